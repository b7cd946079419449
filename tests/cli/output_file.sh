#!/usr/bin/env bash
# -o FILE keeps its promise: written whole or not at all, and nothing but FILE touched
# (io::OutputFile, docs/contract.md). Devices and FIFOs are written through, a symbolic
# link's target is replaced and the link kept, a file with hard links is refused, an
# existing file keeps its mode and owner, an input is never overwritten (compared by file
# identity), a run that exits 2 leaves FILE as it was, and SIGINT, SIGTERM and SIGHUP
# remove the temporary file. (SIGKILL cannot be caught: kill_during_write.sh checks that
# FILE itself survives it.)
# Run by ctest from the repository root as: bash tests/cli/output_file.sh <shaftwork binary>
source "$(dirname "$0")/checks.bash"

case_file=examples/plant-air-compressor.json
log=examples/compressor-week-log.csv
template=examples/compressor-week-log.template.json
"$bin" rate "$case_file" >"$tmp/expected.txt" 2>/dev/null
"$bin" rate "$log" --case "$template" >"$tmp/expected.csv" 2>/dev/null

# No file of the form NAME.XXXXXX anywhere under $tmp.
no_temporary() { [ -z "$(find "$tmp" -name '*.??????' -newer "$tmp/expected.txt")" ]; }
mode_of() { stat -c '%a %u %g %F' "$1"; }

# ---- Devices and FIFOs: written through, never replaced by a regular file --------------------
if [ "$(id -u)" -eq 0 ] && mknod "$tmp/null" c 1 3 2>/dev/null && : >"$tmp/null" 2>/dev/null; then
  # A device node like /dev/null, made here so that a failure cannot replace the real one.
  ln -s "$tmp/null" "$tmp/null-link"
  "$bin" rate "$case_file" -o "$tmp/null" 2>/dev/null
  expect "-o DEVICE exits 0" $?
  [ "$(stat -c %F "$tmp/null")" = "character special file" ]
  expect "-o DEVICE leaves the device a device" $? "$(stat -c %F "$tmp/null")"
  "$bin" rate "$log" --case "$template" -o "$tmp/null-link" >/dev/null 2>&1
  expect "a batch to a link to a device exits 1 (the log's spoilt rows)" $([ $? -eq 1 ]; echo $?)
  [ -L "$tmp/null-link" ] && [ "$(stat -c %F "$tmp/null")" = "character special file" ]
  expect "-o LINK-TO-DEVICE leaves the link and the device" $?
else
  echo "skipped the device checks: making a device node needs root (CI runs as root)"
fi
mkfifo "$tmp/fifo"
timeout 30 cat "$tmp/fifo" >"$tmp/from-fifo" &  # bounded: a broken -o may never open it
reader=$!
"$bin" rate "$case_file" -o "$tmp/fifo" 2>/dev/null
expect "-o FIFO exits 0" $?
wait "$reader"
[ -p "$tmp/fifo" ] && cmp -s "$tmp/from-fifo" "$tmp/expected.txt"
expect "-o FIFO: the reader gets the results and the FIFO stays a FIFO" $?
timeout 30 cat "$tmp/fifo" >"$tmp/from-fifo.csv" &
reader=$!
"$bin" rate "$log" --case "$template" -o "$tmp/fifo" 2>/dev/null
wait "$reader"
[ -p "$tmp/fifo" ] && cmp -s "$tmp/from-fifo.csv" "$tmp/expected.csv"
expect "a batch to a FIFO likewise" $?

# ---- Symbolic links: the target is replaced, beside itself; the link stays -----------------
mkdir "$tmp/links" "$tmp/files"
echo "earlier" >"$tmp/files/target.txt"
ln -s ../files/target.txt "$tmp/links/to-target"
ln -s to-target "$tmp/links/to-link"
"$bin" rate "$case_file" -o "$tmp/links/to-link" 2>/dev/null
expect "-o LINK-TO-LINK exits 0" $?
[ -L "$tmp/links/to-link" ] && [ -L "$tmp/links/to-target" ] && cmp -s "$tmp/files/target.txt" "$tmp/expected.txt"
expect "-o LINK: both links kept, the file they lead to holds the results" $?
no_temporary
expect "-o LINK: no temporary file left in either directory" $?
ln -s new-target.txt "$tmp/files/dangling"
"$bin" rate "$case_file" -o "$tmp/files/dangling" 2>/dev/null
[ -L "$tmp/files/dangling" ] && cmp -s "$tmp/files/new-target.txt" "$tmp/expected.txt"
expect "-o DANGLING-LINK creates the file it names" $?

