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
  LengthSearch(const StudySpec& study, int learner, const PlanTargets& targets, int threads,
               const std::function<void(const std::string&)>& log)
      : study_(study), learner_(learner), targets_(targets), threads_(threads), log_(log) {
    hidden_ = study.grid.hidden_counts.empty() ? -1 : study.grid.hidden_counts.front();
    if (!study.grid.stationarity.empty()) {
      target_ = study.grid.stationarity.front();
    } else {
      target_ = study.events ? study.event_process.spectral_radius : study.path_process.drift_bound;
    }
    const Cell any = MakeCell(study, 1, study.grid.levels.front(), hidden_, target_);
    truths_ = std::make_unique<StudyTruths>(study, std::vector<Cell>{any});
  }

  const PlanStep& Evaluate(double length) {
    auto it = steps_.find(length);
    if (it != steps_.end()) return it->second;
    Cell cell = MakeCell(study_, length, study_.grid.levels.front(), hidden_, target_);
    cell.index = 0;
    std::vector<Unit> units;
    for (int r = 0; r < study_.grid.replicates; ++r) units.push_back(Unit{0, r});
    std::map<int, ReplicateRow> rows;
    RunUnits(study_, {cell}, *truths_, units, threads_,
             [&rows](UnitResult u) { rows[u.unit.replicate] = u.rows.front(); }, nullptr, {learner_});
    std::vector<ReplicateRow> ordered;
    for (auto& [r, row] : rows) ordered.push_back(row);
    PlanStep step{length, SummarizeCell(study_, cell, learner_, ordered), false};
    step.meets = MeetsTargets(step.summary, targets_);
    if (log_) {
      log_("plan: " + study_.learners[learner_].label + " at length " + Num(length) + ": power " +
           IntervalText(step.summary.power) + ", false-edge rate " +
           IntervalText(step.summary.false_edge_rate) + (step.meets ? " (meets)" : ""));
    }
    return steps_.emplace(length, step).first->second;
  }

  LearnerPlan Search() {
    LearnerPlan plan;
    plan.learner = study_.learners[learner_].label;
    const double start = study_.plan.start > 0 ? study_.plan.start
                         : *std::min_element(study_.grid.lengths.begin(), study_.grid.lengths.end());
    plan.cap = study_.plan.cap > 0 ? study_.plan.cap
               : 64 * *std::max_element(study_.grid.lengths.begin(), study_.grid.lengths.end());
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
        const double mid = Round3((failed + met) / 2);
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

  const StudySpec& study_;
  int learner_;
  PlanTargets targets_;
  int threads_;
  const std::function<void(const std::string&)>& log_;
  int hidden_ = -1;
  std::optional<double> target_;
  std::unique_ptr<StudyTruths> truths_;
  std::map<double, PlanStep> steps_;
};

}  // namespace

bool MeetsTargets(const metrics::CellSummary& s, const PlanTargets& targets) {
  if (std::isnan(s.power.estimate) || s.power.estimate < targets.power - kSlack) return false;
  return s.totals.reported == 0 || s.false_edge_rate.estimate <= targets.false_edges + kSlack;
}

std::vector<LearnerPlan> PlanLengths(const StudySpec& study, const PlanTargets& targets, int threads,
                                     const std::function<void(const std::string&)>& log) {
  std::vector<LearnerPlan> plans;
  for (size_t l = 0; l < study.learners.size(); ++l) {
    plans.push_back(LengthSearch(study, static_cast<int>(l), targets, threads, log).Search());
  }
  return plans;
}

std::string PlanReport(const std::vector<LearnerPlan>& plans, const PlanTargets& targets) {
  std::ostringstream out;
  out << "targets: power >= " << Num(targets.power) << ", false-edge rate <= " << Num(targets.false_edges)
      << "\n";
  for (const LearnerPlan& p : plans) {
    if (!p.reached) {
      const PlanStep& best = *std::max_element(p.steps.begin(), p.steps.end(), [](const PlanStep& a, const PlanStep& b) {
        return a.summary.power.estimate < b.summary.power.estimate;
      });
      out << p.learner << ": no length up to " << Num(p.cap) << " reaches the targets (best power "
          << IntervalText(best.summary.power) << " at length " << Num(best.length)
          << ", false-edge rate there " << IntervalText(best.summary.false_edge_rate) << ")\n";
      continue;
    }
    const PlanStep& at = *std::find_if(p.steps.begin(), p.steps.end(),
                                       [&p](const PlanStep& s) { return s.length == p.length; });
    out << p.learner << ": length " << Num(p.length) << " (replicate uncertainty: from "
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
      "conservative_length,cap";
  return header;
}

std::string PlanCsv(const std::vector<LearnerPlan>& plans, const PlanTargets& targets) {
  std::string out = PlanHeader() + "\n";
  for (const LearnerPlan& p : plans) {
    out += CleanText(p.learner) + "," + Num(targets.power) + "," + Num(targets.false_edges) + "," +
           (p.reached ? "yes" : "no") + "," + (p.reached ? Num(p.length) : "") + "," + Num(p.optimistic) +
           "," + Num(p.conservative) + "," + Num(p.cap) + "\n";
  }
  return out;
}

}  // namespace locind::app
