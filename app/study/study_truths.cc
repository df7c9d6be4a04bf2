#include "app/study/study_truths.h"
#include "base/number_format.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "app/io/event_csv.h"
#include "base/hashing.h"
#include "sim/stability.h"

namespace locind::app {
namespace {

double Draw(const ValueRange& r, base::RandomStream& random) {
  // Always one draw, fixed or not, so the streams line up whatever is fixed.
  const double u = random.Uniform();
  return r.IsFixed() ? r.low : r.low + (r.high - r.low) * u;
}

base::RandomStream ParameterStream(const StudySpec& study, const PreparedTruth& truth) {
  return base::RandomStream(base::StreamKey{study.seed, truth.drawn_key,
                                              static_cast<uint64_t>(truth.index), kPurposeParameters});
}

// Under hidden_mode fixed-observed every count shares one drawn truth.
uint64_t FixedObservedKey() { return base::HashText("truth hidden=fixed-observed"); }

bool FixedObserved(const StudySpec& study, int hidden_factor) {
  return study.truth.random && hidden_factor >= 0 && study.grid.hidden_fixed_observed;
}

// The full truth of hidden_mode fixed-observed: random.nodes observed nodes
// plus the largest hidden count.
graph::TruthGraph DrawFullTruth(const StudySpec& study, int index) {
  graph::RandomGraphOptions options = study.truth.random_graph;
  const int most = *std::max_element(study.grid.hidden_counts.begin(), study.grid.hidden_counts.end());
  options.nodes += most;
  options.hidden_count = most;
  options.hidden_list.clear();
  base::RandomStream random(base::StreamKey{study.seed, FixedObservedKey(), static_cast<uint64_t>(index),
                                              kPurposeTruthGraph});
  return graph::RandomTruthGraph(options, random);
}

// Every observed node and the first `hidden` hidden ones, in node order.
std::vector<int> KeptNodes(const graph::TruthGraph& full, int hidden) {
  std::vector<int> kept;
  int taken = 0;
  for (int v = 0; v < full.graph.size(); ++v) {
    if (!full.IsHidden(v) || taken++ < hidden) kept.push_back(v);
  }
  return kept;
}

graph::TruthGraph Restrict(const graph::TruthGraph& full, const std::vector<int>& kept) {
  graph::TruthGraph t;
  t.graph = full.graph.Induced(kept);
  for (size_t i = 0; i < kept.size(); ++i) {
    if (full.IsHidden(kept[i])) t.hidden.push_back(static_cast<int>(i));
  }
  return t;
}

// Position of each drawn node in the kept list, -1 when left out.
std::vector<int> NewIndex(const PreparedTruth& truth) {
  std::vector<int> to(truth.drawn.graph.size(), -1);
  for (size_t i = 0; i < truth.kept.size(); ++i) to[truth.kept[i]] = static_cast<int>(i);
  return to;
}

// Four significant digits: notes for people (study.json keeps exact values).
std::string Short(double v) {
  char text[32];
  std::snprintf(text, sizeof text, "%.4g", v);
  return text;
}

// Counts values outside [low, high] (after rescaling) and their extent.
struct RangeCheck {
  int outside = 0, total = 0;
  double smallest = INFINITY, largest = -INFINITY;
  void Add(double v, const ValueRange& r) {
    ++total;
    smallest = std::min(smallest, v);
    largest = std::max(largest, v);
    // A little slack: a value rescaled onto the end of its range is inside.
    const double slack = 1e-12 * std::max(1.0, std::abs(v));
    if (v < r.low - slack || v > r.high + slack) ++outside;
  }
  std::string Text(const std::string& what, const ValueRange& r) const {
    if (outside == 0) return "";
    return std::to_string(outside) + " of " + std::to_string(total) + " " + what + " outside [" +
           base::FormatNumber(r.low) + ", " + base::FormatNumber(r.high) + "] (now " +
           Short(smallest) + " to " + Short(largest) + ")";
  }
};

std::string JoinNotes(const std::string& a, const std::string& b) {
  return a.empty() ? b : b.empty() ? a : a + "; " + b;
}

std::string HawkesRangeNote(const EventProcessSpec& e, const sim::HawkesModel& m) {
  RangeCheck weights, loops;
  for (const sim::EdgeKernel& k : m.kernels) {
    (k.from == k.to ? loops : weights).Add(k.kernel.terms[0].weight, k.from == k.to ? e.loop_weight : e.weight);
  }
  return JoinNotes(weights.Text("weights", e.weight), loops.Text("loop weights", e.loop_weight));
}

std::string DiffusionRangeNote(const PathProcessSpec& p, const sim::DiffusionModel& m) {
  RangeCheck self, coupling;
  for (int to = 0; to < m.nodes(); ++to) {
    for (int from : m.truth.graph.Parents(to)) {
      if (from == to) self.Add(-m.M(to, to), p.self_rate);
      else coupling.Add(m.M(to, from), p.coupling);
    }
  }
  return JoinNotes(self.Text("self rates", p.self_rate), coupling.Text("couplings", p.coupling));
}

}  // namespace

graph::TruthGraph DrawTruth(const StudySpec& study, int hidden_factor, int index) {
  if (!study.truth.random) return study.truth.explicit_graph;
  if (FixedObserved(study, hidden_factor)) {
    const graph::TruthGraph full = DrawFullTruth(study, index);
    return Restrict(full, KeptNodes(full, hidden_factor));
  }
  graph::RandomGraphOptions options = study.truth.random_graph;
  if (hidden_factor >= 0) {
    options.hidden_count = hidden_factor;
    options.hidden_list.clear();
  }
  base::RandomStream random(base::StreamKey{study.seed, TruthKey(hidden_factor),
                                              static_cast<uint64_t>(index), kPurposeTruthGraph});
  return graph::RandomTruthGraph(options, random);
}

PreparedTruth PrepareTruth(const StudySpec& study, int hidden_factor, int index) {
  PreparedTruth p;
  p.hidden_factor = hidden_factor;
  p.index = index;
  p.label = TruthLabel(hidden_factor, index);
  if (FixedObserved(study, hidden_factor)) {
    p.drawn = DrawFullTruth(study, index);
    p.drawn_key = FixedObservedKey();
    p.kept = KeptNodes(p.drawn, hidden_factor);
    p.truth = Restrict(p.drawn, p.kept);
    return p;
  }
  p.truth = DrawTruth(study, hidden_factor, index);
  p.drawn = p.truth;
  p.drawn_key = TruthKey(hidden_factor);
  for (int v = 0; v < p.truth.graph.size(); ++v) p.kept.push_back(v);
  return p;
}

StudyTruths::StudyTruths(const StudySpec& study, const std::vector<Cell>& cells) {
  for (const Cell& c : cells) {
    for (int t = 0; t < study.truth.truths; ++t) {
      const std::pair<int, int> id(c.hidden_factor, t);
      if (truths_.count(id)) continue;
      PreparedTruth p = PrepareTruth(study, c.hidden_factor, t);
      p.truth_class = metrics::ComputeTruthClass(p.truth);
      truths_.emplace(id, std::move(p));
    }
  }
}

const PreparedTruth& StudyTruths::Get(int hidden_factor, int index) const {
  return truths_.at({hidden_factor, index});
}

Result<BuiltHawkes> BuildHawkes(const StudySpec& study, const PreparedTruth& truth, const Cell& cell) {
  const EventProcessSpec& e = study.event_process;
  base::RandomStream random = ParameterStream(study, truth);
  BuiltHawkes b;
  sim::HawkesModel& m = b.model;
  m.truth = truth.truth;
  // Drawn on the drawn graph in its node order, kept where both ends are kept,
  // so the processes shared by two hidden counts get the same parameters.
  const std::vector<int> at = NewIndex(truth);
  const graph::Dmg& drawn = truth.drawn.graph;
  std::vector<double> baseline;
  for (int v = 0; v < drawn.size(); ++v) baseline.push_back(Draw(e.baseline, random));
  for (int v : truth.kept) m.baseline.push_back(baseline[v]);
  for (int to = 0; to < drawn.size(); ++to) {
    for (int from : drawn.Parents(to)) {
      const double w = Draw(from == to ? e.loop_weight : e.weight, random);
      const double decay = Draw(e.decay, random);
      if (at[from] < 0 || at[to] < 0) continue;
      m.kernels.push_back(sim::EdgeKernel{at[from], at[to], sim::Kernel::Exponential(w, decay)});
    }
  }
  Result<double> radius = sim::HawkesSpectralRadius(m);
  if (!radius.ok()) return radius.status();
  b.drawn_radius = b.spectral_radius = *radius;
  const bool rescale = cell.stationarity && b.drawn_radius > 0 &&
                       (e.rescale_both || b.drawn_radius > *cell.stationarity);
  if (rescale) {
    b.scale = *cell.stationarity / b.drawn_radius;
    for (sim::EdgeKernel& k : m.kernels) k.kernel.terms[0].weight *= b.scale;
    b.spectral_radius = *cell.stationarity;
    b.outside_range = HawkesRangeNote(e, m);
  }
  const Status valid = sim::Validate(m);
  if (!valid.ok()) return valid;
  return b;
}

Result<BuiltDiffusion> BuildDiffusion(const StudySpec& study, const PreparedTruth& truth,
                                      const Cell& cell) {
  const PathProcessSpec& p = study.path_process;
  base::RandomStream random = ParameterStream(study, truth);
  BuiltDiffusion b;
  sim::DiffusionModel& m = b.model;
  m = p.tanh ? sim::TanhDiffusion(truth.truth, 0, 0, p.noise)
             : sim::LinearDiffusion(truth.truth, 0, 0, p.noise);
  const std::vector<int> at = NewIndex(truth);
  const graph::Dmg& drawn = truth.drawn.graph;
  for (int to = 0; to < drawn.size(); ++to) {
    for (int from : drawn.Parents(to)) {
      const double v = from == to ? -Draw(p.self_rate, random) : Draw(p.coupling, random);
      if (at[from] >= 0 && at[to] >= 0) m.M(at[to], at[from]) = v;
    }
  }
  Result<double> largest = sim::LargestRealPart(m.M);
  if (!largest.ok()) return largest.status();
  b.drawn_largest_real_part = b.largest_real_part = *largest;
  if (cell.stationarity && (p.rescale_both || b.drawn_largest_real_part > *cell.stationarity)) {
    if (b.drawn_largest_real_part >= 0) {
      return Status::Error("the drawn drift matrix is unstable (largest real part " +
                           base::FormatNumber(b.drawn_largest_real_part) +
                           "), so it cannot be rescaled to drift_bound; lower coupling or raise self_rate");
    }
    b.scale = *cell.stationarity / b.drawn_largest_real_part;
    m.M *= b.scale;
    b.largest_real_part = *cell.stationarity;
    b.outside_range = DiffusionRangeNote(p, m);
  }
  const Status valid = sim::Validate(m);
  if (!valid.ok()) return valid;
  return b;
}

}  // namespace locind::app
