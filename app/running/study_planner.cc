#include "app/running/study_planner.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <memory>
#include <optional>
#include <sstream>

#include "app/results/results_rows.h"
#include "app/results/results_table.h"
#include "app/results/results_writer.h"
#include "app/running/runner.h"
#include "app/study/study_truths.h"
#include "app/study/study_grid.h"

namespace locind::app {
namespace {

// Rates are compared with a little slack: a Wilson bound of 0 successes can
// come out as 1e-17 instead of 0.
constexpr double kSlack = 1e-12;

// Lengths are kept to 3 significant digits so bisection ends on readable values.
double Round3(double x) {
  if (x <= 0) return x;
  const double scale = std::pow(10.0, std::floor(std::log10(x)) - 2);
  return std::round(x / scale) * scale;
}

class LengthSearch {
 public:
  LengthSearch(const StudySpec& study, int learner, const PlanCombination& at, const StudyTruths& truths,
               const PlanTargets& targets, int threads, const std::function<void(const std::string&)>& log)
      : study_(study), learner_(learner), at_(at), truths_(truths), targets_(targets), threads_(threads),
        log_(log) {}

  const PlanStep& Evaluate(double length) {
    auto it = steps_.find(length);
    if (it != steps_.end()) return it->second;
    // Along trials, `length` counts trials of the first grid length.
    Cell cell = study_.plan.along_trials
                    ? MakeCell(study_, study_.grid.lengths.front(), at_.level, at_.hidden_factor,
                               at_.stationarity, static_cast<int>(length))
                    : MakeCell(study_, length, at_.level, at_.hidden_factor, at_.stationarity, at_.trials);
    cell.index = 0;
    std::vector<Unit> units;
    for (int r = 0; r < study_.grid.replicates; ++r) units.push_back(Unit{0, r});
    std::map<int, ReplicateRow> rows;
    RunUnits(study_, {cell}, truths_, units, threads_,
             [&rows](UnitResult u) { rows[u.unit.replicate] = u.rows.front(); }, nullptr, {learner_});
    std::vector<ReplicateRow> ordered;
    for (auto& [r, row] : rows) ordered.push_back(row);
    PlanStep step{length, SummarizeCell(study_, cell, learner_, ordered), false};
    step.meets = MeetsTargets(step.summary, targets_);
    if (log_) {
      log_("plan: " + study_.learners[learner_].label + Where() + (study_.plan.along_trials ? " at trials " : " at length ") + Num(length) + ": power " +
           IntervalText(step.summary.power) + ", false-edge rate " +
           IntervalText(step.summary.false_edge_rate) + (step.meets ? " (meets)" : ""));
    }
    return steps_.emplace(length, step).first->second;
  }

  LearnerPlan Search() {
    LearnerPlan plan;
    plan.learner = study_.learners[learner_].label;
    plan.at = at_;
    plan.searched = study_.plan.along_trials ? "trials" : "length";
    if (study_.plan.along_trials) plan.trial_length = study_.grid.lengths.front();
    const std::vector<double> values = SearchedValues();
    const double start = study_.plan.start > 0 ? study_.plan.start : *std::min_element(values.begin(), values.end());
    plan.cap = study_.plan.cap > 0 ? study_.plan.cap : 64 * *std::max_element(values.begin(), values.end());
    double failed = 0, met = 0;
    for (double length = std::min(start, plan.cap);; length = std::min(2 * length, plan.cap)) {
      if (Evaluate(length).meets) {
        met = length;
        break;
      }
      failed = length;
      if (length >= plan.cap) break;
    }
    if (met > 0 && failed > 0) {
      for (int i = 0; i < study_.plan.bisection_steps; ++i) {
        const double mid = study_.plan.along_trials ? std::floor((failed + met) / 2) : Round3((failed + met) / 2);
        if (mid <= failed || mid >= met) break;
        (Evaluate(mid).meets ? met : failed) = mid;
      }
    }
    plan.reached = met > 0;
    plan.length = met;
    for (const auto& [length, step] : steps_) plan.steps.push_back(step);
    Bounds(plan);
    return plan;
  }

 private:
  // The grid values of the searched quantity (lengths, or numbers of trials).
  std::vector<double> SearchedValues() const {
    if (!study_.plan.along_trials) return study_.grid.lengths;
    if (study_.grid.trials.empty()) return {1};
    return std::vector<double>(study_.grid.trials.begin(), study_.grid.trials.end());
  }

