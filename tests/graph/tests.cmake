locind_test(tests/graph/mu_separation_test.cc)
locind_test(tests/graph/latent_projection_test.cc)
locind_test(tests/graph/equivalence_graph_test.cc)
locind_test(tests/graph/truth_graph_test.cc)
