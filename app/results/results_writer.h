// The final files of a study folder, built from finished units.
//
//   replicates.csv, edges.csv, summary.csv, comparisons.csv, null_tests.csv,
//   calibration.csv
//                     (columns: results/README.md)
//   study.json        the resolved study: version, seed, truths and their
//                     classes, process, cells with their stream keys, learners
//   truth-<t>.svg     each truth (hidden processes as grey dashed boxes)
//   class-<t>.svg     its equivalence graph (dashed edges dashed)
//   input/<file>      the study file as given (used by `locind merge`)
//   part.txt          "K/N" in the folder of a --part share only
//
// Rows are sorted by (cell, replicate), learners in study order, so the files
// depend only on which units are finished, never on how they were run. Every
// file is written atomically.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "app/results/results_rows.h"
#include "app/study/study_truths.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"
#include "base/status.h"
#include "metrics/cell_summary.h"

namespace locind::app {

inline constexpr char kLocindVersion[] = "0.1.0";  // CMakeLists.txt project(VERSION)

// What the registry declares `method` can report (everything for an
// unknown method).
metrics::LearnerReach ReachOf(const std::string& method);

// Summary of one learner's rows in one cell, clustered by truth label;
// bootstrap stream keyed by (seed, cell key, learner index, kPurposeSummary).
metrics::CellSummary SummarizeCell(const StudySpec& study, const Cell& cell, int learner,
                                   const std::vector<ReplicateRow>& rows);

std::string ReplicatesCsv(const std::map<Unit, UnitResult>& units);
std::string EdgesCsv(const std::map<Unit, UnitResult>& units);
std::string NullTestsCsv(const std::map<Unit, UnitResult>& units);
std::string SummaryCsv(const StudySpec& study, const std::vector<Cell>& cells,
                       const std::map<Unit, UnitResult>& units);
// Every pair of learners in every cell, the later learner of the study
// against the earlier (its reference), paired by replicate; bootstrap stream
// keyed by (seed, cell key, 1024 * learner + reference, kPurposeComparison).
std::string ComparisonsCsv(const StudySpec& study, const std::vector<Cell>& cells,
                           const std::map<Unit, UnitResult>& units);
std::string StudyJson(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths);

// Writes every file above into `dir`. `study_text` is the study file's text.
Status WriteResults(const std::string& dir, const StudySpec& study, const std::string& study_text,
                    const std::vector<Cell>& cells, const StudyTruths& truths,
                    const std::map<Unit, UnitResult>& units, const Part& part);

}  // namespace locind::app
