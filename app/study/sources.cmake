# locind_study: the study: spec, file reader, grid of cells, cost, truths, test choice.
locind_layer(locind_study
  DEPS locind_io
  SOURCES
    app/study/study_cost.cc
    app/study/study_file.cc
    app/study/study_grid.cc
    app/study/study_truths.cc
    app/study/test_choice.cc
    app/study/truth_drawings.cc
    app/study/truth_models.cc
)
