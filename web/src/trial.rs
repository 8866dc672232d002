//! The provisional sheet: one invented mechanism wired straight to the core
//! models, to see and test the sheet's building blocks until the
//! `Scenario -> Report` API drives the real sheet.
//!
//! The mechanism (invented demo data): the sliding guard door of a dough
//! hopper on a fictional bakery line is held open by a latch against a
//! closing spring; released, it slides shut and stops on a rubber end
//! buffer. The core computes everything: the spring's states
//! ([`joulewise_core::spring::states`]), the release and the stroke into the
//! buffer ([`joulewise_core::contact::buffer::release_into_buffer`]), the
//! guard limits ([`joulewise_core::limits::guards`]) and a user limit, the
//! cautions, and a seeded Monte Carlo of the energy released. This module
//! only reads the typed texts, calls those models and arranges the results.

use crate::bind::Binding;
use crate::cautions_panel::CautionsPanel;
use crate::check_row::CheckList;
use crate::field::QuantityField;
use crate::figure_card::FigureGroup;
use crate::plot::line::HLine;
use crate::plot::{
    Axis, HistChart, HistogramPlot, LineChart, LinePlot, MarginOverview, Marker, Series, Shade,
};
use crate::system::DisplaySystem;
use crate::verdict::VerdictBadge;
use joulewise_core::cautions::{cautions_for, AppliedCaution};
use joulewise_core::contact::buffer::{
    release_into_buffer, Buffer, BufferConfig, BufferLaw, ContinuousConfig, Rebound,
};
use joulewise_core::figure::{ids, Figure, Verdict};
use joulewise_core::limits::guards::{guard_checks, GuardCase, GuardKind};
use joulewise_core::limits::user::UserLimit;
use joulewise_core::limits::{worst_verdict, Check, Comparison};
use joulewise_core::mechanism::{
    DirectSpring, Friction, Mechanism, Sense, TranslatingConfig, TranslatingPart,
};
use joulewise_core::release::{HistoryPoint, ReleaseConfig, ReleaseError};
use joulewise_core::scenario::value::{parse_tolerance, Spread, TolText};
use joulewise_core::spring::states::{self, released_between, State, StateRole};
use joulewise_core::spring::{LinearSpec, LinearSpring, Spring, Travel};
use joulewise_core::tolerance::{
    monte_carlo, Distribution, FigureMeta, HistogramSpec, MonteCarloConfig, Tolerance,
    TolerancedInput,
};
use joulewise_core::units::{self, Dim};
use joulewise_core::InputError;
use leptos::prelude::*;

/// A field of the trial sheet: element id, label, kind and bare-number unit.
#[derive(Debug, Clone, Copy)]
pub struct FieldSpec {
    /// Element id of the input.
    pub id: &'static str,
    /// Label.
    pub label: &'static str,
    /// Quantity kind.
    pub dim: Dim,
    /// Unit of a bare number.
    pub unit: &'static str,
}

const fn spec(id: &'static str, label: &'static str, dim: Dim, unit: &'static str) -> FieldSpec {
    FieldSpec {
        id,
        label,
        dim,
        unit,
    }
}

/// The fields, in sheet order.
pub mod fields {
    use super::{spec, Dim, FieldSpec};
    /// Spring rate.
    pub const RATE: FieldSpec = spec("spring-rate", "Spring rate", Dim::LinearRate, "N/mm");
    /// Spring deflection in the latched state.
    pub const LATCHED: FieldSpec = spec(
        "spring-latched",
        "Spring deflection when latched",
        Dim::Length,
        "mm",
    );
    /// Largest admissible deflection.
    pub const MAX: FieldSpec = spec(
        "spring-max",
        "Largest deflection of the spring",
        Dim::Length,
        "mm",
    );
    /// Moving mass.
    pub const MASS: FieldSpec = spec("part-mass", "Mass of the door", Dim::Mass, "kg");
    /// Travel from latch to buffer.
    pub const TRAVEL: FieldSpec = spec(
        "part-travel",
        "Travel from latch to buffer",
        Dim::Length,
        "mm",
    );
    /// Incline of the travel.
    pub const INCLINE: FieldSpec = spec(
        "part-incline",
        "Incline of the travel (uphill +)",
        Dim::Angle,
        "°",
    );
    /// Friction coefficient.
    pub const FRICTION: FieldSpec = spec("part-friction", "Friction coefficient μ", Dim::Ratio, "");
    /// Drive force.
    pub const DRIVE: FieldSpec = spec(
        "part-drive",
        "Drive force towards the buffer",
        Dim::Force,
        "N",
    );
    /// Buffer rate.
    pub const BUFFER_RATE: FieldSpec = spec("buffer-rate", "Buffer rate", Dim::LinearRate, "N/mm");
    /// Buffer stroke.
    pub const BUFFER_STROKE: FieldSpec = spec("buffer-stroke", "Buffer stroke", Dim::Length, "mm");
    /// User limit on the buffer force.
    pub const MOUNT_LIMIT: FieldSpec =
        spec("limit-mount", "Rating of the buffer mount", Dim::Force, "N");
}

