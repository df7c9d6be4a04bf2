// The study runner: the same files for any thread count and for --part
// shares joined by merge; a run killed with SIGKILL and started again ends
// with the files of an uninterrupted run; a second run into a busy folder is
// refused; a failed replicate is a row, not an abort.
#include <doctest/doctest.h>

#include <chrono>
#include <csignal>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <thread>

#include <sys/wait.h>
#include <unistd.h>

#include "app/command.h"
#include "app/input_error.h"
#include "app/runner_journal.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;

// Three observed alarm streams and one hidden driver; oracle and Hawkes tests.
const char kStudy[] =
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

struct Scratch {
  fs::path dir;
  explicit Scratch(const std::string& name) : dir(fs::temp_directory_path() / name) {
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

int Run(const std::vector<std::string>& args, std::string* out_text = nullptr) {
  std::ostringstream out, err;
  const int code = RunRunCommand(args, out, err);
  if (out_text) *out_text = out.str() + err.str();
  return code;
}

std::string ReadAll(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

// The file with every column whose header starts with "timing_" removed.
std::string WithoutTimings(const fs::path& p) {
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
int CompareFolders(const fs::path& a, const fs::path& b) {
  int compared = 0;
  for (const char* csv : {"replicates.csv", "edges.csv", "summary.csv"}) {
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

int CountLines(const fs::path& p) {
  std::ifstream in(p);
  int n = 0;
  for (std::string line; std::getline(in, line);) ++n;
  return n;
}

TEST_CASE("--threads 1 and --threads 2 give the same files, and so do --part 1/2 + 2/2 merged") {
  Scratch s("locind_runner_test_threads");
  const std::string study = s.Write("tiny.yaml", kStudy);
  std::string text;
  REQUIRE(Run({study, "--threads", "1", "--out", s.Path("one")}, &text) == kExitOk);
  CHECK(text.find("results in " + s.Path("one")) != std::string::npos);
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("two")}) == kExitOk);
  // 3 CSV files, study.json, truth-t1/t2.svg and class-t1/t2.svg.
  CHECK(CompareFolders(s.dir / "one", s.dir / "two") == 8);

  REQUIRE(Run({study, "--part", "2/2", "--out", s.Path("p2")}) == kExitOk);
  REQUIRE(Run({study, "--part", "1/2", "--out", s.Path("p1"), "--threads", "2"}) == kExitOk);
  CHECK(ReadAll(s.dir / "p1" / "part.txt") == "1/2\n");
  // Each share holds half of the 2 cells x 4 replicates x 3 learners rows.
  CHECK(CountLines(s.dir / "p1" / "replicates.csv") == 1 + 12);
  std::ostringstream out, err;
  REQUIRE(RunMergeCommand({s.Path("p2"), s.Path("p1"), "--out", s.Path("merged")}, out, err) == kExitOk);
  CHECK(CompareFolders(s.dir / "one", s.dir / "merged") >= 8);
  CHECK_FALSE(fs::exists(s.dir / "merged" / "part.txt"));

  {  // merge refuses an incomplete set of shares
    std::ostringstream o, e;
    CHECK(RunMergeCommand({s.Path("p1"), "--out", s.Path("bad")}, o, e) == kExitInputError);
    CHECK(e.str() == "locind merge: missing part(s) 2 of 2\n");
  }
}

// Runs `args` in a child process and kills it with SIGKILL once `units`
// units are committed to the journal of `dir`, then appends a torn line as a
// kill in the middle of a write would leave. Returns the units committed.
int RunAndKill(const std::vector<std::string>& args, const fs::path& dir, int units) {
  const fs::path journal = dir / Journal::FileName();
  const pid_t child = fork();
  REQUIRE(child >= 0);
  if (child == 0) {
    std::ostringstream out, err;
    _exit(RunRunCommand(args, out, err));
  }
  // Kill it once a few units (journal lines after the header) are committed.
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(60);
  while (CountLines(journal) < units + 1 && std::chrono::steady_clock::now() < deadline) {
    std::this_thread::sleep_for(std::chrono::milliseconds(2));
  }
  kill(child, SIGKILL);
  int status = 0;
  waitpid(child, &status, 0);
  REQUIRE(WIFSIGNALED(status));  // it was killed, not finished
  CHECK_FALSE(fs::exists(dir / "replicates.csv"));
  const int committed = CountLines(journal) - 1;
  std::ofstream(journal, std::ios::app) << "unit\t1\t9\t3\t0\t1,9,t2,1600";
  return committed;
}

// kStudy with 10 replicates and longer windows, so a killed run is still busy
// when the kill comes.
std::string BiggerStudy() {
  std::string bigger = kStudy;
  bigger.replace(bigger.find("replicates: 4"), 13, "replicates: 10");
  bigger.replace(bigger.find("lengths: [150, 300]"), 19, "lengths: [800, 1600]");
  return bigger;
}

TEST_CASE("killed with SIGKILL mid-run, then run again: the files of an uninterrupted run") {
  Scratch s("locind_runner_test_resume");
  const std::string study = s.Write("tiny.yaml", BiggerStudy());
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("whole")}) == kExitOk);

