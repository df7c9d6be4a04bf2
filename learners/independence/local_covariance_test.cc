#include "learners/independence/local_covariance_test.h"

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "learners/independence/reference_distributions.h"

namespace locind::learners {
namespace {

// Columns of the features of `processes` (K per process) at the grid nodes,
// after a leading column of ones when `intercept`.
Eigen::MatrixXd GridColumns(HawkesFeatures& f, const std::vector<int>& processes, bool intercept) {
  const Eigen::Index rows = Eigen::Index(f.QuadratureGrid().times.size());
  const int k_count = f.basis_size();
  Eigen::MatrixXd out(rows, Eigen::Index(intercept) + Eigen::Index(processes.size()) * k_count);
  if (intercept) out.col(0).setOnes();
  for (size_t j = 0; j < processes.size(); ++j) {
    out.middleCols(Eigen::Index(intercept) + Eigen::Index(j) * k_count, k_count) =
        f.AtGrid(processes[j]);
  }
  return out;
}

// The same columns at the events of `target`.
Eigen::MatrixXd EventColumns(HawkesFeatures& f, int target, const std::vector<int>& processes,
                             bool intercept) {
  const Eigen::Index rows = Eigen::Index(f.data().times[target].size());
  const int k_count = f.basis_size();
  Eigen::MatrixXd out(rows, Eigen::Index(intercept) + Eigen::Index(processes.size()) * k_count);
  if (intercept) out.col(0).setOnes();
  for (size_t j = 0; j < processes.size(); ++j) {
    out.middleCols(Eigen::Index(intercept) + Eigen::Index(j) * k_count, k_count) =
        f.AtEvents(target, processes[j]);
  }
  return out;
}

// Block boundaries: the first event (of any process) at or after
// start + k * block, k = 1..blocks-1. Boundaries on event times fall on cuts
// of the quadrature grid (it is cut at every event), so no quadrature part
// straddles two blocks and the fold integrals are as exact as the grid.
std::vector<double> BlockBoundaries(const sim::EventData& data, int blocks) {
  std::vector<double> all;
  for (const std::vector<double>& t : data.times) all.insert(all.end(), t.begin(), t.end());
  std::sort(all.begin(), all.end());
  const double block = (data.end - data.start) / blocks;
  std::vector<double> out;
  for (int k = 1; k < blocks; ++k) {
    const auto it = std::lower_bound(all.begin(), all.end(), data.start + k * block);
    out.push_back(it == all.end() ? data.end : *it);
  }
  return out;
}

// Fold (0 or 1) of each time: the parity of its block.
std::vector<int> Folds(const std::vector<double>& times, const std::vector<double>& boundaries) {
  std::vector<int> fold(times.size());
  for (size_t i = 0; i < times.size(); ++i) {
    const auto k = std::upper_bound(boundaries.begin(), boundaries.end(), times[i]) - boundaries.begin();
    fold[i] = int(k % 2);
  }
  return fold;
}

// Fold (0 or 1) of each trial index: its parity.
std::vector<int> ParityOf(std::vector<int> trial) {
  for (int& k : trial) k %= 2;
  return trial;
}

// Least-squares nuisance coefficients fitted on one fold: columns 0..d-1 of
// the result project the X components, column d is the intensity.
struct Nuisance {
  Eigen::MatrixXd beta;  // p x (d + 1)
  bool ok = false;
};

Nuisance FitNuisance(const Eigen::MatrixXd& z_grid, const Eigen::MatrixXd& x_grid,
                     const Eigen::VectorXd& weights, const std::vector<int>& grid_fold,
                     const Eigen::MatrixXd& z_events, const std::vector<int>& event_fold,
                     int train) {
  const Eigen::Index p = z_grid.cols(), d = x_grid.cols();
  Eigen::MatrixXd gram = Eigen::MatrixXd::Zero(p, p);
  Eigen::MatrixXd right = Eigen::MatrixXd::Zero(p, d + 1);
  Eigen::VectorXd w = weights;
  for (Eigen::Index g = 0; g < w.size(); ++g) {
    if (grid_fold[size_t(g)] != train) w[g] = 0;
  }
  const Eigen::MatrixXd wz = z_grid.array().colwise() * w.array();
  gram.noalias() = wz.transpose() * z_grid;
  right.leftCols(d).noalias() = wz.transpose() * x_grid;
  for (Eigen::Index i = 0; i < z_events.rows(); ++i) {
    if (event_fold[size_t(i)] == train) right.col(d) += z_events.row(i).transpose();
  }
  // A relative ridge of 1e-9 on the diagonal only guards against exact
  // collinearity (e.g. two identical processes); it is far below the
  // sampling error of the fit.
  gram.diagonal() *= 1 + 1e-9;
  Eigen::LDLT<Eigen::MatrixXd> ldlt(gram);
  Nuisance n;
  if (ldlt.info() != Eigen::Success || !ldlt.isPositive()) return n;
  const Eigen::VectorXd diag = ldlt.vectorD();
  if ((diag.array() <= 1e-12 * diag.cwiseAbs().maxCoeff()).any()) return n;
  n.beta = ldlt.solve(right);
  n.ok = true;
  return n;
}

// gamma_hat along time: events of b add G_hat(t_i), grid node g subtracts
// w_g G_hat(s_g) lambda_hat(s_g). Both lists are sorted, so one merge gives
// the path; its supremum is taken over the values after each step (the path
// is monotone between two steps up to the quadrature). Also V_hat.
LocalCovarianceEstimate Accumulate(const std::vector<double>& grid_times,
                                   const Eigen::VectorXd& weights, const Eigen::MatrixXd& g_grid,
                                   const Eigen::VectorXd& lambda_grid,
                                   const std::vector<double>& event_times,
                                   const Eigen::MatrixXd& g_events) {
  const Eigen::Index d = g_grid.cols();
  LocalCovarianceEstimate e;
  // Per component, plain loops: the merge has one step per node and event.
  std::vector<double> gamma(size_t(d), 0.0), supremum(size_t(d), 0.0);
  size_t g = 0, i = 0;
  while (g < grid_times.size() || i < event_times.size()) {
    const bool take_event =
        i < event_times.size() && (g == grid_times.size() || event_times[i] <= grid_times[g]);
    for (Eigen::Index j = 0; j < d; ++j) {
      double& value = gamma[size_t(j)];
      if (take_event) {
        value += g_events(Eigen::Index(i), j);
      } else {
        value -= weights[Eigen::Index(g)] * lambda_grid[Eigen::Index(g)] * g_grid(Eigen::Index(g), j);
      }
      supremum[size_t(j)] = std::max(supremum[size_t(j)], std::abs(value));
    }
    take_event ? ++i : ++g;
  }
  e.gamma = Eigen::Map<Eigen::VectorXd>(gamma.data(), d);
  e.supremum = Eigen::Map<Eigen::VectorXd>(supremum.data(), d);
  e.variance = g_events.transpose() * g_events;
  return e;
}

}  // namespace

LocalCovarianceTest::LocalCovarianceTest(std::shared_ptr<HawkesFeatures> features,
                                         LocalCovarianceOptions options)
    : features_(std::move(features)), options_(options) {}

std::string LocalCovarianceTest::kind() const {
  return options_.statistic == LocalCovarianceStatistic::kSupremum ? "event-local-covariance"
                                                                   : "event-local-covariance-end";
}

TestResult LocalCovarianceTest::Run(const TestQuery& query) {
  auto key = std::make_tuple(query.target, query.sources, query.given);
  auto it = cache_.find(key);
  if (it != cache_.end()) return it->second;
  TestResult r = Compute(query);
  cache_.emplace(std::move(key), r);
  return r;
}

Result<LocalCovarianceEstimate> LocalCovarianceTest::Estimate(const TestQuery& q) {
  HawkesFeatures& f = *features_;
  const sim::EventData& data = f.data();
  for (int a : q.sources) {
    if (data.times[a].empty()) {
      return Status::Error("singular design: source '" + data.names[a] + "' has no events");
    }
  }
  const HawkesFeatures::Grid& grid = f.QuadratureGrid();
  int blocks = 0;
  std::vector<int> grid_fold, event_fold;
  if (data.trial_count() >= 2) {
    // Several trials: the trials are the replications; cross-fit on the
    // parity of the trial index (no block spans two trials).
    blocks = data.trial_count();
    grid_fold = ParityOf(grid.trial);
    event_fold = ParityOf(f.TrialOfEvents(q.target));
  } else {
    // Blocks: several time constants of the slowest filter, at least 2.
    const double slowest = *std::min_element(f.rates().begin(), f.rates().end());
    const double window = data.end - data.start;
    blocks = std::max(2, int(std::floor(window * slowest / options_.block_time_constants)));
    const std::vector<double> boundaries = BlockBoundaries(data, blocks);
    grid_fold = Folds(grid.times, boundaries);
    event_fold = Folds(data.times[q.target], boundaries);
  }
  const int in_fold_one = int(std::count(event_fold.begin(), event_fold.end(), 1));
  const int fewest = std::min(in_fold_one, int(event_fold.size()) - in_fold_one);
  if (fewest < options_.min_target_events) {
    return Status::Error("too few events: '" + data.names[q.target] + "' has " +
                         std::to_string(fewest) + " events in a cross-fitting fold (at least " +
                         std::to_string(options_.min_target_events) + " needed)");
  }
  const Eigen::MatrixXd z_grid = GridColumns(f, q.given, true);
  const Eigen::MatrixXd x_grid = GridColumns(f, q.sources, false);
  const Eigen::MatrixXd z_events = EventColumns(f, q.target, q.given, true);
  const Eigen::MatrixXd x_events = EventColumns(f, q.target, q.sources, false);
  const Eigen::Index d = x_grid.cols();

  // Residuals G_hat on each fold from the nuisances of the other fold, and
  // the intensity estimate at the grid nodes.
  Eigen::MatrixXd g_grid(x_grid.rows(), d), g_events(x_events.rows(), d);
  Eigen::VectorXd lambda_grid(x_grid.rows());
  for (int fold = 0; fold < 2; ++fold) {
    const Nuisance n =
        FitNuisance(z_grid, x_grid, grid.weights, grid_fold, z_events, event_fold, 1 - fold);
    if (!n.ok) return Status::Error("singular design: the history features of C are collinear");
    // Whole-matrix products (vectorised), then the rows of this fold.
    const Eigen::MatrixXd residual_grid = x_grid - z_grid * n.beta.leftCols(d);
    const Eigen::VectorXd lambda = z_grid * n.beta.col(d);
    const Eigen::MatrixXd residual_events = x_events - z_events * n.beta.leftCols(d);
    for (Eigen::Index g = 0; g < x_grid.rows(); ++g) {
      if (grid_fold[size_t(g)] != fold) continue;
      g_grid.row(g) = residual_grid.row(g);
      lambda_grid[g] = lambda[g];
    }
    for (Eigen::Index i = 0; i < x_events.rows(); ++i) {
      if (event_fold[size_t(i)] == fold) g_events.row(i) = residual_events.row(i);
    }
  }
  LocalCovarianceEstimate e =
      Accumulate(grid.times, grid.weights, g_grid, lambda_grid, f.StackedTimes(q.target), g_events);
  e.blocks = blocks;
  return e;
}

TestResult LocalCovarianceTest::Compute(const TestQuery& q) {
  Result<LocalCovarianceEstimate> made = Estimate(q);
  if (!made.ok()) return NotEstimable(made.status().message());
  const LocalCovarianceEstimate& e = made.value();
  TestResult r;
  if (options_.statistic == LocalCovarianceStatistic::kEndPoint) {
    // V_hat^+ by the symmetric eigendecomposition; rank counts eigenvalues
    // above 1e-10 of the largest.
    const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(e.variance);
    const Eigen::VectorXd values = eig.eigenvalues();
    const double top = values.maxCoeff();
    if (!(top > 0)) return NotEstimable("singular design: the residuals are zero at b's events");
    const Eigen::VectorXd u = eig.eigenvectors().transpose() * e.gamma;
    int rank = 0;
    for (Eigen::Index j = 0; j < values.size(); ++j) {
      if (values[j] <= 1e-10 * top) continue;
      r.statistic += u[j] * u[j] / values[j];
      ++rank;
    }
    r.df = rank;
    r.p_value = ChiSquaredSurvival(rank, r.statistic);
    return r;
  }
  int used = 0;
  double smallest = 1;
  for (Eigen::Index j = 0; j < e.gamma.size(); ++j) {
    const double v = e.variance(j, j);
    if (!(v > 0)) continue;
    const double standardized = e.supremum[j] / std::sqrt(v);
    r.statistic = std::max(r.statistic, standardized);
    smallest = std::min(smallest, SupAbsBrownianSurvival(standardized));
    ++used;
  }
  if (used == 0) return NotEstimable("singular design: the residuals are zero at b's events");
  r.df = used;
  r.p_value = std::min(1.0, used * smallest);
  return r;
}

}  // namespace locind::learners
