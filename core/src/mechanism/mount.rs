//! How a spring is attached to the moving part: its deflection as a function
//! of the part's coordinate, the generalised force it applies, and the exact
//! work it does over a stretch of travel.
//!
//! With `q` the part's coordinate (m or rad from the latch, positive towards
//! contact) and `s(q)` the spring's deflection, the spring applies the
//! generalised force `Q = −F_s(s)·ds/dq` (virtual work; F_s > 0 pushes the
//! spring back towards s = 0), and does the work
//! `W(q₁→q₂) = −∫_{s(q₁)}^{s(q₂)} F_s ds`, evaluated with the spring model's
//! exact `work` on the branch of the motion (unloading while `s` falls).
//!
//! Two mounts:
//! - [`DirectSpring`]: `s = s₀ ∓ q`: a spring along a sliding part's travel,
//!   or a torsion spring at a hinge.
//! - [`Strut`]: a linear or gas spring pinned between a frame point `A` and a
//!   point `B` on a rotating part. In the plane of rotation with the hinge at
//!   the origin, `B(θ) = r_B·(cos β, sin β)`, `β = β₀ + θ`, the length is
//!   `L = |B − A|` and, exactly, `dL/dθ = r_B·(A_x·sin β − A_y·cos β)/L`; its
//!   magnitude is the lever arm of the strut force about the hinge. `L` is
//!   extremal where `B` lies on the line through the hinge and `A`
//!   (`β = atan2(A_y, A_x) + kπ`, the over-centre points). Plane geometry;
//!   common practice.

use crate::error::{check, InputError};
use crate::spring::{Axis, Spring, Travel};

/// How a directly mounted spring's deflection changes as the part travels
/// towards contact.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Sense {
    /// The deflection falls as the part travels (the spring drives the part:
    /// ejector, spring-closed door).
    Unloads,
    /// The deflection grows as the part travels (the spring resists: return
    /// spring, counterbalance being wound).
    Loads,
}

impl Sense {
    /// ds/dq: −1 for [`Sense::Unloads`], +1 for [`Sense::Loads`].
    pub fn slope(self) -> f64 {
        match self {
            Self::Unloads => -1.0,
            Self::Loads => 1.0,
        }
    }
}

/// A spring whose deflection changes one-for-one with the part's coordinate:
/// `s(q) = s_latch + slope·q`.
#[derive(Clone, Copy)]
pub struct DirectSpring<'a> {
    /// The spring model (linear axis for a sliding part, rotary for a hinge).
    pub spring: &'a dyn Spring,
    /// Deflection of the spring in the latched position (m or rad).
    pub deflection_at_latch: f64,
    /// Whether the deflection falls or grows with travel.
    pub sense: Sense,
    /// The part only bears on the spring (ejector, loose leg of a torsion
    /// spring): when the spring reaches the low end of its deflection range
    /// (free length) the part leaves it and flies on. Otherwise the spring is
    /// attached and reaching either end of its range stops the analysis.
    pub detaches: bool,
}

/// Whether a strut's spring works in compression or extension.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StrutMode {
    /// Compression or gas spring: deflection = free length − length.
    Compression,
    /// Extension spring: deflection = length − free length.
    Extension,
}

/// A linear or gas spring pinned between a frame point and a point on a
/// rotating part. Coordinates in the plane of rotation, origin on the hinge
/// axis, oriented so that travel towards contact turns counter-clockwise
/// (see [`crate::mechanism::RotatingPart`]).
#[derive(Clone, Copy)]
pub struct Strut<'a> {
    /// The spring model (linear axis).
    pub spring: &'a dyn Spring,
    /// Frame pin `(x, y)` (m).
    pub frame_point: [f64; 2],
    /// Distance of the part pin from the hinge axis (m).
    pub part_point_radius: f64,
    /// Angle of the part pin from the x axis in the latched position (rad).
    pub part_point_angle: f64,
    /// Pin-to-pin length at which the spring's deflection is zero (m).
    pub free_length: f64,
    /// Compression (gas strut) or extension spring.
    pub mode: StrutMode,
}

/// A spring mount, validated.
#[derive(Clone, Copy)]
pub enum SpringMount<'a> {
    /// Deflection linear in the coordinate.
    Direct(DirectSpring<'a>),
    /// Strut between frame and rotating part.
    Strut(Strut<'a>),
}

/// What happens at the ends of the spring's deflection range.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RangeEnds {
    /// Lowest admissible deflection (m or rad).
    pub low: f64,
    /// Highest admissible deflection (m or rad).
    pub high: f64,
    /// Reaching `low` releases the part from the spring (it flies on);
    /// otherwise reaching `low` is an end of the spring's stroke.
    pub detaches_at_low: bool,
}

