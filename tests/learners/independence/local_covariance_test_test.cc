#include "learners/independence/local_covariance_test.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include <doctest/doctest.h>

#include "tests/learners/independence/two_process_draw.h"

#include "base/random_stream.h"
#include "graph/dmg.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"

namespace locind::learners {
namespace {

sim::EventData Draw(double weight, double horizon, uint64_t seed) {
  return DrawTwoProcesses(weight, horizon, seed);
}

std::shared_ptr<HawkesFeatures> Features(sim::EventData d, std::vector<double> rates) {
  return std::make_shared<HawkesFeatures>(HawkesFeatures::Create(std::move(d), rates).value());
}

// x(t) = sum_{s < t} r exp(-r (t - s)) by a direct sum.
double Filtered(const std::vector<double>& events, double r, double t) {
  double x = 0;
  for (double s : events) {
    if (s < t) x += r * std::exp(-r * (t - s));
  }
  return x;
}

TEST_CASE("with an empty C the estimate matches a direct computation") {
  // With C empty the basis is the constant: on each fold the projection of
  // x_a is its time average over the other fold and the intensity is the
  // other fold's event count over its length. The direct version below uses
  // plain sums and the closed-form integral of each exponential over each
  // block (no recursion, no quadrature grid).
  const sim::EventData d = Draw(0.4, 200, 5);
  const double r = 1.0;
  LocalCovarianceTest test(Features(d, {r}), {.block_time_constants = 10});
  const Result<LocalCovarianceEstimate> e = test.Estimate({1, {0}, {}});
  REQUIRE(e.ok());
  CHECK(e.value().blocks == 20);  // 200 * rate 1 / 10 time constants
  // Block boundaries as documented: the first event of any process at or
  // after k * 10.
  std::vector<double> all = d.times[0];
  all.insert(all.end(), d.times[1].begin(), d.times[1].end());
  std::sort(all.begin(), all.end());
  std::vector<double> cut = {d.start};
  for (int k = 1; k < 20; ++k) cut.push_back(*std::lower_bound(all.begin(), all.end(), d.start + k * 10.0));
  cut.push_back(d.end);
  const auto fold = [&](double t) {
    return int((std::upper_bound(cut.begin() + 1, cut.end() - 1, t) - cut.begin() - 1) % 2);
  };
  double x_time[2] = {0, 0}, length[2] = {0, 0};
  double x_block[20] = {};  // int of x over each block
  int count[2] = {0, 0};
  for (int k = 0; k < 20; ++k) {
    const double u = cut[size_t(k)], v = cut[size_t(k) + 1];
    for (double s : d.times[0]) {
      if (s < v) x_block[k] += std::exp(-r * (std::max(u, s) - s)) - std::exp(-r * (v - s));
    }
    x_time[k % 2] += x_block[k];
    length[k % 2] += v - u;
  }
  for (double t : d.times[1]) ++count[fold(t)];
  double gamma = 0, variance = 0;
  for (double t : d.times[1]) {
    const int other = 1 - fold(t);
    const double g = Filtered(d.times[0], r, t) - x_time[other] / length[other];
    gamma += g;
    variance += g * g;
  }
  for (int m = 0; m < 2; ++m) {
    const double mean_other = x_time[1 - m] / length[1 - m];
    const double rate_other = count[1 - m] / length[1 - m];
    gamma -= rate_other * (x_time[m] - mean_other * length[m]);
  }
  CHECK(e.value().gamma[0] == doctest::Approx(gamma).epsilon(1e-6));
  CHECK(e.value().variance(0, 0) == doctest::Approx(variance).epsilon(1e-6));
  CHECK(e.value().supremum[0] >= std::abs(e.value().gamma[0]));
  // Batch variances from the same closed forms, block by block: the
  // increment of block k (fold m = k % 2) is the sum of G over b's events
  // in it less rate_other * int_block (x - mean_other) ds; the centred form
  // removes (L_k / T) gamma(T) from each and divides by 1 - sum (L_k / T)^2
  // (the definition in local_covariance_test.h).
  double increment[20] = {};
  for (double t : d.times[1]) {
    const int k = int(std::upper_bound(cut.begin() + 1, cut.end() - 1, t) - cut.begin() - 1);
    increment[k] += Filtered(d.times[0], r, t) - x_time[1 - k % 2] / length[1 - k % 2];
  }
  const double window = cut.back() - cut.front();
  double uncentred = 0, centred = 0, squares = 0;
  for (int k = 0; k < 20; ++k) {
    const int other = 1 - k % 2;
    const double block = cut[size_t(k) + 1] - cut[size_t(k)];
    increment[k] -= count[other] / length[other] * (x_block[k] - x_time[other] / length[other] * block);
    uncentred += increment[k] * increment[k];
    const double w = block / window;
    centred += (increment[k] - w * gamma) * (increment[k] - w * gamma);
    squares += w * w;
  }
  centred /= 1 - squares;
  CHECK(e.value().batch_variance[0] == doctest::Approx(uncentred).epsilon(1e-6));
  CHECK(e.value().centred_batch_variance[0] == doctest::Approx(centred).epsilon(1e-6));
}

TEST_CASE("a strong effect is found, an absent one is not") {
  const sim::EventData d = Draw(0.5, 1000, 3);
  auto features = Features(d, DefaultHawkesRates(d));
  for (LocalCovarianceStatistic s : {LocalCovarianceStatistic::kSupremum, LocalCovarianceStatistic::kEndPoint}) {
    LocalCovarianceTest test(features, {.statistic = s});
    const TestResult r = test.Run({1, {0}, {1}});
    CHECK(r.status == TestStatus::kOk);
    CHECK(r.df == 3);
    CHECK(r.p_value < 1e-6);
    const TestResult back = test.Run({0, {1}, {0}});
    CHECK(back.status == TestStatus::kOk);
    CHECK(back.p_value > 0.001);
  }
}

TEST_CASE("centred batch variance: a real effect does not inflate it") {
  // The uncentred sum of squared block increments grows with the squared
  // drift of gamma_hat (weight 0.5 here); the centred one removes it, so
  // the test keeps the default's power on a strong effect.
  const sim::EventData d = Draw(0.5, 1000, 3);
  auto features = Features(d, DefaultHawkesRates(d));
  LocalCovarianceTest centred(features, {.batch_variance = BatchVariance::kCentred});
  const auto e = centred.Estimate({1, {0}, {1}});
  REQUIRE(e.ok());
  for (Eigen::Index j = 0; j < e.value().gamma.size(); ++j) {
    CHECK(e.value().centred_batch_variance[j] < e.value().batch_variance[j]);
  }
  CHECK(centred.Run({1, {0}, {1}}).p_value < 1e-6);
  // Regression values (the code's own output, 2026-12-02), query a given
  // {a}, source b (a null: b does not drive a), on a draw where the centred
  // batch variance exceeds V_hat for the middle rate, so it sets the scale.
  const sim::EventData null_draw = Draw(0.3, 400, 26);
  auto null_features = Features(null_draw, {0.5, 2.0, 8.0});
  LocalCovarianceTest test(null_features, {.batch_variance = BatchVariance::kCentred});
  const auto n = test.Estimate({0, {1}, {0}});
  REQUIRE(n.ok());
  CHECK(n.value().blocks == 20);
  CHECK(n.value().centred_batch_variance[1] == doctest::Approx(279.61680754207555).epsilon(1e-6));
  CHECK(n.value().variance(1, 1) == doctest::Approx(202.44813386855688).epsilon(1e-6));
  const TestResult r = test.Run({0, {1}, {0}});
  CHECK(r.statistic == doctest::Approx(2.9222668300694035).epsilon(1e-6));
  CHECK(r.p_value == doctest::Approx(0.020849621984087734).epsilon(1e-6));
  // The default scale (V_hat alone) on the same query: a smaller p-value.
  CHECK(LocalCovarianceTest(null_features).Run({0, {1}, {0}}).p_value ==
        doctest::Approx(0.0056263214281274667).epsilon(1e-6));
  CHECK(test.kind() == "event-local-covariance-batch");
}

TEST_CASE("names, caching and not-estimable results") {
  const sim::EventData d = Draw(0.3, 40, 9);
  auto features = Features(d, {0.5, 2.0, 8.0});
  LocalCovarianceTest sup(features);
  LocalCovarianceTest end(features, {.statistic = LocalCovarianceStatistic::kEndPoint});
  CHECK(sup.kind() == "event-local-covariance");
  CHECK(end.kind() == "event-local-covariance-end");
  LocalCovarianceTest strict(features, {.min_target_events = 1000});
  const TestResult few = strict.Run({1, {0}, {1}});
  CHECK(few.status == TestStatus::kNotEstimable);
  CHECK(few.reason.rfind("too few events", 0) == 0);
  CHECK(few.p_value == 1);
  sup.Run({1, {0}, {1}});
  sup.Run({1, {0}, {1}});
  CHECK(sup.distinct_queries() == 1);

  sim::EventData silent = d;
  silent.times[0].clear();
  LocalCovarianceTest none(Features(silent, {0.5, 2.0, 8.0}));
  const TestResult r = none.Run({1, {0}, {1}});
  CHECK(r.status == TestStatus::kNotEstimable);
  CHECK(r.reason.rfind("singular design", 0) == 0);
}

TEST_CASE("nuisance filters at the shared rates give the shared-basis estimate") {
  // Regression against the code's own default path: with 3 nuisance rates,
  // span 1 and the geometric shared grid {0.5, 2, 8}, NuisanceRates returns
  // the shared rates, so the basis built by the nuisance filters must equal
  // HawkesFeatures' columns and the estimate must not change.
  const sim::EventData d = Draw(0.3, 400, 21);
  auto features = Features(d, {0.5, 2.0, 8.0});
  LocalCovarianceTest shared(features);
  LocalCovarianceTest own(features, {.nuisance_rates = 3, .nuisance_span = 1});
  const auto a = shared.Estimate({1, {0}, {1}});
  const auto b = own.Estimate({1, {0}, {1}});
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  for (Eigen::Index j = 0; j < a.value().gamma.size(); ++j) {
    CHECK(b.value().gamma[j] == doctest::Approx(a.value().gamma[j]).epsilon(1e-8));
    CHECK(b.value().variance(j, j) == doctest::Approx(a.value().variance(j, j)).epsilon(1e-8));
  }
}

TEST_CASE("three folds: at least three blocks, every fold needs events") {
  const sim::EventData d = Draw(0.3, 400, 22);
  auto features = Features(d, {0.5, 2.0, 8.0});
  // 400 * 0.5 / 10 = 20 blocks either way; a window of 40 gives 2 blocks
  // with two folds and is raised to 3 with three.
  LocalCovarianceTest three(features, {.folds = 3});
  const auto e = three.Estimate({1, {0}, {1}});
  REQUIRE(e.ok());
  CHECK(e.value().blocks == 20);
  const TestResult r = three.Run({1, {0}, {1}});
  CHECK(r.status == TestStatus::kOk);
  CHECK(r.p_value > 0);
  CHECK(r.p_value <= 1);
  sim::EventData short_window = Draw(0.3, 40, 23);
  LocalCovarianceTest short_three(Features(short_window, {0.5, 2.0, 8.0}), {.folds = 3});
  const auto s = short_three.Estimate({1, {0}, {1}});
  if (s.ok()) {
    CHECK(s.value().blocks == 3);
  } else {
    CHECK(s.status().message().rfind("too few events", 0) == 0);
  }
  // The quadratic basis with a ridge runs and finds a strong effect.
  const sim::EventData strong = Draw(0.5, 1000, 3);
  LocalCovarianceTest rich(Features(strong, DefaultHawkesRates(strong)),
                           {.nuisance_rates = 6, .quadratic = true, .ridge = 1e-2, .folds = 3});
  CHECK(rich.Run({1, {0}, {1}}).p_value < 1e-6);
}

TEST_CASE("with trials the trials are the folds: the estimate matches a direct computation") {
  // Four trials of 60: even trials form fold 0, odd trials fold 1. The
  // direct version (C empty, as above) uses each trial's own events only and
  // the closed-form integral of each exponential up to its trial's end.
  std::vector<sim::EventData> trials;
  sim::EventData d;
  for (uint64_t seed : {51, 52, 53, 54}) {
    trials.push_back(Draw(0.4, 60, seed));
    sim::AppendTrial(d, trials.back());
  }
  const double r = 1.0;
  LocalCovarianceTest test(Features(d, {r}));
  const Result<LocalCovarianceEstimate> e = test.Estimate({1, {0}, {}});
  REQUIRE(e.ok());
  CHECK(e.value().blocks == 4);
  double x_time[2] = {0, 0}, length[2] = {0, 0};
  int count[2] = {0, 0};
  for (size_t k = 0; k < trials.size(); ++k) {
    const sim::EventData& t = trials[k];
    for (double s : t.times[0]) x_time[k % 2] += 1 - std::exp(-r * (t.end - s));
    length[k % 2] += t.end - t.start;
    count[k % 2] += int(t.times[1].size());
  }
  double gamma = 0, variance = 0;
  for (size_t k = 0; k < trials.size(); ++k) {
    const int other = 1 - int(k % 2);
    for (double t : trials[k].times[1]) {
      const double g = Filtered(trials[k].times[0], r, t) - x_time[other] / length[other];
      gamma += g;
      variance += g * g;
    }
  }
  for (int m = 0; m < 2; ++m) {
    const double mean_other = x_time[1 - m] / length[1 - m];
    const double rate_other = count[1 - m] / length[1 - m];
    gamma -= rate_other * (x_time[m] - mean_other * length[m]);
  }
  CHECK(e.value().gamma[0] == doctest::Approx(gamma).epsilon(1e-6));
  CHECK(e.value().variance(0, 0) == doctest::Approx(variance).epsilon(1e-6));
}

TEST_CASE("with trials the nuisance filters restart per trial like the shared features") {
  // Regression against the code's own shared-feature path, as in the
  // one-trial case above: at the shared rates the nuisance filters (computed
  // per trial on the stacked clock) must equal HawkesFeatures' per-trial
  // columns, so the estimate is unchanged.
  sim::EventData d;
  for (uint64_t seed : {61, 62, 63}) sim::AppendTrial(d, Draw(0.3, 150, seed));
  auto features = Features(d, {0.5, 2.0, 8.0});
  LocalCovarianceTest shared(features);
  LocalCovarianceTest own(features, {.nuisance_rates = 3, .nuisance_span = 1});
  const auto a = shared.Estimate({1, {0}, {1}});
  const auto b = own.Estimate({1, {0}, {1}});
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  CHECK(a.value().blocks == 3);
  for (Eigen::Index j = 0; j < a.value().gamma.size(); ++j) {
    CHECK(b.value().gamma[j] == doctest::Approx(a.value().gamma[j]).epsilon(1e-8));
    CHECK(b.value().variance(j, j) == doctest::Approx(a.value().variance(j, j)).epsilon(1e-8));
  }
}

}  // namespace
}  // namespace locind::learners
