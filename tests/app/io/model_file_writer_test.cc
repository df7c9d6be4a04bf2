#include "app/io/model_file_writer.h"

#include <doctest/doctest.h>

#include "app/io/model_file.h"

namespace locind::app {
namespace {

graph::TruthGraph ThreeNodes() {
  graph::TruthGraph t;
  t.graph = graph::Dmg({"a", "b", "h"});
  t.graph.AddDirected(0, 1);
  t.graph.AddDirected(2, 0);
  t.graph.AddDirected(2, 1);
  t.graph.AddDirected(1, 1);
  t.hidden = {2};
  return t;
}

ModelSpec ReadBack(const std::string& text) {
  ModelOrError r = ParseModelText(text, "written.yaml");
  if (auto* e = std::get_if<Error>(&r)) FAIL(e->ToString() << "\n" << text);
  return std::get<ModelSpec>(r);
}

// Write, read back with the model reader: every parameter is the same double
// (the numbers are written in round-trip form), not merely close.
TEST_CASE("an events model written and read back has the same parameters") {
  sim::HawkesModel m;
  m.truth = ThreeNodes();
  m.baseline = {0.1 / 3, 0.2, 1e-7};
  m.kernels = {sim::EdgeKernel{2, 0, sim::Kernel::Exponential(0.3 * 0.7, 2.5)},
               sim::EdgeKernel{0, 1, sim::Kernel::SumOfExponentials({{0.1, 1}, {0.2, 4}})},
               sim::EdgeKernel{1, 1, sim::Kernel::Exponential(1.0 / 7, 1.25)},
               sim::EdgeKernel{2, 1, sim::Kernel::DelayedGamma(0.2, 1, 2, 3)}};
  sim::HawkesRunOptions run;
  run.burn_in = 50;
  run.event_cap = 12345;
  const std::string text = FormatEventModelFile(m, run, "truth t1\nsecond line");
  CHECK(text.rfind("# truth t1\n# second line\n", 0) == 0);
  const auto back = std::get<EventModelSpec>(ReadBack(text));
  CHECK(back.model.truth.graph == m.truth.graph);
  CHECK(back.model.truth.hidden == m.truth.hidden);
  CHECK(back.model.baseline == m.baseline);
  CHECK(back.run.burn_in == 50);
  CHECK(back.run.event_cap == 12345);
  CHECK(back.run.method == sim::HawkesMethod::kAuto);
  // The reader orders kernels by (to, parent); find each by its edge.
  REQUIRE(back.model.kernels.size() == m.kernels.size());
  for (const sim::EdgeKernel& k : m.kernels) {
    bool found = false;
    for (const sim::EdgeKernel& b : back.model.kernels) {
      if (b.from != k.from || b.to != k.to) continue;
      found = true;
      CHECK(b.kernel.family == k.kernel.family);
      REQUIRE(b.kernel.terms.size() == k.kernel.terms.size());
      for (size_t i = 0; i < k.kernel.terms.size(); ++i) {
        CHECK(b.kernel.terms[i].weight == k.kernel.terms[i].weight);
        CHECK(b.kernel.terms[i].decay == k.kernel.terms[i].decay);
      }
      CHECK(b.kernel.weight == k.kernel.weight);
      CHECK(b.kernel.delay == k.kernel.delay);
      CHECK(b.kernel.shape == k.kernel.shape);
      CHECK(b.kernel.rate == k.kernel.rate);
    }
    CHECK(found);
  }
}

TEST_CASE("a paths model written and read back has the same drift matrix and offsets and noise") {
  graph::TruthGraph t = ThreeNodes();
  t.graph.AddDirected(0, 0);
  t.graph.AddDirected(2, 2);
  sim::DiffusionModel m = sim::LinearDiffusion(t, 0, 0, 1);
  m.M(0, 0) = -1.0 / 3;
  m.M(1, 1) = -2.2;
  m.M(2, 2) = -0.9;
  m.M(1, 0) = 0.45;
  m.M(0, 2) = -0.35;
  m.M(1, 2) = 0.1 / 3;
  m.c << 0.5, -1e-3, 0;
  m.sigma << 1, 0.25, 2;
  sim::PathRunOptions run;
  run.step = 0.01;
  run.interval = 0.1;
  run.burn_in = 10;
  run.method = sim::PathMethod::kExact;
  const auto back = std::get<PathModelSpec>(ReadBack(FormatPathModelFile(m, run, "")));
  CHECK(back.model.truth.graph == t.graph);
  CHECK(back.model.drift == sim::DriftFamily::kLinear);
  CHECK(back.model.M == m.M);
  CHECK(back.model.c == m.c);
  CHECK(back.model.sigma == m.sigma);
  CHECK(back.run.step == 0.01);
  CHECK(back.run.interval == 0.1);
  CHECK(back.run.burn_in == 10);
  CHECK(back.run.method == sim::PathMethod::kExact);
}

}  // namespace
}  // namespace locind::app
