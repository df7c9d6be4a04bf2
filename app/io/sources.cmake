# locind_io: input errors, file formats (graph, model, event, path, JSON), atomic writes, Graphviz, child programs.
locind_layer(locind_io
  DEPS locind_metrics yaml-cpp PkgConfig::GVC
  SOURCES
    app/io/atomic_file.cc
    app/io/data_kind.cc
    app/io/child_process.cc
    app/io/event_csv.cc
    app/io/external_program.cc
    app/io/graph_file.cc
    app/io/graph_json.cc
    app/io/error.cc
    app/io/model_file.cc
    app/io/model_file_writer.cc
    app/io/path_csv.cc
    app/io/process_id.cc
    app/io/svg_render.cc
    app/io/trial_folder.cc
    app/io/window_check.cc
)
