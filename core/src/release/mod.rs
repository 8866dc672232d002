//! Release of a latched mechanism: motion from rest at the latch under
//! spring, gravity and drive, against friction and damping, until contact,
//! a stall, or the end of the spring's stroke.
//!
//! # Method
//! The equation of motion of [`crate::mechanism`],
//! `M·q̈ = Q_spring + Q_gravity + Q_drive − Q_friction − c·q̇`, is integrated
//! by the Dormand–Prince 5(4) solver of [`crate::ode`] with the state
//! `(q, q̇, W_damping)` and these terminal events: contact (`q = travel`),
//! standstill (`q̇` falls through zero), creep into a static equilibrium
//! (speed and acceleration both negligible), the part leaving a spring that
//! only bears on it (deflection reaches its free end: the integration
//! restarts without the spring and its mass share), and an attached spring
//! reaching the end of its range (solid, or a gas spring fully extended).
//! Where it applies (no viscous damping), the speed is also given by the
//! work–energy theorem `½·M·v² = W_spring + W_gravity + W_drive − W_friction`
//! with the exact work integrals; the reported speed is that closed form and
//! the ODE cross-checks it. Sources: Dormand & Prince (1980); Hairer,
//! Nørsett & Wanner, *Solving ODEs I* (1993); work–energy theorem (any
//! dynamics textbook, common practice).
//!
//! # Stall
//! If the speed falls to zero before contact, the part stalls there. The
//! cause reported is the largest consumer of the energy released so far
//! (gravity, friction, damping, a resisting spring or drive); the stall also
//! says whether the spring was exhausted (the part had left it or it no
//! longer pushed) and whether static friction holds the part there or it
//! moves back towards the latch.

use crate::error::InputError;
use crate::figure::{ids, Figure};
use crate::mechanism::{Mechanism, RangeEnds, SpringMount, WorkBudget};
use crate::ode::{
    self, Direction, EventSpec, OdeError, OdeSystem, SolverConfig, Stats, StopReason, Trajectory,
};
use crate::spring::Axis;
use crate::units::tag;
use crate::units::Dim;
use std::fmt;

/// Settings of a release simulation.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct ReleaseConfig {
    /// Integrator settings (tolerances, step cap); `t_end` is the longest
    /// time simulated (s), infinity by default (events end the motion).
    pub solver: SolverConfig,
    /// Number of points of the time history to return for plots (0: none;
    /// no allocation for the history then).
    pub samples: usize,
}

/// Why a release could not be computed.
#[derive(Debug, Clone, PartialEq)]
pub enum ReleaseError {
    /// An input is not usable.
    Input(InputError),
    /// The integration failed (typed, bounded).
    Ode(OdeError),
    /// The time limit `solver.t_end` was reached before any outcome.
    NotFinished {
        /// Time reached, s.
        time: f64,
    },
}

impl fmt::Display for ReleaseError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Self::Input(e) => write!(f, "{e}"),
            Self::Ode(e) => write!(f, "{e}"),
            Self::NotFinished { time } => write!(
                f,
                "the part had neither reached contact nor stopped after {time} s"
            ),
        }
    }
}

impl std::error::Error for ReleaseError {}

impl From<OdeError> for ReleaseError {
    fn from(e: OdeError) -> Self {
        match e {
            OdeError::Input(i) => Self::Input(i),
            other => Self::Ode(other),
        }
    }
}

/// Which force consumed most of the energy before a stall.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StallCause {
    /// Gravity (the part moves uphill, or a lid is lifted).
    Gravity,
    /// Coulomb friction.
    Friction,
    /// Viscous damping.
    Damping,
    /// A spring that is loaded by the travel (it resists).
    Spring,
    /// A drive pushing away from contact.
    Drive,
}

impl StallCause {
    /// The cause in words.
    pub fn describe(self) -> &'static str {
        match self {
            Self::Gravity => "gravity",
            Self::Friction => "friction",
            Self::Damping => "damping",
            Self::Spring => "the spring resisting the travel",
            Self::Drive => "the drive pushing away from contact",
        }
    }
}

/// Where and why the part stops before contact.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Stall {
    /// Position from the latch, m or rad.
    pub position: f64,
    /// Remaining travel to the contact point, m or rad.
    pub short_of_contact: f64,
    /// Largest consumer of the released energy (or of the push at the
    /// latch, if the part never moves).
    pub cause: StallCause,
    /// The spring had nothing left to give: the part had left it, or it no
    /// longer pushed towards contact.
    pub spring_exhausted: bool,
    /// Static friction (or an exact balance of forces) holds the part there;
    /// otherwise it moves back towards the latch.
    pub holds: bool,
}