# ---- Hard links: refused, both names untouched -------------------------------------------------
echo "earlier" >"$tmp/linked"
ln "$tmp/linked" "$tmp/other-name"
"$bin" rate "$case_file" -o "$tmp/linked" >/dev/null 2>"$tmp/hard.err"
expect "-o HARD-LINKED exits 2" $([ $? -eq 2 ]; echo $?)
[ "$(cat "$tmp/hard.err")" = "error: $tmp/linked: the file has 2 hard links; replacing it would cut it from its other names, and writing it in place could leave it half-written: write to a new file" ]
expect "-o HARD-LINKED says why" $? "$(cat "$tmp/hard.err")"
[ "$(cat "$tmp/linked")" = "earlier" ] && [ "$(stat -c %h "$tmp/linked")" = 2 ]
expect "-o HARD-LINKED: the file and its links as they were" $?

# ---- Mode and owner kept; a new file follows the umask ----------------------------------------
echo "earlier" >"$tmp/private"
chmod 600 "$tmp/private"
"$bin" rate "$case_file" -o "$tmp/private" 2>/dev/null
[ "$(stat -c %a "$tmp/private")" = 600 ] && cmp -s "$tmp/private" "$tmp/expected.txt"
expect "a 0600 file stays 0600" $? "$(mode_of "$tmp/private")"
echo "earlier" >"$tmp/shared.csv"
chmod 664 "$tmp/shared.csv"
"$bin" rate "$log" --case "$template" -o "$tmp/shared.csv" 2>/dev/null
[ "$(stat -c %a "$tmp/shared.csv")" = 664 ]
expect "a batch keeps a 0664 file's mode" $? "$(mode_of "$tmp/shared.csv")"
if [ "$(id -u)" -eq 0 ]; then
  echo "earlier" >"$tmp/owned"
  chown 1234:5678 "$tmp/owned"
  chmod 640 "$tmp/owned"
  "$bin" rate "$case_file" -o "$tmp/owned" 2>/dev/null
  [ "$(mode_of "$tmp/owned")" = "640 1234 5678 regular file" ]
  expect "run as root, the file keeps its owner and group" $? "$(mode_of "$tmp/owned")"
fi
(umask 027 && exec "$bin" rate "$case_file" -o "$tmp/new-file") 2>/dev/null
[ "$(stat -c %a "$tmp/new-file")" = 640 ]
expect "a new file gets 0666 less the umask" $? "$(mode_of "$tmp/new-file")"

# ---- An input is never the output: compared by file identity ----------------------------------
cp "$case_file" "$tmp/a.json"
cp "$template" "$tmp/t.json"
cp "$tmp/a.json" "$tmp/a.orig"
cp "$tmp/t.json" "$tmp/t.orig"
ln "$tmp/a.json" "$tmp/a-hard.json"
ln -s a.json "$tmp/a-link.json"
refused() {  # refused LABEL INPUT-SHOWN OUTPUT-SHOWN COMMAND...: exit 2, the message, inputs unchanged
  local label=$1 input=$2 output=$3
  shift 3
  "$@" >/dev/null 2>"$tmp/same.err"
  local status=$?
  expect "$label exits 2" $([ $status -eq 2 ]; echo $?) "(exit $status)"
  [ "$(cat "$tmp/same.err")" = "error: $output: is also an input of this run ($input); the results would overwrite it: write them to another file" ]
  expect "$label names the input" $? "$(cat "$tmp/same.err")"
  cmp -s "$tmp/a.json" "$tmp/a.orig" && cmp -s "$tmp/t.json" "$tmp/t.orig"
  expect "$label leaves the input as it was" $?
}
refused "rate a.json -o a.json" "$tmp/a.json" "$tmp/a.json" "$bin" rate "$tmp/a.json" -o "$tmp/a.json"
program=$(cd "$(dirname "$bin")" && pwd)/$(basename "$bin")
pushd "$tmp" >/dev/null
refused "rate a.json -o ./a.json" a.json ./a.json "$program" rate a.json -o ./a.json
popd >/dev/null
refused "-o a symbolic link to the input" "$tmp/a.json" "$tmp/a-link.json" "$bin" rate "$tmp/a.json" -o "$tmp/a-link.json"
refused "-o a hard link of the input" "$tmp/a-hard.json" "$tmp/a.json" "$bin" rate "$tmp/a-hard.json" -o "$tmp/a.json"
refused "rate - -o a.json < a.json" "standard input" "$tmp/a.json" "$bin" rate - -o "$tmp/a.json" <"$tmp/a.json"
refused "rate log.csv --case t.json -o t.json" "$tmp/t.json" "$tmp/t.json" "$bin" rate "$log" --case "$tmp/t.json" -o "$tmp/t.json"
cp "$log" "$tmp/log.csv"
refused "rate log.csv --case t.json -o log.csv" "$tmp/log.csv" "$tmp/log.csv" "$bin" rate "$tmp/log.csv" --case "$tmp/t.json" -o "$tmp/log.csv"
cmp -s "$tmp/log.csv" "$log"
expect "the CSV input is left as it was" $?

