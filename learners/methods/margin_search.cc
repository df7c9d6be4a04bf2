#include "learners/methods/margin_search.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <string>
#include <tuple>

#include "graph/mu_separation.h"
#include "graph/separation_model.h"
#include "learners/methods/equivalence_marks.h"
#include "learners/methods/test_runner.h"

namespace locind::learners {

double SeparationMargin(double level) { return std::max(level, 0.2); }
double StrongDependence(double level) { return level / 10; }

bool ExactAnswer(const TestResult& r) {
  return r.status == TestStatus::kOk && r.df == 0 && (r.p_value == 0 || r.p_value == 1);
}

bool Refutes(double q, bool exact, double p_e, double level) {
  if (std::isnan(q) || q <= level) return false;  // not a separation at all
  if (exact) return true;  // no sampling error: the rule of maximal-search
  if (q <= SeparationMargin(level)) return false;  // (M)
  return std::isnan(p_e) || p_e > StrongDependence(level);          // (S)
}

namespace {

using graph::Bit;
using graph::BitGraph;
using graph::CompleteGraph;
using graph::Contains;
using graph::Edge;
using graph::EdgeKind;
using graph::Mask;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Passes every query to the wrapped test and keeps each result, so the
// search can read p-values (the TestRunner keeps only the decision).
class AnswerTap : public IndependenceTest {
 public:
  explicit AnswerTap(IndependenceTest& test) : test_(test) {}
  int processes() const override { return test_.processes(); }
  const std::vector<std::string>& names() const override { return test_.names(); }
  std::string kind() const override { return test_.kind(); }
  TestResult Run(const TestQuery& q) override {
    TestResult r = test_.Run(q);
    results_[{q.sources.front(), q.target, ListToMask(q.given)}] = r;
    return r;
  }
  // The result of "d connected from c given `given`", or nullptr if not asked.
  const TestResult* Find(int c, int d, Mask given) const {
    auto it = results_.find({c, d, given});
    return it == results_.end() ? nullptr : &it->second;
  }

 private:
  IndependenceTest& test_;
  std::map<std::tuple<int, int, Mask>, TestResult> results_;
};

// The p-value of a result as evidence: NaN when it could not be computed.
double Evidence(const TestResult& r) {
  return r.status == TestStatus::kNotEstimable ? kNaN : r.p_value;
}

// A remembered separation: `target` separated from `source` given `given`,
// with its p-value (1 when implied by the current graph); exact when implied
// or answered without sampling error.
struct Separation {
  int source;
  int target;
  Mask given;
  double p;
  bool implied;
  bool exact;
};

using EdgeKey = std::tuple<int, int, int>;
EdgeKey KeyOf(const Edge& e) { return {e.from, e.to, static_cast<int>(e.kind)}; }

struct State {
  State(AnswerTap& t, TestRunner& r, double lv)
      : tap(t), runner(r), level(lv), n(r.processes()), upper(CompleteGraph(n)), lower(n) {}

