#include "learners/independence/reference_distributions.h"

#include <cmath>
#include <limits>

#include <doctest/doctest.h>

namespace locind::learners {
namespace {

TEST_CASE("chi-squared and F tail probabilities match table values") {
  // Abramowitz & Stegun 1964, Handbook of Mathematical Functions, Table 26.8
  // (chi-squared percentage points); also SciPy stats.chi2.ppf.
  CHECK(ChiSquaredSurvival(1, 3.841459) == doctest::Approx(0.05).epsilon(1e-6));
  CHECK(ChiSquaredSurvival(3, 7.814728) == doctest::Approx(0.05).epsilon(1e-6));
  CHECK(ChiSquaredSurvival(2, 9.210340) == doctest::Approx(0.01).epsilon(1e-6));
  // Abramowitz & Stegun 1964, Table 26.9 (F percentage points); also SciPy
  // stats.f.ppf(0.95, 3, 20) = 3.098391, f.ppf(0.95, 2, 10) = 4.102821,
  // f.ppf(0.99, 4, 30) = 4.017877.
  CHECK(FSurvival(3, 20, 3.098391) == doctest::Approx(0.05).epsilon(1e-6));
  CHECK(FSurvival(2, 10, 4.102821) == doctest::Approx(0.05).epsilon(1e-6));
  CHECK(FSurvival(4, 30, 4.017877) == doctest::Approx(0.01).epsilon(1e-5));
  CHECK(ChiSquaredSurvival(2, 0) == 1.0);
  CHECK(FSurvival(2, 10, -1) == 1.0);
}

TEST_CASE("the 50:50 chi-bar-squared mixture of one boundary parameter") {
  // Self & Liang 1987, J. Amer. Statist. Assoc. 82(398), Case 5: one
  // parameter on the boundary gives 0.5 chi^2_0 + 0.5 chi^2_1, whose 0.95
  // point is 2.7055 (SciPy: chi2.ppf(0.90, 1)).
  const std::vector<double> weights = {0.5, 0.5};
  CHECK(ChiBarSquaredSurvival(weights, 2.705543) == doctest::Approx(0.05).epsilon(1e-5));
  CHECK(ChiBarSquaredSurvival(weights, 0) == 1.0);
}

TEST_CASE("chi-bar-squared weights for independent components are binomial") {
  // Silvapulle & Sen 2005, Constrained Statistical Inference, Sec. 3.5: for
  // V = I the weights are Binomial(q, 1/2).
  base::RandomStream random(7);
  const std::vector<double> w = ChiBarSquaredWeights(Eigen::MatrixXd::Identity(3, 3), 40000, random);
  REQUIRE(w.size() == 4);
  const double expected[] = {0.125, 0.375, 0.375, 0.125};
  // Monte Carlo standard error <= sqrt(0.25 / 40000) = 0.0025; 4 s.e. allowed.
  for (int i = 0; i < 4; ++i) CHECK(std::abs(w[i] - expected[i]) < 0.01);
}

TEST_CASE("chi-bar-squared weights for two correlated components") {
  // Kudo 1963, Biometrika 50; Silvapulle & Sen 2005, Sec. 3.5: for q = 2 with
  // correlation rho, w_0 = 1/4 - asin(rho)/(2 pi), w_1 = 1/2,
  // w_2 = 1/4 + asin(rho)/(2 pi) (also checked by brute force with NumPy).
  for (double rho : {-0.7, 0.0, 0.6}) {
    Eigen::MatrixXd v(2, 2);
    v << 2.0, rho * std::sqrt(2.0 * 0.5), rho * std::sqrt(2.0 * 0.5), 0.5;
    base::RandomStream random(11);
    const std::vector<double> w = ChiBarSquaredWeights(v, 40000, random);
    const double shift = std::asin(rho) / (2 * M_PI);
    CHECK(std::abs(w[0] - (0.25 - shift)) < 0.01);
    CHECK(std::abs(w[1] - 0.5) < 0.01);
    CHECK(std::abs(w[2] - (0.25 + shift)) < 0.01);
  }
}

TEST_CASE("the weights are reproducible for a seed") {
  Eigen::MatrixXd v(2, 2);
  v << 1.0, 0.3, 0.3, 1.0;
  base::RandomStream r1(5), r2(5);
  CHECK(ChiBarSquaredWeights(v, 1000, r1) == ChiBarSquaredWeights(v, 1000, r2));
}

}  // namespace
}  // namespace locind::learners

TEST_CASE("tail of the supremum of |Brownian motion| on [0, 1]") {
  using locind::learners::SupAbsBrownianSurvival;
  // 2.2414 is the 5% critical value of sup |B| on [0, 1] (value from memory);
  // SciPy 1.10: 4 * (norm.sf(2.2414) - norm.sf(3 * 2.2414)) = 0.0500004.
  CHECK(SupAbsBrownianSurvival(2.2414) == doctest::Approx(0.0500004).epsilon(1e-5));
  // SciPy 1.10: 4 * (norm.sf(1.5) - norm.sf(4.5) + norm.sf(7.5)) = 0.2672152.
  CHECK(SupAbsBrownianSurvival(1.5) == doctest::Approx(0.2672152).epsilon(1e-6));
  // Below 1 the theta series is used; NumPy sum of its first 50 terms at
  // x = 0.5: 0.9908430 (the two series agree to 1e-15 at 0.5, 1, 1.5, 3).
  CHECK(SupAbsBrownianSurvival(0.5) == doctest::Approx(0.9908430).epsilon(1e-6));
  // Both sides of the switch at x = 1 agree (continuity of the two series).
  CHECK(SupAbsBrownianSurvival(1 - 1e-12) == doctest::Approx(SupAbsBrownianSurvival(1.0)).epsilon(1e-9));
  CHECK(SupAbsBrownianSurvival(0) == 1);
  CHECK(SupAbsBrownianSurvival(-1) == 1);
  CHECK(SupAbsBrownianSurvival(std::numeric_limits<double>::infinity()) == 0);
  CHECK(std::isnan(SupAbsBrownianSurvival(std::nan(""))));
}
