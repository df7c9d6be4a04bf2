// locind run: run a study.
//
//   run STUDY.yaml [--threads N] [--out DIR] [--part K/N] [--check]
//                  [--mpi-assign dispatch|static]
//
// Validates the study (every problem on stderr as FILE:LINE:COLUMN: FIELD:
// message, exit 2, nothing written), draws the truths and computes their
// classes, then runs the units of the part that are not yet in DIR's journal
// (app/running/runner_journal.h) on N threads, and finally writes the result files
// (app/results/results_writer.h) and prints the summary table. DIR defaults to
// results/<study name>. Under mpirun, the units run on every rank and rank 0
// does the rest (app/running/runner_mpi.h). A study whose replicate would need more
// memory than its memory_mb is refused before any work (app/study/study_cost.h);
// --check prints the expected work and memory and writes nothing.
#include <boost/program_options.hpp>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <sstream>

#include "app/cli/command.h"
#include "base/hashing.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/running/progress.h"
#include "app/report/report.h"
#include "app/results/results_table.h"
#include "app/results/results_writer.h"
#include "app/running/runner.h"
#include "app/running/runner_journal.h"
#include "app/running/runner_mpi.h"
#include "app/study/study_cost.h"
#include "app/study/study_file.h"
#include "app/study/truth_models.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

struct RunOptions {
  std::string study;
  std::string out;
  int threads = 1;
  Part part;
  std::string assign;  // --mpi-assign
  bool check = false;  // print the expected work and memory only
};

RunOptions ParseOptions(const std::vector<std::string>& args) {
  RunOptions o;
  std::string part = "1/1";
  po::options_description d("locind run");
  d.add_options()(
      "threads", po::value(&o.threads), "worker threads")("out", po::value(&o.out), "output folder")(
      "part", po::value(&part), "run share K of N")(
      "mpi-assign", po::value(&o.assign), "how ranks get units");
  d.add_options()("check", po::bool_switch(&o.check), "print the expected work and memory only");
  const po::variables_map vm = ParseCommandLine(args, d, {{"study", "STUDY.yaml (the study file)"}});
  o.study = vm["study"].as<std::string>();
  if (o.threads < 1 || o.threads > 1024) throw UsageError{"--threads must be from 1 to 1024"};
  const std::optional<Part> p = ParsePart(part);
  if (!p) throw UsageError{"--part expects K/N with 1 <= K <= N, e.g. 2/8"};
  o.part = *p;
  return o;
}

