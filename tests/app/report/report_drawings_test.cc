// Drawings of the report: a learned graph shows false edges and missed
// solid edges in our colours; the truth, projection and class drawings
// carry their titles and marks.
#include "app/report/report_drawings.h"

#include <doctest/doctest.h>

#include "metrics/truth_class.h"

namespace locind::app {
namespace {

// a -> b, with hidden h -> b and h -> c: the projection has b <-> c.
graph::TruthGraph Truth() {
  graph::TruthGraph t;
  t.graph = graph::Dmg({"a", "b", "c", "h"});
  t.graph.AddDirected(0, 1);
  t.graph.AddDirected(3, 1);
  t.graph.AddDirected(3, 2);
  t.hidden = {3};
  return t;
}

EdgeLine Row(const std::string& edge, const std::string& status, bool reported) {
  EdgeLine e;
  e.edge = edge;
  e.truth_status = status;
  e.reported = reported;
  return e;
}

TEST_CASE("a learned graph: false edges thick vermillion, missed solid edges dotted orange") {
  const Result<metrics::TruthClass> c = metrics::ComputeTruthClass(Truth());
  REQUIRE(c.ok());
  const std::string dot = LearnedDot(*c, {Row("a -> b", "solid", true), Row("c -> a", "absent", true),
                                          Row("b <-> c", "solid", false), Row("x -> a", "absent", true)},
                                     "my title");
  CHECK(dot.find("label=\"my title\"") != std::string::npos);
  CHECK(dot.find("\"a\" -> \"b\" [color=\"#333333\"];") != std::string::npos);
  CHECK(dot.find("\"c\" -> \"a\" [color=\"#D55E00\", penwidth=2.5];") != std::string::npos);
  CHECK(dot.find("\"b\" -> \"c\" [color=\"#E69F00\", dir=both, arrowtail=normal, style=dotted, penwidth=2.5];") !=
        std::string::npos);
  CHECK(dot.find("\"x\"") == std::string::npos);  // unknown node: row skipped
}

TEST_CASE("truth, projection and class drawings") {
  PreparedTruth t;
  t.label = "t1";
  t.truth = Truth();
  t.truth_class = metrics::ComputeTruthClass(t.truth);
  REQUIRE(t.truth_class.ok());
  const std::string truth = TruthDot(t);
  CHECK(truth.find("label=\"truth t1\"") != std::string::npos);
  CHECK(truth.find("\"h\" [shape=box, style=\"dashed,filled\"") != std::string::npos);
  const std::string projection = ProjectionDot(t);
  CHECK(projection.find("\"h\"") == std::string::npos);
  CHECK(projection.find("\"b\" -> \"c\" [color=\"#0072B2\", dir=both") != std::string::npos);
  CHECK(ClassDot(t).find("label=\"equivalence graph t1\"") != std::string::npos);
}

}  // namespace
}  // namespace locind::app
