#include "app/io/model_file.h"

#include <cmath>
#include <fstream>
#include <map>
#include <set>
#include <sstream>

#include "app/io/graph_file.h"

namespace locind::app {
namespace {

// The parser throws Error internally; the public functions return it.
class Parser {
 public:
  explicit Parser(const std::string& file) : file_(file) {}

  ModelSpec Parse(const YAML::Node& root) {
    if (!root.IsMap()) throw Error{file_, 1, 1, "", "expected a mapping with nodes and edges"};
    CheckKeys(root, "", {"nodes", "edges", "hidden", "events", "paths"});
    GraphOrError graph = ParseGraphKeys(root, file_);
    if (auto* e = std::get_if<Error>(&graph)) throw *e;
    truth_ = std::get<graph::TruthGraph>(std::move(graph));
    if (root["events"] && root["paths"]) {
      throw ErrorAt(file_, root["paths"], "paths", "a model has either events or paths, not both");
    }
    if (root["events"]) return ParseEvents(root["events"]);
    if (root["paths"]) return ParsePaths(root["paths"]);
    throw ErrorAt(file_, root, "", "missing the process model: an 'events' or a 'paths' section");
  }

 private:
  [[noreturn]] void Fail(const YAML::Node& node, const std::string& field, const std::string& msg) {
    throw ErrorAt(file_, node, field, msg);
  }

  void CheckKeys(const YAML::Node& map, const std::string& section,
                 const std::set<std::string>& allowed) {
    if (!map.IsMap()) Fail(map, section, "expected a mapping");
    std::set<std::string> seen;
    for (const auto& kv : map) {
      const std::string key = kv.first.Scalar();
      if (allowed.count(key) && !seen.insert(key).second)
        Fail(kv.first, Join(section, key), "given twice");
      if (!allowed.count(key)) {
        std::string list;
        for (const std::string& k : allowed) list += (list.empty() ? "" : ", ") + k;
        Fail(kv.first, Join(section, key), "unknown key (expected one of: " + list + ")");
      }
    }
  }

  static std::string Join(const std::string& section, const std::string& key) {
    return section.empty() ? key : section + "." + key;
  }

  double Number(const YAML::Node& node, const std::string& field) {
    double v = 0;
    if (!node.IsScalar() || !YAML::convert<double>::decode(node, v) || !std::isfinite(v)) {
      Fail(node, field, "expected a finite number");
    }
    return v;
  }

  double NumberOr(const YAML::Node& map, const char* key, const std::string& section, double fallback) {
    return map[key] ? Number(map[key], Join(section, key)) : fallback;
  }

  std::string Word(const YAML::Node& map, const char* key, const std::string& section,
                   const std::vector<std::string>& choices) {
    const std::string field = Join(section, key);
    if (!map[key]) return choices.front();
    const YAML::Node node = map[key];
    std::string list;
    for (const std::string& c : choices) {
      if (node.IsScalar() && node.Scalar() == c) return c;
      list += (list.empty() ? "" : ", ") + c;
    }
    Fail(node, field, "expected one of: " + list);
  }

  // A number for every node: one scalar for all, or a mapping naming each node.
  std::vector<double> PerNode(const YAML::Node& map, const char* key, const std::string& section,
                              double fallback) {
    const int n = truth_.graph.size();
    const std::string field = Join(section, key);
    if (!map[key]) return std::vector<double>(n, fallback);
    const YAML::Node node = map[key];
    if (node.IsScalar()) return std::vector<double>(n, Number(node, field));
    if (!node.IsMap()) Fail(node, field, "expected a number or a mapping from node to number");
    std::vector<double> out(n, NAN);
    for (const auto& kv : node) {
      const auto v = truth_.graph.index(kv.first.Scalar());
      if (!v) Fail(kv.first, field, "unknown node '" + kv.first.Scalar() + "'");
      if (!std::isnan(out[*v]))
        Fail(kv.first, field, "node '" + kv.first.Scalar() + "' given twice");
      out[*v] = Number(kv.second, field);
    }
    for (int v = 0; v < n; ++v) {
      if (std::isnan(out[v])) Fail(node, field, "no value for node '" + truth_.graph.name(v) + "'");
    }
    return out;
  }

