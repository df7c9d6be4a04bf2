#include "app/cli/options.h"

#include <algorithm>
#include <sstream>

#include "app/io/error.h"

namespace locind::app {

namespace po = boost::program_options;

bool WantsHelp(const std::vector<std::string>& args) {
  return std::any_of(args.begin(), args.end(),
                     [](const std::string& a) { return a == "--help" || a == "-h"; });
}

po::variables_map ParseCommandLine(const std::vector<std::string>& args,
                                   const po::options_description& options,
                                   const std::vector<Positional>& positional) {
  // Positionals are registered as hidden options without ->required(), so a
  // missing one is reported here under its shown name rather than by boost
  // under the internal key ("--data").
  po::options_description all = options;
  po::positional_options_description order;
  for (const Positional& p : positional) {
    all.add_options()(p.key.c_str(), po::value<std::string>(), "");
    order.add(p.key.c_str(), 1);
  }
  all.add_options()("locind-surplus", po::value<std::vector<std::string>>(), "");
  order.add("locind-surplus", -1);
  po::variables_map vm;
  po::store(po::command_line_parser(args).options(all).positional(order).run(), vm);
  if (vm.count("locind-surplus")) {
    throw UsageError{"unexpected argument '" +
                     vm["locind-surplus"].as<std::vector<std::string>>().front() + "'"};
  }
  for (const Positional& p : positional) {
    if (p.required && !vm.count(p.key)) throw UsageError{"missing " + p.shown};
  }
  po::notify(vm);
  return vm;
}

void RefuseOptions(const po::variables_map& vm, const std::vector<std::string>& names,
                   const std::string& what) {
  for (const std::string& name : names) {
    if (vm.count(name) && !vm[name].defaulted()) {
      throw UsageError{"--" + name + " is not used by " + what + "; leave it out"};
    }
  }
}

std::string AlignedRows(const std::vector<std::pair<std::string, std::string>>& rows) {
  size_t width = 0;
  for (const auto& row : rows) width = std::max(width, row.first.size());
  std::ostringstream out;
  for (const auto& [left, right] : rows) {
    out << "  " << left << std::string(width - left.size() + 2, ' ');
    std::istringstream lines(right);
    bool first = true;
    for (std::string line; std::getline(lines, line); first = false) {
      if (!first) out << std::string(width + 4, ' ');
      out << line << "\n";
    }
    if (right.empty()) out << "\n";
  }
  return out.str();
}

}  // namespace locind::app
