#!/usr/bin/python3
"""How evenly the two MPI assignments of `locind run` share a study.

Reads replicates.csv of a finished single-process run, takes each unit's
cost from its timing columns (one simulation, then every learner with its
scoring), and replays the two assignments of app/running/runner_mpi.h on N ranks
with one thread each:

  static    unit i (cell-major order) on rank i mod N, as --part does;
  dispatch  units handed to whichever rank is free first, longest
            observation length first (what rank 0 does);
  in order  the same dispatch without the longest-first order (for scale).

Prints the parallel efficiency sum(costs) / (N * makespan) of each; 1.0 is
a perfect share. With --replicates R each cell's measured costs are drawn
with replacement up to R replicates (fixed seed), to look at studies larger
than the one measured. Messages and the lead's own work are left out (they
are measured by bench/mpi_scaling.sh).

usage: bench/mpi_balance.py replicates.csv RANKS [RANKS ...] [--replicates R]
"""
import csv
import heapq
import random
import sys


def unit_costs(path):
    """{(cell, replicate): (length, seconds)} from replicates.csv."""
    units = {}
    with open(path, newline="") as f:
        for row in csv.DictReader(f):
            key = (int(row["cell"]), int(row["replicate"]))
            work = float(row["timing_learn_seconds"]) + float(row["timing_score_seconds"])
            if key not in units:  # one simulation per unit, repeated on each learner's row
                units[key] = [float(row["length"]), float(row["timing_simulate_seconds"])]
            units[key][1] += work
    return {k: tuple(v) for k, v in units.items()}


def resample(units, replicates):
    rng = random.Random(20261202)
    cells = sorted({c for c, _ in units})
    out = {}
    for c in cells:
        measured = [v for (cc, _), v in units.items() if cc == c]
        for r in range(replicates):
            out[(c, r)] = rng.choice(measured)
    return out


def makespan_static(costs, ranks):
    loads = [0.0] * ranks
    for i, cost in enumerate(costs):
        loads[i % ranks] += cost
    return max(loads)


def makespan_dispatch(costs, ranks):
    free_at = [0.0] * ranks  # list scheduling: the next unit to the first free rank
    heapq.heapify(free_at)
    for cost in costs:
        heapq.heappush(free_at, heapq.heappop(free_at) + cost)
    return max(free_at)


def main(argv):
    replicates = None
    if "--replicates" in argv:
        at = argv.index("--replicates")
        replicates = int(argv[at + 1])
        del argv[at:at + 2]
    units = unit_costs(argv[0])
    if replicates:
        units = resample(units, replicates)
    order = sorted(units)  # cell-major, as UnitsOf numbers them
    costs = [units[k][1] for k in order]
    longest_first = [units[k][1] for k in sorted(order, key=lambda k: -units[k][0])]
    total = sum(costs)
    print(f"units {len(costs)}, total {total:.2f} s of one-thread work")
    print("ranks  static  dispatch  in-order")
    for ranks in map(int, argv[1:]):
        eff = [total / (ranks * m) for m in (makespan_static(costs, ranks),
                                             makespan_dispatch(longest_first, ranks),
                                             makespan_dispatch(costs, ranks))]
        print(f"{ranks:5d}  {eff[0]:6.3f}  {eff[1]:8.3f}  {eff[2]:8.3f}")


if __name__ == "__main__":
    main(sys.argv[1:])
