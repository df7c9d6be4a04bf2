#include "learners/methods/maximal_search.h"

#include <algorithm>
#include <bit>
#include <tuple>

#include "graph/mu_separation.h"
#include "graph/separation_model.h"
#include "learners/methods/equivalence_marks.h"
#include "learners/methods/maximal_criterion.h"
#include "learners/methods/test_runner.h"

namespace locind::learners {
namespace {

using graph::BitGraph;
using graph::CompleteGraph;
using graph::Bit;
using graph::Contains;
using graph::Edge;
using graph::EdgeKind;
using graph::Mask;

// A remembered separation: `target` separated from `source` given `given`,
// with the answer that found it (a test, or implied by the current graph).
struct Separation {
  int source;
  int target;
  Mask given;
  TestRecord witness;
};

struct State {
  explicit State(TestRunner& r) : runner(r), n(r.processes()), upper(CompleteGraph(n)), lower(n) {}

  TestRunner& runner;
  int n;
  BitGraph upper;  // always contains the maximal graph (under the oracle)
  BitGraph lower;  // accepted edges: contained in the maximal graph
  std::vector<Mask> inseparable_from = std::vector<Mask>(n, 0);  // [c]: d never separated from c
  // [c]: some separation test of (c, d) was not estimable; such a pair is
  // not known to be inseparable (learners/methods/learner.h).
  std::vector<Mask> unknown_pair = std::vector<Mask>(n, 0);
  std::vector<EdgeDecision> decisions;
  std::vector<Separation> separations;
  int pruned = 0;         // edges removed in phase (ii)
  int final_removed = 0;  // edges removed in phase (iii)
};

// The pool for a k-subset search, b's current neighbours first.
std::vector<int> CandidatePool(const State& s, int a, int b) {
  const Mask pool =
      graph::Ancestors(s.upper, Bit(a) | Bit(b)) & ~Bit(a) & ~Bit(b);
  const Mask near = pool & (s.upper.parents[b] | s.upper.siblings[b]);
  std::vector<int> out = MaskToList(near);
  for (int v : MaskToList(pool & ~near)) out.push_back(v);
  return out;
}

// True when every node of D has a directed path to a or b in the current
// graph with all its nodes in D + {a, b}. The set that decides
// separability, An_N({a, b}) - {a, b} (docs/theory.md F1), has this property in
// the maximal graph N and so in the current graph, which contains N: sets
// without it can be skipped without losing completeness.
bool ReachesPair(const State& s, int a, int b, Mask d) {
  Mask reached = Bit(a) | Bit(b);
  for (bool grew = true; grew;) {
    grew = false;
    for (int x : MaskToList(d & ~reached)) {
      if ((s.upper.children[x] & reached) != 0) {
        reached |= Bit(x);
        grew = true;
      }
    }
  }
  return (d & ~reached) == 0;
}

// Tries every k-subset of `pool` (lexicographic in pool order) as D; true and
// the set in `found` when one separates b from a.
bool SearchLevel(State& s, int a, int b, const std::vector<int>& pool, int k, Mask& found,
                 bool& implied) {
  const Mask base = a == b ? 0 : Bit(b);
  std::vector<int> pick(k);
  for (int i = 0; i < k; ++i) pick[i] = i;
  const int m = static_cast<int>(pool.size());
  while (true) {
    Mask d = 0;
    for (int i : pick) d |= Bit(pool[i]);
    const Mask c = base | d;
    // A separation of the current graph (a supergraph of the maximal graph)
    // holds in the truth too: no test needed.
    if (ReachesPair(s, a, b, d)) {
      if (graph::MuSeparated(s.upper, a, b, c)) {
        found = c;
        implied = true;
        return true;
      }
      const Answer answer = s.runner.Ask(a, b, c);
      if (answer == Answer::kSeparated) {
        found = c;
        return true;
      }
      if (answer == Answer::kUnknown) s.unknown_pair[a] |= Bit(b);
    }
    int i = k - 1;
    while (i >= 0 && pick[i] == m - k + i) --i;
    if (i < 0) return false;
    ++pick[i];
    for (int j = i + 1; j < k; ++j) pick[j] = pick[j - 1] + 1;
  }
}

// Phase (i).
void SeparationPhase(State& s) {
  std::vector<std::pair<int, int>> joined;
  for (int a = 0; a < s.n; ++a)
    for (int b = 0; b < s.n; ++b) joined.emplace_back(a, b);
  for (int k = 0; !joined.empty(); ++k) {
    bool any = false;
    std::vector<std::pair<int, int>> still;
    for (auto [a, b] : joined) {
      const std::vector<int> pool = CandidatePool(s, a, b);
      if (static_cast<int>(pool.size()) < k) {
        still.emplace_back(a, b);
        continue;
      }
      any = true;
      Mask found = 0;
      bool implied = false;
      if (SearchLevel(s, a, b, pool, k, found, implied)) {
        const TestRecord witness = s.runner.Witness(a, b, found, false);
        s.separations.push_back({a, b, found, witness});
        const char* rule = implied ? "implied separation" : "separated";
        s.decisions.push_back(MakeDecision({a, b, EdgeKind::kDirected}, false, "separation", rule,
                                           {witness}));
        s.upper.Remove({a, b, EdgeKind::kDirected});
        const Edge sibling{std::min(a, b), std::max(a, b), EdgeKind::kBidirected};
        if (a != b && s.upper.Has(sibling)) {
          s.decisions.push_back(MakeDecision(sibling, false, "separation", rule, {witness}));
          s.upper.Remove(sibling);
        }
      } else {
        still.emplace_back(a, b);
      }
    }
    joined = std::move(still);
    if (!any) break;
  }
  for (auto [a, b] : joined) {
    if (!Contains(s.unknown_pair[a], b)) s.inseparable_from[a] |= Bit(b);
  }
}

// Connected from answers already in hand: a test made, an inseparable pair,
// or a walk in the accepted graph. A not-estimable answer is not a
// connection. When true and `witnesses` is set, the answer is appended.
bool KnownConnected(const State& s, int c, int d, Mask given,
                    std::vector<TestRecord>* witnesses = nullptr) {
  if (Contains(given, c)) return false;
  bool connected = false;
  if (Contains(s.inseparable_from[c], d)) {
    connected = true;
  } else if (std::optional<Answer> known = s.runner.Known(c, d, given)) {
    connected = *known == Answer::kConnected;
  } else {
    connected = !graph::MuSeparated(s.lower, c, d, given);
  }
  if (connected && witnesses != nullptr) witnesses->push_back(s.runner.Witness(c, d, given, true));
  return connected;
}

// The rule of a pruning removal and its witnesses (the separation first).
struct Pruned {
  const char* rule = nullptr;
  std::vector<TestRecord> witnesses;
};

// The rule by which the remembered separation `z` rules out a -> b (a != b),
// or a null rule.
Pruned RulesOutDirected(const State& s, const Separation& z, int a, int b) {
  Pruned p;
  p.witnesses.push_back(z.witness);
  if (Contains(z.given, a)) return {};
  // Condition (D2) of learners/methods/maximal_criterion.h.
  if (z.source == b && KnownConnected(s, a, z.target, z.given, &p.witnesses)) {
    p.rule = "D2";
    return p;
  }
  if (Contains(z.given, b)) {
    // (D3), and docs/theory.md F6 (ii).
    if (z.source != a && KnownConnected(s, z.source, z.target, z.given | Bit(a), &p.witnesses)) {
      p.rule = "D3";
      return p;
    }
    if (KnownConnected(s, z.source, b, z.given) && KnownConnected(s, a, z.target, z.given)) {
      KnownConnected(s, z.source, b, z.given, &p.witnesses);
      KnownConnected(s, a, z.target, z.given, &p.witnesses);
      p.rule = "F6(ii)";
      return p;
    }
  }
  // docs/theory.md F6 (i).
  if (z.target == b && KnownConnected(s, z.source, a, z.given, &p.witnesses)) {
    p.rule = "F6(i)";
    return p;
  }
  return {};
}

// The rule by which `z` rules out a <-> b: condition (B2) one way or the
// other; or a null rule.
Pruned RulesOutBidirected(const State& s, const Separation& z, int a, int b) {
  Pruned p;
  p.witnesses.push_back(z.witness);
  if ((z.target == b && Contains(z.given, a) &&
       KnownConnected(s, z.source, a, z.given, &p.witnesses)) ||
      (z.target == a && Contains(z.given, b) &&
       KnownConnected(s, z.source, b, z.given, &p.witnesses))) {
    p.rule = "B2";
    return p;
  }
  return {};
}

// Phase (ii). Loops left after phase (i) are in the maximal graph (their
// only condition is inseparability), so they seed the accepted graph first.
void PruningPhase(State& s) {
  for (int a = 0; a < s.n; ++a) {
    if (!s.upper.HasDirected(a, a)) continue;
    // A loop kept only because a test could not be computed is not known to
    // be in the maximal graph: it does not join the accepted graph.
    if (!Contains(s.unknown_pair[a], a)) s.lower.Add({a, a, EdgeKind::kDirected});
    s.decisions.push_back(MakeDecision({a, a, EdgeKind::kDirected}, true, "separation",
                                       "inseparable"));
  }
  for (const Edge& e : graph::ListEdges(s.upper)) {
    if (e.is_loop()) continue;
    for (const Separation& z : s.separations) {
      Pruned p = e.kind == EdgeKind::kDirected ? RulesOutDirected(s, z, e.from, e.to)
                                               : RulesOutBidirected(s, z, e.from, e.to);
      if (p.rule != nullptr) {
        s.decisions.push_back(MakeDecision(e, false, "pruning", p.rule, std::move(p.witnesses)));
        s.upper.Remove(e);
        ++s.pruned;
        break;
      }
    }
  }
}

// Answers for the final phase: implied by the current and accepted graphs
// where possible, asked otherwise.
class ImpliedAnswers : public SeparationAnswers {
 public:
  explicit ImpliedAnswers(State& s) : s_(s) {}
  int size() const override { return s_.n; }
  Mask Connected(int c, Mask given, Mask targets) override {
    const Mask possible = graph::ConnectedFrom(s_.upper, c, given) & targets;
    Mask known = (graph::ConnectedFrom(s_.lower, c, given) | s_.inseparable_from[c]) & possible;
    for (int d : MaskToList(possible & ~known)) {
      if (s_.runner.Dependent(c, d, given)) known |= Bit(d);
    }
    return known;
  }
  // Not-estimable answers among those asked; each one used is kept as a
  // witness of an undecided edge.
  Mask Unknown(int c, Mask given) override {
    if (s_.runner.not_estimable() == 0) return 0;
    Mask out = 0;
    for (int d = 0; d < s_.n; ++d) {
      if (s_.runner.Known(c, d, given) == Answer::kUnknown) {
        out |= Bit(d);
        if (unknown_used.size() < 5) unknown_used.push_back(*s_.runner.Record(c, d, given));
      }
    }
    return out;
  }
  std::vector<TestRecord> unknown_used;  // reset per edge by the caller
  Mask Possible(int c, Mask given) override { return graph::ConnectedFrom(s_.upper, c, given); }
  Mask KnownAncestors(Mask given) override { return graph::Ancestors(s_.lower, given); }
  Mask PossibleAncestors(Mask given) override { return graph::Ancestors(s_.upper, given); }
  Mask Certain(int c, Mask given) override {
    const Mask possible = graph::ConnectedFrom(s_.upper, c, given);
    Mask known = (graph::ConnectedFrom(s_.lower, c, given) | s_.inseparable_from[c]) & possible;
    for (int d : MaskToList(possible & ~known)) {
      if (s_.runner.Known(c, d, given) == Answer::kConnected) {
        known |= Bit(d);
      }
    }
    return known;
  }

