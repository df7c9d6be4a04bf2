#include "base/random_stream.h"

namespace locind::base {

uint64_t StreamSeed(const StreamKey& key) {
  uint64_t h = MixBits(key.seed);
  h = MixBits(h ^ key.cell);
  h = MixBits(h ^ key.replicate);
  return MixBits(h ^ key.purpose);
}

}  // namespace locind::base
