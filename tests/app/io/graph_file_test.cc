#include "app/io/graph_file.h"

#include <doctest/doctest.h>

namespace locind::app {
namespace {

Error ErrorOf(const std::string& text) {
  GraphOrError r = ParseGraphText(text, "g.yaml");
  REQUIRE(std::holds_alternative<Error>(r));
  return std::get<Error>(r);
}

TEST_CASE("reads nodes, edges and hidden nodes") {
  GraphOrError r = ParseGraphText(
      "nodes: [a, b, c, h]\nedges: [a -> b, b -> b, h -> a, h -> c, b <-> c]\nhidden: [h]\n",
      "g.yaml");
  REQUIRE(std::holds_alternative<graph::TruthGraph>(r));
  const auto& t = std::get<graph::TruthGraph>(r);
  CHECK(t.graph.size() == 4);
  CHECK(t.graph.HasDirected(0, 1));
  CHECK(t.graph.HasDirected(1, 1));
  CHECK(t.graph.HasBidirected(2, 1));
  CHECK(t.graph.DirectedEdgeCount() == 4);
  CHECK(t.hidden == std::vector<int>{3});
  CHECK(FormatGraph(t) ==
        "nodes: [a, b, c, h]\nedges: [a -> b, b -> b, h -> a, h -> c, b <-> c]\nhidden: [h]\n");
}

TEST_CASE("errors name the file, line, column and field") {
  CHECK(ErrorOf("nodes: [a, b]\nedges: [a -> z]\n").ToString() ==
        "g.yaml:2:9: edges: unknown node 'z'");
  CHECK(ErrorOf("nodes: [a, b, a]\n").ToString() == "g.yaml:1:15: nodes: duplicate node 'a'");
  CHECK(ErrorOf("nodes: [a, b]\nedges: [a => b]\n").ToString() ==
        "g.yaml:2:9: edges: expected an edge 'a -> b' or 'a <-> b'");
  CHECK(ErrorOf("nodes: [a, b]\nedges: [a <-> a]\n").ToString() ==
        "g.yaml:2:9: edges: a bidirected edge needs two distinct nodes");
  CHECK(ErrorOf("nodes: [a, b]\nedge: [a -> b]\n").ToString() ==
        "g.yaml:2:1: edge: unknown key (expected nodes, edges or hidden)");
  CHECK(ErrorOf("nodes: [a, b]\nhidden: [a, b]\n").ToString() ==
        "g.yaml:2:9: hidden: at least one node must be observed");
  CHECK(ErrorOf("nodes: [a, 1b]\n").ToString().rfind("g.yaml:1:12: nodes: expected a node name", 0) ==
        0);
  CHECK(ErrorOf("nodes: [a, b\n").ToString().rfind("g.yaml:", 0) == 0);
  CHECK(ErrorOf("edges: [a -> b]\n").field == "nodes");
  CHECK(ErrorOf("nodes: [a, b]\nnodes: [c]\n").ToString() == "g.yaml:2:1: nodes: given twice");
  CHECK(ErrorOf("nodes: [a, b]\nhidden: [c]\n").ToString() ==
        "g.yaml:2:10: hidden: unknown node 'c'");
  CHECK(ErrorOf("nodes: [a, b]\nhidden: [a, a]\n").ToString() ==
        "g.yaml:2:13: hidden: node 'a' listed twice");
  CHECK(ErrorOf("nodes: a\n").ToString() == "g.yaml:1:8: nodes: expected a list of node names");
  CHECK(ErrorOf("nodes: []\n").ToString() == "g.yaml:1:8: nodes: a graph needs at least one node");
  CHECK(ErrorOf("nodes: [a]\nedges: a -> a\n").ToString() ==
        "g.yaml:2:8: edges: expected a list of edges");
  CHECK(ErrorOf("").ToString() == "g.yaml:1:1: expected a mapping with nodes and edges");
  CHECK(ErrorOf("[a, b]\n").ToString() == "g.yaml:1:1: expected a mapping with nodes and edges");
  // A control character quoted back by the YAML parser stays on one line.
  const std::string escaped = ErrorOf("nodes: [\"a\\\x01\"]\n").ToString();
  CHECK(escaped.find('\x01') == std::string::npos);
  CHECK(escaped.rfind("g.yaml:1:", 0) == 0);
}

TEST_CASE("a missing or empty file is an input error") {
  GraphOrError r = ReadGraphFile("/nonexistent/graph.yaml");
  REQUIRE(std::holds_alternative<Error>(r));
  CHECK(std::get<Error>(r).ToString() == "/nonexistent/graph.yaml: cannot open the file");
}

}  // namespace
}  // namespace locind::app
