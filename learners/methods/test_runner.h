// TestRunner: the one place where a method asks its independence test.
//
// It applies the decision rule of learners/methods/learner.h (dependent when
// p <= level, separated when p > level, unknown when not estimable), asks
// each distinct query once (later asks are answered from memory and not logged again), logs every
// test made, and keeps the counts a LearnResult reports. Queries are "d is
// connected from c given C": target d, sources {c}, given C (C may hold d,
// never c). Node sets are bit masks, so at most 64 processes.
#pragma once

#include <chrono>
#include <optional>
#include <unordered_map>
#include <vector>

#include "graph/bit_graph.h"
#include "learners/independence/independence_test.h"
#include "learners/methods/learner.h"

namespace locind::learners {

// The three answers a test can give. kUnknown: not estimable, neither a
// separation nor a connection.
enum class Answer { kSeparated, kConnected, kUnknown };

class TestRunner {
 public:
  // REQUIRES: test.processes() <= 64.
  TestRunner(IndependenceTest& test, double level) : test_(test), level_(level) {}

  int processes() const { return test_.processes(); }
  size_t tests() const { return log_.size(); }
  int not_estimable() const { return not_estimable_; }

  // The answer to "target locally independent of source given `given`",
  // asked once. REQUIRES: source not in `given`.
  Answer Ask(int source, int target, graph::Mask given);

  // True unless the answer is a separation: "cannot be separated" (connected
  // or not estimable), what a search for a separating set needs.
  bool Dependent(int source, int target, graph::Mask given) {
    return Ask(source, target, given) != Answer::kSeparated;
  }

  // The answer when that query was already made, else nullopt.
  std::optional<Answer> Known(int source, int target, graph::Mask given) const;

  // The log entry of a query already made, else nullptr.
  const TestRecord* Record(int source, int target, graph::Mask given) const;

  // A witness for an answer: the log entry when the query was made and gave
  // that answer, else an implied record (no test; NaN statistic and p-value).
  TestRecord Witness(int source, int target, graph::Mask given, bool connected) const;

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
  std::unordered_map<Key, size_t, KeyHash> answers_;  // index into log_
  std::vector<TestRecord> log_;
  int not_estimable_ = 0;
  int largest_given_ = 0;
};

// --- Decision records (learners/methods/learner.h, EdgeDecision) ---

// A decision for `e` with the given outcome, phase and rule.
EdgeDecision MakeDecision(const graph::Edge& e, bool kept, const char* phase, const char* rule,
                          std::vector<TestRecord> witnesses = {});

// Finishes result.decisions once graph, marks and log are set: sorts them by
// edge, sets the mark of kept edges (when has_marks), and gives every kept
// edge without witnesses its own pair's evidence: when a test of its own pair
// (target = head, source = tail; both ways for a bidirected edge) could not
// be computed the edge is undecided (rule "not estimable", witnesses those
// tests, at most 5); otherwise the witness is its own pair's dependent test
// with the largest p-value (the closest call), when there is one.
void FinishDecisions(LearnResult& result);

// Wall-clock seconds since `start` (the method timer).
double SecondsSince(std::chrono::steady_clock::time_point start);

// The answer a log entry gives.
Answer AnswerOf(const TestRecord& t);

// The nodes of a mask in increasing order.
std::vector<int> MaskToList(graph::Mask m);

// REQUIRES: every index < 64.
graph::Mask ListToMask(const std::vector<int>& nodes);

}  // namespace locind::learners
