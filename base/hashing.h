// Hashing: the two mixing functions that every random stream and every cell
// key of a study depend on. Changing either changes every simulated number,
// so both are checked against published test vectors
// (tests/base/hashing_test.cc).
#pragma once

#include <cstdint>
#include <string_view>

namespace locind::base {

// One SplitMix64 output step applied to x (Steele, Lea & Flood 2014, OOPSLA,
// "Fast splittable pseudorandom number generators": the state is advanced by
// the golden gamma 0x9e3779b97f4a7c15, then mixed).
uint64_t MixBits(uint64_t x);

// FNV-1a, 64 bits (Fowler, Noll & Vo; IETF draft-eastlake-fnv, offset basis
// 14695981039346656037, prime 1099511628211).
uint64_t HashText(std::string_view text);

}  // namespace locind::base
