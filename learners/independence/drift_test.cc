#include "learners/independence/drift_test.h"

#include <algorithm>
#include <cmath>
#include <string>

#include "learners/independence/reference_distributions.h"

namespace locind::learners {
namespace {

std::vector<int> Union(const std::vector<int>& a, const std::vector<int>& b) {
  std::vector<int> out(a);
  out.insert(out.end(), b.begin(), b.end());
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return out;
}

}  // namespace

std::vector<double> DefaultDriftRates(const sim::PathData& data, int count) {
  double dt = 1;
  if (data.increments() >= 1) dt = data.observed_time() / data.increments();
  std::vector<double> rates;
  for (int k = 0; k < count; ++k) rates.push_back(1 / (dt * std::pow(10.0, k + 1)));
  return rates;
}

// A filter with time constant 1/r is a slowly moving, nearly integrated
// regressor unless the window spans many time constants; with few, the
// filtered columns of persistent processes behave like a spurious regression
// (Granger & Newbold 1974, J. Econometrics 2(2)) and the F test over-rejects
// (measured: two uncoupled OU processes, window 50, sampling 0.1, 17% at 0.05
// with a 10-time-unit filter, 7% without it). Only rates whose time constant
// fits kMinFilterWindows times into the window are kept.
std::vector<double> SupportedDriftRates(const sim::PathData& data, const std::vector<double>& rates) {
  // With several trials a filter restarts at each trial: the mean trial
  // length is the window it must fit into.
  const double window = data.samples() >= 2 ? data.observed_time() / data.trial_count() : 0;
  std::vector<double> kept;
  for (double r : rates) {
    if (window * r >= kMinFilterWindows) kept.push_back(r);
  }
  return kept;
}

Status ValidatePathData(const sim::PathData& data) {
  if (data.samples() < 2) return Status::Error("at least two samples are needed");
  if (data.values.rows() != data.samples() || data.values.cols() != data.processes()) {
    return Status::Error("the value matrix must have one row per sample and one column per name");
  }
  for (size_t k = 0; k < data.trial_starts.size(); ++k) {
    const int first = data.trial_starts[k], previous = k ? data.trial_starts[k - 1] : 0;
    if (first - previous < 2 || first > data.samples() - 2) {
      return Status::Error("every trial needs at least two samples, in order");
    }
  }
  for (int i = 0; i < data.samples(); ++i) {
    const bool restart = i == 0 || data.starts_trial(i);
    if (!std::isfinite(data.time[i]) || (!restart && !(data.time[i] > data.time[i - 1]))) {
      return Status::Error("sample times must be finite and strictly increasing within a trial");
    }
  }
  if (!data.values.allFinite()) return Status::Error("values must be finite");
  return Status::Ok();
}

LeastSquares FitLeastSquares(const Eigen::MatrixXd& x, const Eigen::VectorXd& y) {
  Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(x);
  qr.setThreshold(1e-10);
  LeastSquares out;
  out.rank = static_cast<int>(qr.rank());
  out.coefficients = qr.solve(y);
  out.residuals = y - x * out.coefficients;
  out.rss = out.residuals.squaredNorm();
  return out;
}

Result<DriftTest> DriftTest::Create(sim::PathData data, DriftTestOptions options) {
  if (Status s = ValidatePathData(data); !s.ok()) return s;
  if (options.rates.empty()) options.rates = SupportedDriftRates(data, DefaultDriftRates(data));
  for (double r : options.rates) {
    if (!(r > 0) || !std::isfinite(r)) return Status::Error("filter rates must be positive and finite");
  }
  return DriftTest(std::move(data), std::move(options));
}

std::string DriftTest::kind() const {
  return options_.statistic == DriftStatistic::kF ? "drift-f" : "drift-robust-wald";
}

Eigen::VectorXd FilteredHistory(const sim::PathData& data, int process, double rate, Eigen::Index rows) {
  Eigen::VectorXd f(rows);
  if (rows == 0) return f;
  double filtered = data.values(0, process);
  f(0) = filtered;
  for (Eigen::Index i = 1; i < rows; ++i) {
    if (data.starts_trial(int(i))) {
      filtered = data.values(i, process);  // a new trial: the filter restarts at its first value
    } else {
      const double a = std::exp(-rate * (data.time[i] - data.time[i - 1]));
      filtered = a * filtered + (1 - a) * data.values(i - 1, process);
    }
    f(i) = filtered;
  }
  return f;
}

const Eigen::MatrixXd& DriftTest::Columns(int process) {
  auto it = columns_.find(process);
  if (it != columns_.end()) return it->second;
  const Eigen::Index n = data_.samples() - 1;
  const int k_count = static_cast<int>(options_.rates.size());
  Eigen::MatrixXd c(n, 1 + k_count);
  c.col(0) = data_.values.col(process).head(n);
  for (int k = 0; k < k_count; ++k) c.col(1 + k) = FilteredHistory(data_, process, options_.rates[k], n);
  return columns_.emplace(process, std::move(c)).first->second;
}

Eigen::MatrixXd DriftTest::Design(const std::vector<int>& covariates) {
  const std::vector<int> rows = data_.increment_rows();
  const Eigen::Index n = Eigen::Index(rows.size());
  const Eigen::Index width = 1 + Eigen::Index(options_.rates.size());
  Eigen::MatrixXd x(n, 1 + Eigen::Index(covariates.size()) * width);
  x.col(0).setOnes();
  for (size_t c = 0; c < covariates.size(); ++c) {
    const Eigen::MatrixXd& columns = Columns(covariates[c]);
    for (Eigen::Index r = 0; r < n; ++r) {
      x.row(r).segment(1 + Eigen::Index(c) * width, width) = columns.row(rows[size_t(r)]);
    }
  }
  for (Eigen::Index r = 0; r < n; ++r) {
    const int i = rows[size_t(r)];
    x.row(r) *= std::sqrt(data_.time[size_t(i) + 1] - data_.time[size_t(i)]);
  }
  return x;
}

Eigen::VectorXd DriftTest::Response(int target) const {
  const std::vector<int> rows = data_.increment_rows();
  Eigen::VectorXd y(Eigen::Index(rows.size()));
  for (size_t r = 0; r < rows.size(); ++r) {
    const Eigen::Index i = rows[r];
    y[Eigen::Index(r)] = (data_.values(i + 1, target) - data_.values(i, target)) /
                         std::sqrt(data_.time[size_t(i) + 1] - data_.time[size_t(i)]);
  }
  return y;
}

TestResult DriftTest::Run(const TestQuery& query) {
  const auto key = std::make_tuple(query.target, query.sources, query.given);
  auto it = cache_.find(key);
  if (it == cache_.end()) it = cache_.emplace(key, Compute(query)).first;
  return it->second;
}

namespace {

// Robust (HC1) Wald statistic for the coefficients at `tested` columns.
Result<double> RobustWald(const Eigen::MatrixXd& x, const LeastSquares& fit,
                          const std::vector<int>& tested) {
  const double n = double(x.rows()), p = double(x.cols());
  Eigen::LDLT<Eigen::MatrixXd> gram(x.transpose() * x);
  if (gram.info() != Eigen::Success) return Status::Error("singular design");
  const Eigen::MatrixXd bread = gram.solve(Eigen::MatrixXd::Identity(x.cols(), x.cols()));
  const Eigen::MatrixXd scaled = x.array().colwise() * fit.residuals.array();
  const Eigen::MatrixXd cov = n / (n - p) * bread * (scaled.transpose() * scaled) * bread;
  const Eigen::Index q = Eigen::Index(tested.size());
  Eigen::MatrixXd v(q, q);
  Eigen::VectorXd beta(q);
  for (Eigen::Index i = 0; i < q; ++i) {
    beta[i] = fit.coefficients[tested[i]];
    for (Eigen::Index j = 0; j < q; ++j) v(i, j) = cov(tested[i], tested[j]);
  }
  Eigen::LDLT<Eigen::MatrixXd> vldlt(v);
  if (vldlt.info() != Eigen::Success || (vldlt.vectorD().array() <= 0).any()) {
    return Status::Error("singular design: the robust covariance is singular");
  }
  return beta.dot(vldlt.solve(beta));
}

}  // namespace

const DriftTest::Moments& DriftTest::SharedMoments() {
  if (moments_) return *moments_;
  const int processes = data_.processes();
  std::vector<int> all(static_cast<size_t>(processes));
  for (int j = 0; j < processes; ++j) all[size_t(j)] = j;
  const std::vector<int> steps = data_.increment_rows();  // no increment spans two trials
  const Eigen::Index n = Eigen::Index(steps.size());
  const Eigen::Index width = 1 + Eigen::Index(options_.rates.size());
  const Eigen::Index cols = 1 + processes * width;
  Moments m{Eigen::MatrixXd::Zero(cols, cols), Eigen::MatrixXd::Zero(cols, processes),
            Eigen::VectorXd::Zero(processes)};
  for (int j = 0; j < processes; ++j) Columns(j);
  // Row chunks keep the temporary design small whatever the sample count.
  constexpr Eigen::Index kChunk = 4096;
  for (Eigen::Index r0 = 0; r0 < n; r0 += kChunk) {
    const Eigen::Index rows = std::min(kChunk, n - r0);
    Eigen::MatrixXd w(rows, cols);
    Eigen::MatrixXd y(rows, processes);
    for (Eigen::Index i = 0; i < rows; ++i) {
      const Eigen::Index s = steps[size_t(r0 + i)];
      const double dt = data_.time[size_t(s) + 1] - data_.time[size_t(s)];
      const double root = std::sqrt(dt);
      w(i, 0) = root;
      for (int j = 0; j < processes; ++j) {
        w.row(i).segment(1 + j * width, width) = root * columns_.at(j).row(s);
        y(i, j) = (data_.values(s + 1, j) - data_.values(s, j)) / root;
      }
    }
    m.gram.selfadjointView<Eigen::Lower>().rankUpdate(w.transpose());
    m.cross.noalias() += w.transpose() * y;
    m.response2 += y.colwise().squaredNorm().transpose();
  }
  m.gram = m.gram.selfadjointView<Eigen::Lower>();
  moments_ = std::move(m);
  return *moments_;
}

namespace {

// Columns of `processes` in the shared layout (intercept first).
std::vector<int> SharedColumns(const std::vector<int>& processes, int width) {
  std::vector<int> cols = {0};
  for (int j : processes) {
    for (int k = 0; k < width; ++k) cols.push_back(1 + j * width + k);
  }
  return cols;
}

// RSS of the regression on `cols`, from the moments; nullopt when the
// unit-diagonal sub-Gram matrix is numerically singular.
std::optional<double> ResidualSumOfSquares(const Eigen::MatrixXd& gram, const Eigen::VectorXd& cross,
                                           double response2, const std::vector<int>& cols) {
  const Eigen::Index p = Eigen::Index(cols.size());
  Eigen::MatrixXd g(p, p);
  Eigen::VectorXd c(p);
  for (Eigen::Index i = 0; i < p; ++i) {
    c[i] = cross[cols[i]];
    for (Eigen::Index j = 0; j < p; ++j) g(i, j) = gram(cols[i], cols[j]);
  }
  const Eigen::VectorXd scale = g.diagonal().cwiseMax(1e-300).cwiseSqrt().cwiseInverse();
  g = scale.asDiagonal() * g * scale.asDiagonal();
  c = scale.asDiagonal() * c;
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(g);
  const Eigen::VectorXd& values = eig.eigenvalues();
  if (values.minCoeff() <= 1e-12 * values.maxCoeff()) return std::nullopt;
  const Eigen::VectorXd projected = eig.eigenvectors().transpose() * c;
  return response2 - projected.cwiseAbs2().cwiseQuotient(values).sum();
}

}  // namespace

TestResult DriftTest::FTest(const TestQuery& q, const std::vector<int>& full) {
  const Moments& m = SharedMoments();
  const int width = 1 + int(options_.rates.size());
  const std::vector<int> full_cols = SharedColumns(full, width);
  const std::vector<int> kept_cols = SharedColumns(q.given, width);
  const double yy = m.response2[q.target];
  const std::optional<double> rss_full = ResidualSumOfSquares(m.gram, m.cross.col(q.target), yy, full_cols);
  if (!rss_full) return NotEstimable("singular design: the history features are collinear");
  if (!(*rss_full > 1e-12 * yy)) return NotEstimable("perfect fit: zero residuals");
  const std::optional<double> rss_kept = ResidualSumOfSquares(m.gram, m.cross.col(q.target), yy, kept_cols);
  if (!rss_kept) return NotEstimable("singular design: the history features are collinear");
  TestResult r;
  r.df = double(full_cols.size() - kept_cols.size());
  const double df2 = double(data_.increments()) - double(full_cols.size());
  r.statistic = std::max(0.0, (*rss_kept - *rss_full) / r.df / (*rss_full / df2));
  r.p_value = FSurvival(r.df, df2, r.statistic);
  return r;
}

TestResult DriftTest::Compute(const TestQuery& q) {
  const std::vector<int> full = Union(q.sources, q.given);
  const Eigen::Index n = data_.increments();
  const Eigen::Index p = 1 + Eigen::Index(full.size()) * (1 + Eigen::Index(options_.rates.size()));
  if (n < p + 10) {
    return NotEstimable("too few samples: " + std::to_string(n) + " increments for " +
                        std::to_string(p) + " coefficients");
  }
  if (options_.statistic == DriftStatistic::kF) return FTest(q, full);
  const Eigen::MatrixXd x = Design(full);
  const Eigen::VectorXd y = Response(q.target);
  const LeastSquares full_fit = FitLeastSquares(x, y);
  if (full_fit.rank < p) {
    return NotEstimable("singular design: rank " + std::to_string(full_fit.rank) + " of " +
                        std::to_string(p) + " columns");
  }
  if (!(full_fit.rss > 0)) return NotEstimable("perfect fit: zero residuals");
  // Columns of the tested (A) coefficients in the full design.
  const Eigen::Index width = 1 + Eigen::Index(options_.rates.size());
  std::vector<int> tested;
  for (size_t c = 0; c < full.size(); ++c) {
    if (!std::binary_search(q.sources.begin(), q.sources.end(), full[c])) continue;
    for (Eigen::Index k = 0; k < width; ++k) tested.push_back(int(1 + Eigen::Index(c) * width + k));
  }
  TestResult r;
  r.df = double(tested.size());
  Result<double> w = RobustWald(x, full_fit, tested);
  if (!w.ok()) return NotEstimable(w.status().message());
  r.statistic = *w;
  r.p_value = ChiSquaredSurvival(r.df, r.statistic);
  return r;
}

}  // namespace locind::learners
