#include "app/io/data_kind.h"

#include <fstream>

#include "app/io/error.h"
#include "app/io/event_csv.h"
#include "app/io/trial_folder.h"

namespace locind::app {
namespace {

constexpr char kBothHeaders[] =
    "an event file has the header 'time,process', a path file 'time,<process ids>'";

// The next line that is not empty or a '#' comment, with its number; false
// at the end of the file.
bool NextDataLine(std::istream& in, std::string& line, int& number) {
  while (std::getline(in, line)) {
    ++number;
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (!line.empty() && line[0] != '#') return true;
  }
  return false;
}

}  // namespace

DataKind DecideDataKind(const std::string& path, const std::string& kind) {
  if (kind == "events") return DataKind::kEvents;
  if (kind == "paths") return DataKind::kPaths;
  if (!kind.empty()) throw UsageError{"--kind must be events or paths"};
  // A folder of trials: its first file decides.
  if (const std::vector<std::string> files = TrialFiles(path); !files.empty()) {
    return DecideDataKind(files.front(), kind);
  }
  std::ifstream in(path);
  if (!in) throw Error{path, 0, 0, "", "cannot open the file"};
  std::string header;
  int number = 0;
  if (!NextDataLine(in, header, number)) {
    throw Error{path, number + 1, 1, "header", std::string("missing; ") + kBothHeaders};
  }
  if (header == "time,process") return DataKind::kEvents;
  const std::vector<csv::Field> columns = csv::Split(header);
  if (columns[0].text != "time" || columns.size() < 2) {
    throw Error{path, number, 1, "header",
                "expected 'time,process' or 'time,<process ids>' (" + std::string(kBothHeaders) +
                    "), found '" + header + "'"};
  }
  // "time,unit": an event file under another header (its ids may be numbers
  // too) or a path file of one process; only the user knows which.
  if (columns.size() == 2) {
    throw Error{path, number, 1, "header",
                "'" + header + "' may be an event file or a path file of one process: give --kind "
                "events or --kind paths (" + kBothHeaders + ")"};
  }
  return DataKind::kPaths;
}

}  // namespace locind::app
