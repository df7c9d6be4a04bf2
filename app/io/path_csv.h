// The path file: observed diffusion paths as CSV (format documented in
// configs/models/README.md).
//
//   time,x1,x2                 header: "time", then the process names
//   0,0.31,-1.2                one row per grid time, strictly increasing
//   0.1,0.28,-1.05
//
// Values are written in the shortest form that reads back to the same double.
// Readers check everything and report FILE:LINE:COLUMN: FIELD: message.
#pragma once

#include <istream>
#include <ostream>
#include <string>
#include <variant>

#include "app/io/error.h"
#include "sim/path_data.h"

namespace locind::app {

using PathsOrError = std::variant<sim::PathData, Errors>;

// Streams `data` in the path file format.
void WritePathCsv(const sim::PathData& data, std::ostream& out);
std::string FormatPathCsv(const sim::PathData& data);

// Reads a path file; `file` names the source in errors. A bad header stops
// reading; problems in data rows are all reported (up to kMaxErrors),
// in file order.
PathsOrError ReadPathCsv(std::istream& in, const std::string& file);
PathsOrError ReadPathCsvFile(const std::string& path);

}  // namespace locind::app