/// How the release ended.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ReleaseEnd {
    /// The part reached the contact point.
    Contact,
    /// The part stopped before contact.
    Stall(Stall),
    /// An attached spring reached the end of its range (solid, or a gas
    /// spring fully extended) before contact: it stops the part there.
    SpringEndOfStroke {
        /// Position from the latch, m or rad.
        position: f64,
    },
}

/// One point of the time history.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct HistoryPoint {
    /// Time from release, s.
    pub time: f64,
    /// Position from the latch, m or rad.
    pub position: f64,
    /// Speed, m/s or rad/s.
    pub speed: f64,
    /// Speed of the hazard point, m/s.
    pub hazard_speed: f64,
    /// Spring force or torque, N or N·m (0 without a spring or once left).
    pub spring_force: f64,
    /// Buffer force, N (0 before contact).
    pub buffer_force: f64,
    /// Kinetic energy, J.
    pub kinetic_energy: f64,
}

impl HistoryPoint {
    /// Whether every number of the point is finite.
    pub fn is_finite(&self) -> bool {
        [
            self.time,
            self.position,
            self.speed,
            self.hazard_speed,
            self.spring_force,
            self.buffer_force,
            self.kinetic_energy,
        ]
        .into_iter()
        .all(f64::is_finite)
    }
}

/// Result of a release.
#[derive(Debug, Clone, PartialEq)]
pub struct ReleaseOutcome {
    /// How it ended.
    pub end: ReleaseEnd,
    /// Linear or rotary coordinate.
    pub axis: Axis,
    /// Time at the end, s.
    pub time: f64,
    /// Position at the end, m or rad.
    pub position: f64,
    /// Speed at the end from the ODE, m/s or rad/s.
    pub speed_ode: f64,
    /// Speed at the end from the work–energy theorem, when it applies.
    pub speed_energy_balance: Option<f64>,
    /// Whether the spring still acts on the part at the end.
    pub spring_engaged: bool,
    /// Position where the part left the spring, if it did.
    pub left_spring_at: Option<f64>,
    /// Work of each force from the latch to the end, J.
    pub work: WorkBudget,
    /// Generalised inertia at the end, kg or kg·m².
    pub inertia: f64,
    /// Effective mass at the hazard point at the end, kg.
    pub hazard_mass: f64,
    /// Static force at the closing point if the part comes to rest there
    /// (spring + drive + gravity − friction, at the hazard point), N; zero
    /// if those forces do not press the part into the closing point.
    pub closing_force_static: f64,
    /// Integrator work.
    pub stats: Stats,
    /// Time history (empty unless requested).
    pub history: Vec<HistoryPoint>,
    damped: bool,
    rotary_source: Option<&'static str>,
    /// Hazard-point speed per unit generalised speed: 1 for a sliding part,
    /// the hazard radius (m) for a hinged one.
    hazard_lever: f64,
}

impl ReleaseOutcome {
    /// Generalised speed at the end (m/s or rad/s): the work–energy value
    /// where it applies, else the ODE's.
    pub fn speed(&self) -> f64 {
        self.speed_energy_balance.unwrap_or(self.speed_ode)
    }

    /// Speed of the hazard point at the end, m/s.
    pub fn hazard_speed(&self) -> f64 {
        self.speed() * self.hazard_lever
    }

    /// Kinetic energy at the end, ½·M·v², J.
    pub fn kinetic_energy(&self) -> f64 {
        0.5 * self.inertia * self.speed() * self.speed()
    }

    /// Whether the part reached contact.
    pub fn reached_contact(&self) -> bool {
        matches!(self.end, ReleaseEnd::Contact)
    }

    /// Relative difference between the ODE and the work–energy speed at the
    /// end, when both exist.
    pub fn energy_check(&self) -> Option<f64> {
        let e = self.speed_energy_balance?;
        Some((self.speed_ode - e).abs() / e.abs().max(f64::MIN_POSITIVE))
    }

