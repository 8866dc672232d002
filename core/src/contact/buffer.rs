//! End-of-travel buffers: the stroke of a moving part into one or more
//! buffers, with the drive force, the gravity component, friction and (in
//! the continuous simulation) the release spring still acting.
//!
//! # Force laws and closed forms
//! `x` is the buffer compression from first contact (m), `v` the part's
//! speed (m/s), `m` the moving mass at the buffer, `v₀` the contact speed,
//! `E = ½·m·v₀²`. The closed forms hold for one buffer with no drive,
//! gravity or friction; the simulation does not use them, the tests check it
//! against them.
//!
//! | buffer | force while compressing | stroke used | peak force | stop time |
//! |---|---|---|---|---|
//! | linear spring | `F = k·x` | `v₀·√(m/k)` | `v₀·√(m·k)` | `(π/2)·√(m/k)` |
//! | power-law elastomer | `F = a·xⁿ` | `((n+1)·E/a)^(1/(n+1))` | `a·x_maxⁿ` | numeric |
//! | any spring model (table with unloading curve, gas spring…) | `F = F_s(q₀ + x)` | `∫₀ˣ F dx = E` | `F(x_max)` | numeric |
//! | constant force | `F = F₀` | `E/F₀` | `F₀` | `m·v₀/F₀` |
//! | ideal hydraulic absorber (stroke `s`, efficiency `η`) | `F = E_T/s` | `s` | `E_T/(η·s)` | `2·s/v₀` |
//! | orifice damper | `F = c·v²` | never stops: `v(x) = v₀·e^(−c·x/m)` | `c·v₀²` | `t(x) = (m/c)·(e^(c·x/m) − 1)/v₀` |
//!
//! With a constant drive force `F_D` the energy to absorb is
//! `E_T = ½·m·v₀² + F_D·s` (reference-values §10, "drive-force energy";
//! basic mechanics, D) and the deceleration is `(F − F_D)/m`.
//! Sources: linear and power-law strokes by the work–energy theorem (common
//! practice; reference-values §10 "mass striking a linear spring", D); the
//! orifice law from `m·v·dv/dx = −c·v²` (separation of variables, common
//! practice).
//!
//! # Efficiency of a hydraulic absorber
//! Defined as `η = E/(F_max·s)`: the energy absorbed over the full stroke
//! divided by the rectangle of peak force times stroke (reference-values
//! §10; D for the values 1.0 ideal constant force and 0.5 linear spring; the
//! 0.85–0.95 range of real absorbers is from trade literature, M). The ideal
//! absorber here adjusts its force so the part stops exactly at the end of
//! the stroke: mean force `E_T/s`, peak force reported as `E_T/(η·s)`. The
//! motion is simulated with the mean (constant) force, so the stroke and
//! stopping time are those of a constant-force absorber; for `η < 1` the time
//! above a deceleration threshold is bounded conservatively (the whole stop
//! counts when the peak exceeds the threshold).
//!
//! # Rebound
//! After the standstill the buffer pushes back along its unloading law: the
//! loading law for linear and power-law buffers ([`Rebound::Elastic`]), the
//! spring model's own unloading branch for a spring buffer (hysteresis), or
//! the loading force scaled by `e²` with a restitution coefficient `e`
//! ([`Rebound::Restitution`]: the buffer returns `e²` of the energy it
//! stored, so a free mass leaves at `e·v₀`; Newton's impact law,
//! reference-values §10, R). Hydraulic absorbers and orifice dampers do not
//! push back (no return spring is modelled). The rebound speed is the speed
//! when the part leaves the buffer; it stays 0 when the drive, the release
//! spring or friction hold the part in the buffer.
//!
//! # Figures
//! Peak force (per buffer), stroke used, peak and mean deceleration (m/s²
//! and in units of g_n), stopping time, rebound speed, energy absorbed per
//! cycle `E = ∫F dx` (equal to `½·m·v₀² + F_D·s` without friction), heat load
//! at a cycle rate `P = E·(cycles/h)/3600` (W), bottoming (stroke exhausted:
//! residual speed and kinetic energy left for the hard stop), and the
//! effective mass `2·E/v₀²` the trade uses to select absorbers. The mean
//! deceleration is defined as the contact speed over the stopping time,
//! `v₀/t_stop` (the average of the deceleration over time);
//! [`ImpactOutcome::time_above_deceleration`] gives the time the
//! deceleration exceeds a threshold during the stop (lift buffer rules:
//! "retardation above 2.5 g_n for at most 0.04 s").

use crate::error::{check, InputError};
use crate::figure::{ids, Figure};
use crate::mechanism::Mechanism;
use crate::ode::{
    self, DenseStep, Direction, EventSpec, OdeSystem, SolverConfig, Stats, StopReason, Trajectory,
};
use crate::release::{self, HistoryPoint, ReleaseConfig, ReleaseError, ReleaseOutcome};
use crate::spring::{Spring, Travel};
use crate::units::Dim;

/// Figure id: peak deceleration in units of g_n (dimensionless view of
/// [`ids::IMPACT_PEAK_DECELERATION`]).
pub const IMPACT_PEAK_DECELERATION_GN: &str = "impact.peak_deceleration_gn";
/// Figure id: mean deceleration in units of g_n (dimensionless view of
/// [`ids::IMPACT_MEAN_DECELERATION`]).
pub const IMPACT_MEAN_DECELERATION_GN: &str = "impact.mean_deceleration_gn";

/// Force law of one buffer (SI units).
#[derive(Clone, Copy)]
pub enum BufferLaw<'a> {
    /// Linear spring buffer `F = k·x`.
    Linear {
        /// Rate, N/m.
        rate: f64,
        /// Usable stroke, m.
        stroke: f64,
    },
    /// Progressive elastomer `F = a·xⁿ`.
    PowerLaw {
        /// Coefficient a, N/mⁿ.
        coefficient: f64,
        /// Exponent n (dimensionless, 0.2–10; n > 1 is progressive).
        exponent: f64,
        /// Usable stroke, m.
        stroke: f64,
    },
    /// Any spring model as the buffer (measured table with unloading curve,
    /// gas spring, disc stack…), compressed from a preload deflection.
    Spring {
        /// The spring model (linear axis).
        spring: &'a dyn Spring,
        /// Deflection of the spring before contact, m (0 if not preloaded).
        /// The usable stroke runs to the top of the spring's range.
        preload_deflection: f64,
    },
    /// Constant force while compressing (set hydraulic absorber, friction
    /// brake).
    ConstantForce {
        /// Force, N.
        force: f64,
        /// Usable stroke, m.
        stroke: f64,
    },
    /// Ideal self-adjusting hydraulic absorber: stops the part at the end of
    /// its stroke with the mean force `E_T/s`; peak force `E_T/(η·s)`.
    IdealAbsorber {
        /// Stroke, m.
        stroke: f64,
        /// Efficiency η = E/(F_max·s), in (0, 1].
        efficiency: f64,
    },
    /// Orifice damper `F = c·v²` over a finite stroke.
    Orifice {
        /// Coefficient c, N·s²/m².
        coefficient: f64,
        /// Usable stroke, m.
        stroke: f64,
    },
}

