#include "learners/methods/equivalence_marks.h"

#include "graph/separation_model.h"

namespace locind::learners {

Result<std::vector<bool>> DashedMarks(const graph::BitGraph& g) {
  Result<graph::SeparationModel> model = graph::SeparationModel::Compute(g);
  if (!model.ok()) return model.status();
  std::vector<bool> dashed;
  graph::BitGraph trial = g;
  for (const graph::Edge& e : graph::ListEdges(g)) {
    trial.Remove(e);
    dashed.push_back(model->SameAfterChange(trial, e));
    trial.Add(e);
  }
  return dashed;
}

void SetGraphWithMarks(const graph::BitGraph& g, const std::vector<std::string>& names,
                       LearnResult& result) {
  result.graph = graph::ToDmg(g, names);
  Result<std::vector<bool>> dashed = DashedMarks(g);
  if (!dashed.ok()) {
    result.note = "no solid/dashed marks: " + dashed.status().message();
    return;
  }
  result.has_marks = true;
  result.edges = graph::ListEdges(g);
  result.dashed = std::move(dashed.value());
}

}  // namespace locind::learners
