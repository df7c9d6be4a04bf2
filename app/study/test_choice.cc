#include "app/study/test_choice.h"

#include <algorithm>
#include <map>

#include "app/io/error.h"
#include "learners/independence/drift_transition_test.h"

namespace locind::app {

std::optional<learners::HawkesTestOptions> HawkesTestChoice(const std::string& name) {
  learners::HawkesTestOptions options;  // default: chi-bar-squared reference
  if (name == "hawkes-lr-chisq") {
    options.boundary = learners::BoundaryReference::kChiSquare;
  } else if (name == "hawkes-lr-signed") {
    options.link = learners::HawkesLink::kSoftplus;
  } else if (!name.empty() && name != "hawkes-lr" && name != "hawkes-lr-chibar") {
    return std::nullopt;
  }
  return options;
}

std::optional<learners::LocalCovarianceOptions> LocalCovarianceChoice(const std::string& name) {
  learners::LocalCovarianceOptions options;
  if (name == "event-local-covariance-end") {
    options.statistic = learners::LocalCovarianceStatistic::kEndPoint;
  } else if (name == "event-local-covariance-batch") {
    options.batch_variance = learners::BatchVariance::kCentred;
  } else if (name != "event-local-covariance") {
    return std::nullopt;
  }
  return options;
}

const std::vector<std::string>& EventTestNames() {
  static const std::vector<std::string> names = {
      "hawkes-lr",        "hawkes-lr-chibar",       "hawkes-lr-chisq",
      "hawkes-lr-signed", "event-local-covariance", "event-local-covariance-end",
      "event-local-covariance-batch"};
  return names;
}

bool IsEventTestName(const std::string& name) {
  const std::vector<std::string>& names = EventTestNames();
  return name.empty() || std::find(names.begin(), names.end(), name) != names.end();
}

std::string EventTestList() {
  std::string out;
  for (const std::string& name : EventTestNames()) out += (out.empty() ? "" : ", ") + name;
  return out;
}

std::unique_ptr<learners::IndependenceTest> MakeEventTest(
    const std::string& name, std::shared_ptr<learners::HawkesFeatures> features, uint64_t seed) {
  if (std::optional<learners::HawkesTestOptions> lr = HawkesTestChoice(name)) {
    lr->seed = seed;
    return std::make_unique<learners::HawkesLrTest>(std::move(features), *lr);
  }
  if (std::optional<learners::LocalCovarianceOptions> lc = LocalCovarianceChoice(name)) {
    return std::make_unique<learners::LocalCovarianceTest>(std::move(features), *lc);
  }
  return nullptr;
}

std::optional<learners::DriftTestOptions> DriftTestChoice(const std::string& name) {
  learners::DriftTestOptions options;
  if (name == "drift-robust-wald") {
    options.statistic = learners::DriftStatistic::kRobustWald;
  } else if (!name.empty() && name != "drift-f") {
    return std::nullopt;
  }
  return options;
}

const std::vector<std::string>& PathTestNameList() {
  static const std::vector<std::string> names = {"drift-exact-lr-history", "drift-exact-lr", "drift-f",
                                                  "drift-robust-wald"};
  return names;
}

bool IsPathTestName(const std::string& name) {
  const std::vector<std::string>& names = PathTestNameList();
  return name.empty() || std::find(names.begin(), names.end(), name) != names.end();
}

const char* PathTestNames() {
  static const std::string joined = [] {
    std::string out;
    for (const std::string& name : PathTestNameList()) out += (out.empty() ? "" : ", ") + name;
    return out;
  }();
  return joined.c_str();
}

std::string TestAssumptions(const std::string& name) {
  static const std::map<std::string, std::string> text = {
      {"oracle", "answers from the truth's latent projection: no sampling error"},
      {"hawkes-lr", "b's intensity is a linear Hawkes intensity of the histories of A and C "
                    "(exponential kernels); chi-bar-squared reference"},
      {"hawkes-lr-chibar", "the same as hawkes-lr"},
      {"hawkes-lr-chisq", "the hawkes-lr model against plain chi-squared (below its level, less power)"},
      {"hawkes-lr-signed", "a Hawkes intensity with softplus link (inhibition allowed); chi-squared reference"},
      {"event-local-covariance", "no parametric model of b's intensity: cross-fitted local covariance, "
                                 "consistent nuisance fits needed; slightly above its level at short windows"},
      {"event-local-covariance-end", "the local covariance test with an end-point chi-squared statistic; "
                                     "not safe with an omitted parent"},
      {"event-local-covariance-batch", "the local covariance test scaled by a centred batch-means variance; "
                                       "at or below its level where measured"},
      {"drift-exact-lr-history", "a linear drift of A, C and b with independent noise, b's drift also taking "
                                 "filtered histories of C; exact Gaussian transition, chi-squared reference"},
      {"drift-exact-lr", "a linear Markov drift of A, C and b with independent noise; exact Gaussian "
                         "transition; above its level when a slow parent of b is hidden or left out"},
      {"drift-f", "increments regressed on levels and filtered histories; F test; above its level on "
                  "grandparent chains at long windows"},
      {"drift-robust-wald", "the drift-f regression with a heteroskedasticity-robust Wald test"},
  };
  const auto it = text.find(name);
  return it == text.end() ? std::string() : it->second;
}

Result<std::unique_ptr<learners::IndependenceTest>> MakePathTest(const std::string& name, sim::PathData data,
                                                                 std::vector<double> rates) {
  const std::string chosen = name.empty() ? std::string(kDefaultPathTest) : name;
  if (chosen == "drift-exact-lr" || chosen == "drift-exact-lr-history") {
    learners::DriftTransitionOptions options;
    if (chosen == "drift-exact-lr-history") {
      options.history = true;
      options.rates = std::move(rates);  // empty: the supported default filter rates
    }
    Result<learners::DriftTransitionTest> made = learners::DriftTransitionTest::Create(std::move(data), options);
    if (!made.ok()) return made.status();
    return std::unique_ptr<learners::IndependenceTest>(
        std::make_unique<learners::DriftTransitionTest>(std::move(made.value())));
  }
  std::optional<learners::DriftTestOptions> options = DriftTestChoice(chosen);
  if (!options) return Status::Error("unknown path test '" + name + "' (" + PathTestNames() + ")");
  options->rates = std::move(rates);
  Result<learners::DriftTest> made = learners::DriftTest::Create(std::move(data), *options);
  if (!made.ok()) return made.status();
  return std::unique_ptr<learners::IndependenceTest>(std::make_unique<learners::DriftTest>(std::move(made.value())));
}

}  // namespace locind::app
