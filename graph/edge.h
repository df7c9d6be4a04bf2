// Edge: one directed or bidirected edge of a Dmg, and canonical edge lists.
#pragma once

#include <string>
#include <vector>

#include "graph/dmg.h"

namespace locind::graph {

enum class EdgeKind { kDirected, kBidirected };

// A directed edge from -> to (from == to is a loop) or a bidirected edge
// from <-> to stored with from < to.
struct Edge {
  int from = 0;
  int to = 0;
  EdgeKind kind = EdgeKind::kDirected;

  bool is_loop() const { return kind == EdgeKind::kDirected && from == to; }
  bool operator==(const Edge&) const = default;
  auto operator<=>(const Edge&) const = default;
};

// Every edge of `g`: directed edges ordered by (from, to), then bidirected
// edges ordered by (from, to) with from < to.
std::vector<Edge> ListEdges(const Dmg& g);

bool HasEdge(const Dmg& g, const Edge& e);
void AddEdge(Dmg& g, const Edge& e);
void RemoveEdge(Dmg& g, const Edge& e);

// "a -> b" or "a <-> b" with the node names of `g`.
std::string EdgeText(const Dmg& g, const Edge& e);

}  // namespace locind::graph
