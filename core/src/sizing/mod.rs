//! Buffer sizing, the inverse of the impact model: given the part, its impact
//! speed, the forces that keep pushing it and the limits on peak force, peak
//! deceleration, mean deceleration and available stroke, find for each
//! buffer type the stroke and the rate, force level or coefficient that meets
//! every limit, or say, as data, why none can.
//!
//! The energy a buffer must take in one stop over stroke `s` is
//! `E_total = ½·m·v² + F_n·s` with `F_n` = drive force + gravity component −
//! friction (work–energy balance; the trade writes `E_total = E_kinetic +
//! F_drive·s` and selects absorbers by the effective mass
//! `m_e = 2·E_total/v²`). Energy per hour is `E_total` × cycles per hour;
//! the heat load is the energy the buffer absorbs per hour over 3600 s. An
//! orifice damper hands `½·m·v_r²` to the end stop: its figures count only
//! what the damper absorbs, as the impact model does.
//!
//! Each limit is monotone in the stroke (a longer stroke is softer), so it
//! gives a least stroke, in closed form where one exists (the private
//! `law` submodule holds them):
//! - linear spring, `F = k·x`: `k·s²/2 = E_k + F_n·s`, so
//!   `F_peak = 2·(E_k/s + F_n)`; without drive `s = v·√(m/k)`;
//! - power law `F = a·xⁿ`: `a·s^(n+1)/(n+1) = E_total`, `F_peak = (n+1)·E_total/s`;
//! - ideal hydraulic absorber of efficiency `η`: mean force `E_total/s`,
//!   peak `E_total/(η·s)`; constant deceleration `v²/(2s)` when `η = 1`;
//! - gas spring of progression `p` (end force / force at contact) on the
//!   polytropic law: peak `p·E_total/(Φ·s)` with `Φ` its mean-to-initial force
//!   ratio;
//! - orifice damper `F = c·v²`: exact stroke to a residual speed `v_r`, and
//!   a bracketed solve for `c` from a stroke.
//!
//! Mean deceleration (contact speed / stopping time) is solved by bisection
//! on the exact stopping time (closed form for the linear spring, absorber
//! and damper; Gauss–Legendre quadrature for the power law and gas spring).
//!
//! Two designs are reported where they exist: the one at the least stroke
//! that meets the force and deceleration limits (`required`, its stroke is
//! the required stroke), and the softest one that uses the whole available
//! stroke (`using_available_stroke`). Every design stands at or inside every
//! limit; a design at the least stroke meets its governing limit exactly, so
//! add the margin your practice asks for and check the chosen catalogue
//! buffer with the impact model.
//!
//! Sources: work–energy balance and SDOF mass–spring results (basic
//! mechanics, status D in the project's reference table §10); the trade's
//! effective mass and drive-force energy (§10, D); ideal absorber `F = E/s`
//! (§10 buffer efficiency, D).

mod law;
mod numeric;

use crate::error::{check, InputError};
use crate::figure::{ids, Figure, Verdict};
use crate::units::{tag, Dim};
use crate::G_N;
use law::{Bound, Duty, Law, Point};
use serde::{Deserialize, Serialize};

/// Relative tolerance within which a design at the boundary of a limit is
/// taken to meet it: the closed forms and the bisection place the design on
/// the limit to rounding (≈1e-15) or to the bisection's 1e-14; 1e-9 leaves
/// room for the quadrature of the stopping time.
pub const REL_TOL_BOUNDARY: f64 = 1e-9;

/// Ratio of the terminal speed `√(F_n/c)` to the residual speed above which
/// an orifice design carries a sensitivity note: at 0.9 the stroke already
/// depends on `ln(1/(1 − 0.81))`, and small changes in force move it a lot.
const TERMINAL_SPEED_CAUTION: f64 = 0.9;

/// Seconds per hour, for the heat load.
const SECONDS_PER_HOUR: f64 = 3600.0;

/// What moves into the buffer.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum MovingBody {
    /// A translating part of mass `mass`, kg.
    Translating {
        /// Moving mass, kg.
        mass: f64,
    },
    /// A rotating part of moment of inertia `inertia` (kg·m²) about its
    /// axis, striking the buffer at radius `radius` (m): effective mass
    /// `I/r²`. Speed and forces are then those at that radius.
    Rotating {
        /// Moment of inertia about the axis, kg·m².
        inertia: f64,
        /// Radius of the buffer contact point from the axis, m.
        radius: f64,
    },
}

