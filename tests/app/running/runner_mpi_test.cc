// locind run under mpirun (built with LOCIND_MPI; ctest label `mpi`): ranks
// give the files of a single-process run under both assignments; a rank
// killed with SIGKILL leaves the lead's journal intact and a rerun completes
// it; a busy folder or a bad study file stops every rank with one message;
// external programs (a study's own learners) run on the ranks like the
// built-in ones.
//
// The runs go through the real launcher: `mpirun --allow-run-as-root
// --oversubscribe -np N` (as root in CI; 3 ranks on 2 cores) starting the
// locind program built beside this test (LOCIND_BINARY).
#include <doctest/doctest.h>

#include <algorithm>
#include <chrono>
#include <csignal>
#include <cstdlib>
#include <memory>
#include <thread>

#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include "app/io/error.h"
#include "app/running/runner_journal.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using namespace locind::testing;
using Clock = std::chrono::steady_clock;

constexpr char kMarkVariable[] = "LOCIND_MPI_TEST_MARK";

// Starts `mpirun -np RANKS locind run ARGS`, its output into `log`.
pid_t StartMpirun(int ranks, const std::vector<std::string>& run_args, const std::string& log) {
  std::vector<std::string> args = {"mpirun", "--allow-run-as-root", "--oversubscribe", "-np",
                                   std::to_string(ranks), LOCIND_BINARY, "run"};
  args.insert(args.end(), run_args.begin(), run_args.end());
  std::vector<char*> argv;
  for (std::string& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);
  // The ranks inherit this, so FindRank can tell them from other runs' ranks.
  ::setenv(kMarkVariable, std::to_string(::getpid()).c_str(), 1);
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int fd = ::open(log.c_str(), O_CREAT | O_WRONLY | O_TRUNC, 0644);
    const int nothing = ::open("/dev/null", O_RDONLY);  // mpirun forwards stdin to rank 0
    ::dup2(nothing, STDIN_FILENO);
    ::dup2(fd, STDOUT_FILENO);
    ::dup2(fd, STDERR_FILENO);
    ::execvp("mpirun", argv.data());
    ::_exit(127);
  }
  return pid;
}

// Waits for the launcher (killing it after two minutes); its exit code.
int WaitFor(pid_t pid) {
  const Clock::time_point deadline = Clock::now() + std::chrono::minutes(2);
  int status = 0;
  while (::waitpid(pid, &status, WNOHANG) == 0) {
    if (Clock::now() > deadline) {
      ::kill(pid, SIGKILL);
      ::waitpid(pid, &status, 0);
      FAIL("mpirun did not end within two minutes");
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(5));
  }
  return WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
}

int Mpirun(int ranks, const std::vector<std::string>& run_args, const Scratch& s, std::string* log) {
  const std::string path = s.Path("mpirun.log");
  const int code = WaitFor(StartMpirun(ranks, run_args, path));
  *log = ReadAll(path);
  return code;
}

int Count(const std::string& text, const std::string& part) {
  int n = 0;
  for (size_t at = text.find(part); at != std::string::npos; at = text.find(part, at + 1)) ++n;
  return n;
}

// The pid of rank `rank` of the run StartMpirun started last, 0 when none
// is running yet (found by the environment the launcher gives each rank).
pid_t FindRank(int rank) {
  const std::string mark = std::string(kMarkVariable) + "=" + std::to_string(::getpid());
  const std::string rank_is = "OMPI_COMM_WORLD_RANK=" + std::to_string(rank);
  for (const auto& entry : fs::directory_iterator("/proc")) {
    const std::string name = entry.path().filename().string();
    if (name.find_first_not_of("0123456789") != std::string::npos) continue;
    std::string environment = ReadAll(entry.path() / "environ");
    std::replace(environment.begin(), environment.end(), '\0', '\n');
    environment.insert(0, "\n");
    if (environment.find("\n" + mark + "\n") != std::string::npos &&
        environment.find("\n" + rank_is + "\n") != std::string::npos) {
      return static_cast<pid_t>(std::stol(name));
    }
  }
  return 0;
}

TEST_CASE("mpirun -np 2 (dispatch, static) and -np 3 --threads 2 give the files of one process") {
  Scratch s("locind_runner_mpi_test_same");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  REQUIRE(Run({study, "--out", s.Path("one")}) == kExitOk);
  std::string log;
  REQUIRE(Mpirun(2, {study, "--out", s.Path("dispatch")}, s, &log) == kExitOk);
  CHECK(Count(log, "2 ranks x 1 thread, dispatch; 0 of 8 units already done") == 1);
  CHECK(Count(log, "results in " + s.Path("dispatch")) == 1);  // rank 0 alone reports
  // 6 CSV files, study.json, truth-t1/t2.svg and class-t1/t2.svg.
  CHECK(CompareFolders(s.dir / "one", s.dir / "dispatch") == 11);
  CHECK(CountLines(s.dir / "dispatch" / Journal::FileName()) == 1 + 8);

  REQUIRE(Mpirun(2, {study, "--out", s.Path("static"), "--mpi-assign", "static"}, s, &log) == kExitOk);
  CHECK(Count(log, "2 ranks x 1 thread, static") == 1);
  CHECK(CompareFolders(s.dir / "one", s.dir / "static") == 11);

  REQUIRE(Mpirun(3, {study, "--out", s.Path("three"), "--threads", "2"}, s, &log) == kExitOk);
  CHECK(Count(log, "3 ranks x 2 threads, dispatch") == 1);
  CHECK(CompareFolders(s.dir / "one", s.dir / "three") == 11);
}

