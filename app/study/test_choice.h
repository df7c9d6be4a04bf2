// The statistical tests a user can name, shared by `locind test`,
// `locind learn` and study files, and the sniffing of a data file's kind.
//
//   event data: hawkes-lr (default), hawkes-lr-chibar, hawkes-lr-signed
//   path data:  drift-exact-lr (default), drift-f, drift-robust-wald
#pragma once

#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/independence/independence_test.h"
#include "sim/path_data.h"

namespace locind::app {

// Options for the named event test ("" is the default), or nullopt when the
// name is not an event test.
std::optional<learners::HawkesTestOptions> HawkesTestChoice(const std::string& name);

// Options for the named regression path test (drift-f, drift-robust-wald;
// "" gives drift-f's), or nullopt.
std::optional<learners::DriftTestOptions> DriftTestChoice(const std::string& name);

// The path test names, for messages: "drift-exact-lr, drift-f, drift-robust-wald".
const char* PathTestNames();
// The path test used when none is named.
inline constexpr const char* kDefaultPathTest = "drift-exact-lr";
// The named path test ("" is the default) on `data`. `rates` are the filter
// rates of the regression tests (empty: their defaults; ignored by
// drift-exact-lr). Fails with "unknown path test '<name>' (<names>)" or with
// the test's own message on invalid data.
Result<std::unique_ptr<learners::IndependenceTest>> MakePathTest(const std::string& name, sim::PathData data,
                                                                 std::vector<double> rates = {});

// True when the first line that is not a '#' comment is the event header
// "time,process". Throws Error when the file cannot be opened.
bool LooksLikeEventFile(const std::string& path);

}  // namespace locind::app
