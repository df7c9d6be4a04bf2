#include "metrics/replicate_score.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace locind::metrics {
namespace {

using graph::Edge;
using graph::EdgeKind;

// Every possible edge over n nodes, in ListEdges order.
std::vector<Edge> PossibleEdges(int n) {
  std::vector<Edge> out;
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) out.push_back({a, b, EdgeKind::kDirected});
  for (int a = 0; a < n; ++a)
    for (int b = a + 1; b < n; ++b) out.push_back({a, b, EdgeKind::kBidirected});
  return out;
}

void Count(EdgeCounts& c, TruthStatus truth, bool reported) {
  if (reported) {
    ++c.reported;
    if (truth == TruthStatus::kAbsent) {
      ++c.false_edges;
    } else {
      ++c.in_class;
    }
  }
  if (truth == TruthStatus::kSolid) {
    ++c.solid;
    reported ? ++c.solid_found : ++c.missed_solid;
  } else if (truth == TruthStatus::kDashed) {
    ++c.dashed;
    if (reported) ++c.dashed_found;
  }
}

double Ratio(int numerator, int denominator) {
  return denominator == 0 ? std::numeric_limits<double>::quiet_NaN()
                          : static_cast<double>(numerator) / denominator;
}

}  // namespace

EdgeGroup GroupOf(const Edge& e) {
  if (e.kind == EdgeKind::kBidirected) return EdgeGroup::kBidirected;
  return e.from == e.to ? EdgeGroup::kLoop : EdgeGroup::kDirected;
}

const char* EdgeGroupName(EdgeGroup group) {
  switch (group) {
    case EdgeGroup::kDirected: return "directed";
    case EdgeGroup::kLoop: return "loop";
    case EdgeGroup::kBidirected: return "bidirected";
  }
  return "directed";
}

EdgeCounts& EdgeCounts::operator+=(const EdgeCounts& o) {
  reported += o.reported;
  in_class += o.in_class;
  false_edges += o.false_edges;
  solid += o.solid;
  solid_found += o.solid_found;
  missed_solid += o.missed_solid;
  dashed += o.dashed;
  dashed_found += o.dashed_found;
  return *this;
}

ReplicateScore ScoreGraph(const TruthClass& truth_class, const graph::Dmg& learned) {
  ReplicateScore s;
  for (const Edge& e : PossibleEdges(learned.size())) {
    Count(s.by_group[static_cast<int>(GroupOf(e))], truth_class.StatusOf(e), graph::HasEdge(learned, e));
  }
  for (const EdgeCounts& c : s.by_group) s.total += c;
  s.power = Ratio(s.total.solid_found, s.total.solid);
  s.false_edge_rate = Ratio(s.total.false_edges, s.total.reported);
  // Dashed edges are never scored (results/README.md): only missed solid edges
  // and edges outside N are errors.
  s.hamming = s.total.missed_solid + s.total.false_edges;
  s.class_recovered = s.hamming == 0;
  return s;
}

ReplicateScore ScoreGraph(const TruthClass& truth_class, const graph::Dmg& learned,
                          const std::vector<Edge>& learner_dashed) {
  ReplicateScore s = ScoreGraph(truth_class, learned);
  for (const Edge& e : PossibleEdges(learned.size())) {
    const TruthStatus truth = truth_class.StatusOf(e);
    if (truth == TruthStatus::kAbsent || !graph::HasEdge(learned, e)) continue;
    const bool marked_dashed =
        std::find(learner_dashed.begin(), learner_dashed.end(), e) != learner_dashed.end();
    ++s.marks_compared;
    if (marked_dashed == (truth == TruthStatus::kDashed)) ++s.marks_agree;
  }
  s.mark_agreement = Ratio(s.marks_agree, s.marks_compared);
  return s;
}

std::vector<EdgeAudit> AuditEdges(const TruthClass& truth_class, const graph::Dmg& learned) {
  std::vector<EdgeAudit> out;
  for (const Edge& e : PossibleEdges(learned.size())) {
    const TruthStatus truth = truth_class.StatusOf(e);
    const bool reported = graph::HasEdge(learned, e);
    if (reported || truth == TruthStatus::kSolid) out.push_back({e, truth, reported});
  }
  return out;
}

}  // namespace locind::metrics
