// The grid of a study: cells (one per combination of factor values), the
// units of work (cell x replicate), their split into parts, and the keys of
// every random stream.
//
// Random streams are keyed by (study seed, cell key, replicate, purpose).
// A cell's key is a hash of its canonical label ("length=200 level=0.05 ..."),
// not of its position, so a cell draws the same data whatever else the grid
// holds (and `locind plan` can reach any length). The data (and a test's own
// Monte Carlo draws) use the data key, a hash of the label without the
// level: cells that differ only in level share their data, so comparisons
// between levels are paired. Truths are keyed by the hidden-count factor and
// the truth index, so every cell with the same truth factor sees the same
// truths (under hidden_mode fixed-observed one key serves every count).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "app/study/study_spec.h"

namespace locind::app {

// Purposes of the random streams (the fourth part of a StreamKey).
enum StreamPurpose : uint64_t {
  kPurposeTruthGraph = 1,
  kPurposeParameters = 2,
  kPurposeData = 3,
  kPurposeSummary = 4,
  kPurposeTestDraws = 5,  // Monte Carlo draws inside a test (chi-bar weights)
  kPurposeExternal = 6,   // the seed handed to an external learner's program
  kPurposeComparison = 7, // bootstrap of the paired learner comparisons
};

struct Cell {
  int index = 0;       // position in grid order
  double length = 0;   // observation length
  double level = 0.05;
  int hidden_factor = -1;              // grid hidden-count value; -1: the truth's own
  int hidden_count = 0;                // hidden processes of the cell's truths
  std::optional<double> stationarity;  // spectral radius or drift bound target, if any
  int trials = 1;                      // trials per replicate, each of `length`
  std::string label;
  uint64_t key = 0;       // hash of label: summaries
  uint64_t data_key = 0;  // hash of label without the level: data and test draws
};

// Cells in grid order: hidden count, then stationarity target, then level,
// then number of trials (grid.trials), then length (fastest).
std::vector<Cell> ExpandGrid(const StudySpec& study);

// One cell with the given factor values (index -1); used by the planner.
// `trials` > 0 is a value of the number-of-trials factor (" trials=N" in the
// label and keys); 0: no such factor, one trial (labels and keys unchanged).
Cell MakeCell(const StudySpec& study, double length, double level, int hidden_factor,
              std::optional<double> stationarity, int trials = 0);

// The key and drawing label of truth `index` under a hidden-count factor.
uint64_t TruthKey(int hidden_factor);
std::string TruthLabel(int hidden_factor, int index);  // "t1", or "hidden2-t1" under a factor

// The truth index a replicate uses.
inline int TruthIndexOf(const StudySpec& study, int replicate) { return replicate % study.truth.truths; }

struct Unit {
  int cell = 0;
  int replicate = 0;
  bool operator<(const Unit& o) const {
    return cell != o.cell ? cell < o.cell : replicate < o.replicate;
  }
  bool operator==(const Unit&) const = default;
};

// A deterministic share: `part` of `parts` (1-based), or 1/1 for the whole.
struct Part {
  int part = 1;
  int parts = 1;
  std::string Text() const { return std::to_string(part) + "/" + std::to_string(parts); }
};

// Parses "K/N" with 1 <= K <= N; nullopt otherwise.
std::optional<Part> ParsePart(const std::string& text);

// The units of `part`: unit u (numbered cell-major) belongs to part
// (u mod parts) + 1, so each share gets every cell.
std::vector<Unit> UnitsOf(const std::vector<Cell>& cells, int replicates, const Part& part);

}  // namespace locind::app
