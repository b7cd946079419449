"""Steam guarantees against python3-iapws (IAPWS-IF97, an implementation independent of ours).

The two turbines of examples/guarantees/back-pressure-turbine.json are carried to their
guarantees again here, state by state with iapws.IAPWS97: the test's isentropic efficiency
from its measured states (or, for the wet exhaust, from its flow and power), the guarantee
inlet, the isentropic exhaust and the exhaust at that efficiency, the choked-nozzle flow
m_t sqrt(p_g rho_g / (p_t rho_t)) and the shaft power eta_m m (h1 - h2). A steam compressor's
machine Mach number checks the speed of sound against IAPWS-IF97's own w.

Run by ctest: /usr/bin/python3 tests/python/test_guarantee_steam.py <shaftwork binary>
"""
import json
import math
import subprocess
import sys

from iapws import IAPWS97

BIN = sys.argv[1]
FAILURES = []


def check(label, got, want, rtol):
    ok = abs(got - want) <= rtol * abs(want)
    print(f"{'ok  ' if ok else 'FAIL'} {label}: {got!r} against {want!r} (rtol {rtol})")
    if not ok:
        FAILURES.append(label)


def rate(path_or_doc):
    if isinstance(path_or_doc, str):
        args, stdin = [BIN, "rate", "--format", "json", path_or_doc], None
    else:
        args, stdin = [BIN, "rate", "--format", "json", "-"], json.dumps(path_or_doc)
    out = subprocess.run(args, input=stdin, capture_output=True, text=True)
    assert out.returncode in (0, 3), out.stderr
    return json.loads(out.stdout)["results"]


def state(p_bar, t_c=None, h=None, s=None):
    if t_c is not None:
        return IAPWS97(P=p_bar / 10, T=t_c + 273.15)
    if h is not None:
        return IAPWS97(P=p_bar / 10, h=h)
    return IAPWS97(P=p_bar / 10, s=s)


def carried_turbine(eta, eta_m, flow_kg_s, p_g, t_g, p_out_g):
    """The guarantee point: inlet (p_g, t_g), exhaust p_out_g, isentropic efficiency eta."""
    inlet = state(p_g, t_g)
    h2 = inlet.h - eta * (inlet.h - state(p_out_g, s=inlet.s).h)
    exhaust = state(p_out_g, h=h2)
    return inlet, exhaust, eta_m * flow_kg_s * (inlet.h - h2) * 1e3


results = {r["id"]: r for r in rate("examples/guarantees/back-pressure-turbine.json")}

# T-4: superheated exhaust, measured; no guaranteed flow (the choked-nozzle law).
r = results["T-4 back-pressure turbine, acceptance run"]
t_in, t_out = state(38.5, 402.0), state(4.6, 186.0)
eta = (t_in.h - t_out.h) / (t_in.h - state(4.6, s=t_in.s).h)
check("T-4 test isentropic efficiency", r["efficiency"]["isentropic"], eta, 1e-7)
m_t = 40.9 / 3.6
g_in = state(42.0, 420.0)
m_c = m_t * math.sqrt(4.2e6 * g_in.rho / (3.85e6 * t_in.rho))
_, g_out, power = carried_turbine(eta, 0.985, m_c, 42.0, 420.0, 4.5)
conv = r["guarantee"]["converted"]
check("T-4 choked-nozzle flow", conv["mass_flow"], m_c, 1e-7)
check("T-4 guarantee exhaust temperature", conv["outlet"]["temperature"], g_out.T, 1e-7)
check("T-4 guarantee shaft power", conv["power"], power, 1e-6)
check("T-4 power deviation", r["guarantee"]["checks"][1]["deviation_percent"], 100 * (power - 5e6) / 5e6, 1e-5)

# T-7: wet exhaust from the flow and power; the guarantee fixes the flow.
r = results["T-7 condensing turbine, acceptance run"]
t_in = state(62.0, 480.0)
m_t = 25.3 / 3.6
h2 = t_in.h - 6920.0 / (0.98 * m_t)
eta = (t_in.h - h2) / (t_in.h - state(0.12, s=t_in.s).h)
check("T-7 test exhaust quality", r["outlet"]["quality"], state(0.12, h=h2).x, 1e-6)
check("T-7 test isentropic efficiency", r["efficiency"]["isentropic"], eta, 1e-7)
_, g_out, power = carried_turbine(eta, 0.98, 26.0 / 3.6, 64.0, 485.0, 0.10)
conv = r["guarantee"]["converted"]
check("T-7 guarantee exhaust quality", conv["outlet"]["quality"], g_out.x, 1e-6)
check("T-7 guarantee shaft power", conv["power"], power, 1e-6)
assert r["guarantee"]["verdict"] == "pass", r["guarantee"]

# Speed of sound: U / M of a steam compressor against IAPWS-IF97's w, over regions 1 to 2.
points = [(1.0e5, 130.0), (2.0e5, 150.0), (5.0e5, 200.0), (3.0e6, 300.0), (1.2e7, 400.0), (2.5e7, 500.0),
          (1.0e5, 600.0)]
doc = {"cases": [{"id": str(i), "machine": "compressor", "fluid": "steam",
                  "inlet": {"pressure": f"{p!r} Pa", "temperature": f"{t!r} degC"},
                  "outlet": {"pressure": f"{1.2 * p!r} Pa"}, "efficiency": {"polytropic": 0.8},
                  "mass_flow": "1 kg/s", "speed": "100 rev/s", "impeller": {"tip_diameter": "1 m"}}
                 for i, (p, t) in enumerate(points)]}
for (p, t), r in zip(points, rate(doc)):
    a = math.pi * 100.0 / r["machine_mach_number"]
    check(f"speed of sound at {p:g} Pa, {t:g} degC", a, IAPWS97(P=p / 1e6, T=t + 273.15).w, 1e-7)

print(f"{len(FAILURES)} failed")
sys.exit(1 if FAILURES else 0)
