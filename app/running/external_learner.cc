#include "app/running/external_learner.h"

#include <algorithm>
#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <unistd.h>

#include "app/io/child_process.h"
#include "app/io/event_csv.h"
#include "app/io/graph_file.h"
#include "app/io/graph_json.h"
#include "app/io/path_csv.h"
#include "base/number_format.h"
#include "sim/event_data.h"
#include "sim/path_data.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;

std::vector<std::string> Split(const std::string& text, char sep) {
  std::vector<std::string> out;
  std::string item;
  std::istringstream in(text);
  while (std::getline(in, item, sep)) out.push_back(item);
  if (!text.empty() && text.back() == sep) out.push_back("");
  return out;
}

std::string Trim(const std::string& s) {
  const size_t b = s.find_first_not_of(" \t");
  if (b == std::string::npos) return "";
  return s.substr(b, s.find_last_not_of(" \t") - b + 1);
}

// Names -> sorted distinct indices; false on an unknown name.
bool Indices(const std::string& list, const std::vector<std::string>& names, std::vector<int>& out,
             std::string& bad) {
  out.clear();
  for (const std::string& raw : Split(list, ',')) {
    const std::string name = Trim(raw);
    if (name.empty()) continue;
    const auto it = std::find(names.begin(), names.end(), name);
    if (it == names.end()) {
      bad = name;
      return false;
    }
    out.push_back(static_cast<int>(it - names.begin()));
  }
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return true;
}

// A fresh folder; empty on failure.
std::string MakeFolder(const std::string& hint) {
  std::string safe = hint;
  for (char& ch : safe) {
    if (!std::isalnum(static_cast<unsigned char>(ch)) && ch != '-' && ch != '_') ch = '_';
  }
  std::string pattern = (fs::temp_directory_path() / ("locind-external-" + std::to_string(::getpid()) +
                                                      "-" + safe + "-XXXXXX"))
                            .string();
  if (::mkdtemp(pattern.data()) == nullptr) return "";
  return pattern;
}

std::string NamesJson(const std::vector<std::string>& names) {
  std::string out = "[";
  for (size_t i = 0; i < names.size(); ++i) out += (i ? ", " : "") + JsonString(names[i]);
  return out + "]";
}

// task.json: what the program needs to know (docs/external_learners.md).
std::string TaskJson(const LearnerSpec& spec, const ExternalTask& task,
                     const learners::LearnInput& input) {
  const bool oracle = spec.test == "oracle";
  std::string kind = oracle ? "oracle" : input.events ? "events" : "paths";
  std::string data = oracle ? "null" : input.events ? "\"events.csv\"" : "\"paths.csv\"";
  double start = 0, end = 0;
  if (input.events) {
    start = input.events->start;
    end = input.events->end;
  } else if (input.paths && input.paths->samples() > 0) {
    start = input.paths->time.front();
    end = input.paths->time.back();
  }
  std::ostringstream o;
  o << "{\"format\": 1, \"learner\": " << JsonString(spec.label) << ", \"kind\": \"" << kind
    << "\", \"data\": " << data << ", \"processes\": " << NamesJson(task.names)
    << ", \"window\": [" << base::FormatNumber(start) << ", " << base::FormatNumber(end)
    << "], \"level\": " << base::FormatNumber(input.level) << ", \"seed\": " << task.seed
    << ", \"graph\": \"graph.json\", \"time_limit\": " << base::FormatNumber(spec.time_limit)
    << "}\n";
  return o.str();
}

bool WriteText(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
  return static_cast<bool>(out);
}

std::string Tail(const std::string& err) {
  std::string t = err;
  const size_t keep = 400;  // a row message, not a log
  if (t.size() > keep) t = "..." + t.substr(t.size() - keep);
  while (!t.empty() && (t.back() == '\n' || t.back() == ' ')) t.pop_back();
  return t;
}

