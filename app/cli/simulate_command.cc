// locind simulate MODEL.yaml --horizon T --seed S --out FILE.csv [--replicate R]
//
// One draw of the model in MODEL.yaml over the window [0, T], written as an
// event file (events models) or a path file (paths models). The draw uses
// the random stream keyed by (seed, cell 0, replicate, purpose 1 = data), so
// the same arguments always give the same file.
#include <boost/program_options.hpp>
#include <cmath>

#include "app/io/atomic_file.h"
#include "app/io/error.h"
#include "app/cli/command.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/io/event_csv.h"
#include "app/io/model_file.h"
#include "app/io/path_csv.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

constexpr uint64_t kDataPurpose = 1;
constexpr char kUsage[] =
    "usage: locind simulate MODEL.yaml --horizon T --seed S --out FILE.csv [--replicate R]";

struct Options {
  std::string model;
  std::string out;
  double horizon = 0;
  uint64_t seed = 0;
  uint64_t replicate = 0;
};

Options ParseOptions(const std::vector<std::string>& args) {
  Options o;
  po::options_description d("locind simulate MODEL.yaml --horizon T --seed S --out FILE.csv");
  d.add_options()("horizon", po::value<double>(&o.horizon)->required(), "window length T > 0")(
      "seed", po::value<uint64_t>(&o.seed)->required(), "random seed")(
      "replicate", po::value<uint64_t>(&o.replicate)->default_value(0), "replicate number")(
      "out", po::value<std::string>(&o.out)->required(), "output CSV file");
  const po::variables_map vm = ParseCommandLine(args, d, {{"model", "MODEL.yaml (the model file)"}});
  o.model = vm["model"].as<std::string>();
  if (!std::isfinite(o.horizon) || o.horizon <= 0) throw UsageError{"--horizon must be > 0"};
  return o;
}

// Simulates and formats; a refused model is bad input, anything else a failure.
std::string Simulate(const ModelSpec& spec, const Options& o, std::string& summary) {
  base::RandomStream random(base::StreamKey{o.seed, 0, o.replicate, kDataPurpose});
  if (const auto* events = std::get_if<EventModelSpec>(&spec)) {
    sim::HawkesRunOptions run = events->run;
    run.horizon = o.horizon;
    Result<sim::EventData> data = sim::SimulateHawkes(events->model, run, random);
    if (!data.ok()) throw InternalError(data.status().message());
    summary = std::to_string(data->total_events()) + " events";
    return FormatEventCsv(*data);
  }
  const auto& paths = std::get<PathModelSpec>(spec);
  sim::PathRunOptions run = paths.run;
  run.horizon = o.horizon;
  Result<sim::PathData> data = sim::SimulateDiffusion(paths.model, run, random);
  if (!data.ok()) throw InternalError(data.status().message());
  summary = std::to_string(data->samples()) + " samples of " + std::to_string(data->processes()) +
            " processes";
  return FormatPathCsv(*data);
}

}  // namespace

int RunSimulateCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << kUsage << "\n  --horizon T     window length, > 0\n  --seed S        random seed\n"
        << "  --replicate R   replicate number (default 0)\n  --out FILE.csv  output file\n"
        << "Model files and CSV formats: configs/models/README.md\n";
    return kExitOk;
  }
  return GuardCommand("simulate", err, [&] {
    const Options o = ParseOptions(args);
    ModelOrError model = ReadModelFile(o.model);
    if (auto* e = std::get_if<Error>(&model)) throw *e;
    std::string summary;
    const std::string content = Simulate(std::get<ModelSpec>(model), o, summary);
    Status written = WriteFileAtomically(o.out, content);
    if (!written.ok()) throw FileSystemError(written.message());
    out << "wrote " << o.out << " (" << summary << ")\n";
    return kExitOk;
  }, kUsage);
}

}  // namespace locind::app
