// Stationarity rescaling of the process models built for a cell: after
// BuildHawkes / BuildDiffusion the spectral radius of K (the largest real
// part of M's eigenvalues) equals the cell's target. Expected values come
// from numpy.linalg.eigvals (numpy 1.24, /usr/bin/python3) on the same fixed
// matrices, not from the code.
#include "app/study/study_truths.h"

#include <doctest/doctest.h>

#include <string>
#include <variant>

#include "app/study/study_file.h"
#include "app/study/study_grid.h"
#include "sim/stability.h"

namespace locind::app {
namespace {

StudySpec Parse(const std::string& text) {
  StudyOrErrors read = ParseStudyText(text, "truths.yaml");
  REQUIRE(std::holds_alternative<StudySpec>(read));
  return std::get<StudySpec>(read);
}

// a -> b -> c -> a plus a loop on a: fixed parameters, so K (or M) is fixed.
const char kTruth[] = "truth: {nodes: [a, b, c], edges: [a -> b, b -> c, c -> a, a -> a]}\n";

TEST_CASE("events: the weights are rescaled so that the spectral radius of K is the target") {
  const StudySpec s = Parse(std::string("seed: 3\n") + kTruth +
                            "process: {events: {baseline: 0.2, weight: 0.4, loop_weight: 0.3, decay: 2,"
                            " spectral_radius: 0.5}}\n"
                            "grid: {lengths: [100], replicates: 1}\n"
                            "learners: [{method: pairwise, test: oracle}]\n");
  const std::vector<Cell> cells = ExpandGrid(s);
  REQUIRE(cells.size() == 1);
  REQUIRE(cells[0].stationarity.has_value());
  const StudyTruths truths(s, cells);
  const Result<BuiltHawkes> b = BuildHawkes(s, truths.Get(cells[0].hidden_factor, 0), cells[0]);
  REQUIRE(b.ok());
  // numpy: K = [[0.3, 0, 0.4], [0.4, 0, 0], [0, 0.4, 0]] (K[to][from]) has
  // spectral radius 0.5288398423205596 (root of r^3 - 0.3 r^2 - 0.064); the
  // scale 0.5 / 0.52884 makes the weights 0.37818633165458204 (edges) and
  // 0.2836397487409365 (the loop), and the rescaled K has radius 0.5.
  for (const sim::EdgeKernel& e : b->model.kernels) {
    const double expected = e.from == e.to ? 0.2836397487409365 : 0.37818633165458204;
    CHECK(e.kernel.terms[0].weight == doctest::Approx(expected).epsilon(1e-12).scale(0));
  }
  CHECK(b->model.kernels.size() == 4);
  CHECK(b->spectral_radius == doctest::Approx(0.5).epsilon(1e-12).scale(0));
  CHECK(*sim::SpectralRadius(b->model.KernelIntegrals()) ==
        doctest::Approx(0.5).epsilon(1e-12).scale(0));
}

TEST_CASE("paths: M is rescaled so that its largest eigenvalue real part is the drift bound") {
  const StudySpec s = Parse(std::string("seed: 3\n") +
                            "truth: {nodes: [a, b, c], edges: [a -> b, b -> c, c -> a, a -> a, b -> b,"
                            " c -> c]}\n"
                            "process: {paths: {self_rate: 1, coupling: 0.6, noise: 1, drift_bound: -0.5}}\n"
                            "grid: {lengths: [10], replicates: 1}\n"
                            "learners: [{method: pairwise, test: oracle}]\n");
  const std::vector<Cell> cells = ExpandGrid(s);
  REQUIRE(cells.size() == 1);
  const StudyTruths truths(s, cells);
  const Result<BuiltDiffusion> b = BuildDiffusion(s, truths.Get(cells[0].hidden_factor, 0), cells[0]);
  REQUIRE(b.ok());
  // numpy: M = -I + 0.6 P (P the 3-cycle) has eigenvalues -0.4 and
  // -1.3 +- 0.5196i (by hand: -1 + 0.6 w, w the cube roots of unity), largest
  // real part -0.4 (less stable than the bound); scaled by -0.5 / -0.4 = 1.25:
  // couplings 0.75, diagonal -1.25, largest real part -0.5.
  const Eigen::MatrixXd& m = b->model.M;
  CHECK(m(1, 0) == doctest::Approx(0.75).epsilon(1e-12).scale(0));
  CHECK(m(2, 1) == doctest::Approx(0.75).epsilon(1e-12).scale(0));
  CHECK(m(0, 2) == doctest::Approx(0.75).epsilon(1e-12).scale(0));
  for (int v = 0; v < 3; ++v) CHECK(m(v, v) == doctest::Approx(-1.25).epsilon(1e-12).scale(0));
  CHECK(m(0, 1) == 0);  // no edge b -> a
  CHECK(b->largest_real_part == doctest::Approx(-0.5).epsilon(1e-12).scale(0));
  CHECK(*sim::LargestRealPart(m) == doctest::Approx(-0.5).epsilon(1e-12).scale(0));
}

}  // namespace
}  // namespace locind::app
