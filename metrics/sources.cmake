list(APPEND LOCIND_CORE_SOURCES
  metrics/cell_summary.cc
  metrics/intervals.cc
  metrics/pvalue_calibration.cc
  metrics/replicate_score.cc
  metrics/truth_class.cc
)
