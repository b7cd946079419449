"""The workbook (rate --format xlsx -o FILE.xlsx) read back with python3-openpyxl against
the JSON results of the same cases: every number of every case, numbers stored as
numbers, the header rows of keys and units, failed cases with their messages; the
uncertainty and guarantee columns of the cases that state them, and the sheet "tests" of
the files' guarantees against the JSON "test" objects (and the JSON-lines "test" lines).

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

# An uncertainty is a difference: a kelvin is a degree Celsius.
DIFFERENCE_FROM_SI = {"degC": lambda v: v}

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
    "rpm": lambda v: v * 60,  # rev/s to rev/min
    "m/s": lambda v: v,
}

binary = sys.argv[1]
failures = []
checked = 0


def check_uncertainty(cells, result, key, unit):
    """An uncertainty cell against the JSON's (rounded there to 6 significant digits)."""
    expected = result.get("uncertainty", {}).get(key)
    cell = cells["uncertainty." + key]
    if expected is None:
        if cell is not None:
            failures.append(f"{cells['id']}: uncertainty.{key} is {cell} in the workbook and absent in JSON")
        return 0
    if not isinstance(cell, (int, float)):
        failures.append(f"{cells['id']}: uncertainty.{key} is {cell!r}, not a number")
        return 0
    expected = DIFFERENCE_FROM_SI.get(unit or "", FROM_SI[unit or ""])(expected)
    if abs(cell - expected) > 1e-5 * abs(expected):
        failures.append(f"{cells['id']}: uncertainty.{key} {cell} [{unit}] against JSON {expected}")
    return 1


def check_guarantee(cells, result, key, unit):
    """A guarantee cell (guarantee.verdict, guarantee.<quantity>.converted / .deviation_percent
    / .verdict, guarantee.error) against the case's JSON guarantee."""
    g = result.get("guarantee")
    cell = cells[key]
    if key == "guarantee.error":
        expected = result.get("guarantee_error")
    elif key == "guarantee.verdict":
        expected = g and g["verdict"]
    else:
        quantity, part = key[len("guarantee."):].rsplit(".", 1)
        check = next((c for c in (g or {}).get("checks", []) if c["quantity"] == quantity), None)
        expected = check and check.get(part)
        if part == "converted" and expected is not None:
            expected = FROM_SI[unit or ""](expected)
    if isinstance(expected, float):
        if not isinstance(cell, (int, float)) or abs(cell - expected) > 1e-12 * max(1.0, abs(expected)):
            failures.append(f"{cells['id']}: {key} {cell!r} against JSON {expected}")
    elif (cell or None) != (expected or None):
        failures.append(f"{cells['id']}: {key} {cell!r} against JSON {expected!r}")
    return 1


def check_batch(log, template, tmp, judged):
    """A batch's workbook against its CSV, cell for cell; returns the numbers compared."""
    batch = [log, "--case", template, "--quiet"]
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
    must_be_numbers = 0
    for record, row in zip(records[1:], rows[2:]):
        for key, value, cell in zip(rows[0], record, row):
            if isinstance(cell, (int, float)):
                numbers += 1
                if float(value) != cell:
                    failures.append(f"batch {key}: {cell} against the csv's {value}")
            elif (cell or "") != value:
                failures.append(f"batch {key}: {cell!r} against the csv's {value!r}")
            if judged and value and (key.startswith("uncertainty.") or key.endswith((".converted", ".deviation_percent"))):
                must_be_numbers += 1
                if not isinstance(cell, (int, float)):
                    failures.append(f"batch {key}: {cell!r} is text, not a number")
    if numbers < 10 * (len(records) - 1):
        failures.append(f"batch: only {numbers} numbers in {len(records) - 1} rows")
    if judged and must_be_numbers < 10 * (len(records) - 1):
        failures.append(f"batch: only {must_be_numbers} uncertainty and guarantee numbers in {len(records) - 1} rows")
    return numbers

