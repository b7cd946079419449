#!/usr/bin/env bash
# rate --plot and check --plot end to end: files named as the contract says, results
# unchanged, every picture a real SVG, PNG or PDF of the right size with its text, and
# the messages for unusable names. (tests/charts/ checks where the marks fall.)
# Run by ctest from the repository root as: bash tests/cli/plot.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"

# One case: FILE itself. Results on standard output unchanged by --plot.
/usr/bin/python3 - examples/plant-air-compressor.json "$tmp/one.json" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
json.dump(doc["cases"][0] if "cases" in doc else doc, open(sys.argv[2], "w"))
PY
"$bin" rate "$tmp/one.json" --plot "$tmp/one.png" >"$tmp/one.out" 2>"$tmp/one.err"
expect "one case plots, exit 0" $? "$(cat "$tmp/one.err")"
cmp -s "$tmp/one.out" <("$bin" rate "$tmp/one.json")
expect "results unchanged by --plot" $?
file "$tmp/one.png" | grep -q "PNG image data, 1080 x 720"
expect "one case: FILE as named, 1080 x 720 PNG" $? "$(file "$tmp/one.png")"

# Several cases: FILE-<id>.ext, one per rated case.
"$bin" rate examples/steam-turbines.json --plot "$tmp/steam.svg" >/dev/null 2>"$tmp/steam.err"
expect "three steam cases plot, exit 0" $? "$(cat "$tmp/steam.err")"
for f in "TG-2_condensing_turbine_heat-balance_check_at_100_load" "TG-2_condensing_turbine_guaranteed_efficiency" \
         "BP-1_back-pressure_turbine_feeding_the_4_barg_process_header"; do
  [ -s "$tmp/steam-$f.svg" ]
  expect "several cases: steam-$f.svg" $? "$(ls "$tmp")"
done
[ ! -e "$tmp/steam.svg" ]
expect "several cases: no FILE itself" $?
rsvg-convert -d 108 -p 108 -o "$tmp/steam.png" "$tmp/steam-TG-2_condensing_turbine_guaranteed_efficiency.svg"
file "$tmp/steam.png" | grep -q "PNG image data, 1080 x 720"
expect "the SVG rasterises to 1080 x 720 at 108 dpi" $? "$(file "$tmp/steam.png")"

# A PDF: one page per case, with its text; T-s on request.
"$bin" rate examples/steam-turbines.json --plot "$tmp/steam.pdf" --plot-diagram T-s >/dev/null 2>&1
expect "steam cases plot to one PDF" $?
pdfinfo "$tmp/steam.pdf" | grep -qE '^Pages: +3$'
expect "one page per case" $? "$(pdfinfo "$tmp/steam.pdf" | grep Pages)"
pdfinfo "$tmp/steam.pdf" | grep -qE '^Page size: +720 x 480 pts'
expect "720 x 480 pt pages" $?
pdftotext -layout "$tmp/steam.pdf" "$tmp/steam.txt"
for text in "BP-1 back-pressure turbine" "temperature T [degC]" "specific entropy s [kJ/(kg K)]" "0.7133" \
            "p1 = 41 barg"; do
  grep -qF "$text" "$tmp/steam.txt"
  expect "PDF text: $text" $?
done

# check --plot draws as rate does.
"$bin" check examples/steam-turbines.json --plot "$tmp/check.pdf" >/dev/null 2>&1
expect "check --plot: exit 0" $?
pdfinfo "$tmp/check.pdf" | grep -qE '^Pages: +3$'
expect "check --plot: one page per case" $?

# A failed case gets no chart; the others do; exit 1.
cat >"$tmp/mixed.json" <<'JSON'
{ "cases": [
  { "id": "good", "machine": "compressor", "fluid": "air",
    "inlet": { "pressure": "1 bar", "temperature": "20 degC" }, "outlet": { "pressure": "3 bar" }, "efficiency": 0.8 },
  { "id": "bad", "machine": "compressor", "fluid": "air",
    "inlet": { "pressure": "1 bar", "temperature": "20 degC" }, "outlet": { "pressure": "3 bar" } } ] }