/// How the buffer gives energy back after the standstill.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Rebound {
    /// Along the buffer's own unloading law (the loading law when it has
    /// none).
    Elastic,
    /// Unloading force = e² × loading force, e in [0, 1].
    Restitution(f64),
}

/// Inputs of a buffer set.
#[derive(Clone, Copy)]
pub struct BufferConfig<'a> {
    /// Force law of each buffer.
    pub law: BufferLaw<'a>,
    /// Number of identical buffers struck together (≥ 1); they share the
    /// load equally.
    pub count: u32,
    /// Rebound law (ignored by absorbers and dampers).
    pub rebound: Rebound,
}

/// A validated buffer set.
#[derive(Clone, Copy)]
pub struct Buffer<'a> {
    cfg: BufferConfig<'a>,
    stroke: f64,
}

/// Which part of the stroke.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Leg {
    Compress,
    Return,
}

impl<'a> Buffer<'a> {
    /// Validate the inputs.
    ///
    /// # Errors
    /// An [`InputError`] naming the field (`law.rate`, `law.stroke`,
    /// `law.exponent`, `law.efficiency`, `count`, `rebound` …).
    pub fn new(cfg: BufferConfig<'a>) -> Result<Self, InputError> {
        let w = |e: InputError| e.within("law");
        let stroke = match cfg.law {
            BufferLaw::Linear { rate, stroke } => {
                check::positive("rate", rate).map_err(w)?;
                check::positive("stroke", stroke).map_err(w)?
            }
            BufferLaw::PowerLaw {
                coefficient,
                exponent,
                stroke,
            } => {
                check::positive("coefficient", coefficient).map_err(w)?;
                check::in_range("exponent", exponent, 0.2, 10.0).map_err(w)?;
                check::positive("stroke", stroke).map_err(w)?
            }
            BufferLaw::Spring {
                spring,
                preload_deflection,
            } => {
                if spring.axis() != crate::spring::Axis::Linear {
                    return Err(InputError::invalid(
                        "law.spring",
                        "a buffer needs a linear spring (N, m)",
                    ));
                }
                spring
                    .check_deflection("preload_deflection", preload_deflection)
                    .map_err(w)?;
                let s = spring.deflection_range().1 - preload_deflection;
                if !(s.is_finite() && s > 0.0) {
                    return Err(InputError::invalid(
                        "law.preload_deflection",
                        "must leave a finite stroke below the top of the spring's range",
                    ));
                }
                s
            }
            BufferLaw::ConstantForce { force, stroke } => {
                check::positive("force", force).map_err(w)?;
                check::positive("stroke", stroke).map_err(w)?
            }
            BufferLaw::IdealAbsorber { stroke, efficiency } => {
                check::in_range("efficiency", efficiency, 0.0, 1.0).map_err(w)?;
                check::positive("efficiency", efficiency).map_err(w)?;
                check::positive("stroke", stroke).map_err(w)?
            }
            BufferLaw::Orifice {
                coefficient,
                stroke,
            } => {
                check::positive("coefficient", coefficient).map_err(w)?;
                check::positive("stroke", stroke).map_err(w)?
            }
        };
        if cfg.count == 0 {
            return Err(InputError::invalid("count", "at least one buffer"));
        }
        if let Rebound::Restitution(e) = cfg.rebound {
            check::in_range("rebound", e, 0.0, 1.0)?;
        }
        Ok(Self { cfg, stroke })
    }

    /// The inputs.
    pub fn config(&self) -> &BufferConfig<'a> {
        &self.cfg
    }

    /// Usable stroke of each buffer, m.
    pub fn stroke(&self) -> f64 {
        self.stroke
    }

    /// Force of one buffer (N) at compression `x`, speed `v`, on the given
    /// leg; `level` is the ideal absorber's force per buffer.
    #[inline]
    fn force_one(&self, x: f64, v: f64, leg: Leg, level: f64) -> f64 {
        let scale = match (leg, self.cfg.rebound) {
            (Leg::Compress, _) | (Leg::Return, Rebound::Elastic) => 1.0,
            (Leg::Return, Rebound::Restitution(e)) => e * e,
        };
        match self.cfg.law {
            BufferLaw::Linear { rate, .. } => scale * rate * x,
            BufferLaw::PowerLaw {
                coefficient,
                exponent,
                ..
            } => {
                // Odd extension below x = 0 keeps the law smooth where the
                // return leg leaves the buffer (the event is located there).
                scale * coefficient * pow_abs(x, exponent).copysign(x)
            }
            BufferLaw::Spring {
                spring,
                preload_deflection,
            } => {
                let travel = match (leg, self.cfg.rebound) {
                    (Leg::Return, Rebound::Elastic) => Travel::Unloading,
                    _ => Travel::Loading,
                };
                scale * spring.force(preload_deflection + x, travel)
            }
            BufferLaw::ConstantForce { force, .. } => match leg {
                Leg::Compress => force,
                Leg::Return => 0.0,
            },
            BufferLaw::IdealAbsorber { .. } => match leg {
                Leg::Compress => level,
                Leg::Return => 0.0,
            },
            BufferLaw::Orifice { coefficient, .. } => match leg {
                Leg::Compress => coefficient * v * v.abs(),
                Leg::Return => 0.0,
            },
        }
    }

    /// Whether the force law's slope stays bounded as the compression starts
    /// (false only for a power law with n < 1, whose slope `a·n·xⁿ⁻¹` is
    /// unbounded at x = 0). Where it is unbounded the embedded error
    /// estimate under-reads the first steps; the absorbed-energy component
    /// then keeps its pure relative control, whose short first steps
    /// resolve the start (measured: stroke within 1e-9 of the closed form
    /// for n = 0.5 at rtol 1e-8, against 4e-7 with the energy floor).
    fn slope_bounded_at_contact(&self) -> bool {
        match self.cfg.law {
            BufferLaw::PowerLaw { exponent, .. } => exponent >= 1.0,
            _ => true,
        }
    }

    /// Whether the compressing force depends on the compression alone and
    /// never falls as it grows (linear, power law with a > 0, constant
    /// force, ideal absorber): its peak over a compression is then its
    /// value at the largest compression.
    fn force_rises_with_compression(&self) -> bool {
        matches!(
            self.cfg.law,
            BufferLaw::Linear { .. }
                | BufferLaw::PowerLaw { .. }
                | BufferLaw::ConstantForce { .. }
                | BufferLaw::IdealAbsorber { .. }
        )
    }

    /// Efficiency of the ideal absorber, if this is one.
    fn efficiency(&self) -> Option<f64> {
        match self.cfg.law {
            BufferLaw::IdealAbsorber { efficiency, .. } => Some(efficiency),
            _ => None,
        }
    }

    fn law_method(&self) -> &'static str {
        match self.cfg.law {
            BufferLaw::Linear { .. } => "linear spring buffer F = k·x",
            BufferLaw::PowerLaw { .. } => "progressive elastomer buffer F = a·xⁿ",
            BufferLaw::Spring { .. } => "buffer force from the spring model's characteristic",
            BufferLaw::ConstantForce { .. } => "constant-force buffer F = F₀",
            BufferLaw::IdealAbsorber { .. } => {
                "ideal hydraulic absorber: mean force E_T/s, peak force E_T/(η·s), η = E/(F_max·s)"
            }
            BufferLaw::Orifice { .. } => "orifice damper F = c·v²",
        }
    }
}

