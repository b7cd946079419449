#!/usr/bin/env bash
# shaftwork check end to end: exit codes, expectations in both tolerance forms, moved keys,
# cases missing on either side, a directory tree, --record then --baseline, --ignore,
# --rtol, and JUnit XML read back by python3-junitparser (a consumer outside the project).
# Run by ctest from the repository root as: bash tests/cli/check.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"
bin=$(realpath "$bin")  # some checks run from another directory

# run ARGS...: check with ARGS; the output in $tmp/out and $tmp/err, the status in $status.
run() {
  "$bin" check "$@" >"$tmp/out" 2>"$tmp/err"
  status=$?
}
status_is() {  # status_is NAME CODE
  expect "$1 (exit $2)" "$([ "$status" -eq "$2" ]; echo $?)" "exit $status; $(cat "$tmp/out" "$tmp/err")"
}
has_line() {  # has_line NAME FILE LINE: FILE holds exactly LINE as one of its lines
  grep -qxF -- "$3" "$2"
  expect "$1" $? "$(cat "$2")"
}
last_line_is() {  # last_line_is NAME LINE
  expect "$1" "$([ "$(tail -n 1 "$tmp/out")" = "$2" ]; echo $?)" "$(tail -n 3 "$tmp/out")"
}

# Two cases whose expected results are exact: a given outlet temperature and a given power
# come back as given (150 degC = 423.15 K; 135 kW = 135000 W), so every difference below is
# known without the property model.
compressor='"machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "20 degC"}'
write_cases() {  # write_cases FILE T1-EXPECT T2-EXPECT
  cat >"$1" <<JSON
{"cases": [
  {"id": "T1", $compressor, "outlet": {"pressure": "3 bar", "temperature": "150 degC"}, "mass_flow": "1 kg/s",
   "expect": $2},
  {"id": "T2", $compressor, "outlet": {"pressure": "3 bar", "temperature": "150 degC"}, "power": "135 kW",
   "expect": $3}
]}
JSON
}

# Exit 0: an absolute tolerance in degF (0.09 degF = 0.05 K, a difference: NIST SP 811
# B.8) allows 0.04 K; a relative one of 0.1 % allows 0.074 %.
write_cases "$tmp/pass.json" '{"outlet.temperature": {"value": "150.04 degC", "tolerance": "0.09 degF"}}' \
  '{"power": {"value": "134.9 kW", "tolerance": "0.1 %"}, "efficiency.isentropic": {"value": 0.7, "tolerance": 0.2}}'
run "$tmp/pass.json"
status_is "expectations met" 0
has_line "a passed case is one line" "$tmp/out" "passed  $tmp/pass.json: case \"T1\""
last_line_is "the last line counts the cases" "2 passed, 0 failed"

# Exit 3: 0.06 K is beyond 0.09 degF, 0.148 % beyond 0.1 %; each moved key on its own line.
write_cases "$tmp/moved.json" '{"outlet.temperature": {"value": "150.06 degC", "tolerance": "0.09 degF"}}' \
  '{"power": {"value": "134.8 kW", "tolerance": "0.1 %"}}'
run "$tmp/moved.json"
status_is "an expectation failed" 3
cat >"$tmp/moved.want" <<TEXT
failed  $tmp/moved.json: case "T1"
  outlet.temperature: now 423.15 K, expected 423.21 K (expect), difference -0.06 K (-0.0142 %), allowed 0.09 degF
failed  $tmp/moved.json: case "T2"
  power: now 135000 W, expected 134800 W (expect), difference +200 W (+0.148 %), allowed 0.1 %
0 passed, 2 failed
TEXT
cmp -s "$tmp/out" "$tmp/moved.want"
expect "moved keys: now, expected, difference and tolerance, exactly" $? "$(diff "$tmp/moved.want" "$tmp/out")"

