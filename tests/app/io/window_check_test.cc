// Window checks: long stretches without any event at a window's start or end.
#include "app/io/window_check.h"

#include <doctest/doctest.h>

namespace locind::app {
namespace {

sim::EventData Events(std::vector<double> x, double start, double end) {
  sim::EventData d;
  d.names = {"x"};
  d.times = {std::move(x)};
  d.start = start;
  d.end = end;
  return d;
}

TEST_CASE("a window that fits its events gives no warning") {
  CHECK(EmptyWindowWarnings(Events({1, 5, 9.5}, 0, 10), "ev.csv").empty());
}

TEST_CASE("absolute times against a window from 0: the empty start is named with its share") {
  const std::vector<std::string> w = EmptyWindowWarnings(Events({5000, 5500, 6000}, 0, 6000), "ev.csv");
  REQUIRE(w.size() == 1);
  CHECK(w[0] == "ev.csv: no event in the first 83% of the window [0, 5000); check the '# window:' "
                "line (absolute clock times?)");
}

TEST_CASE("an empty end, and trials are named") {
  sim::EventData d;
  sim::AppendTrial(d, Events({1, 2}, 0, 10));
  sim::AppendTrial(d, Events({0.5, 9}, 0, 10));
  const std::vector<std::string> w = EmptyWindowWarnings(d, "dir");
  REQUIRE(w.size() == 1);
  CHECK(w[0] == "dir: trial 1: no event in the last 80% of the window (2, 10]; check the '# window:' line");
  CHECK(EmptyWindowWarnings(Events({}, 0, 10), "ev.csv")[0] == "ev.csv: no event in the window [0, 10]");
}

}  // namespace
}  // namespace locind::app
