"""Field identification against first-order propagation by `uncertainties`.

The core propagates standard uncertainties with sensitivity coefficients by
central differences (GUM 5.1.2); the uncertainties package differentiates
the same measurement model exactly. Each model is written here from its
description: k = m·g/δ; k = 4π²·N²·(m + m_s/3)/t²; f = √(g/δ)/(2π); a
two-point gauge as a straight line through readings that share one gauge
zero offset. Rectangular reading tolerances ±a give u = a/√3 (GUM 4.3.7);
the default gravity is g_n with the sea-level spread ±0.026 m/s² as stated
in the core's documentation.
"""

import math

from uncertainties import ufloat

from common import guarded

G_N = 9.80665
CHECK = "py.identify.gum"


def compare(rec, name, got, ref):
    rec.compare(CHECK, f"{name}: value", got["value"], ref.nominal_value)
    rec.compare(CHECK, f"{name}: standard uncertainty", got["standard_uncertainty"], ref.std_dev)


def run(h, rec):
    g_default = ufloat(G_N, 0.026 / math.sqrt(3.0))

    def static():
        m, delta, a = ufloat(2.5, 0.001), 0.0123, 0.0002
        got = h.call("identify", method="static", input={"mass": 2.5, "mass_uncertainty": 0.001, "sag": delta,
                                                         "sag_tolerance": a})
        k = m * g_default / ufloat(delta, a / math.sqrt(3.0))
        compare(rec, "static sag k = m·g/δ", got["rate"], k)
        got = h.call("identify", method="static", input={"mass": 12.0, "mass_uncertainty": 0.01, "sag": 0.031,
                                                         "sag_tolerance": 0.0005, "gravity": 9.81,
                                                         "gravity_uncertainty": 0.001})
        k = ufloat(12.0, 0.01) * ufloat(9.81, 0.001) / ufloat(0.031, 0.0005 / math.sqrt(3.0))
        compare(rec, "static sag with local gravity", got["rate"], k)
    guarded(rec, CHECK, "static sag", static)

    def dynamic():
        n = 20
        got = h.call("identify", method="dynamic", input={
            "mass": 1.2, "mass_uncertainty": 0.002, "oscillations": n, "time": 8.4, "timing_uncertainty": 0.1,
            "spring_mass": 0.05, "spring_mass_uncertainty": 0.002})
        m, t, ms = ufloat(1.2, 0.002), ufloat(8.4, 0.1), ufloat(0.05, 0.002)
        k = 4.0 * math.pi**2 * n**2 * (m + ms / 3.0) / t**2
        compare(rec, "timed oscillation k = 4π²N²(m + m_s/3)/t²", got["rate"], k)
    guarded(rec, CHECK, "timed oscillation", dynamic)

    def frequency():
        got = h.call("identify", method="frequency_from_sag", sag=0.006, sag_tolerance=0.0002)
        f = (g_default / ufloat(0.006, 0.0002 / math.sqrt(3.0))) ** 0.5 / (2.0 * math.pi)
        compare(rec, "frequency from sag f = √(g/δ)/2π", got, f)
    guarded(rec, CHECK, "frequency from sag", frequency)

    def two_point():
        for kind, l1, f1, l2, f2, closed in [("compression", 0.080, 120.0, 0.060, 200.0, None),
                                             ("extension", 0.150, 60.0, 0.190, 140.0, 0.130)]:
            ul, uf, uz, at = 0.0002, 0.5, 0.3, 0.070 if kind == "compression" else 0.17
            inp = {"kind": kind, "length_1": l1, "force_1": f1, "length_2": l2, "force_2": f2,
                   "length_uncertainty": ul, "force_uncertainty": uf, "gauge_zero_uncertainty": uz,
                   "at_length": at}
            if closed is not None:
                inp["closed_length"] = closed
            got = h.call("identify", method="two_point", input=inp)
            # Readings share one gauge zero offset z: true forces are F_i − z.
            z = ufloat(0.0, uz)
            L1, L2 = ufloat(l1, ul), ufloat(l2, ul)
            F1, F2 = ufloat(f1, uf) - z, ufloat(f2, uf) - z
            slope = (F2 - F1) / (L2 - L1)
            compare(rec, f"two-point {kind}: rate |ΔF/ΔL|", got["rate"]["rate"], slope if slope.nominal_value > 0 else -slope)
            compare(rec, f"two-point {kind}: zero-force length", got["zero_force_length"], L1 - F1 / slope)
            compare(rec, f"two-point {kind}: force at {at} m", got["force_at_length"], F1 + slope * (ufloat(at, ul) - L1))
            if closed is not None:
                compare(rec, f"two-point {kind}: initial tension at the closed length", got["initial_tension"],
                        F1 + slope * (ufloat(closed, ul) - L1))
    guarded(rec, CHECK, "two-point gauge", two_point)