  const int committed =
      RunAndKill({study, "--threads", "1", "--out", s.Path("killed")}, s.dir / "killed", 3);
  CHECK(committed >= 3);
  CHECK(committed < 20);  // 2 cells x 10 replicates: some were still missing

  std::string text;
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("killed")}, &text) == kExitOk);
  CHECK(text.find(std::to_string(committed) + " of 20 units already done") != std::string::npos);
  CHECK(CompareFolders(s.dir / "whole", s.dir / "killed") >= 8);
  CHECK(CountLines(s.dir / "killed" / Journal::FileName()) == 21);

  {  // running the finished study again only rewrites the same files
    REQUIRE(Run({study, "--out", s.Path("killed")}, &text) == kExitOk);
    CHECK(text.find("20 of 20 units already done") != std::string::npos);
    CHECK(CompareFolders(s.dir / "whole", s.dir / "killed") >= 8);
  }
}

TEST_CASE("--part shares merged after one was killed and resumed: the files of one whole run") {
  Scratch s("locind_runner_test_part_resume");
  const std::string study = s.Write("tiny.yaml", BiggerStudy());
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("whole")}) == kExitOk);

  const int committed =
      RunAndKill({study, "--part", "1/2", "--out", s.Path("p1")}, s.dir / "p1", 2);
  CHECK(committed >= 2);
  CHECK(committed < 10);  // share 1 of 2 holds 10 of the 20 units
  std::string text;
  REQUIRE(Run({study, "--part", "1/2", "--threads", "2", "--out", s.Path("p1")}, &text) == kExitOk);
  CHECK(text.find(std::to_string(committed) + " of 10 units already done") != std::string::npos);
  REQUIRE(Run({study, "--part", "2/2", "--out", s.Path("p2")}) == kExitOk);

  std::ostringstream out, err;
  REQUIRE(RunMergeCommand({s.Path("p1"), s.Path("p2"), "--out", s.Path("merged")}, out, err) ==
          kExitOk);
  CHECK(CompareFolders(s.dir / "whole", s.dir / "merged") >= 8);
}

TEST_CASE("a second run into a folder in use is refused, and so is another study's folder") {
  Scratch s("locind_runner_test_lock");
  const std::string study = s.Write("tiny.yaml", kStudy);
  {
    Result<std::unique_ptr<Journal>> held = Journal::Open(s.Path("busy"), "someone else");
    REQUIRE(held.ok());
    std::string text;
    CHECK(Run({study, "--out", s.Path("busy")}, &text) == kExitFailure);
    CHECK(text.find("another run is writing into " + s.Path("busy")) != std::string::npos);
  }
  std::string text;
  CHECK(Run({study, "--out", s.Path("busy")}, &text) == kExitFailure);  // lock free, study differs
  CHECK(text.find("belongs to another study or part") != std::string::npos);
}

TEST_CASE("a replicate whose simulation fails is a row with status and message") {
  Scratch s("locind_runner_test_failed");
  std::string capped = kStudy;
  capped.replace(capped.find("burn_in: 20}"), 12, "burn_in: 20, event_cap: 40}");
  const std::string study = s.Write("capped.yaml", capped);
  std::string text;
  REQUIRE(Run({study, "--out", s.Path("out")}, &text) == kExitOk);
  const std::string rows = ReadAll(s.dir / "out" / "replicates.csv");
  CHECK(rows.find(",failed,simulation: ") != std::string::npos);
  CHECK(rows.find(",ok,") == std::string::npos);  // 40 events never cover the window
  const std::string summary = ReadAll(s.dir / "out" / "summary.csv");
  CHECK(summary.find(",pairwise/hawkes-lr,4,4,") != std::string::npos);  // 4 replicates, 4 failed
}

}  // namespace
}  // namespace locind::app
