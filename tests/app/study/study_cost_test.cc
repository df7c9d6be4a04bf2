// The expected work and memory of a study (app/study/study_cost.h) and the two
// places that use them: `locind run --check` and the memory_mb refusal.
#include "app/study/study_cost.h"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "app/study/study_file.h"
#include "tests/app/command_fixture.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;

// Two observed streams, a -> b: stationary intensities (I - K)^{-1} mu =
// (1, 1 + 0.5 * 1) (Hawkes 1971, Biometrika 58(1)), 2.5 events per unit time.
const char kEvents[] =
    "name: costly\n"
    "truth: {nodes: [a, b], edges: [a -> b]}\n"
    "process:\n"
    "  events: {baseline: 1, weight: 0.5, decay: 1, burn_in: 10}\n"
    "grid: {lengths: [100, 200], replicates: 3}\n"
    "learners:\n"
    "  - {method: pairwise, test: oracle}\n"
    "  - {method: pairwise, test: hawkes-lr}\n";

StudySpec Parse(const std::string& text) {
  StudyOrErrors read = ParseStudyText(text, "costly.yaml");
  REQUIRE(std::holds_alternative<StudySpec>(read));
  return std::get<StudySpec>(read);
}

struct Costed {
  StudySpec study;
  std::vector<Cell> cells;
  StudyCost cost;
};

Costed Cost(const std::string& text) {
  Costed c;
  c.study = Parse(text);
  c.cells = ExpandGrid(c.study);
  const StudyTruths truths(c.study, c.cells);
  c.cost = EstimateCost(c.study, c.cells, truths);
  return c;
}

TEST_CASE("event study: exact counts, expected events at the stationary intensities") {
  const Costed c = Cost(kEvents);
  CHECK(c.cost.truths == 1);
  CHECK(c.cost.cells == 2);
  CHECK(c.cost.replicates == 3);
  CHECK(c.cost.simulations == 6);
  CHECK(c.cost.learner_runs == 12);
  REQUIRE(c.cost.per_cell.size() == 2);
  CHECK(c.cost.per_cell[0].points == doctest::Approx(2.5 * (10 + 100)));
  CHECK(c.cost.per_cell[1].points == doctest::Approx(2.5 * (10 + 200)));
  // 2 x 8 bytes per event plus 3 rates x 2 observed sources x 8 bytes.
  CHECK(BytesPerEvent(c.study, 2) == 64);
  CHECK(c.cost.per_cell[1].bytes == doctest::Approx(525 * 64));
  CHECK(c.cost.peak_bytes == doctest::Approx(525 * 64));
  CHECK(c.cost.per_cell[0].note.empty());
  CHECK(MemoryProblem(c.study, c.cost).empty());
  const std::string text = CostText(c.study, c.cost, 2);
  CHECK(text.find("study costly: 1 truth(s), 2 cell(s) x 3 replicate(s) = 6 simulation(s), x 2 "
                  "learner(s) = 12 learner run(s)\n") == 0);
  CHECK(text.find(": 525 expected events, about 0.0 MB per replicate\n") != std::string::npos);
  CHECK(text.find("(limit memory_mb: 2048), 0.1 MB with 2 thread(s)\n") != std::string::npos);
}

