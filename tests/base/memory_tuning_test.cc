// KeepFreedMemory: a block of a few MiB comes from the heap (not a fresh
// mapping) and stays in the heap after it is freed. glibc's counters
// (mallinfo2: hblks = mapped blocks, fordblks = free bytes kept in the heap;
// glibc manual, "Statistics for Memory Allocation with malloc") tell which.
#include "base/memory_tuning.h"

#include <doctest/doctest.h>

#include <cstdlib>
#include <cstring>

#if defined(__GLIBC__)
#include <malloc.h>
#endif

namespace locind::base {
namespace {

#if defined(__GLIBC__) && !defined(__SANITIZE_ADDRESS__)
TEST_CASE("KeepFreedMemory serves an 8 MiB block from the heap and keeps it after free") {
  KeepFreedMemory();
  KeepFreedMemory();  // idempotent
  constexpr size_t kBytes = 8u << 20;
  const size_t mapped_before = mallinfo2().hblks;
  char* block = static_cast<char*>(std::malloc(kBytes));
  REQUIRE(block != nullptr);
  std::memset(block, 1, kBytes);
  CHECK(mallinfo2().hblks == mapped_before);  // not a separate mapping
  std::free(block);
  CHECK(mallinfo2().fordblks >= kBytes);  // kept for reuse, not trimmed
}
#else
TEST_CASE("KeepFreedMemory can be called without glibc") { KeepFreedMemory(); }
#endif

}  // namespace
}  // namespace locind::base
