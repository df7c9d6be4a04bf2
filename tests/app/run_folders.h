// Study runs for the runner tests: a tiny study, scratch folders, and the
// comparison of two result folders with the timing_ columns dropped (the
// only columns that may differ between two runs of one study).
#pragma once

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include <unistd.h>

#include "app/cli/command.h"

namespace locind::testing {

namespace fs = std::filesystem;

// Three observed alarm streams and one hidden driver; oracle and Hawkes tests.
inline const char kTinyStudy[] =
    "name: tiny\n"
    "seed: 11\n"
    "truth:\n"
    "  nodes: [a, b, c, h]\n"
    "  edges: [a -> b, b -> c, h -> a, h -> c, a -> a, h -> h]\n"
    "  hidden: [h]\n"
    "  truths: 2\n"
    "process:\n"
    "  events: {baseline: [0.3, 0.5], weight: [0.2, 0.5], decay: 2, spectral_radius: 0.5, burn_in: 20}\n"
    "grid:\n"
    "  lengths: [150, 300]\n"
    "  replicates: 4\n"
    "learners:\n"
    "  - {method: pairwise, test: hawkes-lr}\n"
    "  - {method: screen, test: hawkes-lr}\n"
    "  - {method: maximal-search, test: oracle}\n";

// The tiny study with 10 replicates and longer windows, so that a run is
// still busy when a test kills it.
inline std::string LongerTinyStudy() {
  std::string bigger = kTinyStudy;
  bigger.replace(bigger.find("replicates: 4"), 13, "replicates: 10");
  bigger.replace(bigger.find("lengths: [150, 300]"), 19, "lengths: [800, 1600]");
  return bigger;
}

struct Scratch {
  fs::path dir;
  // `name` plus the process id: parallel ctest processes (and other builds
  // on the machine) never share a folder.
  explicit Scratch(const std::string& name)
      : dir(fs::temp_directory_path() / (name + "_" + std::to_string(::getpid()))) {
    fs::remove_all(dir);
    fs::create_directories(dir);
  }
  ~Scratch() { fs::remove_all(dir); }
  std::string Write(const std::string& file, const std::string& text) const {
    std::ofstream(dir / file) << text;
    return (dir / file).string();
  }
  std::string Path(const std::string& sub) const { return (dir / sub).string(); }
};

inline int Run(const std::vector<std::string>& args, std::string* out_text = nullptr) {
  std::ostringstream out, err;
  const int code = app::RunRunCommand(args, out, err);
  if (out_text) *out_text = out.str() + err.str();
  return code;
}

inline std::string ReadAll(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

// The file with every column whose header starts with "timing_" removed.
inline std::string WithoutTimings(const fs::path& p) {
  std::istringstream in(ReadAll(p));
  std::string line, out;
  std::vector<bool> keep;
  while (std::getline(in, line)) {
    std::vector<std::string> fields;
    std::stringstream s(line);
    for (std::string f; std::getline(s, f, ',');) fields.push_back(f);
    if (!line.empty() && line.back() == ',') fields.push_back("");
    if (keep.empty()) {
      for (const std::string& f : fields) keep.push_back(f.rfind("timing_", 0) != 0);
    }
    REQUIRE(fields.size() == keep.size());
    for (size_t i = 0; i < fields.size(); ++i) {
      if (keep[i]) out += fields[i] + ",";
    }
    out += "\n";
  }
  return out;
}

// Same outputs apart from timing columns; returns the number of files compared.
inline int CompareFolders(const fs::path& a, const fs::path& b) {
  int compared = 0;
  for (const char* csv : {"replicates.csv", "edges.csv", "null_tests.csv", "summary.csv", "comparisons.csv",
                          "calibration.csv"}) {
    REQUIRE(fs::exists(a / csv));
    REQUIRE(fs::exists(b / csv));
    CHECK_MESSAGE(WithoutTimings(a / csv) == WithoutTimings(b / csv), csv);
    ++compared;
  }
  for (const auto& entry : fs::directory_iterator(a)) {
    const std::string name = entry.path().filename().string();
    if (name == "study.json" || entry.path().extension() == ".svg") {
      CHECK_MESSAGE(ReadAll(entry.path()) == ReadAll(b / name), name);
      ++compared;
    }
  }
  return compared;
}

inline int CountLines(const fs::path& p) {
  std::ifstream in(p);
  int n = 0;
  for (std::string line; std::getline(in, line);) ++n;
  return n;
}

// The rows of a result CSV file (no quoting in result files), by column name.
inline std::vector<std::map<std::string, std::string>> ReadRows(const fs::path& p) {
  std::istringstream in(ReadAll(p));
  std::vector<std::string> header;
  std::vector<std::map<std::string, std::string>> rows;
  for (std::string line; std::getline(in, line);) {
    std::vector<std::string> fields;
    std::stringstream s(line);
    for (std::string f; std::getline(s, f, ',');) fields.push_back(f);
    if (!line.empty() && line.back() == ',') fields.push_back("");
    if (header.empty()) {
      header = fields;
      continue;
    }
    REQUIRE(fields.size() == header.size());
    std::map<std::string, std::string> r;
    for (size_t i = 0; i < header.size(); ++i) r[header[i]] = fields[i];
    rows.push_back(std::move(r));
  }
  return rows;
}

}  // namespace locind::testing
