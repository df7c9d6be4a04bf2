// Reading a result folder back for the report: columns by name, clear
// FILE:LINE:COLUMN: FIELD messages, plan.csv optional.
#include "app/results/results_reader.h"

#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>

#include <unistd.h>

#include "app/results/results_rows.h"
#include "app/running/study_planner.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;

// A result folder of its own per test process and test case: ctest runs the
// test cases of this file as parallel processes.
struct Folder {
  fs::path dir;
  explicit Folder(const std::string& test)
      : dir(fs::temp_directory_path() /
            ("locind_report_data_test_" + std::to_string(::getpid()) + "_" + test)) {
    fs::remove_all(dir);
    fs::create_directories(dir);
    Write("summary.csv", SummaryHeader() + "\n" +
                             "0,250,0.05,2,0.6,pairwise/hawkes-lr,8,1,0.5,0.25,0.75,,,,0,0,0.3,1.5,1,2,12,11,13,1,"
                             "1,1,10,5,2,0,6,0,"
                             // truths .. marks_agree, then directed, loop, bidirected
                             "2,0.8,yes,yes,no,no,,,,,,"
                             "0.6,0.4,0.8,5,3,0,0,0,4,0,"
                             "0.4,0.2,0.6,5,2,0,0,0,2,0,"
                             ",,,0,0,,,,0,0,"
                             // seconds, then not_estimable, the ten attribution counts and trials
                             "0.01,0.005,0.02,0,7,1,0,2,2,1,0,0,0,0,2\n");
    Write("edges.csv", EdgeHeader() + "\n" +
                           "0,1,t1,pairwise/hawkes-lr,a -> b,directed,solid,reported,,kept,test,dependent,b,a,b,3.2,"
                           "0.01,ok,dependent,test,,,\n");
    Write("null_tests.csv", NullTestHeader() + "\n" + "0,1,t1,pairwise/hawkes-lr,hawkes-lr,250,a,b,a;c,1.5,3,0.68,yes,no\n");
  }
  ~Folder() { fs::remove_all(dir); }
  void Write(const std::string& name, const std::string& text) const { std::ofstream(dir / name) << text; }
};

TEST_CASE("the files of a result folder read back by column name") {
  Folder f("read_back");
  const Result<ReportData> d = ReadReportData(f.dir.string());
  REQUIRE_MESSAGE(d.ok(), (d.ok() ? "" : d.status().message()));
  REQUIRE(d->summary.size() == 1);
  const SummaryLine& s = d->summary[0];
  CHECK(s.length == 250);
  CHECK(s.hidden_count == 2);
  CHECK(*s.stationarity_target == 0.6);
  CHECK(s.learner == "pairwise/hawkes-lr");
  CHECK(s.replicates == 8);
  CHECK(s.failed == 1);
  CHECK(s.trials == 2);
  CHECK(s.power.low == 0.25);
  CHECK(std::isnan(s.false_edge_rate.estimate));
  CHECK(s.tests.estimate == 12);
  CHECK(s.seconds.high == 0.02);
  CHECK(s.truths == 2);
  CHECK(s.power_ceiling == 0.8);
  CHECK(s.reports[int(metrics::EdgeGroup::kLoop)]);
  CHECK_FALSE(s.reports[int(metrics::EdgeGroup::kBidirected)]);
  CHECK_FALSE(s.reports_marks);
  CHECK(std::isnan(s.mark_agreement.estimate));
  CHECK(s.group_power[int(metrics::EdgeGroup::kDirected)].low == 0.4);
  CHECK(s.group_solid_found[int(metrics::EdgeGroup::kLoop)] == 2);
  CHECK(s.group_reported[int(metrics::EdgeGroup::kDirected)] == 4);
  // The causes: 5 missed solid edges (10 solid, 5 found) as 2 + 2 + 1, no false edge.
  CHECK(s.has_attribution);
  CHECK(s.solid == 10);
  CHECK(s.solid_found == 5);
  CHECK(s.missed_own_test == 2);
  CHECK(s.missed_propagation == 2);
  CHECK(s.missed_reach == 1);
  CHECK(s.false_edges + s.false_own_test + s.false_reach == 0);
  REQUIRE(d->edges.size() == 1);
  CHECK(d->edges[0].decision_rule == "dependent");
  CHECK(d->edges[0].error_cause.empty());
  CHECK(d->edges[0].edge == "a -> b");
  CHECK(d->edges[0].reported);
  CHECK(d->edges[0].truth_status == "solid");
  REQUIRE(d->null_tests.size() == 1);
  CHECK(d->null_tests[0].given == "a;c");
  CHECK(d->null_tests[0].p_value == 0.68);
  CHECK(d->null_tests[0].all_parents_given);
  CHECK_FALSE(d->null_tests[0].first_of_pair);
  CHECK(d->plan.empty());
}

TEST_CASE("a null_tests.csv written before first_of_pair reads every row as a first test") {
  Folder f("before_first_of_pair");
  f.Write("null_tests.csv",
          "cell,replicate,truth,learner,test,length,test_target,test_sources,test_given,"
          "test_statistic,test_df,test_p_value,all_parents_given\n"
          "0,1,t1,pairwise/hawkes-lr,hawkes-lr,250,a,b,a;c,1.5,3,0.68,yes\n");
  const Result<ReportData> d = ReadReportData(f.dir.string());
  REQUIRE_MESSAGE(d.ok(), (d.ok() ? "" : d.status().message()));
  REQUIRE(d->null_tests.size() == 1);
  CHECK(d->null_tests[0].p_value == 0.68);
  CHECK(d->null_tests[0].first_of_pair);
}

