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

Status ValidateEventData(const sim::EventData& data) {
  if (!(data.end > data.start)) return Status::Error("the window end must be after its start");
  if (data.times.size() != data.names.size()) {
    return Status::Error("one event list per process name is needed");
  }
  for (size_t i = 0; i < data.times.size(); ++i) {
    const std::vector<double>& t = data.times[i];
    for (size_t k = 0; k < t.size(); ++k) {
      if (!(t[k] >= data.start && t[k] <= data.end)) {
        return Status::Error("process '" + data.names[i] + "' has an event outside the window");
      }
      if (k > 0 && t[k] < t[k - 1]) {
        return Status::Error("events of process '" + data.names[i] + "' are not sorted");
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

Eigen::MatrixXd HawkesFeatures::Evaluate(int source, const std::vector<double>& times) const {
  const std::vector<double>& s = data_.times[source];
  const int k_count = basis_size();
  Eigen::MatrixXd out(static_cast<Eigen::Index>(times.size()), k_count);
  Eigen::ArrayXd state = Eigen::ArrayXd::Zero(k_count);  // value at time `now`, events included
  const Eigen::ArrayXd r = Eigen::Map<const Eigen::ArrayXd>(rates_.data(), k_count);
  double now = data_.start;
  size_t next = 0;
  for (size_t i = 0; i < times.size(); ++i) {
    const double t = times[i];
    // Absorb every source event strictly before t: decay to it, then jump.
    for (; next < s.size() && s[next] < t; ++next) {
      state = state * (-r * (s[next] - now)).exp() + r;
      now = s[next];
    }
    out.row(static_cast<Eigen::Index>(i)) = (state * (-r * (t - now)).exp()).matrix().transpose();
  }
  return out;
}

const Eigen::MatrixXd& HawkesFeatures::AtEvents(int target, int source) {
  const auto key = std::make_pair(target, source);
  auto it = at_events_.find(key);
  if (it == at_events_.end()) {
    it = at_events_.emplace(key, Evaluate(source, data_.times[target])).first;
  }
  return it->second;
}

const Eigen::VectorXd& HawkesFeatures::Integrals(int source) {
  auto it = integrals_.find(source);
  if (it != integrals_.end()) return it->second;
  Eigen::VectorXd sum = Eigen::VectorXd::Zero(basis_size());
  for (double s : data_.times[source]) {
    for (int k = 0; k < basis_size(); ++k) sum[k] += -std::expm1(-rates_[k] * (data_.end - s));
  }
  return integrals_.emplace(source, std::move(sum)).first->second;
}

const HawkesFeatures::Grid& HawkesFeatures::QuadratureGrid() {
  if (grid_) return *grid_;
  std::vector<double> cuts = {data_.start, data_.end};
  for (const std::vector<double>& t : data_.times) cuts.insert(cuts.end(), t.begin(), t.end());
  std::sort(cuts.begin(), cuts.end());
  cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
  const double max_rate = *std::max_element(rates_.begin(), rates_.end());
  // 3-point Gauss-Legendre on [-1, 1] (Abramowitz & Stegun 1964, Table 25.4).
  const double node = std::sqrt(0.6);
  const double outer = 5.0 / 9.0, middle = 8.0 / 9.0;
  Grid grid;
  std::vector<double> weights;
  for (size_t i = 0; i + 1 < cuts.size(); ++i) {
    const double length = cuts[i + 1] - cuts[i];
    const int parts = std::max(1, static_cast<int>(std::ceil(length * max_rate)));
    const double half = length / parts / 2;
    for (int p = 0; p < parts; ++p) {
      const double mid = cuts[i] + (2 * p + 1) * half;
      grid.times.insert(grid.times.end(), {mid - node * half, mid, mid + node * half});
      weights.insert(weights.end(), {outer * half, middle * half, outer * half});
    }
  }
  grid.weights = Eigen::Map<Eigen::VectorXd>(weights.data(), Eigen::Index(weights.size()));
  grid_ = std::move(grid);
  return *grid_;
}

const Eigen::MatrixXd& HawkesFeatures::AtGrid(int source) {
  auto it = at_grid_.find(source);
  if (it == at_grid_.end()) {
    it = at_grid_.emplace(source, Evaluate(source, QuadratureGrid().times)).first;
  }
  return it->second;
}

void HawkesFeatures::ComputeAll() {
  for (int b = 0; b < data_.processes(); ++b) {
    Integrals(b);
    for (int j = 0; j < data_.processes(); ++j) AtEvents(b, j);
  }
}

}  // namespace locind::learners