# Exit 1 wins over 3: a case that cannot be rated, beside a moved one. Its expect block is
# not read; a wrong expect block is an error too.
cat >"$tmp/broken.json" <<JSON
{"cases": [
  {"id": "bad unit", $compressor, "outlet": {"pressure": "3 degC"}, "efficiency": 0.8, "mass_flow": "1 kg/s"},
  {"id": "bad key", $compressor, "outlet": {"pressure": "3 bar"}, "efficiency": 0.8, "expect": {"efficiency.isentropc": 0.8}},
  {"id": "unsized", $compressor, "outlet": {"pressure": "3 bar"}, "efficiency": 0.8, "expect": {"mass_flow": "1 kg/s"}},
  {"id": "bad tolerance", $compressor, "outlet": {"pressure": "3 bar"}, "efficiency": 0.8,
   "expect": {"outlet.pressure": {"value": "3 bar", "tolerance": "0.1 K"}}}
]}
JSON
run "$tmp/moved.json" "$tmp/broken.json"
status_is "a case could not be rated" 1
has_line "the case and the key are named" "$tmp/out" \
  "error   $tmp/broken.json: case \"bad unit\": outlet.pressure: \"3 degC\": a temperature unit where a pressure belongs"
has_line "an unknown expect key is named, with the one meant" "$tmp/out" \
  "error   $tmp/broken.json: case \"bad key\": expect: \"efficiency.isentropc\" is no result key; did you mean efficiency.isentropic?"
has_line "a key the result lacks is named" "$tmp/out" \
  "error   $tmp/broken.json: case \"unsized\": expect.mass_flow: the result of this case has no mass_flow"
has_line "a tolerance of the wrong dimension is named" "$tmp/out" \
  "error   $tmp/broken.json: case \"bad tolerance\": expect.outlet.pressure: tolerance: \"0.1 K\": a temperature unit where a pressure belongs"
last_line_is "errors count as failed" "0 passed, 6 failed"

# Exit 2 wins over all: a missing file (the others are still checked), a baseline that is
# not a results file, bad options.
run "$tmp/pass.json" "$tmp/nothing-here.json" "$tmp/moved.json"
status_is "a missing file" 2
has_line "the missing file is named" "$tmp/out" "error   $tmp/nothing-here.json: cannot read the file: No such file or directory"
has_line "the other files are still checked" "$tmp/out" "passed  $tmp/pass.json: case \"T2\""
run "$tmp/pass.json" --baseline "$tmp/pass.json"
status_is "a baseline that is no results file" 2
has_line "the baseline's problem is said" "$tmp/err" \
  "error: $tmp/pass.json: not a results file: expected {\"results\": [...]} as shaftwork rate --format json writes it (record one with shaftwork check --record)"
run "$tmp/pass.json" --baseline "$tmp/nothing-here.json"
status_is "a missing baseline" 2
run "$tmp/pass.json" --ignore powr
status_is "an --ignore key that is none" 2
has_line "the --ignore key is named" "$tmp/err" "error: --ignore: \"powr\" is no result key; did you mean power?"
run "$tmp/pass.json" --rtol -1
status_is "a negative --rtol" 2
has_line "the --rtol is refused plainly" "$tmp/err" "error: --rtol: expected a finite number of at least 0, got -1"
run "$tmp/pass.json" --tolerance 1
status_is "an unknown option" 2
run
status_is "no files" 2

