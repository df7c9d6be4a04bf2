#include "learners/methods/penalized_fit_learner.h"

#include <doctest/doctest.h>

#include <cmath>

#include "learners/independence/oracle_test.h"
#include "sim/diffusion_model.h"
#include "sim/diffusion_simulator.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"

namespace locind::learners {
namespace {

// x1 -> x2 -> x3 with loops on every process.
graph::TruthGraph Chain() {
  graph::Dmg g({"x1", "x2", "x3"});
  for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  return graph::TruthGraph{g, {}};
}

TEST_CASE("Hawkes chain: the penalized fit finds the chain from long data") {
  // Baseline 0.5, weight 0.3, decay 1: spectral radius 0.3, about 1 event per
  // unit time per process; 4000 time units give thousands of events, so the
  // edges' scores are far above the universal threshold.
  const sim::HawkesModel model = sim::ExponentialHawkes(Chain(), 0.5, 0.3, 1.0);
  sim::HawkesRunOptions options;
  options.horizon = 4000;
  options.burn_in = 50;
  base::RandomStream random(base::StreamKey{77, 0, 0, 1});
  Result<sim::EventData> data = sim::SimulateHawkes(model, options, random);
  REQUIRE(data.ok());
  PenalizedFitLearner method;
  LearnInput input;
  input.events = &data.value();
  const LearnResult r = *method.Learn(input);
  CHECK(r.tests == 0);
  CHECK(r.test_kind == "none");
  CHECK(r.graph == Chain().graph);
}

TEST_CASE("a stream with fewer than 2 events: its fit is not estimable, edges into it kept undecided") {
  // Hand-made data: x1 and x2 have events, x3 one event. The policy of
  // learners/methods/learner.h: the 3 edges into x3 are kept, undecided, with
  // the fit as a not-estimable witness (empty p-value) and its reason.
  sim::EventData data;
  data.names = {"x1", "x2", "x3"};
  data.times.resize(3);
  data.start = 0;
  data.end = 100;
  for (int i = 0; i < 60; ++i) {
    data.times[0].push_back(0.5 + 1.6 * i);
    data.times[1].push_back(1.1 + 1.5 * i);
  }
  data.times[2] = {42.0};
  PenalizedFitLearner method;
  LearnInput input;
  input.events = &data;
  const LearnResult r = *method.Learn(input);
  int undecided = 0;
  for (const EdgeDecision& d : r.decisions) {
    if (d.edge.to != 2 || d.edge.kind != graph::EdgeKind::kDirected) {
      CHECK_FALSE(d.undecided);
      continue;
    }
    ++undecided;
    CHECK(d.kept);
    CHECK(d.undecided);
    CHECK(d.rule == "not estimable");
    REQUIRE(d.witnesses.size() == 1);
    CHECK(d.witnesses[0].status == TestStatus::kNotEstimable);
    CHECK(std::isnan(d.witnesses[0].p_value));
    CHECK(d.witnesses[0].reason == "x3 has 1 event; its intensity fit needs at least 2");
    CHECK(r.graph.HasDirected(d.edge.from, 2));
  }
  CHECK(undecided == 3);
  CHECK(r.note.find("1 of 3 fits not estimable") != std::string::npos);
}

TEST_CASE("diffusion chain: the lasso on the drift regression finds the chain") {
  const sim::DiffusionModel model = sim::LinearDiffusion(Chain(), 1.0, 0.8, 0.5);
  sim::PathRunOptions options;
  options.horizon = 1000;
  options.step = 0.01;
  options.interval = 0.1;
  options.burn_in = 10;
  base::RandomStream random(base::StreamKey{78, 0, 0, 1});
  Result<sim::PathData> data = sim::SimulateDiffusion(model, options, random);
  REQUIRE(data.ok());
  PenalizedFitLearner method;
  LearnInput input;
  input.paths = &data.value();
  const LearnResult r = *method.Learn(input);
  CHECK(r.graph == Chain().graph);
  // A very large penalty leaves nothing.
  PenalizedFitLearner strict(1e6);
  CHECK(strict.Learn(input)->graph.DirectedEdgeCount() == 0);
}

TEST_CASE("needs data") {
  OracleTest oracle(Chain().graph);
  PenalizedFitLearner method;
  Result<LearnResult> r = method.Learn(LearnInput{&oracle, 0.05});
  REQUIRE_FALSE(r.ok());
  CHECK(r.status().message().find("needs data") != std::string::npos);
}

}  // namespace
}  // namespace locind::learners
