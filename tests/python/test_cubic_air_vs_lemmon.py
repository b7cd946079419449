"""Peng-Robinson and Soave-Redlich-Kwong air against the reference equation for air.

python3-iapws (Debian) implements Lemmon, Jacobsen, Penoncello & Friend, "Thermodynamic
Properties of Air and Mixtures of Nitrogen, Argon, and Oxygen From 60 to 2000 K at
Pressures to 2000 MPa", J. Phys. Chem. Ref. Data 29 (2000) 331, as iapws.humidAir.Air.
shaftwork's cubic models of air ({"model": ..., "fluid": "air"}: the NASA "Air" record's
N2/O2/Ar/CO2, built-in critical constants and k_ij) are compared on a grid of 250-600 K and
10-200 bar:
  - the compressibility factor Z, within 3.2 % (a cubic equation with the classical alpha
    misses gas-phase Z of such light gases by up to a few percent at these densities:
    the known deviation, common practice to expect it; measured here: PR up to 2.6 %,
    SRK up to 3.0 %, both at 250 K and 200 bar);
  - the isothermal enthalpy departure h(p, T) - h(1 bar, T), within 22 % of its value plus
    1 kJ/kg up to 400 K (measured: PR overstates it by up to 25 %, where it is small; SRK
    misses by up to 21 %), and within 5 kJ/kg at 600 K, where the departure is small and Soave's
    alpha, fitted to vapour pressures, extrapolates poorly (SRK 5.3 against 0.9 kJ/kg at
    200 bar). docs/properties.md states these deviations;
  - cp, within 2 % (measured: within 1.2 %).
It also runs the cubic fluid forms of a case file through the command line: a species,
a named gas, critical-constant and k_ij overrides, and the messages for bad forms.

Run by ctest as: /usr/bin/python3 tests/python/test_cubic_air_vs_lemmon.py <shaftwork binary>
It fails, not skips, when python3-iapws is missing.
"""
import json
import os
import subprocess
import sys
import tempfile

try:
    from iapws.humidAir import Air
except ImportError:
    print("python3-iapws is not installed (apt-get install python3-iapws); this check cannot run")
    print("0 passed, 1 failed")
    sys.exit(1)

BINARY = sys.argv[1]
passed = 0
failed = 0


def check(label, ok, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAILED {label} {detail}")


def state(fluid, pressure, temperature):
    with tempfile.NamedTemporaryFile("w", suffix=".json", delete=False) as f:
        json.dump(fluid, f)
        path = f.name
    try:
        out = subprocess.run([BINARY, "state", "--fluid-file", path, "--pressure", pressure,
                              "--temperature", temperature, "--format", "json"],
                             capture_output=True, text=True, check=True).stdout
    finally:
        os.unlink(path)
    return json.loads(out)


def rate(case):
    with tempfile.NamedTemporaryFile("w", suffix=".json", delete=False) as f:
        json.dump({"cases": [case]}, f)
        path = f.name
    try:
        run = subprocess.run([BINARY, "rate", "--format", "json", path], capture_output=True, text=True)
    finally:
        os.unlink(path)
    return run, path


for model in ("peng-robinson", "soave-redlich-kwong"):
    fluid = {"model": model, "fluid": "air"}
    for T in (250.0, 300.0, 400.0, 600.0):
        low = state(fluid, "1 bar", f"{T} K")
        ref_low = Air(T=T, P=0.1)
        for p_bar in (10.0, 50.0, 100.0, 200.0):
            ours = state(fluid, f"{p_bar} bar", f"{T} K")
            ref = Air(T=T, P=p_bar / 10)
            label = f"{model} {p_bar} bar {T} K"
            z_dev = ours["compressibility"] / ref.Z - 1
            check(label + " Z", abs(z_dev) < 0.032, f"{ours['compressibility']:.5f} vs {ref.Z:.5f}")
            dh_ours = (ours["enthalpy"] - low["enthalpy"]) / 1e3  # kJ/kg
            dh_ref = ref.h - ref_low.h
            allowed = 0.22 * abs(dh_ref) + 1.0 if T <= 400 else 5.0
            check(label + " h departure", abs(dh_ours - dh_ref) < allowed, f"{dh_ours:.3f} vs {dh_ref:.3f} kJ/kg")
            check(label + " cp", abs(ours["cp"] / 1e3 / ref.cp - 1) < 0.02, f"{ours['cp']/1e3:.4f} vs {ref.cp:.4f}")

# The case-file forms.
base = {"id": "c", "machine": "compressor", "inlet": {"pressure": "41 bar", "temperature": "30 degC"},
        "outlet": {"pressure": "61 bar", "temperature": "62 degC"}, "mass_flow": "10 kg/s"}
run, _ = rate(dict(base, fluid={"model": "peng-robinson", "species": "CH4"}))
check("species form", run.returncode == 0, run.stderr)
run, _ = rate(dict(base, fluid={"model": "peng-robinson", "fluid": "natural-gas-example",
                                "interaction": {"CH4-CO2": 0.1}, "critical": {"n-C4H10": {"acentric_factor": 0.2}}}))
check("named gas with overrides", run.returncode == 0, run.stderr)
# The inlet density of the named natural gas on PR at 41 bar, 30 degC: Z 0.905 (the booster).
if run.returncode == 0:
    result = json.loads(run.stdout)["results"][0]
    check("named gas density", abs(result["inlet"]["density"] - 31.9) < 0.2, str(result["inlet"]["density"]))


def refused(fluid, message):
    run, path = rate(dict(base, fluid=fluid))
    text = run.stdout + run.stderr
    check(f"refused {fluid}", run.returncode != 0 and message in text, text)


refused({"model": "peng-robinson", "fluid": "water"},
        'fluid.fluid: "water" is not a gas of NASA species (its model is iapws-if97)')
refused({"model": "peng-robinson", "fluid": "air", "species": "N2"},
        'fluid: give "fluid", or "species" or "mixture", not both')
refused({"model": "soave-redlich-kwong", "species": "CH4", "interaction": {"CH4CO2": 0.1}},
        "fluid.interaction.CH4CO2: expected two species joined by '-', like \"CH4-CO2\"")
refused({"model": "peng-robinson", "species": "CH4", "critical": {"CH4": {"critical_temperature": "0.5 K"}}},
        "fluid.critical.CH4: the critical temperature must lie between 1 and 5000 K, got 0.5")
# 41 bar, 30 degC: propane is a liquid there.
run, _ = rate(dict(base, fluid={"model": "peng-robinson", "species": "C3H8"}))
check("liquid propane inlet named", "C3H8 on peng-robinson at 41 bar, 303.15 K lies below its dew point" in
      run.stdout + run.stderr, run.stdout + run.stderr)

print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
