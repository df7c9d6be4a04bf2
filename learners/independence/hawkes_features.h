// HawkesFeatures: exponential-basis history features of event streams,
// computed once per data set and shared by every test on it.
//
// For a source process j with events s < t and a rate grid r_1..r_K, the
// feature x_jk(t) = sum_{s < t} r_k exp(-r_k (t - s)) is the convolution
// (h_k * dN_j)(t-) with the unit-mass kernel h_k(u) = r_k exp(-r_k u). It is
// evaluated by the usual exponential recursion (Ozaki 1979, Ann. Inst.
// Statist. Math. 31(B), Sec. 3): between events the state decays by
// exp(-r_k dt), at an event it jumps by r_k, so one pass costs
// O((events of j + evaluation times) * K).
//
// Default rate grid (DefaultHawkesRates): with tau = duration * processes /
// total events (the mean inter-event time of one process), the K rates are
// 4^(k - (K-1)/2) / tau, k = 0..K-1; for K = 3 that is {1/(4 tau), 1/tau,
// 4/tau}. A user may give any positive rates instead.
//
// Several trials (sim::EventData::trials): every filter restarts empty at
// each trial's start and no event of one trial enters another's features;
// rows of AtEvents and the grid are stacked trial after trial, and the
// integrals add over trials, so a likelihood built from them is the sum of
// the trials' likelihoods. For consumers that need one time axis (a running
// sum along time), trials are laid end to end on a "stacked clock": trial k
// starts where trial k-1 ends (a one-trial data set keeps its own clock).
//
// Blocks are computed on first use and kept; the object is not thread-safe.
// ComputeAll() fills the event and integral blocks, but the quadrature grid
// used by the signed test is still built lazily: give each thread its own
// object.
#pragma once

#include <map>
#include <optional>
#include <utility>
#include <vector>

#include <Eigen/Dense>

#include "base/status.h"
#include "sim/event_data.h"

namespace locind::learners {

// The default rate grid of `count` rates for `data` (rule above). When the
// data has no events or zero duration, tau = 1.
std::vector<double> DefaultHawkesRates(const sim::EventData& data, int count = 3);

// Checks what the features assume: end > start, every times[i] sorted and in
// [start, end] (an event at the end is allowed: readers may set end to the
// last event), one name per stream; with trials, the same within each trial,
// at least two trials and one start index per process, non-decreasing.
Status ValidateEventData(const sim::EventData& data);

class HawkesFeatures {
 public:
  // Fails when the data is invalid (ValidateEventData) or a rate is not
  // positive and finite, or `rates` is empty.
  static Result<HawkesFeatures> Create(sim::EventData data, std::vector<double> rates);

  const sim::EventData& data() const { return data_; }
  const std::vector<double>& rates() const { return rates_; }
  int basis_size() const { return static_cast<int>(rates_.size()); }

  // events(target) x K matrix: row i holds x_jk(t_i-) for the i-th event t_i
  // of `target`, j = `source` (events of j at exactly t_i are excluded, so
  // source == target is the process's own strict past).
  const Eigen::MatrixXd& AtEvents(int target, int source);
  // K-vector of integrals over the window: sum_s (1 - exp(-r_k (end - s))).
  const Eigen::VectorXd& Integrals(int source);
  // x_jk at arbitrary sorted `times` (left limits) of trial `trial`, on that
  // trial's clock, from that trial's events only; not cached.
  Eigen::MatrixXd Evaluate(int source, const std::vector<double>& times, int trial = 0) const;
  // Events of `process` on the stacked clock (its own times for one trial).
  const std::vector<double>& StackedTimes(int process);
  // Offset of trial k on the stacked clock: stacked = own - start_k + offset.
  double StackedOffset(int trial) const;
  // Trial of each event of `process`, in the order of data().times[process].
  std::vector<int> TrialOfEvents(int process) const;

  // A quadrature grid for integrals over the window of smooth functions of
  // the features (used by the signed-effects model, whose compensator has no
  // closed form): the window is cut at every event of every process, each
  // piece is cut into parts no longer than 1 / max rate, and each part
  // carries 3-point Gauss-Legendre nodes (Abramowitz & Stegun 1964, Table
  // 25.4). Between events the features are sums of exponentials, so the rule
  // error per part is about (r h)^6 / 2e6 <= 5e-7 relative (r h <= 1).
  // With several trials each trial is cut separately; `times` is on the
  // stacked clock (sorted), `trial` names each node's trial.
  struct Grid {
    std::vector<double> times;  // sorted nodes (stacked clock)
    Eigen::VectorXd weights;
    std::vector<int> trial;     // trial of each node
    std::vector<double> own;    // the nodes on their trial's own clock
  };
  const Grid& QuadratureGrid();
  // grid size x K: features of `source` at the grid nodes.
  const Eigen::MatrixXd& AtGrid(int source);

  // Computes every (target, source) block and every integral.
  void ComputeAll();
  // Number of (target, source) blocks computed so far (for sharing checks).
  size_t computed_blocks() const { return at_events_.size(); }

 private:
  HawkesFeatures(sim::EventData data, std::vector<double> rates)
      : data_(std::move(data)), rates_(std::move(rates)) {}

  sim::EventData data_;
  std::vector<double> rates_;
  std::map<std::pair<int, int>, Eigen::MatrixXd> at_events_;
  std::map<int, Eigen::VectorXd> integrals_;
  std::optional<Grid> grid_;
  std::map<int, Eigen::MatrixXd> at_grid_;
  std::map<int, std::vector<double>> stacked_;
};

}  // namespace locind::learners