    fn assumptions(&self, f: Figure) -> Figure {
        let mut f = f
            .assume("rigid part with one degree of freedom; rigid frame")
            .assume("Coulomb friction independent of speed; no air drag")
            .assume("spring force from its characteristic on the unloading branch");
        if self.axis == Axis::Linear {
            f = f.assume(
                "the spring's effective mass share (Rayleigh, from the spring model) moves \
                 with the part until the part leaves the spring",
            );
        } else {
            f = f.assume("the spring's own inertia is neglected");
        }
        if let Some(src) = self.rotary_source {
            f = f.assume(src);
        }
        f
    }

    fn speed_method(&self) -> &'static str {
        if self.damped {
            "Dormand–Prince 5(4) integration of M·q̈ = Q_spring + Q_gravity + Q_drive − Q_friction − c·q̇"
        } else {
            "½·M·v² = W_spring + W_gravity + W_drive − W_friction (work–energy theorem, exact \
             work integrals), cross-checked by Dormand–Prince 5(4) integration"
        }
    }

    /// The value of figure `id` as [`ReleaseOutcome::figures`] reports it,
    /// in SI: `None` when that figure is missing (no contact, no stall, a
    /// non-finite result) or is not one of these figures. The one place that
    /// maps the figure ids to numbers: [`ReleaseOutcome::figures`] takes its
    /// values from here, and the tolerance study reads them without building
    /// the figures. A stalled part reaches the contact point with speed and
    /// kinetic energy 0.
    pub fn figure_value(&self, id: &str) -> Option<f64> {
        let contact = matches!(self.end, ReleaseEnd::Contact);
        let stalled = matches!(self.end, ReleaseEnd::Stall(_));
        match id {
            ids::RELEASE_EFFECTIVE_MASS => Some(self.hazard_mass),
            ids::RELEASE_CONTACT_SPEED if contact => Some(self.hazard_speed()),
            ids::RELEASE_KINETIC_ENERGY if contact => Some(self.kinetic_energy()),
            ids::RELEASE_CONTACT_SPEED | ids::RELEASE_KINETIC_ENERGY if stalled => Some(0.0),
            ids::RELEASE_TIME_TO_CONTACT if contact => Some(self.time),
            ids::RELEASE_STALL_POSITION => match self.end {
                ReleaseEnd::Stall(s) => Some(s.position),
                _ => None,
            },
            ids::CLOSING_FORCE_STATIC => Some(self.closing_force_static),
            _ => None,
        }
        .filter(|v| v.is_finite())
    }

    /// [`ReleaseOutcome::figure_value`], NaN when missing (which
    /// [`Figure::new`] records as missing).
    fn value_or_nan(&self, id: &str) -> f64 {
        self.figure_value(id).unwrap_or(f64::NAN)
    }

    /// The user-facing figures: effective mass, contact speed, kinetic
    /// energy, time to contact, stall position, static closing force.
    pub fn figures(&self) -> Vec<Figure> {
        const SRC: &str = "work–energy theorem and Newton's second law (any dynamics textbook; \
                           common practice); Dormand & Prince, J. Comput. Appl. Math. 6 (1980); \
                           Hairer, Nørsett & Wanner, Solving ODEs I, 2nd ed. (1993) II.4–II.6";
        let mut out = Vec::with_capacity(6);
        let mass_method = if self.axis == Axis::Linear {
            "m_eff = m + m_spring share"
        } else {
            "m_eff = I/r² at the hazard point (½·I·ω² = ½·m_eff·v²)"
        };
        out.push(self.assumptions(
            Figure::new(ids::RELEASE_EFFECTIVE_MASS, "Effective mass at the hazard point", Dim::Mass, self.value_or_nan(ids::RELEASE_EFFECTIVE_MASS))
                .method(mass_method)
                .source("rigid-body kinetics (any dynamics textbook; common practice); Rayleigh spring-mass correction"),
        ));
        let (speed, energy, time) = match self.end {
            ReleaseEnd::Contact => (
                Figure::new(
                    ids::RELEASE_CONTACT_SPEED,
                    "Speed at contact",
                    Dim::Speed,
                    self.value_or_nan(ids::RELEASE_CONTACT_SPEED),
                ),
                Figure::new(
                    ids::RELEASE_KINETIC_ENERGY,
                    "Kinetic energy at contact",
                    Dim::Energy,
                    self.value_or_nan(ids::RELEASE_KINETIC_ENERGY),
                ),
                Figure::new(
                    ids::RELEASE_TIME_TO_CONTACT,
                    "Time from release to contact",
                    Dim::Time,
                    self.value_or_nan(ids::RELEASE_TIME_TO_CONTACT),
                ),
            ),
            ReleaseEnd::Stall(s) => {
                let note = format!(
                    "the part stops {} short of the contact point ({})",
                    tag(
                        s.short_of_contact,
                        if self.axis == Axis::Linear {
                            Dim::Length
                        } else {
                            Dim::Angle
                        }
                    ),
                    s.cause.describe()
                );
                (
                    Figure::new(
                        ids::RELEASE_CONTACT_SPEED,
                        "Speed at contact",
                        Dim::Speed,
                        self.value_or_nan(ids::RELEASE_CONTACT_SPEED),
                    )
                    .assume(&note),
                    Figure::new(
                        ids::RELEASE_KINETIC_ENERGY,
                        "Kinetic energy at contact",
                        Dim::Energy,
                        self.value_or_nan(ids::RELEASE_KINETIC_ENERGY),
                    )
                    .assume(&note),
                    Figure::missing(
                        ids::RELEASE_TIME_TO_CONTACT,
                        "Time from release to contact",
                        Dim::Time,
                        vec![note],
                    ),
                )
            }
            ReleaseEnd::SpringEndOfStroke { position } => {
                let note = format!(
                    "the spring reaches the end of its range at {} from the latch, \
                     before contact: the part is stopped by the spring (solid or fully extended)",
                    tag(
                        position,
                        if self.axis == Axis::Linear {
                            Dim::Length
                        } else {
                            Dim::Angle
                        }
                    )
                );
                (
                    Figure::missing(
                        ids::RELEASE_CONTACT_SPEED,
                        "Speed at contact",
                        Dim::Speed,
                        vec![note.clone()],
                    ),
                    Figure::missing(
                        ids::RELEASE_KINETIC_ENERGY,
                        "Kinetic energy at contact",
                        Dim::Energy,
                        vec![note.clone()],
                    ),
                    Figure::missing(
                        ids::RELEASE_TIME_TO_CONTACT,
                        "Time from release to contact",
                        Dim::Time,
                        vec![note],
                    ),
                )
            }
        };
        out.push(self.assumptions(speed.method(self.speed_method()).source(SRC)));
        out.push(
            self.assumptions(
                energy
                    .method("E = ½·M·v² (with the speed above)")
                    .source(SRC),
            ),
        );
        out.push(self.assumptions(time.method("Dormand–Prince 5(4) integration, contact located by root finding on the dense output").source(SRC)));
        let dim = if self.axis == Axis::Linear {
            Dim::Length
        } else {
            Dim::Angle
        };
        let stall = match self.end {
            ReleaseEnd::Stall(s) => {
                let mut f = Figure::new(
                    ids::RELEASE_STALL_POSITION,
                    "Stall position from the latch",
                    dim,
                    self.value_or_nan(ids::RELEASE_STALL_POSITION),
                )
                .assume(&format!("main energy consumer: {}", s.cause.describe()));
                if s.spring_exhausted {
                    f = f.assume("the spring was exhausted before the part stopped");
                }
                f.assume(if s.holds {
                    "static friction holds the part there"
                } else {
                    "the part then moves back towards the latch"
                })
            }
            _ => Figure::missing(
                ids::RELEASE_STALL_POSITION,
                "Stall position from the latch",
                dim,
                vec!["the part does not stall before the contact point".into()],
            ),
        };
        out.push(self.assumptions(
            stall
                .method("standstill located by root finding on the dense output of the Dormand–Prince 5(4) solution")
                .source(SRC),
        ));
        let mut closing = Figure::new(ids::CLOSING_FORCE_STATIC, "Static force at the closing point", Dim::Force, self.value_or_nan(ids::CLOSING_FORCE_STATIC))
            .method("F = (Q_spring + Q_drive + Q_gravity − Q_friction)/r at the contact position (statics)")
            .source("statics (any mechanics textbook; common practice)")
            .assume("friction fully opposes the closing (the part arrived moving towards the closing point); with friction relaxed by vibration the force can rise by the friction share");
        if self.closing_force_static <= 0.0 {
            closing =
                closing.assume("the forces at the closing point do not press the part into it");
        }
        out.push(self.assumptions(closing));
        out
    }
}

