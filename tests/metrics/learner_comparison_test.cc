#include "metrics/learner_comparison.h"

#include <doctest/doctest.h>

#include <cmath>

namespace locind::metrics {
namespace {

// A replicate that found `found` of `solid` directed solid edges and
// reported `reported` edges, `false_edges` of them false.
ReplicateRecord Record(int truth, int found, int solid, int reported, int false_edges,
                       bool recovered = false) {
  ReplicateRecord r;
  r.truth = truth;
  EdgeCounts& d = r.score.by_group[static_cast<int>(EdgeGroup::kDirected)];
  d.solid = solid;
  d.solid_found = found;
  d.reported = reported;
  d.false_edges = false_edges;
  r.score.total = d;
  r.score.class_recovered = recovered;
  return r;
}

TEST_CASE("paired difference: a shift shared by every replicate has a zero-width interval") {
  // Derivation (no outside source): the reference finds 1 of 6 directed
  // solid edges on truth 0 and 4 of 6 on truth 1; the learner finds one more
  // on every replicate. In any resample of n replicates the difference is
  // (sum(ref) + n) / 6n - sum(ref) / 6n = 1/6 exactly, whatever was drawn,
  // while the reference's own interval spans the truths (1/6 to 4/6).
  std::vector<ReplicateRecord> reference, learner;
  for (int r = 0; r < 8; ++r) {
    const int truth = r % 2;
    const int found = truth == 0 ? 1 : 4;
    reference.push_back(Record(truth, found, 6, 6, 0));
    learner.push_back(Record(truth, found + 1, 6, 7, 0));
  }
  base::RandomStream random(3);
  const LearnerComparison c = Compare(learner, reference, random);
  CHECK(c.paired == 8);
  CHECK(c.truths == 2);
  CHECK(c.directed_power.estimate == doctest::Approx(1.0 / 6.0));
  CHECK(c.directed_power.low == doctest::Approx(1.0 / 6.0));
  CHECK(c.directed_power.high == doctest::Approx(1.0 / 6.0));
  CHECK(c.power.estimate == doctest::Approx(1.0 / 6.0));
  // Neither reports a false edge: the difference is 0 with zero width.
  CHECK(c.false_edge_rate.estimate == 0);
  CHECK(c.false_edge_rate.low == 0);
  CHECK(c.false_edge_rate.high == 0);
  // Unpaired, the reference alone varies from 1/6 to 4/6 between truths.
  std::vector<ClusteredValue> alone;
  for (const ReplicateRecord& r : reference) alone.push_back({r.truth, double(r.score.total.solid_found), 6});
  base::RandomStream again(3);
  const Interval single = ClusteredRatioInterval(alone, 2000, again);
  CHECK(single.high - single.low == doctest::Approx(0.5));
}

TEST_CASE("paired difference: ratios of sums over the replicates both ran") {
  // Hand-computed. Replicate 2 failed for the reference and is left out of
  // both sides: learner false edges (1 + 0 + 3) / (10 + 8 + 12) = 4/30,
  // reference (0 + 0 + 1) / (9 + 8 + 10) = 1/27.
  std::vector<ReplicateRecord> learner = {Record(0, 3, 4, 10, 1, true), Record(0, 4, 4, 8, 0, true),
                                          Record(1, 0, 4, 99, 50), Record(1, 2, 4, 12, 3)};
  std::vector<ReplicateRecord> reference = {Record(0, 2, 4, 9, 0), Record(0, 4, 4, 8, 0, true),
                                            Record(1, 0, 4, 1, 0), Record(1, 1, 4, 10, 1)};
  reference[2].ok = false;
  base::RandomStream random(7);
  const LearnerComparison c = Compare(learner, reference, random);
  CHECK(c.paired == 3);
  CHECK(c.truths == 2);
  CHECK(c.false_edge_rate.estimate == doctest::Approx(4.0 / 30 - 1.0 / 27));
  CHECK(c.directed_power.estimate == doctest::Approx(9.0 / 12 - 7.0 / 12));
  CHECK(c.class_recovery.estimate == doctest::Approx(2.0 / 3 - 1.0 / 3));
  CHECK(c.false_edge_rate.low <= c.false_edge_rate.estimate);
  CHECK(c.false_edge_rate.high >= c.false_edge_rate.estimate);
}

TEST_CASE("paired difference: a learner against itself, and undefined ratios") {
  std::vector<ReplicateRecord> same = {Record(0, 1, 3, 4, 1), Record(1, 3, 3, 5, 0),
                                       Record(1, 0, 3, 2, 2)};
  base::RandomStream random(1);
  const LearnerComparison c = Compare(same, same, random);
  CHECK(c.power.estimate == 0);
  CHECK(c.power.low == 0);
  CHECK(c.power.high == 0);
  CHECK(c.false_edge_rate.low == 0);
  CHECK(c.false_edge_rate.high == 0);
  // No directed solid edge anywhere: the power difference is undefined.
  std::vector<ReplicateRecord> none = {Record(0, 0, 0, 2, 0), Record(0, 0, 0, 1, 1)};
  const LearnerComparison u = Compare(none, none, random);
  CHECK(std::isnan(u.directed_power.estimate));
  CHECK(std::isnan(u.directed_power.low));
  // Nothing ran on both sides.
  std::vector<ReplicateRecord> failed = none;
  for (ReplicateRecord& r : failed) r.ok = false;
  const LearnerComparison f = Compare(failed, none, random);
  CHECK(f.paired == 0);
  CHECK(std::isnan(f.false_edge_rate.estimate));
}

TEST_CASE("ClusteredRatioDifferenceInterval keeps ClusteredRatioInterval's draws") {
  // With reference shares of 0 / 1 the difference is the plain ratio, and the
  // same stream gives the same bounds: both use one resampling scheme.
  std::vector<ClusteredValue> plain;
  std::vector<PairedValue> paired;
  for (int r = 0; r < 10; ++r) {
    plain.push_back({r % 3, double(r % 4), 5});
    paired.push_back({r % 3, double(r % 4), 5, 0, 1});
  }
  base::RandomStream a(21), b(21);
  const Interval one = ClusteredRatioInterval(plain, 500, a);
  const Interval two = ClusteredRatioDifferenceInterval(paired, 500, b);
  CHECK(one.estimate == two.estimate);
  CHECK(one.low == two.low);
  CHECK(one.high == two.high);
}

}  // namespace
}  // namespace locind::metrics