JSON
"$bin" rate "$tmp/mixed.json" --plot "$tmp/mixed.png" >/dev/null 2>&1
expect "a failed case: exit 1" $(( $? == 1 ? 0 : 1 ))
[ -s "$tmp/mixed-good.png" ] && [ ! -e "$tmp/mixed-bad.png" ]
expect "a failed case: no chart, the good one drawn" $? "$(ls "$tmp")"

# Unusable names: exit 2 before rating, nothing written.
"$bin" rate "$tmp/one.json" --plot "$tmp/one.jpg" >"$tmp/jpg.out" 2>"$tmp/jpg.err"
status=$?
expect "--plot .jpg: exit 2" $(( status == 2 ? 0 : 1 ))
[ "$(cat "$tmp/jpg.err")" = "error: $tmp/one.jpg: a picture is written as .svg, .png or .pdf; this name ends in \".jpg\"" ]
expect "--plot .jpg: the message" $? "$(cat "$tmp/jpg.err")"
[ ! -s "$tmp/jpg.out" ]
expect "--plot .jpg: no results" $?
"$bin" rate "$tmp/one.json" --plot "$tmp/one.json.pdf" --plot-diagram p-v >/dev/null 2>"$tmp/pv.err"
expect "--plot-diagram p-v: exit 2" $(( $? == 2 ? 0 : 1 ))
grep -q "p-v not in {h-s,T-s}" "$tmp/pv.err"
expect "--plot-diagram p-v: the choices named" $? "$(cat "$tmp/pv.err")"
"$bin" rate "$tmp/one.json" --plot "$tmp/no/such/dir.png" >/dev/null 2>"$tmp/dir.err"
expect "--plot into a missing directory: exit 2" $(( $? == 2 ? 0 : 1 ))
grep -q "^error: $tmp/no/such/dir.png: " "$tmp/dir.err"
expect "--plot into a missing directory: the file named" $? "$(cat "$tmp/dir.err")"

# --report: one A4 page per case, failed ones too, with the caution; a name not .pdf refused.
"$bin" rate examples/steam-turbines.json "$tmp/mixed.json" --report "$tmp/report.pdf" >"$tmp/report.out" 2>/dev/null
expect "--report with a failed case: exit 1" $(( $? == 1 ? 0 : 1 ))
cmp -s "$tmp/report.out" <("$bin" rate examples/steam-turbines.json "$tmp/mixed.json" 2>/dev/null)
expect "results unchanged by --report" $?
pdfinfo "$tmp/report.pdf" | grep -qE '^Pages: +5$'
expect "--report: a page per case (3 + 2)" $? "$(pdfinfo "$tmp/report.pdf" | grep Pages)"
pdfinfo "$tmp/report.pdf" | grep -qF 'Page size:       595.28 x 841.89 pts (A4)'
expect "--report: A4 pages" $?
pdftotext -layout "$tmp/report.pdf" "$tmp/report.txt"
for text in "TG-2 condensing turbine, guaranteed efficiency" "isentropic efficiency" "Caution" \
            "never replace, the governing test codes" "Property model: iapws-if97" "Not rated" "too few knowns"; do
  grep -qF "$text" "$tmp/report.txt"
  expect "report text: $text" $?
done
[ "$(grep -c "^Caution" "$tmp/report.txt")" = 5 ]
expect "the caution on every page" $?
"$bin" check examples/steam-turbines.json --report "$tmp/check-report.pdf" >/dev/null 2>&1
pdfinfo "$tmp/check-report.pdf" | grep -qE '^Pages: +3$'
expect "check --report: a page per case" $?
"$bin" rate "$tmp/one.json" --report "$tmp/report.png" >"$tmp/rpng.out" 2>"$tmp/rpng.err"
expect "--report .png: exit 2" $(( $? == 2 ? 0 : 1 ))
[ "$(cat "$tmp/rpng.err")" = "error: $tmp/report.png: a report is written as .pdf" ] && [ ! -s "$tmp/rpng.out" ]
expect "--report .png: the message, no results" $? "$(cat "$tmp/rpng.err")"

