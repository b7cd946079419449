"""The design cases of examples/design-cases.json against their recorded results.

A regression guard, not a correctness check: tests/regression/design-cases.expected.json
holds what shaftwork printed when the cases were last reviewed (their physics is checked
against outside references by the other tests). A change of any number by more than 1e-9
relative, or of any key, status or warning, fails here; when a change is intended,
review it and record the new results with
  build/shaftwork rate --format json examples/design-cases.json > tests/regression/design-cases.expected.json

Run by ctest as: /usr/bin/python3 tests/python/test_design_cases_regression.py <shaftwork binary>
"""
import json
import subprocess
import sys

BINARY = sys.argv[1]
out = subprocess.run([BINARY, "rate", "--format", "json", "examples/design-cases.json"], capture_output=True, text=True)
if out.returncode != 0:
    print(out.stderr)
    print("0 passed, 1 failed")
    sys.exit(1)
now = json.loads(out.stdout)
with open("tests/regression/design-cases.expected.json") as f:
    recorded = json.load(f)

passed = failed = 0


def compare(path, a, b):
    global passed, failed
    if isinstance(b, dict):
        if not isinstance(a, dict) or set(a) != set(b):
            failed += 1
            print(f"CHANGED keys at {path}: now {sorted(a) if isinstance(a, dict) else a!r}, recorded {sorted(b)}")
            return
        for k in b:
            compare(f"{path}.{k}", a[k], b[k])
    elif isinstance(b, list):
        if not isinstance(a, list) or len(a) != len(b):
            failed += 1
            print(f"CHANGED list at {path}: now {a!r}, recorded {b!r}")
            return
        for i, (x, y) in enumerate(zip(a, b)):
            compare(f"{path}[{i}]", x, y)
    elif isinstance(b, float) and isinstance(a, (int, float)):
        if abs(a - b) <= 1e-9 * max(abs(b), 1e-300) or a == b:
            passed += 1
        else:
            failed += 1
            print(f"CHANGED {path}: now {a!r}, recorded {b!r}")
    elif a == b:
        passed += 1
    else:
        failed += 1
        print(f"CHANGED {path}: now {a!r}, recorded {b!r}")


compare("results", now, recorded)
print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