/// Everything typed on the trial sheet, as typed.
#[derive(Debug, Clone, PartialEq)]
pub struct TrialInputs {
    /// Spring rate.
    pub rate: String,
    /// Tolerance of the spring rate.
    pub rate_tol: String,
    /// Spread of that tolerance.
    pub rate_spread: Spread,
    /// Deflection when latched.
    pub latched: String,
    /// Tolerance of the latched deflection.
    pub latched_tol: String,
    /// Spread of that tolerance.
    pub latched_spread: Spread,
    /// Largest deflection.
    pub max: String,
    /// Mass.
    pub mass: String,
    /// Travel.
    pub travel: String,
    /// Incline.
    pub incline: String,
    /// Friction coefficient.
    pub friction: String,
    /// Drive force.
    pub drive: String,
    /// Buffer rate.
    pub buffer_rate: String,
    /// Buffer stroke.
    pub buffer_stroke: String,
    /// The door has a protective device that stops or reverses it.
    pub device: bool,
    /// User limit on the buffer force.
    pub mount_limit: String,
}

impl Default for TrialInputs {
    /// The invented hopper door.
    fn default() -> Self {
        Self {
            rate: "0.25 N/mm".into(),
            rate_tol: "±8 %".into(),
            rate_spread: Spread::Normal,
            latched: "180 mm".into(),
            latched_tol: "±3 mm".into(),
            latched_spread: Spread::Uniform,
            max: "220 mm".into(),
            mass: "3.5 kg".into(),
            travel: "150 mm".into(),
            incline: "0°".into(),
            friction: "0.15".into(),
            drive: "0 N".into(),
            buffer_rate: "60 N/mm".into(),
            buffer_stroke: "15 mm".into(),
            device: false,
            mount_limit: "500 N".into(),
        }
    }
}

/// What the core returned for the trial sheet, ready to show.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Outcome {
    /// Spring figures (states).
    pub spring: Vec<Figure>,
    /// Release figures.
    pub release: Vec<Figure>,
    /// Impact figures.
    pub impact: Vec<Figure>,
    /// Tolerance-study figures.
    pub study: Vec<Figure>,
    /// Checks.
    pub checks: Vec<Check>,
    /// Cautions (general ones included).
    pub cautions: Vec<AppliedCaution>,
    /// Force–deflection curve of the spring, SI `(deflection, force)`.
    pub curve: Vec<(f64, f64)>,
    /// Latched and released deflections with their forces, SI.
    pub states: Option<[(f64, f64); 2]>,
    /// Time history from release through the buffer stroke.
    pub history: Vec<HistoryPoint>,
    /// Time of first contact with the buffer, s.
    pub contact_time: Option<f64>,
    /// Histogram of the energy released (tolerance study).
    pub histogram: Option<joulewise_core::tolerance::Histogram>,
    /// P50 and P95 of the energy released, SI.
    pub percentiles: Option<(f64, f64)>,
    /// Problems the models found with inputs that read well: (field id, message).
    pub field_problems: Vec<(String, String)>,
    /// Why the curve is missing.
    pub curve_missing: String,
    /// Why the motion is missing.
    pub motion_missing: String,
    /// Why the study is missing.
    pub study_missing: String,
}

