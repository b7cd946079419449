#!/usr/bin/env bash
# Batch rating speed (issues 5 and 17): a NASA-air compressor log, CSV to CSV, end to end,
# beside awk and python3-pandas computing only the constant-cp closed form over the
# same file. docs/performance.md records the results.
#
#   bench/batch_compare.sh [path/to/shaftwork] [rows]      (defaults: build/shaftwork, 1000000)
#   REPEATS=7 PANDAS=0 bench/batch_compare.sh build/shaftwork 400000
#
# The log (bench/compressor_log.awk, awk, fixed seed): inlet 15-30 degC at -20..+20 mbar gauge,
# outlet 6-8 barg, an outlet temperature from an isentropic efficiency of 0.78-0.84,
# 5-6 t/h. shaftwork solves efficiency and power on NASA-polynomial air (inverse
# entropy solve, polytropic efficiency from s°(T)) and writes 13 result columns; awk
# and pandas compute the constant-cp isentropic efficiency and power only:
#   eta = T1 ((p2/p1)^((k-1)/k) - 1) / (T2 - T1),  P = m cp (T2 - T1) / eta_m.
# Each tool reads the file and writes its CSV to a file in the same directory. The runs
# are paired: each round runs every tool once, in turn, so that a busy machine slows them
# alike; the figures are medians over `REPEATS` rounds (default 5) of the wall time and
# the CPU time (user + system) from bench/timed_run.py, whose peak resident memory is shown too;
# "awk/this" is the median over rounds of awk's time over the tool's in the same round.
# Tools: shaftwork with all cores, with --jobs 1, with --columns efficiency.isentropic,power;
# awk; pandas unless PANDAS=0.
source "$(dirname "$0")/batch_log.bash"
source "$(dirname "$0")/paired_rounds.bash"
repeats=${REPEATS:-5}
pandas=${PANDAS:-1}

cat >"$work/closed_form.awk" <<'AWK'
# Constant-cp air (k = 1.4, cp = 1005 J/(kg K)), barometer 99.1 kPa, eta_m 0.975.
BEGIN { FS = ","; OFS = ","; e = 0.4 / 1.4 }
NR == 1 { print $0, "efficiency.isentropic", "power [kW]"; next }
{
  p1 = $2 * 1e5 + 99100; T1 = $3 + 273.15; p2 = $4 * 1e5 + 99100; T2 = $5 + 273.15; m = $6 / 3.6
  eta = T1 * (exp(log(p2 / p1) * e) - 1) / (T2 - T1)
  print $0, eta, m * 1005 * (T2 - T1) / 0.975 / 1000
}
AWK

cat >"$work/closed_form.py" <<'PY'
import sys
import numpy as np
import pandas as pd
df = pd.read_csv(sys.argv[1])
p1 = df["inlet.pressure [barg]"].to_numpy() * 1e5 + 99100.0
T1 = df["inlet.temperature [degC]"].to_numpy() + 273.15
p2 = df["outlet.pressure [barg]"].to_numpy() * 1e5 + 99100.0
T2 = df["outlet.temperature [degC]"].to_numpy() + 273.15
m = df["mass_flow [t/h]"].to_numpy() / 3.6
df["efficiency.isentropic"] = T1 * (np.power(p2 / p1, 0.4 / 1.4) - 1.0) / (T2 - T1)
df["power [kW]"] = m * 1005.0 * (T2 - T1) / 0.975 / 1000.0
df.to_csv(sys.argv[2], index=False)
PY

# Each tool: a name and its command line.
names=("shaftwork (NASA air, all cores)" "shaftwork --jobs 1" "shaftwork --columns efficiency.isentropic,power"
       "awk (constant-cp closed form only)")
commands=("'$bin' rate '$work/log.csv' --case '$work/template.json' --quiet -o '$work/shaftwork.csv'"
          "'$bin' rate '$work/log.csv' --case '$work/template.json' --quiet --jobs 1 -o '$work/shaftwork1.csv'"
          "'$bin' rate '$work/log.csv' --case '$work/template.json' --quiet --columns efficiency.isentropic,power -o '$work/narrow.csv'"
          "awk -f '$work/closed_form.awk' '$work/log.csv' >'$work/awk.csv'")
if [ "$pandas" = 1 ]; then
  names+=("pandas+numpy (constant-cp closed form only)")
  commands+=("/usr/bin/python3 '$work/closed_form.py' '$work/log.csv' '$work/pandas.csv'")
fi

paired_rounds "$repeats" "$work/times" "${commands[@]}"

# Every row rated, and the same output whatever the number of threads.
ok_rows=$(grep -c ',ok,' "$work/shaftwork.csv" || true)
cmp -s "$work/shaftwork.csv" "$work/shaftwork1.csv" || { echo "jobs 1 and default differ" >&2; exit 1; }

echo "machine:  $(lscpu | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg)"
echo "compiler: $(c++ --version | head -n 1)"
echo "awk:      $(readlink -f "$(command -v awk)")"
if [ "$pandas" = 1 ]; then
  echo "pandas:   $(/usr/bin/python3 -c 'import pandas, numpy; print("pandas", pandas.__version__, "numpy", numpy.__version__)')"
fi
echo "rows:     $rows ($ok_rows rated by shaftwork), medians of $repeats paired rounds"
echo
# Medians per tool, and awk's wall and CPU time over each tool's, the median of the rounds'
# ratios (each round's runs one after another, so that the host's drifting speed cancels).
for i in "${!names[@]}"; do
  awk -v i="$i" '$1 == i { print $2, $3 + $4, $5 }' "$work/times" >"$work/t$i"
done
printf "%-50s %8s %8s %12s %8s %10s %10s\n" "tool" "wall s" "CPU s" "rows/s" "RSS MB" "awk/this" "awk CPU/"
for i in "${!names[@]}"; do
  wall=$(cut -d' ' -f1 "$work/t$i" | median)
  cpu=$(cut -d' ' -f2 "$work/t$i" | median)
  rss=$(cut -d' ' -f3 "$work/t$i" | median)
  lead=$(paired_ratio "$work/times" "${#names[@]}" 3 "$i" 2)
  lead_cpu=$(paired_ratio "$work/times" "${#names[@]}" 3 "$i" 3)
  awk -v n="${names[$i]}" -v w="$wall" -v c="$cpu" -v m="$rss" -v rows="$rows" -v l="$lead" -v lc="$lead_cpu" \
    'BEGIN { printf "%-50s %8.3f %8.3f %12.0f %8.1f %10.2f %10.2f\n", n, w, c, rows / w, m / 1024, l, lc }'
done
