// The grid's random-stream keys: cells that differ only in level share the
// data key (paired designs), and nothing else does.
#include <doctest/doctest.h>

#include "app/study/study_file.h"
#include "app/study/study_grid.h"

namespace locind::app {
namespace {

TEST_CASE("cells that differ only in level share their data key but not their cell key") {
  StudyOrErrors read = ParseStudyText(
      "truth: {random: {nodes: 4}}\nprocess: {events: {}}\n"
      "grid: {lengths: [100, 200], levels: [0.01, 0.05], hidden: [1, 2], spectral_radius: [0.4, 0.6]}\n"
      "learners: [{method: pairwise, test: oracle}]\n",
      "g.yaml");
  REQUIRE(std::holds_alternative<StudySpec>(read));
  const std::vector<Cell> cells = ExpandGrid(std::get<StudySpec>(read));
  REQUIRE(cells.size() == 16);
  for (const Cell& a : cells) {
    for (const Cell& b : cells) {
      if (a.index == b.index) continue;
      const bool same_but_level =
          a.length == b.length && a.hidden_factor == b.hidden_factor && a.stationarity == b.stationarity;
      CHECK((a.data_key == b.data_key) == same_but_level);
      CHECK(a.key != b.key);
    }
  }
  // Grid order: level just above length, so cells 0 and 2 differ in level only.
  CHECK(cells[0].label == "length=100 level=0.01 hidden=1 target=0.4");
  CHECK(cells[2].label == "length=100 level=0.05 hidden=1 target=0.4");
  CHECK(cells[0].data_key == cells[2].data_key);
  // The planner's cells are keyed the same way.
  CHECK(MakeCell(std::get<StudySpec>(read), 100, 0.3, 1, 0.4).data_key == cells[0].data_key);
}

}  // namespace
}  // namespace locind::app
