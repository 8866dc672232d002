//! Lift buffers: where each buffer type may be used, the stroke it needs, and
//! the retardation it may impose, under EN 81-20 and under the US rules of
//! California Title 8 (which follow ASME A17.1).
//!
//! EN 81-20:2014/2020, clause 5.8 (read in a secondary summary, R2):
//! energy-accumulation buffers only for rated speed v ≤ 1.0 m/s (5.8.1.5);
//! energy-dissipation buffers at any speed (5.8.1.6). Linear buffer stroke
//! s ≥ 0.135·v² and ≥ 65 mm (5.8.2.1.1), where 0.135·v² is twice the gravity
//! stopping distance from 115 % of v; it reaches that stroke under a static
//! load of 2.5 to 4 × (P + Q)·g_n. Non-linear buffers (5.8.2.1.2): mean
//! retardation ≤ 1 g_n, retardation above 2.5 g_n for ≤ 0.04 s, peak ≤ 6 g_n,
//! return speed ≤ 1 m/s. Energy-dissipation stroke s ≥ 0.0674·v², the gravity
//! stopping distance from 115 % of v, with no 65 mm floor (5.8.2.2.1); with a
//! monitored terminal slowdown and v > 2.5 m/s the stroke may be computed
//! from the impact speed, but ≥ 0.42 m (5.8.2.2.2); retardation as for
//! non-linear buffers, mean ≤ 1 g_n and > 2.5 g_n for ≤ 0.04 s (5.8.2.2.3).
//! The SI rules use g_n = 9.806 65 m/s² exactly.
//!
//! US, California Code of Regulations Title 8 (primary text read, R):
//! §3108(a)(1), (a)(3): an oil buffer's stroke stops the car from 115 % of
//! rated speed at an average retardation ≤ 32.2 ft/s², i.e. stroke ≥ the
//! gravity stopping distance S = V²/19 320 (S in inches, V in ft/min, which
//! embeds g = 32.2 ft/s²); §3108(b): average ≤ 32.2 ft/s², peaks above
//! 80.5 ft/s² last ≤ 1/25 s, for any load from rated load down to 150 lb;
//! §3031(a)(3): elevators above 200 ft/min need oil buffers; §1604.14:
//! construction-hoist spring buffers, minimum stroke by speed band, only up to
//! 300 ft/min (or 12 in with a terminal speed limiter up to 600 ft/min), and
//! solid under 3 × but not under 2 × (car + rated load). The US rules use
//! 32.2 ft/s² (9.814 56 m/s²), 0.08 % above g_n: each rule keeps its own
//! constant. ASME A17.1 clause numbers (2.22.3, 2.22.4) are from memory.

use super::{input_ids, us_units, Check, Comparison, LimitEntry, LimitSet, LimitSetId, Subject};
use crate::error::{check, InputError};
use crate::figure::{ids, Provenance, SourceStatus};
use crate::units::Dim;
use crate::G_N;
use serde::{Deserialize, Serialize};

// ---------- EN 81-20 ----------

/// Highest rated speed for energy-accumulation buffers, m/s (EN 81-20 5.8.1.5, R2).
pub const EN81_ACCUMULATION_MAX_SPEED: f64 = 1.0;
/// Linear buffer stroke coefficient, s²/m: s ≥ 0.135·v² (EN 81-20 5.8.2.1.1, R2).
pub const EN81_LINEAR_STROKE_COEFF: f64 = 0.135;
/// Linear buffer minimum stroke, m (EN 81-20 5.8.2.1.1, R2).
pub const EN81_LINEAR_STROKE_MIN: f64 = 0.065;
/// Energy-dissipation stroke coefficient, s²/m: s ≥ 0.0674·v² (EN 81-20 5.8.2.2.1, R2).
pub const EN81_DISSIPATION_STROKE_COEFF: f64 = 0.0674;
/// Rated speed above which a monitored slowdown allows a reduced stroke, m/s
/// (EN 81-20 5.8.2.2.2, R2).
pub const EN81_REDUCED_STROKE_SPEED: f64 = 2.5;
/// Minimum reduced stroke, m (EN 81-20 5.8.2.2.2, R2).
pub const EN81_REDUCED_STROKE_MIN: f64 = 0.42;
/// Highest mean retardation, m/s² (1 g_n; EN 81-20 5.8.2.1.2, 5.8.2.2.3, R2).
pub const EN81_MEAN_RETARDATION_MAX: f64 = G_N;
/// Retardation threshold for the time limit, m/s² (2.5 g_n; same clauses).
pub const EN81_HIGH_RETARDATION: f64 = 2.5 * G_N;
/// Longest time above 2.5 g_n, s (same clauses).
pub const EN81_HIGH_RETARDATION_TIME: f64 = 0.04;
/// Highest peak retardation of a non-linear buffer, m/s² (6 g_n; 5.8.2.1.2, R2).
pub const EN81_NONLINEAR_PEAK_MAX: f64 = 6.0 * G_N;
/// Highest return speed of a non-linear buffer, m/s (5.8.2.1.2, R2).
pub const EN81_NONLINEAR_RETURN_SPEED_MAX: f64 = 1.0;
/// Static load range for a linear buffer to reach its required stroke, as
/// multiples of (P + Q)·g_n (EN 81-20 5.8.2.1.1, R2).
pub const EN81_LINEAR_STATIC_LOAD_FACTORS: (f64, f64) = (2.5, 4.0);

const EN81: &str = "EN 81-20:2014/2020";

fn en81(clause: &str) -> Provenance {
    Provenance::new(EN81, clause, SourceStatus::Secondary)
}

/// EN 81-20 buffer types.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum En81BufferType {
    /// Energy accumulation, linear characteristic (coil spring).
    LinearAccumulation,
    /// Energy accumulation, non-linear characteristic (elastomer, polyurethane).
    NonLinearAccumulation,
    /// Energy dissipation (hydraulic, oil).
    Dissipation,
}

/// What happened during a buffer stop, measured or computed for the
/// conditions the rule prescribes (e.g. the type test of EN 81-50, or impact
/// at 115 % of rated speed for the US rules). Any figure may be missing.
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct BufferStop {
    /// Mean retardation over the stop, impact speed ÷ stopping time, m/s²
    /// (figure [`ids::IMPACT_MEAN_DECELERATION`]).
    pub mean_deceleration: Option<f64>,
    /// Peak retardation, m/s² (figure [`ids::IMPACT_PEAK_DECELERATION`]).
    pub peak_deceleration: Option<f64>,
    /// Total time the retardation exceeds 2.5 g, s. EN 81-20 counts time
    /// above 2.5 g_n = 24.517 m/s²; the US rule time above 80.5 ft/s² =
    /// 24.536 m/s². A time measured above the lower EN threshold is
    /// conservative for the US rule.
    pub time_above_2_5_g: Option<f64>,
    /// Speed of the car leaving the buffer, m/s (figure [`ids::IMPACT_REBOUND_SPEED`]).
    pub return_speed: Option<f64>,
}

