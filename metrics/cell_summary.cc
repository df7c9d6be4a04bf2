#include "metrics/cell_summary.h"

namespace locind::metrics {

CellSummary Summarize(const std::vector<ReplicateRecord>& records, base::RandomStream& random,
                      int bootstrap_resamples) {
  CellSummary s;
  s.replicates = static_cast<int>(records.size());
  std::vector<double> hamming, tests, largest, seconds;
  int recovered = 0;
  for (const ReplicateRecord& r : records) {
    if (!r.ok) {
      ++s.failed;
      continue;
    }
    s.totals += r.score.total;
    s.not_estimable += r.not_estimable;  // why edges were lost
    s.attribution += r.attribution;
    recovered += r.score.class_recovered ? 1 : 0;
    hamming.push_back(r.score.hamming);
    tests.push_back(r.tests);
    largest.push_back(r.largest_given);
    seconds.push_back(r.seconds);
  }
  const int ran = s.replicates - s.failed;
  s.power = WilsonInterval(s.totals.solid_found, s.totals.solid);
  s.false_edge_rate = WilsonInterval(s.totals.false_edges, s.totals.reported);
  s.class_recovery = WilsonInterval(recovered, ran);
  // One stream for all four bootstraps, always drawn in the same order.
  s.hamming = BootstrapMeanInterval(hamming, bootstrap_resamples, random);
  s.tests = BootstrapMeanInterval(tests, bootstrap_resamples, random);
  s.largest_given = BootstrapMeanInterval(largest, bootstrap_resamples, random);
  s.seconds = BootstrapMeanInterval(seconds, bootstrap_resamples, random);
  return s;
}

}  // namespace locind::metrics
