#include "app/io/event_csv.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <sstream>

namespace locind::app {
namespace {

EventsOrError Read(const std::string& text) {
  std::istringstream in(text);
  return ReadEventCsv(in, "ev.csv");
}

std::string ErrorOf(const std::string& text) {
  EventsOrError r = Read(text);
  REQUIRE(std::holds_alternative<Errors>(r));
  return ToString(std::get<Errors>(r));
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
  // No window line: [first event, last event], and a note says so.
  CHECK(e.start == 1);
  CHECK(e.end == 2.5);
  std::vector<std::string> notes;
  std::istringstream in("time,process\n5001,b\n5002,a\n");
  const EventsOrError shifted = ReadEventCsv(in, "ev.csv", &notes);
  CHECK(std::get<sim::EventData>(shifted).start == 5001);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0] == "ev.csv: no '# window:' line, using [first event, last event] = [5001, 5002]");
}

TEST_CASE("event file errors carry FILE:LINE:COLUMN: FIELD") {
  CHECK(ErrorOf("") == "ev.csv:1:1: header: empty file");
  CHECK(ErrorOf("# window: 0,1\n") == "ev.csv:2:1: header: missing 'time,process'");
  CHECK(ErrorOf("t,p\n") ==
        "ev.csv:1:1: header: expected 'time,process' (an event file; a path file has 'time,<process ids>')");
  CHECK(ErrorOf("time,process\n1,a\n0.5,a\n") ==
        "ev.csv:3:1: time: events must be sorted by time (0.5 comes after 1)");
  CHECK(ErrorOf("time,process\nnan,a\n") == "ev.csv:2:1: time: expected a finite number");
  CHECK(ErrorOf("time,process\ninf,a\n") == "ev.csv:2:1: time: expected a finite number");
  CHECK(ErrorOf("time,process\n1,a,b\n") ==
        "ev.csv:2:5: row: expected 2 fields 'time,process', found 3");
  CHECK(ErrorOf("time,process\n1\n") == "ev.csv:2:2: row: expected 2 fields 'time,process', found 1");
  CHECK(ErrorOf("# processes: a,b\ntime,process\n1,c\n") ==
        "ev.csv:3:3: process: unknown process 'c'");
  CHECK(ErrorOf("# processes: a, a\n") == "ev.csv:1:17: processes: duplicate process 'a'");
  CHECK(ErrorOf("# window: 0,1\ntime,process\n2,a\n") == "ev.csv:3:1: time: outside the window");
  CHECK(ErrorOf("# window: 2,1\n") == "ev.csv:1:10: window: start must be before end");
  CHECK(ErrorOf("time,process\n1,a b\n") ==
        "ev.csv:2:3: process: expected a process id (a process id is any token without spaces, "
        "commas, semicolons, '\"' or '\\', not starting with '#')");
  CHECK(ErrorOf("# processes: a\n# processes: b\n") == "ev.csv:2:1: processes: given twice");
  CHECK(ErrorOf("# window: 0,1\n# window: 0,2\n") == "ev.csv:2:1: window: given twice");
  CHECK(ErrorOf("# window: 0,1e999\n") == "ev.csv:1:13: window: expected a finite number");
  CHECK(ErrorOf("time,process\n-1,a\n") ==
        "ev.csv: window: the window [first event, last event] is empty; give a '# window:' line");
  // Found by fuzzing: a negative first time followed by positive ones (a
  // window from the first event now).
  CHECK(std::get<sim::EventData>(Read("time,process\n-.5,a\n2,a\n")).start == -0.5);
}

TEST_CASE("event file: every bad event line is reported, one line each") {
  CHECK(ErrorOf("time,process\n1,a\nx,a\n0.5,a\n2,a,b\n3,a\n") ==
        "ev.csv:3:1: time: expected a finite number\n"
        "ev.csv:4:1: time: events must be sorted by time (0.5 comes after 1)\n"
        "ev.csv:5:5: row: expected 2 fields 'time,process', found 3");
  std::string many = "time,process\n";
  for (int i = 0; i < 30; ++i) many += "nan,a\n";
  const std::string lines = ErrorOf(many);
  CHECK(std::count(lines.begin(), lines.end(), '\n') == 20);
  CHECK(lines.substr(lines.rfind('\n') + 1) == "ev.csv: stopped after 20 problems");
}

TEST_CASE("event file: empty files, empty windows, huge values and control characters") {
  // Found by fuzzing: a file without processes wrote back as one that does not read.
  CHECK(ErrorOf("# window: 0,100\ntime,process\n") ==
        "ev.csv: processes: no process: no events and no '# processes:' line");
  CHECK(ErrorOf("# processes: a\ntime,process\n") ==
        "ev.csv: window: the window [first event, last event] is empty; give a '# window:' line");
  CHECK(ErrorOf("# processes: a\ntime,process\n0,a\n") ==
        "ev.csv: window: the window [first event, last event] is empty; give a '# window:' line");
  // Huge but finite times are values; 1e999 overflows a double and is refused.
  const EventsOrError huge = Read("time,process\n1e300,a\n1.7976931348623157e308,a\n");
  REQUIRE(std::holds_alternative<sim::EventData>(huge));
  CHECK(std::get<sim::EventData>(huge).end == 1.7976931348623157e308);
  CHECK(ErrorOf("time,process\n1e999,a\n") == "ev.csv:2:1: time: expected a finite number");
  // A NUL or escape byte in a name is shown escaped, so the message stays one line.
  CHECK(ErrorOf("# processes: a\ntime,process\n1,b" + std::string(1, '\0') + "\x1b\n") ==
        "ev.csv:3:3: process: unknown process 'b\\x00\\x1b'");
  CHECK(ErrorOf("time,process\n1 ,a\n") == "ev.csv:2:1: time: expected a finite number");
}

}  // namespace
}  // namespace locind::app
