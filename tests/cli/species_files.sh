#!/usr/bin/env bash
# Species files users bring (--species-file), in each of the three formats the
# loader reads, through the command line.
# Run by ctest from the repository root as: bash tests/cli/species_files.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"

# The reference: built-in N2 at one state, as JSON.
"$bin" state --fluid nitrogen --pressure "2 bar" --temperature "700 K" --format json >"$tmp/ref.json"

# 1. Our own format: the N2 block of data/species.txt under another name.
awk '/^species N2$/ {on = 1} on {print} on && /^end$/ {exit}' data/species.txt | sed 's/^species N2$/species N2copy/' >"$tmp/own.txt"
echo '{"model": "nasa-polynomial", "species": "N2copy"}' >"$tmp/own-fluid.json"
"$bin" state --species-file "$tmp/own.txt" --fluid-file "$tmp/own-fluid.json" --pressure "2 bar" --temperature "700 K" \
  --format json >"$tmp/own.json" 2>"$tmp/own.err"
expect "own-format species file loads" $? "$(cat "$tmp/own.err")"
cmp -s "$tmp/own.json" "$tmp/ref.json"
expect "own-format copy of N2 gives N2's state" $?

# 2. The published NASA 9-coefficient format: the N2 record of NASA/TP-2002-211556's
#    database (figures as published), renamed.
cat >"$tmp/n2.inp" <<'INP'
N2x9              Ref-Elm. Gurvich,1978 pt1 p280 pt2 p207.                      
 3 tpis78 N   2.00    0.00    0.00    0.00    0.00 0   28.0134000          0.000
    200.000   1000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104
 2.210371497D+04-3.818461820D+02 6.082738360D+00-8.530914410D-03 1.384646189D-05
-9.625793620D-09 2.519705809D-12                 7.108460860D+02-1.076003744D+01
   1000.000   6000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104
 5.877124060D+05-2.239249073D+03 6.066949220D+00-6.139685500D-04 1.491806679D-07
-1.923105485D-11 1.061954386D-15                 1.283210415D+04-1.586640027D+01
   6000.000  20000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104
 8.310139160D+08-6.420733540D+05 2.020264635D+02-3.065092046D-02 2.486903333D-06
-9.705954110D-11 1.437538881D-15                 4.938707040D+06-1.672099740D+03
INP
echo '{"model": "nasa-polynomial", "species": "N2x9"}' >"$tmp/nasa9-fluid.json"
"$bin" state --species-file "$tmp/n2.inp" --fluid-file "$tmp/nasa9-fluid.json" --pressure "2 bar" --temperature "700 K" \
  --format json >"$tmp/nasa9.json" 2>"$tmp/nasa9.err"
expect "NASA 9-coefficient species file loads" $? "$(cat "$tmp/nasa9.err")"
cmp -s "$tmp/nasa9.json" "$tmp/ref.json"
expect "NASA 9-coefficient N2 gives N2's state" $?

# 3. A malformed record is refused naming the file and the line.
sed '3s/1000.0007/1000.0x07/' "$tmp/n2.inp" >"$tmp/bad.inp"
"$bin" state --species-file "$tmp/bad.inp" --fluid nitrogen --pressure "1 bar" --temperature "300 K" \
  >/dev/null 2>"$tmp/bad.err"
expect "a malformed species file exits 2" $([ $? -eq 2 ]; echo $?)
grep -q "bad.inp:3:" "$tmp/bad.err"
expect "the message names the file and line" $? "$(cat "$tmp/bad.err")"

finish
