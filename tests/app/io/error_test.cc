// Error: the one-line FILE:LINE:COLUMN: FIELD: message form, and the
// cap on how many problems a reader lists.
#include "app/io/error.h"

#include <doctest/doctest.h>

namespace locind::app {
namespace {

TEST_CASE("an input error is one line: unknown positions are left out, control characters escaped") {
  CHECK(Error{"s.yaml", 3, 7, "grid.lengths", "expected a number"}.ToString() ==
        "s.yaml:3:7: grid.lengths: expected a number");
  CHECK(Error{"s.yaml", 3, 0, "", "bad"}.ToString() == "s.yaml:3: bad");
  CHECK(Error{"s.yaml", 0, 0, "memory_mb", "too much"}.ToString() == "s.yaml: memory_mb: too much");
  // A newline, a tab, a NUL and an escape byte, as a YAML parser may quote them back.
  const std::string raw = std::string("unknown escape character: \n\t") + '\0' + "\x1b\x7f";
  CHECK(Error{"f\n", 1, 1, "a\x01", raw}.ToString() ==
        "f\\n:1:1: a\\x01: unknown escape character: \\n\\t\\x00\\x1b\\x7f");
}

TEST_CASE("bytes that are not UTF-8 are escaped; well-formed UTF-8 is kept") {
  // Well-formed sequences from the Unicode Standard, chapter 3, table 3-7:
  // "\xc3\xa9" is U+00E9, "\xe2\x82\xac" U+20AC, "\xf0\x9f\x98\x80" U+1F600.
  CHECK(Error{"d.csv", 2, 1, "process", "caf\xc3\xa9 \xe2\x82\xac \xf0\x9f\x98\x80"}.ToString() ==
        "d.csv:2:1: process: caf\xc3\xa9 \xe2\x82\xac \xf0\x9f\x98\x80");
  // Latin-1 "caf\xe9", a lone continuation byte, an overlong "\xc0\xaf", a
  // surrogate "\xed\xa0\x80" and a sequence cut short at the end.
  CHECK(Error{"d.csv", 2, 1, "", "caf\xe9 \x80 \xc0\xaf \xed\xa0\x80 \xe2\x82"}.ToString() ==
        "d.csv:2: caf\\xe9 \\x80 \\xc0\\xaf \\xed\\xa0\\x80 \\xe2\\x82");
}

TEST_CASE("a reader lists at most kMaxErrors problems, then says it stopped") {
  Errors errors;
  for (size_t i = 1; i < kMaxErrors; ++i) {
    CHECK_FALSE(AddError(errors, Error{"d.csv", static_cast<int>(i) + 1, 1, "", "bad"}));
  }
  CHECK(AddError(errors, Error{"d.csv", 99, 1, "", "bad"}));
  REQUIRE(errors.size() == kMaxErrors + 1);
  CHECK(errors[kMaxErrors - 1].line == 99);
  CHECK(errors.back().ToString() == "d.csv: stopped after 20 problems");
  CHECK(ToString(Errors{errors[0], errors.back()}) == "d.csv:2:1: bad\nd.csv: stopped after 20 problems");
}

}  // namespace
}  // namespace locind::app

namespace locind::app {
namespace {

TEST_CASE("one mapping from error kind to exit code") {
  // The documented table (README.md, "Errors and exit codes").
  CHECK(ExitCode(ErrorKind::kBadInput) == 2);
  CHECK(ExitCode(ErrorKind::kBadUsage) == 2);
  CHECK(ExitCode(ErrorKind::kFileSystem) == 1);
  CHECK(ExitCode(ErrorKind::kInternal) == 1);
  CHECK(UsageError{"--out is missing"}.kind == ErrorKind::kBadUsage);
  CHECK(FileSystemError{"cannot create x"}.kind == ErrorKind::kFileSystem);
  CHECK(InternalError{"x"}.kind == ErrorKind::kInternal);
  CHECK(Error{"f.csv", 3, 2, "time", "expected a number"}.kind == ErrorKind::kBadInput);
}

TEST_CASE("an error without a file prints its message alone") {
  CHECK(UsageError{"--out is missing"}.ToString() == "--out is missing");
  CHECK(Error{"f.csv", 3, 2, "time", "expected a number"}.ToString() ==
        "f.csv:3:2: time: expected a number");
}

}  // namespace
}  // namespace locind::app