/// Read a field; on failure record `label: message` for the figures that
/// depend on it.
fn read(f: FieldSpec, text: &str, why: &mut Vec<String>) -> Option<f64> {
    match units::parse_quantity(text, f.dim, f.unit) {
        Ok(v) => Some(v),
        Err(e) => {
            why.push(format!("{}: {}", f.label, e.message(f.dim)));
            None
        }
    }
}

/// Field id for a model's field path, so a model's refusal shows at the field.
fn field_for(path: &str) -> Option<FieldSpec> {
    use fields::*;
    Some(match path {
        "spring.rate" => RATE,
        "spring.max_deflection" => MAX,
        "part.mass" => MASS,
        "part.travel" => TRAVEL,
        "part.incline" => INCLINE,
        "part.friction" => FRICTION,
        "part.drive_force" => DRIVE,
        "buffer.law.rate" => BUFFER_RATE,
        "buffer.law.stroke" => BUFFER_STROKE,
        p if p.starts_with("part.spring") || p.starts_with("states") => LATCHED,
        _ => return None,
    })
}

fn placeholders(list: &[(&str, &str, Dim)], why: &[String]) -> Vec<Figure> {
    list.iter()
        .map(|&(id, label, dim)| Figure::missing(id, label, dim, why.to_vec()))
        .collect()
}

const SPRING_FIGS: &[(&str, &str, Dim)] = &[
    (
        ids::ENERGY_STORED_LATCHED,
        "Energy stored when latched",
        Dim::Energy,
    ),
    (
        ids::ENERGY_RELEASED,
        "Energy released from latch to stop",
        Dim::Energy,
    ),
    (
        ids::ENERGY_RESIDUAL,
        "Residual energy on the stop",
        Dim::Energy,
    ),
    (
        ids::SPRING_FORCE_LATCHED,
        "Spring force when latched",
        Dim::Force,
    ),
    (
        ids::SPRING_FORCE_RELEASED,
        "Spring force on the stop",
        Dim::Force,
    ),
];
const RELEASE_FIGS: &[(&str, &str, Dim)] = &[
    (ids::RELEASE_CONTACT_SPEED, "Speed at contact", Dim::Speed),
    (
        ids::RELEASE_KINETIC_ENERGY,
        "Kinetic energy at contact",
        Dim::Energy,
    ),
    (
        ids::RELEASE_TIME_TO_CONTACT,
        "Time from release to contact",
        Dim::Time,
    ),
    (
        ids::CLOSING_FORCE_STATIC,
        "Static force at the closing point",
        Dim::Force,
    ),
];
const IMPACT_FIGS: &[(&str, &str, Dim)] = &[
    (ids::IMPACT_PEAK_FORCE, "Peak force per buffer", Dim::Force),
    (ids::IMPACT_STROKE_USED, "Buffer stroke used", Dim::Length),
    (
        ids::IMPACT_PEAK_DECELERATION,
        "Peak deceleration",
        Dim::Acceleration,
    ),
    (ids::IMPACT_STOP_TIME, "Stopping time", Dim::Time),
];

/// Samples in the tolerance study: enough for a stable P95 of a smooth
/// closed-form figure, few enough to rerun on every keystroke.
const STUDY_SAMPLES: usize = 4000;
/// Bins of the histogram.
const STUDY_BINS: usize = 24;
/// Points on the force–deflection curve (plus the states themselves).
const CURVE_POINTS: usize = 60;
/// Points of the release history (the stroke gets as many again).
const HISTORY_POINTS: usize = 160;

