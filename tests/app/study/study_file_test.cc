// Study files: the demo files parse to the values they state, and bad files
// report every problem as FILE:LINE:COLUMN: FIELD: message (exit 2, no
// output folder created).
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>
#include <sstream>

#include "app/cli/command.h"
#include "app/io/error.h"
#include "app/study/study_file.h"
#include "app/study/study_grid.h"

namespace locind::app {
namespace {

std::vector<std::string> Messages(const StudyOrErrors& read) {
  std::vector<std::string> out;
  if (const auto* errors = std::get_if<std::vector<Error>>(&read)) {
    for (const Error& e : *errors) out.push_back(e.ToString());
  }
  return out;
}

TEST_CASE("configs/demo.yaml: explicit truth, events, three lengths, four learners") {
  const StudyOrErrors read = ReadStudyFile("configs/demo.yaml");
  REQUIRE(Messages(read).empty());
  const StudySpec& s = std::get<StudySpec>(read);
  CHECK(s.name == "pumping_station");
  CHECK(s.seed == 20261201u);
  CHECK_FALSE(s.truth.random);
  CHECK(s.truth.explicit_graph.graph.size() == 7);
  CHECK(s.truth.explicit_graph.hidden.size() == 2);
  CHECK(s.truth.truths == 2);
  CHECK(s.events);
  CHECK(s.event_process.weight.low == 0.3);
  CHECK(s.event_process.weight.high == 0.6);
  REQUIRE(s.event_process.spectral_radius.has_value());
  CHECK(*s.event_process.spectral_radius == 0.6);
  CHECK(s.grid.lengths == std::vector<double>{250, 1000, 4000});
  CHECK(s.grid.levels == std::vector<double>{0.05});
  REQUIRE(s.learners.size() == 4);
  CHECK(s.learners[0].label == "pairwise/hawkes-lr");
  CHECK(s.learners[2].method == "screen");
  CHECK(s.learners[2].screening_size == 1);
  CHECK(s.learners[3].test == "oracle");
  const std::vector<Cell> cells = ExpandGrid(s);
  REQUIRE(cells.size() == 3);
  CHECK(cells[1].label == "length=1000 level=0.05 target=0.6");
  CHECK(cells[1].hidden_count == 2);
}

TEST_CASE("configs/demo_diffusion.yaml: random truths, paths, a hidden-count factor") {
  const StudyOrErrors read = ReadStudyFile("configs/demo_diffusion.yaml");
  REQUIRE(Messages(read).empty());
  const StudySpec& s = std::get<StudySpec>(read);
  CHECK_FALSE(s.events);
  CHECK(s.truth.random);
  CHECK(s.truth.random_graph.nodes == 4);  // observed; the hidden one comes on top
  CHECK(s.truth.random_graph.expected_in_degree == 1.2);
  CHECK(s.grid.hidden_counts == std::vector<int>{0, 1});
  CHECK(s.grid.hidden_fixed_observed);
  CHECK_FALSE(s.path_process.rescale_both);  // rescale: down by default
  const std::vector<Cell> cells = ExpandGrid(s);
  REQUIRE(cells.size() == 6);  // 2 hidden counts x 3 lengths, length fastest
  CHECK(cells[0].hidden_count == 0);
  CHECK(cells[3].hidden_count == 1);
  CHECK(cells[4].length == 200);
}

TEST_CASE("every problem is reported with its line and column, in file order") {
  const std::string text =
      "seed: 3\n"                                   // 1
      "colour: blue\n"                              // 2: unknown key
      "truth:\n"                                    // 3
      "  random: {nodes: 4, edge_probability: 2}\n"  // 4: probability out of range (col 40)
      "process:\n"                                  // 5
      "  events: {baseline: -1, decay: fast}\n"     // 6: baseline <= 0, decay not a number
      "grid:\n"                                     // 7
      "  lengths: [100, 0]\n"                       // 8: length 0
      "learners:\n"                                 // 9
      "  - {method: guessing}\n"                    // 10: unknown method
      "  - {method: pairwise, test: drift-f}\n";    // 11: path test on events
  const std::vector<std::string> m = Messages(ParseStudyText(text, "bad.yaml"));
  REQUIRE(m.size() == 7);
  CHECK(m[0].rfind("bad.yaml:2:1: colour: unknown key", 0) == 0);
  CHECK(m[1] == "bad.yaml:4:40: truth.random.edge_probability: must lie in [0, 1]");
  CHECK(m[2] == "bad.yaml:6:22: process.events.baseline: must be > 0");
  CHECK(m[3] == "bad.yaml:6:33: process.events.decay: expected a finite number");
  CHECK(m[4] == "bad.yaml:8:18: grid.lengths: expected numbers in (0, inf)");
  CHECK(m[5].rfind("bad.yaml:10:14: learners[1].method: unknown method", 0) == 0);
  CHECK(m[6].rfind("bad.yaml:11:30: learners[2].test: expected one of:", 0) == 0);
}

TEST_CASE("missing sections, explicit-graph errors and cross-field rules") {
  SUBCASE("missing sections name the field") {
    const auto m = Messages(ParseStudyText("seed: 1\n", "s.yaml"));
    REQUIRE(m.size() == 4);
    CHECK(m[0] == "s.yaml:1:1: truth: missing");
    CHECK(m[3] == "s.yaml:1:1: learners: missing");
  }
  SUBCASE("graph errors are prefixed with truth.") {
    const auto m = Messages(ParseStudyText(
        "truth: {nodes: [a, b], edges: [a -> c]}\nprocess: {events: {}}\ngrid: {lengths: [10]}\n"
        "learners: [{method: pairwise, test: oracle}]\n",
        "g.yaml"));
    REQUIRE(m.size() == 1);
    CHECK(m[0] == "g.yaml:1:32: truth.edges: unknown node 'c'");
  }
  SUBCASE("a hidden-count factor needs a random truth; diffusions need loops on every node") {
    const auto m = Messages(ParseStudyText(
        "truth: {random: {nodes: 3, loops: none}}\nprocess: {paths: {}}\n"
        "grid: {lengths: [10], hidden: [0, 5]}\nlearners: [{method: pairwise}]\n",
        "x.yaml"));
    REQUIRE(m.size() == 2);
    CHECK(m[0].rfind("x.yaml:1:35: truth.random.loops: diffusion truths need a loop", 0) == 0);
    CHECK(m[1] == "x.yaml:3:35: grid.hidden: expected whole numbers in [0, 2]");
  }
  SUBCASE("two learners with the same label") {
    const auto m = Messages(ParseStudyText(
        "truth: {nodes: [a]}\nprocess: {events: {}}\ngrid: {lengths: [10]}\n"
        "learners: [{method: pairwise, test: oracle}, {method: pairwise, test: oracle}]\n",
        "d.yaml"));
    REQUIRE(m.size() == 1);
    CHECK(m[0].find("learner 'pairwise/oracle' listed twice") != std::string::npos);
  }
  SUBCASE("not YAML at all") {
    const auto m = Messages(ParseStudyText("truth: [a, b\n", "y.yaml"));
    REQUIRE(m.size() == 1);
    CHECK(m[0].rfind("y.yaml:", 0) == 0);
    CHECK(m[0].find("not valid YAML") != std::string::npos);
  }
}

TEST_CASE("duplicate keys, memory_mb, wrong types and huge values") {
  const std::string rest =
      "truth: {nodes: [a, b], edges: [a -> b]}\nprocess: {events: {}}\n"
      "learners: [{method: pairwise, test: oracle}]\n";
  SUBCASE("a key given twice is refused, not silently dropped") {
    const auto m =
        Messages(ParseStudyText(rest + "grid: {lengths: [10]}\nseed: 1\nseed: 2\n", "k.yaml"));
    REQUIRE(m.size() == 1);
    CHECK(m[0] == "k.yaml:6:1: seed: given twice");
    const auto n = Messages(
        ParseStudyText(rest + "grid: {lengths: [10], replicates: 2, replicates: 3}\n", "k.yaml"));
    REQUIRE(n.size() == 1);
    CHECK(n[0] == "k.yaml:4:38: grid.replicates: given twice");
  }
  SUBCASE("memory_mb: a whole number of MiB, default 2048") {
    const StudyOrErrors ok = ParseStudyText(rest + "grid: {lengths: [10]}\n", "m.yaml");
    REQUIRE(std::holds_alternative<StudySpec>(ok));
    CHECK(std::get<StudySpec>(ok).memory_mb == 2048);
    const auto m =
        Messages(ParseStudyText(rest + "grid: {lengths: [10]}\nmemory_mb: lots\n", "m.yaml"));
    REQUIRE(m.size() == 1);
    CHECK(m[0] == "m.yaml:5:12: memory_mb: expected a whole number from 16 to 16777216");
    CHECK(
        Messages(ParseStudyText(rest + "grid: {lengths: [10]}\nmemory_mb: 8\n", "m.yaml")).size() ==
        1);
  }
  SUBCASE("wrong types and huge values") {
    const auto m = Messages(ParseStudyText(
        rest + "grid: {lengths: [1e999, {a: 1}], replicates: 1e12, levels: oops}\nseed: -1\n",
        "t.yaml"));
    REQUIRE(m.size() == 5);
    CHECK(m[0] == "t.yaml:4:18: grid.lengths: expected a finite number");
    CHECK(m[1] == "t.yaml:4:25: grid.lengths: expected a finite number");
    CHECK(m[2] == "t.yaml:4:46: grid.replicates: expected a whole number from 1 to 1000000");
    CHECK(m[3] == "t.yaml:4:60: grid.levels: expected a finite number");
    CHECK(m[4] == "t.yaml:5:7: seed: expected a whole number >= 0");
  }
  SUBCASE("an empty file") {
    const auto m = Messages(ParseStudyText("", "e.yaml"));
    REQUIRE(m.size() == 1);
    CHECK(m[0] == "e.yaml: study: expected a mapping with truth, process, grid and learners");
  }
}

TEST_CASE("an explicit event truth must be stationary at the upper ends of its weight ranges") {
  // K has the loop a -> a (0.5) and the cycle a -> b -> a (0.7 each): its
  // eigenvalues solve x (x - 0.5) = 0.49, largest 0.25 + sqrt(0.0625 + 0.49)
  // = 0.993 (stationary); with weight up to 0.8 it is 0.25 + sqrt(0.7025)
  // = 1.088 (hand computation, characteristic polynomial of a 2 x 2 matrix).
  const std::string head = "truth: {nodes: [a, b], edges: [a -> a, a -> b, b -> a]}\n";
  const std::string tail = "grid: {lengths: [10]}\nlearners: [{method: pairwise, test: oracle}]\n";
  CHECK(Messages(ParseStudyText(head + "process: {events: {weight: [0.1, 0.7], loop_weight: 0.5}}\n" + tail,
                                "ok.yaml")).empty());
  const auto m = Messages(ParseStudyText(
      head + "process: {events: {weight: [0.1, 0.8], loop_weight: 0.5}}\n" + tail, "hot.yaml"));
  REQUIRE(m.size() == 1);
  CHECK(m[0].rfind("hot.yaml:2:28: process.events.weight: with the largest weights the spectral radius of K is 1.08", 0) == 0);
  // A rescaling target makes any weights acceptable.
  CHECK(Messages(ParseStudyText(
                     head + "process: {events: {weight: [0.1, 0.8], loop_weight: 0.5, spectral_radius: 0.5}}\n" + tail,
                     "scaled.yaml")).empty());
}

TEST_CASE("locind run on a bad study: exit 2, one line per problem, no output folder") {
  const std::filesystem::path dir = std::filesystem::temp_directory_path() /
                                    ("locind_study_file_test_" + std::to_string(::getpid()));
  std::filesystem::remove_all(dir);
  std::filesystem::create_directories(dir);
  const std::string study = (dir / "bad.yaml").string();
  {
    std::ofstream f(study);
    f << "truth: {nodes: [a, b]}\nprocess: {events: {weight: [0.5, 0.1]}}\ngrid: {lengths: [10], replicates: 0}\n"
         "learners: [{method: pairwise, test: oracle}]\n";
  }
  std::ostringstream out, err;
  const std::string results = (dir / "out").string();
  CHECK(RunRunCommand({study, "--out", results}, out, err) == kExitInputError);
  CHECK(err.str() == study + ":2:28: process.events.weight: a range [low, high] needs low <= high\n" + study +
                         ":3:35: grid.replicates: expected a whole number from 1 to 1000000\n");
  CHECK_FALSE(std::filesystem::exists(results));
  std::filesystem::remove_all(dir);
}

// ---- study designs: rescale, hidden_mode ----

TEST_CASE("rescale is down by default and both on request") {
  const std::string head = "truth: {nodes: [a, b], edges: [a -> b]}\n";
  const std::string tail = "grid: {lengths: [10]}\nlearners: [{method: pairwise, test: oracle}]\n";
  const StudyOrErrors plain = ParseStudyText(head + "process: {events: {spectral_radius: 0.5}}\n" + tail, "r.yaml");
  REQUIRE(Messages(plain).empty());
  CHECK_FALSE(std::get<StudySpec>(plain).event_process.rescale_both);
  const StudyOrErrors both =
      ParseStudyText(head + "process: {events: {spectral_radius: 0.5, rescale: both}}\n" + tail, "r.yaml");
  REQUIRE(Messages(both).empty());
  CHECK(std::get<StudySpec>(both).event_process.rescale_both);
  const auto m = Messages(ParseStudyText(head + "process: {events: {rescale: up}}\n" + tail, "r.yaml"));
  REQUIRE(m.size() == 1);
  CHECK(m[0] == "r.yaml:2:29: process.events.rescale: expected one of: both, down");
}

TEST_CASE("grid.hidden with truth.random.hidden is an error naming both places") {
  const std::string text =
      "truth:\n"                                             // 1
      "  random: {nodes: 5, hidden: 1}\n"                    // 2: the count at column 30
      "process: {events: {}}\n"                              // 3
      "grid: {lengths: [10], hidden: [1, 2]}\n"              // 4: the list at column 31
      "learners: [{method: pairwise, test: oracle}]\n";      // 5
  const auto m = Messages(ParseStudyText(text, "h.yaml"));
  REQUIRE(m.size() == 1);
  CHECK(m[0] ==
        "h.yaml:4:31: grid.hidden: the hidden-count factor replaces truth.random.hidden (given at "
        "h.yaml:2:30); give one of the two");
  std::ostringstream out, err;
  std::ofstream("designs_hidden_both.yaml") << text;
  CHECK(RunRunCommand({"designs_hidden_both.yaml", "--out", "designs_hidden_both_out"}, out, err) ==
        kExitInputError);
  CHECK(err.str().find("designs_hidden_both.yaml:4:31: grid.hidden:") != std::string::npos);
  std::filesystem::remove("designs_hidden_both.yaml");
}

TEST_CASE("hidden_mode fixed-observed counts random.nodes as observed and needs grid.hidden") {
  const std::string head = "truth: {random: {nodes: 62}}\nprocess: {events: {}}\n";
  const std::string learners = "learners: [{method: pairwise, test: oracle}]\n";
  const StudyOrErrors fixed =
      ParseStudyText(head + "grid: {lengths: [10], hidden: [0, 2], hidden_mode: fixed-observed}\n" + learners, "f.yaml");
  REQUIRE(Messages(fixed).empty());
  CHECK(std::get<StudySpec>(fixed).grid.hidden_fixed_observed);
  // 62 observed + 3 hidden would pass the 64-node limit.
  auto m = Messages(
      ParseStudyText(head + "grid: {lengths: [10], hidden: [3], hidden_mode: fixed-observed}\n" + learners, "f.yaml"));
  REQUIRE(m.size() == 1);
  CHECK(m[0] == "f.yaml:3:32: grid.hidden: expected whole numbers in [0, 2]");
  m = Messages(ParseStudyText(head + "grid: {lengths: [10], hidden_mode: fixed-observed}\n" + learners, "f.yaml"));
  REQUIRE(m.size() == 1);
  CHECK(m[0] == "f.yaml:3:36: grid.hidden_mode: applies to a hidden-count factor (grid.hidden)");
}

// ---- end study designs ----

}  // namespace
}  // namespace locind::app

