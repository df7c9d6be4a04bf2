// `locind test`: output layout (text and JSON), agreement with the library
// tests, and bad input.
#include <doctest/doctest.h>

#include "tests/app/command_fixture.h"
#include "base/number_format.h"

#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/event_csv.h"
#include "app/io/error.h"
#include "app/io/path_csv.h"
#include "app/study/test_choice.h"
#include "graph/dmg.h"
#include "learners/independence/drift_test.h"
#include "learners/independence/drift_transition_test.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/independence/local_covariance_test.h"
#include "sim/diffusion_simulator.h"
#include "sim/hawkes_simulator.h"

namespace locind::app {
namespace {

using testing::Outcome;

Outcome Run(const std::vector<std::string>& args) {
  return testing::RunHandler(RunTestCommand, args);
}

graph::TruthGraph PairTruth() {
  graph::Dmg g({"a", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(0, 0);
  g.AddDirected(1, 1);
  return {g, {}};
}

// Writes one event file and one path file of a -> b into a fresh directory.
struct Files {
  std::filesystem::path dir;
  std::string events, paths;
  sim::EventData event_data;
  sim::PathData path_data;

  Files() {
    dir = std::filesystem::temp_directory_path() / ("locind_test_command_" + std::to_string(getpid()));
    std::filesystem::create_directories(dir);
    base::RandomStream r1(1), r2(2);
    sim::HawkesRunOptions ho;
    ho.horizon = 300;
    event_data = sim::SimulateHawkes(sim::ExponentialHawkes(PairTruth(), 0.5, 0.4, 2.0, 0.2), ho, r1).value();
    sim::PathRunOptions po;
    po.horizon = 100;
    path_data = sim::SimulateDiffusion(sim::LinearDiffusion(PairTruth(), 1.0, 0.8, 1.0), po, r2).value();
    events = (dir / "events.csv").string();
    paths = (dir / "paths.csv").string();
    std::ofstream(events) << FormatEventCsv(event_data);
    std::ofstream(paths) << FormatPathCsv(path_data);
    // Read back, so the comparison uses exactly what the command reads.
    event_data = std::get<sim::EventData>(ReadEventCsvFile(events));
    path_data = std::get<sim::PathData>(ReadPathCsvFile(paths));
  }
  ~Files() { std::filesystem::remove_all(dir); }
};

TEST_CASE("--help names every test with what it assumes") {
  const Outcome r = Run({"--help"});
  CHECK(r.code == kExitOk);
  CHECK(r.err.empty());
  // Every name the study files and --test accept (app/study/test_choice.h).
  for (const char* name : {"hawkes-lr (default)", "hawkes-lr-chisq", "hawkes-lr-signed", "event-local-covariance",
                           "event-local-covariance-end", "event-local-covariance-batch",
                           "drift-exact-lr-history (default)", "drift-exact-lr", "drift-f",
                           "drift-robust-wald"}) {
    CHECK_MESSAGE(r.out.find(name) != std::string::npos, name);
  }
  CHECK(r.out.find("docs/tests.md") != std::string::npos);
}

TEST_CASE("text output lists the query and the result, one key per line") {
  Files f;
  const Outcome r = Run({f.events, "--target", "b", "--source", "a", "--given", "b"});
  CHECK(r.code == kExitOk);
  CHECK(r.err.empty());
  const std::regex layout(
      "query: target b, sources \\{a\\}, given \\{b\\} \\(the target's own past is included\\)\n"
      "target: b\nsources: a\ngiven: b\ntest: hawkes-lr\nstatistic: [0-9.e+-]+\ndf: 3\n"
      "p_value: [0-9.e+-]+\nstatus: ok\n");
  CHECK(std::regex_match(r.out, layout));
  // The same numbers as the library test with the default rate grid.
  auto features = std::make_shared<learners::HawkesFeatures>(
      learners::HawkesFeatures::Create(f.event_data, learners::DefaultHawkesRates(f.event_data)).value());
  const learners::TestResult direct = learners::HawkesLrTest(features).Run({1, {0}, {1}});
  CHECK(r.out.find("statistic: " + base::FormatNumber(direct.statistic) + "\n") != std::string::npos);
  CHECK(r.out.find("p_value: " + base::FormatNumber(direct.p_value) + "\n") != std::string::npos);
}

TEST_CASE("JSON output for paths, with the kind read from the header") {
  Files f;
  const Outcome r = Run({f.paths, "--target", "b", "--source", "a", "--given", "b", "--json"});
  CHECK(r.code == kExitOk);
  const std::regex layout(
      "\\{\"query\": \"target b, sources \\{a\\}, given \\{b\\} \\(the target's own past is included\\)\", "
      "\"target_past_given\": true, \"target\": \"b\", \"sources\": \\[\"a\"\\], \"given\": \\[\"b\"\\], \"test\": "
      "\"drift-exact-lr-history\", \"statistic\": [0-9.e+-]+, \"df\": 1, \"p_value\": [0-9.e+-]+, \"status\": "
      "\"ok\", \"reason\": \"\"\\}\n");
  CHECK(std::regex_match(r.out, layout));
  // The default path test is drift-exact-lr-history.
  auto test = learners::DriftTransitionTest::Create(f.path_data, {.history = true}).value();
  const learners::TestResult direct = test.Run({1, {0}, {1}});
  CHECK(r.out.find("\"statistic\": " + base::FormatNumber(direct.statistic) + ",") != std::string::npos);
}

TEST_CASE("test variants, rates and kind are options") {
  Files f;
  Outcome r = Run({f.events, "--target", "b", "--source", "a", "--given", "b", "--test",
                   "hawkes-lr-signed", "--rates", "2", "--kind", "events"});
  CHECK(r.code == kExitOk);
  CHECK(r.out.find("test: hawkes-lr-signed\n") != std::string::npos);
  CHECK(r.out.find("df: 1\n") != std::string::npos);
  r = Run({f.paths, "--target", "b", "--source", "a", "--test", "drift-robust-wald", "--rates", "1,0.1,0.01"});
  CHECK(r.code == kExitOk);
  CHECK(r.out.find("test: drift-robust-wald\n") != std::string::npos);
  CHECK(r.out.find("df: 4\n") != std::string::npos);
  // drift-exact-lr-history takes filter rates; its df stays |A|.
  r = Run({f.paths, "--target", "b", "--source", "a", "--given", "b", "--test", "drift-exact-lr-history",
           "--rates", "1"});
  CHECK(r.code == kExitOk);
  CHECK(r.out.find("test: drift-exact-lr-history\n") != std::string::npos);
  CHECK(r.out.find("df: 1\n") != std::string::npos);
}

TEST_CASE("event-local-covariance-batch resolves to the centred batch-variance test") {
  Files f;
  const Outcome r = Run({f.events, "--target", "b", "--source", "a", "--given", "b", "--test",
                         "event-local-covariance-batch"});
  CHECK(r.code == kExitOk);
  CHECK(r.out.find("test: event-local-covariance-batch\n") != std::string::npos);
  CHECK(IsEventTestName("event-local-covariance-batch"));
  const std::optional<learners::LocalCovarianceOptions> chosen =
      LocalCovarianceChoice("event-local-covariance-batch");
  REQUIRE(chosen.has_value());
  CHECK(chosen->batch_variance == learners::BatchVariance::kCentred);
  CHECK(chosen->statistic == learners::LocalCovarianceStatistic::kSupremum);
  // The same numbers as the library test with the default rate grid.
  auto features = std::make_shared<learners::HawkesFeatures>(
      learners::HawkesFeatures::Create(f.event_data, learners::DefaultHawkesRates(f.event_data)).value());
  const learners::TestResult direct =
      learners::LocalCovarianceTest(features, {.batch_variance = learners::BatchVariance::kCentred})
          .Run({1, {0}, {1}});
  CHECK(r.out.find("statistic: " + base::FormatNumber(direct.statistic) + "\n") != std::string::npos);
  CHECK(r.out.find("p_value: " + base::FormatNumber(direct.p_value) + "\n") != std::string::npos);
}

TEST_CASE("a query without the target's own past is said so, with a warning on stderr") {
  Files f;
  const std::string warning =
      "locind test: warning: --given does not include the target b, so the test leaves out b's own "
      "history (almost never intended; add b to --given)\n";
  // No --given at all: C is empty.
  Outcome r = Run({f.events, "--target", "b", "--source", "a"});
  CHECK(r.code == kExitOk);
  CHECK(r.err == warning);
  CHECK(r.out.rfind("query: target b, sources {a}, given {} (the target's own past is NOT included)\n", 0) == 0);
  CHECK(r.out.find("given: \n") != std::string::npos);
  // The same in JSON: the flag is false, and the warning still goes to stderr.
  r = Run({f.paths, "--target", "a", "--source", "b", "--given", "", "--json"});
  CHECK(r.code == kExitOk);
  CHECK(r.err == "locind test: warning: --given does not include the target a, so the test leaves out a's own "
                 "history (almost never intended; add a to --given)\n");
  CHECK(r.out.rfind("{\"query\": \"target a, sources {b}, given {} (the target's own past is NOT included)\", "
                    "\"target_past_given\": false, ", 0) == 0);
  // With the target in --given there is no warning.
  r = Run({f.paths, "--target", "a", "--source", "b", "--given", "a", "--json"});
  CHECK(r.err.empty());
  CHECK(r.out.find("\"target_past_given\": true") != std::string::npos);
}

TEST_CASE("not estimable results are printed with their reason") {
  Files f;
  sim::EventData few = f.event_data;
  few.times[1].resize(3);
  const std::string path = (f.dir / "few.csv").string();
  std::ofstream(path) << FormatEventCsv(few);
  const Outcome r = Run({path, "--target", "b", "--source", "a", "--given", "b"});
  CHECK(r.code == kExitOk);
  CHECK(r.out.find("status: not estimable: too few events: 'b' has 3, at least 10 needed\n") !=
        std::string::npos);
  // No number stands in for a p-value that could not be computed.
  CHECK(r.out.find("p_value: \n") != std::string::npos);
  CHECK(r.err ==
        "locind test: warning: 1 of 1 tests not estimable (neither separation nor dependence): "
        "too few events: 'b' has 3, at least 10 needed (1)\n");
  const Outcome json = Run({path, "--target", "b", "--source", "a", "--given", "b", "--json"});
  CHECK(json.out.find("\"p_value\": null") != std::string::npos);
}

TEST_CASE("bad input: one line, exit code 2") {
  Files f;
  Outcome r = Run({f.events, "--target", "b", "--source", "q"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == f.events + ": --source: unknown process 'q'\n");
  r = Run({f.events, "--target", "b", "--source", "a", "--given", "a"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "locind test: a --source process may not also be in --given\n");
  r = Run({f.events, "--target", "b", "--source", "b"});
  CHECK(r.code == kExitInputError);
  r = Run({f.events, "--target", "b", "--source", "a", "--rates", "0"});
  CHECK(r.err == f.events + ": --rates: '0' is not a positive number\n");
  r = Run({f.events, "--target", "b", "--source", "a", "--test", "drift-f"});
  CHECK(r.code == kExitInputError);
  r = Run({f.paths, "--target", "b", "--source", "a", "--kind", "events"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err.rfind(f.paths + ":1:1: ", 0) == 0);
  r = Run({f.events, "--source", "a"});
  CHECK(r.code == kExitInputError);
  CHECK(r.out.empty());
}

}  // namespace
}  // namespace locind::app

namespace locind::app {
namespace {

TEST_CASE("a missing data file is named DATA.csv; --help anywhere; --rates refused where unused") {
  Outcome r = Run({"--target", "b", "--source", "a"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err.rfind("locind test: missing DATA.csv (the data file)\n", 0) == 0);
  CHECK(r.err.find("--data") == std::string::npos);
  CHECK(Run({"x.csv", "--target", "b", "--help"}).out.rfind("usage: locind test", 0) == 0);
  const Files f;
  r = Run({f.paths, "--target", "b", "--source", "a", "--given", "b", "--rates", "1,2"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "locind test: --rates is not used by drift-exact-lr; leave it out\n");
}

TEST_CASE("numeric process ids in --target, --source and --given") {
  const Files f;
  // The same draw with a and b renamed 10 and 2: the same numbers.
  std::string text = FormatEventCsv(f.event_data);
  text = std::regex_replace(text, std::regex("# processes: a,b"), "# processes: 10,2");
  text = std::regex_replace(text, std::regex(",a\n"), ",10\n");
  text = std::regex_replace(text, std::regex(",b\n"), ",2\n");
  const std::string renamed = (f.dir / "numeric.csv").string();
  std::ofstream(renamed) << text;
  const Outcome named = Run({f.events, "--target", "b", "--source", "a", "--given", "b"});
  const Outcome numeric = Run({renamed, "--target", "2", "--source", "10", "--given", "2"});
  CHECK(numeric.err == "");
  CHECK(numeric.code == kExitOk);
  CHECK(numeric.out.find("p_value: ") != std::string::npos);
  CHECK(named.out.substr(named.out.find("statistic:")) == numeric.out.substr(numeric.out.find("statistic:")));
}

}  // namespace
}  // namespace locind::app

namespace locind::app {
namespace {

TEST_CASE("bytes that are not printable UTF-8 are escaped in error lines") {
  // An option and a file name with a Latin-1 byte and an escape character.
  Outcome r = Run({"data.csv", "--tar\xe9", "b"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err.find("--tar\\xe9") != std::string::npos);
  CHECK(r.err.find('\xe9') == std::string::npos);
  // A query name typed in another encoding and a terminal escape sequence.
  const Files f;
  r = Run({f.events, "--target", "caf\xe9\x1b[31m", "--source", "a"});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == f.events + ": --target: unknown process 'caf\\xe9\\x1b[31m'\n");
}

}  // namespace
}  // namespace locind::app
