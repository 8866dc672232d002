//! A rotating (hinged) part: door, lid, flap or lever turning about a hinge
//! axis, with its moment of inertia from a shape preset or given directly, a
//! torsion spring at the hinge or a strut spring whose lever arm varies with
//! the angle, gravity torque for any hinge-axis tilt, hinge friction, viscous
//! damping, a drive torque, and the hazard point (closing edge).
//!
//! Coordinate `θ` (rad from the latch, positive towards contact). Plane of
//! rotation: origin on the hinge axis, `y` pointing up the slope of the plane
//! (straight up for a horizontal hinge), `x` chosen so that travel towards
//! contact turns from `x` towards `y` (counter-clockwise). Equation of motion:
//! `I·θ̈ = T_spring(θ) + T_g(θ) + T_D − T_f·sgn θ̇ − c·θ̇`, with the gravity
//! torque `T_g = −m·g·sin τ·r_cg·cos(ψ₀ + θ)` from the potential
//! `V = m·g·sin τ·r_cg·sin(ψ₀ + θ)`, `τ` the angle between the hinge axis and
//! the vertical (0: vertical hinge, no gravity torque; 90°: horizontal hinge,
//! full torque `m·g·r_cg·cos(angle of the centre of mass above the
//! horizontal)`), `ψ₀` the angle of the hinge-to-centre-of-mass line at the
//! latch. At the hazard point of radius `r`: edge speed `v = ω·r`, effective
//! mass `I/r²` (kinetic energy ½·I·ω² = ½·(I/r²)·v²), force `T/r`.
//!
//! Moments of inertia (rigid bodies; any dynamics textbook, common
//! practice): thin plate about one edge `m·w²/3` (`w` the width
//! perpendicular to the hinge); slender rod about one end `m·L²/3`; disc
//! about its centre `m·R²/2`; point mass `m·r²`; any body with its inertia
//! about the centre of mass, offset by `d` (parallel-axis theorem):
//! `I_cg + m·d²`.

use super::mount::SpringMount;
use crate::error::{check, InputError};
use crate::spring::Axis;

/// Moment of inertia about the hinge, with the mass and the distance of the
/// centre of mass from the hinge axis that gravity needs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum InertiaSpec {
    /// Given directly.
    Given {
        /// Moment of inertia about the hinge axis, kg·m².
        inertia: f64,
        /// Mass, kg.
        mass: f64,
        /// Distance of the centre of mass from the hinge axis, m.
        cg_radius: f64,
    },
    /// Uniform thin plate hinged along one edge: `I = m·w²/3`, `r_cg = w/2`.
    PlateAboutEdge {
        /// Mass, kg.
        mass: f64,
        /// Width from the hinge to the opposite edge, m.
        width: f64,
    },
    /// Uniform slender rod pivoted at one end: `I = m·L²/3`, `r_cg = L/2`.
    RodAboutEnd {
        /// Mass, kg.
        mass: f64,
        /// Length, m.
        length: f64,
    },
    /// Uniform disc about its centre: `I = m·R²/2`, `r_cg = 0`.
    DiscAboutCentre {
        /// Mass, kg.
        mass: f64,
        /// Radius, m.
        radius: f64,
    },
    /// Point mass at a radius: `I = m·r²`, `r_cg = r`.
    PointMass {
        /// Mass, kg.
        mass: f64,
        /// Radius, m.
        radius: f64,
    },
    /// Body with known inertia about its own centre of mass, offset from the
    /// hinge (parallel-axis theorem): `I = I_cg + m·d²`, `r_cg = d`.
    Offset {
        /// Mass, kg.
        mass: f64,
        /// Moment of inertia about the centre of mass, parallel to the hinge, kg·m².
        inertia_about_cg: f64,
        /// Distance of the centre of mass from the hinge axis, m.
        distance: f64,
    },
}

impl InertiaSpec {
    /// `(I about the hinge (kg·m²), mass (kg), r_cg (m))`, validated.
    ///
    /// # Errors
    /// An [`InputError`] on `inertia.*`.
    pub fn resolve(&self) -> Result<(f64, f64, f64), InputError> {
        let r = |e: InputError| e.within("inertia");
        Ok(match *self {
            Self::Given {
                inertia,
                mass,
                cg_radius,
            } => {
                let i = check::positive("inertia", inertia).map_err(r)?;
                let m = check::non_negative("mass", mass).map_err(r)?;
                let c = check::non_negative("cg_radius", cg_radius).map_err(r)?;
                // A body's inertia about an axis is at least m·r_cg² (parallel axis).
                if i < m * c * c * (1.0 - 1e-12) {
                    return Err(InputError::invalid(
                        "inertia.inertia",
                        "must be at least mass × cg_radius² (parallel-axis theorem)",
                    ));
                }
                (i, m, c)
            }
            Self::PlateAboutEdge { mass, width } => {
                let m = check::positive("mass", mass).map_err(r)?;
                let w = check::positive("width", width).map_err(r)?;
                (m * w * w / 3.0, m, 0.5 * w)
            }
            Self::RodAboutEnd { mass, length } => {
                let m = check::positive("mass", mass).map_err(r)?;
                let l = check::positive("length", length).map_err(r)?;
                (m * l * l / 3.0, m, 0.5 * l)
            }
            Self::DiscAboutCentre { mass, radius } => {
                let m = check::positive("mass", mass).map_err(r)?;
                let rr = check::positive("radius", radius).map_err(r)?;
                (0.5 * m * rr * rr, m, 0.0)
            }
            Self::PointMass { mass, radius } => {
                let m = check::positive("mass", mass).map_err(r)?;
                let rr = check::positive("radius", radius).map_err(r)?;
                (m * rr * rr, m, rr)
            }
            Self::Offset {
                mass,
                inertia_about_cg,
                distance,
            } => {
                let m = check::positive("mass", mass).map_err(r)?;
                let ic = check::non_negative("inertia_about_cg", inertia_about_cg).map_err(r)?;
                let d = check::non_negative("distance", distance).map_err(r)?;
                let i = ic + m * d * d;
                check::positive("inertia_about_cg", i).map_err(r)?;
                (i, m, d)
            }
        })
    }

