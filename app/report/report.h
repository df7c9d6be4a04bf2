// The report of a study: report.html (one self-contained page) and every
// figure as its own SVG in figures/, written into the result folder.
//
// Figures (captions in the page say how to read each):
//   power-*, false-edges-*   power and false-edge rate against observation
//                            length, one line per learner, cluster-bootstrap
//                            95% bands, power ceilings (dash-dot), targets
//                            and planned lengths from plan.csv
//   power-<group>-*          power per edge group (directed, loop, bidirected)
//   lost-<learner>-*         where edges are lost: per length, the missed
//                            solid and false edges per replicate stacked by
//                            cause (app/report/lost_edges_figure.h)
//   tests-*, seconds-*       tests made and learner seconds (log scale)
//   qq-<test>-<length>-parents-given, qq-<test>-<length>-parent-missing
//                            p-values of tests whose null holds in the truth
//                            against the uniform, with a pointwise 95% band,
//                            split by all_parents_given (null_tests.csv)
// The calibration section also has the table of calibration.csv (rejection
// share of true-null tests per test, length, level and all_parents_given,
// exact 95% intervals), and the page opens with one warning line for every
// row whose interval lies entirely above its level.
//   truth-*, projection-*, class-*   each truth (up to 3), its latent
//                            projection, its equivalence graph
//   learned-*                each learner's graph in the first replicates of
//                            the longest length, false edges and missed
//                            solid edges highlighted
// One set of power/cost figures per combination of the other grid factors
// (level, hidden count, stationarity target).
#pragma once

#include <string>
#include <vector>

#include "app/results/results_reader.h"
#include "app/report/report_html.h"
#include "app/study/study_truths.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"
#include "base/status.h"

namespace locind::app {

// The page of a study from its data, figures not yet rendered (each holds
// its gnuplot script or DOT text).
ReportPage BuildReportPage(const StudySpec& study, const std::vector<Cell>& cells,
                           const StudyTruths& truths, const ReportData& data);

// Builds the page from `data` (read from DIR), renders every figure
// (gnuplot, Graphviz) and writes DIR/figures/<id>.svg and DIR/report.html,
// the page last. Returns the number of figures.
Result<int> WriteReport(const std::string& dir, const StudySpec& study, const std::vector<Cell>& cells,
                        const StudyTruths& truths, const ReportData& data);

// ReadReportData(dir), then WriteReport: what `locind run` and `locind
// merge` call once the result files are written.
Result<int> WriteReportOfResults(const std::string& dir, const StudySpec& study,
                                 const std::vector<Cell>& cells, const StudyTruths& truths);

// The caution printed at the top of every report.
const std::string& ReportCaution();

}  // namespace locind::app
