// Trial folders: one event (or path) file per trial, pooled into one data set.
#include "app/io/trial_folder.h"

#include <doctest/doctest.h>

#include <sstream>

#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using testing::Scratch;

TEST_CASE("an event folder: trials in file-name order, processes pooled by name") {
  Scratch s("locind_trials_events");
  s.Write("b.csv", "# processes: y,x\n# window: 0,4\ntime,process\n0.5,x\n1.5,y\n3,y\n");
  s.Write("a.csv", "# window: 0,5\ntime,process\n1,x\n2,x\n3,y\n");
  s.Write("c.csv", "# window: 10,12\ntime,process\n11,y\n");  // no x at all
  s.Write("notes.txt", "not a trial");
  const EventsOrError read = ReadEventTrials(s.dir.string());
  REQUIRE(std::holds_alternative<sim::EventData>(read));
  const sim::EventData& d = std::get<sim::EventData>(read);
  CHECK(d.names == std::vector<std::string>{"x", "y"});
  REQUIRE(d.trial_count() == 3);
  CHECK(d.times[0] == std::vector<double>{1, 2, 0.5});
  CHECK(d.times[1] == std::vector<double>{3, 1.5, 3, 11});
  CHECK(d.trial_start(2) == 10);
  CHECK(d.trial_end(1) == 4);
  CHECK(d.trial_begin(2, 0) == 3);
  CHECK(d.trial_stop(2, 0) == 3);
  CHECK(d.duration() == 11);
  // Written back one file per trial, read back identically.
  Scratch out("locind_trials_events_out");
  WriteEventTrials(d, out.Path("again"));
  const EventsOrError again = ReadEventTrials(out.Path("again"));
  REQUIRE(std::holds_alternative<sim::EventData>(again));
  CHECK(std::get<sim::EventData>(again).times == d.times);
  CHECK(std::get<sim::EventData>(again).trial_count() == 3);
}

TEST_CASE("an event folder: every file's problems are reported, and an empty folder is refused") {
  Scratch s("locind_trials_bad");
  s.Write("t1.csv", "time,process\n1,x\nz,x\n");
  s.Write("t2.csv", "time,proc\n");
  const EventsOrError read = ReadEventTrials(s.dir.string());
  REQUIRE(std::holds_alternative<Errors>(read));
  const Errors& e = std::get<Errors>(read);
  REQUIRE(e.size() == 2);
  CHECK(e[0].ToString() == s.Path("t1.csv") + ":3:1: time: expected a finite number");
  CHECK(e[1].file == s.Path("t2.csv"));
  Scratch empty("locind_trials_empty");
  CHECK_THROWS_AS(ReadEventTrials(empty.dir.string()), Error);
}

TEST_CASE("a plain file is one trial, and notes say when the window came from the events") {
  Scratch s("locind_trials_one");
  const std::string file = s.Write("one.csv", "time,process\n2,x\n3,x\n");
  std::vector<std::string> notes;
  const EventsOrError read = ReadEventTrials(file, &notes);
  REQUIRE(std::holds_alternative<sim::EventData>(read));
  CHECK(std::get<sim::EventData>(read).trial_count() == 1);
  REQUIRE(notes.size() == 1);
  CHECK(notes[0].find("using [first event, last event] = [2, 3]") != std::string::npos);
}

TEST_CASE("a path folder: same columns in every file; rows stacked, trials marked") {
  Scratch s("locind_trials_paths");
  s.Write("t1.csv", "time,a,b\n0,1,2\n0.1,1.5,2.5\n0.2,1,2\n");
  s.Write("t2.csv", "time,a,b\n0,0,0\n0.1,1,1\n");
  const PathsOrError read = ReadPathTrials(s.dir.string());
  REQUIRE(std::holds_alternative<sim::PathData>(read));
  const sim::PathData& d = std::get<sim::PathData>(read);
  CHECK(d.samples() == 5);
  CHECK(d.trial_starts == std::vector<int>{3});
  CHECK(d.increment_rows() == std::vector<int>{0, 1, 3});
  CHECK(d.observed_time() == doctest::Approx(0.3));
  s.Write("t3.csv", "time,b,a\n0,0,0\n0.1,1,1\n");
  const PathsOrError bad = ReadPathTrials(s.dir.string());
  REQUIRE(std::holds_alternative<Errors>(bad));
  CHECK(std::get<Errors>(bad)[0].ToString().find("the process columns differ from those of") !=
        std::string::npos);
}

}  // namespace
}  // namespace locind::app
