#include "app/event_csv.h"

#include <doctest/doctest.h>

#include <sstream>

namespace locind::app {
namespace {

EventsOrError Read(const std::string& text) {
  std::istringstream in(text);
  return ReadEventCsv(in, "ev.csv");
}

std::string ErrorOf(const std::string& text) {
  EventsOrError r = Read(text);
  REQUIRE(std::holds_alternative<InputError>(r));
  return std::get<InputError>(r).ToString();
}

TEST_CASE("event file: exact golden text and round trip") {
  sim::EventData d;
  d.names = {"x1", "x2", "quiet"};
  d.times = {{0.5, 2.25}, {0.1, 2.25}, {}};
  d.start = 0;
  d.end = 3;
  const std::string text = FormatEventCsv(d);
  CHECK(text ==
        "# processes: x1,x2,quiet\n# window: 0,3\ntime,process\n0.1,x2\n0.5,x1\n2.25,x1\n2.25,x2\n");
  EventsOrError back = Read(text);
  REQUIRE(std::holds_alternative<sim::EventData>(back));
  const auto& e = std::get<sim::EventData>(back);
  CHECK(e.names == d.names);
  CHECK(e.times == d.times);
  CHECK(e.end == 3);
  // Shortest round-trip text for awkward doubles.
  d.times = {{1.0 / 3}, {}, {}};
  const EventsOrError again = Read(FormatEventCsv(d));
  CHECK(std::get<sim::EventData>(again).times[0][0] == 1.0 / 3);
}

TEST_CASE("event file without metadata: names in order of appearance") {
  const EventsOrError read = Read("time,process\r\n1,b\r\n2,a\r\n2.5,b\r\n");
  const auto& e = std::get<sim::EventData>(read);
  CHECK(e.names == std::vector<std::string>{"b", "a"});
  CHECK(e.times[0] == std::vector<double>{1, 2.5});
  CHECK(e.end == 2.5);
}

TEST_CASE("event file errors carry FILE:LINE:COLUMN: FIELD") {
  CHECK(ErrorOf("") == "ev.csv:1:1: header: empty file");
  CHECK(ErrorOf("# window: 0,1\n") == "ev.csv:2:1: header: missing 'time,process'");
  CHECK(ErrorOf("t,p\n") == "ev.csv:1:1: header: expected 'time,process'");
  CHECK(ErrorOf("time,process\n1,a\n0.5,a\n") ==
        "ev.csv:3:1: time: events must be sorted by time (0.5 comes after 1)");
  CHECK(ErrorOf("time,process\nnan,a\n") == "ev.csv:2:1: time: expected a finite number");
  CHECK(ErrorOf("time,process\ninf,a\n") == "ev.csv:2:1: time: expected a finite number");
  CHECK(ErrorOf("time,process\n1,a,b\n") ==
        "ev.csv:2:5: expected 2 fields 'time,process', found 3");
  CHECK(ErrorOf("time,process\n1\n") == "ev.csv:2:2: expected 2 fields 'time,process', found 1");
  CHECK(ErrorOf("# processes: a,b\ntime,process\n1,c\n") ==
        "ev.csv:3:3: process: unknown process 'c'");
  CHECK(ErrorOf("# processes: a, a\n") == "ev.csv:1:17: processes: duplicate process 'a'");
  CHECK(ErrorOf("# window: 0,1\ntime,process\n2,a\n") == "ev.csv:3:1: time: outside the window");
  CHECK(ErrorOf("# window: 2,1\n") == "ev.csv:1:10: window: start must be before end");
  CHECK(ErrorOf("time,process\n1,9x\n") == "ev.csv:2:3: process: expected a process name");
}

}  // namespace
}  // namespace locind::app
