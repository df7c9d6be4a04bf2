#include "sim/hawkes_compensator.h"

#include <algorithm>
#include <cmath>

namespace locind::sim {
namespace {

// A lag beyond which the kernel's cumulative integral equals its total to
// double precision (tails below e^-40 of the weight).
double SaturationLag(const Kernel& k) {
  if (k.family == KernelFamily::kDelayedGamma) {
    return k.delay + (k.shape + 40 * std::sqrt(k.shape) + 40) / k.rate;
  }
  double lag = 0;
  for (const ExpTerm& t : k.terms) lag = std::max(lag, 40 / t.decay);
  return lag;
}

// Sum over source events s < t of G(t - s), for sorted `targets` t.
std::vector<double> KernelSums(const Kernel& k, const std::vector<double>& sources,
                               const std::vector<double>& targets) {
  const double lag = SaturationLag(k);
  const double total = k.Integral();
  std::vector<double> out(targets.size(), 0.0);
  size_t saturated = 0;  // sources with s <= t - lag
  for (size_t i = 0; i < targets.size(); ++i) {
    const double t = targets[i];
    while (saturated < sources.size() && sources[saturated] <= t - lag) ++saturated;
    double sum = total * static_cast<double>(saturated);
    for (size_t j = saturated; j < sources.size() && sources[j] < t; ++j) {
      sum += k.Cumulative(t - sources[j]);
    }
    out[i] = sum;
  }
  return out;
}

}  // namespace

Result<std::vector<std::vector<double>>> CompensatorAtEvents(const HawkesModel& model,
                                                             const EventData& data) {
  if (model.link != Link::kLinear) {
    return Status::Error("the closed-form compensator needs the linear link");
  }
  if (data.processes() != model.nodes()) {
    return Status::Error("the data must hold every node of the model");
  }
  for (int v = 0; v < model.nodes(); ++v) {
    if (data.names[v] != model.truth.graph.name(v)) {
      return Status::Error("process " + data.names[v] + " is not node " +
                           model.truth.graph.name(v) + " of the model");
    }
  }
  std::vector<std::vector<double>> out(model.nodes());
  for (int b = 0; b < model.nodes(); ++b) {
    for (double t : data.times[b]) out[b].push_back(model.baseline[b] * (t - data.start));
  }
  for (const EdgeKernel& e : model.kernels) {
    const std::vector<double> sums = KernelSums(e.kernel, data.times[e.from], data.times[e.to]);
    for (size_t i = 0; i < sums.size(); ++i) out[e.to][i] += sums[i];
  }
  return out;
}

}  // namespace locind::sim