/// `|x|ⁿ` as `exp(n·ln|x|)` (0 at x = 0): the power law is evaluated at
/// every right-hand side of the stroke, and in WebAssembly `powf` is a
/// software routine about twice as slow as `exp` and `ln` together (31 against
/// 62 ns measured in Node); natively both cost the same. The relative
/// difference from `powf` is a few ulp (measured at most 4e-15 for n = 2.2,
/// |x| from 1e-6 to 1 m), far below the integrator's tolerance.
#[inline]
fn pow_abs(x: f64, n: f64) -> f64 {
    let a = x.abs();
    if a == 0.0 {
        0.0
    } else {
        (n * a.ln()).exp()
    }
}

/// The part striking the buffer, for the standalone [`impact`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ImpactInput {
    /// Moving mass at the buffer, kg (> 0).
    pub mass: f64,
    /// Speed at first contact, m/s (> 0).
    pub speed: f64,
    /// Constant drive force pushing into the buffer, N (may be negative).
    pub drive_force: f64,
    /// Incline of the direction of travel above the horizontal, rad, in
    /// [−π/2, π/2] (−π/2: falling onto the buffer).
    pub incline: f64,
    /// Coulomb friction force opposing the motion, N (≥ 0).
    pub friction_force: f64,
    /// Impacts per hour, 1/h (≥ 0), for the heat load.
    pub cycles_per_hour: f64,
}

/// Solver and output settings of an impact.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct ImpactConfig {
    /// Integrator settings.
    pub solver: SolverConfig,
    /// Number of time-history points to return (0: none).
    pub samples: usize,
}

/// How the buffer stroke ended.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum StrokeEnd {
    /// The part stopped in the buffer and stays there (held by the drive,
    /// the release spring, gravity or friction; or no push-back).
    Held,
    /// The part left the buffer moving back.
    Rebound {
        /// Speed when leaving the buffer, m/s.
        speed: f64,
    },
    /// The stroke was exhausted: the part strikes the hard stop.
    Bottomed {
        /// Speed at the end of the stroke, m/s.
        residual_speed: f64,
    },
}

/// Result of a buffer stroke.
#[derive(Debug, Clone, PartialEq)]
pub struct ImpactOutcome {
    /// Moving mass at the buffer, kg.
    pub mass: f64,
    /// Speed at first contact, m/s.
    pub contact_speed: f64,
    /// Number of buffers sharing the load.
    pub count: u32,
    /// How the stroke ended.
    pub end: StrokeEnd,
    /// Largest compression reached, m.
    pub stroke_used: f64,
    /// Usable stroke of the buffer, m.
    pub stroke_available: f64,
    /// Peak force on one buffer, N.
    pub peak_force: f64,
    /// Peak deceleration of the part during the compression, m/s².
    pub peak_deceleration: f64,
    /// Duration of the compression (to the standstill or to bottoming), s.
    pub compression_time: f64,
    /// Energy absorbed by all buffers during the compression, J.
    pub energy_per_cycle: f64,
    /// Impacts per hour, 1/h.
    pub cycles_per_hour: f64,
    /// Integrator work.
    pub stats: Stats,
    /// Time history (empty unless requested); positions from first contact.
    pub history: Vec<HistoryPoint>,
    efficiency: Option<f64>,
    law_method: &'static str,
    /// Velocity interpolants of the compression, for deceleration queries.
    compression: Vec<DenseStep<3>>,
}

impl ImpactOutcome {
    /// Time from contact to standstill, s; `None` when the stroke bottoms.
    pub fn stop_time(&self) -> Option<f64> {
        match self.end {
            StrokeEnd::Bottomed { .. } => None,
            _ => Some(self.compression_time),
        }
    }

    /// Speed at the end of the stroke when it bottoms, else 0, m/s.
    pub fn residual_speed(&self) -> f64 {
        match self.end {
            StrokeEnd::Bottomed { residual_speed } => residual_speed,
            _ => 0.0,
        }
    }

    /// Kinetic energy left for the hard stop, ½·m·v_res², J.
    pub fn residual_energy(&self) -> f64 {
        0.5 * self.mass * self.residual_speed().powi(2)
    }

    /// Speed leaving the buffer, m/s: 0 when held; `None` when bottomed
    /// (the hard stop decides).
    pub fn rebound_speed(&self) -> Option<f64> {
        match self.end {
            StrokeEnd::Held => Some(0.0),
            StrokeEnd::Rebound { speed } => Some(speed),
            StrokeEnd::Bottomed { .. } => None,
        }
    }

    /// Mean deceleration, m/s²: contact speed over stopping time `v₀/t_stop`
    /// (the time average of the deceleration over the stop); when the stroke
    /// bottoms, the speed lost over the compression time.
    pub fn mean_deceleration(&self) -> f64 {
        if self.compression_time > 0.0 {
            (self.contact_speed - self.residual_speed()) / self.compression_time
        } else {
            0.0
        }
    }

    /// Peak deceleration in units of g_n (dimensionless).
    pub fn peak_deceleration_gn(&self) -> f64 {
        self.peak_deceleration / crate::G_N
    }

    /// Mean deceleration in units of g_n (dimensionless).
    pub fn mean_deceleration_gn(&self) -> f64 {
        self.mean_deceleration() / crate::G_N
    }

    /// Mean heat load at the cycle rate, `E·(cycles/h)/3600`, W.
    pub fn heat_load(&self) -> f64 {
        self.energy_per_cycle * self.cycles_per_hour / 3600.0
    }

