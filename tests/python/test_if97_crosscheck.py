#!/usr/bin/python3
"""Cross-check shaftwork's IAPWS-IF97 model against python3-iapws (Debian package).

Usage: test_if97_crosscheck.py <shaftwork binary> <if97_probe binary>

Random states (fixed seed) over regions 1, 2, 3 and 5 and along the saturation line are
computed by python3-iapws's IAPWS97 and by shaftwork (through the test-only if97_probe,
one process for all states), and h, s, v and, for single-phase states, the isobaric
expansivity alpha_v = (1/v)(dv/dT)_p (IAPWS97.alfav) are compared:
  relative difference <= 1e-8 in regions 1, 2 and 5,
  relative difference <= 1e-6 in region 3 and along the saturation line (wet states).
"Relative" is |ours - theirs| / max(|theirs|, floor) with floor = R*T for h and R for s
(R = 461.526 J/(kg K)), and 1e-3/T for alpha_v: h and s are near 0 close to IF97's reference
state (liquid at the triple point), and alpha_v passes through 0 in liquid water at 277 K,
where a relative difference means nothing.

Where python3-iapws departs from the IAPWS releases, the releases win and the state is
not compared with python3-iapws as is; each rule is applied in code below (rule_* names)
and the number of states it touched is printed:
  rule_wet_region3   Wet states above psat(623.15 K) = 16.529 MPa. python3-iapws evaluates
                     region 3 at SR5-05's saturated densities without refining them
                     (_Region4), which leaves p(rho, Ts) off p by up to about 1e-3, and for
                     (P, h) and (P, s) in that wet zone it returns a single-phase region 3
                     solution instead of a wet mixture. There the reference is the lever
                     rule over python3-iapws's own refined saturated liquid and vapour
                     (IAPWS97(P=, x=0) and x=1, which it solves with fsolve on Eq. 28).
  rule_saturated_pt  (p, T) within 1e-6 T of Ts(p): python3-iapws returns the liquid;
                     shaftwork refuses (p, Tsat) as not fixing a state. Such draws are
                     skipped (with a continuous distribution they are rare).
  rule_low_pressure  python3-iapws refuses p below psat(273.15 K) = 611.213 Pa in every
                     region; IF97's region 2 and 5 extend lower. Samples start at 611.213 Pa.

It fails (exit status 1), never skips, when python3-iapws cannot be imported.
"""

import math
import random
import subprocess
import sys

try:
    from iapws import IAPWS97
    from iapws import iapws97 as py97
except ImportError as error:  # the cross-check must fail, not pass silently
    print(f"FAIL: python3-iapws cannot be imported ({error}); install the Debian package python3-iapws")
    print("0 passed, 1 failed")
    sys.exit(1)

R = 0.461526  # kJ/(kg K), IF97
P_MIN = 611.212677e-6  # MPa, psat(273.15 K)
P_SAT_623 = 16.5291642526  # MPa, psat(623.15 K)
P_C = 22.064  # MPa
SEED = 97
STATES_PER_REGION = 2500
WET_STATES = 2000
TOL_SINGLE = 1e-8  # regions 1, 2, 5
TOL_SATURATION = 1e-6  # region 3 and the saturation line

rng = random.Random(SEED)
rules = {"rule_wet_region3": 0, "rule_saturated_pt": 0, "rule_low_pressure": 0}


def log_uniform(low, high):
    return math.exp(rng.uniform(math.log(low), math.log(high)))


def b23_pressure(T):  # MPa, IF97 Eq. 5
    return 0.34805185628969e3 - 0.11671859879975e1 * T + 0.10192970039326e-2 * T * T


def b23_temperature(p):  # K, IF97 Eq. 6
    return 0.57254459862746e3 + math.sqrt((p - 0.13918839778870e2) / 0.10192970039326e-2)


def sample_pt(region):
    """(p in MPa, T in K) drawn inside one IF97 region."""
    while True:
        if region == 1:
            T = rng.uniform(273.15, 623.15)
            p = log_uniform(py97._PSat_T(T), 100.0)
        elif region == 2:
            T = rng.uniform(273.15, 1073.15)
            if T <= 623.15:
                high = py97._PSat_T(T)
            elif T <= 863.15:
                high = b23_pressure(T)
            else:
                high = 100.0
            rules["rule_low_pressure"] += 1
            p = log_uniform(P_MIN, high)
        elif region == 3:
            p = rng.uniform(P_SAT_623, 100.0)
            T = rng.uniform(623.15, b23_temperature(p))
        else:
            T = rng.uniform(1073.15, 2273.15)
            rules["rule_low_pressure"] += 1
            p = log_uniform(P_MIN, 50.0)
        if P_MIN <= p < P_C and abs(T - py97._TSat_P(p)) <= 1e-6 * T:
            rules["rule_saturated_pt"] += 1
            continue
        return p, T


class Case:
    """One query to the probe and the reference it is compared with."""

    def __init__(self, label, query, ref, tol, T):
        self.label = label
        self.query = query  # probe line, SI
        self.ref = ref  # (h kJ/kg, s kJ/(kg K), v m3/kg, x or None, alpha_v 1/K or None)
        self.tol = tol
        self.T = T


def props(st):
    x = st.x if st.region == 4 else None
    return (st.h, st.s, st.v, x, None if x is not None else st.alfav)


