//! What moves when a spring is released: a translating (sliding) part or a
//! rotating (hinged) part, reduced to one generalised coordinate `q` (m or
//! rad from the latch, positive towards contact) with a generalised inertia
//! `M` (kg or kg·m²) and generalised forces (N or N·m).
//!
//! `M·q̈ = Q_spring(q) + Q_gravity(q) + Q_drive − Q_friction·sgn q̇ − c·q̇`
//! (Newton–Euler for one degree of freedom; any dynamics textbook, common
//! practice). The conservative part and the Coulomb friction have exact work
//! integrals, so the speed at any position follows from the work–energy
//! theorem `½·M·v² = W_spring + W_gravity + W_drive − W_friction` while the
//! part moves one way and there is no viscous damping
//! ([`Mechanism::closed_form_speed`]); the ODE in [`crate::release`] covers
//! the rest and cross-checks it.
//!
//! Modules: [`translating`] (sliding part), [`rotating`] (hinged part,
//! inertia presets, gravity for any hinge tilt), [`mount`] (how the spring
//! is attached: direct or strut with exact lever-arm geometry).

pub mod mount;
pub mod rotating;
pub mod translating;

pub use mount::{DirectSpring, RangeEnds, Sense, SpringMount, Strut, StrutMode};
pub use rotating::{InertiaSpec, RotatingConfig, RotatingPart};
pub use translating::{Friction, TranslatingConfig, TranslatingPart};

use crate::spring::Axis;

/// Generalised forces on the part at one position (N or N·m, positive
/// towards contact).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Forces {
    /// From the spring (zero once the part has left it).
    pub spring: f64,
    /// Gravity component along the coordinate.
    pub gravity: f64,
    /// Constant drive.
    pub drive: f64,
    /// Coulomb friction magnitude (≥ 0), opposing the motion.
    pub friction: f64,
    /// Viscous damping coefficient (N·s/m or N·m·s/rad).
    pub damping: f64,
}

impl Forces {
    /// Spring + gravity + drive: the forces that do not depend on the
    /// direction of motion.
    #[inline]
    pub fn active(&self) -> f64 {
        self.spring + self.gravity + self.drive
    }

    /// Net force at speed `v` while moving in direction `dir` (±1): friction
    /// opposes `dir`, damping opposes `v`.
    #[inline]
    pub fn net(&self, v: f64, dir: f64) -> f64 {
        self.active() - dir * self.friction - self.damping * v
    }
}

/// Work done on the part by each force over a stretch of travel (J);
/// friction and damping are ≤ 0.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct WorkBudget {
    /// By the spring.
    pub spring: f64,
    /// By gravity.
    pub gravity: f64,
    /// By the drive.
    pub drive: f64,
    /// By Coulomb friction (≤ 0).
    pub friction: f64,
    /// By viscous damping (≤ 0; from the ODE, zero in closed forms).
    pub damping: f64,
}

impl WorkBudget {
    /// Sum of all terms: the change of kinetic energy.
    pub fn total(&self) -> f64 {
        self.spring + self.gravity + self.drive + self.friction + self.damping
    }

    /// Add another stretch.
    pub fn add(&mut self, o: &WorkBudget) {
        self.spring += o.spring;
        self.gravity += o.gravity;
        self.drive += o.drive;
        self.friction += o.friction;
        self.damping += o.damping;
    }
}

