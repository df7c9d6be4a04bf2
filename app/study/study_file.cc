#include "app/study/study_file.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <map>
#include <set>
#include <sstream>

#include <Eigen/Dense>
#include <yaml-cpp/yaml.h>

#include "app/io/graph_file.h"
#include "app/study/test_choice.h"
#include "learners/methods/learner_registry.h"
#include "sim/stability.h"

namespace locind::app {
namespace {

using Keys = std::set<std::string>;

std::string Join(const std::string& section, const std::string& key) {
  return section.empty() ? key : section + "." + key;
}

std::string List(const Keys& keys) {
  std::string out;
  for (const std::string& k : keys) out += (out.empty() ? "" : ", ") + k;
  return out;
}

// Collects every problem instead of stopping at the first one. Each reader
// returns a usable fallback after reporting, so later sections are still
// checked.
class StudyParser {
 public:
  explicit StudyParser(const std::string& file) : file_(file) {}

  StudySpec Parse(const YAML::Node& root) {
    StudySpec s;
    s.file = file_;
    s.name = std::filesystem::path(file_).stem().string();
    if (!root.IsMap()) {
      Fail(root, "study", "expected a mapping with truth, process, grid and learners");
      return s;
    }
    CheckKeys(root, "",
              {"name", "description", "seed", "truth", "process", "grid", "learners", "plan",
               "memory_mb"});
    if (root["name"]) s.name = Name(root["name"], "name");
    if (root["description"] && !root["description"].IsScalar()) {
      Fail(root["description"], "description", "expected text");
    }
    if (root["seed"]) s.seed = Seed(root["seed"]);
    if (Require(root, "truth", "")) s.truth = ParseTruth(root["truth"]);
    if (Require(root, "process", "")) ParseProcess(root["process"], s);
    if (Require(root, "grid", "")) s.grid = ParseGrid(root["grid"], s);
    if (Require(root, "learners", "")) s.learners = ParseLearners(root["learners"], s.events);
    if (root["plan"]) s.plan = ParsePlan(root["plan"]);
    s.memory_mb = Whole(root, "memory_mb", "", static_cast<int>(s.memory_mb), 16, 16'777'216);
    CrossChecks(root, s);
    return s;
  }

  std::vector<Error> errors() const { return errors_; }

 private:
  void Fail(const YAML::Node& node, const std::string& field, const std::string& message) {
    errors_.push_back(ErrorAt(file_, node, field, message));
  }

  bool Require(const YAML::Node& map, const char* key, const std::string& section) {
    if (map[key]) return true;
    Fail(map, Join(section, key), "missing");
    return false;
  }

  bool CheckKeys(const YAML::Node& map, const std::string& section, const Keys& allowed) {
    if (!map.IsMap()) {
      Fail(map, section, "expected a mapping");
      return false;
    }
    Keys seen;
    for (const auto& kv : map) {
      const std::string key = kv.first.Scalar();
      if (!allowed.count(key)) {
        Fail(kv.first, Join(section, key), "unknown key (expected one of: " + List(allowed) + ")");
      } else if (!seen.insert(key).second) {
        Fail(kv.first, Join(section, key), "given twice");
      }
    }
    return true;
  }

  std::string Name(const YAML::Node& node, const std::string& field) {
    if (!node.IsScalar() || !IsValidNodeName(node.Scalar())) {
      Fail(node, field, "expected a name (a letter or '_', then letters, digits, '_' or '.')");
      return "study";
    }
    return node.Scalar();
  }

  uint64_t Seed(const YAML::Node& node) {
    uint64_t v = 0;
    if (!node.IsScalar() || !YAML::convert<uint64_t>::decode(node, v)) {
      Fail(node, "seed", "expected a whole number >= 0");
      return 1;
    }
    return v;
  }

  std::optional<double> Number(const YAML::Node& node, const std::string& field) {
    double v = 0;
    if (!node.IsScalar() || !YAML::convert<double>::decode(node, v) || !std::isfinite(v)) {
      Fail(node, field, "expected a finite number");
      return std::nullopt;
    }
    return v;
  }

