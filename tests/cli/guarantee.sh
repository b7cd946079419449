#!/usr/bin/env bash
# Guarantees from the command line: the verdicts of the examples, exit status 3 for a
# guarantee not met and its order among the others (2, 1, 3, 0), the "test" object,
# and a batch judged row by row against its template's guarantee.
# Run by ctest from the repository root as: bash tests/cli/guarantee.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"
dir=examples/guarantees

status_of() { "$bin" rate "$@" >/dev/null 2>&1; echo $?; }

[ "$(status_of "$dir/plant-air-97-percent-speed.json")" -eq 0 ]
expect "the plant-air compressor meets its nameplate: exit 0" $?
[ "$(status_of "$dir/back-pressure-turbine.json")" -eq 0 ]
expect "the turbines meet their guarantees: exit 0" $?
[ "$(status_of "$dir/pump-test-stand-grade-2b.json")" -eq 0 ]
expect "the pump meets grade 2B: exit 0" $?
[ "$(status_of "$dir/pump-test-stand-grade-1b.json")" -eq 3 ]
expect "the pump misses grade 1B: exit 3" $?

# The file-level verdict beside the results, as the contract shapes it.
"$bin" rate --format json "$dir/pump-test-stand-grade-1b.json" >"$tmp/pump.json"
/usr/bin/python3 - "$tmp/pump.json" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
test = doc["test"]
assert test["file"].endswith("pump-test-stand-grade-1b.json"), test["file"]
g = test["guarantee"]
assert g["verdict"] == "fail", g["verdict"]
checks = {c["quantity"]: c for c in g["checks"]}
assert set(checks) == {"volume_flow", "head_height", "pump_efficiency", "power"}, set(checks)
assert checks["head_height"]["tolerance_percent"] == [-3.0, 3.0]
assert checks["head_height"]["tolerance_from"] == "ISO 9906:2012 grade 1B"
assert checks["head_height"]["verdict"] == "fail" and checks["power"]["verdict"] == "pass"
for c in g["checks"]:
    assert set(c) >= {"quantity", "guaranteed", "converted", "deviation_percent", "tolerance_percent", "verdict"}
assert all(s["within"] for s in g["similarity"])
assert len(doc["results"]) == 5 and all(r["status"] == "ok" for r in doc["results"])
PY
expect "json: the test object beside the results" $?

# The order 2, 1, 3, 0: a case that cannot be rated, or a guarantee that cannot be
# judged, outranks a guarantee not met; an unusable file outranks both.
/usr/bin/python3 - "$dir/plant-air-97-percent-speed.json" "$tmp" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
out = sys.argv[2]
doc["guarantee"]["power"] = "200 kW"  # the test needs 239 kW: not met
json.dump(doc, open(out + "/fails.json", "w"))
broken = json.loads(json.dumps(doc))
broken["cases"].append({"id": "bad", "machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar"}})
json.dump(broken, open(out + "/fails-and-bad-case.json", "w"))
unjudged = json.loads(json.dumps(doc))
del unjudged["guarantee"]["standard_volume_flow"]
json.dump(unjudged, open(out + "/unjudged.json", "w"))
PY
[ "$(status_of "$tmp/fails.json")" -eq 3 ]
expect "a guarantee not met: exit 3" $?
[ "$(status_of "$tmp/fails-and-bad-case.json")" -eq 1 ]
expect "a case not rated outranks a guarantee not met: exit 1" $?
[ "$(status_of "$tmp/fails.json" "$tmp/no-such-file.json")" -eq 2 ]
expect "an unusable file outranks a guarantee not met: exit 2" $?
"$bin" rate "$tmp/unjudged.json" >/dev/null 2>"$tmp/unjudged.err"
[ $? -eq 1 ] && grep -qxF "error: $tmp/unjudged.json: guarantee: no flow: a compressor guarantee is read at its guaranteed flow; give mass_flow, volume_flow or standard_volume_flow" "$tmp/unjudged.err"
expect "a guarantee that cannot be judged: exit 1 and its message" $? "$(cat "$tmp/unjudged.err")"
"$bin" rate "$tmp/fails.json" >"$tmp/fails.txt" 2>/dev/null
grep -qE '^    shaft power +[0-9.]+ kW +[0-9.]+ kW +200 kW +<= \+4 % +\+[0-9.]+ % +fail$' "$tmp/fails.txt"
expect "table: the failing line reads at a glance" $? "$(grep 'shaft power' "$tmp/fails.txt")"

# A pump's guarantee inlet must be a liquid: 120 degC at the test's 1.05 bar is steam.
/usr/bin/python3 - "$dir/pump-test-stand-grade-2b.json" "$tmp/hot.json" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
doc["guarantee"]["inlet"] = {"temperature": "120 degC"}
json.dump(doc, open(sys.argv[2], "w"))
PY
"$bin" rate "$tmp/hot.json" >/dev/null 2>"$tmp/hot.err"
[ $? -eq 1 ] && grep -qxF "error: $tmp/hot.json: guarantee: inlet: the guarantee's inlet (105 kPa, 393.15 K) is not a liquid; give the inlet pressure of the guarantee point as well as its temperature" "$tmp/hot.err"
expect "a pump guarantee at a vapour inlet: exit 1 and its message" $? "$(cat "$tmp/hot.err")"

# A batch: each row of the week's log judged against the template's guarantee.
/usr/bin/python3 - examples/compressor-week-log.template.json "$tmp/template.json" <<'PY'
import json, sys
t = json.load(open(sys.argv[1]))
t["guarantee"] = {"standard_volume_flow": "3100 Nm3/h", "inlet": {"temperature": "11 degC"},
                  "efficiency": {"polytropic": "82.5 %"}, "tolerances": {"efficiency.polytropic": {"min": "-1 %"}}}
json.dump(t, open(sys.argv[2], "w"))
PY
head -n 4 examples/compressor-week-log.csv >"$tmp/log.csv"
"$bin" rate "$tmp/log.csv" --case "$tmp/template.json" >"$tmp/log.out" 2>"$tmp/log.err"
status=$?
head -n 1 "$tmp/log.out" | grep -qF ",guarantee.verdict,guarantee.efficiency.polytropic.converted,guarantee.efficiency.polytropic.deviation_percent,guarantee.efficiency.polytropic.verdict,guarantee.error,warnings"
expect "batch: the guarantee's columns" $? "$(head -n 1 "$tmp/log.out")"
[ "$(grep -c ',fail,' "$tmp/log.out")" -eq 3 ] && [ $status -eq 3 ] && grep -qxF "3 of 3 rows do not meet the guarantee" "$tmp/log.err"
expect "batch: rows below the guaranteed efficiency fail, exit 3" $? "status $status; $(cat "$tmp/log.err")"

finish
