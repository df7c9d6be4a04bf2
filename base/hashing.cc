#include "base/hashing.h"

namespace locind::base {

uint64_t MixBits(uint64_t x) {
  x += 0x9e3779b97f4a7c15ULL;
  x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
  x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
  return x ^ (x >> 31);
}

uint64_t HashText(std::string_view text) {
  uint64_t h = 14695981039346656037ull;  // FNV-1a 64 offset basis, 0xcbf29ce484222325
  for (unsigned char ch : text) {
    h ^= ch;
    h *= 1099511628211ull;  // FNV prime
  }
  return h;
}

}  // namespace locind::base
