#!/usr/bin/env bash
# No output prints nan or inf: every example in every format and unit system, the CSV batch
# example in csv and jsonl, and every case file of the bad-input catalogue in json and csv
# (bad_inputs.sh scans their table output). A number is printed as a number, or the case is
# refused with a message. Run by ctest from the repository root as:
#   bash tests/cli/outputs_finite.sh <shaftwork binary>
set -uo pipefail
bin=${1:?usage: outputs_finite.sh SHAFTWORK_BINARY}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
failures=0
runs=0

# Runs the command and scans its standard output. With skip_errors=yes, rows that failed
# are left out: a batch echoes its input cells, and a logger's "NaN" cell is refused by name.
skip_errors=no
scan() {
  "$@" 2> /dev/null | if [ "$skip_errors" = yes ]; then grep -vE ',error,|"status":"error"'; else cat; fi > "$tmp/out"
  runs=$((runs + 1))
  if [ ! -s "$tmp/out" ]; then
    echo "FAIL: no output from: $*" >&2
    failures=$((failures + 1))
  elif grep -qiwE -- '-?(nan|inf|infinity)' "$tmp/out"; then
    echo "FAIL: nan or inf in the output of: $*" >&2
    grep -iwE -- '-?(nan|inf|infinity)' "$tmp/out" | head -3 >&2
    failures=$((failures + 1))
  fi
}

for example in examples/*.json examples/guarantees/*.json; do
  case $example in *.template.json) continue ;; esac
  for format in table json csv; do
    for units in si us; do scan "$bin" rate --format "$format" --units "$units" "$example"; done
  done
done
skip_errors=yes
for template in examples/*.template.json; do
  points=${template%.template.json}.csv
  for format in csv jsonl; do
    for units in si us; do scan "$bin" rate "$points" --case "$template" --quiet --format "$format" --units "$units"; done
  done
done
skip_errors=no
for file in tests/bad_input/*.json; do
  # Files that are not JSON print nothing to standard output; only case files are scanned.
  "$bin" rate --format json "$file" > /dev/null 2>&1
  [ $? -eq 2 ] && continue
  for format in json csv; do scan "$bin" rate --format "$format" "$file"; done
done

if [ "$failures" -gt 0 ]; then
  echo "$failures of $runs outputs hold nan or inf, or are missing" >&2
  exit 1
fi
echo "$runs outputs free of nan and inf"
