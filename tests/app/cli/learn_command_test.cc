// `locind learn`: the methods list, oracle runs against the graph engine's
// equivalence graph, the output files, data runs and bad input.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "tests/graph/brute_force.h"

namespace locind::app {
namespace {

struct Outcome {
  int code;
  std::string out, err;
};

Outcome Learn(const std::vector<std::string>& args) {
  std::ostringstream out, err;
  const int code = RunLearnCommand(args, out, err);
  return {code, out.str(), err.str()};
}

// examples/alarm_chain.yaml: a -> b, b -> b, h -> a, h -> c, c -> b, h hidden.
const std::string kExample = "examples/alarm_chain.yaml";

std::string ReadAll(const std::filesystem::path& p) {
  std::ifstream in(p);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

TEST_CASE("--methods lists name TAB description, one per line") {
  const Outcome o = Learn({"--methods"});
  CHECK(o.code == kExitOk);
  CHECK(o.out.rfind("pairwise\t", 0) == 0);
  CHECK(o.out.find("\nmaximal-search\t") != std::string::npos);
  CHECK(o.out.find("\nexhaustive\t") != std::string::npos);
  CHECK(o.out.find("\nscreen\t") != std::string::npos);
}

TEST_CASE("--help prints the usage") {
  const Outcome o = Learn({"--help"});
  CHECK(o.code == kExitOk);
  CHECK(o.out.rfind("usage: locind learn --methods\n", 0) == 0);
  CHECK(o.out.find("--oracle FILE") != std::string::npos);
}

TEST_CASE("--oracle --json prints exactly the class of `graph class --json`, plus decisions") {
  std::ostringstream out, err;
  REQUIRE(RunGraphCommand({"class", kExample, "--json"}, out, err) == kExitOk);
  const std::string graph = out.str().substr(0, out.str().rfind('}'));
  for (const char* method : {"maximal-search", "exhaustive"}) {
    const Outcome o = Learn({"--oracle", kExample, "--method", method, "--json"});
    CHECK(o.code == kExitOk);
    CHECK(o.out.rfind(graph + ", \"decisions\": [{\"edge\": ", 0) == 0);
    CHECK(o.out.substr(o.out.size() - 3) == "]}\n");
    CHECK(o.err.empty());  // the oracle computes every test
  }
}

TEST_CASE("pairwise on the example: the projection's directed edges and more") {
  const Outcome o = Learn({"--oracle", kExample, "--method", "pairwise"});
  CHECK(o.code == kExitOk);
  CHECK(o.out ==
        "nodes: [a, b, c]\n"
        "edges: [a -> a, a -> b, a -> c, b -> b, c -> a, c -> b, c -> c]\n"
        "# method pairwise, test oracle, tests 9, not estimable 0, largest conditioning set 2\n");
  // The edge list derived by the brute force (tests/graph/brute_force.h) from
  // pairwise's rule (learners/methods/pairwise_learner.h): x -> y unless y is
  // separated from x given every observed process but x, in the full graph
  // a -> b, b -> b, h -> a, h -> c, c -> b. 3 x 3 ordered pairs = 9 tests,
  // each given the 2 other processes. Only b -> a and b -> c are absent.
  testing::BruteGraph full(4);
  enum { a, b, c, h };
  full.dir[a][b] = full.dir[b][b] = full.dir[h][a] = full.dir[h][c] = full.dir[c][b] = true;
  std::string edges;
  for (int x = 0; x < 3; ++x) {
    for (int y = 0; y < 3; ++y) {
      const uint32_t others = 7u & ~(1u << x);
      if (testing::BruteConnected(full, x, y, others)) {
        edges += std::string(edges.empty() ? "" : ", ") + "abc"[x] + " -> " + "abc"[y];
      }
    }
  }
  CHECK(edges == "a -> a, a -> b, a -> c, b -> b, c -> a, c -> b, c -> c");
}

TEST_CASE("--out writes the graph as JSON, DOT and SVG and the test log") {
  const auto dir = std::filesystem::temp_directory_path() /
                   ("locind_learn_command_test_" + std::to_string(::getpid()));
  std::filesystem::remove_all(dir);
  const Outcome o = Learn({"--oracle", kExample, "--method", "screen", "--out", dir.string()});
  REQUIRE(o.code == kExitOk);
  CHECK(ReadAll(dir / "graph.json").rfind("{\"nodes\": [\"a\", \"b\", \"c\"]", 0) == 0);
  CHECK(ReadAll(dir / "graph.dot").find("digraph") != std::string::npos);
  CHECK(ReadAll(dir / "graph.svg").find("<svg") != std::string::npos);
  const std::string log = ReadAll(dir / "tests.csv");
  CHECK(log.rfind("target,sources,given,statistic,df,p_value,status,decision,reason\n", 0) == 0);
  // The first test: is a independent of its own past given nothing? No.
  CHECK(log.find("\na,a,,1,0,0,ok,dependent,\n") != std::string::npos);
  // decisions.csv: one row per candidate edge of screen (9 directed, 3
  // bidirected over a, b, c). In the projection (a -> b, b -> b, c -> b,
  // a <-> c) b -> b is a loop of the truth, kept; b is separated from a given
  // {a, c} (the only walk, b <- c <-> a, is blocked at c), so b -> a is
  // removed with a separation of target a from source b as its witness.
  const std::string decisions = ReadAll(dir / "decisions.csv");
  CHECK(decisions.rfind("edge,mark,decision,decision_phase,decision_rule,witness_target,", 0) == 0);
  CHECK(std::count(decisions.begin(), decisions.end(), '\n') == 1 + 9 + 3);
  CHECK(decisions.find("\nb -> b,,kept,screen,inseparable,") != std::string::npos);
  CHECK(decisions.find("\nb -> a,,removed,screen,separated,a,b,") != std::string::npos);
  std::filesystem::remove_all(dir);
}

TEST_CASE("a data run: path file with the drift test") {
  const auto file = std::filesystem::temp_directory_path() /
                    ("locind_learn_paths_" + std::to_string(::getpid()) + ".csv");
  {
    std::ofstream out(file);
    out << "time,x1,x2\n";
    // x1 a deterministic oscillation, x2 driven by x1 with a lag.
    double x2 = 0;
    for (int i = 0; i <= 400; ++i) {
      const double t = 0.1 * i;
      const double x1 = std::sin(0.7 * t) + 0.3 * std::sin(5.1 * t);
      out << t << "," << x1 << "," << x2 << "\n";
      x2 += 0.1 * (x1 - x2) + 0.05 * std::sin(13.7 * t);
    }
  }
  const Outcome o = Learn({file.string(), "--method", "pairwise"});
  CHECK(o.code == kExitOk);
  CHECK(o.out.rfind("nodes: [x1, x2]\n", 0) == 0);
  CHECK(o.out.find("test drift-exact-lr-history, tests 4") != std::string::npos);  // the default
  const Outcome h = Learn({file.string(), "--method", "pairwise", "--test", "drift-exact-lr"});
  CHECK(h.code == kExitOk);
  CHECK(h.out.find("test drift-exact-lr, tests 4") != std::string::npos);
  std::filesystem::remove(file);
}

TEST_CASE("tests that cannot be computed: counted with reasons on stderr, no p-value in tests.csv") {
  // a has 4 events, fewer than the Hawkes test needs for a target (10,
  // min_target_events in learners/independence/hawkes_lr_test.h); b has 40.
  const auto file = std::filesystem::temp_directory_path() / "locind_learn_few.csv";
  {
    std::ofstream out(file);
    out << "time,process\n";
    for (int i = 0; i < 40; ++i) {
      out << 0.5 + i << ",b\n";
      if (i % 13 == 0) out << 0.7 + i << ",a\n";
    }
  }
  const auto dir = std::filesystem::temp_directory_path() / "locind_learn_few";
  std::filesystem::remove_all(dir);
  const Outcome o = Learn({file.string(), "--method", "pairwise", "--out", dir.string()});
  CHECK(o.code == kExitOk);
  // pairwise asks 4 tests; the two with target a cannot be computed.
  // The file has no window line: a note on the window first, then the warning.
  CHECK(o.err.rfind("locind learn: note: ", 0) == 0);
  CHECK(o.err.find("\nlocind learn: warning: 2 of 4 tests not estimable") != std::string::npos);
  CHECK(o.err.find("too few events") != std::string::npos);
  const std::string log = ReadAll(dir / "tests.csv");
  CHECK(log.find(",,,,not estimable,,too few events") != std::string::npos);
  // Both edges into a are kept as undecided, with that test as witness.
  const std::string decisions = ReadAll(dir / "decisions.csv");
  CHECK(decisions.find("\nb -> a,,undecided,test,not estimable,a,b,a,,,not estimable: too few") !=
        std::string::npos);
  std::filesystem::remove_all(dir);
  std::filesystem::remove(file);
}

TEST_CASE("penalized-fit: a stream with one event has no fit; edges into it undecided, with a warning") {
  // b has 30 events, a one: a's intensity cannot be fitted (penalized_fit_learner.h).
  const auto file = std::filesystem::temp_directory_path() / "locind_learn_unfit.csv";
  {
    std::ofstream out(file);
    out << "time,process\n";
    for (int i = 0; i < 30; ++i) {
      if (i == 7) out << 7.2 << ",a\n";
      out << 7.5 + (i - 7) << ",b\n";
    }
  }
  const auto dir = std::filesystem::temp_directory_path() / "locind_learn_unfit";
  std::filesystem::remove_all(dir);
  const Outcome o = Learn({file.string(), "--method", "penalized-fit", "--out", dir.string()});
  CHECK(o.code == kExitOk);
  CHECK(o.err.find("\nlocind learn: warning: 2 edges kept as undecided, their fits not estimable: a has 1 "
                   "event; its intensity fit needs at least 2 (2)") != std::string::npos);
  const std::string decisions = ReadAll(dir / "decisions.csv");
  CHECK(decisions.find("\nb -> a,,undecided,fit,not estimable,a,b,a,,,not estimable: a has 1 event") !=
        std::string::npos);
  std::filesystem::remove_all(dir);
  std::filesystem::remove(file);
}

TEST_CASE("bad input: one line, exit code 2, no output") {
  const Outcome unknown = Learn({"--oracle", kExample, "--method", "nope"});
  CHECK(unknown.code == kExitInputError);
  CHECK(unknown.out.empty());
  CHECK(unknown.err == "locind learn: unknown method 'nope' (see --methods)\n");
  CHECK(Learn({"--oracle", kExample}).code == kExitInputError);
  CHECK(Learn({"--oracle", kExample, "--method", "screen", "--level", "1.5"}).code ==
        kExitInputError);
  CHECK(Learn({"--oracle", "no/such/file.yaml", "--method", "screen"}).code == kExitInputError);
  CHECK(Learn({"--method", "screen"}).code == kExitInputError);
  const Outcome refused = Learn({"--oracle", kExample, "--method", "screen", "--test", "drift-f"});
  CHECK(refused.code == kExitInputError);
}

}  // namespace
}  // namespace locind::app

namespace locind::app {
namespace {

// 300 events of three processes with numeric ids; "003" and "3" are two ids.
std::string NumericIdFile(const std::string& header) {
  const auto file = std::filesystem::temp_directory_path() /
                    ("locind_learn_ids_" + std::to_string(::getpid()) + ".csv");
  std::ofstream out(file);
  out << header << "\n";
  const char* ids[] = {"17", "3", "003"};
  for (int i = 0; i < 300; ++i) out << 0.25 + 0.5 * i << "," << ids[(i * 7) % 3] << "\n";
  return file.string();
}

TEST_CASE("numeric process ids are ids; an unknown header needs --kind") {
  const std::string file = NumericIdFile("time,process");
  const Outcome o = Learn({file, "--method", "pairwise"});
  CHECK(o.code == kExitOk);
  CHECK(o.out.rfind("nodes: [17, 3, 003]\n", 0) == 0);
  CHECK(o.out.find("tests 9, not estimable 0") != std::string::npos);
  const std::string unit = NumericIdFile("time,unit");
  const Outcome refused = Learn({unit, "--method", "pairwise"});
  CHECK(refused.code == kExitInputError);
  CHECK(refused.err.find("'time,unit' may be an event file or a path file of one process: give --kind") !=
        std::string::npos);
  // --kind events: the event reader, whose error names its header.
  const Outcome events = Learn({unit, "--method", "pairwise", "--kind", "events"});
  CHECK(events.err == unit + ":1:1: header: expected 'time,process' (an event file; a path file has "
                             "'time,<process ids>')\n");
  std::filesystem::remove(file);
}

TEST_CASE("options the method does not read are refused") {
  Outcome o = Learn({"--oracle", kExample, "--method", "pairwise", "--penalty", "2"});
  CHECK(o.code == kExitInputError);
  CHECK(o.err == "locind learn: --penalty is not used by method pairwise (only penalized-fit reads it); "
                 "leave it out\n");
  o = Learn({"--oracle", kExample, "--method", "maximal-search", "--size", "2"});
  CHECK(o.err == "locind learn: --size is not used by method maximal-search (only screen reads it); "
                 "leave it out\n");
  o = Learn({"--oracle", kExample, "--method", "penalized-fit", "--level", "0.1"});
  CHECK(o.err == "locind learn: --level is not used by method penalized-fit (it makes no tests); leave it out\n");
  o = Learn({"--oracle", kExample, "--method", "pairwise", "--kind", "events"});
  CHECK(o.err == "locind learn: --kind is not used by --oracle (it reads a graph file); leave it out\n");
  // The methods that read them take them.
  CHECK(Learn({"--oracle", kExample, "--method", "screen", "--size", "0"}).code == kExitOk);
}

TEST_CASE("--help anywhere on the line; surplus arguments named") {
  CHECK(Learn({"--oracle", kExample, "--help"}).out.rfind("usage: locind learn", 0) == 0);
  CHECK(Learn({"--oracle", kExample, "--help"}).out.find('\t') == std::string::npos);
  const Outcome o = Learn({"a.csv", "b.csv", "--method", "pairwise"});
  CHECK(o.code == kExitInputError);
  CHECK(o.err.rfind("locind learn: unexpected argument 'b.csv'\n", 0) == 0);
}

// Not-estimable tests (too few events of a: 4 of at least 10) in the JSON
// output: the witness text carries no p-value, never 1.
TEST_CASE("--json: a not estimable witness has an empty p-value") {
  const auto file = std::filesystem::temp_directory_path() /
                    ("locind_learn_few_json_" + std::to_string(::getpid()) + ".csv");
  {
    std::ofstream out(file);
    out << "time,process\n";
    for (int i = 0; i < 40; ++i) {
      out << 0.5 + i << ",b\n";
      if (i % 13 == 0) out << 0.7 + i << ",a\n";
    }
  }
  const Outcome o = Learn({file.string(), "--method", "pairwise", "--json"});
  CHECK(o.code == kExitOk);
  CHECK(o.out.find("\"a<-b|a:not estimable:\"") != std::string::npos);
  CHECK(o.out.find("not estimable:1") == std::string::npos);
  CHECK(o.err.find("2 of 4 tests not estimable") != std::string::npos);
  std::filesystem::remove(file);
}

}  // namespace
}  // namespace locind::app
