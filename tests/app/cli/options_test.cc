// The shared option plumbing of the commands (app/cli/options.h).
#include <doctest/doctest.h>

#include "app/cli/options.h"
#include "app/io/error.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

std::string UsageMessage(const std::function<void()>& body) {
  try {
    body();
  } catch (const Error& e) {
    return e.ToString();
  }
  return "";
}

TEST_CASE("help rows are aligned with spaces, continuation lines under their text") {
  CHECK(AlignedRows({{"run", "a study"}, {"graph", "graphs\nand more"}}) ==
        "  run    a study\n"
        "  graph  graphs\n"
        "         and more\n");
}

TEST_CASE("--help anywhere; positionals named as shown; surplus words refused") {
  CHECK(WantsHelp({"data.csv", "--level", "0.1", "-h"}));
  CHECK_FALSE(WantsHelp({"data.csv", "--helpful"}));
  po::options_description d("x");
  d.add_options()("level", po::value<double>(), "level")("json", "json");
  const po::variables_map vm = ParseCommandLine({"--json", "d.csv"}, d, {{"data", "DATA.csv"}});
  CHECK(vm["data"].as<std::string>() == "d.csv");
  CHECK(UsageMessage([&] { ParseCommandLine({"--json"}, d, {{"data", "DATA.csv"}}); }) == "missing DATA.csv");
  CHECK(UsageMessage([&] { ParseCommandLine({"--json"}, d, {{"data", "DATA.csv", false}}); }).empty());
  CHECK(UsageMessage([&] { ParseCommandLine({"a", "b"}, d, {{"data", "DATA.csv"}}); }) ==
        "unexpected argument 'b'");
}

TEST_CASE("an option the choice does not read is refused by name") {
  po::options_description d("x");
  d.add_options()("penalty", po::value<double>(), "")("size", po::value<int>()->default_value(1), "");
  const po::variables_map given = ParseCommandLine({"--penalty", "2"}, d, {});
  CHECK(UsageMessage([&] { RefuseOptions(given, {"size", "penalty"}, "method pairwise"); }) ==
        "--penalty is not used by method pairwise; leave it out");
  // A default value is not "given".
  CHECK(UsageMessage([&] { RefuseOptions(given, {"size"}, "method pairwise"); }).empty());
}

}  // namespace
}  // namespace locind::app
