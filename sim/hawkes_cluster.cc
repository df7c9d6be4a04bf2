// The immigrant-offspring (cluster) construction of a linear Hawkes process
// (Hawkes & Oakes 1974, J. Appl. Probab. 11(3); Moller & Rasmussen 2005,
// Adv. Appl. Probab. 37(3)). Immigrants of node v arrive as a Poisson process
// of rate mu_v on [-burn_in, horizon); every event of node a has, for each
// edge a -> b, Poisson(K_ba) children of node b placed at the parent's time
// plus an independent delay with density g_ba / K_ba. Children after the
// horizon are dropped with their descendants, which would come later still.
#include <algorithm>

#include <boost/random/exponential_distribution.hpp>
#include <boost/random/gamma_distribution.hpp>
#include <boost/random/poisson_distribution.hpp>
#include <boost/random/uniform_real_distribution.hpp>

#include "sim/hawkes_methods.h"

namespace locind::sim {
namespace {

struct Offspring {
  int to = 0;
  const Kernel* kernel = nullptr;
  boost::random::poisson_distribution<int, double> count;
  std::vector<double> cumulative_weight;  // exponential families: mixture weights
};

std::vector<std::vector<Offspring>> BuildOffspring(const HawkesModel& model) {
  std::vector<std::vector<Offspring>> out(model.nodes());
  for (const EdgeKernel& e : model.kernels) {
    const double mean = e.kernel.Integral();
    if (mean <= 0) continue;
    Offspring o{e.to, &e.kernel, boost::random::poisson_distribution<int, double>(mean), {}};
    double sum = 0;
    for (const ExpTerm& t : e.kernel.terms) o.cumulative_weight.push_back(sum += t.weight);
    out[e.from].push_back(std::move(o));
  }
  return out;
}

// A delay drawn from the normalised kernel density.
double DrawDelay(const Offspring& o, base::RandomStream& random) {
  const Kernel& k = *o.kernel;
  if (k.family == KernelFamily::kDelayedGamma) {
    boost::random::gamma_distribution<double> gamma(k.shape, 1.0 / k.rate);
    return k.delay + gamma(random.engine());
  }
  size_t j = 0;
  if (k.terms.size() > 1) {
    const double v = random.Uniform() * o.cumulative_weight.back();
    j = std::upper_bound(o.cumulative_weight.begin(), o.cumulative_weight.end(), v) -
        o.cumulative_weight.begin();
    j = std::min(j, k.terms.size() - 1);
  }
  boost::random::exponential_distribution<double> exponential(k.terms[j].decay);
  return exponential(random.engine());
}

struct Event {
  double time;
  int node;
};

}  // namespace

Result<NodeTimes> SimulateByClusters(const HawkesModel& model, const HawkesRunOptions& options,
                                     base::RandomStream& random) {
  std::vector<std::vector<Offspring>> offspring = BuildOffspring(model);
  const double start = -options.burn_in;
  const double length = options.horizon - start;
  NodeTimes times(model.nodes());
  std::vector<Event> pending;
  int64_t count = 0;
  boost::random::uniform_real_distribution<double> when(start, options.horizon);
  for (int v = 0; v < model.nodes(); ++v) {
    const double mean = model.baseline[v] * length;
    if (mean <= 0) continue;
    const int64_t immigrants = boost::random::poisson_distribution<int64_t, double>(mean)(random.engine());
    if ((count += immigrants) > options.event_cap) return EventCapReached(options, options.horizon);
    for (int64_t i = 0; i < immigrants; ++i) pending.push_back(Event{when(random.engine()), v});
  }
  while (!pending.empty()) {
    const Event parent = pending.back();
    pending.pop_back();
    times[parent.node].push_back(parent.time);
    for (Offspring& o : offspring[parent.node]) {
      const int children = o.count(random.engine());
      for (int c = 0; c < children; ++c) {
        const double t = parent.time + DrawDelay(o, random);
        if (t >= options.horizon) continue;
        if (++count > options.event_cap) return EventCapReached(options, t);
        pending.push_back(Event{t, o.to});
      }
    }
  }
  for (auto& t : times) std::sort(t.begin(), t.end());
  if (options.stats) *options.stats = HawkesRunStats{count, 0};
  return times;
}

}  // namespace locind::sim