  // A number checked against (low, high) bounds; `open` excludes the bounds.
  double Bounded(const YAML::Node& map, const char* key, const std::string& section,
                 double fallback, double low, double high, bool open_low, bool open_high) {
    if (!map[key]) return fallback;
    const std::string field = Join(section, key);
    const std::optional<double> v = Number(map[key], field);
    if (!v) return fallback;
    const bool below = open_low ? *v <= low : *v < low;
    const bool above = open_high ? *v >= high : *v > high;
    if (below || above) {
      Fail(map[key], field, "must lie in " + std::string(open_low ? "(" : "[") + Text(low) + ", " +
                                 Text(high) + (open_high ? ")" : "]"));
      return fallback;
    }
    return *v;
  }

  static std::string Text(double v) {
    if (std::isinf(v)) return v > 0 ? "inf" : "-inf";
    std::ostringstream s;
    s << v;
    return s.str();
  }

  int Whole(const YAML::Node& map, const char* key, const std::string& section, int fallback,
            int low, int high) {
    if (!map[key]) return fallback;
    const std::string field = Join(section, key);
    int v = 0;
    if (!map[key].IsScalar() || !YAML::convert<int>::decode(map[key], v) || v < low || v > high) {
      Fail(map[key], field,
            "expected a whole number from " + std::to_string(low) + " to " + std::to_string(high));
      return fallback;
    }
    return v;
  }

  std::string Word(const YAML::Node& map, const char* key, const std::string& section,
                   const std::vector<std::string>& choices) {
    if (!map[key]) return choices.front();
    const YAML::Node node = map[key];
    if (node.IsScalar() && std::find(choices.begin(), choices.end(), node.Scalar()) != choices.end()) {
      return node.Scalar();
    }
    Keys set(choices.begin(), choices.end());
    Fail(node, Join(section, key), "expected one of: " + List(set));
    return choices.front();
  }

  // A number, or [low, high] drawn per truth. Values must lie in [min, max].
  ValueRange Range(const YAML::Node& map, const char* key, const std::string& section,
                   ValueRange fallback, double min, double max, bool positive) {
    if (!map[key]) return fallback;
    const YAML::Node node = map[key];
    const std::string field = Join(section, key);
    ValueRange r;
    if (node.IsScalar()) {
      const auto v = Number(node, field);
      if (!v) return fallback;
      r = {*v, *v};
    } else if (node.IsSequence() && node.size() == 2) {
      const auto lo = Number(node[0], field);
      const auto hi = Number(node[1], field);
      if (!lo || !hi) return fallback;
      if (*lo > *hi) {
        Fail(node, field, "a range [low, high] needs low <= high");
        return fallback;
      }
      r = {*lo, *hi};
    } else {
      Fail(node, field, "expected a number or a range [low, high]");
      return fallback;
    }
    if (r.low < min || r.high > max || (positive && r.low <= 0)) {
      Fail(node, field, positive ? "must be > 0" : "must lie in [" + Text(min) + ", " + Text(max) + "]");
      return fallback;
    }
    return r;
  }

  // ---- truth ----

  TruthSpec ParseTruth(const YAML::Node& t) {
    TruthSpec spec;
    if (!CheckKeys(t, "truth", {"nodes", "edges", "hidden", "random", "truths"})) return spec;
    spec.truths = Whole(t, "truths", "truth", 1, 1, 100000);
    const bool has_graph = t["nodes"] || t["edges"] || t["hidden"];
    if (has_graph && t["random"]) {
      Fail(t["random"], "truth.random", "give either an explicit graph (nodes, edges, hidden) or random, not both");
      return spec;
    }
    if (t["random"]) {
      spec.random = true;
      spec.random_graph = ParseRandom(t["random"]);
      return spec;
    }
    GraphOrError g = ParseGraphKeys(t, file_);
    if (auto* e = std::get_if<Error>(&g)) {
      e->field = Join("truth", e->field);
      errors_.push_back(*e);
    } else {
      spec.explicit_graph = std::get<graph::TruthGraph>(std::move(g));
      if (spec.explicit_graph.graph.BidirectedEdgeCount() > 0) {
        Fail(t["edges"], "truth.edges", "a process truth has directed edges only (hidden nodes make the bidirected ones)");
      }
    }
    return spec;
  }

