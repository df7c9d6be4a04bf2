#include "app/io/model_file.h"

#include <doctest/doctest.h>

namespace locind::app {
namespace {

std::string ErrorOf(const std::string& text) {
  ModelOrError r = ParseModelText(text, "m.yaml");
  REQUIRE(std::holds_alternative<Error>(r));
  return std::get<Error>(r).ToString();
}

TEST_CASE("events model: defaults, per-edge kernels, run options") {
  ModelOrError r = ParseModelText(R"(
nodes: [a, b, h]
edges: [a -> b, h -> a, h -> b, b -> b]
hidden: [h]
events:
  baseline: {a: 0.1, b: 0.2, h: 0.3}
  kernel: {family: exponential, weight: 0.3, decay: 2}
  edge_kernels:
    - {edge: h -> b, family: delayed-gamma, weight: 0.2, delay: 1, shape: 2, rate: 3}
    - {edge: a -> b, family: exponential-sum, terms: [{weight: 0.1, decay: 1}, {weight: 0.2, decay: 4}]}
  burn_in: 30
  method: cluster
  event_cap: 1000
)", "m.yaml");
  REQUIRE(std::holds_alternative<ModelSpec>(r));
  const auto& spec = std::get<EventModelSpec>(std::get<ModelSpec>(r));
  CHECK(spec.model.baseline == std::vector<double>{0.1, 0.2, 0.3});
  CHECK(spec.model.kernels.size() == 4);
  const Eigen::MatrixXd k = spec.model.KernelIntegrals();
  CHECK(k(1, 0) == doctest::Approx(0.3));  // a -> b: 0.1 + 0.2
  CHECK(k(1, 2) == doctest::Approx(0.2));  // h -> b
  CHECK(k(0, 2) == doctest::Approx(0.3));  // h -> a: default
  CHECK(spec.run.burn_in == 30);
  CHECK(spec.run.event_cap == 1000);
  CHECK(spec.run.method == sim::HawkesMethod::kCluster);
  CHECK(spec.model.truth.hidden == std::vector<int>{2});
}

TEST_CASE("paths model: self rates on loops, couplings, noise") {
  ModelOrError r = ParseModelText(R"(
nodes: [a, b]
edges: [a -> b, a -> a, b -> b]
paths:
  self_rate: {a: 1, b: 2}
  coupling: 0.5
  noise: 0.3
  step: 0.01
  interval: 0.05
  method: exact
)", "m.yaml");
  REQUIRE(std::holds_alternative<ModelSpec>(r));
  const auto& spec = std::get<PathModelSpec>(std::get<ModelSpec>(r));
  CHECK(spec.model.M(0, 0) == -1);
  CHECK(spec.model.M(1, 1) == -2);
  CHECK(spec.model.M(1, 0) == 0.5);
  CHECK(spec.model.M(0, 1) == 0);
  CHECK(spec.model.sigma(1) == 0.3);
  CHECK(spec.run.method == sim::PathMethod::kExact);
  CHECK(spec.run.interval == 0.05);
}

TEST_CASE("model file errors point at the offending spot") {
  const std::string head = "nodes: [a, b]\nedges: [a -> b, a -> a, b -> b]\n";
  CHECK(ErrorOf(head) ==
        "m.yaml:1:1: missing the process model: an 'events' or a 'paths' section");
  CHECK(ErrorOf(head + "events:\n  colour: red\n") ==
        "m.yaml:4:3: events.colour: unknown key (expected one of: allow_nonstationary, baseline, "
        "burn_in, edge_kernels, event_cap, kernel, link, method)");
  CHECK(ErrorOf(head + "events:\n  baseline: fast\n") ==
        "m.yaml:4:13: events.baseline: expected a finite number");
  CHECK(ErrorOf(head + "events:\n  baseline: {a: 1}\n") ==
        "m.yaml:4:13: events.baseline: no value for node 'b'");
  CHECK(ErrorOf(head + "events:\n  link: cubic\n") ==
        "m.yaml:4:9: events.link: expected one of: linear, softplus, rectified");
  CHECK(ErrorOf(head + "events:\n  edge_kernels:\n    - {edge: b -> a, weight: 1}\n") ==
        "m.yaml:5:14: events.edge_kernels.edge: the graph has no edge 'b -> a'");
  CHECK(ErrorOf(head + "events:\n  kernel: {family: exponential, weight: 1.2, decay: 1}\n")
            .find("m.yaml:4:3: events: not stationary: the spectral radius") == 0);
  CHECK(ErrorOf(head + "events:\n  kernel: {family: exponential, weight: -0.2, decay: 1}\n")
            .find("softplus or rectified") != std::string::npos);
  CHECK(ErrorOf(head + "paths:\n  self_rate: -0.1\n").find("m.yaml:4:3: paths: unstable") == 0);
  CHECK(ErrorOf(head + "paths:\n  step: 0.03\n  interval: 0.1\n") ==
        "m.yaml:5:13: paths.interval: must be a multiple of the step");
  CHECK(ErrorOf(head + "paths:\n  drift: tanh\n  method: exact\n") ==
        "m.yaml:5:11: paths.method: the exact transition needs the linear drift");
  CHECK(ErrorOf("nodes: [a]\nevents: {}\npaths: {}\n") ==
        "m.yaml:3:8: paths: a model has either events or paths, not both");
  CHECK(ErrorOf("nodes: [a\n").find("m.yaml:") == 0);
  CHECK(ErrorOf(head + "events:\n  baseline: {a: 1, a: 2, b: 1}\n") ==
        "m.yaml:4:20: events.baseline: node 'a' given twice");
  CHECK(ErrorOf(head + "events:\n  link: linear\n  link: softplus\n") ==
        "m.yaml:5:3: events.link: given twice");
  CHECK(ErrorOf(head + "events:\n  baseline: {a: 1, c: 2}\n") ==
        "m.yaml:4:20: events.baseline: unknown node 'c'");
  CHECK(ErrorOf(head + "events:\n  event_cap: 1e99\n") ==
        "m.yaml:4:14: events.event_cap: expected a whole number >= 1");
  CHECK(ErrorOf(head + "events:\n  baseline: .nan\n") ==
        "m.yaml:4:13: events.baseline: expected a finite number");
  CHECK(ErrorOf("") == "m.yaml:1:1: expected a mapping with nodes and edges");
}

}  // namespace
}  // namespace locind::app
