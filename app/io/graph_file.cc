#include "app/io/graph_file.h"

#include <algorithm>
#include <cctype>
#include <fstream>
#include <optional>
#include <set>
#include <sstream>

namespace locind::app {
namespace {

using graph::Dmg;
using graph::Edge;
using graph::EdgeKind;
using graph::TruthGraph;

std::string Trim(const std::string& s) {
  const size_t begin = s.find_first_not_of(" \t");
  if (begin == std::string::npos) return "";
  return s.substr(begin, s.find_last_not_of(" \t") - begin + 1);
}

struct ParsedEdge {
  std::string from, to;
  bool bidirected = false;
  std::optional<bool> dashed;  // the edge's "mark", when given
};

// "a -> b" or "a <-> b"; false when the text is neither.
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

std::string ScalarOr(const YAML::Node& node, const std::string& fallback) {
  return node && node.IsScalar() ? node.Scalar() : fallback;
}

// Reads the graph keys of one mapping and keeps every problem (in file
// order, at most kMaxErrors): a bad entry is skipped and reading goes on.
class GraphReader {
 public:
  explicit GraphReader(const std::string& file) : file_(file) {}

  // Returns false when a problem was found (see errors()).
  bool Read(const YAML::Node& map, bool marks) {
    ReadNodes(map);
    if (names_.empty()) return false;
    result_.truth.graph = Dmg(names_);
    ReadEdges(map["edges"], marks);
    if (map["hidden"]) ReadHidden(map["hidden"]);
    if (marks && map["dashed"]) ReadDashedList(map["dashed"]);
    return errors_.empty();
  }

  GraphFile& result() { return result_; }
  Errors& errors() { return errors_; }

 private:
  void Fail(const YAML::Node& node, const std::string& field, const std::string& message) {
    if (!stopped_) stopped_ = AddError(errors_, ErrorAt(file_, node, field, message));
  }

  void ReadNodes(const YAML::Node& map) {
    const YAML::Node list = map["nodes"];
    if (!list) return Fail(map, "nodes", "missing the list of nodes");
    if (!list.IsSequence()) return Fail(list, "nodes", "expected a list of node names");
    if (list.size() == 0) return Fail(list, "nodes", "a graph needs at least one node");
    std::set<std::string> seen;
    bool bad = false;
    for (const YAML::Node& item : list) {
      if (!item.IsScalar() || !IsValidNodeName(item.Scalar())) {
        Fail(item, "nodes",
             "expected a node name (a letter or '_', then letters, digits, '_' or '.')");
        bad = true;
      } else if (!seen.insert(item.Scalar()).second) {
        Fail(item, "nodes", "duplicate node '" + item.Scalar() + "'");
        bad = true;
      } else {
        names_.push_back(item.Scalar());
      }
    }
    if (bad) names_.clear();  // edges cannot be checked against a broken list
  }

  // One edge entry: "a -> b" text or a mapping {from, to, kind, mark}.
  bool ParseEntry(const YAML::Node& item, bool marks, ParsedEdge& parsed) {
    if (item.IsScalar()) {
      if (SplitEdge(item.Scalar(), parsed)) return true;
      Fail(item, "edges", "expected an edge 'a -> b' or 'a <-> b'");
      return false;
    }
    if (!item.IsMap()) {
      Fail(item, "edges", "expected an edge 'a -> b', 'a <-> b' or {from, to, kind, mark}");
      return false;
    }
    bool ok = true;
    for (const auto& kv : item) {
      const std::string key = ScalarOr(kv.first, "");
      if (key != "from" && key != "to" && key != "kind" && !(marks && key == "mark")) {
        Fail(kv.first, "edges." + key,
             marks ? "unknown key (expected from, to, kind or mark)"
                   : "unknown key (expected from, to or kind)");
        ok = false;
      }
    }
    parsed.from = ScalarOr(item["from"], "");
    parsed.to = ScalarOr(item["to"], "");
    if (!IsValidNodeName(parsed.from) || !IsValidNodeName(parsed.to)) {
      Fail(item, "edges", "an edge needs node names 'from' and 'to'");
      ok = false;
    }
    const std::string kind = ScalarOr(item["kind"], "directed");
    if (kind != "directed" && kind != "bidirected") {
      Fail(item["kind"], "edges.kind", "expected directed or bidirected");
      ok = false;
    }
    parsed.bidirected = kind == "bidirected";
    if (item["mark"] && marks) {
      const std::string mark = ScalarOr(item["mark"], "");
      if (mark != "solid" && mark != "dashed") {
        Fail(item["mark"], "edges.mark", "expected solid or dashed");
        ok = false;
      }
      parsed.dashed = mark == "dashed";
    }
    return ok;
  }

  // The edge named by `parsed` in the graph read so far, or nothing (with
  // the problem recorded).
  std::optional<Edge> Resolve(const YAML::Node& item, const ParsedEdge& parsed,
                              const std::string& field) {
    const Dmg& g = result_.truth.graph;
    const auto from = g.index(parsed.from);
    const auto to = g.index(parsed.to);
    if (!from) Fail(item, field, "unknown node '" + parsed.from + "'");
    if (!to) Fail(item, field, "unknown node '" + parsed.to + "'");
    if (!from || !to) return std::nullopt;
    if (parsed.bidirected && *from == *to) {
      Fail(item, field, "a bidirected edge needs two distinct nodes");
      return std::nullopt;
    }
    if (!parsed.bidirected) return Edge{*from, *to, EdgeKind::kDirected};
    return Edge{std::min(*from, *to), std::max(*from, *to), EdgeKind::kBidirected};
  }

