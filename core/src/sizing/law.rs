//! Buffer laws for sizing, each as a function of the design stroke `s` (or,
//! for the orifice damper, its coefficient `c`), with the closed forms that
//! bound the stroke from each limit.
//!
//! Notation: part mass `m`, impact speed `v`, kinetic energy `E_k = ½·m·v²`,
//! net propelling force `F_n` = drive + gravity component − friction (kept
//! up during the stroke; may be negative), so the energy a buffer stopping
//! the part over `s` must take is `E_total = E_k + F_n·s` (work–energy
//! balance, basic mechanics).
//!
//! Position-dependent buffers (linear spring, power law `F = a·xⁿ`, ideal
//! absorber, gas spring) all have a mean force `E_total/s` over the stroke
//! and a peak force `E_total/(η·s)`, where `η` is the buffer's efficiency
//! (mean/peak force over the stroke): `1/(n+1)` for a power law (so ½ for a
//! linear spring), the given efficiency for a hydraulic absorber, `Φ/p` for a
//! gas spring of progression `p` whose mean-to-initial force ratio is `Φ`.
//! Hence `F_peak(s) = (E_k/s + F_n)/η` and
//! `a_peak(s) = (F_peak − F_n)/m`, decreasing in `s`, and every force or
//! peak-deceleration limit turns into a closed-form least stroke.
//!
//! The orifice damper `F = c·v²` is solved exactly along the stroke:
//! `m·v·dv/dx = F_n − c·v²` gives `v² = F_n/c + (v₀² − F_n/c)·e^(−2cx/m)`, so
//! the stroke to slow to a residual speed `v_r` is
//! `s = (m/2c)·ln((v₀² − F_n/c)/(v_r² − F_n/c))`; a pure `v²` damper never
//! reaches zero speed, so `v_r > 0` is handed to the end stop.

use super::numeric::{integrate, largest_true, smallest_true, PANELS};
use super::BufferSetting;

/// The duty of one stop: what the buffer must absorb.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct Duty {
    /// Effective mass of the part, kg.
    pub m: f64,
    /// Impact speed, m/s.
    pub v: f64,
    /// Kinetic energy ½·m·v², J.
    pub ek: f64,
    /// Net propelling force along the motion during the stroke, N.
    pub fnet: f64,
}

/// A least stroke from one limit, or why no stroke meets it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) enum Bound {
    /// Every stroke from this one up meets the limit, m.
    From(f64),
    /// The limit is at or below the least value the buffer type can reach
    /// (its floor, in the limit's unit).
    Floor(f64),
    /// The bounded solver found no bracket.
    Unsolved,
}

/// One buffer design evaluated at its stroke.
#[derive(Debug, Clone, PartialEq)]
pub(super) struct Point {
    pub setting: BufferSetting,
    pub stroke: f64,
    pub peak_force: f64,
    pub peak_deceleration: f64,
    pub mean_deceleration: f64,
    pub stop_time: f64,
    /// Speed handed to the end stop (orifice damper), m/s; 0 otherwise.
    pub residual_speed: f64,
}

/// A buffer law with its parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) enum Law {
    /// Linear spring (power law with n = 1, closed-form stop time).
    Linear,
    /// Power law F = a·xⁿ.
    Power { n: f64 },
    /// Ideal hydraulic absorber of efficiency η.
    Constant { eta: f64 },
    /// Polytropic gas spring: progression p over the stroke, index κ.
    Gas { p: f64, kappa: f64 },
    /// Orifice damper F = c·v², handing over at residual speed v_r.
    Orifice { vr: f64 },
}

/// Gas spring force along the stroke, as a multiple of the force at contact:
/// `F(x)/F₁ = (1 − b·x/s)^(−κ)` with `b = 1 − p^(−1/κ)`, so `F(s) = p·F₁`
/// (polytropic law `P·Vᵏ = const` with the gas volume falling linearly
/// with the stroke).
#[derive(Debug, Clone, Copy, PartialEq)]
struct GasShape {
    kappa: f64,
    /// `b = 1 − p^(−1/κ)`, in `[0, 1)`.
    b: f64,
}

