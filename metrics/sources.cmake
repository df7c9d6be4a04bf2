# locind_metrics: scoring learned graphs against the true class; aggregation.
locind_layer(locind_metrics
  DEPS locind_methods
  SOURCES
    metrics/cell_summary.cc
    metrics/error_attribution.cc
    metrics/intervals.cc
    metrics/learner_comparison.cc
    metrics/pvalue_calibration.cc
    metrics/replicate_score.cc
    metrics/truth_class.cc
)
