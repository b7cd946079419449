#!/usr/bin/env bash
# rate POINTS.csv --case TEMPLATE.json end to end: exit codes, csv and jsonl, standard
# input, -o whole or not at all, messages, and memory that does not grow with the input.
# Run by ctest from the repository root as: bash tests/cli/batch.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"

log=examples/compressor-week-log.csv
template=examples/compressor-week-log.template.json

# The bundled week log: four spoiled rows, so exit 1, every row in its place.
"$bin" rate "$log" --case "$template" >"$tmp/week.csv" 2>"$tmp/week.err"
expect "a log with bad rows exits 1" $([ $? -eq 1 ]; echo $?)
[ "$(wc -l <"$tmp/week.csv")" -eq 10081 ]
expect "one output row per input row, and the header" $? "$(wc -l <"$tmp/week.csv")"
[ "$(grep -c ',ok,' "$tmp/week.csv")" -eq 10076 ] && [ "$(grep -c ',error,"line' "$tmp/week.csv")" -eq 4 ]
expect "10076 rows rated, 4 refused" $?
grep -qF '2026-03-05 00:01,-1.62,11.1,2.111,154.1,3121,ERR,error,"line 4323, column ""power [kW]"": ""ERR"" is not a number"' "$tmp/week.csv"
expect "a text cell is its row's error, naming line and column" $?
grep -qF 'line 7779: efficiency would be -3.188: a compressor must raise the enthalpy' "$tmp/week.csv"
expect "an impossible outlet temperature is its row's error" $?
grep -qxF 'error: 4 of 10080 rows could not be rated; each one'"'"'s "error" says why' "$tmp/week.err"
expect "standard error sums the failures up" $? "$(cat "$tmp/week.err")"
# The input columns come back as they were written, in their order.
cut -d, -f1-7 "$tmp/week.csv" | tr -d '\r' >"$tmp/week.inputs"
tr -d '\r' <"$log" | cmp -s - "$tmp/week.inputs"
expect "the input columns are echoed unchanged" $?

# Good rows only: exit 0.
head -n 101 "$log" >"$tmp/good.csv"
"$bin" rate "$tmp/good.csv" --case "$template" --quiet >"$tmp/good.out" 2>"$tmp/good.err"
expect "a clean log exits 0" $? "$(cat "$tmp/good.err")"
[ ! -s "$tmp/good.err" ]
expect "nothing on standard error for a clean log (stderr is not a terminal)" $?

# Standard input gives what the file gives; several jobs give what one gives.
"$bin" rate - --case "$template" <"$tmp/good.csv" >"$tmp/stdin.out"
cmp -s "$tmp/stdin.out" "$tmp/good.out"
expect "- reads the CSV from standard input" $?
"$bin" rate "$log" --case "$template" --jobs 1 >"$tmp/one.csv" 2>/dev/null
"$bin" rate "$log" --case "$template" --jobs 4 >"$tmp/four.csv" 2>/dev/null
cmp -s "$tmp/one.csv" "$tmp/four.csv" && cmp -s "$tmp/one.csv" "$tmp/week.csv"
expect "--jobs 1 and --jobs 4 write the same rows in the same order" $?

# JSON lines: one contract result per row.
"$bin" rate "$log" --case "$template" --format jsonl >"$tmp/week.jsonl" 2>/dev/null
expect "jsonl exits 1 too" $([ $? -eq 1 ]; echo $?)
/usr/bin/python3 - "$tmp/week.jsonl" <<'PY'
import json, sys
rows = [json.loads(line) for line in open(sys.argv[1])]
assert len(rows) == 10080, len(rows)
assert rows[0]["id"] == "2026-03-02 00:00" and rows[0]["status"] == "ok", rows[0]
assert rows[0]["solved_for"] == ["efficiency"], rows[0]["solved_for"]
assert "power_balance" in rows[0] and 0.6 < rows[0]["efficiency"]["isentropic"] < 0.9
bad = [r for r in rows if r["status"] == "error"]
assert [r["id"] for r in bad] == ["2026-03-03 01:00", "2026-03-05 00:01", "2026-03-07 09:37",
                                  "2026-03-08 06:01"], bad
assert bad[0]["error"] == 'line 1502, column "outlet.temperature [degC]": the cell is empty', bad[0]
PY
expect "jsonl rows carry the contract's result objects" $?

# US units in the result columns.
"$bin" rate "$tmp/good.csv" --case "$template" --units us >"$tmp/us.csv"
head -n 1 "$tmp/us.csv" | grep -qF 'outlet_isentropic.temperature [degF],mass_flow [lb/h]'
expect "--units us names US units in the headers" $?

# -o: the file appears whole; stdout stays empty.
"$bin" rate "$tmp/good.csv" --case "$template" -o "$tmp/out.csv" >"$tmp/o.stdout"
expect "-o exits 0" $?
[ ! -s "$tmp/o.stdout" ] && cmp -s "$tmp/out.csv" "$tmp/good.out"
expect "-o holds the results" $?
# A header that cannot be used: exit 2, the old file untouched, no temporary left.
printf 'id,inlet.pressure [degC]\n1,2\n' >"$tmp/badhead.csv"
echo "previous" >"$tmp/keep.csv"
"$bin" rate "$tmp/badhead.csv" --case "$template" -o "$tmp/keep.csv" 2>"$tmp/badhead.err"
expect "a unit of another dimension exits 2" $([ $? -eq 2 ]; echo $?)
grep -qF "badhead.csv: line 1, column 2 \"inlet.pressure [degC]\": a temperature unit where a pressure belongs" "$tmp/badhead.err"
expect "the column is named" $? "$(cat "$tmp/badhead.err")"
[ "$(cat "$tmp/keep.csv")" = "previous" ] && [ -z "$(ls "$tmp" | grep 'keep.csv.')" ]
expect "-o left the old file as it was and no temporary file" $?
# A column that names no case key (a misspelt one, a logger's tag) is carried through with a notice.
printf 'timestamp,id,inlet.presure [barg]\n08:00,1,2\n' >"$tmp/extra.csv"
"$bin" rate "$tmp/extra.csv" --case "$template" >"$tmp/extra.out" 2>"$tmp/extra.err"
grep -qxF "notice: $tmp/extra.csv: column 3 \"inlet.presure [barg]\" names no case key: carried through unchanged (did you mean inlet.pressure?)" "$tmp/extra.err"
expect "a column that names no case key gets a notice" $? "$(cat "$tmp/extra.err")"
head -n 1 "$tmp/extra.out" | grep -q '^timestamp,id,inlet.presure \[barg\],status,error,'
expect "the carried columns keep their place" $? "$(head -n 1 "$tmp/extra.out")"
# A column without a unit for a dimensional key.
printf 'id,outlet.temperature\nA,150\n' >"$tmp/nounit.csv"
"$bin" rate "$tmp/nounit.csv" --case "$template" >/dev/null 2>"$tmp/nounit.err"
expect "a pressure or temperature column without a unit exits 2" $([ $? -eq 2 ]; echo $?)
grep -qxF "error: $tmp/nounit.csv: line 1, column 2 \"outlet.temperature\": a temperature needs its unit in square brackets, as in \"outlet.temperature [degC]\"" "$tmp/nounit.err"
expect "the missing unit is named" $? "$(cat "$tmp/nounit.err")"

# The command line: a CSV without --case, a template of two cases, a table format.
"$bin" rate "$log" >/dev/null 2>"$tmp/nocase.err"
expect "a CSV without --case exits 2" $([ $? -eq 2 ]; echo $?)
grep -qxF "error: $log: a CSV file of test points needs its template case: --case TEMPLATE.json" "$tmp/nocase.err"
expect "the missing template is asked for" $? "$(cat "$tmp/nocase.err")"
"$bin" rate "$log" --case examples/plant-air-compressor.json >/dev/null 2>"$tmp/two.err"
expect "a template of two cases exits 2" $([ $? -eq 2 ]; echo $?)
grep -qxF "error: examples/plant-air-compressor.json: a template holds one case; this file holds 2" "$tmp/two.err"
expect "the template's case count is named" $? "$(cat "$tmp/two.err")"
"$bin" rate "$log" --case "$template" --format table >/dev/null 2>"$tmp/table.err"
expect "--format table with a batch exits 2" $([ $? -eq 2 ]; echo $?)
"$bin" rate "$tmp/none.csv" --case "$template" >/dev/null 2>"$tmp/none.err"
expect "a missing CSV exits 2" $([ $? -eq 2 ]; echo $?)
grep -qF "none.csv: cannot read the file: No such file or directory" "$tmp/none.err"
expect "the missing CSV is named" $? "$(cat "$tmp/none.err")"

# JSON lines for JSON case files too.
"$bin" rate --format jsonl examples/design-cases.json >"$tmp/design.jsonl"
expect "--format jsonl rates JSON case files" $?
[ "$(wc -l <"$tmp/design.jsonl")" -eq "$("$bin" rate --format json examples/design-cases.json | grep -c '"status"')" ]
expect "one jsonl line per case" $?

# Memory does not grow with the input: two million rows in well under 100 MB resident.
awk 'BEGIN {
  print "id,inlet.pressure [kPag],inlet.temperature [degC],outlet.pressure [barg],outlet.temperature [degC],mass_flow [t/h]"
  for (i = 0; i < 2000000; i++)
    printf "%d,-1.%d,%d.%d,2.1%d,1%d.%d,5.%d\n", i, i % 9, 15 + i % 10, i % 10, i % 10, 60 + i % 15, i % 10, i % 10
}' >"$tmp/big.csv"
/usr/bin/python3 - "$bin" "$tmp/big.csv" "$template" <<'PY'
import resource, subprocess, sys
binary, points, template = sys.argv[1:]
with open(points, "rb") as source:
    result = subprocess.run([binary, "rate", "-", "--case", template, "--format", "csv"],
                            stdin=source, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
peak_mb = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024  # Linux: kilobytes
print(f"2,000,000 rows: exit {result.returncode}, peak resident {peak_mb:.1f} MB")
assert result.returncode == 0, result.stderr.decode()
# Under AddressSanitizer the resident size is mostly its shadow memory and quarantine; the
# bound is checked in the plain build (the README's test command).
import os
assert os.environ.get("SHAFTWORK_SANITIZED") or peak_mb < 100, peak_mb
PY
expect "two million rows rate in under 100 MB resident" $?

# Humid air in a template by its humidity ratio alone (each row brings its inlet); a row
# whose inlet lies below the dew point of that moisture is rated and warned about. The dew
# point of W = 0.011 kg/kg at the inlet, 98.56 kPa, is about 15.1 degC (p_w = 1.713 kPa; IAPWS-IF97
# saturation, python3-iapws).
cat >"$tmp/humid.json" <<'JSON'
{"id": "humid", "machine": "blower", "fluid": {"model": "humid-air", "humidity_ratio": 0.011},
 "site": {"barometric_pressure": "1008 mbar"}, "mechanical_efficiency": 0.97}
JSON
printf 'time,inlet.pressure [inH2Og],inlet.temperature [degC],outlet.pressure [mbarg],outlet.temperature [degC]\n08:00,-9,24.0,640,87.0\n04:00,-9,12.0,640,74.0\n' >"$tmp/humid.csv"
"$bin" rate "$tmp/humid.csv" --case "$tmp/humid.json" -o "$tmp/humid-out.csv" 2>"$tmp/humid.err"
status=$?
[ "$status" -eq 0 ] && [ "$(grep -c ',ok,' "$tmp/humid-out.csv")" -eq 2 ] &&
  grep -q '^04:00,.*the inlet temperature 12 degC lies below the dew point 15\.[0-9]* degC' "$tmp/humid-out.csv" &&
  ! grep -q '^08:00,.*dew point' "$tmp/humid-out.csv"
expect "a humidity ratio in a template rates each row and warns below its dew point" $? "$(cat "$tmp/humid.err" "$tmp/humid-out.csv")"

finish
