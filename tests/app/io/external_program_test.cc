// Running outside programs: output, exit codes and failures to start.
#include "app/io/external_program.h"

#include <doctest/doctest.h>

namespace locind::app {
namespace {

TEST_CASE("standard input, output, error and the exit code come back") {
  const Result<ProgramOutput> r = RunProgram({"sh", "-c", "tr a-z A-Z; echo oops >&2; exit 3"}, "hello\n");
  REQUIRE(r.ok());
  CHECK(r->out == "HELLO\n");
  CHECK(r->err == "oops\n");
  CHECK(r->exit_code == 3);
}

TEST_CASE("a program that is not there, or is killed, is an error") {
  const Result<ProgramOutput> missing = RunProgram({"locind-no-such-program"});
  REQUIRE_FALSE(missing.ok());
  CHECK(missing.status().message() == "cannot start locind-no-such-program: No such file or directory");
  const Result<ProgramOutput> killed = RunProgram({"sh", "-c", "kill -9 $$"});
  REQUIRE_FALSE(killed.ok());
  CHECK(killed.status().message() == "sh was killed by signal 9");
}

}  // namespace
}  // namespace locind::app
