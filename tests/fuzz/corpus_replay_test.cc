// Replays every kept fuzzing input (tests/fuzz/corpus/<reader>/, minimised
// corpora and crash reproducers) through its reader in the normal build, so
// the Release and sanitizer suites hold every reader to what the fuzzing
// found: a value or clean one-line errors, never a crash.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/fuzz/reader_entries.h"

namespace locind::fuzz {
namespace {

namespace fs = std::filesystem;

std::string ReadBytes(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

TEST_CASE("every kept fuzzing input reads to a value or clean errors") {
  for (const FuzzedReader& reader : FuzzedReaders()) {
    const fs::path dir = fs::path("tests/fuzz/corpus") / reader.name;
    REQUIRE_MESSAGE(fs::is_directory(dir), dir.string());
    int files = 0;
    for (const fs::directory_entry& entry : fs::directory_iterator(dir)) {
      if (!entry.is_regular_file()) continue;
      ++files;
      const std::string problem = reader.entry(ReadBytes(entry.path()));
      const std::string where = entry.path().string() + ": " + problem;
      CHECK_MESSAGE(problem.empty(), where);
    }
    // The corpus was kept for a reason: an empty folder means it was lost.
    CHECK_MESSAGE(files >= 10, dir.string());
  }
}

}  // namespace
}  // namespace locind::fuzz