/// A lift buffer to check against EN 81-20.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct En81BufferCase {
    /// Buffer type.
    pub buffer_type: En81BufferType,
    /// Rated speed of the lift, m/s.
    pub rated_speed: f64,
    /// Full stroke of the buffer as built, m.
    pub stroke: Option<f64>,
    /// Impact speed, m/s, when a monitored terminal slowdown is fitted and
    /// the reduced-stroke rule (v > 2.5 m/s) is used; `None` otherwise.
    pub monitored_slowdown_impact_speed: Option<f64>,
    /// Retardation and return speed during the stop.
    pub stop: BufferStop,
    /// Static force that compresses a linear buffer through its required stroke, N.
    pub static_force_at_stroke: Option<f64>,
    /// Mass of the car plus rated load (P + Q), or of the counterweight, kg.
    pub moving_mass: Option<f64>,
}

/// Required stroke of an EN 81-20 buffer at rated speed `v` (m/s), m:
/// linear `max(0.135·v², 0.065)`, dissipation `0.0674·v²`; `None` for a
/// non-linear buffer, which has no stroke formula (verified by type test).
pub fn en81_required_stroke(buffer_type: En81BufferType, rated_speed: f64) -> Option<f64> {
    let v2 = rated_speed * rated_speed;
    match buffer_type {
        En81BufferType::LinearAccumulation => {
            Some((EN81_LINEAR_STROKE_COEFF * v2).max(EN81_LINEAR_STROKE_MIN))
        }
        En81BufferType::NonLinearAccumulation => None,
        En81BufferType::Dissipation => Some(EN81_DISSIPATION_STROKE_COEFF * v2),
    }
}

/// Minimum reduced stroke of an energy-dissipation buffer with a monitored
/// terminal slowdown, m: `max(0.0674·v_i², 0.42 m)` with `v_i` the impact
/// speed (EN 81-20 5.8.2.2.2, R2: the stroke formula of 5.8.2.2.1 with the
/// impact speed in place of the rated speed, as the secondary summary
/// describes; confirm).
pub fn en81_reduced_stroke(impact_speed: f64) -> f64 {
    (EN81_DISSIPATION_STROKE_COEFF * impact_speed * impact_speed).max(EN81_REDUCED_STROKE_MIN)
}

/// Checks of a lift buffer against EN 81-20: type for the rated speed,
/// stroke, retardation (non-linear and dissipation buffers), return speed
/// and peak (non-linear), static load range (linear, when given).
///
/// # Errors
/// Rated speed not positive; a given figure negative or not finite.
pub fn en81_checks(case: &En81BufferCase) -> Result<Vec<Check>, InputError> {
    let v = check::positive("rated_speed", case.rated_speed)?;
    validate_stop(&case.stop)?;
    for (field, x) in [
        ("stroke", case.stroke),
        ("static_force_at_stroke", case.static_force_at_stroke),
    ] {
        if let Some(x) = x {
            check::non_negative(field, x)?;
        }
    }
    if let Some(m) = case.moving_mass {
        check::positive("moving_mass", m)?;
    }
    if let Some(vi) = case.monitored_slowdown_impact_speed {
        check::positive("monitored_slowdown_impact_speed", vi)?;
    }
    let mut out = Vec::new();
    let speed_subject = Subject::new(
        "lift.en81.buffer_type_for_speed",
        "Rated speed permitted for this buffer type",
        input_ids::RATED_SPEED,
        Dim::Speed,
    );
    let stroke_subject = || {
        Subject::new(
            "lift.en81.stroke",
            "Buffer stroke",
            input_ids::BUFFER_STROKE,
            Dim::Length,
        )
    };
    match case.buffer_type {
        En81BufferType::LinearAccumulation | En81BufferType::NonLinearAccumulation => {
            out.push(
                Check::at_most(
                    speed_subject,
                    Some(v),
                    EN81_ACCUMULATION_MAX_SPEED,
                    en81("5.8.1.5"),
                )
                .note(
                    "Energy-accumulation buffers may only be used up to a rated speed of 1.0 m/s.",
                ),
            );
        }
        En81BufferType::Dissipation => out.push(Check::not_applicable(
            speed_subject,
            Some(v),
            en81("5.8.1.6"),
            "Energy-dissipation buffers may be used at any rated speed.",
        )),
    }
    match case.buffer_type {
        En81BufferType::LinearAccumulation => {
            let quad = EN81_LINEAR_STROKE_COEFF * v * v;
            let req = quad.max(EN81_LINEAR_STROKE_MIN);
            let which = if quad >= EN81_LINEAR_STROKE_MIN {
                "0.135·v² governs (twice the gravity stopping distance from 115 % of rated speed)"
            } else {
                "the 65 mm minimum governs (0.135·v² is smaller)"
            };
            out.push(
                Check::at_least(stroke_subject(), case.stroke, req, en81("5.8.2.1.1"))
                    .note(&format!("Required stroke s ≥ 0.135·v² and ≥ 65 mm: {which}.")),
            );
            out.extend(static_load_checks(case));
        }
        En81BufferType::NonLinearAccumulation => out.push(Check::not_applicable(
            stroke_subject(),
            case.stroke,
            en81("5.8.2.1.2"),
            "Non-linear buffers have no stroke formula: they are verified by type test (retardation, return speed, no permanent deformation).",
        )),
        En81BufferType::Dissipation => {
            let full = EN81_DISSIPATION_STROKE_COEFF * v * v;
            match case.monitored_slowdown_impact_speed {
                Some(vi) if v > EN81_REDUCED_STROKE_SPEED => {
                    out.push(
                        Check::at_least(stroke_subject(), case.stroke, en81_reduced_stroke(vi), en81("5.8.2.2.2"))
                            .note("Reduced stroke with a monitored terminal slowdown: 0.0674·v² with the impact speed in place of the rated speed, and not less than 0.42 m (the impact-speed reading is from a secondary summary; confirm)."),
                    );
                }
                Some(_) => out.push(
                    Check::at_least(stroke_subject(), case.stroke, full, en81("5.8.2.2.1"))
                        .note("The reduced-stroke rule applies only above 2.5 m/s rated speed, so the full stroke 0.0674·v² is required. No 65 mm minimum applies to energy-dissipation buffers."),
                ),
                None => out.push(
                    Check::at_least(stroke_subject(), case.stroke, full, en81("5.8.2.2.1"))
                        .note("Required stroke s ≥ 0.0674·v², the gravity stopping distance from 115 % of rated speed. No 65 mm minimum applies to energy-dissipation buffers."),
                ),
            }
        }
    }
    let clause = match case.buffer_type {
        En81BufferType::LinearAccumulation => None,
        En81BufferType::NonLinearAccumulation => Some("5.8.2.1.2"),
        En81BufferType::Dissipation => Some("5.8.2.2.3"),
    };
    if let Some(clause) = clause {
        out.push(
            Check::at_most(
                Subject::new(
                    "lift.en81.mean_retardation",
                    "Mean retardation on the buffer",
                    ids::IMPACT_MEAN_DECELERATION,
                    Dim::Acceleration,
                ),
                case.stop.mean_deceleration,
                EN81_MEAN_RETARDATION_MAX,
                en81(clause),
            )
            .note("Limit 1 g_n = 9.806 65 m/s²."),
        );
        out.push(time_above_check(
            "lift.en81.time_above_2_5_g",
            "Time with retardation above 2.5 g_n",
            &case.stop,
            EN81_HIGH_RETARDATION,
            EN81_HIGH_RETARDATION_TIME,
            en81(clause),
        ));
    }
    if case.buffer_type == En81BufferType::NonLinearAccumulation {
        out.push(
            Check::at_most(
                Subject::new(
                    "lift.en81.peak_retardation",
                    "Peak retardation on a non-linear buffer",
                    ids::IMPACT_PEAK_DECELERATION,
                    Dim::Acceleration,
                ),
                case.stop.peak_deceleration,
                EN81_NONLINEAR_PEAK_MAX,
                en81("5.8.2.1.2"),
            )
            .note("Limit 6 g_n = 58.84 m/s²."),
        );
        out.push(Check::at_most(
            Subject::new(
                "lift.en81.return_speed",
                "Return speed of the car from a non-linear buffer",
                ids::IMPACT_REBOUND_SPEED,
                Dim::Speed,
            ),
            case.stop.return_speed,
            EN81_NONLINEAR_RETURN_SPEED_MAX,
            en81("5.8.2.1.2"),
        ));
    }
    Ok(out)
}

