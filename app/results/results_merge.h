// Reading back the result folder of a --part share, for `locind merge`.
#pragma once

#include <map>
#include <string>

#include "app/results/results_rows.h"
#include "app/study/study_grid.h"
#include "base/status.h"

namespace locind::app {

struct PartFolder {
  std::string dir;
  Part part;
  std::string study_path;  // DIR/input/<study file>
  std::string study_text;
  std::map<Unit, UnitResult> units;  // from replicates.csv, edges.csv, null_tests.csv
};

// The study file a run saved in DIR/input/ (its path and text). Fails when
// there is not exactly one file there or it cannot be read.
struct SavedStudy {
  std::string path;
  std::string text;
};
Result<SavedStudy> ReadSavedStudy(const std::string& dir);

// Reads part.txt, input/<study file>, replicates.csv, edges.csv and null_tests.csv of a
// finished share. Fails (naming the file and line) when one is missing or
// malformed.
Result<PartFolder> ReadPartFolder(const std::string& dir);

}  // namespace locind::app
