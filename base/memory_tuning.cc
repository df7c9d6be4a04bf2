#include "base/memory_tuning.h"

#include <cstdlib>  // defines __GLIBC__ on glibc systems

#if defined(__GLIBC__)
#include <malloc.h>
#endif

namespace locind::base {

void KeepFreedMemory() {
#if defined(__GLIBC__)
  // M_MMAP_THRESHOLD above 32 MiB is refused by glibc (HEAP_MAX_SIZE / 2 on
  // 64-bit); setting it also switches off the dynamic threshold, which
  // otherwise only rises after a mapped block is freed and is undone by
  // trimming. A trim threshold well above the threshold keeps freed blocks.
  mallopt(M_MMAP_THRESHOLD, 32 * 1024 * 1024);
  mallopt(M_TRIM_THRESHOLD, 256 * 1024 * 1024);
#endif
}

}  // namespace locind::base
