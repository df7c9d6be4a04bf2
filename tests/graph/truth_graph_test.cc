// Random truth graphs: the numbers of directed edges, loops and bidirected
// edges over many draws follow their binomial laws (Pearson chi-square
// goodness of fit), and the hidden nodes are named and counted as asked.
#include "graph/truth_graph.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <string>
#include <vector>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/chi_squared.hpp>

namespace locind::graph {
namespace {

constexpr int kDraws = 2000;

// Pearson's statistic of `counts` (one observed value per draw) against
// Binomial(n, p), tail cells pooled until each expects at least 5 draws
// (Cochran 1954, Biometrics 10(4); common practice). Sets `df` to cells - 1
// (p is given, not fitted).
double PearsonStatistic(const std::vector<int>& counts, int n, double p, int& df) {
  const boost::math::binomial_distribution<> law(n, p);
  const double draws = double(counts.size());
  int lo = 0;  // first cell: values <= lo
  while (boost::math::cdf(law, lo) * draws < 5) ++lo;
  int hi = n;  // last cell: values >= hi
  while (boost::math::cdf(boost::math::complement(law, hi - 1)) * draws < 5) --hi;
  std::vector<double> observed(hi - lo + 1, 0.0), expected(hi - lo + 1, 0.0);
  for (int c : counts) observed[std::clamp(c, lo, hi) - lo] += 1;
  expected.front() = boost::math::cdf(law, lo) * draws;
  expected.back() = boost::math::cdf(boost::math::complement(law, hi - 1)) * draws;
  for (int k = lo + 1; k < hi; ++k) expected[k - lo] = boost::math::pdf(law, k) * draws;
  double statistic = 0;
  for (size_t i = 0; i < observed.size(); ++i) {
    statistic += (observed[i] - expected[i]) * (observed[i] - expected[i]) / expected[i];
  }
  df = int(observed.size()) - 1;
  return statistic;
}

// Band: family-wise level 0.001 split Bonferroni over the 3 goodness-of-fit
// checks of this file, each rejecting above the chi-square quantile at
// 1 - 0.001 / 3 (Boost.Math; SciPy 1.10 stats.chi2.ppf(1 - 0.001 / 3, 11) =
// 34.2166 for the directed edges).
double Critical(int df) {
  return boost::math::quantile(boost::math::chi_squared(df), 1 - 0.001 / 3);
}

TEST_CASE("edge, loop and bidirected counts follow their binomial laws") {
  RandomGraphOptions o;
  o.nodes = 5;
  o.expected_in_degree = 1.2;  // p = 1.2 / 4 = 0.3 per ordered pair
  o.loops = LoopPolicy::kRandom;
  o.loop_probability = 0.5;
  o.bidirected_probability = 0.2;
  REQUIRE(Validate(o).ok());
  base::RandomStream random(8101);
  std::vector<int> directed, loops, bidirected;
  for (int d = 0; d < kDraws; ++d) {
    const TruthGraph t = RandomTruthGraph(o, random);
    int edges = 0, self = 0;
    for (int a = 0; a < o.nodes; ++a) {
      for (int b = 0; b < o.nodes; ++b) (a == b ? self : edges) += t.graph.HasDirected(a, b);
    }
    directed.push_back(edges);
    loops.push_back(self);
    bidirected.push_back(t.graph.BidirectedEdgeCount());
  }
  int df = 0;
  // n (n - 1) = 20 ordered pairs with p = 0.3: cells <= 1, 2..11, >= 12.
  const double x_directed = PearsonStatistic(directed, 20, 0.3, df);
  CHECK(df == 11);
  CHECK(Critical(11) == doctest::Approx(34.2166).epsilon(1e-5).scale(0));
  CHECK_MESSAGE(x_directed < Critical(df), "directed: chi-square ", x_directed);
  const double x_loops = PearsonStatistic(loops, 5, 0.5, df);  // 5 loops, p = 0.5
  CHECK(df == 5);
  CHECK_MESSAGE(x_loops < Critical(df), "loops: chi-square ", x_loops);
  const double x_bidirected = PearsonStatistic(bidirected, 10, 0.2, df);  // 10 pairs, p = 0.2
  CHECK(df == 6);
  CHECK_MESSAGE(x_bidirected < Critical(df), "bidirected: chi-square ", x_bidirected);
  // The check has power: the same counts against p = 0.35 (mean 7 instead of
  // 6 edges) are rejected (a property of these draws, not a sized check).
  CHECK(PearsonStatistic(directed, 20, 0.35, df) > Critical(df));
}

TEST_CASE("hidden nodes: count, names and order") {
  RandomGraphOptions o;
  o.nodes = 6;
  o.hidden_count = 2;
  base::RandomStream random(8102);
  const TruthGraph t = RandomTruthGraph(o, random);
  REQUIRE(t.hidden.size() == 2);
  CHECK(t.hidden[0] < t.hidden[1]);
  CHECK(t.Observed().size() == 4);
  int x = 0, h = 0;
  for (int v = 0; v < o.nodes; ++v) {
    const bool hidden = t.IsHidden(v);
    std::string expected(1, hidden ? 'h' : 'x');
    expected += std::to_string(hidden ? ++h : ++x);
    CHECK(t.graph.name(v) == expected);
  }
  o.hidden_list = {0, 5};
  o.hidden_count = 2;
  const TruthGraph listed = RandomTruthGraph(o, random);
  CHECK(listed.hidden == std::vector<int>{0, 5});
}

}  // namespace
}  // namespace locind::graph
