// locind merge: join the folders of --part shares into the results of one run.
//
//   merge DIR1 DIR2 ... [--out DIR]
//
// Every share must come from the same study file with the same N, and the
// shares must be exactly 1..N. The joined folder holds the same files as a
// single run of the study (app/results/results_writer.h); only the timing_ columns
// differ. DIR defaults to results/<study name>.
#include <boost/program_options.hpp>
#include <filesystem>
#include <set>

#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/io/error.h"
#include "app/report/report.h"
#include "app/results/results_merge.h"
#include "app/results/results_table.h"
#include "app/results/results_writer.h"
#include "app/study/study_file.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

std::vector<PartFolder> ReadParts(const std::vector<std::string>& dirs) {
  std::vector<PartFolder> parts;
  std::set<int> seen;
  for (const std::string& dir : dirs) {
    Result<PartFolder> p = ReadPartFolder(dir);
    if (!p.ok()) throw UsageError{p.status().message()};
    if (!parts.empty()) {
      const PartFolder& first = parts.front();
      if (p->study_text != first.study_text || std::filesystem::path(p->study_path).filename() !=
                                                   std::filesystem::path(first.study_path).filename()) {
        throw UsageError{dir + " holds a different study than " + first.dir};
      }
      if (p->part.parts != first.part.parts) {
        throw UsageError{dir + " is a share of " + std::to_string(p->part.parts) + " parts, " + first.dir +
                             " of " + std::to_string(first.part.parts)};
      }
    }
    if (!seen.insert(p->part.part).second) {
      throw UsageError{dir + ": part " + p->part.Text() + " given twice"};
    }
    parts.push_back(std::move(p.value()));
  }
  if (static_cast<int>(seen.size()) != parts.front().part.parts) {
    std::string missing;
    for (int k = 1; k <= parts.front().part.parts; ++k) {
      if (!seen.count(k)) missing += (missing.empty() ? "" : ", ") + std::to_string(k);
    }
    throw UsageError{"missing part(s) " + missing + " of " + std::to_string(parts.front().part.parts)};
  }
  return parts;
}

// A replicate holds one row per learner of the study, in the study's order
// (a duplicated, missing or unknown learner means the folder was edited).
void CheckLearners(const StudySpec& study, const PartFolder& p, const UnitResult& unit) {
  std::string found, expected;
  for (const ReplicateRow& row : unit.rows) found += (found.empty() ? "" : ", ") + row.learner;
  for (const LearnerSpec& l : study.learners) expected += (expected.empty() ? "" : ", ") + l.label;
  if (found != expected) {
    throw UsageError{p.dir + "/replicates.csv: cell " + std::to_string(unit.unit.cell) +
                         " replicate " + std::to_string(unit.unit.replicate) + ": learners " +
                         found + " (expected " + expected + ")"};
  }
}

int Merge(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  std::vector<std::string> dirs;
  std::string out_dir;
  po::options_description d("locind merge");
  d.add_options()("dirs", po::value(&dirs), "part folders")("out", po::value(&out_dir), "output folder");
  po::positional_options_description positional;
  positional.add("dirs", -1);
  po::variables_map vm;
  po::store(po::command_line_parser(args).options(d).positional(positional).run(), vm);
  po::notify(vm);
  if (dirs.empty()) throw UsageError{"missing DIR1 DIR2 ... (the part folders to join)"};
  const std::vector<PartFolder> parts = ReadParts(dirs);
  StudyOrErrors read = ParseStudyText(parts.front().study_text, parts.front().study_path);
  if (auto* errors = std::get_if<std::vector<Error>>(&read)) {
    for (const Error& e : *errors) err << e.ToString() << "\n";
    return kExitInputError;
  }
  const StudySpec& study = std::get<StudySpec>(read);
  const std::vector<Cell> cells = ExpandGrid(study);
  std::map<Unit, UnitResult> units;
  for (const PartFolder& p : parts) {
    const std::vector<Unit> expected = UnitsOf(cells, study.grid.replicates, p.part);
    if (expected.size() != p.units.size()) {
      throw UsageError{p.dir + ": holds " + std::to_string(p.units.size()) + " replicates, part " +
                           p.part.Text() + " has " + std::to_string(expected.size())};
    }
    for (const Unit& u : expected) {
      if (!p.units.count(u)) throw UsageError{p.dir + ": a replicate of its share is missing"};
      CheckLearners(study, p, p.units.at(u));
      units.emplace(u, p.units.at(u));
    }
  }
  const StudyTruths truths(study, cells);
  const std::string dir = out_dir.empty() ? "results/" + study.name : out_dir;
  const Status written = WriteResults(dir, study, parts.front().study_text, cells, truths, units, Part{});
  if (!written.ok()) throw FileSystemError{written.message()};
  out << "merged " << parts.size() << " parts into " << dir << "/\n";
  const Result<int> report = WriteReportOfResults(dir, study, cells, truths);
  if (report.ok()) out << "report in " << dir << "/report.html\n";
  if (!report.ok()) err << "locind merge: report not written: " << report.status().message() << "\n";
  out << SummaryTable(study, cells, units);
  return kExitOk;
}

}  // namespace

int RunMergeCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << "usage: locind merge DIR1 DIR2 ... [--out DIR]\n"
           "  joins the folders of locind run --part 1/N ... N/N into the results of one run\n"
           "  --out DIR     result folder (default results/<study name>)\n";
    return kExitOk;
  }
  return GuardCommand("merge", err, [&] { return Merge(args, out, err); });
}

}  // namespace locind::app