  AnswerTap& tap;
  TestRunner& runner;
  double level;
  int n;
  BitGraph upper;  // contains the maximal graph under the oracle
  BitGraph lower;  // the loops: contained in the maximal graph
  std::vector<Mask> inseparable_from = std::vector<Mask>(n, 0);
  std::vector<Separation> separations;  // those that refute some edge: (M) or implied
  // own[a * n + b]: largest p of the tests "b from a" made in phase (i); NaN
  // once one of them was not estimable.
  std::vector<double> own = std::vector<double>(n * n, 0.0);
  std::vector<std::vector<Mask>> own_sets = std::vector<std::vector<Mask>>(n * n);
  std::map<EdgeKey, EdgeDecision> decisions;
  int pruned = 0;
  int final_removed = 0;
  int kept_by_evidence = 0;  // kept although an ordinary separation contradicted them
};

TestRecord Witness(const State& s, int c, int d, Mask given) {
  TestRecord w;
  w.target = d;
  w.sources = {c};
  w.given = MaskToList(given);
  if (const TestResult* r = s.tap.Find(c, d, given)) {
    w.statistic = r->statistic;
    w.df = r->df;
    w.p_value = Evidence(*r);
    w.status = r->status;
    w.reason = r->reason;
    w.dependent = r->status == TestStatus::kOk && r->p_value <= s.level;
  } else {  // implied by a graph the search holds
    w.statistic = w.df = w.p_value = kNaN;
    w.implied = true;
  }
  return w;
}

// The edge's own evidence p_e (see the header). A test of b from a speaks
// for an edge into b from a's side, which a -> b explains as well as a <-> b;
// nothing in the pair's own tests speaks for the hidden driver that a <-> b
// claims, so a bidirected edge has no own evidence (p_e = 1).
double OwnEvidence(const State& s, const Edge& e) {
  return e.kind == EdgeKind::kDirected ? s.own[e.from * s.n + e.to] : 1.0;
}

// ---- Phase (i): separation, level by level on a snapshot of the graph.

std::vector<int> CandidatePool(const BitGraph& g, int a, int b) {
  const Mask pool = graph::Ancestors(g, Bit(a) | Bit(b)) & ~Bit(a) & ~Bit(b);
  return MaskToList(pool);
}

// True when every node of D has a directed path to a or b inside D + {a, b}
// (maximal_search.cc: the deciding set has this property, so nothing is lost).
bool ReachesPair(const BitGraph& g, int a, int b, Mask d) {
  Mask reached = Bit(a) | Bit(b);
  for (bool grew = true; grew;) {
    grew = false;
    for (int x : MaskToList(d & ~reached)) {
      if ((g.children[x] & reached) != 0) {
        reached |= Bit(x);
        grew = true;
      }
    }
  }
  return (d & ~reached) == 0;
}

// Tries every k-subset D of `pool` (no early stop, so the separations found
// do not depend on the order of the pool) and returns the separations of b
// from a among the C = {b} + D (C = D for a loop).
std::vector<Separation> SearchLevel(State& s, const BitGraph& snapshot, int a, int b,
                                    const std::vector<int>& pool, int k) {
  std::vector<Separation> found;
  const Mask base = a == b ? 0 : Bit(b);
  std::vector<int> pick(k);
  for (int i = 0; i < k; ++i) pick[i] = i;
  const int m = static_cast<int>(pool.size());
  while (true) {
    Mask d = 0;
    for (int i : pick) d |= Bit(pool[i]);
    const Mask c = base | d;
    if (ReachesPair(snapshot, a, b, d)) {
      if (graph::MuSeparated(snapshot, a, b, c)) {
        found.push_back({a, b, c, 1.0, true, true});
      } else {
        s.runner.Dependent(a, b, c);
        const TestResult& r = *s.tap.Find(a, b, c);
        const double p = Evidence(r);
        double& own = s.own[a * s.n + b];
        own = std::isnan(p) || std::isnan(own) ? kNaN : std::max(own, p);
        s.own_sets[a * s.n + b].push_back(c);
        if (p > s.level) found.push_back({a, b, c, p, false, ExactAnswer(r)});
      }
    }
    int i = k - 1;
    while (i >= 0 && pick[i] == m - k + i) --i;
    if (i < 0) return found;
    ++pick[i];
    for (int j = i + 1; j < k; ++j) pick[j] = pick[j - 1] + 1;
  }
}

void RecordSeparated(State& s, int a, int b, const Separation& z) {
  std::vector<Edge> gone = {{a, b, EdgeKind::kDirected}};
  if (a != b) gone.push_back({std::min(a, b), std::max(a, b), EdgeKind::kBidirected});
  for (const Edge& e : gone) {
    EdgeDecision& d = s.decisions[KeyOf(e)];
    if (!d.phase.empty()) continue;  // the other direction removed it first
    d.edge = e;
    d.phase = "separation";
    d.rule = z.implied ? "implied separation" : "separated";
    d.witnesses = {Witness(s, a, b, z.given)};
  }
}

void SeparationPhase(State& s) {
  std::vector<std::pair<int, int>> joined;
  for (int a = 0; a < s.n; ++a)
    for (int b = 0; b < s.n; ++b) joined.emplace_back(a, b);
  for (int k = 0; !joined.empty(); ++k) {
    const BitGraph snapshot = s.upper;  // Colombo & Maathuis (2014): decide a level, then remove
    bool any = false;
    std::vector<std::pair<int, int>> still;
    std::vector<std::pair<int, int>> separated;
    for (auto [a, b] : joined) {
      const std::vector<int> pool = CandidatePool(snapshot, a, b);
      if (static_cast<int>(pool.size()) < k) {
        still.emplace_back(a, b);
        continue;
      }
      any = true;
      const std::vector<Separation> found = SearchLevel(s, snapshot, a, b, pool, k);
      if (found.empty()) {
        still.emplace_back(a, b);
        continue;
      }
      separated.emplace_back(a, b);
      // The record names the separation with the largest p (implied ones first).
      const Separation* best = &found.front();
      for (const Separation& z : found) {
        if (Refutes(z.p, z.exact, kNaN, s.level)) s.separations.push_back(z);
        if (!best->implied && (z.implied || z.p > best->p)) best = &z;
      }
      RecordSeparated(s, a, b, *best);
    }
    for (auto [a, b] : separated) {
      s.upper.Remove({a, b, EdgeKind::kDirected});
      if (a != b) s.upper.Remove({std::min(a, b), std::max(a, b), EdgeKind::kBidirected});
    }
    joined = std::move(still);
    if (!any) break;
  }
  // A pair left only because a test of it could not be computed (own NaN)
  // is not known to be inseparable: it is no premise (learner.h policy).
  for (auto [a, b] : joined) {
    if (!std::isnan(s.own[a * s.n + b])) s.inseparable_from[a] |= Bit(b);
  }
}

// ---- Phase (ii): pruning with remembered separations, no new tests.

// Connected by an answer in hand: an inseparable pair, a test that said
// dependent (p <= level; never one that could not be computed), or a walk in
// the graph of loops.
bool KnownConnected(const State& s, int c, int d, Mask given) {
  if (Contains(given, c)) return false;
  if (Contains(s.inseparable_from[c], d)) return true;
  if (const TestResult* r = s.tap.Find(c, d, given)) {
    return r->status == TestStatus::kOk && r->p_value <= s.level;
  }
  return !graph::MuSeparated(s.lower, c, d, given);
}

// The rule by which `z` rules out a -> b (a != b) in maximal-search, or
// nullptr. Premises are the connections given by KnownConnected.
const char* RuleAgainstDirected(const State& s, const Separation& z, int a, int b) {
  if (Contains(z.given, a)) return nullptr;
  if (z.source == b && KnownConnected(s, a, z.target, z.given)) return "D2";
  if (Contains(z.given, b)) {
    if (z.source != a && KnownConnected(s, z.source, z.target, z.given | Bit(a))) return "D3";
    if (KnownConnected(s, z.source, b, z.given) && KnownConnected(s, a, z.target, z.given)) {
      return "F6(ii)";
    }
  }
  return z.target == b && KnownConnected(s, z.source, a, z.given) ? "F6(i)" : nullptr;
}

const char* RuleAgainstBidirected(const State& s, const Separation& z, int a, int b) {
  if (z.target == b && Contains(z.given, a) && KnownConnected(s, z.source, a, z.given)) {
    return "B2";
  }
  const bool other = z.target == a && Contains(z.given, b) && KnownConnected(s, z.source, b, z.given);
  return other ? "B2" : nullptr;
}

// The premises of a pruning rule, as witnesses after the separation.
void AddPremises(const State& s, const Separation& z, const Edge& e, EdgeDecision& d) {
  const int a = e.from;
  const int b = e.to;
  const auto add = [&](int c, int t, Mask given) {
    if (Contains(given, c)) return;
    TestRecord w = Witness(s, c, t, given);
    w.dependent = w.dependent || w.implied;  // a premise without a test: a connection the graphs imply
    d.witnesses.push_back(w);
  };
  if (d.rule == "D2") add(a, z.target, z.given);
  if (d.rule == "D3") add(z.source, z.target, z.given | Bit(a));
  if (d.rule == "F6(ii)") {
    add(z.source, b, z.given);
    add(a, z.target, z.given);
  }
  if (d.rule == "F6(i)") add(z.source, a, z.given);
  if (d.rule == "B2") add(z.source, z.target == b ? a : b, z.given);
}

// The reverse direction's evidence for a -> b: the largest p of the tests
// "a from b" made in phase (i); NaN when none was made or one was not estimable.
double ReverseEvidence(const State& s, const Edge& e) {
  if (s.own_sets[e.to * s.n + e.from].empty()) return kNaN;
  return s.own[e.to * s.n + e.from];
}

// Rule (R) of the header, for a tested F6(i) separation z against a -> b
// that (S) set aside: when a is strongly dependent on b too, the dependence
// of b on a is as well explained by a driver of both (the reason F6(i)
// exists), so the separation with margin removes the directed edge.
bool RefutesByReverse(const State& s, const Separation& z, const Edge& e) {
  const double p_r = ReverseEvidence(s, e);
  return !z.exact && z.p > SeparationMargin(s.level) && !std::isnan(p_r) &&
         p_r <= StrongDependence(s.level);
}

void PruningPhase(State& s) {
  // A loop left only because a test of it could not be computed is not
  // accepted: it would serve as a premise conn(a, a | C) (learner.h policy).
  for (int a = 0; a < s.n; ++a) {
    if (s.upper.HasDirected(a, a) && !std::isnan(s.own[a * s.n + a])) s.lower.Add({a, a, EdgeKind::kDirected});
  }
  std::vector<Edge> removed;
  for (const Edge& e : graph::ListEdges(s.upper)) {
    if (e.is_loop()) continue;
    const double p_e = OwnEvidence(s, e);
    for (const Separation& z : s.separations) {
      const char* rule = e.kind == EdgeKind::kDirected ? RuleAgainstDirected(s, z, e.from, e.to)
                                                       : RuleAgainstBidirected(s, z, e.from, e.to);
      if (rule == nullptr) continue;
      EdgeDecision& d = s.decisions[KeyOf(e)];
      const bool refutes = Refutes(z.p, z.exact, p_e, s.level);
      const bool by_reverse =
          !refutes && std::string(rule) == "F6(i)" && RefutesByReverse(s, z, e);
      if (!refutes && !by_reverse) {
        // (S) sets it aside; kept for the record if nothing else removes the edge.
        if (d.rule.empty()) {
          d.rule = "own evidence";
          d.witnesses = {Witness(s, z.source, z.target, z.given)};
        }
        continue;
      }
      d.edge = e;
      d.phase = "pruning";
      d.rule = rule;
      d.witnesses = {Witness(s, z.source, z.target, z.given)};
      AddPremises(s, z, e, d);
      if (by_reverse) {
        // (R) settled the conflict: the reverse tests "a from b" follow the
        // premises, so the record shows why the own evidence did not keep it.
        for (Mask given : s.own_sets[e.to * s.n + e.from]) {
          d.witnesses.push_back(Witness(s, e.to, e.from, given));
        }
      }
      removed.push_back(e);
      break;
    }
  }
  for (const Edge& e : removed) s.upper.Remove(e);
  s.pruned = static_cast<int>(removed.size());
}

// ---- Phase (iii): the criterion of maximal_criterion.h, with answers in
// two roles. A premise needs a test that said dependent (or a graph that
// implies the connection); a conclusion fails only on a separation that
// refutes this edge (or one implied by the current graph).

template <typename Visit>
bool ForEachSubset(Mask pool, Visit visit) {
  Mask c = 0;
  while (true) {
    if (!visit(c)) return false;
    if (c == pool) return true;
    c = (c - pool) & pool;
  }
}

class EdgeAnswers {
 public:
  EdgeAnswers(State& s, double p_e) : s_(s), p_e_(p_e) {}

