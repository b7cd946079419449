# Shared by the command-line test scripts (sourced, not run: ctest runs tests/cli/*.sh).
# Sets bin (the shaftwork binary, the script's first argument) and tmp (a scratch
# directory removed on exit), and counts checks for the closing "N passed, N failed".
set -u
bin=$1
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
passed=0
failed=0

expect() {  # expect NAME CONDITION-RESULT(0 = ok) DETAIL
  if [ "$2" -eq 0 ]; then
    passed=$((passed + 1))
  else
    failed=$((failed + 1))
    echo "FAILED: $1 ${3:-}"
  fi
}

finish() {  # the closing line, and the exit status
  echo "$passed passed, $failed failed"
  [ "$failed" -eq 0 ]
}
