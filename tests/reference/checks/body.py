"""Contact with a body region, clamping and crushing gaps.

Transient contact (ISO/TS 15066 Annex A, two-body model): integrated here
in time as two free masses — the part m_R at the contact speed and the body
region m_H at rest — joined by the region's spring k, with an optional pad
in series that stops yielding once squeezed by its thickness. The peak force
is reached when the two move together (the relative speed falls to zero);
the speed at which the peak force reaches a limit is found by root finding
on that simulation. The core uses the closed forms (reduced mass, energy
balance of the series spring).

Clamping: the part at rest pressing with F₀ while the mechanism spring
relaxes by k_s per metre the body and pad yield: F = F₀ − k_s·δ(F), solved
by root finding. Hinged-edge gaps from the rotated position of the edge.
"""

import math

import numpy as np
from scipy import integrate, optimize

from common import guarded
from models import _event

CHECK = "py.body.two_body"


def contact_force(delta, k_body, pad):
    """Force of body + pad in series at total compression delta."""
    if delta <= 0:
        return 0.0
    if pad is None:
        return k_body * delta
    kp, t = pad["stiffness"], pad.get("thickness")
    keff = k_body * kp / (k_body + kp)
    f = keff * delta
    if t is not None and f > kp * t:
        # Pad flat: it has yielded by t, the body takes the rest.
        f = k_body * (delta - t)
    return f


def two_body_peak(m_r, m_h, k_body, pad, v):
    """Peak contact force of the two-mass system from relative speed v."""
    if v == 0.0:
        return 0.0

    def rhs(_t, y):
        f = contact_force(y[0] - y[2], k_body, pad)
        return [y[1], -f / m_r, y[3], f / m_h]

    ev = _event(lambda _t, y: y[1] - y[3], -1)
    t_scale = math.sqrt(min(m_r, m_h) / k_body)
    x_scale = v * t_scale
    sol = integrate.solve_ivp(rhs, (0.0, 100.0 * t_scale * 10), [0.0, v, 0.0, 0.0], method="DOP853",
                              rtol=1e-12, atol=[1e-14 * x_scale, 1e-14 * v, 1e-14 * x_scale, 1e-14 * v],
                              events=[ev])
    y = sol.y_events[0][0]
    return contact_force(y[0] - y[2], k_body, pad)


def run(h, rec):
    cases = [
        ("hand, 10 kg part at 1.0 m/s, Ø 20 mm face", 10.0, 1.0,
         {"label": "Hands and fingers", "mass": 0.6, "stiffness": 75000.0},
         {"shape": "circle", "diameter": 0.02}, None, 280.0, 3.8e6),
        ("chest, 5 kg part at 1.2 m/s, pad 20 N/mm × 4 mm (bottoms)", 5.0, 1.2,
         {"label": "Chest", "mass": 40.0, "stiffness": 25000.0},
         {"shape": "edge", "length": 0.1, "width": 0.01}, {"stiffness": 20000.0, "thickness": 0.004}, 280.0, None),
        ("thigh, 30 kg part at 0.6 m/s, soft pad 8 N/mm never flat", 30.0, 0.6,
         {"label": "Thighs and knees", "mass": 75.0, "stiffness": 50000.0},
         {"shape": "given", "area": 0.0004}, {"stiffness": 8000.0}, 440.0, 5.0e6),
    ]
    for name, m_r, v, region, area, pad, fmax, pmax in cases:
        def one(name=name, m_r=m_r, v=v, region=region, area=area, pad=pad, fmax=fmax, pmax=pmax):
            inp = {"part_mass": m_r, "relative_speed": v, "region": region, "contact_area": area,
                   "padding": pad, "limits": {"kind": "permissible", "max_force": fmax, "max_pressure": pmax}}
            got = h.call("body", input=inp)
            kb, mh = region["stiffness"], region["mass"]
            f = two_body_peak(m_r, mh, kb, pad, v)
            rec.compare(CHECK, f"{name}: peak force", got["peak_force"], f)
            rec.compare(CHECK, f"{name}: energy transferred to the body F²/(2k)", got["transfer_energy"], f * f / (2 * kb))
            a = {"circle": lambda s: math.pi * s["diameter"] ** 2 / 4.0, "edge": lambda s: s["length"] * s["width"],
                 "given": lambda s: s["area"]}[area["shape"]](area)
            rec.compare(CHECK, f"{name}: pressure F/A", got["pressure"], f / a)
            speeds = {"by_force": fmax}
            if pmax is not None:
                speeds["by_pressure"] = pmax * a
            for key, limit in speeds.items():
                vlim = optimize.brentq(lambda u: two_body_peak(m_r, mh, kb, pad, u) - limit, 1e-6, 50.0,
                                       xtol=1e-15, rtol=1e-14)
                rec.compare(CHECK, f"{name}: permissible speed {key.replace('_', ' ')}",
                            got["permissible_speed"][key], vlim)
        guarded(rec, CHECK, name, one)

    clamp_cases = [
        ("hand clamped by spring 120 N + drive 40 N, spring 2 N/mm relaxing, pad flat", 120.0, 40.0, -5.0, 10.0,
         2000.0, {"label": "Hands and fingers", "mass": 0.6, "stiffness": 75000.0},
         {"stiffness": 30000.0, "thickness": 0.002}),
        ("arm clamped, stiff mechanism spring 20 N/mm, no pad", 200.0, 0.0, 15.0, 0.0, 20000.0,
         {"label": "Lower arms and wrist joints", "mass": 2.0, "stiffness": 40000.0}, None),
    ]
    for name, fs, fd, fg, ff, ks, region, pad in clamp_cases:
        def clamp(name=name, fs=fs, fd=fd, fg=fg, ff=ff, ks=ks, region=region, pad=pad):
            area = {"shape": "given", "area": 0.0002}
            got = h.call("clamping", input={"spring_force": fs, "drive_force": fd, "gravity_force": fg,
                                            "friction_force": ff, "spring_rate": ks, "region": region,
                                            "padding": pad, "contact_area": area})
            f0 = fs + fd + fg - ff
            kb = region["stiffness"]

            def yielded(f):
                d = f / kb
                if pad is not None:
                    d += min(f / pad["stiffness"], pad.get("thickness", math.inf))
                return d

            f = optimize.brentq(lambda x: x - (f0 - ks * yielded(x)), 0.0, f0, xtol=1e-14, rtol=1e-15)
            rec.compare("py.body.clamping", f"{name}: clamping force", got["clamping_force"], f)
            rec.compare("py.body.clamping", f"{name}: compression of body and pad", got["compression"], yielded(f))
            rec.compare("py.body.clamping", f"{name}: pressure", got["pressure"], f / 0.0002)
        guarded(rec, "py.body.clamping", name, clamp)

    def gaps():
        for r, theta in [(0.6, 0.05), (0.45, 0.3), (0.8, 1.2), (0.3, 2.5)]:
            closed = np.array([r, 0.0])
            edge = np.array([r * math.cos(theta), r * math.sin(theta)])
            ref = {"chord": float(np.linalg.norm(edge - closed)), "arc": r * theta, "normal": float(edge[1])}
            for measure, g in ref.items():
                if measure == "normal" and theta > math.pi / 2:
                    continue
                got = h.call("gap", radius=r, angle=theta, measure=measure)
                rec.compare("py.gap.hinged_edge", f"{measure} gap at r = {r} m, θ = {theta} rad", got["gap"], g)
                rec.compare("py.gap.hinged_edge", f"angle back from the {measure} gap at r = {r} m", got["angle_back"], theta)
    guarded(rec, "py.gap.hinged_edge", "hinged edge", gaps)