# Guarantees. A file's test: FILE-<file's stem>-guarantee beside the cases' charts, the
# results and grade 1B's exit 3 unchanged by --plot.
p12=examples/guarantees/pump-test-stand-grade-1b.json
"$bin" rate "$p12" --plot "$tmp/p12.png" >"$tmp/p12.out" 2>"$tmp/p12.err"
expect "a guarantee not met plots, exit 3" $(( $? == 3 ? 0 : 1 )) "$(cat "$tmp/p12.err")"
cmp -s "$tmp/p12.out" <("$bin" rate "$p12" 2>/dev/null)
expect "results unchanged by --plot with a guarantee" $?
file "$tmp/p12-pump-test-stand-grade-1b-guarantee.png" | grep -q "PNG image data, 1080 x 720"
expect "a file's test: FILE-<stem>-guarantee.png, 1080 x 720" $? "$(ls "$tmp")"
[ -s "$tmp/p12-P-12_stand_test_point_5.png" ] && [ "$(ls "$tmp" | grep -c '^p12-.*\.png$')" = 6 ]
expect "a file's test: the five process charts and the guarantee chart" $? "$(ls "$tmp")"
"$bin" rate examples/guarantees/pump-test-stand-grade-2b.json --plot "$tmp/p12.pdf" >/dev/null 2>&1
expect "a guarantee met plots, exit 0" $?
pdfinfo "$tmp/p12.pdf" | grep -qE '^Pages: +6$'
expect "a file's test: its page after the five cases'" $? "$(pdfinfo "$tmp/p12.pdf" | grep Pages)"
pdftotext -layout -f 6 -l 6 "$tmp/p12.pdf" "$tmp/p12.txt"
for text in "test of pump-test-stand-grade-2b.json" "PASS" "guarantee met" "pump head [m]" "tolerance cross"; do
  grep -qF "$text" "$tmp/p12.txt"
  expect "guarantee page text: $text" $? "$(cat "$tmp/p12.txt")"
done

# A case's own guarantee: FILE and FILE-guarantee.ext for one case, FILE-<id>-guarantee.ext for
# several; a turbine's guarantee draws no chart.
/usr/bin/python3 - examples/guarantees/plant-air-97-percent-speed.json "$tmp" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
# Point 2, the one within 5 % of the guaranteed flow, twice: a case's own guarantee is judged on it alone.
cases = [dict(doc["cases"][1], guarantee=doc["guarantee"], id=f"PAC-3 run {n}") for n in (1, 2)]
json.dump(cases[0], open(sys.argv[2] + "/own.json", "w"))
json.dump({"cases": cases}, open(sys.argv[2] + "/own2.json", "w"))
PY
"$bin" rate "$tmp/own.json" --plot "$tmp/own.svg" >/dev/null 2>"$tmp/own.err"
expect "a case with its own guarantee plots, exit 0" $? "$(cat "$tmp/own.err")"
rsvg-convert -d 108 -p 108 -o "$tmp/own-guarantee.raster.png" "$tmp/own-guarantee.svg" && [ -s "$tmp/own.svg" ]
expect "one case: FILE and FILE-guarantee.svg" $? "$(ls "$tmp")"
file "$tmp/own-guarantee.raster.png" | grep -q "PNG image data, 1080 x 720"
expect "the guarantee SVG rasterises to 1080 x 720" $?
"$bin" rate "$tmp/own2.json" --plot "$tmp/own2.png" >/dev/null 2>&1
[ -s "$tmp/own2-PAC-3_run_1-guarantee.png" ] && [ -s "$tmp/own2-PAC-3_run_2-guarantee.png" ] && [ -s "$tmp/own2-PAC-3_run_2.png" ]
expect "several cases: FILE-<id>-guarantee.png each" $? "$(ls "$tmp")"
"$bin" rate examples/guarantees/back-pressure-turbine.json --plot "$tmp/bp.png" >/dev/null 2>&1
expect "turbine guarantees plot, exit 0" $?
[ "$(ls "$tmp" | grep -c '^bp-')" = 2 ] && ! ls "$tmp" | grep -q '^bp-.*guarantee'
expect "a turbine's guarantee: no guarantee chart" $? "$(ls "$tmp")"

