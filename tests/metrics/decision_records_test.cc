// The done-when checks of the decision records, on data: every method of the
// registry learns from simulated diffusions (drift-f test, short windows so
// that tests err and edges are lost; random truths with hidden processes),
// and for every replicate
//  - every missed solid edge has a decision record that names its rule and
//    the witness tests (none only for edges the method never considers, or a
//    method that makes no tests),
//  - no record's named witnesses contradict its decision: a removed edge's
//    first witness is a computed separation and the rule's other witnesses
//    (premises) are connections; a kept edge's witnesses are dependences of
//    its own pair (rule "own evidence": the set-aside separation first); an
//    undecided edge names a test that could not be computed,
//  - the causes add up to the missed solid and false edges of the score.
// The rules are those of learners/methods/learner.h and
// metrics/error_attribution.h; nothing here is a regression value.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "base/random_stream.h"
#include "learners/independence/drift_test.h"
#include "learners/methods/learner_registry.h"
#include "metrics/error_attribution.h"
#include "metrics/replicate_score.h"
#include "metrics/truth_class.h"
#include "sim/diffusion_model.h"
#include "sim/diffusion_simulator.h"
#include "tests/learners/learner_fixtures.h"

namespace locind::metrics {
namespace {

using learners::EdgeDecision;
using learners::TestRecord;
using learners::TestStatus;

bool Separation(const TestRecord& w) { return w.status == TestStatus::kOk && !w.dependent; }
bool Connection(const TestRecord& w) { return w.status == TestStatus::kOk && w.dependent; }

// The first contradiction of `d`, or "" when its witnesses agree with it.
std::string Contradiction(const EdgeDecision& d) {
  if (d.witnesses.empty()) return "";
  if (!d.kept) {
    if (!Separation(d.witnesses[0])) return "removed, first witness not a separation";
    for (size_t i = 1; i < d.witnesses.size(); ++i) {
      if (!Connection(d.witnesses[i])) return "removed, a premise witness not a connection";
    }
    return "";
  }
  if (d.undecided) {
    for (const TestRecord& w : d.witnesses) {
      if (w.status == TestStatus::kNotEstimable) return "";
    }
    return "undecided, no witness not estimable";
  }
  size_t first = 0;
  if (d.rule == "own evidence") {
    if (!Separation(d.witnesses[0])) return "own evidence, first witness not the set-aside separation";
    first = 1;
  }
  for (size_t i = first; i < d.witnesses.size(); ++i) {
    if (!Connection(d.witnesses[i])) return "kept, a witness not a dependence";
    const TestRecord& w = d.witnesses[i];
    const bool own_pair = w.sources.size() == 1 &&
                          ((w.sources[0] == d.edge.from && w.target == d.edge.to) ||
                           (d.edge.kind == graph::EdgeKind::kBidirected && w.sources[0] == d.edge.to &&
                            w.target == d.edge.from));
    if (!own_pair) return "kept, a witness about another pair";
  }
  return "";
}

// A random truth on 4 to 7 observed nodes (some hidden), every node with its
// loop so the linear drift reverts to its mean.
graph::TruthGraph DiffusionTruth(int i) {
  graph::TruthGraph t = testing::SuiteTruth(1515, i);
  for (int v = 0; v < t.graph.size(); ++v) {
    if (!t.graph.HasDirected(v, v)) t.graph.AddDirected(v, v);
  }
  return t;
}

TEST_CASE("every method on simulated diffusions: records name rule and witnesses, none contradicts, causes add up") {
  int replicates = 0;
  int missed = 0;
  int records = 0;
  int removed_with_witness = 0;
  int premises = 0;  // witnesses after the deciding separation of a removed edge
  for (int i = 0; i < 24; ++i) {
    const graph::TruthGraph truth = DiffusionTruth(i);
    const sim::DiffusionModel model = sim::LinearDiffusion(truth, 1.0, 0.45, 1.0);
    if (!sim::CheckStable(model).ok()) continue;
    sim::PathRunOptions options;
    options.horizon = 60;  // short: tests err, edges are lost
    options.step = 0.02;
    options.interval = 0.1;
    options.burn_in = 10;
    base::RandomStream random(base::StreamKey{1515, 0, static_cast<uint64_t>(i), 3});
    Result<sim::PathData> data = sim::SimulateDiffusion(model, options, random);
    REQUIRE(data.ok());
    const TruthClass truth_class = *ComputeTruthClass(truth);
    for (const learners::MethodEntry& entry : learners::LearningMethods()) {
      if (std::string(entry.name) == "exhaustive" && data->processes() > 5) continue;  // its size limit
      std::unique_ptr<learners::Learner> method = entry.make(learners::MethodSettings{});
      learners::DriftTest test = *learners::DriftTest::Create(*data);
      learners::LearnInput input{entry.uses_tests ? &test : nullptr, 0.05};
      if (!entry.uses_tests) input.paths = &data.value();
      const Result<learners::LearnResult> r = method->Learn(input);
      REQUIRE_MESSAGE(r.ok(), entry.name << ": " << (r.ok() ? "" : r.status().message()));
      const ErrorAttribution a = AttributeErrors(truth_class, *r);
      const ReplicateScore score = ScoreGraph(truth_class, r->graph);
      ++replicates;
      // The causes add up to the score's counts.
      CHECK_MESSAGE(a.missed() == score.total.missed_solid, entry.name);
      CHECK_MESSAGE(a.false_edges() == score.total.false_edges, entry.name);
      CHECK(a.tests.correct + a.tests.false_separation + a.tests.false_dependence + a.tests.not_estimable ==
            r->tests);
      // Every missed solid edge: a record, a rule, witnesses.
      for (const AttributedEdge& e : a.edges) {
        if (!e.missed) continue;
        ++missed;
        const EdgeDecision* d = FindDecision(*r, e.edge);
        REQUIRE_MESSAGE(d != nullptr, entry.name);
        CHECK_FALSE(d->kept);
        CHECK_MESSAGE(!d->rule.empty(), entry.name);
        const bool may_lack_tests = d->rule == "never considered" || !entry.uses_tests;
        CHECK_MESSAGE((may_lack_tests || !d->witnesses.empty()), entry.name << " rule " << d->rule);
        removed_with_witness += !d->witnesses.empty();
      }
      // No record contradicts its decision.
      for (const EdgeDecision& d : r->decisions) {
        ++records;
        if (!d.kept && d.witnesses.size() > 1) premises += static_cast<int>(d.witnesses.size()) - 1;
        const std::string why = Contradiction(d);
        CHECK_MESSAGE(why.empty(), entry.name << " truth " << i << " rule " << d.rule << ": " << why);
      }
      CHECK(ContradictingDecisions(*r) == 0);
    }
  }
  MESSAGE(replicates << " method runs, " << records << " records, " << missed << " missed solid edges, "
                     << premises << " premise witnesses");
  CHECK(replicates >= 6 * 12);  // at least half the truths stable, every method
  CHECK(missed > 20);           // not vacuous: short windows lose edges
  CHECK(removed_with_witness > 10);
  CHECK(premises > 10);
}

}  // namespace
}  // namespace locind::metrics
