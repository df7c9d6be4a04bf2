list(APPEND LOCIND_CORE_SOURCES
  learners/oracle_test.cc
  learners/drift_test.cc
  learners/hawkes_features.cc
  learners/hawkes_lr_test.cc
  learners/projected_newton.cc
  learners/reference_distributions.cc
)
