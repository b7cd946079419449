#!/usr/bin/env bash
# The bad-input catalogue: runs every tests/bad_input/NAME.expect and checks the exit status
# and the message fragments it names. Usage: bash tests/cli/bad_inputs.sh SHAFTWORK_BINARY
# (from the repository root; ctest runs it so).
#
# NAME.expect holds one directive a line ('#' lines are comments):
#   args: rate {input}     the command line after the program; {input} is the file NAME.*
#                          beside the .expect (or the generated one), {tmp} a scratch
#                          directory; shell quoting works ("1 bar"). Default: rate {input}
#   stdin: {input}         feed that file to standard input (default: nothing)
#   generate: KIND         the input is made at test time (see generate() below), not committed
#   exit: N                the expected exit status (required)
#   stderr: TEXT           a fragment standard error must hold (any number of these)
#   stdout: TEXT           a fragment standard output must hold (any number of these)
#   stderr-at-most: BYTES  standard error must stay this short (a huge input is not echoed)
#   echoes-input: yes      skip the nan/inf scan below: the output repeats input cells that
#                          hold those words (CSV batches echo their input columns)
# Every other run's standard output must be free of nan and inf: a number is printed as a
# number or the case is refused.
set -uo pipefail
program=${1:?usage: bad_inputs.sh SHAFTWORK_BINARY}
catalogue=tests/bad_input
scratch=$(mktemp -d)
trap 'rm -rf "$scratch"' EXIT

# Inputs too big or too odd to commit.
generate() {
  local kind=$1 out=$2
  case $kind in
    huge-string-line)  # a 100 MB line: an unterminated string
      { printf '{"id": "'; head -c 104857600 /dev/zero | tr '\0' 'y'; } > "$out" ;;
    huge-number-line)  # a 100 MB line: one number of 100 million digits
      { printf '{"id": 1'; head -c 104857600 /dev/zero | tr '\0' '7'; printf '}\n'; } > "$out" ;;
    deep-nesting)      # 200000 nested arrays
      { head -c 200000 /dev/zero | tr '\0' '['; head -c 200000 /dev/zero | tr '\0' ']'; } > "$out" ;;
    deep-fluid)        # a case whose fluid is 100000 nested arrays
      { printf '{"machine": "compressor", "fluid": '; head -c 100000 /dev/zero | tr '\0' '['
        head -c 100000 /dev/zero | tr '\0' ']'; printf ', "inlet": {"pressure": "1 bar"}}\n'; } > "$out" ;;
    many-cases)        # 20000 cases of which one is bad
      python3 - "$out" <<'PY'
import json, sys
good = {"machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "20 degC"},
        "outlet": {"pressure": "4 bar"}, "mass_flow": "1 kg/s", "efficiency": 0.8}
cases = [dict(good, id=f"point {i}") for i in range(20000)]
cases[12345]["efficiency"] = 1.5
json.dump({"cases": cases}, open(sys.argv[1], "w"))
PY
      ;;
    huge-open-quote-csv)  # a CSV record of 20 MB: a quote never closed
      { printf 'id,outlet.temperature [degC]\n"'; head -c 20971520 /dev/zero | tr '\0' 'z'; } > "$out" ;;
    *) echo "unknown generator '$kind'" >&2; return 1 ;;
  esac
}

failures=0
count=0
fail() {
  echo "FAIL $1: $2" >&2
  failures=$((failures + 1))
}

for expect in "$catalogue"/*.expect; do
  name=$(basename "$expect" .expect)
  count=$((count + 1))
  args='rate {input}'
  stdin_spec=''
  kind=''
  exit_expected=''
  stderr_max=''
  echoes=''
  stderr_parts=()
  stdout_parts=()
  while IFS= read -r line || [ -n "$line" ]; do
    case $line in
      '#'* | '') ;;
      args:*) args=${line#args: } ;;
      stdin:*) stdin_spec=${line#stdin: } ;;
      generate:*) kind=${line#generate: } ;;
      exit:*) exit_expected=${line#exit: } ;;
      stderr-at-most:*) stderr_max=${line#stderr-at-most: } ;;
      echoes-input:*) echoes=yes ;;
      stderr:*) stderr_parts+=("${line#stderr: }") ;;
      stdout:*) stdout_parts+=("${line#stdout: }") ;;
      *) fail "$name" "cannot read the line '$line' of $expect" ;;
    esac
  done < "$expect"
  if [ -z "$exit_expected" ]; then
    fail "$name" "$expect has no 'exit:' line"
    continue
  fi

  input=''
  if [ -n "$kind" ]; then
    input="$scratch/$name.input"
    generate "$kind" "$input" || { fail "$name" "could not generate '$kind'"; continue; }
  else
    for candidate in "$catalogue/$name".*; do
      [ "$candidate" != "$expect" ] && input=$candidate
    done
  fi
  command_line=${args//\{input\}/$input}
  command_line=${command_line//\{tmp\}/$scratch}
  eval "set -- $command_line"
  stdin_file=/dev/null
  [ -n "$stdin_spec" ] && stdin_file=${stdin_spec//\{input\}/$input}

  "$program" "$@" < "$stdin_file" > "$scratch/out" 2> "$scratch/err"
  status=$?
  if [ -n "$kind" ]; then rm -f "$input"; fi

  # A sanitizer build may report and still exit 1, the status of a failed case.
  if grep -qE 'runtime error:|ERROR: (Address|Leak|UndefinedBehavior)Sanitizer' "$scratch/err"; then
    fail "$name" "a sanitizer report: $(grep -m1 -E 'runtime error:|Sanitizer' "$scratch/err")"
  fi
  [ "$status" = "$exit_expected" ] || fail "$name" "exit status $status, expected $exit_expected; stderr: $(head -c 300 "$scratch/err")"
  for part in "${stderr_parts[@]}"; do
    grep -qF -- "$part" "$scratch/err" || fail "$name" "stderr lacks '$part'; it holds: $(head -c 300 "$scratch/err")"
  done
  for part in "${stdout_parts[@]}"; do
    grep -qF -- "$part" "$scratch/out" || fail "$name" "stdout lacks '$part'"
  done
  if [ -n "$stderr_max" ] && [ "$(wc -c < "$scratch/err")" -gt "$stderr_max" ]; then
    fail "$name" "stderr holds $(wc -c < "$scratch/err") bytes, more than $stderr_max"
  fi
  if [ -z "$echoes" ] && grep -qiwE -- '-?(nan|inf|infinity)' "$scratch/out"; then
    fail "$name" "stdout holds nan or inf: $(grep -iwE -- '-?(nan|inf|infinity)' "$scratch/out" | head -3)"
  fi
done

if [ "$count" -lt 60 ]; then
  fail catalogue "only $count entries; the catalogue promises at least 60"
fi
if [ "$failures" -gt 0 ]; then
  echo "$failures of $count bad-input checks failed" >&2
  exit 1
fi
echo "all $count bad-input checks passed"