    /// The formula in words, for a figure's method.
    pub fn formula(&self) -> &'static str {
        match self {
            Self::Given { .. } => "I given",
            Self::PlateAboutEdge { .. } => "I = m·w²/3 (thin plate about an edge)",
            Self::RodAboutEnd { .. } => "I = m·L²/3 (slender rod about an end)",
            Self::DiscAboutCentre { .. } => "I = m·R²/2 (disc about its centre)",
            Self::PointMass { .. } => "I = m·r² (point mass)",
            Self::Offset { .. } => "I = I_cg + m·d² (parallel-axis theorem)",
        }
    }
}

/// Inputs of a rotating part (SI units; angles in rad).
#[derive(Clone, Copy)]
pub struct RotatingConfig<'a> {
    /// Moment of inertia, mass and centre-of-mass radius.
    pub inertia: InertiaSpec,
    /// Angle of the hinge-to-centre-of-mass line from the x axis at the
    /// latch, rad (in the plane frame described in the module doc).
    pub cg_angle_at_latch: f64,
    /// Angle between the hinge axis and the vertical, rad, in [0, π/2]:
    /// 0 for a vertical hinge (no gravity torque), π/2 for a horizontal one.
    pub hinge_tilt: f64,
    /// Torsion spring at the hinge (`SpringMount::Direct` with a rotary
    /// spring) or a strut, if any.
    pub spring: Option<SpringMount<'a>>,
    /// Rotation from the latch to the contact position, rad, in (0, 2π].
    pub travel: f64,
    /// Hinge friction torque, N·m (≥ 0), opposing the motion.
    pub friction_torque: f64,
    /// Viscous damping at the hinge, N·m·s/rad (≥ 0).
    pub damping: f64,
    /// Constant drive torque, N·m (positive towards contact).
    pub drive_torque: f64,
    /// Distance of the hazard point (closing edge) from the hinge axis, m.
    pub hazard_radius: f64,
}

/// A validated rotating part.
#[derive(Clone, Copy)]
pub struct RotatingPart<'a> {
    cfg: RotatingConfig<'a>,
    inertia: f64,
    mass: f64,
    cg_radius: f64,
    /// m·g·sin τ·r_cg, N·m: amplitude of the gravity torque.
    gravity_amplitude: f64,
}

impl<'a> RotatingPart<'a> {
    /// Validate the inputs.
    ///
    /// # Errors
    /// An [`InputError`] naming the field (local names: `inertia.*`,
    /// `cg_angle_at_latch`, `hinge_tilt`, `travel`, `friction_torque`,
    /// `damping`, `drive_torque`, `hazard_radius`, `spring.*`).
    pub fn new(cfg: RotatingConfig<'a>) -> Result<Self, InputError> {
        let (inertia, mass, cg_radius) = cfg.inertia.resolve()?;
        check::finite("cg_angle_at_latch", cfg.cg_angle_at_latch)?;
        check::in_range(
            "hinge_tilt",
            cfg.hinge_tilt,
            0.0,
            std::f64::consts::FRAC_PI_2,
        )?;
        check::in_range("travel", cfg.travel, 0.0, std::f64::consts::TAU)?;
        check::positive("travel", cfg.travel)?;
        check::non_negative("friction_torque", cfg.friction_torque)?;
        check::non_negative("damping", cfg.damping)?;
        check::finite("drive_torque", cfg.drive_torque)?;
        check::positive("hazard_radius", cfg.hazard_radius)?;
        if let Some(m) = cfg.spring {
            m.validate(Axis::Rotary)?;
        }
        Ok(Self {
            cfg,
            inertia,
            mass,
            cg_radius,
            gravity_amplitude: mass * crate::G_N * cfg.hinge_tilt.sin() * cg_radius,
        })
    }

    /// The inputs.
    pub fn config(&self) -> &RotatingConfig<'a> {
        &self.cfg
    }

    /// Moment of inertia about the hinge, kg·m².
    pub fn inertia(&self) -> f64 {
        self.inertia
    }

    /// Mass, kg.
    pub fn mass(&self) -> f64 {
        self.mass
    }

    /// Distance of the centre of mass from the hinge axis, m.
    pub fn cg_radius(&self) -> f64 {
        self.cg_radius
    }

    /// Gravity torque at `θ`, N·m (positive towards contact).
    #[inline]
    pub fn gravity_torque(&self, theta: f64) -> f64 {
        -self.gravity_amplitude * (self.cfg.cg_angle_at_latch + theta).cos()
    }

    /// Work of gravity from `θ₁` to `θ₂`, `V(θ₁) − V(θ₂)`, J (exact).
    pub fn gravity_work(&self, t1: f64, t2: f64) -> f64 {
        let psi = self.cfg.cg_angle_at_latch;
        self.gravity_amplitude * ((psi + t1).sin() - (psi + t2).sin())
    }

    /// Effective mass at the hazard point, `I/r²`, kg.
    pub fn hazard_mass(&self) -> f64 {
        self.inertia / (self.cfg.hazard_radius * self.cfg.hazard_radius)
    }
}
