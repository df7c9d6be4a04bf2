// `locind simulate` end to end on the bundled example models.
#include <doctest/doctest.h>

#include "tests/app/command_fixture.h"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "app/cli/command.h"
#include "app/io/event_csv.h"
#include "app/io/error.h"
#include "app/io/path_csv.h"

namespace locind::app {
namespace {

using testing::Outcome;

Outcome Run(const std::vector<std::string>& args) {
  return testing::RunHandler(RunSimulateCommand, args);
}

std::string Slurp(const std::string& path) {
  std::ifstream in(path);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

std::string Temp(const std::string& name) {
  return (std::filesystem::temp_directory_path() / ("locind_sim_test_" + name)).string();
}

TEST_CASE("events model: observed processes only, reproducible for a seed") {
  const std::string out = Temp("events.csv");
  const Outcome r = Run({"configs/models/hawkes_hidden_driver.yaml", "--horizon", "200", "--seed",
                         "7", "--out", out});
  REQUIRE(r.code == kExitOk);
  CHECK(r.out.find("wrote " + out + " (") == 0);
  const std::string first = Slurp(out);
  CHECK(first.rfind("# processes: x1,x2\n# window: 0,200\ntime,process\n", 0) == 0);
  EventsOrError read = ReadEventCsvFile(out);
  REQUIRE(std::holds_alternative<sim::EventData>(read));
  CHECK(std::get<sim::EventData>(read).total_events() > 50);
  REQUIRE(Run({"configs/models/hawkes_hidden_driver.yaml", "--horizon", "200", "--seed", "7",
               "--out", out}).code == kExitOk);
  CHECK(Slurp(out) == first);
  REQUIRE(Run({"configs/models/hawkes_hidden_driver.yaml", "--horizon", "200", "--seed", "7",
               "--replicate", "1", "--out", out}).code == kExitOk);
  CHECK(Slurp(out) != first);
  std::remove(out.c_str());
}

TEST_CASE("paths model: header and grid") {
  const std::string out = Temp("paths.csv");
  REQUIRE(Run({"configs/models/ou_chain.yaml", "--horizon", "5", "--seed", "1", "--out", out}).code ==
          kExitOk);
  PathsOrError read = ReadPathCsvFile(out);
  REQUIRE(std::holds_alternative<sim::PathData>(read));
  const auto& p = std::get<sim::PathData>(read);
  CHECK(p.names == std::vector<std::string>{"x1", "x2", "x3"});
  CHECK(p.samples() == 51);
  CHECK(Slurp(out).rfind("time,x1,x2,x3\n0,", 0) == 0);
  std::remove(out.c_str());
}

TEST_CASE("bad input: exit 2, one-line message, no output file") {
  const std::string out = Temp("never.csv");
  std::remove(out.c_str());
  const std::string bad = Temp("bad_model.yaml");
  std::ofstream(bad) << "nodes: [a]\nedges: [a -> a]\nevents:\n  kernel: {weight: 2}\n";
  Outcome r = Run({bad, "--horizon", "10", "--seed", "1", "--out", out});
  CHECK(r.code == kExitInputError);
  CHECK(r.err.find(bad + ":4:3: events: not stationary") == 0);
  CHECK(std::count(r.err.begin(), r.err.end(), '\n') == 1);
  CHECK_FALSE(std::filesystem::exists(out));
  r = Run({"configs/models/ou_chain.yaml", "--horizon", "-1", "--seed", "1", "--out", out});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "locind simulate: --horizon must be > 0\n");
  r = Run({"configs/models/ou_chain.yaml", "--seed", "1", "--out", out});
  CHECK(r.code == kExitInputError);
  r = Run({"missing.yaml", "--horizon", "1", "--seed", "1", "--out", out});
  CHECK(r.err == "missing.yaml: cannot open the file\n");
  CHECK_FALSE(std::filesystem::exists(out));
  std::remove(bad.c_str());
}

}  // namespace
}  // namespace locind::app
