// The tables a study report is drawn from, read back from a result folder:
// summary.csv, edges.csv, null_tests.csv, comparisons.csv (a folder from
// before it has none) and, when `locind plan --out` wrote it, plan.csv (columns: results/README.md). Columns are found by name, so
// the report reads exactly what the files say.
#pragma once

#include <array>
#include <cmath>
#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "metrics/intervals.h"
#include "metrics/replicate_score.h"

namespace locind::app {

struct SummaryLine {
  int cell = 0;
  double length = 0;
  double level = 0;
  int hidden_count = 0;
  std::optional<double> stationarity_target;
  int trials = 1;  // column trials (summary.csv from before it: 1)
  std::string learner;
  int replicates = 0;
  int failed = 0;
  metrics::Interval power, false_edge_rate, class_recovery, hamming, tests, seconds;
  // Design-aware scoring: truths behind the intervals, what the method can
  // report and its power ceiling, mark agreement, and per edge group
  // (indexed by metrics::EdgeGroup) power, false edges and counts.
  int truths = 0;
  double power_ceiling = NAN;
  std::array<bool, metrics::kEdgeGroups> reports{true, true, true};
  bool reports_marks = false;
  metrics::Interval mark_agreement;
  std::array<metrics::Interval, metrics::kEdgeGroups> group_power, group_false_edge_rate;
  std::array<int, metrics::kEdgeGroups> group_solid{}, group_solid_found{}, group_reported{},
      group_false_edges{};
  // Why edges were lost (metrics/error_attribution.h): the cause counts,
  // summed over the replicates that ran; has_attribution is false for a
  // summary.csv written before those columns.
  bool has_attribution = false;
  int solid = 0, solid_found = 0, false_edges = 0;
  int missed_own_test = 0, missed_propagation = 0, missed_reach = 0;
  int false_own_test = 0, false_propagation = 0, false_not_estimable = 0, false_reach = 0;
};

// One row of comparisons.csv: learner minus reference on paired replicates.
struct ComparisonLine {
  int cell = 0;
  double length = 0;
  double level = 0;
  int hidden_count = 0;
  std::string learner, reference;
  int paired = 0;
  int truths = 0;
  metrics::Interval power, directed_power, false_edge_rate, class_recovery;
};

struct EdgeLine {
  int cell = 0;
  int replicate = 0;
  std::string truth, learner, edge, truth_status, learner_mark;
  bool reported = false;
  // The decision record's rule and the attributed cause (empty when the
  // file has no such columns, or for an edge that is neither missed nor false).
  std::string decision_rule, error_cause;
};

struct NullTestLine {
  int cell = 0;
  int replicate = 0;
  std::string learner, test, target, sources, given;
  double length = 0;
  double p_value = 0;
  bool all_parents_given = false;  // column all_parents_given: yes / no
  // Column first_of_pair (yes / no; yes in files written before it): the
  // learner's first answered test of this target and sources.
  bool first_of_pair = true;
};

struct PlanLine {
  std::string learner;
  double target_power = 0;
  double target_false_edge_rate = 0;
  bool reached = false;
  double length = 0;  // NaN when not reached
  // The combination planned for (plan.csv from before these columns: unset,
  // the plan then applies to every panel).
  std::optional<double> level;
  std::optional<int> hidden_count;
  std::optional<double> stationarity_target;
  // What was searched (column searched; "length" when absent) and, for a
  // length search, the combination's number of trials (column trials).
  std::string searched = "length";
  std::optional<int> trials;
  // True when the plan is for this combination (the panel of a report); a
  // plan without the combination columns fits every combination.
  bool Fits(double panel_level, int panel_hidden_count, std::optional<double> panel_target) const;
};

struct ReportData {
  std::vector<SummaryLine> summary;
  std::vector<ComparisonLine> comparisons;  // empty for a folder from before comparisons.csv
  std::vector<EdgeLine> edges;
  std::vector<NullTestLine> null_tests;
  std::vector<PlanLine> plan;  // empty without plan.csv
};

// Reads the files of `dir`. Fails naming FILE:LINE:COLUMN: FIELD when a file
// is missing (plan.csv and comparisons.csv may be) or a value does not parse.
Result<ReportData> ReadReportData(const std::string& dir);

}  // namespace locind::app
