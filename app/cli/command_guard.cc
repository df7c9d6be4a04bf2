#include "app/cli/command_guard.h"

#include <algorithm>
#include <boost/program_options/errors.hpp>
#include <sstream>

#include "app/io/error.h"

namespace locind::app {
namespace {

// A located problem prints as its own FILE:LINE:COLUMN line; anything else
// is prefixed with the command ("locind NAME: message").
void Print(const std::string& name, std::ostream& err, const Error& e) {
  if (e.file.empty()) {
    err << "locind " << name << ": " << e.ToString() << "\n";
  } else {
    err << e.ToString() << "\n";
  }
}

}  // namespace


std::vector<std::string> SplitList(const std::string& text) {
  std::vector<std::string> out;
  std::stringstream in(text);
  for (std::string item; std::getline(in, item, ',');) {
    if (!item.empty()) out.push_back(item);
  }
  return out;
}

int GuardCommand(const std::string& name, std::ostream& err, const std::function<int()>& body,
                 const std::string& usage) {
  try {
    return body();
  } catch (const Errors& errors) {
    int code = kExitOk;
    for (const Error& e : errors) {
      Print(name, err, e);
      code = std::max(code, ExitCode(e.kind));
    }
    return code == kExitOk ? kExitInputError : code;
  } catch (const Error& e) {
    Print(name, err, e);
    return ExitCode(e.kind);
  } catch (const boost::program_options::error& e) {
    // The message quotes the user's words: escaped like every error line.
    Print(name, err, UsageError{e.what()});
    if (!usage.empty()) err << usage << "\n";
    return ExitCode(ErrorKind::kBadUsage);
  } catch (const std::exception& e) {
    Print(name, err, InternalError(e.what()));
    return ExitCode(ErrorKind::kInternal);
  }
}

}  // namespace locind::app