# ---- A run that exits 2 leaves an existing file byte for byte ---------------------------------
printf 'results of an earlier run\n' >"$tmp/kept"
cp "$tmp/kept" "$tmp/kept.orig"
"$bin" rate "$case_file" "$tmp/missing.json" -o "$tmp/kept" >/dev/null 2>"$tmp/kept.err"
expect "rate good.json missing.json -o FILE exits 2" $([ $? -eq 2 ]; echo $?)
tail -n 1 "$tmp/kept.err" | grep -qxF "error: $tmp/kept: not written, since an input could not be used"
expect "and says FILE was not written" $? "$(cat "$tmp/kept.err")"
cmp -s "$tmp/kept" "$tmp/kept.orig"
expect "and FILE is as it was" $?
printf '{"cases": [\n' >"$tmp/broken.json"
"$bin" rate "$tmp/broken.json" --format csv -o "$tmp/kept" >/dev/null 2>&1
expect "a case file that is not JSON exits 2" $([ $? -eq 2 ]; echo $?)
cmp -s "$tmp/kept" "$tmp/kept.orig"
expect "and leaves FILE as it was (it used to empty it)" $?
no_temporary
expect "no temporary file after the runs that exit 2" $?

# ---- Signals remove the temporary file --------------------------------------------------------
# A large log (the week log 20 times, 201,600 rows) comes through a FIFO that is then held
# open: the batch has written part of its output to the temporary file and waits for more
# rows when the signal comes. env --default-signal undoes the SIGINT that bash ignores
# for commands in the background.
big=$tmp/big.csv
head -n 1 "$log" >"$big"
for _ in $(seq 20); do tail -n +2 "$log" >>"$big"; done
signal_check() {  # signal_check SIGNAL STATUS
  local signal=$1 status_expected=$2 out=$tmp/signalled.csv
  printf 'results of an earlier run\n' >"$out"
  rm -f "$tmp/feed" && mkfifo "$tmp/feed"
  env --default-signal=INT "$bin" rate - --case "$template" -o "$out" <"$tmp/feed" >/dev/null 2>&1 &
  local pid=$!
  exec 3>"$tmp/feed"
  cat "$big" >&3
  local size=0 waited=0
  while [ "$size" -lt 1000000 ] && [ "$waited" -lt 600 ]; do
    sleep 0.1
    waited=$((waited + 1))
    size=$(cat "$out".?????? 2>/dev/null | wc -c)
  done
  expect "$signal: the temporary file was being written when the signal came" $([ "$size" -ge 1000000 ]; echo $?) "($size bytes)"
  kill -s "$signal" "$pid"
  wait "$pid"
  local status=$?
  exec 3>&-
  expect "$signal: the exit status says the signal ($status_expected)" $([ $status -eq "$status_expected" ]; echo $?) "(exit $status)"
  [ -z "$(ls "$out".?????? 2>/dev/null)" ]
  expect "$signal: no temporary file left" $? "$(ls -l "$out".?????? 2>/dev/null)"
  [ "$(cat "$out")" = "results of an earlier run" ]
  expect "$signal: the earlier file as it was" $?
}
signal_check INT 130
signal_check TERM 143
signal_check HUP 129
# A signal the caller ignores stays ignored (nohup ignores SIGHUP): the run goes on.
printf 'results of an earlier run\n' >"$tmp/nohup.csv"
rm -f "$tmp/feed" && mkfifo "$tmp/feed"
(trap '' HUP && exec "$bin" rate - --case "$template" -o "$tmp/nohup.csv" <"$tmp/feed" >/dev/null 2>&1) &
pid=$!
exec 3>"$tmp/feed"
head -n 20001 "$big" >&3
sleep 0.5
kill -s HUP "$pid"
exec 3>&-
wait "$pid"
expect "an ignored SIGHUP: the run completes (exit 1, the spoilt rows)" $([ $? -eq 1 ]; echo $?)
[ "$(wc -l <"$tmp/nohup.csv")" -eq 20001 ]
expect "an ignored SIGHUP: the output is whole" $?

finish
