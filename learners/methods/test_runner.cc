#include "learners/methods/test_runner.h"

#include <algorithm>
#include <bit>
#include <cmath>
#include <map>

namespace locind::learners {

Answer AnswerOf(const TestRecord& t) {
  if (t.status == TestStatus::kNotEstimable) return Answer::kUnknown;
  return t.dependent ? Answer::kConnected : Answer::kSeparated;
}

Answer TestRunner::Ask(int source, int target, graph::Mask given) {
  const Key key{given, source * 64 + target};
  if (auto it = answers_.find(key); it != answers_.end()) return AnswerOf(log_[it->second]);
  TestQuery query{target, {source}, MaskToList(given)};
  TestResult r = test_.Run(query);
  // A p-value that is not a number is evidence the test could not compute.
  const bool not_estimable = r.status == TestStatus::kNotEstimable || std::isnan(r.p_value);
  TestRecord t;
  t.target = target;
  t.sources = std::move(query.sources);
  t.given = std::move(query.given);
  t.statistic = r.statistic;
  t.df = r.df;
  t.p_value = r.p_value;
  if (not_estimable) {
    // Neither a separation nor a dependence (learners/methods/learner.h); the
    // in-memory default p = 1 of a not-estimable result must not look like
    // evidence of independence.
    ++not_estimable_;
    t.status = TestStatus::kNotEstimable;
    t.p_value = NAN;
    t.reason = r.reason.empty() ? std::string("not estimable") : r.reason;
  } else {
    t.dependent = r.p_value <= level_;
  }
  largest_given_ = std::max(largest_given_, std::popcount(given));
  answers_.emplace(key, log_.size());
  log_.push_back(std::move(t));
  return AnswerOf(log_.back());
}

std::optional<Answer> TestRunner::Known(int source, int target, graph::Mask given) const {
  const TestRecord* t = Record(source, target, given);
  if (t == nullptr) return std::nullopt;
  return AnswerOf(*t);
}

const TestRecord* TestRunner::Record(int source, int target, graph::Mask given) const {
  auto it = answers_.find(Key{given, source * 64 + target});
  return it == answers_.end() ? nullptr : &log_[it->second];
}

TestRecord TestRunner::Witness(int source, int target, graph::Mask given, bool connected) const {
  // The log entry only when it gave this answer: a graph may imply a
  // separation the test did not find, and then the graph is the witness.
  if (const TestRecord* t = Record(source, target, given);
      t != nullptr && AnswerOf(*t) == (connected ? Answer::kConnected : Answer::kSeparated)) {
    return *t;
  }
  TestRecord t;
  t.target = target;
  t.sources = {source};
  t.given = MaskToList(given);
  t.statistic = t.df = t.p_value = NAN;
  t.dependent = connected;
  t.implied = true;
  return t;
}

void TestRunner::Fill(LearnResult& result) const {
  result.test_kind = test_.kind();
  result.log = log_;
  result.tests = static_cast<int>(log_.size());
  result.not_estimable = not_estimable_;
  result.largest_given = largest_given_;
}

EdgeDecision MakeDecision(const graph::Edge& e, bool kept, const char* phase, const char* rule,
                          std::vector<TestRecord> witnesses) {
  EdgeDecision d;
  d.edge = e;
  d.kept = kept;
  d.phase = phase;
  d.rule = rule;
  d.witnesses = std::move(witnesses);
  return d;
}

namespace {

constexpr size_t kMaxUndecidedWitnesses = 5;

// Log indices of the single-source tests of each ordered pair (source, target).
std::map<std::pair<int, int>, std::vector<size_t>> IndexByPair(const std::vector<TestRecord>& log) {
  std::map<std::pair<int, int>, std::vector<size_t>> out;
  for (size_t i = 0; i < log.size(); ++i) {
    if (log[i].sources.size() == 1) out[{log[i].sources[0], log[i].target}].push_back(i);
  }
  return out;
}

void AddOwnEvidence(const std::vector<TestRecord>& log,
                    const std::map<std::pair<int, int>, std::vector<size_t>>& index,
                    EdgeDecision& d) {
  std::vector<size_t> own;
  auto add = [&](int source, int target) {
    if (auto it = index.find({source, target}); it != index.end()) {
      own.insert(own.end(), it->second.begin(), it->second.end());
    }
  };
  add(d.edge.from, d.edge.to);
  if (d.edge.kind == graph::EdgeKind::kBidirected) add(d.edge.to, d.edge.from);
  std::sort(own.begin(), own.end());
  std::vector<TestRecord> unknown;
  const TestRecord* closest = nullptr;
  for (size_t i : own) {
    const TestRecord& t = log[i];
    if (t.status == TestStatus::kNotEstimable) {
      if (unknown.size() < kMaxUndecidedWitnesses) unknown.push_back(t);
    } else if (t.dependent && (closest == nullptr || t.p_value > closest->p_value)) {
      closest = &t;
    }
  }
  if (!unknown.empty()) {
    d.undecided = true;
    d.rule = "not estimable";
    if (d.witnesses.empty()) d.witnesses = std::move(unknown);
  } else if (d.witnesses.empty() && closest != nullptr) {
    d.witnesses.push_back(*closest);
  }
}

}  // namespace

void FinishDecisions(LearnResult& result) {
  std::sort(result.decisions.begin(), result.decisions.end(),
            [](const EdgeDecision& x, const EdgeDecision& y) { return x.edge < y.edge; });
  std::map<graph::Edge, bool> dashed;
  if (result.has_marks) {
    for (size_t i = 0; i < result.edges.size(); ++i) dashed[result.edges[i]] = result.dashed[i];
  }
  const auto index = IndexByPair(result.log);
  for (EdgeDecision& d : result.decisions) {
    if (!d.kept) continue;
    if (auto it = dashed.find(d.edge); it != dashed.end()) d.mark = it->second ? "dashed" : "solid";
    if (!d.undecided) AddOwnEvidence(result.log, index, d);
  }
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
