#include "app/io/graph_json.h"

#include <algorithm>
#include <cstdio>

namespace locind::app {

std::string JsonString(const std::string& s) {
  std::string out = "\"";
  for (unsigned char ch : s) {
    switch (ch) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\n': out += "\\n"; break;
      case '\t': out += "\\t"; break;
      case '\r': out += "\\r"; break;
      default:
        if (ch < 0x20) {
          char buf[8];
          std::snprintf(buf, sizeof buf, "\\u%04x", ch);
          out += buf;
        } else {
          out += static_cast<char>(ch);
        }
    }
  }
  return out + "\"";
}

std::string GraphJson(const graph::Dmg& g, const std::vector<graph::Edge>& dashed) {
  std::string out = "{\"nodes\": [";
  for (int v = 0; v < g.size(); ++v) out += (v ? ", " : "") + JsonString(g.name(v));
  out += "], \"edges\": [";
  bool first = true;
  for (const graph::Edge& e : graph::ListEdges(g)) {
    const bool is_dashed = std::find(dashed.begin(), dashed.end(), e) != dashed.end();
    out += first ? "" : ", ";
    first = false;
    out += "{\"from\": " + JsonString(g.name(e.from)) + ", \"to\": " + JsonString(g.name(e.to)) +
           ", \"kind\": \"" + (e.kind == graph::EdgeKind::kDirected ? "directed" : "bidirected") +
           "\", \"mark\": \"" + (is_dashed ? "dashed" : "solid") + "\"}";
  }
  return out + "]}";
}

}  // namespace locind::app
