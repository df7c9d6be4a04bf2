// locind learn: run a learning method on data or on the oracle of a graph.
//
//   learn --methods                                  name<TAB>description per method
//   learn DATA.csv --method NAME [--test NAME] [--kind events|paths] [--level 0.05] [--out DIR] [--json]
//   learn --oracle GRAPH.yaml --method NAME [--level 0.05] [--out DIR] [--json]
//
// DATA.csv is an event file (header "time,process") or a path file (header
// "time,<process ids>"), told apart by app/io/data_kind.h unless --kind says;
// options the chosen method does not read (--size but for screen, --penalty
// but for penalized-fit, --test and --level for a method without tests) are
// refused. The test defaults to hawkes-lr for events and drift-exact-lr-history for
// paths. The learned graph is printed (graph file format plus the dashed
// edges and a cost line, or with --json the shape of `locind graph class
// --json`). With --out the directory receives graph.json, graph.dot,
// graph.svg, tests.csv (one row per test made) and decisions.csv (why each
// candidate edge was kept or removed: phase, rule, witness tests). Tests
// that could not be computed are counted on stderr with their reasons.
#include <boost/program_options.hpp>
#include <filesystem>
#include <fstream>
#include <memory>
#include <sstream>

#include "app/io/atomic_file.h"
#include "app/io/error.h"
#include "app/results/decision_rows.h"
#include "app/results/results_rows.h"
#include "base/number_format.h"
#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/io/data_kind.h"
#include "app/study/test_choice.h"
#include "app/io/event_csv.h"
#include "app/io/graph_file.h"
#include "app/io/graph_json.h"
#include "app/io/path_csv.h"
#include "app/io/trial_folder.h"
#include "app/io/svg_render.h"
#include "graph/dot_format.h"
#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_features.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/methods/learner_registry.h"
#include "learners/independence/oracle_test.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;
using learners::LearnResult;

struct LearnOptions {
  std::string data;    // DATA.csv, or empty
  std::string oracle;  // GRAPH.yaml, or empty
  std::string method;
  std::string test;    // empty: the default for the data kind
  std::string kind;    // events, paths or empty (from the header)
  double level = 0.05;
  int screening_size = 1;
  double penalty = -1;
  std::string out;     // output directory, or empty
  bool json = false;
  bool list = false;
};

// Options only some methods read; giving one to another method is refused
// rather than silently ignored.
void RefuseUnusedOptions(const po::variables_map& vm, const learners::MethodEntry& method) {
  const std::string name = method.name;
  const std::string what = "method " + name;
  if (name != "screen") RefuseOptions(vm, {"size"}, what + " (only screen reads it)");
  if (name != "penalized-fit") RefuseOptions(vm, {"penalty"}, what + " (only penalized-fit reads it)");
  if (!method.uses_tests) RefuseOptions(vm, {"test", "level"}, what + " (it makes no tests)");
  if (vm.count("oracle")) RefuseOptions(vm, {"kind"}, "--oracle (it reads a graph file)");
}

LearnOptions ParseOptions(const std::vector<std::string>& args) {
  LearnOptions o;
  po::options_description d("locind learn");
  d.add_options()("methods", "list the methods")("oracle", po::value(&o.oracle), "graph file")(
      "method", po::value(&o.method), "method name")("test", po::value(&o.test), "test name")(
      "kind", po::value(&o.kind), "events or paths")("level", po::value(&o.level), "significance level")(
      "size", po::value(&o.screening_size), "screen: extra processes in C besides b")(
      "penalty", po::value(&o.penalty), "penalized-fit: L1 weight")(
      "out", po::value(&o.out), "output directory")("json", "print JSON");
  const po::variables_map vm = ParseCommandLine(args, d, {{"data", "DATA.csv", false}});
  if (vm.count("data")) o.data = vm["data"].as<std::string>();
  o.json = vm.count("json") > 0;
  o.list = vm.count("methods") > 0;
  if (o.list) return o;
  if (o.data.empty() == o.oracle.empty()) {
    throw UsageError{"give either DATA.csv or --oracle GRAPH.yaml"};
  }
  if (o.method.empty()) {
    throw UsageError{"--method is required (locind learn --methods lists them)"};
  }
  const learners::MethodEntry* entry = learners::FindMethod(o.method);
  if (entry == nullptr) throw UsageError{"unknown method '" + o.method + "' (see --methods)"};
  RefuseUnusedOptions(vm, *entry);
  if (!(o.level > 0 && o.level < 1)) throw UsageError{"--level must lie strictly between 0 and 1"};
  if (o.screening_size < 0) throw UsageError{"--size must be at least 0"};
  return o;
}

