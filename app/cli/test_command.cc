// locind test: one local-independence test on a data file.
//
//   test DATA.csv --target B --source A1,A2 [--given C1,C2] [--kind events|paths]
//        [--test NAME] [--rates R1,R2,...] [--json]
//
// Asks "is B locally independent of A1, A2 given C1, C2?" (include B in
// --given to condition on its own past, the usual question). The data kind
// is read from the header ("time,process" for events) unless --kind is
// given. Tests: hawkes-lr (default for events; chi-bar-squared reference),
// hawkes-lr-chibar (alias), hawkes-lr-chisq, hawkes-lr-signed,
// event-local-covariance, event-local-covariance-end,
// event-local-covariance-batch; drift-exact-lr-history (default for
// paths), drift-exact-lr, drift-f, drift-robust-wald. --rates sets the
// exponential rate grid (events) or the filter rates (paths; refused with
// drift-exact-lr, which has none). Process ids follow app/io/process_id.h
// (numeric ids included).
// Prints the query in words (b, A and C by name, and whether b's own past is
// in C), then target, sources, given, test, statistic, df, p_value and
// status (with the reason when not estimable), one "key: value" per line, or
// one JSON object with --json (the words under "query", the own-past flag
// under "target_past_given"). When --given leaves out the target, a warning
// goes to standard error: the test then models b without its own history,
// which is almost never the intended question.
#include <algorithm>
#include <boost/program_options.hpp>
#include <fstream>
#include <memory>
#include <sstream>

#include "app/cli/command.h"
#include "base/number_format.h"
#include "app/cli/command_guard.h"
#include "app/cli/options.h"
#include "app/io/data_kind.h"
#include "app/study/test_choice.h"
#include "app/io/event_csv.h"
#include "app/io/graph_json.h"
#include "app/io/path_csv.h"
#include "app/io/trial_folder.h"
#include "learners/independence/drift_test.h"
#include "learners/independence/hawkes_features.h"
#include "learners/independence/hawkes_lr_test.h"