  void Bounds(LearnerPlan& plan) const {
    for (const PlanStep& s : plan.steps) {
      const metrics::CellSummary& m = s.summary;
      const bool none_reported = m.totals.reported == 0;
      const bool allow = !std::isnan(m.power.high) && m.power.high >= targets_.power - kSlack &&
                         (none_reported || m.false_edge_rate.low <= targets_.false_edges + kSlack);
      if (allow && std::isnan(plan.optimistic)) plan.optimistic = s.length;
    }
    // Conservative: from this length on, every evaluated length is guaranteed.
    for (auto it = plan.steps.rbegin(); it != plan.steps.rend(); ++it) {
      const metrics::CellSummary& m = it->summary;
      const bool sure = !std::isnan(m.power.low) && m.power.low >= targets_.power - kSlack &&
                        (m.totals.reported == 0 || m.false_edge_rate.high <= targets_.false_edges + kSlack);
      if (!sure) break;
      plan.conservative = it->length;
    }
  }

  // The combination in log lines, when the study has more than one.
  std::string Where() const {
    return PlanCombinations(study_).size() > 1 ? " (" + at_.Text() + ")" : "";
  }

  const StudySpec& study_;
  int learner_;
  PlanCombination at_;
  const StudyTruths& truths_;
  PlanTargets targets_;
  int threads_;
  const std::function<void(const std::string&)>& log_;
  std::map<double, PlanStep> steps_;
};

}  // namespace

bool MeetsTargets(const metrics::CellSummary& s, const PlanTargets& targets) {
  if (std::isnan(s.power.estimate) || s.power.estimate < targets.power - kSlack) return false;
  return s.totals.reported == 0 || s.false_edge_rate.estimate <= targets.false_edges + kSlack;
}

// ---- combinations of the other grid factors ----

std::string PlanCombination::Text() const {
  std::string text = "level " + Num(level);
  if (hidden_factor >= 0) text += ", " + std::to_string(hidden_count) + " hidden";
  if (stationarity) text += ", stationarity target " + Num(*stationarity);
  if (trials > 0) text += ", " + std::to_string(trials) + " trials";
  return text;
}

std::vector<PlanCombination> PlanCombinations(const StudySpec& study) {
  std::vector<PlanCombination> out;
  // The grid's own cells at one length give every combination in grid order.
  const bool trial_factor = !study.grid.trials.empty() && !study.plan.along_trials;
  for (const Cell& c : ExpandGrid(study)) {
    if (c.length != study.grid.lengths.front()) continue;
    // Along trials the number of trials is searched, not a combination.
    if (!trial_factor && !study.grid.trials.empty() && c.trials != study.grid.trials.front()) continue;
    out.push_back(PlanCombination{c.hidden_factor, c.hidden_count, c.stationarity, c.level,
                                  trial_factor ? c.trials : 0});
  }
  return out;
}

namespace {

// Applies one "key=value" of a combination choice; false when it does not parse.
bool Narrow(const std::string& item, std::vector<PlanCombination>& combos) {
  const size_t eq = item.find('=');
  if (eq == std::string::npos) return false;
  const std::string key = item.substr(0, eq);
  double value = 0;
  try {
    size_t used = 0;
    value = std::stod(item.substr(eq + 1), &used);
    if (used != item.size() - eq - 1) return false;
  } catch (const std::exception&) {
    return false;
  }
  std::vector<PlanCombination> kept;
  for (const PlanCombination& c : combos) {
    const bool match = key == "level"    ? c.level == value
                       : key == "hidden" ? c.hidden_factor >= 0 && c.hidden_count == value
                       : key == "target" ? c.stationarity && *c.stationarity == value
                       : key == "trials" ? c.trials > 0 && c.trials == value
                                         : false;
    if (match) kept.push_back(c);
  }
  if (key != "level" && key != "hidden" && key != "target" && key != "trials") return false;
  combos = kept;
  return true;
}

}  // namespace

Result<std::vector<PlanCombination>> PickCombinations(const StudySpec& study, const std::string& choice) {
  const std::vector<PlanCombination> all = PlanCombinations(study);
  std::vector<PlanCombination> combos = all;
  std::string text = choice;
  std::replace(text.begin(), text.end(), ',', ' ');
  std::istringstream items(text);
  std::string list;
  for (const PlanCombination& c : all) list += (list.empty() ? "" : "; ") + c.Text();
  for (std::string item; items >> item;) {
    if (!Narrow(item, combos)) {
      return Status::Error("cannot read '" + item + "' (expected hidden=N, target=X, level=X or trials=N)");
    }
  }
  if (combos.empty()) return Status::Error("no combination of the study matches '" + choice + "' (the study has: " + list + ")");
  return combos;
}

std::vector<LearnerPlan> PlanLengths(const StudySpec& study, const PlanTargets& targets, int threads,
                                     const std::function<void(const std::string&)>& log,
                                     const std::vector<PlanCombination>& combinations) {
  const std::vector<PlanCombination> combos = combinations.empty() ? PlanCombinations(study) : combinations;
  std::vector<LearnerPlan> plans;
  for (const PlanCombination& at : combos) {
    // Truths depend on the hidden count only; drawn once per combination.
    const StudyTruths truths(study, {MakeCell(study, 1, at.level, at.hidden_factor, at.stationarity)});
    for (size_t l = 0; l < study.learners.size(); ++l) {
      plans.push_back(LengthSearch(study, static_cast<int>(l), at, truths, targets, threads, log).Search());
    }
  }
  return plans;
}

// ---- end combinations ----

std::string PlanReport(const std::vector<LearnerPlan>& plans, const PlanTargets& targets) {
  std::ostringstream out;
  out << "targets: power >= " << Num(targets.power) << ", false-edge rate <= " << Num(targets.false_edges)
      << "\n";
  for (size_t i = 0; i < plans.size(); ++i) {
    const LearnerPlan& p = plans[i];
    if (i == 0 || plans[i - 1].at.Text() != p.at.Text()) out << "at " << p.at.Text() << ":\n";
    if (!p.reached) {
      const PlanStep& best = *std::max_element(p.steps.begin(), p.steps.end(), [](const PlanStep& a, const PlanStep& b) {
        return a.summary.power.estimate < b.summary.power.estimate;
      });
      out << p.learner << ": no " << p.searched << " up to " << Num(p.cap) << " reaches the targets (best power "
          << IntervalText(best.summary.power) << " at " << p.searched << " " << Num(best.length)
          << ", false-edge rate there " << IntervalText(best.summary.false_edge_rate) << ")\n";
      continue;
    }
    const PlanStep& at = *std::find_if(p.steps.begin(), p.steps.end(),
                                       [&p](const PlanStep& s) { return s.length == p.length; });
    out << p.learner << ": " << p.searched << " " << Num(p.length) << " (replicate uncertainty: from "
        << (std::isnan(p.optimistic) ? "?" : Num(p.optimistic)) << " to "
        << (std::isnan(p.conservative) ? "beyond " + Num(p.steps.back().length) : Num(p.conservative))
        << "); power there " << IntervalText(at.summary.power) << ", false-edge rate "
        << IntervalText(at.summary.false_edge_rate) << "\n";
  }
  return out.str();
}

const std::string& PlanHeader() {
  static const std::string header =
      "learner,target_power,target_false_edge_rate,reached,length,optimistic_length,"
      "conservative_length,cap,level,hidden_count,stationarity_target,searched,trials,trial_length";
  return header;
}

std::string PlanCsv(const std::vector<LearnerPlan>& plans, const PlanTargets& targets) {
  std::string out = PlanHeader() + "\n";
  for (const LearnerPlan& p : plans) {
    out += CleanText(p.learner) + "," + Num(targets.power) + "," + Num(targets.false_edges) + "," +
           (p.reached ? "yes" : "no") + "," + (p.reached ? Num(p.length) : "") + "," + Num(p.optimistic) +
           "," + Num(p.conservative) + "," + Num(p.cap) + "," + Num(p.at.level) + "," +
           std::to_string(p.at.hidden_count) + "," + (p.at.stationarity ? Num(*p.at.stationarity) : "") + "," +
           // Trials block: what was searched; the trials of the combination
           // (searched length) or the trial length (searched trials).
           p.searched + "," + (p.searched == "trials" ? "" : std::to_string(std::max(1, p.at.trials))) + "," +
           (p.searched == "trials" ? Num(p.trial_length) : "") + "\n";
  }
  return out;
}

}  // namespace locind::app