impl GasShape {
    fn new(p: f64, kappa: f64) -> Self {
        Self {
            kappa,
            b: -(-(p.ln()) / kappa).exp_m1(),
        }
    }

    /// Mean of `F/F₁` over `[x, s]` with `s − x = w·s`, `w ∈ (0, 1]`:
    /// `∫ (1 − b·y/s)^(−κ) dy / (s − x)` in closed form, written with
    /// `expm1`/`ln_1p` so that it stays exact as `w → 0`.
    fn mean_ratio(&self, w: f64) -> f64 {
        let b = self.b;
        if b <= f64::EPSILON || w <= 0.0 {
            // p = 1 (constant force) or the end point: F(s)/F₁.
            return (1.0 - b).powf(-self.kappa);
        }
        let a = 1.0 - b; // (1 − b·x/s) at x = s
        let z = (b * w / a).ln_1p();
        let q = 1.0 - self.kappa;
        if q.abs() < 1e-9 {
            // κ = 1: ∫ dy/(1 − b·y/s) = (s/b)·ln(...).
            z / (b * w)
        } else {
            a.powf(q) * (q * z).exp_m1() / (b * q * w)
        }
    }

    /// `∫₀^ξ (1 − b·η)^(−κ) dη`: work from contact to `x = ξ·s`, over
    /// `F₁·s`, exact at small `ξ` (`expm1`/`ln_1p`).
    fn work_ratio(&self, xi: f64) -> f64 {
        let b = self.b;
        if b <= f64::EPSILON {
            return xi;
        }
        let z = (-b * xi).ln_1p();
        let q = 1.0 - self.kappa;
        if q.abs() < 1e-9 {
            -z / b
        } else {
            (q * z).exp_m1() / (-b * q)
        }
    }

    /// `Φ`: mean force over the whole stroke / force at contact.
    fn phi(&self) -> f64 {
        self.mean_ratio(1.0)
    }
}

/// A position-dependent buffer force along a stroke `s`, described by what
/// the stopping-time integral needs.
struct Profile<'a> {
    /// `F(0)`, N.
    force_at_contact: f64,
    /// `W(x) = ∫₀ˣ F`, as a function of `ξ = x/s`, J.
    work: &'a dyn Fn(f64) -> f64,
    /// Mean force over `[s·(1 − w), s]`, N, exact as `w → 0`.
    tail_mean: &'a dyn Fn(f64) -> f64,
}