// The learned graph over `names`, or the problem with graph.json.
Result<learners::LearnResult> ReadLearned(const std::string& folder,
                                          const std::vector<std::string>& names) {
  const std::string path = folder + "/graph.json";
  std::ifstream in(path, std::ios::binary);
  if (!in) return Status::Error("no graph.json written");
  std::ostringstream text;
  text << in.rdbuf();
  GraphFileOrErrors read = ParseAnyGraphText(text.str(), "graph.json");
  if (auto* errors = std::get_if<Errors>(&read)) {
    return Status::Error("malformed graph: " + errors->front().ToString());
  }
  const GraphFile& file = std::get<GraphFile>(read);
  const graph::Dmg& own = file.truth.graph;
  if (!file.truth.hidden.empty()) return Status::Error("malformed graph: hidden nodes listed");
  for (const std::string& name : own.names()) {
    if (std::find(names.begin(), names.end(), name) == names.end()) {
      return Status::Error("unknown node '" + name + "' in graph.json");
    }
  }
  std::vector<int> order;
  for (const std::string& name : names) {
    auto v = own.index(name);
    if (!v) return Status::Error("graph.json misses the process '" + name + "'");
    order.push_back(*v);
  }
  learners::LearnResult r;
  r.graph = own.Induced(order);
  if (file.has_marks) {
    std::vector<int> new_index(own.size());
    for (size_t i = 0; i < order.size(); ++i) new_index[order[i]] = static_cast<int>(i);
    std::vector<graph::Edge> dashed;
    for (graph::Edge e : file.dashed) {
      e = graph::Edge{new_index[e.from], new_index[e.to], e.kind};
      if (e.kind == graph::EdgeKind::kBidirected && e.from > e.to) std::swap(e.from, e.to);
      dashed.push_back(e);
    }
    r.has_marks = true;
    r.edges = graph::ListEdges(r.graph);
    for (const graph::Edge& e : r.edges) {
      r.dashed.push_back(std::find(dashed.begin(), dashed.end(), e) != dashed.end());
    }
  }
  return r;
}

// tests.csv, the optional test log of a data program: a header
// "target,sources,given,statistic,df,p_value", then one test per line with
// process names (lists separated by ';', C may be empty). Appended to `log`.
Status ReadTestLog(const std::string& folder, const std::vector<std::string>& names, double level,
                   std::vector<learners::TestRecord>& log) {
  std::ifstream in(folder + "/tests.csv", std::ios::binary);
  if (!in) return Status::Ok();
  std::string line;
  int number = 0;
  auto bad = [&](const std::string& why) {
    return Status::Error("malformed tests.csv: line " + std::to_string(number) + ": " + why);
  };
  while (std::getline(in, line)) {
    ++number;
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (number == 1) {
      if (line != "target,sources,given,statistic,df,p_value") {
        return bad("expected the header target,sources,given,statistic,df,p_value");
      }
      continue;
    }
    if (line.empty()) continue;
    const std::vector<std::string> f = Split(line, ',');
    if (f.size() != 6) return bad("expected 6 fields");
    std::vector<std::string> lists = {f[0], f[1], f[2]};
    for (std::string& l : lists) std::replace(l.begin(), l.end(), ';', ',');
    learners::TestRecord t;
    std::vector<int> target;
    std::string unknown;
    if (!Indices(lists[0], names, target, unknown) || !Indices(lists[1], names, t.sources, unknown) ||
        !Indices(lists[2], names, t.given, unknown)) {
      return bad("unknown process '" + unknown + "'");
    }
    if (target.size() != 1 || t.sources.empty()) return bad("one target and at least one source");
    t.target = target[0];
    try {
      t.statistic = std::stod(f[3]);
      t.df = std::stod(f[4]);
      t.p_value = std::stod(f[5]);
    } catch (const std::exception&) {
      return bad("statistic, df and p_value must be numbers");
    }
    if (!(t.p_value >= 0 && t.p_value <= 1)) return bad("p_value must lie in [0, 1]");
    t.dependent = t.p_value <= level;
    log.push_back(std::move(t));
  }
  return Status::Ok();
}

}  // namespace

