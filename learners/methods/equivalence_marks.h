// Solid and dashed marks for a learned graph, purely graphical.
//
// An edge e of a maximal graph N is dashed (missing from some member of its
// class) iff N - e has the separations of N (docs/theory.md F4); the check runs
// on the graph engine's separation model (graph/separation_model.h). For a
// graph that is not maximal (a statistical run may return one) the same
// rule says which edges can be dropped alone without changing separations.
#pragma once

#include <vector>

#include "graph/bit_graph.h"
#include "graph/edge.h"
#include "base/status.h"
#include "learners/methods/learner.h"

namespace locind::learners {

// dashed[i] for ListEdges(g)[i]. Fails beyond graph::kMaxExactNodes nodes.
Result<std::vector<bool>> DashedMarks(const graph::BitGraph& g);

// Sets result.graph (named `names`), and, when g is small enough for
// DashedMarks, result.edges, result.dashed and has_marks; otherwise leaves
// the marks empty and says so in result.note.
void SetGraphWithMarks(const graph::BitGraph& g, const std::vector<std::string>& names,
                       LearnResult& result);

}  // namespace locind::learners
