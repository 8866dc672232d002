"""Independent models of the moving parts and buffers, integrated by scipy.

Written from the physics description (the core's module documentation and
the project's reference table), not from the core's code:

- a spring acting along the travel pushes with its force on the branch of
  the motion (a gas spring's seals and a measured unloading curve make the
  force lower while the spring gives energy back);
- a sliding part: (m + m_s)·ẍ = F_spring − m·g·sin α + F_D − F_friction − c·ẋ,
  with m_s the spring's moving-mass share while the part is on the spring
  (one third of a helical spring's wire mass) and F_friction = μ·m·g·|cos α|;
- a hinged part: I·θ̈ = T_spring + T_gravity + T_D − T_friction − c·θ̇, with
  the gravity torque taken from the weight of the centre of mass rotated in
  3-D about the tilted hinge axis (Rodrigues' formula), and a strut's torque
  as the 2-D cross product of the pin position with the strut force along
  the pin-to-pin line;
- a buffer stroke: m·ẍ = P(x) − F_friction − n·F_buffer(x, ẋ), then the
  return along the buffer's unloading law (or e² × loading law) if it pushes
  the part back out.

Everything is integrated with scipy.integrate.solve_ivp, method DOP853,
rtol 1e-12, atol 1e-14 × the scale of each state component, with terminal
events located on the dense output.
"""

import math

import numpy as np
from scipy import integrate, optimize
from scipy.interpolate import PchipInterpolator

G_N = 9.80665
RTOL = 1e-12
ATOL_FACTOR = 1e-14


# ── Springs ─────────────────────────────────────────────────────────────

class Law:
    """A spring's force on both branches, its range and moving-mass share."""

    def __init__(self, force, low, high, mass_share=0.0):
        self.force = force  # force(s, loading: bool)
        self.low = low
        self.high = high
        self.mass_share = mass_share


def spring_law(spec):
    """Build a force law from a core SpringSpec (JSON), from the formulas."""
    model = spec["model"]
    if model == "linear":
        k = spec["rate"]
        top = spec.get("max_deflection")
        if spec.get("solid_length") is not None:
            t2 = spec["free_length"] - spec["solid_length"]
            top = t2 if top is None else min(top, t2)
        return Law(lambda s, loading: k * s, 0.0, top)
    if model == "helical":
        d = spec["wire_diameter"]
        c = spec["coil_diameter"]
        mean = {"mean": c["value"], "outside": c["value"] - d, "inside": c["value"] + d}[c["measured"]]
        mat = spec["material"]
        g = mat["shear_modulus"]
        n = spec["active_coils"]
        k = g * d**4 / (8.0 * mean**3 * n)
        n_t = spec.get("total_coils") or (n + 2.0)  # closed ends
        assert spec["ends"] in ("closed_ground",), "the suite uses closed, ground ends"
        solid = n_t * d
        share = 0.0
        if mat.get("density"):
            share = mat["density"] * math.pi * d * d / 4.0 * math.pi * mean * n_t / 3.0
        return Law(lambda s, loading: k * s, 0.0, spec["free_length"] - solid, share)
    if model == "torsion":
        r = spec["rate"]
        k = r["rate"]
        return Law(lambda s, loading: k * s, 0.0, spec["max_angle"])
    if model == "gas":
        f1, ratio, stroke = spec["nominal_force"], spec["progression"], spec["stroke"]
        band = spec.get("friction_band", 0.0)
        kappa = spec.get("polytropic_index") or 1.0
        ref = spec.get("force_reference", "extension")
        shift = {"extension": band / 2.0, "mean": 0.0, "compression": -band / 2.0}[ref]
        fg1, fg2 = f1 + shift, ratio * f1 + shift
        a_over_v0 = (1.0 - (fg1 / fg2) ** (1.0 / kappa)) / stroke

        def gas(s, loading):
            return fg1 * (1.0 - a_over_v0 * s) ** (-kappa) + (band / 2.0 if loading else -band / 2.0)
        return Law(gas, 0.0, stroke, spec.get("moving_mass") or 0.0)
    if model == "table":
        def pchip(points):
            pts = sorted((p["deflection"], p["force"]) for p in points)
            return PchipInterpolator([p[0] for p in pts], [p[1] for p in pts], extrapolate=True)
        load = pchip(spec["loading"])
        unload = pchip(spec["unloading"]) if spec.get("unloading") else load
        lo = max(load.x[0], unload.x[0])
        hi = min(load.x[-1], unload.x[-1])
        return Law(lambda s, loading: float(load(s) if loading else unload(s)), lo, hi,
                   spec.get("effective_mass") or 0.0)
    raise ValueError(f"no Python law for spring model {model}")


