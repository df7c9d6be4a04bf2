#!/usr/bin/env bash
# Installs what is needed, builds, and runs every test: the Release suite
# (all tests, including the long calibration checks and the Python reference
# checks) and the AddressSanitizer + UndefinedBehaviorSanitizer build of the
# suite (without the long `calibration` label), then the MPI build's
# `locind run` under mpirun against a single-process run (label `mpi`,
# Release only: under the sanitizers Open MPI's own allocations would need
# detect_leaks=0).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh

echo "== Layers: every #include points down (scripts/check_includes.py)"
python3 scripts/check_includes.py

echo "== Release build and tests"
bash scripts/build.sh release
ctest --test-dir build/release -j2 --output-on-failure

echo "== Sanitizer build (address, undefined) and tests"
bash scripts/build.sh asan
export UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1
export ASAN_OPTIONS=detect_leaks=1
export LSAN_OPTIONS="suppressions=$PWD/tests/lsan.supp"
ctest --test-dir build/asan -j2 --output-on-failure -LE calibration

echo "== MPI build (Release, LOCIND_MPI=ON): locind run under mpirun"
bash scripts/build.sh mpi locind runner_mpi_test
ctest --test-dir build/mpi --output-on-failure -L mpi   # one at a time: each starts 2-3 ranks
