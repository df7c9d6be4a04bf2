list(APPEND LOCIND_APP_SOURCES
  app/atomic_file.cc
  app/command_guard.cc
  app/graph_command.cc
  app/learn_command.cc
  app/graph_file.cc
  app/graph_json.cc
  app/input_error.cc
  app/svg_render.cc
  app/test_choice.cc
  app/test_command.cc
)
list(APPEND LOCIND_APP_SOURCES app/event_csv.cc app/path_csv.cc app/model_file.cc app/simulate_command.cc)
list(APPEND LOCIND_APP_SOURCES app/study_file.cc app/study_grid.cc app/runner_truths.cc app/runner_replicate.cc app/runner_journal.cc app/runner.cc app/progress.cc app/results_rows.cc app/results_writer.cc app/results_table.cc app/results_merge.cc app/study_planner.cc app/run_command.cc app/merge_command.cc app/plan_command.cc)
list(APPEND LOCIND_APP_SOURCES app/external_program.cc app/report_data.cc app/report_drawings.cc app/report_figures.cc app/report_html.cc app/report.cc app/report_command.cc)
# The MPI side of locind run only with the LOCIND_MPI option (app/runner_mpi.h).
if(LOCIND_MPI)
  list(APPEND LOCIND_APP_SOURCES app/runner_mpi.cc)
else()
  list(APPEND LOCIND_APP_SOURCES app/runner_mpi_off.cc)
endif()
list(APPEND LOCIND_APP_SOURCES app/study_cost.cc)