# ── Moving parts ────────────────────────────────────────────────────────

class Forces:
    def __init__(self, spring, gravity, drive, friction, damping):
        self.spring, self.gravity, self.drive = spring, gravity, drive
        self.friction, self.damping = friction, damping

    @property
    def active(self):
        return self.spring + self.gravity + self.drive


class Direct:
    """A spring whose deflection changes one for one with the travel."""

    def __init__(self, j):
        self.law = spring_law(j["spec"])
        self.s0 = j["deflection_at_latch"]
        self.slope = 1.0 if j["sense"] == "loads" else -1.0
        self.detaches = j.get("detaches", False)

    def deflection(self, q):
        return self.s0 + self.slope * q

    def generalised(self, q, direction):
        # Moving forward the deflection changes by slope·dq: loading when it grows.
        loading = self.slope * direction > 0
        return -self.law.force(self.deflection(q), loading) * self.slope


class StrutMount:
    """A linear or gas spring between a frame pin A and a pin B on the part."""

    def __init__(self, j):
        self.law = spring_law(j["spec"])
        self.a = np.array(j["frame_point"], dtype=float)
        self.rb = j["part_point_radius"]
        self.b0 = j["part_point_angle"]
        self.l0 = j["free_length"]
        self.detaches = False
        assert not j.get("extension", False)

    def pin(self, q):
        ang = self.b0 + q
        return self.rb * np.array([math.cos(ang), math.sin(ang)])

    def deflection(self, q):
        return self.l0 - float(np.linalg.norm(self.pin(q) - self.a))

    def generalised(self, q, direction):
        b = self.pin(q)
        d = b - self.a
        length = float(np.linalg.norm(d))
        # Velocity of B per unit dθ; the strut shortens (is loaded) when B
        # moves towards A.
        db = self.rb * np.array([-math.sin(self.b0 + q), math.cos(self.b0 + q)])
        dlen = float(d @ db) / length
        loading = -dlen * direction > 0
        f = self.law.force(self.l0 - length, loading)
        force_on_b = f * d / length   # a compressed strut pushes B away from A
        return float(b[0] * force_on_b[1] - b[1] * force_on_b[0])


def mount(j):
    if j is None:
        return None
    return Direct(j) if j["kind"] == "direct" else StrutMount(j)


class Translating:
    def __init__(self, j):
        self.m = j["mass"]
        self.travel = j["travel"]
        alpha = j.get("incline", 0.0)
        self.gravity = -self.m * G_N * math.sin(alpha)
        if j.get("friction_coefficient") is not None:
            self.friction = j["friction_coefficient"] * self.m * G_N * abs(math.cos(alpha))
        else:
            self.friction = j.get("friction_force") or 0.0
        self.damping = j.get("damping", 0.0)
        self.drive = j.get("drive_force", 0.0)
        self.spring = mount(j.get("spring"))
        self.share = self.spring.law.mass_share if (self.spring and j.get("include_spring_mass")) else 0.0
        self.radius = 1.0

    def inertia(self, engaged):
        return self.m + (self.share if engaged else 0.0)

    def forces(self, q, direction, engaged):
        spring = self.spring.generalised(q, direction) if (engaged and self.spring) else 0.0
        return Forces(spring, self.gravity, self.drive, self.friction, self.damping)


def rodrigues(v, axis, angle):
    """Rotate vector v about the unit axis by angle (right-hand rule)."""
    return (v * math.cos(angle) + np.cross(axis, v) * math.sin(angle)
            + axis * float(axis @ v) * (1.0 - math.cos(angle)))


