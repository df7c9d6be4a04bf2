#include "app/study/test_choice.h"

#include <fstream>

#include "app/io/error.h"

namespace locind::app {

std::optional<learners::HawkesTestOptions> HawkesTestChoice(const std::string& name) {
  learners::HawkesTestOptions options;
  if (name == "hawkes-lr-chibar") {
    options.boundary = learners::BoundaryReference::kChiBarSquared;
  } else if (name == "hawkes-lr-signed") {
    options.link = learners::HawkesLink::kSoftplus;
  } else if (!name.empty() && name != "hawkes-lr") {
    return std::nullopt;
  }
  return options;
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

bool LooksLikeEventFile(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw Error{path, 0, 0, "", "cannot open the file"};
  for (std::string line; std::getline(in, line);) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (line.empty() || line[0] == '#') continue;
    return line == "time,process";
  }
  return false;
}

}  // namespace locind::app
