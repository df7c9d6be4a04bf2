// KeepFreedMemory: tells the C library's allocator to keep freed blocks of up
// to 32 MiB in its heap for reuse instead of returning them to the system.
//
// Why: the likelihood fits allocate and free n x p matrices of a few MB many
// times per test. glibc serves blocks above its mmap threshold with fresh
// mappings, and trims the heap top on free, so every such block was
// page-faulted anew; on the shared (virtualised) build machine that cost more
// than the arithmetic (bench/learners_tests_bench.cc). Numbers are unchanged:
// only where memory comes from changes. The price: each allocator arena (one
// per thread, roughly) keeps its high-water mark, up to 256 MiB of free
// space at its top, instead of returning it; freed blocks are reused by the
// next allocations, so a run's resident size stays near its peak.
#pragma once

namespace locind::base {

// Sets the mmap threshold to 32 MiB (glibc's largest) and the trim threshold
// to 256 MiB. Call once at program start, before threads start. A no-op when
// the C library is not glibc. Process-wide; idempotent.
void KeepFreedMemory();

}  // namespace locind::base