class Rotating:
    def __init__(self, j):
        sh = j["inertia"]
        if sh["shape"] == "plate_about_edge":
            self.inertia_value = sh["mass"] * sh["width"] ** 2 / 3.0
            self.m, self.r_cg = sh["mass"], sh["width"] / 2.0
        elif sh["shape"] == "rod_about_end":
            self.inertia_value = sh["mass"] * sh["length"] ** 2 / 3.0
            self.m, self.r_cg = sh["mass"], sh["length"] / 2.0
        elif sh["shape"] == "given":
            self.inertia_value, self.m, self.r_cg = sh["inertia"], sh["mass"], sh["cg_radius"]
        else:
            raise ValueError(sh["shape"])
        tau = j.get("hinge_tilt", 0.0)
        # Frame: z up; the plane of rotation holds x (horizontal) and y (up
        # its slope); the hinge axis is x × y, tilted by τ from the vertical.
        self.ex = np.array([1.0, 0.0, 0.0])
        self.ey = np.array([0.0, math.cos(tau), math.sin(tau)])
        self.axis = np.cross(self.ex, self.ey)
        psi0 = j.get("cg_angle_at_latch", 0.0)
        self.cg0 = self.r_cg * (math.cos(psi0) * self.ex + math.sin(psi0) * self.ey)
        self.travel = j["travel"]
        self.friction = j.get("friction_torque", 0.0)
        self.damping = j.get("damping", 0.0)
        self.drive = j.get("drive_torque", 0.0)
        self.radius = j["hazard_radius"]
        self.spring = mount(j.get("spring"))
        self.weight = np.array([0.0, 0.0, -self.m * G_N])

    def inertia(self, engaged):
        return self.inertia_value

    def gravity_torque(self, q):
        p = rodrigues(self.cg0, self.axis, q)
        return float(np.cross(p, self.weight) @ self.axis)

    def forces(self, q, direction, engaged):
        spring = self.spring.generalised(q, direction) if (engaged and self.spring) else 0.0
        return Forces(spring, self.gravity_torque(q), self.drive, self.friction, self.damping)


def part(j):
    return Translating(j) if j["kind"] == "translating" else Rotating(j)


def _event(fn, direction):
    fn.terminal = True
    fn.direction = direction
    return fn


def release(mech):
    """Motion from rest at the latch to contact or stall.

    Returns a dict: end ('contact' or 'stall'), time, position, speed, the
    position where the part left its spring (or None), whether the spring is
    still engaged, and the dense solutions of each phase."""
    sp = mech.spring
    engaged = sp is not None and not (sp.detaches and sp.deflection(0.0) <= sp.law.low)
    t, y = 0.0, np.array([0.0, 0.0])
    left = None
    phases = []
    f0 = mech.forces(0.0, 1.0, engaged)
    if f0.active <= f0.friction:
        return {"end": "stall", "time": 0.0, "position": 0.0, "speed": 0.0, "left_spring_at": None,
                "engaged": engaged, "phases": []}
    # Scales for the absolute tolerance.
    scale_q = mech.travel
    for _ in range(3):
        m_inertia = mech.inertia(engaged)

        def rhs(_t, s, engaged=engaged, m_inertia=m_inertia):
            f = mech.forces(s[0], 1.0, engaged)
            return [s[1], (f.active - f.friction - f.damping * s[1]) / m_inertia]

        events = [
            _event(lambda _t, s: s[0] - mech.travel, 1),
            _event(lambda _t, s: s[1], -1),
        ]
        if engaged and sp is not None and sp.detaches:
            events.append(_event(lambda _t, s: sp.deflection(s[0]) - sp.law.low, -1))
        v_scale = max(abs(y[1]), math.sqrt(2.0 * abs(f0.active) * scale_q / m_inertia))
        sol = integrate.solve_ivp(rhs, (t, t + 1e3), y, method="DOP853", rtol=RTOL,
                                  atol=[ATOL_FACTOR * scale_q, ATOL_FACTOR * v_scale],
                                  events=events, dense_output=True)
        phases.append((sol, engaged))
        hit = [(i, ev[0]) for i, ev in enumerate(sol.t_events) if len(ev)]
        if not hit:
            raise RuntimeError("release: no event within 1000 s")
        i, te = min(hit, key=lambda p: p[1])
        ye = sol.y_events[i][0]
        t, y = te, np.array(ye)
        if i == 0:
            return {"end": "contact", "time": t, "position": mech.travel, "speed": y[1],
                    "left_spring_at": left, "engaged": engaged, "phases": phases}
        if i == 1:
            return {"end": "stall", "time": t, "position": y[0], "speed": 0.0,
                    "left_spring_at": left, "engaged": engaged, "phases": phases}
        left = y[0]
        engaged = False
    raise RuntimeError("release: too many phases")


