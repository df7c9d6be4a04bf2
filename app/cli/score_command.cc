// locind score: one learned graph against the class of a truth.
//
//   score GRAPH --truth TRUTH.yaml [--json]
//
// GRAPH is any graph file the tool writes or a hand-written one (graph
// YAML, `graph class` text with its dashed list, `graph project|class
// --json`, `learn --json` or its graph.json; app/io/graph_file.h). TRUTH is a
// graph file whose hidden nodes are listed. The learned graph must name the
// truth's observed nodes (in any order); when it lists hidden nodes of its
// own it is scored by its latent projection (and its marks are dropped).
// The score is metrics::ScoreGraph against metrics::ComputeTruthClass: per
// edge group (directed, loop, bidirected) the reported, in-class and false
// edges, solid edges found (power), dashed edges of the class found, the
// structural Hamming distance (missed solid + false edges), whether the
// class was recovered, and, when the file marks its edges, how many marks
// agree with the class. Then one line per edge reported or in the class.
#include <boost/program_options.hpp>
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/io/error.h"
#include "app/io/graph_file.h"
#include "app/io/graph_json.h"
#include "base/number_format.h"
#include "graph/latent_projection.h"
#include "metrics/replicate_score.h"
#include "metrics/truth_class.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;
using graph::Dmg;
using graph::Edge;

const char kUsage[] =
    "usage: locind score GRAPH --truth TRUTH.yaml [--json]\n"
    "  GRAPH           a learned graph: graph YAML (with an optional dashed list) or the JSON\n"
    "                  of graph project|class --json and learn --json, or written by hand\n"
    "  --truth FILE    the truth graph, hidden nodes listed under hidden\n"
    "  --json          print the score as JSON\n";

struct Learned {
  Dmg graph;                  // over the truth's observed names, in their order
  std::vector<Edge> dashed;   // the file's dashed marks, mapped
  bool has_marks = false;
};

GraphFile ReadOrThrow(const std::string& path) {
  GraphFileOrErrors read = ReadAnyGraphFile(path);
  if (auto* errors = std::get_if<Errors>(&read)) throw *errors;
  return std::get<GraphFile>(std::move(read));
}

// The learned graph over `names` (the truth's observed nodes): every missing
// and every extra node is reported.
Learned Align(GraphFile file, const std::vector<std::string>& names, const std::string& path) {
  Dmg own = file.truth.graph;
  if (!file.truth.hidden.empty()) {
    Result<Dmg> projected = graph::LatentProjection(own, file.truth.hidden);
    if (!projected.ok()) throw Error{path, 0, 0, "", projected.status().message()};
    own = std::move(*projected);
    file.dashed.clear();
    file.has_marks = false;
  }
  Errors errors;
  std::vector<int> order;
  for (const std::string& name : names) {
    auto v = own.index(name);
    if (!v) AddError(errors, Error{path, 0, 0, "nodes", "observed node '" + name + "' of the truth is missing"});
    order.push_back(v.value_or(0));
  }
  for (const std::string& name : own.names()) {
    if (std::find(names.begin(), names.end(), name) == names.end()) {
      AddError(errors, Error{path, 0, 0, "nodes", "node '" + name + "' is not an observed node of the truth"});
    }
  }
  if (!errors.empty()) throw errors;
  Learned out{own.Induced(order), {}, file.has_marks};
  // Induced(order) renumbers: old index order[i] becomes i.
  std::vector<int> new_index(own.size());
  for (size_t i = 0; i < order.size(); ++i) new_index[order[i]] = static_cast<int>(i);
  for (const Edge& e : file.dashed) {
    Edge mapped{new_index[e.from], new_index[e.to], e.kind};
    if (mapped.kind == graph::EdgeKind::kBidirected && mapped.from > mapped.to) {
      std::swap(mapped.from, mapped.to);
    }
    out.dashed.push_back(mapped);
  }
  return out;
}

std::string Number(double x) { return std::isnan(x) ? "NaN" : base::FormatNumber(x); }
std::string JsonNumber(double x) { return std::isnan(x) ? "null" : base::FormatNumber(x); }

double Ratio(int num, int den) {
  return den == 0 ? std::nan("") : static_cast<double>(num) / den;
}

bool IsDashed(const Learned& g, const Edge& e) {
  return std::find(g.dashed.begin(), g.dashed.end(), e) != g.dashed.end();
}

