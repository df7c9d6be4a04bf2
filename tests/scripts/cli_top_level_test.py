"""The locind program itself: --version names the version, the commit, the
compiler and the library versions; the top-level help is aligned with spaces;
every command and graph subcommand answers --help with its usage, exit 0.

usage: cli_top_level_test.py LOCIND_BINARY
"""
import re
import subprocess
import sys

LOCIND = sys.argv[1]
# At least these; every command the help lists is checked.
KNOWN = ["graph", "simulate", "learn", "test", "run", "merge", "plan", "report"]
GRAPH = ["check", "project", "class", "equivalent", "draw"]


def run(*args):
    return subprocess.run([LOCIND, *args], capture_output=True, text=True)


def check(condition, what):
    if not condition:
        sys.exit("FAILED: " + what)


def main():
    version = run("--version")
    check(version.returncode == 0, "--version exits 0")
    lines = version.stdout.splitlines()
    check(re.fullmatch(r"locind \d+\.\d+\.\d+", lines[0]) is not None, f"first line {lines[0]!r}")
    keys = [line.split(": ", 1)[0] for line in lines[1:]]
    check(keys == ["commit", "compiler", "eigen", "boost", "yaml-cpp"], f"version keys {keys}")
    commit = lines[1].split(": ", 1)[1]
    # A configure-time `git rev-parse --short=12 HEAD`, or "unknown" outside a checkout.
    check(re.fullmatch(r"[0-9a-f]{12}|unknown", commit) is not None, f"commit {commit!r}")
    for line in lines[3:]:
        check(re.fullmatch(r"[a-z-]+: \d+\.\d+(\.\d+)?", line) is not None, f"library line {line!r}")

    top = run("--help")
    check(top.returncode == 0 and "\t" not in top.stdout, "top-level help: exit 0, no tabs")
    rows = [line for line in top.stdout.split("commands:\n", 1)[1].splitlines() if line.startswith("  ")]
    commands = [row.split()[0] for row in rows]
    check(set(KNOWN) <= set(commands), f"commands listed {commands}")
    starts = {len(row) - len(row[2:].split(" ", 1)[1].lstrip()) for row in rows}
    check(len(starts) == 1, f"summaries start in one column: {sorted(starts)}")

    for command in commands:
        for where in (["--help"], ["somefile", "--help"]):
            done = run(command, *where) if command != "graph" else run(command, "--help")
            check(done.returncode == 0, f"locind {command} {' '.join(where)}: exit {done.returncode}")
            check(done.stdout.startswith("usage: locind " + command), f"locind {command} --help usage")
            check("\t" not in done.stdout, f"locind {command} --help has no tabs")
    for sub in GRAPH:
        done = run("graph", sub, "--help")
        check(done.returncode == 0 and done.stdout.startswith("usage: locind graph " + sub),
              f"locind graph {sub} --help")
    bare = run("graph")
    check(bare.returncode == 2 and "DEVELOPERS.md" not in bare.stderr and "usage: locind graph" in bare.stderr,
          "locind graph without a subcommand prints its usage")
    print("cli_top_level_test: version, help and usage as documented")


main()