fn static_load_checks(case: &En81BufferCase) -> Vec<Check> {
    if case.static_force_at_stroke.is_none() && case.moving_mass.is_none() {
        return Vec::new();
    }
    let (lo, hi) = EN81_LINEAR_STATIC_LOAD_FACTORS;
    let subject = |id: &str, label: &str| {
        Subject::new(
            id,
            label,
            input_ids::BUFFER_STATIC_FORCE_AT_STROKE,
            Dim::Force,
        )
    };
    let note = "Static force to compress the buffer through its required stroke must lie between 2.5 and 4 × (P + Q)·g_n.";
    match case.moving_mass {
        Some(m) => vec![
            Check::at_least(
                subject(
                    "lift.en81.static_load_min",
                    "Static force at required stroke (at least 2.5 × (P + Q)·g_n)",
                ),
                case.static_force_at_stroke,
                lo * m * G_N,
                en81("5.8.2.1.1"),
            )
            .note(note),
            Check::at_most(
                subject(
                    "lift.en81.static_load_max",
                    "Static force at required stroke (at most 4 × (P + Q)·g_n)",
                ),
                case.static_force_at_stroke,
                hi * m * G_N,
                en81("5.8.2.1.1"),
            )
            .note(note),
        ],
        None => vec![Check::unknown_limit(
            subject(
                "lift.en81.static_load_min",
                "Static force at required stroke",
            ),
            Comparison::AtLeast,
            case.static_force_at_stroke,
            en81("5.8.2.1.1"),
            "The mass of car plus rated load (P + Q) is needed to form this limit.",
        )],
    }
}

/// Time above a threshold against a maximum time. When the time is not given
/// but the peak is at or below the threshold, the time above is zero.
fn time_above_check(
    id: &str,
    label: &str,
    stop: &BufferStop,
    threshold: f64,
    max_time: f64,
    provenance: Provenance,
) -> Check {
    let inferred = match (stop.time_above_2_5_g, stop.peak_deceleration) {
        (Some(t), _) => Some((t, false)),
        (None, Some(p)) if p <= threshold => Some((0.0, true)),
        _ => None,
    };
    let c = Check::at_most(
        Subject::new(id, label, input_ids::BUFFER_TIME_ABOVE_2_5_G, Dim::Time),
        inferred.map(|(t, _)| t),
        max_time,
        provenance,
    );
    match inferred {
        Some((_, true)) => c.note("No time was given, but the peak retardation does not exceed the threshold, so the time above it is zero."),
        _ => c,
    }
}

fn validate_stop(stop: &BufferStop) -> Result<(), InputError> {
    for (field, x) in [
        ("stop.mean_deceleration", stop.mean_deceleration),
        ("stop.peak_deceleration", stop.peak_deceleration),
        ("stop.time_above_2_5_g", stop.time_above_2_5_g),
        ("stop.return_speed", stop.return_speed),
    ] {
        if let Some(x) = x {
            check::non_negative(field, x)?;
        }
    }
    Ok(())
}

// ---------- US (California Title 8, following ASME A17.1) ----------

/// g used by the US lift rules: 32.2 ft/s² = 9.814 56 m/s² (Cal. T8 §3108, R).
/// 0.08 % above g_n; kept distinct on purpose.
pub const US_G: f64 = 32.2 * us_units::FOOT;
/// Highest average retardation of an oil buffer, m/s² (32.2 ft/s², §3108(a)(1), (b), R).
pub const US_MEAN_RETARDATION_MAX: f64 = US_G;
/// Retardation threshold for the peak-duration rule, m/s² (80.5 ft/s², §3108(b), R).
pub const US_PEAK_THRESHOLD: f64 = 80.5 * us_units::FOOT;
/// Longest duration of retardation above 80.5 ft/s², s (1/25 s, §3108(b), R).
pub const US_PEAK_MAX_TIME: f64 = 1.0 / 25.0;
/// Constant of the gravity stopping distance S = V²/19 320 (in, ft/min),
/// §3108(a)(3), R. 19 320 = 2 × 32.2 × 3600 / 12.
pub const US_GRAVITY_STOP_CONSTANT: f64 = 19_320.0;
/// Elevator speed above which oil buffers are required, m/s (200 ft/min,
/// §3031(a)(3), R).
pub const US_ELEVATOR_SPRING_MAX_SPEED: f64 = 200.0 * us_units::FOOT_PER_MINUTE;
/// Construction-hoist spring buffers: upper speed of each band (ft/min) and
/// minimum stroke (in) (§1604.14(a)(1), (b)(1), R).
pub const US_HOIST_SPRING_BANDS: [(f64, f64); 5] = [
    (100.0, 1.5),
    (150.0, 2.5),
    (200.0, 4.0),
    (250.0, 6.0),
    (300.0, 9.0),
];
/// Hoist spring buffers with a terminal speed limiter: highest speed (ft/min)
/// and stroke (in) (§1604.14, R).
pub const US_HOIST_LIMITER: (f64, f64) = (600.0, 12.0);
/// Hoist spring buffer static load: not solid under 2 ×, solid under 3 ×
/// (car + rated load) (§1604.14(b)(2), R).
pub const US_HOIST_SOLID_FACTORS: (f64, f64) = (2.0, 3.0);

