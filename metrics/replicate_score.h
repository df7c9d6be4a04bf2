// ReplicateScore: one learned graph compared with the true class.
//
// Edges are grouped as directed (a -> b, a != b), loops (a -> a) and
// bidirected (a <-> b). For each group and in total:
//   in_class      reported edges that are in the maximal graph N
//   false_edges   reported edges not in N (no equivalent graph has them)
//   solid         solid edges of N;  solid_found  of those reported
//   missed_solid  solid - solid_found
//   dashed        dashed edges of N; dashed_found of those reported
//                 (undetermined: reported apart, never in power or errors)
// Power = solid_found / solid (NaN when solid = 0); false-edge rate =
// false_edges / reported (NaN when nothing is reported).
//
// One definition for the distances, following "dashed edges are never
// scored": structural Hamming distance = missed_solid + false_edges (a
// missed dashed edge is no error, a reported dashed edge is not false);
// class_recovered: that distance is 0, i.e. every solid edge of N reported
// and no edge outside N (dashed edges free either way).
//
// Marks: when the learner marks its edges solid/dashed, marks_compared =
// reported edges that are in N, marks_agree = those whose learner mark equals
// their mark in the class; mark_agreement = marks_agree / marks_compared
// (NaN when nothing is compared or the learner has no marks).
#pragma once

#include <array>
#include <limits>
#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"
#include "metrics/truth_class.h"

namespace locind::metrics {

enum class EdgeGroup { kDirected = 0, kLoop = 1, kBidirected = 2 };
inline constexpr int kEdgeGroups = 3;

EdgeGroup GroupOf(const graph::Edge& e);
const char* EdgeGroupName(EdgeGroup group);  // "directed", "loop", "bidirected"

struct EdgeCounts {
  int reported = 0;
  int in_class = 0;
  int false_edges = 0;
  int solid = 0;
  int solid_found = 0;
  int missed_solid = 0;
  int dashed = 0;
  int dashed_found = 0;

  EdgeCounts& operator+=(const EdgeCounts& o);
};

struct ReplicateScore {
  std::array<EdgeCounts, kEdgeGroups> by_group;
  EdgeCounts total;
  double power = 0;            // NaN when total.solid == 0
  double false_edge_rate = 0;  // NaN when total.reported == 0
  int hamming = 0;
  bool class_recovered = false;
  int marks_compared = 0;
  int marks_agree = 0;
  double mark_agreement = std::numeric_limits<double>::quiet_NaN();
};

// One row of the edge audit: an edge reported by the learner or solid in
// the truth, with its status in the class and what the learner did.
struct EdgeAudit {
  graph::Edge edge;
  TruthStatus truth = TruthStatus::kAbsent;
  bool reported = false;
};

// REQUIRES: learned has the observed names of truth_class.projected, in order.
// Without marks (mark counts 0, mark_agreement NaN).
ReplicateScore ScoreGraph(const TruthClass& truth_class, const graph::Dmg& learned);
// With the learner's marks: `learner_dashed` lists the reported edges it
// marked dashed; every other reported edge counts as marked solid.
ReplicateScore ScoreGraph(const TruthClass& truth_class, const graph::Dmg& learned,
                          const std::vector<graph::Edge>& learner_dashed);

// Rows for every edge that is reported or solid in the truth, in ListEdges
// order of the union.
std::vector<EdgeAudit> AuditEdges(const TruthClass& truth_class, const graph::Dmg& learned);

}  // namespace locind::metrics
