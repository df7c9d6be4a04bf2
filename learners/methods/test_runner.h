// TestRunner: the one place where a method asks its independence test.
//
// It applies the decision rule of learners/methods/learner.h (dependent when
// p <= level; not estimable counts as dependent), asks each distinct query
// once (later asks are answered from memory and not logged again), logs every
// test made, and keeps the counts a LearnResult reports. Queries are "d is
// connected from c given C": target d, sources {c}, given C (C may hold d,
// never c). Node sets are bit masks, so at most 64 processes.
#pragma once

#include <chrono>
#include <unordered_map>
#include <vector>

#include "graph/bit_graph.h"
#include "learners/independence/independence_test.h"
#include "learners/methods/learner.h"

namespace locind::learners {

class TestRunner {
 public:
  // REQUIRES: test.processes() <= 64.
  TestRunner(IndependenceTest& test, double level) : test_(test), level_(level) {}

  int processes() const { return test_.processes(); }
  size_t tests() const { return log_.size(); }

  // True when the test rejects "target locally independent of source given
  // `given`" (or cannot estimate it). REQUIRES: source not in `given`.
  bool Dependent(int source, int target, graph::Mask given);

  // The answer when that query was already made, else nullptr.
  const bool* Known(int source, int target, graph::Mask given) const;

  // Moves the log and counts into `result` (graph and marks untouched).
  void Fill(LearnResult& result) const;

 private:
  struct Key {
    graph::Mask given;
    int pair;  // source * 64 + target
    bool operator==(const Key&) const = default;
  };
  struct KeyHash {
    size_t operator()(const Key& k) const {
      return std::hash<uint64_t>()(k.given * 0x9E3779B97F4A7C15ull + static_cast<uint64_t>(k.pair));
    }
  };

  IndependenceTest& test_;
  double level_;
  std::unordered_map<Key, bool, KeyHash> answers_;
  std::vector<TestRecord> log_;
  int not_estimable_ = 0;
  int largest_given_ = 0;
};

// Wall-clock seconds since `start` (the method timer).
double SecondsSince(std::chrono::steady_clock::time_point start);

// The nodes of a mask in increasing order.
std::vector<int> MaskToList(graph::Mask m);

// REQUIRES: every index < 64.
graph::Mask ListToMask(const std::vector<int>& nodes);

}  // namespace locind::learners
