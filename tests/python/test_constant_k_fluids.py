"""Constant-k ideal gas: shaftwork against python3-fluids (Debian's python3-fluids).

Checks, for a grid of heat-capacity ratios, molar masses, temperatures, pressure
ratios and efficiencies:
  - the isentropic relation of the constant-cp model (shaftwork state from (p, s))
    against fluids.compressible.T_critical_flow / P_critical_flow, the critical
    (sonic) state of isentropic flow, T* = 2 T0/(k+1), p* = p0 (2/(k+1))^(k/(k-1));
  - compressor outlet temperature against fluids.compressible.isentropic_T_rise_compression;
  - compression work per unit mass against fluids.compressible.isentropic_work_compression
    (J/mol, divided by the molar mass);
  - polytropic efficiency against fluids.compressible.isentropic_efficiency, which
    converts an isentropic efficiency to a polytropic one for constant k.

Run by ctest as: /usr/bin/python3 tests/python/test_constant_k_fluids.py <shaftwork binary>
It fails, not skips, when python3-fluids is missing.
"""
import itertools
import json
import subprocess
import sys

try:
    import fluids.compressible as fc
except ImportError:
    print("python3-fluids is not installed (apt-get install python3-fluids); this check cannot run")
    print("0 passed, 1 failed")
    sys.exit(1)

BINARY = sys.argv[1]
R_U = 8.31446261815324  # J/(mol K), CODATA 2018, as shaftwork and fluids use

passed = 0
failed = 0


def check(label, ours, theirs, rtol):
    global passed, failed
    if abs(ours - theirs) <= rtol * abs(theirs):
        passed += 1
    else:
        failed += 1
        print(f"MISMATCH {label}: shaftwork {ours!r}, python3-fluids {theirs!r}, rel {abs(ours - theirs) / abs(theirs):.3e}")


def run(args, stdin=None):
    out = subprocess.run([BINARY] + args, input=stdin, capture_output=True, text=True, check=False)
    if out.returncode != 0:
        print("shaftwork failed:", args, out.stderr)
        sys.exit(1)
    return json.loads(out.stdout)


# 1. The isentropic relation of the model: the critical state of isentropic flow.
for k, molar_mass, T0, p0 in itertools.product((1.1, 1.3, 1.4, 1.667), (0.004, 0.029, 0.044), (250.0, 600.0), (1e5, 3e6)):
    fluid = json.dumps({"model": "constant-cp", "k": k, "molar_mass": molar_mass})
    with open("/tmp/shaftwork_fluid_k.json", "w") as f:
        f.write(fluid)
    s0 = run(["state", "--fluid-file", "/tmp/shaftwork_fluid_k.json", "--pressure", str(p0), "--temperature", str(T0), "--format", "json"])["entropy"]
    p_star = fc.P_critical_flow(p0, k)
    T_star = fc.T_critical_flow(T0, k)
    st = run(["state", "--fluid-file", "/tmp/shaftwork_fluid_k.json", "--pressure", repr(p_star), "--entropy", repr(s0), "--format", "json"])
    check(f"critical-flow T*, k={k}, M={molar_mass}, T0={T0}, p0={p0}", st["temperature"], T_star, 1e-12)
    check(f"k reported, k={k}", st["k"], k, 1e-13)

# 2-4. Compressors on constant-k gases: one shaftwork run for all the cases.
cases = []
expected = []
for k, molar_mass, T1, ratio, eta in itertools.product((1.15, 1.3, 1.4, 1.667), (0.016, 0.029), (260.0, 310.0), (1.3, 4.0, 30.0), (0.65, 0.85)):
    p1 = 1.0e5
    p2 = p1 * ratio
    cases.append({
        "id": f"k={k} M={molar_mass} T1={T1} r={ratio} eta={eta}",
        "machine": "compressor",
        "fluid": {"model": "constant-cp", "k": k, "molar_mass": molar_mass},
        "inlet": {"pressure": p1, "temperature": T1},
        "outlet": {"pressure": p2},
        "efficiency": {"isentropic": eta},
        "mass_flow": 1.0,
    })
    expected.append({
        "T2": fc.isentropic_T_rise_compression(T1, p1, p2, k, eta),
        "work": fc.isentropic_work_compression(T1, k, 1.0, p1, p2, eta=eta) / molar_mass,
        "eta_p": fc.isentropic_efficiency(p1, p2, k, eta_s=eta),
    })
results = run(["rate", "-", "--format", "json"], stdin=json.dumps({"cases": cases}))["results"]
for case, ours, theirs in zip(cases, results, expected):
    label = case["id"]
    check(f"outlet T, {label}", ours["outlet"]["temperature"], theirs["T2"], 1e-12)
    check(f"work per kg, {label}", ours["power"] / ours["mass_flow"], theirs["work"], 1e-11)
    check(f"polytropic efficiency, {label}", ours["efficiency"]["polytropic"], theirs["eta_p"], 1e-10)

print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