// Event indices of the release ODE.
const EV_CONTACT: usize = 0;
const EV_STOP: usize = 1;
const EV_CREEP: usize = 2;
const EV_SPRING_LOW: usize = 3;
const EV_SPRING_HIGH: usize = 4;

/// Creep threshold relative to the reference speed: below 1e-7·v_ref with
/// an acceleration below 1e-7·v_ref/t_ref the part is at rest for any
/// figure we print (4 significant figures).
const CREEP_FRACTION: f64 = 1e-7;

/// The release equation of motion for one phase (spring on or off).
pub(crate) struct ReleaseOde<'m, 'a> {
    pub(crate) mech: &'m Mechanism<'a>,
    pub(crate) engaged: bool,
    pub(crate) inertia: f64,
    mount: Option<SpringMount<'a>>,
    ends: RangeEnds,
    travel: f64,
    v_creep: f64,
    t_ref: f64,
    /// Energy scale of the damping-work component (J): ½·M·v_ref².
    e_ref: f64,
}

impl<'m, 'a> ReleaseOde<'m, 'a> {
    fn new(mech: &'m Mechanism<'a>, engaged: bool, v_ref: f64, t_ref: f64) -> Self {
        let mount = if engaged { mech.spring_mount() } else { None };
        let inertia = mech.inertia(engaged);
        Self {
            mech,
            engaged,
            inertia,
            ends: mount.map(|m| m.range_ends()).unwrap_or(RangeEnds {
                low: f64::NEG_INFINITY,
                high: f64::INFINITY,
                detaches_at_low: false,
            }),
            mount,
            travel: mech.travel(),
            v_creep: CREEP_FRACTION * v_ref,
            t_ref,
            e_ref: 0.5 * inertia * v_ref * v_ref,
        }
    }

