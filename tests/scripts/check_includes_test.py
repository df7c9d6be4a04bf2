#!/usr/bin/env python3
"""Checks scripts/check_includes.py on a small tree made here: an include that
points up a layer is reported with its file and line and fails the check; one
that points down passes. Run by ctest (tests/scripts/tests.cmake)."""
import pathlib
import subprocess
import sys
import tempfile

script = pathlib.Path(sys.argv[1])


def run(files):
    with tempfile.TemporaryDirectory() as root:
        for name, text in files.items():
            path = pathlib.Path(root) / name
            path.parent.mkdir(parents=True, exist_ok=True)
            path.write_text(text)
        done = subprocess.run([sys.executable, str(script), root], capture_output=True, text=True)
        return done.returncode, done.stdout


code, out = run({"graph/dmg.h": '#pragma once\n#include "base/status.h"\n',
                 "app/cli/main.cc": '#include "graph/dmg.h"\n#include "app/io/error.h"\n'})
assert code == 0, out
code, out = run({"graph/dmg.h": '#pragma once\n\n#include "metrics/score.h"\n',
                 "app/io/error.h": '#include "app/running/runner.h"\n'})
assert code == 1, out
assert 'graph/dmg.h:3: graph includes "metrics/score.h" from the layer above it, metrics' in out, out
assert 'app/io/error.h:1: app/io includes "app/running/runner.h"' in out, out
code, out = run({"app/loose.cc": '#include "graph/dmg.h"\n'})
assert code == 1 and "app/loose.cc:1: source outside every layer folder" in out, out
print("check_includes: 3 cases as expected")
