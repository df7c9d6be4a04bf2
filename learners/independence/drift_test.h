// DriftTest: drift-regression test of local independence for sampled paths.
//
// For dX_b = f_b(history) dt + sigma_b dW_b sampled at t_0 < ... < t_n, the
// increments y_i = X_b(t_{i+1}) - X_b(t_i) satisfy y_i = f_b dt_i + noise
// (Euler-Maruyama; Kloeden & Platen 1992, Numerical Solution of Stochastic
// Differential Equations, Sec. 9.1). The drift is modelled as linear in an
// intercept and, for every j in S = A u C, the current value X_j(t_i) and
// exponentially filtered histories F_jk(t_i) = sum over the past with weights
// r_k exp(-r_k (t_i - s)) (recursion F_i = a F_{i-1} + (1 - a) X_{i-1},
// a = exp(-r_k dt), F_0 = X_0). Filters let the drift depend on the observed
// past, as it does when hidden processes act. The response is divided and
// the regressors multiplied by sqrt(dt_i), so unequal spacings give
// homoskedastic errors and the coefficients are drift coefficients.
//
// Several trials (sim::PathData::trial_starts): rows are the increments within
// trials, stacked; the filters restart at each trial's first sample
// (F = X there); no increment spans two trials.
//
// Tests of the |A| * (1 + K) A-coefficients:
//   * kF (default): nested-model F test, F = ((RSS_r - RSS_f)/q) /
//     (RSS_f/(n - p)) on (q, n - p) degrees of freedom (asymptotic here: the
//     regressors include the target's own past, so the exact normal-theory
//     law of Greene 2012, Econometric Analysis, 7th ed., Sec. 5.3, holds only
//     in the limit). TestResult.df is q; the denominator df is n - p.
//   * kRobustWald: Wald statistic with the heteroskedasticity-consistent
//     covariance HC0 (White 1980, Econometrica 48(4)) scaled by n/(n - p)
//     (HC1; MacKinnon & White 1985, J. Econometrics 29), chi^2_q reference;
//     for state-dependent noise and nonlinear drifts.
//
// Default filter rates (DefaultDriftRates): with dt the mean spacing, K = 2
// rates 1/(10 dt) and 1/(100 dt) (time constants of 10 and 100 samples),
// each kept only when the window holds kMinFilterWindows of its time
// constants (SupportedDriftRates; at dt = 0.1: the fast filter from a window
// of 50, the slow one from 500).
//
// Not estimable: fewer than p + 10 increments ("too few samples"), a
// rank-deficient design ("singular design": for the F test, an eigenvalue of
// the unit-diagonal Gram matrix below 1e-12 of the largest; for the Wald
// test, QR rank at threshold 1e-10), zero residuals ("perfect fit").
// Filtered columns are computed once per process, and for the F test the
// cross-products of all columns and responses once per data set (each F test
// then costs O(p^3), independent of the number of samples); results are
// cached by (b, A, C). Not thread-safe.
#pragma once

#include <map>
#include <optional>
#include <tuple>

#include <Eigen/Dense>

#include "base/status.h"
#include "learners/independence/independence_test.h"
#include "sim/path_data.h"

namespace locind::learners {

enum class DriftStatistic { kF, kRobustWald };

struct DriftTestOptions {
  DriftStatistic statistic = DriftStatistic::kF;
  std::vector<double> rates = {};  // filter rates; empty: DefaultDriftRates
};

std::vector<double> DefaultDriftRates(const sim::PathData& data, int count = 2);

// The filtered history of `process` at `rate` on the first `rows` samples:
//   F_0 = X(t_0),  F_i = a F_{i-1} + (1 - a) X(t_{i-1}),  a = exp(-rate (t_i - t_{i-1})),
// restarting at X(t_i) at each trial's first sample, so F_i uses only values
// before t_i (the first sample of a trial excepted) and never crosses a
// trial boundary. Shared by drift-f's columns and drift-exact-lr-history's
// inputs. REQUIRES: 0 <= process < data.processes(), rows <= data.samples().
Eigen::VectorXd FilteredHistory(const sim::PathData& data, int process, double rate, Eigen::Index rows);

// The rates r of `rates` whose time constant 1/r fits at least
// kMinFilterWindows times into the window t_n - t_0 (with trials: the mean
// trial length) (possibly none: then the
// drift uses current levels only). Applied to the default rates only; rates
// given in the options are used as given.
inline constexpr double kMinFilterWindows = 50;
std::vector<double> SupportedDriftRates(const sim::PathData& data, const std::vector<double>& rates);

// Checks: at least 2 samples, strictly increasing finite times (within each
// trial; every trial with at least 2 samples), finite values, one column per
// name.
Status ValidatePathData(const sim::PathData& data);

// Ordinary least squares by Householder QR with column pivoting; the
// coefficients and the residual sum of squares (exposed for tests).
struct LeastSquares {
  Eigen::VectorXd coefficients;
  Eigen::VectorXd residuals;
  double rss = 0;
  int rank = 0;
};
LeastSquares FitLeastSquares(const Eigen::MatrixXd& x, const Eigen::VectorXd& y);

class DriftTest : public IndependenceTest {
 public:
  // Fails when the data is invalid or a rate is not positive.
  static Result<DriftTest> Create(sim::PathData data, DriftTestOptions options = {});

  int processes() const override { return data_.processes(); }
  const std::vector<std::string>& names() const override { return data_.names; }
  std::string kind() const override;
  TestResult Run(const TestQuery& query) override;

  // The weighted design [1, X_j, F_j1..F_jK for j in covariates] (one row
  // per increment within a trial, PathData::increment_rows) and response y of `target` (exposed for tests).
  Eigen::MatrixXd Design(const std::vector<int>& covariates);
  Eigen::VectorXd Response(int target) const;

  const std::vector<double>& rates() const { return options_.rates; }
  size_t distinct_queries() const { return cache_.size(); }

 private:
  DriftTest(sim::PathData data, DriftTestOptions options)
      : data_(std::move(data)), options_(std::move(options)) {}
  // Cross-products of all columns of all processes with each other and with
  // every response, computed once per data set: every F test is then a small
  // solve on a sub-block (RSS = y'y - c' G^{-1} c).
  struct Moments {
    Eigen::MatrixXd gram;       // W'W, W = [1, columns of process 0, 1, ...], weighted
    Eigen::MatrixXd cross;      // W'Y, one column per target
    Eigen::VectorXd response2;  // y'y per target
  };
  const Eigen::MatrixXd& Columns(int process);
  const Moments& SharedMoments();
  TestResult Compute(const TestQuery& query);
  TestResult FTest(const TestQuery& query, const std::vector<int>& full);

  sim::PathData data_;
  DriftTestOptions options_;
  std::map<int, Eigen::MatrixXd> columns_;  // per process: n x (1 + K), unweighted
  std::optional<Moments> moments_;
  std::map<std::tuple<int, std::vector<int>, std::vector<int>>, TestResult> cache_;
};

}  // namespace locind::learners
