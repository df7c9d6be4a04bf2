#include "learners/methods/maximal_criterion.h"

#include <bit>

namespace locind::learners {
namespace {

using graph::Bit;
using graph::Contains;
using graph::Mask;

// Calls visit(C) for every subset C of `pool` (including the empty set),
// in increasing order of the mask; stops when visit returns false.
template <typename Visit>
bool ForEachSubset(Mask pool, Visit visit) {
  Mask c = 0;
  while (true) {
    if (!visit(c)) return false;
    if (c == pool) return true;
    c = (c - pool) & pool;  // next subset of pool in increasing order
  }
}

}  // namespace

bool Inseparable(SeparationAnswers& answers, int a, int b) {
  const Mask pool = graph::AllNodes(answers.size()) & ~Bit(a);
  return ForEachSubset(pool, [&](Mask c) { return answers.Connected(a, c, Bit(b)) != 0; });
}

bool InseparableBothWays(SeparationAnswers& answers, int a, int b) {
  return Inseparable(answers, a, b) && Inseparable(answers, b, a);
}

namespace {

int Lowest(Mask m) { return std::countr_zero(m); }

void Record(Violation* why, const char* rule, int ps, int pt, Mask pg, int cs, int ct, Mask cg) {
  if (why != nullptr) *why = Violation{rule, ps, pt, pg, cs, ct, cg};
}

}  // namespace

bool DirectedConditionsHold(SeparationAnswers& answers, int a, int b, Violation* why) {
  const int n = answers.size();
  const Mask all = graph::AllNodes(n);
  // (D2): conn(a, d | C) implies conn(b, d | C) for C without a and b. Only
  // d in C + {a, b} and C inside An(b) need checking: restricted so, the
  // criterion still gives exactly the maximal graph on every brute-force
  // check we run (40,000 random graphs with 4 to 8 nodes besides the suites
  // in tests/learners/), with far fewer questions. Ask the conclusion first:
  // where b reaches d the premise need not be asked.
  const Mask pool = answers.PossibleAncestors(Bit(b)) & all & ~Bit(a) & ~Bit(b);
  const bool d2 = ForEachSubset(pool, [&](Mask c) {
    const Mask premise = answers.Possible(a, c) & (c | Bit(a) | Bit(b));
    const Mask from_b = answers.Connected(b, c, premise);
    // An unknown answer is no premise (see SeparationAnswers).
    Mask broken = answers.Connected(a, c, premise & ~from_b);
    broken &= ~answers.Unknown(a, c);
    if (broken == 0) return true;
    Record(why, "D2", a, Lowest(broken), c, b, Lowest(broken), c);
    return false;
  });
  if (!d2) return false;
  // (D3): with b in C and a outside, conn(g, d | C + a) implies conn(g, d | C).
  // When a is already in An(C), An(C + {a}) = An(C) and every walk open given
  // C + {a} is open given C: nothing to check. Otherwise a walk w open given
  // C + {a} but not given C has a collider in An(a) - An(C); cutting w at the
  // first such collider x and following a directed path x -> ... -> a (its
  // nodes lie outside An(C)) gives conn(g, a | C), and cutting at the last
  // one gives conn(a, d | C). So only g with conn(g, a | C) and d with
  // conn(a, d | C) can break (D3).
  return ForEachSubset(all & ~Bit(a) & ~Bit(b), [&](Mask rest) {
    const Mask c = rest | Bit(b);
    if (Contains(answers.KnownAncestors(c), a)) return true;
    for (int g = 0; g < n; ++g) {
      if (g == a || Contains(c, g)) continue;
      // Targets whose conclusion is not already known to hold.
      Mask premise = answers.Possible(g, c | Bit(a)) & answers.Possible(a, c) &
                     ~answers.Certain(g, c);
      if (premise == 0 || answers.Connected(g, c, Bit(a)) == 0) continue;
      premise = answers.Connected(a, c, premise);
      const Mask open = answers.Connected(g, c, premise);
      Mask broken = answers.Connected(g, c | Bit(a), premise & ~open);
      broken &= ~answers.Unknown(g, c | Bit(a));
      if (broken != 0) {
        Record(why, "D3", g, Lowest(broken), c | Bit(a), g, Lowest(broken), c);
        return false;
      }
    }
    return true;
  });
}

namespace {

// (B2) in one direction: with a in C, conn(g, a | C) implies conn(g, b | C).
bool SiblingConditionOneWay(SeparationAnswers& answers, int a, int b, Violation* why) {
  const int n = answers.size();
  return ForEachSubset(graph::AllNodes(n) & ~Bit(a), [&](Mask rest) {
    const Mask c = rest | Bit(a);
    for (int g = 0; g < n; ++g) {
      if (Contains(c, g) || !Contains(answers.Possible(g, c), a)) continue;
      if (answers.Connected(g, c, Bit(b)) != 0) continue;
      const Mask premise = answers.Connected(g, c, Bit(a));
      if ((premise & ~answers.Unknown(g, c)) != 0) {
        Record(why, "B2", g, a, c, g, b, c);
        return false;
      }
    }
    return true;
  });
}

}  // namespace

bool BidirectedConditionsHold(SeparationAnswers& answers, int a, int b, Violation* why) {
  return SiblingConditionOneWay(answers, a, b, why) && SiblingConditionOneWay(answers, b, a, why);
}

}  // namespace locind::learners
