// Ogata thinning (Ogata 1981, IEEE Trans. Inf. Theory 27(1), Algorithm 2)
// for Hawkes processes whose kernels are sums of exponentials.
//
// Every exponential term with decay beta contributes to its target a state
// that decays like exp(-beta t) and jumps by w beta at each event of the
// source. States sharing a decay are kept together in one "decay group".
//
// Linear link: the total intensity only falls between events, so its value
// right after the last event (or proposal) bounds it until the next one. The
// states of a group are stored multiplied by exp(beta (t - epoch)), so they
// need no update while they decay; an event adds its jumps to the targets in
// O(out-degree * terms) and a Fenwick tree per group picks the node of an
// accepted point in O(log n). The epoch moves forward (an O(n) rescale)
// before the factor reaches e^200.
//
// Nonlinear links: lambda_b = link(mu_b + excitation - inhibition) with a
// non-decreasing link; positive states decay and negative states rise
// toward zero, so link(mu_b + positive states at t) bounds lambda_b after t
// until the next event. Each proposal updates all states (O(n * groups)).
#include <cmath>

#include <boost/random/exponential_distribution.hpp>

#include "sim/hawkes_methods.h"

namespace locind::sim {
namespace {

constexpr double kRescaleExponent = 200;

// Sums over a fixed set of non-negative weights with point updates and
// search by cumulative weight (Fenwick 1994, Softw. Pract. Exper. 24(3)).
// The tree is padded to a power of two so the search runs without
// data-dependent branches (mispredicted branches dominate a binary search).
class FenwickTree {
 public:
  explicit FenwickTree(int n) : n_(n) {
    while (size_ < n + 1) size_ *= 2;
    tree_.assign(size_, 0.0);
  }
  void Add(int i, double delta) {
    for (int j = i + 1; j < size_; j += j & -j) tree_[j] += delta;
  }
  void Rebuild(const std::vector<double>& values) {
    std::fill(tree_.begin(), tree_.end(), 0.0);
    for (size_t i = 0; i < values.size(); ++i) Add(static_cast<int>(i), values[i]);
  }
  // The smallest i whose cumulative weight up to and including i exceeds v
  // (clamped to the last index).
  int Find(double v) const {
    int pos = 0;
    for (int step = size_ / 2; step > 0; step >>= 1) {
      const double w = tree_[pos + step];
      const int right = w <= v;  // 0 or 1; arithmetic instead of a branch
      pos += step & -right;
      v -= w * right;
    }
    return std::min(pos, n_ - 1);
  }

 private:
  int n_;
  int size_ = 1;
  std::vector<double> tree_;
};

// Walker's alias table (Walker 1977, ACM Trans. Math. Softw. 3(3)): picks
// index i with probability weight_i / sum in O(1) from one uniform.
class AliasTable {
 public:
  explicit AliasTable(const std::vector<double>& weights)
      : n_(static_cast<int>(weights.size())), keep_(n_, 1.0), alias_(n_) {
    double total = 0;
    for (double w : weights) total += w;
    if (total <= 0) return;
    std::vector<double> scaled(n_);
    std::vector<int> small, large;
    for (int i = 0; i < n_; ++i) {
      alias_[i] = i;
      scaled[i] = weights[i] * n_ / total;
      (scaled[i] < 1 ? small : large).push_back(i);
    }
    while (!small.empty() && !large.empty()) {
      const int s = small.back(), l = large.back();
      small.pop_back();
      keep_[s] = scaled[s];
      alias_[s] = l;
      scaled[l] -= 1 - scaled[s];
      if (scaled[l] < 1) {
        large.pop_back();
        small.push_back(l);
      }
    }
  }
  // REQUIRES: 0 <= u < 1.
  int Pick(double u) const {
    const double x = u * n_;
    const int i = std::min(static_cast<int>(x), n_ - 1);
    return (x - i) < keep_[i] ? i : alias_[i];
  }

