// calibration.csv end to end on a study like configs/demo_diffusion.yaml at
// window 3,200 (random truths, Euler step 0.02, interval 0.1, learners
// pairwise and screen(1) with drift-exact-lr): the
// first tests of each pair hold the level, while screen's follow-ups of a
// pair whose first test was a true null and rejected (asked because of that
// false rejection, on the same data) reject far more often, which is why
// calibration.csv leaves follow-ups out (docs/tests.md, "Study-level
// calibration: follow-up tests"). Seed 777041 was not used to develop the
// rule. About 10 s CPU, hence the calibration label.
#include <doctest/doctest.h>

#include <map>
#include <sstream>

#include "app/io/error.h"
#include "metrics/intervals.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using namespace locind::testing;

const char kStudy[] =
    "name: follow_ups\n"
    "seed: 777041\n"
    "truth:\n"
    "  random: {nodes: 4, in_degree: 1.2, loops: all}\n"
    "  truths: 3\n"
    "process:\n"
    "  paths: {drift: linear, self_rate: [0.8, 1.5], coupling: [-0.8, 0.8], noise: 1, step: 0.02,\n"
    "          interval: 0.1, burn_in: 10, drift_bound: -0.3}\n"
    "grid:\n"
    "  lengths: [3200]\n"
    "  replicates: 48\n"
    "learners:\n"
    "  - {method: pairwise, test: drift-exact-lr}\n"
    "  - {method: screen, test: drift-exact-lr, size: 1}\n";

TEST_CASE("first tests of a pair hold the level at window 3200 and screen follow-ups do not") {
  Scratch s("locind_results_calibration_study_test");
  const std::string study = s.Write("study.yaml", kStudy);
  REQUIRE(Run({study, "--threads", "1", "--out", s.Path("out")}) == kExitOk);
  // Two checks in this file, each at 1 - 0.05/2 (Bonferroni): exact
  // Clopper-Pearson intervals (Clopper & Pearson 1934) treating the rows as
  // independent trials. Rows of one replicate share data, so the intervals
  // are narrower than they should be; the checks err towards failing.
  constexpr double kConfidence = 1 - 0.05 / 2;
  int64_t tests = 0, rejected = 0;
  for (const auto& r : ReadRows(s.dir / "out" / "calibration.csv")) {
    if (r.at("all_parents_given") != "yes") continue;
    tests = std::stoll(r.at("tests"));
    rejected = std::stoll(r.at("rejected"));
  }
  REQUIRE(tests >= 300);
  const metrics::Interval first = metrics::ClopperPearsonInterval(rejected, tests, kConfidence);
  MESSAGE("first tests, all parents given: " << rejected << " of " << tests);
  CHECK(first.low <= 0.05);  // the level (0.05) is inside: the test holds it

  // Follow-ups of a pair whose first test was a true null and rejected: asked
  // because of a false rejection on the same data. (A follow-up after a
  // first test whose null is false in the truth is asked because of a real
  // effect and is not counted here.)
  std::map<std::string, bool> first_rejected;  // "cell replicate learner target sources"
  int64_t follow_ups = 0, follow_ups_rejected = 0;
  for (const auto& r : ReadRows(s.dir / "out" / "null_tests.csv")) {
    const std::string pair = r.at("cell") + " " + r.at("replicate") + " " + r.at("learner") + " " +
                             r.at("test_target") + " " + r.at("test_sources");
    const bool rejects = std::stod(r.at("test_p_value")) <= 0.05;
    if (r.at("first_of_pair") == "yes") {
      first_rejected[pair] = rejects;
      continue;
    }
    auto it = first_rejected.find(pair);
    if (it == first_rejected.end() || !it->second || r.at("all_parents_given") != "yes") continue;
    ++follow_ups;
    follow_ups_rejected += rejects;
  }
  REQUIRE(follow_ups >= 5);
  const metrics::Interval later = metrics::ClopperPearsonInterval(follow_ups_rejected, follow_ups, kConfidence);
  MESSAGE("follow-ups of a rejected true null, all parents given: " << follow_ups_rejected << " of "
                                                                      << follow_ups);
  // Far above the level: seed 777005 gave 113 of 132 (docs/tests.md).
  CHECK(later.low > 0.5);
}

}  // namespace
}  // namespace locind::app