TEST_CASE("path study: samples on the observation grid") {
  const Costed c = Cost(
      "truth: {nodes: [x, y, h], edges: [x -> x, y -> y, h -> h, x -> y, h -> x], hidden: [h]}\n"
      "process: {paths: {interval: 0.25, step: 0.05}}\n"
      "grid: {lengths: [10], replicates: 2}\n"
      "learners: [{method: pairwise, test: drift-f}]\n");
  REQUIRE(c.cost.per_cell.size() == 1);
  // Times 0, 0.25, ..., 10: 41 samples of the 2 observed processes.
  CHECK(c.cost.per_cell[0].points == 82);
  CHECK(c.cost.per_cell[0].bytes == 82 * BytesPerSample());
  CHECK(c.cost.per_cell[0].note.empty());
  // Coupling 2 against self rates 1: M = [[-1, 0], [2, -1]] is stable (both
  // eigenvalues -1), but [[-1, 2], [2, -1]] (a cycle) has eigenvalue 1.
  const Costed cycle = Cost(
      "truth: {nodes: [x, y], edges: [x -> x, y -> y, x -> y, y -> x]}\n"
      "process: {paths: {coupling: 2}}\n"
      "grid: {lengths: [10], replicates: 1}\n"
      "learners: [{method: pairwise, test: drift-f}]\n");
  CHECK(cycle.cost.per_cell[0].note == "truth 1: unstable (largest real part 1): its replicates fail with a message");
}

TEST_CASE("a non-stationary random truth is noted, not estimated") {
  const Costed c = Cost(
      "truth: {random: {nodes: 2, edge_probability: 1, loops: all}}\n"
      "process: {events: {weight: 0.9}}\n"
      "grid: {lengths: [50], replicates: 1}\n"
      "learners: [{method: pairwise, test: oracle}]\n");
  REQUIRE(c.cost.per_cell.size() == 1);
  CHECK(c.cost.per_cell[0].note.find("truth 1: not stationary (spectral radius 1.8") == 0);
  CHECK(c.cost.per_cell[0].points == 0);
}

TEST_CASE("memory_mb: the study refusal and the event cap of a replicate") {
  std::string big = kEvents;
  big.replace(big.find("lengths: [100, 200]"), 19, "lengths: [100, 1000000]");
  big += "memory_mb: 16\n";
  const Costed c = Cost(big);
  // 2.5 x (1e6 + 10) events x 64 bytes = 152.6 MiB.
  const std::string problem = MemoryProblem(c.study, c.cost);
  CHECK(problem.find("cell 1 (") == 0);  // numbered from 0, as the cell column of the CSV files
  CHECK(problem.find(") needs about 153 MB per replicate, more than memory_mb: 16; shorten the "
                     "lengths or raise memory_mb") != std::string::npos);
  // 16 MiB / 64 bytes per event; a smaller event_cap wins.
  CHECK(EventCap(c.study, 2) == 262144);
  StudySpec capped = c.study;
  capped.event_process.event_cap = 1000;
  CHECK(EventCap(capped, 2) == 1000);
}

TEST_CASE("locind run --check prints the work and writes nothing, and too much memory is refused") {
  const fs::path dir = fs::temp_directory_path() / ("locind_study_cost_test_" + std::to_string(::getpid()));
  fs::remove_all(dir);
  fs::create_directories(dir);
  const std::string study = (dir / "costly.yaml").string();
  std::ofstream(study) << kEvents;
  const std::string out = (dir / "out").string();
  testing::Outcome r = testing::RunHandler(RunRunCommand, {study, "--check", "--out", out});
  CHECK(r.code == kExitOk);
  CHECK(r.out.find("study costly: 1 truth(s), 2 cell(s)") == 0);
  // Cells numbered from 0, as the cell column of replicates.csv and the
  // other CSV files (one numbering everywhere).
  CHECK(r.out.find("\n  cell 0 (") != std::string::npos);
  CHECK(r.out.find("\n  cell 1 (") != std::string::npos);
  CHECK(r.out.find("\n  cell 2 (") == std::string::npos);
  CHECK_FALSE(fs::exists(out));

  std::string big = kEvents;
  big.replace(big.find("lengths: [100, 200]"), 19, "lengths: [100, 1000000]");
  std::ofstream(study) << big + "memory_mb: 16\n";
  r = testing::RunHandler(RunRunCommand, {study, "--out", out});
  CHECK(r.code == kExitInputError);
  CHECK(r.err.find(study + ": memory_mb: cell 1 (") == 0);
  CHECK_FALSE(fs::exists(out));
  fs::remove_all(dir);
}

}  // namespace
}  // namespace locind::app