# A directory tree: *.json below it, nested, in sorted order; a JSON file that is not a case
# file skipped with a notice; the baseline itself may live in the tree.
mkdir -p "$tmp/tree/sub/deeper"
write_cases "$tmp/tree/zz.json" '{}' '{}'
write_cases "$tmp/tree/a.json" '{}' '{}'
cp examples/design-cases.json "$tmp/tree/sub/deeper/c.json"
cp examples/cooling-water-pump.json "$tmp/tree/sub/b.JSON"
echo "not JSON, and no .json name" >"$tmp/tree/sub/readme.txt"
echo '{"note": "a fluid library, not cases"}' >"$tmp/tree/sub/fluids.json"
run "$tmp/tree" --record "$tmp/tree/sub/recorded.json"
status_is "a directory tree" 0
grep -v '^passed' "$tmp/out" >"$tmp/tree.rest"
expect "every case of the tree passed" "$([ "$(cat "$tmp/tree.rest")" = "12 passed, 0 failed" ]; echo $?)" "$(cat "$tmp/tree.rest")"
sed -E 's/: case .*//' "$tmp/out" | uniq | head -n 4 >"$tmp/tree.order"
printf 'passed  %s\n' "$tmp/tree/a.json" "$tmp/tree/sub/b.JSON" "$tmp/tree/sub/deeper/c.json" "$tmp/tree/zz.json" >"$tmp/tree.want"
cmp -s "$tmp/tree.order" "$tmp/tree.want"
expect "files in sorted order, nested ones included" $? "$(diff "$tmp/tree.want" "$tmp/tree.order")"
has_line "a JSON file that is not a case file is skipped, with a notice" "$tmp/err" \
  "notice: $tmp/tree/sub/fluids.json: not a case file (no \"cases\" and no \"machine\"), skipped"

# --record writes what rate --format json writes for the same files.
"$bin" rate --format json "$tmp/tree/a.json" "$tmp/tree/sub/b.JSON" "$tmp/tree/sub/deeper/c.json" "$tmp/tree/zz.json" >"$tmp/rated.json"
cmp -s "$tmp/rated.json" "$tmp/tree/sub/recorded.json"
expect "the record is rate's JSON" $? "$(diff "$tmp/rated.json" "$tmp/tree/sub/recorded.json" | head)"

# --record then --baseline: passes (the recorded file, in the tree, is skipped as results).
run "$tmp/tree" --baseline "$tmp/tree/sub/recorded.json"
status_is "the round trip" 0
last_line_is "every case passes against its record" "12 passed, 0 failed"
# Files are matched by name after resolving ./, // and ..: a record made over the directory
# with relative paths matches the same files named one by one in other spellings.
(cd "$tmp" && "$bin" check tree --record rel-record.json >/dev/null 2>&1 &&
  "$bin" check ./tree//a.json tree/sub/../sub/b.JSON tree/sub/deeper/c.json tree/zz.json \
    --baseline ./rel-record.json >"$tmp/rel.out" 2>&1)
expect "files named one by one match a record made from their directory" $? "$(cat "$tmp/rel.out")"

# A case missing from the baseline, and a baseline case missing from the files: exit 3.
write_cases "$tmp/tree/zz.json" '{}' '{}'
sed -i 's/"id": "T2"/"id": "T3"/' "$tmp/tree/zz.json"
run "$tmp/tree" --baseline "$tmp/tree/sub/recorded.json"
status_is "cases missing on either side" 3
cat >"$tmp/missing.want" <<TEXT
failed  $tmp/tree/zz.json: case "T3"
  not in the baseline (record it with --record once the case is reviewed)
failed  $tmp/tree/zz.json: case "T2": in the baseline, not among the cases checked
11 passed, 2 failed
TEXT
grep -v '^passed' "$tmp/out" >"$tmp/missing.out"
cmp -s "$tmp/missing.out" "$tmp/missing.want"
expect "both sides named" $? "$(diff "$tmp/missing.want" "$tmp/missing.out")"
write_cases "$tmp/tree/zz.json" '{}' '{}'

# A moved value against the baseline; --ignore and --rtol.
sed -i 's/"efficiency": 0.81/"efficiency": 0.8101/' "$tmp/tree/sub/b.JSON"
run "$tmp/tree" --baseline "$tmp/tree/sub/recorded.json"
status_is "a value moved from its record" 3
has_line "the moved efficiency, against the baseline" "$tmp/out" \
  "  efficiency.isentropic: now 0.8101, expected 0.81 (baseline), difference +0.0001 (+0.0123 %), allowed 1e-06 relative"
