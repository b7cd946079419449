#!/usr/bin/env bash
# A natural-gas booster on Peng-Robinson in a batch (issue 15), whole process, beside the
# same rows on the NASA ideal gas in the same run. docs/performance.md records the results.
#
#   bench/real_gas_compare.sh [path/to/shaftwork] [rows]     (defaults: build/shaftwork, 2000)
#   REPEATS=7 bench/real_gas_compare.sh build/shaftwork 20000
#
# The log (awk, fixed seed) varies an invented booster's field point: inlet 40-43 barg at
# 14-22 degC, outlet 62-65 barg, an outlet temperature from an efficiency of 0.72-0.86
# (T2s/T1 = ratio^0.245, near the gas's real isentrope), 90-100
# MMSCFD, a shaft power of 1.45-1.60 MW; the pipeline gas "natural-gas-example" of
# data/fluids.txt. Each row is rated with its measured outlet temperature: both
# efficiencies, both heads, the Schultz values on Peng-Robinson, and the power balance.
# Figures: medians over REPEATS paired rounds (default 5) of the wall and CPU time (user +
# system) from bench/timed_run.py, per tool, and the CPU time per row with --jobs 1.
set -eu
source "$(dirname "$0")/paired_rounds.bash"
bin=${1:-build/shaftwork}
rows=${2:-2000}
repeats=${REPEATS:-5}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

awk -v rows="$rows" 'BEGIN {
  srand(20261202)
  print "id,inlet.pressure [barg],inlet.temperature [degC],outlet.pressure [barg],outlet.temperature [degC],standard_volume_flow [MMSCFD],power [MW]"
  for (i = 0; i < rows; i++) {
    t1 = 14 + 8 * rand(); p1 = 40 + 3 * rand(); p2 = 62 + 3 * rand(); eta = 0.72 + 0.14 * rand()
    T1 = t1 + 273.15; t2 = T1 * (exp(0.245 * log((p2 + 1) / (p1 + 1))) - 1) / eta + t1
    printf "%d,%.3f,%.2f,%.3f,%.2f,%.2f,%.4f\n", i, p1, t1, p2, t2, 90 + 10 * rand(), 1.45 + 0.15 * rand()
  }
}' >"$work/log.csv"
for model in peng-robinson nasa-polynomial; do
  if [ "$model" = nasa-polynomial ]; then fluid='"natural-gas-example"'; else fluid='{"model": "peng-robinson", "fluid": "natural-gas-example"}'; fi
  printf '{ "id": "booster log", "machine": "compressor", "fluid": %s, "site": { "barometric_pressure": "0.995 bar" } }\n' \
    "$fluid" >"$work/$model.json"
done

names=("Peng-Robinson, --jobs 1" "NASA ideal gas, --jobs 1" "Peng-Robinson, all cores")
commands=("'$bin' rate '$work/log.csv' --case '$work/peng-robinson.json' --quiet --jobs 1 -o '$work/pr.csv'"
          "'$bin' rate '$work/log.csv' --case '$work/nasa-polynomial.json' --quiet --jobs 1 -o '$work/ideal.csv'"
          "'$bin' rate '$work/log.csv' --case '$work/peng-robinson.json' --quiet -o '$work/pr2.csv'")
paired_rounds "$repeats" "$work/times" "${commands[@]}"
rated=$(grep -c ',ok,' "$work/pr.csv" || true)
cmp -s "$work/pr.csv" "$work/pr2.csv" || { echo "jobs 1 and all cores differ" >&2; exit 1; }

echo "machine:  $(lscpu | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg)"
echo "rows:     $rows ($rated rated on Peng-Robinson), medians of $repeats paired rounds"
echo
printf "%-32s %8s %8s %14s\n" "run" "wall s" "CPU s" "CPU us/row"
for i in "${!names[@]}"; do
  wall=$(awk -v i="$i" '$1 == i { print $2 }' "$work/times" | median)
  cpu=$(awk -v i="$i" '$1 == i { print $3 + $4 }' "$work/times" | median)
  awk -v n="${names[$i]}" -v w="$wall" -v c="$cpu" -v rows="$rows" \
    'BEGIN { printf "%-32s %8.3f %8.3f %14.1f\n", n, w, c, c / rows * 1e6 }'
done
