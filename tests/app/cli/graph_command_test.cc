// Golden outputs of `locind graph ...` on the bundled example, so a changed
// output format is caught.
#include <doctest/doctest.h>

#include "tests/app/command_fixture.h"

#include <cstdio>
#include <fstream>
#include <sstream>

#include "app/cli/command.h"
#include "app/io/error.h"

namespace locind::app {
namespace {

using testing::Outcome;

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
  const std::string other = "/tmp/locind_graph_command_test_other.yaml";
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
  const std::string dot = "/tmp/locind_graph_command_test.dot";
  REQUIRE(Run({"draw", kExample, "-o", dot, "--class"}).code == kExitOk);
  std::ifstream in(dot);
  std::stringstream text;
  text << in.rdbuf();
  CHECK(text.str().find("\"a\" -> \"c\" [color=\"#0072B2\", dir=both, arrowtail=normal, "
                        "style=dashed]") != std::string::npos);
  const std::string svg = "/tmp/locind_graph_command_test.svg";
  REQUIRE(Run({"draw", kExample, "-o", svg}).code == kExitOk);
  std::ifstream svg_in(svg);
  std::stringstream svg_text;
  svg_text << svg_in.rdbuf();
  CHECK(svg_text.str().find("<svg") != std::string::npos);
  CHECK(Run({"draw", kExample, "-o", "/tmp/x.png"}).code == kExitInputError);
  std::remove(dot.c_str());
  std::remove(svg.c_str());
}

}  // namespace
}  // namespace locind::app
