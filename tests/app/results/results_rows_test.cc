// Output columns: a golden copy of every header (a renamed or moved column
// fails here and must be documented in results/README.md), and replicate
// rows that read back to what was written.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <regex>
#include <sstream>

#include "app/results/results_rows.h"
#include "app/running/runner_journal.h"

namespace locind::app {
namespace {

TEST_CASE("replicates.csv header") {
  std::string groups;
  for (const char* g : {"", "directed_", "loop_", "bidirected_"}) {
    for (const char* c : {"reported", "in_class", "false_edges", "solid", "solid_found", "missed_solid",
                          "dashed", "dashed_found"}) {
      groups += std::string(",") + g + c;
    }
  }
  CHECK(ReplicateHeader() ==
        "cell,replicate,truth,length,level,hidden_count,stationarity_target,stationarity_value,"
        "learner,method,test,status,message,observed_points" + groups +
        ",power,false_edge_rate,hamming,class_recovered,marks_compared,marks_agree,mark_agreement,"
        "tests,not_estimable,largest_given,"
        "timing_simulate_seconds,timing_test_seconds,timing_learn_seconds,timing_score_seconds,"
        "test_correct,test_false_separation,test_false_dependence,missed_own_test,"
        "missed_propagation,missed_reach,false_own_test,false_propagation,false_not_estimable,"
        "false_reach,trials");
}

TEST_CASE("edges.csv, null_tests.csv and summary.csv headers") {
  CHECK(EdgeHeader() ==
        "cell,replicate,truth,learner,edge,edge_group,truth_status,learner_action,learner_mark,"
        "decision,decision_phase,decision_rule,witness_target,witness_sources,witness_given,"
        "witness_statistic,witness_p_value,witness_status,witness_decision,witness_origin,"
        "more_witnesses,error_cause,error_test");
  CHECK(NullTestHeader() ==
        "cell,replicate,truth,learner,test,length,test_target,test_sources,test_given,"
        "test_statistic,test_df,test_p_value,all_parents_given,first_of_pair");
  std::string groups;
  for (const char* g : {"directed_", "loop_", "bidirected_"}) {
    for (const char* c : {"power", "power_low", "power_high", "solid", "solid_found", "false_edge_rate",
                          "false_edge_rate_low", "false_edge_rate_high", "reported", "false_edges"}) {
      groups += std::string(g) + c + ",";
    }
  }
  CHECK(SummaryHeader() ==
        "cell,length,level,hidden_count,stationarity_target,learner,replicates,failed,"
        "power,power_low,power_high,false_edge_rate,false_edge_rate_low,false_edge_rate_high,"
        "class_recovery,class_recovery_low,class_recovery_high,hamming,hamming_low,hamming_high,"
        "tests,tests_low,tests_high,largest_given,largest_given_low,largest_given_high,"
        "solid,solid_found,dashed,dashed_found,reported,false_edges,"
        "truths,power_ceiling,reports_directed,reports_loop,reports_bidirected,reports_marks,"
        "mark_agreement,mark_agreement_low,mark_agreement_high,marks_compared,marks_agree," +
        groups +
        "timing_learn_seconds,timing_learn_seconds_low,timing_learn_seconds_high,not_estimable,"
        "test_correct,test_false_separation,test_false_dependence,missed_own_test,"
        "missed_propagation,missed_reach,false_own_test,false_propagation,false_not_estimable,"
        "false_reach,trials");
}

TEST_CASE("every documented column is in results/README.md") {
  std::ifstream in("results/README.md");
  std::stringstream doc;
  doc << in.rdbuf();
  REQUIRE_FALSE(doc.str().empty());
  for (const std::string* header : {&ReplicateHeader(), &EdgeHeader(), &NullTestHeader(), &SummaryHeader()}) {
    std::stringstream s(*header);
    for (std::string column; std::getline(s, column, ',');) {
      // Per-group columns are documented once as <group>_<count>.
      const std::regex grouped("^(directed|loop|bidirected)_");
      const std::string name = std::regex_replace(column, grouped, "");
      CHECK_MESSAGE(doc.str().find("`" + name + "`") != std::string::npos, column);
    }
  }
}

TEST_CASE("a replicate row reads back exactly, failed rows included") {
  ReplicateRow r;
  r.cell = 3;
  r.replicate = 17;
  r.truth = "hidden1-t2";
  r.length = 812.5;
  r.level = 0.01;
  r.hidden_count = 1;
  r.stationarity_target = 0.6;
  r.stationarity_value = 0.6000000000000001;
  r.learner = "screen/hawkes-lr";
  r.method = "screen";
  r.test = "hawkes-lr";
  r.observed_points = 12345;
  r.score.total.reported = 7;
  r.score.total.false_edges = 2;
  r.score.by_group[1].solid = 3;
  r.score.power = 1.0 / 3.0;
  r.score.false_edge_rate = NAN;
  r.score.hamming = 4;
  r.score.class_recovered = true;
  r.tests = 40;
  r.largest_given = 2;
  r.timing_learn_seconds = 0.123456789;
  r.score.marks_compared = 5;
  r.score.marks_agree = 4;
  r.score.mark_agreement = 0.8;
  // The attribution columns travel too (journal, --part merge, MPI).
  r.attribution.tests.false_separation = 6;
  r.attribution.missed_propagation = 2;
  r.attribution.false_not_estimable = 1;
  r.trials = 3;  // the last column (grid.trials)
  const std::string line = FormatReplicateRow(r);
  CHECK(line.find(",0.3333333333333333,,4,1,5,4,0.8,40,") != std::string::npos);  // NaN is an empty field
  CHECK(line.substr(line.size() - 22) == ",0,6,0,0,2,0,0,0,1,0,3");
  const std::optional<ReplicateRow> back = ParseReplicateRow(line);
  REQUIRE(back.has_value());
  CHECK(FormatReplicateRow(*back) == line);
  CHECK(back->attribution.missed_propagation == 2);
  CHECK(back->attribution.false_not_estimable == 1);
  CHECK(back->score.by_group[1].solid == 3);
  CHECK(back->score.marks_agree == 4);
  CHECK(back->score.mark_agreement == 0.8);
  CHECK(back->trials == 3);
  CHECK(std::isnan(back->score.false_edge_rate));

  r.ok = false;
  r.message = "simulation: cap, \"reached\"\nat 40 events";
  const std::string failed = FormatReplicateRow(r);
  CHECK(failed.find(",failed,simulation: cap;  reached  at 40 events,") != std::string::npos);
  REQUIRE(ParseReplicateRow(failed).has_value());
  CHECK_FALSE(ParseReplicateRow(failed)->ok);
  CHECK_FALSE(ParseReplicateRow(failed + ",1").has_value());
}

TEST_CASE("journal lines: a unit reads back, torn or malformed lines do not") {
  UnitResult u;
  u.unit = Unit{2, 5};
  ReplicateRow r;
  r.cell = 2;
  r.replicate = 5;
  r.truth = "t1";
  r.learner = "pairwise/oracle";
  u.rows = {r, r};
  u.edge_lines = {"2,5,t1,pairwise/oracle,a -> b,directed,solid,reported,,b,a,b,0,0,ok,dependent"};
  u.null_test_lines = {"2,5,t1,pairwise/hawkes-lr,hawkes-lr,100,a,b,a,1.5,3,0.68", "2,5,t1,x,y,1,a,b,a,0,3,1"};
  const std::string line = EncodeUnit(u);
  const std::optional<UnitResult> back = DecodeUnit(line);
  REQUIRE(back.has_value());
  CHECK(back->unit == u.unit);
  CHECK(back->rows.size() == 2);
  CHECK(back->edge_lines == u.edge_lines);
  CHECK(back->null_test_lines == u.null_test_lines);
  CHECK(EncodeUnit(*back) == line);
  CHECK_FALSE(DecodeUnit(line.substr(0, line.size() - 4)).has_value());  // no end mark
  CHECK_FALSE(DecodeUnit(line.substr(0, line.size() / 2)).has_value());
  // Counts that do not add up to the fields (or would overflow) are refused.
  CHECK_FALSE(DecodeUnit("unit\t2\t5\t0\t1\t0\tend").has_value());
  CHECK_FALSE(DecodeUnit("unit\t2\t5\t18446744073709551615\t1\t0\tx\tend").has_value());
  CHECK(DecodeUnit("unit\t2\t5\t0\t0\t1\tx\tend")->null_test_lines == std::vector<std::string>{"x"});
}

}  // namespace
}  // namespace locind::app
