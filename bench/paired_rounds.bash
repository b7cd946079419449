# Shared by the whole-process benchmarks (sourced, not run: bench/batch_compare.sh,
# bench/real_gas_compare.sh).
#
# paired_rounds REPEATS TIMES COMMAND...: REPEATS rounds, each running every COMMAND once
# in turn (so that a busy machine slows them alike), timed by /usr/bin/time; one line per
# run appended to the file TIMES: the command's index, wall s, user s, system s, peak
# resident kB.
paired_rounds() {
  local repeats=$1 times=$2
  shift 2
  : >"$times"
  for _ in $(seq "$repeats"); do
    local i=0
    for command in "$@"; do
      /usr/bin/time -f "$i %e %U %S %M" -a -o "$times" sh -c "$command"
      i=$((i + 1))
    done
  done
}

# The median of the numbers on standard input, one a line.
median() { sort -g | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }
