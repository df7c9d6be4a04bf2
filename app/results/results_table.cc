#include "app/results/results_table.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "app/results/results_writer.h"

namespace locind::app {

std::string IntervalText(const metrics::Interval& i) {
  if (std::isnan(i.estimate)) return "-";
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.2f [%.2f, %.2f]", i.estimate, i.low, i.high);
  return buffer;
}

std::string SummaryTable(const StudySpec& study, const std::vector<Cell>& cells,
                         const std::map<Unit, UnitResult>& units) {
  std::vector<std::vector<std::string>> table = {
      {"length", "level", "hidden", "learner", "power", "false-edge rate", "class recovered", "tests",
       "failed"}};
  for (const Cell& c : cells) {
    for (size_t l = 0; l < study.learners.size(); ++l) {
      std::vector<ReplicateRow> rows;
      for (auto it = units.lower_bound(Unit{c.index, 0}); it != units.end() && it->first.cell == c.index; ++it) {
        for (const ReplicateRow& r : it->second.rows) {
          if (r.learner == study.learners[l].label) rows.push_back(r);
        }
      }
      if (rows.empty()) continue;
      const metrics::CellSummary s = SummarizeCell(study, c, static_cast<int>(l), rows);
      char tests[32];
      std::snprintf(tests, sizeof tests, "%.0f", s.tests.estimate);
      table.push_back({Num(c.length), Num(c.level), std::to_string(c.hidden_count), study.learners[l].label,
                       IntervalText(s.power), IntervalText(s.false_edge_rate),
                       IntervalText(s.class_recovery), std::isnan(s.tests.estimate) ? "-" : tests,
                       std::to_string(s.failed) + "/" + std::to_string(s.replicates)});
      if (!study.grid.trials.empty()) table.back().insert(table.back().begin() + 1, std::to_string(c.trials));
    }
  }
  // A number-of-trials factor (grid.trials) gets its own column after length.
  if (!study.grid.trials.empty()) table[0].insert(table[0].begin() + 1, "trials");
  std::vector<size_t> width(table[0].size(), 0);
  for (const auto& row : table) {
    for (size_t i = 0; i < row.size(); ++i) width[i] = std::max(width[i], row[i].size());
  }
  std::ostringstream out;
  for (const auto& row : table) {
    for (size_t i = 0; i < row.size(); ++i) {
      out << row[i] << (i + 1 < row.size() ? std::string(width[i] - row[i].size() + 2, ' ') : "\n");
    }
  }
  return out.str();
}

}  // namespace locind::app
