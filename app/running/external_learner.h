// ExternalLearner: a study's own program as a learning method
// (docs/external_learners.md is the protocol the program sees).
//
// Per replicate the learner makes a fresh folder, writes the data there
// (events.csv or paths.csv, the formats of configs/models/README.md) and
// task.json (observed processes, data kind, window, level, a seed from the
// replicate's stream), runs the program (no shell; its folder as working
// directory and as last argument; its time limit) and reads back graph.json
// (any graph file app/io/graph_file.h reads, over the observed processes)
// and, when the program wrote one, its test log tests.csv (one test per line;
// the tests then count like a built-in method's and their p-values go to
// null_tests.csv).
// With the oracle, each line the program writes on standard output is a
// question "b;A;C" answered "separated" or "connected" from the test it is
// given (the truth's latent projection) and logged as a test.
//
// Every failure of the program (cannot start, non-zero exit, signal, time
// limit, missing or malformed graph or test log, unknown or missing node) is a failed
// Result whose message gives the reason, the folder (kept for a rerun by
// hand) and the tail of standard error. The folder is removed on success.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "app/study/study_spec.h"
#include "learners/methods/learner.h"

namespace locind::app {

struct ExternalTask {
  std::vector<std::string> names;  // observed processes, in the scoring order
  uint64_t seed = 0;               // for the program's own randomness
  std::string folder_hint;         // part of the folder name (cell, replicate, learner)
};

class ExternalLearner : public learners::Learner {
 public:
  ExternalLearner(LearnerSpec spec, ExternalTask task);
  // Uses input.test for oracle questions (spec.test == "oracle"), else the
  // data (input.events or input.paths).
  Result<learners::LearnResult> Learn(const learners::LearnInput& input) override;

 private:
  LearnerSpec spec_;
  ExternalTask task_;
};

// The answer to one oracle line "b;A;C" (names; A, C comma-separated, C may
// be empty): "separated" or "connected", or "error: ..." for a line that is
// no question (then `record` is left alone and false is returned).
bool AnswerQuestion(const std::string& line, const std::vector<std::string>& names,
                    learners::IndependenceTest& test, double level, learners::TestRecord& record,
                    std::string& reply);

}  // namespace locind::app
