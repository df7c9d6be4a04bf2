// The statistical tests a user can name, shared by `locind test`,
// `locind learn` and study files, and the sniffing of a data file's kind.
//
//   event data: hawkes-lr (default), hawkes-lr-chibar, hawkes-lr-signed
//   path data:  drift-f (default), drift-robust-wald
#pragma once

#include <optional>
#include <string>

#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_lr_test.h"

namespace locind::app {

// Options for the named event test ("" is the default), or nullopt when the
// name is not an event test.
std::optional<learners::HawkesTestOptions> HawkesTestChoice(const std::string& name);

// Options for the named path test ("" is the default), or nullopt.
std::optional<learners::DriftTestOptions> DriftTestChoice(const std::string& name);

// True when the first line that is not a '#' comment is the event header
// "time,process". Throws Error when the file cannot be opened.
bool LooksLikeEventFile(const std::string& path);

}  // namespace locind::app
