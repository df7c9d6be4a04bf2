// locind: the command-line front end. It only parses, calls and prints; the
// work is done by the handlers listed here.
#include <iostream>
#include <string>
#include <vector>

#include "app/cli/command.h"
#include "app/cli/options.h"
#include "app/cli/version.h"
#include "app/io/error.h"
#include "base/memory_tuning.h"

namespace {

using locind::app::Command;

const Command kCommands[] = {
    {"graph", "mu-separation, latent projection, equivalence classes, drawings",
     locind::app::RunGraphCommand},
    {"simulate", "one draw of a Hawkes or diffusion model file, written as CSV",
     locind::app::RunSimulateCommand},
    {"learn", "run a learning method on data or on the oracle of a graph", locind::app::RunLearnCommand},
    {"test", "one local-independence test on a data file", locind::app::RunTestCommand},
    {"run", "run a study file: simulate, learn, score; resumable, --part K/N shares", locind::app::RunRunCommand},
    {"merge", "join the result folders of --part shares into one", locind::app::RunMergeCommand},
    {"plan", "smallest observation length reaching a target power and false-edge rate", locind::app::RunPlanCommand},
    {"report", "HTML report with figures of a finished result folder", locind::app::RunReportCommand},
    {"score", "score a learned graph against the class of a truth with hidden processes",
     locind::app::RunScoreCommand},
};

void PrintUsage(std::ostream& out) {
  out << "usage: locind COMMAND [options]   (locind COMMAND --help for details)\n"
         "       locind --version\n\ncommands:\n";
  std::vector<std::pair<std::string, std::string>> rows;
  for (const Command& c : kCommands) rows.emplace_back(c.name, c.summary);
  out << locind::app::AlignedRows(rows);
}

}  // namespace

int main(int argc, char** argv) {
  locind::base::KeepFreedMemory();  // reuse freed fit matrices (base/memory_tuning.h)
  if (argc < 2 || std::string(argv[1]) == "--help" || std::string(argv[1]) == "-h") {
    PrintUsage(argc < 2 ? std::cerr : std::cout);
    return argc < 2 ? locind::app::kExitInputError : locind::app::kExitOk;
  }
  const std::string name = argv[1];
  if (name == "--version") {
    std::cout << locind::app::VersionText();
    return locind::app::kExitOk;
  }
  for (const Command& c : kCommands) {
    if (name == c.name) return c.run(std::vector<std::string>(argv + 2, argv + argc), std::cout, std::cerr);
  }
  std::cerr << "locind: " << locind::app::UsageError{"unknown command '" + name + "'"}.ToString() << "\n";
  PrintUsage(std::cerr);
  return locind::app::kExitInputError;
}
