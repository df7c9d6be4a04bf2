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
        "g.yaml:2:1: edge: unknown key (expected nodes, edges, hidden or dashed)");
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

Errors AllErrorsOf(const std::string& text) {
  GraphFileOrErrors r = ParseAnyGraphText(text, "g.yaml");
  REQUIRE(std::holds_alternative<Errors>(r));
  return std::get<Errors>(r);
}

GraphFile Read(const std::string& text) {
  GraphFileOrErrors r = ParseAnyGraphText(text, "g.json");
  if (auto* e = std::get_if<Errors>(&r)) FAIL(ToString(*e));
  return std::get<GraphFile>(std::move(r));
}

TEST_CASE("every problem of a graph file is reported, in file order") {
  const Errors errors = AllErrorsOf(
      "nodes: [a, b, c]\nedges: [a -> z, a => b, b <-> b, y -> c]\nhidden: [q, a]\n"
      "dashed: [a -> c]\n");
  REQUIRE(errors.size() == 6);
  CHECK(errors[0].ToString() == "g.yaml:2:9: edges: unknown node 'z'");
  CHECK(errors[1].ToString() == "g.yaml:2:17: edges: expected an edge 'a -> b' or 'a <-> b'");
  CHECK(errors[2].ToString() == "g.yaml:2:25: edges: a bidirected edge needs two distinct nodes");
  CHECK(errors[3].ToString() == "g.yaml:2:34: edges: unknown node 'y'");
  CHECK(errors[4].ToString() == "g.yaml:3:10: hidden: unknown node 'q'");
  CHECK(errors[5].ToString() == "g.yaml:4:10: dashed: 'a -> c' is not an edge of the graph");
  // Two bad names and a duplicate in the node list: three problems.
  CHECK(AllErrorsOf("nodes: [a, 1b, a, 2c]\n").size() == 3);
  // Two unknown keys.
  CHECK(AllErrorsOf("nodes: [a]\nnode: [b]\nedge: []\n").size() == 2);
}

TEST_CASE("the JSON shape and the dashed list read back with their marks") {
  // The shape of graph class --json (app/io/graph_json.h), plus learn's decisions key.
  const GraphFile json = Read(
      "{\"nodes\": [\"a\", \"b\"], \"edges\": [{\"from\": \"a\", \"to\": \"b\", "
      "\"kind\": \"directed\", \"mark\": \"solid\"}, {\"from\": \"b\", \"to\": \"a\", "
      "\"kind\": \"bidirected\", \"mark\": \"dashed\"}], \"decisions\": []}");
  CHECK(json.truth.graph.HasDirected(0, 1));
  CHECK(json.truth.graph.HasBidirected(0, 1));
  CHECK(json.truth.graph.DirectedEdgeCount() == 1);
  CHECK(json.has_marks);
  REQUIRE(json.dashed.size() == 1);
  CHECK(json.dashed[0] == graph::Edge{0, 1, graph::EdgeKind::kBidirected});
  // Every edge "solid": the writer's mark where no class was computed, read as unmarked.
  CHECK_FALSE(Read("{\"nodes\": [\"a\"], \"edges\": [{\"from\": \"a\", \"to\": \"a\", "
                   "\"mark\": \"solid\"}]}")
                  .has_marks);
  // The YAML of graph class: a dashed list.
  const GraphFile yaml = Read("nodes: [a, b]\nedges: [a -> b, b -> b]\ndashed: [b -> b]\n");
  CHECK(yaml.has_marks);
  CHECK(yaml.dashed == std::vector<graph::Edge>{{1, 1, graph::EdgeKind::kDirected}});
  CHECK(Read("nodes: [a, b]\nedges: [a -> b]\ndashed: []\n").has_marks);
  // Bad edge mappings (columns counted by hand).
  const Errors bad = AllErrorsOf(
      "nodes: [a, b]\nedges: [{from: a, to: b, kind: sideways}, {from: a, mark: x}, {from: a, to: b, "
      "colour: red}]\n");
  REQUIRE(bad.size() == 4);
  CHECK(bad[0].ToString() == "g.yaml:2:32: edges.kind: expected directed or bidirected");
  CHECK(bad[1].ToString() == "g.yaml:2:43: edges: an edge needs node names 'from' and 'to'");
  CHECK(bad[2].ToString() == "g.yaml:2:59: edges.mark: expected solid or dashed");
  CHECK(bad[3].ToString() == "g.yaml:2:80: edges.colour: unknown key (expected from, to, kind or mark)");
  // Embedded graphs (model and study files) take no marks.
  CHECK(std::get<Error>(ParseGraphKeys(YAML::Load("nodes: [a]\nedges: [{from: a, to: a, mark: dashed}]"),
                                       "m.yaml"))
            .ToString() == "m.yaml:2:26: edges.mark: unknown key (expected from, to or kind)");
}

TEST_CASE("a missing or empty file is an input error") {
  GraphOrError r = ReadGraphFile("/nonexistent/graph.yaml");
  REQUIRE(std::holds_alternative<Error>(r));
  CHECK(std::get<Error>(r).ToString() == "/nonexistent/graph.yaml: cannot open the file");
}

}  // namespace
}  // namespace locind::app