impl Profile<'_> {
    /// `t = ∫₀^s dx/v(x)`, `½·m·v(x)² = N(x) = E_k + F_n·x − W(x)`, split at
    /// `x = s/2` so that each half has one difficult end, each removed by a
    /// substitution:
    /// - near the stop `x = s`, `v ∝ √(s − x)`: with `x = s − (s/2)·u²`,
    ///   `N = (s − x)·h` (`h` = mean buffer force over `[x, s]` − `F_n`), the
    ///   integrand becomes the smooth `√(2·(s/2)·m/h)`;
    /// - near contact, when the net force first accelerates the part
    ///   (`g₀ = F_n − F(0) > 0`) and the kinetic energy is small against
    ///   `g₀·x`, the speed rises steeply over a short distance `E_k/g₀`:
    ///   with `x = (E_k/g₀)·(e^σ − 1)`, `E_k + g₀·x = E_k·e^σ` and the
    ///   integrand is a smooth `∝ e^(σ/2)`.
    ///
    /// Each part by composite Gauss–Legendre.
    fn stop_time(&self, d: &Duty, s: f64) -> f64 {
        let half = 0.5 * s;
        // Stop side: ∫₀¹ √(2·half·m/h(u)) du, w = (s − x)/s = u²/2.
        let tail = integrate(
            |u| {
                let h = ((self.tail_mean)(0.5 * u * u) - d.fnet).max(f64::MIN_POSITIVE);
                (2.0 * half * d.m / h).sqrt()
            },
            0.0,
            1.0,
            PANELS,
        );
        let g0 = d.fnet - self.force_at_contact;
        let head = if g0 > 0.0 {
            let scale = d.ek / g0;
            let sigma_max = (half / scale).ln_1p();
            // Panels of width ≤ 1 in σ: e^(σ/2) over a unit panel is
            // integrated by 10-point Gauss to rounding.
            let panels = (sigma_max.ceil() as usize).clamp(PANELS, MAX_SIGMA_PANELS);
            integrate(
                |sigma| {
                    let x = scale * sigma.exp_m1();
                    // N = E_k·e^σ + F(0)·x − W(x), free of cancellation at
                    // small x.
                    let n = d.ek * sigma.exp() + self.force_at_contact * x - (self.work)(x / s);
                    scale * sigma.exp() / (2.0 * n.max(f64::MIN_POSITIVE) / d.m).sqrt()
                },
                0.0,
                sigma_max,
                panels,
            )
        } else {
            integrate(
                |x| {
                    let n = d.ek + d.fnet * x - (self.work)(x / s);
                    1.0 / (2.0 * n.max(f64::MIN_POSITIVE) / d.m).sqrt()
                },
                0.0,
                half,
                PANELS,
            )
        };
        head + tail
    }
}

/// Cap on the panels over `σ`: `σ_max = ln(1 + g₀·s/(2E_k))` stays below
/// ~710 in f64, so 800 unit panels always suffice.
const MAX_SIGMA_PANELS: usize = 800;

impl Law {
    /// Efficiency η = mean force / peak force over the stroke, for the
    /// position-dependent laws; `None` for the orifice damper.
    pub fn eta(&self) -> Option<f64> {
        match *self {
            Law::Linear => Some(0.5),
            Law::Power { n } => Some(1.0 / (n + 1.0)),
            Law::Constant { eta } => Some(eta),
            Law::Gas { p, kappa } => Some(GasShape::new(p, kappa).phi() / p),
            Law::Orifice { .. } => None,
        }
    }

    /// The stroke beyond which a buffer is not needed: with a resisting net
    /// force the part stops unaided over `E_k/|F_n|` (orifice: slows to
    /// `v_r` over `m·(v₀² − v_r²)/(2|F_n|)`). Infinite otherwise.
    pub fn stroke_sup(&self, d: &Duty) -> f64 {
        if d.fnet >= 0.0 {
            return f64::INFINITY;
        }
        match *self {
            Law::Orifice { vr } => d.m * (d.v * d.v - vr * vr) / (2.0 * -d.fnet),
            _ => d.ek / -d.fnet,
        }
    }

    /// Least peak force reachable (N): the limit of `F_peak` as the stroke
    /// grows to its supremum.
    fn force_floor(&self, d: &Duty) -> f64 {
        let f = d.fnet.max(0.0);
        match (*self, self.eta()) {
            (Law::Orifice { vr }, _) => f * d.v * d.v / (vr * vr),
            (_, Some(eta)) => f / eta,
            (_, None) => f,
        }
    }

    /// Least peak deceleration reachable (m/s²).
    fn peak_decel_floor(&self, d: &Duty) -> f64 {
        if d.fnet < 0.0 {
            return -d.fnet / d.m;
        }
        match (*self, self.eta()) {
            (Law::Orifice { vr }, _) => d.fnet * (d.v * d.v / (vr * vr) - 1.0) / d.m,
            (_, Some(eta)) => d.fnet * (1.0 / eta - 1.0) / d.m,
            (_, None) => 0.0,
        }
    }