/// Run the core models on the typed inputs.
pub fn compute(inp: &TrialInputs) -> Outcome {
    use fields::*;
    let mut out = Outcome::default();
    let mut spring_why = Vec::new();
    let rate = read(RATE, &inp.rate, &mut spring_why);
    let latched = read(LATCHED, &inp.latched, &mut spring_why);
    let max = read(MAX, &inp.max, &mut spring_why);
    let travel = read(TRAVEL, &inp.travel, &mut spring_why);
    let mut part_why = spring_why.clone();
    let mass = read(MASS, &inp.mass, &mut part_why);
    let incline = read(INCLINE, &inp.incline, &mut part_why);
    let friction = read(FRICTION, &inp.friction, &mut part_why);
    let drive = read(DRIVE, &inp.drive, &mut part_why);
    let buffer_rate = read(BUFFER_RATE, &inp.buffer_rate, &mut part_why);
    let buffer_stroke = read(BUFFER_STROKE, &inp.buffer_stroke, &mut part_why);

    let refuse = |out: &mut Outcome, e: InputError, why: &mut Vec<String>| {
        let f = field_for(&e.field);
        let label = f.map_or(e.field.as_str(), |f| f.label);
        why.push(format!("{label}: {}", e.message()));
        if let Some(f) = f {
            out.field_problems.push((f.id.into(), e.message()));
        }
    };

    // The spring.
    let spring = match (rate, max) {
        (Some(rate), Some(max)) => LinearSpring::new(LinearSpec {
            rate,
            free_length: None,
            max_deflection: Some(max),
            solid_length: None,
        })
        .map_err(|e| refuse(&mut out, e.within("spring"), &mut spring_why))
        .ok(),
        _ => None,
    };
    if spring.is_none() {
        part_why.extend(spring_why.iter().cloned());
    }

    // States: latched, and the door at the buffer (the spring follows the
    // door until it reaches its free length; the door then leaves it).
    let states_at = match (&spring, latched, travel) {
        (Some(s), Some(l), Some(t)) => Some((s, l, (l - t).max(0.0))),
        _ => None,
    };
    match states_at {
        Some((s, l, r)) => {
            let list = [
                State {
                    name: "latched".into(),
                    deflection: l,
                    role: StateRole::Latched,
                },
                State {
                    name: "door at the buffer".into(),
                    deflection: r,
                    role: StateRole::Released,
                },
            ];
            match states::analyse(s, &list) {
                Ok(rep) => {
                    out.spring = rep.figures();
                    out.states = Some([
                        (l, s.force(l, Travel::Loading)),
                        (r, s.force(r, Travel::Unloading)),
                    ]);
                    let top = s.deflection_range().1.max(l);
                    out.curve = (0..=CURVE_POINTS)
                        .map(|i| top * i as f64 / CURVE_POINTS as f64)
                        .chain([l, r])
                        .map(|q| (q, s.force(q, Travel::Loading)))
                        .collect();
                    out.curve.sort_by(|a, b| a.0.total_cmp(&b.0));
                }
                Err(e) => {
                    let mut why = Vec::new();
                    refuse(&mut out, e, &mut why);
                    out.spring = placeholders(SPRING_FIGS, &why);
                    out.curve_missing = why.join("; ");
                    part_why.extend(why);
                }
            }
        }
        None => {
            out.spring = placeholders(SPRING_FIGS, &spring_why);
            out.curve_missing = spring_why.join("; ");
        }
    }

    // The release and the stroke into the buffer.
    let inputs = (
        &spring,
        latched,
        mass,
        travel,
        incline,
        friction,
        drive,
        buffer_rate,
        buffer_stroke,
    );
    let mut motion = None;
    if let (Some(s), Some(l), Some(m), Some(t), Some(a), Some(mu), Some(d), Some(k), Some(st)) =
        inputs
    {
        let part = TranslatingPart::new(TranslatingConfig {
            mass: m,
            spring: Some(DirectSpring {
                spring: s,
                deflection_at_latch: l,
                sense: Sense::Unloads,
                detaches: true,
            }),
            travel: t,
            incline: a,
            friction: Friction::Coefficient(mu),
            damping: 0.0,
            drive_force: d,
            include_spring_mass: false,
        })
        .map_err(|e| refuse(&mut out, e.within("part"), &mut part_why));
        let buffer = Buffer::new(BufferConfig {
            law: BufferLaw::Linear {
                rate: k,
                stroke: st,
            },
            count: 1,
            rebound: Rebound::Elastic,
        })
        .map_err(|e| refuse(&mut out, e.within("buffer"), &mut part_why));
        if let (Ok(part), Ok(buffer)) = (part, buffer) {
            let cfg = ContinuousConfig {
                release: ReleaseConfig {
                    samples: HISTORY_POINTS,
                    ..ReleaseConfig::default()
                },
                buffer_radius: None,
                cycles_per_hour: 0.0,
            };
            match release_into_buffer(&Mechanism::Translating(part), &buffer, &cfg) {
                Ok(ri) => motion = Some(ri),
                Err(ReleaseError::Input(e)) => refuse(&mut out, e, &mut part_why),
                Err(e) => part_why.push(format!("the motion could not be computed: {e}")),
            }
        }
    }
    match &motion {
        Some(ri) => {
            out.release = ri.release.figures();
            out.contact_time = ri.release.reached_contact().then_some(ri.release.time);
            out.history = ri.release.history.clone();
            match &ri.impact {
                Some(imp) => {
                    out.impact = imp.figures();
                    out.history.extend(imp.history.iter().copied());
                }
                None => {
                    out.impact = placeholders(
                        IMPACT_FIGS,
                        &["the door does not reach the buffer (see the release figures)".into()],
                    )
                }
            }
        }
        None => {
            out.release = placeholders(RELEASE_FIGS, &part_why);
            out.impact = placeholders(IMPACT_FIGS, &part_why);
            out.motion_missing = part_why.join("; ");
        }
    }

    // Checks: the guard limits and a limit the user states.
    let all: Vec<Figure> = [&out.spring, &out.release, &out.impact]
        .into_iter()
        .flatten()
        .cloned()
        .collect();
    let value = |id: &str| all.iter().find(|f| f.id == id).and_then(|f| f.value);
    let missing = |id: &str| -> Vec<String> {
        all.iter()
            .find(|f| f.id == id)
            .map(|f| f.missing.clone())
            .unwrap_or_default()
    };
    let case = GuardCase {
        kind: GuardKind::SelfClosing,
        protective_device: inp.device,
        closing_force: value(ids::CLOSING_FORCE_STATIC),
        kinetic_energy: value(ids::RELEASE_KINETIC_ENERGY),
        edge_actuation_force: None,
    };
    match guard_checks(&case) {
        Ok(list) => out.checks.extend(list.into_iter().map(|c| {
            let why = missing(&c.figure);
            c.missing_because(&why)
        })),
        Err(e) => out.motion_missing.push_str(&e.to_string()),
    }
    let mut limit_why = Vec::new();
    if let Some(threshold) = read(MOUNT_LIMIT, &inp.mount_limit, &mut limit_why) {
        let user = UserLimit {
            name: "Peak buffer force against the rating of its mount".into(),
            figure: ids::IMPACT_PEAK_FORCE.into(),
            dim: Dim::Force,
            threshold,
            comparison: Comparison::AtMost,
            source: "Rating of the buffer mount, from the (invented) frame drawing".into(),
        };
        if let Ok(c) = user.check(value(ids::IMPACT_PEAK_FORCE)) {
            let why = missing(ids::IMPACT_PEAK_FORCE);
            out.checks.push(c.missing_because(&why));
        }
    }
    out.cautions = cautions_for(&all, &out.checks);

    // Tolerance study of the energy released (spring rate and latched
    // deflection with their tolerances).
    study(inp, &spring, latched, travel, &mut out);
    out
}