  graph::RandomGraphOptions ParseRandom(const YAML::Node& r) {
    const std::string s = "truth.random";
    graph::RandomGraphOptions o;
    if (!CheckKeys(r, s, {"nodes", "edge_probability", "in_degree", "loops", "loop_probability", "hidden"})) {
      return o;
    }
    if (Require(r, "nodes", s)) o.nodes = Whole(r, "nodes", s, 5, 1, 64);
    if (r["edge_probability"] && r["in_degree"]) {
      Fail(r["in_degree"], Join(s, "in_degree"), "give edge_probability or in_degree, not both");
    }
    o.edge_probability = Bounded(r, "edge_probability", s, 0.3, 0, 1, false, false);
    if (r["in_degree"]) {
      o.expected_in_degree = Bounded(r, "in_degree", s, 1, 0, std::max(0, o.nodes - 1), false, false);
    }
    const std::string loops = Word(r, "loops", s, {"random", "all", "none"});
    o.loops = loops == "all" ? graph::LoopPolicy::kAll
              : loops == "none" ? graph::LoopPolicy::kNone : graph::LoopPolicy::kRandom;
    o.loop_probability = Bounded(r, "loop_probability", s, 0.5, 0, 1, false, false);
    if (const YAML::Node h = r["hidden"]) {
      random_hidden_ = h;
      if (h.IsSequence()) {
        std::set<int> seen;
        for (const YAML::Node& item : h) {
          int v = 0;
          if (!item.IsScalar() || !YAML::convert<int>::decode(item, v) || v < 1 || v > o.nodes) {
            Fail(item, Join(s, "hidden"), "expected node positions from 1 to " + std::to_string(o.nodes));
          } else if (!seen.insert(v - 1).second) {
            Fail(item, Join(s, "hidden"), "position listed twice");
          }
        }
        o.hidden_list.assign(seen.begin(), seen.end());
      } else {
        o.hidden_count = Whole(r, "hidden", s, 0, 0, std::max(0, o.nodes - 1));
      }
    }
    if (static_cast<int>(o.hidden_list.size()) >= o.nodes && o.nodes > 0) {
      Fail(NodeOr(r, "hidden"), Join(s, "hidden"), "at least one node must be observed");
    }
    return o;
  }

  static YAML::Node NodeOr(const YAML::Node& map, const char* key) { return map[key] ? map[key] : map; }

  // ---- process ----

  void ParseProcess(const YAML::Node& p, StudySpec& s) {
    if (!CheckKeys(p, "process", {"events", "paths"})) return;
    if (p["events"] && p["paths"]) {
      Fail(p["paths"], "process.paths", "a study simulates either events or paths, not both");
      return;
    }
    if (p["paths"]) {
      s.events = false;
      s.path_process = ParsePaths(p["paths"]);
    } else if (p["events"]) {
      s.event_process = ParseEvents(p["events"]);
    } else {
      Fail(p, "process", "expected an 'events' or a 'paths' section");
    }
  }

