// The report of a study whose cells differ in their number of trials: rate
// panels split by trials, and power / false edges against the number of
// trials (pages built from hand-made summary lines; nothing is rendered).
#include <doctest/doctest.h>

#include <algorithm>

#include "app/report/report.h"
#include "app/study/study_file.h"
#include "app/study/study_grid.h"
#include "app/study/study_truths.h"

namespace locind::app {
namespace {

StudySpec Study(const std::string& trials) {
  StudyOrErrors read = ParseStudyText(
      "truth: {nodes: [a, b], edges: [a -> b]}\nprocess: {events: {baseline: 0.5, weight: 0.4, decay: 2}}\n"
      "grid: {lengths: [50, 100], replicates: 2" + trials + "}\nlearners: [{method: pairwise, test: hawkes-lr}]\n",
      "r.yaml");
  REQUIRE(std::holds_alternative<StudySpec>(read));
  return std::get<StudySpec>(read);
}

ReportData Data(const std::vector<Cell>& cells) {
  ReportData d;
  for (const Cell& c : cells) {
    SummaryLine s;
    s.cell = c.index;
    s.length = c.length;
    s.level = c.level;
    s.trials = c.trials;
    s.learner = "pairwise/hawkes-lr";
    s.replicates = 2;
    s.power = {0.1 * c.trials + c.length / 1000, 0, 1};
    s.false_edge_rate = {0.05, 0, 0.1};
    d.summary.push_back(s);
  }
  return d;
}

std::vector<std::string> FigureIds(const ReportPage& page) {
  std::vector<std::string> ids;
  for (const ReportFigure& f : page.sections.front().figures) ids.push_back(f.id);
  return ids;
}

bool Has(const std::vector<std::string>& ids, const std::string& id) {
  return std::find(ids.begin(), ids.end(), id) != ids.end();
}

TEST_CASE("cells with 1 and 4 trials: panels per number of trials and figures against it") {
  const StudySpec s = Study(", trials: [1, 4]");
  const std::vector<Cell> cells = ExpandGrid(s);
  const StudyTruths truths(s, cells);
  ReportData data = Data(cells);
  PlanLine plan;
  plan.learner = "pairwise/hawkes-lr";
  plan.target_power = 0.8;
  plan.target_false_edge_rate = 0.05;
  plan.reached = true;
  plan.length = 3;
  plan.level = 0.05;
  plan.hidden_count = 0;
  plan.searched = "trials";
  data.plan.push_back(plan);
  const ReportPage page = BuildReportPage(s, cells, truths, data);
  const std::vector<std::string> ids = FigureIds(page);
  // Length panels: one per number of trials.
  CHECK(Has(ids, "power-g1"));
  CHECK(Has(ids, "power-g2"));
  // Against the number of trials: one panel per trial length.
  CHECK(Has(ids, "power-trials-t1"));
  CHECK(Has(ids, "false-edges-trials-t2"));
  const auto trial_figure = std::find_if(page.sections.front().figures.begin(), page.sections.front().figures.end(),
                                         [](const ReportFigure& f) { return f.id == "power-trials-t1"; });
  REQUIRE(trial_figure != page.sections.front().figures.end());
  CHECK(trial_figure->source.find("number of trials") != std::string::npos);
  CHECK(trial_figure->title == "Power against number of trials (level 0.05, 0 hidden, trials of length 50)");
  CHECK(trial_figure->caption.find("planned number of trials") != std::string::npos);
  const auto length_figure = std::find_if(page.sections.front().figures.begin(), page.sections.front().figures.end(),
                                          [](const ReportFigure& f) { return f.id == "power-g2"; });
  CHECK(length_figure->title == "Power against observation length (level 0.05, 0 hidden, 4 trials)");
  // The planned 3 trials: a vertical on the trials panels, none on the length panels.
  CHECK(trial_figure->source.find("set arrow from first 3, graph 0") != std::string::npos);
  CHECK(length_figure->source.find("set arrow from first 3, graph 0") == std::string::npos);
}

TEST_CASE("one trial everywhere: no trials figure, panels as before") {
  const StudySpec s = Study("");
  const std::vector<Cell> cells = ExpandGrid(s);
  const StudyTruths truths(s, cells);
  const std::vector<std::string> ids = FigureIds(BuildReportPage(s, cells, truths, Data(cells)));
  CHECK(Has(ids, "power"));
  CHECK_FALSE(Has(ids, "power-g1"));
  CHECK(std::none_of(ids.begin(), ids.end(), [](const std::string& id) { return id.find("trials") != std::string::npos; }));
}

}  // namespace
}  // namespace locind::app
