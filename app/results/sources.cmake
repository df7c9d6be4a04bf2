# locind_results: result files: rows, their columns, writers, readers and merge.
locind_layer(locind_results
  DEPS locind_study
  SOURCES
    app/results/results_calibration.cc
    app/results/decision_rows.cc
    app/results/results_merge.cc
    app/results/results_reader.cc
    app/results/results_rows.cc
    app/results/results_table.cc
    app/results/results_writer.cc
)
