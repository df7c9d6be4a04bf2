#!/usr/bin/env python3
"""Fails when a source file includes a header from a layer above its own.

Layers, bottom to top (a file may include its own layer and those below):
base, graph, sim, learners/independence, learners/methods, metrics,
app/io, app/study, app/results, app/running, app/report, app/cli.
tests/, bench/ and examples/ sit above everything. Prints one line per
violation as FILE:LINE: message and exits 1; exits 0 when there is none.
"""
import pathlib
import re
import sys

LAYERS = [
    "base", "graph", "sim", "learners/independence", "learners/methods", "metrics",
    "app/io", "app/study", "app/results", "app/running", "app/report", "app/cli",
]
INCLUDE = re.compile(r'^\s*#\s*include\s+"([^"]+)"')


def layer_of(path):
    """Index of the layer a repository path belongs to, or None (tests, bench, ...)."""
    for i in reversed(range(len(LAYERS))):
        if path == LAYERS[i] or path.startswith(LAYERS[i] + "/"):
            return i
    return None


def check(root):
    problems = []
    for layer in LAYERS:
        folder = root / layer
        for f in sorted(folder.glob("*")):
            if f.suffix not in (".h", ".cc"):
                continue
            rel = f.relative_to(root).as_posix()
            own = layer_of(rel)
            for number, line in enumerate(f.read_text(encoding="utf-8").splitlines(), 1):
                m = INCLUDE.match(line)
                if not m:
                    continue
                target = layer_of(m.group(1))
                if target is None:
                    problems.append(f"{rel}:{number}: includes \"{m.group(1)}\", which is in no layer")
                elif target > own:
                    problems.append(f"{rel}:{number}: {LAYERS[own]} includes \"{m.group(1)}\" "
                                    f"from the layer above it, {LAYERS[target]}")
    # A folder holding sources that is not a layer would escape the check.
    for d in ("app", "learners"):
        for f in sorted((root / d).glob("*.*")):
            if f.suffix in (".h", ".cc"):
                problems.append(f"{f.relative_to(root).as_posix()}:1: source outside every layer folder")
    return problems


def main():
    root = pathlib.Path(sys.argv[1] if len(sys.argv) > 1 else ".").resolve()
    problems = check(root)
    for p in problems:
        print(p)
    if problems:
        print(f"check_includes: {len(problems)} include(s) point up a layer", file=sys.stderr)
        return 1
    print(f"check_includes: every include points down ({len(LAYERS)} layers)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