    /// Effective mass `2·E/v₀²`, kg (the figure used to select absorbers).
    pub fn effective_mass(&self) -> f64 {
        // The energy an absorber must take is what this buffer took plus
        // what it left for the hard stop when its stroke ran out; using the
        // absorbed energy alone would understate the duty of a bottoming
        // buffer.
        let e = self.energy_per_cycle + self.residual_energy();
        2.0 * e / (self.contact_speed * self.contact_speed)
    }

    /// Total time (s) during the compression (contact to standstill or
    /// bottoming) in which the deceleration exceeds `a` (m/s²). Located on
    /// the dense output of the integration. For an ideal absorber with
    /// η < 1 the force profile is not modelled: the whole compression counts
    /// when the peak deceleration exceeds `a` (conservative).
    pub fn time_above_deceleration(&self, a: f64) -> f64 {
        if !a.is_finite() {
            return if a < 0.0 { self.compression_time } else { 0.0 };
        }
        if self.efficiency.is_some_and(|e| e < 1.0) {
            return if self.peak_deceleration > a {
                self.compression_time
            } else {
                0.0
            };
        }
        const SUB: usize = 16;
        let mut total = 0.0;
        for s in &self.compression {
            let f = |t: f64| -s.derivative(t)[1] - a;
            let span = s.t_stop - s.t0;
            if span <= 0.0 {
                continue;
            }
            let mut ta = s.t0;
            let mut fa = f(ta);
            for j in 1..=SUB {
                let tb = s.t0 + span * j as f64 / SUB as f64;
                let fb = f(tb);
                if fa > 0.0 && fb > 0.0 {
                    total += tb - ta;
                } else if (fa > 0.0) != (fb > 0.0) {
                    let r = crate::ode::find_root(f, ta, tb, fa, fb, 0.0);
                    total += if fa > 0.0 { r - ta } else { tb - r };
                }
                ta = tb;
                fa = fb;
            }
        }
        total.min(self.compression_time)
    }

    /// The value of figure `id` as [`ImpactOutcome::figures`] reports it,
    /// in SI: `None` when that figure is missing (stopping time and rebound
    /// speed of a stroke that bottoms, a non-finite result) or is not one of
    /// these figures. The one place that maps the figure ids to numbers:
    /// [`ImpactOutcome::figures`] takes its values from here, and the
    /// tolerance study reads them without building the figures.
    pub fn figure_value(&self, id: &str) -> Option<f64> {
        match id {
            ids::IMPACT_PEAK_FORCE => Some(self.peak_force),
            ids::IMPACT_STROKE_USED => Some(self.stroke_used),
            ids::IMPACT_PEAK_DECELERATION => Some(self.peak_deceleration),
            IMPACT_PEAK_DECELERATION_GN => Some(self.peak_deceleration_gn()),
            ids::IMPACT_MEAN_DECELERATION => Some(self.mean_deceleration()),
            IMPACT_MEAN_DECELERATION_GN => Some(self.mean_deceleration_gn()),
            ids::IMPACT_STOP_TIME => self.stop_time(),
            ids::IMPACT_REBOUND_SPEED => self.rebound_speed(),
            ids::IMPACT_ENERGY_PER_CYCLE => Some(self.energy_per_cycle),
            ids::IMPACT_HEAT_LOAD => Some(self.heat_load()),
            ids::IMPACT_RESIDUAL_SPEED => Some(self.residual_speed()),
            ids::IMPACT_RESIDUAL_ENERGY => Some(self.residual_energy()),
            ids::IMPACT_EFFECTIVE_MASS => Some(self.effective_mass()),
            _ => None,
        }
        .filter(|v| v.is_finite())
    }

    /// [`ImpactOutcome::figure_value`], NaN when missing (which
    /// [`Figure::new`] records as missing).
    fn value_or_nan(&self, id: &str) -> f64 {
        self.figure_value(id).unwrap_or(f64::NAN)
    }

