// Learning methods under the oracle at 8, 12 and 16 observed nodes: tests
// made and time per method.
//
// Graphs: 2 hidden nodes among n + 2, expected in-degree 1.5, random loops
// (the graphs of bench/equivalence_class_bench.cc). Each iteration learns a
// fresh graph (seeds 100, 101, ...); counters report the mean tests made per
// graph, the largest conditioning set, and the tests relative to pairwise
// (n^2 tests) and to the full table that exhaustive asks (n^2 2^(n-1)). exhaustive is refused beyond
// learners::kMaxExhaustiveNodes = 12 and is run at 8 and 12 only;
// maximal-search runs a single graph at 16 (its separation and final phases
// grow exponentially with the size of the current ancestor sets).
#include <benchmark/benchmark.h>

#include "graph/latent_projection.h"
#include "base/random_stream.h"
#include "graph/truth_graph.h"
#include "learners/methods/learner_registry.h"
#include "learners/independence/oracle_test.h"

namespace {

using namespace locind;

graph::TruthGraph Truth(int observed, uint64_t seed) {
  base::RandomStream random(seed);
  graph::RandomGraphOptions o;
  o.nodes = observed + 2;
  o.expected_in_degree = 1.5;
  o.hidden_count = 2;
  return graph::RandomTruthGraph(o, random);
}

void RunMethod(benchmark::State& state, const char* name) {
  const int n = static_cast<int>(state.range(0));
  const learners::MethodEntry* entry = learners::FindMethod(name);
  double tests = 0;
  double edges = 0;
  int largest = 0;
  int64_t graphs = 0;
  uint64_t seed = 100;
  for (auto _ : state) {
    state.PauseTiming();
    Result<learners::OracleTest> oracle = learners::OracleTest::FromTruth(Truth(n, seed++));
    std::unique_ptr<learners::Learner> method = entry->make(learners::MethodSettings{});
    state.ResumeTiming();
    Result<learners::LearnResult> r = method->Learn(learners::LearnInput{&oracle.value(), 0.05});
    if (!r.ok()) {
      state.SkipWithError(r.status().message().c_str());
      return;
    }
    tests += r->tests;
    edges += r->graph.DirectedEdgeCount() + r->graph.BidirectedEdgeCount();
    largest = std::max(largest, r->largest_given);
    ++graphs;
  }
  state.counters["tests"] = tests / graphs;
  state.counters["tests_vs_pairwise"] = tests / graphs / (n * n);
  // exhaustive asks the full table: n^2 2^(n-1) questions.
  state.counters["tests_vs_full_table"] = tests / graphs / (double(n * n) * double(1 << (n - 1)));
  state.counters["edges"] = edges / graphs;
  state.counters["largest_C"] = largest;
}

void BM_Pairwise(benchmark::State& s) { RunMethod(s, "pairwise"); }
void BM_Screen(benchmark::State& s) { RunMethod(s, "screen"); }
void BM_MaximalSearch(benchmark::State& s) { RunMethod(s, "maximal-search"); }
void BM_Exhaustive(benchmark::State& s) { RunMethod(s, "exhaustive"); }

BENCHMARK(BM_Pairwise)->Arg(8)->Arg(12)->Arg(16)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_Screen)->Arg(8)->Arg(12)->Arg(16)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_MaximalSearch)->Arg(8)->Arg(12)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_Exhaustive)->Arg(8)->Arg(12)->Unit(benchmark::kMillisecond);
// One graph at 16 nodes, last (it holds about 1.4 GB): some 2.7 million
// oracle questions.
BENCHMARK(BM_MaximalSearch)->Arg(16)->Iterations(1)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
