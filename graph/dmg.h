// Dmg: a directed mixed graph with named nodes.
//
// Directed edges a -> b (loops a -> a allowed) and bidirected edges a <-> b
// between distinct nodes. Adjacency is stored as dense bit rows, so a graph of
// any size can be held (simulation truths may be large); the exact
// equivalence-class algorithms work on the compact form in bit_graph.h, which
// is limited to 64 nodes.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace locind::graph {

class Dmg {
 public:
  Dmg() = default;
  // REQUIRES: names are distinct and non-empty.
  explicit Dmg(std::vector<std::string> names);

  int size() const { return static_cast<int>(names_.size()); }
  const std::string& name(int v) const { return names_[v]; }
  const std::vector<std::string>& names() const { return names_; }
  // Index of the node called `name`, or nullopt.
  std::optional<int> index(std::string_view name) const;

  void AddDirected(int from, int to);
  void RemoveDirected(int from, int to);
  bool HasDirected(int from, int to) const { return Bit(directed_in_, to, from); }
  // REQUIRES: a != b.
  void AddBidirected(int a, int b);
  void RemoveBidirected(int a, int b);
  bool HasBidirected(int a, int b) const { return Bit(bidirected_, a, b); }

  std::vector<int> Parents(int v) const { return Row(directed_in_, v); }
  std::vector<int> Children(int v) const;
  std::vector<int> Siblings(int v) const { return Row(bidirected_, v); }

  int DirectedEdgeCount() const;
  int BidirectedEdgeCount() const;  // each a <-> b once

  // The subgraph induced by `keep` (in the given order).
  Dmg Induced(const std::vector<int>& keep) const;

  bool operator==(const Dmg& other) const;

 private:
  bool Bit(const std::vector<uint64_t>& rows, int row, int col) const;
  void Set(std::vector<uint64_t>& rows, int row, int col, bool on);
  std::vector<int> Row(const std::vector<uint64_t>& rows, int row) const;

  std::vector<std::string> names_;
  int words_ = 0;                       // 64-bit words per row
  std::vector<uint64_t> directed_in_;   // row v: parents of v
  std::vector<uint64_t> bidirected_;    // row v: siblings of v (symmetric)
};

}  // namespace locind::graph
