#include "app/cli/command_guard.h"

#include <boost/program_options/errors.hpp>
#include <sstream>

#include "app/io/input_error.h"

namespace locind::app {

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
  } catch (const InputError& e) {
    err << e.ToString() << "\n";
    return kExitInputError;
  } catch (const InputErrors& errors) {
    for (const InputError& e : errors) err << e.ToString() << "\n";
    return kExitInputError;
  } catch (const UsageError& e) {
    err << "locind " << name << ": " << e.message << "\n";
    return kExitInputError;
  } catch (const boost::program_options::error& e) {
    err << "locind " << name << ": " << e.what() << "\n";
    if (!usage.empty()) err << usage << "\n";
    return kExitInputError;
  } catch (const std::exception& e) {
    err << "locind " << name << ": " << e.what() << "\n";
    return kExitFailure;
  }
}

}  // namespace locind::app
