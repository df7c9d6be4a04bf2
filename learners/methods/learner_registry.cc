#include "learners/methods/learner_registry.h"

#include "learners/methods/exhaustive_learner.h"
#include "learners/methods/margin_search.h"
#include "learners/methods/maximal_search.h"
#include "learners/methods/pairwise_learner.h"
#include "learners/methods/penalized_fit_learner.h"
#include "learners/methods/screening_learner.h"

namespace locind::learners {
namespace {

template <typename T>
std::unique_ptr<Learner> MakePlain(const MethodSettings&) {
  return std::make_unique<T>();
}

std::unique_ptr<Learner> MakePenalizedFit(const MethodSettings& settings) {
  return std::make_unique<PenalizedFitLearner>(settings.penalty);
}

std::unique_ptr<Learner> MakeScreening(const MethodSettings& settings) {
  return std::make_unique<ScreeningLearner>(settings.screening_size);
}

// pairwise and penalized-fit only ever add a -> b (a == b allowed);
// screen adds a <-> b when both directions are kept; maximal-search and
// exhaustive decide every edge and set marks (SetGraphWithMarks).
constexpr unsigned kDirectedAndLoops = kReportsDirected | kReportsLoops;
constexpr unsigned kAllGroups = kDirectedAndLoops | kReportsBidirected;

}  // namespace

const std::vector<MethodEntry>& LearningMethods() {
  static const std::vector<MethodEntry> methods = {
      {"pairwise", "a -> b unless b is independent of a given all other processes", true,
       MakePlain<PairwiseLearner>, kDirectedAndLoops},
      {"maximal-search",
       "search for the maximal graph and its solid/dashed marks (exact under the oracle)", true,
       MakePlain<MaximalSearch>, kAllGroups | kReportsMarks},
      {"margin-search",
       "maximal search that uses each answer by its strength, order-independent (exact under the oracle)",
       true, MakePlain<MarginSearch>, kAllGroups | kReportsMarks},
      {"exhaustive", "every edge from the full list of separations (reference; small graphs)",
       true, MakePlain<ExhaustiveLearner>, kAllGroups | kReportsMarks},
      {"screen", "separation search with conditioning sets of at most k processes besides b",
       true, MakeScreening, kAllGroups},
      {"penalized-fit", "L1-penalized fit of every process on all others, no tests (needs data)",
       false, MakePenalizedFit, kDirectedAndLoops},
  };
  return methods;
}

const MethodEntry* FindMethod(std::string_view name) {
  for (const MethodEntry& m : LearningMethods()) {
    if (name == m.name) return &m;
  }
  return nullptr;
}

}  // namespace locind::learners
