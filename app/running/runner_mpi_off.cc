// RankGroup in a build without the LOCIND_MPI option: always one process.
#include "app/running/runner_mpi.h"

#include "app/io/error.h"

namespace locind::app {

bool BuiltWithMpi() { return false; }

RankGroup::RankGroup(const std::string& assign) {
  const std::string rebuild = "this locind was built without MPI (configure with -DLOCIND_MPI=ON, "
                              "see DEVELOPERS.md)";
  if (!assign.empty()) throw UsageError{"--mpi-assign: " + rebuild};
  if (LauncherRanks() > 1) {
    throw UsageError{"started as one of " + std::to_string(LauncherRanks()) +
                     " copies by an MPI launcher, but " + rebuild +
                     "; run one copy, or split the study with --part K/N and locind merge"};
  }
}

RankGroup::~RankGroup() = default;

std::string RankGroup::Describe(int) const { return ""; }

void RankGroup::RunUnits(const StudySpec& study, const std::vector<Cell>& cells,
                         const StudyTruths& truths, const std::vector<Unit>& units, int threads,
                         const UnitSink& sink, Progress* progress) {
  app::RunUnits(study, cells, truths, units, threads, sink, progress);
}

int RankGroup::Serve(const std::string&, int) { return kExitOk; }

}  // namespace locind::app
