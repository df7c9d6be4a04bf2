// External learners (docs/external_learners.md): programs that fail in every
// way give failed rows with their reasons while the run goes on; the oracle
// line protocol; and the example study of examples/external/, where the
// Python pairwise program asks the built-in pairwise method's questions and
// must score exactly like it.
#include <doctest/doctest.h>

#include <map>
#include <set>
#include <sstream>

#include "app/io/child_process.h"
#include "app/io/error.h"
#include "app/running/external_learner.h"
#include "app/study/study_file.h"
#include "learners/independence/oracle_test.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using namespace locind::testing;
using Row = std::map<std::string, std::string>;

// The folder named in a failed row's message ("folder kept: PATH; ...").
std::string KeptFolder(const std::string& message) {
  const std::string tag = "folder kept: ";
  const size_t at = message.find(tag);
  if (at == std::string::npos) return "";
  const size_t end = message.find(';', at);
  return message.substr(at + tag.size(), end == std::string::npos ? end : end - at - tag.size());
}

TEST_CASE("crashing, hanging and garbage-writing programs give failed rows and the run goes on") {
  Scratch s("locind_external_learner_test_failures");
  const std::string crash = s.Write("crash.sh", "echo 'about to crash' >&2\nkill -SEGV $$\n");
  const std::string hang = s.Write("hang.sh", "sleep 30 &\nsleep 30\n");
  const std::string garbage = s.Write("garbage.sh", "echo 'nodes: [a, b' > \"$1/graph.json\"\n");
  const std::string unknown = s.Write(
      "unknown.sh", "echo '{\"nodes\": [\"a\", \"b\", \"c\", \"q\"], \"edges\": []}' > \"$1/graph.json\"\n");
  const std::string fails = s.Write("fails.sh", "echo 'no license for this method' >&2\nexit 3\n");
  const std::string silent = s.Write("silent.sh", "exit 0\n");
  const std::string badlog = s.Write(
      "badlog.sh",
      "echo 'nodes: [a, b, c]' > \"$1/graph.json\"\n"
      "printf 'target,sources,given,statistic,df,p_value\\nb,a,,1,1,2\\n' > \"$1/tests.csv\"\n");
  std::string text = kTinyStudy;
  text.replace(text.find("lengths: [150, 300]"), 19, "lengths: [150]");
  text.replace(text.find("replicates: 4"), 13, "replicates: 2");
  text.replace(text.find("  - {method: pairwise, test: hawkes-lr}\n"), 40, "");
  text.replace(text.find("  - {method: screen, test: hawkes-lr}\n"), 38, "");
  for (const auto& [name, path] : std::vector<std::pair<std::string, std::string>>{
           {"crash", crash}, {"garbage", garbage}, {"unknown", unknown}, {"fails", fails},
           {"silent", silent}, {"badlog", badlog}}) {
    text += "  - {program: [sh, " + path + "], name: " + name + ", needs: data}\n";
  }
  text += "  - {program: [sh, " + hang + "], name: hang, needs: oracle, time_limit: 1}\n";
  const std::string study = s.Write("failures.yaml", text);
  std::string log;
  CHECK(Run({study, "--out", s.Path("out")}, &log) == kExitOk);
  const std::map<std::string, std::string> expected = {
      {"crash", "learner: program killed by signal 11"},
      {"hang", "learner: program time limit passed (killed)"},
      {"garbage", "learner: malformed graph: graph.json:"},
      {"unknown", "learner: unknown node 'q' in graph.json"},
      {"fails", "learner: program exit code 3"},
      {"silent", "learner: no graph.json written"},
      {"badlog", "learner: malformed tests.csv: line 2: p_value must lie in [0; 1]"},
  };
  int failed = 0, ok = 0;
  for (const Row& r : ReadRows(s.dir / "out" / "replicates.csv")) {
    CAPTURE(r.at("learner"));
    if (r.at("learner") == "maximal-search/oracle") {
      CHECK(r.at("status") == "ok");
      ++ok;
      continue;
    }
    CHECK(r.at("status") == "failed");
    CHECK(r.at("method") == "external");
    CHECK(r.at("message").rfind(expected.at(r.at("learner")), 0) == 0);
    const std::string folder = KeptFolder(r.at("message"));
    CHECK(fs::exists(fs::path(folder) / "task.json"));  // kept for a rerun by hand
    fs::remove_all(folder);
    ++failed;
  }
  CHECK(ok == 2);
  CHECK(failed == 7 * 2);
  // Standard error travels with the row (commas become ';' in result files).
  const std::string all = ReadAll(s.dir / "out" / "replicates.csv");
  CHECK(all.find("stderr: about to crash") != std::string::npos);
  CHECK(all.find("stderr: no license for this method") != std::string::npos);
}