TEST_CASE("plan.csv is read when present") {
  Folder f("plan");
  LearnerPlan reached;
  reached.learner = "pairwise/hawkes-lr";
  reached.reached = true;
  reached.length = 750;
  reached.cap = 16000;
  LearnerPlan missed = reached;
  missed.learner = "screen/hawkes-lr";
  missed.reached = false;
  f.Write("plan.csv", PlanCsv({reached, missed}, PlanTargets{0.8, 0.05}));
  const Result<ReportData> d = ReadReportData(f.dir.string());
  REQUIRE(d.ok());
  REQUIRE(d->plan.size() == 2);
  CHECK(d->plan[0].reached);
  CHECK(d->plan[0].length == 750);
  CHECK(d->plan[0].target_power == 0.8);
  CHECK_FALSE(d->plan[1].reached);
  CHECK(std::isnan(d->plan[1].length));
}

TEST_CASE("each plan.csv row names its combination and fits only that panel") {
  Folder f("combination");
  LearnerPlan one;
  one.learner = "pairwise/hawkes-lr";
  one.reached = true;
  one.length = 750;
  one.at = PlanCombination{2, 2, 0.6, 0.05};
  LearnerPlan other = one;
  other.at = PlanCombination{-1, 1, std::nullopt, 0.2};
  f.Write("plan.csv", PlanCsv({one, other}, PlanTargets{0.8, 0.05}));
  const Result<ReportData> d = ReadReportData(f.dir.string());
  REQUIRE(d.ok());
  REQUIRE(d->plan.size() == 2);
  CHECK(*d->plan[0].level == 0.05);
  CHECK(*d->plan[0].hidden_count == 2);
  CHECK(*d->plan[0].stationarity_target == 0.6);
  CHECK_FALSE(d->plan[1].stationarity_target);
  CHECK(d->plan[0].Fits(0.05, 2, 0.6));
  CHECK_FALSE(d->plan[0].Fits(0.05, 1, 0.6));      // another hidden count
  CHECK_FALSE(d->plan[0].Fits(0.2, 2, 0.6));       // another level
  CHECK_FALSE(d->plan[0].Fits(0.05, 2, 0.4));      // another target
  CHECK_FALSE(d->plan[0].Fits(0.05, 2, std::nullopt));
  CHECK(d->plan[1].Fits(0.2, 1, std::nullopt));
  CHECK_FALSE(d->plan[1].Fits(0.2, 1, 0.6));
  // What was searched, and the combination's number of trials.
  CHECK(d->plan[0].searched == "length");
  CHECK(*d->plan[0].trials == 1);
  // A plan.csv from before the combination columns fits every panel.
  f.Write("plan.csv", "learner,target_power,target_false_edge_rate,reached,length,optimistic_length,"
                      "conservative_length,cap\npairwise/hawkes-lr,0.8,0.05,yes,750,,,16000\n");
  const Result<ReportData> old = ReadReportData(f.dir.string());
  REQUIRE(old.ok());
  CHECK_FALSE(old->plan[0].level);
  CHECK(old->plan[0].Fits(0.2, 3, 0.5));
}

TEST_CASE("missing files, ragged rows and bad numbers name file, line, column and field") {
  Folder f("problems");
  fs::remove(f.dir / "null_tests.csv");
  Result<ReportData> d = ReadReportData(f.dir.string());
  REQUIRE_FALSE(d.ok());
  CHECK(d.status().message() == (f.dir / "null_tests.csv").string() +
                                    ": cannot open the file (is this the folder of a finished locind run?)");
  f.Write("null_tests.csv", NullTestHeader() + "\n0,1,t1\n");
  d = ReadReportData(f.dir.string());
  REQUIRE_FALSE(d.ok());
  CHECK(d.status().message() == (f.dir / "null_tests.csv").string() + ":2:1: row: 3 fields, the header has 14");
  f.Write("null_tests.csv", NullTestHeader() + "\n0,1,t1,l,hawkes-lr,250,a,b,a,1.5,3,0.5,perhaps,yes\n");
  d = ReadReportData(f.dir.string());
  REQUIRE_FALSE(d.ok());
  // all_parents_given starts at character 114 of the header.
  CHECK(d.status().message() == (f.dir / "null_tests.csv").string() +
                                    ":2:114: all_parents_given: expected yes or no, got 'perhaps'");
  f.Write("null_tests.csv", NullTestHeader() + "\n0,1,t1,l,hawkes-lr,250,a,b,a,1.5,3,high,no,yes\n");
  d = ReadReportData(f.dir.string());
  REQUIRE_FALSE(d.ok());
  // test_p_value starts at character 101 of the header.
  CHECK(d.status().message() == (f.dir / "null_tests.csv").string() +
                                    ":2:101: test_p_value: expected a number, got 'high'");
  f.Write("summary.csv", "cell,length\n0,250\n");
  d = ReadReportData(f.dir.string());
  REQUIRE_FALSE(d.ok());
  CHECK(d.status().message() == (f.dir / "summary.csv").string() + ":1:1: header: no column 'level'");
  f.Write("summary.csv", "");
  d = ReadReportData(f.dir.string());
  REQUIRE_FALSE(d.ok());
  CHECK(d.status().message() == (f.dir / "summary.csv").string() + ":1:1: header: the file is empty");
}

}  // namespace
}  // namespace locind::app