const CAL: &str = "Cal. Code Regs. Title 8";
const ASME_NOTE: &str = "California Title 8 follows ASME A17.1 (buffer rules believed in 2.22.3 spring and 2.22.4 oil buffers; clause numbers from memory).";
const US_G_NOTE: &str = "The US rule takes g = 32.2 ft/s² (9.814 56 m/s²), 0.08 % above g_n = 9.806 65 m/s² used by EN 81-20.";

fn cal(clause: &str) -> Provenance {
    Provenance::new(CAL, clause, SourceStatus::Confirmed)
}

/// Where the US buffer is installed (selects the rule).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum UsInstallation {
    /// Passenger or freight elevator (Elevator Safety Orders, §3031, §3108).
    Elevator,
    /// Construction personnel hoist (§1604.14).
    ConstructionHoist,
}

/// US buffer types.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum UsBufferType {
    /// Spring buffer.
    Spring,
    /// Oil buffer.
    Oil,
}

/// A buffer to check against the US rules.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct UsBufferCase {
    /// Elevator or construction hoist.
    pub installation: UsInstallation,
    /// Spring or oil buffer.
    pub buffer_type: UsBufferType,
    /// Rated speed, m/s.
    pub rated_speed: f64,
    /// Full stroke of the buffer as built, m.
    pub stroke: Option<f64>,
    /// A terminal speed limiter is fitted (hoist spring buffers up to 600 ft/min).
    pub terminal_speed_limiter: bool,
    /// Retardation during a stop from 115 % of rated speed (oil buffers).
    pub stop: BufferStop,
    /// Static force that compresses a hoist spring buffer solid, N.
    pub force_to_solid: Option<f64>,
    /// Mass of the car plus rated load, kg.
    pub car_and_rated_load_mass: Option<f64>,
}

/// Gravity stopping distance from `speed` (m/s), m: S = V²/19 320 with S in
/// inches and V in ft/min (Cal. T8 §3108(a)(3), R), i.e. v²/(2 × 32.2 ft/s²).
pub fn us_gravity_stopping_distance(speed: f64) -> f64 {
    let fpm = speed / us_units::FOOT_PER_MINUTE;
    fpm * fpm / US_GRAVITY_STOP_CONSTANT * us_units::INCH
}

/// Minimum oil-buffer stroke, m: the gravity stopping distance from 115 % of
/// rated speed (Cal. T8 §3108(a)(1), (a)(3), R).
pub fn us_oil_buffer_minimum_stroke(rated_speed: f64) -> f64 {
    us_gravity_stopping_distance(1.15 * rated_speed)
}

/// Minimum stroke of a construction-hoist spring buffer, m (Cal. T8
/// §1604.14(a)(1), (b)(1), R), or `None` where spring buffers are not
/// permitted (above 300 ft/min, or above 600 ft/min with a terminal speed
/// limiter). A speed between two listed bands (e.g. 100.5 ft/min) is put in
/// the higher band, the conservative reading.
pub fn us_hoist_spring_buffer_minimum_stroke(
    rated_speed: f64,
    terminal_speed_limiter: bool,
) -> Option<f64> {
    let fpm = rated_speed / us_units::FOOT_PER_MINUTE;
    let within = |upper: f64| fpm <= upper * (1.0 + super::BOUNDARY_REL_TOL);
    if let Some(&(_, inches)) = US_HOIST_SPRING_BANDS
        .iter()
        .find(|(upper, _)| within(*upper))
    {
        return Some(inches * us_units::INCH);
    }
    let (limiter_speed, limiter_stroke) = US_HOIST_LIMITER;
    (terminal_speed_limiter && within(limiter_speed)).then_some(limiter_stroke * us_units::INCH)
}

/// Checks of a buffer against the US rules (Cal. T8 §3031, §3108, §1604.14).
/// Combinations the confirmed text does not cover (elevator spring-buffer
/// strokes, oil buffers on construction hoists) give NotApplicable checks
/// that say so.
///
/// # Errors
/// Rated speed not positive; a given figure negative or not finite.
pub fn us_checks(case: &UsBufferCase) -> Result<Vec<Check>, InputError> {
    let v = check::positive("rated_speed", case.rated_speed)?;
    validate_stop(&case.stop)?;
    for (field, x) in [
        ("stroke", case.stroke),
        ("force_to_solid", case.force_to_solid),
    ] {
        if let Some(x) = x {
            check::non_negative(field, x)?;
        }
    }
    if let Some(m) = case.car_and_rated_load_mass {
        check::positive("car_and_rated_load_mass", m)?;
    }
    let speed_subject = |id: &str| {
        Subject::new(
            id,
            "Rated speed permitted for this buffer type",
            input_ids::RATED_SPEED,
            Dim::Speed,
        )
    };
    let stroke_subject = || {
        Subject::new(
            "lift.us.stroke",
            "Buffer stroke",
            input_ids::BUFFER_STROKE,
            Dim::Length,
        )
    };
    let mut out = Vec::new();
    match (case.installation, case.buffer_type) {
        (UsInstallation::Elevator, UsBufferType::Spring) => {
            out.push(
                Check::at_most(speed_subject("lift.us.spring_buffer_speed"), Some(v), US_ELEVATOR_SPRING_MAX_SPEED, cal("§3031(a)(3)"))
                    .note("Elevators rated above 200 ft/min (1.016 m/s) need oil buffers.")
                    .note(ASME_NOTE),
            );
            out.push(Check::not_applicable(
                stroke_subject(),
                case.stroke,
                cal("§3031(a)(3)"),
                "Elevator spring-buffer strokes are set in ASME A17.1 (believed 2.22.3, from memory) and are not among the confirmed sources: no stroke check is made.",
            ));
        }
        (UsInstallation::Elevator, UsBufferType::Oil) => {
            out.push(
                Check::at_least(stroke_subject(), case.stroke, us_oil_buffer_minimum_stroke(v), cal("§3108(a)(1), (a)(3)"))
                    .note("Stroke at least the gravity stopping distance from 115 % of rated speed, S = V²/19 320 (in, ft/min).")
                    .note(US_G_NOTE)
                    .note(ASME_NOTE),
            );
            out.push(
                Check::at_most(
                    Subject::new("lift.us.mean_retardation", "Average retardation on the oil buffer", ids::IMPACT_MEAN_DECELERATION, Dim::Acceleration),
                    case.stop.mean_deceleration,
                    US_MEAN_RETARDATION_MAX,
                    cal("§3108(b)"),
                )
                .note("Limit 32.2 ft/s², for any load from rated load down to 150 lb, striking at 115 % of rated speed.")
                .note(US_G_NOTE),
            );
            out.push(
                time_above_check(
                    "lift.us.time_above_80_5",
                    "Time with retardation above 80.5 ft/s²",
                    &case.stop,
                    US_PEAK_THRESHOLD,
                    US_PEAK_MAX_TIME,
                    cal("§3108(b)"),
                )
                .note("Peaks above 80.5 ft/s² (24.536 m/s²) may last at most 1/25 s."),
            );
        }
        (UsInstallation::ConstructionHoist, UsBufferType::Spring) => {
            let (limiter_speed, _) = US_HOIST_LIMITER;
            let max_speed = if case.terminal_speed_limiter {
                limiter_speed
            } else {
                US_HOIST_SPRING_BANDS.last().map_or(0.0, |b| b.0)
            } * us_units::FOOT_PER_MINUTE;
            out.push(
                Check::at_most(speed_subject("lift.us.hoist_spring_buffer_speed"), Some(v), max_speed, cal("§1604.14(a)(1), (b)(1)"))
                    .note("Spring buffers on construction hoists: up to 300 ft/min, or up to 600 ft/min with a terminal speed limiter and a 12 in stroke."),
            );
            match us_hoist_spring_buffer_minimum_stroke(v, case.terminal_speed_limiter) {
                Some(req) => out.push(
                    Check::at_least(stroke_subject(), case.stroke, req, cal("§1604.14(a)(1), (b)(1)"))
                        .note("Minimum stroke by rated-speed band; a speed between two listed bands is put in the higher band."),
                ),
                None => out.push(Check::not_applicable(
                    stroke_subject(),
                    case.stroke,
                    cal("§1604.14(a)(1), (b)(1)"),
                    "Spring buffers are not permitted at this speed, so no stroke applies.",
                )),
            }
            out.extend(solid_checks(case));
        }
        (UsInstallation::ConstructionHoist, UsBufferType::Oil) => out.push(Check::not_applicable(
            stroke_subject(),
            case.stroke,
            cal("§1604.14"),
            "The confirmed hoist rules (§1604.14) cover spring buffers; oil buffers on construction hoists are not covered by the sources Joulewise holds.",
        )),
    }
    Ok(out)
}