    /// Least mean deceleration reachable (m/s²): zero with a propelling
    /// force (the stop can be made as long as one likes), the unaided
    /// deceleration `|F_n|/m` with a resisting one.
    fn mean_decel_floor(d: &Duty) -> f64 {
        (-d.fnet).max(0.0) / d.m
    }

    /// Least stroke meeting a peak-force limit `fmax`.
    pub fn force_bound(&self, d: &Duty, fmax: f64) -> Bound {
        let floor = self.force_floor(d);
        if fmax <= floor {
            return Bound::Floor(floor);
        }
        match (*self, self.eta()) {
            (Law::Orifice { vr }, _) => {
                orifice_stroke(d, vr, fmax / (d.v * d.v)).map_or(Bound::Floor(floor), Bound::From)
            }
            // (E_k/s + F_n)/η ≤ F_max  ⇔  s ≥ E_k/(η·F_max − F_n).
            (_, Some(eta)) => Bound::From(d.ek / (eta * fmax - d.fnet)),
            (_, None) => Bound::Unsolved,
        }
    }

    /// Least stroke meeting a peak-deceleration limit `amax`.
    pub fn peak_decel_bound(&self, d: &Duty, amax: f64) -> Bound {
        let floor = self.peak_decel_floor(d);
        if amax <= floor {
            return Bound::Floor(floor);
        }
        match (*self, self.eta()) {
            (Law::Orifice { vr }, _) => {
                // (c·v₀² − F_n)/m ≤ a_max  ⇔  c ≤ (m·a_max + F_n)/v₀².
                let c = (d.m * amax + d.fnet) / (d.v * d.v);
                orifice_stroke(d, vr, c).map_or(Bound::Floor(floor), Bound::From)
            }
            // (E_k/(η·s) + F_n·(1/η − 1))/m ≤ a_max.
            (_, Some(eta)) => Bound::From(d.ek / (eta * (d.m * amax - d.fnet * (1.0 / eta - 1.0)))),
            (_, None) => Bound::Unsolved,
        }
    }

    /// Least stroke meeting a mean-deceleration limit `amean` (contact speed
    /// over stopping time; for the orifice damper, the speed lost over the
    /// time to the residual speed).
    pub fn mean_decel_bound(&self, d: &Duty, amean: f64) -> Bound {
        let floor = Self::mean_decel_floor(d);
        if amean <= floor {
            return Bound::Floor(floor);
        }
        match *self {
            // Ideal absorber: constant deceleration v²/(2s) (independent of
            // F_n, which the absorber's force level takes up).
            Law::Constant { .. } => Bound::From(d.v * d.v / (2.0 * amean)),
            Law::Orifice { vr } => {
                // Mean deceleration rises with c: find the largest c that
                // meets the limit, in z = ln(c − c_floor).
                let c0 = orifice_c_floor(d, vr);
                let guess = (d.m * amean / (d.v * vr)).max(f64::MIN_POSITIVE).ln();
                let z = largest_true(
                    |z| {
                        let c = c0 + z.exp();
                        orifice_time(d, vr, c).is_some_and(|t| (d.v - vr) / t <= amean)
                    },
                    guess,
                );
                match z.and_then(|z| orifice_stroke(d, vr, c0 + z.exp())) {
                    Some(s) => Bound::From(s),
                    None => Bound::Unsolved,
                }
            }
            _ => {
                let sup = self.stroke_sup(d);
                let guess = d.v * d.v / (2.0 * amean);
                let z0 = stroke_to_z(guess.min(0.5 * sup), sup);
                let z = smallest_true(
                    |z| {
                        let s = z_to_stroke(z, sup);
                        s > 0.0 && s < sup && d.v / self.stop_time(d, s) <= amean
                    },
                    z0,
                );
                match z {
                    Some(z) => Bound::From(z_to_stroke(z, sup)),
                    None => Bound::Unsolved,
                }
            }
        }
    }