impl MovingBody {
    /// Effective mass at the buffer, kg: `m`, or `I/r²`.
    ///
    /// # Errors
    /// Mass, inertia or radius not finite and positive.
    pub fn effective_mass(&self) -> Result<f64, InputError> {
        match *self {
            MovingBody::Translating { mass } => check::positive("mass", mass),
            MovingBody::Rotating { inertia, radius } => {
                let i = check::positive("inertia", inertia)?;
                let r = check::positive("radius", radius)?;
                let m = i / (r * r);
                if m.is_finite() && m > 0.0 {
                    Ok(m)
                } else {
                    Err(InputError::invalid(
                        "radius",
                        "inertia and radius give no finite effective mass I/r²",
                    ))
                }
            }
        }
    }
}

/// Limits the sized buffer must meet. Give at least one.
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize, Deserialize)]
pub struct SizingLimits {
    /// Highest buffer force, N.
    pub peak_force: Option<f64>,
    /// Highest deceleration of the part, m/s².
    pub peak_deceleration: Option<f64>,
    /// Highest mean deceleration (contact speed / stopping time), m/s².
    pub mean_deceleration: Option<f64>,
    /// Stroke available for the buffer, m.
    pub stroke: Option<f64>,
}

/// The duty and limits of a buffer to size.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct SizingInput {
    /// What moves.
    pub moving: MovingBody,
    /// Speed at which the part meets the buffer, m/s.
    pub impact_speed: f64,
    /// Drive force that keeps pushing during the stroke, N (positive
    /// towards the buffer).
    pub drive_force: f64,
    /// Gravity component along the motion, N (positive towards the buffer,
    /// e.g. `m·g_n·sin(incline)` going down).
    pub gravity_force: f64,
    /// Friction opposing the motion during the stroke, N (zero or more; zero
    /// is conservative).
    pub friction_force: f64,
    /// Stops per hour (zero or more).
    pub cycles_per_hour: f64,
    /// Limits to meet.
    pub limits: SizingLimits,
}

/// Buffer types that can be sized.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum BufferType {
    /// Linear spring `F = k·x` (no preload).
    LinearSpring,
    /// Progressive (or degressive) elastomer `F = a·xⁿ`.
    PowerLaw {
        /// Exponent `n`, in `[0.2, 10]` (the range the impact model takes).
        exponent: f64,
    },
    /// Hydraulic absorber as an ideal constant-force device with efficiency
    /// `η` = mean force / peak force over the stroke (1 for the ideal).
    ConstantForce {
        /// Efficiency, in `(0, 1]`.
        efficiency: f64,
    },
    /// Orifice damper `F = c·v²` over a finite stroke, handing the part to
    /// the end stop at `residual_speed` (a pure `v²` damper never stops it).
    Orifice {
        /// Speed at the end of the damper's stroke, m/s, in `(0, v)`.
        residual_speed: f64,
    },
    /// Gas spring: force at contact `F₁` rising on the polytropic law to
    /// `p·F₁` at the end of the stroke used.
    GasSpring {
        /// Progression `p` = end force / force at contact, in `[1, 10]`.
        progression: f64,
        /// Polytropic index `κ`, in `[1, 1.67]` (1 isothermal, 1.4
        /// adiabatic for air or nitrogen).
        polytropic_index: f64,
    },
}

impl BufferType {
    /// Name for people.
    pub fn label(&self) -> &'static str {
        match self {
            BufferType::LinearSpring => "linear spring",
            BufferType::PowerLaw { .. } => "power-law elastomer",
            BufferType::ConstantForce { .. } => "hydraulic absorber (constant force)",
            BufferType::Orifice { .. } => "orifice damper (F = c·v²)",
            BufferType::GasSpring { .. } => "gas spring",
        }
    }

    fn law(&self, v: f64) -> Result<Law, InputError> {
        Ok(match *self {
            BufferType::LinearSpring => Law::Linear,
            BufferType::PowerLaw { exponent } => Law::Power {
                n: check::in_range("exponent", exponent, 0.2, 10.0)?,
            },
            BufferType::ConstantForce { efficiency } => Law::Constant {
                eta: positive_up_to("efficiency", efficiency, 1.0)?,
            },
            BufferType::Orifice { residual_speed } => {
                let vr = check::positive("residual_speed", residual_speed)?;
                if vr >= v {
                    return Err(InputError::invalid(
                        "residual_speed",
                        "must be less than the impact speed",
                    ));
                }
                Law::Orifice { vr }
            }
            BufferType::GasSpring {
                progression,
                polytropic_index,
            } => Law::Gas {
                p: check::in_range("progression", progression, 1.0, 10.0)?,
                kappa: check::in_range("polytropic_index", polytropic_index, 1.0, 1.67)?,
            },
        })
    }
}

/// Finite, above zero and at most `max`.
fn positive_up_to(field: &str, v: f64, max: f64) -> Result<f64, InputError> {
    let v = check::positive(field, v)?;
    if v <= max {
        Ok(v)
    } else {
        Err(InputError::new(
            field,
            crate::error::Problem::OutOfRange { min: 0.0, max },
        ))
    }
}

