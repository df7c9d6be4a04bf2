// `locind learn` on recorded data: a folder of trials against the same events
// on one clock, and absolute (shifted) clock times with and without a window.
#include <doctest/doctest.h>

#include <sstream>

#include "app/cli/command.h"
#include "app/io/event_csv.h"
#include "app/io/trial_folder.h"
#include "base/random_stream.h"
#include "graph/dmg.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"
#include "tests/app/command_fixture.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using testing::Scratch;

// The "edges: [...]" line of learn's output.
std::string EdgesLine(const std::string& out) {
  const size_t at = out.find("edges: ");
  return at == std::string::npos ? "" : out.substr(at, out.find('\n', at) - at);
}

// One trial of 100 (as in hawkes_lr_test_test.cc): y fires every 0.3 in
// [0.3, 3] and every 10 in [15, 85]; x every 0.1 in [99.6, 99.9]. Within a
// trial no x event precedes a y event.
sim::EventData BurstTrial(double shift) {
  sim::EventData d;
  d.names = {"x", "y"};
  d.times.resize(2);
  for (int i = 1; i <= 10; ++i) d.times[1].push_back(shift + 0.3 * i);
  for (int i = 15; i <= 85; i += 10) d.times[1].push_back(shift + i);
  for (int i = 6; i <= 9; ++i) d.times[0].push_back(shift + 99 + 0.1 * i);
  d.start = shift;
  d.end = shift + 100;
  return d;
}

TEST_CASE("three trials in a folder: no x -> y; the same events on one clock with gaps: x -> y") {
  Scratch s("locind_learn_trials");
  sim::EventData trials, glued;
  for (int k = 0; k < 3; ++k) sim::AppendTrial(trials, BurstTrial(0));
  WriteEventTrials(trials, s.Path("trials"));
  // One file: trial k on [100.05 k, 100.05 k + 100], window [0, 300.1].
  for (int k = 0; k < 3; ++k) {
    const sim::EventData t = BurstTrial(100.05 * k);
    if (k == 0) glued = t;
    for (size_t i = 0; i < 2; ++i) glued.times[i].insert(glued.times[i].end(), t.times[i].begin(), t.times[i].end());
  }
  glued.times[0].erase(glued.times[0].begin(), glued.times[0].begin() + 4);
  glued.times[1].erase(glued.times[1].begin(), glued.times[1].begin() + 18);
  glued.end = 300.1;
  const std::string one = s.Write("glued.csv", FormatEventCsv(glued));
  const testing::Outcome a = testing::RunHandler(RunLearnCommand, {s.Path("trials"), "--method", "pairwise"});
  const testing::Outcome b = testing::RunHandler(RunLearnCommand, {one, "--method", "pairwise"});
  REQUIRE(a.code == kExitOk);
  REQUIRE(b.code == kExitOk);
  // Within trials x never precedes y: no evidence for x -> y. Across the
  // joins x's burst precedes y's: a spurious x -> y.
  CHECK(EdgesLine(a.out).find("x -> y") == std::string::npos);
  CHECK(EdgesLine(b.out).find("x -> y") != std::string::npos);
}

// a -> b -> c with loops, 2,000 time units.
sim::EventData Chain(uint64_t seed) {
  graph::Dmg g({"a", "b", "c"});
  for (int i = 0; i < 3; ++i) g.AddDirected(i, i);
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  const sim::HawkesModel m = sim::ExponentialHawkes(graph::TruthGraph{g, {}}, 0.5, 0.3, 1.0, 0.2);
  sim::HawkesRunOptions o;
  o.horizon = 2000;
  o.burn_in = 50;
  base::RandomStream random(seed);
  return sim::SimulateHawkes(m, o, random).value();
}

// The event file of `d` with every time shifted by `shift`, with or without
// the window line.
std::string Shifted(sim::EventData d, double shift, bool window) {
  for (auto& t : d.times) {
    for (double& x : t) x += shift;
  }
  d.start += shift;
  d.end += shift;
  std::string text = FormatEventCsv(d);
  if (!window) {
    const size_t at = text.find("# window:");
    text.erase(at, text.find('\n', at) + 1 - at);
  }
  return text;
}

TEST_CASE("shifted clock times (+5,000) learn the graph of the unshifted events") {
  Scratch s("locind_learn_shift");
  const sim::EventData d = Chain(41);
  auto learn = [&](const std::string& name, const std::string& text) {
    return testing::RunHandler(RunLearnCommand, {s.Write(name, text), "--method", "pairwise"});
  };
  const testing::Outcome plain = learn("plain.csv", Shifted(d, 0, true));
  const testing::Outcome moved = learn("moved.csv", Shifted(d, 5000, true));  // window moved too
  const testing::Outcome bare = learn("bare.csv", Shifted(d, 0, false));
  const testing::Outcome bare_moved = learn("bare_moved.csv", Shifted(d, 5000, false));
  REQUIRE(plain.code == kExitOk);
  CHECK(EdgesLine(plain.out).find("a -> b") != std::string::npos);
  CHECK(EdgesLine(moved.out) == EdgesLine(plain.out));
  CHECK(EdgesLine(bare_moved.out) == EdgesLine(bare.out));
  CHECK(plain.err.empty());
  // Without a window line the window is taken from the events, on stderr.
  CHECK(bare_moved.err.find("locind learn: note: ") == 0);
  CHECK(bare_moved.err.find("using [first event, last event]") != std::string::npos);
  // A window from 0 against the shifted events: the empty start is named.
  std::string wrong = Shifted(d, 5000, true);
  wrong.replace(wrong.find("# window: 5000"), 14, "# window: 0");
  const testing::Outcome warned = learn("wrong.csv", wrong);
  CHECK(warned.code == kExitOk);
  CHECK(warned.err.find("locind learn: warning: ") == 0);
  CHECK(warned.err.find("no event in the first 71% of the window") != std::string::npos);
}

}  // namespace
}  // namespace locind::app
