// Where edges are lost: the cause counts of summary.csv per replicate, the
// propagation of missed edges split by the rules of edges.csv, and bars that
// add up to the missed and false counts. Expected values follow from the
// hand-made lines below (no code output).
#include "app/report/lost_edges_figure.h"

#include <doctest/doctest.h>

#include <numeric>

namespace locind::app {
namespace {

SummaryLine Line(int cell, double length, const std::string& learner) {
  SummaryLine s;
  s.cell = cell;
  s.length = length;
  s.learner = learner;
  s.replicates = 5;
  s.failed = 1;  // 4 ran
  s.has_attribution = true;
  s.solid = 20;
  s.solid_found = 12;  // 8 missed: 2 own test, 5 propagated, 1 reach
  s.missed_own_test = 2;
  s.missed_propagation = 5;
  s.missed_reach = 1;
  s.false_edges = 4;  // 1 own test, 1 propagated, 1 not estimable, 1 reach
  s.false_own_test = s.false_propagation = s.false_not_estimable = s.false_reach = 1;
  return s;
}

EdgeLine Missed(int cell, const std::string& learner, const std::string& rule) {
  EdgeLine e;
  e.cell = cell;
  e.learner = learner;
  e.truth_status = "solid";
  e.reported = false;
  e.decision_rule = rule;
  e.error_cause = "propagation";
  return e;
}

size_t At(LostCause c) { return static_cast<size_t>(c); }

TEST_CASE("propagated missed edges are split by rule; what edges.csv lacks stays in the total") {
  const SummaryLine line = Line(3, 4000, "maximal-search/hawkes-lr");
  std::vector<EdgeLine> edges = {Missed(3, line.learner, "D2"), Missed(3, line.learner, "D2"),
                                 Missed(3, line.learner, "F6(ii)"), Missed(3, line.learner, "B2"),
                                 // not counted: another cell, another learner, a reported edge, another cause
                                 Missed(2, line.learner, "D2"), Missed(3, "pairwise/hawkes-lr", "D2")};
  EdgeLine reported = Missed(3, line.learner, "D3");
  reported.reported = true;
  EdgeLine own = Missed(3, line.learner, "separated");
  own.error_cause = "own_test";
  edges.push_back(reported);
  edges.push_back(own);
  const LostCounts c = CountLost(line, edges);
  CHECK(c.ran == 4);
  CHECK(c.missed[At(LostCause::kOwnTest)] == 2);
  CHECK(c.missed[At(LostCause::kPropagatedD2)] == 2);
  CHECK(c.missed[At(LostCause::kPropagatedD3)] == 0);
  CHECK(c.missed[At(LostCause::kPropagatedF6)] == 1);
  CHECK(c.missed[At(LostCause::kPropagatedB2)] == 1);
  CHECK(c.missed[At(LostCause::kPropagatedOther)] == 1);  // 5 propagated, 4 found in edges.csv
  CHECK(c.missed[At(LostCause::kReach)] == 1);
  CHECK(std::accumulate(c.missed.begin(), c.missed.end(), 0) == line.solid - line.solid_found);
  CHECK(c.false_edges[At(LostCause::kOwnTest)] == 1);
  CHECK(c.false_edges[At(LostCause::kPropagatedFalse)] == 1);
  CHECK(c.false_edges[At(LostCause::kNotEstimable)] == 1);
  CHECK(c.false_edges[At(LostCause::kReach)] == 1);
  CHECK(std::accumulate(c.false_edges.begin(), c.false_edges.end(), 0) == line.false_edges);
  CHECK(PropagationCause("implied separation") == LostCause::kPropagatedOther);
  CHECK(PropagationCause("F6(i)") == LostCause::kPropagatedF6);
}

TEST_CASE("one learner's bars: two per length, sorted by length, in edges per replicate that ran") {
  const SummaryLine long_line = Line(1, 16000, "margin-search/hawkes-lr");
  const SummaryLine short_line = Line(0, 4000, "margin-search/hawkes-lr");
  const SummaryLine other = Line(0, 4000, "pairwise/hawkes-lr");
  SummaryLine old = Line(2, 1000, "margin-search/hawkes-lr");
  old.has_attribution = false;  // a summary.csv from before the cause columns: no bars
  const StackedBarPlot plot =
      LostEdgesPlot("margin-search/hawkes-lr", "t", {&long_line, &other, &short_line, &old}, {});
  REQUIRE(plot.bars.size() == 4);
  CHECK(plot.categories.size() == static_cast<size_t>(kLostCauses));
  CHECK(plot.bars[0].x == doctest::Approx(-0.2));
  CHECK(plot.bars[0].tic == "missed");
  CHECK(plot.bars[1].tic == "false");
  CHECK(plot.bars[3].x == doctest::Approx(1.2));
  REQUIRE(plot.group_labels.size() == 2);
  CHECK(plot.group_labels[0].second == "length 4000");
  CHECK(plot.group_labels[1].second == "length 16000");
  // No rule split from edges.csv here: all 5 propagated edges are "other"; / 4 replicates.
  CHECK(plot.bars[0].parts[At(LostCause::kPropagatedOther)] == 1.25);
  CHECK(plot.bars[0].parts[At(LostCause::kOwnTest)] == 0.5);
  const double missed = std::accumulate(plot.bars[0].parts.begin(), plot.bars[0].parts.end(), 0.0);
  const double false_edges = std::accumulate(plot.bars[1].parts.begin(), plot.bars[1].parts.end(), 0.0);
  CHECK(missed == 2.0);       // 8 missed over 4 replicates
  CHECK(false_edges == 1.0);  // 4 false over 4 replicates
}

}  // namespace
}  // namespace locind::app
