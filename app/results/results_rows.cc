#include "app/results/results_rows.h"
#include "base/number_format.h"

#include <cmath>
#include <iterator>
#include <sstream>

#include "app/io/event_csv.h"
#include "app/results/decision_rows.h"

namespace locind::app {
namespace {

constexpr const char* kCountNames[] = {"reported", "in_class", "false_edges", "solid",
                                       "solid_found", "missed_solid", "dashed", "dashed_found"};

std::vector<int*> CountFields(metrics::EdgeCounts& c) {
  return {&c.reported, &c.in_class, &c.false_edges, &c.solid,
          &c.solid_found, &c.missed_solid, &c.dashed, &c.dashed_found};
}

// --- Why edges were lost (metrics/error_attribution.h) ---

constexpr const char* kAttributionNames[] = {
    "test_correct",     "test_false_separation", "test_false_dependence", "missed_own_test",
    "missed_propagation", "missed_reach",        "false_own_test",        "false_propagation",
    "false_not_estimable", "false_reach"};

std::vector<int*> AttributionFields(metrics::ErrorAttribution& a) {
  return {&a.tests.correct,       &a.tests.false_separation, &a.tests.false_dependence,
          &a.missed_own_test,     &a.missed_propagation,     &a.missed_reach,
          &a.false_own_test,      &a.false_propagation,      &a.false_not_estimable,
          &a.false_reach};
}

constexpr size_t kAttributionColumns = std::size(kAttributionNames);

std::string AttributionHeader() {
  std::string h;
  for (const char* n : kAttributionNames) h += std::string(",") + n;
  return h;
}

std::string BuildReplicateHeader() {
  std::string h = "cell,replicate,truth,length,level,hidden_count,stationarity_target,"
                  "stationarity_value,learner,method,test,status,message,observed_points";
  for (const char* n : kCountNames) h += std::string(",") + n;
  for (int g = 0; g < metrics::kEdgeGroups; ++g) {
    for (const char* n : kCountNames) {
      h += std::string(",") + metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(g)) + "_" + n;
    }
  }
  h += ",power,false_edge_rate,hamming,class_recovered,marks_compared,marks_agree,mark_agreement,"
       "tests,not_estimable,largest_given,"
       "timing_simulate_seconds,timing_test_seconds,timing_learn_seconds,timing_score_seconds";
  h += AttributionHeader();
  h += ",trials";
  return h;
}

std::vector<std::string> SplitCommas(const std::string& line) {
  std::vector<std::string> out;
  size_t start = 0;
  while (true) {
    const size_t comma = line.find(',', start);
    out.push_back(line.substr(start, comma == std::string::npos ? std::string::npos : comma - start));
    if (comma == std::string::npos) return out;
    start = comma + 1;
  }
}

bool ReadNumber(const std::string& text, double& out) {
  if (text.empty()) {
    out = NAN;
    return true;
  }
  return csv::ParseNumber(text, out);
}

bool ReadInt(const std::string& text, int& out) {
  double v = 0;
  if (!csv::ParseNumber(text, v) || v != std::floor(v)) return false;
  out = static_cast<int>(v);
  return true;
}

// Summary columns of the design-aware scoring (results/README.md): truths,
// the method's reach and power ceiling, mark agreement, and power and false
// edges per edge group. Each ends with a comma.
std::string SummaryScoreColumns() {
  std::string h = "truths,power_ceiling,reports_directed,reports_loop,reports_bidirected,reports_marks,"
                  "mark_agreement,mark_agreement_low,mark_agreement_high,marks_compared,marks_agree,";
  for (int g = 0; g < metrics::kEdgeGroups; ++g) {
    const std::string p = std::string(metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(g))) + "_";
    h += p + "power," + p + "power_low," + p + "power_high," + p + "solid," + p + "solid_found," + p +
         "false_edge_rate," + p + "false_edge_rate_low," + p + "false_edge_rate_high," + p + "reported," +
         p + "false_edges,";
  }
  return h;
}

}  // namespace

std::string Num(double value) { return std::isnan(value) ? "" : base::FormatNumber(value); }

std::string CleanText(const std::string& text) {
  std::string out = text;
  for (char& ch : out) {
    if (ch == ',') ch = ';';
    if (ch == '"' || ch == '\t' || ch == '\n' || ch == '\r') ch = ' ';
  }
  return out;
}

const std::string& ReplicateHeader() {
  static const std::string header = BuildReplicateHeader();
  return header;
}

