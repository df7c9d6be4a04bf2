#include "app/results/results_calibration.h"

#include <charconv>
#include <cstdio>
#include <set>
#include <sstream>
#include <string_view>
#include <tuple>

#include "app/io/event_csv.h"

namespace locind::app {
namespace {

using GroupKey = std::tuple<std::string, double, double, bool>;  // test, length, level, !all_parents_given

std::string Fixed3(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.3f", value);
  return buffer;
}

// Column index of `name` in the null_tests.csv header.
size_t NullTestColumn(const std::string& name) {
  std::istringstream in(NullTestHeader());
  size_t index = 0;
  for (std::string f; std::getline(in, f, ','); ++index) {
    if (f == name) return index;
  }
  return index;  // not there: one past the last field, so a lookup fails
}

bool ParseWhole(std::string_view text, int& out) {
  const auto r = std::from_chars(text.data(), text.data() + text.size(), out);
  return r.ec == std::errc() && r.ptr == text.data() + text.size();
}

}  // namespace

std::vector<const NullTestLine*> DistinctNullTests(const std::vector<NullTestLine>& lines) {
  std::set<std::tuple<std::string, int, int, std::string, std::string, std::string>> seen;
  std::vector<const NullTestLine*> out;
  for (const NullTestLine& n : lines) {
    // A follow-up of the same pair was asked because of an earlier rejection
    // on the same data (metrics::FirstOfPair): not a fair trial of the level.
    if (!n.first_of_pair) continue;
    if (seen.insert({n.test, n.cell, n.replicate, n.target, n.sources, n.given}).second) out.push_back(&n);
  }
  return out;
}

std::vector<CalibrationRow> CalibrationTable(const std::vector<NullTestLine>& lines,
                                             const std::vector<Cell>& cells) {
  std::map<GroupKey, CalibrationRow> groups;
  for (const NullTestLine* n : DistinctNullTests(lines)) {
    if (n->cell < 0 || n->cell >= static_cast<int>(cells.size())) continue;
    const double level = cells[n->cell].level;
    CalibrationRow& row = groups[{n->test, n->length, level, !n->all_parents_given}];
    row.test = n->test;
    row.length = n->length;
    row.level = level;
    row.all_parents_given = n->all_parents_given;
    ++row.tests;
    // The learners' rule: dependent (a rejection) when p <= level.
    if (n->p_value <= level) ++row.rejected;
  }
  std::vector<CalibrationRow> out;
  for (auto& [key, row] : groups) {
    row.share = metrics::ClopperPearsonInterval(row.rejected, row.tests);
    out.push_back(std::move(row));
  }
  return out;
}

const std::string& CalibrationHeader() {
  static const std::string header =
      "test,length,level,all_parents_given,tests,rejected,rejected_share,rejected_share_low,"
      "rejected_share_high,above_level";
  return header;
}

std::string FormatCalibrationRow(const CalibrationRow& r) {
  std::ostringstream o;
  o << r.test << "," << Num(r.length) << "," << Num(r.level) << "," << (r.all_parents_given ? "yes" : "no")
    << "," << r.tests << "," << r.rejected << "," << Num(r.share.estimate) << "," << Num(r.share.low) << ","
    << Num(r.share.high) << "," << (r.AboveLevel() ? "yes" : "no");
  return o.str();
}

std::optional<NullTestLine> ParseNullTestLine(const std::string& line) {
  static const size_t cell = NullTestColumn("cell"), replicate = NullTestColumn("replicate"),
                      learner = NullTestColumn("learner"), test = NullTestColumn("test"),
                      length = NullTestColumn("length"), target = NullTestColumn("test_target"),
                      sources = NullTestColumn("test_sources"), given = NullTestColumn("test_given"),
                      p_value = NullTestColumn("test_p_value"), tag = NullTestColumn("all_parents_given"),
                      first = NullTestColumn("first_of_pair");
  const std::vector<csv::Field> f = csv::Split(line);
  // No column has an empty name, so this is the header's field count. A line
  // of a journal written before first_of_pair (the last column) has one
  // field less and counts as a first test, as it did then.
  const size_t fields = NullTestColumn("");
  if (f.size() != fields && f.size() + 1 != fields) return std::nullopt;
  NullTestLine n;
  const std::string_view tag_text = f[tag].text;
  const std::string_view first_text = f.size() > first ? f[first].text : std::string_view("yes");
  if (!ParseWhole(f[cell].text, n.cell) || !ParseWhole(f[replicate].text, n.replicate) ||
      !csv::ParseNumber(f[length].text, n.length) || !csv::ParseNumber(f[p_value].text, n.p_value) ||
      (tag_text != "yes" && tag_text != "no") || (first_text != "yes" && first_text != "no")) {
    return std::nullopt;
  }
  n.first_of_pair = first_text == "yes";
  n.learner = f[learner].text;
  n.test = f[test].text;
  n.target = f[target].text;
  n.sources = f[sources].text;
  n.given = f[given].text;
  n.all_parents_given = tag_text == "yes";
  return n;
}

std::string CalibrationCsv(const std::vector<Cell>& cells, const std::map<Unit, UnitResult>& units) {
  std::vector<NullTestLine> lines;
  for (const auto& [unit, result] : units) {
    for (const std::string& text : result.null_test_lines) {
      if (std::optional<NullTestLine> n = ParseNullTestLine(text)) lines.push_back(std::move(*n));
    }
  }
  std::string out = CalibrationHeader() + "\n";
  for (const CalibrationRow& row : CalibrationTable(lines, cells)) out += FormatCalibrationRow(row) + "\n";
  return out;
}

std::string CalibrationWarning(const CalibrationRow& r) {
  return r.test + " at length " + Num(r.length) + ", level " + Num(r.level) +
         ", all parents given: " + (r.all_parents_given ? "yes" : "no") + ": " + std::to_string(r.rejected) +
         " of " + std::to_string(r.tests) + " true-null tests rejected (share " + Fixed3(r.share.estimate) +
         ", exact 95% interval " + Fixed3(r.share.low) + " to " + Fixed3(r.share.high) + ")";
}

}  // namespace locind::app
