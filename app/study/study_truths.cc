#include "app/study/study_truths.h"
#include "base/number_format.h"

#include <cmath>

#include "app/io/event_csv.h"
#include "sim/stability.h"

namespace locind::app {
namespace {

double Draw(const ValueRange& r, base::RandomStream& random) {
  // Always one draw, fixed or not, so the streams line up whatever is fixed.
  const double u = random.Uniform();
  return r.IsFixed() ? r.low : r.low + (r.high - r.low) * u;
}

base::RandomStream ParameterStream(const StudySpec& study, const PreparedTruth& truth) {
  return base::RandomStream(base::StreamKey{study.seed, TruthKey(truth.hidden_factor),
                                              static_cast<uint64_t>(truth.index), kPurposeParameters});
}

}  // namespace

graph::TruthGraph DrawTruth(const StudySpec& study, int hidden_factor, int index) {
  if (!study.truth.random) return study.truth.explicit_graph;
  graph::RandomGraphOptions options = study.truth.random_graph;
  if (hidden_factor >= 0) {
    options.hidden_count = hidden_factor;
    options.hidden_list.clear();
  }
  base::RandomStream random(base::StreamKey{study.seed, TruthKey(hidden_factor),
                                              static_cast<uint64_t>(index), kPurposeTruthGraph});
  return graph::RandomTruthGraph(options, random);
}

StudyTruths::StudyTruths(const StudySpec& study, const std::vector<Cell>& cells) {
  for (const Cell& c : cells) {
    for (int t = 0; t < study.truth.truths; ++t) {
      const std::pair<int, int> id(c.hidden_factor, t);
      if (truths_.count(id)) continue;
      PreparedTruth p;
      p.hidden_factor = c.hidden_factor;
      p.index = t;
      p.label = TruthLabel(c.hidden_factor, t);
      p.truth = DrawTruth(study, c.hidden_factor, t);
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
  const int n = m.truth.graph.size();
  for (int v = 0; v < n; ++v) m.baseline.push_back(Draw(e.baseline, random));
  for (int to = 0; to < n; ++to) {
    for (int from : m.truth.graph.Parents(to)) {
      const double w = Draw(from == to ? e.loop_weight : e.weight, random);
      const double decay = Draw(e.decay, random);
      m.kernels.push_back(sim::EdgeKernel{from, to, sim::Kernel::Exponential(w, decay)});
    }
  }
  Result<double> radius = sim::HawkesSpectralRadius(m);
  if (!radius.ok()) return radius.status();
  b.spectral_radius = *radius;
  if (cell.stationarity && b.spectral_radius > 0) {
    const double scale = *cell.stationarity / b.spectral_radius;
    for (sim::EdgeKernel& k : m.kernels) k.kernel.terms[0].weight *= scale;
    b.spectral_radius = *cell.stationarity;
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
  const int n = m.nodes();
  for (int to = 0; to < n; ++to) {
    for (int from : m.truth.graph.Parents(to)) {
      m.M(to, from) = from == to ? -Draw(p.self_rate, random) : Draw(p.coupling, random);
    }
  }
  Result<double> largest = sim::LargestRealPart(m.M);
  if (!largest.ok()) return largest.status();
  b.largest_real_part = *largest;
  if (cell.stationarity) {
    if (b.largest_real_part >= 0) {
      return Status::Error("the drawn drift matrix is unstable (largest real part " +
                           base::FormatNumber(b.largest_real_part) +
                           "), so it cannot be rescaled to drift_bound; lower coupling or raise self_rate");
    }
    m.M *= *cell.stationarity / b.largest_real_part;
    b.largest_real_part = *cell.stationarity;
  }
  const Status valid = sim::Validate(m);
  if (!valid.ok()) return valid;
  return b;
}

}  // namespace locind::app
