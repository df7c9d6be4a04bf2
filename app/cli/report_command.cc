// locind report: the HTML report of a finished result folder.
//
//   report DIR
//
// Reads the study saved in DIR/input/ and the files summary.csv, edges.csv,
// null_tests.csv (and plan.csv when `locind plan --out DIR` wrote one), and
// writes DIR/report.html and DIR/figures/*.svg (app/report/report.h). Needs
// gnuplot for the plots and Graphviz for the drawings. `locind run` and
// `locind merge` write the report themselves; this command redraws it, for
// example after a plan was added.
#include <boost/program_options.hpp>

#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/io/error.h"
#include "app/report/report.h"
#include "app/results/results_merge.h"
#include "app/study/study_file.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

constexpr char kUsage[] = "usage: locind report DIR";

int Report(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  std::string dir;
  po::options_description d("locind report");
  const po::variables_map vm = ParseCommandLine(args, d, {{"dir", "DIR (the result folder)"}});
  dir = vm["dir"].as<std::string>();
  Result<SavedStudy> saved = ReadSavedStudy(dir);
  if (!saved.ok()) {
    err << "locind report: " << saved.status().message() << "\n";
    return kExitInputError;
  }
  StudyOrErrors read = ParseStudyText(saved->text, saved->path);
  if (auto* errors = std::get_if<std::vector<Error>>(&read)) {
    for (const Error& e : *errors) err << e.ToString() << "\n";
    return kExitInputError;
  }
  Result<ReportData> data = ReadReportData(dir);
  if (!data.ok()) {
    err << "locind report: " << data.status().message() << "\n";
    return kExitInputError;
  }
  const StudySpec& study = std::get<StudySpec>(read);
  const std::vector<Cell> cells = ExpandGrid(study);
  const StudyTruths truths(study, cells);
  Result<int> figures = WriteReport(dir, study, cells, truths, *data);
  if (!figures.ok()) {
    err << "locind report: " << figures.status().message() << "\n";
    return kExitFailure;
  }
  out << "report in " << dir << "/report.html (" << *figures << " figures, also as SVG files in " << dir
      << "/figures/)\n";
  return kExitOk;
}

}  // namespace

int RunReportCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << kUsage << "\n"
        << "  writes DIR/report.html (one self-contained page) and DIR/figures/*.svg for the result\n"
           "  folder of locind run or locind merge; plan targets are drawn when DIR/plan.csv exists\n"
           "  (locind plan STUDY.yaml --out DIR)\n";
    return kExitOk;
  }
  return GuardCommand("report", err, [&] { return Report(args, out, err); }, kUsage);
}

}  // namespace locind::app
