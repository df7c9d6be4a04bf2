#include "learners/independence/hawkes_lr_test.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <memory>
#include <string>

#include "base/random_stream.h"
#include "learners/independence/projected_newton.h"
#include "learners/independence/reference_distributions.h"

namespace locind::learners {
namespace {

constexpr double kMinusInfinity = -std::numeric_limits<double>::infinity();

std::vector<int> Union(const std::vector<int>& a, const std::vector<int>& b) {
  std::vector<int> out(a);
  out.insert(out.end(), b.begin(), b.end());
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return out;
}

// Softplus pieces for u = eta / s, computed without overflow.
double Softplus(double u) { return u > 0 ? u + std::log1p(std::exp(-u)) : std::log1p(std::exp(u)); }
double LogSoftplus(double u) { return u < -30 ? u : std::log(Softplus(u)); }

uint64_t HashList(const std::vector<int>& list) {
  uint64_t h = 0x51ed27u;
  for (int v : list) h = base::MixBits(h ^ static_cast<uint64_t>(v));
  return h;
}

}  // namespace

// The data of one fit: event design Z = [1, x(t_i)] and either the exact
// integrals J, and for the softplus link the grid design U with weights.
struct HawkesLrTest::Design {
  Eigen::MatrixXd z;
  Eigen::VectorXd integrals;
  Eigen::MatrixXd grid;
  Eigen::VectorXd grid_weights;
  double scale = 1;  // softplus scale s
};

HawkesLrTest::HawkesLrTest(std::shared_ptr<HawkesFeatures> features, HawkesTestOptions options)
    : features_(std::move(features)), options_(options) {}

std::string HawkesLrTest::kind() const {
  if (options_.link == HawkesLink::kSoftplus) return "hawkes-lr-signed";
  return options_.boundary == BoundaryReference::kChiBarSquared ? "hawkes-lr" : "hawkes-lr-chisq";
}

HawkesLrTest::Design HawkesLrTest::BuildDesign(int target, const std::vector<int>& covariates) {
  const int k_count = features_->basis_size();
  const sim::EventData& data = features_->data();
  const Eigen::Index n = static_cast<Eigen::Index>(data.times[target].size());
  const Eigen::Index p = 1 + static_cast<Eigen::Index>(covariates.size()) * k_count;
  Design d;
  d.z.resize(n, p);
  d.z.col(0).setOnes();
  for (size_t c = 0; c < covariates.size(); ++c) {
    d.z.middleCols(1 + Eigen::Index(c) * k_count, k_count) = features_->AtEvents(target, covariates[c]);
  }
  d.integrals.resize(p);
  d.integrals[0] = data.duration();
  for (size_t c = 0; c < covariates.size(); ++c) {
    d.integrals.segment(1 + Eigen::Index(c) * k_count, k_count) = features_->Integrals(covariates[c]);
  }
  if (options_.link == HawkesLink::kLinear) return d;
  const HawkesFeatures::Grid& grid = features_->QuadratureGrid();
  d.grid.resize(static_cast<Eigen::Index>(grid.times.size()), p);
  d.grid.col(0).setOnes();
  for (size_t c = 0; c < covariates.size(); ++c) {
    d.grid.middleCols(1 + Eigen::Index(c) * k_count, k_count) = features_->AtGrid(covariates[c]);
  }
  d.grid_weights = grid.weights;
  d.scale = std::max<double>(double(n), 1.0) / data.duration() / 100;
  return d;
}

namespace {

// Buffers of the linear objective, kept across its calls: the event design
// has about 1e4-1e5 rows, and allocating the n x p matrix `scaled` on every
// Hessian cost more than the arithmetic (each fresh block of a few MB is
// mapped and page-faulted anew). The results are those of the plain
// expressions, bit for bit: the same Eigen operations run on the same
// operands, only into kept storage. `eta` caches z * x for the last x
// evaluated (the projected Newton routine asks for the derivatives at the
// point whose value it has just accepted).
struct LinearWorkspace {
  Eigen::VectorXd last_x;
  Eigen::ArrayXd eta;      // z * last_x
  Eigen::ArrayXd inverse;  // 1 / eta
  Eigen::MatrixXd scaled;  // z scaled row-wise by 1 / eta
  bool has_eta = false;

