"""Steam turbines and feed pumps rated by shaftwork against states from python3-iapws.

For each machine the reference values are built here from IAPWS97 states (Debian's
python3-iapws): h1, s1 at the inlet, h2s = h(p2, s1), h2 from the efficiency, the
power from the energy balance. shaftwork is asked both ways: efficiency given
(outlet and power solved) and power given (efficiency and outlet solved).

Run by ctest as: /usr/bin/python3 tests/python/test_steam_machines.py <shaftwork binary>
It fails, not skips, when python3-iapws is missing.
"""
import json
import subprocess
import sys

try:
    from iapws import IAPWS97
except ImportError:
    print("python3-iapws is not installed (apt-get install python3-iapws); this check cannot run")
    print("0 passed, 1 failed")
    sys.exit(1)

BINARY = sys.argv[1]
passed = 0
failed = 0


def check(label, ours, theirs, rtol):
    global passed, failed
    if abs(ours - theirs) <= rtol * max(abs(theirs), 1e-300):
        passed += 1
    else:
        failed += 1
        print(f"MISMATCH {label}: shaftwork {ours!r}, python3-iapws {theirs!r}, rel {abs(ours - theirs) / abs(theirs):.3e}")


# (machine, p1 MPa, T1 K, p2 MPa, isentropic efficiency, mass flow kg/s)
machines = [
    ("turbine", 8.8, 788.15, 0.0085, 0.84, 39.4),   # condensing: wet exhaust
    ("turbine", 4.2, 693.15, 0.35, 0.78, 10.0),     # back pressure: wet isentropic end, dry actual
    ("turbine", 12.0, 808.15, 2.5, 0.88, 55.0),     # HP section: superheated throughout
    ("turbine", 1.0, 453.15, 0.1, 0.70, 3.0),       # saturated-ish inlet, wet exhaust
    ("pump", 0.75, 438.15, 14.2, 0.78, 41.7),       # boiler feed pump
    ("pump", 0.01, 318.15, 2.5, 0.72, 80.0),        # condensate pump
    ("pump", 0.3, 293.15, 30.0, 0.80, 5.0),         # high-pressure water injection
]

cases = []
expected = []
for n, (machine, p1, T1, p2, eta, m) in enumerate(machines):
    inlet = IAPWS97(P=p1, T=T1)
    iso = IAPWS97(P=p2, s=inlet.s)
    h1, h2s = inlet.h * 1e3, iso.h * 1e3
    if machine == "turbine":
        h2 = h1 - eta * (h1 - h2s)
        power = m * (h1 - h2)
    else:
        h2 = h1 + (h2s - h1) / eta
        power = m * (h2 - h1)
    outlet = IAPWS97(P=p2, h=h2 / 1e3)
    ref = {"h1": h1, "s1": inlet.s * 1e3, "h2s": h2s, "h2": h2, "T2": outlet.T, "power": power,
           "x2": outlet.x if 0 < outlet.x < 1 else None}
    base = {"machine": machine, "fluid": "steam" if machine == "turbine" else "water",
            "inlet": {"pressure": p1 * 1e6, "temperature": T1}, "outlet": {"pressure": p2 * 1e6},
            "mass_flow": m}
    cases.append(dict(base, id=f"{n} by efficiency", efficiency=eta))
    expected.append(ref)
    cases.append(dict(base, id=f"{n} by power", power=power))
    expected.append(ref)

out = subprocess.run([BINARY, "rate", "-", "--format", "json"], input=json.dumps({"cases": cases}),
                     capture_output=True, text=True, check=False)
if out.returncode != 0:
    print(out.stderr)
    print("0 passed, 1 failed")
    sys.exit(1)
results = json.loads(out.stdout)["results"]

for case, r, ref in zip(cases, results, expected):
    label = case["id"]
    check(f"inlet h, {label}", r["inlet"]["enthalpy"], ref["h1"], 1e-8)
    check(f"inlet s, {label}", r["inlet"]["entropy"], ref["s1"], 1e-8)
    check(f"isentropic outlet h, {label}", r["outlet_isentropic"]["enthalpy"], ref["h2s"], 1e-7)
    check(f"outlet h, {label}", r["outlet"]["enthalpy"], ref["h2"], 1e-7)
    check(f"outlet T, {label}", r["outlet"]["temperature"], ref["T2"], 1e-7)
    check(f"power, {label}", r["power"], ref["power"], 1e-7)
    check(f"efficiency, {label}", r["efficiency"]["isentropic"], case.get("efficiency", None) or
          (machines[int(label.split()[0])][4]), 1e-7)
    if ref["x2"] is not None:
        check(f"outlet quality, {label}", r["outlet"]["quality"], ref["x2"], 1e-7)
    elif "quality" in r["outlet"]:
        failed_label = f"outlet should be dry, {label}"
        print("MISMATCH", failed_label)
        failed += 1

print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
