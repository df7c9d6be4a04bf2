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
list(APPEND LOCIND_APP_SOURCES app/study_cost.cc)
