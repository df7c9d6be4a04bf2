// The statistical tests a user can name, shared by `locind test`,
// `locind learn` and study files, and the sniffing of a data file's kind.
//
//   event data: hawkes-lr (default; chi-bar-squared reference, alias
//               hawkes-lr-chibar), hawkes-lr-chisq (plain chi-squared
//               reference, conservative), hawkes-lr-signed,
//               event-local-covariance (cross-fitted local covariance test,
//               supremum statistic), event-local-covariance-end (its
//               end-point chi-squared statistic), event-local-covariance-batch
//               (supremum statistic scaled by the larger of the optional
//               variation and a centred batch-means variance)
//   path data:  drift-exact-lr-history (default), drift-exact-lr, drift-f,
//               drift-robust-wald
#pragma once

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/independence/independence_test.h"
#include "learners/independence/local_covariance_test.h"
#include "sim/path_data.h"

namespace locind::app {

// Options for the named event test ("" is the default), or nullopt when the
// name is not an event test.
std::optional<learners::HawkesTestOptions> HawkesTestChoice(const std::string& name);

// Options for the named local covariance test, or nullopt.
std::optional<learners::LocalCovarianceOptions> LocalCovarianceChoice(const std::string& name);

// Every event test name, the default first (for messages and study files).
const std::vector<std::string>& EventTestNames();
// True when `name` is one of EventTestNames() or "" (the default).
bool IsEventTestName(const std::string& name);
// EventTestNames() joined by ", " (for messages).
std::string EventTestList();

// The named event test on `features` ("" is the default), or nullptr when
// the name is not an event test. `seed` keys the test's Monte Carlo draws.
// REQUIRES: features != nullptr.
std::unique_ptr<learners::IndependenceTest> MakeEventTest(
    const std::string& name, std::shared_ptr<learners::HawkesFeatures> features, uint64_t seed);

// Options for the named regression path test (drift-f, drift-robust-wald;
// "" gives drift-f's), or nullopt.
std::optional<learners::DriftTestOptions> DriftTestChoice(const std::string& name);

// Every path test name, the default first (for study files).
const std::vector<std::string>& PathTestNameList();
// True for "" (the default) and every PathTestNameList() entry.
bool IsPathTestName(const std::string& name);
// PathTestNameList() joined by ", " (for messages): "drift-exact-lr-history, drift-exact-lr,
// drift-f, drift-robust-wald".
const char* PathTestNames();
// One sentence on what the named test assumes and when it holds its level
// (for the report; the fuller text is `locind test --help` and
// docs/tests.md); "" for a name that is not a test.
std::string TestAssumptions(const std::string& name);

// The path test used when none is named.
inline constexpr const char* kDefaultPathTest = "drift-exact-lr-history";
// The named path test ("" is the default) on `data`. `rates` are the filter
// rates of the regression tests and of drift-exact-lr-history's history
// inputs (empty: their defaults; ignored by drift-exact-lr). Fails with "unknown path test '<name>' (<names>)" or with
// the test's own message on invalid data.
Result<std::unique_ptr<learners::IndependenceTest>> MakePathTest(const std::string& name, sim::PathData data,
                                                                 std::vector<double> rates = {});

}  // namespace locind::app
