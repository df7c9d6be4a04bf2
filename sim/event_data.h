// EventData: observed event streams, one sorted vector of event times per
// process, on the observation window [start, end).
//
// Several trials (independent recordings of the same system, each on its own
// clock and window) are held in the same lists: times[i] holds the events of
// process i trial after trial, sorted within each trial, and `trials` gives
// each trial's window and where its events begin. With `trials` empty the
// data set is one trial on [start, end]; with trials, start and end are
// unused (kept at the first trial's start and the last trial's end). Pooled
// quantities (duration, event counts) add over trials; nothing that filters
// history may run across a trial boundary.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace locind::sim {

// One trial of a several-trial data set.
struct EventTrial {
  double start = 0;
  double end = 0;
  std::vector<size_t> first;  // first[i]: index in times[i] of this trial's first event
};

struct EventData {
  std::vector<std::string> names;          // one per observed process
  std::vector<std::vector<double>> times;  // times[i]: event times of process i (see above)
  double start = 0;
  double end = 0;
  std::vector<EventTrial> trials;  // two or more trials; empty: one trial [start, end]

  int processes() const { return static_cast<int>(names.size()); }
  int trial_count() const { return trials.empty() ? 1 : static_cast<int>(trials.size()); }
  double trial_start(int k) const { return trials.empty() ? start : trials[size_t(k)].start; }
  double trial_end(int k) const { return trials.empty() ? end : trials[size_t(k)].end; }
  // Index range [trial_begin, trial_stop) of trial k's events in times[i].
  size_t trial_begin(int k, int i) const { return trials.empty() ? 0 : trials[size_t(k)].first[size_t(i)]; }
  size_t trial_stop(int k, int i) const {
    return k + 1 < trial_count() ? trials[size_t(k) + 1].first[size_t(i)] : times[size_t(i)].size();
  }
  // Total observed time: the sum of the trial windows' lengths.
  double duration() const {
    if (trials.empty()) return end - start;
    double d = 0;
    for (const EventTrial& t : trials) d += t.end - t.start;
    return d;
  }
  size_t total_events() const {
    size_t n = 0;
    for (const auto& t : times) n += t.size();
    return n;
  }
};

// Appends `trial` (a one-trial data set over the same processes) as a new
// trial of `data`. The first call on an empty `data` (no names) copies it.
// REQUIRES: trial.names == data.names when data has names; trial has no trials.
inline void AppendTrial(EventData& data, const EventData& trial) {
  if (data.names.empty()) {
    data = trial;
    return;
  }
  if (data.trials.empty()) {
    data.trials.push_back(EventTrial{data.start, data.end, std::vector<size_t>(data.names.size(), 0)});
  }
  EventTrial next{trial.start, trial.end, {}};
  for (size_t i = 0; i < data.times.size(); ++i) {
    next.first.push_back(data.times[i].size());
    data.times[i].insert(data.times[i].end(), trial.times[i].begin(), trial.times[i].end());
  }
  data.trials.push_back(std::move(next));
  data.end = trial.end;
}

}  // namespace locind::sim
