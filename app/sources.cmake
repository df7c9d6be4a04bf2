list(APPEND LOCIND_APP_SOURCES
  app/atomic_file.cc
  app/graph_command.cc
  app/learn_command.cc
  app/graph_file.cc
  app/graph_json.cc
  app/input_error.cc
  app/svg_render.cc
  app/test_command.cc
)
list(APPEND LOCIND_APP_SOURCES app/event_csv.cc app/path_csv.cc app/model_file.cc app/simulate_command.cc)
