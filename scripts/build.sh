#!/usr/bin/env bash
# Configures and builds one build tree: scripts/build.sh release|asan|mpi [targets...]
set -euo pipefail
cd "$(dirname "$0")/.."
kind="${1:-release}"
shift || true
case "$kind" in
  release) flags=(-DCMAKE_BUILD_TYPE=Release) ;;
  asan) flags=(-DCMAKE_BUILD_TYPE=RelWithDebInfo -DLOCIND_SANITIZE=ON -DLOCIND_BUILD_BENCH=OFF) ;;
  mpi) flags=(-DCMAKE_BUILD_TYPE=Release -DLOCIND_MPI=ON -DLOCIND_BUILD_BENCH=OFF) ;;
  *) echo "usage: scripts/build.sh release|asan|mpi [targets...]" >&2; exit 2 ;;
esac
# ccache lets the MPI tree reuse the Release tree's objects (same flags,
# paths made relative to the checkout), which saves most of its build.
if command -v ccache >/dev/null; then
  export CCACHE_BASEDIR="${CCACHE_BASEDIR:-$PWD}"
  flags+=(-DCMAKE_CXX_COMPILER_LAUNCHER=ccache)
fi
cmake -S . -B "build/$kind" -G Ninja "${flags[@]}" >/dev/null
if (($# > 0)); then
  cmake --build "build/$kind" -j2 --target "$@"
else
  cmake --build "build/$kind" -j2
fi
