#include "sim/hawkes_simulator.h"

#include <algorithm>
#include <cmath>
#include <string>

#include "sim/hawkes_methods.h"

namespace locind::sim {
namespace {

Status ValidateOptions(const HawkesRunOptions& options) {
  if (!std::isfinite(options.horizon) || options.horizon <= 0) {
    return Status::Error("horizon must be finite and > 0");
  }
  if (!std::isfinite(options.burn_in) || options.burn_in < 0) {
    return Status::Error("burn-in must be finite and >= 0");
  }
  if (options.event_cap <= 0) return Status::Error("event cap must be > 0");
  return Status::Ok();
}

bool AllExponentialFamilies(const HawkesModel& model) {
  for (const EdgeKernel& e : model.kernels) {
    if (!e.kernel.IsExponentialFamily()) return false;
  }
  return true;
}

Result<HawkesMethod> ChooseMethod(const HawkesModel& model, HawkesMethod asked) {
  const bool exponential = AllExponentialFamilies(model);
  if (asked == HawkesMethod::kAuto) {
    return exponential ? HawkesMethod::kThinning : HawkesMethod::kCluster;
  }
  if (asked == HawkesMethod::kThinning && !exponential) {
    return Status::Error("thinning with the intensity recursion needs exponential or "
                         "exponential-sum kernels; use the cluster method for delayed kernels");
  }
  if (asked == HawkesMethod::kCluster && model.link != Link::kLinear) {
    return Status::Error("the cluster construction needs the linear link; use thinning for the " +
                         std::string(LinkName(model.link)) + " link");
  }
  return asked;
}

// Keeps the observed nodes and the recorded window [0, horizon).
EventData ObservedWindow(const HawkesModel& model, NodeTimes& all, double horizon) {
  EventData data;
  data.start = 0;
  data.end = horizon;
  for (int v : model.truth.Observed()) {
    data.names.push_back(model.truth.graph.name(v));
    std::vector<double>& t = all[v];
    t.erase(t.begin(), std::lower_bound(t.begin(), t.end(), 0.0));
    data.times.push_back(std::move(t));
  }
  return data;
}

}  // namespace

Status EventCapReached(const HawkesRunOptions& options, double time) {
  return Status::Error("event cap of " + std::to_string(options.event_cap) +
                       " events reached at time " + std::to_string(time) +
                       " (burn-in starts at " + std::to_string(-options.burn_in) +
                       "); the draw was abandoned");
}

Result<EventData> SimulateHawkes(const HawkesModel& model, const HawkesRunOptions& options,
                                 base::RandomStream& random) {
  if (Status s = Validate(model); !s.ok()) return s;
  if (Status s = ValidateOptions(options); !s.ok()) return s;
  if (!options.allow_nonstationary) {
    if (Status s = CheckStationary(model); !s.ok()) return s;
  }
  Result<HawkesMethod> method = ChooseMethod(model, options.method);
  if (!method.ok()) return method.status();
  Result<NodeTimes> all = *method == HawkesMethod::kThinning
                              ? SimulateByThinning(model, options, random)
                              : SimulateByClusters(model, options, random);
  if (!all.ok()) return all.status();
  return ObservedWindow(model, all.value(), options.horizon);
}

const char* HawkesMethodName(HawkesMethod method) {
  switch (method) {
    case HawkesMethod::kAuto: return "auto";
    case HawkesMethod::kThinning: return "thinning";
    case HawkesMethod::kCluster: return "cluster";
  }
  return "?";
}

Result<EventData> SimulateHawkesTrials(const HawkesModel& model, const HawkesRunOptions& options,
                                       int trials, base::RandomStream& random) {
  EventData out;
  for (int k = 0; k < trials; ++k) {
    Result<EventData> one = SimulateHawkes(model, options, random);
    if (!one.ok()) return one.status();
    AppendTrial(out, one.value());
  }
  return out;
}

}  // namespace locind::sim