    /// The user-facing figures.
    pub fn figures(&self) -> Vec<Figure> {
        const SRC_SIM: &str = "Newton's second law integrated by Dormand–Prince 5(4) (Dormand & Prince, \
                               J. Comput. Appl. Math. 6 (1980)); work–energy theorem (common practice)";
        let mut common: Vec<String> = vec![
            "rigid part and frame; the buffer is the only compliance".into(),
            "drive force, gravity component and friction act throughout the stroke".into(),
        ];
        if self.count > 1 {
            common.push(format!(
                "the load is shared equally by {} identical buffers struck together",
                self.count
            ));
        }
        if let Some(e) = self.efficiency {
            common.push(format!(
                "ideal absorber tuned to stop the part at the end of its stroke; efficiency η = {e} \
                 gives the peak force E_T/(η·s); the motion uses the mean force E_T/s"
            ));
        }
        let with = |f: Figure| common.iter().fold(f, |f, a| f.assume(a));
        let mut out = Vec::with_capacity(13);
        out.push(with(
            Figure::new(
                ids::IMPACT_PEAK_FORCE,
                "Peak force per buffer",
                Dim::Force,
                self.value_or_nan(ids::IMPACT_PEAK_FORCE),
            )
            .method(self.law_method)
            .source(SRC_SIM),
        ));
        out.push(with(
            Figure::new(
                ids::IMPACT_STROKE_USED,
                "Buffer stroke used",
                Dim::Length,
                self.value_or_nan(ids::IMPACT_STROKE_USED),
            )
            .method("largest compression of the simulated stroke")
            .source(SRC_SIM),
        ));
        let decel_method = "a = (F_buffer·n + F_friction + c·v − F_drive − F_gravity)/m, largest value over the compression";
        out.push(with(
            Figure::new(
                ids::IMPACT_PEAK_DECELERATION,
                "Peak deceleration",
                Dim::Acceleration,
                self.value_or_nan(ids::IMPACT_PEAK_DECELERATION),
            )
            .method(decel_method)
            .source(SRC_SIM),
        ));
        out.push(with(
            Figure::new(
                IMPACT_PEAK_DECELERATION_GN,
                "Peak deceleration in g_n",
                Dim::Ratio,
                self.value_or_nan(IMPACT_PEAK_DECELERATION_GN),
            )
            .method("a_peak / g_n, g_n = 9.806 65 m/s²")
            .source("g_n: 3rd CGPM (1901); NIST SP 811 (2008)"),
        ));
        let mean_method = "a_mean = v₀ / t_stop (contact speed over stopping time; the time average of the deceleration)";
        out.push(with(
            Figure::new(
                ids::IMPACT_MEAN_DECELERATION,
                "Mean deceleration",
                Dim::Acceleration,
                self.value_or_nan(ids::IMPACT_MEAN_DECELERATION),
            )
            .method(mean_method)
            .source(SRC_SIM),
        ));
        out.push(with(
            Figure::new(
                IMPACT_MEAN_DECELERATION_GN,
                "Mean deceleration in g_n",
                Dim::Ratio,
                self.value_or_nan(IMPACT_MEAN_DECELERATION_GN),
            )
            .method("a_mean / g_n, g_n = 9.806 65 m/s²")
            .source("g_n: 3rd CGPM (1901); NIST SP 811 (2008)"),
        ));
        let bottomed_note =
            "the stroke is exhausted: the part strikes the hard stop at the residual speed"
                .to_string();
        out.push(with(match self.stop_time() {
            Some(_) => Figure::new(ids::IMPACT_STOP_TIME, "Stopping time", Dim::Time, self.value_or_nan(ids::IMPACT_STOP_TIME)),
            None => Figure::missing(ids::IMPACT_STOP_TIME, "Stopping time", Dim::Time, vec![bottomed_note.clone()]),
        }
        .method("time from first contact to standstill, located by root finding on the dense output")
        .source(SRC_SIM)));
        out.push(with(match self.rebound_speed() {
            Some(_) => Figure::new(ids::IMPACT_REBOUND_SPEED, "Rebound speed", Dim::Speed, self.value_or_nan(ids::IMPACT_REBOUND_SPEED)),
            None => Figure::missing(ids::IMPACT_REBOUND_SPEED, "Rebound speed", Dim::Speed, vec![bottomed_note]),
        }
        .method("speed when the part leaves the buffer, integrating the buffer's unloading law (or e² × loading law)")
        .source("Newton's impact law e = v_out/v_in (reference-values §10, R); Dormand–Prince 5(4)")));
        out.push(with(
            Figure::new(
                ids::IMPACT_ENERGY_PER_CYCLE,
                "Energy absorbed per cycle",
                Dim::Energy,
                self.value_or_nan(ids::IMPACT_ENERGY_PER_CYCLE),
            )
            .method("E = ∫F_buffer dx over the compression (= ½·m·v₀² + F_D·s without friction)")
            .source("basic mechanics; reference-values §10 drive-force energy (D)"),
        ));
        out.push(with(
            Figure::new(ids::IMPACT_HEAT_LOAD, "Mean heat load", Dim::Power, self.value_or_nan(ids::IMPACT_HEAT_LOAD))
                .method("P = E·(cycles/h)/3600")
                .source("energy balance (common practice)")
                .assume("all energy the buffer absorbs becomes heat in it (true for hydraulic absorbers; an upper bound for elastic buffers, which return part of it)"),
        ));
        out.push(with(
            Figure::new(
                ids::IMPACT_RESIDUAL_SPEED,
                "Speed at the hard stop (bottoming)",
                Dim::Speed,
                self.value_or_nan(ids::IMPACT_RESIDUAL_SPEED),
            )
            .method(
                "speed when the compression reaches the usable stroke; 0 if the part stops before",
            )
            .source(SRC_SIM),
        ));
        out.push(with(
            Figure::new(
                ids::IMPACT_RESIDUAL_ENERGY,
                "Energy left for the hard stop",
                Dim::Energy,
                self.value_or_nan(ids::IMPACT_RESIDUAL_ENERGY),
            )
            .method("½·m·v_res²")
            .source(SRC_SIM),
        ));
        out.push(with(
            Figure::new(ids::IMPACT_EFFECTIVE_MASS, "Effective mass for absorber selection", Dim::Mass, self.value_or_nan(ids::IMPACT_EFFECTIVE_MASS))
                .method("m_e = 2·E/v₀², E = energy absorbed + energy left at bottoming")
                .source("trade convention for absorber selection (common practice); reference-values §10 (D)"),
        ));
        out
    }
}

/// What pushes the part along the buffer axis: constant forces for the
/// standalone impact, or the mechanism's forces seen at the buffer.
trait Carrier {
    /// Moving mass at the buffer, kg.
    fn mass(&self) -> f64;
    /// `(active force into the buffer, friction magnitude, damping)` at
    /// compression `x` moving in direction `dir`; N, N, N·s/m.
    fn forces(&self, x: f64, dir: f64) -> (f64, f64, f64);
    /// Exact work of the active forces from compression `x1` to `x2`, J.
    fn active_work(&self, x1: f64, x2: f64) -> f64;
}

struct FreeCarrier {
    mass: f64,
    push: f64,
    friction: f64,
}

impl Carrier for FreeCarrier {
    fn mass(&self) -> f64 {
        self.mass
    }
    #[inline]
    fn forces(&self, _x: f64, _dir: f64) -> (f64, f64, f64) {
        (self.push, self.friction, 0.0)
    }
    fn active_work(&self, x1: f64, x2: f64) -> f64 {
        self.push * (x2 - x1)
    }
}

/// A mechanism seen at the buffer: compression `x` at radius `r` (1 for a
/// sliding part) beyond the contact coordinate: `q = q_c + x/r`, mass
/// `M/r²`, forces `Q/r`.
struct MechCarrier<'m, 'a> {
    mech: &'m Mechanism<'a>,
    engaged: bool,
    detach: Option<f64>,
    lever: f64,
    q_contact: f64,
    /// `(active, friction, damping)` at the buffer when they do not depend
    /// on the position (a sliding part off its spring; lever 1).
    constant: Option<(f64, f64, f64)>,
}

impl MechCarrier<'_, '_> {
    #[inline]
    fn on_spring(&self, q: f64) -> bool {
        self.engaged && self.detach.is_none_or(|qd| q < qd)
    }
}

impl Carrier for MechCarrier<'_, '_> {
    fn mass(&self) -> f64 {
        self.mech.inertia(self.engaged) / (self.lever * self.lever)
    }
    #[inline]
    fn forces(&self, x: f64, dir: f64) -> (f64, f64, f64) {
        if let Some(c) = self.constant {
            return c;
        }
        let q = self.q_contact + x / self.lever;
        let f = self.mech.forces(q, dir, self.on_spring(q));
        (
            f.active() / self.lever,
            f.friction / self.lever,
            f.damping / (self.lever * self.lever),
        )
    }
    fn active_work(&self, x1: f64, x2: f64) -> f64 {
        let (q1, q2) = (
            self.q_contact + x1 / self.lever,
            self.q_contact + x2 / self.lever,
        );
        let w = |a: f64, b: f64, on: bool| {
            let w = self.mech.work(a, b, on);
            w.spring + w.gravity + w.drive
        };
        match self.detach {
            Some(qd) if self.engaged && qd > q1 && qd < q2 => w(q1, qd, true) + w(qd, q2, false),
            _ => w(q1, q2, self.on_spring(0.5 * (q1 + q2))),
        }
    }
}

// Event indices of the stroke ODE.
const EV_STOP: usize = 0;
const EV_LIMIT: usize = 1;
const EV_CREEP: usize = 2;
/// Creep threshold relative to the contact speed (as in the release).
const CREEP_FRACTION: f64 = 1e-7;