// The data of a run and the test built on it (either may be empty).
struct Inputs {
  std::unique_ptr<learners::IndependenceTest> test;
  std::unique_ptr<sim::EventData> events;
  std::unique_ptr<sim::PathData> paths;
};

void LoadEvents(const LearnOptions& o, Inputs& in, std::ostream& err) {
  in.events = std::make_unique<sim::EventData>(LoadEventTrials(o.data, "locind learn", err));
  if (!o.test.empty() && !IsEventTestName(o.test)) {
    throw UsageError{"unknown test '" + o.test + "' for event data (" + EventTestList() + ")"};
  }
  auto features =
      learners::HawkesFeatures::Create(*in.events, learners::DefaultHawkesRates(*in.events));
  if (!features.ok()) throw Error{o.data, 0, 0, "", features.status().message()};
  in.test = MakeEventTest(o.test,
                          std::make_shared<learners::HawkesFeatures>(std::move(features.value())), 1);
}

void LoadPaths(const LearnOptions& o, Inputs& in) {
  PathsOrError read = ReadPathTrials(o.data);
  if (auto* e = std::get_if<Errors>(&read)) throw *e;
  in.paths = std::make_unique<sim::PathData>(std::get<sim::PathData>(std::move(read)));
  if (!IsPathTestName(o.test)) {
    throw UsageError{"unknown test '" + o.test + "' for path data (" + PathTestNames() + ")"};
  }
  auto made = MakePathTest(o.test, *in.paths);
  if (!made.ok()) throw Error{o.data, 0, 0, "", made.status().message()};
  in.test = std::move(made.value());
}

Inputs LoadInputs(const LearnOptions& o, std::ostream& err) {
  Inputs in;
  if (!o.oracle.empty()) {
    if (!o.test.empty() && o.test != "oracle") {
      throw UsageError{"--oracle runs the oracle test only"};
    }
    GraphFileOrErrors read = ReadAnyGraphFile(o.oracle);
    if (auto* errors = std::get_if<Errors>(&read)) throw *errors;
    Result<learners::OracleTest> oracle =
        learners::OracleTest::FromTruth(std::get<GraphFile>(read).truth);
    if (!oracle.ok()) throw Error{o.oracle, 0, 0, "", oracle.status().message()};
    in.test = std::make_unique<learners::OracleTest>(std::move(oracle.value()));
    return in;
  }
  if (DecideDataKind(o.data, o.kind) == DataKind::kEvents) {
    LoadEvents(o, in, err);
  } else {
    LoadPaths(o, in);
  }
  return in;
}

std::string ListText(const std::vector<int>& nodes, const std::vector<std::string>& names) {
  std::string out;
  for (size_t i = 0; i < nodes.size(); ++i) out += (i ? ";" : "") + names[nodes[i]];
  return out;
}

// One row per test made, in the order made.
std::string TestLogCsv(const LearnResult& r) {
  const std::vector<std::string>& names = r.graph.names();
  std::ostringstream out;
  out << "target,sources,given,statistic,df,p_value,status,decision,reason\n";
  for (const learners::TestRecord& t : r.log) {
    // Not estimable: no statistic, df or p-value, and no decision.
    const bool ok = t.status == learners::TestStatus::kOk;
    out << names[t.target] << "," << ListText(t.sources, names) << "," << ListText(t.given, names)
        << "," << (ok ? Num(t.statistic) : "") << "," << (ok ? Num(t.df) : "") << ","
        << (ok ? Num(t.p_value) : "") << "," << (ok ? "ok" : "not estimable") << ","
        << (ok ? (t.dependent ? "dependent" : "independent") : "") << "," << CleanText(t.reason)
        << "\n";
  }
  return out.str();
}

void WriteOutputs(const LearnResult& r, const std::string& dir) {
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec) throw FileSystemError("cannot create " + dir + ": " + ec.message());
  graph::DotOptions style;
  style.dashed = learners::DashedEdges(r);
  style.title = r.method + " (" + r.test_kind + ")";
  const std::string dot = graph::ToDot(r.graph, style);
  Result<std::string> svg = RenderSvg(dot);
  if (!svg.ok()) throw InternalError(svg.status().message());
  const std::pair<std::string, std::string> files[] = {
      {"graph.json", GraphJson(r.graph, style.dashed) + "\n"},
      {"graph.dot", dot},
      {"graph.svg", *svg},
      {"tests.csv", TestLogCsv(r)},
      {"decisions.csv", DecisionsCsv(r)}};
  for (const auto& [name, content] : files) {
    Status written = WriteFileAtomically(dir + "/" + name, content);
    if (!written.ok()) throw FileSystemError(written.message());
  }
}

