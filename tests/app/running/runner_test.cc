// The study runner: the same files for any thread count and for --part
// shares joined by merge; a run killed with SIGKILL and started again ends
// with the files of an uninterrupted run; a second run into a busy folder is
// refused; a failed replicate is a row, not an abort.
#include <doctest/doctest.h>

#include <algorithm>
#include <chrono>
#include <iterator>
#include <csignal>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <thread>

#include <sys/wait.h>
#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "app/running/runner_journal.h"
#include "app/running/runner_mpi.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;

using namespace locind::testing;

TEST_CASE("--threads 1 and --threads 2 give the same files, and so do --part 1/2 + 2/2 merged") {
  Scratch s("locind_runner_test_threads");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  std::string text;
  REQUIRE(Run({study, "--threads", "1", "--out", s.Path("one")}, &text) == kExitOk);
  CHECK(text.find("results in " + s.Path("one")) != std::string::npos);
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("two")}) == kExitOk);
  // 6 CSV files, study.json, truth-t1/t2.svg and class-t1/t2.svg.
  CHECK(CompareFolders(s.dir / "one", s.dir / "two") == 11);

  REQUIRE(Run({study, "--part", "2/2", "--out", s.Path("p2")}) == kExitOk);
  REQUIRE(Run({study, "--part", "1/2", "--out", s.Path("p1"), "--threads", "2"}) == kExitOk);
  CHECK(ReadAll(s.dir / "p1" / "part.txt") == "1/2\n");
  // Each share holds half of the 2 cells x 4 replicates x 3 learners rows.
  CHECK(CountLines(s.dir / "p1" / "replicates.csv") == 1 + 12);
  std::ostringstream out, err;
  REQUIRE(RunMergeCommand({s.Path("p2"), s.Path("p1"), "--out", s.Path("merged")}, out, err) == kExitOk);
  CHECK(CompareFolders(s.dir / "one", s.dir / "merged") >= 11);
  CHECK_FALSE(fs::exists(s.dir / "merged" / "part.txt"));

  {  // merge refuses an incomplete set of shares
    std::ostringstream o, e;
    CHECK(RunMergeCommand({s.Path("p1"), "--out", s.Path("bad")}, o, e) == kExitInputError);
    CHECK(e.str() == "locind merge: missing part(s) 2 of 2\n");
  }
}

// Lines that end with a newline. A kill can cut a long unit line short (a
// write to a regular file stops between pages on SIGKILL); such a torn tail
// is no committed unit, and std::getline would count it.
int CountCompleteLines(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  return static_cast<int>(std::count(text.begin(), text.end(), '\n'));
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
  const int committed = CountCompleteLines(journal) - 1;
  std::ofstream(journal, std::ios::app) << "unit\t1\t9\t3\t0\t0\t1,9,t2,1600";
  return committed;
}

TEST_CASE("killed with SIGKILL mid-run, then run again: the files of an uninterrupted run") {
  Scratch s("locind_runner_test_resume");
  const std::string study = s.Write("tiny.yaml", LongerTinyStudy());
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("whole")}) == kExitOk);

  const int committed =
      RunAndKill({study, "--threads", "1", "--out", s.Path("killed")}, s.dir / "killed", 3);
  CHECK(committed >= 3);
  CHECK(committed < 20);  // 2 cells x 10 replicates: some were still missing

  std::string text;
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("killed")}, &text) == kExitOk);
  CHECK(text.find(std::to_string(committed) + " of 20 units already done") != std::string::npos);
  CHECK(CompareFolders(s.dir / "whole", s.dir / "killed") >= 11);
  CHECK(CountLines(s.dir / "killed" / Journal::FileName()) == 21);

  {  // running the finished study again only rewrites the same files
    REQUIRE(Run({study, "--out", s.Path("killed")}, &text) == kExitOk);
    CHECK(text.find("20 of 20 units already done") != std::string::npos);
    CHECK(CompareFolders(s.dir / "whole", s.dir / "killed") >= 11);
  }
}

TEST_CASE("--part shares merged after one was killed and resumed: the files of one whole run") {
  Scratch s("locind_runner_test_part_resume");
  const std::string study = s.Write("tiny.yaml", LongerTinyStudy());
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
  CHECK(CompareFolders(s.dir / "whole", s.dir / "merged") >= 11);
}