impl<'a> SpringMount<'a> {
    /// Validate a mount for a part moving along `axis` (the coordinate's
    /// kind: linear for sliding, rotary for hinged).
    pub(crate) fn validate(&self, part_axis: Axis) -> Result<(), InputError> {
        match self {
            Self::Direct(d) => {
                if d.spring.axis() != part_axis {
                    return Err(InputError::invalid(
                        "spring",
                        match part_axis {
                            Axis::Linear => "a sliding part needs a linear spring (N, m)",
                            Axis::Rotary => {
                                "a spring at the hinge must be a torsion spring (N·m, rad); \
                                 use a strut for a linear spring"
                            }
                        },
                    ));
                }
                d.spring
                    .check_deflection("spring.deflection_at_latch", d.deflection_at_latch)
            }
            Self::Strut(s) => {
                if part_axis != Axis::Rotary {
                    return Err(InputError::invalid(
                        "spring",
                        "a strut mount applies to a hinged part only",
                    ));
                }
                if s.spring.axis() != Axis::Linear {
                    return Err(InputError::invalid(
                        "spring",
                        "a strut needs a linear or gas spring (N, m)",
                    ));
                }
                check::finite("spring.frame_point.x", s.frame_point[0])?;
                check::finite("spring.frame_point.y", s.frame_point[1])?;
                check::positive("spring.part_point_radius", s.part_point_radius)?;
                check::finite("spring.part_point_angle", s.part_point_angle)?;
                check::positive("spring.free_length", s.free_length)?;
                let ra = s.frame_point[0].hypot(s.frame_point[1]);
                // |A| = r_B lets the pins meet (L = 0) at some angle, where the
                // lever arm is undefined.
                if (ra - s.part_point_radius).abs() <= 1e-9 * ra.max(s.part_point_radius) {
                    return Err(InputError::invalid(
                        "spring.frame_point",
                        "must not lie on the circle of the part pin (the pins would meet)",
                    ));
                }
                s.spring
                    .check_deflection("spring.part_point_angle", self.deflection(0.0))
            }
        }
    }

    /// The spring model.
    pub fn spring(&self) -> &'a dyn Spring {
        match self {
            Self::Direct(d) => d.spring,
            Self::Strut(s) => s.spring,
        }
    }

    /// Spring deflection `s(q)` (m or rad) at part coordinate `q`.
    #[inline]
    pub fn deflection(&self, q: f64) -> f64 {
        match self {
            Self::Direct(d) => d.deflection_at_latch + d.sense.slope() * q,
            Self::Strut(s) => {
                let l = s.length(q);
                match s.mode {
                    StrutMode::Compression => s.free_length - l,
                    StrutMode::Extension => l - s.free_length,
                }
            }
        }
    }

    /// ds/dq at `q` (dimensionless for a direct mount, m/rad for a strut).
    #[inline]
    pub fn deflection_slope(&self, q: f64) -> f64 {
        match self {
            Self::Direct(d) => d.sense.slope(),
            Self::Strut(s) => {
                let dl = s.length_slope(q);
                match s.mode {
                    StrutMode::Compression => -dl,
                    StrutMode::Extension => dl,
                }
            }
        }
    }

    /// Generalised force on the part (N or N·m, positive towards contact)
    /// at `q` while the part moves in direction `dir` (+1 towards contact,
    /// −1 back), and the spring force itself (N or N·m).
    #[inline]
    pub fn force(&self, q: f64, dir: f64) -> (f64, f64) {
        let slope = self.deflection_slope(q);
        let travel = if slope * dir > 0.0 {
            Travel::Loading
        } else {
            Travel::Unloading
        };
        let f = self.spring().force(self.deflection(q), travel);
        (-f * slope, f)
    }

    /// Deflection range and what happens at its ends.
    pub fn range_ends(&self) -> RangeEnds {
        let (low, high) = self.spring().deflection_range();
        RangeEnds {
            low,
            high,
            detaches_at_low: matches!(self, Self::Direct(d) if d.detaches),
        }
    }

    /// Exact work of the spring on the part from `q1` to `q2` (J), on the
    /// branch of the motion; split at the over-centre points of a strut
    /// where the deflection turns. Positive when the spring drives the part.
    pub fn work(&self, q1: f64, q2: f64) -> f64 {
        let dir = if q2 >= q1 { 1.0 } else { -1.0 };
        let mut total = 0.0;
        let mut a = q1;
        let mut turns = [f64::NAN; 8];
        let n = match self {
            Self::Direct(_) => 0,
            Self::Strut(s) => s.turning_points(q1.min(q2), q1.max(q2), &mut turns),
        };
        // `turning_points` returns at most `turns.len()`.
        let turns = turns.get_mut(..n).unwrap_or_default();
        if dir < 0.0 {
            turns.reverse();
        }
        for &b in turns.iter().chain(std::iter::once(&q2)) {
            total += self.segment_work(a, b, dir);
            a = b;
        }
        total
    }

    fn segment_work(&self, a: f64, b: f64, dir: f64) -> f64 {
        if a == b {
            return 0.0;
        }
        let mid = 0.5 * (a + b);
        let travel = if self.deflection_slope(mid) * dir > 0.0 {
            Travel::Loading
        } else {
            Travel::Unloading
        };
        -self
            .spring()
            .work(self.deflection(a), self.deflection(b), travel)
    }
}