    #[inline]
    fn accel(&self, q: f64, v: f64) -> f64 {
        self.mech.forces(q, 1.0, self.engaged).net(v, 1.0) / self.inertia
    }
}

impl OdeSystem<3> for ReleaseOde<'_, '_> {
    #[inline]
    fn rhs(&self, _t: f64, y: &[f64; 3], dy: &mut [f64; 3]) {
        let f = self.mech.forces(y[0], 1.0, self.engaged);
        dy[0] = y[1];
        dy[1] = f.net(y[1], 1.0) / self.inertia;
        dy[2] = -f.damping * y[1] * y[1];
    }
    fn event_count(&self) -> usize {
        5
    }
    fn event(&self, index: usize, _t: f64, y: &[f64; 3]) -> f64 {
        match index {
            EV_CONTACT => y[0] - self.travel,
            EV_STOP => y[1],
            // While the speed alone is above the threshold the sign is known
            // without the acceleration (saves a force evaluation per step).
            EV_CREEP if y[1].abs() > self.v_creep => y[1].abs() - self.v_creep,
            EV_CREEP => y[1].max(self.accel(y[0], y[1]).abs() * self.t_ref) - self.v_creep,
            EV_SPRING_LOW => self
                .mount
                .map_or(1.0, |m| m.deflection(y[0]) - self.ends.low),
            EV_SPRING_HIGH => self
                .mount
                .map_or(1.0, |m| self.ends.high - m.deflection(y[0])),
            _ => 1.0,
        }
    }
    fn event_spec(&self, index: usize) -> EventSpec {
        match index {
            EV_CONTACT => EventSpec::terminal(Direction::Rising),
            _ => EventSpec::terminal(Direction::Falling),
        }
    }
    /// The damping work starts at zero and only accumulates: its error is
    /// measured against the release's reference energy ½·M·v_ref².
    fn magnitudes(&self) -> [f64; 3] {
        [0.0, 0.0, self.e_ref]
    }
}

/// Reference speed and time of a release: `v_ref = √(2·E_ref/M)` with
/// `E_ref` the sum of the magnitudes of the work terms over the travel, and
/// `t_ref = travel / v_ref`.
pub(crate) fn reference_scales(mech: &Mechanism<'_>) -> (f64, f64) {
    let w = mech.work_from_latch(mech.travel());
    let e = w.spring.abs() + w.gravity.abs() + w.drive.abs() + w.friction.abs();
    let m = mech.inertia(mech.engaged_at_latch());
    let v_ref = (2.0 * e / m).sqrt();
    if v_ref.is_finite() && v_ref > 0.0 {
        (v_ref, mech.travel() / v_ref)
    } else {
        (1.0, mech.travel())
    }
}

