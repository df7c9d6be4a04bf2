#include "learners/methods/learner.h"

namespace locind::learners {

std::vector<graph::Edge> DashedEdges(const LearnResult& result) {
  std::vector<graph::Edge> out;
  for (size_t i = 0; i < result.edges.size() && i < result.dashed.size(); ++i) {
    if (result.dashed[i]) out.push_back(result.edges[i]);
  }
  return out;
}

}  // namespace locind::learners