/// A limit of the sizing.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum LimitKind {
    /// Peak buffer force.
    PeakForce,
    /// Peak deceleration of the part.
    PeakDeceleration,
    /// Mean deceleration.
    MeanDeceleration,
    /// Available stroke.
    Stroke,
}

impl LimitKind {
    /// Name for people.
    pub fn label(self) -> &'static str {
        match self {
            LimitKind::PeakForce => "peak force",
            LimitKind::PeakDeceleration => "peak deceleration",
            LimitKind::MeanDeceleration => "mean deceleration",
            LimitKind::Stroke => "available stroke",
        }
    }

    /// Kind of quantity of the limit's value.
    pub fn dim(self) -> Dim {
        match self {
            LimitKind::PeakForce => Dim::Force,
            LimitKind::PeakDeceleration | LimitKind::MeanDeceleration => Dim::Acceleration,
            LimitKind::Stroke => Dim::Length,
        }
    }

    /// SI unit of the limit.
    pub fn unit(self) -> &'static str {
        match self {
            LimitKind::PeakForce => "N",
            LimitKind::PeakDeceleration | LimitKind::MeanDeceleration => "m/s²",
            LimitKind::Stroke => "m",
        }
    }
}

/// How a design stands against one limit.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct LimitMargin {
    /// Which limit.
    pub limit: LimitKind,
    /// The limit's value (SI).
    pub limit_value: f64,
    /// The design's value (SI).
    pub value: f64,
    /// `limit / value` (≥ 1 within the limit); `None` when the value is 0.
    pub ratio: Option<f64>,
    /// `limit − value` (≥ 0 within the limit).
    pub difference: f64,
    /// `Pass` when `value ≤ limit·(1 + REL_TOL_BOUNDARY)`.
    pub verdict: Verdict,
}

impl LimitMargin {
    fn new(limit: LimitKind, limit_value: f64, value: f64) -> Self {
        Self {
            limit,
            limit_value,
            value,
            ratio: (value > 0.0).then(|| limit_value / value),
            difference: limit_value - value,
            verdict: if value <= limit_value * (1.0 + REL_TOL_BOUNDARY) {
                Verdict::Pass
            } else {
                Verdict::Fail
            },
        }
    }
}

/// The setting of a sized buffer, per type.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum BufferSetting {
    /// Linear spring.
    LinearSpring {
        /// Rate `k`, N/m.
        rate: f64,
    },
    /// Power law `F = a·xⁿ`.
    PowerLaw {
        /// Coefficient `a`, N/mⁿ (`None` if it overflows f64).
        coefficient: Option<f64>,
        /// Exponent `n`.
        exponent: f64,
        /// End force / stroke, N/m.
        secant_rate: f64,
    },
    /// Hydraulic absorber.
    ConstantForce {
        /// Mean force over the stroke `E_total/s`, N (the ideal absorber's
        /// constant force).
        mean_force: f64,
        /// Efficiency (mean / peak force).
        efficiency: f64,
    },
    /// Orifice damper.
    Orifice {
        /// Coefficient `c`, N·s²/m².
        coefficient: f64,
        /// Speed handed to the end stop, m/s.
        residual_speed: f64,
        /// With a propelling force, the speed at which the damper's force
        /// balances it, `√(F_n/c)` (always below the residual speed), m/s.
        /// Close to the residual speed, the stroke and time are sensitive
        /// to the drive force and the coefficient.
        terminal_speed: Option<f64>,
    },
    /// Gas spring.
    GasSpring {
        /// Force at contact `F₁`, N.
        force_at_contact: f64,
        /// Progression `p`.
        progression: f64,
        /// Polytropic index `κ`.
        polytropic_index: f64,
    },
}

/// One sized buffer with its figures and margins.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SizedBuffer {
    /// Rate, force level or coefficient.
    pub setting: BufferSetting,
    /// Stroke used to stop the part, m (to the residual speed for the
    /// orifice damper).
    pub stroke: f64,
    /// Peak buffer force, N.
    pub peak_force: f64,
    /// Peak deceleration of the part, `(F_peak − F_n)/m`, m/s².
    pub peak_deceleration: f64,
    /// Mean deceleration, speed lost / time, m/s².
    pub mean_deceleration: f64,
    /// Time from contact to standstill (orifice: to the residual speed), s.
    pub stop_time: f64,
    /// Energy the buffer absorbs per cycle, `E = ½·m·v² + F_n·s`, less
    /// `½·m·v_r²` handed to the end stop by an orifice damper, J.
    pub energy_per_cycle: f64,
    /// Effective mass `2·E/v²`, kg.
    pub effective_mass: f64,
    /// Energy per hour `E × cycles/h`, J.
    pub energy_per_hour: f64,
    /// Mean heat load `E × cycles/h / 3600 s`, W.
    pub heat_load: f64,
    /// Speed handed to the end stop (orifice damper), m/s; 0 otherwise.
    pub residual_speed: f64,
    /// Energy handed to the end stop, `½·m·v_r²`, J.
    pub residual_energy: f64,
    /// Margin of each limit given.
    pub margins: Vec<LimitMargin>,
}