TEST_CASE("a second run into a folder in use is refused, and so is another study's folder") {
  Scratch s("locind_runner_test_lock");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  {
    Result<std::unique_ptr<Journal>> held = Journal::Open(s.Path("busy"), "someone else");
    REQUIRE(held.ok());
    std::string text;
    CHECK(Run({study, "--out", s.Path("busy")}, &text) == kExitFailure);
    CHECK(text.find("another run is writing into " + s.Path("busy")) != std::string::npos);
  }
  std::string text;
  CHECK(Run({study, "--out", s.Path("busy")}, &text) == kExitInputError);  // lock free, study differs
  CHECK(text == "locind run: " + s.Path("busy") + " holds the results of another study, or of another "
                "version of this study file; give another --out, or delete " + s.Path("busy") +
                " to start this study afresh\n");
  CHECK(text.find("finished units") == std::string::npos);
}

TEST_CASE("a folder of another share of the same study says so and points at merge") {
  Scratch s("locind_runner_test_share");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  REQUIRE(Run({study, "--part", "1/2", "--out", s.Path("p")}) == kExitOk);
  std::string text;
  CHECK(Run({study, "--part", "2/2", "--out", s.Path("p")}, &text) == kExitInputError);
  CHECK(text == "locind run: " + s.Path("p") + " holds another share of this study (part 1/2, not part "
                "2/2); run this share with another --out and join the folders with locind merge\n");
}

TEST_CASE("a replicate whose simulation fails is a row with status and message") {
  Scratch s("locind_runner_test_failed");
  std::string capped = kTinyStudy;
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

// Reads a CSV file with a header into rows of column -> field (no quoting:
// the result files never quote).
std::vector<std::map<std::string, std::string>> ReadRows(const fs::path& file) {
  std::ifstream in(file);
  std::vector<std::string> header;
  std::vector<std::map<std::string, std::string>> rows;
  for (std::string line; std::getline(in, line);) {
    std::vector<std::string> f;
    std::stringstream s(line);
    for (std::string x; std::getline(s, x, ',');) f.push_back(x);
    if (!line.empty() && line.back() == ',') f.emplace_back();
    if (header.empty()) {
      header = f;
      continue;
    }
    REQUIRE(f.size() == header.size());
    std::map<std::string, std::string> row;
    for (size_t i = 0; i < f.size(); ++i) row[header[i]] = f[i];
    rows.push_back(row);
  }
  return rows;
}

int Int(const std::map<std::string, std::string>& row, const std::string& column) {
  return std::stoi(row.at(column));
}

// Why each edge was lost, end to end: the tiny study with maximal-search on
// the Hawkes test as well (short windows, so tests err and some cannot be
// computed). Per replicate the causes add up to the missed solid edges and
// the false edges, and the verdicts to the tests; every missed solid edge has
// a decision record with a rule; no removed edge names a witness that says
// dependent; a not-estimable witness has no p-value.
TEST_CASE("edges.csv decision records and replicates.csv attribution add up") {
  Scratch s("locind_runner_test_attribution");
  std::string text = kTinyStudy;
  text += "  - {method: maximal-search, test: hawkes-lr}\n";
  const std::string study = s.Write("tiny.yaml", text);
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("out")}) == kExitOk);
  int missed = 0;
  int errors_judged = 0;
  for (const auto& r : ReadRows(s.dir / "out" / "replicates.csv")) {
    if (r.at("status") != "ok") continue;
    CHECK(Int(r, "missed_own_test") + Int(r, "missed_propagation") + Int(r, "missed_reach") ==
          Int(r, "missed_solid"));
    CHECK(Int(r, "false_own_test") + Int(r, "false_propagation") + Int(r, "false_not_estimable") +
              Int(r, "false_reach") ==
          Int(r, "false_edges"));
    CHECK(Int(r, "test_correct") + Int(r, "test_false_separation") +
              Int(r, "test_false_dependence") + Int(r, "not_estimable") ==
          Int(r, "tests"));
    if (r.at("test") == "oracle") CHECK(Int(r, "test_correct") == Int(r, "tests"));
    missed += Int(r, "missed_solid");
    errors_judged += Int(r, "test_false_separation") + Int(r, "test_false_dependence");
  }
  CHECK(missed > 0);  // not vacuous: short windows lose edges
  CHECK(errors_judged > 0);
  for (const auto& e : ReadRows(s.dir / "out" / "edges.csv")) {
    if (e.at("truth_status") == "solid" && e.at("learner_action") == "not reported") {
      CHECK(e.at("decision") == "removed");
      CHECK_FALSE(e.at("decision_rule").empty());
      CHECK_FALSE(e.at("error_cause").empty());
    }
    if (e.at("decision") == "removed" && !e.at("witness_target").empty()) {
      CHECK(e.at("witness_decision") == "separated");
    }
    if (e.at("witness_status").rfind("not estimable", 0) == 0) {
      CHECK(e.at("witness_p_value").empty());
    }
  }
}

