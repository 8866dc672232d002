"""Springs: forces and stored energy against quadrature, interpolation and
the exact continuous-spring results.

Each force law is written here from its physics description (the model's
documentation and the reference table): Hooke's law, the helical and torsion
rates from the wire geometry, initial tension, a gas spring from its gas
volume (p·V^κ = const), the Almen–László disc force, a monotone cubic
interpolant of a measured table (scipy's own PchipInterpolator), and series
stacks by inverting each member's force law numerically. The core's work is
its closed form or exact interpolant integral; here it is a QUADPACK
quadrature of the force.
"""

import math

import numpy as np
from scipy import integrate, linalg, optimize
from scipy.interpolate import PchipInterpolator

from common import guarded

G_N = 9.80665


def quad(f, a, b):
    """∫_a^b f with QUADPACK at a relative tolerance of 1e-13."""
    val, _err = integrate.quad(f, a, b, epsabs=0.0, epsrel=1e-13, limit=200)
    return val


def ask(h, spec, qs, pairs, travel="loading"):
    return h.call("spring", spec=spec, q=list(qs), pairs=[list(p) for p in pairs], travel=travel)


def compare_law(h, rec, check, name, spec, force, qs, pairs, travel="loading"):
    """Core forces and work against `force` and its quadrature."""
    got = ask(h, spec, qs, pairs, travel)
    for q, f in zip(qs, got["force"]):
        rec.compare(check, f"{name}: force at q = {q:g} ({travel})", f, force(q))
    for (a, b), w in zip(pairs, got["work"]):
        rec.compare(check, f"{name}: work {a:g} → {b:g} ({travel})", w, quad(force, a, b))
    return got


# ── Helical, extension, torsion ─────────────────────────────────────────

def helical_rate(g, d, mean_d, n):
    """Rate of a close-coiled helical spring (torsion of the wire), N/m."""
    return g * d**4 / (8.0 * mean_d**3 * n)


def custom(g, e=None, rho=None):
    m = {"kind": "custom", "shear_modulus": g}
    if e is not None:
        m["youngs_modulus"] = e
    if rho is not None:
        m["density"] = rho
    return m


def helical_spec(d, coil, n, l0, material, ends="closed_ground", total=None):
    s = {
        "model": "helical",
        "wire_diameter": d,
        "coil_diameter": coil,
        "active_coils": n,
        "ends": ends,
        "free_length": l0,
        "material": material,
        "seating": "both_fixed",
    }
    if total is not None:
        s["total_coils"] = total
    return s


def linear_and_helical(h, rec):
    k = 12_000.0
    compare_law(
        h, rec, "py.spring.linear_energy", "linear 12 N/mm",
        {"model": "linear", "rate": k, "max_deflection": 0.08},
        lambda q: k * q, [0.0, 0.013, 0.05, 0.08], [(0.0, 0.05), (0.01, 0.07), (0.07, 0.02)],
    )
    cases = [
        # Bhandari Ex. 10.1 geometry with G = 81 370 N/mm² (mean diameter).
        ("d 7, D 42, n 8, G 81.37 GPa", 0.007, {"measured": "mean", "value": 0.042}, 8.0, 0.110,
         custom(81.37e9), 81.37e9, 0.042),
        # Outside diameter given: D = OD − d; EN 10270-1 grade, G = 81 500 N/mm²
        # as quoted by a spring maker (reference table §6, R2).
        ("d 2.5, OD 31, n 13, EN 10270-1", 0.0025, {"measured": "outside", "value": 0.031}, 13.0, 0.16,
         {"kind": "grade", "grade": "en10270_1_sm"}, 81.5e9, 0.031 - 0.0025),
        # Inside diameter given: D = ID + d.
        ("d 4, ID 30, n 6.5, G 79.5 GPa", 0.004, {"measured": "inside", "value": 0.030}, 6.5, 0.09,
         custom(79.5e9), 79.5e9, 0.030 + 0.004),
    ]
    for name, d, coil, n, l0, mat, g, mean_d in cases:
        def one(name=name, d=d, coil=coil, n=n, l0=l0, mat=mat, g=g, mean_d=mean_d):
            k = helical_rate(g, d, mean_d, n)
            spec = helical_spec(d, coil, n, l0, mat)
            got = compare_law(
                h, rec, "py.spring.helical_rate_energy", name, spec, lambda q: k * q,
                [0.001, 0.01], [(0.0, 0.01), (0.002, 0.015)],
            )
            rec.compare("py.spring.helical_rate_energy", f"{name}: rate", got["extra"]["rate"], k)
        guarded(rec, "py.spring.helical_rate_energy", name, one)


