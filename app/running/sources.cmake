# locind_running: running a study: runner, replicates, journal, MPI ranks, planner, progress.
locind_layer(locind_running
  DEPS locind_results
  SOURCES
    app/running/external_learner.cc
    app/running/progress.cc
    app/running/runner.cc
    app/running/runner_journal.cc
    app/running/runner_replicate.cc
    app/running/study_planner.cc
)
# The MPI side of locind run only with the LOCIND_MPI option (app/running/runner_mpi.h).
if(LOCIND_MPI)
  target_sources(locind_running PRIVATE app/running/runner_mpi.cc)
  target_link_libraries(locind_running PUBLIC MPI::MPI_CXX)
else()
  target_sources(locind_running PRIVATE app/running/runner_mpi_off.cc)
endif()
