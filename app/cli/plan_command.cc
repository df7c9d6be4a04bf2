// locind plan: the observation length each learner needs.
//
//   plan STUDY.yaml [--power 0.8] [--false-edges 0.05] [--threads N] [--out DIR] [--at "hidden=2 level=0.05"]
//
// The search runs for every combination of the other grid factors (hidden
// count, stationarity target, level), or for those --at names; the report
// and plan.csv name the combination of each plan.
// For every learner of the study, the smallest observation length at which
// the pooled power reaches --power and the false-edge rate stays at or below
// --false-edges, found by the adaptive search of app/running/study_planner.h, with
// the range the replicate uncertainty allows, or a plain statement when no
// length up to the cap (plan.cap in the study) reaches the targets. One line
// per evaluated length goes to stderr as the search proceeds. With --out DIR
// the result also goes to DIR/plan.csv, where `locind report DIR` draws the
// targets and the planned lengths (give it the study's result folder).
#include <boost/program_options.hpp>
#include <filesystem>

#include "app/cli/command.h"
#include "app/io/atomic_file.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/study/study_file.h"
#include "app/running/study_planner.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

int Plan(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  std::string path;
  PlanTargets targets;
  int threads = 1;
  std::string out_dir;
  std::string at;
  po::options_description d("locind plan");
  d.add_options()("power", po::value(&targets.power), "target power")(
      "false-edges", po::value(&targets.false_edges), "largest false-edge rate")(
      "threads", po::value(&threads), "worker threads")("out", po::value(&out_dir), "folder for plan.csv")(
      "at", po::value(&at), "combination of the other grid factors");
  const po::variables_map vm = ParseCommandLine(args, d, {{"study", "STUDY.yaml (the study file)"}});
  path = vm["study"].as<std::string>();
  if (!(targets.power > 0 && targets.power <= 1)) throw UsageError{"--power must lie in (0, 1]"};
  if (!(targets.false_edges >= 0 && targets.false_edges < 1)) throw UsageError{"--false-edges must lie in [0, 1)"};
  if (threads < 1 || threads > 1024) throw UsageError{"--threads must be from 1 to 1024"};
  StudyOrErrors read = ReadStudyFile(path);
  if (auto* errors = std::get_if<std::vector<Error>>(&read)) {
    for (const Error& e : *errors) err << e.ToString() << "\n";
    return kExitInputError;
  }
  const StudySpec& study = std::get<StudySpec>(read);
  const Result<std::vector<PlanCombination>> combos = PickCombinations(study, at);
  if (!combos.ok()) throw UsageError{"--at: " + combos.status().message()};
  err << "plan: " << combos->size() << " combination" << (combos->size() == 1 ? "" : "s")
      << " of the other grid factors:";
  for (const PlanCombination& c : *combos) err << (&c == &combos->front() ? " " : "; ") << c.Text();
  err << "\n";
  const std::vector<LearnerPlan> plans = PlanLengths(
      study, targets, threads, [&err](const std::string& line) { err << line << "\n" << std::flush; }, *combos);
  out << PlanReport(plans, targets);
  if (!out_dir.empty()) {
    std::error_code ec;
    std::filesystem::create_directories(out_dir, ec);
    const Status written = WriteFileAtomically(out_dir + "/plan.csv", PlanCsv(plans, targets));
    if (!written.ok()) {
      err << "locind plan: " << written.message() << "\n";
      return kExitFailure;
    }
    out << "plan written to " << out_dir << "/plan.csv\n";
  }
  return kExitOk;
}

}  // namespace

int RunPlanCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << "usage: locind plan STUDY.yaml [--power 0.8] [--false-edges 0.05] [--threads N] [--out DIR] [--at TEXT]\n"
           "  per learner, the smallest observation length with power >= --power and false-edge\n"
           "  rate <= --false-edges (search settings: the plan section of the study file;\n"
           "  plan.along: trials searches the number of trials of the first grid length instead)\n"
           "  --out DIR     also write DIR/plan.csv (locind report DIR draws the targets)\n"
           "  --at TEXT     plan only the combinations of the other grid factors that match TEXT,\n"
           "                e.g. \"hidden=2 target=0.6 level=0.05\" (default: every combination)\n";
    return kExitOk;
  }
  return GuardCommand("plan", err, [&] {
    return Plan(args, out, err);
  });
}

}  // namespace locind::app