TEST_CASE("an external learner in --part shares, merged, and resumed gives the whole run's rows") {
  Scratch s("locind_external_learner_test_parts");
  // A deterministic program: the graph a -> b, b -> b, c -> c over the task's processes.
  const std::string fixed = s.Write(
      "fixed.sh",
      "printf '{\"nodes\": [\"a\", \"b\", \"c\"], \"edges\": [\"a -> b\", \"b -> b\", \"c -> c\"]}' "
      "> \"$1/graph.json\"\n");
  std::string text = kTinyStudy;
  text.replace(text.find("  - {method: pairwise, test: hawkes-lr}\n"), 40, "");
  text.replace(text.find("  - {method: screen, test: hawkes-lr}\n"), 38, "");
  text += "  - {program: [sh, " + fixed + "], name: fixed, needs: data}\n";
  const std::string study = s.Write("parts.yaml", text);
  REQUIRE(Run({study, "--out", s.Path("whole")}) == kExitOk);
  REQUIRE(Run({study, "--out", s.Path("p1"), "--part", "1/2"}) == kExitOk);
  REQUIRE(Run({study, "--out", s.Path("p2"), "--part", "2/2"}) == kExitOk);
  std::ostringstream out, err;
  REQUIRE(RunMergeCommand({s.Path("p1"), s.Path("p2"), "--out", s.Path("merged")}, out, err) == kExitOk);
  CHECK(CompareFolders(s.dir / "whole", s.dir / "merged") >= 5);
  // A second run of a finished folder runs nothing and changes nothing.
  const std::string before = WithoutTimings(s.dir / "whole" / "replicates.csv");
  std::string log;
  REQUIRE(Run({study, "--out", s.Path("whole")}, &log) == kExitOk);
  CHECK(log.find("8 of 8 units already done") != std::string::npos);
  CHECK(WithoutTimings(s.dir / "whole" / "replicates.csv") == before);
  int rows = 0;
  for (const Row& r : ReadRows(s.dir / "whole" / "replicates.csv")) {
    if (r.at("learner") != "fixed") continue;
    CHECK(r.at("status") == "ok");
    CHECK(r.at("reported") == "3");
    ++rows;
  }
  CHECK(rows == 8);  // 2 lengths x 4 replicates
}

TEST_CASE("study keys of an external learner: read, defaulted, and refused with their place") {
  Scratch s("locind_external_learner_test_keys");
  s.Write("mine.py", "");
  std::string text = kTinyStudy;
  text += "  - {program: [python3, mine.py, --k, \"2\"], name: mine}\n"
          "  - {program: [sh, x.sh], name: asks, needs: oracle, time_limit: 2.5}\n";
  StudyOrErrors read = ParseStudyText(text, (s.dir / "keys.yaml").string());
  REQUIRE(std::holds_alternative<StudySpec>(read));
  const StudySpec& study = std::get<StudySpec>(read);
  REQUIRE(study.learners.size() == 5);
  const LearnerSpec& mine = study.learners[3];
  CHECK(mine.label == "mine");
  CHECK(mine.method == "external");
  CHECK(mine.test == "none");
  CHECK(mine.time_limit == 60);
  // mine.py lies next to the study file: made absolute; python3 and --k are left alone.
  CHECK(mine.program == std::vector<std::string>{"python3", (s.dir / "mine.py").string(), "--k", "2"});
  CHECK(study.learners[4].test == "oracle");
  CHECK(study.learners[4].time_limit == 2.5);
  CHECK(study.learners[4].program == std::vector<std::string>{"sh", "x.sh"});

  std::string bad = kTinyStudy;
  bad += "  - {program: [], name: a}\n"
         "  - {program: [sh], needs: sometimes, time_limit: 0, name: b}\n"
         "  - {program: [sh], colour: red}\n";
  StudyOrErrors refused = ParseStudyText(bad, "bad.yaml");
  REQUIRE(std::holds_alternative<std::vector<Error>>(refused));
  std::string all;
  for (const Error& e : std::get<std::vector<Error>>(refused)) all += e.ToString() + "\n";
  CHECK(all.find("learners[4].program: expected a list: the program and its arguments") != std::string::npos);
  CHECK(all.find("learners[5].needs: expected one of: data, oracle") != std::string::npos);
  CHECK(all.find("learners[5].time_limit: must lie in (0, 86400]") != std::string::npos);
  CHECK(all.find("learners[6].colour: unknown key") != std::string::npos);
}