def rayleigh(h, rec):
    """One-third spring mass against the exact fixed–free spring.

    A uniform spring of mass m_s and rate k, fixed at one end, carries a mass
    m at the other. The wave equation along the spring gives the exact
    frequencies from β·tan β = m_s/m with ω = β·√(k/m_s). Rayleigh's
    approximation replaces the spring by m_s/3 at the load.
    """
    d, mean_d, n, g, rho = 0.004, 0.032, 10.0, 81.5e9, 7850.0
    spec = helical_spec(d, {"measured": "mean", "value": mean_d}, n, 0.12, custom(g, 206e9, rho))
    del spec["model"]
    k = helical_rate(g, d, mean_d, n)
    n_t = n + 2.0  # closed ends (reference table §6, Bhandari Ex. 10.1)
    m_s = rho * math.pi * d * d / 4.0 * math.pi * mean_d * n_t
    for r in [0.01, 0.1, 0.3]:
        m = m_s / r

        def one(r=r, m=m):
            got = h.call("helical", spec=spec, load_mass=m, force=100.0)
            rec.compare("py.spring.helical_rate_energy", f"spring mass ρ·(πd²/4)·(πD·n_t), r = {r}", got["spring_mass"], m_s)
            beta = optimize.brentq(lambda b: b * math.tan(b) - r, 1e-12, math.pi / 2 - 1e-12, xtol=1e-15, rtol=1e-15)
            omega = beta * math.sqrt(k / m_s)
            f_exact = omega / (2.0 * math.pi)
            rec.compare("py.spring.rayleigh_exact", f"natural frequency, spring/load mass {r}", got["natural_frequency_with_load"], f_exact)
            # The same correction identifies the rate from a timed period.
            n_osc = 20
            ident = h.call("identify", method="dynamic", input={
                "mass": m, "oscillations": n_osc, "time": n_osc / f_exact, "spring_mass": m_s,
                "timing_uncertainty": 0.0,
            })
            rec.compare("py.spring.rayleigh_exact", f"rate identified from the exact period, spring/load mass {r}", ident["rate"]["value"], k)
        guarded(rec, "py.spring.rayleigh_exact", f"r = {r}", one)

    def surge():
        got = h.call("helical", spec=spec, load_mass=1.0, force=0.0)
        # Fixed–fixed spring as N equal springs (each N·k) and N − 1 equal
        # masses m_s/N between them.
        big_n = 2000
        kk = big_n * k
        mm = m_s / big_n
        diag = np.full(big_n - 1, 2.0 * kk / mm)
        off = np.full(big_n - 2, -kk / mm)
        w2 = linalg.eigh_tridiagonal(diag, off, eigvals_only=True, select="i", select_range=(0, 0))[0]
        rec.compare("py.spring.surge_chain", "surge frequency ½·√(k/m_s)", got["surge_frequency"], math.sqrt(w2) / (2.0 * math.pi))
    guarded(rec, "py.spring.surge_chain", "surge", surge)


def extension_torsion(h, rec):
    f0, k = 35.0, 4_200.0
    compare_law(
        h, rec, "py.spring.extension_energy", "extension F₀ 35 N, 4.2 N/mm",
        {"model": "extension", "initial_tension": f0, "rate": {"from": "given", "rate": k}, "max_deflection": 0.12},
        lambda q: f0 + k * q if q > 0 else 0.0,
        [0.0, 1e-6, 0.05, 0.12], [(0.0, 0.05), (0.02, 0.12), (0.1, 0.03)],
    )
    # Geometry: rate as the helical spring (EN 13906-3).
    d, mean_d, n, g = 0.002, 0.016, 40.0, 79.5e9
    kg = helical_rate(g, d, mean_d, n)
    spec = {"model": "extension", "initial_tension": 5.0, "max_deflection": 0.05,
            "rate": {"from": "geometry", "wire_diameter": d, "coil_diameter": {"measured": "mean", "value": mean_d},
                     "active_coils": n, "material": custom(g)}}
    got = compare_law(h, rec, "py.spring.extension_energy", "extension from geometry", spec,
                      lambda q: 5.0 + kg * q if q > 0 else 0.0, [0.01], [(0.0, 0.04)])
    rec.compare("py.spring.extension_energy", "extension rate from geometry", got["extra"]["rate"], kg)

    # Torsion: k_θ = E·d⁴/(64·D·n) (bending of the wire), torque k_θ·θ.
    e, d, mean_d, n = 207e9, 0.0016, 0.018, 392.53
    kt = e * d**4 / (64.0 * mean_d * n)
    spec = {"model": "torsion", "max_angle": 6.0,
            "rate": {"from": "geometry", "wire_diameter": d, "coil_diameter": {"measured": "mean", "value": mean_d},
                     "active_coils": n, "material": custom(79e9, e)}}
    got = compare_law(h, rec, "py.spring.torsion_energy", "torsion from geometry", spec,
                      lambda q: kt * q, [0.5, 3.0], [(0.0, 3.0), (0.5, 2.0)])
    rec.compare("py.spring.torsion_energy", "torsion rate E·d⁴/(64·D·n)", got["extra"]["rate"], kt)
    compare_law(h, rec, "py.spring.torsion_energy", "torsion 2 N·m/rad",
                {"model": "torsion", "max_angle": 3.0, "rate": {"from": "given", "rate": 2.0}},
                lambda q: 2.0 * q, [0.5, 2.0], [(2.0, 0.5), (0.0, 3.0)])


