# locind_sim: simulators of event streams and diffusion paths.
locind_layer(locind_sim
  DEPS locind_graph Eigen3::Eigen
  SOURCES
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
