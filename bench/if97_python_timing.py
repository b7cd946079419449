#!/usr/bin/python3
"""Time python3-iapws on the steam-turbine points of bench/bench_if97.cpp.

One point is the inlet IAPWS97(P=, T=) and the isentropic outlet IAPWS97(P=, s=), as
bench_if97 times shaftwork's from_pt and from_ps. Prints microseconds per point for the
superheated and the wet outlets; docs/performance.md records the result next to
bench_if97's.

    /usr/bin/python3 bench/if97_python_timing.py [repeats]
"""

import sys
import time

from iapws import IAPWS97

# (inlet pressure MPa, inlet temperature K, outlet pressure MPa): the points of bench_if97.cpp.
SUPERHEATED = [(10, 800, 2), (16, 820, 4), (6, 750, 1), (12, 850, 3),
               (4, 720, 0.8), (8, 780, 1.5), (14, 830, 3.5), (5, 760, 1.2)]
WET = [(10, 800, 0.01), (16, 820, 0.005), (6, 750, 0.02), (12, 850, 0.05),
       (4, 720, 0.1), (8, 780, 0.008), (14, 830, 0.015), (5, 760, 0.03)]


def time_points(points, repeats):
    """Best wall-clock and CPU time per point over `repeats` passes, in microseconds."""
    best_wall = best_cpu = float("inf")
    for _ in range(repeats):
        wall, cpu = time.perf_counter(), time.process_time()
        for p_in, T_in, p_out in points:
            inlet = IAPWS97(P=p_in, T=T_in)
            outlet = IAPWS97(P=p_out, s=inlet.s)
            assert outlet.h < inlet.h
        best_wall = min(best_wall, (time.perf_counter() - wall) / len(points))
        best_cpu = min(best_cpu, (time.process_time() - cpu) / len(points))
    return best_wall * 1e6, best_cpu * 1e6


def main():
    repeats = int(sys.argv[1]) if len(sys.argv) > 1 else 20
    for name, points in (("superheated", SUPERHEATED), ("wet", WET)):
        wall, cpu = time_points(points, repeats)
        print(f"python3-iapws, turbine point with {name} outlet: {wall:.0f} us wall, {cpu:.0f} us CPU per point "
              f"(best of {repeats} passes over {len(points)} points)")


if __name__ == "__main__":
    main()
