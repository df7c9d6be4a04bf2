#include "graph/dot_format.h"

#include <algorithm>
#include <sstream>

namespace locind::graph {
namespace {

constexpr const char* kDirectedColour = "#333333";
constexpr const char* kBidirectedColour = "#0072B2";

bool Listed(const std::vector<Edge>& edges, const Edge& e) {
  return std::find(edges.begin(), edges.end(), e) != edges.end();
}

void WriteEdge(std::ostream& out, const Dmg& g, const Edge& e, const DotOptions& o,
               const char* style) {
  const bool bidirected = e.kind == EdgeKind::kBidirected;
  auto colour = o.color.find(e);
  out << "  " << DotQuote(g.name(e.from)) << " -> " << DotQuote(g.name(e.to)) << " [color=\""
      << (colour != o.color.end() ? colour->second
                                  : (bidirected ? kBidirectedColour : kDirectedColour))
      << "\"";
  if (bidirected) out << ", dir=both, arrowtail=normal";
  if (style != nullptr) out << ", style=" << style;
  if (Listed(o.bold, e)) out << ", penwidth=2.5";
  out << "];\n";
}

}  // namespace

std::string DotQuote(const std::string& s) {
  std::string out = "\"";
  for (char ch : s) {
    if (ch == '"' || ch == '\\') out += '\\';
    out += ch;
  }
  return out + "\"";
}

std::string ToDot(const Dmg& g, const DotOptions& o) {
  std::ostringstream out;
  out << "digraph locind {\n  rankdir=LR;\n  node [fontname=\"Helvetica\"];\n";
  if (!o.title.empty()) out << "  label=" << DotQuote(o.title) << "; labelloc=t;\n";
  for (int v = 0; v < g.size(); ++v) {
    const bool hidden = std::find(o.hidden.begin(), o.hidden.end(), v) != o.hidden.end();
    out << "  " << DotQuote(g.name(v));
    if (hidden) out << " [shape=box, style=\"dashed,filled\", fillcolor=\"#e6e6e6\"]";
    out << ";\n";
  }
  for (const Edge& e : ListEdges(g)) {
    WriteEdge(out, g, e, o, Listed(o.dashed, e) ? "dashed" : nullptr);
  }
  for (const Edge& e : o.extra) WriteEdge(out, g, e, o, "dotted");
  out << "}\n";
  return out.str();
}

}  // namespace locind::graph
