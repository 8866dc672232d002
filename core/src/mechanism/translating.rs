//! A translating (sliding) part: a mass moving along a straight path from the
//! latch to the contact point, driven or resisted by a spring, gravity, a
//! constant drive force, Coulomb friction and viscous damping.
//!
//! Generalised coordinate `x` (m from the latch, positive towards contact).
//! Equation of motion (Newton's second law along the path):
//! `(m + m_s)·ẍ = F_spring(x) − m·g·sin α + F_D − μ·m·g·|cos α|·sgn ẋ − c·ẋ`,
//! where `α` is the incline of the path above the horizontal (positive
//! uphill, −90° straight down), `m_s` the spring's effective mass share
//! (Rayleigh: one third of a uniform helical spring's mass, supplied by the
//! spring model), `μ` the Coulomb coefficient (or a fixed friction force).
//! Sources: any dynamics textbook (common practice); Rayleigh's spring-mass
//! correction as in reference-values §10.

use super::mount::{DirectSpring, SpringMount};
use crate::error::{check, InputError};
use crate::spring::Axis;

/// Coulomb friction of a sliding part, opposing the motion.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Friction {
    /// No friction.
    None,
    /// Coefficient μ (dimensionless, 0–2) times the normal force from the
    /// incline, `m·g·|cos α|`.
    Coefficient(f64),
    /// A fixed friction force (N, ≥ 0), e.g. measured with a force gauge.
    Force(f64),
}

/// Inputs of a translating part (SI units).
#[derive(Clone, Copy)]
pub struct TranslatingConfig<'a> {
    /// Moving mass, kg (the part, without the spring).
    pub mass: f64,
    /// The spring along the path, if any.
    pub spring: Option<DirectSpring<'a>>,
    /// Travel from the latched position to the contact point, m (> 0).
    pub travel: f64,
    /// Incline of the direction of travel above the horizontal, rad, in
    /// [−π/2, π/2]: +π/2 moves straight up, −π/2 falls straight down.
    pub incline: f64,
    /// Coulomb friction.
    pub friction: Friction,
    /// Viscous damping coefficient, N·s/m (≥ 0).
    pub damping: f64,
    /// Constant drive force along the travel, N (positive towards contact):
    /// a cylinder or motor that keeps pushing.
    pub drive_force: f64,
    /// Add the spring's effective mass share to the moving mass while the
    /// part is on the spring.
    pub include_spring_mass: bool,
}

/// A validated translating part.
#[derive(Clone, Copy)]
pub struct TranslatingPart<'a> {
    cfg: TranslatingConfig<'a>,
    friction_force: f64,
    gravity_force: f64,
    spring_mass: f64,
}

impl<'a> TranslatingPart<'a> {
    /// Validate the inputs.
    ///
    /// # Errors
    /// An [`InputError`] naming the field (local names: `mass`, `travel`,
    /// `incline`, `friction`, `damping`, `drive_force`, `spring.*`).
    pub fn new(cfg: TranslatingConfig<'a>) -> Result<Self, InputError> {
        check::positive("mass", cfg.mass)?;
        check::positive("travel", cfg.travel)?;
        let half_pi = std::f64::consts::FRAC_PI_2;
        check::in_range("incline", cfg.incline, -half_pi, half_pi)?;
        check::non_negative("damping", cfg.damping)?;
        check::finite("drive_force", cfg.drive_force)?;
        let normal = cfg.mass * crate::G_N * cfg.incline.cos().abs();
        let friction_force = match cfg.friction {
            Friction::None => 0.0,
            // A coefficient above 2 is outside any dry-friction pairing.
            Friction::Coefficient(mu) => check::in_range("friction", mu, 0.0, 2.0)? * normal,
            Friction::Force(f) => check::non_negative("friction", f)?,
        };
        let mut spring_mass = 0.0;
        if let Some(d) = cfg.spring {
            SpringMount::Direct(d).validate(Axis::Linear)?;
            if cfg.include_spring_mass {
                spring_mass =
                    check::non_negative("spring.effective_mass", d.spring.effective_mass())?;
            }
        }
        Ok(Self {
            cfg,
            friction_force,
            gravity_force: -cfg.mass * crate::G_N * cfg.incline.sin(),
            spring_mass,
        })
    }

    /// The inputs.
    pub fn config(&self) -> &TranslatingConfig<'a> {
        &self.cfg
    }

    /// Coulomb friction force magnitude, N.
    pub fn friction_force(&self) -> f64 {
        self.friction_force
    }

    /// Gravity component along the travel, `−m·g_n·sin α`, N.
    pub fn gravity_force(&self) -> f64 {
        self.gravity_force
    }

    /// The spring's effective mass share added while on the spring, kg.
    pub fn spring_mass(&self) -> f64 {
        self.spring_mass
    }
}
