#include "app/io/event_csv.h"
#include "base/number_format.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>

#include "app/io/process_id.h"

namespace locind::app {
namespace csv {

std::vector<Field> Split(std::string_view line) {
  std::vector<Field> out;
  size_t start = 0;
  while (true) {
    const size_t comma = line.find(',', start);
    const size_t end = comma == std::string_view::npos ? line.size() : comma;
    out.push_back(Field{line.substr(start, end - start), static_cast<int>(start) + 1});
    if (comma == std::string_view::npos) return out;
    start = comma + 1;
  }
}

bool ParseNumber(std::string_view text, double& out) {
  if (text.empty()) return false;
  const char* end = text.data() + text.size();
  const auto [ptr, ec] = std::from_chars(text.data(), end, out);
  return ec == std::errc() && ptr == end && std::isfinite(out);
}

}  // namespace csv

namespace {

constexpr char kHeader[] = "time,process";
constexpr char kProcessesKey[] = "# processes:";
constexpr char kWindowKey[] = "# window:";

struct Reader {
  const std::string& file;
  int line = 0;
  Error Fail(int column, const std::string& field, const std::string& message) const {
    return Error{file, line, column, field, message};
  }
};

bool StartsWith(std::string_view s, std::string_view prefix) {
  return s.substr(0, prefix.size()) == prefix;
}

std::string_view TrimLeft(std::string_view s, int& column) {
  while (!s.empty() && s.front() == ' ') {
    s.remove_prefix(1);
    ++column;
  }
  return s;
}

struct Parsed {
  sim::EventData data;
  std::map<std::string, int, std::less<>> index;
  bool declared = false;  // processes line seen
  bool window = false;    // window line seen
};

std::optional<Error> ReadProcesses(const Reader& r, std::string_view rest, int column,
                                        Parsed& p) {
  for (const csv::Field& f : csv::Split(rest)) {
    int col = column + f.column - 1;
    const std::string name(TrimLeft(f.text, col));
    if (!IsValidProcessId(name)) return r.Fail(col, "processes", std::string("expected a process id (") + kProcessIdRule + ")");
    if (!p.index.emplace(name, p.data.processes()).second) {
      return r.Fail(col, "processes", "duplicate process '" + name + "'");
    }
    p.data.names.push_back(name);
  }
  p.data.times.resize(p.data.names.size());
  p.declared = true;
  return std::nullopt;
}

std::optional<Error> ReadWindow(const Reader& r, std::string_view rest, int column, Parsed& p) {
  const std::vector<csv::Field> f = csv::Split(rest);
  if (f.size() != 2) return r.Fail(column, "window", "expected 'start,end'");
  double v[2];
  for (int i = 0; i < 2; ++i) {
    int col = column + f[i].column - 1;
    if (!csv::ParseNumber(TrimLeft(f[i].text, col), v[i])) {
      return r.Fail(col, "window", "expected a finite number");
    }
  }
  if (!(v[0] < v[1])) return r.Fail(column, "window", "start must be before end");
  p.data.start = v[0];
  p.data.end = v[1];
  p.window = true;
  return std::nullopt;
}

std::optional<Error> ReadEvent(const Reader& r, std::string_view text, double& last, Parsed& p) {
  const std::vector<csv::Field> f = csv::Split(text);
  if (f.size() != 2) {
    return r.Fail(f.size() > 2 ? f[2].column : static_cast<int>(text.size()) + 1, "row",
                   "expected 2 fields 'time,process', found " + std::to_string(f.size()));
  }
  double t = 0;
  if (!csv::ParseNumber(f[0].text, t)) return r.Fail(1, "time", "expected a finite number");
  if (t < last) {
    return r.Fail(1, "time", "events must be sorted by time (" + std::string(f[0].text) +
                                  " comes after " + base::FormatNumber(last) + ")");
  }
  if (p.window && (t < p.data.start || t > p.data.end)) {
    return r.Fail(1, "time", "outside the window");
  }
  last = t;
  const std::string name(f[1].text);
  auto it = p.index.find(name);
  if (it == p.index.end()) {
    if (p.declared) return r.Fail(f[1].column, "process", "unknown process '" + name + "'");
    if (!IsValidProcessId(name)) {
      return r.Fail(f[1].column, "process", std::string("expected a process id (") + kProcessIdRule + ")");
    }
    it = p.index.emplace(name, p.data.processes()).first;
    p.data.names.push_back(name);
    p.data.times.emplace_back();
  }
  p.data.times[it->second].push_back(t);
  return std::nullopt;
}

}  // namespace

// The events leave in (time, process) order, the order of sorting the pairs:
// each process's times are already sorted, so a k-way merge (smallest time,
// ties to the smaller process index) gives that order in O(events * k)
// without a copy of the events. Lines go into one reserved string through
// to_chars (base::AppendNumber): no stream, no temporary per number.
std::string FormatEventCsv(const sim::EventData& data) {
  const int k = data.processes();
  size_t longest_name = 0;
  for (const std::string& name : data.names) longest_name = std::max(longest_name, name.size());
  std::string out;
  out.reserve(64 + 32 * size_t(k) + size_t(data.total_events()) * (26 + longest_name));
  out.append(kProcessesKey).push_back(' ');
  for (int i = 0; i < k; ++i) out.append(i ? "," : "").append(data.names[i]);
  out.push_back('\n');
  out.append(kWindowKey).push_back(' ');
  base::AppendNumber(out, data.start);
  out.push_back(',');
  base::AppendNumber(out, data.end);
  out.push_back('\n');
  out.append(kHeader).push_back('\n');
  std::vector<size_t> next(size_t(k), 0);
  for (;;) {
    int pick = -1;
    double best = 0;
    for (int i = 0; i < k; ++i) {
      const std::vector<double>& t = data.times[i];
      if (next[i] < t.size() && (pick < 0 || t[next[i]] < best)) {
        pick = i;
        best = t[next[i]];
      }
    }
    if (pick < 0) break;
    ++next[pick];
    base::AppendNumber(out, best);
    out.append(",").append(data.names[pick]).push_back('\n');
  }
  return out;
}

void WriteEventCsv(const sim::EventData& data, std::ostream& out) {
  const std::string text = FormatEventCsv(data);
  out.write(text.data(), std::streamsize(text.size()));
}

EventsOrError ReadEventCsv(std::istream& in, const std::string& file,
                           std::vector<std::string>* notes) {
  Reader r{file};
  Parsed p;
  bool header = false;
  double last = -INFINITY;
  Errors rows;  // problems in event lines: reading goes on after them
  for (std::string text; std::getline(in, text);) {
    ++r.line;
    if (!text.empty() && text.back() == '\r') text.pop_back();
    std::optional<Error> error;
    if (!header && StartsWith(text, kProcessesKey)) {
      if (p.declared) return Errors{r.Fail(1, "processes", "given twice")};
      error = ReadProcesses(r, std::string_view(text).substr(sizeof kProcessesKey - 1),
                            sizeof kProcessesKey, p);
    } else if (!header && StartsWith(text, kWindowKey)) {
      if (p.window) return Errors{r.Fail(1, "window", "given twice")};
      error = ReadWindow(r, std::string_view(text).substr(sizeof kWindowKey - 1), sizeof kWindowKey, p);
    } else if (!header && StartsWith(text, "#")) {
      continue;  // a comment before the header
    } else if (!header) {
      if (text != kHeader) {
        return Errors{r.Fail(1, "header",
                             "expected 'time,process' (an event file; a path file has 'time,<process ids>')")};
      }
      header = true;
    } else if (std::optional<Error> bad = ReadEvent(r, text, last, p)) {
      if (AddError(rows, *bad)) return rows;
    }
    if (error) return Errors{*error};
  }
  if (!header) {
    return Errors{Error{file, r.line + 1, 1, "header",
                                  r.line ? "missing 'time,process'" : "empty file"}};
  }
  if (!rows.empty()) return rows;
  if (p.data.names.empty()) {
    return Errors{
        Error{file, 0, 0, "processes", "no process: no events and no '# processes:' line"}};
  }
  if (!p.window) {
    // No window line: the window is [first event, last event] (a shift of
    // every time then shifts the window with it), and the caller is told.
    double first = INFINITY;
    for (const std::vector<double>& t : p.data.times) {
      if (!t.empty()) first = std::min(first, t.front());
    }
    if (!(std::isfinite(first) && last > first)) {
      return Errors{Error{file, 0, 0, "window",
                          "the window [first event, last event] is empty; give a '# window:' line"}};
    }
    p.data.start = first;
    p.data.end = last;
    if (notes != nullptr) {
      notes->push_back(file + ": no '# window:' line, using [first event, last event] = [" +
                       base::FormatNumber(first) + ", " + base::FormatNumber(last) + "]");
    }
  }
  return std::move(p.data);
}

EventsOrError ReadEventCsvFile(const std::string& path, std::vector<std::string>* notes) {
  std::ifstream in(path);
  if (!in) return Errors{Error{path, 0, 0, "", "cannot open the file"}};
  return ReadEventCsv(in, path, notes);
}

}  // namespace locind::app
