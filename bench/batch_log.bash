# Shared by the batch benchmarks (sourced, not run: bench/batch_compare.sh,
# bench/batch_uncertainty.sh). From the script's arguments [path/to/shaftwork] [rows]
# (defaults: build/shaftwork, 1000000) it sets bin and rows, makes a scratch directory
# `work` (removed on exit), and writes there the NASA-air compressor log of
# bench/compressor_log.awk (log.csv) and its template without uncertainties
# (template.json: machine, fluid, barometer, mechanical efficiency).
set -eu
bin=${1:-build/shaftwork}
rows=${2:-1000000}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

awk -v rows="$rows" -f "$(dirname "${BASH_SOURCE[0]}")/compressor_log.awk" >"$work/log.csv"
cat >"$work/template.json" <<'JSON'
{ "id": "benchmark log", "machine": "compressor", "fluid": "air",
  "site": { "barometric_pressure": "99.1 kPa" }, "mechanical_efficiency": 0.975 }
JSON
