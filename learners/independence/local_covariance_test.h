// LocalCovarianceTest: the cross-fitted local covariance test of conditional
// local independence for event data (Christgau, Petersen & Hansen 2023, The
// Annals of Statistics 51(5), "Nonparametric conditional local independence
// testing", arXiv 2203.13559).
//
// Question: is b locally independent of A given C? Let N be b's counting
// process, Lambda its intensity given the history of C alone, M = N - int
// Lambda dt, and for a source a let X_a be a predictable summary of a's
// history. With Pi = E[X_a(t) | history of C before t] and G = X_a - Pi, the
// local covariance measure is gamma(t) = E int_0^t G(s) dM(s); it is zero
// for all t under the null and measures the departure otherwise.
//
// Here X_a(t) is each exponentially filtered history x_ak(t) of
// HawkesFeatures (one component per source and rate, d = |A| * K
// components). Both nuisances are estimated by least squares on the basis
// Z(t) = [1, x_ck(t), c in C, k = 1..K]:
//   * Lambda: the least-squares contrast int lambda^2 dt - 2 int lambda dN of
//     Hansen, Reynaud-Bouret & Rivoirard (2015), Bernoulli 21(1), Sec. 2,
//     minimised over lambda = beta' Z: beta = (int Z Z' dt)^{-1} int Z dN;
//   * Pi: the L2(dt) projection of x_ak on the same span,
//     (int Z Z' dt)^{-1} int Z x_ak dt.
// The integrals over time use HawkesFeatures' quadrature grid. Because both
// nuisances live in one span, a nuisance error that is orthogonal to it
// enters the statistic only as the product of the two approximation errors
// (the double robustness the paper builds on), not linearly as in a
// likelihood-ratio test of a misspecified intensity model.
//
// Cross-fitting: the window is cut into consecutive blocks of about
// block_time_constants / (slowest rate in use) (default 10 slowest time
// constants, at least one block per fold; each boundary moved to the first
// event at or after start + k * length so that it falls on a cut of the
// quadrature grid); blocks alternate among the folds (2, or 3 with
// options.folds = 3). The nuisances fitted on other folds are evaluated on
// each fold, and the estimate sums the folds:
//   gamma_hat(t) = sum_{t_i <= t} G_hat(t_i) - int_0^t G_hat lambda_hat ds,
//   V_hat = sum_i G_hat(t_i) G_hat(t_i)' (the optional variation),
// with t_i the events of b. Long blocks keep a fold's nuisance fit nearly
// independent of the other folds' data, which the paper obtains from
// independent replications; the cost is that each nuisance is fitted on half
// (a third) of the window. With several trials (sim::EventData::trials) the
// trials are those replications: trial k is in fold k modulo the number of
// folds, `blocks` is the number of trials, and gamma_hat runs along the
// trials laid end to end (HawkesFeatures' stacked clock).
//
// Statistic and reference (LocalCovarianceStatistic):
//   * kSupremum (default, the paper's test): per component j,
//     D_j = sup_t |gamma_hat_j(t)| / sqrt(V_hat_jj), which under the null
//     tends to sup_{0<=s<=1} |B_s| for a standard Brownian motion (the
//     estimate is a martingale whose variance process, rescaled by its end
//     value, is a time change of [0, 1]); p_j from SupAbsBrownianSurvival,
//     and the query's p-value is min(1, d * min_j p_j) (Bonferroni over the
//     components: valid whatever their correlation; components with
//     V_hat_jj = 0 are left out of d). statistic = max_j D_j, df = d.
//   * kEndPoint: gamma_hat(T)' V_hat^+ gamma_hat(T), chi^2 with df = rank of
//     V_hat (the martingale central limit theorem at the end point; uses the
//     components' correlation instead of Bonferroni).
//
// Checked against the paper's construction (the stored copy of the paper
// gives its abstract; the estimator was checked against the authors'
// companion simulation code, Christgau et al., github.com/AlexanderChristgau/
// nonparametric-cli-test): the estimate is the fold sum of
// int_0^t (X - Pi_hat)(dN - lambda_hat dt), the variance the fold sum of
// int (X - Pi_hat)^2 dN (no extra term for the nuisances' noise: with
// cross-fitting it is of smaller order), and the test (the X-LCT: the
// cross-fitted local covariance test) compares sup_t |gamma_hat(t)| /
// sqrt(V_hat(T)) with sup_{0<=s<=1} |B_s|. The end-point chi^2 variant is
// ours, not the paper's. Differences from the paper: X is one process there
// and d = |A| K filters here (hence Bonferroni); the paper's nuisances are
// flexible learners (boosted hazard trees for lambda, a ridge on the whole
// discretised path of C for Pi), ours are (penalised) least squares on
// filters of C; the paper's folds are independent replications, ours are
// alternating blocks of one window.
//
// Batch variance (options.batch_variance; supremum statistic only): scale
// component j by max(V_hat_jj, W_j), W_j a batch-means variance of
// gamma_hat_j(T) over the cross-fitting blocks (Delta_k the increment of
// gamma_hat_j over block k, of length L_k, T the window):
//   * kUncentred: W_j = sum_k Delta_k^2;
//   * kCentred (test name event-local-covariance-batch):
//     W_j = sum_k (Delta_k - (L_k / T) gamma_hat_j(T))^2 / (1 - sum_k (L_k / T)^2),
//     the increments less their drift, so a real effect does not inflate
//     it; for equal blocks the usual B / (B - 1) sum_k (Delta_k - mean)^2.
// Unlike V_hat, W carries the nuisances' own estimation noise.
//
// Measured (docs/tests.md): near or below the level on specified nulls and
// a hidden mediator; above it on the pooled true nulls of the demo graph
// at 1,000 (6.6-6.8%), where a richer basis makes it worse and three folds
// do not help: the excess behaves like nuisance estimation noise that
// V_hat leaves out. The uncentred batch variance holds the level there
// (2.5%) but loses power on strong effects. The centred one
// (event-local-covariance-batch) stays at or below the level on the pooled
// demo nulls (2.9% of 2,016 at 1,000, where the default rejects 5.7%;
// 3.7% of 672 at 16,000) and the specified null, conservative rather than
// at 5%, with the default's power at 0.05 and strong-effect p-values of
// the default's order. Neither is the default of the name
// event-local-covariance.
//
// Not estimable: fewer than min_target_events events of b in either fold
// ("too few events"), a source without events or a singular basis Gram
// matrix ("singular design"), V_hat zero ("singular design"). Results are
// cached by (b, A, C). Not thread-safe (shares HawkesFeatures).
#pragma once

