// A definition-level brute force for mu-separation and equivalence classes,
// written independently of graph/ for the tests: plain edge lists, ancestors
// by transitive closure, walk prefixes extended one edge at a time, and
// classes decided by comparing complete lists of separations.
#pragma once

#include <cstdint>
#include <vector>

namespace locind::testing {

struct BruteGraph {
  int n = 0;
  // dir[u][v]: u -> v (u == v a loop); bi[u][v] == bi[v][u]: u <-> v, u != v.
  std::vector<std::vector<bool>> dir, bi;

  explicit BruteGraph(int nodes)
      : n(nodes), dir(nodes, std::vector<bool>(nodes)), bi(nodes, std::vector<bool>(nodes)) {}
  bool operator==(const BruteGraph&) const = default;
};

// ancestor[x][y]: x has a directed path (of length >= 0) to y.
inline std::vector<std::vector<bool>> Closure(const BruteGraph& g) {
  std::vector<std::vector<bool>> r = g.dir;
  for (int v = 0; v < g.n; ++v) r[v][v] = true;
  for (int k = 0; k < g.n; ++k)
    for (int i = 0; i < g.n; ++i)
      for (int j = 0; j < g.n; ++j)
        if (r[i][k] && r[k][j]) r[i][j] = true;
  return r;
}

// Decides mu-connection by the definition. A walk prefix is summarised by
// its last node x and whether its last edge has an arrowhead at x; extending
// it by an edge makes x an inner node, which must then satisfy the collider /
// non-collider condition of the definition.
class BruteSearcher {
 public:
  explicit BruteSearcher(const BruteGraph& g) : n_(g.n), anc_(Closure(g)) {
    // Edges as (x, y, arrowhead at x, arrowhead at y) in both travel directions.
    for (int u = 0; u < g.n; ++u)
      for (int v = 0; v < g.n; ++v) {
        if (g.dir[u][v]) {
          steps_.push_back({u, v, false, true});
          steps_.push_back({v, u, true, false});
        }
        if (g.bi[u][v]) steps_.push_back({u, v, true, true});
      }
  }

  // True when a mu-connecting walk from a to b given C (a bit mask) exists.
  bool Connected(int a, int b, uint32_t c) const { return Reached(a, c)[b]; }

  // reached[b]: a mu-connecting walk from a to b given C exists.
  std::vector<bool> Reached(int a, uint32_t c) const {
    std::vector<bool> reached(n_);
    if ((c >> a) & 1) return reached;
    auto in_c = [&](int v) { return ((c >> v) & 1) != 0; };
    auto in_an_c = [&](int v) {
      for (int w = 0; w < n_; ++w)
        if (in_c(w) && anc_[v][w]) return true;
      return false;
    };
    // seen[x][h]: some walk from a ends at x with (h == 1) an arrowhead at x.
    std::vector<std::vector<bool>> seen(n_, std::vector<bool>(2));
    std::vector<std::pair<int, int>> frontier;
    for (const Step& s : steps_)
      if (s.x == a && !seen[s.y][s.head_y]) {
        seen[s.y][s.head_y] = true;
        frontier.push_back({s.y, s.head_y});
      }
    while (!frontier.empty()) {
      auto [x, h] = frontier.back();
      frontier.pop_back();
      for (const Step& s : steps_) {
        if (s.x != x) continue;
        const bool collider = h && s.head_x;
        if (collider ? !in_an_c(x) : in_c(x)) continue;
        if (!seen[s.y][s.head_y]) {
          seen[s.y][s.head_y] = true;
          frontier.push_back({s.y, s.head_y});
        }
      }
    }
    for (int b = 0; b < n_; ++b) reached[b] = seen[b][1];
    return reached;
  }

 private:
  struct Step { int x, y; bool head_x, head_y; };
  int n_;
  std::vector<std::vector<bool>> anc_;
  std::vector<Step> steps_;
};

inline bool BruteConnected(const BruteGraph& g, int a, int b, uint32_t c) {
  return BruteSearcher(g).Connected(a, b, c);
}

// Every separation: entry ((a * n + b) << n) | C is true when b is separated
// from a given C (entries with a in C are left false).
inline std::vector<bool> SeparationList(const BruteGraph& g) {
  std::vector<bool> out(static_cast<size_t>(g.n) * g.n << g.n);
  const BruteSearcher searcher(g);
  for (int a = 0; a < g.n; ++a)
    for (uint32_t c = 0; c < (1u << g.n); ++c) {
      if ((c >> a) & 1) continue;
      const std::vector<bool> reached = searcher.Reached(a, c);
      for (int b = 0; b < g.n; ++b)
        out[(static_cast<size_t>(a * g.n + b) << g.n) | c] = !reached[b];
    }
  return out;
}

// All possible edges: n^2 directed (loops included), then n(n-1)/2 bidirected.
struct BruteEdge { int u, v; bool bidirected; };
inline std::vector<BruteEdge> AllEdges(int n) {
  std::vector<BruteEdge> out;
  for (int u = 0; u < n; ++u)
    for (int v = 0; v < n; ++v) out.push_back({u, v, false});
  for (int u = 0; u < n; ++u)
    for (int v = u + 1; v < n; ++v) out.push_back({u, v, true});
  return out;
}

inline bool HasEdge(const BruteGraph& g, const BruteEdge& e) {
  return e.bidirected ? g.bi[e.u][e.v] : g.dir[e.u][e.v];
}

inline void SetEdge(BruteGraph& g, const BruteEdge& e, bool on) {
  if (e.bidirected) {
    g.bi[e.u][e.v] = g.bi[e.v][e.u] = on;
  } else {
    g.dir[e.u][e.v] = on;
  }
}

// The graph whose edges are the set bits of `code` in AllEdges order.
inline BruteGraph FromCode(int n, uint64_t code) {
  BruteGraph g(n);
  const auto edges = AllEdges(n);
  for (size_t i = 0; i < edges.size(); ++i) SetEdge(g, edges[i], (code >> i) & 1);
  return g;
}

inline uint64_t ToCode(const BruteGraph& g) {
  const auto edges = AllEdges(g.n);
  uint64_t code = 0;
  for (size_t i = 0; i < edges.size(); ++i)
    if (HasEdge(g, edges[i])) code |= uint64_t{1} << i;
  return code;
}

// The maximal graph by docs/theory.md F2: add every absent edge whose addition
// keeps the complete list of separations.
inline BruteGraph BruteMaximal(const BruteGraph& g) {
  const auto base = SeparationList(g);
  BruteGraph out = g;
  for (const BruteEdge& e : AllEdges(g.n)) {
    if (HasEdge(g, e)) continue;
    BruteGraph trial = g;
    SetEdge(trial, e, true);
    if (SeparationList(trial) == base) SetEdge(out, e, true);
  }
  return out;
}

// Dashed edges of the maximal graph by docs/theory.md F4, in AllEdges order.
inline std::vector<bool> BruteDashed(const BruteGraph& maximal) {
  const auto base = SeparationList(maximal);
  std::vector<bool> out;
  for (const BruteEdge& e : AllEdges(maximal.n)) {
    if (!HasEdge(maximal, e)) continue;
    BruteGraph trial = maximal;
    SetEdge(trial, e, false);
    out.push_back(SeparationList(trial) == base);
  }
  return out;
}

}  // namespace locind::testing
