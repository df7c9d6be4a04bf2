// Option plumbing shared by the command handlers: help detection, parsing
// with positional arguments named as the user writes them, refusing options
// that a choice does not use, and aligned help rows.
#pragma once

#include <boost/program_options.hpp>
#include <string>
#include <utility>
#include <vector>

namespace locind::app {

// True when any argument is --help or -h (before or after the others).
bool WantsHelp(const std::vector<std::string>& args);

// A positional argument: the option key it is stored under and the name the
// help shows for it ("DATA.csv"). Errors name it by `shown`, never by `key`.
struct Positional {
  std::string key;
  std::string shown;
  bool required = true;
};

// Parses `args` against `options` plus the positionals, each taking one
// word in order. Throws UsageError "missing DATA.csv" for an absent required
// positional, "unexpected argument 'X'" for a surplus word, and lets
// boost's own errors for named options through (GuardCommand prints them).
boost::program_options::variables_map ParseCommandLine(
    const std::vector<std::string>& args, const boost::program_options::options_description& options,
    const std::vector<Positional>& positional);

// Throws UsageError "OPTION is not used by WHAT; leave it out" for the first
// of `names` (without the leading "--") present in `vm`.
void RefuseOptions(const boost::program_options::variables_map& vm,
                   const std::vector<std::string>& names, const std::string& what);

// Help rows "  LEFT  RIGHT" with every RIGHT starting in the same column
// (spaces, never tabs); a RIGHT with newlines continues under itself.
std::string AlignedRows(const std::vector<std::pair<std::string, std::string>>& rows);

}  // namespace locind::app
