#include "metrics/cell_summary.h"

#include <algorithm>
#include <limits>

namespace locind::metrics {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// The replicates that ran, as (truth, numerator, denominator) for one ratio.
template <typename Pick>
std::vector<ClusteredValue> Values(const std::vector<ReplicateRecord>& records, Pick pick) {
  std::vector<ClusteredValue> out;
  for (const ReplicateRecord& r : records) {
    if (!r.ok) continue;
    const auto [num, den] = pick(r);
    out.push_back({r.truth, static_cast<double>(num), static_cast<double>(den)});
  }
  return out;
}

int DistinctTruths(const std::vector<ReplicateRecord>& records) {
  std::vector<int> seen;
  for (const ReplicateRecord& r : records) {
    if (r.ok && std::find(seen.begin(), seen.end(), r.truth) == seen.end()) seen.push_back(r.truth);
  }
  return static_cast<int>(seen.size());
}

double Ceiling(const CellSummary& s) {
  if (s.totals.solid == 0) return kNaN;
  int reachable = 0;
  for (int g = 0; g < kEdgeGroups; ++g) {
    if (s.reach.groups[g]) reachable += s.groups[g].totals.solid;
  }
  return static_cast<double>(reachable) / s.totals.solid;
}

}  // namespace

CellSummary Summarize(const std::vector<ReplicateRecord>& records, const LearnerReach& reach,
                      base::RandomStream& random, int bootstrap_resamples) {
  CellSummary s;
  s.reach = reach;
  s.replicates = static_cast<int>(records.size());
  for (const ReplicateRecord& r : records) {
    if (!r.ok) {
      ++s.failed;
      continue;
    }
    s.totals += r.score.total;
    for (int g = 0; g < kEdgeGroups; ++g) s.groups[g].totals += r.score.by_group[g];
    s.marks_compared += r.score.marks_compared;
    s.marks_agree += r.score.marks_agree;
    s.not_estimable += r.not_estimable;  // why edges were lost
    s.attribution += r.attribution;
  }
  s.truths = DistinctTruths(records);
  s.power_ceiling = Ceiling(s);
  const int n = bootstrap_resamples;
  // One stream for every interval, always drawn in the same order.
  auto ratio = [&](auto pick) { return ClusteredRatioInterval(Values(records, pick), n, random); };
  s.power = ratio([](const ReplicateRecord& r) {
    return std::pair(r.score.total.solid_found, r.score.total.solid);
  });
  s.false_edge_rate = ratio([](const ReplicateRecord& r) {
    return std::pair(r.score.total.false_edges, r.score.total.reported);
  });
  s.class_recovery = ratio([](const ReplicateRecord& r) {
    return std::pair(r.score.class_recovered ? 1 : 0, 1);
  });
  s.hamming = ratio([](const ReplicateRecord& r) { return std::pair(r.score.hamming, 1); });
  s.tests = ratio([](const ReplicateRecord& r) { return std::pair(r.tests, 1.0); });
  s.largest_given = ratio([](const ReplicateRecord& r) { return std::pair(r.largest_given, 1.0); });
  s.seconds = ratio([](const ReplicateRecord& r) { return std::pair(r.seconds, 1.0); });
  for (int g = 0; g < kEdgeGroups; ++g) {
    s.groups[g].power = ratio([g](const ReplicateRecord& r) {
      return std::pair(r.score.by_group[g].solid_found, r.score.by_group[g].solid);
    });
    s.groups[g].false_edge_rate = ratio([g](const ReplicateRecord& r) {
      return std::pair(r.score.by_group[g].false_edges, r.score.by_group[g].reported);
    });
  }
  s.mark_agreement = {kNaN, kNaN, kNaN};
  if (reach.marks) {
    s.mark_agreement = ratio([](const ReplicateRecord& r) {
      return std::pair(r.score.marks_agree, r.score.marks_compared);
    });
  }
  return s;
}

}  // namespace locind::metrics