  std::pair<int, int> Edge(const YAML::Node& node, const std::string& field) {
    const std::string text = node.IsScalar() ? node.Scalar() : "";
    const size_t arrow = text.find("->");
    auto trim = [](std::string s) {
      s.erase(0, s.find_first_not_of(' '));
      s.erase(s.find_last_not_of(' ') + 1);
      return s;
    };
    if (arrow == std::string::npos || text.find("<->") != std::string::npos) {
      Fail(node, field, "expected a directed edge 'a -> b'");
    }
    const auto from = truth_.graph.index(trim(text.substr(0, arrow)));
    const auto to = truth_.graph.index(trim(text.substr(arrow + 2)));
    if (!from || !to) Fail(node, field, "unknown node in '" + text + "'");
    if (!truth_.graph.HasDirected(*from, *to)) {
      Fail(node, field, "the graph has no edge '" + text + "'");
    }
    return {*from, *to};
  }

  sim::Kernel ParseKernel(const YAML::Node& k, const std::string& section) {
    CheckKeys(k, section, {"edge", "family", "weight", "decay", "terms", "delay", "shape", "rate"});
    const std::string family =
        Word(k, "family", section, {"exponential", "exponential-sum", "delayed-gamma"});
    if (family == "exponential") {
      return sim::Kernel::Exponential(NumberOr(k, "weight", section, 0),
                                      NumberOr(k, "decay", section, 1));
    }
    if (family == "delayed-gamma") {
      return sim::Kernel::DelayedGamma(NumberOr(k, "weight", section, 0), NumberOr(k, "delay", section, 0),
                                       NumberOr(k, "shape", section, 1), NumberOr(k, "rate", section, 1));
    }
    const YAML::Node terms = k["terms"];
    const std::string field = Join(section, "terms");
    if (!terms || !terms.IsSequence() || terms.size() == 0) {
      Fail(terms ? terms : k, field, "expected a list of {weight, decay} terms");
    }
    std::vector<sim::ExpTerm> out;
    for (const YAML::Node& t : terms) {
      CheckKeys(t, field, {"weight", "decay"});
      out.push_back(sim::ExpTerm{NumberOr(t, "weight", field, 0), NumberOr(t, "decay", field, 1)});
    }
    return sim::Kernel::SumOfExponentials(std::move(out));
  }

  void CheckModel(const Status& s, const YAML::Node& section, const std::string& field) {
    if (!s.ok()) Fail(section, field, s.message());
  }

  EventModelSpec ParseEvents(const YAML::Node& e) {
    const std::string s = "events";
    CheckKeys(e, s, {"link", "baseline", "kernel", "edge_kernels", "burn_in", "method",
                     "event_cap", "allow_nonstationary"});
    EventModelSpec spec;
    sim::HawkesModel& m = spec.model;
    m.truth = truth_;
    const std::string link = Word(e, "link", s, {"linear", "softplus", "rectified"});
    m.link = link == "linear" ? sim::Link::kLinear
             : link == "softplus" ? sim::Link::kSoftplus : sim::Link::kRectified;
    m.baseline = PerNode(e, "baseline", s, 0.1);
    sim::Kernel fallback = sim::Kernel::Exponential(0, 1);
    if (e["kernel"]) {
      if (e["kernel"]["edge"]) Fail(e["kernel"]["edge"], "events.kernel.edge", "the default kernel has no edge");
      fallback = ParseKernel(e["kernel"], "events.kernel");
    }
    std::map<std::pair<int, int>, sim::Kernel> own;
    if (const YAML::Node list = e["edge_kernels"]) {
      if (!list.IsSequence()) Fail(list, "events.edge_kernels", "expected a list of kernels");
      for (const YAML::Node& k : list) {
        if (!k.IsMap() || !k["edge"]) Fail(k, "events.edge_kernels", "each kernel needs an 'edge'");
        const auto edge = Edge(k["edge"], "events.edge_kernels.edge");
        if (own.count(edge)) Fail(k["edge"], "events.edge_kernels.edge", "edge given twice");
        own[edge] = ParseKernel(k, "events.edge_kernels");
      }
    }
    for (int to = 0; to < m.nodes(); ++to) {
      for (int from : m.truth.graph.Parents(to)) {
        auto it = own.find({from, to});
        m.kernels.push_back(sim::EdgeKernel{from, to, it == own.end() ? fallback : it->second});
      }
    }
    spec.run.burn_in = NumberOr(e, "burn_in", s, 0);
    if (spec.run.burn_in < 0) Fail(e["burn_in"], "events.burn_in", "must be >= 0");
    const std::string method = Word(e, "method", s, {"auto", "thinning", "cluster"});
    spec.run.method = method == "auto" ? sim::HawkesMethod::kAuto
                      : method == "thinning" ? sim::HawkesMethod::kThinning
                                             : sim::HawkesMethod::kCluster;
    const double cap = NumberOr(e, "event_cap", s, static_cast<double>(spec.run.event_cap));
    if (cap < 1 || cap > 1e15 || cap != std::floor(cap)) {
      Fail(e["event_cap"], "events.event_cap", "expected a whole number >= 1");
    }
    spec.run.event_cap = static_cast<int64_t>(cap);
    if (const YAML::Node flag = e["allow_nonstationary"]) {
      bool v = false;
      if (!flag.IsScalar() || !YAML::convert<bool>::decode(flag, v)) {
        Fail(flag, "events.allow_nonstationary", "expected true or false");
      }
      spec.run.allow_nonstationary = v;
    }
    CheckModel(sim::Validate(m), e, s);
    if (!spec.run.allow_nonstationary) CheckModel(sim::CheckStationary(m), e, s);
    return spec;
  }