with tempfile.TemporaryDirectory() as tmp:
    bad = os.path.join(tmp, "with-a-failure.json")
    with open(bad, "w") as f:
        json.dump({"cases": [
            {"id": "unsolvable", "machine": "compressor", "fluid": "air",
             "inlet": {"pressure": "1 bar", "temperature": "20 degC"}, "outlet": {"pressure": "3 bar"}}]}, f)
    inputs = sorted(glob.glob("examples/*.json")) + sorted(glob.glob("examples/guarantees/*.json")) + [bad]
    book = os.path.join(tmp, "results.xlsx")
    status = subprocess.run([binary, "rate", *inputs, "--format", "xlsx", "-o", book],
                            stderr=subprocess.DEVNULL).returncode
    if status != 1:
        failures.append(f"exit status {status}, expected 1 (one case fails)")
    document = json.loads(subprocess.run([binary, "rate", *inputs, "--format", "json"], capture_output=True,
                                         text=True).stdout)
    results = document["results"]
    tests = document.get("test", [])
    tests = tests if isinstance(tests, list) else [tests]
    workbook = openpyxl.load_workbook(book, read_only=True)
    sheet = workbook["results"]
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
            if key.startswith("uncertainty."):
                checked += check_uncertainty(cells, result, key[len("uncertainty."):], unit)
                continue
            if key.startswith("guarantee."):
                checked += check_guarantee(cells, result, key, unit)
                continue
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

    # The sheet "tests": a row per check of each file's guarantee, as the JSON "test" objects.
    rows = list(workbook["tests"].iter_rows(values_only=True)) if "tests" in workbook.sheetnames else []
    expected_rows = sum(len(t["guarantee"]["checks"]) if "guarantee" in t else 1 for t in tests)
    if not tests or len(rows) != 1 + expected_rows:
        failures.append(f"tests sheet: {len(rows)} rows for {len(tests)} tests with {expected_rows} checks")
    rows = [dict(zip(rows[0], r)) for r in rows[1:]] if rows else []
    for test in tests:
        for check in test.get("guarantee", {}).get("checks", []):
            row = next((r for r in rows if r["file"] == test["file"] and r["quantity"] == check["quantity"]), None)
            if row is None:
                failures.append(f"tests sheet: no row for {test['file']} {check['quantity']}")
                continue
            if row["verdict"] != test["guarantee"]["verdict"] or row["check_verdict"] != check["verdict"]:
                failures.append(f"tests sheet: {test['file']} {check['quantity']} verdicts {row['verdict']}, "
                                f"{row['check_verdict']}")
            for part in ("measured", "converted", "guaranteed"):
                value = check.get(part)
                expected = None if value is None else FROM_SI[row["unit"] or ""](value)
                cell = row[part]
                if (expected is None) != (cell is None) or (
                        expected is not None and abs(cell - expected) > 1e-12 * max(1.0, abs(expected))):
                    failures.append(f"tests sheet: {test['file']} {check['quantity']} {part} {cell} against {expected}")
                checked += 1
            low, high = check["tolerance_percent"]
            if row["tolerance.min_percent"] != low or row["tolerance.max_percent"] != high:
                failures.append(f"tests sheet: {test['file']} {check['quantity']} tolerance "
                                f"{row['tolerance.min_percent']}, {row['tolerance.max_percent']} against {low}, {high}")

    # JSON lines: a file's test is a line {"test": {...}} after its cases, as JSON's "test".
    lines = subprocess.run([binary, "rate", *inputs, "--format", "jsonl"], capture_output=True,
                           text=True).stdout.splitlines()
    line_tests = [json.loads(line)["test"] for line in lines if line.startswith('{"test":')]
    if line_tests != tests:
        failures.append(f"jsonl: {len(line_tests)} test lines, unlike JSON's {len(tests)} tests")

    # Batches: the workbook holds the batch's CSV cell for cell, numbers as numbers. The
    # second adds stated uncertainties and a guarantee to the week log's template (an
    # invented guarantee near the log's first hour), over that hour's rows: its unitless
    # uncertainty and guarantee numbers must be numbers too.
    with open("examples/compressor-week-log.template.json") as f:
        template = json.load(f)
    template["uncertainty"] = {"inlet.temperature": "0.3 K", "outlet.temperature": "0.5 K", "power": "1 %"}
    template["guarantee"] = {
        "site": {"barometric_pressure": "99.1 kPa"}, "inlet": {"pressure": "-1.8 kPag", "temperature": "12 degC"},
        "standard_volume_flow": "3100 Nm3/h", "outlet": {"pressure": "2.10 barg"},
        "efficiency": {"polytropic": "75 %"}, "tolerances": {"efficiency.polytropic": {"min": "-2 %"}}}
    judged_template = os.path.join(tmp, "judged.template.json")
    with open(judged_template, "w") as f:
        json.dump(template, f)
    hour = os.path.join(tmp, "hour.csv")
    with open("examples/compressor-week-log.csv") as f, open(hour, "w") as out:
        out.writelines(line for _, line in zip(range(61), f))
    for log, template_file in (("examples/compressor-week-log.csv", "examples/compressor-week-log.template.json"),
                               (hour, judged_template)):
        checked += check_batch(log, template_file, tmp, template_file == judged_template)


    # Without -o: refused.
    run = subprocess.run([binary, "rate", "examples/plant-air-compressor.json", "--format", "xlsx"],
                         capture_output=True, text=True)
    if run.returncode != 2 or run.stderr != "error: --format xlsx writes a workbook file: give it with -o FILE.xlsx\n":
        failures.append(f"no -o: exit {run.returncode}, {run.stderr!r}")

for f in failures:
    print("FAILED:", f)
print(f"{checked} numbers compared, {len(failures)} failures")
sys.exit(1 if failures or checked < 100 else 0)
