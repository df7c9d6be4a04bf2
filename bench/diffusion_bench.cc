// Diffusion simulation speed, reported against baselines measured in the
// same run:
//  - BM_EulerMaruyama/n: coordinate-steps per second of Euler-Maruyama on a
//    sparse linear model (mean in-degree 2 plus loops), and `normals_ratio`,
//    its time over a loop drawing the same normals. Target: <= 2.
//  - BM_EulerMaruyamaTanh/n: the same with the tanh drift.
//  - BM_ExactTransition/n: coordinate-samples per second of the exact OU
//    transition (one dense matrix-vector product per sample).
#include <benchmark/benchmark.h>

#include <ctime>

#include <boost/random/normal_distribution.hpp>

#include "graph/truth_graph.h"
#include "sim/diffusion_simulator.h"

namespace {

using namespace locind;

// Thread CPU time: the machine may be shared, and CPU time is what the ratio
// should compare.
struct Clock {
  using time_point = double;
  static double now() {
    timespec ts;
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return ts.tv_sec + 1e-9 * ts.tv_nsec;
  }
};

sim::DiffusionModel SparseModel(int n, bool tanh) {
  graph::RandomGraphOptions o;
  o.nodes = n;
  o.expected_in_degree = 2;
  o.loops = graph::LoopPolicy::kAll;
  base::RandomStream random(base::StreamKey{2, 0, 0, 0});
  const graph::TruthGraph truth = graph::RandomTruthGraph(o, random);
  return tanh ? sim::TanhDiffusion(truth, 1.0, 0.3, 1.0) : sim::LinearDiffusion(truth, 1.0, 0.3, 1.0);
}

double Seconds(double a, double b) { return b - a; }

double NormalsOnly(int64_t count, base::RandomStream& random) {
  boost::random::normal_distribution<double> normal;
  double sum = 0;
  for (int64_t i = 0; i < count; ++i) sum += normal(random.engine());
  return sum;
}

void RunEuler(benchmark::State& state, bool tanh) {
  const int n = static_cast<int>(state.range(0));
  const sim::DiffusionModel model = SparseModel(n, tanh);
  sim::PathRunOptions o;
  o.step = 0.01;
  o.interval = 0.1;
  o.horizon = 2e4 / n;  // 2e6 coordinate-steps whatever n
  const int64_t steps = static_cast<int64_t>(std::llround(o.horizon / o.step)) * n;
  double sim_time = 0, rng_time = 0;
  int64_t total = 0;
  uint64_t seed = 0;
  for (auto _ : state) {
    base::RandomStream random(++seed);
    const auto t0 = Clock::now();
    auto data = sim::SimulateDiffusion(model, o, random);
    const auto t1 = Clock::now();
    benchmark::DoNotOptimize(NormalsOnly(steps, random));
    const auto t2 = Clock::now();
    if (!data.ok()) state.SkipWithError(data.status().message().c_str());
    sim_time += Seconds(t0, t1);
    rng_time += Seconds(t1, t2);
    total += steps;
    state.SetIterationTime(Seconds(t0, t1));
  }
  state.counters["coordinate_steps_per_s"] = total / sim_time;
  state.counters["normals_ratio"] = sim_time / rng_time;
}

void BM_EulerMaruyama(benchmark::State& state) { RunEuler(state, false); }
void BM_EulerMaruyamaTanh(benchmark::State& state) { RunEuler(state, true); }
BENCHMARK(BM_EulerMaruyama)->Arg(10)->Arg(50)->UseManualTime()->Unit(benchmark::kMillisecond);
BENCHMARK(BM_EulerMaruyamaTanh)->Arg(10)->Arg(50)->UseManualTime()->Unit(benchmark::kMillisecond);

void BM_ExactTransition(benchmark::State& state) {
  const int n = static_cast<int>(state.range(0));
  const sim::DiffusionModel model = SparseModel(n, false);
  sim::PathRunOptions o;
  o.interval = 0.1;
  o.step = 0.1;
  o.horizon = 2e5 / n;
  o.method = sim::PathMethod::kExact;
  int64_t samples = 0;
  uint64_t seed = 0;
  for (auto _ : state) {
    base::RandomStream random(++seed);
    auto data = sim::SimulateDiffusion(model, o, random);
    if (!data.ok()) state.SkipWithError(data.status().message().c_str());
    samples += int64_t(data->samples()) * n;
  }
  state.counters["coordinate_samples_per_s"] =
      benchmark::Counter(double(samples), benchmark::Counter::kIsRate);
}
BENCHMARK(BM_ExactTransition)->Arg(10)->Arg(50)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
