#include "app/report/report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <map>
#include <set>
#include <sstream>
#include <tuple>

#include "app/io/atomic_file.h"
#include "app/report/lost_edges_figure.h"
#include "app/report/report_drawings.h"
#include "app/report/report_figures.h"
#include "app/results/results_calibration.h"
#include "app/results/results_rows.h"
#include "app/study/test_choice.h"
#include "app/io/svg_render.h"

namespace locind::app {
namespace {

constexpr size_t kTruthsDrawn = 3;
constexpr int kReplicatesDrawn = 2;
constexpr double kCalibrationLevel = 0.05;

std::string RangeText(const ValueRange& r) {
  return r.IsFixed() ? Num(r.low) : "uniform on [" + Num(r.low) + ", " + Num(r.high) + "] per truth";
}

std::string JoinNumbers(const std::vector<double>& values) {
  std::string out;
  for (double v : values) out += (out.empty() ? "" : ", ") + Num(v);
  return out;
}

std::string TruthText(const StudySpec& study) {
  const TruthSpec& t = study.truth;
  if (!t.random) {
    const graph::TruthGraph& g = t.explicit_graph;
    std::string hidden;
    for (int v : g.hidden) hidden += (hidden.empty() ? "" : ", ") + g.graph.name(v);
    return "one explicit graph: " + std::to_string(g.graph.size()) + " processes" +
           (hidden.empty() ? ", none hidden" : ", hidden: " + hidden) + "; " + std::to_string(t.truths) +
           " parameter draw(s)";
  }
  const graph::RandomGraphOptions& r = t.random_graph;
  std::string text = std::to_string(t.truths) + " random graph(s) on " + std::to_string(r.nodes) + " processes, ";
  text += r.expected_in_degree >= 0 ? "expected in-degree " + Num(r.expected_in_degree)
                                    : "edge probability " + Num(r.edge_probability);
  text += r.loops == graph::LoopPolicy::kAll ? ", every loop" : r.loops == graph::LoopPolicy::kNone ? ", no loops"
                                                                : ", loops with probability " + Num(r.loop_probability);
  return text + ", " + std::to_string(r.hidden_count) + " hidden";
}

std::string ProcessText(const StudySpec& study) {
  if (study.events) {
    const EventProcessSpec& e = study.event_process;
    return "Hawkes event streams, exponential kernels; baseline " + RangeText(e.baseline) + ", weight " +
           RangeText(e.weight) + ", loop weight " + RangeText(e.loop_weight) + ", decay " + RangeText(e.decay) +
           (e.spectral_radius ? ", rescaled to spectral radius " + Num(*e.spectral_radius) : "") +
           ", burn-in " + Num(e.burn_in);
  }
  const PathProcessSpec& p = study.path_process;
  return std::string(p.tanh ? "tanh" : "linear") + " diffusion paths; self rate " + RangeText(p.self_rate) +
         ", coupling " + RangeText(p.coupling) + ", noise " + Num(p.noise) + ", step " + Num(p.step) +
         ", observed every " + Num(p.interval) + (p.exact ? ", exact transitions" : ", Euler-Maruyama") +
         (p.drift_bound ? ", rescaled to drift bound " + Num(*p.drift_bound) : "");
}

std::vector<std::pair<std::string, std::string>> StudyRows(const StudySpec& study) {
  std::vector<std::pair<std::string, std::string>> rows = {
      {"study", study.name},
      {"file", std::filesystem::path(study.file).filename().string()},
      {"seed", std::to_string(study.seed)},
      {"truths", TruthText(study)},
      {"process", ProcessText(study)},
      {"observation lengths", JoinNumbers(study.grid.lengths)},
      {"levels", JoinNumbers(study.grid.levels)},
      {"replicates per cell", std::to_string(study.grid.replicates)}};
  if (!study.grid.hidden_counts.empty()) {
    std::vector<double> h(study.grid.hidden_counts.begin(), study.grid.hidden_counts.end());
    rows.push_back({"hidden counts", JoinNumbers(h)});
  }
  if (!study.grid.stationarity.empty()) rows.push_back({"stationarity targets", JoinNumbers(study.grid.stationarity)});
  if (!study.grid.trials.empty()) {
    rows.push_back({"trials per replicate", JoinNumbers(std::vector<double>(study.grid.trials.begin(), study.grid.trials.end())) +
                                                " (each of the observation length)"});
  }
  std::string learners;
  for (const LearnerSpec& l : study.learners) learners += (learners.empty() ? "" : "; ") + l.label;
  rows.push_back({"learners", learners});
  return rows;
}

// The other grid factors of a summary line: one set of curves per value.
// level, hidden count, target (NaN: none), trials (0: the same in every cell)
using GroupKey = std::tuple<double, int, double, int>;

// True when the cells differ in their number of trials (grid.trials).
bool TrialsVary(const ReportData& data) {
  return std::any_of(data.summary.begin(), data.summary.end(),
                     [&data](const SummaryLine& s) { return s.trials != data.summary.front().trials; });
}

GroupKey GroupOf(const SummaryLine& s, bool trials_vary) {
  return {s.level, s.hidden_count, s.stationarity_target.value_or(NAN), trials_vary ? s.trials : 0};
}

std::string GroupText(const GroupKey& g) {
  std::string text = "level " + Num(std::get<0>(g)) + ", " + std::to_string(std::get<1>(g)) + " hidden";
  if (!std::isnan(std::get<2>(g))) text += ", stationarity target " + Num(std::get<2>(g));
  if (std::get<3>(g) > 0) text += ", " + std::to_string(std::get<3>(g)) + (std::get<3>(g) == 1 ? " trial" : " trials");
  return text;
}

int StyleOf(const StudySpec& study, const std::string& learner) {
  for (size_t i = 0; i < study.learners.size(); ++i) {
    if (study.learners[i].label == learner) return static_cast<int>(i);
  }
  return static_cast<int>(study.learners.size());
}

// Summary lines grouped by the other factors, in order of first appearance.
std::vector<std::pair<GroupKey, std::vector<const SummaryLine*>>> Groups(const ReportData& data) {
  std::vector<std::pair<GroupKey, std::vector<const SummaryLine*>>> groups;
  const bool vary = TrialsVary(data);
  for (const SummaryLine& s : data.summary) {
    const GroupKey key = GroupOf(s, vary);
    auto it = std::find_if(groups.begin(), groups.end(), [&key](const auto& g) {
      return std::get<0>(g.first) == std::get<0>(key) && std::get<1>(g.first) == std::get<1>(key) &&
             (std::get<2>(g.first) == std::get<2>(key) || (std::isnan(std::get<2>(g.first)) && std::isnan(std::get<2>(key)))) &&
             std::get<3>(g.first) == std::get<3>(key);
    });
    if (it == groups.end()) {
      groups.push_back({key, {}});
      it = groups.end() - 1;
    }
    it->second.push_back(&s);
  }
  return groups;
}

// A plan belongs on the panel of its own combination only.
bool PlanFitsGroup(const PlanLine& p, const GroupKey& g) {
  // A plan of the number of trials is drawn on the trials panels only.
  if (p.searched != "length") return false;
  if (p.trials && std::get<3>(g) > 0 && *p.trials != std::get<3>(g)) return false;
  const double target = std::get<2>(g);
  return p.Fits(std::get<0>(g), std::get<1>(g), std::isnan(target) ? std::nullopt : std::optional<double>(target));
}

using Pick = metrics::Interval SummaryLine::*;

std::vector<PlotSeries> SeriesOf(const StudySpec& study, const std::vector<const SummaryLine*>& lines, Pick pick) {
  std::vector<PlotSeries> series;
  for (const LearnerSpec& l : study.learners) {
    PlotSeries s;
    s.label = l.label;
    s.style = StyleOf(study, l.label);
    for (const SummaryLine* line : lines) {
      const metrics::Interval& v = line->*pick;
      if (line->learner != l.label || std::isnan(v.estimate)) continue;
      s.points.push_back({line->length, v.estimate, v.low, v.high});
    }
    std::sort(s.points.begin(), s.points.end(), [](const PlotPoint& a, const PlotPoint& b) { return a.x < b.x; });
    series.push_back(std::move(s));
  }
  return series;
}

ReportFigure PlotFigure(const std::string& id, const std::string& title, const std::string& caption,
                        const LinePlot& plot) {
  return {id, title, caption, Renderer::kGnuplot, LinePlotScript(plot), ""};
}

// Design-aware scoring block: power ceilings and one power panel per edge group.

// Each learner's power ceiling where it is below 1 (the first defined value
// over the lengths: it depends on the truths only).
std::vector<std::pair<int, double>> Ceilings(const StudySpec& study, const std::vector<const SummaryLine*>& lines) {
  std::vector<std::pair<int, double>> out;
  for (const LearnerSpec& l : study.learners) {
    for (const SummaryLine* line : lines) {
      if (line->learner != l.label || std::isnan(line->power_ceiling)) continue;
      if (line->power_ceiling < 1) out.push_back({StyleOf(study, l.label), line->power_ceiling});
      break;
    }
  }
  return out;
}

std::vector<PlotSeries> GroupSeries(const StudySpec& study, const std::vector<const SummaryLine*>& lines, int g) {
  std::vector<PlotSeries> series;
  for (const LearnerSpec& l : study.learners) {
    PlotSeries s{l.label, StyleOf(study, l.label), {}};
    for (const SummaryLine* line : lines) {
      const metrics::Interval& v = line->group_power[g];
      if (line->learner != l.label || !line->reports[g] || std::isnan(v.estimate)) continue;
      s.points.push_back({line->length, v.estimate, v.low, v.high});
    }
    std::sort(s.points.begin(), s.points.end(), [](const PlotPoint& a, const PlotPoint& b) { return a.x < b.x; });
    series.push_back(std::move(s));
  }
  return series;
}

// Solid edges of the group summed over the lines of one learner (the first
// learner's count: every learner sees the same truths).
int GroupSolid(const std::vector<const SummaryLine*>& lines, int g) {
  int solid = 0;
  for (const SummaryLine* line : lines) solid = std::max(solid, line->group_solid[g]);
  return solid;
}

void AddGroupFigures(const StudySpec& study, const GroupKey& group, const std::vector<const SummaryLine*>& lines,
                     const std::string& suffix, ReportSection& section) {
  for (int g = 0; g < metrics::kEdgeGroups; ++g) {
    if (GroupSolid(lines, g) == 0) continue;  // no solid edge of this group: power undefined
    const std::string name = metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(g));
    LinePlot plot;
    plot.title = "Power, " + name + " edges, " + GroupText(group);
    plot.y_label = "power (solid " + name + " edges found)";
    plot.unit_range = true;
    plot.series = GroupSeries(study, lines, g);
    std::string cannot;
    for (const LearnerSpec& l : study.learners) {
      auto it = std::find_if(lines.begin(), lines.end(), [&l](const SummaryLine* x) { return x->learner == l.label; });
      if (it == lines.end() || (*it)->reports[g]) continue;
      plot.ceilings.push_back({StyleOf(study, l.label), 0.0});
      cannot += (cannot.empty() ? "" : ", ") + l.label;
    }
    section.figures.push_back(PlotFigure(
        "power-" + name + suffix, "Power on " + name + " edges (" + GroupText(group) + ")",
        "Share of the solid " + name + " edges of N that were reported, pooled over replicates; bands are 95% "
        "cluster-bootstrap intervals." +
            (cannot.empty() ? std::string()
                            : " Cannot report " + name + " edges at all (dash-dot line at 0, no curve): " +
                                  cannot + "."),
        plot));
  }
}

void AddRateFigures(const StudySpec& study, const ReportData& data, const GroupKey& group,
                    const std::vector<const SummaryLine*>& lines, const std::string& suffix,
                    ReportSection& section) {
  LinePlot power;
  power.title = "Power, " + GroupText(group);
  power.y_label = "power (solid edges of N found)";
  power.unit_range = true;
  power.series = SeriesOf(study, lines, &SummaryLine::power);
  power.ceilings = Ceilings(study, lines);
  LinePlot false_edges = power;
  false_edges.ceilings.clear();
  false_edges.title = "False-edge rate, " + GroupText(group);
  false_edges.y_label = "false-edge rate (reported edges not in N)";
  false_edges.series = SeriesOf(study, lines, &SummaryLine::false_edge_rate);
  if (!data.plan.empty()) {
    power.target = data.plan.front().target_power;
    power.target_label = "target " + Num(*power.target);
    false_edges.target = data.plan.front().target_false_edge_rate;
    false_edges.target_label = "limit " + Num(*false_edges.target);
    for (const PlanLine& p : data.plan) {
      if (p.reached && PlanFitsGroup(p, group)) power.marks.push_back({StyleOf(study, p.learner), p.length});
    }
    false_edges.marks = power.marks;
  }
  const std::string plan_note = data.plan.empty() ? "" : " Grey dashed: the target of locind plan; dotted "
                                                         "verticals: each learner's planned length for "
                                                         "this panel's combination (none: not planned).";
  section.figures.push_back(PlotFigure(
      "power" + suffix, "Power against observation length (" + GroupText(group) + ")",
      "Share of the solid edges of the maximal graph N that were reported, pooled over replicates and "
      "edge groups; bands are 95% cluster-bootstrap intervals (truths, then replicates within truths). "
      "Dash-dot lines: a method's ceiling, the share of solid edges in the groups it can report at all "
      "(drawn when below 1)." + plan_note, power));
  section.figures.push_back(PlotFigure(
      "false-edges" + suffix, "False-edge rate against observation length (" + GroupText(group) + ")",
      "Share of reported edges that are not in N (no graph equivalent to the truth has them); bands are "
      "95% cluster-bootstrap intervals. Undefined where nothing was reported." + plan_note, false_edges));
  AddGroupFigures(study, group, lines, suffix, section);
}

// ---- Number of trials (grid.trials): power and false edges against it ----

// Lines of one panel: the same level, hidden count, target and trial length.
using TrialPanelKey = std::tuple<double, int, double, double>;

std::vector<std::pair<TrialPanelKey, std::vector<const SummaryLine*>>> TrialPanels(const ReportData& data) {
  std::vector<std::pair<TrialPanelKey, std::vector<const SummaryLine*>>> panels;
  for (const SummaryLine& s : data.summary) {
    const TrialPanelKey key{s.level, s.hidden_count, s.stationarity_target.value_or(NAN), s.length};
    auto same = [&key](const auto& p) {
      const TrialPanelKey& k = p.first;
      return std::get<0>(k) == std::get<0>(key) && std::get<1>(k) == std::get<1>(key) &&
             (std::get<2>(k) == std::get<2>(key) || (std::isnan(std::get<2>(k)) && std::isnan(std::get<2>(key)))) &&
             std::get<3>(k) == std::get<3>(key);
    };
    auto it = std::find_if(panels.begin(), panels.end(), same);
    if (it == panels.end()) it = panels.insert(panels.end(), {key, {}});
    it->second.push_back(&s);
  }
  return panels;
}

std::vector<PlotSeries> TrialSeries(const StudySpec& study, const std::vector<const SummaryLine*>& lines, Pick pick) {
  std::vector<PlotSeries> series = SeriesOf(study, lines, pick);
  for (PlotSeries& s : series) {
    s.points.clear();
    for (const SummaryLine* line : lines) {
      const metrics::Interval& v = line->*pick;
      if (line->learner != s.label || std::isnan(v.estimate)) continue;
      s.points.push_back({double(line->trials), v.estimate, v.low, v.high});
    }
    std::sort(s.points.begin(), s.points.end(), [](const PlotPoint& a, const PlotPoint& b) { return a.x < b.x; });
  }
  return series;
}

void AddTrialFigures(const StudySpec& study, const ReportData& data, ReportSection& section) {
  const auto panels = TrialPanels(data);
  for (size_t i = 0; i < panels.size(); ++i) {
    const auto& [key, lines] = panels[i];
    const GroupKey group{std::get<0>(key), std::get<1>(key), std::get<2>(key), 0};
    const std::string where = GroupText(group) + ", trials of length " + Num(std::get<3>(key));
    const std::string suffix = panels.size() > 1 ? "-t" + std::to_string(i + 1) : "";
    LinePlot power;
    power.title = "Power, " + where;
    power.x_label = "number of trials";
    power.y_label = "power (solid edges of N found)";
    power.unit_range = true;
    power.series = TrialSeries(study, lines, &SummaryLine::power);
    LinePlot false_edges = power;
    false_edges.title = "False-edge rate, " + where;
    false_edges.y_label = "false-edge rate (reported edges not in N)";
    false_edges.series = TrialSeries(study, lines, &SummaryLine::false_edge_rate);
    for (const PlanLine& p : data.plan) {
      if (p.searched != "trials" || !p.reached) continue;
      const GroupKey plain{std::get<0>(key), std::get<1>(key), std::get<2>(key), 0};
      PlanLine as_length = p;
      as_length.searched = "length";
      if (PlanFitsGroup(as_length, plain)) power.marks.push_back({StyleOf(study, p.learner), p.length});
    }
    false_edges.marks = power.marks;
    const std::string note = power.marks.empty() ? "" : " Dotted verticals: each learner's planned number of trials.";
    section.figures.push_back(PlotFigure(
        "power-trials" + suffix, "Power against number of trials (" + where + ")",
        "The same cells as above, against the number of independent trials each replicate recorded; bands "
        "are 95% cluster-bootstrap intervals." + note, power));
    section.figures.push_back(PlotFigure(
        "false-edges-trials" + suffix, "False-edge rate against number of trials (" + where + ")",
        "Share of reported edges that are not in N, against the number of trials; bands are 95% "
        "cluster-bootstrap intervals." + note, false_edges));
  }
}

// ---- end number of trials ----

void AddCostFigures(const StudySpec& study, const GroupKey& group, const std::vector<const SummaryLine*>& lines,
                    const std::string& suffix, ReportSection& section) {
  LinePlot tests;
  tests.title = "Tests made, " + GroupText(group);
  tests.y_label = "independence tests per replicate";
  tests.log_y = true;
  tests.series = SeriesOf(study, lines, &SummaryLine::tests);
  LinePlot seconds = tests;
  seconds.title = "Learner time, " + GroupText(group);
  seconds.y_label = "seconds per replicate (tests included)";
  seconds.series = SeriesOf(study, lines, &SummaryLine::seconds);
  section.figures.push_back(PlotFigure(
      "tests" + suffix, "Tests made (" + GroupText(group) + ")",
      "Mean number of independence tests per replicate, log scale, with percentile-bootstrap 95% "
      "intervals; methods that make no tests are left out.", tests));
  section.figures.push_back(PlotFigure(
      "seconds" + suffix, "Learner time (" + GroupText(group) + ")",
      "Mean wall-clock seconds of each learner per replicate, log scale, with percentile-bootstrap 95% "
      "intervals. Times depend on the machine and its load; compare learners within one run.", seconds));
}

// How many truths stand behind the intervals, and what that means.
std::string TruthsNote(const ReportData& data) {
  int fewest = 0, most = 0;
  for (const SummaryLine& s : data.summary) {
    if (s.truths == 0) continue;
    fewest = fewest == 0 ? s.truths : std::min(fewest, s.truths);
    most = std::max(most, s.truths);
  }
  if (most == 0) return "";
  const std::string count = fewest == most ? std::to_string(most) : std::to_string(fewest) + " to " + std::to_string(most);
  std::string note = " Intervals resample truths, then replicates within truths; " + count +
                     " truth(s) stand behind each.";
  if (fewest < 5) {
    note += " With fewer than 5 truths the intervals show little of the variation between truths: read them "
            "as conditional on the truths drawn (a zero-width interval means every replicate gave that value).";
  }
  return note;
}

// File-name-safe form of a label.
std::string Slug(const std::string& text) {
  std::string out;
  for (char c : text) out += std::isalnum(static_cast<unsigned char>(c)) || c == '.' ? c : '-';
  return out;
}

// --- Where edges are lost: stacked bars of the causes per learner ----------

void AddLostFigures(const StudySpec& study, const ReportData& data, const GroupKey& group,
                    const std::vector<const SummaryLine*>& lines, const std::string& suffix,
                    ReportSection& section) {
  for (const LearnerSpec& l : study.learners) {
    const bool any = std::any_of(lines.begin(), lines.end(), [&l](const SummaryLine* x) {
      return x->learner == l.label && x->has_attribution;
    });
    if (!any) continue;
    const StackedBarPlot plot =
        LostEdgesPlot(l.label, "Where edges are lost: " + l.label + ", " + GroupText(group), lines, data.edges);
    section.figures.push_back({"lost-" + Slug(l.label) + suffix,
                               "Where edges are lost: " + l.label + " (" + GroupText(group) + ")",
                               "Per length, left: the solid edges of N the learner missed; right: its false "
                               "edges; both per replicate that ran, each split by its one cause as in "
                               "summary.csv. Propagated: removed (or kept) because of a wrong answer about "
                               "another pair, split by the rule that removed the edge (edges.csv "
                               "decision_rule). Method's reach: no test was wrong (edges the method never "
                               "reports, or its own rule).",
                               Renderer::kGnuplot, StackedBarScript(plot), ""});
  }
}

// --- Calibration: QQ plots split by all_parents_given, rejection table ------

std::string TagText(bool all_parents_given) {
  return all_parents_given ? "all parents given" : "a parent omitted or hidden";
}

// The level the QQ captions count rejections at: the study's level when it
// has one, else 0.05 (the table has every level).
double QqLevel(const StudySpec& study) {
  return study.grid.levels.size() == 1 ? study.grid.levels.front() : kCalibrationLevel;
}

void AddQqFigures(const StudySpec& study, const ReportData& data, ReportSection& section) {
  // (test, length, tag) -> p-values, each distinct (cell, replicate, query) once,
  // first tests of a pair only (DistinctNullTests).
  std::map<std::tuple<std::string, double, bool>, std::vector<double>> pooled;
  for (const NullTestLine* n : DistinctNullTests(data.null_tests)) {
    pooled[{n->test, n->length, !n->all_parents_given}].push_back(n->p_value);
  }
  const double level = QqLevel(study);
  for (const auto& [key, p_values] : pooled) {
    const auto& [test, length, missing] = key;
    QqPlot plot;
    plot.title = test + ", length " + Num(length) + (missing ? ", parent missing" : ", parents given");
    plot.points = metrics::UniformQq(p_values);
    plot.level = level;
    plot.share_at_level = metrics::ShareAtOrBelow(p_values, level);
    section.figures.push_back(
        {"qq-" + Slug(test) + "-" + Slug(Num(length)) + (missing ? "-parent-missing" : "-parents-given"),
         "P-values under true nulls: " + test + " at length " + Num(length) + ", " + TagText(!missing),
         std::to_string(p_values.size()) + " tests; " + Num(std::round(plot.share_at_level * 1000) / 10) +
             "% had p <= " + Num(level) + " (a calibrated test: about " + Num(level * 100) + "%).",
         Renderer::kGnuplot, QqPlotScript(plot), ""});
  }
}

std::string Fixed3(double value) {
  if (std::isnan(value)) return "-";
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.3f", value);
  return buffer;
}

ReportTable CalibrationTableOf(const std::vector<CalibrationRow>& rows) {
  ReportTable table;
  table.id = "calibration-table";
  table.caption = "Rejections among true-null tests at the level of their cell (each learner's first test of "
                  "a target and sources; follow-ups asked after a rejection left out), with exact "
                  "(Clopper-Pearson) 95% intervals; as in calibration.csv. Rows whose interval lies entirely above the level "
                  "are marked.";
  table.columns = {"test", "length", "level", "all_parents_given", "tests", "rejected", "rejected_share",
                   "rejected_share_low", "rejected_share_high"};
  table.header = {"test", "length", "level", "all parents given", "true-null tests", "rejected", "share",
                  "95% low", "95% high"};
  for (const CalibrationRow& r : rows) {
    const std::string tag = r.all_parents_given ? "yes" : "no";
    table.rows.push_back({r.test + "|" + Num(r.length) + "|" + Num(r.level) + "|" + tag, r.AboveLevel(),
                          {r.test, Num(r.length), Num(r.level), tag, std::to_string(r.tests),
                           std::to_string(r.rejected), Fixed3(r.share.estimate), Fixed3(r.share.low),
                           Fixed3(r.share.high)}});
  }
  return table;
}

ReportSection CalibrationSection(const StudySpec& study, const std::vector<Cell>& cells,
                                 const ReportData& data, std::vector<std::string>& warnings) {
  ReportSection section{"calibration", "Calibration of the tests",
                        "Each plot pools the p-values of the tests whose null hypothesis holds in the truth "
                        "(b mu-separated from A given C in the latent projection), one per distinct query and "
                        "replicate, over all learners using that test at that length. The plots are split by "
                        "whether the test's model can be right: 'all parents given' when C holds every parent "
                        "of b in the projection (b itself when b has a loop) and b has no bidirected edge (a "
                        "hidden process driving b and another process); otherwise a parent is omitted or "
                        "hidden and the test may reject more often than its level. A calibrated test keeps its "
                        "points inside the grey "
                        "band around the diagonal; points below it mean too many rejections (false edges), "
                        "points above it a conservative test (lost power).",
                        {}};
  const std::vector<CalibrationRow> rows = CalibrationTable(data.null_tests, cells);
  if (rows.empty()) {
    section.intro = "No learner of this study made a statistical test whose null holds in the truth (the "
                    "oracle and penalized-fit make none), so there is nothing to calibrate.";
    return section;
  }
  section.tables.push_back(CalibrationTableOf(rows));
  for (const CalibrationRow& r : rows) {
    if (r.AboveLevel()) warnings.push_back("Too many rejections under true nulls: " + CalibrationWarning(r) + ".");
  }
  AddQqFigures(study, data, section);
  return section;
}

ReportFigure GraphFigure(const std::string& id, const std::string& title, const std::string& caption,
                         const std::string& dot) {
  return {id, title, caption, Renderer::kGraphviz, dot, ""};
}

void AddTruthDrawings(const StudyTruths& truths, ReportSection& section) {
  size_t drawn = 0;
  for (const auto& [id, t] : truths.all()) {
    if (drawn++ == kTruthsDrawn) break;
    section.figures.push_back(GraphFigure("truth-" + Slug(t.label), "Truth " + t.label,
                                          "The simulated graph; hidden processes are grey dashed boxes.",
                                          TruthDot(t)));
    if (!t.truth_class.ok()) continue;
    section.figures.push_back(GraphFigure(
        "projection-" + Slug(t.label), "Latent projection of " + t.label,
        "What the observed processes can show of the truth: the hidden processes projected out "
        "(blue two-headed edges: a hidden common driver).", ProjectionDot(t)));
    section.figures.push_back(GraphFigure(
        "class-" + Slug(t.label), "Equivalence graph of " + t.label,
        "The maximal graph N of the class: solid edges are in every graph with the same separations "
        "(a learner should find them), dashed edges in some only (undetermined; never scored).", ClassDot(t)));
  }
}

// The longest length of the first group, and the cell there.
const Cell* DrawnCell(const std::vector<Cell>& cells, const ReportData& data) {
  if (data.summary.empty()) return nullptr;
  const GroupKey first = GroupOf(data.summary.front(), false);
  const Cell* best = nullptr;
  for (const SummaryLine& s : data.summary) {
    const GroupKey g = GroupOf(s, false);
    if (std::get<0>(g) != std::get<0>(first) || std::get<1>(g) != std::get<1>(first)) continue;
    if (s.cell < 0 || s.cell >= static_cast<int>(cells.size())) continue;
    if (best == nullptr || cells[s.cell].length > best->length) best = &cells[s.cell];
  }
  return best;
}

void AddLearnedDrawings(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths,
                        const ReportData& data, ReportSection& section) {
  const Cell* cell = DrawnCell(cells, data);
  if (cell == nullptr) return;
  for (int r = 0; r < std::min(kReplicatesDrawn, study.grid.replicates); ++r) {
    const PreparedTruth& truth = truths.Get(cell->hidden_factor, TruthIndexOf(study, r));
    if (!truth.truth_class.ok()) continue;
    for (const LearnerSpec& l : study.learners) {
      std::vector<EdgeLine> rows;
      for (const EdgeLine& e : data.edges) {
        if (e.cell == cell->index && e.replicate == r && e.learner == l.label) rows.push_back(e);
      }
      if (rows.empty()) continue;  // the replicate failed, or has no share in this folder
      const std::string title = l.label + ", replicate " + std::to_string(r) + " (" + truth.label +
                                ", length " + Num(cell->length) + ")";
      section.figures.push_back(GraphFigure(
          "learned-" + std::to_string(cell->index) + "-" + std::to_string(r) + "-" + Slug(l.label), title,
          "Reported edges as the method drew them; vermillion thick: false edges (not in N); orange "
          "dotted thick: solid edges of N the learner missed.",
          LearnedDot(*truth.truth_class, rows, title)));
    }
  }
}

Status RenderFigure(ReportFigure& f) {
  Result<std::string> svg =
      f.renderer == Renderer::kGnuplot ? RenderGnuplot(f.source) : RenderSvg(f.source);
  if (!svg.ok()) return Status::Error("figure " + f.id + ": " + svg.status().message());
  f.svg = std::move(svg.value());
  return Status::Ok();
}

}  // namespace

