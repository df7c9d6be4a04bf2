// Which reader a data file needs: the event file (app/io/event_csv.h, header
// "time,process") or the path file (app/io/path_csv.h, header
// "time,<process ids>").
#pragma once

#include <string>

namespace locind::app {

enum class DataKind { kEvents, kPaths };

// `kind` "events" or "paths" decides; "" decides from the file's (for a
// folder of trials, its first file's) first line
// that is not a '#' comment: exactly "time,process" is an event file,
// "time,X,Y,..." (two or more process columns) a path file. Throws Error
// (FILE:LINE:COLUMN: header: ...) naming both headers when the line is
// neither, or when it is "time,X" with X not "process": an event file under
// another header ("time,unit", whose ids may be numbers too) cannot be told
// from a path file of one process, so --kind must say. Throws Error when the
// file cannot be opened. A `kind` other than "", "events" or "paths" is
// a UsageError.
DataKind DecideDataKind(const std::string& path, const std::string& kind);

}  // namespace locind::app
