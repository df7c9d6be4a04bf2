"""Every output file of a tiny study and of `locind learn --out` loads in the
one line results/README.md documents for pandas ("Loading the files"), with
Debian's python3-pandas; seeds and stream keys above 2^53 survive study.json.

usage: output_files_test.py LOCIND_BINARY SOURCE_DIR
"""
import json
import os
import subprocess
import sys
import tempfile

import pandas as pd

LOCIND, SOURCE = sys.argv[1], sys.argv[2]

# 2^60 + 1: a double cannot hold it (2^53 is the largest exactly held run of
# integers, IEEE 754 binary64), so a reader keeping JSON numbers as doubles
# would round it.
SEED = 2**60 + 1

STUDY = f"""name: tiny_files
seed: {SEED}
truth:
  nodes: [a, b, c, h]
  edges: [a -> b, h -> a, h -> c, a -> a, b -> b]
  hidden: [h]
process:
  events: {{baseline: 0.5, weight: 0.4, loop_weight: 0.2, decay: 2, burn_in: 10}}
grid: {{lengths: [60, 120], replicates: 2}}
learners:
  - {{method: pairwise, test: hawkes-lr}}
  - {{method: maximal-search, test: oracle}}
"""


def run(*args):
    done = subprocess.run([LOCIND, *args], capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"locind {' '.join(args)} exited {done.returncode}: {done.stderr}")
    return done


def check(condition, what):
    if not condition:
        sys.exit("FAILED: " + what)


def csv_files(folder):
    return sorted(f for f in os.listdir(folder) if f.endswith(".csv"))


def main():
    with tempfile.TemporaryDirectory(prefix="locind_output_files_") as tmp:
        study = os.path.join(tmp, "tiny.yaml")
        with open(study, "w") as f:
            f.write(STUDY)
        out = os.path.join(tmp, "results")
        run("run", study, "--out", out)
        expected = {"replicates.csv", "edges.csv", "summary.csv", "comparisons.csv", "null_tests.csv",
                    "calibration.csv"}
        check(expected <= set(csv_files(out)), f"result files {csv_files(out)}")
        for name in csv_files(out):
            frame = pd.read_csv(os.path.join(out, name))  # the documented line
            check(len(frame.columns) > 1, f"{name}: columns {list(frame.columns)}")
            check(not any(str(c).startswith("Unnamed") for c in frame.columns), f"{name}: unnamed column")
        replicates = pd.read_csv(os.path.join(out, "replicates.csv"))
        # 2 cells x 2 replicates x 2 learners; cells numbered from 0.
        check(len(replicates) == 8, f"replicates.csv has {len(replicates)} rows, expected 8")
        check(sorted(replicates["cell"].unique()) == [0, 1], "cells numbered 0, 1")

        with open(os.path.join(out, "study.json")) as f:
            resolved = json.load(f)  # the documented line (pandas: json_normalize of "cells")
        check(resolved["seed"] == str(SEED), f"seed {resolved['seed']!r} is not the string {SEED}")
        cells = pd.json_normalize(resolved["cells"])
        check(list(cells["cell"]) == [0, 1], "study.json cells numbered from 0")
        for key in list(cells["key"]) + list(cells["data_key"]):
            check(isinstance(key, str) and key.isdigit() and int(key) < 2**64, f"stream key {key!r}")

        # An event file from simulate (comment lines before the header).
        model = os.path.join(SOURCE, "configs", "models", "hawkes_hidden_driver.yaml")
        events = os.path.join(tmp, "events.csv")
        run("simulate", model, "--horizon", "200", "--seed", "7", "--out", events)
        frame = pd.read_csv(events, comment="#")  # the documented line for data files
        check(list(frame.columns) == ["time", "process"], f"events.csv columns {list(frame.columns)}")
        check(len(frame) > 10, "events.csv rows")

        learned = os.path.join(tmp, "learned")
        run("learn", events, "--method", "maximal-search", "--out", learned)
        for name in ["tests.csv", "decisions.csv"]:
            frame = pd.read_csv(os.path.join(learned, name))
            check(len(frame) > 0, f"{name} rows")
        tests = pd.read_csv(os.path.join(learned, "tests.csv"))
        check(tests["p_value"].dtype == float, "tests.csv p_value is numeric")
        # Not estimable: empty p-value (NaN in pandas), never 1.
        check(tests.loc[tests["status"] != "ok", "p_value"].isna().all(), "not estimable p-values are empty")
        with open(os.path.join(learned, "graph.json")) as f:
            graph = json.load(f)
        check(len(pd.json_normalize(graph["edges"])) == len(graph["edges"]), "graph.json edges")
    print("output_files_test: every output file loads")


main()
