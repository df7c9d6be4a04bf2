#include "learners/independence/drift_transition_test.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <numbers>
#include <string>

#include <unsupported/Eigen/MatrixFunctions>

#include "learners/independence/drift_test.h"
#include "learners/independence/reference_distributions.h"

namespace locind::learners {
namespace {

constexpr double kMinusInfinity = -std::numeric_limits<double>::infinity();
// Spacings within this relative distance share one transition.
constexpr double kSpacingTolerance = 1e-6;

// The moments of one spacing restricted to the coordinates of a fit.
struct Block {
  double step, count;
  Eigen::MatrixXd zz, yz, yy;
  Eigen::MatrixXd hh, hy, hz;  // history inputs (empty without them)
};

// Log-likelihood of the exact transitions with the offsets profiled out. For
// each spacing D: F = e^{MD} and Q(D) come from
//   exp([[-M, diag(sigma^2)], [0, M']] D) = [[., G], [0, e^{M'D}]],  Q = e^{M'D}' G
// (Van Loan 1978, Theorem 1). With centred moments, the residual
// cross-product is E = yy - yz F' - F yz' + F zz F', and
//   l = -1/2 sum_D [count (d log 2 pi + log det Q) + tr(Q^{-1} E)].
// -infinity when a transition overflows or Q is not positive definite.
//
// History inputs (blocks with hh non-empty, `target` >= 0): the drift of
// coordinate `target` has the extra term gamma' H(t_i), held over the step, so
// the mean of X(t+D) gains g gamma' H(t_i) with g = (int_0^D e^{Ms} ds) e_target,
// the last column of exp([[M, e_target], [0, 0]] D) (Van Loan 1978,
// Theorem 1). The residuals are r = e - g H' gamma with e = y - F z, and
//   sum r' Q^{-1} r = sum e' Q^{-1} e - 2 gamma' u + gamma' W gamma,
//   u = sum_D (hy - hz F') Q^{-1} g,  W = sum_D (g' Q^{-1} g) hh,
// so profiling gamma = W^{-1} u adds u' W^{-1} u / 2 to l.
double LogLikelihood(const std::vector<Block>& blocks, const Eigen::MatrixXd& M,
                     const Eigen::VectorXd& sigma, Eigen::Index target = -1) {
  const Eigen::Index d = M.rows();
  const Eigen::Index k = target >= 0 ? blocks.front().hh.rows() : 0;
  Eigen::VectorXd u = Eigen::VectorXd::Zero(k);
  Eigen::MatrixXd w = Eigen::MatrixXd::Zero(k, k);
  Eigen::MatrixXd input = Eigen::MatrixXd::Zero(d + 1, d + 1);
  double total = 0;
  Eigen::MatrixXd big = Eigen::MatrixXd::Zero(2 * d, 2 * d);
  for (const Block& b : blocks) {
    big.topLeftCorner(d, d) = -M * b.step;
    big.topRightCorner(d, d) = (sigma.array().square() * b.step).matrix().asDiagonal();
    big.bottomRightCorner(d, d) = M.transpose() * b.step;
    const Eigen::MatrixXd e = big.exp();
    if (!e.allFinite()) return kMinusInfinity;
    const Eigen::MatrixXd f = e.bottomRightCorner(d, d).transpose();
    Eigen::MatrixXd q = f * e.topRightCorner(d, d);
    q = 0.5 * (q + q.transpose()).eval();
    Eigen::LLT<Eigen::MatrixXd> llt(q);
    if (llt.info() != Eigen::Success) return kMinusInfinity;
    const Eigen::MatrixXd fyz = f * b.yz.transpose();
    const Eigen::MatrixXd resid = b.yy - fyz - fyz.transpose() + f * b.zz * f.transpose();
    const double log_det = 2 * llt.matrixLLT().diagonal().array().log().sum();
    if (!std::isfinite(log_det)) return kMinusInfinity;
    const double trace = llt.solve(resid).trace();
    total -= 0.5 * (b.count * (double(d) * std::log(2 * std::numbers::pi) + log_det) + trace);
    if (k > 0) {
      input.topLeftCorner(d, d) = M * b.step;
      input(target, d) = b.step;
      const Eigen::VectorXd g = input.exp().col(d).head(d);
      if (!g.allFinite()) return kMinusInfinity;
      const Eigen::VectorXd qg = llt.solve(g);
      u.noalias() += (b.hy - b.hz * f.transpose()) * qg;
      w += g.dot(qg) * b.hh;
    }
  }
  if (k > 0) {
    Eigen::LDLT<Eigen::MatrixXd> ldlt(w);
    if (ldlt.info() != Eigen::Success) return kMinusInfinity;
    total += 0.5 * u.dot(ldlt.solve(u));
  }
  return std::isfinite(total) ? total : kMinusInfinity;
}

// Parameters theta = [allowed entries of M, row-major; log sigma].
struct Layout {
  const Eigen::MatrixX<bool>* allowed;
  Eigen::Index d;
  Eigen::Index size() const { return allowed->count() + d; }
  Eigen::VectorXd Pack(const Eigen::MatrixXd& M, const Eigen::VectorXd& sigma) const {
    Eigen::VectorXd theta(size());
    Eigen::Index k = 0;
    for (Eigen::Index i = 0; i < d; ++i)
      for (Eigen::Index j = 0; j < d; ++j)
        if ((*allowed)(i, j)) theta[k++] = M(i, j);
    theta.tail(d) = sigma.array().log();
    return theta;
  }
  void Unpack(const Eigen::VectorXd& theta, Eigen::MatrixXd& M, Eigen::VectorXd& sigma) const {
    M.setZero(d, d);
    Eigen::Index k = 0;
    for (Eigen::Index i = 0; i < d; ++i)
      for (Eigen::Index j = 0; j < d; ++j)
        if ((*allowed)(i, j)) M(i, j) = theta[k++];
    sigma = theta.tail(d).array().exp();
  }
};

// Euler start: row by row, the weighted least squares of increments on the
// allowed current levels, sum_D sum_i (dx_i - D m' z_i)^2 / D (Kloeden &
// Platen 1992, Sec. 9.1), and sigma_i^2 = RSS_i / n.
Status EulerStart(const std::vector<Block>& blocks, const Eigen::MatrixX<bool>& allowed,
                  Eigen::MatrixXd& M, Eigen::VectorXd& sigma) {
  const Eigen::Index d = allowed.rows();
  M.setZero(d, d);
  sigma.resize(d);
  double n = 0;
  for (const Block& b : blocks) n += b.count;
  for (Eigen::Index i = 0; i < d; ++i) {
    std::vector<Eigen::Index> cols;
    for (Eigen::Index j = 0; j < d; ++j)
      if (allowed(i, j)) cols.push_back(j);
    const Eigen::Index k = Eigen::Index(cols.size());
    Eigen::MatrixXd gram = Eigen::MatrixXd::Zero(k, k);
    Eigen::VectorXd cross = Eigen::VectorXd::Zero(k);
    double dd = 0;
    for (const Block& b : blocks) {
      const Eigen::MatrixXd dz = b.yz - b.zz;  // centred sum of increments times levels
      dd += (b.yy(i, i) - 2 * b.yz(i, i) + b.zz(i, i)) / b.step;
      for (Eigen::Index u = 0; u < k; ++u) {
        cross[u] += dz(i, cols[size_t(u)]);
        for (Eigen::Index v = 0; v < k; ++v) gram(u, v) += b.step * b.zz(cols[size_t(u)], cols[size_t(v)]);
      }
    }
    double rss = dd;
    if (k > 0) {
      Eigen::LDLT<Eigen::MatrixXd> ldlt(gram);
      if (ldlt.info() != Eigen::Success || !(ldlt.vectorD().array() > 1e-12 * gram.diagonal().maxCoeff()).all()) {
        return Status::Error("singular design: the levels are collinear");
      }
      const Eigen::VectorXd m = ldlt.solve(cross);
      for (Eigen::Index u = 0; u < k; ++u) M(i, cols[size_t(u)]) = m[u];
      rss -= m.dot(cross);
    }
    if (!(rss > 1e-12 * std::max(dd, 1e-300))) return Status::Error("perfect fit: a coordinate does not move");
    sigma[i] = std::sqrt(rss / n);
  }
  return Status::Ok();
}

// Central-difference gradient of f at x (one-sided where a side is -inf).
Eigen::VectorXd Gradient(const std::function<double(const Eigen::VectorXd&)>& f, const Eigen::VectorXd& x,
                         double fx) {
  Eigen::VectorXd g(x.size());
  Eigen::VectorXd probe = x;
  for (Eigen::Index i = 0; i < x.size(); ++i) {
    const double h = 1e-5 * std::max(1.0, std::abs(x[i]));
    probe[i] = x[i] + h;
    const double up = f(probe);
    probe[i] = x[i] - h;
    const double down = f(probe);
    probe[i] = x[i];
    if (std::isfinite(up) && std::isfinite(down)) {
      g[i] = (up - down) / (2 * h);
    } else if (std::isfinite(up)) {
      g[i] = (up - fx) / h;
    } else if (std::isfinite(down)) {
      g[i] = (fx - down) / h;
    } else {
      g[i] = 0;
    }
  }
  return g;
}

struct Maximum {
  Eigen::VectorXd x;
  double value = 0;
  int iterations = 0;
  bool converged = false;
};

// BFGS ascent (Nocedal & Wright 2006, Numerical Optimization, 2nd ed.,
// Algorithm 6.1, with the initial scaling of their eq. 6.20) and Armijo
// backtracking. Stops when an iteration gains less than 1e-10 (1 + |f|) or the
// largest gradient entry is below 1e-6; a stalled line search counts as
// converged when that entry is below 1e-2 (the finite-difference noise).
Maximum Bfgs(const std::function<double(const Eigen::VectorXd&)>& f, Eigen::VectorXd x, int max_iterations) {
  Maximum out;
  double fx = f(x);
  Eigen::VectorXd g = Gradient(f, x, fx);
  const Eigen::Index p = x.size();
  Eigen::MatrixXd h = Eigen::MatrixXd::Identity(p, p) / std::max(1.0, g.cwiseAbs().maxCoeff());
  bool scaled = false;
  for (int it = 1; it <= max_iterations; ++it) {
    out.iterations = it;
    if (g.cwiseAbs().maxCoeff() < 1e-6) {
      out.converged = true;
      break;
    }
    Eigen::VectorXd dir = h * g;
    double slope = g.dot(dir);
    if (!(slope > 0)) {
      h = Eigen::MatrixXd::Identity(p, p) / std::max(1.0, g.cwiseAbs().maxCoeff());
      dir = h * g;
      slope = g.dot(dir);
    }
    double alpha = 1, fnew = kMinusInfinity;
    Eigen::VectorXd xnew;
    for (; alpha > 1e-14; alpha *= 0.5) {
      xnew = x + alpha * dir;
      fnew = f(xnew);
      if (std::isfinite(fnew) && fnew >= fx + 1e-4 * alpha * slope) break;
    }
    if (!(alpha > 1e-14)) {
      out.converged = g.cwiseAbs().maxCoeff() < 1e-2;
      break;
    }
    const Eigen::VectorXd gnew = Gradient(f, xnew, fnew);
    // Ascent on f is descent on -f: s = step, y = -(gnew - g).
    const Eigen::VectorXd s = xnew - x;
    const Eigen::VectorXd y = g - gnew;
    const double gain = fnew - fx;
    x = xnew;
    fx = fnew;
    g = gnew;
    const double sy = s.dot(y);
    if (sy > 1e-300) {
      if (!scaled) {
        h = Eigen::MatrixXd::Identity(p, p) * (sy / y.squaredNorm());
        scaled = true;
      }
      const double rho = 1 / sy;
      const Eigen::VectorXd hy = h * y;
      h += (rho * rho * y.dot(hy) + rho) * s * s.transpose() - rho * (hy * s.transpose() + s * hy.transpose());
    }
    if (gain < 1e-10 * (1 + std::abs(fx))) {
      out.converged = true;
      break;
    }
  }
  out.x = std::move(x);
  out.value = fx;
  return out;
}

std::vector<int> Union(const std::vector<int>& a, const std::vector<int>& b) {
  std::vector<int> out(a);
  out.insert(out.end(), b.begin(), b.end());
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return out;
}

}  // namespace

Result<DriftTransitionTest> DriftTransitionTest::Create(sim::PathData data, DriftTransitionOptions options) {
  if (Status s = ValidatePathData(data); !s.ok()) return s;
  if (options.max_iterations < 1) return Status::Error("max_iterations must be at least 1");
  if (!options.history && !options.rates.empty()) return Status::Error("filter rates need history inputs");
  for (double r : options.rates) {
    if (!(r > 0) || !std::isfinite(r)) return Status::Error("filter rates must be positive");
  }
  if (options.history && options.rates.empty()) options.rates = SupportedDriftRates(data, DefaultDriftRates(data));
  return DriftTransitionTest(std::move(data), options);
}

const std::vector<DriftTransitionTest::SpacingMoments>& DriftTransitionTest::Moments() {
  if (moments_) return *moments_;
  const Eigen::Index p = data_.processes();
  const std::vector<int> steps = data_.increment_rows();  // no step spans two trials
  const size_t n = steps.size();
  // Group the steps by spacing.
  std::vector<int> group(n, 0);
  std::vector<SpacingMoments> out;
  for (size_t r = 0; r < n; ++r) {
    const size_t i = size_t(steps[r]);
    const double step = data_.time[i + 1] - data_.time[i];
    size_t g = 0;
    while (g < out.size() && std::abs(step - out[g].step) > kSpacingTolerance * out[g].step) ++g;
    if (g == out.size()) {
      if (out.size() == size_t(kMaxDistinctSpacings)) {
        moments_.emplace();
        return *moments_;
      }
      out.push_back({step, 0, Eigen::MatrixXd::Zero(p, p), Eigen::MatrixXd::Zero(p, p), Eigen::MatrixXd::Zero(p, p),
                     {}, {}, {}});
    }
    group[r] = int(g);
    out[g].count += 1;
  }
  // Two passes (means, then centred sums) for accuracy.
  std::vector<Eigen::VectorXd> zbar(out.size(), Eigen::VectorXd::Zero(p)), ybar = zbar;
  for (size_t r = 0; r < n; ++r) {
    const Eigen::Index i = steps[r];
    zbar[size_t(group[r])] += data_.values.row(i).transpose();
    ybar[size_t(group[r])] += data_.values.row(i + 1).transpose();
  }
  for (size_t g = 0; g < out.size(); ++g) zbar[g] /= out[g].count, ybar[g] /= out[g].count;
  for (size_t r = 0; r < n; ++r) {
    const Eigen::Index i = steps[r];
    const size_t g = size_t(group[r]);
    const Eigen::VectorXd z = data_.values.row(i).transpose() - zbar[g];
    const Eigen::VectorXd y = data_.values.row(i + 1).transpose() - ybar[g];
    out[g].zz.noalias() += z * z.transpose();
    out[g].yz.noalias() += y * z.transpose();
    out[g].yy.noalias() += y * y.transpose();
  }
  // History inputs: the filtered columns of drift-f (DriftTest), F_i = a F_{i-1}
  // + (1 - a) X_{i-1}, a = exp(-r (t_i - t_{i-1})), F = X at each trial's first sample.
  const Eigen::Index rate_count = Eigen::Index(options_.rates.size());
  const Eigen::Index hp = p * rate_count;
  if (hp > 0) {
    Eigen::MatrixXd h(data_.samples(), hp);
    for (Eigen::Index j = 0; j < p; ++j) {
      for (Eigen::Index k = 0; k < rate_count; ++k) {
        h.col(j * rate_count + k) = FilteredHistory(data_, int(j), options_.rates[size_t(k)], data_.samples());
      }
    }
    std::vector<Eigen::VectorXd> hbar(out.size(), Eigen::VectorXd::Zero(hp));
    for (size_t r = 0; r < n; ++r) hbar[size_t(group[r])] += h.row(steps[r]).transpose();
    for (size_t g = 0; g < out.size(); ++g) {
      hbar[g] /= out[g].count;
      out[g].hh = Eigen::MatrixXd::Zero(hp, hp);
      out[g].hy = Eigen::MatrixXd::Zero(hp, p);
      out[g].hz = Eigen::MatrixXd::Zero(hp, p);
    }
    for (size_t r = 0; r < n; ++r) {
      const Eigen::Index i = steps[r];
      const size_t g = size_t(group[r]);
      const Eigen::VectorXd x = h.row(i).transpose() - hbar[g];
      const Eigen::VectorXd z = data_.values.row(i).transpose() - zbar[g];
      const Eigen::VectorXd y = data_.values.row(i + 1).transpose() - ybar[g];
      out[g].hh.noalias() += x * x.transpose();
      out[g].hy.noalias() += x * y.transpose();
      out[g].hz.noalias() += x * z.transpose();
    }
  }
  moments_ = std::move(out);
  return *moments_;
}

Result<TransitionFit> DriftTransitionTest::Fit(const std::vector<int>& coords, const Eigen::MatrixX<bool>& allowed,
                                               const TransitionFit* start) {
  return FitWithHistory(coords, allowed, -1, {}, start);
}

Result<TransitionFit> DriftTransitionTest::FitWithHistory(const std::vector<int>& coords,
                                                          const Eigen::MatrixX<bool>& allowed, Eigen::Index target,
                                                          const std::vector<int>& history,
                                                          const TransitionFit* start) {
  const std::vector<SpacingMoments>& moments = Moments();
  if (moments.empty()) {
    return Status::Error("irregular sampling: more than " + std::to_string(kMaxDistinctSpacings) +
                         " distinct spacings");
  }
  if (!history.empty() && (target < 0 || target >= Eigen::Index(coords.size()))) {
    return Status::Error("history inputs need a target coordinate");
  }
  for (int j : history) {
    if (j < 0 || j >= data_.processes()) return Status::Error("history process out of range");
  }
  std::vector<int> hcols;  // the filtered columns of the history processes
  const int rate_count = int(options_.rates.size());
  for (int j : history)
    for (int k = 0; k < rate_count; ++k) hcols.push_back(j * rate_count + k);
  if (hcols.empty()) target = -1;
  std::vector<Block> blocks;
  for (const SpacingMoments& m : moments) {
    blocks.push_back({m.step, m.count, m.zz(coords, coords), m.yz(coords, coords), m.yy(coords, coords), {}, {}, {}});
    if (!hcols.empty()) {
      blocks.back().hh = m.hh(hcols, hcols);
      blocks.back().hy = m.hy(hcols, coords);
      blocks.back().hz = m.hz(hcols, coords);
    }
  }
  if (!hcols.empty()) {
    Eigen::MatrixXd gram = Eigen::MatrixXd::Zero(Eigen::Index(hcols.size()), Eigen::Index(hcols.size()));
    for (const Block& b : blocks) gram += b.hh;
    const Eigen::VectorXd scale = gram.diagonal().cwiseMax(1e-300).cwiseSqrt().cwiseInverse();
    const Eigen::MatrixXd unit = scale.asDiagonal() * gram * scale.asDiagonal();
    Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(unit, Eigen::EigenvaluesOnly);
    if (!(eig.eigenvalues().minCoeff() > 1e-12 * eig.eigenvalues().maxCoeff())) {
      return Status::Error("singular design: the filtered histories are collinear");
    }
  }
  Eigen::MatrixXd M;
  Eigen::VectorXd sigma;
  if (Status s = EulerStart(blocks, allowed, M, sigma); !s.ok()) return s;
  const Layout layout{&allowed, Eigen::Index(coords.size())};
  auto objective = [&](const Eigen::VectorXd& theta) {
    Eigen::MatrixXd m;
    Eigen::VectorXd s;
    layout.Unpack(theta, m, s);
    return LogLikelihood(blocks, m, s, target);
  };
  Maximum best = Bfgs(objective, layout.Pack(M, sigma), options_.max_iterations);
  if (start != nullptr) {
    Maximum other = Bfgs(objective, layout.Pack(start->M, start->sigma), options_.max_iterations);
    if (other.value > best.value || !std::isfinite(best.value)) best = std::move(other);
  }
  TransitionFit fit;
  layout.Unpack(best.x, fit.M, fit.sigma);
  fit.log_likelihood = best.value;
  fit.iterations = best.iterations;
  fit.converged = best.converged && std::isfinite(best.value);
  return fit;
}

TestResult DriftTransitionTest::Run(const TestQuery& query) {
  const auto key = std::make_tuple(query.target, query.sources, query.given);
  auto it = cache_.find(key);
  if (it == cache_.end()) it = cache_.emplace(key, Compute(query)).first;
  return it->second;
}

TestResult DriftTransitionTest::Compute(const TestQuery& q) {
  const std::vector<int> coords = Union(Union(q.sources, q.given), {q.target});
  const Eigen::Index d = Eigen::Index(coords.size());
  const Eigen::Index n = data_.increments();
  const std::vector<int> history = options_.history ? Union(q.given, {}) : std::vector<int>{};
  const Eigen::Index inputs = Eigen::Index(history.size() * options_.rates.size());
  if (n < d * (d + 2) + 10 + inputs) {
    return NotEstimable("too few samples: " + std::to_string(n) + " increments for " + std::to_string(d) +
                        " coordinates");
  }
  auto position = [&](int process) {
    return Eigen::Index(std::lower_bound(coords.begin(), coords.end(), process) - coords.begin());
  };
  Eigen::MatrixX<bool> full = Eigen::MatrixX<bool>::Constant(d, d, true);
  Eigen::MatrixX<bool> null = full;
  for (int a : q.sources) null(position(q.target), position(a)) = false;
  const Eigen::Index target = position(q.target);
  Result<TransitionFit> restricted = FitWithHistory(coords, null, target, history);
  if (!restricted.ok()) return NotEstimable(restricted.status().message());
  if (!restricted->converged) return NotEstimable("failed fit: the null model did not converge");
  // Starting the full fit at the null optimum as well keeps LR >= 0.
  Result<TransitionFit> unrestricted = FitWithHistory(coords, full, target, history, &*restricted);
  if (!unrestricted.ok()) return NotEstimable(unrestricted.status().message());
  if (!unrestricted->converged) return NotEstimable("failed fit: the full model did not converge");
  TestResult r;
  r.df = double(q.sources.size());
  r.statistic = std::max(0.0, 2 * (unrestricted->log_likelihood - restricted->log_likelihood));
  r.p_value = ChiSquaredSurvival(r.df, r.statistic);
  return r;
}

}  // namespace locind::learners