/// Simulate the release of `mech` from rest at the latch.
///
/// # Errors
/// [`ReleaseError::Input`] for unusable solver settings, and the bounded
/// failures of the integrator ([`ReleaseError::Ode`]) or of the time limit.
pub fn release(mech: &Mechanism<'_>, cfg: &ReleaseConfig) -> Result<ReleaseOutcome, ReleaseError> {
    let o = release_unchecked(mech, cfg)?;
    // Inputs each valid but of extreme size can overflow the integration;
    // such an outcome is refused, never handed on with NaN in it.
    let w = &o.work;
    let numbers = [
        o.time,
        o.position,
        o.speed_ode,
        o.speed_energy_balance.unwrap_or(0.0),
        o.left_spring_at.unwrap_or(0.0),
        o.inertia,
        o.hazard_mass,
        o.closing_force_static,
        w.spring,
        w.gravity,
        w.drive,
        w.friction,
        w.damping,
    ];
    if numbers.into_iter().all(f64::is_finite) && o.history.iter().all(HistoryPoint::is_finite) {
        Ok(o)
    } else {
        Err(ReleaseError::Input(InputError::invalid(
            "mass",
            "the release gives no finite figures for inputs of this size: check the sizes and \
             units of the mass, spring, forces and travel",
        )))
    }
}

fn release_unchecked(
    mech: &Mechanism<'_>,
    cfg: &ReleaseConfig,
) -> Result<ReleaseOutcome, ReleaseError> {
    let travel = mech.travel();
    let (v_ref, t_ref) = reference_scales(mech);
    let mut engaged = mech.engaged_at_latch();
    let mut t = 0.0;
    let mut y = [0.0, 0.0, 0.0];
    let mut stats = Stats::default();
    let mut left_spring_at = None;
    let mut phases: Vec<(Trajectory<3>, bool)> = Vec::new();

    // Does the part move at all? At rest the friction can hold up to its
    // full value in either direction.
    let f0 = mech.forces(0.0, 1.0, engaged);
    let end = if f0.active() <= f0.friction {
        ReleaseEnd::Stall(Stall {
            position: 0.0,
            short_of_contact: travel,
            cause: cause_at_rest(&f0),
            spring_exhausted: mech.spring_mount().is_some() && f0.spring <= 0.0,
            holds: f0.active() >= -f0.friction,
        })
    } else {
        let mut end = None;
        // At most: on the spring, off the spring. A third pass is never
        // needed; the bound keeps the loop finite regardless.
        for _phase in 0..3 {
            let sys = ReleaseOde::new(mech, engaged, v_ref, t_ref);
            let sol = if cfg.samples > 0 {
                let mut traj = Trajectory::new();
                let s = ode::solve(&sys, t, y, &cfg.solver, &mut traj);
                phases.push((traj, engaged));
                s?
            } else {
                ode::integrate(&sys, t, y, &cfg.solver)?
            };
            stats.add(&sol.stats);
            t = sol.t;
            y = sol.y;
            match sol.stop {
                StopReason::ReachedEnd => return Err(ReleaseError::NotFinished { time: t }),
                StopReason::Event { index: EV_CONTACT } => {
                    y[0] = travel;
                    end = Some(ReleaseEnd::Contact);
                }
                StopReason::Event {
                    index: i @ (EV_STOP | EV_CREEP),
                } => {
                    y[1] = y[1].max(0.0);
                    let mut st = stall_at(
                        mech,
                        y[0],
                        engaged,
                        left_spring_at.is_some(),
                        &work_budget(mech, y[0], y[2]),
                    );
                    // Creeping into a static equilibrium: it stays there.
                    st.holds |= i == EV_CREEP;
                    end = Some(ReleaseEnd::Stall(st));
                }
                StopReason::Event {
                    index: EV_SPRING_LOW,
                } if sys.ends.detaches_at_low => {
                    left_spring_at = Some(y[0]);
                    engaged = false;
                    continue;
                }
                StopReason::Event { .. } => {
                    end = Some(ReleaseEnd::SpringEndOfStroke { position: y[0] });
                }
            }
            break;
        }
        end.unwrap_or(ReleaseEnd::SpringEndOfStroke { position: y[0] })
    };

    let position = y[0];
    let work = work_budget(mech, position, y[2]);
    let damped = f0.damping > 0.0;
    let speed_energy_balance = if damped {
        None
    } else if matches!(end, ReleaseEnd::Stall(_)) {
        Some(0.0)
    } else {
        mech.closed_form_speed(position)
    };
    let closing_force_static = closing_force(mech);
    let rotary_source = match mech {
        Mechanism::Rotating(p) => Some(p.config().inertia.formula()),
        Mechanism::Translating(_) => None,
    };
    let history = if cfg.samples > 0 {
        sample_release(mech, &phases, cfg.samples)
    } else {
        Vec::new()
    };
    Ok(ReleaseOutcome {
        end,
        axis: mech.axis(),
        time: t,
        position,
        speed_ode: y[1],
        speed_energy_balance,
        spring_engaged: engaged,
        left_spring_at,
        work,
        inertia: mech.inertia(engaged),
        hazard_mass: mech.hazard_mass(engaged),
        closing_force_static,
        stats,
        history,
        damped,
        rotary_source,
        hazard_lever: mech.hazard_radius().unwrap_or(1.0),
    })
}