cases = []
for region in (1, 2, 3, 5):
    tol = TOL_SATURATION if region == 3 else TOL_SINGLE
    for i in range(STATES_PER_REGION):
        p, T = sample_pt(region)
        st = IAPWS97(P=p, T=T)
        cases.append(Case(f"region {region}, pt p={p!r} MPa T={T!r} K", f"pt {p * 1e6!r} {T!r}", props(st), tol, T))
        if i % 2 == 0:
            by_h = IAPWS97(P=p, h=st.h)
            cases.append(Case(f"region {region}, ph p={p!r} MPa h={st.h!r} kJ/kg", f"ph {p * 1e6!r} {st.h * 1e3!r}",
                              props(by_h), tol, by_h.T))
        else:
            by_s = IAPWS97(P=p, s=st.s)
            cases.append(Case(f"region {region}, ps p={p!r} MPa s={st.s!r} kJ/(kg K)", f"ps {p * 1e6!r} {st.s * 1e3!r}",
                              props(by_s), tol, by_s.T))

for i in range(WET_STATES):
    # Half over the whole line (log-uniform in p), half over region 3's part of it.
    p = log_uniform(P_MIN * 1.0001, P_C * 0.99999) if i % 2 == 0 else rng.uniform(P_SAT_623, P_C * 0.99999)
    x = rng.uniform(0.001, 0.999)
    Ts = py97._TSat_P(p)
    if p > P_SAT_623:
        rules["rule_wet_region3"] += 1
        liquid, vapour = IAPWS97(P=p, x=0), IAPWS97(P=p, x=1)
        h = liquid.h + x * (vapour.h - liquid.h)
        s = liquid.s + x * (vapour.s - liquid.s)
        v = liquid.v + x * (vapour.v - liquid.v)
        ref = (h, s, v, x, None)
        refs = {"px": ref, "ph": ref, "ps": ref}
    else:
        st = IAPWS97(P=p, x=x)
        ref = props(st)
        refs = {"px": ref, "ph": props(IAPWS97(P=p, h=st.h)), "ps": props(IAPWS97(P=p, s=st.s))}
        h, s = st.h, st.s
    cases.append(Case(f"wet, px p={p!r} MPa x={x!r}", f"px {p * 1e6!r} {x!r}", refs["px"], TOL_SATURATION, Ts))
    cases.append(Case(f"wet, ph p={p!r} MPa h={h!r} kJ/kg", f"ph {p * 1e6!r} {h * 1e3!r}", refs["ph"], TOL_SATURATION, Ts))
    cases.append(Case(f"wet, ps p={p!r} MPa s={s!r} kJ/(kg K)", f"ps {p * 1e6!r} {s * 1e3!r}", refs["ps"], TOL_SATURATION, Ts))

probe = sys.argv[2] if len(sys.argv) > 2 else None
if probe is None:
    print("FAIL: usage: test_if97_crosscheck.py <shaftwork binary> <if97_probe binary>")
    print("0 passed, 1 failed")
    sys.exit(1)
run = subprocess.run([probe], input="\n".join(c.query for c in cases) + "\n", capture_output=True, text=True,
                     check=False)
answers = run.stdout.splitlines()
if run.returncode != 0 or len(answers) != len(cases):
    print(f"FAIL: {probe} exited with {run.returncode} after {len(answers)} of {len(cases)} lines: {run.stderr}")
    print(f"0 passed, {len(cases)} failed")
    sys.exit(1)


def relative(ours, theirs, floor):
    return abs(ours - theirs) / max(abs(theirs), floor)


passed = failed = 0
worst = {}
for case, answer in zip(cases, answers):
    problem = None
    if answer.startswith("error"):
        problem = answer
    else:
        T, h, s, v, x, alpha = (float(f) for f in answer.split())
        h, s = h / 1e3, s / 1e3
        ref_h, ref_s, ref_v, ref_x, ref_alpha = case.ref
        diffs = {"h": relative(h, ref_h, R * case.T), "s": relative(s, ref_s, R), "v": relative(v, ref_v, 0.0)}
        if ref_alpha is not None:
            diffs["alpha_v"] = relative(alpha, ref_alpha, 1e-3 / case.T)
        if (ref_x is None) != math.isnan(x):
            problem = f"phase: ours x={x}, theirs x={ref_x}"
        elif ref_x is not None and abs(x - ref_x) > case.tol:
            problem = f"quality: ours {x!r}, theirs {ref_x!r}"
        else:
            kind = case.label.split(",")[0]
            for key, d in diffs.items():
                worst[(kind, key)] = max(worst.get((kind, key), 0.0), d)
            bad = {k: d for k, d in diffs.items() if d > case.tol}
            if bad:
                problem = "relative differences " + ", ".join(f"{k} {d:.2e}" for k, d in bad.items())
                problem += f" (ours h={h!r} s={s!r} v={v!r}; theirs h={ref_h!r} s={ref_s!r} v={ref_v!r})"
    if problem:
        failed += 1
        if failed <= 25:
            print(f"FAILED {case.label}: {problem}")
    else:
        passed += 1

for (kind, key), d in sorted(worst.items()):
    print(f"largest relative difference, {kind}, {key}: {d:.2e}")
for rule, count in rules.items():
    print(f"{rule}: applied to {count} draws")
print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
