#include "app/io/trial_folder.h"

#include <algorithm>
#include <filesystem>
#include <map>
#include <system_error>

#include "app/io/atomic_file.h"
#include "app/io/window_check.h"

namespace locind::app {
namespace fs = std::filesystem;

std::vector<std::string> TrialFiles(const std::string& path) {
  std::error_code ec;
  if (!fs::is_directory(path, ec)) return {};
  std::vector<std::string> files;
  for (fs::directory_iterator it(path, ec), end; !ec && it != end; it.increment(ec)) {
    if (it->path().extension() == ".csv" && it->is_regular_file(ec)) files.push_back(it->path().string());
  }
  if (ec) throw Error{path, 0, 0, "", "cannot list the folder: " + ec.message()};
  if (files.empty()) throw Error{path, 0, 0, "", "the folder holds no *.csv file (one file per trial)"};
  std::sort(files.begin(), files.end());
  return files;
}

namespace {

// The one-trial data sets `trials` over the union of their process names.
sim::EventData PoolEventTrials(const std::vector<sim::EventData>& trials) {
  std::vector<std::string> names;
  std::map<std::string, size_t> index;
  for (const sim::EventData& t : trials) {
    for (const std::string& n : t.names) {
      if (index.emplace(n, names.size()).second) names.push_back(n);
    }
  }
  sim::EventData pooled;
  for (const sim::EventData& t : trials) {
    sim::EventData same;  // this trial over the union, in the union's order
    same.names = names;
    same.times.resize(names.size());
    same.start = t.start;
    same.end = t.end;
    for (size_t i = 0; i < t.names.size(); ++i) same.times[index.at(t.names[i])] = t.times[i];
    sim::AppendTrial(pooled, same);
  }
  return pooled;
}

}  // namespace

EventsOrError ReadEventTrials(const std::string& path, std::vector<std::string>* notes) {
  const std::vector<std::string> files = TrialFiles(path);
  if (files.empty()) return ReadEventCsvFile(path, notes);
  std::vector<sim::EventData> trials;
  Errors errors;
  for (const std::string& file : files) {
    EventsOrError read = ReadEventCsvFile(file, notes);
    if (auto* e = std::get_if<Errors>(&read)) {
      for (Error& one : *e) {
        if (AddError(errors, std::move(one))) return errors;
      }
    } else {
      trials.push_back(std::get<sim::EventData>(std::move(read)));
    }
  }
  if (!errors.empty()) return errors;
  return PoolEventTrials(trials);
}

sim::EventData LoadEventTrials(const std::string& path, const std::string& program, std::ostream& err) {
  std::vector<std::string> notes;
  EventsOrError read = ReadEventTrials(path, &notes);
  if (auto* e = std::get_if<Errors>(&read)) throw *e;
  sim::EventData data = std::get<sim::EventData>(std::move(read));
  for (const std::string& n : notes) err << program << ": note: " << n << "\n";
  for (const std::string& w : EmptyWindowWarnings(data, path)) err << program << ": warning: " << w << "\n";
  return data;
}

PathsOrError ReadPathTrials(const std::string& path) {
  const std::vector<std::string> files = TrialFiles(path);
  if (files.empty()) return ReadPathCsvFile(path);
  sim::PathData pooled;
  Errors errors;
  for (const std::string& file : files) {
    PathsOrError read = ReadPathCsvFile(file);
    if (auto* e = std::get_if<Errors>(&read)) {
      for (Error& one : *e) {
        if (AddError(errors, std::move(one))) return errors;
      }
      continue;
    }
    const sim::PathData& trial = std::get<sim::PathData>(read);
    if (!pooled.names.empty() && trial.names != pooled.names) {
      if (AddError(errors, Error{file, 1, 1, "header",
                                 "the process columns differ from those of " + files.front()})) {
        return errors;
      }
      continue;
    }
    if (trial.samples() < 2) {
      if (AddError(errors, Error{file, 0, 0, "time", "a trial needs at least two samples"})) return errors;
      continue;
    }
    sim::AppendTrial(pooled, trial);
  }
  if (!errors.empty()) return errors;
  return pooled;
}

sim::EventData EventTrialOf(const sim::EventData& data, int k) {
  sim::EventData out;
  out.names = data.names;
  out.start = data.trial_start(k);
  out.end = data.trial_end(k);
  for (int i = 0; i < data.processes(); ++i) {
    const std::vector<double>& t = data.times[size_t(i)];
    out.times.emplace_back(t.begin() + long(data.trial_begin(k, i)), t.begin() + long(data.trial_stop(k, i)));
  }
  return out;
}

void WriteEventTrials(const sim::EventData& data, const std::string& folder) {
  std::error_code ec;
  fs::create_directories(folder, ec);
  if (ec) throw FileSystemError{"cannot create the folder " + folder + ": " + ec.message()};
  const int width = std::max(2, int(std::to_string(data.trial_count()).size()));
  for (int k = 0; k < data.trial_count(); ++k) {
    std::string number = std::to_string(k + 1);
    number.insert(0, size_t(std::max(0, width - int(number.size()))), '0');
    const std::string file = (fs::path(folder) / ("trial" + number + ".csv")).string();
    const Status s = WriteFileAtomically(file, FormatEventCsv(EventTrialOf(data, k)));
    if (!s.ok()) throw FileSystemError{"cannot write " + file + ": " + s.message()};
  }
}

}  // namespace locind::app
