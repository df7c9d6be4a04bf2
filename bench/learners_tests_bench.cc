// Speed of the independence tests, with baselines measured in the same run:
//  - BM_HawkesLrTest: one likelihood-ratio test (linear model, K = 3) on
//    about 100,000 events of 6 processes with |A u C| = 5. The framework times
//    the test with features already computed and shared; the counters give
//    `shared_ms` (that time), `recompute_ms` (features computed again for the
//    test, as a test without sharing would) and `speedup` (their ratio).
//    `features_share` is the share of the recomputing run spent on features.
//    The test uses its default (chi-bar-squared) reference; `to_10ms_target`
//    is shared_ms / 10 (issue target: at most 1). The allocator keeps freed
//    blocks (base::KeepFreedMemory), as in locind itself.
//  - BM_LocalCovarianceTest: the cross-fitted local covariance test on the
//    same data and query, features shared and their quadrature-grid values
//    already computed (a study computes them once per data set). Counters:
//    `lr_ms`, the likelihood-ratio test timed in the same run, `ratio` (local
//    covariance time / LR time), `first_ms` (a first query that also computes
//    the grid and the grid features of the 5 processes).
//  - BM_DriftTest: one drift F test on 10 processes x 100,000 samples with
//    |A u C| = 10 (31 coefficients), from a fresh test object (filtered
//    columns and shared moments included). Counters: `later_test_us`, the
//    mean time of nine further queries on the same data (moments reused),
//    and `qr_baseline_ms`, the first query done by two QR least-squares fits
//    on the assembled design instead.
//  - BM_DriftExactLrTest: one drift-exact-lr test on the same data with 3 and
//    5 coordinates; counter `ratio_to_drift_f` (see the function).
#include <benchmark/benchmark.h>

#include <ctime>
#include <memory>

#include "base/memory_tuning.h"
#include "graph/truth_graph.h"
#include "learners/independence/drift_test.h"
#include "learners/independence/drift_transition_test.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/independence/local_covariance_test.h"
#include "sim/diffusion_simulator.h"
#include "sim/hawkes_simulator.h"

