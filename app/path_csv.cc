#include "app/path_csv.h"

#include <cmath>
#include <fstream>
#include <set>
#include <sstream>

#include "app/event_csv.h"
#include "app/graph_file.h"

namespace locind::app {
namespace {

InputError At(const std::string& file, int line, int column, const std::string& field,
              const std::string& message) {
  return InputError{file, line, column, field, message};
}

std::variant<std::vector<std::string>, InputError> ReadHeader(const std::string& text,
                                                              const std::string& file) {
  const std::vector<csv::Field> f = csv::Split(text);
  if (f[0].text != "time") return At(file, 1, 1, "header", "expected 'time' as the first column");
  if (f.size() < 2) return At(file, 1, 1, "header", "expected at least one process column");
  std::vector<std::string> names;
  std::set<std::string> seen;
  for (size_t i = 1; i < f.size(); ++i) {
    const std::string name(f[i].text);
    if (!IsValidNodeName(name)) return At(file, 1, f[i].column, "header", "expected a process name");
    if (!seen.insert(name).second) {
      return At(file, 1, f[i].column, "header", "duplicate process '" + name + "'");
    }
    names.push_back(name);
  }
  return names;
}

}  // namespace

void WritePathCsv(const sim::PathData& data, std::ostream& out) {
  out << "time";
  for (const std::string& name : data.names) out << ',' << name;
  out << '\n';
  for (int k = 0; k < data.samples(); ++k) {
    out << csv::FormatNumber(data.time[k]);
    for (int j = 0; j < data.processes(); ++j) out << ',' << csv::FormatNumber(data.values(k, j));
    out << '\n';
  }
}

std::string FormatPathCsv(const sim::PathData& data) {
  std::ostringstream out;
  WritePathCsv(data, out);
  return out.str();
}

PathsOrError ReadPathCsv(std::istream& in, const std::string& file) {
  std::string text;
  if (!std::getline(in, text)) return At(file, 1, 1, "header", "empty file");
  if (!text.empty() && text.back() == '\r') text.pop_back();
  auto header = ReadHeader(text, file);
  if (auto* e = std::get_if<InputError>(&header)) return *e;
  sim::PathData data;
  data.names = std::get<std::vector<std::string>>(std::move(header));
  const size_t width = data.names.size() + 1;
  std::vector<double> values;
  int line = 1;
  while (std::getline(in, text)) {
    ++line;
    if (!text.empty() && text.back() == '\r') text.pop_back();
    const std::vector<csv::Field> f = csv::Split(text);
    if (f.size() != width) {
      return At(file, line, f.size() > width ? f[width].column : static_cast<int>(text.size()) + 1,
                "", "expected " + std::to_string(width) + " fields, found " + std::to_string(f.size()));
    }
    for (size_t i = 0; i < width; ++i) {
      double v = 0;
      const std::string field = i == 0 ? "time" : data.names[i - 1];
      if (!csv::ParseNumber(f[i].text, v)) {
        return At(file, line, f[i].column, field, "expected a finite number");
      }
      if (i == 0 && !data.time.empty() && !(v > data.time.back())) {
        return At(file, line, 1, "time", "times must increase strictly");
      }
      if (i == 0) {
        data.time.push_back(v);
      } else {
        values.push_back(v);
      }
    }
  }
  if (data.time.empty()) return At(file, line + 1, 1, "", "no samples after the header");
  const Eigen::Index n = static_cast<Eigen::Index>(data.names.size());
  data.values = Eigen::Map<Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>>(
      values.data(), data.samples(), n);
  return data;
}

PathsOrError ReadPathCsvFile(const std::string& path) {
  std::ifstream in(path);
  if (!in) return InputError{path, 0, 0, "", "cannot open the file"};
  return ReadPathCsv(in, path);
}

}  // namespace locind::app