// " Tests in this study: NAME (what it assumes); ..." for the distinct tests
// of the study's learners ("" when none uses a test).
static std::string TestsAssumed(const StudySpec& study) {
  std::vector<std::string> seen;
  std::string out;
  for (const LearnerSpec& l : study.learners) {
    const std::string text = TestAssumptions(l.test);
    if (text.empty() || std::find(seen.begin(), seen.end(), l.test) != seen.end()) continue;
    seen.push_back(l.test);
    out += (out.empty() ? " Tests in this study: " : "; ") + l.test + " (" + text + ")";
  }
  return out.empty() ? out : out + ". Calibration of each: docs/tests.md.";
}

const std::string& ReportCaution() {
  static const std::string text =
      "Read the learned graphs as statistical hypotheses, not as proven mechanisms. Each rests on "
      "assumptions: the model class of the test (for example a linear Hawkes intensity with exponential "
      "kernels, or a linear drift), faithfulness (every separation in the data comes from the graph), "
      "stationarity over the observation window, and the chosen level. The rates in this report describe "
      "the simulated truths and processes of this study only. Do not use a learned graph as evidence for "
      "decisions about people, patients or safety-critical systems.";
  return text;
}

ReportPage BuildReportPage(const StudySpec& study, const std::vector<Cell>& cells,
                           const StudyTruths& truths, const ReportData& data) {
  ReportPage page;
  page.title = "Study report: " + study.name;
  page.study = StudyRows(study);
  page.caution = ReportCaution() + TestsAssumed(study);
  page.summary = data.summary;
  page.comparisons = data.comparisons;
  ReportSection rates{"rates", "Power and false edges", "Scored against the maximal graph N of each truth's "
                      "class: a learner can at best report N." + TruthsNote(data), {}};
  ReportSection cost{"cost", "Tests made and time", "", {}};
  ReportSection lost{"lost", "Where edges are lost",
                     "Each missed solid edge and each false edge has exactly one cause, judged against the "
                     "truth (results/README.md, \"Why edges were lost\"): the edge's own test was wrong, "
                     "a wrong answer about another pair propagated through a rule of the method, a test "
                     "could not be computed, or no test was wrong (the method's reach).", {}};
  const auto groups = Groups(data);
  for (size_t g = 0; g < groups.size(); ++g) {
    const std::string suffix = groups.size() > 1 ? "-g" + std::to_string(g + 1) : "";
    AddRateFigures(study, data, groups[g].first, groups[g].second, suffix, rates);
    AddLostFigures(study, data, groups[g].first, groups[g].second, suffix, lost);
    AddCostFigures(study, groups[g].first, groups[g].second, suffix, cost);
  }
  if (TrialsVary(data)) AddTrialFigures(study, data, rates);
  ReportSection drawings{"graphs", "Graphs", "", {}};
  AddTruthDrawings(truths, drawings);
  ReportSection learned{"learned", "Learned graphs", "", {}};
  AddLearnedDrawings(study, cells, truths, data, learned);
  page.sections = {rates, cost, CalibrationSection(study, cells, data, page.warnings), drawings, learned};
  if (!lost.figures.empty()) page.sections.insert(page.sections.begin() + 1, lost);
  return page;
}

Result<int> WriteReport(const std::string& dir, const StudySpec& study, const std::vector<Cell>& cells,
                        const StudyTruths& truths, const ReportData& data) {
  ReportPage page = BuildReportPage(study, cells, truths, data);
  std::error_code ec;
  std::filesystem::create_directories(dir + "/figures", ec);
  if (ec) return Status::Error("cannot create " + dir + "/figures: " + ec.message());
  int figures = 0;
  for (ReportSection& section : page.sections) {
    for (ReportFigure& f : section.figures) {
      Status s = RenderFigure(f);
      if (s.ok()) s = WriteFileAtomically(dir + "/figures/" + f.id + ".svg", f.svg);
      if (!s.ok()) return s;
      ++figures;
    }
  }
  std::ostringstream html;
  WriteReportHtml(page, html);
  Status s = WriteFileAtomically(dir + "/report.html", html.str());
  if (!s.ok()) return s;
  return figures;
}

Result<int> WriteReportOfResults(const std::string& dir, const StudySpec& study,
                                 const std::vector<Cell>& cells, const StudyTruths& truths) {
  Result<ReportData> data = ReadReportData(dir);
  if (!data.ok()) return data.status();
  return WriteReport(dir, study, cells, truths, *data);
}

}  // namespace locind::app
