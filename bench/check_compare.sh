#!/usr/bin/env bash
# Check speed (issue 12): checking N cases against their recorded results may take at most
# twice as long as rating them. docs/performance.md records the results.
#
#   bench/check_compare.sh [path/to/shaftwork] [cases]      (defaults: build/shaftwork, 10000)
#
# One case file of N NASA-air compressor test points is generated here (awk, fixed seed):
# inlet 0.9-1.1 bar and 5-35 degC, outlet 2.5-4.5 bar at the temperature an isentropic
# efficiency of 0.70-0.85 gives on a constant-k estimate, 1-6 kg/s; shaftwork solves the
# efficiencies and the power. The baseline is recorded once with check --record; then
# hyperfine times, whole process, start to exit:
#   rate --format json -o FILE    (rating them, the reference)
#   check --baseline              (rating, then every numeric key against the record)
#   check --baseline --junit FILE (the same, writing JUnit XML as well)
set -eu
bin=$(realpath "${1:-build/shaftwork}")
cases=${2:-10000}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

awk -v n="$cases" 'BEGIN {
  srand(20261202)
  print "{\"cases\": ["
  for (i = 1; i <= n; i++) {
    p1 = 0.9 + 0.2 * rand(); t1 = 5 + 30 * rand(); p2 = 2.5 + 2 * rand(); eta = 0.70 + 0.15 * rand()
    T1 = t1 + 273.15; T2 = T1 + T1 * (exp(log(p2 / p1) * 0.4 / 1.4) - 1) / eta
    printf "{\"id\": \"point %d\", \"machine\": \"compressor\", \"fluid\": \"air\", ", i
    printf "\"inlet\": {\"pressure\": \"%.4f bar\", \"temperature\": \"%.2f degC\"}, ", p1, t1
    printf "\"outlet\": {\"pressure\": \"%.3f bar\", \"temperature\": \"%.2f degC\"}, ", p2, T2 - 273.15
    printf "\"mass_flow\": \"%.3f kg/s\"}%s\n", 1 + 5 * rand(), i < n ? "," : ""
  }
  print "]}"
}' >"$work/cases.json"

cd "$work"
"$bin" check cases.json --record baseline.json >/dev/null
"$bin" check cases.json --baseline baseline.json | tail -n 1
hyperfine --warmup 2 --runs 10 -N \
  "$bin rate --format json -o rated.json cases.json" \
  "$bin check cases.json --baseline baseline.json" \
  "$bin check cases.json --baseline baseline.json --junit junit.xml"
