#include "app/running/runner_replicate.h"
#include "base/number_format.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <memory>
#include <sstream>
#include <variant>

#include "app/io/event_csv.h"
#include "app/running/external_learner.h"
#include "app/results/decision_rows.h"
#include "app/study/study_cost.h"
#include "app/study/test_choice.h"
#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_features.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/methods/learner_registry.h"
#include "learners/independence/oracle_test.h"
#include "metrics/error_attribution.h"
#include "metrics/pvalue_calibration.h"
#include "metrics/replicate_score.h"
#include "sim/diffusion_simulator.h"
#include "sim/hawkes_simulator.h"

namespace locind::app {
namespace {

using Clock = std::chrono::steady_clock;

double Since(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

// Forwards every query and adds up the time spent inside the test, so a
// learner's time splits into testing and the method's own work.
class TimedTest : public learners::IndependenceTest {
 public:
  explicit TimedTest(std::unique_ptr<learners::IndependenceTest> inner) : inner_(std::move(inner)) {}
  int processes() const override { return inner_->processes(); }
  const std::vector<std::string>& names() const override { return inner_->names(); }
  std::string kind() const override { return inner_->kind(); }
  learners::TestResult Run(const learners::TestQuery& query) override {
    const Clock::time_point start = Clock::now();
    learners::TestResult r = inner_->Run(query);
    seconds_ += Since(start);
    return r;
  }
  double seconds() const { return seconds_; }

 private:
  std::unique_ptr<learners::IndependenceTest> inner_;
  double seconds_ = 0;
};

// The simulated data of a replicate (one of the two is set) or the failure.
struct Simulated {
  std::unique_ptr<sim::EventData> events;
  std::unique_ptr<sim::PathData> paths;
  std::shared_ptr<learners::HawkesFeatures> features;
  double stationarity_value = NAN;
  double observed_points = 0;
  std::string failure;  // empty when the data is there
};

Simulated SimulateEvents(const StudySpec& study, const PreparedTruth& truth, const Cell& cell,
                         base::RandomStream& random) {
  Simulated s;
  Result<BuiltHawkes> built = BuildHawkes(study, truth, cell);
  if (!built.ok()) {
    s.failure = "model: " + built.status().message();
    return s;
  }
  s.stationarity_value = built->spectral_radius;
  sim::HawkesRunOptions run;
  run.horizon = cell.length;
  run.burn_in = study.event_process.burn_in;
  // The memory cap holds the whole replicate: shared among its trials.
  run.event_cap = std::max<int64_t>(1, EventCap(study, static_cast<int>(truth.truth.Observed().size())) / cell.trials);
  // Several trials (grid.trials): successive draws from this replicate's stream.
  Result<sim::EventData> data = sim::SimulateHawkesTrials(built->model, run, cell.trials, random);
  if (!data.ok()) {
    s.failure = "simulation: " + data.status().message();
    if (run.event_cap < study.event_process.event_cap) {
      s.failure += " (the cap comes from memory_mb: " + std::to_string(study.memory_mb) + ")";
    }
    return s;
  }
  s.events = std::make_unique<sim::EventData>(std::move(data.value()));
  s.observed_points = static_cast<double>(s.events->total_events());
  return s;
}

Simulated SimulatePaths(const StudySpec& study, const PreparedTruth& truth, const Cell& cell,
                        base::RandomStream& random) {
  Simulated s;
  Result<BuiltDiffusion> built = BuildDiffusion(study, truth, cell);
  if (!built.ok()) {
    s.failure = "model: " + built.status().message();
    return s;
  }
  s.stationarity_value = built->largest_real_part;
  const PathProcessSpec& p = study.path_process;
  sim::PathRunOptions run;
  run.horizon = cell.length;
  run.step = p.step;
  run.interval = p.interval;
  run.burn_in = p.burn_in;
  run.method = p.exact ? sim::PathMethod::kExact : sim::PathMethod::kEuler;
  // Path sizes are known in advance: refuse a draw memory_mb cannot hold
  // (locind run refuses such studies up front; locind plan may reach them).
  const double samples = PathPoints(study, cell, static_cast<int>(truth.truth.Observed().size()));
  if (samples * BytesPerSample() > static_cast<double>(study.memory_mb) * 1024 * 1024) {
    s.failure = "simulation: " + base::FormatNumber(samples) +
                " samples x processes need more than memory_mb: " + std::to_string(study.memory_mb);
    return s;
  }
  Result<sim::PathData> data = sim::SimulateDiffusionTrials(built->model, run, cell.trials, random);
  if (!data.ok()) {
    s.failure = "simulation: " + data.status().message();
    return s;
  }
  s.paths = std::make_unique<sim::PathData>(std::move(data.value()));
  s.observed_points = s.paths->samples();
  return s;
}

// The test a learner asks, or an error message.
// `draws_seed` keys the test's own Monte Carlo draws to this replicate.
std::variant<std::unique_ptr<learners::IndependenceTest>, std::string> MakeTest(
    const LearnerSpec& spec, const PreparedTruth& truth, Simulated& data, uint64_t draws_seed) {
  if (spec.test == "oracle") {
    Result<learners::OracleTest> oracle = learners::OracleTest::FromTruth(truth.truth);
    if (!oracle.ok()) return oracle.status().message();
    return std::make_unique<learners::OracleTest>(std::move(oracle.value()));
  }
  if (spec.test == "none") return std::unique_ptr<learners::IndependenceTest>();
  if (data.events) {
    if (!data.features) return std::string("features: not prepared");
    // Study files are validated, so the name is a known event test.
    std::unique_ptr<learners::IndependenceTest> test = MakeEventTest(spec.test, data.features, draws_seed);
    if (!test) return "test: unknown event test '" + spec.test + "'";
    return test;
  }
  Result<std::unique_ptr<learners::IndependenceTest>> made = MakePathTest(spec.test, *data.paths);
  if (!made.ok()) return "test: " + made.status().message();
  return std::move(made.value());
}

// The history features shared by every Hawkes test of the replicate,
// computed once with the data (their time counts as simulation).
void PrepareFeatures(const StudySpec& study, const std::vector<int>& chosen, Simulated& data) {
  bool needed = false;
  for (int i : chosen) {
    const std::string& test = study.learners[i].test;
    needed = needed || (test != "oracle" && test != "none");  // every event test reads the features
  }
  if (!needed || !data.events) return;
  auto made = learners::HawkesFeatures::Create(*data.events, learners::DefaultHawkesRates(*data.events));
  if (!made.ok()) {
    data.failure = "features: " + made.status().message();
    return;
  }
  data.features = std::make_shared<learners::HawkesFeatures>(std::move(made.value()));
  data.features->ComputeAll();
}

std::string NameList(const std::vector<int>& nodes, const std::vector<std::string>& names) {
  std::string out;
  for (size_t i = 0; i < nodes.size(); ++i) out += (i ? ";" : "") + names[nodes[i]];
  return out;
}

// The attributed error of an audited edge, or nullptr when it is neither a
// missed solid edge nor a false edge.
const metrics::AttributedEdge* AttributedOf(const metrics::ErrorAttribution& a,
                                            const graph::Edge& e) {
  for (const metrics::AttributedEdge& x : a.edges) {
    if (x.edge == e) return &x;
  }
  return nullptr;
}

std::string LearnerMark(const learners::LearnResult& r, const graph::Edge& e) {
  if (!r.has_marks) return "";
  for (size_t i = 0; i < r.edges.size(); ++i) {
    if (r.edges[i] == e) return r.dashed[i] ? "dashed" : "solid";
  }
  return "";
}

// One row per audited edge: the learner's decision record of the edge (its
// rule and the witness tests that caused it) and, for a missed solid or
// false edge, its attributed cause.
void AddEdgeLines(const ReplicateRow& row, const metrics::TruthClass& truth_class,
                  const learners::LearnResult& r, const metrics::ErrorAttribution& attribution,
                  std::vector<std::string>& lines) {
  const std::vector<std::string>& names = truth_class.projected.names();
  for (const metrics::EdgeAudit& a : metrics::AuditEdges(truth_class, r.graph)) {
    std::ostringstream o;
    o << row.cell << "," << row.replicate << "," << row.truth << "," << row.learner << ","
      << graph::EdgeText(truth_class.projected, a.edge) << ","
      << metrics::EdgeGroupName(metrics::GroupOf(a.edge)) << ","
      << metrics::TruthStatusName(a.truth) << "," << (a.reported ? "reported" : "not reported")
      << "," << (a.reported ? LearnerMark(r, a.edge) : "") << ","
      << EdgeDecisionFields(metrics::FindDecision(r, a.edge), names) << ","
      << EdgeAttributionFields(AttributedOf(attribution, a.edge), names);
    lines.push_back(o.str());
  }
}

// At most this many null-holding tests per replicate and learner go to
// null_tests.csv (evenly spaced over the learner's log), so a method that
// makes 10^5 tests does not swamp the file. Each line ends with
// all_parents_given (metrics::AllParentsGiven on the truth's projection):
// yes when the test's model can be right; then first_of_pair
// (metrics::FirstOfPair on the whole log): yes when no earlier answered test
// of the learner had the same target and sources, so the test was not asked
// because of an earlier rejection on the same data.
constexpr size_t kNullTestsPerLearner = 200;

void AddNullTestLines(const ReplicateRow& row, const metrics::TruthClass& truth_class,
                      const learners::LearnResult& r, std::vector<std::string>& lines) {
  if (r.test_kind == "oracle" || r.test_kind == "none") return;
  const std::vector<std::string>& names = truth_class.projected.names();
  const std::vector<bool> first_of_pair = metrics::FirstOfPair(r.log);
  for (const size_t i : metrics::NullHoldingTests(truth_class.projected, r.log, kNullTestsPerLearner)) {
    const learners::TestRecord& t = r.log[i];
    std::ostringstream o;
    o << row.cell << "," << row.replicate << "," << row.truth << "," << row.learner << "," << row.test
      << "," << Num(row.length) << "," << names[t.target] << "," << NameList(t.sources, names) << ","
      << NameList(t.given, names) << "," << Num(t.statistic) << "," << Num(t.df) << ","
      << Num(t.p_value) << ","
      << (metrics::AllParentsGiven(truth_class.projected, t.target, t.given) ? "yes" : "no") << ","
      << (first_of_pair[i] ? "yes" : "no");
    lines.push_back(o.str());
  }
}

// An external learner (app/running/external_learner.h): its seed is keyed
// like the data, with a purpose of its own.
std::unique_ptr<learners::Learner> MakeExternal(uint64_t seed, const LearnerSpec& spec,
                                                const PreparedTruth& truth, const Cell& cell,
                                                int replicate) {
  ExternalTask task;
  task.names = truth.truth_class->projected.names();
  task.seed = base::StreamSeed(
      {seed, cell.data_key, static_cast<uint64_t>(replicate), kPurposeExternal});
  task.folder_hint = spec.label + "-c" + std::to_string(cell.index) + "-r" + std::to_string(replicate);
  return std::make_unique<ExternalLearner>(spec, std::move(task));
}

// Runs one learner on the data and scores it; fills `row`, the edge lines
// and the null-test lines.
void RunLearner(uint64_t seed, const LearnerSpec& spec, const PreparedTruth& truth,
                const Cell& cell, Simulated& data, ReplicateRow& row, UnitResult& out) {
  const Clock::time_point start = Clock::now();
  const uint64_t draws_seed = base::StreamSeed(
      {seed, cell.data_key, static_cast<uint64_t>(row.replicate), kPurposeTestDraws});
  auto test = MakeTest(spec, truth, data, draws_seed);
  if (auto* message = std::get_if<std::string>(&test)) {
    row.ok = false;
    row.message = *message;
    return;
  }
  std::unique_ptr<TimedTest> timed;
  if (auto& inner = std::get<0>(test)) timed = std::make_unique<TimedTest>(std::move(inner));
  learners::MethodSettings settings;
  settings.screening_size = spec.screening_size;
  settings.penalty = spec.penalty;
  std::unique_ptr<learners::Learner> method;
  if (spec.IsExternal()) {
    method = MakeExternal(seed, spec, truth, cell, row.replicate);
  } else {
    method = learners::FindMethod(spec.method)->make(settings);
  }
  Result<learners::LearnResult> result = method->Learn(
      learners::LearnInput{timed.get(), cell.level, data.events.get(), data.paths.get()});
  row.timing_learn_seconds = Since(start);
  row.timing_test_seconds = timed ? timed->seconds() : 0;
  if (!result.ok()) {
    row.ok = false;
    row.message = "learner: " + result.status().message();
    return;
  }
  row.tests = result->tests;
  row.not_estimable = result->not_estimable;
  row.largest_given = result->largest_given;
  const Clock::time_point scoring = Clock::now();
  const metrics::TruthClass& truth_class = *truth.truth_class;
  row.score = result->has_marks
                  ? metrics::ScoreGraph(truth_class, result->graph, learners::DashedEdges(*result))
                  : metrics::ScoreGraph(truth_class, result->graph);
  const metrics::ErrorAttribution attribution = metrics::AttributeErrors(truth_class, *result);
  row.attribution = attribution;
  row.attribution.edges.clear();  // counts only travel with the row
  AddEdgeLines(row, truth_class, *result, attribution, out.edge_lines);
  AddNullTestLines(row, truth_class, *result, out.null_test_lines);
  row.timing_score_seconds = Since(scoring);
}

}  // namespace

UnitResult RunUnit(const StudySpec& study, const Cell& cell, const StudyTruths& truths,
                   int replicate, const std::vector<int>& learner_indices) {
  UnitResult out;
  out.unit = Unit{cell.index, replicate};
  const PreparedTruth& truth = truths.Get(cell.hidden_factor, TruthIndexOf(study, replicate));
  ReplicateRow base;
  base.cell = cell.index;
  base.replicate = replicate;
  base.truth = truth.label;
  base.length = cell.length;
  base.level = cell.level;
  base.hidden_count = cell.hidden_count;
  base.trials = cell.trials;
  base.stationarity_target = cell.stationarity;

  std::vector<int> chosen = learner_indices;
  if (chosen.empty()) {
    for (size_t i = 0; i < study.learners.size(); ++i) chosen.push_back(static_cast<int>(i));
  }
  std::string failure;
  Simulated data;
  if (!truth.truth_class.ok()) {
    failure = "truth class: " + truth.truth_class.status().message();
  } else {
    const Clock::time_point start = Clock::now();
    base::RandomStream random(base::StreamKey{study.seed, cell.data_key, static_cast<uint64_t>(replicate),
                                                kPurposeData});
    data = study.events ? SimulateEvents(study, truth, cell, random)
                        : SimulatePaths(study, truth, cell, random);
    if (data.failure.empty()) PrepareFeatures(study, chosen, data);
    failure = data.failure;
    base.timing_simulate_seconds = Since(start);
    base.stationarity_value = data.stationarity_value;
    base.observed_points = data.observed_points;
  }
  for (int i : chosen) {
    const LearnerSpec& spec = study.learners[i];
    ReplicateRow row = base;
    row.learner = spec.label;
    row.method = spec.method;
    row.test = spec.test;
    if (!failure.empty()) {
      row.ok = false;
      row.message = failure;
    } else {
      RunLearner(study.seed, spec, truth, cell, data, row, out);
    }
    if (!row.ok) {
      row.score.power = NAN;
      row.score.false_edge_rate = NAN;
    }
    out.rows.push_back(std::move(row));
  }
  return out;
}

}  // namespace locind::app
