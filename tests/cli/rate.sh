#!/usr/bin/env bash
# The rate command end to end: exit codes, stdin, -o, formats, messages.
# Run by ctest from the repository root as: bash tests/cli/rate.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"

# Every bundled example rates, exit 0, in all three formats.
for format in table json csv; do
  "$bin" rate --format "$format" examples/*.json >"$tmp/all.$format" 2>"$tmp/all.err"
  expect "examples rate as $format" $? "$(cat "$tmp/all.err")"
done
# No NaN or infinity anywhere in what the examples print.
! grep -iqE '(^|[^a-z])(nan|inf)([^a-z]|$)' "$tmp"/all.*
expect "no nan/inf in example output" $?

# The JSON carries the contract's keys for every result.
/usr/bin/python3 - "$tmp/all.json" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
keys = ["id", "status", "machine", "model", "solved_for", "inlet", "outlet", "outlet_isentropic",
        "efficiency", "head", "specific_work", "pressure_ratio", "warnings"]
size = ["mass_flow", "power", "fluid_power"]  # absent together in an unsized rating (four knowns)
for r in doc["results"]:
    missing = [k for k in keys if k not in r]
    assert not missing, (r["id"], missing)
    assert all(k in r for k in size) or not any(k in r for k in size), (r["id"], "size keys in part")
    for side in ("inlet", "outlet"):
        for k in ("pressure", "temperature", "enthalpy", "entropy", "density"):
            assert k in r[side], (r["id"], side, k)
    assert set(r["efficiency"]) >= {"isentropic", "polytropic"}
    assert set(r["head"]) >= {"isentropic", "polytropic"}
    assert r["pressure_ratio"] >= 1
    if r["machine"] == "pump":
        assert "head_height" in r and "volume_flow" in r
PY
expect "json results carry the contract keys" $?

# Uncertainties (docs/uncertainty.md): "± U" in the table with the efficiency's largest
# shares under it, the JSON's two keys, the CSV's uncertainty columns.
"$bin" rate examples/plant-air-field-test.json >"$tmp/u.txt" 2>/dev/null
grep -qF '  isentropic efficiency          0.7779 ± 0.0042               solved' "$tmp/u.txt" &&
  grep -qF '    U² from outlet temperature 57 %, inlet temperature 31 %, outlet pressure 10 %' "$tmp/u.txt" &&
  grep -qF '  outlet temperature             172.5 degC ± 0.6 K            given' "$tmp/u.txt"
expect "the table shows ± U and the shares of U²" $? "$(head -20 "$tmp/u.txt")"
"$bin" rate --format json examples/plant-air-field-test.json 2>/dev/null | /usr/bin/python3 -c '
import json, sys
r = json.load(sys.stdin)["results"][0]
assert abs(r["uncertainty"]["efficiency.isentropic"] - 0.00422) < 5e-5, r["uncertainty"]
assert r["uncertainty"]["outlet.temperature"] == 0.6
shares = r["uncertainty_contributions"]["efficiency.isentropic"]
assert shares[0]["input"] == "outlet.temperature" and abs(sum(s["share_percent"] for s in shares) - 100) < 0.3
'
expect "json carries uncertainty and uncertainty_contributions" $?
"$bin" rate --format csv examples/plant-air-field-test.json 2>/dev/null | head -1 |
  grep -qF ',uncertainty.efficiency.isentropic,uncertainty.efficiency.polytropic,'
expect "csv carries uncertainty.<key> columns" $?

# Standard input.
"$bin" rate --format json - <examples/design-cases.json >"$tmp/stdin.json"
expect "rate - reads standard input" $?
# The same results; each names where it came from.
cmp -s <(grep -v '"file":' "$tmp/stdin.json") <("$bin" rate --format json examples/design-cases.json | grep -v '"file":')
expect "stdin and file give the same output" $?
grep -q '"file": "standard input"' "$tmp/stdin.json"
expect "results from standard input say so" $?

# One bad case among good ones: exit 1, the good ones still rated, the bad one named.
cat >"$tmp/mixed.json" <<'JSON'
{"cases": [
  {"id": "good", "machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "20 degC"},
   "outlet": {"pressure": "3 bar"}, "efficiency": 0.8, "mass_flow": "1 kg/s"},
  {"id": "bad", "machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "20 degC"},
   "outlet": {"pressure": "3 degC"}, "efficiency": 0.8, "mass_flow": "1 kg/s"}
]}
JSON
"$bin" rate --format json "$tmp/mixed.json" >"$tmp/mixed.out" 2>"$tmp/mixed.err"
expect "a failed case exits 1" $([ $? -eq 1 ]; echo $?)
grep -q '"status": "ok"' "$tmp/mixed.out"
expect "the good case is still rated" $?
grep -qF 'error: case "bad": outlet.pressure: "3 degC": a temperature unit where a pressure belongs' "$tmp/mixed.err"
expect "the bad case's message names the case, the key and the unit" $? "$(cat "$tmp/mixed.err")"

# A file that is not JSON: exit 2, the file and the place named.
printf '{"cases": [\n  {"id": 1,,}\n' >"$tmp/broken.json"
"$bin" rate "$tmp/broken.json" >/dev/null 2>"$tmp/broken.err"
expect "not JSON exits 2" $([ $? -eq 2 ]; echo $?)
grep -q "broken.json: not valid JSON: parse error at line 2" "$tmp/broken.err"
expect "not-JSON message names file and line" $? "$(cat "$tmp/broken.err")"

# A missing file: exit 2.
"$bin" rate "$tmp/none.json" >/dev/null 2>"$tmp/none.err"
expect "missing file exits 2" $([ $? -eq 2 ]; echo $?)
grep -qF "none.json: cannot read the file" "$tmp/none.err"
expect "missing file message" $?

# -o writes the whole output to the file and nothing to stdout.
"$bin" rate --format json -o "$tmp/out.json" examples/design-cases.json >"$tmp/o.stdout"
expect "-o exits 0" $?
[ ! -s "$tmp/o.stdout" ] && cmp -s "$tmp/out.json" <("$bin" rate --format json examples/design-cases.json)
expect "-o file holds the results, stdout is empty" $?
# -o into a directory that does not exist: exit 2, nothing left behind.
"$bin" rate -o "$tmp/no/such/dir/out.json" examples/design-cases.json 2>"$tmp/odir.err"
expect "-o to a missing directory exits 2" $([ $? -eq 2 ]; echo $?)

# A duplicate key makes the file unusable.
printf '{"machine": "pump", "machine": "compressor"}' >"$tmp/dup.json"
"$bin" rate "$tmp/dup.json" >/dev/null 2>"$tmp/dup.err"
expect "duplicate key exits 2" $([ $? -eq 2 ]; echo $?)
grep -qF 'the key "machine" appears twice in one object; keep one' "$tmp/dup.err"
expect "duplicate key message" $?

# A misspelt key is warned about, not silently ignored.
sed 's/"mechanical_efficiency"/"mechanical_efficency"/' examples/plant-air-compressor.json >"$tmp/typo.json"
"$bin" rate --format json "$tmp/typo.json" >"$tmp/typo.out" 2>"$tmp/typo.err"
grep -qF 'unknown key \"mechanical_efficency\" ignored' "$tmp/typo.out"
expect "misspelt key warned" $?
# Warnings go to standard error too (docs/contract.md), one line each, naming the case.
grep -qxF 'warning: case "PAC-3 first stage, nameplate check 2026-11-20": unknown key "mechanical_efficency" ignored' "$tmp/typo.err"
expect "the warning is on standard error, naming the case" $? "$(cat "$tmp/typo.err")"

# US units in the table.
"$bin" rate --units us examples/plant-air-compressor.json >"$tmp/us.txt"
grep -q "psia\|psig\|degF" "$tmp/us.txt" && grep -q " hp" "$tmp/us.txt"
expect "--units us shows US units" $?

# A given value written wider than its column keeps a space before its note.
cat >"$tmp/long.json" <<'JSON'
{"machine": "turbine", "fluid": "steam", "inlet": {"pressure": "47.635 MPa", "temperature": "644.467 K"},
 "outlet": {"pressure": "14.2685 MPa", "enthalpy": "1665175.3136656282 J/kg"}, "mass_flow": "5.46 kg/s"}
JSON
"$bin" rate "$tmp/long.json" >"$tmp/long.txt" 2>/dev/null
grep -qF '  outlet enthalpy                1665175.3136656282 J/kg given' "$tmp/long.txt"
expect "a long written value and its note stay apart" $? "$(grep 'outlet enthalpy' "$tmp/long.txt")"

finish