# --report: a page after a case with a guarantee chart, and one for a file's test, judged or not.
"$bin" rate "$tmp/own.json" "$p12" examples/guarantees/back-pressure-turbine.json --report "$tmp/g.pdf" >/dev/null 2>&1
expect "--report with guarantees: exit 3" $(( $? == 3 ? 0 : 1 ))
pdfinfo "$tmp/g.pdf" | grep -qE '^Pages: +10$'
expect "--report: 1 + 1, 5 + 1, 2 pages" $? "$(pdfinfo "$tmp/g.pdf" | grep Pages)"
/usr/bin/python3 - "$p12" "$tmp/far.json" <<'PY'
import json, sys
doc = json.load(open(sys.argv[1]))
doc["guarantee"]["volume_flow"] = "600 m3/h"
json.dump(doc, open(sys.argv[2], "w"))
PY
"$bin" rate "$tmp/far.json" --report "$tmp/far.pdf" --plot "$tmp/far.png" >/dev/null 2>&1
expect "a guarantee not judged: exit 1" $(( $? == 1 ? 0 : 1 ))
pdftotext -layout -f 6 -l 6 "$tmp/far.pdf" "$tmp/far.txt"
grep -qF "Not judged" "$tmp/far.txt" && grep -qF "beyond the converted test flows" "$tmp/far.txt"
expect "a test not judged: its page says why" $? "$(cat "$tmp/far.txt")"
! ls "$tmp" | grep -q '^far-.*guarantee'
expect "a test not judged: no guarantee chart" $? "$(ls "$tmp")"

# A batch: one chart of the whole log, against the id column's timestamps; its 4 bad rows
# give exit 1, the results are those without --plot.
week=(examples/compressor-week-log.csv --case examples/compressor-week-log.template.json --quiet)
"$bin" rate "${week[@]}" --plot "$tmp/week.png" >"$tmp/week.csv" 2>"$tmp/week.err"
expect "batch --plot: exit 1 for its failed rows" $(( $? == 1 ? 0 : 1 )) "$(cat "$tmp/week.err")"
cmp -s "$tmp/week.csv" <("$bin" rate "${week[@]}" 2>/dev/null)
expect "batch results unchanged by --plot" $?
file "$tmp/week.png" | grep -q "PNG image data, 1080 x 720"
expect "batch --plot: a 1080 x 720 PNG" $? "$(file "$tmp/week.png")"
"$bin" rate "${week[@]}" --plot "$tmp/week.pdf" >/dev/null 2>&1
pdfinfo "$tmp/week.pdf" | grep -qE '^Pages: +1$'
expect "batch --plot PDF: one page" $?
pdftotext -layout "$tmp/week.pdf" "$tmp/week.txt"
for text in "PAC-3 first stage, week log template" 'time (column "id")' "10080" "10076" "failed row" \
            "efficiency [-]" "power balance diff. [%]" "03-04"; do
  grep -qF "$text" "$tmp/week.txt"
  expect "batch PDF text: $text" $? "$(cat "$tmp/week.txt")"
done
"$bin" rate "${week[@]}" --plot "$tmp/week.gif" >"$tmp/gif.out" 2>"$tmp/gif.err"
expect "batch --plot .gif: exit 2" $(( $? == 2 ? 0 : 1 ))
[ "$(cat "$tmp/gif.err")" = "error: $tmp/week.gif: a picture is written as .svg, .png or .pdf; this name ends in \".gif\"" ] && [ ! -s "$tmp/gif.out" ]
expect "batch --plot .gif: the message, no results" $? "$(cat "$tmp/gif.err")"
"$bin" rate "${week[@]}" --report "$tmp/week-report.pdf" >/dev/null 2>"$tmp/rep.err"
expect "batch --report: exit 2" $(( $? == 2 ? 0 : 1 ))
[ "$(cat "$tmp/rep.err")" = "error: --report writes the cases of JSON case files; a batch of test points draws its chart with --plot FILE" ]
expect "batch --report: the message" $? "$(cat "$tmp/rep.err")"

finish