  PathModelSpec ParsePaths(const YAML::Node& p) {
    const std::string s = "paths";
    CheckKeys(p, s, {"drift", "offset", "self_rate", "coupling", "edge_couplings", "noise", "step",
                     "interval", "burn_in", "method"});
    PathModelSpec spec;
    const int n = truth_.graph.size();
    const std::string drift = Word(p, "drift", s, {"linear", "tanh"});
    const double coupling = NumberOr(p, "coupling", s, 0);
    const std::vector<double> self = PerNode(p, "self_rate", s, 1.0);
    sim::DiffusionModel& m = spec.model;
    m = drift == "linear" ? sim::LinearDiffusion(truth_, 0, coupling, 1)
                          : sim::TanhDiffusion(truth_, 0, coupling, 1);
    for (int b = 0; b < n; ++b) {
      if (truth_.graph.HasDirected(b, b)) m.M(b, b) = -self[b];
    }
    const std::vector<double> offset = PerNode(p, "offset", s, 0);
    const std::vector<double> noise = PerNode(p, "noise", s, 1);
    m.c = Eigen::Map<const Eigen::VectorXd>(offset.data(), n);
    m.sigma = Eigen::Map<const Eigen::VectorXd>(noise.data(), n);
    if (const YAML::Node list = p["edge_couplings"]) {
      if (!list.IsSequence()) Fail(list, "paths.edge_couplings", "expected a list of {edge, value}");
      for (const YAML::Node& item : list) {
        CheckKeys(item, "paths.edge_couplings", {"edge", "value"});
        if (!item["edge"] || !item["value"]) Fail(item, "paths.edge_couplings", "needs edge and value");
        const auto [from, to] = Edge(item["edge"], "paths.edge_couplings.edge");
        if (from == to) Fail(item["edge"], "paths.edge_couplings.edge", "loops take self_rate");
        m.M(to, from) = Number(item["value"], "paths.edge_couplings.value");
      }
    }
    spec.run.step = NumberOr(p, "step", s, 0.01);
    spec.run.interval = NumberOr(p, "interval", s, 0.1);
    spec.run.burn_in = NumberOr(p, "burn_in", s, 0);
    const std::string method = Word(p, "method", s, {"euler", "exact"});
    spec.run.method = method == "euler" ? sim::PathMethod::kEuler : sim::PathMethod::kExact;
    CheckModel(sim::Validate(m), p, s);
    CheckModel(sim::CheckStable(m), p, s);
    if (spec.run.step <= 0 || spec.run.interval <= 0 || spec.run.burn_in < 0) {
      Fail(p, s, "step and interval must be > 0 and burn_in >= 0");
    }
    const double ratio = spec.run.interval / spec.run.step;
    if (std::abs(ratio - std::round(ratio)) > 1e-9 * ratio || std::round(ratio) < 1) {
      Fail(p["interval"] ? p["interval"] : p, "paths.interval", "must be a multiple of the step");
    }
    if (spec.run.method == sim::PathMethod::kExact && m.drift != sim::DriftFamily::kLinear) {
      Fail(p["method"], "paths.method", "the exact transition needs the linear drift");
    }
    return spec;
  }

  const std::string& file_;
  graph::TruthGraph truth_;
};

}  // namespace

ModelOrError ParseModelText(const std::string& text, const std::string& file) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    return Error{file, e.mark.line + 1, e.mark.column + 1, "", "not valid YAML: " + e.msg};
  }
  try {
    return Parser(file).Parse(root);
  } catch (const Error& e) {
    return e;
  } catch (const YAML::Exception& e) {
    return Error{file, e.mark.line + 1, e.mark.column + 1, "", e.msg};
  }
}

ModelOrError ReadModelFile(const std::string& path) {
  std::ifstream in(path);
  if (!in) return Error{path, 0, 0, "", "cannot open the file"};
  std::stringstream text;
  text << in.rdbuf();
  return ParseModelText(text.str(), path);
}

}  // namespace locind::app
