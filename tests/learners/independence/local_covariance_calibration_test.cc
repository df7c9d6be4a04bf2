// Calibration and power of the local covariance test (event-local-covariance,
// supremum statistic; and its end-point variant) next to the Hawkes
// likelihood-ratio test with its default chi-bar-squared reference.
//
// Nulls (b locally independent of a given C in the truth: b is mu-separated
// from a given C in the latent projection):
//   * specified: a -> c -> b, b given {b, c}, kernel decay 2 on the rate grid
//     {0.5, 2, 8}: b's intensity given {b, c} is a linear Hawkes intensity of
//     the test's basis;
//   * omitted parent (the demo truth of configs/demo.yaml with fixed
//     parameters: weights 0.6, loops 0.55, slow and fast kernels): flow_alert given {flow_alert, valve_alarm}, source
//     operator_log; flow_alert's parent pressure_alert is left out of C and
//     two drivers are hidden, so flow_alert's intensity given C is not a
//     linear Hawkes intensity, and operator_log (a child of flow_alert) is a
//     noisy copy of flow_alert's past; default rate grid, as in studies;
//   * hidden process: a -> c -> h -> b with h hidden, b given {b, c}.
// Windows 1,000, 4,000 and 16,000.
//
// Bands (the rule): each rejection count is compared with the central
// interval of the exact Binomial(n, level) distribution (BinomialInterval,
// Boost.Math) of coverage 1 - 0.01 / kChecks, kChecks = the number of such
// interval checks in this file (Bonferroni: the file fails by chance with
// probability below 1%). On the nulls with an omitted parent or a hidden
// process only the upper end is asserted, and only for the local covariance
// tests (supremum, and the batch variant, which is also held to the upper
// end only on specified nulls: it is conservative by construction); the
// likelihood-ratio and end-point counts are printed (the LR's calibration is
// asserted in hawkes_lr_calibration_test.cc). The printed 95%
// Clopper-Pearson upper bounds are the measured targets.
//
// Seeds: 7 was used while developing (results in docs/tests.md); the seeds
// below were run once, after the code was fixed.
//
// Three more cases, skipped unless run with --no-skip, compare the options
// of LocalCovarianceOptions (environment LOCIND_VARIANT_SEED, _REPS,
// _LENGTH, _SETTING, _SET choose the run; _SET=centred compares the default
// with the uncentred and centred batch variances): "nuisance basis
// variants" on one query, "pooled demo nulls" on every true null
// b _||_ a | {b} or {b, c} of the demo graph, and "strong effect p-values"
// (LOCIND_VARIANT_SEEDS). They print and assert nothing; their measured
// tables are in docs/tests.md.
#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <utility>
#include <vector>

#include <doctest/doctest.h>

#include "base/random_stream.h"
#include "graph/dmg.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/independence/local_covariance_test.h"
#include "learners/independence/oracle_test.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"
#include "tests/learners/independence/calibration_checks.h"
#include "tests/learners/independence/two_process_draw.h"

