// Trials: several recordings of the same system given as a folder with one
// event file (or one path file) per trial (format documented in
// configs/models/README.md, "Several trials").
//
//   recordings/            a folder: every *.csv file in it is one trial,
//     trial01.csv            in file-name order; each is an ordinary event
//     trial02.csv            (or path) file with its own clock and window
//
// A plain file is read as one trial. Event trials may name their processes
// in any order and may leave a process out (it then has no events in that
// trial); the data set's processes are the union in order of first
// appearance. Path trials must have the same columns in the same order.
// Learners pool over the trials (sim::EventData::trials,
// sim::PathData::trial_starts): no history crosses a trial boundary.
#pragma once

#include <ostream>
#include <string>
#include <vector>

#include "app/io/event_csv.h"
#include "app/io/path_csv.h"

namespace locind::app {

// The *.csv files of `folder`, sorted by name; empty when `path` is a file.
// Fails (Error) when the folder cannot be listed or holds no *.csv file.
std::vector<std::string> TrialFiles(const std::string& path);

// Reads `path`: an event file (one trial) or a folder of event files (one per
// trial). Every problem of every file is reported (each file's own rules);
// `notes` collects the readers' notes (e.g. a window taken from the events).
EventsOrError ReadEventTrials(const std::string& path, std::vector<std::string>* notes = nullptr);

// ReadEventTrials for a command: writes its notes ("PROGRAM: note: ...") and
// EmptyWindowWarnings ("PROGRAM: warning: ...") to `err`; throws the Errors
// of bad input.
sim::EventData LoadEventTrials(const std::string& path, const std::string& program, std::ostream& err);

// Reads `path`: a path file (one trial) or a folder of path files.
PathsOrError ReadPathTrials(const std::string& path);

// Writes every trial of `data` as `folder`/trialNN.csv (NN from 01, wide
// enough for the count; a one-trial data set gives trial01.csv), creating
// the folder. Throws Error when a file cannot be written.
void WriteEventTrials(const sim::EventData& data, const std::string& folder);

// The trial k of `data` as a one-trial data set (its own window and events).
sim::EventData EventTrialOf(const sim::EventData& data, int k);

}  // namespace locind::app
