// Maximal graph + equivalence graph for random sparse graphs with 6 to 16
// observed nodes, and the speed-up over the test suite's definition-level
// brute force (tests/graph/brute_force.h) at 6 and 8 nodes.
//
// Graphs: 2 hidden nodes among n + 2, expected in-degree 1.5, random loops,
// projected onto the n observed nodes.
#include <benchmark/benchmark.h>

#include <algorithm>
#include <chrono>
#include <ctime>
#include <vector>

#include "graph/equivalence_graph.h"
#include "graph/latent_projection.h"
#include "graph/separation_model.h"
#include "base/random_stream.h"
#include "graph/truth_graph.h"
#include "tests/graph/brute_force.h"
#include "tests/graph/graph_fixtures.h"

namespace {

using namespace locind::graph;

BitGraph ProjectedGraph(int observed, uint64_t seed) {
  locind::base::RandomStream random(seed);
  RandomGraphOptions o;
  o.nodes = observed + 2;
  o.expected_in_degree = 1.5;
  o.hidden_count = 2;
  const TruthGraph truth = RandomTruthGraph(o, random);
  Mask hidden = 0;
  for (int h : truth.hidden) hidden |= Bit(h);
  return LatentProjection(*ToBitGraph(truth.graph), hidden);
}

void BM_EquivalenceGraph(benchmark::State& state) {
  const int n = static_cast<int>(state.range(0));
  int64_t graphs = 0;
  uint64_t seed = 100;
  for (auto _ : state) {
    const BitGraph g = ProjectedGraph(n, seed++);
    benchmark::DoNotOptimize(ComputeEquivalenceGraph(g));
    ++graphs;
  }
  state.counters["graphs"] = static_cast<double>(graphs);
}
BENCHMARK(BM_EquivalenceGraph)
    ->Arg(6)->Arg(8)->Arg(10)->Arg(12)->Arg(14)->Arg(16)
    ->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime()->UseRealTime();

void BM_SpeedupOverBruteForce(benchmark::State& state) {
  const int n = static_cast<int>(state.range(0));
  double engine = 0, brute = 0;
  uint64_t seed = 100;
  for (auto _ : state) {
    const BitGraph g = ProjectedGraph(n, seed++);
    auto t0 = std::chrono::steady_clock::now();
    benchmark::DoNotOptimize(ComputeEquivalenceGraph(g));
    auto t1 = std::chrono::steady_clock::now();
    const auto max = locind::testing::BruteMaximal(locind::testing::ToBrute(g));
    benchmark::DoNotOptimize(locind::testing::BruteDashed(max));
    auto t2 = std::chrono::steady_clock::now();
    engine += std::chrono::duration<double>(t1 - t0).count();
    brute += std::chrono::duration<double>(t2 - t1).count();
  }
  state.counters["speedup"] = brute / engine;
}
BENCHMARK(BM_SpeedupOverBruteForce)->Arg(6)->Arg(8)->Unit(benchmark::kMillisecond)->Iterations(5);

double ThreadCpuSeconds() {
  timespec ts;
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
  return double(ts.tv_sec) + 1e-9 * double(ts.tv_nsec);
}

// The family of issue 19: n observed processes, each directed edge with
// probability 0.125, a loop on every node, 0, 1 or 2 hidden nodes (graph i
// has i mod 3), projected; 20 graphs, seeds 1000-1019. Counters: median and
// largest CPU seconds per equivalence graph, and `median_to_table`, the
// median ratio of that time to one separation table of the same graph
// (SeparationModel::Compute, the fixed cost every class computation pays).
void BM_EquivalenceGraphIssueFamily(benchmark::State& state) {
  const int n = static_cast<int>(state.range(0));
  std::vector<double> seconds, ratios;
  for (auto _ : state) {
    for (int i = 0; i < 20; ++i) {
      locind::base::RandomStream random(1000 + i);
      RandomGraphOptions o;
      o.nodes = n + i % 3;
      o.edge_probability = 0.125;
      o.loops = LoopPolicy::kAll;
      o.hidden_count = i % 3;
      const TruthGraph truth = RandomTruthGraph(o, random);
      Mask hidden = 0;
      for (int h : truth.hidden) hidden |= Bit(h);
      const BitGraph g = LatentProjection(*ToBitGraph(truth.graph), hidden);
      const double t0 = ThreadCpuSeconds();
      benchmark::DoNotOptimize(ComputeEquivalenceGraph(g));
      const double t1 = ThreadCpuSeconds();
      benchmark::DoNotOptimize(SeparationModel::Compute(g));
      const double t2 = ThreadCpuSeconds();
      seconds.push_back(t1 - t0);
      ratios.push_back((t1 - t0) / std::max(t2 - t1, 1e-9));
    }
  }
  std::sort(seconds.begin(), seconds.end());
  std::sort(ratios.begin(), ratios.end());
  state.counters["median_s"] = seconds[seconds.size() / 2];
  state.counters["max_s"] = seconds.back();
  state.counters["median_to_table"] = ratios[ratios.size() / 2];
}
BENCHMARK(BM_EquivalenceGraphIssueFamily)->Arg(12)->Arg(16)->Iterations(1)->Unit(benchmark::kSecond);

}  // namespace

BENCHMARK_MAIN();
