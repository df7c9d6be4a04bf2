// Studies with a number-of-trials factor (grid.trials): cells and keys, the
// simulated trials in each replicate, thread independence, and `locind plan`
// searching along the number of trials.
#include <doctest/doctest.h>

#include <map>

#include "app/results/results_rows.h"
#include "app/running/runner.h"
#include "app/running/study_planner.h"
#include "app/study/study_file.h"
#include "app/study/study_grid.h"
#include "app/study/study_truths.h"

namespace locind::app {
namespace {

StudySpec Study(const std::string& grid, const std::string& learners, const std::string& plan = "") {
  const std::string text =
      "seed: 7\n"
      "truth: {nodes: [a, b, c], edges: [a -> b, b -> c, a -> a]}\n"
      "process: {events: {baseline: 0.5, weight: 0.4, decay: 2, burn_in: 20}}\n"
      "grid: " + grid + "\n"
      "learners: " + learners + "\n" + plan;
  StudyOrErrors read = ParseStudyText(text, "trials.yaml");
  REQUIRE(std::holds_alternative<StudySpec>(read));
  return std::get<StudySpec>(read);
}

// Rows of every unit of `cells`, keyed by (cell, replicate), timing dropped.
std::map<std::pair<int, int>, std::string> Run(const StudySpec& s, int threads) {
  const std::vector<Cell> cells = ExpandGrid(s);
  const StudyTruths truths(s, cells);
  std::vector<Unit> units;
  for (size_t c = 0; c < cells.size(); ++c) {
    for (int r = 0; r < s.grid.replicates; ++r) units.push_back(Unit{int(c), r});
  }
  std::map<std::pair<int, int>, std::string> out;
  RunUnits(s, cells, truths, units, threads, [&out](UnitResult u) {
    ReplicateRow row = u.rows.front();
    row.timing_simulate_seconds = row.timing_test_seconds = row.timing_learn_seconds = row.timing_score_seconds = 0;
    out[{u.unit.cell, u.unit.replicate}] = FormatReplicateRow(row);
  }, nullptr);
  return out;
}

TEST_CASE("a trials factor adds cells and keys; without it labels stay as they were") {
  const StudySpec plain = Study("{lengths: [50], replicates: 2}", "[{method: pairwise, test: hawkes-lr}]");
  const std::vector<Cell> one = ExpandGrid(plain);
  REQUIRE(one.size() == 1);
  CHECK(one[0].label == "length=50 level=0.05");
  CHECK(one[0].trials == 1);
  const StudySpec s = Study("{lengths: [50, 100], replicates: 2, trials: [1, 4]}", "[{method: pairwise, test: hawkes-lr}]");
  const std::vector<Cell> cells = ExpandGrid(s);
  REQUIRE(cells.size() == 4);
  // Number of trials outside length (length fastest).
  CHECK(cells[0].label == "length=50 level=0.05 trials=1");
  CHECK(cells[1].label == "length=100 level=0.05 trials=1");
  CHECK(cells[2].label == "length=50 level=0.05 trials=4");
  CHECK(cells[2].trials == 4);
  CHECK(cells[2].data_key != cells[0].data_key);
  StudyOrErrors bad = ParseStudyText(
      "truth: {nodes: [a, b], edges: [a -> b]}\nprocess: {events: {baseline: 0.5, weight: 0.4, decay: 2}}\n"
      "grid: {lengths: [50], trials: [0]}\nlearners: [{method: pairwise}]\n", "bad.yaml");
  CHECK(std::holds_alternative<Errors>(bad));
}

TEST_CASE("a study with a trials axis runs: trials recorded, the same rows on 1 and 2 threads") {
  const StudySpec s = Study("{lengths: [60], replicates: 3, trials: [1, 3]}", "[{method: pairwise, test: hawkes-lr}]");
  const auto rows1 = Run(s, 1);
  const auto rows2 = Run(s, 2);
  REQUIRE(rows1.size() == 6);
  CHECK(rows1 == rows2);
  for (const auto& [key, line] : rows1) {
    const std::optional<ReplicateRow> row = ParseReplicateRow(line);
    REQUIRE(row);
    CHECK(row->ok);
    CHECK(row->trials == (key.first == 0 ? 1 : 3));
  }
  // Three trials of 60 hold about three times the events of one (stationary
  // rate x length per trial; a loose check of the trial count, not of the rate).
  double events1 = 0, events3 = 0;
  for (const auto& [key, line] : rows1) (key.first == 0 ? events1 : events3) += ParseReplicateRow(line)->observed_points;
  CHECK(events3 > 2 * events1);
  CHECK(events3 < 4.5 * events1);
}

TEST_CASE("plan along the number of trials: whole numbers, searched column, trial length") {
  const StudySpec s = Study("{lengths: [40], replicates: 3, trials: [1]}", "[{method: pairwise, test: hawkes-lr}]",
                            "plan: {along: trials, cap: 8}");
  const PlanTargets targets{0.9, 0.2};
  std::vector<std::string> log;
  const auto plans = PlanLengths(s, targets, 1, [&log](const std::string& l) { log.push_back(l); });
  REQUIRE(plans.size() == 1);
  CHECK(plans[0].searched == "trials");
  CHECK(plans[0].trial_length == 40);
  CHECK(plans[0].cap == 8);
  for (const PlanStep& step : plans[0].steps) CHECK(step.length == std::floor(step.length));
  CHECK(plans[0].steps.front().length == 1);
  REQUIRE(!log.empty());
  CHECK(log[0].rfind("plan: pairwise/hawkes-lr at trials 1: power ", 0) == 0);
  const std::string csv = PlanCsv(plans, targets);
  CHECK(csv.find(",trials,,40\n") != std::string::npos);
  CHECK(PlanReport(plans, targets).find("pairwise/hawkes-lr: ") != std::string::npos);
  // The oracle needs one trial.
  const StudySpec o = Study("{lengths: [40], replicates: 2}", "[{method: maximal-search, test: oracle}]",
                            "plan: {along: trials}");
  const auto oracle = PlanLengths(o, targets, 1, {});
  REQUIRE(oracle.size() == 1);
  CHECK(oracle[0].reached);
  CHECK(oracle[0].length == 1);
  CHECK(oracle[0].cap == 64);
}

TEST_CASE("searching length with a trials factor: one combination per number of trials") {
  const StudySpec s = Study("{lengths: [40], replicates: 2, trials: [1, 2]}", "[{method: maximal-search, test: oracle}]");
  const std::vector<PlanCombination> combos = PlanCombinations(s);
  REQUIRE(combos.size() == 2);
  CHECK(combos[1].trials == 2);
  CHECK(combos[1].Text() == "level 0.05, 2 trials");
  const auto picked = PickCombinations(s, "trials=2");
  REQUIRE(picked.ok());
  CHECK(picked->size() == 1);
  const auto plans = PlanLengths(s, {0.9, 0.05}, 1, {}, *picked);
  REQUIRE(plans.size() == 1);
  CHECK(PlanCsv(plans, {0.9, 0.05}).find(",length,2,\n") != std::string::npos);
}

}  // namespace
}  // namespace locind::app
