// CellSummary: the aggregate of one (grid cell, learner) over its replicates.
//
// Proportions are pooled over the replicates that ran (failed replicates are
// counted, never scored): power = sum solid_found / sum solid, false-edge
// rate = sum false_edges / sum reported, class recovery = replicates with the
// class recovered / replicates; each with a Wilson 95% interval. Hamming
// distance, tests made, largest conditioning set and seconds are means with
// percentile-bootstrap 95% intervals (metrics/intervals.h).
#pragma once

#include <vector>

#include "base/random_stream.h"
#include "metrics/error_attribution.h"
#include "metrics/intervals.h"
#include "metrics/replicate_score.h"

namespace locind::metrics {

// What one replicate of one learner produced. `ok` is false for a failed
// replicate (simulation or learner error); its score is then ignored.
struct ReplicateRecord {
  bool ok = true;
  ReplicateScore score;
  double tests = 0;
  double largest_given = 0;
  double seconds = 0;
  // --- Why edges were lost (metrics/error_attribution.h) ---
  int not_estimable = 0;            // tests that could not be computed
  ErrorAttribution attribution;     // counts only
};

struct CellSummary {
  int replicates = 0;  // all, failed included
  int failed = 0;
  EdgeCounts totals;   // summed over the replicates that ran
  Interval power;
  Interval false_edge_rate;
  Interval class_recovery;
  Interval hamming;
  Interval tests;
  Interval largest_given;
  Interval seconds;
  // --- Why edges were lost: sums over the replicates that ran ---
  int not_estimable = 0;
  ErrorAttribution attribution;  // counts only
};

// `random` drives the bootstrap resamples (key it by study seed and cell).
CellSummary Summarize(const std::vector<ReplicateRecord>& records, base::RandomStream& random,
                      int bootstrap_resamples = 2000);

}  // namespace locind::metrics
