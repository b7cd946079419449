#!/usr/bin/env bash
# Batch rating speed (issue 5): a NASA-air compressor log, CSV to CSV, end to end,
# beside awk and python3-pandas computing only the constant-cp closed form over the
# same file. docs/performance.md records the results.
#
#   bench/batch_compare.sh [path/to/shaftwork] [rows]      (defaults: build/shaftwork, 1000000)
#
# The log (bench/compressor_log.awk, awk, fixed seed): inlet 15-30 degC at -20..+20 mbar gauge,
# outlet 6-8 barg, an outlet temperature from an isentropic efficiency of 0.78-0.84,
# 5-6 t/h. shaftwork solves efficiency and power on NASA-polynomial air (inverse
# entropy solve, polytropic efficiency from s°(T)) and writes 13 result columns; awk
# and pandas compute the constant-cp isentropic efficiency and power only:
#   eta = T1 ((p2/p1)^((k-1)/k) - 1) / (T2 - T1),  P = m cp (T2 - T1) / eta_m.
# Each tool reads the file and writes its CSV to a file in the same directory; the
# time is wall-clock from start to exit, best of `repeats` runs.
source "$(dirname "$0")/batch_log.bash"
repeats=${REPEATS:-3}

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

# best_of COMMAND...: the shortest wall time of `repeats` runs, in seconds.
best_of() {
  local best=""
  for _ in $(seq "$repeats"); do
    local start end
    start=$(date +%s.%N)
    "$@" >/dev/null
    end=$(date +%s.%N)
    best=$(awk -v s="$start" -v e="$end" -v b="$best" 'BEGIN { t = e - s; print (b == "" || t < b) ? t : b }')
  done
  echo "$best"
}

t_shaftwork=$(best_of "$bin" rate "$work/log.csv" --case "$work/template.json" --quiet -o "$work/shaftwork.csv")
t_shaftwork_1=$(best_of "$bin" rate "$work/log.csv" --case "$work/template.json" --quiet --jobs 1 -o "$work/shaftwork1.csv")
t_awk=$(best_of sh -c "awk -f '$work/closed_form.awk' '$work/log.csv' >'$work/awk.csv'")
t_pandas=$(best_of /usr/bin/python3 "$work/closed_form.py" "$work/log.csv" "$work/pandas.csv")

# Every row rated, and the same output whatever the number of threads.
ok_rows=$(grep -c ',ok,' "$work/shaftwork.csv" || true)
cmp -s "$work/shaftwork.csv" "$work/shaftwork1.csv" || { echo "jobs 1 and default differ" >&2; exit 1; }

echo "machine:  $(lscpu | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores"
echo "compiler: $(c++ --version | head -n 1)"
echo "awk:      $(readlink -f "$(command -v awk)")"
echo "pandas:   $(/usr/bin/python3 -c 'import pandas, numpy; print("pandas", pandas.__version__, "numpy", numpy.__version__)')"
echo "rows:     $rows ($ok_rows rated by shaftwork), best of $repeats runs"
echo
awk -v rows="$rows" -v s="$t_shaftwork" -v s1="$t_shaftwork_1" -v a="$t_awk" -v p="$t_pandas" 'BEGIN {
  printf "%-44s %8s %14s %10s\n", "tool", "seconds", "rows/s", "shaftwork x"
  printf "%-44s %8.3f %14.0f %10s\n", "shaftwork (NASA air, all cores)", s, rows / s, "1.00"
  printf "%-44s %8.3f %14.0f %10.2f\n", "shaftwork --jobs 1", s1, rows / s1, s1 / s
  printf "%-44s %8.3f %14.0f %10.2f\n", "awk (constant-cp closed form only)", a, rows / a, a / s
  printf "%-44s %8.3f %14.0f %10.2f\n", "pandas+numpy (constant-cp closed form only)", p, rows / p, p / s
}'
