#include "app/results/results_writer.h"

#include <algorithm>
#include <filesystem>
#include <sstream>

#include "app/io/atomic_file.h"
#include "app/results/results_calibration.h"
#include "app/io/graph_json.h"
#include "app/study/truth_drawings.h"
#include "app/study/truth_models.h"
#include "app/io/svg_render.h"
#include "learners/methods/learner_registry.h"

namespace locind::app {
namespace {

std::string Range(const ValueRange& r) {
  if (r.IsFixed()) return Num(r.low);
  std::string text = "[";
  return text.append(Num(r.low)).append(", ").append(Num(r.high)).append("]");
}

std::string OptionalNumber(const std::optional<double>& v) { return v ? Num(*v) : "null"; }

std::string TruthJson(const StudySpec& study) {
  std::ostringstream o;
  const TruthSpec& t = study.truth;
  o << "{\"truths\": " << t.truths << ", ";
  if (!t.random) {
    o << "\"graph\": " << GraphJson(t.explicit_graph.graph) << ", \"hidden\": [";
    for (size_t i = 0; i < t.explicit_graph.hidden.size(); ++i) {
      o << (i ? ", " : "") << JsonString(t.explicit_graph.graph.name(t.explicit_graph.hidden[i]));
    }
    o << "]}";
    return o.str();
  }
  const graph::RandomGraphOptions& r = t.random_graph;
  const char* loops = r.loops == graph::LoopPolicy::kAll ? "all" : r.loops == graph::LoopPolicy::kNone ? "none" : "random";
  o << "\"random\": {\"nodes\": " << r.nodes << ", \"edge_probability\": " << Num(r.edge_probability)
    << ", \"in_degree\": " << (r.expected_in_degree >= 0 ? Num(r.expected_in_degree) : "null")
    << ", \"loops\": \"" << loops << "\", \"loop_probability\": " << Num(r.loop_probability)
    << ", \"hidden_count\": " << r.hidden_count << ", \"hidden_positions\": [";
  for (size_t i = 0; i < r.hidden_list.size(); ++i) o << (i ? ", " : "") << r.hidden_list[i] + 1;
  o << "]}}";
  return o.str();
}

std::string ProcessJson(const StudySpec& study) {
  std::ostringstream o;
  if (study.events) {
    const EventProcessSpec& e = study.event_process;
    o << "{\"events\": {\"kernel\": \"exponential\", \"baseline\": \"" << Range(e.baseline)
      << "\", \"weight\": \"" << Range(e.weight) << "\", \"loop_weight\": \"" << Range(e.loop_weight)
      << "\", \"decay\": \"" << Range(e.decay) << "\", \"spectral_radius\": "
      << OptionalNumber(e.spectral_radius) << ", \"rescale\": \"" << (e.rescale_both ? "both" : "down")
      << "\", \"burn_in\": " << Num(e.burn_in)
      << ", \"event_cap\": " << e.event_cap << "}}";
  } else {
    const PathProcessSpec& p = study.path_process;
    o << "{\"paths\": {\"drift\": \"" << (p.tanh ? "tanh" : "linear") << "\", \"self_rate\": \""
      << Range(p.self_rate) << "\", \"coupling\": \"" << Range(p.coupling) << "\", \"noise\": "
      << Num(p.noise) << ", \"step\": " << Num(p.step) << ", \"interval\": " << Num(p.interval)
      << ", \"burn_in\": " << Num(p.burn_in) << ", \"method\": \"" << (p.exact ? "exact" : "euler")
      << "\", \"drift_bound\": " << OptionalNumber(p.drift_bound) << ", \"rescale\": \""
      << (p.rescale_both ? "both" : "down") << "\"}}";
  }
  return o.str();
}

std::string TruthsJson(const StudyTruths& truths) {
  std::ostringstream o;
  o << "[";
  bool first = true;
  for (const auto& [id, t] : truths.all()) {
    o << (first ? "\n    " : ",\n    ") << "{\"label\": " << JsonString(t.label)
      << ", \"graph\": " << GraphJson(t.truth.graph) << ", \"hidden\": [";
    for (size_t i = 0; i < t.truth.hidden.size(); ++i) {
      o << (i ? ", " : "") << JsonString(t.truth.graph.name(t.truth.hidden[i]));
    }
    o << "], ";
    if (t.truth_class.ok()) {
      std::vector<graph::Edge> dashed;
      for (size_t i = 0; i < t.truth_class->edges.size(); ++i) {
        if (t.truth_class->dashed[i]) dashed.push_back(t.truth_class->edges[i]);
      }
      o << "\"equivalence_graph\": " << GraphJson(t.truth_class->maximal, dashed) << "}";
    } else {
      o << "\"equivalence_graph\": null, \"problem\": " << JsonString(t.truth_class.status().message()) << "}";
    }
    first = false;
  }
  o << "\n  ]";
  return o.str();
}

// ---- truth models: parameters as simulated, rescaling, model files ----

std::string TruthModelsJson(const std::vector<TruthModel>& models) {
  std::ostringstream o;
  o << "[";
  for (size_t i = 0; i < models.size(); ++i) {
    const TruthModel& t = models[i];
    o << (i ? ",\n    " : "\n    ") << "{\"truth\": " << JsonString(t.truth) << ", \"label\": "
      << JsonString(t.label) << ", \"stationarity_target\": " << OptionalNumber(t.target);
    if (!t.problem.empty()) {
      o << ", \"problem\": " << JsonString(t.problem) << "}";
      continue;
    }
    o << ", \"model_file\": " << JsonString("truths/" + t.label + ".model.yaml")
      << ", \"stationarity_drawn\": " << Num(t.drawn_value) << ", \"stationarity_simulated\": "
      << Num(t.simulated_value) << ", \"scale\": " << Num(t.scale) << ", \"outside_range\": "
      << (t.outside_range.empty() ? "null" : JsonString(t.outside_range)) << ", \"parameters\": "
      << t.parameters_json << "}";
  }
  o << "\n  ]";
  return o.str();
}

std::string WarningsJson(const std::vector<std::string>& warnings) {
  std::string out = "[";
  for (size_t i = 0; i < warnings.size(); ++i) out += (i ? ", " : "") + JsonString(warnings[i]);
  return out + "]";
}

Status WriteTruthModels(const std::string& dir, const std::vector<TruthModel>& models) {
  std::error_code ec;
  std::filesystem::create_directories(dir + "/truths", ec);
  if (ec) return Status::Error("cannot create " + dir + "/truths: " + ec.message());
  for (const TruthModel& t : models) {
    if (!t.problem.empty()) continue;
    Status s = WriteFileAtomically(dir + "/truths/" + t.label + ".model.yaml", t.file_text);
    if (!s.ok()) return s;
  }
  return Status::Ok();
}

// ---- end truth models ----

Status WriteDrawings(const std::string& dir, const StudyTruths& truths) {
  for (const auto& [id, t] : truths.all()) {
    Result<std::string> svg = RenderSvg(TruthDot(t));
    if (!svg.ok()) return svg.status();
    Status s = WriteFileAtomically(dir + "/truth-" + t.label + ".svg", *svg);
    if (!s.ok()) return s;
    if (!t.truth_class.ok()) continue;
    svg = RenderSvg(ClassDot(t));
    if (!svg.ok()) return svg.status();
    s = WriteFileAtomically(dir + "/class-" + t.label + ".svg", *svg);
    if (!s.ok()) return s;
  }
  return Status::Ok();
}

// The record of a row, its truth numbered by first appearance in `truths`:
// the cluster bootstrap resamples truths, and the numbers only group them.
metrics::ReplicateRecord NumberedRecord(const ReplicateRow& r, std::vector<std::string>& truths) {
  metrics::ReplicateRecord record = RecordOf(r);
  auto it = std::find(truths.begin(), truths.end(), r.truth);
  record.truth = static_cast<int>(it - truths.begin());
  if (it == truths.end()) truths.push_back(r.truth);
  return record;
}

}  // namespace

metrics::LearnerReach ReachOf(const std::string& method) {
  metrics::LearnerReach reach;
  const learners::MethodEntry* entry = learners::FindMethod(method);
  if (entry == nullptr) return reach;  // unknown method: assume it can report everything
  using metrics::EdgeGroup;
  reach.groups[static_cast<int>(EdgeGroup::kDirected)] = entry->reports & learners::kReportsDirected;
  reach.groups[static_cast<int>(EdgeGroup::kLoop)] = entry->reports & learners::kReportsLoops;
  reach.groups[static_cast<int>(EdgeGroup::kBidirected)] = entry->reports & learners::kReportsBidirected;
  reach.marks = entry->reports & learners::kReportsMarks;
  return reach;
}

metrics::CellSummary SummarizeCell(const StudySpec& study, const Cell& cell, int learner,
                                   const std::vector<ReplicateRow>& rows) {
  std::vector<std::string> truths;
  std::vector<metrics::ReplicateRecord> records;
  for (const ReplicateRow& r : rows) records.push_back(NumberedRecord(r, truths));
  base::RandomStream random(base::StreamKey{study.seed, cell.key, static_cast<uint64_t>(learner),
                                              kPurposeSummary});
  return metrics::Summarize(records, ReachOf(study.learners[learner].method), random);
}

std::string ReplicatesCsv(const std::map<Unit, UnitResult>& units) {
  std::string out = ReplicateHeader() + "\n";
  for (const auto& [unit, result] : units) {
    for (const ReplicateRow& r : result.rows) out += FormatReplicateRow(r) + "\n";
  }
  return out;
}

std::string EdgesCsv(const std::map<Unit, UnitResult>& units) {
  std::string out = EdgeHeader() + "\n";
  for (const auto& [unit, result] : units) {
    for (const std::string& line : result.edge_lines) out += line + "\n";
  }
  return out;
}

std::string NullTestsCsv(const std::map<Unit, UnitResult>& units) {
  std::string out = NullTestHeader() + "\n";
  for (const auto& [unit, result] : units) {
    for (const std::string& line : result.null_test_lines) out += line + "\n";
  }
  return out;
}

std::string SummaryCsv(const StudySpec& study, const std::vector<Cell>& cells,
                       const std::map<Unit, UnitResult>& units) {
  // rows[cell][learner], replicates in order (the map is sorted).
  std::vector<std::vector<std::vector<ReplicateRow>>> rows(
      cells.size(), std::vector<std::vector<ReplicateRow>>(study.learners.size()));
  for (const auto& [unit, result] : units) {
    for (const ReplicateRow& r : result.rows) {
      for (size_t l = 0; l < study.learners.size(); ++l) {
        if (study.learners[l].label == r.learner) rows[unit.cell][l].push_back(r);
      }
    }
  }
  std::string out = SummaryHeader() + "\n";
  for (const Cell& c : cells) {
    for (size_t l = 0; l < study.learners.size(); ++l) {
      if (rows[c.index][l].empty()) continue;
      out += FormatSummaryRow(c, study.learners[l].label,
                              SummarizeCell(study, c, static_cast<int>(l), rows[c.index][l])) + "\n";
    }
  }
  return out;
}

std::string ComparisonsCsv(const StudySpec& study, const std::vector<Cell>& cells,
                           const std::map<Unit, UnitResult>& units) {
  // records[cell][learner]: replicate -> record, truths numbered per cell;
  // pairs are matched by replicate number.
  const size_t learners = study.learners.size();
  std::vector<std::vector<std::map<int, metrics::ReplicateRecord>>> records(
      cells.size(), std::vector<std::map<int, metrics::ReplicateRecord>>(learners));
  std::vector<std::vector<std::string>> truths(cells.size());
  for (const auto& [unit, result] : units) {
    for (const ReplicateRow& r : result.rows) {
      for (size_t l = 0; l < learners; ++l) {
        if (study.learners[l].label == r.learner) {
          records[unit.cell][l][r.replicate] = NumberedRecord(r, truths[unit.cell]);
        }
      }
    }
  }
  std::string out = ComparisonHeader() + "\n";
  for (const Cell& c : cells) {
    for (size_t l = 1; l < learners; ++l) {
      for (size_t ref = 0; ref < l; ++ref) {
        std::vector<metrics::ReplicateRecord> mine, theirs;
        for (const auto& [replicate, record] : records[c.index][l]) {
          auto other = records[c.index][ref].find(replicate);
          if (other == records[c.index][ref].end()) continue;
          mine.push_back(record);
          theirs.push_back(other->second);
        }
        if (mine.empty()) continue;
        base::RandomStream random(base::StreamKey{study.seed, c.key, 1024 * l + ref, kPurposeComparison});
        out += FormatComparisonRow(c, study.learners[l].label, study.learners[ref].label,
                                   metrics::Compare(mine, theirs, random)) + "\n";
      }
    }
  }
  return out;
}

// The seed and the stream keys are 64-bit integers: written as JSON strings,
// since readers that hold JSON numbers as doubles (R's jsonlite, JavaScript,
// pandas) round integers above 2^53.
std::string StudyJson(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths) {
  std::ostringstream o;
  o << "{\n  \"program\": \"locind\",\n  \"version\": \"" << kLocindVersion << "\",\n"
    << "  \"name\": " << JsonString(study.name) << ",\n  \"seed\": \"" << study.seed << "\",\n"
    << "  \"streams\": \"every random stream is keyed by (seed, cell key, replicate, purpose); "
       "purposes: 1 truth graph, 2 process parameters, 3 data, 4 summary bootstrap, 5 test draws, 6 external learners, 7 learner comparisons; "
       "data and test draws use the data key (the cell label without the level, so cells that differ "
       "only in level share data); truths use the key of 'truth hidden=<factor>' (or "
       "'truth hidden=fixed-observed') and the truth index as replicate\",\n"
    << "  \"truth\": " << TruthJson(study) << ",\n  \"process\": " << ProcessJson(study) << ",\n"
    << "  \"replicates\": " << study.grid.replicates << ",\n  \"hidden_mode\": \""
    << (study.grid.hidden_fixed_observed ? "fixed-observed" : "fresh-truth") << "\",\n  \"cells\": [";
  for (size_t i = 0; i < cells.size(); ++i) {
    const Cell& c = cells[i];
    o << (i ? ",\n    " : "\n    ") << "{\"cell\": " << c.index << ", \"label\": " << JsonString(c.label)
      << ", \"key\": \"" << c.key << "\", \"data_key\": \"" << c.data_key << "\", \"length\": " << Num(c.length) << ", \"level\": " << Num(c.level)
      << ", \"hidden_count\": " << c.hidden_count
      << ", \"stationarity_target\": " << OptionalNumber(c.stationarity) << ", \"trials\": " << c.trials << "}";
  }
  o << "\n  ],\n  \"learners\": [";
  for (size_t i = 0; i < study.learners.size(); ++i) {
    const LearnerSpec& l = study.learners[i];
    o << (i ? ",\n    " : "\n    ") << "{\"label\": " << JsonString(l.label) << ", \"method\": "
      << JsonString(l.method) << ", \"test\": " << JsonString(l.test);
    if (l.method == "screen") o << ", \"size\": " << l.screening_size;
    if (l.method == "penalized-fit") o << ", \"penalty\": " << Num(l.penalty > 0 ? l.penalty : 1);
    // --- external learners (docs/external_learners.md): the program as run ---
    if (l.IsExternal()) {
      o << ", \"program\": [";
      for (size_t k = 0; k < l.program.size(); ++k) o << (k ? ", " : "") << JsonString(l.program[k]);
      o << "], \"time_limit\": " << Num(l.time_limit);
    }
    o << "}";
  }
  o << "\n  ],\n  \"truths\": " << TruthsJson(truths);
  const std::vector<TruthModel> models = TruthModels(study, cells, truths);
  o << ",\n  \"truth_models\": " << TruthModelsJson(models)
    << ",\n  \"rescale_warnings\": " << WarningsJson(RescaleWarnings(models)) << "\n}\n";
  return o.str();
}

Status WriteResults(const std::string& dir, const StudySpec& study, const std::string& study_text,
                    const std::vector<Cell>& cells, const StudyTruths& truths,
                    const std::map<Unit, UnitResult>& units, const Part& part) {
  std::error_code ec;
  std::filesystem::create_directories(dir + "/input", ec);
  if (ec) return Status::Error("cannot create " + dir + "/input: " + ec.message());
  const std::string input = dir + "/input/" + std::filesystem::path(study.file).filename().string();
  const std::pair<std::string, std::string> files[] = {
      {input, study_text},
      {dir + "/study.json", StudyJson(study, cells, truths)},
      {dir + "/replicates.csv", ReplicatesCsv(units)},
      {dir + "/edges.csv", EdgesCsv(units)},
      {dir + "/null_tests.csv", NullTestsCsv(units)},
      {dir + "/summary.csv", SummaryCsv(study, cells, units)},
      {dir + "/comparisons.csv", ComparisonsCsv(study, cells, units)},
      {dir + "/calibration.csv", CalibrationCsv(cells, units)}};
  for (const auto& [path, content] : files) {
    Status s = WriteFileAtomically(path, content);
    if (!s.ok()) return s;
  }
  if (part.parts > 1) {
    Status s = WriteFileAtomically(dir + "/part.txt", part.Text() + "\n");
    if (!s.ok()) return s;
  }
  Status models = WriteTruthModels(dir, TruthModels(study, cells, truths));
  if (!models.ok()) return models;
  return WriteDrawings(dir, truths);
}

}  // namespace locind::app