namespace {

using namespace locind;

// Thread CPU time, as the machine may be shared.
double CpuSeconds() {
  timespec ts;
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
  return double(ts.tv_sec) + 1e-9 * double(ts.tv_nsec);
}

graph::TruthGraph RandomTruth(int nodes, uint64_t seed) {
  graph::RandomGraphOptions o;
  o.nodes = nodes;
  o.expected_in_degree = 1.5;
  o.loops = graph::LoopPolicy::kAll;
  base::RandomStream random(base::StreamKey{seed, 0, 0, 0});
  return graph::RandomTruthGraph(o, random);
}

sim::EventData HawkesData() {
  // Weight 0.15 on in-degree ~2.5 (loops included) keeps the radius < 1.
  const sim::HawkesModel model = sim::ExponentialHawkes(RandomTruth(6, 1), 1.0, 0.15, 2.0);
  const Eigen::VectorXd rates = sim::StationaryIntensity(model).value();
  sim::HawkesRunOptions o;
  o.horizon = 100000 / rates.sum();
  o.burn_in = 50;
  base::RandomStream random(base::StreamKey{1, 0, 0, 1});
  return sim::SimulateHawkes(model, o, random).value();
}

void BM_HawkesLrTest(benchmark::State& state) {
  base::KeepFreedMemory();  // as locind's main() does
  const sim::EventData data = HawkesData();
  const std::vector<double> rates = learners::DefaultHawkesRates(data);
  auto shared = std::make_shared<learners::HawkesFeatures>(
      learners::HawkesFeatures::Create(data, rates).value());
  const learners::TestQuery query{0, {1}, {0, 2, 3, 4}};
  learners::HawkesLrTest(shared).Run(query);  // fills the shared features
  double shared_time = 0, recompute_time = 0, feature_time = 0;
  for (auto _ : state) {
    const double t0 = CpuSeconds();
    learners::HawkesLrTest warm(shared);
    benchmark::DoNotOptimize(warm.Run(query));
    const double t1 = CpuSeconds();
    state.PauseTiming();
    const double t2 = CpuSeconds();
    auto fresh = std::make_shared<learners::HawkesFeatures>(
        learners::HawkesFeatures::Create(data, rates).value());
    for (int j : {0, 1, 2, 3, 4}) fresh->AtEvents(0, j), fresh->Integrals(j);
    const double t3 = CpuSeconds();
    learners::HawkesLrTest cold(fresh);
    benchmark::DoNotOptimize(cold.Run(query));
    const double t4 = CpuSeconds();
    state.ResumeTiming();
    shared_time += t1 - t0;
    recompute_time += t4 - t2;
    feature_time += t3 - t2;
  }
  const double n = double(state.iterations());
  state.counters["events"] = double(data.total_events());
  state.counters["shared_ms"] = 1e3 * shared_time / n;
  state.counters["recompute_ms"] = 1e3 * recompute_time / n;
  state.counters["speedup"] = recompute_time / shared_time;
  state.counters["features_share"] = feature_time / recompute_time;
  state.counters["to_10ms_target"] = 1e3 * shared_time / n / 10;
}
BENCHMARK(BM_HawkesLrTest)->Unit(benchmark::kMillisecond)->Iterations(5);

// Arg 0: event-local-covariance; arg 1: event-local-covariance-batch (the
// centred batch-means variance besides V_hat).
void BM_LocalCovarianceTest(benchmark::State& state) {
  learners::LocalCovarianceOptions options;
  if (state.range(0) == 1) options.batch_variance = learners::BatchVariance::kCentred;
  const sim::EventData data = HawkesData();
  const std::vector<double> rates = learners::DefaultHawkesRates(data);
  auto shared = std::make_shared<learners::HawkesFeatures>(
      learners::HawkesFeatures::Create(data, rates).value());
  const learners::TestQuery query{0, {1}, {0, 2, 3, 4}};
  learners::HawkesLrTest(shared).Run(query);  // fills the event features
  const double f0 = CpuSeconds();
  learners::LocalCovarianceTest(shared, options).Run(query);  // fills the grid features
  const double first_time = CpuSeconds() - f0;
  double local_time = 0, lr_time = 0;
  for (auto _ : state) {
    const double t0 = CpuSeconds();
    learners::LocalCovarianceTest local(shared, options);
    benchmark::DoNotOptimize(local.Run(query));
    const double t1 = CpuSeconds();
    state.PauseTiming();
    const double t2 = CpuSeconds();
    learners::HawkesLrTest lr(shared);
    benchmark::DoNotOptimize(lr.Run(query));
    const double t3 = CpuSeconds();
    state.ResumeTiming();
    local_time += t1 - t0;
    lr_time += t3 - t2;
  }
  const double n = double(state.iterations());
  state.counters["events"] = double(data.total_events());
  state.counters["grid_nodes"] = double(shared->QuadratureGrid().times.size());
  state.counters["first_ms"] = 1e3 * first_time;
  state.counters["lr_ms"] = 1e3 * lr_time / n;
  state.counters["ratio"] = local_time / lr_time;
}
BENCHMARK(BM_LocalCovarianceTest)->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond)->Iterations(5);

sim::PathData DiffusionData() {
  const graph::TruthGraph truth = RandomTruth(10, 2);
  const sim::DiffusionModel model = sim::LinearDiffusion(truth, 1.0, 0.3, 1.0);
  sim::PathRunOptions o;
  o.horizon = 9999.9;  // 100,000 samples at interval 0.1
  o.interval = 0.1;
  o.method = sim::PathMethod::kExact;
  o.burn_in = 10;
  base::RandomStream random(base::StreamKey{2, 0, 0, 1});
  return sim::SimulateDiffusion(model, o, random).value();
}

