# Shared by the whole-process benchmarks (sourced, not run: bench/batch_compare.sh,
# bench/real_gas_compare.sh).
#
# paired_rounds REPEATS TIMES COMMAND...: REPEATS rounds, each running every COMMAND once
# in turn (so that a busy machine slows them alike), timed by bench/timed_run.py (wait4's
# rusage and a monotonic clock, to the microsecond); one line per run appended to the file
# TIMES: the command's index, wall s, user s, system s, peak resident kB. Line k of TIMES
# is round k / (number of commands).
paired_rounds() {
  local repeats=$1 times=$2
  shift 2
  : >"$times"
  for _ in $(seq "$repeats"); do
    local i=0
    for command in "$@"; do
      /usr/bin/python3 "$(dirname "${BASH_SOURCE[0]}")/timed_run.py" "$times" "$i" "$command"
      i=$((i + 1))
    done
  done
}

# The median of the numbers on standard input, one a line.
median() { sort -g | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }

# paired_ratio TIMES COUNT I J FIELD: the median over rounds of command I's FIELD (2: wall,
# 3: user + system) over command J's in the same round, for TIMES of COUNT commands a round.
paired_ratio() {
  awk -v n="$2" -v i="$3" -v j="$4" -v f="$5" '
    { r = int((NR - 1) / n); t = (f == 3) ? $3 + $4 : $f; v[r, $1] = t; rounds = r + 1 }
    END { for (r = 0; r < rounds; ++r) if (v[r, j] > 0) print v[r, i] / v[r, j] }' "$1" | median
}