# ── Gas spring ──────────────────────────────────────────────────────────

def gas_law(f1, ratio, stroke, kappa, band, reference="extension"):
    """Gas spring from its gas: the rod of area A entering a gas volume V₀
    compresses it to V₀ − A·s; p·V^κ = const, F_gas = p·A. The two data-sheet
    forces fix p₀·A and A/V₀; the seals add ±band/2 against the motion."""
    shift = {"extension": band / 2.0, "mean": 0.0, "compression": -band / 2.0}[reference]
    fg1 = f1 + shift            # gas force at full extension
    fg2 = ratio * f1 + shift    # gas force at the end of the stroke
    # (V₀/(V₀ − A·stroke))^κ = fg2/fg1  ⇒  A/V₀ = (1 − (fg1/fg2)^(1/κ))/stroke
    a_over_v0 = (1.0 - (fg1 / fg2) ** (1.0 / kappa)) / stroke

    def gas(s):
        volume_ratio = 1.0 - a_over_v0 * s   # V/V₀
        return fg1 * volume_ratio ** (-kappa)

    def force(s, travel):
        return gas(s) + (band / 2.0 if travel == "loading" else -band / 2.0)

    return force


def gas(h, rec):
    cases = [
        ("gas 400 N, 1.3, isothermal", 400.0, 1.3, 0.1, None, 0.0, "extension"),
        ("gas 250 N, 1.5, κ 1.4, band 40 N", 250.0, 1.5, 0.08, 1.4, 40.0, "extension"),
        ("gas 800 N, 1.2, κ 1.3, band 60 N, mean curve", 800.0, 1.2, 0.15, 1.3, 60.0, "mean"),
    ]
    for name, f1, ratio, stroke, kappa, band, ref in cases:
        def one(name=name, f1=f1, ratio=ratio, stroke=stroke, kappa=kappa, band=band, ref=ref):
            spec = {"model": "gas", "nominal_force": f1, "progression": ratio, "stroke": stroke,
                    "friction_band": band, "force_reference": ref}
            if kappa is not None:
                spec["polytropic_index"] = kappa
            law = gas_law(f1, ratio, stroke, kappa or 1.0, band, ref)
            for travel in ["loading", "unloading"]:
                compare_law(h, rec, "py.spring.gas_energy", name, spec, lambda s, t=travel: law(s, t),
                            [0.0, 0.3 * stroke, stroke], [(0.0, stroke), (0.2 * stroke, 0.7 * stroke)], travel)
        guarded(rec, "py.spring.gas_energy", name, one)


# ── Disc springs ────────────────────────────────────────────────────────

def disc_law(de, di, t, h0, e, mu, ns, np_, constant="k1", friction=None):
    """Almen–László disc force (no contact flats): for one disc
    F = 4E/(1 − μ²)·t⁴/(K·D_e²)·(s/t)·[(h₀/t − s/t)·(h₀/t − s/2t) + 1]
    with K₁ (EN 16984 / DIN 2092) or the textbook M (Bhandari Ex. 10.26);
    n_s discs in series share the deflection, n_p in parallel add force;
    parallel-stack friction divides by 1 ∓ (w_M·(n_p − 1) + w_R)."""
    delta = de / di
    if constant == "k1":
        kc = (1.0 / math.pi) * ((delta - 1.0) / delta) ** 2 / ((delta + 1.0) / (delta - 1.0) - 2.0 / math.log(delta))
    else:
        kc = 6.0 / (math.pi * math.log(delta)) * ((delta - 1.0) / delta) ** 2

    def one_disc(s):
        return 4.0 * e / (1.0 - mu**2) * t**4 / (kc * de**2) * (s / t) * ((h0 / t - s / t) * (h0 / t - s / (2 * t)) + 1.0)

    w = 0.0 if friction is None else friction[0] * (np_ - 1) + friction[1]

    def force(q, travel="loading"):
        factor = 1.0 / (1.0 - w) if travel == "loading" else 1.0 / (1.0 + w)
        return factor * np_ * one_disc(q / ns)

    return force


