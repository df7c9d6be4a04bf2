#!/usr/bin/env python3
"""Pairwise search against the oracle protocol of locind (docs/external_learners.md).

For every ordered pair (a, b) of observed processes, a -> b is kept unless b is
separated from a given every other process (b included); for a loop b -> b,
given every other process. These are the questions the built-in pairwise
method asks, so under the oracle both report the same graph.

Usage (locind runs it): pairwise_oracle.py FOLDER
"""
import json
import os
import sys


def ask(target, sources, given):
    """One question on standard output, one answer on standard input."""
    print(f"{target};{','.join(sources)};{','.join(given)}", flush=True)
    answer = sys.stdin.readline().strip()
    if answer not in ("separated", "connected"):
        sys.exit(f"unexpected answer from locind: {answer!r}")
    return answer == "connected"


def main():
    folder = sys.argv[-1]
    with open(os.path.join(folder, "task.json")) as f:
        task = json.load(f)
    names = task["processes"]
    edges = []
    for b in names:
        for a in names:
            given = [x for x in names if x != a]
            if ask(b, [a], given):
                edges.append({"from": a, "to": b, "kind": "directed"})
    with open(os.path.join(folder, "graph.json"), "w") as f:
        json.dump({"nodes": names, "edges": edges}, f)


if __name__ == "__main__":
    main()
