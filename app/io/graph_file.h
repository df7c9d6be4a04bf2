// The graph file: a YAML mapping with the keys
//
//   nodes: [a, b, c, h]                              # distinct names
//   edges: [a -> b, b -> b, h -> a, h -> c, b <-> c]  # "x -> y" or "x <-> y"
//   hidden: [h]                                      # optional
//   dashed: [b <-> c]                                # optional: edges marked dashed
//
// Names start with a letter or '_' and continue with letters, digits, '_' or
// '.'. Loops are written "b -> b"; bidirected loops are refused.
//
// Every graph file the tool writes reads back here: the graph YAML above
// (`graph project`, `graph class` and `learn` text, whose `dashed` list and
// '#' lines are read or skipped), and the JSON shape of app/io/graph_json.h
// (`graph project|class --json`, `learn --json` and its graph.json; JSON is
// read as YAML), where an edge is a mapping {from, to, kind, mark} and a
// `decisions` key is ignored. An edge may be written either way in either
// file. Readers report every problem they find (up to kMaxErrors), in file
// order.
#pragma once

#include <string>
#include <variant>
#include <vector>

#include <yaml-cpp/yaml.h>

#include "app/io/error.h"
#include "graph/edge.h"
#include "graph/truth_graph.h"

namespace locind::app {

using GraphOrError = std::variant<graph::TruthGraph, Error>;

// A graph file with its marks: `dashed` lists the edges marked dashed (a
// `dashed` key or "mark": "dashed"); `has_marks` is true when the file has a
// `dashed` key or some edge marked "dashed" (the JSON writer marks every edge
// "solid" where no class was computed, so all-solid JSON reads as unmarked).
struct GraphFile {
  graph::TruthGraph truth;
  std::vector<graph::Edge> dashed;
  bool has_marks = false;
};
using GraphFileOrErrors = std::variant<GraphFile, Errors>;

// Reads any graph file the tool writes (YAML or JSON), every problem found.
GraphFileOrErrors ReadAnyGraphFile(const std::string& path);
GraphFileOrErrors ParseAnyGraphText(const std::string& text, const std::string& file);

// Reads and validates a graph file; the first problem only (kept for callers
// that report one error per input).
GraphOrError ReadGraphFile(const std::string& path);

// Parses graph text; `file` names the source in errors.
GraphOrError ParseGraphText(const std::string& text, const std::string& file);

// Reads the nodes/edges/hidden keys of a mapping that may hold other keys
// (model and study files embed a graph this way); the first problem only.
GraphOrError ParseGraphKeys(const YAML::Node& map, const std::string& file);

// The graph in the file format (hidden nodes listed when present).
std::string FormatGraph(const graph::TruthGraph& truth);

// True for names the file format accepts.
bool IsValidNodeName(const std::string& name);

// The location of a YAML node as an Error (line and column 1-based).
Error ErrorAt(const std::string& file, const YAML::Node& node, const std::string& field,
                   const std::string& message);

}  // namespace locind::app
