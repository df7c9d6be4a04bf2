// Command: one entry of the front end's table of subcommands.
//
// A handler gets the arguments after the subcommand name and the two output
// streams, and returns the exit code (kExitOk, kExitFailure, or
// kExitInputError for bad input or usage).
#pragma once

#include <ostream>
#include <string>
#include <vector>

namespace locind::app {

using CommandHandler = int (*)(const std::vector<std::string>& args, std::ostream& out,
                               std::ostream& err);

struct Command {
  const char* name;
  const char* summary;
  CommandHandler run;
};

// Handlers, one per file app/<name>_command.cc.
int RunGraphCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunSimulateCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunLearnCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunTestCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunRunCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunMergeCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunPlanCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunReportCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
int RunScoreCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);

}  // namespace locind::app
