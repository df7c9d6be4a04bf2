#include "learners/methods/test_runner.h"

#include <algorithm>
#include <bit>
#include <cmath>

namespace locind::learners {

bool TestRunner::Dependent(int source, int target, graph::Mask given) {
  const Key key{given, source * 64 + target};
  if (auto it = answers_.find(key); it != answers_.end()) return it->second;
  TestQuery query{target, {source}, MaskToList(given)};
  const TestResult r = test_.Run(query);
  // A p-value that is not a number is evidence the test could not compute.
  const bool not_estimable = r.status == TestStatus::kNotEstimable || std::isnan(r.p_value);
  // Not estimable counts as dependent: the edge is kept (learners/methods/learner.h).
  const bool dependent = not_estimable || r.p_value <= level_;
  if (not_estimable) ++not_estimable_;
  largest_given_ = std::max(largest_given_, std::popcount(given));
  log_.push_back(TestRecord{target, std::move(query.sources), std::move(query.given), r.statistic,
                            r.df, r.p_value, r.status, dependent});
  answers_.emplace(key, dependent);
  return dependent;
}

const bool* TestRunner::Known(int source, int target, graph::Mask given) const {
  auto it = answers_.find(Key{given, source * 64 + target});
  return it == answers_.end() ? nullptr : &it->second;
}

void TestRunner::Fill(LearnResult& result) const {
  result.test_kind = test_.kind();
  result.log = log_;
  result.tests = static_cast<int>(log_.size());
  result.not_estimable = not_estimable_;
  result.largest_given = largest_given_;
}

double SecondsSince(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

std::vector<int> MaskToList(graph::Mask m) {
  std::vector<int> out;
  for (; m != 0; m &= m - 1) out.push_back(std::countr_zero(m));
  return out;
}

graph::Mask ListToMask(const std::vector<int>& nodes) {
  graph::Mask m = 0;
  for (int v : nodes) m |= graph::Bit(v);
  return m;
}

}  // namespace locind::learners
