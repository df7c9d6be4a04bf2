#include "app/io/model_file_writer.h"

#include <sstream>

#include "base/number_format.h"

namespace locind::app {
namespace {

std::string N(double v) { return base::FormatNumber(v); }

// Comment lines, then nodes, edges and hidden, as graph_file reads them.
void WriteGraph(const graph::TruthGraph& truth, const std::string& heading, std::ostream& o) {
  std::istringstream lines(heading);
  for (std::string line; std::getline(lines, line);) o << "# " << line << "\n";
  const graph::Dmg& g = truth.graph;
  o << "nodes: [";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << g.name(v);
  o << "]\nedges: [";
  bool first = true;
  for (int to = 0; to < g.size(); ++to) {
    for (int from : g.Parents(to)) {
      o << (first ? "" : ", ") << g.name(from) << " -> " << g.name(to);
      first = false;
    }
  }
  o << "]\nhidden: [";
  for (size_t i = 0; i < truth.hidden.size(); ++i) o << (i ? ", " : "") << g.name(truth.hidden[i]);
  o << "]\n";
}

void WriteKernel(const sim::Kernel& k, std::ostream& o) {
  if (k.family == sim::KernelFamily::kDelayedGamma) {
    o << "family: delayed-gamma, weight: " << N(k.weight) << ", delay: " << N(k.delay)
      << ", shape: " << N(k.shape) << ", rate: " << N(k.rate);
  } else if (k.terms.size() == 1) {
    o << "family: exponential, weight: " << N(k.terms[0].weight) << ", decay: " << N(k.terms[0].decay);
  } else {
    o << "family: exponential-sum, terms: [";
    for (size_t i = 0; i < k.terms.size(); ++i) {
      o << (i ? ", " : "") << "{weight: " << N(k.terms[i].weight) << ", decay: " << N(k.terms[i].decay) << "}";
    }
    o << "]";
  }
}

void WritePerNode(const char* key, const graph::Dmg& g, const Eigen::VectorXd& values, std::ostream& o) {
  o << "  " << key << ": {";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << g.name(v) << ": " << N(values(v));
  o << "}\n";
}

}  // namespace

std::string FormatEventModelFile(const sim::HawkesModel& model, const sim::HawkesRunOptions& run,
                                 const std::string& heading) {
  std::ostringstream o;
  WriteGraph(model.truth, heading, o);
  const graph::Dmg& g = model.truth.graph;
  const char* link = model.link == sim::Link::kLinear     ? "linear"
                     : model.link == sim::Link::kSoftplus ? "softplus"
                                                          : "rectified";
  o << "events:\n  link: " << link << "\n  baseline: {";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << g.name(v) << ": " << N(model.baseline[v]);
  o << "}\n  edge_kernels:";
  if (model.kernels.empty()) o << " []";
  o << "\n";
  for (const sim::EdgeKernel& k : model.kernels) {
    o << "    - {edge: " << g.name(k.from) << " -> " << g.name(k.to) << ", ";
    WriteKernel(k.kernel, o);
    o << "}\n";
  }
  const char* method = run.method == sim::HawkesMethod::kAuto       ? "auto"
                       : run.method == sim::HawkesMethod::kThinning ? "thinning"
                                                                    : "cluster";
  o << "  burn_in: " << N(run.burn_in) << "\n  method: " << method << "\n  event_cap: " << run.event_cap
    << "\n  allow_nonstationary: " << (run.allow_nonstationary ? "true" : "false") << "\n";
  return o.str();
}

std::string FormatPathModelFile(const sim::DiffusionModel& model, const sim::PathRunOptions& run,
                                const std::string& heading) {
  std::ostringstream o;
  WriteGraph(model.truth, heading, o);
  const graph::Dmg& g = model.truth.graph;
  o << "paths:\n  drift: " << (model.drift == sim::DriftFamily::kLinear ? "linear" : "tanh") << "\n";
  WritePerNode("offset", g, model.c, o);
  // The reader sets M_bb = -self_rate only on loops; other diagonal entries are 0.
  WritePerNode("self_rate", g, Eigen::VectorXd(Eigen::VectorXd::Zero(g.size()) - model.M.diagonal()), o);
  WritePerNode("noise", g, model.sigma, o);
  o << "  edge_couplings:";
  bool any = false;
  for (int to = 0; to < g.size(); ++to) {
    for (int from : g.Parents(to)) {
      if (from == to) continue;
      o << "\n    - {edge: " << g.name(from) << " -> " << g.name(to) << ", value: " << N(model.M(to, from)) << "}";
      any = true;
    }
  }
  if (!any) o << " []";
  o << "\n  step: " << N(run.step) << "\n  interval: " << N(run.interval) << "\n  burn_in: " << N(run.burn_in)
    << "\n  method: " << (run.method == sim::PathMethod::kExact ? "exact" : "euler") << "\n";
  return o.str();
}

}  // namespace locind::app
