// The event file: observed event streams as CSV (format documented in
// configs/models/README.md).
//
//   # processes: x1,x2,x3      optional: every process, also those without events
//   # window: 0,100            optional: the observation window start,end
//                              (default: first event to last event)
//   time,process               header
//   0.1250000000000000,x2      one event per line, sorted by time (ties allowed)
//
// Times are written in the shortest form that reads back to the same double.
// Readers check everything and report FILE:LINE:COLUMN: FIELD: message.
#pragma once

#include <istream>
#include <ostream>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "app/io/error.h"
#include "sim/event_data.h"

namespace locind::app {

using EventsOrError = std::variant<sim::EventData, Errors>;

// Streams `data` in the event file format, events merged across processes in
// time order (ties broken by process order). REQUIRES: one trial (a data set
// of several trials is written as a folder: WriteEventTrials, trial_folder.h).
void WriteEventCsv(const sim::EventData& data, std::ostream& out);
std::string FormatEventCsv(const sim::EventData& data);

// Reads an event file; `file` names the source in errors. A problem in the
// lines before the header stops reading; problems in event lines are all
// reported (up to kMaxErrors), in file order. Without the
// processes line, processes are named in order of first appearance; without
// the window line, the window is [first event, last event], which must not be
// empty, and a note saying so is appended to `notes` (when given) for the
// caller to print on stderr.
EventsOrError ReadEventCsv(std::istream& in, const std::string& file,
                           std::vector<std::string>* notes = nullptr);
EventsOrError ReadEventCsvFile(const std::string& path, std::vector<std::string>* notes = nullptr);

// Pieces shared by the CSV readers and writers of app/.
namespace csv {

struct Field {
  std::string_view text;
  int column = 1;  // 1-based position of the field's first character
};

// Splits a line at commas (no quoting: names and numbers never need it).
std::vector<Field> Split(std::string_view line);
// A finite double written in full (no surrounding spaces); false otherwise.
bool ParseNumber(std::string_view text, double& out);

}  // namespace csv

}  // namespace locind::app
