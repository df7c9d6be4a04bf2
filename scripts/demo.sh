#!/usr/bin/env bash
# Installs what is needed, builds locind, and runs the demo on the bundled
# example. Outputs go to results/demo/.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh
bash scripts/build.sh release locind
bin=build/release/locind
out=results/demo
mkdir -p "$out"
example=examples/alarm_chain.yaml
echo "== The example graph ($example; h is hidden)"
cat "$example"
echo "== Its latent projection onto the observed streams"
"$bin" graph project "$example" | tee "$out/projection.yaml"
echo "== The equivalence graph of the projection (dashed: missing from some equivalent graph)"
"$bin" graph class "$example" | tee "$out/equivalence_graph.txt"
"$bin" graph class "$example" --json > "$out/equivalence_graph.json"
"$bin" graph draw "$example" -o "$out/truth.svg"
"$bin" graph draw "$example" -o "$out/equivalence_graph.svg" --class
echo "== Results in $out/: projection.yaml, equivalence_graph.{txt,json,svg}, truth.svg"
study=configs/demo.yaml
study_out=results/pumping_station
echo "== A simulation study ($study, an invented pumping station): 4 learners x 3 observation lengths"
rm -rf "$study_out"   # a fresh run (an existing folder would be resumed)
"$bin" run "$study" --threads 2 --out "$study_out"
echo "== The length each learner needs for power 0.8 with at most 5% false edges (about a minute)"
"$bin" plan "$study" --power 0.8 --false-edges 0.05 --threads 2 --out "$study_out"
echo "== The report, redrawn with the plan's targets"
"$bin" report "$study_out"
echo "== Study results in $study_out/: report.html (open it in a browser; figures also in figures/),"
echo "   summary.csv (the table locind run printed), replicates.csv, edges.csv, null_tests.csv, calibration.csv, plan.csv, study.json"
