#include "app/io/window_check.h"

#include <algorithm>
#include <cmath>

#include "base/number_format.h"

namespace locind::app {
namespace {

std::string Percent(double fraction) {
  return std::to_string(static_cast<int>(std::lround(100 * fraction))) + "%";
}

}  // namespace

std::vector<std::string> EmptyWindowWarnings(const sim::EventData& data, const std::string& file,
                                             double share) {
  std::vector<std::string> out;
  for (int k = 0; k < data.trial_count(); ++k) {
    const double start = data.trial_start(k), end = data.trial_end(k), length = end - start;
    if (!(length > 0)) continue;
    double first = INFINITY, last = -INFINITY;
    for (int i = 0; i < data.processes(); ++i) {
      const size_t b = data.trial_begin(k, i), e = data.trial_stop(k, i);
      if (b == e) continue;
      first = std::min(first, data.times[size_t(i)][b]);
      last = std::max(last, data.times[size_t(i)][e - 1]);
    }
    const std::string where =
        file + ": " + (data.trials.empty() ? "" : "trial " + std::to_string(k + 1) + ": ");
    if (!std::isfinite(first)) {
      out.push_back(where + "no event in the window [" + base::FormatNumber(start) + ", " +
                    base::FormatNumber(end) + "]");
      continue;
    }
    const double head = (first - start) / length, tail = (end - last) / length;
    if (head > share) {
      out.push_back(where + "no event in the first " + Percent(head) + " of the window [" +
                    base::FormatNumber(start) + ", " + base::FormatNumber(first) +
                    "); check the '# window:' line (absolute clock times?)");
    }
    if (tail > share) {
      out.push_back(where + "no event in the last " + Percent(tail) + " of the window (" +
                    base::FormatNumber(last) + ", " + base::FormatNumber(end) +
                    "]; check the '# window:' line");
    }
  }
  return out;
}

}  // namespace locind::app