    /// Time from contact to standstill for a position-dependent law over
    /// stroke `s` (s). Linear spring: closed form; ideal absorber: `2s/v`;
    /// power law and gas spring: `t = ∫₀^s dx/v(x)` by [`Profile`].
    fn stop_time(&self, d: &Duty, s: f64) -> f64 {
        let mean_force = d.ek / s + d.fnet;
        match *self {
            Law::Linear => {
                // m·ẍ = F_n − k·x, x(0) = 0, ẋ(0) = v: standstill at
                // t = (π/2 + atan2(x_e·ω, v))/ω with x_e = F_n/k.
                let k = 2.0 * mean_force / s;
                let w = (k / d.m).sqrt();
                let xe = d.fnet / k;
                (std::f64::consts::FRAC_PI_2 + (xe * w).atan2(d.v)) / w
            }
            Law::Constant { .. } => 2.0 * s / d.v,
            Law::Power { n } => {
                let fp = (n + 1.0) * mean_force;
                let profile = Profile {
                    force_at_contact: 0.0,
                    // W(x) = F_p·s·ξ^(n+1)/(n+1), ξ = x/s.
                    work: &|xi: f64| fp * s * xi.powf(n + 1.0) / (n + 1.0),
                    // Mean of a·yⁿ over [s(1 − w), s]:
                    // F_p·(1 − (1 − w)^(n+1))/((n+1)·w).
                    tail_mean: &|w: f64| {
                        let g = if w <= 0.0 {
                            n + 1.0
                        } else {
                            -((n + 1.0) * (-w).ln_1p()).exp_m1() / w
                        };
                        fp * g / (n + 1.0)
                    },
                };
                profile.stop_time(d, s)
            }
            Law::Gas { p, kappa } => {
                let shape = GasShape::new(p, kappa);
                let f1 = mean_force / shape.phi();
                let profile = Profile {
                    force_at_contact: f1,
                    work: &|xi: f64| f1 * s * shape.work_ratio(xi),
                    tail_mean: &|w: f64| f1 * shape.mean_ratio(w),
                };
                profile.stop_time(d, s)
            }
            // Not position-dependent: never called for the orifice.
            Law::Orifice { .. } => f64::INFINITY,
        }
    }

    /// The design that stops the part over stroke `s` (for the orifice
    /// damper: the coefficient whose stroke to `v_r` is at most `s`).
    /// `None` when `s` is outside `(0, stroke_sup)` or the solve fails.
    pub fn at_stroke(&self, d: &Duty, s: f64) -> Option<Point> {
        if !(s > 0.0 && s < self.stroke_sup(d)) {
            return None;
        }
        if let Law::Orifice { vr } = *self {
            let c0 = orifice_c_floor(d, vr);
            let guess = (d.m * (d.v / vr).ln() / s).max(f64::MIN_POSITIVE).ln();
            // Stroke falls as c rises: the smallest c whose stroke fits.
            let z = smallest_true(
                |z| orifice_stroke(d, vr, c0 + z.exp()).is_some_and(|x| x <= s),
                guess,
            )?;
            return self.orifice_at(d, vr, c0 + z.exp());
        }
        let eta = self.eta()?;
        let mean_force = d.ek / s + d.fnet;
        let peak = mean_force / eta;
        let setting = match *self {
            Law::Linear => BufferSetting::LinearSpring { rate: peak / s },
            Law::Power { n } => {
                let a = peak / s.powf(n);
                BufferSetting::PowerLaw {
                    coefficient: a.is_finite().then_some(a),
                    exponent: n,
                    secant_rate: peak / s,
                }
            }
            Law::Constant { eta } => BufferSetting::ConstantForce {
                mean_force,
                efficiency: eta,
            },
            Law::Gas { p, kappa } => BufferSetting::GasSpring {
                force_at_contact: peak / p,
                progression: p,
                polytropic_index: kappa,
            },
            Law::Orifice { .. } => return None,
        };
        let t = self.stop_time(d, s);
        Some(Point {
            setting,
            stroke: s,
            peak_force: peak,
            peak_deceleration: (peak - d.fnet) / d.m,
            mean_deceleration: d.v / t,
            stop_time: t,
            residual_speed: 0.0,
        })
    }