  Mask Possible(int c, Mask given) const { return graph::ConnectedFrom(s_.upper, c, given); }
  Mask PossibleAncestors(Mask given) const { return graph::Ancestors(s_.upper, given); }
  Mask KnownAncestors(Mask given) const { return graph::Ancestors(s_.lower, given); }

  // Connections known without asking (graphs, inseparable pairs, dependent answers).
  Mask Certain(int c, Mask given) const {
    const Mask possible = Possible(c, given);
    Mask known = Implied(c, given, possible);
    for (int d : MaskToList(possible & ~known)) {
      if (KnownConnected(s_, c, d, given)) known |= Bit(d);
    }
    return known;
  }

  // The members of `targets` established as connected from c (premise role).
  Mask Premise(int c, Mask given, Mask targets) {
    const Mask possible = Possible(c, given) & targets;
    Mask known = Implied(c, given, possible);
    for (int d : MaskToList(possible & ~known)) {
      s_.runner.Dependent(c, d, given);
      const TestResult& r = *s_.tap.Find(c, d, given);
      if (r.status == TestStatus::kOk && r.p_value <= s_.level) known |= Bit(d);
      NoteUnknown(r, c, d, given);
    }
    return known;
  }

  // The members of `targets` not refuted as connected from c (conclusion role).
  Mask Conclusion(int c, Mask given, Mask targets) {
    const Mask possible = Possible(c, given) & targets;
    Mask open = possible;
    for (int d : MaskToList(possible & ~Implied(c, given, possible))) {
      s_.runner.Dependent(c, d, given);
      const TestResult& r = *s_.tap.Find(c, d, given);
      const double q = Evidence(r);
      NoteUnknown(r, c, d, given);
      if (Refutes(q, ExactAnswer(r), p_e_, s_.level)) {
        open &= ~Bit(d);
      } else if (q > s_.level && set_aside_.given == kNone) {
        set_aside_ = {c, d, given, q, false, false};
      }
    }
    return open;
  }