impl SizedBuffer {
    /// Whether every number of the design is finite.
    fn is_finite(&self) -> bool {
        let numbers = [
            self.stroke,
            self.peak_force,
            self.peak_deceleration,
            self.mean_deceleration,
            self.stop_time,
            self.energy_per_cycle,
            self.effective_mass,
            self.energy_per_hour,
            self.heat_load,
            self.residual_speed,
            self.residual_energy,
        ];
        let margins = self
            .margins
            .iter()
            .flat_map(|m| [m.limit_value, m.value, m.ratio.unwrap_or(0.0), m.difference]);
        numbers.into_iter().chain(margins).all(f64::is_finite)
    }

    /// Whether every margin passes.
    pub fn meets_all_limits(&self) -> bool {
        self.margins.iter().all(|m| m.verdict == Verdict::Pass)
    }
}

/// Why no buffer of a type meets the limits.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Infeasibility {
    /// The limit is at or below the least value this buffer type can reach
    /// while stopping the part (reached only with an endless stroke). E.g. a
    /// linear spring under a constant propelling force `F_n` peaks at no
    /// less than `2·F_n` (a suddenly applied load); an absorber of
    /// efficiency `η` at `F_n/η`; an orifice damper at `F_n·v²/v_r²`.
    BelowFloor {
        /// Which limit.
        limit: LimitKind,
        /// The limit's value (SI).
        limit_value: f64,
        /// The least value reachable (SI).
        floor: f64,
    },
    /// The available stroke is shorter than the stroke the other limits
    /// need.
    StrokeTooShort {
        /// Available stroke, m.
        available: f64,
        /// Least stroke the force and deceleration limits need, m.
        required: f64,
        /// The limit that sets `required`.
        governing: LimitKind,
    },
    /// The bounded solver found no stroke for this limit.
    NotSolved {
        /// Which limit.
        limit: LimitKind,
    },
}

impl Infeasibility {
    /// The reason in words (SI values).
    pub fn explain(&self) -> String {
        match *self {
            Infeasibility::BelowFloor {
                limit,
                limit_value,
                floor,
            } => format!(
                "the {} limit {} is at or below {}, the least this buffer type can reach while \
                 stopping the part against the forces that act along its motion",
                limit.label(),
                tag(limit_value, limit.dim()),
                tag(floor, limit.dim()),
            ),
            Infeasibility::StrokeTooShort {
                available,
                required,
                governing,
            } => format!(
                "the available stroke {} is shorter than the {} the {} limit needs",
                tag(available, Dim::Length),
                tag(required, Dim::Length),
                governing.label()
            ),
            Infeasibility::NotSolved { limit } => {
                format!("no stroke could be found for the {} limit", limit.label())
            }
        }
    }
}

/// The answer for one buffer type.
// One value per buffer type sized, never held in bulk: boxing the designs
// would only make matching on them clumsier.
#[allow(clippy::large_enum_variant)]
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum SizingResult {
    /// Some designs meet every limit.
    Feasible {
        /// The design at the least stroke that meets the force and
        /// deceleration limits (`None` when only a stroke limit is given).
        required: Option<SizedBuffer>,
        /// The limit that sets the required stroke.
        governing: Option<LimitKind>,
        /// The softest design, using the whole available stroke (`None`
        /// without a stroke limit, or when the part stops unaided within it).
        using_available_stroke: Option<SizedBuffer>,
        /// With a resisting net force, the part stops (orifice: slows to the
        /// residual speed) unaided over this distance, m.
        stops_unaided_within: Option<f64>,
    },
    /// No design meets every limit.
    Infeasible {
        /// Each reason found.
        reasons: Vec<Infeasibility>,
    },
}

/// Sizing of one buffer type.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SizingOutcome {
    /// The buffer type sized.
    pub buffer: BufferType,
    /// Effective mass of the part at the buffer, kg.
    pub part_mass: f64,
    /// Impact speed, m/s.
    pub impact_speed: f64,
    /// Kinetic energy at impact `½·m·v²`, J.
    pub kinetic_energy: f64,
    /// Net propelling force during the stroke (drive + gravity − friction), N.
    pub propelling_force: f64,
    /// Cycles per hour.
    pub cycles_per_hour: f64,
    /// The designs, or why there are none.
    pub result: SizingResult,
}

