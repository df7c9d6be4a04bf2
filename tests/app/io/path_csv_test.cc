#include "app/io/path_csv.h"

#include <doctest/doctest.h>

#include <sstream>

namespace locind::app {
namespace {

PathsOrError Read(const std::string& text) {
  std::istringstream in(text);
  return ReadPathCsv(in, "p.csv");
}

std::string ErrorOf(const std::string& text) {
  PathsOrError r = Read(text);
  REQUIRE(std::holds_alternative<Errors>(r));
  return ToString(std::get<Errors>(r));
}

TEST_CASE("path file: golden text and round trip") {
  sim::PathData d;
  d.names = {"x1", "x2"};
  d.time = {0, 0.5};
  d.values.resize(2, 2);
  d.values << 1.5, -2, 0.25, 1e-300;
  const std::string text = FormatPathCsv(d);
  CHECK(text == "time,x1,x2\n0,1.5,-2\n0.5,0.25,1e-300\n");
  PathsOrError back = Read(text);
  REQUIRE(std::holds_alternative<sim::PathData>(back));
  const auto& p = std::get<sim::PathData>(back);
  CHECK(p.names == d.names);
  CHECK(p.time == d.time);
  CHECK(p.values == d.values);
}

TEST_CASE("path file errors carry FILE:LINE:COLUMN: FIELD") {
  CHECK(ErrorOf("") == "p.csv:1:1: header: empty file");
  CHECK(ErrorOf("t,x\n") ==
        "p.csv:1:1: header: expected 'time,<process ids>' (a path file; an event file has 'time,process')");
  CHECK(ErrorOf("time\n") == "p.csv:1:1: header: expected at least one process column");
  CHECK(ErrorOf("time,x,x\n") == "p.csv:1:8: header: duplicate process 'x'");
  CHECK(ErrorOf("time,x\n") == "p.csv:2:1: no samples after the header");
  CHECK(ErrorOf("time,x,y\n0,1,2\n1,3\n") == "p.csv:3:4: row: expected 3 fields, found 2");
  CHECK(ErrorOf("time,x\n0,1,2\n") == "p.csv:2:5: row: expected 2 fields, found 3");
  CHECK(ErrorOf("time,x\n0,1\n0,2\n") == "p.csv:3:1: time: times must increase strictly");
  CHECK(ErrorOf("time,x\n0,abc\n") == "p.csv:2:3: x: expected a finite number");
  CHECK(ErrorOf("time,x\n0,1e999\n") == "p.csv:2:3: x: expected a finite number");
  CHECK(ErrorOf("time,x\n0,nan\n") == "p.csv:2:3: x: expected a finite number");
  CHECK(ErrorOf("time,x\n-inf,1\n") == "p.csv:2:1: time: expected a finite number");
  CHECK(ErrorOf("time,a;b\n") ==
        "p.csv:1:6: header: expected a process id (a process id is any token without spaces, "
        "commas, semicolons, '\"' or '\\', not starting with '#')");
  CHECK(ErrorOf("\n") ==
        "p.csv:1:1: header: expected 'time,<process ids>' (a path file; an event file has 'time,process')");
}

TEST_CASE("path file: every bad row is reported, and huge finite values are values") {
  CHECK(ErrorOf("time,x,y\n0,1,2\n1,3\n1,4,zz\n-1,1,1\n2,1,1\n") ==
        "p.csv:3:4: row: expected 3 fields, found 2\n"
        "p.csv:4:5: y: expected a finite number\n"
        "p.csv:5:1: time: times must increase strictly");
  const PathsOrError huge = Read("time,x\n0,1.7976931348623157e308\n1e300,-1e300\n");
  REQUIRE(std::holds_alternative<sim::PathData>(huge));
  CHECK(std::get<sim::PathData>(huge).values(0, 0) == 1.7976931348623157e308);
}

}  // namespace
}  // namespace locind::app
