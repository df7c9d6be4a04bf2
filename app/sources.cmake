list(APPEND LOCIND_APP_SOURCES
  app/atomic_file.cc
  app/graph_command.cc
  app/graph_file.cc
  app/graph_json.cc
  app/input_error.cc
  app/svg_render.cc
)