struct StrokeOde<'s, 'b, C: Carrier> {
    buffer: &'s Buffer<'b>,
    carrier: &'s C,
    mass: f64,
    count: f64,
    leg: Leg,
    dir: f64,
    level: f64,
    v_creep: f64,
    t_ref: f64,
    /// Energy scale of the absorbed-energy component (J): the kinetic
    /// energy at contact (0 where the law's slope is unbounded at contact,
    /// see [`Buffer::slope_bounded_at_contact`]).
    e_ref: f64,
}

impl<C: Carrier> StrokeOde<'_, '_, C> {
    #[inline]
    fn accel(&self, x: f64, v: f64) -> f64 {
        let (active, friction, damping) = self.carrier.forces(x, self.dir);
        let fb = self.count * self.buffer.force_one(x, v, self.leg, self.level);
        (active - self.dir * friction - damping * v - fb) / self.mass
    }
}

impl<C: Carrier> OdeSystem<3> for StrokeOde<'_, '_, C> {
    #[inline]
    fn rhs(&self, _t: f64, y: &[f64; 3], dy: &mut [f64; 3]) {
        let fb = self.count * self.buffer.force_one(y[0], y[1], self.leg, self.level);
        let (active, friction, damping) = self.carrier.forces(y[0], self.dir);
        dy[0] = y[1];
        dy[1] = (active - self.dir * friction - damping * y[1] - fb) / self.mass;
        dy[2] = fb * y[1];
    }
    fn event_count(&self) -> usize {
        3
    }
    fn event(&self, index: usize, _t: f64, y: &[f64; 3]) -> f64 {
        match (index, self.leg) {
            (EV_STOP, _) => y[1],
            (EV_LIMIT, Leg::Compress) => y[0] - self.buffer.stroke,
            (EV_LIMIT, Leg::Return) => y[0],
            // Creep: speed and acceleration both negligible. While the speed
            // alone is above the threshold the sign is known without the
            // acceleration (saves a force evaluation per step).
            _ if y[1].abs() > self.v_creep => y[1].abs() - self.v_creep,
            _ => y[1].abs().max(self.accel(y[0], y[1]).abs() * self.t_ref) - self.v_creep,
        }
    }
    fn event_spec(&self, index: usize) -> EventSpec {
        match (index, self.leg) {
            (EV_STOP, Leg::Compress) | (EV_LIMIT, Leg::Return) | (EV_CREEP, _) => {
                EventSpec::terminal(Direction::Falling)
            }
            _ => EventSpec::terminal(Direction::Rising),
        }
    }
    /// The absorbed energy starts at zero and only accumulates: its error
    /// is measured against the kinetic energy at contact, the accuracy the
    /// energy and heat figures need (position and speed keep their pure
    /// relative control: the stroke and the stop are located on them).
    fn magnitudes(&self) -> [f64; 3] {
        [0.0, 0.0, self.e_ref]
    }
}

/// Mass `input.mass` at `input.speed` with constant drive, gravity component
/// and friction onto `buffer`.
///
/// # Errors
/// [`ReleaseError::Input`] for unusable inputs (field names `mass`,
/// `speed`, `drive_force`, `incline`, `friction_force`, `cycles_per_hour`),
/// and the bounded integrator failures.
pub fn impact(
    input: &ImpactInput,
    buffer: &Buffer<'_>,
    cfg: &ImpactConfig,
) -> Result<ImpactOutcome, ReleaseError> {
    let inp = |r: Result<f64, InputError>| r.map_err(ReleaseError::Input);
    inp(check::positive("mass", input.mass))?;
    inp(check::positive("speed", input.speed))?;
    inp(check::finite("drive_force", input.drive_force))?;
    let hp = std::f64::consts::FRAC_PI_2;
    inp(check::in_range("incline", input.incline, -hp, hp))?;
    inp(check::non_negative("friction_force", input.friction_force))?;
    inp(check::non_negative(
        "cycles_per_hour",
        input.cycles_per_hour,
    ))?;
    let carrier = FreeCarrier {
        mass: input.mass,
        push: input.drive_force - input.mass * crate::G_N * input.incline.sin(),
        friction: input.friction_force,
    };
    stroke(&carrier, buffer, input.speed, input.cycles_per_hour, cfg)
}

/// Where the buffer sits, for [`release_into_buffer`].
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct ContinuousConfig {
    /// Release settings (solver, number of history points for the release
    /// part; the stroke gets as many again).
    pub release: ReleaseConfig,
    /// For a hinged part: distance of the buffer's contact point from the
    /// hinge axis, m; `None` puts it at the hazard point.
    pub buffer_radius: Option<f64>,
    /// Impacts per hour, 1/h (≥ 0), for the heat load.
    pub cycles_per_hour: f64,
}

/// A release followed, if the part reaches contact, by its stroke into the
/// buffer with the release spring, drive, gravity and friction still acting.
#[derive(Debug, Clone, PartialEq)]
pub struct ReleaseImpact {
    /// The release from the latch to contact (or stall).
    pub release: ReleaseOutcome,
    /// The buffer stroke, when contact is reached.
    pub impact: Option<ImpactOutcome>,
}

impl ReleaseImpact {
    /// All figures of the release and of the stroke.
    pub fn figures(&self) -> Vec<Figure> {
        let mut f = self.release.figures();
        if let Some(i) = &self.impact {
            f.extend(i.figures());
        }
        f
    }
}

