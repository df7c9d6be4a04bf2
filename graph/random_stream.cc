#include "graph/random_stream.h"

namespace locind::graph {

uint64_t MixBits(uint64_t x) {
  x += 0x9e3779b97f4a7c15ULL;
  x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
  x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
  return x ^ (x >> 31);
}

uint64_t StreamSeed(const StreamKey& key) {
  uint64_t h = MixBits(key.seed);
  h = MixBits(h ^ key.cell);
  h = MixBits(h ^ key.replicate);
  return MixBits(h ^ key.purpose);
}

}  // namespace locind::graph
