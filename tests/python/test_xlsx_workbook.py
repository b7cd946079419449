"""The workbook (rate --format xlsx -o FILE.xlsx) read back with python3-openpyxl against
the JSON results of the same cases: every number of every case, numbers stored as
numbers, the header rows of keys and units, failed cases with their messages.

The column units are the CSV's SI set; the factors from SI below are the SI prefixes
and the hour (BIPM SI Brochure, 9th ed.), and degC = K - 273.15 by definition.

Run by ctest as: /usr/bin/python3 tests/python/test_xlsx_workbook.py <shaftwork binary>
It fails, not skips, when python3-openpyxl is missing.
"""
import glob
import json
import os
import subprocess
import sys
import tempfile

try:
    import openpyxl
except ImportError:
    print("python3-openpyxl is not installed (apt-get install python3-openpyxl); this check cannot run")
    sys.exit(1)

FROM_SI = {
    "": lambda v: v,
    "kPa": lambda v: v / 1e3,
    "degC": lambda v: v - 273.15,
    "kg/s": lambda v: v,
    "m3/h": lambda v: v * 3600,
    "kW": lambda v: v / 1e3,
    "kJ/kg": lambda v: v / 1e3,
    "m": lambda v: v,
    "kJ/(kg K)": lambda v: v / 1e3,
    "kg/m3": lambda v: v,
}

binary = sys.argv[1]
failures = []
checked = 0

with tempfile.TemporaryDirectory() as tmp:
    bad = os.path.join(tmp, "with-a-failure.json")
    with open(bad, "w") as f:
        json.dump({"cases": [
            {"id": "unsolvable", "machine": "compressor", "fluid": "air",
             "inlet": {"pressure": "1 bar", "temperature": "20 degC"}, "outlet": {"pressure": "3 bar"}}]}, f)
    inputs = sorted(glob.glob("examples/*.json")) + [bad]
    book = os.path.join(tmp, "results.xlsx")
    status = subprocess.run([binary, "rate", *inputs, "--format", "xlsx", "-o", book],
                            stderr=subprocess.DEVNULL).returncode
    if status != 1:
        failures.append(f"exit status {status}, expected 1 (one case fails)")
    results = json.loads(subprocess.run([binary, "rate", *inputs, "--format", "json"], capture_output=True,
                                        text=True).stdout)["results"]
    sheet = openpyxl.load_workbook(book, read_only=True)["results"]
    rows = list(sheet.iter_rows(values_only=True))
    keys, units, data = rows[0], rows[1], rows[2:]
    if list(keys[:4]) != ["id", "file", "status", "error"] or keys[-1] != "warnings":
        failures.append(f"header row: {keys[:4]} ... {keys[-1]}")
    if len(data) != len(results):
        failures.append(f"{len(data)} case rows, {len(results)} JSON results")
    for row, result in zip(data, results):
        cells = dict(zip(keys, row))
        if cells["id"] != result["id"] or cells["status"] != result["status"]:
            failures.append(f"{cells['id']}: id/status {cells['status']} against {result['id']}/{result['status']}")
        if result["status"] != "ok":
            if cells["error"] != result["error"]:
                failures.append(f"{cells['id']}: error {cells['error']!r} against {result['error']!r}")
            continue
        for key, unit in zip(keys[8:-1], units[8:-1]):
            node = result
            for part in key.split("."):
                node = node.get(part) if isinstance(node, dict) else None
            cell = cells[key]
            if isinstance(node, dict):  # "efficiency" etc. are objects in JSON; the columns name their parts
                node = None
            if node is None:
                if cell is not None:
                    failures.append(f"{cells['id']}: {key} is {cell} in the workbook and absent in JSON")
                continue
            if not isinstance(cell, (int, float)):
                failures.append(f"{cells['id']}: {key} is {cell!r}, not a number")
                continue
            expected = FROM_SI[unit or ""](node)
            checked += 1
            if abs(cell - expected) > 1e-12 * max(1.0, abs(expected)):
                failures.append(f"{cells['id']}: {key} {cell} [{unit}] against JSON {node} (SI) = {expected}")

    # Without -o: refused.
    run = subprocess.run([binary, "rate", "examples/plant-air-compressor.json", "--format", "xlsx"],
                         capture_output=True, text=True)
    if run.returncode != 2 or run.stderr != "error: --format xlsx writes a workbook file: give it with -o FILE.xlsx\n":
        failures.append(f"no -o: exit {run.returncode}, {run.stderr!r}")

for f in failures:
    print("FAILED:", f)
print(f"{checked} numbers compared, {len(failures)} failures")
sys.exit(1 if failures or checked < 100 else 0)
