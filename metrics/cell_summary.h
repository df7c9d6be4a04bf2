// CellSummary: the aggregate of one (grid cell, learner) over its replicates.
//
// Rates are ratio estimators pooled over the replicates that ran (failed
// replicates are counted, never scored): power = sum solid_found / sum solid,
// false-edge rate = sum false_edges / sum reported, class recovery =
// replicates with the class recovered / replicates, mark agreement = sum
// marks_agree / sum marks_compared; power and false-edge rate also per edge
// group (directed, loop, bidirected). Hamming distance, tests made, largest
// conditioning set and seconds are means.
//
// Intervals respect the design: replicates are nested in truths (parameter
// draws or random graphs), so edges of one replicate, and replicates of one
// truth, are not independent trials. Every interval is a two-stage cluster
// bootstrap (metrics::ClusteredRatioInterval: truths, then replicates within
// truths; Davison & Hinkley 1997, sec. 3.8) of the ratio, 2000 resamples.
// Why not the alternatives: a binomial (Wilson) interval over pooled edges
// treats every edge as an independent trial and is far too narrow when
// replicates agree; a t-interval over truth means has 1 degree of freedom
// with 2 truths (multiplier 12.7, so [0, 1] for any difference) and zero
// width whenever the truth means tie, which discrete counts often do. The
// cluster bootstrap's own limit: with few truths it sees little of the
// variation between truths, so with fewer than about 5 truths read it as
// conditional on the truths drawn; `truths` says how many there were
// (tests/metrics/cluster_coverage_test.cc: 95% intervals cover in about 95%
// of simulated studies with 2 truths that do not differ, or 10 truths that
// do; with 2 truths that differ, sd 0.17 in power, only about 72%). When
// every replicate gives the same value, every resample does too and the
// interval is that value with zero width.
#pragma once

#include <array>
#include <vector>

#include "base/random_stream.h"
#include "metrics/error_attribution.h"
#include "metrics/intervals.h"
#include "metrics/replicate_score.h"

namespace locind::metrics {

// What one replicate of one learner produced. `ok` is false for a failed
// replicate (simulation or learner error); its score is then ignored.
// `truth` numbers the truth the replicate used (the bootstrap's cluster).
struct ReplicateRecord {
  bool ok = true;
  int truth = 0;
  ReplicateScore score;
  double tests = 0;
  double largest_given = 0;
  double seconds = 0;
  // --- Why edges were lost (metrics/error_attribution.h) ---
  int not_estimable = 0;            // tests that could not be computed
  ErrorAttribution attribution;     // counts only
};

// Which edge groups a method can report at all, and whether it marks its
// edges solid/dashed (learners/methods/learner_registry.h declares it per
// method). Groups it cannot report cap its power.
struct LearnerReach {
  std::array<bool, kEdgeGroups> groups = {true, true, true};
  bool marks = false;
};

struct GroupSummary {
  EdgeCounts totals;  // summed over the replicates that ran
  Interval power;
  Interval false_edge_rate;
};

struct CellSummary {
  int replicates = 0;  // all, failed included
  int failed = 0;
  int truths = 0;      // distinct truths among the replicates that ran
  EdgeCounts totals;   // summed over the replicates that ran
  Interval power;
  Interval false_edge_rate;
  Interval class_recovery;
  Interval hamming;
  Interval tests;
  Interval largest_given;
  Interval seconds;
  // Edge groups, indexed by EdgeGroup.
  std::array<GroupSummary, kEdgeGroups> groups;
  // What the method can report; power_ceiling = solid edges in the groups it
  // can report / all solid edges (NaN when there is no solid edge): the best
  // pooled power it can reach.
  LearnerReach reach;
  double power_ceiling = 0;
  // Solid/dashed marks; all NaN / 0 when the method does not mark edges.
  int marks_compared = 0;
  int marks_agree = 0;
  Interval mark_agreement;
  // --- Why edges were lost: sums over the replicates that ran ---
  int not_estimable = 0;
  ErrorAttribution attribution;  // counts only
};

// `random` drives the bootstrap resamples (key it by study seed, cell and
// learner); they are drawn in a fixed order, so the same records give the
// same intervals.
CellSummary Summarize(const std::vector<ReplicateRecord>& records, const LearnerReach& reach,
                      base::RandomStream& random, int bootstrap_resamples = 2000);

}  // namespace locind::metrics
