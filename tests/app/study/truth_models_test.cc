// The truth models of a study: one model file per truth that reads back
// (app/io/model_file.h) to exactly the parameters the study simulates, and
// that `locind simulate` runs; rescaling recorded before and after, with a
// warning when the rescaled weights leave their configured range.
#include <doctest/doctest.h>

#include <algorithm>

#include "app/cli/command.h"
#include "app/io/model_file.h"
#include "app/study/study_file.h"
#include "app/study/truth_models.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

using namespace locind::testing;

StudySpec Parse(const std::string& text) {
  StudyOrErrors read = ParseStudyText(text, "m.yaml");
  if (auto* e = std::get_if<std::vector<Error>>(&read)) FAIL(e->front().ToString());
  return std::get<StudySpec>(read);
}

TEST_CASE("locind run writes truths/<label>.model.yaml that reads back to the simulated model and runs in locind simulate") {
  Scratch s("locind_truth_models_test_files");
  const std::string study = s.Write("tiny.yaml", kTinyStudy);
  std::string text;
  REQUIRE(Run({study, "--out", s.Path("out")}, &text) == kExitOk);
  const StudySpec spec = Parse(kTinyStudy);
  const std::vector<Cell> cells = ExpandGrid(spec);
  const StudyTruths truths(spec, cells);
  for (int t = 0; t < 2; ++t) {
    const std::string file = s.Path("out/truths/t" + std::to_string(t + 1) + ".model.yaml");
    ModelOrError read = ReadModelFile(file);
    if (auto* e = std::get_if<Error>(&read)) FAIL(e->ToString());
    const EventModelSpec& back = std::get<EventModelSpec>(std::get<ModelSpec>(read));
    const Result<BuiltHawkes> built = BuildHawkes(spec, truths.Get(-1, t), cells.front());
    REQUIRE(built.ok());
    CHECK(back.model.truth.graph == built->model.truth.graph);
    CHECK(back.model.truth.hidden == built->model.truth.hidden);
    CHECK(back.model.baseline == built->model.baseline);
    REQUIRE(back.model.kernels.size() == built->model.kernels.size());
    for (size_t k = 0; k < back.model.kernels.size(); ++k) {
      CHECK(back.model.kernels[k].from == built->model.kernels[k].from);
      CHECK(back.model.kernels[k].to == built->model.kernels[k].to);
      CHECK(back.model.kernels[k].kernel.terms[0].weight == built->model.kernels[k].kernel.terms[0].weight);
      CHECK(back.model.kernels[k].kernel.terms[0].decay == built->model.kernels[k].kernel.terms[0].decay);
    }
    CHECK(back.run.burn_in == 20);
    std::ostringstream out, err;
    CHECK(RunSimulateCommand({file, "--horizon", "50", "--seed", "3", "--out", s.Path("t.csv")}, out, err) == kExitOk);
    CHECK(out.str().find(" events)") != std::string::npos);
  }
  const std::string json = ReadAll(s.dir / "out" / "study.json");
  CHECK(json.find("\"truth_models\": [") != std::string::npos);
  CHECK(json.find("\"model_file\": \"truths/t1.model.yaml\"") != std::string::npos);
  CHECK(json.find("\"rescale_warnings\": []") != std::string::npos);
}

// Two nodes a -> b, loop on a, weights fixed at 0.3: the spectral radius of
// K is 0.3 (triangular K; its eigenvalues are its diagonal).
const char kChain[] =
    "name: chain\nseed: 2\ntruth: {nodes: [a, b], edges: [a -> b, a -> a]}\n"
    "process: {events: {baseline: 0.2, weight: 0.3, decay: 2, burn_in: 5}}\n"
    "grid: {lengths: [30], replicates: 1, spectral_radius: [0.2, 0.6]}\n"
    "learners: [{method: pairwise, test: oracle}]\n";

TEST_CASE("a stationarity factor gives one model per target with drawn and simulated radius and range warnings") {
  const StudySpec spec = Parse(kChain);
  const std::vector<Cell> cells = ExpandGrid(spec);
  const StudyTruths truths(spec, cells);
  const std::vector<TruthModel> models = TruthModels(spec, cells, truths);
  REQUIRE(models.size() == 2);
  CHECK(models[0].label == "t1-target0.2");
  CHECK(models[0].drawn_value == doctest::Approx(0.3));
  CHECK(models[0].simulated_value == 0.2);  // scaled down to the target
  CHECK(models[0].scale == doctest::Approx(2.0 / 3));
  CHECK(models[1].label == "t1-target0.6");
  CHECK(models[1].simulated_value == doctest::Approx(0.3));  // rescale: down keeps a stable draw
  CHECK(models[1].scale == 1);
  const std::vector<std::string> warnings = RescaleWarnings(models);
  REQUIRE(warnings.size() == 1);
  // 0.2 / 0.3 to four significant digits.
  CHECK(warnings[0] == "truth t1-target0.2: rescaling by 0.6667 (to 0.2) left the configured ranges: 1 of 1 "
                       "weights outside [0.3, 0.3] (now 0.2 to 0.2); 1 of 1 loop weights outside [0.3, 0.3] "
                       "(now 0.2 to 0.2)");

  Scratch s("locind_truth_models_test_warn");
  std::string both = kChain;
  both.replace(both.find("burn_in: 5"), 10, "burn_in: 5, rescale: both");
  std::string text;
  REQUIRE(Run({s.Write("chain.yaml", both), "--out", s.Path("out")}, &text) == kExitOk);
  // Both targets move the weights off 0.3: two warnings on stderr before the run, and in study.json.
  CHECK(text.find("locind run: warning: truth t1-target0.2: rescaling by") != std::string::npos);
  CHECK(text.find("locind run: warning: truth t1-target0.6: rescaling by 2 (to 0.6) left the configured ranges: "
                  "1 of 1 weights outside [0.3, 0.3] (now 0.6 to 0.6)") != std::string::npos);
  CHECK(fs::exists(s.dir / "out" / "truths" / "t1-target0.6.model.yaml"));
  const std::string json = ReadAll(s.dir / "out" / "study.json");
  // Exact doubles in study.json: the drawn radius is 0.3 up to the eigenvalue solver's rounding.
  CHECK(json.find("\"stationarity_drawn\": 0.") != std::string::npos);
  CHECK(json.find("\"stationarity_simulated\": 0.6, \"scale\": 2") != std::string::npos);
  CHECK(json.find("\"rescale_warnings\": [\"truth t1-target0.2") != std::string::npos);
  // replicates.csv: stationarity_value is the simulated radius.
  const std::string rows = ReadAll(s.dir / "out" / "replicates.csv");
  CHECK(rows.find(",0.6,0.6,pairwise/oracle,") != std::string::npos);
}

}  // namespace
}  // namespace locind::app