# ── Buffers ─────────────────────────────────────────────────────────────

class BufferModel:
    """One buffer's force while compressing and while returning."""

    def __init__(self, j):
        self.j = j
        self.kind = j["law"]
        self.count = j.get("count", 1)
        self.e = j.get("restitution")
        self.spring = spring_law(j["spec"]) if self.kind == "spring" else None
        self.pre = j.get("preload_deflection", 0.0)
        if self.kind == "spring":
            self.stroke = self.spring.high - self.pre
        else:
            self.stroke = j["stroke"]
        self.level = None  # ideal absorber force per buffer, set per impact

    def compress(self, x, v):
        k = self.kind
        if k == "linear":
            return self.j["rate"] * x
        if k == "power_law":
            return self.j["coefficient"] * math.copysign(abs(x) ** self.j["exponent"], x)
        if k == "spring":
            return self.spring.force(self.pre + x, True)
        if k == "constant_force":
            return self.j["force"]
        if k == "ideal_absorber":
            return self.level
        if k == "orifice":
            return self.j["coefficient"] * v * abs(v)
        raise ValueError(k)

    def back(self, x):
        """Force pushing the part back out at rest or while returning."""
        if self.kind in ("constant_force", "ideal_absorber", "orifice"):
            return 0.0
        if self.e is not None:
            return self.e**2 * self.compress(x, 0.0)
        if self.kind == "spring":
            return self.spring.force(self.pre + x, False)
        return self.compress(x, 0.0)


class FreeCarrier:
    """A mass with constant push (drive + gravity component) and friction."""

    def __init__(self, mass, drive, incline, friction):
        self.mass = mass
        self.push = drive - mass * G_N * math.sin(incline)
        self.fric = friction

    def forces(self, x, direction):
        return self.push, self.fric, 0.0

    def active_work(self, x1, x2):
        return self.push * (x2 - x1)


class MechCarrier:
    """A mechanism seen at the buffer: compression x at radius r beyond the
    contact coordinate q_c, so q = q_c + x/r, mass I/r², forces Q/r."""

    def __init__(self, mech, rel, radius):
        self.mech = mech
        self.r = radius
        self.qc = rel["position"]
        self.engaged = rel["engaged"]
        sp = mech.spring
        self.detach_at = (sp.s0 - sp.law.low) if (sp is not None and sp.detaches and isinstance(sp, Direct)) else None
        self.mass = mech.inertia(self.engaged) / radius**2

    def on_spring(self, q):
        return self.engaged and (self.detach_at is None or q < self.detach_at)

    def forces(self, x, direction):
        q = self.qc + x / self.r
        f = self.mech.forces(q, direction, self.on_spring(q))
        return f.active / self.r, f.friction / self.r, f.damping / self.r**2

    def active_work(self, x1, x2):
        val, _ = integrate.quad(lambda x: self.forces(x, 1.0)[0], x1, x2, epsabs=0.0, epsrel=1e-13, limit=200)
        return val


def _peak(sol, t0, t1, fn):
    """Largest fn(t) over [t0, t1] on the dense output: a fine grid, then a
    bounded scalar search around the best grid point."""
    ts = np.linspace(t0, t1, 4001)
    vals = np.array([fn(t) for t in ts])
    i = int(np.argmax(vals))
    best = vals[i]
    lo, hi = ts[max(i - 1, 0)], ts[min(i + 1, len(ts) - 1)]
    if hi > lo:
        res = optimize.minimize_scalar(lambda t: -fn(t), bounds=(lo, hi), method="bounded",
                                       options={"xatol": 1e-15 * max(1.0, t1)})
        best = max(best, -res.fun)
    return float(best)