def disc(h, rec):
    cases = [
        # Series A 40 × 20.4 × 2.25, h₀ = 0.9 mm (DIN 2093 dimensions).
        ("disc 40×20.4×2.25, K₁", 0.040, 0.0204, 0.00225, 0.0009, 206e9, 0.3, 1, 1, "en16984_k1", None),
        # Bhandari Ex. 10.26 disc, textbook M.
        ("disc Bhandari 10.26, M", 0.154818, 0.154818 / 1.75, 0.00265298, 0.00397947, 207e9, 0.3, 1, 1, "almen_laszlo_m", None),
        # A stack of 3 in series of 2 in parallel with friction.
        ("disc stack 3×2 with friction", 0.050, 0.0254, 0.003, 0.0011, 206e9, 0.3, 3, 2, "en16984_k1", (0.02, 0.03)),
    ]
    for name, de, di, t, h0, e, mu, ns, np_, const, fr in cases:
        def one(name=name, de=de, di=di, t=t, h0=h0, e=e, mu=mu, ns=ns, np_=np_, const=const, fr=fr):
            spec = {"model": "disc", "outer_diameter": de, "inner_diameter": di, "thickness": t,
                    "cone_height": h0, "youngs_modulus": e, "poisson_ratio": mu,
                    "in_series": ns, "in_parallel": np_, "constant": const}
            if fr is not None:
                spec["friction"] = {"between_discs": fr[0], "at_edges": fr[1]}
            law = disc_law(de, di, t, h0, e, mu, ns, np_, "k1" if const == "en16984_k1" else "m", fr)
            top = ns * h0
            for travel in ["loading", "unloading"] if fr else ["loading"]:
                got = compare_law(h, rec, "py.spring.disc_energy", name, spec, lambda q, tr=travel: law(q, tr),
                                  [0.25 * top, 0.75 * top, top], [(0.0, top), (0.1 * top, 0.8 * top)], travel)
            rec.compare("py.spring.disc_energy", f"{name}: flat force of one disc", got["extra"]["flat_force"],
                        disc_law(de, di, t, h0, e, mu, 1, 1, "k1" if const == "en16984_k1" else "m")(h0))
        guarded(rec, "py.spring.disc_energy", name, one)


# ── Measured table ──────────────────────────────────────────────────────

LOADING = [(0.0, 0.0), (0.005, 180.0), (0.01, 300.0), (0.02, 520.0), (0.03, 900.0), (0.04, 1700.0)]
# Recorded on the way back (deflections decreasing), below the loading curve.
UNLOADING = [(0.04, 1500.0), (0.03, 640.0), (0.02, 330.0), (0.01, 150.0), (0.005, 60.0), (0.0, 0.0)]


def table_spec(loading=LOADING, unloading=UNLOADING):
    spec = {"model": "table", "loading": [{"deflection": q, "force": f} for q, f in loading]}
    if unloading is not None:
        spec["unloading"] = [{"deflection": q, "force": f} for q, f in unloading]
    return spec


def pchip_of(points):
    pts = sorted(points)
    return PchipInterpolator([p[0] for p in pts], [p[1] for p in pts], extrapolate=True)


def table(h, rec):
    def one():
        spec = table_spec()
        for travel, pts in [("loading", LOADING), ("unloading", UNLOADING)]:
            p = pchip_of(pts)
            qs = [0.0, 0.0025, 0.0137, 0.025, 0.0399, 0.04]
            pairs = [(0.0, 0.04), (0.0031, 0.0277), (0.035, 0.012)]
            got = ask(h, spec, qs, pairs, travel)
            for q, f in zip(qs, got["force"]):
                rec.compare("py.spring.table_pchip", f"table force at {q:g} ({travel})", f, float(p(q)))
            for (a, b), w in zip(pairs, got["work"]):
                rec.compare("py.spring.table_pchip", f"table work {a:g} → {b:g} ({travel})", w, float(p.integrate(a, b)))
    guarded(rec, "py.spring.table_pchip", "table", one)


