#include "learners/methods/penalized_fit_learner.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

#include "graph/bit_graph.h"
#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_features.h"
#include "learners/independence/projected_newton.h"
#include "learners/methods/test_runner.h"
#include "sim/event_data.h"
#include "sim/path_data.h"

namespace locind::learners {
namespace {

using Eigen::MatrixXd;
using Eigen::VectorXd;

// The design of b's intensity: column 0 ones (mu), then x_jk at b's events.
struct HawkesDesign {
  MatrixXd z;          // events x (1 + n K)
  VectorXd integrals;  // duration, then int x_jk
};

HawkesDesign BuildHawkesDesign(HawkesFeatures& f, int b) {
  const int n = f.data().processes();
  const int k = f.basis_size();
  const Eigen::Index events = static_cast<Eigen::Index>(f.data().times[b].size());
  HawkesDesign d{MatrixXd(events, 1 + n * k), VectorXd(1 + n * k)};
  d.z.col(0).setOnes();
  d.integrals[0] = f.data().duration();
  for (int j = 0; j < n; ++j) {
    d.z.middleCols(1 + j * k, k) = f.AtEvents(b, j);
    d.integrals.segment(1 + j * k, k) = f.Integrals(j);
  }
  return d;
}

// The sources j with a selected coefficient in b's penalized fit; fails when
// the fit does not converge.
Result<std::vector<int>> HawkesParents(HawkesFeatures& f, int b, double scale) {
  const int n = f.data().processes();
  const int k = f.basis_size();
  const HawkesDesign d = BuildHawkesDesign(f, b);
  const Eigen::Index events = d.z.rows();
  if (events < 2) return std::vector<int>{};
  const double lambda0 = events / f.data().duration();
  const Eigen::Index p = d.z.cols();
  VectorXd weight = VectorXd::Zero(p);
  const double universal = std::sqrt(2 * std::log(std::max(2, n * k)));
  for (Eigen::Index c = 1; c < p; ++c) {
    weight[c] = scale * universal * d.z.col(c).norm() / lambda0;
  }
  ConcaveObjective objective;
  objective.value = [&](const VectorXd& x) {
    const VectorXd rate = d.z * x;
    if (rate.minCoeff() <= 0) return -std::numeric_limits<double>::infinity();
    return rate.array().log().sum() - d.integrals.dot(x) - weight.dot(x);
  };
  objective.derivatives = [&](const VectorXd& x, VectorXd& gradient, MatrixXd& hessian) {
    const VectorXd inverse = (d.z * x).cwiseInverse();
    gradient = d.z.transpose() * inverse - d.integrals - weight;
    hessian = -(d.z.transpose() * inverse.cwiseAbs2().asDiagonal() * d.z);
  };
  VectorXd start = VectorXd::Zero(p);
  start[0] = lambda0;
  VectorXd lower = VectorXd::Zero(p);
  lower[0] = 1e-9 * lambda0;
  const NewtonResult fit = MaximizeConcave(objective, start, lower);
  if (!fit.converged) {
    return Status::Error("penalized-fit: the penalized likelihood fit of process " +
                         f.data().names[b] + " did not converge");
  }
  // Selected: the coefficient carries more than a 1e-6 share of the base rate.
  std::vector<int> parents;
  for (int j = 0; j < n; ++j) {
    for (int r = 0; r < k; ++r) {
      const Eigen::Index c = 1 + j * k + r;
      if (fit.x[c] * d.z.col(c).mean() > 1e-6 * lambda0) {
        parents.push_back(j);
        break;
      }
    }
  }
  return parents;
}

double SoftThreshold(double z, double t) {
  return z > t ? z - t : (z < -t ? z + t : 0.0);
}

// Lasso by cyclic coordinate descent; penalty[c] per column (0: free).
VectorXd Lasso(const MatrixXd& x, const VectorXd& y, const VectorXd& penalty) {
  const Eigen::Index p = x.cols();
  VectorXd beta = VectorXd::Zero(p);
  VectorXd residual = y;
  const VectorXd squared = x.colwise().squaredNorm();
  for (int sweep = 0; sweep < 10000; ++sweep) {
    double largest_change = 0;
    for (Eigen::Index c = 0; c < p; ++c) {
      if (squared[c] <= 0) continue;
      const double z = x.col(c).dot(residual) + squared[c] * beta[c];
      const double updated = SoftThreshold(z, penalty[c]) / squared[c];
      const double change = updated - beta[c];
      if (change != 0) {
        residual -= change * x.col(c);
        beta[c] = updated;
        largest_change = std::max(largest_change, std::abs(change) * std::sqrt(squared[c]));
      }
    }
    if (largest_change <= 1e-10 * (1 + y.norm())) break;
  }
  return beta;
}

// Fails when there are too few increments for the noise scale that sets the
// penalty (the same rule as the drift test: at least coefficients + 10).
Result<std::vector<int>> DriftParents(DriftTest& test, int b, double scale) {
  const int n = test.processes();
  std::vector<int> all(n);
  for (int j = 0; j < n; ++j) all[j] = j;
  MatrixXd x = test.Design(all);
  const VectorXd y = test.Response(b);
  const Eigen::Index rows = x.rows();
  const Eigen::Index p = x.cols();
  if (n < 1 || rows < p + 10) {
    return Status::Error("penalized-fit: " + std::to_string(rows) + " increments are too few for " +
                         std::to_string(p) + " coefficients (need at least " +
                         std::to_string(p + 10) + ")");
  }
  const int width = static_cast<int>((p - 1) / n);
  // Scale the penalized columns to unit root mean square.
  for (Eigen::Index c = 1; c < p; ++c) {
    const double rms = x.col(c).norm() / std::sqrt(double(rows));
    if (rms > 0) x.col(c) /= rms;
  }
  const LeastSquares ols = FitLeastSquares(x, y);
  const double dof = std::max<double>(1, double(rows - ols.rank));
  const double sigma = std::sqrt(ols.rss / dof);
  const double lambda = scale * sigma * std::sqrt(2 * rows * std::log(double(p)));
  VectorXd penalty = VectorXd::Constant(p, lambda);
  penalty[0] = 0;
  const VectorXd beta = Lasso(x, y, penalty);
  std::vector<int> parents;
  for (int j = 0; j < n; ++j) {
    if (beta.segment(1 + j * width, width).cwiseAbs().maxCoeff() > 0) parents.push_back(j);
  }
  return parents;
}

}  // namespace

Result<LearnResult> PenalizedFitLearner::Learn(const LearnInput& input) {
  if (input.events == nullptr && input.paths == nullptr) {
    return Status::Error("penalized-fit needs data (event streams or paths), not a test");
  }
  const auto start = std::chrono::steady_clock::now();
  LearnResult result;
  result.method = "penalized-fit";
  result.test_kind = "none";
  std::vector<std::vector<int>> parents;
  std::vector<std::string> names;
  // Targets whose fit cannot be made, with the reason: the policy of
  // learner.h, as for a test that could not be computed: every edge into
  // such a target is kept and marked undecided.
  std::vector<std::string> unfit;
  if (input.events != nullptr) {
    Result<HawkesFeatures> f =
        HawkesFeatures::Create(*input.events, DefaultHawkesRates(*input.events));
    if (!f.ok()) return f.status();
    names = input.events->names;
    unfit.resize(names.size());
    for (int b = 0; b < input.events->processes(); ++b) {
      const size_t events = input.events->times[b].size();
      if (events < 2) {
        unfit[b] = names[b] + " has " + std::to_string(events) +
                   (events == 1 ? " event" : " events") + "; its intensity fit needs at least 2";
        parents.emplace_back();
        for (int j = 0; j < input.events->processes(); ++j) parents.back().push_back(j);
        continue;
      }
      Result<std::vector<int>> found = HawkesParents(f.value(), b, scale_);
      if (!found.ok()) return found.status();
      parents.push_back(*found);
    }
  } else {
    Result<DriftTest> test = DriftTest::Create(*input.paths);
    if (!test.ok()) return test.status();
    names = input.paths->names;
    for (int b = 0; b < input.paths->processes(); ++b) {
      Result<std::vector<int>> found = DriftParents(test.value(), b, scale_);
      if (!found.ok()) return found.status();
      parents.push_back(*found);
    }
  }
  result.graph = graph::Dmg(names);
  for (size_t b = 0; b < parents.size(); ++b) {
    for (int j : parents[b]) result.graph.AddDirected(j, static_cast<int>(b));
  }
  // No tests: every directed pair is decided by its fitted coefficients, or
  // undecided when its target's fit could not be made (the witness is that
  // fit, as a not-estimable record of b from a given the others).
  const int n = static_cast<int>(parents.size());
  unfit.resize(n);
  const auto undecided_targets =
      std::count_if(unfit.begin(), unfit.end(), [](const std::string& why) { return !why.empty(); });
  for (int a = 0; a < n; ++a) {
    for (int b = 0; b < n; ++b) {
      if (!unfit[b].empty()) {
        TestRecord w;
        w.target = b;
        w.sources = {a};
        for (int c = 0; c < n; ++c) {
          if (c != a) w.given.push_back(c);
        }
        w.statistic = w.df = w.p_value = std::numeric_limits<double>::quiet_NaN();
        w.status = TestStatus::kNotEstimable;
        w.reason = unfit[b];
        EdgeDecision d = MakeDecision({a, b, graph::EdgeKind::kDirected}, true, "fit", "not estimable", {w});
        d.undecided = true;
        result.decisions.push_back(d);
        continue;
      }
      const bool kept = result.graph.HasDirected(a, b);
      result.decisions.push_back(MakeDecision({a, b, graph::EdgeKind::kDirected}, kept, "fit",
                                              kept ? "nonzero coefficient" : "zero coefficient"));
    }
  }
  for (int a = 0; a < n; ++a) {
    for (int b = a + 1; b < n; ++b) {
      result.decisions.push_back(
          MakeDecision({a, b, graph::EdgeKind::kBidirected}, false, "fit", "never considered"));
    }
  }
  std::ostringstream note;
  note << "penalty scale " << scale_;
  if (undecided_targets > 0) {
    note << "; warning: " << undecided_targets << " of " << n
         << " fits not estimable, every edge into them kept as undecided:";
    for (const std::string& why : unfit) {
      if (!why.empty()) note << " " << why << ";";
    }
  }
  result.note = note.str();
  FinishDecisions(result);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
