#include "app/study/truth_models.h"

#include <cstdio>
#include <set>
#include <sstream>

#include "app/io/graph_json.h"
#include "app/io/model_file_writer.h"
#include "base/number_format.h"

namespace locind::app {
namespace {

std::string N(double v) { return base::FormatNumber(v); }

// Four significant digits, for lines people read.
std::string Short(double v) {
  char text[32];
  std::snprintf(text, sizeof text, "%.4g", v);
  return text;
}

std::string Heading(const StudySpec& study, const TruthModel& t, const char* measure) {
  std::ostringstream o;
  o << "truth " << t.truth << " of study " << study.name << " (seed " << study.seed << ")";
  if (t.target) o << ", stationarity target " << N(*t.target);
  o << "\n" << measure << " as drawn " << Short(t.drawn_value) << ", as simulated " << Short(t.simulated_value);
  if (t.scale != 1) o << " (drawn parameters multiplied by " << Short(t.scale) << ")";
  if (!t.outside_range.empty()) o << "\nrescaling left the configured ranges: " << t.outside_range;
  o << "\nrerun: locind simulate truths/" << t.label << ".model.yaml --horizon LENGTH --seed S --out data.csv";
  return o.str();
}

std::string EventJson(const sim::HawkesModel& m) {
  const graph::Dmg& g = m.truth.graph;
  std::ostringstream o;
  o << "{\"baseline\": {";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << JsonString(g.name(v)) << ": " << N(m.baseline[v]);
  o << "}, \"kernels\": [";
  for (size_t i = 0; i < m.kernels.size(); ++i) {
    const sim::EdgeKernel& k = m.kernels[i];
    o << (i ? ", " : "") << "{\"edge\": " << JsonString(g.name(k.from) + " -> " + g.name(k.to))
      << ", \"weight\": " << N(k.kernel.terms[0].weight) << ", \"decay\": " << N(k.kernel.terms[0].decay) << "}";
  }
  o << "]}";
  return o.str();
}

std::string PathJson(const sim::DiffusionModel& m) {
  const graph::Dmg& g = m.truth.graph;
  std::ostringstream o;
  o << "{\"nodes\": [";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << JsonString(g.name(v));
  o << "], \"drift_matrix\": [";
  for (int r = 0; r < g.size(); ++r) {
    o << (r ? ", " : "") << "[";
    for (int c = 0; c < g.size(); ++c) o << (c ? ", " : "") << N(m.M(r, c));
    o << "]";
  }
  o << "], \"intercepts\": [";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << N(m.c(v));
  o << "], \"noise\": [";
  for (int v = 0; v < g.size(); ++v) o << (v ? ", " : "") << N(m.sigma(v));
  o << "]}";
  return o.str();
}

void FillEvents(const StudySpec& study, const PreparedTruth& truth, const Cell& cell, TruthModel& t) {
  const Result<BuiltHawkes> built = BuildHawkes(study, truth, cell);
  if (!built.ok()) {
    t.problem = built.status().message();
    return;
  }
  t.drawn_value = built->drawn_radius;
  t.simulated_value = built->spectral_radius;
  t.scale = built->scale;
  t.outside_range = built->outside_range;
  sim::HawkesRunOptions run;
  run.burn_in = study.event_process.burn_in;
  run.event_cap = study.event_process.event_cap;
  run.allow_nonstationary = built->spectral_radius >= 1;
  t.file_text = FormatEventModelFile(built->model, run, Heading(study, t, "spectral radius of K"));
  t.parameters_json = EventJson(built->model);
}

void FillPaths(const StudySpec& study, const PreparedTruth& truth, const Cell& cell, TruthModel& t) {
  const Result<BuiltDiffusion> built = BuildDiffusion(study, truth, cell);
  if (!built.ok()) {
    t.problem = built.status().message();
    return;
  }
  t.drawn_value = built->drawn_largest_real_part;
  t.simulated_value = built->largest_real_part;
  t.scale = built->scale;
  t.outside_range = built->outside_range;
  const PathProcessSpec& p = study.path_process;
  sim::PathRunOptions run;
  run.step = p.step;
  run.interval = p.interval;
  run.burn_in = p.burn_in;
  run.method = p.exact ? sim::PathMethod::kExact : sim::PathMethod::kEuler;
  t.file_text = FormatPathModelFile(built->model, run, Heading(study, t, "largest real part of M"));
  t.parameters_json = PathJson(built->model);
}

}  // namespace

std::vector<TruthModel> TruthModels(const StudySpec& study, const std::vector<Cell>& cells,
                                    const StudyTruths& truths) {
  std::vector<TruthModel> out;
  std::set<std::pair<std::pair<int, int>, std::optional<double>>> done;
  for (const auto& [id, truth] : truths.all()) {
    for (const Cell& c : cells) {
      if (c.hidden_factor != id.first || !done.insert({id, c.stationarity}).second) continue;
      TruthModel t;
      t.truth = truth.label;
      t.target = c.stationarity;
      t.label = truth.label;
      if (!study.grid.stationarity.empty() && c.stationarity) t.label += "-target" + N(*c.stationarity);
      if (study.events) {
        FillEvents(study, truth, c, t);
      } else {
        FillPaths(study, truth, c, t);
      }
      out.push_back(std::move(t));
    }
  }
  return out;
}

std::vector<std::string> RescaleWarnings(const std::vector<TruthModel>& models) {
  std::vector<std::string> out;
  for (const TruthModel& t : models) {
    if (t.outside_range.empty()) continue;
    out.push_back("truth " + t.label + ": rescaling by " + Short(t.scale) + " (to " + Short(t.simulated_value) +
                  ") left the configured ranges: " + t.outside_range);
  }
  return out;
}

}  // namespace locind::app
