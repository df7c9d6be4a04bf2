// EventData: observed event streams, one sorted vector of event times per
// process, on the observation window [start, end).
#pragma once

#include <string>
#include <vector>

namespace locind::sim {

struct EventData {
  std::vector<std::string> names;          // one per observed process
  std::vector<std::vector<double>> times;  // times[i]: sorted event times of process i
  double start = 0;
  double end = 0;

  int processes() const { return static_cast<int>(names.size()); }
  double duration() const { return end - start; }
  size_t total_events() const {
    size_t n = 0;
    for (const auto& t : times) n += t.size();
    return n;
  }
};

}  // namespace locind::sim
