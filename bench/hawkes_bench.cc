// Hawkes simulation speed, reported against baselines measured in the same
// run:
//  - BM_HawkesThinning/n: events per second of Ogata thinning with the
//    intensity recursion on a sparse random truth (mean in-degree 2,
//    exponential kernels, spectral radius about 0.5), and `rng_ratio`, its
//    time over an RNG-only loop drawing the same variates (one exponential
//    and one uniform per proposal). Target: rng_ratio <= 3.
//  - BM_HawkesCluster/n: the cluster construction on the same model.
//  - BM_NaiveThinning/horizon vs BM_RecursiveThinning/horizon: thinning that
//    recomputes every intensity from the whole history (O(events) per
//    proposal) against the recursion, on the 10-process model; `ns_per_event`
//    grows with the horizon for the naive one only.
#include <benchmark/benchmark.h>

#include <ctime>

#include <boost/random/exponential_distribution.hpp>

#include "base/memory_tuning.h"
#include "graph/truth_graph.h"
#include "sim/hawkes_simulator.h"

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

sim::HawkesModel SparseModel(int n) {
  graph::RandomGraphOptions o;
  o.nodes = n;
  o.expected_in_degree = 2;
  o.loops = graph::LoopPolicy::kNone;
  base::RandomStream random(base::StreamKey{1, 0, 0, 0});
  const graph::TruthGraph truth = graph::RandomTruthGraph(o, random);
  // Weight 0.25 on in-degree 2 puts the spectral radius near 0.5.
  return sim::ExponentialHawkes(truth, 1.0, 0.25, 2.0);
}

double Seconds(double a, double b) { return b - a; }

// Draws 2 * proposals variates as the thinning does; returns a checksum.
double RngOnly(int64_t proposals, base::RandomStream& random) {
  boost::random::exponential_distribution<double> exponential(1.0);
  double sum = 0;
  for (int64_t i = 0; i < proposals; ++i) sum += exponential(random.engine()) + random.Uniform();
  return sum;
}

void BM_HawkesThinning(benchmark::State& state) {
  base::KeepFreedMemory();  // as locind's main() does
  const int n = static_cast<int>(state.range(0));
  const sim::HawkesModel model = SparseModel(n);
  sim::HawkesRunStats stats;
  sim::HawkesRunOptions o;
  o.horizon = 2e5 / n;  // about 4e5 events whatever n
  o.method = sim::HawkesMethod::kThinning;
  o.stats = &stats;
  double sim_time = 0, rng_time = 0;
  int64_t events = 0, proposals = 0;
  uint64_t seed = 0;
  for (auto _ : state) {
    base::RandomStream random(++seed);
    const auto t0 = Clock::now();
    auto data = sim::SimulateHawkes(model, o, random);
    const auto t1 = Clock::now();
    benchmark::DoNotOptimize(RngOnly(stats.proposals, random));
    const auto t2 = Clock::now();
    if (!data.ok()) state.SkipWithError(data.status().message().c_str());
    sim_time += Seconds(t0, t1);
    rng_time += Seconds(t1, t2);
    events += stats.events;
    proposals += stats.proposals;
    state.SetIterationTime(Seconds(t0, t1));
  }
  state.counters["events_per_s"] = events / sim_time;
  state.counters["proposals_per_event"] = double(proposals) / events;
  state.counters["rng_ratio"] = sim_time / rng_time;
}
BENCHMARK(BM_HawkesThinning)->Arg(10)->Arg(50)->UseManualTime()->Unit(benchmark::kMillisecond);

void BM_HawkesCluster(benchmark::State& state) {
  const int n = static_cast<int>(state.range(0));
  const sim::HawkesModel model = SparseModel(n);
  sim::HawkesRunStats stats;
  sim::HawkesRunOptions o;
  o.horizon = 2e5 / n;
  o.method = sim::HawkesMethod::kCluster;
  o.stats = &stats;
  int64_t events = 0;
  uint64_t seed = 0;
  for (auto _ : state) {
    base::RandomStream random(++seed);
    auto data = sim::SimulateHawkes(model, o, random);
    if (!data.ok()) state.SkipWithError(data.status().message().c_str());
    events += stats.events;
  }
  state.counters["events_per_s"] = benchmark::Counter(double(events), benchmark::Counter::kIsRate);
}
BENCHMARK(BM_HawkesCluster)->Arg(10)->Arg(50)->Unit(benchmark::kMillisecond);

// Ogata thinning without the recursion: every intensity is recomputed from
// the whole history at every proposal.
int64_t NaiveThinning(const sim::HawkesModel& m, double horizon, base::RandomStream& random) {
  const int n = m.nodes();
  std::vector<std::pair<double, int>> history;
  boost::random::exponential_distribution<double> exponential(1.0);
  std::vector<double> lambda(n);
  auto intensities = [&](double t) {
    double total = 0;
    for (int b = 0; b < n; ++b) lambda[b] = m.baseline[b];
    for (const auto& [s, a] : history) {
      for (const sim::EdgeKernel& e : m.kernels) {
        if (e.from == a) lambda[e.to] += e.kernel.Value(t - s);
      }
    }
    for (double l : lambda) total += l;
    return total;
  };
  double t = 0;
  double bound = intensities(0);
  while (true) {
    t += exponential(random.engine()) / bound;
    if (t >= horizon) break;
    const double total = intensities(t);
    double v = random.Uniform() * bound;
    if (v < total) {
      int b = 0;
      while (b < n - 1 && v >= lambda[b]) v -= lambda[b++];
      history.emplace_back(t, b);
      bound = intensities(t + 1e-12);  // just after the event
    } else {
      bound = total;
    }
  }
  return static_cast<int64_t>(history.size());
}

void BM_NaiveThinning(benchmark::State& state) {
  const sim::HawkesModel model = SparseModel(10);
  const double horizon = static_cast<double>(state.range(0));
  int64_t events = 0;
  uint64_t seed = 0;
  for (auto _ : state) {
    base::RandomStream random(++seed);
    events += NaiveThinning(model, horizon, random);
  }
  state.counters["ns_per_event"] =
      benchmark::Counter(double(events) * 1e-9, benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_NaiveThinning)->Arg(25)->Arg(50)->Arg(100)->Unit(benchmark::kMillisecond);

void BM_RecursiveThinning(benchmark::State& state) {
  const sim::HawkesModel model = SparseModel(10);
  sim::HawkesRunStats stats;
  sim::HawkesRunOptions o;
  o.horizon = static_cast<double>(state.range(0));
  o.method = sim::HawkesMethod::kThinning;
  o.stats = &stats;
  int64_t events = 0;
  uint64_t seed = 0;
  for (auto _ : state) {
    base::RandomStream random(++seed);
    benchmark::DoNotOptimize(sim::SimulateHawkes(model, o, random));
    events += stats.events;
  }
  state.counters["ns_per_event"] =
      benchmark::Counter(double(events) * 1e-9, benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_RecursiveThinning)->Arg(25)->Arg(50)->Arg(100)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
