locind_test(tests/sim/hawkes_model_test.cc)
locind_test(tests/sim/hawkes_simulator_test.cc)
locind_test(tests/sim/diffusion_simulator_test.cc)
locind_test(tests/sim/euler_maruyama_test.cc)
