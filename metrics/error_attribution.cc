#include "metrics/error_attribution.h"

#include <algorithm>

#include "metrics/replicate_score.h"

namespace locind::metrics {
namespace {

using learners::EdgeDecision;
using learners::TestRecord;
using learners::TestStatus;

bool IsWrong(TestVerdict v) {
  return v == TestVerdict::kFalseSeparation || v == TestVerdict::kFalseDependence;
}

// A test of the edge's own pair: target = head and source = tail (either way
// round for a bidirected edge).
bool OwnPair(const graph::Edge& e, const TestRecord& t) {
  if (t.sources.size() != 1) return false;
  if (t.sources[0] == e.from && t.target == e.to) return true;
  return e.kind == graph::EdgeKind::kBidirected && t.sources[0] == e.to && t.target == e.from;
}

// The first test of the log with a verdict accepted by `pick`, or nullopt.
template <typename Pick>
std::optional<TestRecord> FirstInLog(const std::vector<TestRecord>& log,
                                     const std::vector<TestVerdict>& verdicts, Pick pick) {
  for (size_t i = 0; i < log.size(); ++i) {
    if (pick(verdicts[i])) return log[i];
  }
  return std::nullopt;
}

// The earliest test error that can explain a wrong implied answer: a false
// separation shrinks the method's graph; without one, any wrong test.
std::optional<TestRecord> EarliestError(const std::vector<TestRecord>& log,
                                        const std::vector<TestVerdict>& verdicts) {
  if (auto t = FirstInLog(log, verdicts,
                          [](TestVerdict v) { return v == TestVerdict::kFalseSeparation; })) {
    return t;
  }
  return FirstInLog(log, verdicts, IsWrong);
}

AttributedEdge AttributeMissed(const graph::Edge& e, const EdgeDecision* d, TestJudge& judge,
                               const std::vector<TestRecord>& log,
                               const std::vector<TestVerdict>& verdicts) {
  AttributedEdge a{e, true, ErrorCause::kReach, std::string(), std::nullopt};
  if (d == nullptr) return a;
  a.rule = d->rule;
  std::vector<TestVerdict> judged;
  for (const TestRecord& w : d->witnesses) judged.push_back(judge.Judge(w));
  for (size_t i = 0; i < judged.size(); ++i) {
    const TestRecord& w = d->witnesses[i];
    if (!w.implied && OwnPair(e, w) && judged[i] == TestVerdict::kFalseSeparation) {
      a.cause = ErrorCause::kOwnTest;
      a.blamed = w;
      return a;
    }
  }
  for (size_t i = 0; i < judged.size(); ++i) {
    if (!IsWrong(judged[i])) continue;
    a.cause = ErrorCause::kPropagation;
    a.blamed = d->witnesses[i].implied ? EarliestError(log, verdicts) : d->witnesses[i];
    if (!a.blamed) a.cause = ErrorCause::kReach;  // a graph wrong with no wrong test: the rule
    return a;
  }
  return a;
}

bool UsesOtherPairs(const EdgeDecision* d) {
  return d != nullptr && d->phase != "test" && d->phase != "screen" && d->phase != "fit";
}

// A kept edge whose record explains it in full: margin-search's "own
// evidence" names the separation it set aside and the edge's own tests.
bool SelfExplained(const EdgeDecision* d, TestJudge& judge) {
  if (d == nullptr || d->rule != "own evidence" || d->witnesses.empty()) return false;
  for (const TestRecord& w : d->witnesses) {
    if (IsWrong(judge.Judge(w))) return false;
  }
  return true;
}

AttributedEdge AttributeFalse(const graph::Edge& e, const EdgeDecision* d, TestJudge& judge,
                              const std::vector<TestRecord>& log,
                              const std::vector<TestVerdict>& verdicts) {
  AttributedEdge a{e, false, ErrorCause::kReach, std::string(), std::nullopt};
  if (d != nullptr) a.rule = d->rule;
  std::optional<TestRecord> unknown;
  for (size_t i = 0; i < log.size(); ++i) {
    if (!OwnPair(e, log[i])) continue;
    if (verdicts[i] == TestVerdict::kFalseDependence) {
      a.cause = ErrorCause::kOwnTest;
      a.blamed = log[i];
      return a;
    }
    if (verdicts[i] == TestVerdict::kNotEstimable && !unknown) unknown = log[i];
  }
  if (unknown || (d != nullptr && d->undecided)) {
    a.cause = ErrorCause::kNotEstimable;
    a.blamed = unknown ? unknown
                       : (d->witnesses.empty() ? std::nullopt
                                               : std::optional<TestRecord>(d->witnesses[0]));
    return a;
  }
  if (SelfExplained(d, judge)) return a;  // every answer it rests on is right: the method's rule
  if (UsesOtherPairs(d)) {
    if (auto t = FirstInLog(log, verdicts, IsWrong)) {
      a.cause = ErrorCause::kPropagation;
      a.blamed = t;
    }
  }
  return a;
}

void Count(const AttributedEdge& a, ErrorAttribution& out) {
  if (a.missed) {
    int* field[] = {&out.missed_own_test, &out.missed_propagation, &out.missed_reach,
                    &out.missed_reach};
    ++*field[static_cast<int>(a.cause)];
  } else {
    int* field[] = {&out.false_own_test, &out.false_propagation, &out.false_not_estimable,
                    &out.false_reach};
    ++*field[static_cast<int>(a.cause)];
  }
}

}  // namespace

const char* TestVerdictName(TestVerdict v) {
  switch (v) {
    case TestVerdict::kCorrect: return "correct";
    case TestVerdict::kFalseSeparation: return "false separation";
    case TestVerdict::kFalseDependence: return "false dependence";
    case TestVerdict::kNotEstimable: return "not estimable";
  }
  return "";
}

const char* ErrorCauseName(ErrorCause c) {
  switch (c) {
    case ErrorCause::kOwnTest: return "own_test";
    case ErrorCause::kPropagation: return "propagation";
    case ErrorCause::kNotEstimable: return "not_estimable";
    case ErrorCause::kReach: return "reach";
  }
  return "";
}

ErrorAttribution& ErrorAttribution::operator+=(const ErrorAttribution& o) {
  tests.correct += o.tests.correct;
  tests.false_separation += o.tests.false_separation;
  tests.false_dependence += o.tests.false_dependence;
  tests.not_estimable += o.tests.not_estimable;
  missed_own_test += o.missed_own_test;
  missed_propagation += o.missed_propagation;
  missed_reach += o.missed_reach;
  false_own_test += o.false_own_test;
  false_propagation += o.false_propagation;
  false_not_estimable += o.false_not_estimable;
  false_reach += o.false_reach;
  return *this;
}

TestVerdict TestJudge::Judge(const TestRecord& t) {
  if (t.status == TestStatus::kNotEstimable) return TestVerdict::kNotEstimable;
  // The oracle answers p = 1 exactly when the null holds in the projection.
  const bool separated = oracle_.Run({t.target, t.sources, t.given}).p_value == 1;
  if (separated == !t.dependent) return TestVerdict::kCorrect;
  return separated ? TestVerdict::kFalseDependence : TestVerdict::kFalseSeparation;
}

const EdgeDecision* FindDecision(const learners::LearnResult& result, const graph::Edge& e) {
  for (const EdgeDecision& d : result.decisions) {
    if (d.edge == e) return &d;
  }
  return nullptr;
}

int ContradictingDecisions(const learners::LearnResult& result) {
  int bad = 0;
  for (const EdgeDecision& d : result.decisions) {
    if (d.kept || d.witnesses.empty()) continue;
    const TestRecord& w = d.witnesses[0];
    if (w.dependent || w.status == TestStatus::kNotEstimable) ++bad;
  }
  return bad;
}

ErrorAttribution AttributeErrors(const TruthClass& truth_class,
                                 const learners::LearnResult& result) {
  ErrorAttribution out;
  TestJudge judge(truth_class.projected);
  std::vector<TestVerdict> verdicts;
  verdicts.reserve(result.log.size());
  for (const TestRecord& t : result.log) {
    verdicts.push_back(judge.Judge(t));
    int* field[] = {&out.tests.correct, &out.tests.false_separation, &out.tests.false_dependence,
                    &out.tests.not_estimable};
    ++*field[static_cast<int>(verdicts.back())];
  }
  for (const EdgeAudit& audit : AuditEdges(truth_class, result.graph)) {
    const EdgeDecision* d = FindDecision(result, audit.edge);
    if (audit.truth == TruthStatus::kSolid && !audit.reported) {
      out.edges.push_back(AttributeMissed(audit.edge, d, judge, result.log, verdicts));
    } else if (audit.truth == TruthStatus::kAbsent && audit.reported) {
      out.edges.push_back(AttributeFalse(audit.edge, d, judge, result.log, verdicts));
    } else {
      continue;
    }
    Count(out.edges.back(), out);
  }
  return out;
}

}  // namespace locind::metrics
