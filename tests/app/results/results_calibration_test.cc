// calibration.csv: its golden header (documented in results/README.md), the
// null-test lines it is built from, the pooled counts with their exact
// intervals, and the warning line of the report.
#include "app/results/results_calibration.h"

#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <sstream>

namespace locind::app {
namespace {

TEST_CASE("calibration.csv header, every column documented") {
  CHECK(CalibrationHeader() ==
        "test,length,level,all_parents_given,tests,rejected,rejected_share,rejected_share_low,"
        "rejected_share_high,above_level");
  std::ifstream in("results/README.md");
  std::stringstream doc;
  doc << in.rdbuf();
  REQUIRE_FALSE(doc.str().empty());
  std::stringstream s(CalibrationHeader());
  for (std::string column; std::getline(s, column, ',');) {
    CHECK_MESSAGE(doc.str().find("`" + column + "`") != std::string::npos, column);
  }
}

TEST_CASE("a null_tests.csv line reads back, and a malformed one is refused") {
  const std::optional<NullTestLine> n =
      ParseNullTestLine("2,5,t1,pairwise/hawkes-lr,hawkes-lr,600,b,a,b;c,1.5,3,0.04,no");
  REQUIRE(n.has_value());
  CHECK(n->cell == 2);
  CHECK(n->replicate == 5);
  CHECK(n->learner == "pairwise/hawkes-lr");
  CHECK(n->test == "hawkes-lr");
  CHECK(n->length == 600);
  CHECK(n->target == "b");
  CHECK(n->sources == "a");
  CHECK(n->given == "b;c");
  CHECK(n->p_value == 0.04);
  CHECK_FALSE(n->all_parents_given);
  CHECK(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,yes")->all_parents_given);
  CHECK_FALSE(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,maybe"));  // bad tag
  CHECK_FALSE(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04"));        // field missing
  CHECK_FALSE(ParseNullTestLine("x,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,yes"));    // bad cell
}

TEST_CASE("first_of_pair reads back; a line without it (older journal) is a first test") {
  CHECK(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,yes")->first_of_pair);
  CHECK(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,yes,yes")->first_of_pair);
  CHECK_FALSE(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b;c,1.5,3,0.04,yes,no")->first_of_pair);
  CHECK_FALSE(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,yes,maybe"));  // bad tag
  CHECK_FALSE(ParseNullTestLine("2,5,t1,l,hawkes-lr,600,b,a,b,1.5,3,0.04,yes,no,no"));  // field too many
}

NullTestLine Line(int cell, int replicate, const std::string& learner, const std::string& target,
                  const std::string& source, double p, bool given) {
  NullTestLine n;
  n.cell = cell;
  n.replicate = replicate;
  n.learner = learner;
  n.test = "hawkes-lr";
  n.length = 100;
  n.target = target;
  n.sources = source;
  n.given = target;
  n.p_value = p;
  n.all_parents_given = given;
  return n;
}

TEST_CASE("counts per test, length, level and tag, each query on one data set once") {
  std::vector<Cell> cells(2);
  cells[0].length = cells[1].length = 100;
  cells[0].level = 0.05;
  cells[1].index = 1;
  cells[1].level = 0.01;
  const std::vector<NullTestLine> lines = {
      Line(0, 0, "L1", "b", "a", 0.03, true),   // rejected at 0.05
      Line(0, 0, "L2", "b", "a", 0.03, true),   // the same query and data, another learner: once
      Line(0, 0, "L1", "b", "c", 0.5, true),    // kept
      Line(0, 1, "L1", "b", "a", 0.2, true),    // another replicate: counts
      Line(0, 0, "L1", "c", "a", 0.001, false), // rejected
      Line(0, 1, "L1", "c", "a", 0.04, false),  // rejected
      Line(1, 0, "L1", "b", "a", 0.03, true),   // level 0.01: not rejected
      Line(7, 0, "L1", "b", "a", 0.03, true),   // no such cell: left out
  };
  CHECK(DistinctNullTests(lines).size() == 7);
  const std::vector<CalibrationRow> rows = CalibrationTable(lines, cells);
  REQUIRE(rows.size() == 3);
  // Sorted by level, then yes before no. Exact intervals: SciPy 1.10.1,
  // scipy.stats.beta.ppf(0.025, x, n - x + 1) and beta.ppf(0.975, x + 1, n - x),
  // 0 at x = 0 and 1 at x = n (Clopper & Pearson 1934).
  CHECK(rows[0].level == 0.01);
  CHECK(rows[0].all_parents_given);
  CHECK(rows[0].tests == 1);
  CHECK(rows[0].rejected == 0);
  CHECK(rows[0].share.low == 0.0);
  CHECK(rows[0].share.high == doctest::Approx(0.975).epsilon(1e-12));
  CHECK(rows[1].level == 0.05);
  CHECK(rows[1].all_parents_given);
  CHECK(rows[1].tests == 3);
  CHECK(rows[1].rejected == 1);
  CHECK(rows[1].share.estimate == doctest::Approx(1.0 / 3));
  CHECK(rows[1].share.low == doctest::Approx(0.008403758659612636).epsilon(1e-10));
  CHECK(rows[1].share.high == doctest::Approx(0.9057006759497539).epsilon(1e-10));
  CHECK_FALSE(rows[1].AboveLevel());
  CHECK_FALSE(rows[2].all_parents_given);
  CHECK(rows[2].tests == 2);
  CHECK(rows[2].rejected == 2);
  CHECK(rows[2].share.low == doctest::Approx(0.15811388300841897).epsilon(1e-10));
  CHECK(rows[2].share.high == 1.0);
  CHECK(rows[2].AboveLevel());  // 0.158 > 0.05

  CHECK(FormatCalibrationRow(rows[2]) ==
        "hawkes-lr,100,0.05,no,2,2,1," + Num(rows[2].share.low) + ",1,yes");
  CHECK(CalibrationWarning(rows[2]) ==
        "hawkes-lr at length 100, level 0.05, all parents given: no: 2 of 2 true-null tests rejected "
        "(share 1.000, exact 95% interval 0.158 to 1.000)");
}

TEST_CASE("a follow-up test of the same pair does not count") {
  std::vector<Cell> cells(1);
  cells[0].length = 100;
  cells[0].level = 0.05;
  NullTestLine first = Line(0, 0, "L1", "b", "a", 0.03, true);
  NullTestLine follow_up = Line(0, 0, "L1", "b", "a", 0.02, true);
  follow_up.given = "b;c";
  follow_up.first_of_pair = false;
  // The same query as the follow-up, asked first by another learner: counts.
  NullTestLine other = follow_up;
  other.learner = "L2";
  other.first_of_pair = true;
  const std::vector<NullTestLine> alone = {first, follow_up};
  REQUIRE(DistinctNullTests(alone).size() == 1);
  CHECK(DistinctNullTests(alone)[0] == &alone[0]);
  const std::vector<CalibrationRow> rows = CalibrationTable(alone, cells);
  REQUIRE(rows.size() == 1);
  CHECK(rows[0].tests == 1);
  CHECK(rows[0].rejected == 1);
  CHECK(DistinctNullTests({first, follow_up, other}).size() == 2);
}

TEST_CASE("calibration.csv of finished units") {
  std::vector<Cell> cells(1);
  cells[0].length = 100;
  std::map<Unit, UnitResult> units;
  units[{0, 0}].null_test_lines = {"0,0,t1,L1,drift-f,100,b,a,b,2,3,0.5,yes",
                                   "0,0,t1,L1,drift-f,100,c,a,c,9,3,0.01,no"};
  units[{0, 1}].null_test_lines = {"0,1,t1,L1,drift-f,100,b,a,b,2,3,0.06,yes"};
  // 0 of 2 and 1 of 1: CP(0, 2) upper 0.8418861169915811 (SciPy 1.10.1,
  // beta.ppf(0.975, 1, 2)); CP(1, 1) lower 0.025 (beta.ppf(0.025, 1, 1)).
  const std::string csv = CalibrationCsv(cells, units);
  CHECK(csv == CalibrationHeader() + "\n" + "drift-f,100,0.05,yes,2,0,0,0," +
                   Num(metrics::ClopperPearsonInterval(0, 2).high) + ",no\n" +
                   "drift-f,100,0.05,no,1,1,1," + Num(metrics::ClopperPearsonInterval(1, 1).low) +
                   ",1,no\n");
  CHECK(metrics::ClopperPearsonInterval(0, 2).high == doctest::Approx(0.8418861169915811).epsilon(1e-12));
  CHECK(metrics::ClopperPearsonInterval(1, 1).low == doctest::Approx(0.025).epsilon(1e-12));
}

}  // namespace
}  // namespace locind::app
