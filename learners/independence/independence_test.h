// IndependenceTest: the one question every learner asks of the data.
//
// "Is b locally independent of A given C?" (Didelez 2008; Mogensen, Malinsky
// & Hansen 2018). Processes are indexed 0..processes()-1 in the order of the
// observed data. A test returns the statistic, its degrees of freedom, the
// p-value and a status; learners see nothing else. Implementations cache
// answers by (b, A, C) for their data set.
#pragma once

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace locind::learners {

enum class TestStatus { kOk, kNotEstimable };

struct TestResult {
  double statistic = 0;
  double df = 0;
  double p_value = 1;
  TestStatus status = TestStatus::kOk;
  std::string reason;  // why not estimable (too few events, singular design, failed fit)
};

// A not-estimable result with its reason. The p-value stays at its
// in-memory default of 1 but is never written to a file: callers check
// `status` first (not estimable is neither separation nor dependence).
inline TestResult NotEstimable(std::string reason) {
  TestResult r;
  r.status = TestStatus::kNotEstimable;
  r.reason = std::move(reason);
  return r;
}

// A query: b locally independent of A given C. A and C are disjoint, sorted
// and may contain b (b in C is the usual case: its own past).
struct TestQuery {
  int target = 0;
  std::vector<int> sources;
  std::vector<int> given;
};

class IndependenceTest {
 public:
  virtual ~IndependenceTest() = default;
  virtual int processes() const = 0;
  virtual const std::vector<std::string>& names() const = 0;
  // A short name for logs ("oracle", "hawkes-lr", ...).
  virtual std::string kind() const = 0;
  // REQUIRES: indices in range; sources non-empty and disjoint from given.
  virtual TestResult Run(const TestQuery& query) = 0;
};

}  // namespace locind::learners