std::string ReadText(const std::string& path) {
  std::ifstream in(path);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::string Hex(uint64_t v) {
  char buffer[17];
  std::snprintf(buffer, sizeof buffer, "%016llx", static_cast<unsigned long long>(v));
  return buffer;
}

int Run(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const RunOptions o = ParseOptions(args);
  RankGroup ranks(o.assign);
  if (!ranks.lead()) return ranks.Serve(o.study, o.threads);
  StudyOrErrors read = ReadStudyFile(o.study);
  if (auto* errors = std::get_if<std::vector<Error>>(&read)) {
    for (const Error& e : *errors) err << e.ToString() << "\n";
    return kExitInputError;
  }
  const StudySpec& study = std::get<StudySpec>(read);
  const std::vector<Cell> cells = ExpandGrid(study);
  const StudyTruths truths(study, cells);
  const StudyCost cost = EstimateCost(study, cells, truths);
  // Rescaled parameters outside their configured ranges: said before any work
  // (and again in study.json, rescale_warnings).
  for (const std::string& w : RescaleWarnings(TruthModels(study, cells, truths))) {
    err << "locind run: warning: " << w << "\n";
  }
  if (o.check) {
    out << CostText(study, cost, o.threads);
    if (o.part.parts > 1) {
      out << "part " << o.part.Text() << ": "
          << UnitsOf(cells, study.grid.replicates, o.part).size() << " of " << cost.simulations
          << " simulations\n";
    }
    return kExitOk;
  }
  if (const std::string memory = MemoryProblem(study, cost); !memory.empty()) {
    err << Error{o.study, 0, 0, "memory_mb", memory}.ToString() << "\n";
    return kExitInputError;
  }
  const std::string dir = o.out.empty() ? "results/" + study.name : o.out;
  // study.json names the version, so a folder of another version is not resumed.
  const std::string identity =
      Hex(base::HashText(StudyJson(study, cells, truths))) + " part " + o.part.Text();
  Result<std::unique_ptr<Journal>> journal = Journal::Open(dir, identity);
  // A folder of another study or share is a usage problem (exit 2); a busy
  // or unwritable folder is exit 1.
  if (!journal.ok() && journal.status().message() == ForeignJournal(dir, identity)) {
    throw UsageError{journal.status().message()};
  }
  if (!journal.ok()) {
    err << "locind run: " << journal.status().message() << "\n";
    return kExitFailure;
  }
  Journal& j = *journal.value();
  const std::vector<Unit> mine = UnitsOf(cells, study.grid.replicates, o.part);
  std::vector<Unit> pending;
  for (const Unit& u : mine) {
    if (!j.finished().count(u)) pending.push_back(u);
  }
  err << "locind run: " << study.name << ", " << cells.size() << " cells x " << study.grid.replicates
      << " replicates x " << study.learners.size() << " learners";
  if (o.part.parts > 1) err << ", part " << o.part.Text();
  if (ranks.size() > 1) err << ", " << ranks.Describe(o.threads);
  err << "; " << mine.size() - pending.size() << " of " << mine.size() << " units already done\n";
  Progress progress(err, StderrIsTerminal() && &err == &std::cerr, static_cast<int64_t>(mine.size()),
                    static_cast<int64_t>(mine.size() - pending.size()), "units");
  Status appended;
  ranks.RunUnits(study, cells, truths, pending, o.threads,
           [&](UnitResult r) {
             Status s = j.Append(std::move(r));
             if (!s.ok() && appended.ok()) appended = s;
           },
           &progress);
  progress.Finish();
  if (!appended.ok()) {
    err << "locind run: " << appended.message() << "\n";
    return kExitFailure;
  }
  std::map<Unit, UnitResult> finished;
  for (const Unit& u : mine) finished.emplace(u, j.finished().at(u));
  const Status written = WriteResults(dir, study, ReadText(o.study), cells, truths, finished, o.part);
  if (!written.ok()) {
    err << "locind run: " << written.message() << "\n";
    return kExitFailure;
  }
  out << "results in " << dir << "/ (replicates.csv, edges.csv, summary.csv, comparisons.csv, null_tests.csv, calibration.csv, study.json, drawings)\n";
  if (o.part.parts > 1) {
    out << "this is part " << o.part.Text() << "; join the parts with locind merge (it writes the report)\n";
  } else {
    // The results stand without the report: a drawing problem is a warning.
    const Result<int> report = WriteReportOfResults(dir, study, cells, truths);
    if (report.ok()) out << "report in " << dir << "/report.html\n";
    if (!report.ok()) err << "locind run: report not written: " << report.status().message() << "\n";
  }
  out << SummaryTable(study, cells, finished);
  return kExitOk;
}

}  // namespace

int RunRunCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << "usage: locind run STUDY.yaml [--threads N] [--out DIR] [--part K/N] [--check]\n"
           "  --threads N   worker threads (default 1)\n"
           "  --out DIR     result folder (default results/<study name>); an existing one is "
           "resumed\n"
           "  --part K/N    run share K of N (join the shares with locind merge)\n"
           "  --check       print the expected work and memory of the study; write nothing\n"
           "  --mpi-assign dispatch|static\n"
           "                under mpirun: units handed out by rank 0 on request, longest first\n"
           "                (default), or fixed shares; needs a build with LOCIND_MPI\n"
           "Study files: configs/README.md; output columns: results/README.md\n";
    return kExitOk;
  }
  return GuardCommand("run", err, [&] {
    return Run(args, out, err);
  });
}

}  // namespace locind::app
