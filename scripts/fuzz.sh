#!/usr/bin/env bash
# Fuzzes one reader with libFuzzer (not run in CI; CI replays the corpus):
#   scripts/fuzz.sh study_file|graph_file|event_csv|path_csv [SECONDS]
# Builds build/fuzz with clang (-fsanitize=fuzzer,address,undefined), fuzzes
# from tests/fuzz/corpus/<reader>/ for SECONDS (default 600) with one job,
# then merges what was found into the kept corpus (-merge=1 keeps only
# inputs that add coverage). Crash reproducers land in build/fuzz/artifacts/;
# copy each into the corpus folder as crash_<what>, after fixing it.
set -euo pipefail
cd "$(dirname "$0")/.."
reader="${1:?usage: scripts/fuzz.sh study_file|graph_file|event_csv|path_csv [SECONDS]}"
seconds="${2:-600}"
cmake -S . -B build/fuzz -G Ninja -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_CXX_COMPILER=clang++ \
  -DLOCIND_FUZZ=ON -DLOCIND_BUILD_TESTS=OFF -DLOCIND_BUILD_BENCH=OFF -DLOCIND_BUILD_APP=OFF >/dev/null
cmake --build build/fuzz -j2 --target "${reader}_fuzz"
root="$PWD"
work="$root/build/fuzz/work/$reader"
mkdir -p "$work" "$root/build/fuzz/artifacts"
cd build/fuzz  # -jobs writes its log (fuzz-0.log) into the current folder
"./${reader}_fuzz" -max_total_time="$seconds" -jobs=1 -print_final_stats=1 \
  -artifact_prefix="$root/build/fuzz/artifacts/" "$work" "$root/tests/fuzz/corpus/$reader"
tail -n 8 fuzz-0.log
"./${reader}_fuzz" -merge=1 "$root/tests/fuzz/corpus/$reader" "$work"
