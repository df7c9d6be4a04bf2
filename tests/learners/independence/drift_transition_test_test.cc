#include "learners/independence/drift_transition_test.h"

#include <cmath>
#include <numbers>

#include <doctest/doctest.h>

#include "base/random_stream.h"
#include "graph/dmg.h"
#include "sim/diffusion_model.h"
#include "sim/diffusion_simulator.h"

namespace locind::learners {
namespace {

// Exact simulation of a -> b (loops on both) sampled every 0.1.
sim::PathData Draw(double coupling, double horizon, uint64_t seed) {
  graph::Dmg g({"a", "b"});
  g.AddDirected(0, 0);
  g.AddDirected(1, 1);
  if (coupling != 0) g.AddDirected(0, 1);
  sim::DiffusionModel m = sim::LinearDiffusion(graph::TruthGraph{g, {}}, 1.0, coupling, 1.0);
  sim::PathRunOptions o;
  o.horizon = horizon;
  o.interval = 0.1;
  o.burn_in = 10;
  o.method = sim::PathMethod::kExact;
  base::RandomStream random(seed);
  return sim::SimulateDiffusion(m, o, random).value();
}

TEST_CASE("one coordinate: the fit is the closed-form exact maximum likelihood of an OU path") {
  // The exact discretisation of dX = (c + m X) dt + s dW over a step D is the
  // Gaussian AR(1) X' = phi X + k + e, phi = e^{mD}, Var e = s^2 (e^{2mD} - 1)
  // / (2m) (e.g. Gardiner, Handbook of Stochastic Methods, Sec. 4.4.4). The
  // AR(1) maximum likelihood conditional on X_0 is least squares: phi =
  // Syz / Szz, Var e = RSS / n, l = -n/2 (log(2 pi RSS / n) + 1) (common
  // practice, no source); mapping back gives m and s.
  const sim::PathData d = Draw(0, 300, 3);
  const Eigen::Index n = d.samples() - 1;
  const Eigen::VectorXd z = d.values.col(0).head(n), y = d.values.col(0).tail(n);
  const Eigen::VectorXd zc = z.array() - z.mean(), yc = y.array() - y.mean();
  const double phi = zc.dot(yc) / zc.squaredNorm();
  const double rss = (yc - phi * zc).squaredNorm();
  const double m = std::log(phi) / 0.1;
  const double s = std::sqrt(rss / double(n) * 2 * m / (std::exp(2 * m * 0.1) - 1));
  const double loglik = -0.5 * double(n) * (std::log(2 * std::numbers::pi * rss / double(n)) + 1);

  auto test = DriftTransitionTest::Create(d).value();
  const Eigen::MatrixX<bool> allowed = Eigen::MatrixX<bool>::Constant(1, 1, true);
  const TransitionFit fit = test.Fit({0}, allowed).value();
  CHECK(fit.converged);
  CHECK(fit.M(0, 0) == doctest::Approx(m).epsilon(1e-4));
  CHECK(fit.sigma[0] == doctest::Approx(s).epsilon(1e-4));
  CHECK(fit.log_likelihood == doctest::Approx(loglik).epsilon(1e-9));
}

TEST_CASE("two coordinates: the fit recovers the drift of a long exact simulation") {
  // Truth M = [[-1, 0], [0.5, -1]], sigma = 1. With 100,000 steps of 0.1 the
  // standard errors of the drift entries are about sqrt(2 |m| / T) ~ 0.014
  // (OU asymptotics, e.g. Kutoyants 2004, Statistical Inference for Ergodic
  // Diffusion Processes); 0.07 is five of them.
  const sim::PathData d = Draw(0.5, 10000, 5);
  auto test = DriftTransitionTest::Create(d).value();
  const Eigen::MatrixX<bool> allowed = Eigen::MatrixX<bool>::Constant(2, 2, true);
  const TransitionFit fit = test.Fit({0, 1}, allowed).value();
  CHECK(fit.converged);
  CHECK(std::abs(fit.M(0, 0) + 1) < 0.07);
  CHECK(std::abs(fit.M(0, 1)) < 0.07);
  CHECK(std::abs(fit.M(1, 0) - 0.5) < 0.07);
  CHECK(std::abs(fit.M(1, 1) + 1) < 0.07);
  CHECK(std::abs(fit.sigma[0] - 1) < 0.02);
  CHECK(std::abs(fit.sigma[1] - 1) < 0.02);
  // A restriction is honoured: M(1, 0) stays zero.
  Eigen::MatrixX<bool> restricted = allowed;
  restricted(1, 0) = false;
  const TransitionFit null = test.Fit({0, 1}, restricted).value();
  CHECK(null.M(1, 0) == 0);
  CHECK(null.log_likelihood < fit.log_likelihood);
}

TEST_CASE("the test rejects a strong coupling and reports |A| degrees of freedom") {
  auto test = DriftTransitionTest::Create(Draw(0.5, 300, 7)).value();
  CHECK(test.kind() == "drift-exact-lr");
  const TestResult r = test.Run({1, {0}, {1}});
  REQUIRE(r.status == TestStatus::kOk);
  CHECK(r.df == 1);
  CHECK(r.p_value < 1e-6);
  // The reverse direction is a null; a cached answer is returned again.
  const TestResult reverse = test.Run({0, {1}, {0}});
  REQUIRE(reverse.status == TestStatus::kOk);
  CHECK(reverse.p_value > 1e-3);
  test.Run({0, {1}, {0}});
  CHECK(test.distinct_queries() == 2);
}

TEST_CASE("sampling: a gap is handled, many distinct spacings are refused, short data is not estimable") {
  sim::PathData d = Draw(0.5, 100, 9);
  // A gap: every time from sample 500 on is shifted by 0.25 (two spacings).
  for (size_t i = 500; i < d.time.size(); ++i) d.time[i] += 0.25;
  auto gap = DriftTransitionTest::Create(d).value();
  const TestResult ok = gap.Run({1, {0}, {1}});
  CHECK(ok.status == TestStatus::kOk);
  CHECK(ok.p_value < 1e-3);
  // Jittered times: every spacing distinct.
  sim::PathData jitter = Draw(0.5, 100, 9);
  for (size_t i = 1; i < jitter.time.size(); ++i) jitter.time[i] += 1e-3 * double((i * i) % 101) / 101;
  auto irregular = DriftTransitionTest::Create(jitter).value();
  const TestResult refused = irregular.Run({1, {0}, {1}});
  CHECK(refused.status == TestStatus::kNotEstimable);
  CHECK(refused.reason.rfind("irregular sampling", 0) == 0);
  // 2 coordinates need 2 * 4 + 10 = 18 increments.
  auto tiny = DriftTransitionTest::Create(Draw(0.5, 1.5, 9)).value();
  const TestResult few = tiny.Run({1, {0}, {1}});
  CHECK(few.status == TestStatus::kNotEstimable);
  CHECK(few.reason.rfind("too few samples", 0) == 0);
}

TEST_CASE("a coordinate that never moves is not estimable") {
  sim::PathData d = Draw(0.5, 50, 11);
  d.values.col(0).setConstant(2.0);
  auto test = DriftTransitionTest::Create(d).value();
  const TestResult r = test.Run({1, {0}, {1}});
  CHECK(r.status == TestStatus::kNotEstimable);
}

TEST_CASE("with trials the transitions pool: a trial given twice doubles the statistic") {
  // Each log-likelihood doubles at every parameter, so both maxima stay put
  // and the likelihood ratio doubles (common practice, no source). On one
  // clock the join adds a spurious increment, so the statistic differs.
  const sim::PathData one = Draw(0.3, 100, 36);
  sim::PathData twice;
  sim::AppendTrial(twice, one);
  sim::AppendTrial(twice, one);
  REQUIRE(twice.trial_count() == 2);
  const TestQuery q{1, {0}, {1}};
  const TestResult a = DriftTransitionTest::Create(one).value().Run(q);
  const TestResult b = DriftTransitionTest::Create(twice).value().Run(q);
  REQUIRE(a.status == TestStatus::kOk);
  REQUIRE(b.status == TestStatus::kOk);
  CHECK(b.statistic == doctest::Approx(2 * a.statistic).epsilon(1e-4));
  sim::PathData glued = twice;
  glued.trial_starts.clear();
  const double shift = one.time.back() + 0.1 - one.time.front();
  for (int i = one.samples(); i < glued.samples(); ++i) glued.time[size_t(i)] += shift;
  const TestResult g = DriftTransitionTest::Create(glued).value().Run(q);
  REQUIRE(g.status == TestStatus::kOk);
  CHECK(g.statistic != doctest::Approx(b.statistic).epsilon(1e-4));
}

// drift-exact-lr-history.

TEST_CASE("history inputs: one coordinate, the fit is least squares on level and filtered history") {
  // With one coordinate and the input held over the step, the exact
  // transition is X' = phi X + k + g gamma H + e with phi = e^{mD} and
  // g = (e^{mD} - 1) / m: a bijective reparametrisation of the regression of
  // X' on [1, X, H], so the maximum likelihood is ordinary least squares,
  // l = -n/2 (log(2 pi RSS / n) + 1), and m = log(phi) / D (common practice,
  // no source). H is drift-f's filter at rate 1, computed here by hand.
  const sim::PathData d = Draw(0, 300, 3);
  const Eigen::Index n = d.samples() - 1;
  Eigen::VectorXd h(n);
  double filtered = d.values(0, 0);
  h[0] = filtered;
  for (Eigen::Index i = 1; i < n; ++i) {
    const double a = std::exp(-1.0 * (d.time[size_t(i)] - d.time[size_t(i - 1)]));
    filtered = a * filtered + (1 - a) * d.values(i - 1, 0);
    h[i] = filtered;
  }
  Eigen::MatrixXd x(n, 3);
  x.col(0).setOnes();
  x.col(1) = d.values.col(0).head(n);
  x.col(2) = h;
  const Eigen::VectorXd y = d.values.col(0).tail(n);
  const Eigen::VectorXd beta = x.colPivHouseholderQr().solve(y);
  const double rss = (y - x * beta).squaredNorm();
  const double loglik = -0.5 * double(n) * (std::log(2 * std::numbers::pi * rss / double(n)) + 1);
  const double m = std::log(beta[1]) / 0.1;

  DriftTransitionOptions options;
  options.history = true;
  options.rates = {1.0};
  auto test = DriftTransitionTest::Create(d, options).value();
  CHECK(test.kind() == "drift-exact-lr-history");
  const Eigen::MatrixX<bool> allowed = Eigen::MatrixX<bool>::Constant(1, 1, true);
  const TransitionFit fit = test.FitWithHistory({0}, allowed, 0, {0}).value();
  CHECK(fit.converged);
  CHECK(fit.M(0, 0) == doctest::Approx(m).epsilon(1e-4));
  CHECK(fit.log_likelihood == doctest::Approx(loglik).epsilon(1e-9));
  CHECK(!test.FitWithHistory({0}, allowed, 1, {0}).ok());  // no coordinate 1
  CHECK(!test.FitWithHistory({0}, allowed, 0, {2}).ok());  // no process 2
  // The inputs can only raise the likelihood.
  CHECK(fit.log_likelihood > test.Fit({0}, allowed).value().log_likelihood);
}

TEST_CASE("history inputs: without filtered columns the statistic is drift-exact-lr's") {
  DriftTransitionOptions options;
  options.history = true;
  // Window 30 holds fewer than kMinFilterWindows = 50 time constants of the
  // fastest default filter (1 / (10 * 0.1) = 1): no rate is supported.
  const sim::PathData short_path = Draw(0.3, 30, 21);
  auto none = DriftTransitionTest::Create(short_path, options).value();
  CHECK(none.history_rates().empty());
  const TestQuery q{1, {0}, {1}};
  const TestResult a = DriftTransitionTest::Create(short_path).value().Run(q);
  const TestResult b = none.Run(q);
  REQUIRE(a.status == TestStatus::kOk);
  REQUIRE(b.status == TestStatus::kOk);
  CHECK(b.statistic == a.statistic);
  // An empty C: no history processes.
  const sim::PathData long_path = Draw(0.3, 600, 21);
  auto empty_c = DriftTransitionTest::Create(long_path, options).value();
  CHECK(empty_c.history_rates().size() == 2);  // rates 1 and 0.1 from a window of 600
  const TestQuery unconditional{1, {0}, {}};
  const TestResult c = DriftTransitionTest::Create(long_path).value().Run(unconditional);
  const TestResult e = empty_c.Run(unconditional);
  REQUIRE(c.status == TestStatus::kOk);
  REQUIRE(e.status == TestStatus::kOk);
  CHECK(e.statistic == c.statistic);
}

TEST_CASE("history inputs: regression value, and bad rates are refused") {
  DriftTransitionOptions options;
  options.history = true;
  auto test = DriftTransitionTest::Create(Draw(0.3, 600, 23), options).value();
  const TestResult r = test.Run({1, {0}, {1}});
  REQUIRE(r.status == TestStatus::kOk);
  CHECK(r.df == 1);
  CHECK(r.statistic == doctest::Approx(26.03833762).epsilon(1e-5));  // regression value
  CHECK(r.p_value < 1e-6);  // coupling 0.3 over a window of 600: a clear effect
  options.rates = {1.0, -1.0};
  CHECK(!DriftTransitionTest::Create(Draw(0.3, 50, 23), options).ok());
  DriftTransitionOptions no_history;
  no_history.rates = {1.0};
  CHECK(!DriftTransitionTest::Create(Draw(0.3, 50, 23), no_history).ok());
}

}  // namespace
}  // namespace locind::learners
