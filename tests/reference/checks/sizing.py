"""Buffer sizing against a forward integration by scipy's solve_ivp.

Each sized design (the one at the least stroke that meets the limits, and
the softest one using the whole available stroke) is integrated here with
only its setting: m·dv/dt = F_n − F_buffer(x, v), F_n = drive + gravity −
friction, from the impact speed until the part stops (an orifice damper:
until it has slowed to its residual speed). The force laws are written from
their descriptions: k·x, a·xⁿ, the constant mean force of an ideal absorber,
a gas spring whose gas volume falls linearly with the stroke so that the
force rises by the progression p over the design stroke (p·V^κ = const),
and c·v². The stroke, peak force, stopping time and mean deceleration must
equal the sized ones, and every limit must hold.
"""

import math

import numpy as np
from scipy import integrate

from common import guarded
from models import _event, _peak

CHECK = "py.sizing.solve_ivp"

DUTIES = [
    ("60 kg at 1.4 m/s, drive 400 N, gravity 100 N, friction 50 N", {
        "moving": {"kind": "translating", "mass": 60.0}, "impact_speed": 1.4, "drive_force": 400.0,
        "gravity_force": 100.0, "friction_force": 50.0, "cycles_per_hour": 120.0,
        "limits": {"peak_force": 6000.0, "peak_deceleration": 70.0, "mean_deceleration": 30.0, "stroke": 0.2}}),
    ("rotating I = 2.4 kg·m² at r = 0.5 m, 2.0 m/s, no drive", {
        "moving": {"kind": "rotating", "inertia": 2.4, "radius": 0.5}, "impact_speed": 2.0, "drive_force": 0.0,
        "gravity_force": 0.0, "friction_force": 0.0, "cycles_per_hour": 0.0,
        "limits": {"peak_force": 2500.0, "stroke": 0.12}}),
]

TYPES = [
    {"kind": "linear_spring"},
    {"kind": "power_law", "exponent": 2.5},
    {"kind": "power_law", "exponent": 1.0},
    {"kind": "constant_force", "efficiency": 1.0},
    {"kind": "gas_spring", "progression": 1.3, "polytropic_index": 1.4},
    {"kind": "gas_spring", "progression": 2.0, "polytropic_index": 1.0},
    {"kind": "orifice", "residual_speed": 0.5},
]


def law(setting, stroke):
    kind = setting["kind"]
    if kind == "linear_spring":
        k = setting["rate"]
        return lambda x, v: k * x
    if kind == "power_law":
        a, n = setting["coefficient"], setting["exponent"]
        return lambda x, v: a * max(x, 0.0) ** n
    if kind == "constant_force":
        f = setting["mean_force"]
        return lambda x, v: f
    if kind == "gas_spring":
        f1, p, kappa = setting["force_at_contact"], setting["progression"], setting["polytropic_index"]
        # V(x)/V₀ = 1 − b·x/s with (V₀/V(s))^κ = p.
        b = 1.0 - p ** (-1.0 / kappa)
        return lambda x, v: f1 * (1.0 - b * x / stroke) ** (-kappa)
    if kind == "orifice":
        c = setting["coefficient"]
        return lambda x, v: c * v * abs(v)
    raise ValueError(kind)


def mass_of(moving):
    if moving["kind"] == "translating":
        return moving["mass"]
    return moving["inertia"] / moving["radius"] ** 2


def forward(duty, design):
    m = mass_of(duty["moving"])
    fn = duty["drive_force"] + duty["gravity_force"] - duty["friction_force"]
    v0 = duty["impact_speed"]
    target = design["residual_speed"]
    f = law(design["setting"], design["stroke"])

    def rhs(_t, y):
        return [y[1], (fn - f(y[0], y[1])) / m]

    ev = _event(lambda _t, y: y[1] - target, -1)
    sol = integrate.solve_ivp(rhs, (0.0, 100.0), [0.0, v0], method="DOP853", rtol=1e-12,
                              atol=[1e-14 * design["stroke"], 1e-14 * v0], events=[ev], dense_output=True)
    t1 = sol.t_events[0][0]
    x1 = sol.y_events[0][0][0]
    peak = _peak(sol, 0.0, t1, lambda t: f(*sol.sol(t)))
    return {"stroke": x1, "peak_force": peak, "stop_time": t1, "peak_deceleration": (peak - fn) / m,
            "mean_deceleration": (v0 - target) / t1}


def run(h, rec):
    tol = rec.tolerance(CHECK)
    for dname, duty in DUTIES:
        for bt in TYPES:
            label = f"{dname}, {bt['kind']} {bt.get('exponent', bt.get('progression', bt.get('residual_speed', '')))}"

            def one(duty=duty, bt=bt, label=label):
                out = h.call("sizing", input=duty, buffer=bt)
                res = out["result"]
                if res["kind"] != "feasible":
                    rec.error(CHECK, label, f"sizing found no design: {res}")
                    return
                for which in ["required", "using_available_stroke"]:
                    d = res.get(which)
                    if d is None:
                        continue
                    ref = forward(duty, d)
                    for key in ["stroke", "peak_force", "stop_time", "peak_deceleration", "mean_deceleration"]:
                        rec.compare(CHECK, f"{label} ({which}): {key.replace('_', ' ')}", d[key], ref[key])
                    lim = duty["limits"]
                    for key, lk in [("peak_force", "peak_force"), ("peak_deceleration", "peak_deceleration"),
                                    ("mean_deceleration", "mean_deceleration"), ("stroke", "stroke")]:
                        if lim.get(lk) is not None:
                            rec.decide(CHECK, f"{label} ({which}): integrated {key.replace('_', ' ')} within its limit",
                                       ref[key] <= lim[lk] * (1.0 + tol), True)
            guarded(rec, CHECK, label, one)
