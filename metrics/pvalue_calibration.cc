#include "metrics/pvalue_calibration.h"

#include <algorithm>
#include <cmath>
#include <set>
#include <tuple>
#include <utility>

#include <boost/math/distributions/beta.hpp>

#include "learners/independence/oracle_test.h"

namespace locind::metrics {

std::vector<size_t> NullHoldingTests(const graph::Dmg& projected,
                                     const std::vector<learners::TestRecord>& log, size_t cap) {
  learners::OracleTest oracle(projected);
  std::set<std::tuple<int, std::vector<int>, std::vector<int>>> seen;
  std::vector<size_t> holding;
  for (size_t i = 0; i < log.size(); ++i) {
    const learners::TestRecord& r = log[i];
    if (r.status != learners::TestStatus::kOk) continue;
    if (!seen.insert({r.target, r.sources, r.given}).second) continue;
    // The oracle answers p = 1 exactly when b is separated from all of A given C.
    if (oracle.Run({r.target, r.sources, r.given}).p_value == 1) holding.push_back(i);
  }
  if (holding.size() <= cap) return holding;
  std::vector<size_t> kept;
  const double step = static_cast<double>(holding.size() - 1) / static_cast<double>(cap - 1);
  for (size_t k = 0; k < cap; ++k) {
    kept.push_back(holding[static_cast<size_t>(std::llround(static_cast<double>(k) * step))]);
  }
  return kept;
}

// --- Was the test asked only because of an earlier one? ---------------------

std::vector<bool> FirstOfPair(const std::vector<learners::TestRecord>& log) {
  std::set<std::pair<int, std::vector<int>>> asked;
  std::vector<bool> first(log.size());
  for (size_t i = 0; i < log.size(); ++i) {
    const learners::TestRecord& r = log[i];
    first[i] = asked.count({r.target, r.sources}) == 0;
    // Only an answer (status ok) can have steered the learner's next test.
    if (r.status == learners::TestStatus::kOk) asked.insert({r.target, r.sources});
  }
  return first;
}

// --- Can the test's model be right? -----------------------------------------

bool AllParentsGiven(const graph::Dmg& projected, int target, const std::vector<int>& given) {
  // A bidirected edge at b: a hidden common driver (Mogensen & Hansen 2020,
  // Ann. Statist. 48(1), Sec. 3: a <-> b stands for a hidden process with
  // directed paths into both), whose past no observed history carries.
  if (!projected.Siblings(target).empty()) return false;
  for (int parent : projected.Parents(target)) {
    if (std::find(given.begin(), given.end(), parent) == given.end()) return false;
  }
  return true;
}

std::vector<QqPoint> UniformQq(std::vector<double> p_values, double coverage) {
  std::sort(p_values.begin(), p_values.end());
  const double n = static_cast<double>(p_values.size());
  const double tail = (1 - coverage) / 2;
  std::vector<QqPoint> out;
  out.reserve(p_values.size());
  for (size_t k = 0; k < p_values.size(); ++k) {
    const double i = static_cast<double>(k + 1);
    const boost::math::beta_distribution<double> order(i, n + 1 - i);
    out.push_back({i / (n + 1), p_values[k], boost::math::quantile(order, tail),
                   boost::math::quantile(order, 1 - tail)});
  }
  return out;
}

double ShareAtOrBelow(const std::vector<double>& p_values, double level) {
  if (p_values.empty()) return NAN;
  const auto below = std::count_if(p_values.begin(), p_values.end(), [level](double p) { return p <= level; });
  return static_cast<double>(below) / static_cast<double>(p_values.size());
}

}  // namespace locind::metrics
