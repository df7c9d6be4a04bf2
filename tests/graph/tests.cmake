locind_test(tests/graph/mu_separation_test.cc)
