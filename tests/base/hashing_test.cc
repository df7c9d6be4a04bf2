// The two mixing functions every random stream and cell key depends on,
// against published test vectors. tests/reference/hashing_vectors.py holds
// the plain Python ports that reproduce every value below.
#include "base/hashing.h"

#include <doctest/doctest.h>

#include <cstdint>

namespace locind::base {
namespace {

constexpr uint64_t kGoldenGamma = 0x9e3779b97f4a7c15ULL;

TEST_CASE("HashText is FNV-1a 64: published test vectors") {
  // FNV reference test suite (Fowler, Noll & Vo, test_fnv.c,
  // www.isthe.com/chongo/tech/comp/fnv), FNV-1a 64-bit vectors; the empty
  // string hashes to the offset basis itself.
  CHECK(HashText("") == 0xcbf29ce484222325ULL);
  CHECK(HashText("a") == 0xaf63dc4c8601ec8cULL);
  CHECK(HashText("foobar") == 0x85944171f73967e8ULL);
}

TEST_CASE("MixBits is one SplitMix64 output step: the reference sequences") {
  // splitmix64.c by Vigna (prng.di.unimi.it): next() adds the golden gamma to
  // the state, then mixes. MixBits(x) is that step applied to state x, so the
  // k-th output (k = 0, 1, ...) from seed s is MixBits(s + k * gamma).
  // Values from a line-by-line Python port (tests/reference/hashing_vectors.py).
  CHECK(MixBits(0) == 0xe220a8397b1dcdafULL);
  CHECK(MixBits(0 + kGoldenGamma) == 0x6e789e6aa1b965f4ULL);
  CHECK(MixBits(0 + 2 * kGoldenGamma) == 0x06c45d188009454fULL);
  // Seed 1234567: 6457827717110365317, 3203168211198807973,
  // 9817491932198370423 in decimal.
  CHECK(MixBits(1234567) == 0x599ed017fb08fc85ULL);
  CHECK(MixBits(1234567 + kGoldenGamma) == 0x2c73f08458540fa5ULL);
  CHECK(MixBits(1234567 + 2 * kGoldenGamma) == 0x883ebce5a3f27c77ULL);
}

}  // namespace
}  // namespace locind::base