  static constexpr Mask kNone = ~Mask{0};
  // The condition that failed, as (source, target, given) queries: the
  // separation first, then the connections that made it a violation (set
  // by DirectedFails and SiblingFailsOneWay when they return a failure).
  std::vector<std::tuple<int, int, Mask>> failure_;
  // Answers the conditions needed that could not be computed (at most 5):
  // an edge kept with any is undecided (learner.h policy, as maximal-search).
  std::vector<TestRecord> unknown_used_;
  Separation set_aside_{0, 0, kNone, 0, false, false};

 private:
  Mask Implied(int c, Mask given, Mask possible) const {
    return (graph::ConnectedFrom(s_.lower, c, given) | s_.inseparable_from[c]) & possible;
  }

  void NoteUnknown(const TestResult& r, int c, int d, Mask given) {
    if (r.status == TestStatus::kNotEstimable && unknown_used_.size() < 5) {
      unknown_used_.push_back(Witness(s_, c, d, given));
    }
  }

  State& s_;
  double p_e_;
};

// (D2) and (D3) for a -> b; the name of the failed condition or nullptr.
const char* DirectedFails(State& s, EdgeAnswers& ans, int a, int b) {
  const Mask all = graph::AllNodes(s.n);
  const Mask pool = ans.PossibleAncestors(Bit(b)) & all & ~Bit(a) & ~Bit(b);
  const bool d2 = ForEachSubset(pool, [&](Mask c) {
    const Mask premise = ans.Possible(a, c) & (c | Bit(a) | Bit(b));
    const Mask from_b = ans.Conclusion(b, c, premise);
    const Mask held = ans.Premise(a, c, premise & ~from_b);
    if (held == 0) return true;
    const int d = MaskToList(held).front();
    ans.failure_ = {{b, d, c}, {a, d, c}};  // d not connected from b, but from a
    return false;
  });
  if (!d2) return "D2";
  const bool d3 = ForEachSubset(all & ~Bit(a) & ~Bit(b), [&](Mask rest) {
    const Mask c = rest | Bit(b);
    if (Contains(ans.KnownAncestors(c), a)) return true;
    for (int g = 0; g < s.n; ++g) {
      if (g == a || Contains(c, g)) continue;
      Mask premise = ans.Possible(g, c | Bit(a)) & ans.Possible(a, c) & ~ans.Certain(g, c);
      if (premise == 0 || ans.Premise(g, c, Bit(a)) == 0) continue;
      premise = ans.Premise(a, c, premise);
      const Mask open = ans.Conclusion(g, c, premise);
      const Mask held = ans.Premise(g, c | Bit(a), premise & ~open);
      if (held == 0) continue;
      const int d = MaskToList(held).front();
      ans.failure_ = {{g, d, c}, {g, a, c}, {a, d, c}, {g, d, c | Bit(a)}};
      return false;
    }
    return true;
  });
  return d3 ? nullptr : "D3";
}

// (B2) one way: with a in C, conn(g, a | C) implies conn(g, b | C).
bool SiblingFailsOneWay(State& s, EdgeAnswers& ans, int a, int b) {
  return !ForEachSubset(graph::AllNodes(s.n) & ~Bit(a), [&](Mask rest) {
    const Mask c = rest | Bit(a);
    for (int g = 0; g < s.n; ++g) {
      if (Contains(c, g) || !Contains(ans.Possible(g, c), a)) continue;
      if (ans.Conclusion(g, c, Bit(b)) != 0) continue;
      if (ans.Premise(g, c, Bit(a)) == 0) continue;
      ans.failure_ = {{g, b, c}, {g, a, c}};  // b not connected from g, but a is
      return false;
    }
    return true;
  });
}

void FinalPhase(State& s) {
  std::vector<Edge> removed;
  for (const Edge& e : graph::ListEdges(s.upper)) {
    if (e.is_loop()) continue;
    EdgeDecision& d = s.decisions[KeyOf(e)];
    EdgeAnswers ans(s, OwnEvidence(s, e));
    const char* failed = nullptr;
    if (e.kind == EdgeKind::kDirected) {
      failed = DirectedFails(s, ans, e.from, e.to);
    } else if (SiblingFailsOneWay(s, ans, e.from, e.to) ||
               SiblingFailsOneWay(s, ans, e.to, e.from)) {
      failed = "B2";
    }
    if (failed != nullptr) {
      d.phase = "final";
      d.rule = std::string(failed);  // not = failed: a g++ 12 -Wrestrict false positive
      // The separation that failed the condition (tested, or implied by the
      // current graph), then the connections that made it a violation.
      d.witnesses.clear();
      for (size_t k = 0; k < ans.failure_.size(); ++k) {
        const auto [c, t, given] = ans.failure_[k];
        TestRecord w = Witness(s, c, t, given);
        if (k > 0) w.dependent = w.dependent || w.implied;  // a premise the graphs imply
        d.witnesses.push_back(w);
      }
      removed.push_back(e);
    } else if (!ans.unknown_used_.empty()) {
      d.undecided = true;
      d.witnesses = ans.unknown_used_;
    } else if (d.rule.empty() && ans.set_aside_.given != EdgeAnswers::kNone) {
      const Separation& z = ans.set_aside_;
      d.rule = std::string("own evidence");  // not = "...": a g++ 12 -Wrestrict false positive
      d.witnesses = {Witness(s, z.source, z.target, z.given)};
    }
  }
  for (const Edge& e : removed) s.upper.Remove(e);
  s.final_removed = static_cast<int>(removed.size());
}

// One record per candidate edge, in ListEdges order of the complete graph.
void FillDecisions(State& s, LearnResult& result) {
  std::map<EdgeKey, bool> dashed;
  for (size_t i = 0; i < result.edges.size(); ++i) dashed[KeyOf(result.edges[i])] = result.dashed[i];
  for (const Edge& e : graph::ListEdges(CompleteGraph(s.n))) {
    EdgeDecision d = s.decisions[KeyOf(e)];
    d.edge = e;
    d.kept = s.upper.Has(e);
    if (d.kept) {
      d.phase = e.is_loop() ? "separation" : "final";
      if (!d.undecided && d.rule != "own evidence") {
        d.rule = e.is_loop() ? "inseparable" : "conditions hold";
        d.witnesses.clear();
      }
      // The tests of the edge's own pair (both directions for a <-> b).
      std::vector<std::pair<int, int>> pairs = {{e.from, e.to}};
      if (e.kind == EdgeKind::kBidirected) pairs.emplace_back(e.to, e.from);
      for (auto [c, t] : pairs) {
        for (Mask given : s.own_sets[c * s.n + t]) d.witnesses.push_back(Witness(s, c, t, given));
      }
      for (const TestRecord& w : d.witnesses) d.undecided |= w.status == TestStatus::kNotEstimable;
      if (d.undecided) {
        // As FinishDecisions (test_runner.h): rule "not estimable", the tests
        // of its own pair that could not be computed as the witnesses.
        d.rule = "not estimable";
        std::erase_if(d.witnesses,
                      [](const TestRecord& w) { return w.status != TestStatus::kNotEstimable; });
      } else if (d.rule == "own evidence") {
        ++s.kept_by_evidence;
      }
      if (auto it = dashed.find(KeyOf(e)); it != dashed.end()) d.mark = it->second ? "dashed" : "solid";
    }
    result.decisions.push_back(std::move(d));
  }
}

}  // namespace

Result<LearnResult> MarginSearch::Learn(const LearnInput& input) {
  if (input.test == nullptr) return Status::Error("margin-search needs an independence test");
  const int n = input.test->processes();
  if (n > graph::kMaxExactNodes) return graph::NodeLimitError("margin-search", n, graph::kMaxExactNodes);
  const auto start = std::chrono::steady_clock::now();
  AnswerTap tap(*input.test);
  TestRunner runner(tap, input.level);
  State s(tap, runner, input.level);
  SeparationPhase(s);
  const size_t separation_tests = runner.tests();
  PruningPhase(s);
  FinalPhase(s);
  LearnResult result;
  result.method = "margin-search";
  SetGraphWithMarks(s.upper, input.test->names(), result);
  runner.Fill(result);
  FillDecisions(s, result);
  if (!result.note.empty()) result.note += "; ";
  result.note += "tests in the separation phase " + std::to_string(separation_tests) +
                 ", in the final phase " + std::to_string(runner.tests() - separation_tests) +
                 "; edges removed by pruning " + std::to_string(s.pruned) + ", by the final phase " +
                 std::to_string(s.final_removed) + "; kept on their own evidence against a separation " +
                 std::to_string(s.kept_by_evidence);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