namespace locind::app {
namespace {

namespace po = boost::program_options;

struct TestOptions {
  std::string data;
  std::string target;
  std::string sources;
  std::string given;
  std::string kind;  // events, paths or empty (from the header)
  std::string test;  // empty: the default for the kind
  std::string rates;
  bool json = false;
};

TestOptions ParseOptions(const std::vector<std::string>& args) {
  TestOptions o;
  po::options_description d("locind test DATA.csv --target B --source A1,A2 [--given C1,C2]");
  d.add_options()("target", po::value(&o.target)->required(), "the process b")(
      "source", po::value(&o.sources)->required(), "the processes A, comma-separated")(
      "given", po::value(&o.given), "the processes C, comma-separated (include B for its own past)")(
      "kind", po::value(&o.kind), "events or paths (default: from the header)")(
      "test", po::value(&o.test), "test name")("rates", po::value(&o.rates), "rates, comma-separated")(
      "json", "print JSON");
  const po::variables_map vm = ParseCommandLine(args, d, {{"data", "DATA.csv (the data file)"}});
  o.data = vm["data"].as<std::string>();
  o.json = vm.count("json") > 0;
  if (!o.kind.empty() && o.kind != "events" && o.kind != "paths") {
    throw UsageError{"--kind must be events or paths"};
  }
  return o;
}

std::vector<double> ParseRates(const TestOptions& o) {
  std::vector<double> rates;
  for (const std::string& item : SplitList(o.rates)) {
    double r = 0;
    if (!csv::ParseNumber(item, r) || !(r > 0)) {
      throw Error{o.data, 0, 0, "--rates", "'" + item + "' is not a positive number"};
    }
    rates.push_back(r);
  }
  return rates;
}

std::unique_ptr<learners::IndependenceTest> EventTest(const TestOptions& o, std::ostream& err) {
  sim::EventData data = LoadEventTrials(o.data, "locind test", err);
  std::vector<double> rates = ParseRates(o);
  if (rates.empty()) rates = learners::DefaultHawkesRates(data);
  auto features = learners::HawkesFeatures::Create(std::move(data), rates);
  if (!features.ok()) throw Error{o.data, 0, 0, "", features.status().message()};
  std::unique_ptr<learners::IndependenceTest> test = MakeEventTest(
      o.test, std::make_shared<learners::HawkesFeatures>(std::move(features.value())), 1);
  if (!test) throw UsageError{"unknown test '" + o.test + "' for events (" + EventTestList() + ")"};
  return test;
}

std::unique_ptr<learners::IndependenceTest> PathTest(const TestOptions& o) {
  PathsOrError read = ReadPathTrials(o.data);
  if (auto* e = std::get_if<Errors>(&read)) throw *e;
  if (!IsPathTestName(o.test)) {
    throw UsageError{"unknown test '" + o.test + "' for paths (" + PathTestNames() + ")"};
  }
  auto made = MakePathTest(o.test, std::get<sim::PathData>(std::move(read)), ParseRates(o));
  if (!made.ok()) throw Error{o.data, 0, 0, "", made.status().message()};
  return std::move(made.value());
}

// Indices of the named processes, sorted and without repeats.
std::vector<int> Indices(const learners::IndependenceTest& test, const std::string& list,
                         const std::string& option, const std::string& path) {
  std::vector<int> out;
  const std::vector<std::string>& names = test.names();
  for (const std::string& name : SplitList(list)) {
    const auto it = std::find(names.begin(), names.end(), name);
    if (it == names.end()) throw Error{path, 0, 0, option, "unknown process '" + name + "'"};
    out.push_back(int(it - names.begin()));
  }
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return out;
}

learners::TestQuery MakeQuery(const learners::IndependenceTest& test, const TestOptions& o) {
  const std::vector<int> target = Indices(test, o.target, "--target", o.data);
  if (target.size() != 1) throw UsageError{"--target takes exactly one process"};
  learners::TestQuery q{target[0], Indices(test, o.sources, "--source", o.data),
                        Indices(test, o.given, "--given", o.data)};
  if (q.sources.empty()) throw UsageError{"--source needs at least one process"};
  for (int a : q.sources) {
    if (a == q.target) throw UsageError{"the target may not be a source (put it in --given)"};
    if (std::binary_search(q.given.begin(), q.given.end(), a)) {
      throw UsageError{"a --source process may not also be in --given"};
    }
  }
  return q;
}

std::string NameList(const std::vector<int>& nodes, const std::vector<std::string>& names,
                     bool json) {
  std::string out = json ? "[" : "";
  for (size_t i = 0; i < nodes.size(); ++i) {
    out += (i ? "," : "") + (json ? JsonString(names[nodes[i]]) : names[nodes[i]]);
  }
  return json ? out + "]" : out;
}

bool TargetPastGiven(const learners::TestQuery& q) {
  return std::binary_search(q.given.begin(), q.given.end(), q.target);
}

// "target b, sources {a}, given {b, c} (the target's own past is included)".
std::string QueryText(const std::vector<std::string>& names, const learners::TestQuery& q) {
  const auto set = [&names](const std::vector<int>& nodes) {
    std::string out = "{";
    for (size_t i = 0; i < nodes.size(); ++i) out += (i ? ", " : "") + names[nodes[i]];
    return out + "}";
  };
  return "target " + names[q.target] + ", sources " + set(q.sources) + ", given " + set(q.given) +
         (TargetPastGiven(q) ? " (the target's own past is included)"
                             : " (the target's own past is NOT included)");
}

void WarnWithoutTargetPast(const std::vector<std::string>& names, const learners::TestQuery& q,
                           std::ostream& err) {
  if (TargetPastGiven(q)) return;
  const std::string& b = names[q.target];
  err << "locind test: warning: --given does not include the target " << b << ", so the test leaves out "
      << b << "'s own history (almost never intended; add " << b << " to --given)\n";
}

void Print(const learners::IndependenceTest& test, const learners::TestQuery& q,
           const learners::TestResult& r, bool json, std::ostream& out) {
  const std::vector<std::string>& names = test.names();
  const bool ok = r.status == learners::TestStatus::kOk;
  // A result that could not be computed has no statistic, df or p-value
  // (the in-memory p = 1 is not evidence of independence): empty / null.
  auto number = [ok, json](double v) {
    return ok ? base::FormatNumber(v) : std::string(json ? "null" : "");
  };
  if (json) {
    out << "{\"query\": " << JsonString(QueryText(names, q))
        << ", \"target_past_given\": " << (TargetPastGiven(q) ? "true" : "false")
        << ", \"target\": " << JsonString(names[q.target])
        << ", \"sources\": " << NameList(q.sources, names, true)
        << ", \"given\": " << NameList(q.given, names, true) << ", \"test\": "
        << JsonString(test.kind()) << ", \"statistic\": " << number(r.statistic)
        << ", \"df\": " << number(r.df) << ", \"p_value\": " << number(r.p_value)
        << ", \"status\": " << (ok ? "\"ok\"" : "\"not estimable\"")
        << ", \"reason\": " << JsonString(r.reason) << "}\n";
    return;
  }
  out << "query: " << QueryText(names, q) << "\ntarget: " << names[q.target]
      << "\nsources: " << NameList(q.sources, names, false)
      << "\ngiven: " << NameList(q.given, names, false) << "\ntest: " << test.kind()
      << "\nstatistic: " << number(r.statistic) << "\ndf: " << number(r.df)
      << "\np_value: " << number(r.p_value)
      << "\nstatus: " << (ok ? "ok" : "not estimable: " + r.reason) << "\n";
}

int Test(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const TestOptions o = ParseOptions(args);
  const bool events = DecideDataKind(o.data, o.kind) == DataKind::kEvents;
  // drift-exact-lr has no filter rates: --rates would be silently ignored.
  if (!events && !o.rates.empty() && o.test == "drift-exact-lr") {
    throw UsageError{"--rates is not used by drift-exact-lr; leave it out"};
  }
  std::unique_ptr<learners::IndependenceTest> test = events ? EventTest(o, err) : PathTest(o);
  const learners::TestQuery query = MakeQuery(*test, o);
  WarnWithoutTargetPast(test->names(), query, err);
  const learners::TestResult result = test->Run(query);
  Print(*test, query, result, o.json, out);
  if (result.status != learners::TestStatus::kOk) {
    err << "locind test: warning: 1 of 1 tests not estimable (neither separation nor "
           "dependence): "
        << (result.reason.empty() ? "no reason given" : result.reason) << " (1)\n";
  }
  return kExitOk;
}

}  // namespace

// The usage, and what each test assumes (docs/tests.md has the details and
// the measured calibration).
const char kTestHelp[] =
    "usage: locind test DATA.csv --target B --source A1,A2 [--given C1,C2] [--test NAME]\n"
    "                   [--kind events|paths] [--rates R1,R2] [--json]\n"
    "  asks whether B is locally independent of A given C; put B in --given to\n"
    "  condition on its own past (the usual question; a warning says when it is left out)\n"
    "  DATA.csv: an event file (header time,process) or a path file (header time,<process ids>),\n"
    "  told apart by the header unless --kind events|paths says; any token without spaces,\n"
    "  commas, semicolons, quotes or backslashes is a process id, numeric ids included;\n"
    "  a folder of such files is one data set of several trials (pooled, no history\n"
    "  crosses from one trial into the next); without a '# window:' line the window\n"
    "  runs from the first to the last event (a note says so)\n"
    "  --rates R1,R2: exponential rates (events) or filter rates (drift-exact-lr-history,\n"
    "                drift-f, drift-robust-wald)\n"
    "tests and what they assume:\n"
    "  events:\n"
    "    hawkes-lr (default)   B's intensity is a linear Hawkes intensity of the histories of\n"
    "                          A and C (exponential kernels at --rates); chi-bar-squared reference\n"
    "    hawkes-lr-chisq       the same statistic against plain chi-squared (conservative)\n"
    "    hawkes-lr-signed      softplus link, inhibition allowed; chi-squared reference\n"
    "    event-local-covariance  no parametric model: cross-fitted local covariance of B's\n"
    "                          residual with A's part predictable from C; sup-|Brownian motion|\n"
    "    event-local-covariance-end  the same, end-point chi-squared statistic\n"
    "    event-local-covariance-batch  the same supremum, scaled by the larger of the\n"
    "                          optional variation and a centred batch-means variance\n"
    "  paths:\n"
    "    drift-exact-lr-history (default)  A, C and B evolve as one linear SDE with\n"
    "                          independent noise, B's drift also taking filtered histories of C\n"
    "                          (hidden processes acting through C's past); likelihood ratio on\n"
    "                          the exact Gaussian transition, chi-squared\n"
    "    drift-exact-lr        the same without the histories of C\n"
    "    drift-f               increments regressed on levels and filtered histories; F test\n"
    "    drift-robust-wald     the same regression, heteroskedasticity-robust Wald test\n"
    "  Every test holds its level only when its model can describe B given C: with a\n"
    "  parent of B hidden or left out of C, parametric tests reject true nulls more\n"
    "  often as the window grows. Details and measured rejection rates: docs/tests.md.\n";

int RunTestCommand(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  if (WantsHelp(args)) {
    out << kTestHelp;
    return kExitOk;
  }
  return GuardCommand("test", err, [&] {
    return Test(args, out, err);
  });
}

}  // namespace locind::app