    /// The orifice design at coefficient `c`.
    fn orifice_at(&self, d: &Duty, vr: f64, c: f64) -> Option<Point> {
        let s = orifice_stroke(d, vr, c)?;
        let t = orifice_time(d, vr, c)?;
        let peak = c * d.v * d.v;
        Some(Point {
            setting: BufferSetting::Orifice {
                coefficient: c,
                residual_speed: vr,
                terminal_speed: (d.fnet > 0.0).then(|| (d.fnet / c).sqrt()),
            },
            stroke: s,
            peak_force: peak,
            peak_deceleration: (peak - d.fnet) / d.m,
            mean_deceleration: (d.v - vr) / t,
            stop_time: t,
            residual_speed: vr,
        })
    }
}

/// Map `z ∈ ℝ` onto a stroke in `(0, sup)`: `e^z` when `sup` is infinite,
/// otherwise the logistic `sup/(1 + e^(−z))`.
fn z_to_stroke(z: f64, sup: f64) -> f64 {
    if sup.is_finite() {
        sup / (1.0 + (-z).exp())
    } else {
        z.exp()
    }
}

/// Inverse of [`z_to_stroke`] for `s ∈ (0, sup)`.
fn stroke_to_z(s: f64, sup: f64) -> f64 {
    if sup.is_finite() {
        (s / (sup - s)).ln()
    } else {
        s.ln()
    }
}

/// Least orifice coefficient that can slow the part to `v_r` against a
/// propelling force: `c·v_r² > F_n`, so `c > F_n/v_r²` (0 without one).
pub(super) fn orifice_c_floor(d: &Duty, vr: f64) -> f64 {
    d.fnet.max(0.0) / (vr * vr)
}

/// Stroke over which an orifice damper of coefficient `c` slows the part from
/// `v₀` to `v_r`: `s = (m/2c)·ln((v₀² − F_n/c)/(v_r² − F_n/c))`, computed as
/// `ln_1p((v₀² − v_r²)/(v_r² − F_n/c))`. `None` when `c·v_r² ≤ F_n` (the
/// part never slows to `v_r`) or `c ≤ 0`.
pub(super) fn orifice_stroke(d: &Duty, vr: f64, c: f64) -> Option<f64> {
    if !(c > 0.0 && c.is_finite()) {
        return None;
    }
    let den = vr * vr - d.fnet / c;
    if den <= 0.0 {
        return None;
    }
    let s = d.m / (2.0 * c) * ((d.v * d.v - vr * vr) / den).ln_1p();
    (s.is_finite() && s > 0.0).then_some(s)
}