bool AnswerQuestion(const std::string& line, const std::vector<std::string>& names,
                    learners::IndependenceTest& test, double level, learners::TestRecord& record,
                    std::string& reply) {
  const std::vector<std::string> fields = Split(line, ';');
  if (fields.size() != 3) {
    reply = "error: expected 'b;A;C' (three fields separated by ';')";
    return false;
  }
  std::vector<int> target, sources, given;
  std::string bad;
  if (!Indices(fields[0], names, target, bad) || !Indices(fields[1], names, sources, bad) ||
      !Indices(fields[2], names, given, bad)) {
    reply = "error: unknown process '" + bad + "'";
    return false;
  }
  if (target.size() != 1 || sources.empty()) {
    reply = "error: b is one process and A at least one";
    return false;
  }
  for (int a : sources) {
    if (std::binary_search(given.begin(), given.end(), a)) {
      reply = "error: A and C must not share a process";
      return false;
    }
  }
  const learners::TestResult r = test.Run(learners::TestQuery{target[0], sources, given});
  record = learners::TestRecord{};
  record.target = target[0];
  record.sources = sources;
  record.given = given;
  record.statistic = r.statistic;
  record.df = r.df;
  record.p_value = r.p_value;
  record.status = r.status;
  record.reason = r.reason;
  record.dependent = r.status == learners::TestStatus::kOk && r.p_value <= level;
  reply = record.dependent ? "connected" : "separated";
  return true;
}

ExternalLearner::ExternalLearner(LearnerSpec spec, ExternalTask task)
    : spec_(std::move(spec)), task_(std::move(task)) {}

Result<learners::LearnResult> ExternalLearner::Learn(const learners::LearnInput& input) {
  const bool oracle = spec_.test == "oracle";
  if (oracle && input.test == nullptr) return Status::Error("no oracle for the program");
  if (!oracle && !input.events && !input.paths) return Status::Error("no data for the program");
  const std::string folder = MakeFolder(task_.folder_hint);
  if (folder.empty()) return Status::Error(std::string("cannot create a folder: ") + std::strerror(errno));
  bool written = WriteText(folder + "/task.json", TaskJson(spec_, task_, input));
  if (!oracle && input.events) written = written && WriteText(folder + "/events.csv", FormatEventCsv(*input.events));
  if (!oracle && input.paths) written = written && WriteText(folder + "/paths.csv", FormatPathCsv(*input.paths));
  if (!written) return Status::Error("cannot write the task into " + folder);

  std::vector<learners::TestRecord> log;
  ChildRequest request;
  request.argv = spec_.program;
  request.argv.push_back(folder);
  request.folder = folder;
  request.time_limit_seconds = spec_.time_limit;
  if (oracle) {
    request.answer = [&](const std::string& line) {
      learners::TestRecord record;
      std::string reply;
      if (AnswerQuestion(line, task_.names, *input.test, input.level, record, reply)) {
        log.push_back(std::move(record));
      }
      return reply;
    };
  }
  const ChildOutcome outcome = RunChild(request);
  auto fail = [&](const std::string& reason) {
    std::string message = reason + "; folder kept: " + folder;
    if (!outcome.err_tail.empty()) message += "; stderr: " + Tail(outcome.err_tail);
    return Status::Error(message);
  };
  if (!outcome.ok()) return fail("program " + outcome.Describe());
  Result<learners::LearnResult> learned = ReadLearned(folder, task_.names);
  if (!learned.ok()) return fail(learned.status().message());
  if (!oracle) {
    if (Status read = ReadTestLog(folder, task_.names, input.level, log); !read.ok()) {
      return fail(read.message());
    }
  }
  learners::LearnResult r = std::move(learned.value());
  r.method = "external";
  // A data program's own tests are p-values: "external" sends them to
  // null_tests.csv like a built-in test's ("none" would skip them).
  r.test_kind = oracle ? input.test->kind() : log.empty() ? "none" : "external";
  r.log = std::move(log);
  r.tests = static_cast<int>(r.log.size());
  for (const learners::TestRecord& t : r.log) {
    r.largest_given = std::max(r.largest_given, static_cast<int>(t.given.size()));
    if (t.status != learners::TestStatus::kOk) ++r.not_estimable;
  }
  r.seconds = outcome.seconds;
  std::error_code ec;
  fs::remove_all(folder, ec);
  return r;
}

}  // namespace locind::app
