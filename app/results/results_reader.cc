#include "app/results/results_reader.h"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <map>
#include <sstream>

namespace locind::app {
namespace {

// One CSV file of ours (no quoted fields), with columns looked up by name.
// Every accessor throws Bad with the location of the offending field.
struct Bad {
  std::string message;
};

class Table {
 public:
  Table(std::string path, const std::string& text) : path_(std::move(path)) {
    std::istringstream in(text);
    std::string line;
    if (!std::getline(in, line)) throw Bad{path_ + ":1:1: header: the file is empty"};
    header_ = Split(line);
    for (size_t i = 0; i < header_.size(); ++i) column_[header_[i]] = i;
    for (int number = 2; std::getline(in, line); ++number) {
      if (line.empty()) continue;
      rows_.push_back({number, Split(line)});
      if (rows_.back().fields.size() != header_.size()) {
        throw Bad{Where(number, 1, "row") + std::to_string(rows_.back().fields.size()) +
                  " fields, the header has " + std::to_string(header_.size())};
      }
    }
  }

  size_t size() const { return rows_.size(); }
  bool Has(const std::string& name) const { return column_.count(name) > 0; }
  const std::string& Text(size_t row, const std::string& name) const {
    return rows_[row].fields[Column(name)];
  }
  double Number(size_t row, const std::string& name) const {
    const std::string& f = Text(row, name);
    if (f.empty()) return NAN;
    size_t used = 0;
    double v = NAN;
    try {
      v = std::stod(f, &used);
    } catch (const std::exception&) {
      used = 0;
    }
    if (used != f.size()) throw Bad{Where(rows_[row].number, ColumnNumber(name), name) + "expected a number, got '" + f + "'"};
    return v;
  }
  int Whole(size_t row, const std::string& name) const {
    const double v = Number(row, name);
    if (!(std::abs(v) < 1e9) || v != std::floor(v)) {
      throw Bad{Where(rows_[row].number, ColumnNumber(name), name) + "expected a whole number"};
    }
    return static_cast<int>(v);
  }
  bool YesNo(size_t row, const std::string& name) const {
    const std::string& f = Text(row, name);
    if (f != "yes" && f != "no") {
      throw Bad{Where(rows_[row].number, ColumnNumber(name), name) + "expected yes or no, got '" + f + "'"};
    }
    return f == "yes";
  }
  metrics::Interval Interval(size_t row, const std::string& name) const {
    return {Number(row, name), Number(row, name + "_low"), Number(row, name + "_high")};
  }

 private:
  struct Row {
    int number;
    std::vector<std::string> fields;
  };
  static std::vector<std::string> Split(const std::string& line) {
    std::vector<std::string> out;
    std::stringstream s(line);
    for (std::string f; std::getline(s, f, ',');) out.push_back(f);
    if (line.empty() || line.back() == ',') out.push_back("");
    return out;
  }
  std::string Where(int line, size_t column, const std::string& field) const {
    return path_ + ":" + std::to_string(line) + ":" + std::to_string(column) + ": " + field + ": ";
  }
  size_t Column(const std::string& name) const {
    auto it = column_.find(name);
    if (it == column_.end()) throw Bad{Where(1, 1, "header") + "no column '" + name + "'"};
    return it->second;
  }
  // 1-based character column where the field starts, for messages.
  size_t ColumnNumber(const std::string& name) const {
    size_t at = 1;
    for (size_t i = 0; i < Column(name); ++i) at += header_[i].size() + 1;
    return at;
  }

