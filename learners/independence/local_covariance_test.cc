#include "learners/independence/local_covariance_test.h"

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include "learners/independence/reference_distributions.h"

namespace locind::learners {
namespace {

// Columns of the features of `processes` (K per process) at the grid nodes.
Eigen::MatrixXd GridColumns(HawkesFeatures& f, const std::vector<int>& processes) {
  const Eigen::Index rows = Eigen::Index(f.QuadratureGrid().times.size());
  const int k_count = f.basis_size();
  Eigen::MatrixXd out(rows, Eigen::Index(processes.size()) * k_count);
  for (size_t j = 0; j < processes.size(); ++j) {
    out.middleCols(Eigen::Index(j) * k_count, k_count) = f.AtGrid(processes[j]);
  }
  return out;
}

// The same columns at the events of `target`.
Eigen::MatrixXd EventColumns(HawkesFeatures& f, int target, const std::vector<int>& processes) {
  const Eigen::Index rows = Eigen::Index(f.data().times[target].size());
  const int k_count = f.basis_size();
  Eigen::MatrixXd out(rows, Eigen::Index(processes.size()) * k_count);
  for (size_t j = 0; j < processes.size(); ++j) {
    out.middleCols(Eigen::Index(j) * k_count, k_count) = f.AtEvents(target, processes[j]);
  }
  return out;
}

// Exponential filters sum_{s < t} r exp(-r (t - s)) of `events` at sorted
// `times` (left limits), one column per rate: the recursion of
// HawkesFeatures, for the nuisance rates, which may differ from the shared
// grid's.
Eigen::MatrixXd Filters(const std::vector<double>& events, double start,
                        const std::vector<double>& rates, const std::vector<double>& times) {
  const Eigen::Index k_count = Eigen::Index(rates.size());
  const Eigen::ArrayXd r = Eigen::Map<const Eigen::ArrayXd>(rates.data(), k_count);
  Eigen::MatrixXd out(Eigen::Index(times.size()), k_count);
  Eigen::ArrayXd state = Eigen::ArrayXd::Zero(k_count);
  double now = start;
  size_t next = 0;
  for (size_t i = 0; i < times.size(); ++i) {
    for (; next < events.size() && events[next] < times[i]; ++next) {
      state = state * (-r * (events[next] - now)).exp() + r;
      now = events[next];
    }
    out.row(Eigen::Index(i)) = (state * (-r * (times[i] - now)).exp()).matrix().transpose();
  }
  return out;
}

// Filters of `process` at `rates` at the sorted `times` of the stacked clock
// (HawkesFeatures), `trial[i]` naming the trial of times[i]: each trial's
// filters start empty at its start and see only its own events, so no
// history crosses a trial boundary (one trial: Filters on the data's clock).
Eigen::MatrixXd TrialFilters(HawkesFeatures& f, int process, const std::vector<double>& rates,
                             const std::vector<double>& times, const std::vector<int>& trial) {
  const sim::EventData& data = f.data();
  if (data.trial_count() == 1) return Filters(data.times[size_t(process)], data.start, rates, times);
  Eigen::MatrixXd out(Eigen::Index(times.size()), Eigen::Index(rates.size()));
  size_t begin = 0;
  while (begin < times.size()) {
    const int k = trial[begin];
    size_t stop = begin;
    while (stop < times.size() && trial[stop] == k) ++stop;
    const double shift = f.StackedOffset(k) - data.trial_start(k);
    std::vector<double> events;
    for (size_t i = data.trial_begin(k, process); i < data.trial_stop(k, process); ++i) {
      events.push_back(data.times[size_t(process)][i] + shift);
    }
    const std::vector<double> part(times.begin() + long(begin), times.begin() + long(stop));
    out.middleRows(Eigen::Index(begin), Eigen::Index(stop - begin)) =
        Filters(events, f.StackedOffset(k), rates, part);
    begin = stop;
  }
  return out;
}

// The nuisance rates: `count` rates spaced geometrically from the slowest
// shared rate / `span` to the fastest shared rate (count <= 0: the shared
// rates themselves).
std::vector<double> NuisanceRates(const std::vector<double>& shared, int count, double span) {
  if (count <= 0) return shared;
  const double low = *std::min_element(shared.begin(), shared.end()) / span;
  const double high = *std::max_element(shared.begin(), shared.end());
  std::vector<double> out;
  for (int k = 0; k < count; ++k) {
    out.push_back(count == 1 ? high : low * std::pow(high / low, double(k) / (count - 1)));
  }
  return out;
}

// The nuisance basis Z at the grid nodes and at b's events:
//   [1, filters of each c in C at the nuisance rates,
//    (quadratic) products z_i z_j, i <= j, of the standardised shared-rate
//    features of C].
// The products let both nuisances bend: with a hidden driver, b's intensity
// given C's history is a nonlinear (filtering) function of C's past, which
// no linear span of filters represents (Christgau, Petersen & Hansen 2023,
// Sec. 5, use boosted trees and a ridge on the whole path for that reason).
struct Basis {
  Eigen::MatrixXd grid, events;
};

Basis NuisanceBasis(HawkesFeatures& f, int target, const std::vector<int>& given,
                    const std::vector<double>& rates, bool quadratic) {
  const HawkesFeatures::Grid& grid = f.QuadratureGrid();
  const std::vector<double>& at = f.StackedTimes(target);
  const std::vector<int> at_trial = f.TrialOfEvents(target);
  const Eigen::Index k_count = Eigen::Index(rates.size());
  const Eigen::Index linear = Eigen::Index(given.size()) * k_count;
  Eigen::MatrixXd sg = GridColumns(f, given), se = EventColumns(f, target, given);
  const Eigen::Index q = sg.cols();
  const Eigen::Index products = quadratic ? q * (q + 1) / 2 : 0;
  Basis z{Eigen::MatrixXd(sg.rows(), 1 + linear + products),
          Eigen::MatrixXd(se.rows(), 1 + linear + products)};
  z.grid.col(0).setOnes();
  z.events.col(0).setOnes();
  for (size_t j = 0; j < given.size(); ++j) {
    z.grid.middleCols(1 + Eigen::Index(j) * k_count, k_count) =
        TrialFilters(f, given[j], rates, grid.times, grid.trial);
    z.events.middleCols(1 + Eigen::Index(j) * k_count, k_count) =
        TrialFilters(f, given[j], rates, at, at_trial);
  }
  if (products == 0) return z;
  // Standardise by the time-weighted mean and spread over the window (a
  // scaling only: it changes no fitted value, it keeps the products'
  // magnitudes comparable for the ridge).
  const double total = grid.weights.sum();
  const Eigen::RowVectorXd mean = (grid.weights.transpose() * sg) / total;
  sg.rowwise() -= mean;
  se.rowwise() -= mean;
  const Eigen::RowVectorXd spread =
      ((grid.weights.transpose() * sg.cwiseAbs2()) / total).cwiseSqrt().cwiseMax(1e-12);
  sg.array().rowwise() /= spread.array();
  se.array().rowwise() /= spread.array();
  Eigen::Index col = 1 + linear;
  for (Eigen::Index i = 0; i < q; ++i) {
    for (Eigen::Index j = i; j < q; ++j, ++col) {
      z.grid.col(col) = sg.col(i).cwiseProduct(sg.col(j));
      z.events.col(col) = se.col(i).cwiseProduct(se.col(j));
    }
  }
  return z;
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
std::vector<int> Folds(const std::vector<double>& times, const std::vector<double>& boundaries,
                       int folds) {
  std::vector<int> fold(times.size());
  for (size_t i = 0; i < times.size(); ++i) {
    const auto k = std::upper_bound(boundaries.begin(), boundaries.end(), times[i]) - boundaries.begin();
    fold[i] = int(k % folds);
  }
  return fold;
}

// Fold of each trial index: the index modulo the number of folds.
std::vector<int> ModuloOf(std::vector<int> trial, int folds) {
  for (int& k : trial) k %= folds;
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
                     int train, double ridge) {
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
  // A relative ridge on the diagonal (the intercept is not penalised): at
  // 1e-9 it only guards against exact collinearity; larger values shrink
  // the many product columns of the quadratic basis (a penalised fit, as the
  // paper's ridge estimate of Pi; Christgau, Petersen & Hansen 2023, Sec. 5).
  gram.diagonal().tail(p - 1) *= 1 + std::max(ridge, 1e-9);
  gram(0, 0) *= 1 + 1e-9;
  Eigen::LDLT<Eigen::MatrixXd> ldlt(gram);
  Nuisance n;
  if (ldlt.info() != Eigen::Success || !ldlt.isPositive()) return n;
  const Eigen::VectorXd diag = ldlt.vectorD();
  if ((diag.array() <= 1e-12 * diag.cwiseAbs().maxCoeff()).any()) return n;
  n.beta = ldlt.solve(right);
  n.ok = true;
  return n;
}

// Batch-means variances of gamma_hat(T) from its increments over blocks
// (increments[k][j] of component j over block k, of length lengths[k]):
//   uncentred: sum_k Delta_k^2 (its mean is Var gamma_hat(T) plus the
//     squared drift of each block, so a real effect inflates it);
//   centred: sum_k (Delta_k - w_k gamma_hat(T))^2 / (1 - sum_k w_k^2),
//     w_k = L_k / sum L: each increment less its share of the drift.
// The centred form is the batch means estimator of simulation output
// analysis (common practice; as in Flegal & Jones 2010, The Annals of
// Statistics 38(2), "Batch means and spectral variance estimators in Markov
// chain Monte Carlo", arXiv 0811.1729: b / (a - 1) sum_k (Y_k - mean)^2 for
// a batches of b draws with means Y_k, which for the variance of the total
// is a / (a - 1) times the sum of squared deviations of the batch sums
// from their mean), with
// the drift taken per unit time because the blocks' lengths differ a
// little. The divisor makes it unbiased for uncorrelated increments of
// variance proportional to length: E sum_k (Delta_k - w_k S)^2 =
// sigma^2 T (1 - 2 sum w_k^2 + sum w_k^2), S = sum_k Delta_k; for equal
// blocks 1 - 1/B, the usual n / (n - 1).
void BatchVariances(const std::vector<std::vector<double>>& increments,
                    const std::vector<double>& lengths, const Eigen::VectorXd& gamma,
                    Eigen::VectorXd& uncentred, Eigen::VectorXd& centred) {
  const Eigen::Index d = gamma.size();
  uncentred = Eigen::VectorXd::Zero(d);
  centred = Eigen::VectorXd::Zero(d);
  double total = 0;
  for (double l : lengths) total += l;
  double squares = 0;  // sum_k w_k^2
  for (double l : lengths) squares += (l / total) * (l / total);
  for (size_t k = 0; k < increments.size(); ++k) {
    const double w = total > 0 ? lengths[k] / total : 0;
    for (Eigen::Index j = 0; j < d; ++j) {
      const double delta = increments[k][size_t(j)];
      uncentred[j] += delta * delta;
      const double deviation = delta - w * gamma[j];
      centred[j] += deviation * deviation;
    }
  }
  // One block (or none): no spread to estimate from; zero leaves V_hat.
  if (increments.size() < 2 || !(squares < 1)) {
    centred.setZero();
  } else {
    centred /= 1 - squares;
  }
}

// gamma_hat along time: events of b add G_hat(t_i), grid node g subtracts
// w_g G_hat(s_g) lambda_hat(s_g). Both lists are sorted, so one merge gives
// the path; its supremum is taken over the values after each step (the path
// is monotone between two steps up to the quadrature). Also V_hat and the
// two batch-means variances over the blocks (blocks end at `boundaries`;
// a block's length is the sum of its grid weights).
LocalCovarianceEstimate Accumulate(const std::vector<double>& grid_times,
                                   const Eigen::VectorXd& weights, const Eigen::MatrixXd& g_grid,
                                   const Eigen::VectorXd& lambda_grid,
                                   const std::vector<double>& event_times,
                                   const Eigen::MatrixXd& g_events,
                                   const std::vector<double>& boundaries) {
  const Eigen::Index d = g_grid.cols();
  LocalCovarianceEstimate e;
  // Per component, plain loops: the merge has one step per node and event.
  std::vector<double> gamma(size_t(d), 0.0), supremum(size_t(d), 0.0);
  std::vector<double> block_start(size_t(d), 0.0);
  std::vector<std::vector<double>> increments;  // per block, per component
  std::vector<double> lengths;                  // per block
  double length = 0;
  const auto close_block = [&] {
    std::vector<double> increment(static_cast<size_t>(d));
    for (size_t j = 0; j < size_t(d); ++j) {
      increment[j] = gamma[j] - block_start[j];
      block_start[j] = gamma[j];
    }
    increments.push_back(std::move(increment));
    lengths.push_back(length);
    length = 0;
  };
  size_t g = 0, i = 0, next = 0;
  while (g < grid_times.size() || i < event_times.size()) {
    const bool take_event =
        i < event_times.size() && (g == grid_times.size() || event_times[i] <= grid_times[g]);
    const double now = take_event ? event_times[i] : grid_times[g];
    // Boundaries are event times; an event at a boundary opens the new block.
    for (; next < boundaries.size() && now >= boundaries[next]; ++next) close_block();
    for (Eigen::Index j = 0; j < d; ++j) {
      double& value = gamma[size_t(j)];
      if (take_event) {
        value += g_events(Eigen::Index(i), j);
      } else {
        value -= weights[Eigen::Index(g)] * lambda_grid[Eigen::Index(g)] * g_grid(Eigen::Index(g), j);
      }
      supremum[size_t(j)] = std::max(supremum[size_t(j)], std::abs(value));
    }
    if (!take_event) length += weights[Eigen::Index(g)];
    take_event ? ++i : ++g;
  }
  close_block();
  e.gamma = Eigen::Map<Eigen::VectorXd>(gamma.data(), d);
  e.supremum = Eigen::Map<Eigen::VectorXd>(supremum.data(), d);
  e.variance = g_events.transpose() * g_events;
  BatchVariances(increments, lengths, e.gamma, e.batch_variance, e.centred_batch_variance);
  return e;
}

}  // namespace

LocalCovarianceTest::LocalCovarianceTest(std::shared_ptr<HawkesFeatures> features,
                                         LocalCovarianceOptions options)
    : features_(std::move(features)), options_(options) {}

std::string LocalCovarianceTest::kind() const {
  if (options_.statistic == LocalCovarianceStatistic::kEndPoint) return "event-local-covariance-end";
  return options_.batch_variance == BatchVariance::kCentred ? "event-local-covariance-batch"
                                                            : "event-local-covariance";
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
  const int folds = options_.folds;
  const std::vector<double> rates =
      NuisanceRates(f.rates(), options_.nuisance_rates, options_.nuisance_span);
  int blocks = 0;
  std::vector<double> boundaries;  // block ends on the (stacked) clock
  std::vector<int> grid_fold, event_fold;
  if (data.trial_count() >= 2) {
    // Several trials: the trials are the replications and the blocks;
    // cross-fit on the trial index modulo the folds (no block spans two
    // trials), and the batch-means blocks end where each trial ends on the
    // stacked clock.
    blocks = data.trial_count();
    for (int k = 1; k < blocks; ++k) boundaries.push_back(f.StackedOffset(k));
    grid_fold = ModuloOf(grid.trial, folds);
    event_fold = ModuloOf(f.TrialOfEvents(q.target), folds);
  } else {
    // Blocks: several time constants of the slowest filter in use (shared
    // or nuisance), at least as many as folds.
    const double slowest = std::min(*std::min_element(f.rates().begin(), f.rates().end()),
                                    *std::min_element(rates.begin(), rates.end()));
    const double window = data.end - data.start;
    blocks = std::max(folds, int(std::floor(window * slowest / options_.block_time_constants)));
    boundaries = BlockBoundaries(data, blocks);
    grid_fold = Folds(grid.times, boundaries, folds);
    event_fold = Folds(data.times[q.target], boundaries, folds);
  }
  int fewest = int(event_fold.size());
  for (int k = 0; k < folds; ++k) {
    fewest = std::min(fewest, int(std::count(event_fold.begin(), event_fold.end(), k)));
  }
  if (fewest < options_.min_target_events) {
    return Status::Error("too few events: '" + data.names[q.target] + "' has " +
                         std::to_string(fewest) + " events in a cross-fitting fold (at least " +
                         std::to_string(options_.min_target_events) + " needed)");
  }
  const Basis z = NuisanceBasis(f, q.target, q.given, rates, options_.quadratic);
  const Eigen::MatrixXd& z_grid = z.grid;
  const Eigen::MatrixXd& z_events = z.events;
  const Eigen::MatrixXd x_grid = GridColumns(f, q.sources);
  const Eigen::MatrixXd x_events = EventColumns(f, q.target, q.sources);
  const Eigen::Index d = x_grid.cols();

  // Residuals G_hat on each fold from nuisances fitted on other folds, and
  // the intensity estimate at the grid nodes. With two folds both nuisances
  // come from the other fold (the paper's cross-fitting); with three, Pi_hat
  // comes from the next fold and lambda_hat from the one after, so their
  // estimation errors are independent and their product has no mean beyond
  // the product of the approximation biases (double cross-fitting: Newey &
  // Robins 2018, arXiv 1801.09138, Sec. 3). Two errors fitted on one fold
  // are correlated whenever a's future responds to b's past, which gives a
  // bias of order (basis size) / sqrt(b's events) in the standardised
  // statistic; the split removes it at the price of a third of the window
  // per nuisance.
  Eigen::MatrixXd g_grid(x_grid.rows(), d), g_events(x_events.rows(), d);
  Eigen::VectorXd lambda_grid(x_grid.rows());
  for (int fold = 0; fold < folds; ++fold) {
    const Nuisance pi = FitNuisance(z_grid, x_grid, grid.weights, grid_fold, z_events,
                                    event_fold, (fold + 1) % folds, options_.ridge);
    const Nuisance rate = folds == 2 ? pi
                                     : FitNuisance(z_grid, x_grid, grid.weights, grid_fold,
                                                   z_events, event_fold, (fold + 2) % folds,
                                                   options_.ridge);
    if (!pi.ok || !rate.ok) {
      return Status::Error("singular design: the history features of C are collinear");
    }
    // Whole-matrix products (vectorised), then the rows of this fold.
    const Eigen::MatrixXd residual_grid = x_grid - z_grid * pi.beta.leftCols(d);
    const Eigen::VectorXd lambda = z_grid * rate.beta.col(d);
    const Eigen::MatrixXd residual_events = x_events - z_events * pi.beta.leftCols(d);
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
      Accumulate(grid.times, grid.weights, g_grid, lambda_grid, f.StackedTimes(q.target), g_events,
                 boundaries);
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
    // With `batch_variance`, the larger of the optional variation and the
    // batch-means variance over blocks: the latter also carries the
    // nuisances' own estimation noise (the term int G (lambda_hat - lambda)
    // ds, of mean zero but not of zero variance on a finite window, which
    // the optional variation leaves out) and any dependence between blocks.
    // Centred (event-local-covariance-batch): the increments less their
    // drift, so a real effect does not inflate the scale.
    double v = e.variance(j, j);
    if (options_.batch_variance == BatchVariance::kUncentred) v = std::max(v, e.batch_variance[j]);
    if (options_.batch_variance == BatchVariance::kCentred) {
      v = std::max(v, e.centred_batch_variance[j]);
    }
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
