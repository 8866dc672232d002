"""Buffer strokes against scipy's solve_ivp.

Each case of cases/impact.json is integrated by the independent buffer model
of models.py (DOP853, rtol 1e-12) and by the core's `contact::buffer::impact`
at rtol 1e-12 (the check named in the case) and at the product settings
(`py.ode.product_settings`). The cases of cases/release_impact.json chain the
release and the stroke with the mechanism still acting
(`py.release_impact.continuous`).
"""

import math

import models
from checks.release import TIGHT, load
from common import guarded

FIGURES = ["stroke_used", "peak_force", "peak_deceleration", "compression_time", "energy_per_cycle",
           "mean_deceleration"]


def compare_stroke(rec, check, name, got, ref):
    rec.decide(check, f"{name}: how the stroke ends", got["end"], ref["end"])
    for key in FIGURES:
        rec.compare(check, f"{name}: {key.replace('_', ' ')}", got[key], ref[key])
    if ref["end"] == "bottomed":
        rec.compare(check, f"{name}: speed at the hard stop", got["residual_speed"], ref["residual_speed"])
    else:
        rec.compare(check, f"{name}: stop time", got["stop_time"], ref["stop_time"])
    if ref["end"] == "rebound":
        rec.compare(check, f"{name}: rebound speed", got["rebound_speed"], ref["rebound_speed"])
    for a, g, r in zip(ref.get("thresholds", []), got.get("time_above", []), ref.get("time_above", [])):
        rec.compare(check, f"{name}: time above {a:g} m/s²", g, r)


def run(h, rec):
    for case in load("impact.json"):
        name, check = case["name"], case["check"]

        def one(case=case, name=name, check=check):
            buf = models.BufferModel(case["buffer"])
            carrier = models.FreeCarrier(case["mass"], case.get("drive_force", 0.0), case.get("incline", 0.0),
                                         case.get("friction_force", 0.0))
            ref = models.impact(buf, carrier, case["speed"], case.get("thresholds", []))
            ref["thresholds"] = case.get("thresholds", [])
            req = {k: v for k, v in case.items() if k not in ("name", "check")}
            compare_stroke(rec, check, name, h.call("impact", **req, **TIGHT), ref)
            compare_stroke(rec, "py.ode.product_settings", name, h.call("impact", **req), ref)
        guarded(rec, check, name, one)

    check = "py.release_impact.continuous"
    for case in load("release_impact.json"):
        name = case["name"]

        def one(case=case, name=name):
            mech = models.part(case["part"])
            rel = models.release(mech)
            radius = case.get("buffer_radius") or mech.radius
            carrier = models.MechCarrier(mech, rel, radius)
            buf = models.BufferModel(case["buffer"])
            ref = models.impact(buf, carrier, rel["speed"] * radius)
            req = {"part": case["part"], "buffer": case["buffer"], "buffer_radius": case.get("buffer_radius")}
            got = h.call("release_impact", **req, **TIGHT)
            rec.decide(check, f"{name}: release reaches contact", got["release"]["end"], rel["end"])
            rec.compare(check, f"{name}: contact speed at the buffer", got["impact"]["contact_speed"], rel["speed"] * radius)
            rec.compare(check, f"{name}: effective mass at the buffer", got["impact"]["mass"], carrier.mass)
            compare_stroke(rec, check, name, got["impact"], ref)
            default = h.call("release_impact", **req)
            compare_stroke(rec, "py.ode.product_settings", name, default["impact"], ref)
        guarded(rec, check, name, one)
