// RandomStream: the single seam for randomness.
//
// Every random draw in locind comes from a stream keyed by (study seed, cell,
// replicate, purpose), so each draw can be reproduced alone and no result
// depends on thread count, order or how work was split. Keys are mixed with
// SplitMix64 (Steele, Lea & Flood 2014, OOPSLA) into the seed of a
// Boost.Random mt19937_64 engine.
#pragma once

#include <cstdint>

#include <boost/random/mersenne_twister.hpp>
#include <boost/random/uniform_01.hpp>

#include "base/hashing.h"

namespace locind::base {

struct StreamKey {
  uint64_t seed = 0;
  uint64_t cell = 0;
  uint64_t replicate = 0;
  uint64_t purpose = 0;  // distinguishes streams of one replicate (truth, data, ...)
};

uint64_t StreamSeed(const StreamKey& key);

class RandomStream {
 public:
  explicit RandomStream(const StreamKey& key) : engine_(StreamSeed(key)) {}
  explicit RandomStream(uint64_t seed) : engine_(MixBits(seed)) {}

  // Uniform on [0, 1).
  double Uniform() { return boost::random::uniform_01<double>()(engine_); }
  boost::random::mt19937_64& engine() { return engine_; }

 private:
  boost::random::mt19937_64 engine_;
};

}  // namespace locind::base
