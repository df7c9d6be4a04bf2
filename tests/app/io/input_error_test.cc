// InputError: the one-line FILE:LINE:COLUMN: FIELD: message form, and the
// cap on how many problems a reader lists.
#include "app/io/input_error.h"

#include <doctest/doctest.h>

namespace locind::app {
namespace {

TEST_CASE("an input error is one line: unknown positions are left out, control characters escaped") {
  CHECK(InputError{"s.yaml", 3, 7, "grid.lengths", "expected a number"}.ToString() ==
        "s.yaml:3:7: grid.lengths: expected a number");
  CHECK(InputError{"s.yaml", 3, 0, "", "bad"}.ToString() == "s.yaml:3: bad");
  CHECK(InputError{"s.yaml", 0, 0, "memory_mb", "too much"}.ToString() == "s.yaml: memory_mb: too much");
  // A newline, a tab, a NUL and an escape byte, as a YAML parser may quote them back.
  const std::string raw = std::string("unknown escape character: \n\t") + '\0' + "\x1b\x7f";
  CHECK(InputError{"f\n", 1, 1, "a\x01", raw}.ToString() ==
        "f\\n:1:1: a\\x01: unknown escape character: \\n\\t\\x00\\x1b\\x7f");
}

TEST_CASE("a reader lists at most kMaxInputErrors problems, then says it stopped") {
  InputErrors errors;
  for (size_t i = 1; i < kMaxInputErrors; ++i) {
    CHECK_FALSE(AddInputError(errors, InputError{"d.csv", static_cast<int>(i) + 1, 1, "", "bad"}));
  }
  CHECK(AddInputError(errors, InputError{"d.csv", 99, 1, "", "bad"}));
  REQUIRE(errors.size() == kMaxInputErrors + 1);
  CHECK(errors[kMaxInputErrors - 1].line == 99);
  CHECK(errors.back().ToString() == "d.csv: stopped after 20 problems");
  CHECK(ToString(InputErrors{errors[0], errors.back()}) == "d.csv:2:1: bad\nd.csv: stopped after 20 problems");
}

}  // namespace
}  // namespace locind::app
