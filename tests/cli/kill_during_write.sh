#!/usr/bin/env bash
# -o FILE is written whole or not at all: SIGKILL the program while it writes and the file
# from before must still be there, byte for byte. Two writers: a CSV batch (streamed into a
# temporary file beside FILE while the rows are rated) and a JSON case file of many cases
# (rated first, then written in one go). Both go through io::OutputFile. Each is killed at several moments;
# after every kill FILE holds either the earlier content or, when the run had already
# finished, the complete new output, never a part of it.
# Run by ctest from the repository root as: bash tests/cli/kill_during_write.sh <shaftwork binary>
set -uo pipefail
bin=${1:?usage: kill_during_write.sh SHAFTWORK_BINARY}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
failures=0
fail() {
  echo "FAIL: $*" >&2
  failures=$((failures + 1))
}

# Inputs: the week log repeated to 80640 rows, and 3000 cases in one JSON file.
points=$tmp/points.csv
head -n 1 examples/compressor-week-log.csv > "$points"
for _ in 1 2 3 4 5 6 7 8; do tail -n +2 examples/compressor-week-log.csv >> "$points"; done
python3 - "$tmp/cases.json" <<'PY'
import json, sys
case = {"machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "20 degC"},
        "outlet": {"pressure": "4 bar"}, "mass_flow": "1 kg/s"}
cases = [dict(case, id=f"point {i}", efficiency=0.6 + 0.3 * i / 3000) for i in range(3000)]
json.dump({"cases": cases}, open(sys.argv[1], "w"))
PY

# Runs the command with -o $out, kills it with SIGKILL after $delay seconds, and checks $out.
# $complete holds the output of an undisturbed run.
killed_mid_write=0
check_kill() {
  local label=$1 delay=$2 complete=$3
  shift 3
  local out=$tmp/results
  printf 'results of an earlier run, to be kept\n' > "$out"
  cp "$out" "$tmp/earlier"
  "$@" -o "$out" > /dev/null 2>&1 &
  local pid=$!
  sleep "$delay"
  local temp_size=0
  for temp in "$out".??????; do
    [ -f "$temp" ] && temp_size=$(wc -c < "$temp")
  done
  kill -KILL "$pid" 2> /dev/null
  wait "$pid" 2> /dev/null
  local status=$?
  if cmp -s "$out" "$tmp/earlier"; then
    [ "$status" -eq 137 ] || fail "$label, killed after $delay s: exit status $status, yet the file was not replaced"
    [ "$temp_size" -gt 0 ] && killed_mid_write=$((killed_mid_write + 1))
  elif cmp -s "$out" "$complete"; then
    : # the run finished before the kill: the new file is complete
  else
    fail "$label, killed after $delay s: $out holds neither the earlier file nor the complete output ($(wc -c < "$out") bytes)"
  fi
  rm -f "$out".??????  # a killed writer cannot remove its temporary file
}

# Undisturbed runs give the complete outputs and how long a run takes here (a sanitizer
# build is many times slower than a release build); the kills come at fractions of that.
seconds() { date +%s.%N; }
times() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.3f", a * b }'; }
start=$(seconds)
"$bin" rate "$points" --case examples/compressor-week-log.template.json --quiet -o "$tmp/complete.csv" 2> /dev/null
batch_time=$(awk -v end="$(seconds)" -v start="$start" 'BEGIN { print end - start }')
[ -s "$tmp/complete.csv" ] || fail "the undisturbed batch wrote nothing"
start=$(seconds)
"$bin" rate --format json "$tmp/cases.json" -o "$tmp/complete.json" 2> /dev/null
cases_time=$(awk -v end="$(seconds)" -v start="$start" 'BEGIN { print end - start }')
[ -s "$tmp/complete.json" ] || fail "the undisturbed case file run wrote nothing"

for fraction in 0.05 0.2 0.4 0.6 0.8 0.95; do
  check_kill "batch" "$(times "$batch_time" "$fraction")" "$tmp/complete.csv" \
    "$bin" rate "$points" --case examples/compressor-week-log.template.json --quiet
  check_kill "case file" "$(times "$cases_time" "$fraction")" "$tmp/complete.json" \
    "$bin" rate --format json "$tmp/cases.json"
done
# At least one kill must have struck while the batch's temporary file was being filled, or
# the test proved nothing about a half-written file.
[ "$killed_mid_write" -gt 0 ] || fail "no kill came while the output was being written; make the inputs bigger"

if [ "$failures" -gt 0 ]; then
  echo "$failures kill checks failed" >&2
  exit 1
fi
echo "kill checks passed ($killed_mid_write kills came while a temporary file was being written)"