void PrintResult(const LearnResult& r, bool json, std::ostream& out) {
  const std::vector<graph::Edge> dashed = learners::DashedEdges(r);
  if (json) {
    // The shape of `graph class --json`, with one more key: "decisions".
    std::string text = GraphJson(r.graph, dashed);
    const size_t close = text.rfind('}');
    text.insert(close, ", \"decisions\": " + DecisionsJson(r));
    out << text << "\n";
    return;
  }
  out << FormatGraph(graph::TruthGraph{r.graph, {}});
  if (r.has_marks) {
    out << "dashed: [";
    for (size_t i = 0; i < dashed.size(); ++i) {
      out << (i ? ", " : "") << graph::EdgeText(r.graph, dashed[i]);
    }
    out << "]\n";
  }
  out << "# method " << r.method << ", test " << r.test_kind << ", tests " << r.tests
      << ", not estimable " << r.not_estimable << ", largest conditioning set "
      << r.largest_given << "\n";
  if (!r.note.empty()) out << "# " << r.note << "\n";
}

int ListMethods(std::ostream& out) {
  for (const learners::MethodEntry& m : learners::LearningMethods()) {
    out << m.name << "\t" << m.description << "\n";
  }
  return kExitOk;
}

int Learn(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const LearnOptions o = ParseOptions(args);
  if (o.list) return ListMethods(out);
  const learners::MethodEntry* entry = learners::FindMethod(o.method);
  Inputs in = LoadInputs(o, err);
  learners::MethodSettings settings;
  settings.screening_size = o.screening_size;
  settings.penalty = o.penalty;
  std::unique_ptr<learners::Learner> method = entry->make(settings);
  Result<LearnResult> result =
      method->Learn(learners::LearnInput{in.test.get(), o.level, in.events.get(), in.paths.get()});
  if (!result.ok()) throw UsageError{result.status().message()};
  if (!o.out.empty()) WriteOutputs(*result, o.out);
  PrintResult(*result, o.json, out);
  if (const std::string warning = NotEstimableWarning(result->log); !warning.empty()) {
    err << "locind learn: warning: " << warning << "\n";
  } else if (result->log.empty()) {
    // A method without tests (penalized-fit): fits that could not be made.
    std::vector<learners::TestRecord> fits;
    for (const learners::EdgeDecision& d : result->decisions) {
      if (d.undecided && !d.witnesses.empty()) fits.push_back(d.witnesses.front());
    }
    if (!fits.empty()) {
      err << "locind learn: warning: " << fits.size() << " edges kept as undecided, their fits not estimable: "
          << NotEstimableReasons(fits) << "\n";
    }
  }
  return kExitOk;
}

const char kLearnHelp[] =
    "usage: locind learn --methods\n"
    "       locind learn DATA.csv --method NAME [--test NAME] [--kind events|paths] [--level 0.05]\n"
    "                    [--out DIR] [--json]\n"
    "       locind learn --oracle GRAPH.yaml --method NAME [--level 0.05] [--out DIR] [--json]\n"
    "  --methods        list the methods (name, tab, description)\n"
    "  DATA.csv         an event file (header time,process) or a path file (header\n"
    "                   time,<process ids>); any token without spaces, commas,\n"
    "                   semicolons, quotes or backslashes is a process id, numeric\n"
    "                   ids included\n"
    "                   (a folder of such files: several trials, pooled; no\n"
    "                   '# window:' line: first to last event, with a note)\n"
    "  --kind K         events or paths: which reader (default: from the header)\n"
    "  --method NAME    the learning method\n"
    "  --test NAME      events: hawkes-lr (default), hawkes-lr-chisq, hawkes-lr-signed,\n"
    "                   event-local-covariance, event-local-covariance-end,\n"
    "                   event-local-covariance-batch;\n"
    "                   paths: drift-exact-lr-history (default), drift-exact-lr,\n"
    "                   drift-f, drift-robust-wald\n"
    "  --level L        reject independence when p <= L (default 0.05)\n"
    "  --size K         screen only: at most K processes in C besides the target (default 1)\n"
    "  --penalty C      penalized-fit only: scale of the L1 weight (default 1)\n"
    "                   (an option the chosen method does not read is refused)\n"
    "  --oracle FILE    answer tests from the graph file (hidden nodes hidden)\n"
    "  --out DIR        write graph.json, graph.dot, graph.svg, tests.csv and decisions.csv\n"
    "                   (why each candidate edge was kept or removed) into DIR\n"
    "  --json           print the graph as JSON (the shape of graph class --json, plus\n"
    "                   \"decisions\")\n";

}  // namespace

int RunLearnCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << kLearnHelp;
    return kExitOk;
  }
  return GuardCommand("learn", err, [&] {
    return Learn(args, out, err);
  });
}

}  // namespace locind::app
