// The rows of a study's results and their CSV text (columns documented in
// results/README.md).
//
//   replicates.csv  one ReplicateRow per replicate x learner
//   edges.csv       one audit row per replicate x learner x edge that was
//                   reported or is solid in the truth
//   summary.csv     one row per cell x learner (metrics::Summarize)
//   comparisons.csv one row per cell x pair of learners (metrics::Compare)
//   null_tests.csv  tests whose null hypothesis holds in the truth, for the
//                   p-value calibration plots of the report
//
// Numbers are written in the shortest form that reads back to the same
// double; undefined values (NaN) are empty fields. Free text (messages) has
// commas, quotes, tabs and line breaks replaced, so no field needs quoting.
// Columns whose name starts with "timing_" hold wall-clock times: they are the
// only columns that differ between two runs of the same study.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "app/study/study_grid.h"
#include "metrics/cell_summary.h"
#include "metrics/error_attribution.h"
#include "metrics/learner_comparison.h"
#include "metrics/replicate_score.h"

namespace locind::app {

struct ReplicateRow {
  int cell = 0;
  int replicate = 0;
  std::string truth;  // truth label (TruthLabel)
  double length = 0;
  double level = 0;
  int hidden_count = 0;
  std::optional<double> stationarity_target;
  double stationarity_value = NAN;  // spectral radius of K, or largest real part of M
  std::string learner;
  std::string method;
  std::string test;
  bool ok = true;
  std::string message;         // why it failed; empty when ok
  double observed_points = 0;  // events (event streams) or samples per process (paths)
  metrics::ReplicateScore score;
  int tests = 0;
  int not_estimable = 0;
  int largest_given = 0;
  double timing_simulate_seconds = 0;
  double timing_test_seconds = 0;
  double timing_learn_seconds = 0;
  double timing_score_seconds = 0;
  // --- Why edges were lost (metrics/error_attribution.h): counts only; the
  // columns come after the timing columns ---
  metrics::ErrorAttribution attribution;
  // --- Trials (grid.trials): the last column ---
  int trials = 1;  // independent trials of `length` each
};

// Everything one unit (cell x replicate) produced, in learner order.
struct UnitResult {
  Unit unit;
  std::vector<ReplicateRow> rows;
  std::vector<std::string> edge_lines;  // edges.csv lines without the newline
  std::vector<std::string> null_test_lines;  // null_tests.csv lines without the newline
};

const std::string& ReplicateHeader();
const std::string& EdgeHeader();
const std::string& SummaryHeader();
const std::string& ComparisonHeader();
const std::string& NullTestHeader();

std::string FormatReplicateRow(const ReplicateRow& row);
// Parses a line of replicates.csv; nullopt when it is malformed.
std::optional<ReplicateRow> ParseReplicateRow(const std::string& line);

// Free text made safe for a CSV field.
std::string CleanText(const std::string& text);
// Shortest round-trip number; NaN gives an empty field.
std::string Num(double value);

// One summary.csv line for a cell and learner.
std::string FormatSummaryRow(const Cell& cell, const std::string& learner,
                             const metrics::CellSummary& summary);

// One comparisons.csv line: `learner` minus `reference` in a cell.
std::string FormatComparisonRow(const Cell& cell, const std::string& learner,
                                const std::string& reference, const metrics::LearnerComparison& c);

// The records of a group of rows, for metrics::Summarize.
metrics::ReplicateRecord RecordOf(const ReplicateRow& row);

}  // namespace locind::app
