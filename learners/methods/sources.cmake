# locind_methods: learning methods; they see tests only through learners/independence/independence_test.h.
locind_layer(locind_methods
  DEPS locind_independence
  SOURCES
    learners/methods/equivalence_marks.cc
    learners/methods/exhaustive_learner.cc
    learners/methods/learner.cc
    learners/methods/learner_registry.cc
    learners/methods/maximal_criterion.cc
    learners/methods/margin_search.cc
    learners/methods/maximal_search.cc
    learners/methods/pairwise_learner.cc
    learners/methods/penalized_fit_learner.cc
    learners/methods/screening_learner.cc
    learners/methods/test_runner.cc
)
