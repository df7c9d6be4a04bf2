#include "tests/fuzz/reader_entries.h"

#include <sstream>
#include <variant>

#include "app/io/event_csv.h"
#include "app/io/graph_file.h"
#include "app/io/error.h"
#include "app/io/path_csv.h"
#include "app/study/study_file.h"

namespace locind::fuzz {
namespace {

using app::Error;

// One problem, one line, located in the file it came from.
std::string CheckError(const Error& e) {
  if (e.file != kFuzzFile) return "error names the file '" + e.file + "'";
  if (e.line < 0 || e.column < 0) return "negative line or column: " + e.ToString();
  if (e.message.empty()) return "error without a message: " + e.ToString();
  if (e.ToString().find('\n') != std::string::npos) return "error spans lines: " + e.ToString();
  return "";
}

std::string Lines(const Error& e) { return e.ToString(); }
std::string Lines(const app::Errors& errors) { return app::ToString(errors); }

std::string CheckErrors(const app::Errors& errors) {
  if (errors.empty()) return "failure without an error";
  for (const Error& e : errors) {
    if (std::string problem = CheckError(e); !problem.empty()) return problem;
  }
  return "";
}

// Reads `text` with `read`, writes the value with `format`: the text written
// must read back to a value that is written identically.
template <typename Read, typename Format>
std::string CheckRoundTrip(const std::string& text, Read read, Format format) {
  auto again = read(text);
  if (const auto* e = std::get_if<1>(&again)) {
    return "written value does not read back: " + Lines(*e);
  }
  if (format(std::get<0>(again)) != text) return "value changed in a write-read round trip";
  return "";
}

app::EventsOrError ReadEvents(const std::string& text) {
  std::istringstream in(text);
  return app::ReadEventCsv(in, kFuzzFile);
}

app::PathsOrError ReadPaths(const std::string& text) {
  std::istringstream in(text);
  return app::ReadPathCsv(in, kFuzzFile);
}

app::GraphOrError ReadGraph(const std::string& text) {
  return app::ParseGraphText(text, kFuzzFile);
}

}  // namespace

std::string FeedStudyFile(std::string_view data) {
  app::StudyOrErrors read = app::ParseStudyText(std::string(data), kFuzzFile);
  if (const auto* errors = std::get_if<app::Errors>(&read)) return CheckErrors(*errors);
  return "";
}

std::string FeedGraphFile(std::string_view data) {
  app::GraphOrError read = ReadGraph(std::string(data));
  if (const auto* e = std::get_if<Error>(&read)) return CheckError(*e);
  return CheckRoundTrip(app::FormatGraph(std::get<graph::TruthGraph>(read)), ReadGraph,
                        app::FormatGraph);
}

std::string FeedEventCsv(std::string_view data) {
  app::EventsOrError read = ReadEvents(std::string(data));
  if (const auto* e = std::get_if<app::Errors>(&read)) return CheckErrors(*e);
  return CheckRoundTrip(app::FormatEventCsv(std::get<sim::EventData>(read)), ReadEvents,
                        app::FormatEventCsv);
}

std::string FeedPathCsv(std::string_view data) {
  app::PathsOrError read = ReadPaths(std::string(data));
  if (const auto* e = std::get_if<app::Errors>(&read)) return CheckErrors(*e);
  return CheckRoundTrip(app::FormatPathCsv(std::get<sim::PathData>(read)), ReadPaths,
                        app::FormatPathCsv);
}

const std::vector<FuzzedReader>& FuzzedReaders() {
  static const std::vector<FuzzedReader> readers = {
      {"study_file", FeedStudyFile},
      {"graph_file", FeedGraphFile},
      {"event_csv", FeedEventCsv},
      {"path_csv", FeedPathCsv},
  };
  return readers;
}

}  // namespace locind::fuzz