# ── Series and parallel ─────────────────────────────────────────────────

def series_force(laws, q, limits):
    """Shared force F of springs in series at total deflection q: Σ q_i(F) = q,
    with q_i(F) the largest deflection of member i (within its range) whose
    force does not exceed F (a member at its limit stays there)."""
    def deflection(law, top, f):
        if law(top) <= f:
            return top
        if law(0.0) > f:
            return 0.0
        return optimize.brentq(lambda x: law(x) - f, 0.0, top, xtol=1e-16, rtol=1e-15, maxiter=500)

    def total(f):
        return sum(deflection(l, t, f) for l, t in zip(laws, limits)) - q

    hi = max(l(t) for l, t in zip(laws, limits))
    if total(hi) <= 0:
        return hi
    return optimize.brentq(total, 0.0, hi, xtol=1e-14, rtol=1e-15, maxiter=500)


def combine(h, rec):
    def one():
        k1, k2 = 20_000.0, 35_000.0
        f0, k3 = 40.0, 6_000.0
        gas_spec = {"model": "gas", "nominal_force": 300.0, "progression": 1.4, "stroke": 0.05,
                    "friction_band": 0.0, "polytropic_index": 1.2}
        gas_f = gas_law(300.0, 1.4, 0.05, 1.2, 0.0)
        members = [
            ({"model": "linear", "rate": k1, "max_deflection": 0.03}, lambda x: k1 * x, 0.03),
            ({"model": "extension", "initial_tension": f0, "rate": {"from": "given", "rate": k3}, "max_deflection": 0.08},
             lambda x: f0 + k3 * x if x > 0 else 0.0, 0.08),
            (gas_spec, lambda x: gas_f(x, "loading"), 0.05),
        ]
        spec = {"model": "series", "members": [m[0] for m in members]}
        laws = [m[1] for m in members]
        limits = [m[2] for m in members]
        top = sum(limits)
        qs = [0.002, 0.01, 0.04, 0.09, 0.15]
        pairs = [(0.0, 0.09), (0.01, 0.15), (0.0, top)]
        got = ask(h, spec, qs, pairs)
        force = lambda q: series_force(laws, q, limits)  # noqa: E731
        for q, f in zip(qs, got["force"]):
            rec.compare("py.spring.series_parallel", f"series force at {q:g}", f, force(q))
        # The series force has kinks where a member reaches its limit or its
        # force step; integrate piecewise between those points.
        for (a, b), w in zip(pairs, got["work"]):
            rec.compare("py.spring.series_parallel", f"series work {a:g} → {b:g}", w, quad_kinked(force, a, b))
        # Parallel: helical + table + disc stack share the deflection.
        disc_spec = {"model": "disc", "outer_diameter": 0.040, "inner_diameter": 0.0204, "thickness": 0.00225,
                     "cone_height": 0.0009, "youngs_modulus": 206e9, "poisson_ratio": 0.3,
                     "in_series": 20, "in_parallel": 1}
        d_law = disc_law(0.040, 0.0204, 0.00225, 0.0009, 206e9, 0.3, 20, 1)
        t_law = pchip_of(LOADING)
        kh = 15_000.0
        spec = {"model": "parallel", "members": [
            {"model": "linear", "rate": kh, "max_deflection": 0.05}, table_spec(unloading=None), disc_spec]}
        par = lambda q: kh * q + float(t_law(q)) + d_law(q)  # noqa: E731
        compare_law(h, rec, "py.spring.series_parallel", "parallel linear + table + disc stack", spec, par,
                    [0.004, 0.017], [(0.0, 0.018), (0.002, 0.011)])
    guarded(rec, "py.spring.series_parallel", "series and parallel", one)


def quad_kinked(f, a, b):
    """Quadrature over [a, b] split into small pieces (the integrand has kinks)."""
    lo, hi = min(a, b), max(a, b)
    edges = np.linspace(lo, hi, 41)
    total = sum(quad(f, x0, x1) for x0, x1 in zip(edges[:-1], edges[1:]))
    return total if b >= a else -total


def run(h, rec):
    linear_and_helical(h, rec)
    rayleigh(h, rec)
    extension_torsion(h, rec)
    gas(h, rec)
    disc(h, rec)
    table(h, rec)
    combine(h, rec)