def impact(buffer, carrier, v0, thresholds=()):
    """Stroke of the carrier into the buffer from contact at speed v0."""
    m = carrier.mass
    n = buffer.count
    s = buffer.stroke
    if buffer.kind == "ideal_absorber":
        _, fr, _ = carrier.forces(0.0, 1.0)
        e_t = 0.5 * m * v0**2 + carrier.active_work(0.0, s) - fr * s
        buffer.level = max(e_t / (s * n), 0.0)

    def accel(x, v, direction, back):
        push, fr, c = carrier.forces(x, direction)
        fb = n * (buffer.back(x) if back else buffer.compress(x, v))
        return (push - direction * fr - c * v - fb) / m

    def rhs(_t, y):
        return [y[1], accel(y[0], y[1], 1.0, False), n * buffer.compress(y[0], y[1]) * y[1]]

    events = [_event(lambda _t, y: y[1], -1), _event(lambda _t, y: y[0] - s, 1)]
    sol = integrate.solve_ivp(rhs, (0.0, 1e3), [0.0, v0, 0.0], method="DOP853", rtol=RTOL,
                              atol=[ATOL_FACTOR * s, ATOL_FACTOR * v0, ATOL_FACTOR * 0.5 * m * v0**2],
                              events=events, dense_output=True)
    hit = [(i, ev[0]) for i, ev in enumerate(sol.t_events) if len(ev)]
    i, t1 = min(hit, key=lambda p: p[1])
    y1 = sol.y_events[i][0]
    out = {
        "compression_time": t1,
        "stroke_used": min(y1[0], s),
        "energy_per_cycle": y1[2],
        "mass": m,
    }

    def force_at(t):
        y = sol.sol(t)
        return buffer.compress(y[0], y[1])

    def decel_at(t):
        y = sol.sol(t)
        return -accel(y[0], y[1], 1.0, False)

    out["peak_force"] = _peak(sol, 0.0, t1, force_at)
    out["peak_deceleration"] = _peak(sol, 0.0, t1, decel_at)
    if buffer.kind == "ideal_absorber":
        eta = buffer.j["efficiency"]
        out["peak_force"] = buffer.level / eta
        out["peak_deceleration"] += n * buffer.level * (1.0 / eta - 1.0) / m
    out["time_above"] = [time_above(sol, t1, decel_at, a) for a in thresholds]
    if i == 1:
        out["end"] = "bottomed"
        out["residual_speed"] = max(y1[1], 0.0)
        out["rebound_speed"] = None
        out["stop_time"] = None
        out["mean_deceleration"] = (v0 - out["residual_speed"]) / t1
        return out
    out["residual_speed"] = 0.0
    out["stop_time"] = t1
    out["mean_deceleration"] = v0 / t1
    x = y1[0]
    push, fr, _ = carrier.forces(x, -1.0)
    if n * buffer.back(x) - push > fr:
        def rhs2(_t, y):
            return [y[1], accel(y[0], y[1], -1.0, True)]
        ev = [_event(lambda _t, y: y[0], -1), _event(lambda _t, y: y[1], 1)]
        sol2 = integrate.solve_ivp(rhs2, (t1, t1 + 1e3), [x, 0.0], method="DOP853", rtol=RTOL,
                                   atol=[ATOL_FACTOR * s, ATOL_FACTOR * v0], events=ev, dense_output=True)
        hit2 = [(j, e[0]) for j, e in enumerate(sol2.t_events) if len(e)]
        j, _t2 = min(hit2, key=lambda p: p[1])
        if j == 0:
            out["end"] = "rebound"
            out["rebound_speed"] = max(-sol2.y_events[0][0][1], 0.0)
            return out
    out["end"] = "held"
    out["rebound_speed"] = 0.0
    return out


def time_above(sol, t1, decel_at, a):
    """Total time in [0, t1] where the deceleration exceeds a."""
    ts = np.linspace(0.0, t1, 2001)
    vals = np.array([decel_at(t) - a for t in ts])
    total = 0.0
    for k in range(len(ts) - 1):
        fa, fb = vals[k], vals[k + 1]
        if fa > 0 and fb > 0:
            total += ts[k + 1] - ts[k]
        elif (fa > 0) != (fb > 0):
            r = optimize.brentq(lambda t: decel_at(t) - a, ts[k], ts[k + 1], xtol=1e-16, rtol=1e-15)
            total += (r - ts[k]) if fa > 0 else (ts[k + 1] - r)
    return total
