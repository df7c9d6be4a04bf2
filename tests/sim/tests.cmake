locind_test(tests/sim/hawkes_model_test.cc)
locind_test(tests/sim/hawkes_simulator_test.cc)
locind_test(tests/sim/diffusion_simulator_test.cc)
# Statistical reference checks: about a second each in Release, minutes in
# the Debug sanitizer build, hence the calibration label.
locind_test(tests/sim/ou_reference_test.cc LABELS calibration)
locind_test(tests/sim/euler_maruyama_test.cc LABELS calibration)
locind_test(tests/sim/tanh_reference_test.cc LABELS calibration)
