// locind graph SUBCOMMAND: the graph engine from the command line.
//
//   check FILE --from A --to B [--given C1,C2]   prints separated|connected
//   project FILE [--json]                        the latent projection
//   class FILE [--json]                          the equivalence graph
//   equivalent FILE1 FILE2                       equivalent|not equivalent
//   draw FILE -o OUT.svg|OUT.dot [--class]       a drawing
//
// check and equivalent answer through the exit code too: 0 for separated /
// equivalent, 1 for connected / not equivalent, 2 for bad input or usage
// (as every command). Every subcommand takes --help.
#include <boost/program_options.hpp>
#include <map>
#include <sstream>

#include "app/io/atomic_file.h"
#include "app/io/error.h"
#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
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

// Parses `args` with `options` and the positional graph files, named in
// errors as the usage writes them (FILE, or FILE1 and FILE2).
po::variables_map ParseArgs(const std::vector<std::string>& args, const po::options_description& options,
                            int files) {
  std::vector<Positional> positional;
  if (files == 1) {
    positional.push_back({"file1", "FILE (a graph file)"});
  } else {
    positional.push_back({"file1", "FILE1 (the first graph file)"});
    positional.push_back({"file2", "FILE2 (the second graph file)"});
  }
  return ParseCommandLine(args, options, positional);
}

std::string FileArg(const po::variables_map& vm, int k = 1) {
  return vm["file" + std::to_string(k)].as<std::string>();
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
  const std::string path = FileArg(vm);
  Loaded g = LoadProjected(path);
  const graph::Mask from = NodeSet(g, vm["from"].as<std::string>(), "--from", path);
  const graph::Mask to = NodeSet(g, vm["to"].as<std::string>(), "--to", path);
  const graph::Mask given = NodeSet(g, vm["given"].as<std::string>(), "--given", path);
  if (from == 0 || to == 0) throw UsageError{"--from and --to need at least one node"};
  if ((from & given) != 0) throw UsageError{"a --from node may not also be in --given"};
  graph::BitGraph bits = *graph::ToBitGraph(g.projected);
  const bool separated = graph::MuSeparated(bits, from, to, given);
  out << (separated ? "separated" : "connected") << "\n";
  return separated ? kExitOk : kExitFailure;
}

int Project(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph project FILE [--json]");
  o.add_options()("json", "print JSON instead of the graph file format");
  po::variables_map vm = ParseArgs(args, o, 1);
  Loaded g = LoadProjected(FileArg(vm));
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
  const std::string path = FileArg(vm);
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
  const std::vector<std::string> files = {FileArg(vm, 1), FileArg(vm, 2)};
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
  return *same ? kExitOk : kExitFailure;
}

int Draw(const std::vector<std::string>& args, std::ostream& out) {
  po::options_description o("locind graph draw FILE -o OUT.svg|OUT.dot [--class]");
  o.add_options()("output,o", po::value<std::string>()->required(), "output file (.svg or .dot)")(
      "class", "draw the equivalence graph of the projection (dashed edges dashed)");
  po::variables_map vm = ParseArgs(args, o, 1);
  const std::string path = FileArg(vm);
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
struct Subcommand {
  Handler run;
  const char* usage;
  const char* help;  // the options and the answer, aligned
};

const std::map<std::string, Subcommand> kSubcommands = {
    {"check",
     {Check, "locind graph check FILE --from A --to B [--given C1,C2]",
      "  is B mu-separated from A given C in the latent projection of FILE?\n"
      "  --from A1,A2   source node(s)\n"
      "  --to B1,B2     target node(s)\n"
      "  --given C1,C2  conditioning nodes (default: none)\n"
      "  prints separated (exit 0) or connected (exit 1); bad input or usage exit 2\n"}},
    {"project",
     {Project, "locind graph project FILE [--json]",
      "  the latent projection of FILE onto its observed nodes\n"
      "  --json         print JSON instead of the graph file format\n"}},
    {"class",
     {Class, "locind graph class FILE [--json]",
      "  the equivalence graph of the projection (dashed edges listed)\n"
      "  --json         print JSON instead of text\n"}},
    {"equivalent",
     {Equivalent, "locind graph equivalent FILE1 FILE2",
      "  are the two projections Markov equivalent?\n"
      "  prints equivalent (exit 0) or not equivalent (exit 1); bad input or usage exit 2\n"}},
    {"draw",
     {Draw, "locind graph draw FILE -o OUT.svg|OUT.dot [--class]",
      "  -o, --output OUT  output file, .svg or .dot\n"
      "  --class           draw the equivalence graph of the projection (dashed edges dashed)\n"}}};

std::string GraphUsage() {
  std::string text = "usage: locind graph SUBCOMMAND FILE ... (locind graph SUBCOMMAND --help)\n";
  for (const auto& [name, sub] : kSubcommands) text += "       " + std::string(sub.usage) + "\n";
  text += "graph files: nodes, edges and hidden nodes in YAML (README.md, \"The graph engine from the command line\")\n";
  return text;
}

}  // namespace

int RunGraphCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (args.empty() || kSubcommands.count(args[0]) == 0) {
    const bool help = !args.empty() && (args[0] == "--help" || args[0] == "-h");
    if (!help) {
      const UsageError problem{args.empty() ? "missing SUBCOMMAND" : "unknown subcommand '" + args[0] + "'"};
      err << "locind graph: " << problem.ToString() << "\n";
    }
    (help ? out : err) << GraphUsage();
    return help ? kExitOk : kExitInputError;
  }
  const Subcommand& sub = kSubcommands.at(args[0]);
  const std::vector<std::string> rest(args.begin() + 1, args.end());
  if (WantsHelp(rest)) {
    out << "usage: " << sub.usage << "\n" << sub.help;
    return kExitOk;
  }
  return GuardCommand("graph " + args[0], err, [&] { return sub.run(rest, out); },
                      std::string("usage: ") + sub.usage);
}

}  // namespace locind::app
