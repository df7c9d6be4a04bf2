// Window checks: warnings about an observation window that does not fit the
// events in it (documented in configs/models/README.md, "Windows").
//
// A window much longer than the recording (a wrong `# window:` line, or
// absolute clock times read against a window from 0) leaves a long stretch
// at its start or end without any event; the learners then read that
// stretch as silence of every process. EmptyWindowWarnings names, per
// trial, an empty stretch at the start or end longer than `share` of the
// window. At a pooled rate of n events per window such a stretch has
// probability exp(-share * n) under a homogeneous Poisson stream (common
// practice, no source): about 6e-4 for 74 events at share 0.1.
#pragma once

#include <string>
#include <vector>

#include "sim/event_data.h"

namespace locind::app {

inline constexpr double kEmptyWindowShare = 0.1;

// One line per stretch found (none when the window fits), naming the trial
// (when there are several), the side, its length and its share of the window.
// `file` starts each line.
std::vector<std::string> EmptyWindowWarnings(const sim::EventData& data, const std::string& file,
                                             double share = kEmptyWindowShare);

}  // namespace locind::app
