// locind graph SUBCOMMAND: the graph engine from the command line.
//
//   check FILE --from A --to B [--given C1,C2]   prints separated|connected
//   project FILE [--json]                        the latent projection
//   class FILE [--json]                          the equivalence graph
//   equivalent FILE1 FILE2                       equivalent|not equivalent
//   draw FILE -o OUT.svg|OUT.dot [--class]       a drawing
#include <boost/program_options.hpp>
#include <map>
#include <sstream>

#include "app/io/atomic_file.h"
#include "app/io/error.h"
#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/io/graph_file.h"
#include "app/io/graph_json.h"
#include "app/io/svg_render.h"
#include "graph/bit_graph.h"
#include "graph/dot_format.h"
#include "graph/equivalence_graph.h"
#include "graph/latent_projection.h"
#include "graph/markov_equivalence.h"
#include "graph/mu_separation.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;
using graph::Dmg;
using graph::TruthGraph;

// Parses `args` with `options` and one or more positional FILE arguments.
po::variables_map ParseArgs(const std::vector<std::string>& args, const po::options_description& options,
                            int files) {
  po::options_description all = options;
  all.add_options()("file", po::value<std::vector<std::string>>(), "input files");
  po::positional_options_description positional;
  positional.add("file", files);
  po::variables_map vm;
  po::store(po::command_line_parser(args).options(all).positional(positional).run(), vm);
  po::notify(vm);
  if (!vm.count("file") || vm["file"].as<std::vector<std::string>>().size() != size_t(files)) {
    throw UsageError{"expected " + std::to_string(files) + " graph file(s)"};
  }
  return vm;
}

// Reads a graph file and projects it onto its observed nodes.
struct Loaded {
  TruthGraph truth;
  Dmg projected;
};

Loaded LoadProjected(const std::string& path) {
  GraphFileOrErrors read = ReadAnyGraphFile(path);
  if (auto* errors = std::get_if<Errors>(&read)) throw *errors;
  TruthGraph truth = std::get<GraphFile>(std::move(read)).truth;
  Result<Dmg> projected = graph::LatentProjection(truth.graph, truth.hidden);
  if (!projected.ok()) throw Error{path, 0, 0, "", projected.status().message()};
  return Loaded{std::move(truth), std::move(*projected)};
}

graph::Mask NodeSet(const Loaded& g, const std::string& list, const std::string& option,
                    const std::string& path) {
  graph::Mask set = 0;
  for (const std::string& name : SplitList(list)) {
    if (auto v = g.truth.graph.index(name); v && g.truth.IsHidden(*v)) {
      throw Error{path, 0, 0, option, "node '" + name + "' is hidden"};
    }
    auto v = g.projected.index(name);
    if (!v) throw Error{path, 0, 0, option, "unknown node '" + name + "'"};
    set |= graph::Bit(*v);
  }
  return set;
}

int Check(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph check FILE --from A --to B [--given C1,C2]");
  o.add_options()("from", po::value<std::string>()->required(), "source node(s), comma-separated")(
      "to", po::value<std::string>()->required(), "target node(s), comma-separated")(
      "given", po::value<std::string>()->default_value(""), "conditioning nodes, comma-separated");
  po::variables_map vm = ParseArgs(args, o, 1);
  const std::string path = vm["file"].as<std::vector<std::string>>()[0];
  Loaded g = LoadProjected(path);
  const graph::Mask from = NodeSet(g, vm["from"].as<std::string>(), "--from", path);
  const graph::Mask to = NodeSet(g, vm["to"].as<std::string>(), "--to", path);
  const graph::Mask given = NodeSet(g, vm["given"].as<std::string>(), "--given", path);
  if (from == 0 || to == 0) throw UsageError{"--from and --to need at least one node"};
  if ((from & given) != 0) throw UsageError{"a --from node may not also be in --given"};
  graph::BitGraph bits = *graph::ToBitGraph(g.projected);
  out << (graph::MuSeparated(bits, from, to, given) ? "separated" : "connected") << "\n";
  return kExitOk;
}

int Project(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph project FILE [--json]");
  o.add_options()("json", "print JSON instead of the graph file format");
  po::variables_map vm = ParseArgs(args, o, 1);
  Loaded g = LoadProjected(vm["file"].as<std::vector<std::string>>()[0]);
  if (vm.count("json")) {
    out << GraphJson(g.projected) << "\n";
  } else {
    out << FormatGraph(TruthGraph{g.projected, {}});
  }
  return kExitOk;
}