const std::string& EdgeHeader() {
  static const std::string header =
      "cell,replicate,truth,learner,edge,edge_group,truth_status,learner_action,learner_mark," +
      EdgeDecisionColumns() + "," + EdgeAttributionColumns();
  return header;
}

const std::string& NullTestHeader() {
  static const std::string header =
      "cell,replicate,truth,learner,test,length,test_target,test_sources,test_given,"
      "test_statistic,test_df,test_p_value,all_parents_given,first_of_pair";
  return header;
}

const std::string& SummaryHeader() {
  static const std::string header =
      "cell,length,level,hidden_count,stationarity_target,learner,replicates,failed,"
      "power,power_low,power_high,false_edge_rate,false_edge_rate_low,false_edge_rate_high,"
      "class_recovery,class_recovery_low,class_recovery_high,hamming,hamming_low,hamming_high,"
      "tests,tests_low,tests_high,largest_given,largest_given_low,largest_given_high,"
      "solid,solid_found,dashed,dashed_found,reported,false_edges," +
      SummaryScoreColumns() +
      "timing_learn_seconds,timing_learn_seconds_low,timing_learn_seconds_high,"
      "not_estimable" +
      AttributionHeader() + ",trials";
  return header;
}

const std::string& ComparisonHeader() {
  static const std::string header =
      "cell,length,level,hidden_count,stationarity_target,learner,reference,paired,truths,"
      "power_difference,power_difference_low,power_difference_high,"
      "directed_power_difference,directed_power_difference_low,directed_power_difference_high,"
      "false_edge_rate_difference,false_edge_rate_difference_low,false_edge_rate_difference_high,"
      "class_recovery_difference,class_recovery_difference_low,class_recovery_difference_high";
  return header;
}

std::string FormatReplicateRow(const ReplicateRow& r) {
  std::ostringstream o;
  o << r.cell << "," << r.replicate << "," << r.truth << "," << Num(r.length) << "," << Num(r.level)
    << "," << r.hidden_count << "," << (r.stationarity_target ? Num(*r.stationarity_target) : "")
    << "," << Num(r.stationarity_value) << "," << r.learner << "," << r.method << "," << r.test
    << "," << (r.ok ? "ok" : "failed") << "," << CleanText(r.message) << ","
    << Num(r.observed_points);
  metrics::ReplicateScore s = r.score;
  for (int* v : CountFields(s.total)) o << "," << *v;
  for (auto& group : s.by_group) {
    for (int* v : CountFields(group)) o << "," << *v;
  }
  o << "," << Num(s.power) << "," << Num(s.false_edge_rate) << "," << s.hamming << ","
    << (s.class_recovered ? 1 : 0) << "," << s.marks_compared << "," << s.marks_agree << ","
    << Num(s.mark_agreement) << "," << r.tests << "," << r.not_estimable << ","
    << r.largest_given << "," << Num(r.timing_simulate_seconds) << ","
    << Num(r.timing_test_seconds) << "," << Num(r.timing_learn_seconds) << ","
    << Num(r.timing_score_seconds);
  metrics::ErrorAttribution a = r.attribution;
  for (int* v : AttributionFields(a)) o << "," << *v;
  o << "," << r.trials;
  return o.str();
}