/// Continuous simulation: release of `mech` from the latch, then its stroke
/// into `buffer` at the contact point, with every mechanism force still
/// acting (a spring-closed door pressing its buffer).
///
/// For a hinged part the buffer compression is `x = r_b·(θ − θ_contact)`
/// at the buffer radius `r_b`; the part is seen there with mass `I/r_b²`
/// and forces `T/r_b`. The stroke starts at the contact speed the release
/// reports ([`ReleaseOutcome::speed`]: the work–energy value where it
/// applies), so the impact and the release state the same speed. The
/// release history
/// ([`ReleaseOutcome::history`]) covers the latch to contact, the stroke
/// history ([`ImpactOutcome::history`]) continues on the same clock and
/// coordinate. Assumption: a spring that only bears on the part and runs
/// out during the stroke stops pushing there, but its mass share stays with
/// the part for the rest of the stroke.
///
/// # Errors
/// As [`release::release`] and [`impact`]; `buffer_radius` must be > 0.
pub fn release_into_buffer(
    mech: &Mechanism<'_>,
    buffer: &Buffer<'_>,
    cfg: &ContinuousConfig,
) -> Result<ReleaseImpact, ReleaseError> {
    check::non_negative("cycles_per_hour", cfg.cycles_per_hour).map_err(ReleaseError::Input)?;
    let lever = match (mech.hazard_radius(), cfg.buffer_radius) {
        (None, _) => 1.0,
        (Some(_), Some(r)) => check::positive("buffer_radius", r).map_err(ReleaseError::Input)?,
        (Some(r), None) => r,
    };
    let rel = release::release(mech, &cfg.release)?;
    if !rel.reached_contact() {
        return Ok(ReleaseImpact {
            release: rel,
            impact: None,
        });
    }
    // A sliding part off its spring meets only constant forces (gravity,
    // drive, friction, damping): computed once instead of at every
    // evaluation of the stroke.
    let constant = match mech {
        Mechanism::Translating(_) if !rel.spring_engaged => {
            let f = mech.forces(rel.position, 1.0, false);
            Some((f.active(), f.friction, f.damping))
        }
        _ => None,
    };
    let carrier = MechCarrier {
        mech,
        engaged: rel.spring_engaged,
        detach: mech.detach_position(),
        lever,
        q_contact: rel.position,
        constant,
    };
    let icfg = ImpactConfig {
        solver: cfg.release.solver,
        samples: cfg.release.samples,
    };
    let t_contact = rel.time;
    // The stroke starts at the contact speed the release reports: the
    // work–energy value where it applies (exact for the model), else the
    // ODE's; so the impact's contact speed is the release's figure and the
    // stroke does not inherit the release integration's error.
    let mut imp = stroke(
        &carrier,
        buffer,
        rel.speed() * lever,
        cfg.cycles_per_hour,
        &icfg,
    )?;
    // Express the stroke history on the release's clock and coordinate.
    for p in &mut imp.history {
        let q = rel.position + p.position / lever;
        let on = carrier.on_spring(q);
        let mut h = release::history_point(
            mech,
            t_contact + p.time,
            q,
            p.speed / lever,
            on,
            p.buffer_force,
        );
        h.hazard_speed = mech.hazard_speed(p.speed / lever);
        *p = h;
    }
    Ok(ReleaseImpact {
        release: rel,
        impact: Some(imp),
    })
}

/// Recorder of the compression's dense steps (always) for peak and
/// threshold queries.
struct Record {
    steps: Vec<DenseStep<3>>,
}

impl ode::Observer<3> for Record {
    fn step(&mut self, step: &DenseStep<3>) {
        self.steps.push(*step);
    }
}

/// The stroke: compression from `(x = 0, v0)` and, when the buffer pushes
/// back, the return leg.
fn stroke<C: Carrier>(
    carrier: &C,
    buffer: &Buffer<'_>,
    v0: f64,
    cycles_per_hour: f64,
    cfg: &ImpactConfig,
) -> Result<ImpactOutcome, ReleaseError> {
    let o = stroke_unchecked(carrier, buffer, v0, cycles_per_hour, cfg)?;
    // Inputs each valid but of extreme size (a friction force of 1e308 N
    // against a large buffer count) can overflow the integration; such an
    // outcome is refused, never handed on with NaN in it.
    let numbers = [
        o.mass,
        o.contact_speed,
        o.stroke_used,
        o.stroke_available,
        o.peak_force,
        o.peak_deceleration,
        o.compression_time,
        o.energy_per_cycle,
        o.cycles_per_hour,
        o.residual_speed(),
        o.heat_load(),
    ];
    if numbers.into_iter().all(f64::is_finite) && o.history.iter().all(HistoryPoint::is_finite) {
        Ok(o)
    } else {
        Err(ReleaseError::Input(InputError::invalid(
            "buffer",
            "the stroke gives no finite figures for inputs of this size: check the sizes and \
             units of the mass, speed, forces and buffer",
        )))
    }
}

fn stroke_unchecked<C: Carrier>(
    carrier: &C,
    buffer: &Buffer<'_>,
    v0: f64,
    cycles_per_hour: f64,
    cfg: &ImpactConfig,
) -> Result<ImpactOutcome, ReleaseError> {
    let mass = carrier.mass();
    let count = f64::from(buffer.cfg.count);
    let s = buffer.stroke;
    // Ideal absorber: force level per buffer that absorbs E_T over the stroke.
    let level = match buffer.cfg.law {
        BufferLaw::IdealAbsorber { .. } => {
            let (_, friction, _) = carrier.forces(0.0, 1.0);
            let e_t = 0.5 * mass * v0 * v0 + carrier.active_work(0.0, s) - friction * s;
            (e_t / (s * count)).max(0.0)
        }
        _ => 0.0,
    };
    let v_ref = v0;
    let t_ref = s / v0;
    let mut sys = StrokeOde {
        buffer,
        carrier,
        mass,
        count,
        leg: Leg::Compress,
        dir: 1.0,
        level,
        v_creep: CREEP_FRACTION * v_ref,
        t_ref,
        e_ref: if buffer.slope_bounded_at_contact() {
            0.5 * mass * v0 * v0
        } else {
            0.0
        },
    };
    let mut stats = Stats::default();
    let mut rec = Record {
        steps: Vec::with_capacity(32),
    };
    let sol = ode::solve(&sys, 0.0, [0.0, v0, 0.0], &cfg.solver, &mut rec)?;
    stats.add(&sol.stats);
    let (t1, y1) = (sol.t, sol.y);
    let energy = y1[2];
    let compression = rec.steps;

    // Peaks over the compression: the step ends and midpoints, refined by
    // golden-section search where a midpoint beats both ends of its step
    // (an interior maximum), and the exact values at contact and at the end.
    let force_at = |st: &DenseStep<3>, t: f64| {
        let y = st.eval(t);
        buffer.force_one(y[0], y[1], Leg::Compress, level)
    };
    let decel_at = |st: &DenseStep<3>, t: f64| -st.derivative(t)[1];
    let mut peak_f = buffer
        .force_one(0.0, v0, Leg::Compress, level)
        .max(buffer.force_one(y1[0], y1[1], Leg::Compress, level));
    let mut peak_a = (-sys.accel(0.0, v0)).max(-sys.accel(y1[0], y1[1]));
    // A force that depends only on the compression and never falls as it
    // grows peaks where the compression does: at the end (the part moves
    // into the buffer throughout, v ≥ 0, so x is largest there). Other laws
    // (a spring characteristic with a falling branch, the orifice's F(v))
    // are searched over the steps.
    let search_force = !buffer.force_rises_with_compression();
    for st in &compression {
        if search_force {
            peak_f = peak_f.max(step_peak(st, &force_at));
        }
        peak_a = peak_a.max(step_peak(st, &decel_at));
    }
    // A maximum close to a step boundary beats neither neighbouring step's
    // midpoint test: search across the best boundary too.
    if search_force {
        peak_f = peak_f.max(boundary_peak(&compression, &force_at));
    }
    peak_a = peak_a.max(boundary_peak(&compression, &decel_at));
    if let Some(eta) = buffer.efficiency() {
        // Peak force by the efficiency convention; the deceleration with the
        // peak force in place of the mean one (conservative).
        let extra = level * (1.0 / eta - 1.0);
        peak_f = level / eta;
        peak_a += count * extra / mass;
    }

    let mut history_phases: Vec<(Trajectory<3>, Leg)> = Vec::new();
    if cfg.samples > 0 {
        let mut tr = Trajectory::new();
        for st in &compression {
            ode::Observer::step(&mut tr, st);
        }
        history_phases.push((tr, Leg::Compress));
    }

    let end = match sol.stop {
        StopReason::Event { index: EV_LIMIT } => StrokeEnd::Bottomed {
            residual_speed: y1[1].max(0.0),
        },
        StopReason::ReachedEnd => return Err(ReleaseError::NotFinished { time: t1 }),
        StopReason::Event { .. } => {
            // At rest at x_max: does the buffer push the part back out?
            let x = y1[0];
            let back = count * buffer.force_one(x, 0.0, Leg::Return, level);
            let (active, friction, _) = carrier.forces(x, -1.0);
            if back - active > friction {
                sys.leg = Leg::Return;
                sys.dir = -1.0;
                let mut tr = Trajectory::new();
                let sol2 = if cfg.samples > 0 {
                    ode::solve(&sys, t1, [x, 0.0, energy], &cfg.solver, &mut tr)?
                } else {
                    ode::integrate(&sys, t1, [x, 0.0, energy], &cfg.solver)?
                };
                stats.add(&sol2.stats);
                if cfg.samples > 0 {
                    history_phases.push((tr, Leg::Return));
                }
                match sol2.stop {
                    StopReason::Event { index: EV_LIMIT } => StrokeEnd::Rebound {
                        speed: (-sol2.y[1]).max(0.0),
                    },
                    StopReason::ReachedEnd => {
                        return Err(ReleaseError::NotFinished { time: sol2.t })
                    }
                    StopReason::Event { .. } => StrokeEnd::Held,
                }
            } else {
                StrokeEnd::Held
            }
        }
    };

    let history = if cfg.samples > 0 {
        sample_stroke(buffer, level, count, mass, &history_phases, cfg.samples)
    } else {
        Vec::new()
    };

    Ok(ImpactOutcome {
        mass,
        contact_speed: v0,
        count: buffer.cfg.count,
        end,
        stroke_used: y1[0].min(s),
        stroke_available: s,
        peak_force: peak_f,
        peak_deceleration: peak_a,
        compression_time: t1,
        energy_per_cycle: energy,
        cycles_per_hour,
        stats,
        history,
        efficiency: buffer.efficiency(),
        law_method: buffer.law_method(),
        compression,
    })
}

