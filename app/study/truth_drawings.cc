#include "app/study/truth_drawings.h"

#include "graph/dot_format.h"

namespace locind::app {

std::string TruthDot(const PreparedTruth& t) {
  graph::DotOptions style;
  style.title = "truth " + t.label;
  style.hidden = t.truth.hidden;
  return graph::ToDot(t.truth.graph, style);
}

std::string ProjectionDot(const PreparedTruth& t) {
  graph::DotOptions style;
  style.title = "latent projection " + t.label;
  return graph::ToDot(t.truth_class->projected, style);
}

std::string ClassDot(const PreparedTruth& t) {
  graph::DotOptions style;
  style.title = "equivalence graph " + t.label;
  for (size_t i = 0; i < t.truth_class->edges.size(); ++i) {
    if (t.truth_class->dashed[i]) style.dashed.push_back(t.truth_class->edges[i]);
  }
  return graph::ToDot(t.truth_class->maximal, style);
}

}  // namespace locind::app
