#!/usr/bin/env python3
"""A simple method on event data (python3 + numpy), run by locind as an
external learner (docs/external_learners.md).

For every ordered pair (a, b): count the events of b that fall within
WINDOW time units after an event of a (for a loop, after an earlier event of
b itself). Under no influence of a on b, with b a Poisson stream of constant
rate, that count has mean n_a * WINDOW * rate_b (edge effects ignored); keep
a -> b when the one-sided normal approximation to the Poisson count gives a
p-value at most the task's level, Bonferroni-corrected over the n^2 pairs.
This ignores every other process (no conditioning), so hidden drivers and
chains give false edges: it is an example of the protocol, not a good method.

Each pair's test is written to tests.csv (optional for a program).

Usage (locind runs it): excess_events.py [--window W] FOLDER
"""
import csv
import json
import math
import os
import sys

import numpy as np


def read_events(path, names):
    times = {n: [] for n in names}
    with open(path) as f:
        for line in f:
            line = line.strip()
            if not line or line.startswith("#") or line.startswith("time,"):
                continue
            t, p = line.split(",")[:2]
            if p in times:
                times[p].append(float(t))
    return {n: np.sort(np.array(v)) for n, v in times.items()}


def excess_count(ta, tb, window, same):
    """Events of b within (t, t + window] after each event t of a."""
    if len(ta) == 0 or len(tb) == 0:
        return 0
    hi = np.searchsorted(tb, ta + window, side="right")
    lo = np.searchsorted(tb, ta, side="right")
    return int(np.sum(hi - lo))


def main():
    window = 1.0
    if "--window" in sys.argv:
        window = float(sys.argv[sys.argv.index("--window") + 1])
    folder = sys.argv[-1]
    with open(os.path.join(folder, "task.json")) as f:
        task = json.load(f)
    if task["kind"] != "events":
        sys.exit("this example reads event data only")
    names = task["processes"]
    start, end = task["window"]
    times = read_events(os.path.join(folder, task["data"]), names)
    level = task["level"] / (len(names) ** 2)
    edges, rows = [], []
    for b in names:
        rate_b = len(times[b]) / max(end - start, 1e-12)
        for a in names:
            count = excess_count(times[a], times[b], window, a == b)
            expected = len(times[a]) * window * rate_b
            z = (count - expected) / math.sqrt(expected) if expected > 0 else 0.0
            p = 0.5 * math.erfc(z / math.sqrt(2))
            rows.append((b, a, "", z, 1, p))
            if p <= level:
                edges.append({"from": a, "to": b, "kind": "directed"})
    with open(os.path.join(folder, "graph.json"), "w") as f:
        json.dump({"nodes": names, "edges": edges}, f)
    with open(os.path.join(folder, "tests.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["target", "sources", "given", "statistic", "df", "p_value"])
        w.writerows(rows)


if __name__ == "__main__":
    main()