/// Size one buffer type for the duty and limits.
///
/// # Formula
/// See the module documentation: `E_total = ½·m·v² + F_n·s`;
/// `F_peak = E_total/(η·s)` with `η = 1/(n+1)` (power law, linear `n = 1`),
/// the absorber's efficiency, or `Φ/p` (gas spring); orifice damper by exact
/// integration of `m·v·dv/dx = F_n − c·v²`.
///
/// # Errors
/// A mass, inertia, radius or impact speed not finite and positive; a
/// friction or cycle rate negative; a non-finite force; a limit not positive;
/// no limit given; a buffer parameter out of range. The field is named.
pub fn size_buffer(input: &SizingInput, buffer: &BufferType) -> Result<SizingOutcome, InputError> {
    let m = input
        .moving
        .effective_mass()
        .map_err(|e| e.within("moving"))?;
    let v = check::positive("impact_speed", input.impact_speed)?;
    let fd = check::finite("drive_force", input.drive_force)?;
    let fg = check::finite("gravity_force", input.gravity_force)?;
    let ff = check::non_negative("friction_force", input.friction_force)?;
    let n_per_h = check::non_negative("cycles_per_hour", input.cycles_per_hour)?;
    let lim = input.limits;
    let opt = |field: &str, x: Option<f64>| -> Result<Option<f64>, InputError> {
        x.map(|v| check::positive(field, v))
            .transpose()
            .map_err(|e| e.within("limits"))
    };
    let f_max = opt("peak_force", lim.peak_force)?;
    let a_max = opt("peak_deceleration", lim.peak_deceleration)?;
    let a_mean = opt("mean_deceleration", lim.mean_deceleration)?;
    let s_avail = opt("stroke", lim.stroke)?;
    if f_max.is_none() && a_max.is_none() && a_mean.is_none() && s_avail.is_none() {
        return Err(InputError::invalid(
            "limits",
            "give at least one limit: peak force, peak deceleration, mean deceleration or stroke",
        ));
    }
    let law = buffer.law(v).map_err(|e| e.within("buffer"))?;
    let duty = Duty {
        m,
        v,
        ek: 0.5 * m * v * v,
        fnet: fd + fg - ff,
    };
    // A positive speed and mass of extreme size can underflow the energy to
    // 0 (then 0/0 in the mean deceleration) or overflow it.
    if !(duty.ek.is_finite() && duty.ek > 0.0 && duty.fnet.is_finite()) {
        return Err(InputError::invalid(
            "impact_speed",
            "mass, speed and forces give no finite, positive kinetic energy: check their sizes and units",
        ));
    }

    // Least stroke from each force or deceleration limit.
    let mut reasons = Vec::new();
    let mut required: Option<(f64, LimitKind)> = None;
    let bounds = [
        (
            LimitKind::PeakForce,
            f_max,
            law_bound(&law, &duty, LimitKind::PeakForce, f_max),
        ),
        (
            LimitKind::PeakDeceleration,
            a_max,
            law_bound(&law, &duty, LimitKind::PeakDeceleration, a_max),
        ),
        (
            LimitKind::MeanDeceleration,
            a_mean,
            law_bound(&law, &duty, LimitKind::MeanDeceleration, a_mean),
        ),
    ];
    for (kind, value, bound) in bounds {
        let (Some(limit_value), Some(bound)) = (value, bound) else {
            continue;
        };
        match bound {
            Bound::From(s) => {
                if required.is_none_or(|(r, _)| s > r) {
                    required = Some((s, kind));
                }
            }
            Bound::Floor(floor) => reasons.push(Infeasibility::BelowFloor {
                limit: kind,
                limit_value,
                floor,
            }),
            Bound::Unsolved => reasons.push(Infeasibility::NotSolved { limit: kind }),
        }
    }
    if reasons.is_empty() {
        if let (Some((s_req, governing)), Some(avail)) = (required, s_avail) {
            if s_req > avail {
                reasons.push(Infeasibility::StrokeTooShort {
                    available: avail,
                    required: s_req,
                    governing,
                });
            }
        }
    }

    let sup = law.stroke_sup(&duty);
    let result = if reasons.is_empty() {
        // A design whose numbers overflow (a stroke of extreme size) is
        // reported as not solved, never handed on with NaN in it.
        let make = |s: f64| -> Option<SizedBuffer> {
            law.at_stroke(&duty, s)
                .map(|p| finish(p, &duty, n_per_h, &lim))
                .filter(SizedBuffer::is_finite)
        };
        let req_design = match required {
            Some((s, _)) => match make(s) {
                Some(d) => Some(d),
                None => {
                    reasons.push(Infeasibility::NotSolved {
                        limit: required.map_or(LimitKind::Stroke, |r| r.1),
                    });
                    None
                }
            },
            None => None,
        };
        let avail_design = match s_avail {
            Some(s) if s < sup => match make(s) {
                Some(d) => Some(d),
                None => {
                    reasons.push(Infeasibility::NotSolved {
                        limit: LimitKind::Stroke,
                    });
                    None
                }
            },
            _ => None,
        };
        if reasons.is_empty() {
            SizingResult::Feasible {
                required: req_design,
                governing: required.map(|r| r.1),
                using_available_stroke: avail_design,
                stops_unaided_within: sup.is_finite().then_some(sup),
            }
        } else {
            SizingResult::Infeasible { reasons }
        }
    } else {
        SizingResult::Infeasible { reasons }
    };

    Ok(SizingOutcome {
        buffer: *buffer,
        part_mass: m,
        impact_speed: v,
        kinetic_energy: duty.ek,
        propelling_force: duty.fnet,
        cycles_per_hour: n_per_h,
        result,
    })
}

