// Study truths and their process models: rescaling to a stationarity target
// (down only by default, both ways on request) and the hidden_mode
// fixed-observed, where every hidden count shares the observed processes,
// their edges and their parameters.
#include <doctest/doctest.h>

#include <algorithm>

#include "app/study/study_file.h"
#include "app/study/study_grid.h"
#include "app/study/study_truths.h"

namespace locind::app {
namespace {

StudySpec Parse(const std::string& text) {
  StudyOrErrors read = ParseStudyText(text, "t.yaml");
  if (auto* e = std::get_if<std::vector<Error>>(&read)) FAIL(e->front().ToString());
  return std::get<StudySpec>(read);
}

// a -> b with a loop on a, fixed weights 0.3: K = [[0.3, 0], [0.3, 0]] is
// triangular, so its spectral radius is the largest diagonal entry, 0.3
// (eigenvalues of a triangular matrix are its diagonal; Horn & Johnson 2013,
// Matrix Analysis, 1.1).
StudySpec Chain(const std::string& events) {
  return Parse("truth: {nodes: [a, b], edges: [a -> b, a -> a]}\nprocess: {events: {baseline: 0.2, weight: 0.3, "
               "decay: 2, " + events + "}}\ngrid: {lengths: [10]}\nlearners: [{method: pairwise, test: oracle}]\n");
}

BuiltHawkes Hawkes(const StudySpec& s) {
  const std::vector<Cell> cells = ExpandGrid(s);
  const StudyTruths truths(s, cells);
  Result<BuiltHawkes> b = BuildHawkes(s, truths.Get(-1, 0), cells.front());
  REQUIRE(b.ok());
  return *b;
}

std::vector<double> Weights(const sim::HawkesModel& m) {
  std::vector<double> w;
  for (const sim::EdgeKernel& k : m.kernels) w.push_back(k.kernel.terms[0].weight);
  return w;
}

TEST_CASE("rescale down: a stable draw below the target keeps its weights") {
  const BuiltHawkes b = Hawkes(Chain("spectral_radius: 0.6"));
  CHECK(b.drawn_radius == doctest::Approx(0.3));
  CHECK(b.spectral_radius == b.drawn_radius);
  CHECK(b.scale == 1);
  CHECK(Weights(b.model) == std::vector<double>{0.3, 0.3});
  CHECK(b.outside_range.empty());
}

TEST_CASE("rescale down: a draw above the target is scaled down to it and the range note says so") {
  const BuiltHawkes b = Hawkes(Chain("spectral_radius: 0.2"));
  CHECK(b.drawn_radius == doctest::Approx(0.3));
  CHECK(b.spectral_radius == 0.2);
  CHECK(b.scale == doctest::Approx(2.0 / 3));
  for (double w : Weights(b.model)) CHECK(w == doctest::Approx(0.2));
  // weight and loop_weight are fixed at 0.3, so both rescaled weights left their range.
  CHECK(b.outside_range == "1 of 1 weights outside [0.3, 0.3] (now 0.2 to 0.2); 1 of 1 loop weights outside "
                           "[0.3, 0.3] (now 0.2 to 0.2)");
}

TEST_CASE("rescale both: a draw below the target is scaled up to it") {
  const BuiltHawkes b = Hawkes(Chain("spectral_radius: 0.6, rescale: both"));
  CHECK(b.drawn_radius == doctest::Approx(0.3));
  CHECK(b.spectral_radius == 0.6);
  CHECK(b.scale == doctest::Approx(2));
  for (double w : Weights(b.model)) CHECK(w == doctest::Approx(0.6));
  CHECK_FALSE(b.outside_range.empty());
}

// M = [[-1, 0], [0.5, -1]] (self rate 1, coupling 0.5 on a -> b) is
// triangular: eigenvalues -1, -1, largest real part -1.
StudySpec Drift(const std::string& paths) {
  return Parse("truth: {nodes: [a, b], edges: [a -> b, a -> a, b -> b]}\nprocess: {paths: {self_rate: 1, "
               "coupling: 0.5, " + paths + "}}\ngrid: {lengths: [10]}\nlearners: [{method: pairwise, test: oracle}]\n");
}

BuiltDiffusion Diffusion(const StudySpec& s) {
  const std::vector<Cell> cells = ExpandGrid(s);
  const StudyTruths truths(s, cells);
  Result<BuiltDiffusion> b = BuildDiffusion(s, truths.Get(-1, 0), cells.front());
  REQUIRE(b.ok());
  return *b;
}

TEST_CASE("drift_bound: down rescales only a draw less stable than the bound") {
  BuiltDiffusion b = Diffusion(Drift("drift_bound: -0.5"));  // -1 is below -0.5: kept
  CHECK(b.drawn_largest_real_part == doctest::Approx(-1));
  CHECK(b.scale == 1);
  CHECK(b.model.M(1, 0) == 0.5);
  b = Diffusion(Drift("drift_bound: -2"));  // -1 is above -2: M doubled
  CHECK(b.scale == doctest::Approx(2));
  CHECK(b.largest_real_part == -2);
  CHECK(b.model.M(0, 0) == doctest::Approx(-2));
  CHECK(b.model.M(1, 0) == doctest::Approx(1));
  b = Diffusion(Drift("drift_bound: -0.5, rescale: both"));  // halved
  CHECK(b.scale == doctest::Approx(0.5));
  CHECK(b.model.M(1, 0) == doctest::Approx(0.25));
  CHECK(b.outside_range == "2 of 2 self rates outside [1, 1] (now 0.5 to 0.5); 1 of 1 couplings outside "
                           "[0.5, 0.5] (now 0.25 to 0.25)");
}

const char kRandom[] =
    "seed: 4\ntruth: {random: {nodes: 4, edge_probability: 0.5}, truths: 2}\n"
    "process: {events: {baseline: [0.1, 0.5], weight: [0.1, 0.3], decay: [1, 3]}}\n"
    "learners: [{method: pairwise, test: oracle}]\n";

TEST_CASE("hidden_mode fixed-observed: every count keeps the same observed processes and their edges and parameters") {
  const StudySpec s = Parse(std::string(kRandom) + "grid: {lengths: [10], hidden: [0, 1, 2], hidden_mode: fixed-observed}\n");
  const std::vector<Cell> cells = ExpandGrid(s);
  const StudyTruths truths(s, cells);
  for (int t = 0; t < 2; ++t) {
    std::vector<BuiltHawkes> built;
    for (int h : {0, 1, 2}) {
      const PreparedTruth& p = truths.Get(h, t);
      // random.nodes observed, h hidden on top, named h1, h2 in order.
      CHECK(p.truth.graph.size() == 4 + h);
      CHECK(p.truth.Observed().size() == 4);
      CHECK(static_cast<int>(p.truth.hidden.size()) == h);
      CHECK(p.drawn.graph.size() == 6);
      Result<BuiltHawkes> b = BuildHawkes(s, p, cells[h]);
      REQUIRE(b.ok());
      built.push_back(*b);
    }
    const PreparedTruth& none = truths.Get(0, t);
    for (int h : {1, 2}) {
      const PreparedTruth& p = truths.Get(h, t);
      const std::vector<int> observed = p.truth.Observed();
      // Node i of count 0 is the i-th observed node of count h (the kept nodes
      // stay in drawn order): same names, edges, baselines and kernels.
      CHECK(p.truth.graph.Induced(observed) == none.truth.graph);
      for (size_t i = 0; i < observed.size(); ++i) {
        CHECK(built[h].model.baseline[observed[i]] == built[0].model.baseline[i]);
      }
      for (const sim::EdgeKernel& k0 : built[0].model.kernels) {
        const auto same = std::find_if(built[h].model.kernels.begin(), built[h].model.kernels.end(),
                                       [&](const sim::EdgeKernel& k) {
                                         return k.from == observed[k0.from] && k.to == observed[k0.to];
                                       });
        REQUIRE(same != built[h].model.kernels.end());
        CHECK(same->kernel.terms[0].weight == k0.kernel.terms[0].weight);
        CHECK(same->kernel.terms[0].decay == k0.kernel.terms[0].decay);
      }
    }
    // Count 1 hides the first hidden process of count 2.
    CHECK(truths.Get(1, t).truth.graph.name(truths.Get(1, t).truth.hidden[0]) == "h1");
  }
}

TEST_CASE("hidden_mode fresh-truth (the default): random.nodes counts the hidden processes too") {
  const StudySpec s = Parse(std::string(kRandom) + "grid: {lengths: [10], hidden: [1, 2]}\n");
  const StudyTruths truths(s, ExpandGrid(s));
  CHECK(truths.Get(1, 0).truth.graph.size() == 4);
  CHECK(truths.Get(1, 0).truth.Observed().size() == 3);
  CHECK(truths.Get(2, 0).truth.Observed().size() == 2);
  CHECK(truths.Get(2, 0).drawn.graph == truths.Get(2, 0).truth.graph);
}

}  // namespace
}  // namespace locind::app
