#!/usr/bin/env python3
"""Outside reference for mu-separation and latent projection (docs/theory.md F7).

For a directed graph D, build the DAG with a node (v, t) for t = 0..T and an
edge (u, s) -> (v, t) for every u -> v in D and every s < t. With
T >= 2|V| + 2, b is mu-separated from a given C in the latent projection of D
iff (b, T) is d-separated from {(a, t): t < T} given {(c, t): c in C, t < T}
in that DAG; hidden nodes are simply not conditioned on. The d-separation
reference is networkx.d_separated (networkx 2.8.8, Debian python3-networkx).
The mu-separation answers come from `locind graph check` on a graph file with
hidden nodes. Usage: f7_unrolled_dag.py PATH/TO/locind
"""
import itertools
import os
import random
import subprocess
import sys
import tempfile

import networkx as nx


def unrolled_dag(nodes, edges, horizon):
    dag = nx.DiGraph()
    for v in nodes:
        for t in range(horizon + 1):
            dag.add_node((v, t))
    for u, v in edges:
        for t in range(horizon + 1):
            for s in range(t):
                dag.add_edge((u, s), (v, t))
    return dag


def reference_separated(nodes, edges, a, b, given):
    horizon = 2 * len(nodes) + 2
    dag = unrolled_dag(nodes, edges, horizon)
    sources = {(a, t) for t in range(horizon)}
    conditioned = {(c, t) for c in given for t in range(horizon)}
    return nx.d_separated(dag, sources, {(b, horizon)}, conditioned)


def random_graph(rng, index):
    n = rng.choice([4, 5])
    nodes = [f"v{i}" for i in range(n)]
    edges = [(u, v) for u in nodes for v in nodes
             if rng.random() < (0.5 if u == v else 0.3)]
    hidden = rng.sample(nodes, rng.choice([1, 2]))
    return nodes, edges, hidden


def write_graph(path, nodes, edges, hidden):
    with open(path, "w") as f:
        f.write(f"nodes: [{', '.join(nodes)}]\n")
        f.write(f"edges: [{', '.join(f'{u} -> {v}' for u, v in edges)}]\n")
        f.write(f"hidden: [{', '.join(hidden)}]\n")


def engine_separated(binary, path, a, b, given):
    args = [binary, "graph", "check", path, "--from", a, "--to", b]
    if given:
        args += ["--given", ",".join(given)]
    # The answer is also the exit code: 0 separated, 1 connected (README.md).
    done = subprocess.run(args, capture_output=True, text=True)
    out = done.stdout.strip()
    assert (out, done.returncode) in (("separated", 0), ("connected", 1)), (out, done.returncode, done.stderr)
    return out == "separated"


def main():
    binary = sys.argv[1]
    rng = random.Random(7)
    graphs = 100
    queries = 0
    separated = 0
    with tempfile.TemporaryDirectory() as tmp:
        for index in range(graphs):
            nodes, edges, hidden = random_graph(rng, index)
            path = os.path.join(tmp, f"g{index}.yaml")
            write_graph(path, nodes, edges, hidden)
            observed = [v for v in nodes if v not in hidden]
            triples = []
            for a, b in itertools.product(observed, observed):
                rest = [c for c in observed if c != a]
                for size in range(len(rest) + 1):
                    for given in itertools.combinations(rest, size):
                        triples.append((a, b, list(given)))
            for a, b, given in rng.sample(triples, min(8, len(triples))):
                expected = reference_separated(nodes, edges, a, b, given)
                got = engine_separated(binary, path, a, b, given)
                if expected != got:
                    print(f"MISMATCH graph {index}: nodes={nodes} edges={edges} hidden={hidden} "
                          f"from={a} to={b} given={given}: networkx separated={expected}, "
                          f"locind separated={got}")
                    return 1
                queries += 1
                separated += expected
    if separated == 0 or separated == queries:
        print(f"degenerate sample: {separated} of {queries} queries separated")
        return 1
    print(f"{graphs} graphs, {queries} queries ({separated} separated): mu-separation in the latent projection "
          f"matches d-separation in the time-unrolled DAG (networkx {nx.__version__})")
    return 0


if __name__ == "__main__":
    sys.exit(main())
