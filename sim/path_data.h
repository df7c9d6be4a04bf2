// PathData: observed diffusion paths sampled on a time grid.
//
// Several trials (independent recordings, each on its own clock) are held in
// the same rows, trial after trial; `trial_starts` lists the row of each
// trial's first sample after the first trial. Time is strictly increasing
// within a trial. No increment, and no filtered history, spans two trials.
#pragma once

#include <algorithm>
#include <string>
#include <vector>

#include <Eigen/Dense>

namespace locind::sim {

struct PathData {
  std::vector<std::string> names;  // one per observed process (column)
  std::vector<double> time;        // grid, strictly increasing within each trial
  Eigen::MatrixXd values;          // time.size() x names.size(), column-major
  std::vector<int> trial_starts;   // sorted rows > 0 that begin a new trial; empty: one trial

  int processes() const { return static_cast<int>(names.size()); }
  int samples() const { return static_cast<int>(time.size()); }
  int trial_count() const { return static_cast<int>(trial_starts.size()) + 1; }
  // True when row i begins a trial other than the first (the increment from
  // row i - 1 to row i then spans two trials).
  bool starts_trial(int i) const {
    return std::binary_search(trial_starts.begin(), trial_starts.end(), i);
  }
  // Number of increments within trials: samples - trials.
  int increments() const { return samples() - trial_count(); }
  // Rows i whose increment (row i to row i + 1) lies within one trial.
  std::vector<int> increment_rows() const {
    std::vector<int> rows;
    for (int i = 0; i + 1 < samples(); ++i) {
      if (!starts_trial(i + 1)) rows.push_back(i);
    }
    return rows;
  }
  // Total observed time: the sum of each trial's last minus first sample time.
  double observed_time() const {
    double total = 0;
    int first = 0;
    for (int k = 0; k <= static_cast<int>(trial_starts.size()); ++k) {
      const int stop = k < static_cast<int>(trial_starts.size()) ? trial_starts[size_t(k)] : samples();
      if (stop > first) total += time[size_t(stop) - 1] - time[size_t(first)];
      first = stop;
    }
    return total;
  }
};

// Appends the rows of `trial` (one trial, same processes) as a new trial of
// `data`; an empty `data` (no names) becomes a copy.
inline void AppendTrial(PathData& data, const PathData& trial) {
  if (data.names.empty()) {
    data = trial;
    return;
  }
  const Eigen::Index old = data.values.rows();
  data.trial_starts.push_back(static_cast<int>(old));
  data.time.insert(data.time.end(), trial.time.begin(), trial.time.end());
  data.values.conservativeResize(old + trial.values.rows(), Eigen::NoChange);
  data.values.bottomRows(trial.values.rows()) = trial.values;
}

}  // namespace locind::sim