#include <map>
#include <memory>
#include <tuple>

#include "learners/independence/hawkes_features.h"
#include "learners/independence/independence_test.h"

namespace locind::learners {

enum class LocalCovarianceStatistic { kSupremum, kEndPoint };
// Scale of the supremum statistic: V_hat alone (kNone), or the larger of
// V_hat and a batch-means variance over the blocks (see above).
enum class BatchVariance { kNone, kUncentred, kCentred };

struct LocalCovarianceOptions {
  LocalCovarianceStatistic statistic = LocalCovarianceStatistic::kSupremum;
  double block_time_constants = 10;  // block length in units of 1 / (slowest rate)
  // Nuisance basis: filters of C at `nuisance_rates` rates (geometric from
  // the slowest shared rate / nuisance_span to the fastest; 0 = the shared
  // rates), plus products of C's standardised shared-rate features when
  // `quadratic`; relative ridge `ridge` on every column but the intercept.
  int nuisance_rates = 0;
  double nuisance_span = 2;
  bool quadratic = false;
  double ridge = 0;
  // Cross-fitting folds (blocks alternate among them): 2 fits both
  // nuisances on the other fold; 3 fits Pi and lambda on two different
  // other folds (double cross-fitting). REQUIRES: 2 or 3.
  int folds = 2;
  // Supremum statistic: scale by max(V_hat_jj, batch-means variance_j).
  BatchVariance batch_variance = BatchVariance::kNone;
  int min_target_events = 10;        // per fold
};

// The estimate of one query before the reference is applied (for tests).
struct LocalCovarianceEstimate {
  Eigen::VectorXd gamma;      // gamma_hat(T), one entry per (source, rate)
  Eigen::VectorXd supremum;   // sup_t |gamma_hat_j(t)|
  Eigen::MatrixXd variance;   // V_hat
  Eigen::VectorXd batch_variance;  // sum over blocks of (block increment of gamma_hat_j)^2
  // The same with each increment less (block length / window) gamma_hat_j(T),
  // divided by 1 - sum over blocks of (block length / window)^2.
  Eigen::VectorXd centred_batch_variance;
  int blocks = 0;
};

class LocalCovarianceTest : public IndependenceTest {
 public:
  // REQUIRES: features != nullptr.
  explicit LocalCovarianceTest(std::shared_ptr<HawkesFeatures> features,
                               LocalCovarianceOptions options = {});

  int processes() const override { return features_->data().processes(); }
  const std::vector<std::string>& names() const override { return features_->data().names; }
  std::string kind() const override;
  TestResult Run(const TestQuery& query) override;

  // The cross-fitted estimate, or the not-estimable reason. REQUIRES: as Run.
  Result<LocalCovarianceEstimate> Estimate(const TestQuery& query);

  size_t distinct_queries() const { return cache_.size(); }

 private:
  TestResult Compute(const TestQuery& query);

  std::shared_ptr<HawkesFeatures> features_;
  LocalCovarianceOptions options_;
  std::map<std::tuple<int, std::vector<int>, std::vector<int>>, TestResult> cache_;
};

}  // namespace locind::learners