/// Time for an orifice damper to slow the part from `v₀` to `v_r`:
/// `m·dv/dt = F_n − c·v²` integrated exactly. With `V² = F_n/c > 0`:
/// `t = (m/(c·V))·atanh(V·(v₀ − v_r)/(v₀·v_r − V²))`; with `F_n = 0`:
/// `t = (m/c)·(v₀ − v_r)/(v₀·v_r)`; with `U² = −F_n/c > 0`:
/// `t = (m/(c·U))·atan(U·(v₀ − v_r)/(v₀·v_r + U²))` (difference formulas
/// of atanh/atan, exact and free of cancellation as `F_n → 0`).
pub(super) fn orifice_time(d: &Duty, vr: f64, c: f64) -> Option<f64> {
    if !(c > 0.0 && c.is_finite()) {
        return None;
    }
    let v0 = d.v;
    let t = if d.fnet > 0.0 {
        let big_v = (d.fnet / c).sqrt();
        if big_v >= vr {
            return None;
        }
        d.m / (c * big_v) * (big_v * (v0 - vr) / (v0 * vr - big_v * big_v)).atanh()
    } else if d.fnet < 0.0 {
        let u = (-d.fnet / c).sqrt();
        d.m / (c * u) * (u * (v0 - vr) / (v0 * vr + u * u)).atan()
    } else {
        d.m / c * (v0 - vr) / (v0 * vr)
    };
    (t.is_finite() && t > 0.0).then_some(t)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;

    /// The quadrature of the stop time against closed forms: 160 Gauss nodes
    /// on a smooth integrand reach rounding; allow 1e-10.
    const REL_QUADRATURE: f64 = 1e-10;
    /// The same for a power law of non-integer exponent, whose integrand has
    /// a weak power singularity at one end: 1e-7 measured margin ×10.
    const REL_QUADRATURE_ROUGH: f64 = 1e-6;

    /// The gas mean ratio at w = 1e-12 differs from its end value by
    /// O(w·κ·b) ≈ 1e-12 plus the rounding of ln_1p/expm1: allow 1e-9.
    const REL_NEAR_END: f64 = 1e-9;
    /// Orifice formulas at F_n = ±1e-6 N against F_n = 0: the change is
    /// O(F_n/(c·v_r²)) ≈ 6e-8; allow 1e-6.
    const REL_SMALL_FORCE: f64 = 1e-6;

    fn duty(m: f64, v: f64, fnet: f64) -> Duty {
        Duty {
            m,
            v,
            ek: 0.5 * m * v * v,
            fnet,
        }
    }

    #[test]
    fn power_law_time_matches_linear_closed_form() {
        // n = 1 by quadrature against the closed-form linear-spring time,
        // with propelling, zero and resisting forces (same formula two ways).
        for fnet in [0.0, 500.0, -300.0] {
            let d = duty(100.0, 1.5, fnet);
            for s in [0.01, 0.05, 0.2] {
                if s >= Law::Linear.stroke_sup(&d) {
                    continue;
                }
                let a = Law::Linear.stop_time(&d, s);
                let b = Law::Power { n: 1.0 }.stop_time(&d, s);
                assert_relative_eq!(a, b, max_relative = REL_QUADRATURE);
            }
        }
        // A drive that dwarfs the kinetic energy (F_n·s/E_k ≈ 3e5): the
        // speed rises steeply just after contact; the σ substitution keeps
        // the quadrature exact.
        for (m, v, fnet, s) in [(0.1, 0.05, 390.0, 0.1), (1.0, 1e-3, 1000.0, 0.5)] {
            let d = duty(m, v, fnet);
            let a = Law::Linear.stop_time(&d, s);
            let b = Law::Power { n: 1.0 }.stop_time(&d, s);
            assert_relative_eq!(a, b, max_relative = REL_QUADRATURE);
        }
    }

    #[test]
    fn linear_time_without_drive_is_quarter_period() {
        // SDOF: t = (π/2)·√(m/k) (reference-values.md §10, D).
        let d = duty(10.0, 2.0, 0.0);
        let s = 2.0 * (10.0_f64 / 20_000.0).sqrt(); // x = v·√(m/k), k = 20 N/mm
        let t = Law::Linear.stop_time(&d, s);
        assert_relative_eq!(
            t,
            std::f64::consts::FRAC_PI_2 * (10.0_f64 / 20_000.0).sqrt(),
            max_relative = REL_EXACT
        );
    }

    #[test]
    fn power_law_time_without_drive_matches_beta_function() {
        // With F_n = 0: t = (s/v)·B(1/(n+1), 1/2)/(n+1); the factor computed
        // with scipy.special.beta (scipy 1.x): n = 2 → 1.4021821053254537,
        // n = 3 → 1.3110287771460598, n = 1.5 → 1.4716375921623521,
        // n = 0.5 → 1.7247397061531933.
        let d = duty(3.0, 1.2, 0.0);
        let s = 0.04;
        for (n, factor, tol) in [
            (2.0, 1.402_182_105_325_453_7, REL_QUADRATURE),
            (3.0, 1.311_028_777_146_059_8, REL_QUADRATURE),
            (1.5, 1.471_637_592_162_352_1, REL_QUADRATURE_ROUGH),
            (0.5, 1.724_739_706_153_193_3, REL_QUADRATURE_ROUGH),
        ] {
            let t = Law::Power { n }.stop_time(&d, s);
            assert_relative_eq!(t, s / 1.2 * factor, max_relative = tol);
        }
    }

    #[test]
    fn gas_spring_of_progression_one_is_constant_force() {
        let d = duty(50.0, 1.0, 200.0);
        let s = 0.03;
        let g = Law::Gas { p: 1.0, kappa: 1.3 }.at_stroke(&d, s).unwrap();
        let c = Law::Constant { eta: 1.0 }.at_stroke(&d, s).unwrap();
        assert_relative_eq!(g.peak_force, c.peak_force, max_relative = REL_EXACT);
        assert_relative_eq!(g.stop_time, c.stop_time, max_relative = REL_QUADRATURE);
    }

    #[test]
    fn gas_mean_ratio_integrates_the_force_law() {
        // Φ against a direct Gauss integration of (1 − b·ξ)^(−κ) on [0, 1].
        for (p, kappa) in [(1.3, 1.0), (1.3, 1.4), (2.5, 1.2), (1.05, 1.0)] {
            let g = GasShape::new(p, kappa);
            let direct = integrate(|xi| (1.0 - g.b * xi).powf(-kappa), 0.0, 1.0, PANELS);
            assert_relative_eq!(g.work_ratio(1.0), direct, max_relative = REL_QUADRATURE);
            assert_relative_eq!(g.work_ratio(1e-9), 1e-9, max_relative = REL_NEAR_END);
            assert_relative_eq!(g.phi(), direct, max_relative = REL_QUADRATURE);
            assert_relative_eq!((1.0 - g.b).powf(-kappa), p, max_relative = REL_EXACT * 10.0);
            // Near the end point the closed form tends to F(s)/F₁ = p.
            assert_relative_eq!(g.mean_ratio(1e-12), p, max_relative = REL_NEAR_END);
        }
    }

    #[test]
    fn orifice_without_drive_matches_exponential_decay() {
        // m·v·dv/dx = −c·v² ⇒ v = v₀·exp(−c·x/m) (ODE test case of issue 4):
        // stroke to v_r is (m/c)·ln(v₀/v_r); time (m/c)·(1/v_r − 1/v₀).
        let d = duty(20.0, 2.0, 0.0);
        let (c, vr) = (400.0, 0.2);
        let s = orifice_stroke(&d, vr, c).unwrap();
        assert_relative_eq!(s, 20.0 / 400.0 * (10.0_f64).ln(), max_relative = REL_EXACT);
        let t = orifice_time(&d, vr, c).unwrap();
        assert_relative_eq!(
            t,
            20.0 / 400.0 * (1.0 / 0.2 - 1.0 / 2.0),
            max_relative = REL_EXACT
        );
        // The drive and resisting forms tend to it continuously.
        for f in [1e-6, -1e-6] {
            let df = duty(20.0, 2.0, f);
            assert_relative_eq!(
                orifice_time(&df, vr, c).unwrap(),
                t,
                max_relative = REL_SMALL_FORCE
            );
            assert_relative_eq!(
                orifice_stroke(&df, vr, c).unwrap(),
                s,
                max_relative = REL_SMALL_FORCE
            );
        }
        // A drive that the damper cannot overcome at v_r: no stroke.
        let dd = duty(20.0, 2.0, 400.0 * 0.2 * 0.2 * 1.001);
        assert_eq!(orifice_stroke(&dd, vr, c), None);
        assert_eq!(orifice_time(&dd, vr, c), None);
    }
}