TEST_CASE("oracle questions: answers from the projection, malformed lines refused") {
  // examples/alarm_chain.yaml: a -> b, b -> b, h -> a, h -> c, c -> b, h hidden;
  // the answers below are those of tests/app/cli/graph_command_test.cc.
  graph::Dmg g({"a", "b", "c", "h"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 1);
  g.AddDirected(3, 0);
  g.AddDirected(3, 2);
  g.AddDirected(2, 1);
  Result<learners::OracleTest> oracle = learners::OracleTest::FromTruth(graph::TruthGraph{g, {3}});
  REQUIRE(oracle.ok());
  learners::OracleTest& test = oracle.value();
  const std::vector<std::string> names = {"a", "b", "c"};
  learners::TestRecord record;
  std::string reply;
  // graph check --from b --to a --given a,c: separated (target a, source b).
  CHECK(AnswerQuestion("a;b;a,c", names, test, 0.05, record, reply));
  CHECK(reply == "separated");
  CHECK(record.target == 0);
  CHECK(record.sources == std::vector<int>{1});
  CHECK(record.given == std::vector<int>{0, 2});
  CHECK(AnswerQuestion("c;a;", names, test, 0.05, record, reply));
  CHECK(reply == "connected");
  CHECK(record.dependent);
  CHECK(AnswerQuestion(" b ; c ; b, a ", names, test, 0.05, record, reply));
  CHECK(reply == "connected");  // c -> b directly
  CHECK_FALSE(AnswerQuestion("b;a", names, test, 0.05, record, reply));
  CHECK(reply.rfind("error: expected 'b;A;C'", 0) == 0);
  CHECK_FALSE(AnswerQuestion("b;h;", names, test, 0.05, record, reply));
  CHECK(reply == "error: unknown process 'h'");
  CHECK_FALSE(AnswerQuestion("b;a;a", names, test, 0.05, record, reply));
  CHECK(reply == "error: A and C must not share a process");
  CHECK_FALSE(AnswerQuestion("a,b;c;", names, test, 0.05, record, reply));
  CHECK(reply == "error: b is one process and A at least one");
}

TEST_CASE("a child conversation: each line answered, standard error kept, the group killed at the limit") {
  Scratch s("locind_external_learner_test_child");
  ChildRequest exchange;
  exchange.argv = {"sh", "-c", "echo one; read x; echo \"got $x\" >&2; echo two; read y; exit 4"};
  exchange.folder = s.dir.string();
  exchange.time_limit_seconds = 20;
  std::vector<std::string> heard;
  exchange.answer = [&](const std::string& line) {
    heard.push_back(line);
    return "answer-" + line;
  };
  const ChildOutcome done = RunChild(exchange);
  CHECK(done.started);
  CHECK(done.exit_code == 4);
  CHECK(done.Describe() == "exit code 4");
  CHECK(heard == std::vector<std::string>{"one", "two"});
  CHECK(done.err_tail == "got answer-one\n");

  ChildRequest hang;
  hang.argv = {"sh", "-c", "sleep 30 & sleep 30"};
  hang.folder = s.dir.string();
  hang.time_limit_seconds = 0.5;
  const ChildOutcome killed = RunChild(hang);
  CHECK(killed.timed_out);
  CHECK_FALSE(killed.ok());

  ChildRequest missing;
  missing.argv = {"/nonexistent/program"};
  missing.folder = s.dir.string();
  const ChildOutcome none = RunChild(missing);
  CHECK_FALSE(none.started);
  CHECK(none.Describe() == "could not start: /nonexistent/program: No such file or directory");
}

TEST_CASE("the example study: the Python pairwise program scores exactly like the built-in pairwise") {
  Scratch s("locind_external_learner_test_example");
  std::string log;
  REQUIRE(Run({"examples/external/study.yaml", "--out", s.Path("out")}, &log) == kExitOk);
  std::map<std::string, std::map<std::string, Row>> by_replicate;  // replicate -> learner -> row
  for (const Row& r : ReadRows(s.dir / "out" / "replicates.csv")) {
    CHECK(r.at("status") == "ok");
    by_replicate[r.at("replicate")][r.at("learner")] = r;
  }
  REQUIRE(by_replicate.size() == 2);
  // Every column that depends on the learned graph and the questions asked.
  // Left out: learner and method (names), the timings, and the error-cause
  // columns: a program gives no decision record (edges.csv's decision_*
  // and witness_* columns are empty for it), so a missed edge of it would
  // be attributed to "reach" where the built-in names the witness test.
  const std::vector<std::string> columns = {
      "reported", "in_class", "false_edges", "solid", "solid_found", "dashed", "dashed_found",
      "loop_reported", "bidirected_reported", "power", "false_edge_rate", "hamming",
      "class_recovered", "tests", "largest_given", "test_correct", "test_false_separation",
      "test_false_dependence"};
  for (auto& [replicate, rows] : by_replicate) {
    CAPTURE(replicate);
    const Row& builtin = rows.at("pairwise/oracle");
    const Row& python = rows.at("py_pairwise");
    for (const std::string& c : columns) {
      CAPTURE(c);
      CHECK(python.at(c) == builtin.at(c));
    }
    CHECK(python.at("tests") == "16");  // n^2 questions, 4 observed processes
    CHECK(rows.at("py_search").at("status") == "ok");
    CHECK(rows.at("py_excess").at("status") == "ok");
    CHECK(rows.at("py_excess").at("tests") == "16");  // its tests.csv: one test per ordered pair
    CHECK(rows.at("py_excess").at("test") == "none");
  }
  // The same edges, reported or not, with the same truth status.
  std::map<std::string, std::set<std::string>> edges;  // learner -> "replicate edge action"
  for (const Row& r : ReadRows(s.dir / "out" / "edges.csv")) {
    edges[r.at("learner")].insert(r.at("replicate") + " " + r.at("edge") + " " + r.at("truth_status") +
                                  " " + r.at("learner_action"));
  }
  CHECK(edges.at("py_pairwise") == edges.at("pairwise/oracle"));
}

}  // namespace
}  // namespace locind::app