/// Size several buffer types for the same duty (one outcome each, in order).
///
/// # Errors
/// As [`size_buffer`]; the failing buffer's index is named.
pub fn size_buffers(
    input: &SizingInput,
    buffers: &[BufferType],
) -> Result<Vec<SizingOutcome>, InputError> {
    buffers
        .iter()
        .enumerate()
        .map(|(i, b)| {
            size_buffer(input, b).map_err(|e| {
                if e.field.starts_with("buffer") {
                    InputError {
                        field: e.field.replacen("buffer", &format!("buffers.{i}"), 1),
                        problem: e.problem,
                    }
                } else {
                    e
                }
            })
        })
        .collect()
}

fn law_bound(law: &Law, d: &Duty, kind: LimitKind, value: Option<f64>) -> Option<Bound> {
    let v = value?;
    Some(match kind {
        LimitKind::PeakForce => law.force_bound(d, v),
        LimitKind::PeakDeceleration => law.peak_decel_bound(d, v),
        LimitKind::MeanDeceleration => law.mean_decel_bound(d, v),
        LimitKind::Stroke => Bound::From(0.0),
    })
}

/// Energy figures and margins of a design point.
fn finish(p: Point, d: &Duty, n_per_h: f64, lim: &SizingLimits) -> SizedBuffer {
    let e_total = d.ek + d.fnet * p.stroke;
    let residual_energy = 0.5 * d.m * p.residual_speed * p.residual_speed;
    let absorbed = (e_total - residual_energy).max(0.0);
    let mut margins = Vec::new();
    let mut push = |kind, limit: Option<f64>, value: f64| {
        if let Some(l) = limit {
            margins.push(LimitMargin::new(kind, l, value));
        }
    };
    push(LimitKind::PeakForce, lim.peak_force, p.peak_force);
    push(
        LimitKind::PeakDeceleration,
        lim.peak_deceleration,
        p.peak_deceleration,
    );
    push(
        LimitKind::MeanDeceleration,
        lim.mean_deceleration,
        p.mean_deceleration,
    );
    push(LimitKind::Stroke, lim.stroke, p.stroke);
    SizedBuffer {
        setting: p.setting,
        stroke: p.stroke,
        peak_force: p.peak_force,
        peak_deceleration: p.peak_deceleration,
        mean_deceleration: p.mean_deceleration,
        stop_time: p.stop_time,
        energy_per_cycle: absorbed,
        effective_mass: 2.0 * absorbed / (d.v * d.v),
        energy_per_hour: absorbed * n_per_h,
        heat_load: absorbed * n_per_h / SECONDS_PER_HOUR,
        residual_speed: p.residual_speed,
        residual_energy,
        margins,
    }
}

impl SizingOutcome {
    /// The design to show first: the one at the required stroke, else the
    /// one using the available stroke.
    pub fn design(&self) -> Option<&SizedBuffer> {
        match &self.result {
            SizingResult::Feasible {
                required,
                using_available_stroke,
                ..
            } => required.as_ref().or(using_available_stroke.as_ref()),
            SizingResult::Infeasible { .. } => None,
        }
    }

    /// The figures of [`SizingOutcome::design`]; when there is none, the same
    /// figures kept in place as missing, with the reasons.
    pub fn figures(&self) -> Vec<Figure> {
        match self.design() {
            Some(d) => self.design_figures(d),
            None => {
                let reasons: Vec<String> = match &self.result {
                    SizingResult::Infeasible { reasons } => {
                        reasons.iter().map(Infeasibility::explain).collect()
                    }
                    SizingResult::Feasible { .. } => {
                        vec!["the part stops unaided within the available stroke: no buffer is needed".into()]
                    }
                };
                [
                    (ids::SIZING_STROKE, "Required buffer stroke", Dim::Length),
                    (ids::SIZING_PEAK_FORCE, "Peak buffer force", Dim::Force),
                    (
                        ids::SIZING_PEAK_DECELERATION,
                        "Peak deceleration",
                        Dim::Acceleration,
                    ),
                    (
                        ids::SIZING_EFFECTIVE_MASS,
                        "Effective mass 2·E/v²",
                        Dim::Mass,
                    ),
                    (
                        ids::SIZING_ENERGY_PER_CYCLE,
                        "Energy per cycle",
                        Dim::Energy,
                    ),
                ]
                .into_iter()
                .map(|(id, label, dim)| Figure::missing(id, label, dim, reasons.clone()))
                .collect()
            }
        }
    }

