// libFuzzer program for one reader, chosen at compile time by
// LOCIND_FUZZ_READER (its name in FuzzedReaders()); built by
// tests/fuzz/fuzz.cmake with clang and -fsanitize=fuzzer,address,undefined.
// A broken promise of the reader aborts with its description.
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <string_view>

#include "tests/fuzz/reader_entries.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  static const locind::fuzz::FuzzedReader& reader = [] {
    for (const locind::fuzz::FuzzedReader& r : locind::fuzz::FuzzedReaders()) {
      if (std::string_view(r.name) == LOCIND_FUZZ_READER) return r;
    }
    std::abort();  // fuzz.cmake names a reader that FuzzedReaders() does not list
  }();
  const std::string problem =
      reader.entry(std::string_view(reinterpret_cast<const char*>(data), size));
  if (!problem.empty()) {
    std::fprintf(stderr, "%s reader: %s\n", reader.name, problem.c_str());
    std::abort();
  }
  return 0;
}