void BM_DriftTest(benchmark::State& state) {
  const sim::PathData data = DiffusionData();
  const learners::TestQuery query{0, {1}, {0, 2, 3, 4, 5, 6, 7, 8, 9}};
  double later_time = 0, qr_time = 0;
  for (auto _ : state) {
    auto test = learners::DriftTest::Create(data).value();
    benchmark::DoNotOptimize(test.Run(query));
    state.PauseTiming();
    // Nine more queries on the same data reuse the shared moments.
    const double t0 = CpuSeconds();
    for (int a = 2; a < 10; ++a) benchmark::DoNotOptimize(test.Run({0, {a}, {0, 1}}));
    benchmark::DoNotOptimize(test.Run({0, {1}, {0}}));
    const double t1 = CpuSeconds();
    // Baseline: the same first query by two QR least-squares fits on the
    // assembled design, as without shared moments.
    const Eigen::MatrixXd x = test.Design({0, 1, 2, 3, 4, 5, 6, 7, 8, 9});
    const Eigen::VectorXd y = test.Response(0);
    Eigen::MatrixXd restricted(x.rows(), x.cols() - 3);
    restricted << x.leftCols(1), x.rightCols(x.cols() - 4);
    benchmark::DoNotOptimize(learners::FitLeastSquares(x, y).rss);
    benchmark::DoNotOptimize(learners::FitLeastSquares(restricted, y).rss);
    const double t2 = CpuSeconds();
    state.ResumeTiming();
    later_time += (t1 - t0) / 9;
    qr_time += t2 - t1;
  }
  const double n = double(state.iterations());
  state.counters["samples"] = double(data.samples());
  state.counters["later_test_us"] = 1e6 * later_time / n;
  state.counters["qr_baseline_ms"] = 1e3 * qr_time / n;
}
BENCHMARK(BM_DriftTest)->Unit(benchmark::kMillisecond)->Iterations(5);

// BM_DriftExactLrTest: one drift-exact-lr test on the same 100,000 samples
// with |A u C u {b}| = state.range(0) coordinates (range 3 and 5: 15 and 35
// parameters per fit), from a fresh test object (data moments included).
// Counter `ratio_to_drift_f`: its time over that of a drift-f test of the
// same query from a fresh object, measured in the same loop.
void BM_DriftExactLrTest(benchmark::State& state) {
  const sim::PathData data = DiffusionData();
  const int d = int(state.range(0));
  learners::TestQuery query{0, {1}, {0}};
  for (int j = 2; j < d; ++j) query.given.push_back(j);
  double exact_time = 0, f_time = 0;
  for (auto _ : state) {
    const double t0 = CpuSeconds();
    auto exact = learners::DriftTransitionTest::Create(data).value();
    benchmark::DoNotOptimize(exact.Run(query));
    const double t1 = CpuSeconds();
    state.PauseTiming();
    auto f = learners::DriftTest::Create(data).value();
    benchmark::DoNotOptimize(f.Run(query));
    const double t2 = CpuSeconds();
    state.ResumeTiming();
    exact_time += t1 - t0;
    f_time += t2 - t1;
  }
  state.counters["ratio_to_drift_f"] = exact_time / f_time;
}
BENCHMARK(BM_DriftExactLrTest)->Arg(3)->Arg(5)->Unit(benchmark::kMillisecond)->Iterations(3);

// BM_DriftExactLrHistoryTest: drift-exact-lr-history on the same data and
// query as BM_DriftExactLrTest (its default filter rates: two per process
// of C), from a fresh test object. Counter `ratio_to_exact_lr`: its time
// over that of drift-exact-lr on the same query, measured in the same loop.
void BM_DriftExactLrHistoryTest(benchmark::State& state) {
  const sim::PathData data = DiffusionData();
  const int d = int(state.range(0));
  learners::TestQuery query{0, {1}, {0}};
  for (int j = 2; j < d; ++j) query.given.push_back(j);
  double history_time = 0, exact_time = 0;
  for (auto _ : state) {
    const double t0 = CpuSeconds();
    auto history = learners::DriftTransitionTest::Create(data, {.history = true}).value();
    benchmark::DoNotOptimize(history.Run(query));
    const double t1 = CpuSeconds();
    state.PauseTiming();
    const double t2 = CpuSeconds();
    auto exact = learners::DriftTransitionTest::Create(data).value();
    benchmark::DoNotOptimize(exact.Run(query));
    const double t3 = CpuSeconds();
    state.ResumeTiming();
    history_time += t1 - t0;
    exact_time += t3 - t2;
  }
  state.counters["ratio_to_exact_lr"] = history_time / exact_time;
}
BENCHMARK(BM_DriftExactLrHistoryTest)->Arg(3)->Arg(5)->Unit(benchmark::kMillisecond)->Iterations(3);

}  // namespace

BENCHMARK_MAIN();
