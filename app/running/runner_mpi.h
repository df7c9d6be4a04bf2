// The ranks of an MPI launch: one study run shared across processes.
//
// `mpirun -np N locind run STUDY.yaml --out DIR` starts N copies of the same
// command. Each copy builds a RankGroup. Rank 0 (the lead) does everything a
// single-process run does — it reads the journal, holds DIR's lock, appends
// every finished unit to the journal as soon as it arrives and, once all are
// in, writes the final files — except that the units run on every rank.
// The other ranks never touch DIR: they read the study file themselves,
// draw the truths and compute their classes (the same on every rank), run
// the units they are given with their own --threads and send each result
// to rank 0 when it is done.
//
// Assignment (`--mpi-assign`):
//   dispatch  (default) rank 0 hands out units one at a time to whichever
//             thread on any rank is free, longest observation length first;
//   static    unit i of the pending list goes to rank i mod N, as --part does.
// Measured in DEVELOPERS.md ("Running across ranks with MPI"); the results
// are the same either way, since a unit's rows depend only on its streams.
//
// A rank that dies ends the launch (mpirun's default); what rank 0 had
// journalled is kept and the next run completes the rest, by the resume
// rules of app/running/runner_journal.h. No final file is written before every unit
// is in.
//
// Without the LOCIND_MPI build option a RankGroup is always the single
// process; it refuses `--mpi-assign` and refuses to run as one of several
// copies started by an MPI launcher (which would all run the whole study).
#pragma once

#include <algorithm>
#include <cstdlib>
#include <string>
#include <vector>

#include "app/running/progress.h"
#include "app/running/runner.h"
#include "app/study/study_truths.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"

namespace locind::app {

// True when this program was built with the LOCIND_MPI option.
bool BuiltWithMpi();

// The number of processes the MPI launcher that started this one started
// (OMPI_COMM_WORLD_SIZE from Open MPI's mpirun, PMI_SIZE from MPICH's or a
// scheduler's launcher), 1 when none did.
inline int LauncherRanks() {
  for (const char* name : {"OMPI_COMM_WORLD_SIZE", "PMI_SIZE"}) {
    if (const char* value = std::getenv(name)) return std::max(1, std::atoi(value));
  }
  return 1;
}

class RankGroup {
 public:
  // Joins the launch (MPI_Init) when LauncherRanks() > 1; otherwise a group
  // of one. `assign`: "dispatch", "static", or "" for the default.
  // Throws UsageError for another `assign`, and in a build without MPI for
  // a non-empty `assign` or LauncherRanks() > 1.
  explicit RankGroup(const std::string& assign);
  // The lead tells every other rank to stop (after a failure too), then
  // every rank leaves the launch (MPI_Finalize).
  ~RankGroup();
  RankGroup(const RankGroup&) = delete;
  RankGroup& operator=(const RankGroup&) = delete;

  int rank() const { return rank_; }
  int size() const { return size_; }
  bool lead() const { return rank_ == 0; }
  // "2 ranks x 1 thread, dispatch" for the start line; empty for one rank.
  std::string Describe(int threads) const;

  // Lead only: runs `units` across the ranks, `threads` threads on each,
  // calling `sink` and `progress` (may be null) on this thread once per
  // unit. With one rank this is app::RunUnits.
  void RunUnits(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths,
                const std::vector<Unit>& units, int threads, const UnitSink& sink,
                Progress* progress);

  // Every rank but the lead: reads `study_path`, runs what the lead sends
  // until it says stop, and returns the exit code (0; the lead reports
  // failures).
  int Serve(const std::string& study_path, int threads);

 private:
  // Lead: tells every other rank to stop and waits until each has (once).
  void StopOthers();

  bool joined_ = false;  // MPI_Init was called
  int rank_ = 0;
  int size_ = 1;
  bool dispatch_ = true;
  bool stopped_ = false;  // the lead has told the others to stop
};

}  // namespace locind::app