fn solid_checks(case: &UsBufferCase) -> Vec<Check> {
    if case.force_to_solid.is_none() && case.car_and_rated_load_mass.is_none() {
        return Vec::new();
    }
    let (lo, hi) = US_HOIST_SOLID_FACTORS;
    let subject = |id: &str, label: &str| {
        Subject::new(id, label, input_ids::BUFFER_FORCE_TO_SOLID, Dim::Force)
    };
    let note = "The buffer must not go solid under 2 × (car + rated load) and must go solid under 3 ×. Weight from mass with g_n (1 lb of mass weighs 1 lbf).";
    match case.car_and_rated_load_mass {
        Some(m) => vec![
            Check::at_least(
                subject(
                    "lift.us.solid_not_under_2x",
                    "Force to compress solid (more than 2 × car + rated load)",
                ),
                case.force_to_solid,
                lo * m * G_N,
                cal("§1604.14(b)(2)"),
            )
            .note(note),
            Check::at_most(
                subject(
                    "lift.us.solid_under_3x",
                    "Force to compress solid (at most 3 × car + rated load)",
                ),
                case.force_to_solid,
                hi * m * G_N,
                cal("§1604.14(b)(2)"),
            )
            .note(note),
        ],
        None => vec![Check::unknown_limit(
            subject("lift.us.solid_not_under_2x", "Force to compress solid"),
            Comparison::AtLeast,
            case.force_to_solid,
            cal("§1604.14(b)(2)"),
            "The mass of car plus rated load is needed to form this limit.",
        )],
    }
}

/// The EN 81-20 lift-buffer limit set for the catalogue.
pub fn en81_limit_set() -> LimitSet {
    let e = |key: &str, q: &str, cmp: Comparison, dim: Dim, clause: &str| {
        LimitEntry::new(key, q, cmp, dim, en81(clause))
    };
    LimitSet {
        id: LimitSetId::LiftBuffersEn81,
        title: "Lift buffers (EN 81-20)".into(),
        documents: vec![EN81.into(), "EN 81-50 (type tests)".into()],
        scope: "Buffers at the bottom of a lift well under the car and counterweight. Earlier numbering (EN 81-1:1998 10.4) is recalled from memory only.".into(),
        explanation: "A lift buffer must stop a car that overruns at up to 115 % of rated speed without throwing the passengers: spring and elastomer buffers only on slow lifts, oil buffers at any speed, enough stroke for the speed, and a mean retardation no more than one g. The values were read in a secondary summary of EN 81-20, not in the standard itself.".into(),
        entries: vec![
            e("accumulation_max_speed", "Energy-accumulation buffers: rated speed", Comparison::AtMost, Dim::Speed, "5.8.1.5").value(EN81_ACCUMULATION_MAX_SPEED).published("1.0 m/s"),
            e("dissipation_any_speed", "Energy-dissipation buffers: rated speed", Comparison::AtMost, Dim::Speed, "5.8.1.6").rule("any rated speed"),
            e("linear_stroke", "Linear buffer stroke", Comparison::AtLeast, Dim::Length, "5.8.2.1.1").rule("s ≥ 0.135·v² (v in m/s, s in m)").note("0.135·v² is twice the gravity stopping distance from 115 % of v."),
            e("linear_stroke_min", "Linear buffer stroke, minimum", Comparison::AtLeast, Dim::Length, "5.8.2.1.1").value(EN81_LINEAR_STROKE_MIN).published("65 mm"),
            e("linear_static_load", "Linear buffer: static load reaching the required stroke", Comparison::AtLeast, Dim::Force, "5.8.2.1.1").rule("2.5 to 4 × (P + Q)·g_n"),
            e("nonlinear_mean", "Non-linear buffer: mean retardation", Comparison::AtMost, Dim::Acceleration, "5.8.2.1.2").value(EN81_MEAN_RETARDATION_MAX).published("1 g_n"),
            e("nonlinear_time_above", "Non-linear buffer: time above 2.5 g_n", Comparison::AtMost, Dim::Time, "5.8.2.1.2").value(EN81_HIGH_RETARDATION_TIME).published("0.04 s"),
            e("nonlinear_peak", "Non-linear buffer: peak retardation", Comparison::AtMost, Dim::Acceleration, "5.8.2.1.2").value(EN81_NONLINEAR_PEAK_MAX).published("6 g_n"),
            e("nonlinear_return_speed", "Non-linear buffer: return speed", Comparison::AtMost, Dim::Speed, "5.8.2.1.2").value(EN81_NONLINEAR_RETURN_SPEED_MAX).published("1 m/s").note("Also no permanent deformation (type test)."),
            e("dissipation_stroke", "Energy-dissipation buffer stroke", Comparison::AtLeast, Dim::Length, "5.8.2.2.1").rule("s ≥ 0.0674·v²").note("Gravity stopping distance from 115 % of v; no 65 mm minimum."),
            e("reduced_stroke_min", "Reduced stroke with monitored slowdown (v > 2.5 m/s)", Comparison::AtLeast, Dim::Length, "5.8.2.2.2").value(EN81_REDUCED_STROKE_MIN).published("0.42 m").rule("0.0674·v_impact², not less than 0.42 m").note("Clause number from the secondary summary."),
            e("dissipation_mean", "Energy-dissipation buffer: mean retardation", Comparison::AtMost, Dim::Acceleration, "5.8.2.2.3").value(EN81_MEAN_RETARDATION_MAX).published("1 g_n"),
            e("dissipation_time_above", "Energy-dissipation buffer: time above 2.5 g_n", Comparison::AtMost, Dim::Time, "5.8.2.2.3").value(EN81_HIGH_RETARDATION_TIME).published("0.04 s"),
        ],
        cautions: vec![crate::cautions::CautionId::ValuesFromSecondarySource],
    }
}