std::optional<ReplicateRow> ParseReplicateRow(const std::string& line) {
  const std::vector<std::string> f = SplitCommas(line);
  constexpr size_t kCounts = 8 * (1 + metrics::kEdgeGroups);
  if (f.size() != 14 + kCounts + 14 + kAttributionColumns + 1) return std::nullopt;
  ReplicateRow r;
  double target = 0;
  bool ok = ReadInt(f[0], r.cell) && ReadInt(f[1], r.replicate) && ReadNumber(f[3], r.length) &&
            ReadNumber(f[4], r.level) && ReadInt(f[5], r.hidden_count) &&
            ReadNumber(f[6], target) && ReadNumber(f[7], r.stationarity_value) &&
            ReadNumber(f[13], r.observed_points);
  r.truth = f[2];
  if (!std::isnan(target)) r.stationarity_target = target;
  r.learner = f[8];
  r.method = f[9];
  r.test = f[10];
  r.ok = f[11] == "ok";
  ok = ok && (r.ok || f[11] == "failed");
  r.message = f[12];
  size_t i = 14;
  for (int* v : CountFields(r.score.total)) ok = ok && ReadInt(f[i++], *v);
  for (auto& group : r.score.by_group) {
    for (int* v : CountFields(group)) ok = ok && ReadInt(f[i++], *v);
  }
  int recovered = 0;
  ok = ok && ReadNumber(f[i], r.score.power) && ReadNumber(f[i + 1], r.score.false_edge_rate) &&
       ReadInt(f[i + 2], r.score.hamming) && ReadInt(f[i + 3], recovered);
  i += 4;
  ok = ok && ReadInt(f[i], r.score.marks_compared) && ReadInt(f[i + 1], r.score.marks_agree) &&
       ReadNumber(f[i + 2], r.score.mark_agreement);
  i += 3;
  ok = ok && ReadInt(f[i], r.tests) && ReadInt(f[i + 1], r.not_estimable) &&
       ReadInt(f[i + 2], r.largest_given) && ReadNumber(f[i + 3], r.timing_simulate_seconds) &&
       ReadNumber(f[i + 4], r.timing_test_seconds) && ReadNumber(f[i + 5], r.timing_learn_seconds) &&
       ReadNumber(f[i + 6], r.timing_score_seconds);
  r.score.class_recovered = recovered != 0;
  i += 7;
  for (int* v : AttributionFields(r.attribution)) ok = ok && ReadInt(f[i++], *v);
  ok = ok && ReadInt(f[i], r.trials) && r.trials >= 1;
  if (!ok) return std::nullopt;
  return r;
}

std::string FormatSummaryRow(const Cell& cell, const std::string& learner,
                             const metrics::CellSummary& s) {
  std::ostringstream o;
  auto interval = [&o](const metrics::Interval& i) {
    o << "," << Num(i.estimate) << "," << Num(i.low) << "," << Num(i.high);
  };
  o << cell.index << "," << Num(cell.length) << "," << Num(cell.level) << "," << cell.hidden_count
    << "," << (cell.stationarity ? Num(*cell.stationarity) : "") << "," << learner << ","
    << s.replicates << "," << s.failed;
  interval(s.power);
  interval(s.false_edge_rate);
  interval(s.class_recovery);
  interval(s.hamming);
  interval(s.tests);
  interval(s.largest_given);
  o << "," << s.totals.solid << "," << s.totals.solid_found << "," << s.totals.dashed << ","
    << s.totals.dashed_found << "," << s.totals.reported << "," << s.totals.false_edges;
  // Design-aware scoring block (SummaryScoreColumns).
  auto yes = [](bool b) { return b ? ",yes" : ",no"; };
  o << "," << s.truths << "," << Num(s.power_ceiling);
  for (bool g : s.reach.groups) o << yes(g);
  o << yes(s.reach.marks);
  interval(s.mark_agreement);
  o << "," << (s.reach.marks ? std::to_string(s.marks_compared) : "") << ","
    << (s.reach.marks ? std::to_string(s.marks_agree) : "");
  for (const metrics::GroupSummary& g : s.groups) {
    interval(g.power);
    o << "," << g.totals.solid << "," << g.totals.solid_found;
    interval(g.false_edge_rate);
    o << "," << g.totals.reported << "," << g.totals.false_edges;
  }
  interval(s.seconds);
  o << "," << s.not_estimable;
  metrics::ErrorAttribution a = s.attribution;
  for (int* v : AttributionFields(a)) o << "," << *v;
  o << "," << cell.trials;
  return o.str();
}

std::string FormatComparisonRow(const Cell& cell, const std::string& learner,
                                const std::string& reference, const metrics::LearnerComparison& c) {
  std::ostringstream o;
  o << cell.index << "," << Num(cell.length) << "," << Num(cell.level) << "," << cell.hidden_count
    << "," << (cell.stationarity ? Num(*cell.stationarity) : "") << "," << learner << "," << reference
    << "," << c.paired << "," << c.truths;
  for (const metrics::Interval& i : {c.power, c.directed_power, c.false_edge_rate, c.class_recovery}) {
    o << "," << Num(i.estimate) << "," << Num(i.low) << "," << Num(i.high);
  }
  return o.str();
}

metrics::ReplicateRecord RecordOf(const ReplicateRow& row) {
  metrics::ReplicateRecord r;
  r.ok = row.ok;
  r.score = row.score;
  r.tests = row.tests;
  r.largest_given = row.largest_given;
  r.seconds = row.timing_learn_seconds;
  r.not_estimable = row.not_estimable;
  r.attribution = row.attribution;
  return r;
}

}  // namespace locind::app
