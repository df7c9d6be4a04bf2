# locind_independence: independence tests (statistical and oracle); no learning method.
locind_layer(locind_independence
  DEPS locind_sim
  SOURCES
    learners/independence/drift_test.cc
    learners/independence/drift_transition_test.cc
    learners/independence/hawkes_features.cc
    learners/independence/hawkes_lr_test.cc
    learners/independence/local_covariance_test.cc
    learners/independence/oracle_test.cc
    learners/independence/projected_newton.cc
    learners/independence/reference_distributions.cc
)
