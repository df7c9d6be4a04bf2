// Where edges are lost: for one learner, per observation length, two stacked
// bars of edges per replicate that ran — the missed solid edges and the false
// edges — each split by its cause (metrics/error_attribution.h, the counts of
// summary.csv). Missed edges propagated from another test's error are split
// further by the rule that removed them (edges.csv `decision_rule`): D2, D3,
// F6(i)/F6(ii), B2, or another rule (an implied separation, screen's
// one-direction rule, ...). Propagation counted in summary.csv but not found
// in edges.csv (a file without decision columns) goes to "another rule", so
// the bars always add up to summary.csv's missed and false counts.
#pragma once

#include <array>
#include <string>
#include <vector>

#include "app/report/report_figures.h"
#include "app/results/results_reader.h"

namespace locind::app {

enum class LostCause {
  kOwnTest,               // the edge's own test was wrong
  kPropagatedD2,          // missed: removed through a wrong answer about another pair, by rule ...
  kPropagatedD3,
  kPropagatedF6,
  kPropagatedB2,
  kPropagatedOther,
  kPropagatedFalse,       // false edge kept because another answer was wrong
  kNotEstimable,          // false edge kept because a test could not be computed
  kReach,                 // the method's own rule or the edges it never reports
};
constexpr int kLostCauses = 9;

// Legend entries and colours, indexed by LostCause.
const std::vector<StackCategory>& LostCauseCategories();

// The propagation category of a missed edge removed by `rule`.
LostCause PropagationCause(const std::string& rule);

// Counts per cause for one summary line (cell x learner): missed and false.
struct LostCounts {
  std::array<int, kLostCauses> missed{};
  std::array<int, kLostCauses> false_edges{};
  int ran = 0;  // replicates that ran
};

// The counts of `line`, propagation of missed edges split by the rules of
// the rows of `edges` of the same cell and learner.
LostCounts CountLost(const SummaryLine& line, const std::vector<EdgeLine>& edges);

// The plot of one learner over `lines` (one panel's summary lines; those of
// other learners and lines without attribution are skipped): two bars per
// length, in mean edges per replicate.
StackedBarPlot LostEdgesPlot(const std::string& learner, const std::string& title,
                             const std::vector<const SummaryLine*>& lines,
                             const std::vector<EdgeLine>& edges);

}  // namespace locind::app