  EventProcessSpec ParseEvents(const YAML::Node& e) {
    const std::string s = "process.events";
    EventProcessSpec o;
    if (!CheckKeys(e, s, {"baseline", "weight", "loop_weight", "decay", "spectral_radius", "rescale", "burn_in",
                          "event_cap"})) {
      return o;
    }
    constexpr double kInf = std::numeric_limits<double>::infinity();
    o.baseline = Range(e, "baseline", s, o.baseline, 0, kInf, true);
    o.weight = Range(e, "weight", s, o.weight, 0, kInf, false);
    o.loop_weight = Range(e, "loop_weight", s, o.weight, 0, kInf, false);
    o.decay = Range(e, "decay", s, o.decay, 0, kInf, true);
    if (e["spectral_radius"]) o.spectral_radius = Bounded(e, "spectral_radius", s, 0.5, 0, 1, true, true);
    o.rescale_both = Word(e, "rescale", s, {"down", "both"}) == "both";
    o.burn_in = Bounded(e, "burn_in", s, o.burn_in, 0, kInf, false, true);
    o.event_cap = Whole(e, "event_cap", s, static_cast<int>(o.event_cap), 1, 2'000'000'000);
    return o;
  }

  PathProcessSpec ParsePaths(const YAML::Node& p) {
    const std::string s = "process.paths";
    PathProcessSpec o;
    if (!CheckKeys(p, s, {"drift", "self_rate", "coupling", "noise", "step", "interval", "burn_in",
                          "method", "drift_bound", "rescale"})) {
      return o;
    }
    constexpr double kInf = std::numeric_limits<double>::infinity();
    o.tanh = Word(p, "drift", s, {"linear", "tanh"}) == "tanh";
    o.self_rate = Range(p, "self_rate", s, o.self_rate, 0, kInf, true);
    o.coupling = Range(p, "coupling", s, o.coupling, -kInf, kInf, false);
    o.noise = Bounded(p, "noise", s, o.noise, 0, kInf, true, true);
    o.step = Bounded(p, "step", s, o.step, 0, kInf, true, true);
    o.interval = Bounded(p, "interval", s, o.interval, 0, kInf, true, true);
    o.burn_in = Bounded(p, "burn_in", s, o.burn_in, 0, kInf, false, true);
    o.exact = Word(p, "method", s, {"euler", "exact"}) == "exact";
    if (p["drift_bound"]) o.drift_bound = Bounded(p, "drift_bound", s, -0.5, -kInf, 0, true, true);
    o.rescale_both = Word(p, "rescale", s, {"down", "both"}) == "both";
    const double ratio = o.interval / o.step;
    if (std::abs(ratio - std::round(ratio)) > 1e-9 * ratio || std::round(ratio) < 1) {
      Fail(NodeOr(p, "interval"), Join(s, "interval"), "must be a multiple of the step");
    }
    if (o.tanh && o.exact) Fail(p["method"], Join(s, "method"), "the exact transition needs the linear drift");
    if (o.tanh && o.drift_bound) {
      Fail(p["drift_bound"], Join(s, "drift_bound"), "drift_bound rescales a linear drift only");
    }
    return o;
  }

  // ---- grid ----

  template <typename T>
  std::vector<T> NumberList(const YAML::Node& map, const char* key, const std::string& section,
                            double low, double high, bool open_low, bool open_high, bool whole) {
    std::vector<T> out;
    const YAML::Node node = map[key];
    const std::string field = Join(section, key);
    if (!node.IsSequence() && !node.IsScalar()) {
      Fail(node, field, "expected a number or a list of numbers");
      return out;
    }
    std::vector<YAML::Node> items;
    if (node.IsScalar()) {
      items.push_back(node);
    } else {
      for (const YAML::Node& item : node) items.push_back(item);
    }
    if (items.empty()) Fail(node, field, "expected at least one value");
    for (const YAML::Node& item : items) {
      const auto v = Number(item, field);
      if (!v) continue;
      const bool bad = (open_low ? *v <= low : *v < low) || (open_high ? *v >= high : *v > high) ||
                       (whole && *v != std::floor(*v));
      if (bad) {
        Fail(item, field, std::string(whole ? "expected whole numbers" : "expected numbers") + " in " +
                               (open_low ? "(" : "[") + Text(low) + ", " + Text(high) + (open_high ? ")" : "]"));
        continue;
      }
      if (std::find(out.begin(), out.end(), static_cast<T>(*v)) != out.end()) {
        Fail(item, field, "value listed twice");
        continue;
      }
      out.push_back(static_cast<T>(*v));
    }
    return out;
  }

  GridSpec ParseGrid(const YAML::Node& g, const StudySpec& study) {
    const std::string s = "grid";
    GridSpec o;
    if (!CheckKeys(g, s, {"lengths", "replicates", "levels", "hidden", "hidden_mode", "spectral_radius",
                          "drift_bound", "trials"})) {
      return o;
    }
    constexpr double kInf = std::numeric_limits<double>::infinity();
    if (Require(g, "lengths", s)) o.lengths = NumberList<double>(g, "lengths", s, 0, kInf, true, true, false);
    o.replicates = Whole(g, "replicates", s, o.replicates, 1, 1'000'000);
    if (g["levels"]) o.levels = NumberList<double>(g, "levels", s, 0, 1, true, true, false);
    if (g["hidden"]) {
      if (!study.truth.random) {
        Fail(g["hidden"], "grid.hidden", "a hidden-count factor needs a random truth");
      } else {
        ParseHiddenFactor(g, study, o);
      }
    }
    if (g["hidden_mode"] && !g["hidden"]) {
      Fail(g["hidden_mode"], "grid.hidden_mode", "applies to a hidden-count factor (grid.hidden)");
    }
    if (g["spectral_radius"]) {
      if (!study.events) Fail(g["spectral_radius"], "grid.spectral_radius", "spectral_radius applies to events");
      else o.stationarity = NumberList<double>(g, "spectral_radius", s, 0, 1, true, true, false);
    }
    if (g["drift_bound"]) {
      if (study.events || study.path_process.tanh) {
        Fail(g["drift_bound"], "grid.drift_bound", "drift_bound applies to paths with the linear drift");
      } else {
        o.stationarity = NumberList<double>(g, "drift_bound", s, -kInf, 0, true, true, false);
      }
    }
    if (g["spectral_radius"] && g["drift_bound"]) {
      Fail(g["drift_bound"], "grid.drift_bound", "give spectral_radius or drift_bound, not both");
    }
    // Number of trials factor (whole numbers from 1).
    if (g["trials"]) o.trials = NumberList<int>(g, "trials", s, 1, 1'000'000, false, false, true);
    return o;
  }

  // ---- hidden-count factor ----

  // grid.hidden and grid.hidden_mode. truth.random.hidden would be silently
  // replaced by the factor, so giving both is an error naming both places.
  void ParseHiddenFactor(const YAML::Node& g, const StudySpec& study, GridSpec& o) {
    const std::string s = "grid";
    o.hidden_fixed_observed = Word(g, "hidden_mode", s, {"fresh-truth", "fixed-observed"}) == "fixed-observed";
    if (random_hidden_) {
      const Error other = ErrorAt(file_, *random_hidden_, "truth.random.hidden", "");
      Fail(g["hidden"], "grid.hidden",
            "the hidden-count factor replaces truth.random.hidden (given at " + other.file + ":" +
                std::to_string(other.line) + ":" + std::to_string(other.column) + "); give one of the two");
      return;
    }
    // fresh-truth: random.nodes counts every node, so at least one stays observed;
    // fixed-observed: random.nodes counts the observed ones, hidden ones come on top.
    const int most = o.hidden_fixed_observed ? 64 - study.truth.random_graph.nodes
                                             : study.truth.random_graph.nodes - 1;
    o.hidden_counts = NumberList<int>(g, "hidden", s, 0, std::max(0, most), false, false, true);
  }

  // ---- learners ----

  std::vector<LearnerSpec> ParseLearners(const YAML::Node& list, bool events) {
    std::vector<LearnerSpec> out;
    if (!list.IsSequence() || list.size() == 0) {
      Fail(list, "learners", "expected a list of learners ({method, test})");
      return out;
    }
    std::set<std::string> labels;
    for (size_t i = 0; i < list.size(); ++i) {
      const std::string s = "learners[" + std::to_string(i + 1) + "]";
      const YAML::Node l = list[i];
      if (l.IsMap() && l["program"]) {
        LearnerSpec spec = ParseExternal(l, s);
        if (!spec.label.empty() && !labels.insert(spec.label).second) {
          Fail(l, s, "learner '" + spec.label + "' listed twice (give one of them a name)");
        } else if (!spec.label.empty()) {
          out.push_back(spec);
        }
        continue;
      }
      if (!CheckKeys(l, s, {"method", "test", "name", "size", "penalty"})) continue;
      LearnerSpec spec;
      if (!Require(l, "method", s)) continue;
      const learners::MethodEntry* entry = l["method"].IsScalar() ? learners::FindMethod(l["method"].Scalar()) : nullptr;
      if (entry == nullptr) {
        Keys names;
        for (const auto& m : learners::LearningMethods()) names.insert(m.name);
        Fail(l["method"], Join(s, "method"), "unknown method (expected one of: " + List(names) + ")");
        continue;
      }
      spec.method = entry->name;
      spec.test = LearnerTest(l, s, *entry, events);
      spec.screening_size = Whole(l, "size", s, 1, 0, 62);
      if (l["size"] && spec.method != "screen") Fail(l["size"], Join(s, "size"), "only the screen method takes a size");
      if (l["penalty"]) {
        spec.penalty = Bounded(l, "penalty", s, 1, 0, std::numeric_limits<double>::infinity(), true, true);
        if (spec.method != "penalized-fit") Fail(l["penalty"], Join(s, "penalty"), "only penalized-fit takes a penalty");
      }
      spec.label = l["name"] ? Name(l["name"], Join(s, "name")) : spec.method + "/" + spec.test;
      if (!labels.insert(spec.label).second) {
        Fail(l, s, "learner '" + spec.label + "' listed twice (give one of them a name)");
        continue;
      }
      out.push_back(spec);
    }
    return out;
  }

  // ---- external learners (docs/external_learners.md) ----

  // {program: [argv...], name, time_limit, needs: data|oracle}. An element of
  // the program list that names an existing file relative to the study
  // file's folder is made absolute (the program runs in a folder of its own).
  LearnerSpec ParseExternal(const YAML::Node& l, const std::string& s) {
    LearnerSpec spec;
    if (!CheckKeys(l, s, {"program", "name", "time_limit", "needs"})) return spec;
    const YAML::Node program = l["program"];
    if (!program.IsSequence() || program.size() == 0) {
      Fail(program, Join(s, "program"), "expected a list: the program and its arguments");
      return spec;
    }
    const std::filesystem::path here = std::filesystem::path(file_).parent_path();
    for (const YAML::Node& arg : program) {
      if (!arg.IsScalar() || arg.Scalar().empty()) {
        Fail(arg, Join(s, "program"), "expected a word (the program or one argument)");
        return spec;
      }
      std::string word = arg.Scalar();
      const std::filesystem::path local = here / word;
      std::error_code ec;
      if (std::filesystem::path(word).is_relative() && std::filesystem::is_regular_file(local, ec)) {
        word = std::filesystem::absolute(local, ec).lexically_normal().string();
      }
      spec.program.push_back(word);
    }
    if (!Require(l, "name", s)) return LearnerSpec{};
    spec.label = Name(l["name"], Join(s, "name"));
    spec.method = "external";
    spec.test = Word(l, "needs", s, {"data", "oracle"}) == "oracle" ? "oracle" : "none";
    spec.time_limit = Bounded(l, "time_limit", s, 60, 0, 86400, true, false);
    return spec;
  }

  std::string LearnerTest(const YAML::Node& l, const std::string& s,
                          const learners::MethodEntry& entry, bool events) {
    if (!entry.uses_tests) {
      if (l["test"] && !(l["test"].IsScalar() && l["test"].Scalar() == "none")) {
        Fail(l["test"], Join(s, "test"), std::string(entry.name) + " reads the data itself and takes no test");
      }
      return "none";
    }
    std::vector<std::string> choices = events ? EventTests() : PathTests();
    choices.push_back("oracle");
    return Word(l, "test", s, choices);
  }

  PlanSpec ParsePlan(const YAML::Node& p) {
    PlanSpec o;
    if (!CheckKeys(p, "plan", {"start", "cap", "bisection_steps", "along"})) return o;
    constexpr double kInf = std::numeric_limits<double>::infinity();
    o.start = Bounded(p, "start", "plan", 0, 0, kInf, true, true);
    o.cap = Bounded(p, "cap", "plan", 0, 0, kInf, true, true);
    o.bisection_steps = Whole(p, "bisection_steps", "plan", o.bisection_steps, 0, 20);
    if (o.start > 0 && o.cap > 0 && o.cap < o.start) Fail(p["cap"], "plan.cap", "must be >= plan.start");
    if (p["along"]) o.along_trials = Word(p, "along", "plan", {"length", "trials"}) == "trials";
    return o;
  }

  // The fewest observed processes any cell's truths have.
  static int FewestObserved(const StudySpec& s) {
    if (!s.truth.random) {
      return s.truth.explicit_graph.graph.size() - static_cast<int>(s.truth.explicit_graph.hidden.size());
    }
    const graph::RandomGraphOptions& r = s.truth.random_graph;
    if (s.grid.hidden_fixed_observed) return r.nodes;
    int hidden = r.hidden_list.empty() ? r.hidden_count : static_cast<int>(r.hidden_list.size());
    if (!s.grid.hidden_counts.empty()) {
      hidden = *std::max_element(s.grid.hidden_counts.begin(), s.grid.hidden_counts.end());
    }
    return r.nodes - hidden;
  }

  // screen's size counts the processes of C besides the target b; with n
  // observed processes there are n - 1 others (all of them usable for a loop
  // b -> b, learners/methods/screening_learner.h), so a larger size asks for
  // sets that do not exist.
  void CheckScreenSizes(const YAML::Node& root, const StudySpec& s) {
    const int observed = FewestObserved(s);
    const YAML::Node list = root["learners"];
    for (size_t i = 0; i < s.learners.size() && list && list.IsSequence() && i < list.size(); ++i) {
      const LearnerSpec& l = s.learners[i];
      const int most = std::max(0, observed - 1);
      if (l.method != "screen" || !list[i]["size"] || l.screening_size <= most) continue;
      Fail(list[i]["size"], "learners[" + std::to_string(i + 1) + "].size",
           "size " + std::to_string(l.screening_size) + " is more than the truths' " +
               std::to_string(observed) + " observed processes allow (at most " + std::to_string(most) +
               ", the number of processes besides the target)");
    }
  }

  void CrossChecks(const YAML::Node& root, const StudySpec& s) {
    if (errors_.empty()) CheckStationaryAtUpperEnds(root, s);
    if (errors_.empty()) CheckScreenSizes(root, s);
    const YAML::Node truth = root["truth"];
    if (!truth || !truth.IsMap()) return;
    const int nodes = s.truth.random ? s.truth.random_graph.nodes : s.truth.explicit_graph.graph.size();
    if (nodes > 64) Fail(truth, "truth", "at most 64 nodes");
    if (!s.truth.random && truth["truths"] && s.truth.truths > 1 && AllFixed(s)) {
      Fail(truth["truths"], "truth.truths",
            "with an explicit graph and fixed parameters every truth would be the same; give ranges or truths: 1");
    }
    if (!s.events && s.truth.random && s.truth.random_graph.loops != graph::LoopPolicy::kAll) {
      Fail(NodeOr(truth["random"], "loops"), "truth.random.loops",
            "diffusion truths need a loop on every node (loops: all): the loop carries the mean reversion");
    }
  }

  // An explicit event truth without a rescaling target: with the largest
  // weights of the ranges the process must still be stationary. The spectral
  // radius of a non-negative matrix grows with its entries (Perron-Frobenius;
  // Horn & Johnson 2013, Matrix Analysis, Thm. 8.1.18), so the upper ends
  // are the worst case of every draw.
  void CheckStationaryAtUpperEnds(const YAML::Node& root, const StudySpec& s) {
    if (!s.events || s.truth.random || s.event_process.spectral_radius || !s.grid.stationarity.empty()) return;
    const graph::Dmg& g = s.truth.explicit_graph.graph;
    if (g.size() == 0) return;
    Eigen::MatrixXd k = Eigen::MatrixXd::Zero(g.size(), g.size());
    for (int to = 0; to < g.size(); ++to) {
      for (int from : g.Parents(to)) {
        k(to, from) = from == to ? s.event_process.loop_weight.high : s.event_process.weight.high;
      }
    }
    const Result<double> radius = sim::SpectralRadius(k);
    if (radius.ok() && *radius >= 1) {
      const YAML::Node events = root["process"]["events"];
      Fail(NodeOr(events, "weight"), "process.events.weight",
            "with the largest weights the spectral radius of K is " + Text(*radius) +
                " >= 1 (not stationary); lower weight or loop_weight, or set spectral_radius");
    }
  }

  static bool AllFixed(const StudySpec& s) {
    if (s.events) {
      const auto& e = s.event_process;
      return e.baseline.IsFixed() && e.weight.IsFixed() && e.loop_weight.IsFixed() && e.decay.IsFixed();
    }
    return s.path_process.self_rate.IsFixed() && s.path_process.coupling.IsFixed();
  }

  const std::string& file_;
  std::vector<Error> errors_;
  std::optional<YAML::Node> random_hidden_;  // truth.random.hidden, when given
};

}  // namespace

const std::vector<std::string>& EventTests() {
  return EventTestNames();
}

const std::vector<std::string>& PathTests() {
  return PathTestNameList();
}

StudyOrErrors ParseStudyText(const std::string& text, const std::string& file) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    return std::vector<Error>{
        Error{file, e.mark.line + 1, e.mark.column + 1, "", "not valid YAML: " + e.msg}};
  }
  StudyParser parser(file);
  StudySpec spec;
  try {
    spec = parser.Parse(root);
  } catch (const YAML::Exception& e) {
    std::vector<Error> errors = parser.errors();
    errors.push_back(Error{file, e.mark.line + 1, e.mark.column + 1, "", e.msg});
    return errors;
  }
  std::vector<Error> errors = parser.errors();
  if (!errors.empty()) {
    std::stable_sort(errors.begin(), errors.end(), [](const Error& a, const Error& b) {
      return std::pair(a.line, a.column) < std::pair(b.line, b.column);
    });
    return errors;
  }
  return spec;
}

StudyOrErrors ReadStudyFile(const std::string& path) {
  std::ifstream in(path);
  if (!in) return std::vector<Error>{Error{path, 0, 0, "", "cannot open the file"}};
  std::ostringstream text;
  text << in.rdbuf();
  if (text.str().find_first_not_of(" \t\r\n") == std::string::npos) {
    return std::vector<Error>{Error{path, 1, 1, "", "the file is empty"}};
  }
  return ParseStudyText(text.str(), path);
}

}  // namespace locind::app
