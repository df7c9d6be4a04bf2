// The study runner on the demo cell (configs/demo.yaml, length 1000: 5
// observed alarm streams, 2 hidden drivers, 4 learners): replicates per
// second at 1 and 2 threads, the scaling ratio measured in the same run, and
// where the time goes (simulation and data preparation, inside independence
// tests, the methods' own work, scoring).
//
// One "replicate" is a unit: one simulation and every learner on it. Each
// iteration runs the same 8 replicates first on 1 thread, then on 2, so the
// ratio compares equal work. Run from the source tree (the study file is
// found by walking up from the working directory).
#include <benchmark/benchmark.h>

#include <chrono>
#include <filesystem>

#include "app/running/runner.h"
#include "base/memory_tuning.h"
#include "app/study/study_truths.h"
#include "app/study/study_file.h"
#include "app/study/study_grid.h"

namespace {

using namespace locind;
using Clock = std::chrono::steady_clock;

std::string FindDemo() {
  for (std::filesystem::path dir = std::filesystem::current_path(); !dir.empty(); dir = dir.parent_path()) {
    if (std::filesystem::exists(dir / "configs/demo.yaml")) return (dir / "configs/demo.yaml").string();
    if (dir == dir.parent_path()) break;
  }
  return "configs/demo.yaml";
}

struct Shares {
  double simulate = 0, test = 0, learn = 0, score = 0;
};

double RunCell(const app::StudySpec& study, const app::Cell& cell, const app::StudyTruths& truths,
               int threads, int replicates, Shares& shares) {
  std::vector<app::Unit> units;
  for (int r = 0; r < replicates; ++r) units.push_back(app::Unit{0, r});
  const Clock::time_point start = Clock::now();
  app::RunUnits(study, {cell}, truths, units, threads, [&shares](app::UnitResult u) {
    for (size_t i = 0; i < u.rows.size(); ++i) {
      const app::ReplicateRow& row = u.rows[i];
      if (i == 0) shares.simulate += row.timing_simulate_seconds;  // one simulation per unit
      shares.test += row.timing_test_seconds;
      shares.learn += row.timing_learn_seconds - row.timing_test_seconds;
      shares.score += row.timing_score_seconds;
    }
  }, nullptr);
  return std::chrono::duration<double>(Clock::now() - start).count();
}

void BM_DemoCellScaling(benchmark::State& state) {
  base::KeepFreedMemory();  // as locind's main() does, before any thread starts
  app::StudyOrErrors read = app::ReadStudyFile(FindDemo());
  if (!std::holds_alternative<app::StudySpec>(read)) {
    state.SkipWithError("configs/demo.yaml not found or invalid");
    return;
  }
  const app::StudySpec& study = std::get<app::StudySpec>(read);
  const std::vector<app::Cell> cells = app::ExpandGrid(study);
  app::Cell cell = cells.at(1);  // length 1000
  cell.index = 0;
  const app::StudyTruths truths(study, {cell});
  constexpr int kReplicates = 8;
  double one = 0, two = 0;
  Shares shares;
  for (auto _ : state) {
    one += RunCell(study, cell, truths, 1, kReplicates, shares);
    two += RunCell(study, cell, truths, 2, kReplicates, shares);
  }
  const double runs = static_cast<double>(state.iterations()) * kReplicates;
  state.counters["replicates_per_s_1_thread"] = runs / one;
  state.counters["replicates_per_s_2_threads"] = runs / two;
  state.counters["scaling_2_vs_1"] = one / two;
  const double total = shares.simulate + shares.test + shares.learn + shares.score;
  state.counters["share_simulate"] = shares.simulate / total;
  state.counters["share_tests"] = shares.test / total;
  state.counters["share_learn_own"] = shares.learn / total;
  state.counters["share_score"] = shares.score / total;
}
BENCHMARK(BM_DemoCellScaling)->Iterations(2)->Unit(benchmark::kSecond)->UseRealTime();

}  // namespace

BENCHMARK_MAIN();
