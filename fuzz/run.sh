#!/usr/bin/env bash
# Runs the libFuzzer targets for a bounded time each, one after another.
#   fuzz/run.sh BUILD_DIR SECONDS [TARGET...]      e.g. fuzz/run.sh build-fuzz 600 case_file
# BUILD_DIR is a build configured with -DSHAFTWORK_FUZZ=ON (clang); TARGET is a topic
# (case_file, units, species, csv_rows), all of them when none is named. Each target's corpus
# lives in BUILD_DIR/fuzz-corpus/TOPIC and grows from run to run; it starts from the seeds
# below (examples/, the bad-input catalogue, fuzz/seeds/). A finding is written to
# BUILD_DIR/fuzz-findings/TOPIC-crash-... and the script exits 1 after the other targets ran.
# Replay one: BUILD_DIR/fuzz/fuzz_TOPIC FILE
set -euo pipefail
cd "$(dirname "$0")/.."

if [ $# -lt 2 ]; then
  echo "usage: fuzz/run.sh BUILD_DIR SECONDS [TARGET...]" >&2
  exit 2
fi
build=$1
seconds=$2
shift 2
topics=("$@")
if [ ${#topics[@]} -eq 0 ]; then
  topics=()
  for program in "$build"/fuzz/fuzz_*; do
    [ -x "$program" ] && topics+=("$(basename "$program" | sed 's/^fuzz_//')")
  done
fi
if [ ${#topics[@]} -eq 0 ]; then
  echo "fuzz/run.sh: no fuzz targets in $build/fuzz (configure with -DSHAFTWORK_FUZZ=ON)" >&2
  exit 2
fi

# Copies seed files into a corpus directory; libFuzzer names what it adds by content hash,
# so seeds keep their own names and never clash with those.
seed() {
  local corpus=$1
  shift
  local file
  for file in "$@"; do
    [ -f "$file" ] && cp "$file" "$corpus/seed-$(basename "$file")"
  done
  return 0
}

failed=()
mkdir -p "$build/fuzz-findings"
for topic in "${topics[@]}"; do
  program="$build/fuzz/fuzz_$topic"
  corpus="$build/fuzz-corpus/$topic"
  mkdir -p "$corpus"
  options=(-max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 -print_final_stats=1)
  case $topic in
    case_file)
      seed "$corpus" examples/*.json examples/guarantees/*.json tests/bad_input/*.json fuzz/seeds/case_file/*
      options+=(-dict=fuzz/case_file.dict -max_len=8192)
      ;;
    units)
      # One file per line of seeds/units.txt: the dimension byte, then the text.
      python3 - "$corpus" <<'PY'
import sys
n = 0
for line in open("fuzz/seeds/units.txt", encoding="utf-8"):
    if line.startswith("#") or not line.strip():
        continue
    index, text = line.rstrip("\n").split(" ", 1)
    n += 1
    with open(f"{sys.argv[1]}/seed-units-{n:03d}", "wb") as f:
        f.write(bytes([int(index)]) + text.encode("utf-8"))
PY
      options+=(-max_len=128)
      ;;
    species)
      seed "$corpus" fuzz/seeds/species/*
      options+=(-max_len=4096)
      ;;
    csv_rows)
      # The first byte picks the output format and threads; the catalogue's CSV files
      # lose theirs to it and still make useful seeds.
      seed "$corpus" fuzz/seeds/csv_rows/* tests/bad_input/*.csv
      options+=(-max_len=4096)
      ;;
    *)
      seed "$corpus" fuzz/seeds/"$topic"/*
      ;;
  esac
  echo "fuzz/run.sh: fuzz_$topic for ${seconds} s, corpus $corpus"
  if ! "$program" "${options[@]}" -artifact_prefix="$build/fuzz-findings/$topic-" "$corpus"; then
    failed+=("$topic")
  fi
done

if [ ${#failed[@]} -gt 0 ]; then
  echo "fuzz/run.sh: findings in: ${failed[*]} (see $build/fuzz-findings)" >&2
  exit 1
fi
echo "fuzz/run.sh: no findings in ${topics[*]}"
