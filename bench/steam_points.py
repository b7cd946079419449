#!/usr/bin/python3
"""Test points for bench/steam_compare.sh, and the python3-iapws side of the comparison.

    steam_points.py --write DIR N     writes DIR/turbine.csv, turbine-template.json, turbine.json
                                      and the same for mvr: N points each, from a fixed seed
    steam_points.py --iapws FILE.csv  for every row of FILE.csv: the inlet state IAPWS97(P=, T=)
                                      and the isentropic outlet IAPWS97(P=, s=), nothing more

Condensing turbine: 10 MPa +-5 %, 500 degC +-10 K, exhaust 10 kPa +-20 % (wet), isentropic
efficiency 0.80-0.88, 80-120 kg/s. MVR compressor: 1-5 bar, 2-15 K above saturation,
pressure ratio 2.5-4, 5-20 kg/s, and an outlet temperature as a thermometer would read it
(0.01 K), made here from an isentropic efficiency of 0.70-0.82 with python3-iapws states.
"""

import csv
import json
import random
import sys

from iapws import IAPWS97

SEED = 20261209


def turbine_points(rng, n):
    rows = []
    for i in range(n):
        rows.append({
            "id": f"T{i:05d}",
            "p1_MPa": round(10.0 * rng.uniform(0.95, 1.05), 4),
            "t1_C": round(500.0 + rng.uniform(-10.0, 10.0), 2),
            "p2_kPa": round(10.0 * rng.uniform(0.8, 1.2), 3),
            "eta": round(rng.uniform(0.80, 0.88), 4),
            "m": round(rng.uniform(80.0, 120.0), 3),
        })
    return rows


def mvr_points(rng, n):
    rows = []
    for i in range(n):
        p1 = round(rng.uniform(1.0, 5.0), 4)  # bar
        T1 = IAPWS97(P=p1 / 10, x=1).T + rng.uniform(2.0, 15.0)
        p2 = round(p1 * rng.uniform(2.5, 4.0), 4)
        inlet = IAPWS97(P=p1 / 10, T=T1)
        h2s = IAPWS97(P=p2 / 10, s=inlet.s).h
        h2 = inlet.h + (h2s - inlet.h) / rng.uniform(0.70, 0.82)
        T2 = IAPWS97(P=p2 / 10, h=h2).T
        rows.append({"id": f"M{i:05d}", "p1_bar": p1, "t1_C": round(T1 - 273.15, 2), "p2_bar": p2,
                     "t2_C": round(T2 - 273.15, 2), "m": round(rng.uniform(5.0, 20.0), 3)})
    return rows


def write(directory, n):
    rng = random.Random(SEED)
    turbines = turbine_points(rng, n)
    mvr = mvr_points(rng, n)
    with open(f"{directory}/turbine.csv", "w", newline="") as f:
        out = csv.writer(f)
        out.writerow(["id", "inlet.pressure [MPa]", "inlet.temperature [degC]", "outlet.pressure [kPa]",
                      "efficiency", "mass_flow [kg/s]"])
        for r in turbines:
            out.writerow([r["id"], r["p1_MPa"], r["t1_C"], r["p2_kPa"], r["eta"], r["m"]])
    with open(f"{directory}/mvr.csv", "w", newline="") as f:
        out = csv.writer(f)
        out.writerow(["id", "inlet.pressure [bar]", "inlet.temperature [degC]", "outlet.pressure [bar]",
                      "outlet.temperature [degC]", "mass_flow [kg/s]"])
        for r in mvr:
            out.writerow([r["id"], r["p1_bar"], r["t1_C"], r["p2_bar"], r["t2_C"], r["m"]])
    for kind, machine in (("turbine", "turbine"), ("mvr", "compressor")):
        with open(f"{directory}/{kind}-template.json", "w") as f:
            json.dump({"id": f"{kind} benchmark", "machine": machine, "fluid": "steam"}, f)
    cases = [{"id": r["id"], "machine": "turbine", "fluid": "steam",
              "inlet": {"pressure": f"{r['p1_MPa']} MPa", "temperature": f"{r['t1_C']} degC"},
              "outlet": {"pressure": f"{r['p2_kPa']} kPa"}, "efficiency": r["eta"],
              "mass_flow": f"{r['m']} kg/s"} for r in turbines]
    with open(f"{directory}/turbine.json", "w") as f:
        json.dump({"cases": cases}, f)
    cases = [{"id": r["id"], "machine": "compressor", "fluid": "steam",
              "inlet": {"pressure": f"{r['p1_bar']} bar", "temperature": f"{r['t1_C']} degC"},
              "outlet": {"pressure": f"{r['p2_bar']} bar", "temperature": f"{r['t2_C']} degC"},
              "mass_flow": f"{r['m']} kg/s"} for r in mvr]
    with open(f"{directory}/mvr.json", "w") as f:
        json.dump({"cases": cases}, f)


def iapws_states(path):
    """Inlet and isentropic outlet of every row (MPa and K for IAPWS97)."""
    total = 0.0
    with open(path, newline="") as f:
        rows = csv.reader(f)
        header = next(rows)
        turbine = header[3] == "outlet.pressure [kPa]"
        for row in rows:
            if turbine:
                p1, T1, p2 = float(row[1]), float(row[2]) + 273.15, float(row[3]) / 1000
            else:
                p1, T1, p2 = float(row[1]) / 10, float(row[2]) + 273.15, float(row[3]) / 10
            inlet = IAPWS97(P=p1, T=T1)
            outlet = IAPWS97(P=p2, s=inlet.s)
            total += outlet.h - inlet.h
    print(f"{path}: sum of isentropic enthalpy changes {total:.6g} kJ/kg")


if __name__ == "__main__":
    if len(sys.argv) == 4 and sys.argv[1] == "--write":
        write(sys.argv[2], int(sys.argv[3]))
    elif len(sys.argv) == 3 and sys.argv[1] == "--iapws":
        iapws_states(sys.argv[2])
    else:
        sys.exit(__doc__)
