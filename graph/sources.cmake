# locind_graph: graphs, mu-separation, projection, equivalence classes.
locind_layer(locind_graph
  DEPS locind_base
  SOURCES
    graph/bit_graph.cc
    graph/dmg.cc
    graph/dot_format.cc
    graph/edge.cc
    graph/equivalence_graph.cc
    graph/latent_projection.cc
    graph/markov_equivalence.cc
    graph/mu_separation.cc
    graph/separation_model.cc
    graph/truth_graph.cc
)