  void ReadEdges(const YAML::Node& edges, bool marks) {
    if (!edges) return;
    if (!edges.IsSequence()) return Fail(edges, "edges", "expected a list of edges");
    for (const YAML::Node& item : edges) {
      ParsedEdge parsed;
      if (!ParseEntry(item, marks, parsed)) continue;
      const std::optional<Edge> e = Resolve(item, parsed, "edges");
      if (!e) continue;
      graph::AddEdge(result_.truth.graph, *e);
      // Only a "dashed" mark says the file has marks: the JSON writer marks
      // every edge "solid" where no class was computed.
      if (!parsed.dashed || !*parsed.dashed) continue;
      result_.has_marks = true;
      result_.dashed.push_back(*e);
    }
  }

  void ReadHidden(const YAML::Node& hidden) {
    if (!hidden.IsSequence()) return Fail(hidden, "hidden", "expected a list of node names");
    TruthGraph& truth = result_.truth;
    for (const YAML::Node& item : hidden) {
      const std::string name = ScalarOr(item, "");
      const auto v = truth.graph.index(name);
      if (!v) {
        Fail(item, "hidden", "unknown node '" + name + "'");
      } else if (truth.IsHidden(*v)) {
        Fail(item, "hidden", "node '" + name + "' listed twice");
      } else {
        truth.hidden.insert(std::upper_bound(truth.hidden.begin(), truth.hidden.end(), *v), *v);
      }
    }
    if (truth.hidden.size() == static_cast<size_t>(truth.graph.size())) {
      Fail(hidden, "hidden", "at least one node must be observed");
    }
  }

  void ReadDashedList(const YAML::Node& dashed) {
    result_.has_marks = true;
    if (!dashed.IsSequence()) return Fail(dashed, "dashed", "expected a list of edges");
    for (const YAML::Node& item : dashed) {
      ParsedEdge parsed;
      if (!item.IsScalar() || !SplitEdge(item.Scalar(), parsed)) {
        Fail(item, "dashed", "expected an edge 'a -> b' or 'a <-> b'");
        continue;
      }
      const std::optional<Edge> e = Resolve(item, parsed, "dashed");
      if (!e) continue;
      if (!graph::HasEdge(result_.truth.graph, *e)) {
        Fail(item, "dashed", "'" + item.Scalar() + "' is not an edge of the graph");
      } else if (std::find(result_.dashed.begin(), result_.dashed.end(), *e) ==
                 result_.dashed.end()) {
        result_.dashed.push_back(*e);
      }
    }
  }

  std::string file_;
  std::vector<std::string> names_;
  GraphFile result_;
  Errors errors_;
  bool stopped_ = false;
};

GraphOrError FirstOf(GraphFileOrErrors read) {
  if (auto* errors = std::get_if<Errors>(&read)) return errors->front();
  return std::get<GraphFile>(std::move(read)).truth;
}

// The text of a file, or the problem opening it.
std::variant<std::string, Error> ReadText(const std::string& path) {
  std::ifstream in(path);
  if (!in) return Error{path, 0, 0, "", "cannot open the file"};
  std::ostringstream text;
  text << in.rdbuf();
  if (text.str().find_first_not_of(" \t\r\n") == std::string::npos) {
    return Error{path, 1, 1, "", "the file is empty"};
  }
  return text.str();
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
  GraphReader reader(file);
  if (!reader.Read(map, /*marks=*/false)) return reader.errors().front();
  return std::move(reader.result().truth);
}

GraphFileOrErrors ParseAnyGraphText(const std::string& text, const std::string& file) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    return Errors{Error{file, e.mark.line + 1, e.mark.column + 1, "", "not valid YAML: " + e.msg}};
  }
  if (!root.IsMap()) return Errors{Error{file, 1, 1, "", "expected a mapping with nodes and edges"}};
  Errors errors;
  std::set<std::string> seen;
  for (const auto& kv : root) {
    const std::string key = ScalarOr(kv.first, "");
    if (key != "nodes" && key != "edges" && key != "hidden" && key != "dashed" &&
        key != "decisions") {
      AddError(errors, ErrorAt(file, kv.first, key,
                               "unknown key (expected nodes, edges, hidden or dashed)"));
    } else if (!seen.insert(key).second) {
      AddError(errors, ErrorAt(file, kv.first, key, "given twice"));
    }
  }
  if (!errors.empty()) return errors;
  GraphReader reader(file);
  if (!reader.Read(root, /*marks=*/true)) return std::move(reader.errors());
  return std::move(reader.result());
}

GraphFileOrErrors ReadAnyGraphFile(const std::string& path) {
  auto text = ReadText(path);
  if (auto* e = std::get_if<Error>(&text)) return Errors{*e};
  return ParseAnyGraphText(std::get<std::string>(text), path);
}

GraphOrError ParseGraphText(const std::string& text, const std::string& file) {
  return FirstOf(ParseAnyGraphText(text, file));
}

GraphOrError ReadGraphFile(const std::string& path) {
  return FirstOf(ReadAnyGraphFile(path));
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
