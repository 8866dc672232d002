"""scipy's solve_ivp on the power-law buffer case, for `cargo xtask bench`.

Solves the same release + impact as the core benchmark
(`core/benches/core.rs`, case in `bench/power_law_case.json`) with
scipy.integrate.solve_ivp, method RK45 (Dormand–Prince 5(4)), at the same
rtol and atol, phase by phase with terminal events:

1. on the spring: m·x'' = k·(s0 − x) until x = s0 (the part leaves it);
2. coasting: x'' = 0 until x = travel (contact);
3. compression: m·y'' = −a·yⁿ, y = x − travel, until y' = 0.

Times one whole solve with time.perf_counter over repeated runs and prints
one JSON line: the median time per solve (s), the number of right-hand-side
evaluations, and the errors against the closed forms (work–energy theorem:
½·m·v² = ½·k·s0² at contact, ½·m·v² = a·x^(n+1)/(n+1) at the largest
compression). Run with the project's .venv (pinned scipy).
"""

import json
import math
import pathlib
import statistics
import sys
import time

import scipy
from scipy.integrate import solve_ivp

CASE = pathlib.Path(__file__).with_name("power_law_case.json")


def event(fn, direction):
    fn.terminal = True
    fn.direction = direction
    return fn


def solve(c):
    m, k, s0 = c["mass"], c["spring_rate"], c["latched_deflection"]
    a, n, travel = c["buffer_coefficient"], c["buffer_exponent"], c["travel"]
    opts = {"method": "RK45", "rtol": c["rtol"], "atol": c["atol"]}
    nfev = 0

    def on_spring(_t, y):
        return [y[1], k * (s0 - y[0]) / m]

    sol = solve_ivp(on_spring, (0.0, 1e3), [0.0, 0.0], events=[event(lambda _t, y: y[0] - s0, 1)], **opts)
    nfev += sol.nfev
    t1, y1 = sol.t_events[0][0], sol.y_events[0][0]

    def coast(_t, y):
        return [y[1], 0.0]

    sol = solve_ivp(coast, (t1, t1 + 1e3), y1, events=[event(lambda _t, y: y[0] - travel, 1)], **opts)
    nfev += sol.nfev
    t2, y2 = sol.t_events[0][0], sol.y_events[0][0]
    v_contact = y2[1]

    def compress(_t, y):
        return [y[1], -a * math.copysign(abs(y[0]) ** n, y[0]) / m]

    sol = solve_ivp(compress, (t2, t2 + 1e3), [0.0, v_contact], events=[event(lambda _t, y: y[1], -1)], **opts)
    nfev += sol.nfev
    stroke = sol.y_events[0][0][0]
    return stroke, v_contact, nfev


def main():
    c = json.loads(CASE.read_text())
    energy = 0.5 * c["spring_rate"] * c["latched_deflection"] ** 2
    n = c["buffer_exponent"]
    x = ((n + 1.0) * energy / c["buffer_coefficient"]) ** (1.0 / (n + 1.0))
    v = math.sqrt(2.0 * energy / c["mass"])
    stroke, v_contact, nfev = solve(c)
    budget = float(sys.argv[1]) if len(sys.argv) > 1 else 3.0
    times = []
    start = time.perf_counter()
    while len(times) < 5 or (time.perf_counter() - start < budget and len(times) < 2000):
        t0 = time.perf_counter()
        solve(c)
        times.append(time.perf_counter() - t0)
    print(json.dumps({
        "id": "scipy_power_law_solve",
        "scipy": scipy.__version__,
        "method": "RK45",
        "rtol": c["rtol"],
        "atol": c["atol"],
        "runs": len(times),
        "median_s": statistics.median(times),
        "min_s": min(times),
        "rhs_evaluations": nfev,
        "stroke": stroke,
        "stroke_closed_form": x,
        "stroke_rel_error": abs(stroke - x) / x,
        "contact_speed_rel_error": abs(v_contact - v) / v,
    }))


if __name__ == "__main__":
    main()
