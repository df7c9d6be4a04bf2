#!/usr/bin/env bash
# Replicates per second of `locind run` in one process and on 2 MPI ranks
# (both assignments), the 2-rank efficiency ratio, the serial parts of a run
# (study and truths, reading back finished units, final files) and the
# balance of the two assignments replayed on more ranks (bench/mpi_balance.py).
#
# The study is the demo (configs/demo.yaml: 5 observed alarm streams, 2
# hidden, 4 learners) with lengths 500, 2000 and 8000 and 5 replicates: 15
# units whose cost differs about 16-fold between the shortest and the
# longest length. Runs alternate between the three set-ups, REPEATS times.
#
# usage: bash bench/mpi_scaling.sh [REPEATS]
#   needs build/mpi/locind (bash scripts/build.sh mpi locind) and mpirun.
set -euo pipefail
cd "$(dirname "$0")/.."
bin=build/mpi/locind
repeats="${1:-3}"
mpirun=(mpirun --allow-run-as-root --oversubscribe --bind-to none)
[ -x "$bin" ] || { echo "build it first: bash scripts/build.sh mpi locind" >&2; exit 2; }
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT

sed -e 's/^  lengths: .*/  lengths: [500, 2000, 8000]/' -e 's/^  replicates: .*/  replicates: 5/' \
  configs/demo.yaml > "$work/study.yaml"
grep -q '^  lengths: \[500, 2000, 8000\]$' "$work/study.yaml" && grep -q '^  replicates: 5$' "$work/study.yaml" ||
  { echo "configs/demo.yaml: grid lines not found" >&2; exit 1; }
units=15

stamp() { date +%s.%N; }
# timed LOG COMMAND...: runs it with its stderr lines time-stamped into LOG;
# prints the start and end times.
timed() {
  local log="$1"; shift
  local t0 t1
  t0="$(stamp)"
  "$@" 2>&1 >/dev/null | while IFS= read -r line; do echo "$(stamp) $line"; done > "$log"
  t1="$(stamp)"
  echo "$t0 $t1"
}
# Seconds from the start to the "units already done" line (study read,
# truths drawn and classified, journal read back).
to_start_line() { awk -v t0="$1" '/units already done/ { printf "%.3f", $1 - t0; exit }' "$2"; }

echo "load before: $(uptime)"
declare -A wall
for kind in one dispatch static; do wall[$kind]=""; done
for ((r = 1; r <= repeats; ++r)); do
  for kind in one dispatch static; do
    rm -rf "$work/$kind"
    case "$kind" in
      one) cmd=("$bin" run "$work/study.yaml" --out "$work/$kind") ;;
      dispatch) cmd=("${mpirun[@]}" -np 2 "$bin" run "$work/study.yaml" --out "$work/$kind") ;;
      static) cmd=("${mpirun[@]}" -np 2 "$bin" run "$work/study.yaml" --out "$work/$kind" --mpi-assign static) ;;
    esac
    load="$(cut -d' ' -f1 /proc/loadavg)"
    read -r t0 t1 < <(timed "$work/$kind.log" "${cmd[@]}")
    wall[$kind]+="$(awk -v a="$t0" -v b="$t1" -v l="$load" 'BEGIN { printf "%.3f (load %s) ", b - a, l }')"
    if [ "$kind" = one ] && [ "$r" = 1 ]; then prepare="$(to_start_line "$t0" "$work/one.log")"; fi
  done
done
# The lead's serial work per unit, on many cheap units (length 100, 400
# replicates): a 2-rank run, then the finished folder run again (the same
# start, every unit read back from the journal, then only the final files).
sed -e 's/^  lengths: .*/  lengths: [100]/' -e 's/^  replicates: .*/  replicates: 400/' \
  configs/demo.yaml > "$work/many.yaml"
many=400
read -r t0 t1 < <(timed "$work/many.log" "${mpirun[@]}" -np 2 "$bin" run "$work/many.yaml" --out "$work/many")
many_wall="$(awk -v a="$t0" -v b="$t1" 'BEGIN { printf "%.3f", b - a }')"
read -r t0 t1 < <(timed "$work/again.log" "$bin" run "$work/many.yaml" --out "$work/many")
again_start="$(to_start_line "$t0" "$work/again.log")"
again_total="$(awk -v a="$t0" -v b="$t1" 'BEGIN { printf "%.3f", b - a }')"
# The same under mpirun -np 2: the difference is the launch (start, wire-up, finalize).
read -r t0 t1 < <(timed "$work/again2.log" "${mpirun[@]}" -np 2 "$bin" run "$work/many.yaml" --out "$work/many")
launch="$(awk -v a="$t0" -v b="$t1" -v one="$again_total" 'BEGIN { printf "%.3f", b - a - one }')"
echo "load after:  $(uptime)"

median() { tr ' ' '\n' | grep -v '[()]' | grep . | sort -g | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }
one="$(echo "${wall[one]}" | median)"
dispatch="$(echo "${wall[dispatch]}" | median)"
static="$(echo "${wall[static]}" | median)"
echo "study: demo truths, lengths 500/2000/8000, 5 replicates = $units units x 4 learners; median of $repeats runs"
echo "walls (s): 1 process: ${wall[one]}| 2 ranks dispatch: ${wall[dispatch]}| 2 ranks static: ${wall[static]}"
awk -v u="$units" -v one="$one" -v d="$dispatch" -v s="$static" 'BEGIN {
  printf "replicates_per_s_1_process      %.3f\n", u / one
  printf "replicates_per_s_2_ranks_dispatch %.3f  speed-up %.3f  efficiency %.3f\n", u / d, one / d, one / d / 2
  printf "replicates_per_s_2_ranks_static   %.3f  speed-up %.3f  efficiency %.3f\n", u / s, one / s, one / s / 2
}'
unit_seconds="$(awk -F, 'NR == 1 { for (i = 1; i <= NF; ++i) c[$i] = i; next }
  { t += $c["timing_learn_seconds"] + $c["timing_score_seconds"]
    if (!seen[$c["cell"] "," $c["replicate"]]++) t += $c["timing_simulate_seconds"] }
  END { printf "%.5f", t / length(seen) }' "$work/many/replicates.csv")"
awk -v p="$prepare" -v as="$again_start" -v at="$again_total" -v u="$many" -v c="$unit_seconds" \
    -v w="$many_wall" 'BEGIN {
  printf "serial: study + truths %.3f s (demo: 2 truths, 5 observed nodes)\n", p
  printf "many cheap units: %d units of %.1f ms each, 2 ranks dispatch %.1f units/s\n", u, 1000 * c, u / w
  printf "lead per unit: read back + decode %.3f ms, final files %.3f ms (ratios to a unit: %.4f, %.4f)\n",
    1000 * (as - p) / u, 1000 * (at - as) / u, (as - p) / u / c, (at - as) / u / c
}'
echo "launch of 2 ranks (mpirun start, MPI wire-up and finalize): $launch s"
echo "balance replayed from the 1-process run's unit times (efficiency, 1 = perfect):"
/usr/bin/python3 bench/mpi_balance.py "$work/one/replicates.csv" 2 3 4 8
echo "the same cells resampled to 200 and 2,000 replicates per cell:"
/usr/bin/python3 bench/mpi_balance.py "$work/one/replicates.csv" 10 100 --replicates 200
/usr/bin/python3 bench/mpi_balance.py "$work/one/replicates.csv" 100 1000 --replicates 2000
