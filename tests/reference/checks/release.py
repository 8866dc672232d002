"""Release of sliding and hinged parts against scipy's solve_ivp.

Each case of cases/release.json is integrated here by the independent model
of models.py (DOP853, rtol 1e-12) and by the core through the harness twice:
at rtol 1e-12 (the equations must agree: `py.release.translating`,
`py.release.rotating`) and at the product settings (`py.ode.product_settings`).
"""

import json
import os

import models
from common import guarded

HERE = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
TIGHT = {"rtol": 1e-12, "atol": 1e-15}


def load(name):
    with open(os.path.join(HERE, "cases", name), encoding="utf-8") as f:
        return json.load(f)["cases"]


def mech_forces_at_contact(ref):
    mech = ref["mech"]
    f = mech.forces(mech.travel, 1.0, ref["engaged"])
    return max((f.active - f.friction) / mech.radius, 0.0)


def compare_release(rec, check, name, got, ref, radius):
    rec.decide(check, f"{name}: how the release ends", got["end"], ref["end"])
    rec.compare(check, f"{name}: time at the end", got["time"], ref["time"])
    if ref["end"] == "contact":
        rec.compare(check, f"{name}: speed at contact (ODE)", got["speed_ode"], ref["speed"])
        rec.compare(check, f"{name}: hazard-point speed at contact", got["hazard_speed"], ref["speed"] * radius)
    else:
        rec.compare(check, f"{name}: stall position", got["position"], ref["position"])
        # Statics at the closing point: (Q_spring + Q_drive + Q_gravity −
        # Q_friction)/r with the spring acting if the part is still on it.
        f = mech_forces_at_contact(ref)
        rec.compare(check, f"{name}: static force at the closing point", got["closing_force_static"], f)
        rec.compare(check, f"{name}: effective mass at the hazard point", got["hazard_mass"], ref["hazard_mass"])
    if ref["left_spring_at"] is not None or got["left_spring_at"] is not None:
        rec.compare(check, f"{name}: where the part leaves its spring", got["left_spring_at"], ref["left_spring_at"])


def run(h, rec):
    for case in load("release.json"):
        name, check = case["name"], case["check"]

        def one(case=case, name=name, check=check):
            mech = models.part(case["part"])
            ref = models.release(mech)
            ref["mech"] = mech
            ref["hazard_mass"] = mech.inertia(ref["engaged"]) / mech.radius**2
            tight = h.call("release", part=case["part"], **TIGHT)
            compare_release(rec, check, name, tight, ref, mech.radius)
            if ref["end"] == "contact" and tight["speed_energy_balance"] is not None:
                rec.compare(check, f"{name}: speed at contact (work–energy closed form)", tight["speed_energy_balance"], ref["speed"])
            default = h.call("release", part=case["part"])
            compare_release(rec, "py.ode.product_settings", name, default, ref, mech.radius)
        guarded(rec, check, name, one)