/// Largest value of `f` over one step: its ends, its midpoint, and a
/// golden-section refinement when the midpoint beats both ends.
fn step_peak<F: Fn(&DenseStep<3>, f64) -> f64>(st: &DenseStep<3>, f: &F) -> f64 {
    let (a, b) = (st.t0, st.t_stop);
    let (fa, fb) = (f(st, a), f(st, b));
    let m = 0.5 * (a + b);
    let fm = f(st, m);
    if !(fm > fa && fm > fb) {
        return fa.max(fb).max(fm);
    }
    fm.max(golden_max(a, b, |t| f(st, t)))
}

/// Golden-section search for the maximum of `g` on `[a, b]` (a unimodal
/// bracket; on a monotone one it closes on the higher end). 40 iterations
/// shrink the bracket by 0.618⁴⁰ ≈ 4e-9: near a smooth maximum the value
/// is then exact to rounding.
fn golden_max(a: f64, b: f64, g: impl Fn(f64) -> f64) -> f64 {
    const INV_PHI: f64 = 0.618_033_988_749_894_9;
    let (mut lo, mut hi) = (a, b);
    let mut c = hi - INV_PHI * (hi - lo);
    let mut d = lo + INV_PHI * (hi - lo);
    let (mut fc, mut fd) = (g(c), g(d));
    for _ in 0..40 {
        if fc > fd {
            hi = d;
            d = c;
            fd = fc;
            c = hi - INV_PHI * (hi - lo);
            fc = g(c);
        } else {
            lo = c;
            c = d;
            fc = fd;
            d = lo + INV_PHI * (hi - lo);
            fd = g(d);
        }
    }
    fc.max(fd)
}

/// Largest value of `f` around the step boundary where it is highest (the
/// start of the first step and the end of the last count as boundaries): a
/// golden-section search from the midpoint of the step before the boundary
/// to the midpoint of the step after it. A smooth maximum just beside a
/// boundary lies in that bracket, and neither step's own midpoint test sees
/// it (e.g. the peak deceleration of a damped part, shortly before its
/// standstill).
fn boundary_peak<F: Fn(&DenseStep<3>, f64) -> f64>(steps: &[DenseStep<3>], f: &F) -> f64 {
    let Some(first) = steps.first() else {
        return f64::NEG_INFINITY;
    };
    // Boundary k lies between steps k − 1 and k.
    let mut best = (f(first, first.t0), 0usize);
    for (i, st) in steps.iter().enumerate() {
        let v = f(st, st.t_stop);
        if v > best.0 {
            best = (v, i + 1);
        }
    }
    let k = best.1;
    let before = k.checked_sub(1).and_then(|i| steps.get(i));
    let after = steps.get(k);
    let mid = |st: &DenseStep<3>| 0.5 * (st.t0 + st.t_stop);
    let (a, b) = match (before, after) {
        (Some(p), Some(n)) => (mid(p), mid(n)),
        (Some(p), None) => (mid(p), p.t_stop),
        (None, Some(n)) => (n.t0, mid(n)),
        (None, None) => return best.0,
    };
    let at = |t: f64| match (before, after) {
        (Some(p), _) if t <= p.t_stop => f(p, t),
        (_, Some(n)) => f(n, t),
        (Some(p), None) => f(p, t),
        (None, None) => f64::NEG_INFINITY,
    };
    best.0.max(golden_max(a, b, at))
}

fn sample_stroke(
    buffer: &Buffer<'_>,
    level: f64,
    count: f64,
    mass: f64,
    phases: &[(Trajectory<3>, Leg)],
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
        if let Some((tr, leg)) = phase {
            if let Some(y) = tr.eval(t) {
                out.push(HistoryPoint {
                    time: t,
                    position: y[0],
                    speed: y[1],
                    hazard_speed: y[1],
                    spring_force: 0.0,
                    buffer_force: count * buffer.force_one(y[0], y[1], *leg, level),
                    kinetic_energy: 0.5 * mass * y[1] * y[1],
                });
            }
        }
    }
    out
}

#[cfg(test)]
mod tests;
