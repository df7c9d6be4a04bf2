#include "app/io/path_csv.h"
#include "base/number_format.h"

#include <cmath>
#include <fstream>
#include <optional>
#include <set>
#include <sstream>

#include "app/io/event_csv.h"
#include "app/io/process_id.h"

namespace locind::app {
namespace {

Error At(const std::string& file, int line, int column, const std::string& field,
              const std::string& message) {
  return Error{file, line, column, field, message};
}

std::variant<std::vector<std::string>, Error> ReadHeader(const std::string& text,
                                                              const std::string& file) {
  const std::vector<csv::Field> f = csv::Split(text);
  if (f[0].text != "time") {
    return At(file, 1, 1, "header",
              "expected 'time,<process ids>' (a path file; an event file has 'time,process')");
  }
  if (f.size() < 2) return At(file, 1, 1, "header", "expected at least one process column");
  std::vector<std::string> names;
  std::set<std::string> seen;
  for (size_t i = 1; i < f.size(); ++i) {
    const std::string name(f[i].text);
    if (!IsValidProcessId(name)) {
      return At(file, 1, f[i].column, "header", std::string("expected a process id (") + kProcessIdRule + ")");
    }
    if (!seen.insert(name).second) {
      return At(file, 1, f[i].column, "header", "duplicate process '" + name + "'");
    }
    names.push_back(name);
  }
  return names;
}

// The problem of one data row, if any; a good row is appended to `data`
// (its time) and `values`.
std::optional<Error> ReadRow(const std::string& text, int line, const std::string& file,
                                  sim::PathData& data, std::vector<double>& values) {
  const size_t width = data.names.size() + 1;
  const std::vector<csv::Field> f = csv::Split(text);
  if (f.size() != width) {
    return At(file, line, f.size() > width ? f[width].column : static_cast<int>(text.size()) + 1,
              "row",
              "expected " + std::to_string(width) + " fields, found " + std::to_string(f.size()));
  }
  std::vector<double> row(width);
  for (size_t i = 0; i < width; ++i) {
    if (!csv::ParseNumber(f[i].text, row[i])) {
      return At(file, line, f[i].column, i == 0 ? "time" : data.names[i - 1],
                "expected a finite number");
    }
  }
  if (!data.time.empty() && !(row[0] > data.time.back())) {
    return At(file, line, 1, "time", "times must increase strictly");
  }
  data.time.push_back(row[0]);
  values.insert(values.end(), row.begin() + 1, row.end());
  return std::nullopt;
}

}  // namespace

// One reserved string filled through to_chars (base::AppendNumber): no
// stream and no temporary string per number.
std::string FormatPathCsv(const sim::PathData& data) {
  std::string out;
  out.reserve(64 + 32 * data.names.size() +
              size_t(data.samples()) * (size_t(data.processes()) + 1) * 25);
  out.append("time");
  for (const std::string& name : data.names) out.append(",").append(name);
  out.push_back('\n');
  for (int k = 0; k < data.samples(); ++k) {
    base::AppendNumber(out, data.time[k]);
    for (int j = 0; j < data.processes(); ++j) {
      out.push_back(',');
      base::AppendNumber(out, data.values(k, j));
    }
    out.push_back('\n');
  }
  return out;
}

void WritePathCsv(const sim::PathData& data, std::ostream& out) {
  const std::string text = FormatPathCsv(data);
  out.write(text.data(), std::streamsize(text.size()));
}

PathsOrError ReadPathCsv(std::istream& in, const std::string& file) {
  std::string text;
  if (!std::getline(in, text)) return Errors{At(file, 1, 1, "header", "empty file")};
  if (!text.empty() && text.back() == '\r') text.pop_back();
  auto header = ReadHeader(text, file);
  if (auto* e = std::get_if<Error>(&header)) return Errors{*e};
  sim::PathData data;
  data.names = std::get<std::vector<std::string>>(std::move(header));
  std::vector<double> values;
  Errors errors;  // problems in data rows: reading goes on after them
  int line = 1;
  while (std::getline(in, text)) {
    ++line;
    if (!text.empty() && text.back() == '\r') text.pop_back();
    if (std::optional<Error> bad = ReadRow(text, line, file, data, values)) {
      if (AddError(errors, *bad)) return errors;
    }
  }
  if (!errors.empty()) return errors;
  if (data.time.empty())
    return Errors{At(file, line + 1, 1, "", "no samples after the header")};
  const Eigen::Index n = static_cast<Eigen::Index>(data.names.size());
  data.values = Eigen::Map<Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>>(
      values.data(), data.samples(), n);
  return data;
}

PathsOrError ReadPathCsvFile(const std::string& path) {
  std::ifstream in(path);
  if (!in) return Errors{Error{path, 0, 0, "", "cannot open the file"}};
  return ReadPathCsv(in, path);
}

}  // namespace locind::app