 private:
  int n_;
  std::vector<double> keep_;
  std::vector<int> alias_;
};

// A jump of size `amount` (= w beta) in group `group` of node `to`.
struct Push {
  int to = 0;
  int group = 0;
  double amount = 0;
};

struct Recursion {
  std::vector<double> decay;               // per group
  std::vector<std::vector<Push>> pushes;   // per source node
};

Recursion BuildRecursion(const HawkesModel& model) {
  Recursion r;
  r.pushes.resize(model.nodes());
  for (const EdgeKernel& e : model.kernels) {
    for (const ExpTerm& term : e.kernel.terms) {
      if (term.weight == 0) continue;
      auto it = std::find(r.decay.begin(), r.decay.end(), term.decay);
      const int group = static_cast<int>(it - r.decay.begin());
      if (it == r.decay.end()) r.decay.push_back(term.decay);
      r.pushes[e.from].push_back(Push{e.to, group, term.weight * term.decay});
    }
  }
  return r;
}

class LinearThinning {
 public:
  LinearThinning(const HawkesModel& model, const HawkesRunOptions& options,
                 base::RandomStream& random)
      : options_(options), random_(random), rec_(BuildRecursion(model)), n_(model.nodes()),
        base_pick_(model.baseline) {
    for (double mu : model.baseline) base_total_ += mu;
    const size_t groups = rec_.decay.size();
    epoch_.assign(groups, -options.burn_in);
    scaled_.assign(groups, std::vector<double>(n_, 0.0));
    total_.assign(groups, 0.0);
    factor_.assign(groups, 1.0);
    inverse_.assign(groups, 1.0);
    part_.assign(groups, 0.0);
    trees_.assign(groups, FenwickTree(n_));
  }

  Result<NodeTimes> Run(const HawkesModel& model) {
    NodeTimes times(n_);
    ReserveExpected(model, times);
    boost::random::exponential_distribution<double> exponential(1.0);
    int64_t count = 0;
    double t = -options_.burn_in;
    double bound = base_total_;
    while (bound > 0) {
      t += exponential(random_.engine()) / bound;
      if (t >= options_.horizon) break;
      ++proposals_;
      const double intensity = IntensityAt(t);
      const double v = random_.Uniform() * bound;
      if (v >= intensity) {  // rejected: the intensity at t bounds what follows
        bound = intensity;
        continue;
      }
      if (++count > options_.event_cap) return EventCapReached(options_, t);
      const int node = Select(v);
      times[node].push_back(t);
      bound = intensity + Excite(node);
    }
    if (options_.stats) *options_.stats = HawkesRunStats{count, proposals_};
    return times;
  }

 private:
  // Room for about the stationary number of events (Hawkes 1971), so the
  // vectors do not grow by copying.
  void ReserveExpected(const HawkesModel& model, NodeTimes& times) const {
    // (I - K)^{-1} mu by LU only: the eigenvalue check was made by the caller
    // (or waived, and then a meaningless solution is skipped below).
    const Eigen::VectorXd mu = Eigen::Map<const Eigen::VectorXd>(model.baseline.data(), n_);
    const Eigen::MatrixXd a = Eigen::MatrixXd::Identity(n_, n_) - model.KernelIntegrals();
    const Eigen::VectorXd rate = a.partialPivLu().solve(mu);
    const double length = options_.horizon + options_.burn_in;
    for (int v = 0; v < n_; ++v) {
      if (!std::isfinite(rate(v)) || rate(v) < 0) continue;
      const double expected = std::min<double>(1.05 * rate(v) * length + 16, 1e8);
      times[v].reserve(static_cast<size_t>(std::min<double>(expected, options_.event_cap)));
    }
  }

  // Total intensity at t; sets factor_ and part_ for Select.
  double IntensityAt(double t) {
    double sum = base_total_;
    for (size_t d = 0; d < rec_.decay.size(); ++d) {
      double x = rec_.decay[d] * (t - epoch_[d]);
      if (x > kRescaleExponent) {
        Rescale(d, t);
        x = 0;
      }
      factor_[d] = std::exp(-x);
      part_[d] = factor_[d] * total_[d];
      sum += part_[d];
    }
    return sum;
  }

  void Rescale(size_t d, double t) {
    const double s = std::exp(-rec_.decay[d] * (t - epoch_[d]));
    total_[d] = 0;
    for (double& z : scaled_[d]) total_[d] += (z *= s);
    trees_[d].Rebuild(scaled_[d]);
    epoch_[d] = t;
  }

  // The node whose share of the total intensity contains v.
  int Select(double v) const {
    // Given acceptance, v is uniform on [0, intensity), so v / base_total
    // is uniform on [0, 1) when v falls in the baseline share.
    if (v < base_total_) return base_pick_.Pick(v / base_total_);
    v -= base_total_;
    if (rec_.decay.empty()) return n_ - 1;
    const size_t last = rec_.decay.size() - 1;
    for (size_t d = 0;; ++d) {
      if (v < part_[d] || d == last) return trees_[d].Find(v / factor_[d]);
      v -= part_[d];
    }
  }

  // Adds the jumps caused by an event of `node`; returns their total.
  double Excite(int node) {
    for (size_t d = 0; d < factor_.size(); ++d) inverse_[d] = 1 / factor_[d];
    double jump = 0;
    for (const Push& p : rec_.pushes[node]) {
      const double z = p.amount * inverse_[p.group];
      scaled_[p.group][p.to] += z;
      total_[p.group] += z;
      trees_[p.group].Add(p.to, z);
      jump += p.amount;
    }
    return jump;
  }

