// The graph file: a YAML mapping with the keys
//
//   nodes: [a, b, c, h]                              # distinct names
//   edges: [a -> b, b -> b, h -> a, h -> c, b <-> c]  # "x -> y" or "x <-> y"
//   hidden: [h]                                      # optional
//
// Names start with a letter or '_' and continue with letters, digits, '_' or
// '.'. Loops are written "b -> b"; bidirected loops are refused.
#pragma once

#include <string>
#include <variant>

#include <yaml-cpp/yaml.h>

#include "app/io/error.h"
#include "graph/truth_graph.h"

namespace locind::app {

using GraphOrError = std::variant<graph::TruthGraph, Error>;

// Reads and validates a graph file.
GraphOrError ReadGraphFile(const std::string& path);

// Parses graph text; `file` names the source in errors.
GraphOrError ParseGraphText(const std::string& text, const std::string& file);

// Reads the nodes/edges/hidden keys of a mapping that may hold other keys
// (model and study files embed a graph this way).
GraphOrError ParseGraphKeys(const YAML::Node& map, const std::string& file);

// The graph in the file format (hidden nodes listed when present).
std::string FormatGraph(const graph::TruthGraph& truth);

// True for names the file format accepts.
bool IsValidNodeName(const std::string& name);

// The location of a YAML node as an Error (line and column 1-based).
Error ErrorAt(const std::string& file, const YAML::Node& node, const std::string& field,
                   const std::string& message);

}  // namespace locind::app
