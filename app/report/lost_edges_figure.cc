#include "app/report/lost_edges_figure.h"

#include <algorithm>

#include "app/results/results_rows.h"

namespace locind::app {

const std::vector<StackCategory>& LostCauseCategories() {
  // Okabe & Ito (2008) colours as elsewhere in the report; propagation in
  // the blue-green family, own test errors vermillion, reach grey.
  static const std::vector<StackCategory> categories = {
      {"own test wrong", "#D55E00"},
      {"propagated via D2", "#0072B2"},
      {"propagated via D3", "#56B4E9"},
      {"propagated via F6", "#009E73"},
      {"propagated via B2", "#CC79A7"},
      {"propagated, other rule", "#332288"},
      {"false edge kept: another test wrong", "#88CCEE"},
      {"own test not estimable", "#E69F00"},
      {"method's reach", "#AAAAAA"}};
  return categories;
}

LostCause PropagationCause(const std::string& rule) {
  if (rule == "D2") return LostCause::kPropagatedD2;
  if (rule == "D3") return LostCause::kPropagatedD3;
  if (rule == "F6(i)" || rule == "F6(ii)") return LostCause::kPropagatedF6;
  if (rule == "B2") return LostCause::kPropagatedB2;
  return LostCause::kPropagatedOther;
}

LostCounts CountLost(const SummaryLine& line, const std::vector<EdgeLine>& edges) {
  LostCounts c;
  c.ran = line.replicates - line.failed;
  const auto at = [](LostCause k) { return static_cast<size_t>(k); };
  c.missed[at(LostCause::kOwnTest)] = line.missed_own_test;
  c.missed[at(LostCause::kReach)] = line.missed_reach;
  int split = 0;
  for (const EdgeLine& e : edges) {
    if (e.cell != line.cell || e.learner != line.learner || e.reported || e.truth_status != "solid") continue;
    if (e.error_cause != "propagation") continue;
    ++c.missed[at(PropagationCause(e.decision_rule))];
    ++split;
  }
  // Whatever edges.csv does not explain stays in the total (a file without
  // the decision columns, or rows of replicates left out of this folder).
  c.missed[at(LostCause::kPropagatedOther)] += std::max(0, line.missed_propagation - split);
  c.false_edges[at(LostCause::kOwnTest)] = line.false_own_test;
  c.false_edges[at(LostCause::kPropagatedFalse)] = line.false_propagation;
  c.false_edges[at(LostCause::kNotEstimable)] = line.false_not_estimable;
  c.false_edges[at(LostCause::kReach)] = line.false_reach;
  return c;
}

namespace {

std::vector<double> PerReplicate(const std::array<int, kLostCauses>& counts, int ran) {
  std::vector<double> out(kLostCauses, 0.0);
  if (ran <= 0) return out;
  for (int i = 0; i < kLostCauses; ++i) out[i] = static_cast<double>(counts[i]) / ran;
  return out;
}

}  // namespace

StackedBarPlot LostEdgesPlot(const std::string& learner, const std::string& title,
                             const std::vector<const SummaryLine*>& lines,
                             const std::vector<EdgeLine>& edges) {
  StackedBarPlot plot;
  plot.title = title;
  plot.y_label = "edges per replicate";
  plot.categories = LostCauseCategories();
  std::vector<const SummaryLine*> mine;
  for (const SummaryLine* line : lines) {
    if (line->learner == learner && line->has_attribution) mine.push_back(line);
  }
  std::sort(mine.begin(), mine.end(),
            [](const SummaryLine* a, const SummaryLine* b) { return a->length < b->length; });
  for (size_t i = 0; i < mine.size(); ++i) {
    const LostCounts c = CountLost(*mine[i], edges);
    const double x = static_cast<double>(i);
    plot.bars.push_back({x - 0.2, "missed", PerReplicate(c.missed, c.ran)});
    plot.bars.push_back({x + 0.2, "false", PerReplicate(c.false_edges, c.ran)});
    plot.group_labels.push_back({x, "length " + Num(mine[i]->length)});
  }
  return plot;
}

}  // namespace locind::app
