// Decision records as text: the columns edges.csv gives every audited edge
// and the rows of `locind learn --out DIR`'s decisions.csv (documented in
// results/README.md).
//
// A witness reads "TARGET<-SOURCES|GIVEN:ANSWER:P" (sources and given joined
// by '+', ANSWER "dependent", "separated" or "not estimable", P the p-value,
// "implied" when a graph of the method implied the answer and no test was
// made, empty when not estimable). Not-estimable tests have an empty p-value
// in every column: the in-memory p = 1 of such a result never reaches a file.
#pragma once

#include <string>
#include <vector>

#include "learners/methods/learner.h"
#include "metrics/error_attribution.h"

namespace locind::app {

// "kept", "undecided" (kept, a needed test not estimable) or "removed".
const char* DecisionName(const learners::EdgeDecision& d);

// "dependent", "separated" or "not estimable".
const char* AnswerName(const learners::TestRecord& t);

// One witness as "TARGET<-SOURCES|GIVEN:ANSWER:P" (see above).
std::string WitnessText(const learners::TestRecord& t, const std::vector<std::string>& names);

// The decision columns of edges.csv (their names: EdgeDecisionColumns()),
// without a leading or trailing comma; empty fields when `d` is null.
const std::string& EdgeDecisionColumns();
std::string EdgeDecisionFields(const learners::EdgeDecision* d,
                               const std::vector<std::string>& names);

// The attribution columns of edges.csv: error_cause, error_test; empty for
// an edge that is neither a missed solid edge nor a false edge.
const std::string& EdgeAttributionColumns();
std::string EdgeAttributionFields(const metrics::AttributedEdge* a,
                                  const std::vector<std::string>& names);

// decisions.csv of `locind learn --out`: header line and one row per record.
std::string DecisionsCsv(const learners::LearnResult& r);

// The decisions as a JSON array (for `locind learn --json`).
std::string DecisionsJson(const learners::LearnResult& r);

// Tests that could not be computed: "N of M tests not estimable: REASON (k),
// ..." (distinct reasons, most frequent first); empty when there are none.
std::string NotEstimableWarning(const std::vector<learners::TestRecord>& log);
// The distinct reasons of the records that could not be computed, "REASON
// (k), ..." most frequent first; empty when there are none.
std::string NotEstimableReasons(const std::vector<learners::TestRecord>& records);

}  // namespace locind::app