graph::NamedEquivalenceGraph ClassOf(const Loaded& g, const std::string& path) {
  auto eg = graph::ComputeEquivalenceGraph(g.projected);
  if (!eg.ok()) throw Error{path, 0, 0, "", eg.status().message()};
  return std::move(eg.value());
}

std::vector<graph::Edge> DashedEdges(const graph::NamedEquivalenceGraph& eg) {
  std::vector<graph::Edge> out;
  for (size_t i = 0; i < eg.edges.size(); ++i) {
    if (eg.dashed[i]) out.push_back(eg.edges[i]);
  }
  return out;
}

int Class(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph class FILE [--json]");
  o.add_options()("json", "print JSON instead of text");
  po::variables_map vm = ParseArgs(args, o, 1);
  const std::string path = vm["file"].as<std::vector<std::string>>()[0];
  const auto eg = ClassOf(LoadProjected(path), path);
  const std::vector<graph::Edge> dashed = DashedEdges(eg);
  if (vm.count("json")) {
    out << GraphJson(eg.maximal, dashed) << "\n";
    return kExitOk;
  }
  out << FormatGraph(TruthGraph{eg.maximal, {}}) << "dashed: [";
  for (size_t i = 0; i < dashed.size(); ++i) {
    out << (i ? ", " : "") << graph::EdgeText(eg.maximal, dashed[i]);
  }
  out << "]\n";
  return kExitOk;
}

int Equivalent(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph equivalent FILE1 FILE2");
  po::variables_map vm = ParseArgs(args, o, 2);
  const auto files = vm["file"].as<std::vector<std::string>>();
  Loaded g1 = LoadProjected(files[0]);
  Loaded g2 = LoadProjected(files[1]);
  // Put the second graph's observed nodes in the first graph's order.
  std::vector<int> order;
  for (const std::string& name : g1.projected.names()) {
    auto v = g2.projected.index(name);
    if (!v) throw Error{files[1], 0, 0, "nodes", "observed node '" + name + "' is missing"};
    order.push_back(*v);
  }
  if (g2.projected.size() != g1.projected.size()) {
    throw Error{files[1], 0, 0, "nodes", "the graphs have different observed nodes"};
  }
  Result<bool> same = graph::MarkovEquivalent(g1.projected, g2.projected.Induced(order));
  if (!same.ok()) throw Error{files[0], 0, 0, "", same.status().message()};
  out << (*same ? "equivalent" : "not equivalent") << "\n";
  return kExitOk;
}

int Draw(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph draw FILE -o OUT.svg|OUT.dot [--class]");
  o.add_options()("output,o", po::value<std::string>()->required(), "output file (.svg or .dot)")(
      "class", "draw the equivalence graph of the projection (dashed edges dashed)");
  po::variables_map vm = ParseArgs(args, o, 1);
  const std::string path = vm["file"].as<std::vector<std::string>>()[0];
  const std::string target = vm["output"].as<std::string>();
  const bool svg = target.size() >= 4 && target.substr(target.size() - 4) == ".svg";
  const bool dot_file = target.size() >= 4 && target.substr(target.size() - 4) == ".dot";
  if (!svg && !dot_file) throw UsageError{"the output name must end in .svg or .dot"};
  Loaded g = LoadProjected(path);
  std::string dot;
  if (vm.count("class")) {
    const auto eg = ClassOf(g, path);
    graph::DotOptions style;
    style.dashed = DashedEdges(eg);
    dot = graph::ToDot(eg.maximal, style);
  } else {
    graph::DotOptions style;
    style.hidden = g.truth.hidden;
    dot = graph::ToDot(g.truth.graph, style);
  }
  std::string content = dot;
  if (svg) {
    Result<std::string> rendered = RenderSvg(dot);
    if (!rendered.ok()) throw InternalError(rendered.status().message());
    content = *rendered;
  }
  Status written = WriteFileAtomically(target, content);
  if (!written.ok()) throw FileSystemError(written.message());
  out << "wrote " << target << "\n";
  return kExitOk;
}

using Handler = int (*)(const std::vector<std::string>&, std::ostream&);
const std::map<std::string, Handler> kSubcommands = {
    {"check", Check}, {"project", Project}, {"class", Class}, {"equivalent", Equivalent},
    {"draw", Draw}};

}  // namespace

int RunGraphCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (args.empty() || kSubcommands.count(args[0]) == 0) {
    err << "usage: locind graph check|project|class|equivalent|draw FILE ... (see DEVELOPERS.md)\n";
    return kExitInputError;
  }
  const std::vector<std::string> rest(args.begin() + 1, args.end());
  return GuardCommand("graph " + args[0], err, [&] {
    return kSubcommands.at(args[0])(rest, out);
  });
}

}  // namespace locind::app