    /// The figures of one design (either of the two reported).
    pub fn design_figures(&self, d: &SizedBuffer) -> Vec<Figure> {
        let basics = "work–energy balance E_total = ½·m·v² + F_n·s (basic mechanics, derived)";
        let kind = format!("buffer type: {}", self.buffer.label());
        let fnet = format!(
            "net propelling force F_n = drive + gravity − friction = {}, constant over the stroke",
            tag(self.propelling_force, Dim::Force)
        );
        let rigid = "rigid frame and part; buffer mass ignored";
        let mut out = Vec::new();

        let (stroke_method, stroke_source) = match self.buffer {
            BufferType::LinearSpring => (
                "k·s²/2 = ½·m·v² + F_n·s (s = v·√(m/k) without F_n)",
                "SDOF mass–spring energy balance (basic mechanics, derived)",
            ),
            BufferType::PowerLaw { .. } => ("a·s^(n+1)/(n+1) = ½·m·v² + F_n·s", basics),
            BufferType::ConstantForce { .. } => ("F_mean·s = ½·m·v² + F_n·s", basics),
            BufferType::Orifice { .. } => (
                "s = (m/2c)·ln((v₀² − F_n/c)/(v_r² − F_n/c)) from m·v·dv/dx = F_n − c·v²",
                "exact integration of the equation of motion (derived)",
            ),
            BufferType::GasSpring { .. } => {
                ("F₁·Φ·s = ½·m·v² + F_n·s, polytropic P·V^κ = const", basics)
            }
        };
        out.push(
            Figure::new(
                ids::SIZING_STROKE,
                "Required buffer stroke",
                Dim::Length,
                d.stroke,
            )
            .method(stroke_method)
            .source(stroke_source)
            .assume(&kind)
            .assume(&fnet)
            .assume(rigid)
            .assume("the stroke the part uses; install a buffer with more stroke than this"),
        );
        match d.setting {
            BufferSetting::LinearSpring { rate } => out.push(
                Figure::new(ids::SIZING_RATE, "Spring rate", Dim::LinearRate, rate)
                    .method("k = 2·(½·m·v² + F_n·s)/s²")
                    .source(stroke_source)
                    .assume("no preload"),
            ),
            BufferSetting::PowerLaw {
                coefficient,
                exponent,
                secant_rate,
            } => {
                let mut f = Figure::new(ids::SIZING_RATE, "Secant rate (end force / stroke)", Dim::LinearRate, secant_rate)
                    .method("F_end/s with F_end = (n+1)·E_total/s")
                    .source(basics)
                    .assume(&format!("F = a·xⁿ with n = {exponent}"));
                if let Some(a) = coefficient {
                    f = f.assume(&format!("a = {a:.4e} N/mⁿ"));
                }
                out.push(f);
            }
            BufferSetting::ConstantForce { mean_force, efficiency } => out.push(
                Figure::new(ids::SIZING_FORCE_LEVEL, "Absorber force (mean over stroke)", Dim::Force, mean_force)
                    .method("F = E_total/s")
                    .source("ideal constant-force absorber (basic mechanics, derived)")
                    .assume(&format!("efficiency η = {efficiency} (mean/peak force)")),
            ),
            BufferSetting::Orifice {
                coefficient,
                residual_speed,
                terminal_speed,
            } => {
                let mut f = Figure::new(ids::SIZING_DAMPING, "Orifice coefficient c", Dim::QuadraticDamping, coefficient)
                    .method("F = c·v²; c solved from the stroke")
                    .source(stroke_source)
                    .assume(&format!(
                        "the damper hands the part to the end stop at {}",
                        tag(residual_speed, Dim::Speed)
                    ));
                if let Some(vt) = terminal_speed {
                    if vt >= TERMINAL_SPEED_CAUTION * residual_speed {
                        f = f.assume(&format!(
                            "the drive alone would keep the part moving at {} against this damper, close to \
                             the residual speed: stroke and time are sensitive to the drive force and the coefficient",
                            tag(vt, Dim::Speed)
                        ));
                    }
                }
                out.push(f);
            }
            BufferSetting::GasSpring {
                force_at_contact,
                progression,
                polytropic_index,
            } => out.push(
                Figure::new(ids::SIZING_FORCE_LEVEL, "Gas spring force at contact", Dim::Force, force_at_contact)
                    .method("F₁ = E_total/(Φ·s), Φ = mean/initial force of F₁·(1 − b·x/s)^(−κ)")
                    .source("polytropic gas law P·V^κ = const (basic thermodynamics, derived)")
                    .assume(&format!(
                        "progression {progression} over the stroke used (rated stroke = stroke used), κ = {polytropic_index}; seal friction ignored"
                    )),
            ),
        }
        let peak_method = match self.buffer {
            BufferType::Orifice { .. } => "F_peak = c·v₀² (at entry)",
            BufferType::ConstantForce { .. } => "F_peak = E_total/(η·s)",
            BufferType::LinearSpring => "F_peak = k·s = 2·E_total/s",
            BufferType::PowerLaw { .. } => "F_peak = (n+1)·E_total/s",
            BufferType::GasSpring { .. } => "F_peak = p·F₁",
        };
        out.push(
            Figure::new(
                ids::SIZING_PEAK_FORCE,
                "Peak buffer force",
                Dim::Force,
                d.peak_force,
            )
            .method(peak_method)
            .source(basics)
            .assume(&kind)
            .assume(rigid),
        );
        out.push(
            Figure::new(
                ids::SIZING_PEAK_DECELERATION,
                "Peak deceleration",
                Dim::Acceleration,
                d.peak_deceleration,
            )
            .method("a_peak = (F_peak − F_n)/m")
            .source("Newton's second law")
            .assume(&format!("{:.3} g_n", d.peak_deceleration / G_N)),
        );
        let mut mean = Figure::new(
            ids::SIZING_MEAN_DECELERATION,
            "Mean deceleration",
            Dim::Acceleration,
            d.mean_deceleration,
        )
        .method("a_mean = speed lost / stopping time")
        .source("exact stopping time of the buffer law (closed form or Gauss–Legendre quadrature)")
        .assume(&format!("{:.3} g_n", d.mean_deceleration / G_N));
        if let BufferType::ConstantForce { efficiency } = self.buffer {
            if efficiency < 1.0 {
                mean = mean.assume(
                    "time of the ideal constant-force profile (v²/(2s)); a real absorber's time mean depends on its force profile",
                );
            }
        }
        out.push(mean);
        out.push(
            Figure::new(
                ids::SIZING_STOP_TIME,
                "Stopping time",
                Dim::Time,
                d.stop_time,
            )
            .method("t = ∫ dx/v(x) over the stroke")
            .source("exact integration of the equation of motion (derived)"),
        );
        let energy_src = "drive-force energy E_total = ½·m·v² + F_D·s (trade practice; reference-values.md §10, derived)";
        out.push(
            Figure::new(
                ids::SIZING_EFFECTIVE_MASS,
                "Effective mass 2·E/v²",
                Dim::Mass,
                d.effective_mass,
            )
            .method("m_e = 2·E/v²")
            .source(energy_src)
            .assume("the figure absorber catalogues are selected by"),
        );
        out.push(
            Figure::new(
                ids::SIZING_ENERGY_PER_CYCLE,
                "Energy per cycle",
                Dim::Energy,
                d.energy_per_cycle,
            )
            .method(if d.residual_speed > 0.0 {
                "E = ½·m·v² + F_n·s − ½·m·v_r² (the end stop takes ½·m·v_r²)"
            } else {
                "E = ½·m·v² + F_n·s"
            })
            .source(energy_src)
            .assume(&fnet),
        );
        out.push(
            Figure::new(
                ids::SIZING_ENERGY_PER_HOUR,
                "Energy per hour",
                Dim::Energy,
                d.energy_per_hour,
            )
            .method("E × cycles per hour")
            .source(energy_src)
            .assume(&format!("{} cycles per hour", self.cycles_per_hour)),
        );
        let mut heat = Figure::new(
            ids::SIZING_HEAT_LOAD,
            "Mean heat load",
            Dim::Power,
            d.heat_load,
        )
        .method("E × cycles per hour / 3600 s")
        .source(energy_src);
        if matches!(
            self.buffer,
            BufferType::LinearSpring | BufferType::PowerLaw { .. } | BufferType::GasSpring { .. }
        ) {
            heat = heat.assume("an elastic buffer returns most of this energy to the part: this is an upper bound on its heat");
        }
        out.push(heat);
        if let BufferType::Orifice { .. } = self.buffer {
            out.push(
                Figure::new(
                    ids::SIZING_RESIDUAL_ENERGY,
                    "Energy left for the end stop",
                    Dim::Energy,
                    d.residual_energy,
                )
                .method("½·m·v_r²")
                .source(basics)
                .assume(
                    "a pure v² damper never reaches zero speed; the end stop takes this energy",
                ),
            );
        }
        out
    }
}

#[cfg(test)]
mod tests;