double Dbl(const std::map<std::string, std::string>& row, const std::string& column) {
  return std::stod(row.at(column));
}

// comparisons.csv: one row per cell and pair of learners (later minus
// earlier in the study); with no failed replicate its estimates are the
// differences of summary.csv's pooled rates (the same ratios, checked here
// against the other file), and every interval holds its estimate.
TEST_CASE("comparisons.csv pairs every two learners and matches summary.csv") {
  Scratch s("locind_runner_test_comparisons");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  REQUIRE(Run({study, "--out", s.Path("out")}) == kExitOk);
  std::map<std::pair<std::string, std::string>, std::map<std::string, std::string>> summary;
  for (const auto& r : ReadRows(s.dir / "out" / "summary.csv")) {
    REQUIRE(r.at("failed") == "0");
    summary[{r.at("cell"), r.at("learner")}] = r;
  }
  const auto rows = ReadRows(s.dir / "out" / "comparisons.csv");
  REQUIRE(rows.size() == 2 * 3);  // 2 cells x 3 pairs of 3 learners
  CHECK(rows[0].at("learner") == "screen/hawkes-lr");
  CHECK(rows[0].at("reference") == "pairwise/hawkes-lr");
  CHECK(rows[2].at("learner") == "maximal-search/oracle");
  CHECK(rows[2].at("reference") == "screen/hawkes-lr");
  for (const auto& c : rows) {
    CHECK(c.at("paired") == "4");
    const auto& mine = summary.at({c.at("cell"), c.at("learner")});
    const auto& ref = summary.at({c.at("cell"), c.at("reference")});
    for (const std::string m : {"power", "false_edge_rate", "directed_power"}) {
      if (mine.at(m).empty() || ref.at(m).empty()) {
        CHECK(c.at(m + "_difference").empty());
        continue;
      }
      CHECK(Dbl(c, m + "_difference") == doctest::Approx(Dbl(mine, m) - Dbl(ref, m)));
      CHECK(Dbl(c, m + "_difference_low") <= Dbl(c, m + "_difference") + 1e-12);
      CHECK(Dbl(c, m + "_difference_high") >= Dbl(c, m + "_difference") - 1e-12);
    }
  }
}

TEST_CASE("without the MPI build option, MPI use is refused with the way out") {
  Scratch s("locind_runner_test_no_mpi");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  std::string text;
  if (BuiltWithMpi()) {
    CHECK(Run({study, "--mpi-assign", "round-robin"}, &text) == kExitInputError);
    CHECK(text == "locind run: --mpi-assign must be dispatch or static\n");
    return;
  }
  CHECK(Run({study, "--mpi-assign", "static", "--out", s.Path("out")}, &text) == kExitInputError);
  CHECK(text.find("locind run: --mpi-assign: this locind was built without MPI (configure with "
                  "-DLOCIND_MPI=ON") == 0);
  ::setenv("OMPI_COMM_WORLD_SIZE", "2", 1);  // as Open MPI's mpirun sets it
  CHECK(Run({study, "--out", s.Path("out")}, &text) == kExitInputError);
  ::unsetenv("OMPI_COMM_WORLD_SIZE");
  CHECK(text.find("locind run: started as one of 2 copies by an MPI launcher, but this locind was "
                  "built without MPI") == 0);
  CHECK(text.find("split the study with --part K/N and locind merge") != std::string::npos);
  CHECK_FALSE(fs::exists(s.dir / "out"));
}

}  // namespace
}  // namespace locind::app
