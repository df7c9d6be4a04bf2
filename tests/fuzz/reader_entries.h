// The fuzzed readers behind one signature: each entry feeds bytes to the
// in-memory form of a reader (the file-based readers wrap the same code) and
// checks what a reader promises for any input: a value, or errors that name
// the file and say what was expected. Parsed values are also written back
// and read again, and must survive the round trip unchanged.
//
// Shared by the libFuzzer programs (tests/fuzz/*_fuzz.cc, clang) and the
// corpus replay test (tests/fuzz/corpus_replay_test.cc, the normal build).
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace locind::fuzz {

// The name every entry passes as the file name of the input.
inline constexpr char kFuzzFile[] = "fuzz-input";

// Empty when the reader kept its promise, else what went wrong.
using ReaderEntry = std::string (*)(std::string_view data);

struct FuzzedReader {
  const char* name;  // also the corpus folder: tests/fuzz/corpus/<name>/
  ReaderEntry entry;
};

std::string FeedStudyFile(std::string_view data);
std::string FeedGraphFile(std::string_view data);
std::string FeedEventCsv(std::string_view data);
std::string FeedPathCsv(std::string_view data);

// Every fuzzed reader, in a fixed order.
const std::vector<FuzzedReader>& FuzzedReaders();

}  // namespace locind::fuzz