namespace locind::app {
namespace {

// screen's size counts processes besides the target: n observed processes
// leave n - 1 (learners/methods/screening_learner.h).
TEST_CASE("screen sizes are checked against the observed process count") {
  const std::string head =
      "seed: 1\n"
      "truth: {nodes: [a, b, c, d, e, h], edges: [a -> b], hidden: [h]}\n"
      "process: {events: {baseline: 0.5, weight: 0.3, loop_weight: 0.2, decay: 2}}\n"
      "grid: {lengths: [100], replicates: 1}\n";
  const auto m = Messages(ParseStudyText(head + "learners: [{method: screen, test: oracle, size: 9}]\n", "s.yaml"));
  REQUIRE(m.size() == 1);
  CHECK(m[0] == "s.yaml:5:49: learners[1].size: size 9 is more than the truths' 5 observed processes allow "
                "(at most 4, the number of processes besides the target)");
  CHECK(Messages(ParseStudyText(head + "learners: [{method: screen, test: oracle, size: 4}]\n", "s.yaml")).empty());
  // Random truths: the fewest observed over the hidden-count factor (6 - 3).
  const std::string random =
      "seed: 1\n"
      "truth: {random: {nodes: 6, edge_probability: 0.3}}\n"
      "process: {events: {baseline: 0.5, weight: 0.3, loop_weight: 0.2, decay: 2, spectral_radius: 0.5}}\n"
      "grid: {lengths: [100], replicates: 1, hidden: [0, 3]}\n";
  const auto r = Messages(ParseStudyText(random + "learners: [{method: screen, test: oracle, size: 3}]\n", "r.yaml"));
  REQUIRE(r.size() == 1);
  CHECK(r[0].find("learners[1].size: size 3 is more than the truths' 3 observed processes allow (at most 2") !=
        std::string::npos);
}

}  // namespace
}  // namespace locind::app
