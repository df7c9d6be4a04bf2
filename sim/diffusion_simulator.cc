#include "sim/diffusion_simulator.h"

#include <cmath>
#include <string>

#include <boost/random/normal_distribution.hpp>

#include "sim/euler_maruyama.h"
#include "sim/ou_transition.h"

namespace locind::sim {
namespace {

// The drift with the couplings stored by row (truth graphs are sparse), so a
// step costs O(nodes + edges).
class SparseDrift {
 public:
  explicit SparseDrift(const DiffusionModel& model)
      : tanh_(model.drift == DriftFamily::kTanh), c_(model.c), self_(model.M.diagonal()),
        saturated_(model.nodes()) {
    const int n = model.nodes();
    row_start_.push_back(0);
    for (int b = 0; b < n; ++b) {
      for (int a = 0; a < n; ++a) {
        if (a != b && model.M(b, a) != 0) {
          column_.push_back(a);
          value_.push_back(model.M(b, a));
        }
      }
      row_start_.push_back(static_cast<int>(column_.size()));
    }
  }

  void operator()(const Eigen::VectorXd& x, Eigen::VectorXd& out) const {
    const double* in = x.data();
    if (tanh_) {
      saturated_ = x.array().tanh().matrix();
      in = saturated_.data();
    }
    const int n = static_cast<int>(x.size());
    for (int b = 0; b < n; ++b) {
      double s = c_[b] + self_[b] * x[b];
      for (int k = row_start_[b]; k < row_start_[b + 1]; ++k) s += value_[k] * in[column_[k]];
      out[b] = s;
    }
  }

 private:
  bool tanh_;
  Eigen::VectorXd c_, self_;
  mutable Eigen::VectorXd saturated_;
  std::vector<int> row_start_, column_;
  std::vector<double> value_;
};

struct Grid {
  int samples = 0;         // recorded times 0, interval, ...
  int burn_intervals = 0;  // intervals simulated before time 0
  int steps = 1;           // Euler steps per interval
};

Result<Grid> MakeGrid(const PathRunOptions& o, int nodes) {
  for (double v : {o.horizon, o.step, o.interval}) {
    if (!std::isfinite(v) || v <= 0) return Status::Error("horizon, step and interval must be > 0");
  }
  if (!std::isfinite(o.burn_in) || o.burn_in < 0) return Status::Error("burn-in must be >= 0");
  if (o.initial.size() != 0 && (o.initial.size() != nodes || !o.initial.allFinite())) {
    return Status::Error("the initial state needs one finite value per node");
  }
  Grid g;
  const double ratio = o.interval / o.step;
  g.steps = static_cast<int>(std::llround(ratio));
  if (g.steps < 1 || std::abs(g.steps - ratio) > 1e-9 * ratio) {
    return Status::Error("the interval " + std::to_string(o.interval) +
                         " is not a multiple of the step " + std::to_string(o.step));
  }
  const double samples = std::floor(o.horizon / o.interval + 1e-9) + 1;
  const double burn = std::ceil(o.burn_in / o.interval - 1e-9);
  if (samples > 1e9 || burn > 1e9) return Status::Error("too many grid points");
  g.samples = static_cast<int>(samples);
  g.burn_intervals = static_cast<int>(burn);
  return g;
}

// Advances x over one observation interval.
class Stepper {
 public:
  Stepper(const DiffusionModel& model, const Grid& grid, double h, base::RandomStream& random)
      : model_(model), grid_(grid), h_(h), random_(random), drift_(model),
        dw_(model.nodes()), f_(model.nodes()), g_(model.nodes()) {}

  Status UseExact(double interval) {
    Result<OuTransition> t = ExactTransition(model_.M, model_.c, model_.sigma, interval);
    if (!t.ok()) return t.status();
    exact_ = std::move(t.value());
    use_exact_ = true;
    return Status::Ok();
  }

  void Advance(Eigen::VectorXd& x) {
    if (use_exact_) {
      Draw(1.0);
      x = exact_.F * x + exact_.offset + exact_.noise_factor * dw_;
      return;
    }
    const double root_h = std::sqrt(h_);
    const auto noise = [this](const Eigen::VectorXd&, Eigen::VectorXd& out) { out = model_.sigma; };
    for (int s = 0; s < grid_.steps; ++s) {
      Draw(root_h);
      EulerMaruyamaStep(drift_, noise, h_, dw_, x, f_, g_);
    }
  }

 private:
  void Draw(double scale) {
    for (Eigen::Index i = 0; i < dw_.size(); ++i) dw_[i] = scale * normal_(random_.engine());
  }

  const DiffusionModel& model_;
  const Grid& grid_;
  double h_;
  base::RandomStream& random_;
  SparseDrift drift_;
  boost::random::normal_distribution<double> normal_;
  Eigen::VectorXd dw_, f_, g_;
  bool use_exact_ = false;
  OuTransition exact_;
};

}  // namespace

Result<PathData> SimulateDiffusion(const DiffusionModel& model, const PathRunOptions& options,
                                   base::RandomStream& random) {
  if (Status s = Validate(model); !s.ok()) return s;
  Result<Grid> grid = MakeGrid(options, model.nodes());
  if (!grid.ok()) return grid.status();
  if (options.require_stable) {
    if (Status s = CheckStable(model); !s.ok()) return s;
  }
  Stepper stepper(model, *grid, options.step, random);
  if (options.method == PathMethod::kExact) {
    if (model.drift != DriftFamily::kLinear) {
      return Status::Error("the exact transition needs the linear drift; use euler");
    }
    if (Status s = stepper.UseExact(options.interval); !s.ok()) return s;
  }
  Eigen::VectorXd x = options.initial.size() ? options.initial : Eigen::VectorXd::Zero(model.nodes());
  for (int k = 0; k < grid->burn_intervals; ++k) stepper.Advance(x);
  const std::vector<int> observed = model.truth.Observed();
  PathData data;
  for (int v : observed) data.names.push_back(model.truth.graph.name(v));
  data.values.resize(grid->samples, static_cast<Eigen::Index>(observed.size()));
  for (int k = 0; k < grid->samples; ++k) {
    if (k > 0) stepper.Advance(x);
    if (!x.allFinite()) {
      return Status::Error("the state left the finite numbers at time " +
                           std::to_string(k * options.interval) + "; the model is unstable or "
                           "the step too long");
    }
    data.time.push_back(k * options.interval);
    for (size_t j = 0; j < observed.size(); ++j) data.values(k, j) = x[observed[j]];
  }
  return data;
}

const char* PathMethodName(PathMethod method) {
  return method == PathMethod::kEuler ? "euler" : "exact";
}

Result<PathData> SimulateDiffusionTrials(const DiffusionModel& model, const PathRunOptions& options,
                                         int trials, base::RandomStream& random) {
  PathData out;
  for (int k = 0; k < trials; ++k) {
    Result<PathData> one = SimulateDiffusion(model, options, random);
    if (!one.ok()) return one.status();
    AppendTrial(out, one.value());
  }
  return out;
}

}  // namespace locind::sim
