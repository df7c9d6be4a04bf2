list(APPEND LOCIND_CORE_SOURCES
  learners/oracle_test.cc
  learners/equivalence_marks.cc
  learners/exhaustive_learner.cc
  learners/learner.cc
  learners/learner_registry.cc
  learners/maximal_criterion.cc
  learners/maximal_search.cc
  learners/pairwise_learner.cc
  learners/penalized_fit_learner.cc
  learners/screening_learner.cc
  learners/test_runner.cc
  learners/drift_test.cc
  learners/hawkes_features.cc
  learners/hawkes_lr_test.cc
  learners/projected_newton.cc
  learners/reference_distributions.cc
)