  const Eigen::ArrayXd& Eta(const Eigen::MatrixXd& z, const Eigen::VectorXd& x) {
    if (has_eta && last_x.size() == x.size() && last_x == x) return eta;
    eta.resize(z.rows());
    eta.matrix().noalias() = z * x;
    last_x = x;
    has_eta = true;
    return eta;
  }
};

ConcaveObjective LinearObjective(const Eigen::MatrixXd& z, const Eigen::VectorXd& integrals) {
  ConcaveObjective f;
  auto work = std::make_shared<LinearWorkspace>();
  f.value = [&, work](const Eigen::VectorXd& x) {
    const Eigen::ArrayXd& lambda = work->Eta(z, x);
    if (lambda.size() > 0 && lambda.minCoeff() <= 0) return kMinusInfinity;
    return lambda.log().sum() - integrals.dot(x);
  };
  f.derivatives = [&, work](const Eigen::VectorXd& x, Eigen::VectorXd& g, Eigen::MatrixXd& h) {
    work->inverse = work->Eta(z, x).inverse();
    g = z.transpose() * work->inverse.matrix() - integrals;
    work->scaled.resize(z.rows(), z.cols());
    work->scaled.array() = z.array().colwise() * work->inverse;
    h = -(work->scaled.transpose() * work->scaled);
  };
  return f;
}

// Softplus link lambda = s * softplus(eta / s). Per point, with u = eta / s
// and e = exp(-|u|) (one exponential): softplus(u) = max(u, 0) + log1p(e),
// sigma(u) = 1/(1+e) or e/(1+e), sigma (1 - sigma) = e / (1+e)^2.
struct SoftplusPoint {
  double softplus, sigma, sigma_slope;
};
SoftplusPoint SoftplusAt(double u) {
  const double e = std::exp(-std::abs(u));
  const double inv = 1 / (1 + e);
  return {std::max(u, 0.0) + std::log1p(e), u >= 0 ? inv : e * inv, e * inv * inv};
}

// The compensator splits as int s sp(eta/s) dt = int eta dt + int s sp(-eta/s) dt
// (sp(u) = u + sp(-u)): the first part is J'x in closed form, the second is
// a small correction, non-zero only where eta is within a few s of zero, and
// taken by quadrature over the grid nodes with u = eta/s < kSkip (beyond, it
// is below e^-kSkip relative and dropped).
constexpr double kSkip = 40;

ConcaveObjective SoftplusObjective(const Eigen::MatrixXd& z, const Eigen::VectorXd& integrals,
                                   const Eigen::MatrixXd& grid, const Eigen::VectorXd& w, double s) {
  ConcaveObjective f;
  f.value = [&, s](const Eigen::VectorXd& x) {
    const Eigen::VectorXd eta = z * x, eta_grid = grid * x;
    double value = double(eta.size()) * std::log(s) - integrals.dot(x);
    for (Eigen::Index i = 0; i < eta.size(); ++i) value += LogSoftplus(eta[i] / s);
    double correction = 0;
    for (Eigen::Index q = 0; q < eta_grid.size(); ++q) {
      const double u = eta_grid[q] / s;
      if (u < kSkip) correction += w[q] * Softplus(-u);
    }
    value -= s * correction;
    return std::isfinite(value) ? value : kMinusInfinity;
  };
  f.derivatives = [&, s](const Eigen::VectorXd& x, Eigen::VectorXd& g, Eigen::MatrixXd& h) {
    const Eigen::VectorXd eta = z * x, eta_grid = grid * x;
    // Events: d/deta log lambda = sigma / (s sp); second derivative
    // (sigma (1 - sigma) / sp - (sigma / sp)^2) / s^2 <= 0 (log softplus is concave).
    Eigen::VectorXd first(eta.size()), weight(eta.size());
    for (Eigen::Index i = 0; i < eta.size(); ++i) {
      const double u = eta[i] / s;
      if (u < -30) {  // log lambda ~ log s + u: linear in eta
        first[i] = 1 / s;
        weight[i] = 0;
        continue;
      }
      const SoftplusPoint p = SoftplusAt(u);
      const double ratio = p.sigma / p.softplus;
      first[i] = ratio / s;
      weight[i] = std::max(0.0, ratio * ratio - p.sigma_slope / p.softplus) / (s * s);
    }
    g = z.transpose() * first - integrals;
    const Eigen::MatrixXd z_weighted = z.array().colwise() * weight.array();
    h = -(z.transpose() * z_weighted);
    // Correction term -s sp(-u): gradient sigma(-u) z, Hessian -sigma(-u)(1 - sigma(-u))/s z z'.
    std::vector<Eigen::Index> near;
    for (Eigen::Index q = 0; q < eta_grid.size(); ++q) {
      if (eta_grid[q] / s < kSkip) near.push_back(q);
    }
    if (near.empty()) return;
    Eigen::MatrixXd rows(Eigen::Index(near.size()), grid.cols());
    Eigen::VectorXd slope(Eigen::Index(near.size()));
    for (size_t r = 0; r < near.size(); ++r) {
      const SoftplusPoint p = SoftplusAt(-eta_grid[near[r]] / s);
      rows.row(Eigen::Index(r)) = grid.row(near[r]);
      g += w[near[r]] * p.sigma * grid.row(near[r]).transpose();
      slope[Eigen::Index(r)] = w[near[r]] * p.sigma_slope / s;
    }
    const Eigen::MatrixXd rows_weighted = rows.array().colwise() * slope.array();
    h -= rows.transpose() * rows_weighted;
  };
  return f;
}

}  // namespace

HawkesFit HawkesLrTest::Fit(int target, const std::vector<int>& covariates,
                            const Eigen::VectorXd* start) {
  return FitWithHessianHook(target, covariates, start, nullptr);
}

HawkesFit HawkesLrTest::FitKeepingStartHessian(int target, const std::vector<int>& covariates,
                                               const Eigen::VectorXd& start,
                                               Eigen::MatrixXd& hessian_at_start) {
  return FitWithHessianHook(target, covariates, &start, &hessian_at_start);
}

HawkesFit HawkesLrTest::FitWithHessianHook(int target, const std::vector<int>& covariates,
                                           const Eigen::VectorXd* start,
                                           Eigen::MatrixXd* hessian_at_start) {
  const Design d = BuildDesign(target, covariates);
  const double rate = std::max<double>(double(d.z.rows()), 1.0) / features_->data().duration();
  Eigen::VectorXd x0 = Eigen::VectorXd::Zero(d.z.cols());
  Eigen::VectorXd lower = Eigen::VectorXd::Zero(d.z.cols());
  NewtonResult r;
  if (options_.link == HawkesLink::kLinear) {
    x0[0] = rate;
    if (start) x0 = *start;
    ConcaveObjective f = LinearObjective(d.z, d.integrals);
    if (hessian_at_start != nullptr) {
      // The Newton loop's first derivatives are taken at the projected
      // start; keep that Hessian (the p-value needs exactly it).
      f.derivatives = [inner = f.derivatives, hessian_at_start, first = true](
                          const Eigen::VectorXd& x, Eigen::VectorXd& g, Eigen::MatrixXd& h) mutable {
        inner(x, g, h);
        if (first) *hessian_at_start = h;
        first = false;
      };
    }
    r = MaximizeConcave(f, x0, lower);
  } else {
    // eta such that s * softplus(eta / s) equals the mean rate.
    x0[0] = d.scale * std::log(std::expm1(rate / d.scale));
    if (start) x0 = *start;
    lower.setConstant(-std::numeric_limits<double>::infinity());
    r = MaximizeConcave(SoftplusObjective(d.z, d.integrals, d.grid, d.grid_weights, d.scale), x0, lower);
  }
  return HawkesFit{r.x, r.value, r.iterations, r.converged};
}

const HawkesFit& HawkesLrTest::RestrictedFit(int target, const std::vector<int>& given) {
  const auto key = std::make_pair(target, given);
  auto it = restricted_fits_.find(key);
  if (it == restricted_fits_.end()) it = restricted_fits_.emplace(key, Fit(target, given)).first;
  return it->second;
}

TestResult HawkesLrTest::Run(const TestQuery& query) {
  const auto key = std::make_tuple(query.target, query.sources, query.given);
  auto it = cache_.find(key);
  if (it == cache_.end()) it = cache_.emplace(key, Compute(query)).first;
  return it->second;
}

namespace {

// True when the Gram matrix of the event design [1, x(t_i)] is numerically
// rank deficient (eigenvalue ratio below 1e-12 after scaling to unit
// diagonal): the event term carries almost all the curvature of the signed
// model, so its parameters are then not identified.
bool EventDesignSingular(const Eigen::MatrixXd& z) {
  Eigen::MatrixXd gram = z.transpose() * z;
  const Eigen::VectorXd scale = gram.diagonal().cwiseMax(1e-300).cwiseSqrt().cwiseInverse();
  gram = scale.asDiagonal() * gram * scale.asDiagonal();
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(gram, Eigen::EigenvaluesOnly);
  return eig.eigenvalues().minCoeff() <= 1e-12 * eig.eigenvalues().maxCoeff();
}

}  // namespace

TestResult HawkesLrTest::Compute(const TestQuery& q) {
  const sim::EventData& data = features_->data();
  const size_t events = data.times[q.target].size();
  if (events < size_t(options_.min_target_events)) {
    return NotEstimable("too few events: '" + data.names[q.target] + "' has " +
                        std::to_string(events) + ", at least " +
                        std::to_string(options_.min_target_events) + " needed");
  }
  for (int a : q.sources) {
    if (data.times[a].empty()) {
      return NotEstimable("singular design: source '" + data.names[a] + "' has no events");
    }
  }
  const std::vector<int> full = Union(q.sources, q.given);
  if (options_.link == HawkesLink::kSoftplus) {
    Eigen::MatrixXd z(Eigen::Index(events), 1 + Eigen::Index(full.size()) * features_->basis_size());
    z.col(0).setOnes();
    for (size_t c = 0; c < full.size(); ++c) {
      z.middleCols(1 + Eigen::Index(c) * features_->basis_size(), features_->basis_size()) =
          features_->AtEvents(q.target, full[c]);
    }
    if (EventDesignSingular(z)) {
      return NotEstimable("singular design: the history features are collinear");
    }
  }
  const HawkesFit& restricted = RestrictedFit(q.target, q.given);
  if (!restricted.converged) {
    return NotEstimable("failed fit: the restricted model did not converge in " +
                        std::to_string(restricted.iterations) + " iterations");
  }
  // Warm start of the full model: the restricted estimate with theta_A = 0.
  const int k_count = features_->basis_size();
  Eigen::VectorXd start = Eigen::VectorXd::Zero(1 + Eigen::Index(full.size()) * k_count);
  start[0] = restricted.parameters[0];
  for (size_t c = 0; c < q.given.size(); ++c) {
    const auto pos = std::find(full.begin(), full.end(), q.given[c]) - full.begin();
    start.segment(1 + pos * k_count, k_count) =
        restricted.parameters.segment(1 + Eigen::Index(c) * k_count, k_count);
  }
  // The chi-bar-squared weights need the information at the restricted
  // estimate embedded in the full model, which is `start` itself (restricted
  // estimates are >= 0, so projecting it changes nothing): the full fit's
  // first Hessian, bit for bit what a separate evaluation would give.
  Eigen::MatrixXd hessian_at_restricted;
  const HawkesFit full_fit = FitKeepingStartHessian(q.target, full, start, hessian_at_restricted);
  if (!full_fit.converged) {
    return NotEstimable("failed fit: the full model did not converge in " +
                        std::to_string(full_fit.iterations) + " iterations");
  }
  TestResult r;
  r.statistic = std::max(0.0, 2 * (full_fit.log_likelihood - restricted.log_likelihood));
  r.df = double(q.sources.size()) * k_count;
  r.p_value = PValue(q, full, restricted, hessian_at_restricted, r.statistic, r.df);
  return r;
}

double HawkesLrTest::PValue(const TestQuery& q, const std::vector<int>& full,
                            const HawkesFit& restricted, const Eigen::MatrixXd& h,
                            double statistic, double df) {
  if (options_.link != HawkesLink::kLinear || options_.boundary != BoundaryReference::kChiBarSquared) {
    return ChiSquaredSurvival(df, statistic);
  }
  if (statistic <= 0) return 1;
  // Observed information at the restricted estimate, embedded in the full
  // model: -h, kept by the full fit (Compute).
  const int k_count = features_->basis_size();
  Eigen::VectorXd x = Eigen::VectorXd::Zero(h.rows());
  x[0] = restricted.parameters[0];
  std::vector<int> kept;  // coordinates treated as free: mu, positive theta_C, all theta_A
  std::vector<int> tested;
  if (x[0] > 0) kept.push_back(0);
  for (size_t c = 0; c < full.size(); ++c) {
    const bool is_source = std::binary_search(q.sources.begin(), q.sources.end(), full[c]);
    const auto given_pos = std::find(q.given.begin(), q.given.end(), full[c]) - q.given.begin();
    for (int k = 0; k < k_count; ++k) {
      const int col = 1 + int(c) * k_count + k;
      if (is_source) {
        tested.push_back(int(kept.size()));
        kept.push_back(col);
      } else {
        x[col] = restricted.parameters[1 + given_pos * k_count + k];
        if (x[col] > 0) kept.push_back(col);
      }
    }
  }
  Eigen::MatrixXd info(kept.size(), kept.size());
  for (size_t i = 0; i < kept.size(); ++i) {
    for (size_t j = 0; j < kept.size(); ++j) info(i, j) = -h(kept[i], kept[j]);
  }
  Eigen::LDLT<Eigen::MatrixXd> ldlt(info);
  if (ldlt.info() != Eigen::Success || !ldlt.isPositive() || (ldlt.vectorD().array() <= 0).any()) {
    return ChiSquaredSurvival(df, statistic);  // information singular: keep the conservative reference
  }
  const Eigen::MatrixXd cov = ldlt.solve(Eigen::MatrixXd::Identity(info.rows(), info.cols()));
  Eigen::MatrixXd v(tested.size(), tested.size());
  for (size_t i = 0; i < tested.size(); ++i) {
    for (size_t j = 0; j < tested.size(); ++j) v(i, j) = cov(tested[i], tested[j]);
  }
  v = (v + v.transpose()) / 2;
  base::RandomStream random(base::StreamKey{options_.seed, uint64_t(q.target),
                                              HashList(q.sources), HashList(q.given)});
  return ChiBarSquaredSurvival(ChiBarSquaredWeights(v, options_.chi_bar_draws, random), statistic);
}

}  // namespace locind::learners
