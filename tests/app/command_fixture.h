// Runs a command handler in-process and captures its exit code and streams.
#pragma once

#include <sstream>
#include <string>
#include <vector>

#include "app/cli/command.h"

namespace locind::testing {

struct Outcome {
  int code;
  std::string out, err;
};

inline Outcome RunHandler(app::CommandHandler handler, const std::vector<std::string>& args) {
  std::ostringstream out, err;
  const int code = handler(args, out, err);
  return {code, out.str(), err.str()};
}

}  // namespace locind::testing
