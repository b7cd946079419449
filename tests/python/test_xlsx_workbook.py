"""The workbook (rate --format xlsx -o FILE.xlsx) read back with python3-openpyxl against
the JSON results of the same cases: every number of every case, numbers stored as
numbers, the header rows of keys and units, failed cases with their messages.

The column units are the CSV's SI set; the factors from SI below are the SI prefixes
and the hour (BIPM SI Brochure, 9th ed.), and degC = K - 273.15 by definition.

Run by ctest as: /usr/bin/python3 tests/python/test_xlsx_workbook.py <shaftwork binary>
It fails, not skips, when python3-openpyxl is missing.
"""
import csv
import glob
import io
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

    # A batch: the workbook holds the batch's CSV cell for cell, numbers as numbers.
    batch = ["examples/compressor-week-log.csv", "--case", "examples/compressor-week-log.template.json", "--quiet"]
    book = os.path.join(tmp, "batch.xlsx")
    subprocess.run([binary, "rate", *batch, "--format", "xlsx", "-o", book], stderr=subprocess.DEVNULL)
    text = subprocess.run([binary, "rate", *batch], capture_output=True, text=True).stdout
    records = list(csv.reader(io.StringIO(text)))
    rows = list(openpyxl.load_workbook(book, read_only=True)["results"].iter_rows(values_only=True))
    header = [h.rsplit(" [", 1) for h in records[0]]
    if [h[0] for h in header] != list(rows[0]):
        failures.append(f"batch keys {rows[0]} against the csv header {records[0]}")
    if [h[1][:-1] if len(h) == 2 else None for h in header] != [u or None for u in rows[1]]:
        failures.append(f"batch units {rows[1]}")
    if len(rows) - 2 != len(records) - 1:
        failures.append(f"batch: {len(rows) - 2} rows in the workbook, {len(records) - 1} in the csv")
    numbers = 0
    for record, row in zip(records[1:], rows[2:]):
        for key, value, cell in zip(rows[0], record, row):
            if isinstance(cell, (int, float)):
                numbers += 1
                checked += 1
                if float(value) != cell:
                    failures.append(f"batch {key}: {cell} against the csv's {value}")
            elif (cell or "") != value:
                failures.append(f"batch {key}: {cell!r} against the csv's {value!r}")
    if numbers < 10 * (len(records) - 1):
        failures.append(f"batch: only {numbers} numbers in {len(records) - 1} rows")

    # Without -o: refused.
    run = subprocess.run([binary, "rate", "examples/plant-air-compressor.json", "--format", "xlsx"],
                         capture_output=True, text=True)
    if run.returncode != 2 or run.stderr != "error: --format xlsx writes a workbook file: give it with -o FILE.xlsx\n":
        failures.append(f"no -o: exit {run.returncode}, {run.stderr!r}")

for f in failures:
    print("FAILED:", f)
print(f"{checked} numbers compared, {len(failures)} failures")
sys.exit(1 if failures or checked < 100 else 0)
