#include "metrics/learner_comparison.h"

#include <algorithm>
#include <cassert>
#include <utility>

namespace locind::metrics {

LearnerComparison Compare(const std::vector<ReplicateRecord>& learner,
                          const std::vector<ReplicateRecord>& reference, base::RandomStream& random,
                          int bootstrap_resamples) {
  assert(learner.size() == reference.size());
  LearnerComparison out;
  std::vector<int> truths;
  for (size_t i = 0; i < learner.size(); ++i) {
    if (!learner[i].ok || !reference[i].ok) continue;
    ++out.paired;
    if (std::find(truths.begin(), truths.end(), learner[i].truth) == truths.end()) {
      truths.push_back(learner[i].truth);
    }
  }
  out.truths = static_cast<int>(truths.size());
  // One stream for every difference, always drawn in the same order.
  auto difference = [&](auto pick) {
    std::vector<PairedValue> values;
    for (size_t i = 0; i < learner.size(); ++i) {
      if (!learner[i].ok || !reference[i].ok) continue;
      const auto [num, den] = pick(learner[i]);
      const auto [ref_num, ref_den] = pick(reference[i]);
      values.push_back({learner[i].truth, static_cast<double>(num), static_cast<double>(den),
                        static_cast<double>(ref_num), static_cast<double>(ref_den)});
    }
    return ClusteredRatioDifferenceInterval(values, bootstrap_resamples, random);
  };
  const int directed = static_cast<int>(EdgeGroup::kDirected);
  out.power = difference([](const ReplicateRecord& r) {
    return std::pair(r.score.total.solid_found, r.score.total.solid);
  });
  out.directed_power = difference([directed](const ReplicateRecord& r) {
    return std::pair(r.score.by_group[directed].solid_found, r.score.by_group[directed].solid);
  });
  out.false_edge_rate = difference([](const ReplicateRecord& r) {
    return std::pair(r.score.total.false_edges, r.score.total.reported);
  });
  out.class_recovery = difference([](const ReplicateRecord& r) {
    return std::pair(r.score.class_recovered ? 1 : 0, 1);
  });
  return out;
}

}  // namespace locind::metrics
