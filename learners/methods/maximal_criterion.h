// The complete criterion: which edges belong to the maximal graph, decided
// from separations alone.
//
// Write conn(c, d | C) for "d is mu-connected from c given C" (c not in C) in
// the independence model I of the observed system, and N for the maximal
// graph of its Markov equivalence class. Then, for distinct a, b:
//
//   a -> a in N  iff  (L)  conn(a, a | C) for every C not containing a.
//
//   a -> b in N  iff  (D1) conn(a, b | C) for every C not containing a;
//                     (D2) for every C containing neither a nor b and every d:
//                          conn(a, d | C) implies conn(b, d | C);
//                     (D3) for every C with b in C and a not in C, every
//                          g outside C + {a} and every d:
//                          conn(g, d | C + {a}) implies conn(g, d | C).
//
//   a <-> b in N iff  (B1) conn(a, b | C) for every C not containing a, and
//                          conn(b, a | C) for every C not containing b;
//                     (B2) for every C with a in C, every g outside C:
//                          conn(g, a | C) implies conn(g, b | C);
//                          and the same with a and b exchanged.
//
// Necessity (proved): by docs/theory.md F2 an edge e is in N iff N + e has the
// separations of N. (D2): in N + (a -> b) the walk b <- a ~> d is
// mu-connecting whenever a ~> d is (a becomes a non-collider outside C).
// (D3): adding a -> b with b in C puts a and its ancestors into An(C), so
// every walk open given C + {a} is open given C; only g and d with
// conn(g, a | C) and conn(a, d | C) can break it (derivation in the .cc).
// (B2): in N + (a <-> b), a walk g ~> a continues through the collider a
// (in C) to b. The conditions follow the potential-parent and
// potential-sibling conditions of Mogensen, Malinsky & Hansen (2018, UAI;
// recalled from memory and restated in our own terms); docs/theory.md F6 (i) and
// (ii) are further necessary conditions, used only for pruning.
//
// Sufficiency (checked, not proved): on all 4,096 DMGs with 3 nodes and on
// 2,000 + 2,000 random projected graphs with 4 to 7 observed nodes
// (tests/learners/methods/maximal_search_test.cc, exhaustive_learner_test.cc), and on
// 40,000 more with 4 to 8 nodes while developing, the criterion gives exactly
// graph::MaximalGraph. The same checks pass when (D2) is asked only for d in
// C + {a, b} and C inside An(b), which is what the code does (far fewer
// questions); that restriction is also empirical.
//
// The answers come through a SeparationAnswers object, so the same criterion
// runs on a full table of separations (the `exhaustive` method) or on
// answers asked lazily and partly implied by known graphs (`maximal-search`).
#pragma once

#include "graph/bit_graph.h"

namespace locind::learners {

// Answers that could not be computed (not estimable) are neither
// separations nor connections: Connected() includes them (so they never
// serve as the separation that breaks a condition) and Unknown() names them,
// so the criterion never uses them as the connection a condition starts
// from either. An edge whose conditions hang on such an answer is kept.
class SeparationAnswers {
 public:
  virtual ~SeparationAnswers() = default;
  virtual int size() const = 0;
  // The members d of `targets` with conn(c, d | given), or whose answer is
  // unknown. REQUIRES: c not in given.
  virtual graph::Mask Connected(int c, graph::Mask given, graph::Mask targets) = 0;
  // Among the answers already asked, the d whose conn(c, d | given) is
  // unknown (not estimable); 0 when every answer is known.
  virtual graph::Mask Unknown(int, graph::Mask) { return 0; }
  // A superset of the d with conn(c, d | given), known without asking
  // anything (every node when nothing is known). REQUIRES: c not in given.
  virtual graph::Mask Possible(int c, graph::Mask given) = 0;
  // A subset of the d with conn(c, d | given), known without asking.
  virtual graph::Mask Certain(int c, graph::Mask given) = 0;
  // A superset of An(given) known without asking (every node when unknown).
  virtual graph::Mask PossibleAncestors(graph::Mask given) = 0;
  // A subset of An(given) known without asking (at least `given` itself).
  virtual graph::Mask KnownAncestors(graph::Mask given) = 0;
};

// The answers that broke a condition: the premise conn(premise_source,
// premise_target | premise_given) held and the conclusion
// conn(conclusion_source, conclusion_target | conclusion_given) did not.
struct Violation {
  const char* rule = "";  // "D2", "D3" or "B2"
  int premise_source = 0;
  int premise_target = 0;
  graph::Mask premise_given = 0;
  int conclusion_source = 0;
  int conclusion_target = 0;
  graph::Mask conclusion_given = 0;
};

// (L), (D1) for a loop or a directed edge; (B1) is InseparableBothWays.
bool Inseparable(SeparationAnswers& answers, int a, int b);
bool InseparableBothWays(SeparationAnswers& answers, int a, int b);

// (D2) and (D3) for a -> b, a != b (D1 is not rechecked). When false and
// `why` is set, *why names the condition and the two answers that broke it.
bool DirectedConditionsHold(SeparationAnswers& answers, int a, int b, Violation* why = nullptr);
// (B2) for a <-> b (B1 is not rechecked); `why` as above.
bool BidirectedConditionsHold(SeparationAnswers& answers, int a, int b, Violation* why = nullptr);

}  // namespace locind::learners
