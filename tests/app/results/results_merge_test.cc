// locind merge reads back --part folders: every malformed, missing, edited
// or mismatched piece is refused with exit code 2 and one line naming the
// file (and line), and nothing is written.
#include "app/results/results_merge.h"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>
#include <sstream>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "tests/app/command_fixture.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;
using testing::RunHandler;

// Two oracle learners on a small event truth: quick to run.
const char kStudy[] =
    "name: mergeable\n"
    "truth: {nodes: [a, b, h], edges: [a -> b, h -> a, h -> b], hidden: [h]}\n"
    "process:\n"
    "  events: {baseline: 0.5, weight: 0.3, burn_in: 5}\n"
    "grid: {lengths: [40], replicates: 4}\n"
    "learners:\n"
    "  - {method: pairwise, test: oracle}\n"
    "  - {method: maximal-search, test: oracle}\n";

using testing::ReadAll;

void WriteAll(const fs::path& p, const std::string& text) {
  std::ofstream(p, std::ios::binary) << text;
}

// Part folders 1/2 and 2/2 of kStudy, made once; each check edits copies.
struct Parts {
  // Per test process: ctest runs this file's test cases in parallel.
  fs::path dir = fs::temp_directory_path() / ("locind_results_merge_test_" + std::to_string(::getpid()));
  Parts() {
    fs::remove_all(dir);
    fs::create_directories(dir);
    WriteAll(dir / "mergeable.yaml", kStudy);
    for (const char* k : {"1", "2"}) {
      const testing::Outcome r = RunHandler(
          RunRunCommand, {(dir / "mergeable.yaml").string(), "--part", std::string(k) + "/2",
                          "--out", (dir / (std::string("p") + k)).string()});
      REQUIRE(r.code == kExitOk);
    }
  }
  ~Parts() { fs::remove_all(dir); }

  // A fresh copy of both parts; returns the folders.
  std::pair<std::string, std::string> Copy(const std::string& name) const {
    const fs::path a = dir / (name + "1"), b = dir / (name + "2");
    fs::remove_all(a);
    fs::remove_all(b);
    fs::copy(dir / "p1", a, fs::copy_options::recursive);
    fs::copy(dir / "p2", b, fs::copy_options::recursive);
    return {a.string(), b.string()};
  }
};

const Parts& Shared() {
  static const Parts parts;
  return parts;
}

// Merges a and b; the error stream when the merge is refused with code 2.
std::string Refusal(const std::string& a, const std::string& b) {
  const fs::path out = Shared().dir / "merged";
  fs::remove_all(out);
  const testing::Outcome r = RunHandler(RunMergeCommand, {a, b, "--out", out.string()});
  CHECK(r.code == kExitInputError);
  CHECK_FALSE(fs::exists(out));
  return r.err;
}

// Replaces the first occurrence of `from` in the file.
void Edit(const fs::path& file, const std::string& from, const std::string& to) {
  std::string text = ReadAll(file);
  const size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  WriteAll(file, text.replace(at, from.size(), to));
}

// The second line (first data row) of a CSV file.
std::string FirstRow(const fs::path& file) {
  std::istringstream in(ReadAll(file));
  std::string line;
  std::getline(in, line);
  std::getline(in, line);
  return line;
}

TEST_CASE("merge reads the shares back, and refuses a damaged share naming its file and line") {
  const Parts& parts = Shared();
  {
    const auto [a, b] = parts.Copy("ok");
    const testing::Outcome r =
        RunHandler(RunMergeCommand, {a, b, "--out", (parts.dir / "merged_ok").string()});
    CHECK(r.code == kExitOk);
  }
  SUBCASE("missing file") {
    const auto [a, b] = parts.Copy("missing");
    fs::remove(fs::path(b) / "edges.csv");
    CHECK(Refusal(a, b).find(b + "/edges.csv: cannot open the file") != std::string::npos);
  }
  SUBCASE("empty file") {
    const auto [a, b] = parts.Copy("empty");
    WriteAll(fs::path(a) / "replicates.csv", "");
    CHECK(Refusal(a, b) ==
          "locind merge: " + a +
              "/replicates.csv:1:1: header: not the columns of this version of locind\n");
  }
  SUBCASE("ragged or non-numeric row") {
    const auto [a, b] = parts.Copy("ragged");
    const fs::path file = fs::path(a) / "replicates.csv";
    Edit(file, FirstRow(file), FirstRow(file) + ",extra");
    CHECK(Refusal(a, b) == "locind merge: " + a + "/replicates.csv:2:1: row: malformed\n");
    const auto [c, d] = parts.Copy("nan");
    const fs::path other = fs::path(c) / "replicates.csv";
    const std::string row = FirstRow(other);
    Edit(other, row, "x" + row);
    CHECK(Refusal(c, d) == "locind merge: " + c + "/replicates.csv:2:1: row: malformed\n");
  }
  SUBCASE("edge row of no replicate of the share") {
    const auto [a, b] = parts.Copy("edges");
    const fs::path file = fs::path(a) / "edges.csv";
    const std::string row = FirstRow(file);
    Edit(file, row, "99" + row.substr(row.find(',')));
    CHECK(Refusal(a, b) == "locind merge: " + a + "/edges.csv:2:1: row: no matching replicate\n");
  }
  SUBCASE("a learner row duplicated, or renamed") {
    const auto [a, b] = parts.Copy("dup");
    const fs::path file = fs::path(a) / "replicates.csv";
    const std::string row = FirstRow(file);
    Edit(file, row, row + "\n" + row);
    CHECK(Refusal(a, b).find("replicates.csv: cell 0 replicate 0: learners pairwise/oracle, "
                             "pairwise/oracle, maximal-search/oracle (expected pairwise/oracle, "
                             "maximal-search/oracle)") != std::string::npos);
    const auto [c, d] = parts.Copy("renamed");
    Edit(fs::path(c) / "replicates.csv", "pairwise/oracle", "someone/oracle");
    CHECK(Refusal(c, d).find("learners someone/oracle, maximal-search/oracle") !=
          std::string::npos);
  }
  SUBCASE("part.txt, the same share twice, another study") {
    const auto [a, b] = parts.Copy("part");
    WriteAll(fs::path(a) / "part.txt", "3/2\n");
    CHECK(Refusal(a, b) == "locind merge: " + a + "/part.txt:1:1: part: expected K/N\n");
    const auto [c, d] = parts.Copy("twice");
    CHECK(Refusal(c, c) == "locind merge: " + c + ": part 1/2 given twice\n");
    Edit(fs::path(d) / "input" / "mergeable.yaml", "replicates: 4", "replicates: 5");
    CHECK(Refusal(c, d) == "locind merge: " + d + " holds a different study than " + c + "\n");
  }
}

}  // namespace
}  // namespace locind::app
