#!/usr/bin/env python3
"""A separating-set search against the oracle protocol of locind
(docs/external_learners.md).

Start from every directed edge a -> b (loops included). Remove a -> b as soon
as some set C of other processes separates b from a: sets are tried by size,
0 up to MAX_SIZE, and for a != b the set always holds b itself (b's own past).
Report the directed edges that survive; no bidirected edges and no marks.

Usage (locind runs it): search_oracle.py [--max-size K] FOLDER
"""
import itertools
import json
import os
import sys


def ask(target, sources, given):
    print(f"{target};{','.join(sources)};{','.join(given)}", flush=True)
    answer = sys.stdin.readline().strip()
    if answer not in ("separated", "connected"):
        sys.exit(f"unexpected answer from locind: {answer!r}")
    return answer == "separated"


def separated_somehow(a, b, names, max_size):
    others = [x for x in names if x not in (a, b)]
    base = [b] if a != b else []
    for size in range(0, min(max_size, len(others)) + 1):
        for extra in itertools.combinations(others, size):
            if ask(b, [a], sorted(base + list(extra))):
                return True
    return False


def main():
    max_size = 2
    if "--max-size" in sys.argv:
        max_size = int(sys.argv[sys.argv.index("--max-size") + 1])
    folder = sys.argv[-1]
    with open(os.path.join(folder, "task.json")) as f:
        names = json.load(f)["processes"]
    edges = [{"from": a, "to": b, "kind": "directed"}
             for b in names for a in names
             if not separated_somehow(a, b, names, max_size)]
    with open(os.path.join(folder, "graph.json"), "w") as f:
        json.dump({"nodes": names, "edges": edges}, f)


if __name__ == "__main__":
    main()
