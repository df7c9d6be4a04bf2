#include "learners/independence/hawkes_features.h"

#include <algorithm>
#include <cmath>
#include <string>

namespace locind::learners {

std::vector<double> DefaultHawkesRates(const sim::EventData& data, int count) {
  const double events = static_cast<double>(data.total_events());
  double tau = 1;
  if (events > 0 && data.duration() > 0) tau = data.duration() * data.processes() / events;
  std::vector<double> rates;
  for (int k = 0; k < count; ++k) {
    rates.push_back(std::pow(4.0, k - (count - 1) / 2.0) / tau);
  }
  return rates;
}

namespace {

Status ValidateTrialShape(const sim::EventData& data) {
  if (data.trials.empty()) return Status::Ok();
  if (data.trials.size() < 2) return Status::Error("a trial list needs at least two trials");
  for (size_t k = 0; k < data.trials.size(); ++k) {
    const sim::EventTrial& t = data.trials[k];
    if (t.first.size() != data.names.size()) {
      return Status::Error("trial " + std::to_string(k + 1) + " needs one start index per process");
    }
    for (size_t i = 0; i < t.first.size(); ++i) {
      const size_t stop = k + 1 < data.trials.size() ? data.trials[k + 1].first[i] : data.times[i].size();
      if (t.first[i] > stop || (k == 0 && t.first[i] != 0)) {
        return Status::Error("trial " + std::to_string(k + 1) + " has a bad event range");
      }
    }
  }
  return Status::Ok();
}

}  // namespace

Status ValidateEventData(const sim::EventData& data) {
  if (data.times.size() != data.names.size()) {
    return Status::Error("one event list per process name is needed");
  }
  if (Status s = ValidateTrialShape(data); !s.ok()) return s;
  for (int k = 0; k < data.trial_count(); ++k) {
    const double start = data.trial_start(k), end = data.trial_end(k);
    const std::string which = data.trials.empty() ? "" : " of trial " + std::to_string(k + 1);
    if (!(end > start)) return Status::Error("the window end" + which + " must be after its start");
    for (size_t i = 0; i < data.times.size(); ++i) {
      const std::vector<double>& t = data.times[i];
      for (size_t e = data.trial_begin(k, int(i)); e < data.trial_stop(k, int(i)); ++e) {
        if (!(t[e] >= start && t[e] <= end)) {
          return Status::Error("process '" + data.names[i] + "' has an event outside the window" + which);
        }
        if (e > data.trial_begin(k, int(i)) && t[e] < t[e - 1]) {
          return Status::Error("events of process '" + data.names[i] + "' are not sorted" + which);
        }
      }
    }
  }
  return Status::Ok();
}

Result<HawkesFeatures> HawkesFeatures::Create(sim::EventData data, std::vector<double> rates) {
  if (Status s = ValidateEventData(data); !s.ok()) return s;
  if (rates.empty()) return Status::Error("the rate grid is empty");
  for (double r : rates) {
    if (!(r > 0) || !std::isfinite(r)) return Status::Error("rates must be positive and finite");
  }
  return HawkesFeatures(std::move(data), std::move(rates));
}

Eigen::MatrixXd HawkesFeatures::Evaluate(int source, const std::vector<double>& times,
                                         int trial) const {
  const std::vector<double>& s = data_.times[size_t(source)];
  const int k_count = basis_size();
  Eigen::MatrixXd out(static_cast<Eigen::Index>(times.size()), k_count);
  Eigen::ArrayXd state = Eigen::ArrayXd::Zero(k_count);  // value at time `now`, events included
  const Eigen::ArrayXd r = Eigen::Map<const Eigen::ArrayXd>(rates_.data(), k_count);
  // Only this trial's events: the filter starts empty at the trial's start.
  double now = data_.trial_start(trial);
  size_t next = data_.trial_begin(trial, source);
  const size_t stop = data_.trial_stop(trial, source);
  for (size_t i = 0; i < times.size(); ++i) {
    const double t = times[i];
    // Absorb every source event strictly before t: decay to it, then jump.
    for (; next < stop && s[next] < t; ++next) {
      state = state * (-r * (s[next] - now)).exp() + r;
      now = s[next];
    }
    out.row(static_cast<Eigen::Index>(i)) = (state * (-r * (t - now)).exp()).matrix().transpose();
  }
  return out;
}

double HawkesFeatures::StackedOffset(int trial) const {
  double offset = data_.trial_start(0);
  for (int k = 0; k < trial; ++k) offset += data_.trial_end(k) - data_.trial_start(k);
  return offset;
}

const std::vector<double>& HawkesFeatures::StackedTimes(int process) {
  if (data_.trials.empty()) return data_.times[size_t(process)];
  auto it = stacked_.find(process);
  if (it != stacked_.end()) return it->second;
  std::vector<double> out = data_.times[size_t(process)];
  for (int k = 1; k < data_.trial_count(); ++k) {
    const double shift = StackedOffset(k) - data_.trial_start(k);
    for (size_t e = data_.trial_begin(k, process); e < data_.trial_stop(k, process); ++e) out[e] += shift;
  }
  return stacked_.emplace(process, std::move(out)).first->second;
}

std::vector<int> HawkesFeatures::TrialOfEvents(int process) const {
  std::vector<int> out(data_.times[size_t(process)].size(), 0);
  for (int k = 1; k < data_.trial_count(); ++k) {
    for (size_t e = data_.trial_begin(k, process); e < data_.trial_stop(k, process); ++e) out[e] = k;
  }
  return out;
}

const Eigen::MatrixXd& HawkesFeatures::AtEvents(int target, int source) {
  const auto key = std::make_pair(target, source);
  auto it = at_events_.find(key);
  if (it != at_events_.end()) return it->second;
  const std::vector<double>& t = data_.times[size_t(target)];
  if (data_.trials.empty()) return at_events_.emplace(key, Evaluate(source, t)).first->second;
  // One trial at a time, rows stacked in the order of times[target].
  Eigen::MatrixXd out(Eigen::Index(t.size()), basis_size());
  for (int k = 0; k < data_.trial_count(); ++k) {
    const size_t b = data_.trial_begin(k, target), e = data_.trial_stop(k, target);
    const std::vector<double> part(t.begin() + long(b), t.begin() + long(e));
    out.middleRows(Eigen::Index(b), Eigen::Index(e - b)) = Evaluate(source, part, k);
  }
  return at_events_.emplace(key, std::move(out)).first->second;
}

const Eigen::VectorXd& HawkesFeatures::Integrals(int source) {
  auto it = integrals_.find(source);
  if (it != integrals_.end()) return it->second;
  Eigen::VectorXd sum = Eigen::VectorXd::Zero(basis_size());
  const std::vector<double>& s = data_.times[size_t(source)];
  for (int trial = 0; trial < data_.trial_count(); ++trial) {
    const double end = data_.trial_end(trial);  // each trial's kernel mass stops at its end
    for (size_t e = data_.trial_begin(trial, source); e < data_.trial_stop(trial, source); ++e) {
      for (int k = 0; k < basis_size(); ++k) sum[k] += -std::expm1(-rates_[k] * (end - s[e]));
    }
  }
  return integrals_.emplace(source, std::move(sum)).first->second;
}

namespace {

// Appends the 3-point Gauss-Legendre nodes of [lo, hi] cut into `parts`.
void AddNodes(double lo, double hi, int parts, std::vector<double>& times, std::vector<double>& weights) {
  // 3-point Gauss-Legendre on [-1, 1] (Abramowitz & Stegun 1964, Table 25.4).
  const double node = std::sqrt(0.6);
  const double outer = 5.0 / 9.0, middle = 8.0 / 9.0;
  const double half = (hi - lo) / parts / 2;
  for (int p = 0; p < parts; ++p) {
    const double mid = lo + (2 * p + 1) * half;
    times.insert(times.end(), {mid - node * half, mid, mid + node * half});
    weights.insert(weights.end(), {outer * half, middle * half, outer * half});
  }
}

}  // namespace

const HawkesFeatures::Grid& HawkesFeatures::QuadratureGrid() {
  if (grid_) return *grid_;
  const double max_rate = *std::max_element(rates_.begin(), rates_.end());
  Grid grid;
  std::vector<double> weights;
  for (int trial = 0; trial < data_.trial_count(); ++trial) {
    std::vector<double> cuts = {data_.trial_start(trial), data_.trial_end(trial)};
    for (int i = 0; i < data_.processes(); ++i) {
      const std::vector<double>& t = data_.times[size_t(i)];
      cuts.insert(cuts.end(), t.begin() + long(data_.trial_begin(trial, i)),
                  t.begin() + long(data_.trial_stop(trial, i)));
    }
    std::sort(cuts.begin(), cuts.end());
    cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
    const size_t first = grid.own.size();
    for (size_t i = 0; i + 1 < cuts.size(); ++i) {
      const double length = cuts[i + 1] - cuts[i];
      const int parts = std::max(1, static_cast<int>(std::ceil(length * max_rate)));
      AddNodes(cuts[i], cuts[i + 1], parts, grid.own, weights);
    }
    grid.trial.resize(grid.own.size(), trial);
    const double shift = trial == 0 ? 0 : StackedOffset(trial) - data_.trial_start(trial);
    for (size_t g = first; g < grid.own.size(); ++g) {
      grid.times.push_back(trial == 0 ? grid.own[g] : grid.own[g] + shift);
    }
  }
  grid.weights = Eigen::Map<Eigen::VectorXd>(weights.data(), Eigen::Index(weights.size()));
  grid_ = std::move(grid);
  return *grid_;
}

const Eigen::MatrixXd& HawkesFeatures::AtGrid(int source) {
  auto it = at_grid_.find(source);
  if (it != at_grid_.end()) return it->second;
  const Grid& grid = QuadratureGrid();
  if (data_.trials.empty()) return at_grid_.emplace(source, Evaluate(source, grid.own)).first->second;
  Eigen::MatrixXd out(Eigen::Index(grid.own.size()), basis_size());
  size_t b = 0;
  for (int k = 0; k < data_.trial_count(); ++k) {
    size_t e = b;
    while (e < grid.trial.size() && grid.trial[e] == k) ++e;
    const std::vector<double> part(grid.own.begin() + long(b), grid.own.begin() + long(e));
    out.middleRows(Eigen::Index(b), Eigen::Index(e - b)) = Evaluate(source, part, k);
    b = e;
  }
  return at_grid_.emplace(source, std::move(out)).first->second;
}

void HawkesFeatures::ComputeAll() {
  for (int b = 0; b < data_.processes(); ++b) {
    Integrals(b);
    for (int j = 0; j < data_.processes(); ++j) AtEvents(b, j);
  }
}

}  // namespace locind::learners
