#include "app/study/study_cost.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "sim/hawkes_model.h"

namespace locind::app {
namespace {

constexpr double kMiB = 1024.0 * 1024.0;

// The truth indices replicates of a cell use (replicate r uses r mod truths).
int TruthsUsed(const StudySpec& study) {
  return std::min(study.truth.truths, study.grid.replicates);
}

// Expected events of one replicate of `cell` on `truth`, or a note.
double ExpectedEvents(const StudySpec& study, const PreparedTruth& truth, const Cell& cell,
                      std::string& note) {
  Result<BuiltHawkes> built = BuildHawkes(study, truth, cell);
  if (!built.ok()) {
    note = built.status().message();
    return 0;
  }
  Result<Eigen::VectorXd> rates = sim::StationaryIntensity(built->model);
  if (!rates.ok()) {
    char radius[32];
    std::snprintf(radius, sizeof radius, "%.3g", built->spectral_radius);
    note = std::string("not stationary (spectral radius ") + radius +
           "): its replicates fail with a message";
    return 0;
  }
  return rates->sum() * (study.event_process.burn_in + cell.length) * cell.trials;
}

// A diffusion truth whose drift is unstable, as a note (empty when stable).
std::string PathNote(const StudySpec& study, const PreparedTruth& truth, const Cell& cell) {
  Result<BuiltDiffusion> built = BuildDiffusion(study, truth, cell);
  if (!built.ok()) return built.status().message();
  if (built->largest_real_part < 0) return "";
  char part[32];
  std::snprintf(part, sizeof part, "%.3g", built->largest_real_part);
  return std::string("unstable (largest real part ") + part + "): its replicates fail with a message";
}

std::string Megabytes(double bytes) {
  char text[32];
  std::snprintf(text, sizeof text, bytes < 10 * kMiB ? "%.1f MB" : "%.0f MB", bytes / kMiB);
  return text;
}

std::string Count(double v) {
  char text[32];
  std::snprintf(text, sizeof text, "%.0f", v);
  return text;
}

}  // namespace

double BytesPerEvent(const StudySpec& study, int observed) {
  const bool grid = std::any_of(study.learners.begin(), study.learners.end(),
                                [](const LearnerSpec& l) {
                                  // Tests that read the features' quadrature grid.
                                  return l.test == "hawkes-lr-signed" ||
                                         l.test.rfind("event-local-covariance", 0) == 0;
                                });
  return 2 * 8 + (grid ? 4 : 1) * 8.0 * 3 * observed;
}

double BytesPerSample() { return 4 * 8; }

double PathPoints(const StudySpec& study, const Cell& cell, int observed) {
  return (std::floor(cell.length / study.path_process.interval) + 1) * observed * cell.trials;
}

int64_t EventCap(const StudySpec& study, int observed) {
  const double by_memory =
      static_cast<double>(study.memory_mb) * kMiB / BytesPerEvent(study, observed);
  return std::min(study.event_process.event_cap, static_cast<int64_t>(by_memory));
}

StudyCost EstimateCost(const StudySpec& study, const std::vector<Cell>& cells,
                       const StudyTruths& truths) {
  StudyCost cost;
  cost.truths = static_cast<int>(truths.all().size());
  cost.cells = static_cast<int>(cells.size());
  cost.replicates = study.grid.replicates;
  cost.simulations = static_cast<int64_t>(cells.size()) * study.grid.replicates;
  cost.learner_runs = cost.simulations * static_cast<int64_t>(study.learners.size());
  for (const Cell& cell : cells) {
    CellCost c;
    c.cell = &cell;
    for (int t = 0; t < TruthsUsed(study); ++t) {
      const PreparedTruth& truth = truths.Get(cell.hidden_factor, t);
      const int observed = static_cast<int>(truth.truth.Observed().size());
      std::string note;
      double points = 0, bytes = 0;
      if (study.events) {
        points = ExpectedEvents(study, truth, cell, note);
        bytes = points * BytesPerEvent(study, observed);
      } else {
        points = PathPoints(study, cell, observed);
        note = PathNote(study, truth, cell);
        bytes = points * BytesPerSample();
      }
      if (!note.empty() && c.note.empty()) c.note = "truth " + std::to_string(t + 1) + ": " + note;
      c.points = std::max(c.points, points);
      c.bytes = std::max(c.bytes, bytes);
    }
    cost.peak_bytes = std::max(cost.peak_bytes, c.bytes);
    cost.per_cell.push_back(c);
  }
  return cost;
}

std::string CostText(const StudySpec& study, const StudyCost& cost, int threads) {
  std::ostringstream o;
  o << "study " << study.name << ": " << cost.truths << " truth(s), " << cost.cells << " cell(s) x "
    << cost.replicates << " replicate(s) = " << cost.simulations << " simulation(s), x "
    << study.learners.size() << " learner(s) = " << cost.learner_runs << " learner run(s)\n";
  const char* unit = study.events ? "expected events" : "samples x processes";
  for (const CellCost& c : cost.per_cell) {
    o << "  cell " << c.cell->index << " (" << c.cell->label << "): " << Count(c.points) << " "
      << unit << ", about " << Megabytes(c.bytes) << " per replicate";
    if (!c.note.empty()) o << "; " << c.note;
    o << "\n";
  }
  o << "memory: about " << Megabytes(cost.peak_bytes)
    << " per replicate at most (limit memory_mb: " << study.memory_mb << "), "
    << Megabytes(cost.peak_bytes * threads) << " with " << threads << " thread(s)\n";
  return o.str();
}

std::string MemoryProblem(const StudySpec& study, const StudyCost& cost) {
  const double limit = static_cast<double>(study.memory_mb) * kMiB;
  for (const CellCost& c : cost.per_cell) {
    if (c.bytes > limit) {
      return "cell " + std::to_string(c.cell->index) + " (" + c.cell->label + ") needs about " +
             Megabytes(c.bytes) +
             " per replicate, more than memory_mb: " + std::to_string(study.memory_mb) +
             "; shorten the lengths or raise memory_mb";
    }
  }
  return "";
}

}  // namespace locind::app
