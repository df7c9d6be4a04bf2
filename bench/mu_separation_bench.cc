// mu-separation queries per second at 10, 20 and 50 nodes, and the ratio of
// their cost to a plain reachability pass over the same graph (following
// children only: the floor for any search that must look at the graph).
#include <benchmark/benchmark.h>

#include <bit>
#include <chrono>
#include <vector>

#include "graph/mu_separation.h"
#include "base/random_stream.h"
#include "graph/truth_graph.h"

namespace {

using namespace locind::graph;

BitGraph SparseGraph(int n, uint64_t seed) {
  locind::base::RandomStream random(seed);
  RandomGraphOptions o;
  o.nodes = n;
  o.expected_in_degree = 2;
  o.bidirected_probability = 1.0 / n;
  return *ToBitGraph(RandomTruthGraph(o, random).graph);
}

Mask PlainReach(const BitGraph& g, int a) {
  Mask seen = g.children[a];
  Mask frontier = seen;
  while (frontier != 0) {
    const int v = std::countr_zero(frontier);
    frontier &= frontier - 1;
    const Mask fresh = g.children[v] & ~seen;
    seen |= fresh;
    frontier |= fresh;
  }
  return seen;
}

struct Query {
  int a;
  Mask c;
};

std::vector<Query> Queries(int n, uint64_t seed) {
  locind::base::RandomStream random(seed);
  std::vector<Query> out;
  for (int i = 0; i < 1024; ++i) {
    Query q{static_cast<int>(random.Uniform() * n), 0};
    for (int v = 0; v < n; ++v)
      if (v != q.a && random.Uniform() < 0.2) q.c |= Bit(v);
    out.push_back(q);
  }
  return out;
}

void BM_MuSeparation(benchmark::State& state) {
  const int n = static_cast<int>(state.range(0));
  const BitGraph g = SparseGraph(n, 5);
  const std::vector<Query> queries = Queries(n, 6);
  double mu_seconds = 0, reach_seconds = 0;
  int64_t count = 0;
  for (auto _ : state) {
    auto t0 = std::chrono::steady_clock::now();
    for (const Query& q : queries) benchmark::DoNotOptimize(ConnectedFrom(g, q.a, q.c));
    auto t1 = std::chrono::steady_clock::now();
    for (const Query& q : queries) benchmark::DoNotOptimize(PlainReach(g, q.a));
    auto t2 = std::chrono::steady_clock::now();
    mu_seconds += std::chrono::duration<double>(t1 - t0).count();
    reach_seconds += std::chrono::duration<double>(t2 - t1).count();
    count += static_cast<int64_t>(queries.size());
  }
  state.counters["queries_per_s"] = count / mu_seconds;
  state.counters["ratio_to_plain_reach"] = mu_seconds / reach_seconds;
}
BENCHMARK(BM_MuSeparation)->Arg(10)->Arg(20)->Arg(50);

}  // namespace

BENCHMARK_MAIN();
