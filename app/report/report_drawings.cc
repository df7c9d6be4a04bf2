#include "app/report/report_drawings.h"

#include <optional>

#include "graph/dot_format.h"
#include "graph/edge.h"

namespace locind::app {
namespace {

constexpr char kFalseColour[] = "#D55E00";
constexpr char kMissedColour[] = "#E69F00";

// "a -> b" or "a <-> b" over the names of `g` (as graph::EdgeText writes them).
std::optional<graph::Edge> ParseEdgeText(const graph::Dmg& g, const std::string& text) {
  for (const auto& [arrow, kind] : {std::pair{" <-> ", graph::EdgeKind::kBidirected},
                                    std::pair{" -> ", graph::EdgeKind::kDirected}}) {
    const size_t at = text.find(arrow);
    if (at == std::string::npos) continue;
    const std::optional<int> from = g.index(text.substr(0, at));
    const std::optional<int> to = g.index(text.substr(at + std::string(arrow).size()));
    if (!from || !to || (kind == graph::EdgeKind::kBidirected && *from == *to)) return std::nullopt;
    if (kind == graph::EdgeKind::kBidirected && *from > *to) return graph::Edge{*to, *from, kind};
    return graph::Edge{*from, *to, kind};
  }
  return std::nullopt;
}

}  // namespace

std::string LearnedDot(const metrics::TruthClass& truth_class, const std::vector<EdgeLine>& rows,
                       const std::string& title) {
  graph::Dmg learned(truth_class.projected.names());
  graph::DotOptions style;
  style.title = title;
  for (const EdgeLine& row : rows) {
    const std::optional<graph::Edge> e = ParseEdgeText(learned, row.edge);
    if (!e) continue;
    if (row.reported) {
      graph::AddEdge(learned, *e);
      if (row.learner_mark == "dashed") style.dashed.push_back(*e);
      if (row.truth_status == "absent") {
        style.color[*e] = kFalseColour;
        style.bold.push_back(*e);
      }
    } else if (row.truth_status == "solid") {
      style.extra.push_back(*e);
      style.color[*e] = kMissedColour;
      style.bold.push_back(*e);
    }
  }
  return graph::ToDot(learned, style);
}

}  // namespace locind::app