impl Strut<'_> {
    /// Pin-to-pin length `L(θ)` (m).
    #[inline]
    pub fn length(&self, theta: f64) -> f64 {
        let beta = self.part_point_angle + theta;
        let bx = self.part_point_radius * beta.cos() - self.frame_point[0];
        let by = self.part_point_radius * beta.sin() - self.frame_point[1];
        bx.hypot(by)
    }

    /// `dL/dθ` (m/rad), exact; |dL/dθ| is the lever arm of the strut force
    /// about the hinge.
    #[inline]
    pub fn length_slope(&self, theta: f64) -> f64 {
        let beta = self.part_point_angle + theta;
        let l = self.length(theta);
        if l > 0.0 {
            self.part_point_radius
                * (self.frame_point[0] * beta.sin() - self.frame_point[1] * beta.cos())
                / l
        } else {
            0.0
        }
    }

    /// Angles in `(lo, hi)` where `dL/dθ = 0`, written into `out`; returns
    /// how many (sorted ascending).
    fn turning_points(&self, lo: f64, hi: f64, out: &mut [f64; 8]) -> usize {
        let pi = std::f64::consts::PI;
        let base = self.frame_point[1].atan2(self.frame_point[0]) - self.part_point_angle;
        // θ* = base + kπ; first k with θ* > lo.
        let k0 = ((lo - base) / pi).floor() + 1.0;
        let mut n = 0;
        for j in 0..out.len() {
            let th = base + (k0 + j as f64) * pi;
            if th >= hi {
                break;
            }
            if th > lo {
                // n ≤ j < out.len(): the slot exists.
                if let Some(slot) = out.get_mut(n) {
                    *slot = th;
                    n += 1;
                }
            }
        }
        n
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::spring::{Axis, Spring, Travel};

    /// Finite-difference derivative vs the analytic one: central difference
    /// with h = 1e-6 rad has truncation ~h² and rounding ~1e-16/h.
    const FD_TOL: f64 = 1e-8;
    const ROUNDING: f64 = crate::test_tol::REL_EXACT;

    struct Lin {
        k: f64,
    }
    impl Spring for Lin {
        fn axis(&self) -> Axis {
            Axis::Linear
        }
        fn force(&self, q: f64, _t: Travel) -> f64 {
            self.k * q
        }
        fn work(&self, a: f64, b: f64, _t: Travel) -> f64 {
            0.5 * self.k * (b * b - a * a)
        }
        fn deflection_range(&self) -> (f64, f64) {
            (-1.0, 1.0)
        }
    }

    fn strut(spring: &dyn Spring) -> SpringMount<'_> {
        SpringMount::Strut(Strut {
            spring,
            frame_point: [0.3, -0.1],
            part_point_radius: 0.2,
            part_point_angle: 0.4,
            free_length: 0.6,
            mode: StrutMode::Compression,
        })
    }

    #[test]
    fn strut_length_slope_is_the_derivative_of_the_length() {
        let k = Lin { k: 1000.0 };
        let SpringMount::Strut(s) = strut(&k) else {
            unreachable!()
        };
        for i in 0..40 {
            let th = -3.0 + 0.15 * f64::from(i);
            let h = 1e-6;
            let fd = (s.length(th + h) - s.length(th - h)) / (2.0 * h);
            assert!((fd - s.length_slope(th)).abs() < FD_TOL, "θ = {th}");
        }
    }

    #[test]
    fn strut_work_splits_at_the_over_centre_point() {
        // Over a full turn and back the strut length returns: a conservative
        // spring does no net work, and the work equals ½k(s₁² − s₂²) with the
        // sign of the motion (Hooke's law, common practice).
        let k = Lin { k: 1000.0 };
        let m = strut(&k);
        let w = m.work(0.0, 2.0 * std::f64::consts::PI);
        assert!(w.abs() < ROUNDING * 1000.0);
        let (s1, s2) = (m.deflection(0.3), m.deflection(2.5));
        let w = m.work(0.3, 2.5);
        assert!((w - 0.5 * 1000.0 * (s1 * s1 - s2 * s2)).abs() < ROUNDING * 1000.0);
        // Work is the integral of the generalised force (trapezoid, fine grid).
        let n = 200_000;
        let mut acc = 0.0;
        for i in 0..n {
            let a = 0.3 + 2.2 * f64::from(i) / f64::from(n);
            let b = 0.3 + 2.2 * f64::from(i + 1) / f64::from(n);
            acc += 0.5 * (m.force(a, 1.0).0 + m.force(b, 1.0).0) * (b - a);
        }
        // Trapezoid with Δ = 1.1e-5 rad on a smooth integrand: error ~Δ²
        // relative, far below this bound.
        const TRAPEZOID_REL: f64 = 1e-6;
        assert!((acc - w).abs() < TRAPEZOID_REL * w.abs().max(1.0));
    }
}