/// Exact work budget from the latch to `q`, with the damping work from the
/// ODE's third state component.
fn work_budget(mech: &Mechanism<'_>, q: f64, damping_work: f64) -> WorkBudget {
    let mut w = mech.work_from_latch(q);
    w.damping = damping_work;
    w
}

/// Static force at the hazard point with the part at rest on the contact
/// point, friction opposing the closing: `(Q_active − Q_friction)/r`, ≥ 0.
pub(crate) fn closing_force(mech: &Mechanism<'_>) -> f64 {
    let q = mech.travel();
    let engaged = match (mech.engaged_at_latch(), mech.detach_position()) {
        (true, Some(qd)) => q < qd,
        (e, _) => e,
    };
    let f = mech.forces(q, 1.0, engaged);
    mech.hazard_force(f.active() - f.friction).max(0.0)
}

fn cause_at_rest(f: &crate::mechanism::Forces) -> StallCause {
    if f.active() > 0.0 {
        return StallCause::Friction;
    }
    let mut best = (f.gravity, StallCause::Gravity);
    for c in [(f.spring, StallCause::Spring), (f.drive, StallCause::Drive)] {
        if c.0 < best.0 {
            best = c;
        }
    }
    best.1
}

fn stall_at(mech: &Mechanism<'_>, q: f64, engaged: bool, left: bool, w: &WorkBudget) -> Stall {
    let mut best = (w.gravity, StallCause::Gravity);
    for c in [
        (w.friction, StallCause::Friction),
        (w.damping, StallCause::Damping),
        (w.spring, StallCause::Spring),
        (w.drive, StallCause::Drive),
    ] {
        if c.0 < best.0 {
            best = c;
        }
    }
    let f = mech.forces(q, 1.0, engaged);
    Stall {
        position: q,
        short_of_contact: (mech.travel() - q).max(0.0),
        cause: best.1,
        spring_exhausted: mech.spring_mount().is_some() && (left || f.spring <= 0.0),
        holds: f.active().abs() <= f.friction,
    }
}

/// Sample the recorded phases at `n` equally spaced times.
fn sample_release(
    mech: &Mechanism<'_>,
    phases: &[(Trajectory<3>, bool)],
    n: usize,
) -> Vec<HistoryPoint> {
    let Some(t_stop) = phases.iter().rev().find_map(|p| p.0.span()).map(|s| s.1) else {
        return Vec::new();
    };
    let mut out = Vec::with_capacity(n);
    for k in 0..n {
        let t = if n > 1 {
            t_stop * k as f64 / (n - 1) as f64
        } else {
            0.0
        };
        let phase = phases
            .iter()
            .find(|p| p.0.span().is_some_and(|s| t <= s.1))
            .or(phases.last());
        if let Some((traj, engaged)) = phase {
            if let Some(y) = traj.eval(t) {
                out.push(history_point(mech, t, y[0], y[1], *engaged, 0.0));
            }
        }
    }
    out
}

/// One history point for the part at `(q, v)`.
pub(crate) fn history_point(
    mech: &Mechanism<'_>,
    t: f64,
    q: f64,
    v: f64,
    engaged: bool,
    buffer_force: f64,
) -> HistoryPoint {
    let dir = if v < 0.0 { -1.0 } else { 1.0 };
    let m = mech.inertia(engaged);
    HistoryPoint {
        time: t,
        position: q,
        speed: v,
        hazard_speed: mech.hazard_speed(v),
        spring_force: mech.spring_state(q, dir, engaged).map_or(0.0, |s| s.0),
        buffer_force,
        kinetic_energy: 0.5 * m * v * v,
    }
}

#[cfg(test)]
mod tests;