fn tolerance_of(text: &str, spread: Spread, f: FieldSpec) -> Result<Option<Tolerance>, String> {
    let dist = match spread {
        Spread::Uniform => Distribution::Uniform,
        Spread::Normal => Distribution::Normal,
    };
    Ok(parse_tolerance(text, f.dim, f.unit)?.map(|t| match t {
        TolText::Absolute(a) => Tolerance::absolute(a, dist),
        TolText::Relative(r) => Tolerance::relative(r, dist),
    }))
}

fn study(
    inp: &TrialInputs,
    spring: &Option<LinearSpring>,
    latched: Option<f64>,
    travel: Option<f64>,
    out: &mut Outcome,
) {
    use fields::*;
    let meta = [FigureMeta::new(
        ids::ENERGY_RELEASED,
        "Energy released from latch to stop",
        Dim::Energy,
    )];
    let (Some(s), Some(l), Some(t)) = (spring, latched, travel) else {
        out.study_missing = "the spring, its latched deflection and the travel are needed".into();
        return;
    };
    let tol = |text: &str, spread, f: FieldSpec| {
        tolerance_of(text, spread, f).map_err(|e| format!("{}, tolerance: {e}", f.label))
    };
    let (rate_tol, latch_tol) = match (
        tol(&inp.rate_tol, inp.rate_spread, RATE),
        tol(&inp.latched_tol, inp.latched_spread, LATCHED),
    ) {
        (Ok(a), Ok(b)) => (a, b),
        (Err(e), _) | (_, Err(e)) => {
            out.study_missing = e;
            return;
        }
    };
    let none = Tolerance::absolute(0.0, Distribution::Uniform);
    let inputs = [
        TolerancedInput::new("spring.rate", s.spec().rate, rate_tol.unwrap_or(none), true),
        TolerancedInput::new("spring.latched", l, latch_tol.unwrap_or(none), true),
    ];
    let inputs: Result<Vec<_>, _> = inputs.into_iter().collect();
    let inputs = match inputs {
        Ok(v) => v,
        Err(e) => {
            out.study_missing = e.to_string();
            return;
        }
    };
    let max = s.max_deflection();
    let mut model = |x: &[f64], y: &mut [f64]| -> Result<(), InputError> {
        let (Some(&k), Some(&q), Some(slot)) = (x.first(), x.get(1), y.first_mut()) else {
            return Ok(());
        };
        let sp = LinearSpring::new(LinearSpec {
            rate: k,
            free_length: None,
            max_deflection: Some(max.max(q)),
            solid_length: None,
        })?;
        *slot = released_between(&sp, q, (q - t).max(0.0));
        Ok(())
    };
    let cfg = MonteCarloConfig {
        samples: STUDY_SAMPLES,
        histogram: Some(HistogramSpec {
            figure: 0,
            bins: STUDY_BINS,
        }),
        ..MonteCarloConfig::default()
    };
    match monte_carlo(&inputs, 1, cfg, &mut model) {
        Ok(r) => {
            out.study = r.figures(&meta);
            out.percentiles = r
                .figures
                .first()
                .and_then(|f| f.summary.as_ref())
                .map(|s| (s.p50, s.p95));
            out.histogram = r.histogram;
        }
        Err(e) => out.study_missing = e.to_string(),
    }
}

