// locind score and the graph round trip: every command that reads a graph
// accepts every graph file the tool writes.
//
// The class of examples/alarm_chain.yaml used below (maximal graph a -> a,
// a -> b, a -> c, b -> b, c -> a, c -> b, c -> c, a <-> c; solid a -> b,
// b -> b, c -> b, the rest dashed) is the golden of
// tests/app/cli/graph_command_test.cc, which derives it with the
// definition-level brute force (tests/graph/brute_force.h). The score counts
// expected here are worked out by hand from the definitions in
// metrics/replicate_score.h.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <map>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "tests/app/command_fixture.h"

namespace locind::app {
namespace {

using testing::Outcome;
using testing::RunHandler;

const std::string kExample = "examples/alarm_chain.yaml";

std::string Scratch(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() /
                   ("locind_score_command_" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  return (dir / name).string();
}

std::string Write(const std::string& name, const std::string& text) {
  const std::string path = Scratch(name);
  std::ofstream(path) << text;
  return path;
}

TEST_CASE("score of the class itself: every solid edge found, no false edge, marks agree") {
  const std::string cls = Write("class.yaml", RunHandler(RunGraphCommand, {"class", kExample}).out);
  const Outcome r = RunHandler(RunScoreCommand, {cls, "--truth", kExample});
  REQUIRE(r.code == kExitOk);
  CHECK(r.out.find("total               8         8            0      3            3      1       5"
                   "             5\n") != std::string::npos);
  CHECK(r.out.find("power 1, false-edge rate 0, hamming 0 (missed solid 0 + false edges 0), class "
                   "recovered yes\n") != std::string::npos);
  CHECK(r.out.find("marks: 8 of 8 agree with the class (1)\n") != std::string::npos);
}

TEST_CASE("score of a hand-written graph counts false edges, missed solid edges and groups") {
  // Reported: a -> b (solid in the class), b -> a (not in the class: false),
  // c -> c (dashed). Missed solid: b -> b, c -> b. Nodes in another order.
  const std::string g = Write("hand.yaml", "nodes: [c, b, a]\nedges: [a -> b, b -> a, c -> c]\n");
  const Outcome r = RunHandler(RunScoreCommand, {g, "--truth", kExample, "--json"});
  REQUIRE(r.code == kExitOk);
  CHECK(r.out.find("\"directed\": {\"reported\": 2, \"in_class\": 1, \"false_edges\": 1, \"solid\": 2, "
                   "\"solid_found\": 1, \"missed_solid\": 1, \"power\": 0.5, \"dashed\": 2, "
                   "\"dashed_found\": 0}") != std::string::npos);
  CHECK(r.out.find("\"loop\": {\"reported\": 1, \"in_class\": 1, \"false_edges\": 0, \"solid\": 1, "
                   "\"solid_found\": 0, \"missed_solid\": 1, \"power\": 0, \"dashed\": 2, "
                   "\"dashed_found\": 1}") != std::string::npos);
  CHECK(r.out.find("\"power\": 0.3333333333333333, \"false_edge_rate\": 0.3333333333333333, "
                   "\"hamming\": 3, \"class_recovered\": false, \"has_marks\": false") !=
        std::string::npos);
  CHECK(r.out.find("{\"from\": \"b\", \"to\": \"a\", \"kind\": \"directed\", \"truth\": \"absent\", "
                   "\"reported\": true}") != std::string::npos);
}

TEST_CASE("score refuses graphs over other nodes and names every problem") {
  const std::string g = Write("other.yaml", "nodes: [a, b, x, y]\nedges: [a -> b]\n");
  const Outcome r = RunHandler(RunScoreCommand, {g, "--truth", kExample});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == g + ": nodes: observed node 'c' of the truth is missing\n" + g +
                     ": nodes: node 'x' is not an observed node of the truth\n" + g +
                     ": nodes: node 'y' is not an observed node of the truth\n");
  CHECK(RunHandler(RunScoreCommand, {g}).code == kExitInputError);  // no --truth
  CHECK(RunHandler(RunScoreCommand, {"--help"}).out.rfind("usage: locind score", 0) == 0);
}

// Every graph file the tool writes, from the example.
std::map<std::string, std::string> WrittenGraphs() {
  std::map<std::string, std::string> files;
  auto keep = [&](const std::string& name, const Outcome& r) {
    REQUIRE(r.code == kExitOk);
    files[name] = Write(name, r.out);
  };
  keep("graph.yaml", Outcome{0, "nodes: [a, b, c, h]\nedges: [a -> b, b -> b, h -> a, h -> c, c -> b]\nhidden: [h]\n", ""});
  keep("project.yaml", RunHandler(RunGraphCommand, {"project", kExample}));
  keep("project.json", RunHandler(RunGraphCommand, {"project", kExample, "--json"}));
  keep("class.yaml", RunHandler(RunGraphCommand, {"class", kExample}));
  keep("class.json", RunHandler(RunGraphCommand, {"class", kExample, "--json"}));
  keep("learn.txt", RunHandler(RunLearnCommand, {"--oracle", kExample, "--method", "pairwise"}));
  keep("learn.json", RunHandler(RunLearnCommand, {"--oracle", kExample, "--method", "pairwise", "--json"}));
  const std::string out_dir = Scratch("learn_out");
  REQUIRE(RunHandler(RunLearnCommand, {"--oracle", kExample, "--method", "pairwise", "--out", out_dir})
              .code == kExitOk);
  files["learn_out/graph.json"] = out_dir + "/graph.json";
  return files;
}

TEST_CASE("round trip: every command that reads a graph accepts every graph file the tool writes") {
  for (const auto& [name, path] : WrittenGraphs()) {
    CAPTURE(name);
    CHECK(RunHandler(RunGraphCommand, {"check", path, "--from", "a", "--to", "b"}).out ==
          "connected\n");
    CHECK(RunHandler(RunGraphCommand, {"project", path}).code == kExitOk);
    CHECK(RunHandler(RunGraphCommand, {"class", path, "--json"}).code == kExitOk);
    CHECK(RunHandler(RunGraphCommand, {"equivalent", path, path}).out == "equivalent\n");
    CHECK(RunHandler(RunGraphCommand, {"draw", path, "-o", Scratch("d.dot")}).code == kExitOk);
    CHECK(RunHandler(RunLearnCommand, {"--oracle", path, "--method", "pairwise"}).code == kExitOk);
    const Outcome scored = RunHandler(RunScoreCommand, {path, "--truth", kExample, "--json"});
    CHECK(scored.code == kExitOk);
    // Every solid edge of the class is in every written graph.
    CHECK(scored.out.find("\"power\": 1, \"false_edge_rate\": 0") != std::string::npos);
  }
}

TEST_CASE("round trip: every written file is equivalent to the example") {
  // The projection, the maximal graph, and the pairwise graph under the
  // oracle (the maximal graph without its dashed a <-> c, which the
  // directed a -> c, c -> a imply) all have the example's separations.
  for (const auto& [name, path] : WrittenGraphs()) {
    CAPTURE(name);
    CHECK(RunHandler(RunGraphCommand, {"equivalent", kExample, path}).out == "equivalent\n");
    CHECK(RunHandler(RunGraphCommand, {"equivalent", path, kExample}).out == "equivalent\n");
  }
}

}  // namespace
}  // namespace locind::app
