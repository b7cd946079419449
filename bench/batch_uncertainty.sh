#!/usr/bin/env bash
# Batch rating speed with uncertainties (issue 13): the NASA-air compressor log of
# bench/compressor_log.awk (outlet temperature measured, efficiency and power solved),
# CSV to CSV, end to end, with and without the instruments' uncertainties. With them,
# each row is rated 13 times: once, and twice more for each of its six uncertain inputs
# (inlet and outlet pressure and temperature, mass flow, barometer). docs/performance.md
# records the results.
#
#   bench/batch_uncertainty.sh [path/to/shaftwork] [rows]   (defaults: build/shaftwork, 1000000)
#
# Times with hyperfine (wall clock, whole process, mean of RUNS runs after one warm-up),
# then the CPU time of one run with /usr/bin/time.
source "$(dirname "$0")/batch_log.bash"
runs=${RUNS:-5}
cat >"$work/uncertain.json" <<'JSON'
{ "id": "benchmark log with uncertainties", "machine": "compressor", "fluid": "air",
  "site": { "barometric_pressure": { "value": "99.1 kPa", "uncertainty": "0.1 kPa" } },
  "mechanical_efficiency": 0.975,
  "uncertainty": { "inlet.pressure": "0.05 kPa", "inlet.temperature": "0.3 K", "outlet.pressure": "0.25 %",
                   "outlet.temperature": "0.6 K", "mass_flow": "1.5 %" } }
JSON

echo "machine:  $(lscpu | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores; load: $(cut -d' ' -f1-3 /proc/loadavg)"
echo "rows:     $rows"
hyperfine --warmup 1 --runs "$runs" --export-json "$work/times.json" \
  -n plain "$bin rate $work/log.csv --case $work/template.json --quiet -o $work/plain.csv" \
  -n uncertainties "$bin rate $work/log.csv --case $work/uncertain.json --quiet -o $work/uncertain.csv"
/usr/bin/python3 - "$work/times.json" "$rows" <<'PY'
import json, sys
rows = int(sys.argv[2])
for r in json.load(open(sys.argv[1]))["results"]:
    print(f"{r['command']:>14}: mean {r['mean']:.3f} s, min {r['min']:.3f} s: "
          f"{rows / r['mean']:,.0f} rows/s (mean), {rows / r['min']:,.0f} rows/s (best)")
PY
/usr/bin/time -f "uncertainties, one run: %e s wall, %U s user, %S s system, %M kB peak" \
  "$bin" rate "$work/log.csv" --case "$work/uncertain.json" --quiet -o "$work/uncertain.csv"
ok=$(grep -c ',ok,' "$work/uncertain.csv" || true)
echo "rows rated with uncertainties: $ok of $rows"
