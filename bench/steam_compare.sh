#!/usr/bin/env bash
# Steam rating speed (issue 9), whole process, beside python3-iapws in the same run.
# docs/performance.md records the results.
#
#   bench/steam_compare.sh [path/to/shaftwork] [points]      (defaults: build/shaftwork, 2000)
#
# bench/steam_points.py writes, from a fixed seed, two sets of `points` test points as a
# user would hand them over, each both as a CSV log with a template (docs/batch.md) and as
# a JSON case file:
#   condensing turbine  around 10 MPa, 500 degC -> 10 kPa (wet exhaust), isentropic
#                       efficiency and mass flow given: outlet, power and the polytropic
#                       efficiency solved;
#   MVR compressor      saturated-plus-a-little steam at 1-5 bar, pressure ratio 2.5-4, the
#                       outlet temperature measured: both efficiencies and the power solved.
# python3-iapws (bench/steam_points.py --iapws) computes, for the same points, only the
# inlet state IAPWS97(P=, T=) and the isentropic outlet IAPWS97(P=, s=).
# Timings: hyperfine (Debian package hyperfine), wall clock, mean of --runs runs after
# one warm-up; RUNS=n changes the count. Every case must rate, or the script fails.
set -eu
bin=$(readlink -f "${1:-build/shaftwork}")
points=${2:-2000}
runs=${RUNS:-5}
here=$(cd "$(dirname "$0")" && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

/usr/bin/python3 "$here/steam_points.py" --write "$work" "$points"

# Every point rated, with no refusal, in both forms.
for kind in turbine mvr; do
  "$bin" rate "$work/$kind.csv" --case "$work/$kind-template.json" --quiet -o "$work/$kind-out.csv"
  rated=$(grep -c ',ok,' "$work/$kind-out.csv" || true)
  [ "$rated" -eq "$points" ] || { echo "$kind: only $rated of $points rows rated" >&2; exit 1; }
  "$bin" rate "$work/$kind.json" --format jsonl -o "$work/$kind-out.jsonl"
  ok=$(grep -c '"solved_for"' "$work/$kind-out.jsonl" || true)
  [ "$ok" -eq "$points" ] || { echo "$kind: only $ok of $points cases rated" >&2; exit 1; }
done

echo "machine:  $(lscpu | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg)"
echo "compiler: $(c++ --version | head -n 1)"
echo "python:   $(/usr/bin/python3 --version), iapws $(/usr/bin/python3 -c 'import iapws; print(iapws.__version__)')"
echo "points:   $points per set"
for kind in turbine mvr; do
  hyperfine --warmup 1 --runs "$runs" --style basic --export-markdown "$work/$kind.md" \
    -n "shaftwork, CSV log, all cores" "$bin rate $work/$kind.csv --case $work/$kind-template.json --quiet -o $work/o1.csv" \
    -n "shaftwork, CSV log, --jobs 1" "$bin rate $work/$kind.csv --case $work/$kind-template.json --quiet --jobs 1 -o $work/o2.csv" \
    -n "shaftwork, JSON case file" "$bin rate $work/$kind.json --format csv -o $work/o3.csv" \
    -n "python3-iapws, inlet and isentropic outlet only" "/usr/bin/python3 $here/steam_points.py --iapws $work/$kind.csv" \
    >/dev/null
  echo
  echo "## $kind ($points points)"
  cat "$work/$kind.md"
done
