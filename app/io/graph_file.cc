#include "app/io/graph_file.h"

#include <algorithm>
#include <cctype>
#include <fstream>
#include <set>
#include <sstream>

#include "graph/edge.h"

namespace locind::app {
namespace {

using graph::Dmg;
using graph::TruthGraph;

std::string Trim(const std::string& s) {
  const size_t begin = s.find_first_not_of(" \t");
  if (begin == std::string::npos) return "";
  return s.substr(begin, s.find_last_not_of(" \t") - begin + 1);
}

struct ParsedEdge {
  std::string from, to;
  bool bidirected = false;
};

// "a -> b" or "a <-> b"; empty optional-like result signalled by `ok`.
bool SplitEdge(const std::string& text, ParsedEdge& out) {
  size_t pos = text.find("<->");
  size_t len = 3;
  out.bidirected = true;
  if (pos == std::string::npos) {
    pos = text.find("->");
    len = 2;
    out.bidirected = false;
  }
  if (pos == std::string::npos) return false;
  out.from = Trim(text.substr(0, pos));
  out.to = Trim(text.substr(pos + len));
  return IsValidNodeName(out.from) && IsValidNodeName(out.to);
}

std::variant<std::vector<std::string>, Error> ReadNameList(const YAML::Node& list,
                                                                const std::string& file,
                                                                const std::string& field) {
  if (!list.IsSequence()) return ErrorAt(file, list, field, "expected a list of node names");
  std::vector<std::string> names;
  for (const YAML::Node& item : list) {
    if (!item.IsScalar() || !IsValidNodeName(item.Scalar())) {
      return ErrorAt(file, item, field,
                     "expected a node name (a letter or '_', then letters, digits, '_' or '.')");
    }
    names.push_back(item.Scalar());
  }
  return names;
}

std::variant<Dmg, Error> ReadNodesAndEdges(const YAML::Node& map, const std::string& file) {
  if (!map["nodes"]) return ErrorAt(file, map, "nodes", "missing the list of nodes");
  auto names = ReadNameList(map["nodes"], file, "nodes");
  if (auto* e = std::get_if<Error>(&names)) return *e;
  std::set<std::string> seen;
  const auto& list = std::get<std::vector<std::string>>(names);
  for (size_t i = 0; i < list.size(); ++i) {
    if (!seen.insert(list[i]).second) {
      return ErrorAt(file, map["nodes"][i], "nodes", "duplicate node '" + list[i] + "'");
    }
  }
  if (list.empty()) return ErrorAt(file, map["nodes"], "nodes", "a graph needs at least one node");
  Dmg g(list);
  const YAML::Node edges = map["edges"];
  if (!edges) return g;
  if (!edges.IsSequence()) return ErrorAt(file, edges, "edges", "expected a list of edges");
  for (const YAML::Node& item : edges) {
    ParsedEdge parsed;
    if (!item.IsScalar() || !SplitEdge(item.Scalar(), parsed)) {
      return ErrorAt(file, item, "edges", "expected an edge 'a -> b' or 'a <-> b'");
    }
    const auto from = g.index(parsed.from);
    const auto to = g.index(parsed.to);
    if (!from) return ErrorAt(file, item, "edges", "unknown node '" + parsed.from + "'");
    if (!to) return ErrorAt(file, item, "edges", "unknown node '" + parsed.to + "'");
    if (parsed.bidirected && *from == *to) {
      return ErrorAt(file, item, "edges", "a bidirected edge needs two distinct nodes");
    }
    if (parsed.bidirected) {
      g.AddBidirected(*from, *to);
    } else {
      g.AddDirected(*from, *to);
    }
  }
  return g;
}

}  // namespace

bool IsValidNodeName(const std::string& name) {
  if (name.empty()) return false;
  const char first = name[0];
  if (!(std::isalpha(static_cast<unsigned char>(first)) || first == '_')) return false;
  for (char ch : name) {
    if (!(std::isalnum(static_cast<unsigned char>(ch)) || ch == '_' || ch == '.')) return false;
  }
  return true;
}

Error ErrorAt(const std::string& file, const YAML::Node& node, const std::string& field,
                   const std::string& message) {
  const YAML::Mark mark = node.Mark();
  const bool known = mark.line >= 0 && !mark.is_null();
  return Error{file, known ? mark.line + 1 : 0, known ? mark.column + 1 : 0, field, message};
}

GraphOrError ParseGraphKeys(const YAML::Node& map, const std::string& file) {
  auto parsed = ReadNodesAndEdges(map, file);
  if (auto* e = std::get_if<Error>(&parsed)) return *e;
  TruthGraph truth{std::get<Dmg>(std::move(parsed)), {}};
  if (const YAML::Node hidden = map["hidden"]) {
    auto names = ReadNameList(hidden, file, "hidden");
    if (auto* e = std::get_if<Error>(&names)) return *e;
    const auto& list = std::get<std::vector<std::string>>(names);
    for (size_t i = 0; i < list.size(); ++i) {
      const auto v = truth.graph.index(list[i]);
      if (!v) return ErrorAt(file, hidden[i], "hidden", "unknown node '" + list[i] + "'");
      if (truth.IsHidden(*v)) {
        return ErrorAt(file, hidden[i], "hidden", "node '" + list[i] + "' listed twice");
      }
      truth.hidden.insert(std::upper_bound(truth.hidden.begin(), truth.hidden.end(), *v), *v);
    }
    if (truth.hidden.size() == static_cast<size_t>(truth.graph.size())) {
      return ErrorAt(file, hidden, "hidden", "at least one node must be observed");
    }
  }
  return truth;
}

GraphOrError ParseGraphText(const std::string& text, const std::string& file) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    return Error{file, e.mark.line + 1, e.mark.column + 1, "", "not valid YAML: " + e.msg};
  }
  if (!root.IsMap()) return Error{file, 1, 1, "", "expected a mapping with nodes and edges"};
  std::set<std::string> seen;
  for (const auto& kv : root) {
    const std::string key = kv.first.Scalar();
    if (key != "nodes" && key != "edges" && key != "hidden") {
      return ErrorAt(file, kv.first, key, "unknown key (expected nodes, edges or hidden)");
    }
    if (!seen.insert(key).second) return ErrorAt(file, kv.first, key, "given twice");
  }
  return ParseGraphKeys(root, file);
}

GraphOrError ReadGraphFile(const std::string& path) {
  std::ifstream in(path);
  if (!in) return Error{path, 0, 0, "", "cannot open the file"};
  std::ostringstream text;
  text << in.rdbuf();
  if (text.str().find_first_not_of(" \t\r\n") == std::string::npos) {
    return Error{path, 1, 1, "", "the file is empty"};
  }
  return ParseGraphText(text.str(), path);
}

std::string FormatGraph(const TruthGraph& truth) {
  const Dmg& g = truth.graph;
  std::string out = "nodes: [";
  for (int v = 0; v < g.size(); ++v) out += (v ? ", " : "") + g.name(v);
  out += "]\nedges: [";
  bool first = true;
  for (const graph::Edge& e : graph::ListEdges(g)) {
    out += (first ? "" : ", ") + graph::EdgeText(g, e);
    first = false;
  }
  out += "]\n";
  if (!truth.hidden.empty()) {
    out += "hidden: [";
    for (size_t i = 0; i < truth.hidden.size(); ++i) {
      out += (i ? ", " : "") + g.name(truth.hidden[i]);
    }
    out += "]\n";
  }
  return out;
}

}  // namespace locind::app
