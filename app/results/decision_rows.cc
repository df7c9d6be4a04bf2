#include "app/results/decision_rows.h"

#include <algorithm>
#include <map>
#include <sstream>

#include "app/io/graph_json.h"
#include "app/results/results_rows.h"
#include "graph/edge.h"

namespace locind::app {
namespace {

using learners::EdgeDecision;
using learners::TestRecord;
using learners::TestStatus;

std::string Joined(const std::vector<int>& nodes, const std::vector<std::string>& names,
                   const char* separator) {
  std::string out;
  for (size_t i = 0; i < nodes.size(); ++i) out += (i ? separator : "") + names[nodes[i]];
  return out;
}

bool Estimable(const TestRecord& t) { return t.status == TestStatus::kOk; }

// The first witness's own columns: target, sources, given, statistic,
// p-value, status, decision, origin.
std::string FirstWitnessFields(const TestRecord* t, const std::vector<std::string>& names) {
  if (t == nullptr) return ",,,,,,,";
  std::ostringstream o;
  o << names[t->target] << "," << Joined(t->sources, names, ";") << ","
    << Joined(t->given, names, ";") << "," << (Estimable(*t) ? Num(t->statistic) : "") << ","
    << (Estimable(*t) ? Num(t->p_value) : "") << ","
    << (Estimable(*t) ? "ok" : "not estimable: " + CleanText(t->reason)) << ","
    << (Estimable(*t) ? AnswerName(*t) : "") << "," << (t->implied ? "implied" : "test");
  return o.str();
}

std::string MoreWitnesses(const EdgeDecision& d, const std::vector<std::string>& names) {
  std::string out;
  for (size_t i = 1; i < d.witnesses.size(); ++i) {
    if (i > 1) out += ' ';  // not (" " : "") + ...: a g++ 12 -Wrestrict false positive
    out += WitnessText(d.witnesses[i], names);
  }
  return out;
}

}  // namespace

const char* DecisionName(const EdgeDecision& d) {
  if (!d.kept) return "removed";
  return d.undecided ? "undecided" : "kept";
}

const char* AnswerName(const TestRecord& t) {
  if (!Estimable(t)) return "not estimable";
  return t.dependent ? "dependent" : "separated";
}

std::string WitnessText(const TestRecord& t, const std::vector<std::string>& names) {
  std::string p = t.implied ? "implied" : (Estimable(t) ? Num(t.p_value) : "");
  return CleanText(names[t.target] + "<-" + Joined(t.sources, names, "+") + "|" +
                   Joined(t.given, names, "+") + ":" + AnswerName(t) + ":" + p);
}

const std::string& EdgeDecisionColumns() {
  static const std::string columns =
      "decision,decision_phase,decision_rule,witness_target,witness_sources,witness_given,"
      "witness_statistic,witness_p_value,witness_status,witness_decision,witness_origin,"
      "more_witnesses";
  return columns;
}

std::string EdgeDecisionFields(const EdgeDecision* d, const std::vector<std::string>& names) {
  if (d == nullptr) return ",,," + FirstWitnessFields(nullptr, names) + ",";
  const TestRecord* first = d->witnesses.empty() ? nullptr : &d->witnesses[0];
  return std::string(DecisionName(*d)) + "," + d->phase + "," + CleanText(d->rule) + "," +
         FirstWitnessFields(first, names) + "," + MoreWitnesses(*d, names);
}

const std::string& EdgeAttributionColumns() {
  static const std::string columns = "error_cause,error_test";
  return columns;
}

std::string EdgeAttributionFields(const metrics::AttributedEdge* a,
                                  const std::vector<std::string>& names) {
  if (a == nullptr) return ",";
  return std::string(metrics::ErrorCauseName(a->cause)) + "," +
         (a->blamed ? WitnessText(*a->blamed, names) : "");
}

std::string DecisionsCsv(const learners::LearnResult& r) {
  const std::vector<std::string>& names = r.graph.names();
  std::ostringstream out;
  out << "edge,mark," << EdgeDecisionColumns() << "\n";
  for (const EdgeDecision& d : r.decisions) {
    out << graph::EdgeText(r.graph, d.edge) << "," << d.mark << "," << EdgeDecisionFields(&d, names)
        << "\n";
  }
  return out.str();
}

std::string DecisionsJson(const learners::LearnResult& r) {
  const std::vector<std::string>& names = r.graph.names();
  std::ostringstream out;
  out << "[";
  for (size_t i = 0; i < r.decisions.size(); ++i) {
    const EdgeDecision& d = r.decisions[i];
    out << (i ? ", " : "") << "{\"edge\": " << JsonString(graph::EdgeText(r.graph, d.edge))
        << ", \"decision\": " << JsonString(DecisionName(d))
        << ", \"mark\": " << JsonString(d.mark) << ", \"phase\": " << JsonString(d.phase)
        << ", \"rule\": " << JsonString(d.rule) << ", \"witnesses\": [";
    for (size_t k = 0; k < d.witnesses.size(); ++k) {
      out << (k ? ", " : "") << JsonString(WitnessText(d.witnesses[k], names));
    }
    out << "]}";
  }
  out << "]";
  return out.str();
}

std::string NotEstimableReasons(const std::vector<TestRecord>& records) {
  std::map<std::string, int> reasons;
  for (const TestRecord& t : records) {
    if (!Estimable(t)) ++reasons[t.reason.empty() ? "no reason given" : t.reason];
  }
  std::vector<std::pair<std::string, int>> sorted(reasons.begin(), reasons.end());
  std::stable_sort(sorted.begin(), sorted.end(),
                   [](const auto& x, const auto& y) { return x.second > y.second; });
  std::string out;
  for (size_t i = 0; i < sorted.size(); ++i) {
    out += (i ? ", " : "") + sorted[i].first + " (" + std::to_string(sorted[i].second) + ")";
  }
  return out;
}

std::string NotEstimableWarning(const std::vector<TestRecord>& log) {
  const auto count = std::count_if(log.begin(), log.end(), [](const TestRecord& t) { return !Estimable(t); });
  if (count == 0) return "";
  return std::to_string(count) + " of " + std::to_string(log.size()) +
         " tests not estimable (neither separation nor dependence; their edges kept as undecided): " +
         NotEstimableReasons(log);
}

}  // namespace locind::app