 private:
  State& s_;
};

// Phase (iii).
void FinalPhase(State& s) {
  ImpliedAnswers answers(s);
  for (const Edge& e : graph::ListEdges(s.upper)) {
    if (e.is_loop()) continue;
    Violation why;
    answers.unknown_used.clear();
    const bool keep = e.kind == EdgeKind::kDirected
                          ? DirectedConditionsHold(answers, e.from, e.to, &why)
                          : BidirectedConditionsHold(answers, e.from, e.to, &why);
    if (keep) {
      EdgeDecision d = MakeDecision(e, true, "final", "conditions hold");
      const bool own_unknown =
          Contains(s.unknown_pair[e.from], e.to) ||
          (e.kind == EdgeKind::kBidirected && Contains(s.unknown_pair[e.to], e.from));
      if (!answers.unknown_used.empty()) {
        d.undecided = true;
        d.rule = "not estimable";
        d.witnesses = answers.unknown_used;
      }
      // Only edges decided on computed answers join the accepted graph.
      if (!d.undecided && !own_unknown) s.lower.Add(e);
      s.decisions.push_back(std::move(d));
    } else {
      // The separation that broke the condition first, then the connection.
      s.decisions.push_back(MakeDecision(
          e, false, "final", why.rule,
          {s.runner.Witness(why.conclusion_source, why.conclusion_target, why.conclusion_given,
                            false),
           s.runner.Witness(why.premise_source, why.premise_target, why.premise_given, true)}));
      s.upper.Remove(e);
      ++s.final_removed;
    }
  }
}

}  // namespace

Result<LearnResult> MaximalSearch::Learn(const LearnInput& input) {
  if (input.test == nullptr) return Status::Error("maximal-search needs an independence test");
  const int n = input.test->processes();
  if (n > graph::kMaxExactNodes) {
    return graph::NodeLimitError("maximal-search", n, graph::kMaxExactNodes);
  }
  const auto start = std::chrono::steady_clock::now();
  TestRunner runner(*input.test, input.level);
  State s(runner);
  SeparationPhase(s);
  const size_t separation_tests = runner.tests();
  PruningPhase(s);
  FinalPhase(s);
  LearnResult result;
  result.method = "maximal-search";
  SetGraphWithMarks(s.upper, input.test->names(), result);
  runner.Fill(result);
  result.decisions = std::move(s.decisions);
  FinishDecisions(result);
  if (!result.note.empty()) result.note += "; ";
  result.note += "tests in the separation phase " + std::to_string(separation_tests) +
                ", in the final phase " + std::to_string(runner.tests() - separation_tests) +
                "; edges removed by pruning " + std::to_string(s.pruned) + ", by the final phase " +
                std::to_string(s.final_removed);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