TEST_CASE("external programs (data and oracle questions) under mpirun -np 2 give the rows of one process") {
  Scratch s("locind_runner_mpi_test_external");
  // Asks the oracle one question on its standard streams (b against a given
  // {b, c}) and reports a -> b when the answer is "connected".
  const std::string asks = s.Write(
      "asks.sh",
      "echo 'b;a;b,c'\nread answer\n"
      "if [ \"$answer\" = connected ]; then edges='\"a -> b\"'; else edges=''; fi\n"
      "printf '{\"nodes\": [\"a\", \"b\", \"c\"], \"edges\": [%s]}' \"$edges\" > \"$1/graph.json\"\n");
  // Reads nothing but the task folder: the graph a -> b, b -> c.
  const std::string fixed = s.Write(
      "fixed.sh",
      "test -f \"$1/task.json\" || exit 4\n"
      "printf '{\"nodes\": [\"a\", \"b\", \"c\"], \"edges\": [\"a -> b\", \"b -> c\"]}' "
      "> \"$1/graph.json\"\n");
  std::string text = kTinyStudy;
  text.replace(text.find("  - {method: screen, test: hawkes-lr}\n"), 38, "");
  text += "  - {program: [sh, " + asks + "], name: asks, needs: oracle}\n";
  text += "  - {program: [sh, " + fixed + "], name: fixed, needs: data}\n";
  const std::string study = s.Write("external.yaml", text);
  REQUIRE(Run({study, "--out", s.Path("one")}) == kExitOk);
  std::string log;
  REQUIRE(Mpirun(2, {study, "--out", s.Path("ranks")}, s, &log) == kExitOk);
  CHECK(Count(log, "2 ranks x 1 thread, dispatch; 0 of 8 units already done") == 1);
  CHECK(CompareFolders(s.dir / "one", s.dir / "ranks") == 11);
  int asks_rows = 0, fixed_rows = 0;
  for (const auto& r : ReadRows(s.dir / "ranks" / "replicates.csv")) {
    if (r.at("learner") == "asks") {
      ++asks_rows;
      CHECK(r.at("status") == "ok");
      CHECK(r.at("tests") == "1");     // the one question, counted as a test
      CHECK(r.at("reported") == "1");  // a -> b: b depends on a given {b, c} in the truth
    }
    if (r.at("learner") == "fixed") {
      ++fixed_rows;
      CHECK(r.at("status") == "ok");
      CHECK(r.at("reported") == "2");
    }
  }
  CHECK(asks_rows == 8);  // 2 lengths x 4 replicates
  CHECK(fixed_rows == 8);
}

TEST_CASE("a rank killed with SIGKILL: the journal keeps what was finished, a rerun completes it") {
  Scratch s("locind_runner_mpi_test_killed");
  const std::string study = s.Write("tiny.yaml", LongerTinyStudy());
  REQUIRE(Run({study, "--threads", "2", "--out", s.Path("whole")}) == kExitOk);

  const fs::path journal = s.dir / "killed" / Journal::FileName();
  const pid_t launcher = StartMpirun(2, {study, "--out", s.Path("killed")}, s.Path("killed.log"));
  const Clock::time_point deadline = Clock::now() + std::chrono::seconds(60);
  pid_t rank1 = 0;
  while ((rank1 == 0 || CountLines(journal) < 4) && Clock::now() < deadline) {
    if (rank1 == 0) rank1 = FindRank(1);
    std::this_thread::sleep_for(std::chrono::milliseconds(2));
  }
  REQUIRE(rank1 > 0);
  ::kill(rank1, SIGKILL);
  CHECK(WaitFor(launcher) != kExitOk);  // mpirun ends the launch when a rank dies
  CHECK_FALSE(fs::exists(s.dir / "killed" / "replicates.csv"));
  const int lines = CountLines(journal);
  CHECK(lines >= 1 + 3);
  CHECK(lines < 1 + 20);  // 2 cells x 10 replicates: some were still missing

  std::string log;
  REQUIRE(Mpirun(2, {study, "--out", s.Path("killed")}, s, &log) == kExitOk);
  CHECK(Count(log, " of 20 units already done") == 1);
  CHECK(Count(log, "; 0 of 20 units already done") == 0);
  CHECK(CompareFolders(s.dir / "whole", s.dir / "killed") == 11);
  CHECK(CountLines(journal) == 1 + 20);
}

TEST_CASE("a busy folder or a bad study file: every rank stops, one message") {
  Scratch s("locind_runner_mpi_test_refused");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  std::string log;
  {
    Result<std::unique_ptr<Journal>> held = Journal::Open(s.Path("busy"), "someone else");
    REQUIRE(held.ok());
    CHECK(Mpirun(2, {study, "--out", s.Path("busy")}, s, &log) == kExitFailure);
    CHECK(Count(log, "another run is writing into " + s.Path("busy")) == 1);
  }
  std::string bad = kTinyStudy;
  bad.replace(bad.find("replicates: 4"), 13, "replicates: 0");
  const std::string bad_study = s.Write("bad.yaml", bad);
  CHECK(Mpirun(2, {bad_study, "--out", s.Path("bad")}, s, &log) == kExitInputError);
  CHECK(Count(log, bad_study + ":") == 1);
  CHECK_FALSE(fs::exists(s.dir / "bad"));
}

}  // namespace
}  // namespace locind::app
