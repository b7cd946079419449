#!/usr/bin/env python3
"""Writes examples/compressor-week-log.csv: an invented test log of a plant-air
compressor's first stage, one row a minute for a week (10,080 rows).

Nothing here is measured: the demand follows invented shifts (weekday days, nights,
a quiet weekend), the inlet temperature a daily swing, the stage efficiency a slow
drift from fouling, and every reading carries invented instrument noise. The outlet
temperature and the motor power come from a constant-cp air model (k = 1.4,
cp = 1005 J/(kg K)), so shaftwork, rating on NASA-polynomial air, finds efficiencies
close to, not equal to, the ones used here. A few rows are spoiled on purpose, as a
logger spoils them: an empty cell, a text code in a number column, and an outlet
temperature below the inlet's (a failed thermocouple).

Run from the repository root:  python3 tools/make_compressor_log.py
The seed is fixed, so the file comes out the same every time.
"""
import datetime
import math
import random

SEED = 20260302
ROWS = 7 * 24 * 60
START = datetime.datetime(2026, 3, 2, 0, 0)  # a Monday
BAROMETER_KPA = 99.1   # the template's site barometer
K = 1.4
CP = 1005.0            # J/(kg K)
R_AIR = 287.05         # J/(kg K)
NM3_DENSITY = 1.2929   # kg/Nm3 of dry air at 0 degC, 101.325 kPa
MECHANICAL = 0.975     # as in the template

rng = random.Random(SEED)


def demand_nm3h(t):
    """Plant demand by shift, with slow wander."""
    weekday = t.weekday() < 5
    hour = t.hour + t.minute / 60
    if weekday and 6 <= hour < 22:
        base = 4200.0
    elif weekday:
        base = 3100.0
    else:
        base = 2600.0
    return base * (1 + 0.03 * math.sin(2 * math.pi * hour / 5.3))


def main():
    rows = []
    wander = 0.0
    for i in range(ROWS):
        t = START + datetime.timedelta(minutes=i)
        day_fraction = (t.hour * 60 + t.minute) / 1440
        ambient = 16.0 + 7.0 * math.sin(2 * math.pi * (day_fraction - 0.375))  # warmest mid-afternoon
        wander += rng.gauss(0, 0.02)
        wander *= 0.995
        flow = demand_nm3h(t) * (1 + 0.01 * wander)
        filter_drop = 1.2 + 0.6 * (flow / 4200.0) ** 2  # kPa, rises with flow
        p1 = BAROMETER_KPA - filter_drop                 # kPa absolute
        p2 = BAROMETER_KPA + 210.0 + rng.gauss(0, 0.4)   # controller holds 2.10 barg
        T1 = ambient + 273.15
        eta = 0.785 - 0.012 * i / ROWS                   # fouling over the week
        eta -= 0.04 * (flow / 4200.0 - 1.0) ** 2         # off the best-efficiency flow
        T2s = T1 * (p2 / p1) ** ((K - 1) / K)
        T2 = T1 + (T2s - T1) / eta
        m = flow * NM3_DENSITY / 3600.0
        power = m * CP * (T2 - T1) / MECHANICAL / 1000.0  # kW at the coupling

        # Instrument noise (invented): transmitters and thermocouples as logged.
        row = [
            t.strftime("%Y-%m-%d %H:%M"),
            f"{p1 - BAROMETER_KPA + rng.gauss(0, 0.05):.2f}",   # inlet kPag
            f"{ambient + rng.gauss(0, 0.15):.1f}",              # inlet degC
            f"{(p2 - BAROMETER_KPA) / 100 + rng.gauss(0, 0.003):.3f}",  # outlet barg
            f"{T2 - 273.15 + rng.gauss(0, 0.3):.1f}",           # outlet degC
            f"{flow * (1 + rng.gauss(0, 0.004)):.0f}",           # Nm3/h
            f"{power * (1 + rng.gauss(0, 0.003)):.1f}",          # kW
        ]
        rows.append(row)

    # Spoiled rows, as loggers spoil them.
    rows[1500][4] = ""          # the outlet thermocouple reading missing
    rows[4321][6] = "ERR"       # the power meter's error code
    rows[7777][4] = "-18.6"     # a failed thermocouple: colder than the inlet
    rows[9001][5] = "NaN"       # the flow computer's not-a-number

    with open("examples/compressor-week-log.csv", "w", newline="") as f:
        f.write("id,inlet.pressure [kPag],inlet.temperature [degC],outlet.pressure [barg],"
                "outlet.temperature [degC],standard_volume_flow [Nm3/h],power [kW]\r\n")
        for row in rows:
            f.write(",".join(row) + "\r\n")


if __name__ == "__main__":
    main()