run "$tmp/tree" --baseline "$tmp/tree/sub/recorded.json" --rtol 2e-4
status_is "--rtol wide enough" 0
moved_keys=$(sed -n 's/^  \([a-z_.]*\): now .*/\1/p' <("$bin" check "$tmp/tree/sub/b.JSON" --baseline "$tmp/tree/sub/recorded.json" 2>/dev/null) | paste -sd, -)
run "$tmp/tree" --baseline "$tmp/tree/sub/recorded.json" --ignore "$moved_keys"
status_is "--ignore the moved keys ($moved_keys)" 0
run "$tmp/tree" --baseline "$tmp/tree/sub/recorded.json" --ignore "${moved_keys#*,}"
status_is "--ignore all but one of them" 3

# --record is refused when a case could not be rated, and never over a case file.
run "$tmp/broken.json" --record "$tmp/broken-record.json"
status_is "recording with a failed case" 1
expect "no record written" "$([ ! -e "$tmp/broken-record.json" ]; echo $?)"
has_line "the record is refused plainly" "$tmp/err" "error: $tmp/broken-record.json: not recorded, since not every case was rated"
cp "$tmp/pass.json" "$tmp/keep.json"
run "$tmp/pass.json" --record "$tmp/pass.json"
status_is "recording over a case file" 2
cmp -s "$tmp/pass.json" "$tmp/keep.json"
expect "the case file is untouched" $?

# JUnit XML, read back by python3-junitparser: one suite per file, one test per case, the
# counts of failures (moved, missing) and errors (not rated, unusable file), and ids that
# need escaping (markup characters, a control character, non-ASCII) intact.
cat >"$tmp/odd.json" <<JSON
{"cases": [
  {"id": "<b>&amp;\"quoted\" 'it' \u0001 \u00e9 \u20ac", $compressor, "outlet": {"pressure": "3 bar"}, "efficiency": 0.8},
  {"id": "T9", $compressor, "outlet": {"pressure": "3 degC"}, "efficiency": 0.8}
]}
JSON
echo '{"cases": [' >"$tmp/truncated.json"
"$bin" check "$tmp/pass.json" "$tmp/moved.json" --record "$tmp/junit-base.json" >/dev/null 2>&1
run "$tmp/moved.json" "$tmp/odd.json" "$tmp/truncated.json" --baseline "$tmp/junit-base.json" --junit "$tmp/junit.xml"
status_is "a run with every kind of outcome" 2
/usr/bin/python3 - "$tmp/junit.xml" "$tmp" <<'PY'
import sys
from junitparser import JUnitXml, Failure, Error

path, tmp = sys.argv[1], sys.argv[2]
xml = JUnitXml.fromfile(path)
suites = {s.name: s for s in xml}
want = {  # file: (tests, failures, errors)
    f"{tmp}/moved.json": (2, 2, 0),      # both expectations fail
    f"{tmp}/odd.json": (2, 1, 1),        # not in the baseline; cannot be rated
    f"{tmp}/truncated.json": (1, 0, 1),  # not valid JSON
    f"{tmp}/pass.json": (2, 2, 0),       # in the baseline, not among the cases checked
}
got = {}
for name, s in suites.items():
    results = [type(r) for c in s for r in c.result]
    got[name] = (len(list(s)), results.count(Failure), results.count(Error))
    assert (s.tests, s.failures, s.errors) == got[name], (name, s.tests, s.failures, s.errors, got[name])
assert got == want, got
assert (xml.tests, xml.failures, xml.errors) == (7, 5, 2), (xml.tests, xml.failures, xml.errors)
names = [c.name for c in suites[f"{tmp}/odd.json"]]
assert names == ["<b>&amp;\"quoted\" 'it' \\x01 \u00e9 \u20ac", "T9"], names
moved = list(suites[f"{tmp}/moved.json"])[0]
assert moved.classname == f"{tmp}/moved.json"
assert moved.result[0].message.startswith("outlet.temperature: now 423.15 K"), moved.result[0].message
assert moved.result[0].text.startswith("outlet.temperature: now 423.15 K, expected 423.21 K"), moved.result[0].text
print("junit ok")
PY
expect "JUnit XML read back with the right counts and names" $?

finish