void PrintText(const metrics::TruthClass& tc, const Learned& g, const metrics::ReplicateScore& s,
               std::ostream& out) {
  out << "group        reported  in_class  false_edges  solid  solid_found  power  dashed  dashed_found\n";
  auto row = [&](const std::string& name, const metrics::EdgeCounts& c) {
    char line[160];
    std::snprintf(line, sizeof line, "%-12s %8d  %8d  %11d  %5d  %11d  %5s  %6d  %12d\n",
                  name.c_str(), c.reported, c.in_class, c.false_edges, c.solid, c.solid_found,
                  Number(Ratio(c.solid_found, c.solid)).c_str(), c.dashed, c.dashed_found);
    out << line;
  };
  for (int k = 0; k < metrics::kEdgeGroups; ++k) {
    row(metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(k)), s.by_group[k]);
  }
  row("total", s.total);
  out << "power " << Number(s.power) << ", false-edge rate " << Number(s.false_edge_rate)
      << ", hamming " << s.hamming << " (missed solid " << s.total.missed_solid
      << " + false edges " << s.total.false_edges << "), class recovered "
      << (s.class_recovered ? "yes" : "no") << "\n";
  if (g.has_marks) {
    out << "marks: " << s.marks_agree << " of " << s.marks_compared << " agree with the class ("
        << Number(s.mark_agreement) << ")\n";
  } else {
    out << "marks: none in the file\n";
  }
  for (const metrics::EdgeAudit& a : metrics::AuditEdges(tc, g.graph)) {
    const bool false_edge = a.reported && a.truth == metrics::TruthStatus::kAbsent;
    const bool missed = !a.reported && a.truth == metrics::TruthStatus::kSolid;
    out << "  " << graph::EdgeText(g.graph, a.edge) << "  truth "
        << metrics::TruthStatusName(a.truth) << ", "
        << (a.reported ? (g.has_marks ? (IsDashed(g, a.edge) ? "reported dashed" : "reported solid")
                                      : "reported")
                       : "not reported")
        << (false_edge ? "  (false edge)" : missed ? "  (missed)" : "") << "\n";
  }
}

std::string CountsJson(const metrics::EdgeCounts& c) {
  std::ostringstream o;
  o << "{\"reported\": " << c.reported << ", \"in_class\": " << c.in_class
    << ", \"false_edges\": " << c.false_edges << ", \"solid\": " << c.solid
    << ", \"solid_found\": " << c.solid_found << ", \"missed_solid\": " << c.missed_solid
    << ", \"power\": " << JsonNumber(Ratio(c.solid_found, c.solid)) << ", \"dashed\": " << c.dashed
    << ", \"dashed_found\": " << c.dashed_found << "}";
  return o.str();
}

void PrintJson(const metrics::TruthClass& tc, const Learned& g, const metrics::ReplicateScore& s,
               std::ostream& out) {
  out << "{\"groups\": {";
  for (int k = 0; k < metrics::kEdgeGroups; ++k) {
    out << (k ? ", " : "") << JsonString(metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(k)))
        << ": " << CountsJson(s.by_group[k]);
  }
  out << "}, \"total\": " << CountsJson(s.total) << ", \"power\": " << JsonNumber(s.power)
      << ", \"false_edge_rate\": " << JsonNumber(s.false_edge_rate) << ", \"hamming\": " << s.hamming
      << ", \"class_recovered\": " << (s.class_recovered ? "true" : "false")
      << ", \"has_marks\": " << (g.has_marks ? "true" : "false")
      << ", \"marks_compared\": " << s.marks_compared << ", \"marks_agree\": " << s.marks_agree
      << ", \"mark_agreement\": " << JsonNumber(s.mark_agreement) << ", \"edges\": [";
  bool first = true;
  for (const metrics::EdgeAudit& a : metrics::AuditEdges(tc, g.graph)) {
    out << (first ? "" : ", ") << "{\"from\": " << JsonString(g.graph.name(a.edge.from))
        << ", \"to\": " << JsonString(g.graph.name(a.edge.to)) << ", \"kind\": \""
        << (a.edge.kind == graph::EdgeKind::kDirected ? "directed" : "bidirected")
        << "\", \"truth\": \"" << metrics::TruthStatusName(a.truth)
        << "\", \"reported\": " << (a.reported ? "true" : "false");
    if (g.has_marks && a.reported) {
      out << ", \"mark\": \"" << (IsDashed(g, a.edge) ? "dashed" : "solid") << "\"";
    }
    out << "}";
    first = false;
  }
  out << "]}\n";
}

int Score(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("options");
  o.add_options()("truth", po::value<std::string>()->required(), "truth graph file")("json", "print JSON");
  const po::variables_map vm = ParseCommandLine(args, o, {{"graph", "GRAPH (the learned graph file)"}});
  const std::string graph_path = vm["graph"].as<std::string>();
  const std::string truth_path = vm["truth"].as<std::string>();
  const GraphFile truth = ReadOrThrow(truth_path);
  GraphFile learned_file = ReadOrThrow(graph_path);
  Result<metrics::TruthClass> tc = metrics::ComputeTruthClass(truth.truth);
  if (!tc.ok()) throw Error{truth_path, 0, 0, "", tc.status().message()};
  const Learned g = Align(std::move(learned_file), tc->projected.names(), graph_path);
  const metrics::ReplicateScore s = g.has_marks ? metrics::ScoreGraph(*tc, g.graph, g.dashed)
                                                : metrics::ScoreGraph(*tc, g.graph);
  if (vm.count("json")) {
    PrintJson(*tc, g, s, out);
  } else {
    PrintText(*tc, g, s, out);
  }
  return kExitOk;
}

}  // namespace

int RunScoreCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << kUsage;
    return kExitOk;
  }
  return GuardCommand("score", err, [&] { return Score(args, out); }, kUsage);
}

}  // namespace locind::app
