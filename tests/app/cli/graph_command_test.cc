// Golden outputs of `locind graph ...` on the bundled example, so a changed
// output format is caught. The graphs in them are not taken from the code:
// the last test case derives each one with the definition-level brute force
// (tests/graph/brute_force.h).
#include <doctest/doctest.h>

#include "tests/app/command_fixture.h"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "tests/graph/brute_force.h"

namespace locind::app {
namespace {

using testing::Outcome;

// A file name of this test process in the temporary folder (parallel ctest
// processes and other builds never share one).
std::string Scratch(const std::string& name) {
  return (std::filesystem::temp_directory_path() /
          ("locind_graph_command_" + std::to_string(::getpid()) + "_" + name))
      .string();
}

Outcome Run(const std::vector<std::string>& args) {
  return testing::RunHandler(RunGraphCommand, args);
}

// examples/alarm_chain.yaml: a -> b, b -> b, h -> a, h -> c, c -> b, h hidden.
const std::string kExample = "examples/alarm_chain.yaml";

TEST_CASE("graph check prints separated or connected") {
  // c -> b directly: connected whatever is conditioned on.
  CHECK(Run({"check", kExample, "--from", "c", "--to", "b", "--given", "a,b"}).out ==
        "connected\n");
  // Projection: a -> a, a -> b, b -> b, c -> b, c -> c, a <-> c. From b, the
  // walks step back to a or c (both in C, blocked) or take b -> b and then
  // need b as a collider, but b is no ancestor of {a, c}: separated.
  CHECK(Run({"check", kExample, "--from", "b", "--to", "a", "--given", "a,c"}).out ==
        "separated\n");
  // a <-> c (the hidden common parent h): c depends on a's past.
  CHECK(Run({"check", kExample, "--from", "a", "--to", "c"}).out == "connected\n");
}

TEST_CASE("graph check refuses hidden and unknown nodes") {
  Outcome r = Run({"check", kExample, "--from", "h", "--to", "b"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "examples/alarm_chain.yaml: --from: node 'h' is hidden\n");
  r = Run({"check", kExample, "--from", "q", "--to", "b"});
  CHECK(r.err == "examples/alarm_chain.yaml: --from: unknown node 'q'\n");
  r = Run({"check", kExample, "--from", "a", "--to", "b", "--given", "a"});
  CHECK(r.code == kExitInputError);
}

TEST_CASE("graph project and class print the projection and the equivalence graph") {
  CHECK(Run({"project", kExample}).out ==
        "nodes: [a, b, c]\nedges: [a -> a, a -> b, b -> b, c -> b, c -> c, a <-> c]\n");
  CHECK(Run({"class", kExample}).out ==
        "nodes: [a, b, c]\n"
        "edges: [a -> a, a -> b, a -> c, b -> b, c -> a, c -> b, c -> c, a <-> c]\n"
        "dashed: [a -> a, a -> c, c -> a, c -> c, a <-> c]\n");
  const std::string json = Run({"class", kExample, "--json"}).out;
  CHECK(json.rfind("{\"nodes\": [\"a\", \"b\", \"c\"], \"edges\": [{\"from\": \"a\", \"to\": \"a\", "
                   "\"kind\": \"directed\", \"mark\": \"dashed\"}",
                   0) == 0);
  CHECK(json.find("{\"from\": \"a\", \"to\": \"c\", \"kind\": \"bidirected\", \"mark\": \"dashed\"}") !=
        std::string::npos);
}

TEST_CASE("graph equivalent compares projected graphs") {
  const std::string other = Scratch("other.yaml");
  {
    // The maximal graph of the example's class, nodes in another order.
    std::ofstream f(other);
    f << "nodes: [c, b, a]\nedges: [a -> a, a -> b, a -> c, b -> b, c -> a, c -> b, c -> c, "
         "a <-> c]\n";
  }
  CHECK(Run({"equivalent", kExample, other}).out == "equivalent\n");
  {
    std::ofstream f(other);
    f << "nodes: [a, b, c]\nedges: [a -> b, c -> b]\n";
  }
  CHECK(Run({"equivalent", kExample, other}).out == "not equivalent\n");
  std::remove(other.c_str());
}

TEST_CASE("graph draw writes DOT and SVG") {
  const std::string dot = Scratch("class.dot");
  REQUIRE(Run({"draw", kExample, "-o", dot, "--class"}).code == kExitOk);
  std::ifstream in(dot);
  std::stringstream text;
  text << in.rdbuf();
  CHECK(text.str().find("\"a\" -> \"c\" [color=\"#0072B2\", dir=both, arrowtail=normal, "
                        "style=dashed]") != std::string::npos);
  const std::string svg = Scratch("graph.svg");
  REQUIRE(Run({"draw", kExample, "-o", svg}).code == kExitOk);
  std::ifstream svg_in(svg);
  std::stringstream svg_text;
  svg_text << svg_in.rdbuf();
  CHECK(svg_text.str().find("<svg") != std::string::npos);
  CHECK(Run({"draw", kExample, "-o", Scratch("refused.png")}).code == kExitInputError);
  std::remove(dot.c_str());
  std::remove(svg.c_str());
}

// The golden graphs above, derived by the brute force: the projection keeps
// every separation among a, b, c of the full graph (docs/theory.md F3), the
// class's edges are the maximal graph (F2) and its dashed edges those whose
// removal keeps every separation (F4); the `check` answers by the definition.
TEST_CASE("the golden projection, class and check answers agree with the brute force") {
  using testing::BruteGraph;
  enum { a, b, c, h };
  BruteGraph full(4);  // a -> b, b -> b, h -> a, h -> c, c -> b
  full.dir[a][b] = full.dir[b][b] = full.dir[h][a] = full.dir[h][c] = full.dir[c][b] = true;
  BruteGraph projection(3);  // golden: a -> a, a -> b, b -> b, c -> b, c -> c, a <-> c
  projection.dir[a][a] = projection.dir[a][b] = projection.dir[b][b] = true;
  projection.dir[c][b] = projection.dir[c][c] = true;
  projection.bi[a][c] = projection.bi[c][a] = true;
  int compared = 0;
  for (int from = 0; from < 3; ++from) {
    for (int to = 0; to < 3; ++to) {
      for (uint32_t given = 0; given < 8; ++given) {
        if ((given >> from) & 1) continue;
        CHECK(testing::BruteConnected(full, from, to, given) ==
              testing::BruteConnected(projection, from, to, given));
        ++compared;
      }
    }
  }
  CHECK(compared == 36);
  // Golden class: a -> a, a -> b, a -> c, b -> b, c -> a, c -> b, c -> c,
  // a <-> c; dashed a -> a, a -> c, c -> a, c -> c, a <-> c.
  BruteGraph maximal = projection;
  maximal.dir[a][c] = maximal.dir[c][a] = true;
  CHECK(testing::BruteMaximal(projection) == maximal);
  std::vector<bool> dashed;  // in AllEdges order over the maximal graph's edges
  for (const testing::BruteEdge& e : testing::AllEdges(3)) {
    if (!testing::HasEdge(maximal, e)) continue;
    const bool is_loop_or_ac = e.bidirected || (e.u != b && e.v != b);
    dashed.push_back(is_loop_or_ac);  // every edge not touching b
  }
  CHECK(testing::BruteDashed(maximal) == dashed);
  // The three `check` answers (bit masks: a = 1, b = 2, c = 4).
  CHECK(testing::BruteConnected(full, c, b, 1 | 2));        // connected
  CHECK_FALSE(testing::BruteConnected(full, b, a, 1 | 4));  // separated
  CHECK(testing::BruteConnected(full, a, c, 0));            // connected
}

}  // namespace
}  // namespace locind::app

namespace locind::app {
namespace {

// The answer of check and equivalent is also the exit code (README.md,
// "The graph engine from the command line"): 0 separated / equivalent,
// 1 connected / not equivalent, 2 bad input or usage.
TEST_CASE("graph check and graph equivalent exit 0 or 1 by their answer, 2 on errors") {
  CHECK(Run({"check", kExample, "--from", "b", "--to", "a", "--given", "a,c"}).code == kExitOk);
  CHECK(Run({"check", kExample, "--from", "c", "--to", "b", "--given", "a,b"}).code == kExitFailure);
  CHECK(Run({"check", kExample, "--from", "q", "--to", "b"}).code == kExitInputError);
  CHECK(Run({"equivalent", kExample, kExample}).code == kExitOk);
  const std::string other = Scratch("answer.yaml");
  {
    std::ofstream f(other);
    f << "nodes: [a, b, c]\nedges: [a -> b, c -> b]\n";
  }
  const Outcome r = Run({"equivalent", kExample, other});
  CHECK(r.out == "not equivalent\n");
  CHECK(r.code == kExitFailure);
  CHECK(Run({"equivalent", kExample, Scratch("absent.yaml")}).code == kExitInputError);
  std::remove(other.c_str());
}

TEST_CASE("every graph subcommand takes --help and no subcommand prints the usage (not a pointer elsewhere)") {
  for (const char* sub : {"check", "project", "class", "equivalent", "draw"}) {
    const Outcome r = Run({sub, "--help"});
    CHECK(r.code == kExitOk);
    CHECK(r.out.rfind(std::string("usage: locind graph ") + sub, 0) == 0);
    CHECK(r.out.find('\t') == std::string::npos);
  }
  // --help after other arguments too.
  CHECK(Run({"check", kExample, "--from", "a", "--help"}).code == kExitOk);
  const Outcome none = Run({});
  CHECK(none.code == kExitInputError);
  CHECK(none.err.rfind("locind graph: missing SUBCOMMAND\nusage: locind graph SUBCOMMAND", 0) == 0);
  CHECK(none.err.find("DEVELOPERS.md") == std::string::npos);
  CHECK(none.err.find("locind graph check FILE --from A --to B") != std::string::npos);
  const Outcome help = Run({"--help"});
  CHECK(help.code == kExitOk);
  CHECK(help.out == none.err.substr(none.err.find('\n') + 1));
}

TEST_CASE("a missing graph file is named as the usage writes it") {
  Outcome r = Run({"check", "--from", "a", "--to", "b"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err.rfind("locind graph check: missing FILE (a graph file)\n", 0) == 0);
  r = Run({"equivalent", kExample});
  CHECK(r.err.rfind("locind graph equivalent: missing FILE2 (the second graph file)\n", 0) == 0);
  r = Run({"project", kExample, kExample});
  CHECK(r.err.rfind("locind graph project: unexpected argument 'examples/alarm_chain.yaml'\n", 0) == 0);
}

}  // namespace
}  // namespace locind::app
