#!/usr/bin/env bash
# No abort, ever: inputs and limits that once ended the program with a signal (exit 134 or
# 139) now end it with a message and an exit status. The bad-input catalogue holds the
# inputs that need no special surroundings (deep-nesting, deep-fluid,
# turbine-outlet-beyond-range); this script holds those that do: a small stack, a thread
# count beyond the machine, and too little address space to start the threads.
# Run by ctest from the repository root as: bash tests/cli/no_abort.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"

log=examples/compressor-week-log.csv
template=examples/compressor-week-log.template.json
depth_refusal='arrays and objects nested more than 64 levels deep; no shaftwork input needs more than ten'

# 5000 nested objects under "fluid", read with a 256 kB stack: segfaulted before the
# nesting limit (nlohmann's dump() recursed once per level for the error message).
{
  printf '{"machine": "compressor", "fluid": '
  for _ in $(seq 5000); do printf '{"a": '; done
  printf '1'
  for _ in $(seq 5000); do printf '}'; done
  printf ', "inlet": {"pressure": "1 bar", "temperature": "300 K"}}\n'
} >"$tmp/deep.json"
(ulimit -s 256 && exec "$bin" rate "$tmp/deep.json") >"$tmp/deep.out" 2>"$tmp/deep.err"
status=$?
expect "5000 levels with a 256 kB stack exit 2" $([ $status -eq 2 ]; echo $?) "(exit $status)"
[ "$(cat "$tmp/deep.err")" = "error: $tmp/deep.json: $depth_refusal" ]
expect "and say the nesting is too deep, naming the file" $? "$(head -c 300 "$tmp/deep.err")"
(ulimit -s 256 && exec "$bin" rate examples/design-cases.json) >/dev/null 2>&1
expect "a 256 kB stack still rates the design cases" $?

# --jobs 0: a plain message, not the range of a double.
"$bin" rate "$log" --case "$template" --jobs 0 >/dev/null 2>"$tmp/jobs0.err"
expect "--jobs 0 exits 2" $([ $? -eq 2 ]; echo $?)
[ "$(head -n 1 "$tmp/jobs0.err")" = '--jobs: expected a whole number of threads, at least 1; got "0"' ]
expect "--jobs 0 says what --jobs takes" $? "$(head -c 300 "$tmp/jobs0.err")"
"$bin" rate "$log" --case "$template" --jobs 2.5 >/dev/null 2>"$tmp/jobs-frac.err"
[ "$(head -n 1 "$tmp/jobs-frac.err")" = '--jobs: expected a whole number of threads, at least 1; got "2.5"' ]
expect "--jobs 2.5 likewise" $? "$(head -c 300 "$tmp/jobs-frac.err")"

# --jobs 100000 (and beyond unsigned): capped at 4 threads a core, with a warning; the
# results are those of one thread.
cores=$(nproc)
"$bin" rate "$log" --case "$template" --jobs 1 >"$tmp/one.csv" 2>/dev/null
for asked in 100000 99999999999999999999; do
  "$bin" rate "$log" --case "$template" --jobs "$asked" -o "$tmp/many.csv" 2>"$tmp/many.err"
  status=$?
  expect "--jobs $asked rates the log (exit 1: its four spoilt rows)" $([ $status -eq 1 ]; echo $?) "(exit $status)"
  grep -qxF "warning: --jobs: at most $((4 * cores)) threads are used on $cores cores (4 a core); rating with $((4 * cores))" "$tmp/many.err"
  expect "--jobs $asked is capped with a warning" $? "$(head -c 300 "$tmp/many.err")"
  cmp -s "$tmp/many.csv" "$tmp/one.csv"
  expect "--jobs $asked writes what one thread writes" $?
done

# Too little address space for the threads asked for (each one reserves its stack):
# std::thread threw std::system_error, which aborted the program and left the temporary
# output file behind. Now the batch runs on the threads that started, with a warning, or
# (when even memory for the rows runs out) stops with "out of memory" and exit 2. The
# limits tried span both; some must start fewer threads than asked.
if ( (ulimit -v 400000 && exec "$bin" --version) ) >/dev/null 2>&1; then  # the outer shell reports an abort, silenced
  fewer=0
  for kb in 400000 200000 120000 80000 60000 50000 40000 30000 20000 15000; do
    # Below some limit the dynamic loader cannot map the shared libraries (Cairo's fonts
    # and image libraries among them) and the program never starts: nothing of ours to check.
    if ! ( (ulimit -v "$kb" && exec "$bin" --version) ) >/dev/null 2>&1; then
      echo "ulimit -v $kb: the program cannot load its shared libraries under this limit; skipped"
      continue
    fi
    (ulimit -s 8192 -v "$kb" && exec "$bin" rate "$log" --case "$template" --jobs 8 -o "$tmp/limited.csv") \
      >/dev/null 2>"$tmp/limited.err"
    status=$?
    case $status in
      1)
        cmp -s "$tmp/limited.csv" "$tmp/one.csv"
        expect "ulimit -v $kb: the batch written whole" $?
        grep -qE '^warning: the system started [1-7] of the 8 threads asked for; the batch was rated on [1-7]$' \
          "$tmp/limited.err" && fewer=$((fewer + 1))
        ;;
      2)
        [ "$(cat "$tmp/limited.err")" = "error: out of memory" ]
        expect "ulimit -v $kb: exit 2 says out of memory" $? "$(head -c 300 "$tmp/limited.err")"
        ;;
      *) expect "ulimit -v $kb: exit 1 or 2" 1 "(exit $status: $(head -c 300 "$tmp/limited.err"))" ;;
    esac
    [ -z "$(find "$tmp" -name 'limited.csv?*')" ]
    expect "ulimit -v $kb: no temporary file left" $? "$(find "$tmp" -name 'limited.csv?*')"
  done
  expect "some limit started fewer threads than asked, and said so" $([ "$fewer" -gt 0 ]; echo $?)
else
  echo "skipped the ulimit -v checks: this build cannot run under ulimit -v (a sanitizer build reserves terabytes)"
fi

finish