  std::string path_;
  std::vector<std::string> header_;
  std::map<std::string, size_t> column_;
  std::vector<Row> rows_;
};

std::optional<Table> Open(const std::string& dir, const std::string& file, bool required) {
  const std::string path = (std::filesystem::path(dir) / file).string();
  std::ifstream in(path, std::ios::binary);
  if (!in) {
    if (!required) return std::nullopt;
    throw Bad{path + ": cannot open the file (is this the folder of a finished locind run?)"};
  }
  std::ostringstream text;
  text << in.rdbuf();
  return Table(path, text.str());
}

// The design-aware scoring columns of one summary line.
void ReadGroups(const Table& t, size_t i, SummaryLine& s) {
  s.truths = t.Whole(i, "truths");
  s.power_ceiling = t.Number(i, "power_ceiling");
  s.reports_marks = t.Text(i, "reports_marks") == "yes";
  s.mark_agreement = t.Interval(i, "mark_agreement");
  for (int g = 0; g < metrics::kEdgeGroups; ++g) {
    const std::string name = metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(g));
    s.reports[g] = t.Text(i, "reports_" + name) == "yes";
    s.group_power[g] = t.Interval(i, name + "_power");
    s.group_false_edge_rate[g] = t.Interval(i, name + "_false_edge_rate");
    s.group_solid[g] = t.Whole(i, name + "_solid");
    s.group_solid_found[g] = t.Whole(i, name + "_solid_found");
    s.group_reported[g] = t.Whole(i, name + "_reported");
    s.group_false_edges[g] = t.Whole(i, name + "_false_edges");
  }
}

// The cause counts of one summary line, when the file has them.
void ReadAttribution(const Table& t, size_t i, SummaryLine& s) {
  s.solid = t.Whole(i, "solid");
  s.solid_found = t.Whole(i, "solid_found");
  s.false_edges = t.Whole(i, "false_edges");
  s.has_attribution = t.Has("missed_own_test");
  if (!s.has_attribution) return;
  const std::pair<const char*, int*> fields[] = {
      {"missed_own_test", &s.missed_own_test},         {"missed_propagation", &s.missed_propagation},
      {"missed_reach", &s.missed_reach},               {"false_own_test", &s.false_own_test},
      {"false_propagation", &s.false_propagation},     {"false_not_estimable", &s.false_not_estimable},
      {"false_reach", &s.false_reach}};
  for (const auto& [name, field] : fields) *field = t.Whole(i, name);
}

void ReadSummary(const Table& t, ReportData& d) {
  for (size_t i = 0; i < t.size(); ++i) {
    SummaryLine s;
    s.cell = t.Whole(i, "cell");
    s.length = t.Number(i, "length");
    s.level = t.Number(i, "level");
    s.hidden_count = t.Whole(i, "hidden_count");
    if (!t.Text(i, "stationarity_target").empty()) s.stationarity_target = t.Number(i, "stationarity_target");
    if (t.Has("trials")) s.trials = t.Whole(i, "trials");
    s.learner = t.Text(i, "learner");
    s.replicates = t.Whole(i, "replicates");
    s.failed = t.Whole(i, "failed");
    s.power = t.Interval(i, "power");
    s.false_edge_rate = t.Interval(i, "false_edge_rate");
    s.class_recovery = t.Interval(i, "class_recovery");
    s.hamming = t.Interval(i, "hamming");
    s.tests = t.Interval(i, "tests");
    s.seconds = t.Interval(i, "timing_learn_seconds");
    ReadGroups(t, i, s);
    ReadAttribution(t, i, s);
    d.summary.push_back(std::move(s));
  }
}

void ReadComparisons(const Table& t, ReportData& d) {
  for (size_t i = 0; i < t.size(); ++i) {
    ComparisonLine c;
    c.cell = t.Whole(i, "cell");
    c.length = t.Number(i, "length");
    c.level = t.Number(i, "level");
    c.hidden_count = t.Whole(i, "hidden_count");
    c.learner = t.Text(i, "learner");
    c.reference = t.Text(i, "reference");
    c.paired = t.Whole(i, "paired");
    c.truths = t.Whole(i, "truths");
    c.power = t.Interval(i, "power_difference");
    c.directed_power = t.Interval(i, "directed_power_difference");
    c.false_edge_rate = t.Interval(i, "false_edge_rate_difference");
    c.class_recovery = t.Interval(i, "class_recovery_difference");
    d.comparisons.push_back(std::move(c));
  }
}

void ReadEdges(const Table& t, ReportData& d) {
  for (size_t i = 0; i < t.size(); ++i) {
    EdgeLine e;
    e.cell = t.Whole(i, "cell");
    e.replicate = t.Whole(i, "replicate");
    e.truth = t.Text(i, "truth");
    e.learner = t.Text(i, "learner");
    e.edge = t.Text(i, "edge");
    e.truth_status = t.Text(i, "truth_status");
    e.reported = t.Text(i, "learner_action") == "reported";
    e.learner_mark = t.Text(i, "learner_mark");
    if (t.Has("decision_rule")) e.decision_rule = t.Text(i, "decision_rule");
    if (t.Has("error_cause")) e.error_cause = t.Text(i, "error_cause");
    d.edges.push_back(std::move(e));
  }
}

void ReadNullTests(const Table& t, ReportData& d) {
  for (size_t i = 0; i < t.size(); ++i) {
    NullTestLine n;
    n.cell = t.Whole(i, "cell");
    n.replicate = t.Whole(i, "replicate");
    n.learner = t.Text(i, "learner");
    n.test = t.Text(i, "test");
    n.length = t.Number(i, "length");
    n.target = t.Text(i, "test_target");
    n.sources = t.Text(i, "test_sources");
    n.given = t.Text(i, "test_given");
    n.p_value = t.Number(i, "test_p_value");
    n.all_parents_given = t.YesNo(i, "all_parents_given");
    if (t.Has("first_of_pair")) n.first_of_pair = t.YesNo(i, "first_of_pair");
    d.null_tests.push_back(std::move(n));
  }
}

void ReadPlan(const Table& t, ReportData& d) {
  for (size_t i = 0; i < t.size(); ++i) {
    PlanLine p;
    p.learner = t.Text(i, "learner");
    p.target_power = t.Number(i, "target_power");
    p.target_false_edge_rate = t.Number(i, "target_false_edge_rate");
    p.reached = t.Text(i, "reached") == "yes";
    p.length = t.Number(i, "length");
    // The combination of the other grid factors (columns added with per-combination plans).
    if (t.Has("level")) p.level = t.Number(i, "level");
    if (t.Has("hidden_count")) p.hidden_count = t.Whole(i, "hidden_count");
    if (t.Has("stationarity_target") && !t.Text(i, "stationarity_target").empty()) {
      p.stationarity_target = t.Number(i, "stationarity_target");
    }
    if (t.Has("searched")) p.searched = t.Text(i, "searched");
    if (t.Has("trials") && !t.Text(i, "trials").empty()) p.trials = t.Whole(i, "trials");
    d.plan.push_back(std::move(p));
  }
}

}  // namespace

bool PlanLine::Fits(double panel_level, int panel_hidden_count, std::optional<double> panel_target) const {
  if (!level) return true;  // plan.csv from before the combination columns
  return *level == panel_level && (!hidden_count || *hidden_count == panel_hidden_count) &&
         stationarity_target == panel_target;
}

Result<ReportData> ReadReportData(const std::string& dir) {
  ReportData d;
  try {
    ReadSummary(*Open(dir, "summary.csv", true), d);
    if (std::optional<Table> c = Open(dir, "comparisons.csv", false)) ReadComparisons(*c, d);
    ReadEdges(*Open(dir, "edges.csv", true), d);
    ReadNullTests(*Open(dir, "null_tests.csv", true), d);
    if (std::optional<Table> plan = Open(dir, "plan.csv", false)) ReadPlan(*plan, d);
  } catch (const Bad& bad) {
    return Status::Error(bad.message);
  }
  return d;
}

}  // namespace locind::app