/// The overall verdict of the counted checks, `Unknown` when none counts.
pub fn overall(checks: &[Check]) -> Verdict {
    worst_verdict(checks).unwrap_or(Verdict::Unknown)
}

fn field_problem(outcome: Memo<Outcome>, id: &'static str) -> Signal<Option<String>> {
    Signal::derive(move || {
        outcome.with(|o| {
            o.field_problems
                .iter()
                .find(|(f, _)| f == id)
                .map(|(_, m)| m.clone())
        })
    })
}

/// A binding to one text member of the inputs.
fn bind(
    s: RwSignal<TrialInputs>,
    get: fn(&TrialInputs) -> &String,
    set: fn(&mut TrialInputs) -> &mut String,
) -> Binding<String> {
    Binding::new(
        move || s.with(|i| get(i).clone()),
        move |t| s.update(|i| *set(i) = t),
    )
}

/// Named curves picked from the time history: (legend name, value of a point).
type HistoryCurves = &'static [(&'static str, fn(&HistoryPoint) -> f64)];

/// The provisional sheet.
#[component]
pub fn TrialSheet() -> impl IntoView {
    use fields::*;
    let sys = DisplaySystem::expect();
    let inputs = RwSignal::new(TrialInputs::default());
    let outcome = Memo::new(move |_| compute(&inputs.get()));

    macro_rules! text {
        ($f:ident) => {
            bind(inputs, |i| &i.$f, |i| &mut i.$f)
        };
    }
    let field = move |f: FieldSpec, text: Binding<String>| {
        view! {
            <QuantityField id=f.id label=f.label dim=f.dim unit=f.unit text=text problem=field_problem(outcome, f.id) />
        }
    };
    let rate_spread = Binding::new(
        move || inputs.with(|i| i.rate_spread),
        move |v| inputs.update(|i| i.rate_spread = v),
    );
    let latched_spread = Binding::new(
        move || inputs.with(|i| i.latched_spread),
        move |v| inputs.update(|i| i.latched_spread = v),
    );

    let verdict = Signal::derive(move || outcome.with(|o| overall(&o.checks)));
    let fig = |get: fn(&Outcome) -> &Vec<Figure>| {
        Signal::derive(move || outcome.with(|o| get(o).clone()))
    };
    let checks = Signal::derive(move || outcome.with(|o| o.checks.clone()));
    let cautions = Signal::derive(move || outcome.with(|o| o.cautions.clone()));

    let curve = Signal::derive(move || {
        let s = sys.get();
        outcome.with(|o| {
            let mut c = LineChart::new(
                "Spring force against deflection",
                Axis::new("Deflection", Dim::Length),
                Axis::new("Spring force", Dim::Force),
            );
            c.empty = o.curve_missing.clone();
            if !o.curve.is_empty() {
                c.series.push(Series {
                    name: "spring force (loading)".into(),
                    points: o.curve.clone(),
                });
            }
            if let Some([(ql, fl), (qr, fr)]) = o.states {
                let released = o
                    .spring
                    .iter()
                    .find(|f| f.id == ids::ENERGY_RELEASED)
                    .and_then(|f| f.value)
                    .map(|e| units::format_quantity(e, Dim::Energy, s).to_string())
                    .unwrap_or_else(|| "not computed".into());
                c.shade = Some(Shade {
                    series: 0,
                    from: qr,
                    to: ql,
                    label: format!("energy released, {released}"),
                });
                c.markers.push(Marker {
                    x: qr,
                    y: Some(fr),
                    label: "at the buffer".into(),
                });
                c.markers.push(Marker {
                    x: ql,
                    y: Some(fl),
                    label: "latched".into(),
                });
            }
            c
        })
    });
    let motion = move |title: &'static str, y: Axis, pick: HistoryCurves| {
        Signal::derive(move || {
            outcome.with(|o| {
                let mut c =
                    LineChart::new(title, Axis::new("Time from release", Dim::Time), y.clone());
                c.empty = o.motion_missing.clone();
                for (name, f) in pick {
                    c.series.push(Series {
                        name: (*name).into(),
                        points: o.history.iter().map(|p| (p.time, f(p))).collect(),
                    });
                }
                if let Some(t) = o.contact_time {
                    c.markers.push(Marker {
                        x: t,
                        y: None,
                        label: "contact".into(),
                    });
                }
                c
            })
        })
    };
    let position = motion(
        "Door position against time",
        Axis::new("Position from the latch", Dim::Length),
        &[("position", |p| p.position)],
    );
    let speed = motion(
        "Door speed against time",
        Axis::new("Speed", Dim::Speed),
        &[("speed", |p| p.speed)],
    );
    let force = motion(
        "Forces against time",
        Axis::new("Force", Dim::Force),
        &[
            ("spring force", |p| p.spring_force),
            ("buffer force", |p| p.buffer_force),
        ],
    );
    let force = Signal::derive(move || {
        let mut c = force.get();
        outcome.with(|o| {
            if let Some(limit) = o
                .checks
                .iter()
                .find(|c| c.figure == ids::IMPACT_PEAK_FORCE)
                .and_then(|c| c.limit)
            {
                c.hlines.push(HLine {
                    y: limit,
                    label: "mount rating".into(),
                });
            }
        });
        c
    });
    let histogram = Signal::derive(move || {
        outcome.with(|o| {
            let mut markers = Vec::new();
            if let Some((p50, p95)) = o.percentiles {
                markers.push(Marker {
                    x: p50,
                    y: None,
                    label: "P50".into(),
                });
                markers.push(Marker {
                    x: p95,
                    y: None,
                    label: "P95".into(),
                });
            }
            match &o.histogram {
                Some(h) => HistChart {
                    title: "Energy released across the tolerances".into(),
                    x: Axis::new("Energy released", Dim::Energy),
                    low: h.low,
                    high: h.high,
                    counts: h.counts.clone(),
                    markers,
                    empty: String::new(),
                },
                None => HistChart {
                    title: "Energy released across the tolerances".into(),
                    x: Axis::new("Energy released", Dim::Energy),
                    low: 0.0,
                    high: 0.0,
                    counts: Vec::new(),
                    markers,
                    empty: o.study_missing.clone(),
                },
            }
        })
    });

    view! {
        <div class="sheet">
            <form class="inputs" aria-label="Inputs" on:submit=|ev| ev.prevent_default()>
                <p class="demo-note">
                    "Trial sheet with invented data: the sliding guard door of a dough hopper on a fictional bakery line, "
                    "held open by a latch against a closing spring and stopped by a rubber buffer."
                </p>
                <fieldset class="section">
                    <legend>"The spring"</legend>
                    <QuantityField
                        id=RATE.id label=RATE.label dim=RATE.dim unit=RATE.unit
                        text=text!(rate) tol=text!(rate_tol) spread=rate_spread
                        problem=field_problem(outcome, RATE.id)
                    />
                    <QuantityField
                        id=LATCHED.id label=LATCHED.label dim=LATCHED.dim unit=LATCHED.unit
                        text=text!(latched) tol=text!(latched_tol) spread=latched_spread
                        problem=field_problem(outcome, LATCHED.id)
                    />
                    {field(MAX, text!(max))}
                </fieldset>
                <fieldset class="section">
                    <legend>"What moves"</legend>
                    {field(MASS, text!(mass))}
                    {field(TRAVEL, text!(travel))}
                    {field(INCLINE, text!(incline))}
                    {field(FRICTION, text!(friction))}
                    {field(DRIVE, text!(drive))}
                </fieldset>
                <fieldset class="section">
                    <legend>"The end buffer"</legend>
                    {field(BUFFER_RATE, text!(buffer_rate))}
                    {field(BUFFER_STROKE, text!(buffer_stroke))}
                </fieldset>
                <fieldset class="section">
                    <legend>"Limits"</legend>
                    <label class="check-option" for="guard-device">
                        <input
                            type="checkbox"
                            id="guard-device"
                            prop:checked=move || inputs.with(|i| i.device)
                            on:change=move |ev| {
                                let on = event_target_checked(&ev);
                                inputs.update(|i| i.device = on)
                            }
                        />
                        <span>"The door has a device that stops or reverses it on contact"</span>
                    </label>
                    {field(MOUNT_LIMIT, text!(mount_limit))}
                </fieldset>
            </form>
            <div class="results">
                <section class="summary" aria-labelledby="summary-title">
                    <h2 id="summary-title">"Verdict"</h2>
                    <p id="overall" aria-live="polite"><VerdictBadge verdict=verdict /></p>
                </section>
                <section aria-labelledby="figures-title">
                    <h2 id="figures-title">"Figures"</h2>
                    <FigureGroup title="Spring energy" figures=fig(|o| &o.spring) />
                    <FigureGroup title="Release" figures=fig(|o| &o.release) />
                    <FigureGroup title="Impact on the buffer" figures=fig(|o| &o.impact) />
                </section>
                <section aria-labelledby="checks-title">
                    <h2 id="checks-title">"Checks"</h2>
                    <CheckList checks=checks />
                    <MarginOverview id="plot-margins" checks=checks />
                </section>
                <section aria-labelledby="plots-title">
                    <h2 id="plots-title">"Plots"</h2>
                    <LinePlot id="plot-spring" chart=curve />
                    <LinePlot id="plot-position" chart=position />
                    <LinePlot id="plot-speed" chart=speed />
                    <LinePlot id="plot-force" chart=force />
                </section>
                <section aria-labelledby="study-title">
                    <h2 id="study-title">"Tolerances"</h2>
                    <FigureGroup title="Energy released, tolerance study" figures=fig(|o| &o.study) />
                    <HistogramPlot id="plot-study" chart=histogram />
                </section>
                <CautionsPanel cautions=cautions />
            </div>
        </div>
    }
}