/// A validated moving part.
#[derive(Clone, Copy)]
pub enum Mechanism<'a> {
    /// Sliding part.
    Translating(TranslatingPart<'a>),
    /// Hinged part.
    Rotating(RotatingPart<'a>),
}

impl<'a> Mechanism<'a> {
    /// Linear (m, N, kg) or rotary (rad, N·m, kg·m²) coordinate.
    pub fn axis(&self) -> Axis {
        match self {
            Self::Translating(_) => Axis::Linear,
            Self::Rotating(_) => Axis::Rotary,
        }
    }

    /// Travel from the latch to contact (m or rad).
    pub fn travel(&self) -> f64 {
        match self {
            Self::Translating(p) => p.config().travel,
            Self::Rotating(p) => p.config().travel,
        }
    }

    /// The spring mount, if any.
    pub fn spring_mount(&self) -> Option<SpringMount<'a>> {
        match self {
            Self::Translating(p) => p.config().spring.map(SpringMount::Direct),
            Self::Rotating(p) => p.config().spring,
        }
    }

    /// Whether the part is on the spring at the latch (a spring that only
    /// bears on the part and is already at its free length is not).
    pub fn engaged_at_latch(&self) -> bool {
        match self.spring_mount() {
            None => false,
            Some(m) => {
                let e = m.range_ends();
                !(e.detaches_at_low && m.deflection(0.0) <= e.low)
            }
        }
    }

    /// Position where the part leaves a spring that only bears on it
    /// (deflection reaches the low end of its range), if that happens
    /// beyond the latch.
    pub fn detach_position(&self) -> Option<f64> {
        let m = self.spring_mount()?;
        let e = m.range_ends();
        match m {
            SpringMount::Direct(d) if e.detaches_at_low && d.sense == Sense::Unloads => {
                let q = d.deflection_at_latch - e.low;
                (q > 0.0).then_some(q)
            }
            _ => None,
        }
    }

    /// Generalised inertia (kg or kg·m²): the part, plus the spring's
    /// effective mass share while `engaged` (sliding part only).
    pub fn inertia(&self, engaged: bool) -> f64 {
        match self {
            Self::Translating(p) => p.config().mass + if engaged { p.spring_mass() } else { 0.0 },
            Self::Rotating(p) => p.inertia(),
        }
    }

    /// Generalised forces at `q` while moving in direction `dir` (±1), with
    /// the spring acting if `engaged`.
    #[inline]
    pub fn forces(&self, q: f64, dir: f64, engaged: bool) -> Forces {
        let spring = match (engaged, self.spring_mount()) {
            (true, Some(m)) => m.force(q, dir).0,
            _ => 0.0,
        };
        match self {
            Self::Translating(p) => Forces {
                spring,
                gravity: p.gravity_force(),
                drive: p.config().drive_force,
                friction: p.friction_force(),
                damping: p.config().damping,
            },
            Self::Rotating(p) => Forces {
                spring,
                gravity: p.gravity_torque(q),
                drive: p.config().drive_torque,
                friction: p.config().friction_torque,
                damping: p.config().damping,
            },
        }
    }

    /// The spring's own force or torque (N or N·m, positive = pushing back
    /// towards its free state) at `q`, and its deflection; `None` without a
    /// spring or when the part has left it.
    pub fn spring_state(&self, q: f64, dir: f64, engaged: bool) -> Option<(f64, f64)> {
        if !engaged {
            return None;
        }
        let m = self.spring_mount()?;
        Some((m.force(q, dir).1, m.deflection(q)))
    }

    /// Exact work of spring, gravity, drive and friction from `q1` to `q2`
    /// with the spring acting if `engaged` (damping not included).
    pub fn work(&self, q1: f64, q2: f64, engaged: bool) -> WorkBudget {
        let spring = match (engaged, self.spring_mount()) {
            (true, Some(m)) => m.work(q1, q2),
            _ => 0.0,
        };
        let f = self.forces(q1, 1.0, false);
        let dq = q2 - q1;
        let gravity = match self {
            Self::Translating(p) => p.gravity_force() * dq,
            Self::Rotating(p) => p.gravity_work(q1, q2),
        };
        WorkBudget {
            spring,
            gravity,
            drive: f.drive * dq,
            friction: -f.friction * dq.abs(),
            damping: 0.0,
        }
    }

    /// Work budget from the latch to `q` (forward motion), with the spring
    /// acting up to where the part leaves it.
    pub fn work_from_latch(&self, q: f64) -> WorkBudget {
        let engaged = self.engaged_at_latch();
        match self.detach_position() {
            Some(qd) if engaged && q > qd => {
                let mut w = self.work(0.0, qd, true);
                w.add(&self.work(qd, q, false));
                w
            }
            _ => self.work(0.0, q, engaged),
        }
    }

    /// Speed (m/s or rad/s) at `q` from rest at the latch by the work–energy
    /// theorem, when it applies: no viscous damping, and an attached spring
    /// stays within its deflection range. Where the part leaves the spring,
    /// its speed carries on and the inertia drops by the spring's share.
    /// Assumes the part did not stop on the way (the ODE checks that);
    /// `None` where the energy balance gives no real speed.
    pub fn closed_form_speed(&self, q: f64) -> Option<f64> {
        if self.forces(0.0, 1.0, false).damping > 0.0 {
            return None;
        }
        let engaged = self.engaged_at_latch();
        let qd = self.detach_position().filter(|&qd| engaged && qd < q);
        if let Some(m) = self.spring_mount().filter(|_| engaged) {
            // The attached spring must stay inside its range up to q (or qd).
            let end = qd.unwrap_or(q);
            let e = m.range_ends();
            let tol = 1e-12 * (e.high - e.low).abs().max(1e-300);
            let n = 64;
            for i in 0..=n {
                let s = m.deflection(end * f64::from(i) / f64::from(n));
                if s < e.low - tol || s > e.high + tol {
                    return None;
                }
            }
        }
        let v2 = match qd {
            Some(qd) => {
                let v1 = 2.0 * self.work(0.0, qd, true).total() / self.inertia(true);
                v1 + 2.0 * self.work(qd, q, false).total() / self.inertia(false)
            }
            None => 2.0 * self.work(0.0, q, engaged).total() / self.inertia(engaged),
        };
        (v2 >= 0.0 && v2.is_finite()).then(|| v2.sqrt())
    }

    /// Distance of the hazard point from the hinge (rotating part), m.
    pub fn hazard_radius(&self) -> Option<f64> {
        match self {
            Self::Translating(_) => None,
            Self::Rotating(p) => Some(p.config().hazard_radius),
        }
    }

    /// Speed of the hazard point (m/s) for a generalised speed `v`.
    pub fn hazard_speed(&self, v: f64) -> f64 {
        v * self.hazard_radius().unwrap_or(1.0)
    }

    /// Force at the hazard point (N) for a generalised force `q_force`.
    pub fn hazard_force(&self, q_force: f64) -> f64 {
        q_force / self.hazard_radius().unwrap_or(1.0)
    }

    /// Effective mass at the hazard point (kg): `M` for a sliding part,
    /// `I/r²` for a hinged one.
    pub fn hazard_mass(&self, engaged: bool) -> f64 {
        let r = self.hazard_radius().unwrap_or(1.0);
        self.inertia(engaged) / (r * r)
    }
}

#[cfg(test)]
pub(crate) mod tests;