/// The US lift and hoist buffer limit set for the catalogue.
pub fn us_limit_set() -> LimitSet {
    let e = |key: &str, q: &str, cmp: Comparison, dim: Dim, clause: &str| {
        LimitEntry::new(key, q, cmp, dim, cal(clause))
    };
    let mut entries = vec![
        e(
            "gravity_stopping_distance",
            "Gravity stopping distance",
            Comparison::AtLeast,
            Dim::Length,
            "§3108(a)(3)",
        )
        .rule("S = V²/19 320 (S in in, V in ft/min)"),
        e(
            "oil_stroke",
            "Oil buffer stroke (elevators)",
            Comparison::AtLeast,
            Dim::Length,
            "§3108(a)(1)",
        )
        .rule("S at 115 % of rated speed"),
        e(
            "oil_mean",
            "Oil buffer: average retardation",
            Comparison::AtMost,
            Dim::Acceleration,
            "§3108(b)",
        )
        .value(US_MEAN_RETARDATION_MAX)
        .published("32.2 ft/s²")
        .note("For any load from rated load down to 150 lb."),
        e(
            "oil_peak_time",
            "Oil buffer: time above 80.5 ft/s²",
            Comparison::AtMost,
            Dim::Time,
            "§3108(b)",
        )
        .value(US_PEAK_MAX_TIME)
        .published("1/25 s"),
        e(
            "elevator_spring_max_speed",
            "Elevator spring buffers: rated speed (oil above)",
            Comparison::AtMost,
            Dim::Speed,
            "§3031(a)(3)",
        )
        .value(US_ELEVATOR_SPRING_MAX_SPEED)
        .published("200 ft/min"),
    ];
    let mut lower = 0.0;
    for (upper, inches) in US_HOIST_SPRING_BANDS {
        entries.push(
            e(
                &format!("hoist_spring_stroke_{upper}"),
                &format!("Hoist spring buffer stroke, {lower}–{upper} ft/min"),
                Comparison::AtLeast,
                Dim::Length,
                "§1604.14(a)(1), (b)(1)",
            )
            .value(inches * us_units::INCH)
            .published(&format!("{inches} in")),
        );
        lower = upper + 1.0;
    }
    entries.push(
        e(
            "hoist_spring_limiter",
            "Hoist spring buffer with terminal speed limiter, up to 600 ft/min",
            Comparison::AtLeast,
            Dim::Length,
            "§1604.14(a)(1), (b)(1)",
        )
        .value(US_HOIST_LIMITER.1 * us_units::INCH)
        .published("12 in"),
    );
    entries.push(
        e(
            "hoist_spring_solid",
            "Hoist spring buffer: load to go solid",
            Comparison::AtLeast,
            Dim::Force,
            "§1604.14(b)(2)",
        )
        .rule("not solid under 2 × (car + rated load); solid under 3 ×"),
    );
    LimitSet {
        id: LimitSetId::LiftBuffersUs,
        title: "Lift and hoist buffers (US, California Title 8)".into(),
        documents: vec![CAL.into(), "ASME A17.1 (clause numbers 2.22.3, 2.22.4 from memory)".into()],
        scope: "Elevator oil and spring buffers (§3031, §3108) and construction personnel hoist spring buffers (§1604.14). Elevator spring-buffer strokes and oil buffers on hoists are not covered by the confirmed text.".into(),
        explanation: "US rules size the buffer so the car, overrunning at 115 % of rated speed, stops at no more than about one g on average, with only brief peaks above two and a half g. They take g as 32.2 ft/s², slightly above the standard value used in the European rules, so the two give marginally different numbers.".into(),
        entries,
        cautions: Vec::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::Verdict;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;

    /// reference-values.md T23 is printed to 4 significant figures.
    const REL_4SF: f64 = crate::test_tol::REL_PRINTED_4SF;
    /// reference-values.md §4 prints 0.067429 (5 significant figures): half a
    /// unit in the last digit is 5e-7/0.0674 = 7.4e-6 relative.
    const REL_PRINTED_5SF: f64 = 7.5e-6;
    /// EN 81-20 prints 0.0674 (3 significant figures) for (1.15)²/(2 g_n) =
    /// 0.067429: half a unit in the last digit is 0.00005/0.0674 = 7.4e-4 relative.
    const REL_COEFF_0674: f64 = 7.5e-4;
    /// ... and 0.135 for twice that (0.134857): half a unit in the last digit
    /// is 0.0005/0.135 = 3.7e-3 relative.
    const REL_COEFF_135: f64 = 3.8e-3;

    fn en(t: En81BufferType, v: f64, stroke_mm: f64) -> En81BufferCase {
        En81BufferCase {
            buffer_type: t,
            rated_speed: v,
            stroke: Some(stroke_mm * 1e-3),
            monitored_slowdown_impact_speed: None,
            stop: BufferStop::default(),
            static_force_at_stroke: None,
            moving_mass: None,
        }
    }

    fn verdict(checks: &[Check], id: &str) -> Verdict {
        checks.iter().find(|c| c.id == id).unwrap().verdict
    }

    #[test]
    fn en81_coefficients_match_gravity_stopping_distance() {
        // reference-values.md §4 "Constant check" (D): (1.15 v)²/(2 g_n) = 0.067429·v².
        let k = 1.15_f64.powi(2) / (2.0 * G_N);
        assert_relative_eq!(k, 0.067_429, max_relative = REL_PRINTED_5SF);
        assert_relative_eq!(
            EN81_DISSIPATION_STROKE_COEFF,
            k,
            max_relative = REL_COEFF_0674
        );
        assert_relative_eq!(
            EN81_LINEAR_STROKE_COEFF,
            2.0 * k,
            max_relative = REL_COEFF_135
        );
    }

    #[test]
    fn t20_linear_buffer_stroke() {
        // T20, EN 81-20 5.8.2.1.1 (R2): v = 1.0 m/s → 135 mm (134 fails);
        // v = 0.63 m/s → max(53.6, 65) = 65 mm (64 fails).
        let t = En81BufferType::LinearAccumulation;
        assert_relative_eq!(
            en81_required_stroke(t, 1.0).unwrap(),
            0.135,
            max_relative = REL_EXACT
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 1.0, 135.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Pass
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 1.0, 134.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Fail
        );
        assert_relative_eq!(
            en81_required_stroke(t, 0.63).unwrap(),
            0.065,
            max_relative = REL_EXACT
        );
        assert_relative_eq!(
            EN81_LINEAR_STROKE_COEFF * 0.63 * 0.63,
            0.053_581_5,
            max_relative = REL_EXACT
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 0.63, 65.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Pass
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 0.63, 64.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Fail
        );
    }

    #[test]
    fn t21_dissipation_buffer_stroke() {
        // T21, EN 81-20 5.8.2.2.1 (R2): v = 2.5 m/s → 421.25 mm (421 fails,
        // 422 passes); v = 0.63 → 26.8 mm with no 65 mm floor.
        let t = En81BufferType::Dissipation;
        assert_relative_eq!(
            en81_required_stroke(t, 2.5).unwrap(),
            0.421_25,
            max_relative = REL_EXACT
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 2.5, 421.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Fail
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 2.5, 422.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Pass
        );
        assert_relative_eq!(
            en81_required_stroke(t, 0.63).unwrap(),
            0.026_751_06,
            max_relative = REL_EXACT
        );
        assert_eq!(
            verdict(
                &en81_checks(&en(t, 0.63, 27.0)).unwrap(),
                "lift.en81.stroke"
            ),
            Verdict::Pass
        );
    }

    #[test]
    fn t22_speed_applicability() {
        // T22, EN 81-20 5.8.1.5 / 5.8.1.6 (R2): accumulation at 1.2 m/s
        // rejected; dissipation at 2.5 m/s accepted.
        for t in [
            En81BufferType::LinearAccumulation,
            En81BufferType::NonLinearAccumulation,
        ] {
            let c = en81_checks(&en(t, 1.2, 500.0)).unwrap();
            assert_eq!(
                verdict(&c, "lift.en81.buffer_type_for_speed"),
                Verdict::Fail
            );
            let ok = en81_checks(&en(t, 1.0, 500.0)).unwrap();
            assert_eq!(
                verdict(&ok, "lift.en81.buffer_type_for_speed"),
                Verdict::Pass
            );
        }
        let c = en81_checks(&en(En81BufferType::Dissipation, 2.5, 500.0)).unwrap();
        assert_eq!(
            verdict(&c, "lift.en81.buffer_type_for_speed"),
            Verdict::NotApplicable
        );
        assert!(c.iter().all(|c| c.verdict != Verdict::Fail));
    }

    #[test]
    fn reduced_stroke_floor_042_m() {
        // EN 81-20 5.8.2.2.2 (R2): v > 2.5 m/s with monitored slowdown,
        // stroke from the impact speed but ≥ 0.42 m.
        let mut c = en(En81BufferType::Dissipation, 4.0, 420.0);
        c.monitored_slowdown_impact_speed = Some(2.0);
        let checks = en81_checks(&c).unwrap();
        let s = checks.iter().find(|c| c.id == "lift.en81.stroke").unwrap();
        assert_eq!(s.limit, Some(0.42));
        assert_eq!(s.verdict, Verdict::Pass);
        // Not allowed at 2.5 m/s and below: full 0.0674·v² applies.
        let mut slow = en(En81BufferType::Dissipation, 2.5, 420.0);
        slow.monitored_slowdown_impact_speed = Some(1.0);
        let checks = en81_checks(&slow).unwrap();
        assert_eq!(verdict(&checks, "lift.en81.stroke"), Verdict::Fail);
        assert_relative_eq!(
            en81_reduced_stroke(3.0),
            0.0674 * 9.0,
            max_relative = REL_EXACT
        );
    }

    #[test]
    fn t24_retardation_acceptance_en81_and_us() {
        // T24: mean 0.95 g_n with a 3.0 g_n spike lasting 0.03 s passes, 0.05 s
        // fails. EN 81-20 5.8.2.2.3 (R2) and Cal. T8 §3108(b) (R).
        let stop = |t: f64| BufferStop {
            mean_deceleration: Some(0.95 * G_N),
            peak_deceleration: Some(3.0 * G_N),
            time_above_2_5_g: Some(t),
            return_speed: None,
        };
        let mut c = en(En81BufferType::Dissipation, 1.6, 500.0);
        c.stop = stop(0.03);
        let ok = en81_checks(&c).unwrap();
        assert_eq!(verdict(&ok, "lift.en81.mean_retardation"), Verdict::Pass);
        assert_eq!(verdict(&ok, "lift.en81.time_above_2_5_g"), Verdict::Pass);
        c.stop = stop(0.05);
        assert_eq!(
            verdict(&en81_checks(&c).unwrap(), "lift.en81.time_above_2_5_g"),
            Verdict::Fail
        );

        let mut us = UsBufferCase {
            installation: UsInstallation::Elevator,
            buffer_type: UsBufferType::Oil,
            rated_speed: 1.0,
            stroke: Some(0.1),
            terminal_speed_limiter: false,
            stop: stop(0.03),
            force_to_solid: None,
            car_and_rated_load_mass: None,
        };
        let ok = us_checks(&us).unwrap();
        assert_eq!(verdict(&ok, "lift.us.mean_retardation"), Verdict::Pass);
        assert_eq!(verdict(&ok, "lift.us.time_above_80_5"), Verdict::Pass);
        us.stop = stop(0.05);
        assert_eq!(
            verdict(&us_checks(&us).unwrap(), "lift.us.time_above_80_5"),
            Verdict::Fail
        );
        // 1 g_n passes EN exactly at the limit; 32.2 ft/s² is 0.08 % higher.
        assert_relative_eq!(US_MEAN_RETARDATION_MAX, 9.814_56, max_relative = REL_EXACT);
        assert_relative_eq!(US_PEAK_THRESHOLD, 24.536_4, max_relative = REL_EXACT);
        assert_relative_eq!(EN81_HIGH_RETARDATION, 24.516_625, max_relative = REL_EXACT);
    }

    #[test]
    fn time_above_is_zero_when_the_peak_stays_below_2_5_g() {
        let mut c = en(En81BufferType::Dissipation, 1.0, 100.0);
        c.stop.peak_deceleration = Some(2.0 * G_N);
        let checks = en81_checks(&c).unwrap();
        let t = checks
            .iter()
            .find(|c| c.id == "lift.en81.time_above_2_5_g")
            .unwrap();
        assert_eq!(t.value, Some(0.0));
        assert_eq!(t.verdict, Verdict::Pass);
        assert_eq!(
            verdict(&checks, "lift.en81.mean_retardation"),
            Verdict::Unknown
        );
    }

    #[test]
    fn nonlinear_peak_and_return_speed() {
        // EN 81-20 5.8.2.1.2 (R2): peak ≤ 6 g_n, return speed ≤ 1 m/s.
        let mut c = en(En81BufferType::NonLinearAccumulation, 1.0, 80.0);
        c.stop = BufferStop {
            mean_deceleration: Some(0.8 * G_N),
            peak_deceleration: Some(6.0 * G_N),
            time_above_2_5_g: Some(0.02),
            return_speed: Some(1.01),
        };
        let checks = en81_checks(&c).unwrap();
        assert_eq!(
            verdict(&checks, "lift.en81.peak_retardation"),
            Verdict::Pass
        );
        assert_eq!(verdict(&checks, "lift.en81.return_speed"), Verdict::Fail);
        assert_eq!(verdict(&checks, "lift.en81.stroke"), Verdict::NotApplicable);
        c.stop.peak_deceleration = Some(6.1 * G_N);
        assert_eq!(
            verdict(&en81_checks(&c).unwrap(), "lift.en81.peak_retardation"),
            Verdict::Fail
        );
    }

    #[test]
    fn linear_static_load_between_2_5_and_4_times() {
        // EN 81-20 5.8.2.1.1 (R2): 2.5 to 4 × (P + Q), weight with g_n.
        let mut c = en(En81BufferType::LinearAccumulation, 0.5, 70.0);
        c.moving_mass = Some(1000.0);
        c.static_force_at_stroke = Some(3.0 * 1000.0 * G_N);
        let checks = en81_checks(&c).unwrap();
        assert_eq!(verdict(&checks, "lift.en81.static_load_min"), Verdict::Pass);
        assert_eq!(verdict(&checks, "lift.en81.static_load_max"), Verdict::Pass);
        c.static_force_at_stroke = Some(4.1 * 1000.0 * G_N);
        assert_eq!(
            verdict(&en81_checks(&c).unwrap(), "lift.en81.static_load_max"),
            Verdict::Fail
        );
        c.moving_mass = None;
        assert_eq!(
            verdict(&en81_checks(&c).unwrap(), "lift.en81.static_load_min"),
            Verdict::Unknown
        );
    }

    #[test]
    fn t23_us_gravity_stopping_distance() {
        // T23, Cal. T8 §3108(a)(3) (R): V = 200 fpm at 115 % = 230 fpm →
        // S = 230²/19 320 = 2.738 in (g = 32.2). With g_n the SI formula gives
        // 0.067429·(1.016 m/s)² = 69.60 mm = 2.740 in.
        let v = 200.0 * us_units::FOOT_PER_MINUTE;
        let s = us_oil_buffer_minimum_stroke(v);
        assert_relative_eq!(s / us_units::INCH, 2.738, max_relative = REL_4SF);
        assert_relative_eq!(
            s / us_units::INCH,
            230.0 * 230.0 / 19_320.0,
            max_relative = REL_EXACT
        );
        let si = (1.15 * v).powi(2) / (2.0 * G_N);
        assert_relative_eq!(si, 0.069_60, max_relative = REL_4SF);
        assert_relative_eq!(si / us_units::INCH, 2.740, max_relative = REL_4SF);
        // The two differ by the ratio of the g values used (32.2 vs 32.174 ft/s²).
        assert_relative_eq!(si / s, US_G / G_N, max_relative = REL_EXACT);
        let case = UsBufferCase {
            installation: UsInstallation::Elevator,
            buffer_type: UsBufferType::Oil,
            rated_speed: v,
            stroke: Some(2.7 * us_units::INCH),
            terminal_speed_limiter: false,
            stop: BufferStop::default(),
            force_to_solid: None,
            car_and_rated_load_mass: None,
        };
        assert_eq!(
            verdict(&us_checks(&case).unwrap(), "lift.us.stroke"),
            Verdict::Fail
        );
    }

    #[test]
    fn us_hoist_spring_buffer_bands() {
        // Cal. T8 §1604.14(a)(1), (b)(1) (R): ≤ 100 fpm 1½ in; 101–150 2½;
        // 151–200 4; 201–250 6; 251–300 9; above 300 only with a terminal
        // speed limiter, 12 in, up to 600 fpm.
        let fpm = |x: f64| x * us_units::FOOT_PER_MINUTE;
        let inch = |x: f64| Some(x * us_units::INCH);
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(100.0), false),
            inch(1.5)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(101.0), false),
            inch(2.5)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(150.0), false),
            inch(2.5)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(200.0), false),
            inch(4.0)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(250.0), false),
            inch(6.0)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(300.0), false),
            inch(9.0)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(301.0), false),
            None
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(600.0), true),
            inch(12.0)
        );
        assert_eq!(
            us_hoist_spring_buffer_minimum_stroke(fpm(601.0), true),
            None
        );
        let mut case = UsBufferCase {
            installation: UsInstallation::ConstructionHoist,
            buffer_type: UsBufferType::Spring,
            rated_speed: fpm(350.0),
            stroke: Some(0.3),
            terminal_speed_limiter: false,
            stop: BufferStop::default(),
            force_to_solid: Some(2.5 * 1500.0 * G_N),
            car_and_rated_load_mass: Some(1500.0),
        };
        let c = us_checks(&case).unwrap();
        assert_eq!(
            verdict(&c, "lift.us.hoist_spring_buffer_speed"),
            Verdict::Fail
        );
        assert_eq!(verdict(&c, "lift.us.stroke"), Verdict::NotApplicable);
        // §1604.14(b)(2) (R): solid between 2 × and 3 × (car + rated load).
        assert_eq!(verdict(&c, "lift.us.solid_not_under_2x"), Verdict::Pass);
        assert_eq!(verdict(&c, "lift.us.solid_under_3x"), Verdict::Pass);
        case.terminal_speed_limiter = true;
        let c = us_checks(&case).unwrap();
        assert_eq!(
            verdict(&c, "lift.us.hoist_spring_buffer_speed"),
            Verdict::Pass
        );
        assert_eq!(verdict(&c, "lift.us.stroke"), Verdict::Fail); // 0.3 m < 12 in
    }

    #[test]
    fn us_elevator_spring_buffers_only_to_200_fpm() {
        // Cal. T8 §3031(a)(3) (R): oil buffers required above 200 fpm.
        let mut case = UsBufferCase {
            installation: UsInstallation::Elevator,
            buffer_type: UsBufferType::Spring,
            rated_speed: 200.0 * us_units::FOOT_PER_MINUTE,
            stroke: None,
            terminal_speed_limiter: false,
            stop: BufferStop::default(),
            force_to_solid: None,
            car_and_rated_load_mass: None,
        };
        let c = us_checks(&case).unwrap();
        assert_eq!(verdict(&c, "lift.us.spring_buffer_speed"), Verdict::Pass);
        assert_eq!(verdict(&c, "lift.us.stroke"), Verdict::NotApplicable);
        case.rated_speed = 210.0 * us_units::FOOT_PER_MINUTE;
        assert_eq!(
            verdict(&us_checks(&case).unwrap(), "lift.us.spring_buffer_speed"),
            Verdict::Fail
        );
    }

    #[test]
    fn bad_inputs_are_refused() {
        let mut c = en(En81BufferType::Dissipation, 0.0, 100.0);
        assert_eq!(en81_checks(&c).unwrap_err().field, "rated_speed");
        c.rated_speed = 1.0;
        c.stop.mean_deceleration = Some(f64::NAN);
        assert_eq!(en81_checks(&c).unwrap_err().field, "stop.mean_deceleration");
    }
}