  const HawkesRunOptions& options_;
  base::RandomStream& random_;
  Recursion rec_;
  int n_;
  AliasTable base_pick_;
  double base_total_ = 0;
  std::vector<double> epoch_;                // per group
  std::vector<std::vector<double>> scaled_;  // per group, per node
  std::vector<double> total_;                // per group: sum of scaled_
  std::vector<double> factor_;               // per group: exp(-beta (t - epoch))
  std::vector<double> inverse_;              // per group: 1 / factor_
  std::vector<double> part_;                 // per group: factor * total
  std::vector<FenwickTree> trees_;
  int64_t proposals_ = 0;
};

double ApplyLink(Link link, double x) {
  if (link == Link::kRectified) return x > 0 ? x : 0;
  // softplus, written to avoid overflow for large x
  return x > 0 ? x + std::log1p(std::exp(-x)) : std::log1p(std::exp(x));
}

class NonlinearThinning {
 public:
  NonlinearThinning(const HawkesModel& model, const HawkesRunOptions& options,
                    base::RandomStream& random)
      : model_(model), options_(options), random_(random), rec_(BuildRecursion(model)),
        n_(model.nodes()), groups_(rec_.decay.size()) {
    excite_.assign(n_ * groups_, 0.0);
    inhibit_.assign(n_ * groups_, 0.0);
    intensity_.assign(n_, 0.0);
    step_.assign(groups_, 1.0);
  }

  Result<NodeTimes> Run() {
    NodeTimes times(n_);
    boost::random::exponential_distribution<double> exponential(1.0);
    int64_t count = 0;
    double t = -options_.burn_in;
    double bound = Bound();
    while (bound > 0) {
      const double next = t + exponential(random_.engine()) / bound;
      if (next >= options_.horizon) break;
      ++proposals_;
      Decay(next - t);
      t = next;
      const double total = Intensities();
      double v = random_.Uniform() * bound;
      if (v < total) {
        if (++count > options_.event_cap) return EventCapReached(options_, t);
        int node = 0;
        while (node < n_ - 1 && v >= intensity_[node]) v -= intensity_[node++];
        times[node].push_back(t);
        Excite(node);
      }
      bound = Bound();
    }
    if (options_.stats) *options_.stats = HawkesRunStats{count, proposals_};
    return times;
  }

 private:
  void Decay(double dt) {
    for (size_t d = 0; d < groups_; ++d) step_[d] = std::exp(-rec_.decay[d] * dt);
    for (int b = 0; b < n_; ++b) {
      for (size_t d = 0; d < groups_; ++d) {
        excite_[b * groups_ + d] *= step_[d];
        inhibit_[b * groups_ + d] *= step_[d];
      }
    }
  }

  double Intensities() {
    double total = 0;
    for (int b = 0; b < n_; ++b) {
      double x = model_.baseline[b];
      for (size_t d = 0; d < groups_; ++d) x += excite_[b * groups_ + d] - inhibit_[b * groups_ + d];
      total += intensity_[b] = ApplyLink(model_.link, x);
    }
    return total;
  }

  double Bound() const {
    double total = 0;
    for (int b = 0; b < n_; ++b) {
      double x = model_.baseline[b];
      for (size_t d = 0; d < groups_; ++d) x += excite_[b * groups_ + d];
      total += ApplyLink(model_.link, x);
    }
    return total;
  }

  void Excite(int node) {
    for (const Push& p : rec_.pushes[node]) {
      if (p.amount > 0) {
        excite_[p.to * groups_ + p.group] += p.amount;
      } else {
        inhibit_[p.to * groups_ + p.group] -= p.amount;
      }
    }
  }

  const HawkesModel& model_;
  const HawkesRunOptions& options_;
  base::RandomStream& random_;
  Recursion rec_;
  int n_;
  size_t groups_;
  std::vector<double> excite_;   // node-major, per group: positive states
  std::vector<double> inhibit_;  // node-major, per group: magnitudes of negative states
  std::vector<double> intensity_;
  std::vector<double> step_;
  int64_t proposals_ = 0;
};

}  // namespace

Result<NodeTimes> SimulateByThinning(const HawkesModel& model, const HawkesRunOptions& options,
                                     base::RandomStream& random) {
  if (model.link == Link::kLinear) return LinearThinning(model, options, random).Run(model);
  return NonlinearThinning(model, options, random).Run();
}

}  // namespace locind::sim
