// One replicate of a cell: cells that differ only in level run on the same
// simulated data (paired levels), so the same tests give the same p-values
// and only the decisions differ.
#include <doctest/doctest.h>

#include <map>
#include <set>
#include <sstream>

#include "app/io/error.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using namespace locind::testing;
using Row = std::map<std::string, std::string>;

TEST_CASE("two levels in one study share data and p-values and differ only in decisions") {
  Scratch s("locind_runner_replicate_test_paired");
  std::string text = kTinyStudy;
  text.replace(text.find("replicates: 4"), 13, "replicates: 4\n  levels: [0.01, 0.3]");
  const std::string study = s.Write("paired.yaml", text);
  REQUIRE(Run({study, "--out", s.Path("out")}) == kExitOk);
  // Grid order: level, then length (fastest): cells 0, 1 at level 0.01 and
  // 2, 3 at level 0.3, lengths 150 and 300 in each.
  std::map<std::string, std::string> points;  // "length replicate learner" -> observed_points
  int compared = 0;
  for (const Row& r : ReadRows(s.dir / "out" / "replicates.csv")) {
    const std::string key = r.at("length") + " " + r.at("replicate") + " " + r.at("learner");
    auto [it, fresh] = points.emplace(key, r.at("observed_points"));
    if (!fresh) {
      CHECK(it->second == r.at("observed_points"));
      ++compared;
    }
  }
  CHECK(compared == 2 * 4 * 3);  // 2 lengths x 4 replicates x 3 learners, each seen at both levels

  std::map<std::string, std::string> p_values;  // "cell%2 replicate edge" -> p-value
  int same = 0, dependent_low = 0, dependent_high = 0;
  for (const Row& r : ReadRows(s.dir / "out" / "edges.csv")) {
    if (r.at("learner") != "pairwise/hawkes-lr" || r.at("witness_status") != "ok") continue;
    const int cell = std::stoi(r.at("cell"));
    const double level = cell < 2 ? 0.01 : 0.3;
    const double p = std::stod(r.at("witness_p_value"));
    // The decision rule of learners/methods/test_runner.cc: dependent when p <= level.
    CHECK((r.at("witness_decision") == "dependent") == (p <= level));
    (cell < 2 ? dependent_low : dependent_high) += r.at("witness_decision") == "dependent";
    const std::string key = std::to_string(cell % 2) + " " + r.at("replicate") + " " + r.at("edge");
    auto [it, fresh] = p_values.emplace(key, r.at("witness_p_value"));
    if (!fresh) {
      CHECK(it->second == r.at("witness_p_value"));
      ++same;
    }
  }
  CHECK(same > 0);
  // Same p-values: the larger level rejects at least wherever the smaller does.
  CHECK(dependent_high >= dependent_low);
}

TEST_CASE("null_tests.csv marks follow-ups of a pair, and calibration.csv counts only first tests") {
  Scratch s("locind_runner_replicate_test_first_of_pair");
  std::string text = kTinyStudy;
  // A high level: screen rejects often and then asks follow-ups of the pair.
  text.replace(text.find("replicates: 4"), 13, "replicates: 4\n  levels: [0.3]");
  const std::string study = s.Write("first.yaml", text);
  REQUIRE(Run({study, "--out", s.Path("out")}) == kExitOk);
  std::map<std::string, int> first_rows, follow_ups;  // "cell replicate learner target sources"
  std::map<std::string, bool> follow_up_seen;
  std::set<std::string> fair;  // distinct first-test queries (cell replicate target sources given)
  for (const Row& r : ReadRows(s.dir / "out" / "null_tests.csv")) {
    const std::string pair =
        r.at("cell") + " " + r.at("replicate") + " " + r.at("learner") + " " + r.at("test_target") + " " +
        r.at("test_sources");
    if (r.at("first_of_pair") == "yes") {
      ++first_rows[pair];
      CHECK_FALSE(follow_up_seen[pair]);  // the log order: the first test comes before its follow-ups
      fair.insert(r.at("cell") + " " + r.at("replicate") + " " + r.at("test_target") + " " +
                  r.at("test_sources") + " " + r.at("test_given"));
    } else {
      REQUIRE(r.at("first_of_pair") == "no");
      ++follow_ups[r.at("learner")];
      follow_up_seen[pair] = true;
    }
  }
  for (const auto& [pair, n] : first_rows) CHECK_MESSAGE(n == 1, pair);
  CHECK(follow_ups["pairwise/hawkes-lr"] == 0);  // pairwise asks each pair once
  CHECK(follow_ups["screen/hawkes-lr"] > 0);
  int counted = 0;
  for (const Row& r : ReadRows(s.dir / "out" / "calibration.csv")) counted += std::stoi(r.at("tests"));
  CHECK(counted == static_cast<int>(fair.size()));
}

}  // namespace
}  // namespace locind::app
