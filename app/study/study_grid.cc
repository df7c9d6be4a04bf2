#include "app/study/study_grid.h"

#include <algorithm>

#include "base/hashing.h"
#include "base/number_format.h"

#include "app/io/event_csv.h"

namespace locind::app {

uint64_t TruthKey(int hidden_factor) { return base::HashText("truth hidden=" + std::to_string(hidden_factor)); }

std::string TruthLabel(int hidden_factor, int index) {
  std::string label;
  if (hidden_factor >= 0) label.append("hidden").append(std::to_string(hidden_factor)).append("-");
  return label.append("t").append(std::to_string(index + 1));
}

Cell MakeCell(const StudySpec& study, double length, double level, int hidden_factor,
              std::optional<double> stationarity, int trials) {
  Cell c;
  c.index = -1;
  c.length = length;
  c.level = level;
  c.hidden_factor = hidden_factor;
  if (hidden_factor >= 0) {
    c.hidden_count = hidden_factor;
  } else if (study.truth.random) {
    const auto& r = study.truth.random_graph;
    c.hidden_count = r.hidden_list.empty() ? r.hidden_count : static_cast<int>(r.hidden_list.size());
  } else {
    c.hidden_count = static_cast<int>(study.truth.explicit_graph.hidden.size());
  }
  c.stationarity = stationarity;
  std::string rest;
  if (hidden_factor >= 0) rest += " hidden=" + std::to_string(hidden_factor);
  if (stationarity) rest += " target=" + base::FormatNumber(*stationarity);
  if (trials > 0) rest += " trials=" + std::to_string(trials);
  c.trials = std::max(1, trials);
  c.label = "length=" + base::FormatNumber(length) + " level=" + base::FormatNumber(level) + rest;
  c.key = base::HashText(c.label);
  // Paired levels: the level is left out of the data key.
  c.data_key = base::HashText("data length=" + base::FormatNumber(length) + rest);
  return c;
}

std::vector<Cell> ExpandGrid(const StudySpec& study) {
  const GridSpec& g = study.grid;
  std::vector<int> hidden = g.hidden_counts.empty() ? std::vector<int>{-1} : g.hidden_counts;
  std::vector<std::optional<double>> targets;
  for (double t : g.stationarity) targets.push_back(t);
  if (targets.empty()) {
    targets.push_back(study.events ? study.event_process.spectral_radius : study.path_process.drift_bound);
  }
  const std::vector<int> trials = g.trials.empty() ? std::vector<int>{0} : g.trials;
  std::vector<Cell> cells;
  for (int h : hidden) {
    for (const auto& target : targets) {
      for (double level : g.levels) {
        for (int n : trials) {
          for (double length : g.lengths) {
            Cell c = MakeCell(study, length, level, h, target, n);
            c.index = static_cast<int>(cells.size());
            cells.push_back(c);
          }
        }
      }
    }
  }
  return cells;
}

std::optional<Part> ParsePart(const std::string& text) {
  const size_t slash = text.find('/');
  if (slash == std::string::npos) return std::nullopt;
  try {
    size_t used1 = 0, used2 = 0;
    const std::string a = text.substr(0, slash), b = text.substr(slash + 1);
    Part p{std::stoi(a, &used1), std::stoi(b, &used2)};
    if (used1 != a.size() || used2 != b.size() || p.parts < 1 || p.part < 1 || p.part > p.parts) {
      return std::nullopt;
    }
    return p;
  } catch (const std::exception&) {
    return std::nullopt;
  }
}

std::vector<Unit> UnitsOf(const std::vector<Cell>& cells, int replicates, const Part& part) {
  std::vector<Unit> units;
  int64_t u = 0;
  for (const Cell& c : cells) {
    for (int r = 0; r < replicates; ++r, ++u) {
      if (u % part.parts == part.part - 1) units.push_back(Unit{c.index, r});
    }
  }
  return units;
}

}  // namespace locind::app
