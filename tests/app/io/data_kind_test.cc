// Process ids (app/io/process_id.h) in both data readers, and the choice
// between the event and the path reader (app/io/data_kind.h).
#include <doctest/doctest.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <unistd.h>

#include "app/io/data_kind.h"
#include "app/io/event_csv.h"
#include "app/io/path_csv.h"
#include "app/io/process_id.h"

namespace locind::app {
namespace {

std::string Scratch(const std::string& name, const std::string& content) {
  const std::string path = (std::filesystem::temp_directory_path() /
                            ("locind_data_kind_" + std::to_string(::getpid()) + "_" + name))
                               .string();
  std::ofstream(path) << content;
  return path;
}

// What DecideDataKind throws, as its one line.
std::string KindError(const std::string& path, const std::string& kind = "") {
  try {
    DecideDataKind(path, kind);
  } catch (const Error& e) {
    return e.ToString();
  }
  return "";
}

TEST_CASE("process ids: any token without separators, numeric ids included") {
  for (const char* id : {"x1", "17", "003", "unit-4", "n1.a", "caf\xc3\xa9", "A/B"}) {
    CHECK(IsValidProcessId(id));
  }
  for (const char* id : {"", "a b", "a,b", "a;b", "a\"b", "#1", "a\tb", "a\x7f", "a\\b"}) {
    CHECK_FALSE(IsValidProcessId(id));
  }
}

TEST_CASE("numeric unit ids read in event and path files, compared as text") {
  std::istringstream events("time,process\n0.5,17\n0.75,3\n1,003\n1.5,17\n");
  const EventsOrError e = ReadEventCsv(events, "ev.csv");
  REQUIRE(std::holds_alternative<sim::EventData>(e));
  const auto& data = std::get<sim::EventData>(e);
  CHECK(data.names == std::vector<std::string>{"17", "3", "003"});
  CHECK(data.times[0] == std::vector<double>{0.5, 1.5});
  std::istringstream paths("time,1,2\n0,0.5,1\n1,0.25,2\n");
  const PathsOrError p = ReadPathCsv(paths, "p.csv");
  REQUIRE(std::holds_alternative<sim::PathData>(p));
  CHECK(std::get<sim::PathData>(p).names == std::vector<std::string>{"1", "2"});
}

TEST_CASE("the header decides the reader; --kind overrides it") {
  const std::string events = Scratch("events.csv", "# window: 0,2\ntime,process\n0.5,17\n");
  const std::string paths = Scratch("paths.csv", "time,17,4\n0,1,2\n");
  CHECK(DecideDataKind(events, "") == DataKind::kEvents);
  CHECK(DecideDataKind(paths, "") == DataKind::kPaths);
  CHECK(DecideDataKind(events, "paths") == DataKind::kPaths);
  CHECK(DecideDataKind(paths, "events") == DataKind::kEvents);
  std::remove(events.c_str());
  std::remove(paths.c_str());
}

TEST_CASE("a header that is neither names both expected headers") {
  // An event file under another header, with names or with numeric ids, and
  // a path file of one process: the header alone cannot tell them apart.
  for (const char* rows : {"0.5,n1\n0.7,n2\n", "0.5,17\n0.7,3\n"}) {
    const std::string unit = Scratch("unit.csv", std::string("time,unit\n") + rows);
    CHECK(KindError(unit) ==
          unit + ":1:1: header: 'time,unit' may be an event file or a path file of one process: give "
                 "--kind events or --kind paths (an event file has the header 'time,process', a path "
                 "file 'time,<process ids>')");
    CHECK(DecideDataKind(unit, "events") == DataKind::kEvents);
    std::remove(unit.c_str());
  }
  const std::string other = Scratch("other.csv", "# a comment\nt,process\n");
  CHECK(KindError(other) ==
        other + ":2:1: header: expected 'time,process' or 'time,<process ids>' (an event file has the "
                "header 'time,process', a path file 'time,<process ids>'), found 't,process'");
  const std::string empty = Scratch("empty.csv", "# only a comment\n");
  CHECK(KindError(empty) == empty + ":2:1: header: missing; an event file has the header "
                                    "'time,process', a path file 'time,<process ids>'");
  const std::string absent =
      (std::filesystem::temp_directory_path() / "locind_data_kind_no_such_folder" / "none.csv").string();
  CHECK(KindError(absent) == absent + ": cannot open the file");
  for (const std::string& f : {other, empty}) std::remove(f.c_str());
}

}  // namespace
}  // namespace locind::app