namespace locind::learners {
namespace {

enum class Setting { kSpecified, kOmittedParent, kHidden, kAlternative, kDemoDrawn, kDemoFixed };

// Interval checks in this file (see the rule above).
constexpr int kChecks = 42;
constexpr double kCoverage = 1 - 0.01 / kChecks;

// Observed order puts the source first and the target last.
graph::TruthGraph Truth(Setting s) {
  switch (s) {
    case Setting::kSpecified: {
      graph::Dmg g({"a", "c", "b"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
      return {g, {}};
    }
    case Setting::kOmittedParent:
    case Setting::kDemoDrawn:
    case Setting::kDemoFixed: {
      // configs/demo.yaml: observed first, hidden power_dip and maintenance last.
      graph::Dmg g({"pump_alarm", "pressure_alert", "flow_alert", "valve_alarm", "operator_log",
                    "power_dip", "maintenance"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      g.AddDirected(3, 2);
      g.AddDirected(2, 4);
      g.AddDirected(5, 0);
      g.AddDirected(5, 1);
      g.AddDirected(6, 3);
      g.AddDirected(6, 4);
      for (int v : {0, 2, 4, 5}) g.AddDirected(v, v);
      return {g, {5, 6}};
    }
    case Setting::kHidden: {
      graph::Dmg g({"a", "c", "h", "b"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      g.AddDirected(2, 3);
      for (int v = 0; v < 4; ++v) g.AddDirected(v, v);
      return {g, {2}};
    }
    case Setting::kAlternative:
      break;
  }
  graph::Dmg g({"a", "c", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  g.AddDirected(0, 2);
  for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
  return {g, {}};
}

TestQuery Query(Setting s) {
  if (s == Setting::kOmittedParent || s == Setting::kDemoDrawn || s == Setting::kDemoFixed) {
    return {2, {4}, {2, 3}};  // pressure_alert (1) omitted
  }
  return {2, {0}, {1, 2}};
}

// p-values per test: 0 LR chi-bar-squared (the default), 1 local covariance
// (supremum), 2 local covariance (end point), 3 local covariance with the
// centred batch-means variance (event-local-covariance-batch).
constexpr int kTests = 4;
const char* kTestNames[kTests] = {"hawkes-lr", "local-cov sup", "local-cov end", "local-cov batch"};

std::vector<std::vector<double>> Run(Setting s, double horizon, int replicates, uint64_t seed) {
  const graph::TruthGraph truth = Truth(s);
  sim::HawkesModel model =
      s == Setting::kOmittedParent ? sim::ExponentialHawkes(truth, 0.3, 0.6, 3.0, 0.55)
      : s == Setting::kAlternative ? sim::ExponentialHawkes(truth, 0.5, 0.1, 2.0, 0.2)
                                   : sim::ExponentialHawkes(truth, 0.5, 0.3, 2.0, 0.2);
  if (s == Setting::kOmittedParent) {
    // Slow kernels (decay 0.5) out of the hidden drivers and on the omitted
    // parent's edge, fast ones (decay 3) elsewhere: time scales a factor 6
    // apart, as the demo's decays in [1, 3] and more. Spectral radius 0.55
    // (the loops; the rest is acyclic).
    for (sim::EdgeKernel& e : model.kernels) {
      if (e.from >= 5 || (e.from == 1 && e.to == 2)) e.kernel.terms[0].decay = 0.5;
    }
  }
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  std::vector<std::vector<double>> p(kTests);
  for (int r = 0; r < replicates; ++r) {
    base::RandomStream random(base::StreamKey{seed, uint64_t(s), uint64_t(r), uint64_t(horizon)});
    sim::EventData d = sim::SimulateHawkes(model, o, random).value();
    std::vector<double> rates = {0.5, 2.0, 8.0};
    if (s == Setting::kOmittedParent) rates = DefaultHawkesRates(d);
    auto features =
        std::make_shared<HawkesFeatures>(HawkesFeatures::Create(std::move(d), rates).value());
    HawkesLrTest lr(features, {.chi_bar_draws = 2000, .seed = seed});
    LocalCovarianceTest sup(features);
    LocalCovarianceTest end(features, {.statistic = LocalCovarianceStatistic::kEndPoint});
    LocalCovarianceTest batch(features, {.batch_variance = BatchVariance::kCentred});
    IndependenceTest* tests[kTests] = {&lr, &sup, &end, &batch};
    for (int v = 0; v < kTests; ++v) {
      const TestResult t = tests[v]->Run(Query(s));
      REQUIRE(t.status == TestStatus::kOk);
      p[v].push_back(t.p_value);
    }
  }
  return p;
}

void Report(const char* name, double horizon, const std::vector<std::vector<double>>& p) {
  for (int v = 0; v < kTests; ++v) {
    const int n = int(p[v].size()), k5 = CountBelow(p[v], 0.05), k1 = CountBelow(p[v], 0.01);
    std::printf("%s T=%g %s: at 0.05 %d / %d (95%% upper %.3f), at 0.01 %d (95%% upper %.3f)\n",
                name, horizon, kTestNames[v], k5, n, ClopperPearsonUpper(k5, n, 0.95), k1,
                ClopperPearsonUpper(k1, n, 0.95));
  }
  std::fflush(stdout);
}

// Both levels inside the interval (two interval checks per call).
void CheckHolds(const std::vector<double>& p) {
  for (double level : {0.05, 0.01}) {
    const auto [lo, hi] = BinomialInterval(int(p.size()), level, kCoverage);
    CHECK(CountBelow(p, level) >= lo);
    CHECK(CountBelow(p, level) <= hi);
  }
}

// Only the upper end at both levels (two checks per call).
void CheckNotAbove(const std::vector<double>& p) {
  for (double level : {0.05, 0.01}) {
    CHECK(CountBelow(p, level) <= BinomialInterval(int(p.size()), level, kCoverage).second);
  }
}

void SetKernel(sim::HawkesModel& m, int from, int to, double weight, double decay) {
  for (sim::EdgeKernel& e : m.kernels) {
    if (e.from == from && e.to == to) e.kernel = sim::Kernel::Exponential(weight, decay);
  }
}

// The two truths that configs/demo.yaml draws (study seed 20261201), their
// parameters as written to results/pumping_station/truths/t*.model.yaml:
// the truths on which the issue measured the over-rejection of this query.
sim::HawkesModel DemoTruth(const graph::TruthGraph& truth, int t) {
  sim::HawkesModel m = sim::ExponentialHawkes(truth, 0.3, 0.45, 2.0, 0.3);
  if (t == 1) {
    m.baseline = {0.2487965933462693, 0.3059446465663242, 0.3792921592917699, 0.3524124328954642, 0.3833551519924357, 0.21988785801843816, 0.3898435372853536};
    SetKernel(m, 0, 0, 0.26330681036843984, 2.792926000990029);
    SetKernel(m, 5, 0, 0.3241474795230736, 2.484098224667372);
    SetKernel(m, 0, 1, 0.314231674489805, 2.448371739909412);
    SetKernel(m, 5, 1, 0.5966572494705258, 1.0259031249448602);
    SetKernel(m, 1, 2, 0.30545630156529907, 2.997047477670897);
    SetKernel(m, 2, 2, 0.21785783955006333, 1.979979351183866);
    SetKernel(m, 3, 2, 0.46923129782777384, 1.8864383178791075);
    SetKernel(m, 6, 3, 0.38714103671585876, 1.1035968433224186);
    SetKernel(m, 2, 4, 0.312290080090771, 1.169176184754351);
    SetKernel(m, 4, 4, 0.3874682572824961, 1.896460157583777);
    SetKernel(m, 6, 4, 0.3395726172908655, 2.82726062605758);
    SetKernel(m, 5, 5, 0.27079735941381755, 1.759919546347534);
  }
  if (t == 2) {
    m.baseline = {0.20232358534322287, 0.21018172545310282, 0.23672073314514888, 0.21099429417258186, 0.3708319645081734, 0.35924405825244493, 0.38476299246252055};
    SetKernel(m, 0, 0, 0.22430858714981, 1.2631416123915633);
    SetKernel(m, 5, 0, 0.5471807208158337, 1.4044216612885931);
    SetKernel(m, 0, 1, 0.4052780178934318, 2.475473363872265);
    SetKernel(m, 5, 1, 0.3673067663866737, 2.6053048876021156);
    SetKernel(m, 1, 2, 0.40260150993079713, 1.8323075597219378);
    SetKernel(m, 2, 2, 0.226320426736354, 2.0466161008064225);
    SetKernel(m, 3, 2, 0.3380186785696718, 2.470314297573209);
    SetKernel(m, 6, 3, 0.558747165846621, 2.7424687796438145);
    SetKernel(m, 2, 4, 0.4006444067277432, 1.7233437626311439);
    SetKernel(m, 4, 4, 0.20197194879367528, 1.3721107061304876);
    SetKernel(m, 6, 4, 0.330968951094907, 2.7242152861310815);
    SetKernel(m, 5, 5, 0.3847661734547683, 2.533402991472558);
  }
  return m;
}

// The demo truth with parameters drawn as configs/demo.yaml draws them
// (baseline in [0.2, 0.4], weight in [0.3, 0.6], loop weight in [0.2, 0.4],
// decay in [1, 3], uniform; scaled down to spectral radius 0.6 when above).
sim::HawkesModel DemoDraw(const graph::TruthGraph& truth, base::RandomStream& random) {
  sim::HawkesModel m = sim::ExponentialHawkes(truth, 0.3, 0.45, 2.0, 0.3);
  auto draw = [&](double lo, double hi) { return lo + (hi - lo) * random.Uniform(); };
  for (double& b : m.baseline) b = draw(0.2, 0.4);
  for (sim::EdgeKernel& e : m.kernels) {
    e.kernel.terms[0].weight = e.from == e.to ? draw(0.2, 0.4) : draw(0.3, 0.6);
    e.kernel.terms[0].decay = draw(1, 3);
  }
  const double radius = sim::HawkesSpectralRadius(m).value();
  if (radius > 0.6) {
    for (sim::EdgeKernel& e : m.kernels) e.kernel.terms[0].weight *= 0.6 / radius;
  }
  return m;
}

// p-values of hawkes-lr (first) and of one local covariance test per entry
// of `variants` (the nuisance-basis study below).
std::vector<std::vector<double>> RunVariants(Setting s, double horizon, int replicates,
                                             uint64_t seed,
                                             const std::vector<LocalCovarianceOptions>& variants) {
  const graph::TruthGraph truth = Truth(s);
  sim::HawkesModel model =
      s == Setting::kOmittedParent ? sim::ExponentialHawkes(truth, 0.3, 0.6, 3.0, 0.55)
      : s == Setting::kAlternative ? sim::ExponentialHawkes(truth, 0.5, 0.1, 2.0, 0.2)
                                   : sim::ExponentialHawkes(truth, 0.5, 0.3, 2.0, 0.2);
  if (s == Setting::kOmittedParent) {
    for (sim::EdgeKernel& e : model.kernels) {
      if (e.from >= 5 || (e.from == 1 && e.to == 2)) e.kernel.terms[0].decay = 0.5;
    }
  }
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  std::vector<std::vector<double>> p(variants.size() + 1);
  for (int r = 0; r < replicates; ++r) {
    base::RandomStream random(base::StreamKey{seed, uint64_t(s), uint64_t(r), uint64_t(horizon)});
    if (s == Setting::kDemoDrawn) model = DemoDraw(truth, random);
    if (s == Setting::kDemoFixed) model = DemoTruth(truth, 1 + r % 2);
    sim::EventData d = sim::SimulateHawkes(model, o, random).value();
    std::vector<double> rates = {0.5, 2.0, 8.0};
    if (s == Setting::kOmittedParent || s == Setting::kDemoDrawn || s == Setting::kDemoFixed) {
      rates = DefaultHawkesRates(d);
    }
    auto features =
        std::make_shared<HawkesFeatures>(HawkesFeatures::Create(std::move(d), rates).value());
    HawkesLrTest lr(features, {.chi_bar_draws = 2000, .seed = seed});
    const TestResult t = lr.Run(Query(s));
    REQUIRE(t.status == TestStatus::kOk);
    p[0].push_back(t.p_value);
    for (size_t v = 0; v < variants.size(); ++v) {
      LocalCovarianceTest test(features, variants[v]);
      const TestResult u = test.Run(Query(s));
      REQUIRE(u.status == TestStatus::kOk);
      p[v + 1].push_back(u.p_value);
    }
  }
  return p;
}

void ReportVariants(const char* name, double horizon, const std::vector<std::vector<double>>& p) {
  for (size_t v = 0; v < p.size(); ++v) {
    const int n = int(p[v].size()), k5 = CountBelow(p[v], 0.05), k1 = CountBelow(p[v], 0.01);
    std::printf("%s T=%g variant %zu: at 0.05 %d / %d (95%% upper %.3f), at 0.01 %d\n", name,
                horizon, v, k5, n, ClopperPearsonUpper(k5, n, 0.95), k1);
  }
  std::fflush(stdout);
}

constexpr uint64_t kSeed = 2026;

}  // namespace

// Specified nulls: hawkes-lr and the local covariance test hold the level
// (4 interval checks per window: 12); the batch variant, conservative by
// construction (it scales by the larger of two variances), is held to the
// upper end only (2 per window: 6).
TEST_CASE("specified null: hawkes-lr and the local covariance test hold the level") {
  for (const auto& [horizon, reps] : {std::pair{1000.0, 200}, {4000.0, 80}, {16000.0, 25}}) {
    const auto p = Run(Setting::kSpecified, horizon, reps, kSeed);
    Report("specified", horizon, p);
    CheckHolds(p[0]);
    CheckHolds(p[1]);
    CheckNotAbove(p[3]);
  }
}

// Omitted parent and hidden drivers (demo truth): 2 upper-end checks per
// window and local covariance variant (supremum, batch: 12).
TEST_CASE("omitted parent and hidden drivers: the local covariance test stays below the band") {
  for (const auto& [horizon, reps] : {std::pair{1000.0, 100}, {4000.0, 50}, {16000.0, 25}}) {
    const auto p = Run(Setting::kOmittedParent, horizon, reps, kSeed);
    Report("omitted parent (demo)", horizon, p);
    CheckNotAbove(p[1]);
    CheckNotAbove(p[3]);
  }
}

// Hidden mediator: 2 upper-end checks per window and variant (12).
TEST_CASE("hidden mediator: the local covariance test stays below the band") {
  for (const auto& [horizon, reps] : {std::pair{1000.0, 100}, {4000.0, 50}, {16000.0, 25}}) {
    const auto p = Run(Setting::kHidden, horizon, reps, kSeed);
    Report("hidden mediator", horizon, p);
    CheckNotAbove(p[1]);
    CheckNotAbove(p[3]);
  }
}

// The development run (seed 7; skipped unless run with --no-skip).
TEST_CASE("development run on the tuning seed" * doctest::skip()) {
  for (Setting s : {Setting::kSpecified, Setting::kOmittedParent, Setting::kHidden}) {
    for (const auto& [horizon, reps] : {std::pair{1000.0, 100}, {4000.0, 50}, {16000.0, 20}}) {
      if (s != Setting::kOmittedParent && horizon < 16000) continue;
      Report(s == Setting::kSpecified ? "dev specified" : s == Setting::kHidden ? "dev hidden" : "dev omitted",
             horizon, Run(s, horizon, reps, 7));
    }
  }
}

// Power on a fixed alternative (a -> b directly, weight 0.1, besides
// a -> c -> b), window 2,000; the counts are compared, not banded.
TEST_CASE("power on a fixed alternative, next to hawkes-lr") {
  const auto p = Run(Setting::kAlternative, 2000, 60, kSeed);
  Report("alternative a -> b w=0.1", 2000, p);
  // Regression floor (measured, not from a source): both tests find the
  // effect in most replicates.
  CHECK(CountBelow(p[0], 0.05) >= 30);
  CHECK(CountBelow(p[1], 0.05) >= 20);
  CHECK(CountBelow(p[3], 0.05) >= 20);
}

// Nuisance-basis variants on development seeds (skipped unless run with
// --no-skip; environment LOCIND_VARIANT_SEED picks the seed).
TEST_CASE("nuisance basis variants" * doctest::skip()) {
  const char* env = std::getenv("LOCIND_VARIANT_SEED");
  const uint64_t seed = env ? std::strtoull(env, nullptr, 10) : 11;
  const char* reps_env = std::getenv("LOCIND_VARIANT_REPS");
  const int reps = reps_env ? std::atoi(reps_env) : 40;
  std::vector<LocalCovarianceOptions> variants(5);
  variants[4].nuisance_rates = 6;
  variants[4].quadratic = true;
  variants[4].ridge = 1e-2;
  variants[1].nuisance_rates = 6;
  variants[2].quadratic = true;
  variants[2].ridge = 1e-3;
  variants[3].nuisance_rates = 6;
  variants[3].quadratic = true;
  variants[3].ridge = 1e-3;
  const char* set = std::getenv("LOCIND_VARIANT_SET");
  if (set && std::string(set) == "lr") variants.clear();
  if (set && std::string(set) == "default") variants.resize(1);
  if (set && std::string(set) == "batch") {
    variants.assign(2, LocalCovarianceOptions{});
    variants[1].batch_variance = BatchVariance::kUncentred;
  }
  if (set && std::string(set) == "centred") {  // default, uncentred, centred
    variants.assign(3, LocalCovarianceOptions{});
    variants[1].batch_variance = BatchVariance::kUncentred;
    variants[2].batch_variance = BatchVariance::kCentred;
  }
  const char* which = std::getenv("LOCIND_VARIANT_SETTING");
  const Setting only = which && std::string(which) == "alternative" ? Setting::kAlternative
                       : which && std::string(which) == "specified" ? Setting::kSpecified
                       : which && std::string(which) == "omitted" ? Setting::kOmittedParent
                       : which && std::string(which) == "drawn"   ? Setting::kDemoDrawn
                                                                   : Setting::kDemoFixed;
  const char* len_env = std::getenv("LOCIND_VARIANT_LENGTH");
  for (Setting s : {only}) {
    for (double horizon : {len_env ? std::atof(len_env) : 4000.0}) {
      ReportVariants(s == Setting::kSpecified     ? "specified"
                     : s == Setting::kAlternative ? "alternative"
                                                  : "demo/omitted",
                     horizon,
                     RunVariants(s, horizon, reps, seed, variants));
    }
  }
}

// A strong effect (two processes a -> b, weight 0.5, window 1,000; the
// draw of the unit tests) on the seeds in LOCIND_VARIANT_SEEDS (comma
// separated): p-values of hawkes-lr, the default local covariance test and
// its uncentred and centred batch-variance options (skipped unless run with
// --no-skip; prints, asserts nothing).
TEST_CASE("strong effect p-values" * doctest::skip()) {
  const char* env = std::getenv("LOCIND_VARIANT_SEEDS");
  std::string list = env ? env : "3";
  size_t at = 0;
  while (at <= list.size()) {
    const size_t comma = std::min(list.find(',', at), list.size());
    const uint64_t seed = std::strtoull(list.substr(at, comma - at).c_str(), nullptr, 10);
    at = comma + 1;
    const sim::EventData d = DrawTwoProcesses(0.5, 1000, seed);
    auto features = std::make_shared<HawkesFeatures>(
        HawkesFeatures::Create(d, DefaultHawkesRates(d)).value());
    const TestQuery q{1, {0}, {1}};
    std::printf("strong effect seed %llu: hawkes-lr %.3g", (unsigned long long)seed,
                HawkesLrTest(features, {.chi_bar_draws = 2000, .seed = seed}).Run(q).p_value);
    for (BatchVariance b : {BatchVariance::kNone, BatchVariance::kUncentred, BatchVariance::kCentred}) {
      const Result<LocalCovarianceEstimate> e =
          LocalCovarianceTest(features, {.batch_variance = b}).Estimate(q);
      std::printf(", %s %.3g", b == BatchVariance::kNone ? "default" : b == BatchVariance::kUncentred ? "uncentred" : "centred",
                  LocalCovarianceTest(features, {.batch_variance = b}).Run(q).p_value);
      if (b == BatchVariance::kNone && e.ok()) {
        std::printf(" (V_hat/uncentred/centred of component 0: %.4g/%.4g/%.4g, %d blocks)",
                    e.value().variance(0, 0), e.value().batch_variance[0],
                    e.value().centred_batch_variance[0], e.value().blocks);
      }
    }
    std::printf("\n");
    std::fflush(stdout);
  }
}

// Every true null of the form b _||_ a | {b} or {b, c} on the demo graph
// (the queries a size-1 screen asks), hidden drivers removed from the data,
// parameters drawn per replicate (LOCIND_VARIANT_SETTING=drawn, default) or
// the demo's two truths (fixed). Pooled rejections per test (skipped unless
// run with --no-skip).
TEST_CASE("pooled demo nulls" * doctest::skip()) {
  const char* env = std::getenv("LOCIND_VARIANT_SEED");
  const uint64_t seed = env ? std::strtoull(env, nullptr, 10) : 11;
  const char* reps_env = std::getenv("LOCIND_VARIANT_REPS");
  const int reps = reps_env ? std::atoi(reps_env) : 8;
  const char* len_env = std::getenv("LOCIND_VARIANT_LENGTH");
  const double horizon = len_env ? std::atof(len_env) : 4000.0;
  const char* which = std::getenv("LOCIND_VARIANT_SETTING");
  const bool fixed = which && std::string(which) == "fixed";
  std::vector<LocalCovarianceOptions> variants(4);
  variants[1].batch_variance = BatchVariance::kUncentred;
  variants[2].batch_variance = BatchVariance::kUncentred;
  variants[2].folds = 3;
  variants[3].batch_variance = BatchVariance::kUncentred;
  variants[3].nuisance_rates = 6;
  variants[3].quadratic = true;
  variants[3].ridge = 1e-2;
  const char* set = std::getenv("LOCIND_VARIANT_SET");
  if (set && std::string(set) == "default") variants.resize(1);
  if (set && std::string(set) == "batch") variants.resize(2);
  if (set && std::string(set) == "centred") {  // default, uncentred, centred
    variants.resize(3);
    variants[2] = LocalCovarianceOptions{};
    variants[2].batch_variance = BatchVariance::kCentred;
  }
  const graph::TruthGraph truth = Truth(Setting::kDemoDrawn);
  OracleTest oracle = OracleTest::FromTruth(truth).value();
  std::vector<std::vector<double>> p(variants.size() + 1);
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  for (int r = 0; r < reps; ++r) {
    base::RandomStream random(base::StreamKey{seed, 99, uint64_t(r), uint64_t(horizon)});
    const sim::HawkesModel model = fixed ? DemoTruth(truth, 1 + r % 2) : DemoDraw(truth, random);
    sim::EventData d = sim::SimulateHawkes(model, o, random).value();
    d.times.resize(5);
    d.names.resize(5);
    const std::vector<double> rates = DefaultHawkesRates(d);
    auto features =
        std::make_shared<HawkesFeatures>(HawkesFeatures::Create(std::move(d), rates).value());
    HawkesLrTest lr(features, {.chi_bar_draws = 2000, .seed = seed});
    std::vector<LocalCovarianceTest> lcm;
    for (const LocalCovarianceOptions& v : variants) lcm.emplace_back(features, v);
    for (int b = 0; b < 5; ++b) {
      for (int a = 0; a < 5; ++a) {
        if (a == b) continue;
        for (int c = -1; c < 5; ++c) {
          if (c == a || c == b) continue;
          TestQuery q{b, {a}, c < 0 ? std::vector<int>{b} : std::vector<int>{std::min(b, c), std::max(b, c)}};
          if (oracle.Run(q).p_value < 0.5) continue;
          const TestResult t = lr.Run(q);
          if (t.status == TestStatus::kOk) p[0].push_back(t.p_value);
          for (size_t v = 0; v < lcm.size(); ++v) {
            const TestResult u = lcm[v].Run(q);
            if (u.status == TestStatus::kOk) p[v + 1].push_back(u.p_value);
          }
        }
      }
    }
  }
  ReportVariants(fixed ? "pooled demo (fixed truths)" : "pooled demo (drawn)", horizon, p);
}

}  // namespace locind::learners
