list(APPEND LOCIND_CORE_SOURCES
  sim/diffusion_model.cc
  sim/diffusion_simulator.cc
  sim/hawkes_cluster.cc
  sim/hawkes_compensator.cc
  sim/hawkes_model.cc
  sim/hawkes_simulator.cc
  sim/hawkes_thinning.cc
  sim/ou_transition.cc
  sim/stability.cc
)
