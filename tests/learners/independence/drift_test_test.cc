#include "learners/independence/drift_test.h"

#include <cmath>

#include <doctest/doctest.h>

#include "graph/dmg.h"
#include "base/random_stream.h"
#include "sim/diffusion_model.h"
#include "sim/diffusion_simulator.h"

namespace locind::learners {
namespace {

// Linear diffusion a -> b (loops on both), sampled every 0.1.
sim::PathData Draw(double coupling, double horizon, uint64_t seed) {
  graph::Dmg g({"a", "b"});
  g.AddDirected(0, 0);
  g.AddDirected(1, 1);
  if (coupling != 0) g.AddDirected(0, 1);
  sim::DiffusionModel m = sim::LinearDiffusion(graph::TruthGraph{g, {}}, 1.0, coupling, 1.0);
  sim::PathRunOptions o;
  o.horizon = horizon;
  o.interval = 0.1;
  o.step = 0.01;
  o.burn_in = 10;
  base::RandomStream random(seed);
  return sim::SimulateDiffusion(m, o, random).value();
}

TEST_CASE("least squares agrees with the normal equations and a one-regressor closed form") {
  base::RandomStream random(9);
  Eigen::MatrixXd x(200, 3);
  Eigen::VectorXd y(200);
  for (int i = 0; i < 200; ++i) {
    x(i, 0) = 1;
    x(i, 1) = random.Uniform();
    x(i, 2) = random.Uniform() + x(i, 1);
    y[i] = 0.5 + 2 * x(i, 1) - x(i, 2) + random.Uniform();
  }
  const LeastSquares fit = FitLeastSquares(x, y);
  // Normal equations X'X b = X'y solved by Cholesky (common practice, no source).
  const Eigen::VectorXd normal = (x.transpose() * x).llt().solve(x.transpose() * y);
  CHECK((fit.coefficients - normal).cwiseAbs().maxCoeff() < 1e-10);
  CHECK(fit.rank == 3);
  CHECK(fit.rss == doctest::Approx((y - x * normal).squaredNorm()));
  // Simple regression: slope = cov(x, y) / var(x), intercept = ybar - slope xbar.
  const Eigen::MatrixXd x2 = x.leftCols(2);
  const LeastSquares simple = FitLeastSquares(x2, y);
  const Eigen::VectorXd u = x.col(1).array() - x.col(1).mean();
  const Eigen::VectorXd v = y.array() - y.mean();
  const double slope = u.dot(v) / u.squaredNorm();
  CHECK(simple.coefficients[1] == doctest::Approx(slope).epsilon(1e-10));
  CHECK(simple.coefficients[0] == doctest::Approx(y.mean() - slope * x.col(1).mean()).epsilon(1e-10));
}

TEST_CASE("filtered histories follow the recursion") {
  sim::PathData d;
  d.names = {"a"};
  d.time = {0, 1, 2, 3};
  d.values.resize(4, 1);
  d.values << 1, 2, 4, 8;
  auto test = DriftTest::Create(d, {.rates = {1.0}}).value();
  const Eigen::MatrixXd x = test.Design({0});
  const double a = std::exp(-1.0);
  // Columns: 1, X, F; rows scaled by sqrt(dt) = 1.
  CHECK(x(0, 1) == 1);
  CHECK(x(0, 2) == 1);  // F_0 = X_0
  CHECK(x(1, 2) == doctest::Approx(a * 1 + (1 - a) * 1));
  CHECK(x(2, 2) == doctest::Approx(a * 1 + (1 - a) * 2));
  CHECK(test.Response(0)[2] == 4);
}

TEST_CASE("the F statistic of two coefficients (q = 2) is the Wald statistic over q") {
  // Greene 2012, Econometric Analysis, 7th ed., Sec. 5.3: the nested-model F
  // of q linear restrictions equals the Wald form with s^2 divided by q (for
  // q = 1 that is t^2; the body checks q = 2).
  sim::PathData d = Draw(0.5, 200, 1);
  auto test = DriftTest::Create(d, {.rates = {}}).value();
  const TestResult r = test.Run({1, {0}, {1}});
  REQUIRE(r.status == TestStatus::kOk);
  CHECK(r.df == 2);  // current value and the fast filter of a (window 200 < 50 / 0.1)
  auto one = DriftTest::Create(d, {.rates = {0.5}}).value();
  const Eigen::MatrixXd x = one.Design({0, 1});
  const Eigen::VectorXd y = one.Response(1);
  const LeastSquares fit = FitLeastSquares(x, y);
  const double s2 = fit.rss / double(x.rows() - x.cols());
  const Eigen::MatrixXd inv = (x.transpose() * x).inverse();
  // Only the current value of a: drop a's filter by testing with rates {} is
  // not possible, so compare on the joint F with q = 2 via the Wald form
  // b' (s^2 (X'X)^{-1})_AA^{-1} b / q (same identity for q > 1).
  Eigen::Vector2d b(fit.coefficients[1], fit.coefficients[2]);
  Eigen::Matrix2d v = s2 * inv.block(1, 1, 2, 2);
  const double wald_over_q = b.dot(v.inverse() * b) / 2;
  const TestResult f = one.Run({1, {0}, {1}});
  CHECK(f.df == 2);
  CHECK(f.statistic == doctest::Approx(wald_over_q).epsilon(1e-8));
}

TEST_CASE("default filters are kept only when the window holds 50 time constants") {
  // Sampling 0.1: default rates 1 and 0.1 (time constants 10 and 100 samples).
  const std::vector<double> rates = DefaultDriftRates(Draw(0, 10, 1));
  REQUIRE(rates.size() == 2);
  CHECK(rates[0] == doctest::Approx(1.0));
  CHECK(rates[1] == doctest::Approx(0.1));
  CHECK(DriftTest::Create(Draw(0, 49, 1)).value().rates().empty());
  CHECK(DriftTest::Create(Draw(0, 51, 1)).value().rates().size() == 1);
  CHECK(DriftTest::Create(Draw(0, 499, 1)).value().rates().size() == 1);
  CHECK(DriftTest::Create(Draw(0, 501, 1)).value().rates().size() == 2);
  // Rates given in the options are used as given.
  CHECK(DriftTest::Create(Draw(0, 20, 1), {.rates = {0.01}}).value().rates() == std::vector<double>{0.01});
}

TEST_CASE("the F test from shared moments equals two QR fits") {
  sim::PathData d = Draw(0.4, 600, 6);  // window 600: both default filters kept
  auto test = DriftTest::Create(d).value();
  const TestResult r = test.Run({1, {0}, {1}});
  const Eigen::MatrixXd full = test.Design({0, 1});
  const Eigen::VectorXd y = test.Response(1);
  Eigen::MatrixXd restricted(full.rows(), 4);
  restricted << full.col(0), full.rightCols(3);  // intercept and b's three columns
  const double rss_f = FitLeastSquares(full, y).rss, rss_r = FitLeastSquares(restricted, y).rss;
  const double df2 = double(full.rows() - full.cols());
  CHECK(r.statistic == doctest::Approx((rss_r - rss_f) / 3 / (rss_f / df2)).epsilon(1e-8));
}

TEST_CASE("a coupling is detected and its absence is not") {
  sim::PathData d = Draw(0.8, 500, 2);
  for (DriftStatistic s : {DriftStatistic::kF, DriftStatistic::kRobustWald}) {
    auto test = DriftTest::Create(d, {.statistic = s}).value();
    CHECK(test.Run({1, {0}, {1}}).p_value < 1e-10);
    CHECK(test.Run({0, {1}, {0}}).p_value > 0.001);
  }
}

TEST_CASE("the robust Wald statistic is close to q F under homoskedastic noise") {
  sim::PathData d = Draw(0.3, 2000, 3);
  auto f = DriftTest::Create(d).value();
  auto w = DriftTest::Create(d, {.statistic = DriftStatistic::kRobustWald}).value();
  const TestResult rf = f.Run({1, {0}, {1}}), rw = w.Run({1, {0}, {1}});
  CHECK(rw.statistic == doctest::Approx(rf.statistic * rf.df).epsilon(0.1));
  CHECK(w.kind() == "drift-robust-wald");
  CHECK(f.kind() == "drift-f");
}

TEST_CASE("not estimable: too few samples and collinear processes") {
  sim::PathData d = Draw(0.3, 1, 4);  // 11 samples
  auto small = DriftTest::Create(d).value();
  TestResult r = small.Run({1, {0}, {1}});
  CHECK(r.status == TestStatus::kNotEstimable);
  CHECK(r.reason.find("too few samples") == 0);
  sim::PathData twin = Draw(0.3, 100, 5);
  twin.names.push_back("a2");
  twin.values.conservativeResize(Eigen::NoChange, 3);
  twin.values.col(2) = twin.values.col(0);
  auto test = DriftTest::Create(twin).value();
  TestResult s = test.Run({1, {2}, {0, 1}});
  CHECK(s.status == TestStatus::kNotEstimable);
  CHECK(s.reason.find("singular design") == 0);
  CHECK(test.distinct_queries() == 1);
}

TEST_CASE("invalid paths are refused") {
  sim::PathData d;
  d.names = {"a"};
  d.time = {0, 1, 1};
  d.values = Eigen::MatrixXd::Zero(3, 1);
  CHECK(!DriftTest::Create(d).ok());
  d.time = {0, 1, 2};
  d.values(1, 0) = NAN;
  CHECK(!DriftTest::Create(d).ok());
}

// A path data set of the given one-trial pieces.
sim::PathData Trials(const std::vector<sim::PathData>& pieces) {
  sim::PathData d;
  for (const sim::PathData& p : pieces) sim::AppendTrial(d, p);
  return d;
}

TEST_CASE("with trials the design stacks each trial's own design, no increment spans two") {
  const std::vector<sim::PathData> pieces = {Draw(0.3, 60, 31), Draw(0.3, 40, 32), Draw(0.3, 50, 33)};
  const sim::PathData pooled = Trials(pieces);
  REQUIRE(pooled.trial_count() == 3);
  CHECK(pooled.increments() == pooled.samples() - 3);
  const DriftTestOptions options{DriftStatistic::kF, {0.5}};
  DriftTest test = DriftTest::Create(pooled, options).value();
  // Independent computation: each trial's design and response on its own.
  Eigen::MatrixXd x(0, 5);
  Eigen::VectorXd y(0);
  for (const sim::PathData& p : pieces) {
    DriftTest one = DriftTest::Create(p, options).value();
    const Eigen::MatrixXd xi = one.Design({0, 1});
    const Eigen::VectorXd yi = one.Response(1);
    x.conservativeResize(x.rows() + xi.rows(), Eigen::NoChange);
    x.bottomRows(xi.rows()) = xi;
    y.conservativeResize(y.rows() + yi.rows());
    y.tail(yi.rows()) = yi;
  }
  CHECK(test.Design({0, 1}) == x);
  CHECK(test.Response(1) == y);
  // The F statistic of the stacked regressions (nested least squares, Greene
  // 2012, Sec. 5.3) equals the pooled test's, computed from shared moments.
  const double rss_full = FitLeastSquares(x, y).rss;
  const Eigen::MatrixXd kept(x.leftCols(1));
  Eigen::MatrixXd restricted(x.rows(), 3);
  restricted << x.col(0), x.middleCols(3, 2);
  const double rss_kept = FitLeastSquares(restricted, y).rss;
  const double f = ((rss_kept - rss_full) / 2) / (rss_full / double(x.rows() - 5));
  const TestResult r = test.Run({1, {0}, {1}});
  REQUIRE(r.status == TestStatus::kOk);
  CHECK(r.df == 2);
  CHECK(r.statistic == doctest::Approx(f).epsilon(1e-8));
  // The same samples on one clock (trial k shifted after trial k - 1) add the
  // increments across the joins: a different statistic.
  sim::PathData glued = pooled;
  glued.trial_starts.clear();
  double shift = 0;
  for (int i = 1; i < glued.samples(); ++i) {
    if (pooled.starts_trial(i)) shift = glued.time[size_t(i) - 1] + 0.1 - pooled.time[size_t(i)];
    glued.time[size_t(i)] = pooled.time[size_t(i)] + shift;
  }
  const TestResult g = DriftTest::Create(glued, options).value().Run({1, {0}, {1}});
  CHECK(g.statistic != doctest::Approx(r.statistic).epsilon(1e-6));
}

TEST_CASE("a trial list is checked") {
  sim::PathData d = Trials({Draw(0.3, 20, 34), Draw(0.3, 20, 35)});
  CHECK(ValidatePathData(d).ok());
  d.trial_starts = {1};  // a first trial of one sample
  CHECK(!ValidatePathData(d).ok());
}

}  // namespace
}  // namespace locind::learners
