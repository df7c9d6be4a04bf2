// How well each statistical test holds its level: the rejection share of the
// tests whose null hypothesis holds in the truth (null_tests.csv), for
// calibration.csv and the calibration table of the report (columns:
// results/README.md).
//
// Each true-null test is one trial, rejected when its p-value is at or below
// the level of its cell (the learners' decision rule,
// learners/methods/test_runner.h). Trials are pooled per test kind,
// observation length, level and all_parents_given (can the test's model be
// right: metrics::AllParentsGiven); a query asked of one data set (cell,
// replicate, target, sources, given) counts once however many learners
// asked it, as the p-value is the same. Only a learner's first answered test
// of each target and sources counts (column first_of_pair): a learner that
// tries a larger conditioning set only after a rejection asks its follow-ups
// because of that rejection, and they reject far more often than the level
// even when the test is exact (docs/tests.md, drift-exact-lr). The share gets an exact
// (Clopper-Pearson) 95% interval; a group whose interval lies entirely above
// the level rejects too often, and the report warns about it.
#pragma once

#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "app/results/results_reader.h"
#include "app/results/results_rows.h"
#include "app/study/study_grid.h"
#include "metrics/intervals.h"

namespace locind::app {

struct CalibrationRow {
  std::string test;
  double length = 0;
  double level = 0;
  bool all_parents_given = false;
  int64_t tests = 0;     // distinct true-null tests
  int64_t rejected = 0;  // of them, p <= level
  metrics::Interval share;  // rejected / tests with its Clopper-Pearson 95% interval
  // True when the whole interval lies above the level: too many rejections.
  bool AboveLevel() const { return share.low > level; }
};

// The null-test lines that count, in file order: those with first_of_pair,
// each distinct query on one data set once (the first line of each).
std::vector<const NullTestLine*> DistinctNullTests(const std::vector<NullTestLine>& lines);

// The table, sorted by test, length, level, then all_parents_given (yes
// first). A line whose cell is not in `cells` is left out.
std::vector<CalibrationRow> CalibrationTable(const std::vector<NullTestLine>& lines,
                                             const std::vector<Cell>& cells);

const std::string& CalibrationHeader();
std::string FormatCalibrationRow(const CalibrationRow& row);

// One line of null_tests.csv as the runner writes it (NullTestHeader);
// nullopt when a field is missing or does not parse.
std::optional<NullTestLine> ParseNullTestLine(const std::string& line);

// calibration.csv of the finished units: header and one line per group.
// Null-test lines that do not parse are left out (the runner writes none).
std::string CalibrationCsv(const std::vector<Cell>& cells, const std::map<Unit, UnitResult>& units);

// The one-line warning for a row above the level, e.g. "hawkes-lr at length
// 600, level 0.05, all parents given: no: 9 of 40 true-null tests rejected
// (share 0.225, exact 95% interval 0.108 to 0.385)".
std::string CalibrationWarning(const CalibrationRow& row);

}  // namespace locind::app
