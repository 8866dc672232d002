//! The one entry point: [`assess`] turns a [`Scenario`] into a [`Report`].
//!
//! Order of work: read the inputs ([`resolve`]), compute the spring states
//! (stored, released and residual energy), release the part (ODE with
//! events) into its contact (buffer stroke on the same clock, or two-body
//! contact with a body region and quasi-static clamping), the closing gap,
//! the buffer sizing, then the checks against every limit set that applies
//! and the cautions those figures and checks call for. Each step runs on
//! what the earlier ones could compute; what cannot be computed stays in the
//! report as a missing figure that names its reason.
//!
//! The tolerance study is separate ([`Study`]): it re-runs the same
//! evaluation thousands of times, so the web runs it in slices while the
//! nominal report is shown at once.

use crate::cautions::cautions_for;
use crate::contact::body::{
    clamping, transient_contact, BodyRegion as BodyModelRegion, Clamping, ClampingOutcome,
    TransientContact, TransientLimits, TransientOutcome,
};
use crate::contact::buffer::{
    impact, release_into_buffer, Buffer, BufferConfig, BufferLaw, ContinuousConfig, ImpactConfig,
    ImpactInput, ImpactOutcome, Rebound,
};
use crate::contact::gap::{closing_gap, ClosingGap, ClosingGeometry};
use crate::error::InputError;
use crate::figure::{ids, Figure, Verdict};
use crate::limits::{self, Check, Comparison};
use crate::mechanism::{
    DirectSpring, Mechanism, RotatingConfig, RotatingPart, SpringMount, Strut, TranslatingConfig,
    TranslatingPart,
};
use crate::ode::SolverConfig;
use crate::release::{release, ReleaseConfig, ReleaseEnd, ReleaseOutcome};
use crate::report::{
    InputLine, Report, SpringCurve, StudyInputLine, StudyLimit, StudyReport, VerdictCounts,
};
use crate::scenario::reader::{InputRecord, Reader};
use crate::scenario::resolve::{
    resolve, BodyModel, BufferModel, ContactModel, GapGeometryModel, LawModel, Model, MountModel,
    PartModel, SpringSetup,
};
use crate::scenario::value::TolText;
use crate::scenario::{Scenario, Spread, SCHEMA_VERSION};
use crate::sizing::{size_buffers, BufferType, MovingBody, SizingInput, SizingOutcome};
use crate::spring::states::{analyse, State, StateRole};
use crate::spring::{Axis, Spring, StatesReport, Travel};
use crate::tolerance::{
    self, Distribution, MonteCarloConfig, MonteCarloRun, Tolerance, TolerancedInput,
    WorstCaseOptions,
};
use crate::units::Dim;
use crate::G_N;
use serde::Serialize;
use sha2::{Digest, Sha256};

/// Why a scenario cannot be assessed at all (as opposed to an input error,
/// which only removes the figures that depend on it).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub enum ScenarioError {
    /// The scenario's format version is not the one this program assesses
    /// (files are migrated on load by `Scenario::from_json`).
    Version {
        /// Version found.
        found: u32,
        /// Version expected.
        expected: u32,
    },
}

impl std::fmt::Display for ScenarioError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Self::Version { found, expected } => write!(
                f,
                "schema_version: this scenario is in format version {found}; this program assesses version {expected} (read files with Scenario::from_json, which migrates them)"
            ),
        }
    }
}

impl std::error::Error for ScenarioError {}

/// How much detail an evaluation keeps.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Detail {
    /// Everything, with time histories for plots.
    Full,
    /// Every figure, check and caution, without plots or sizing (batch runs).
    Summary,
    /// Figures only (tolerance study samples).
    Numbers,
}

/// Number of time-history points kept for the release and again for the
/// stroke: enough for a smooth plot on a tablet, small enough to print.
const HISTORY_POINTS: usize = 150;

/// Integrator settings for the assessment: relative tolerance 1e-8 keeps the
/// integration error far below any input's uncertainty; the step cap bounds
/// the work on a stiff or runaway case (it ends with a typed error).
fn solver(detail: Detail) -> SolverConfig {
    SolverConfig {
        rtol: match detail {
            Detail::Full | Detail::Summary => 1e-8,
            // The study compares samples with each other and with limits;
            // 1e-7 is still far below the spread the tolerances produce.
            Detail::Numbers => 1e-7,
        },
        max_steps: 20_000,
        t_end: 600.0,
        ..SolverConfig::default()
    }
}

/// Everything the physics computed for one evaluation.
#[derive(Default)]
struct Outcome {
    states: Option<Result<StatesReport, InputError>>,
    release: Option<Result<ReleaseOutcome, String>>,
    impact: Option<ImpactOutcome>,
    transient: Option<Result<TransientOutcome, InputError>>,
    clamping: Option<Result<ClampingOutcome, InputError>>,
    gap: Option<Result<ClosingGap, InputError>>,
    sizing: Vec<SizingOutcome>,
    /// The buffer's inputs, each valid, do not make a buffer together (a
    /// preload outside a measured table): an input error for the report.
    buffer_error: Option<InputError>,
    /// Forces at the contact point (hazard point, N): spring, gravity,
    /// drive, friction.
    contact_forces: Option<[f64; 4]>,
    notes: Vec<String>,
}

/// Assess a scenario: the nominal report, without the tolerance study.
///
/// # Errors
/// Only a scenario of another format version; input errors are inside the
/// report.
pub fn assess(s: &Scenario) -> Result<Report, ScenarioError> {
    assess_at(s, Detail::Full)
}

/// Assess without plots (time history, spring curve) and without buffer
/// sizing: the same figures, checks and cautions, for a plant register of
/// thousands of mechanisms.
///
/// # Errors
/// As [`assess`].
pub fn assess_summary(s: &Scenario) -> Result<Report, ScenarioError> {
    assess_at(s, Detail::Summary)
}

fn assess_at(s: &Scenario, detail: Detail) -> Result<Report, ScenarioError> {
    if s.schema_version != SCHEMA_VERSION {
        return Err(ScenarioError::Version {
            found: s.schema_version,
            expected: SCHEMA_VERSION,
        });
    }
    let mut r = Reader::record();
    let model = resolve(s, &mut r);
    let out = evaluate(&model, detail);
    // A buffer whose inputs do not fit together is an input error like any
    // other: beside its field, and the reason its figures are missing.
    let mut errors = r.errors;
    errors.extend(out.buffer_error.clone());
    let mut figures = figures(&model, &out, &errors);
    let checks = checks(&model, &out, &figures);
    add_check_figures(&mut figures, &checks);
    let cautions = cautions_for(&figures, &checks);
    let counts = count(&checks);
    // With no check at all nothing is "within limit": say not applicable.
    let verdict = limits::worst_verdict(&checks).unwrap_or(Verdict::NotApplicable);
    let mut notes = out.notes.clone();
    if let Some(Ok(st)) = &out.states {
        notes.extend(st.notes.iter().cloned());
    }
    let (history, contact_index) = history(&out);
    Ok(Report {
        program: format!("Joulewise {}", crate::VERSION),
        schema_version: s.schema_version,
        scenario_hash: scenario_hash(s),
        identity: s.identity.clone(),
        display_units: s.display_units,
        inputs: r.records.iter().map(input_line).collect(),
        errors,
        figures,
        checks,
        cautions,
        verdict,
        counts,
        notes,
        spring_curve: if detail == Detail::Full {
            spring_curve(&model, &out)
        } else {
            None
        },
        history,
        contact_index,
        states: out.states.and_then(Result::ok),
        sizing: out.sizing,
        identification_comparison: model
            .identification
            .as_ref()
            .zip(model.identification_check.as_ref())
            .map(|(a, b)| crate::identify::compare(a, b)),
        identification_check: model.identification_check,
        identification: model.identification,
        study: None,
    })
}

/// Assess and run the tolerance study in one go (CLI, tests): the study runs
/// when any input carries a tolerance; the Monte Carlo part when the
/// scenario asks for it.
///
/// # Errors
/// As [`assess`].
pub fn assess_with_study(s: &Scenario) -> Result<Report, ScenarioError> {
    let mut report = assess(s)?;
    if let Some(mut study) = Study::new(s, &report) {
        while !study.advance(2_000) {}
        report.study = Some(study.finish());
    }
    Ok(report)
}

/// SHA-256 of the scenario's JSON with the informative SI values left out
/// (hex).
pub fn scenario_hash(s: &Scenario) -> String {
    // A scenario's JSON is a few kilobytes: one allocation of that size
    // instead of a vector grown from nothing.
    let mut json = Vec::with_capacity(4096);
    if serde_json::to_writer(&mut json, s).is_err() {
        // As `to_vec(..).unwrap_or_default()`: unwritable hashes as empty.
        json.clear();
    }
    let digest = Sha256::digest(&json);
    let mut out = String::with_capacity(2 * digest.len());
    for b in digest.iter() {
        for nibble in [b >> 4, b & 0x0f] {
            out.extend(char::from_digit(u32::from(nibble), 16));
        }
    }
    out
}

fn input_line(rec: &InputRecord) -> InputLine {
    InputLine {
        path: rec.path.clone(),
        dim: rec.dim,
        text: rec.text.clone(),
        si: rec.si,
        tolerance: match rec.tol {
            None => String::new(),
            Some(TolText::Relative(f)) => format!("±{} %", crate::units::format_sig(f * 100.0, 4)),
            Some(TolText::Absolute(a)) => format!(
                "±{}",
                crate::units::format_quantity(a, rec.dim, crate::units::UnitSystem::Si)
            ),
        },
    }
}

fn count(checks: &[Check]) -> VerdictCounts {
    let mut c = VerdictCounts::default();
    for ch in checks.iter().filter(|c| !c.informative) {
        match ch.verdict {
            Verdict::Pass => c.pass += 1,
            Verdict::Fail => c.fail += 1,
            Verdict::Unknown => c.unknown += 1,
            Verdict::NotApplicable => c.not_applicable += 1,
        }
    }
    c
}

// ---------------------------------------------------------------- evaluate

/// Build the mechanism borrowing the spring.
fn mechanism<'a>(
    part: &PartModel,
    spring: Option<&'a SpringSetup>,
) -> Result<Mechanism<'a>, InputError> {
    let mount = spring.map(|sp| match sp.mount {
        MountModel::Direct {
            deflection_at_latch,
            sense,
            detaches,
        } => SpringMount::Direct(DirectSpring {
            spring: &sp.spring,
            deflection_at_latch,
            sense,
            detaches,
        }),
        MountModel::Strut {
            frame_point,
            part_radius,
            part_angle,
            free_length,
            mode,
        } => SpringMount::Strut(Strut {
            spring: &sp.spring,
            frame_point,
            part_point_radius: part_radius,
            part_point_angle: part_angle,
            free_length,
            mode,
        }),
    });
    match *part {
        PartModel::Translating {
            mass,
            travel,
            incline,
            friction,
            damping,
            drive_force,
            include_spring_mass,
        } => {
            let direct = match mount {
                None => None,
                Some(SpringMount::Direct(d)) => Some(d),
                Some(SpringMount::Strut(_)) => {
                    return Err(InputError::invalid(
                        "spring.mount.kind",
                        "a sliding part takes a direct mount",
                    ))
                }
            };
            TranslatingPart::new(TranslatingConfig {
                mass,
                spring: direct,
                travel,
                incline,
                friction,
                damping,
                drive_force,
                include_spring_mass,
            })
            .map(Mechanism::Translating)
            .map_err(map_mech_error)
        }
        PartModel::Rotating {
            inertia,
            hinge_tilt,
            cg_angle_at_latch,
            travel,
            friction_torque,
            drive_torque,
            hazard_radius,
        } => RotatingPart::new(RotatingConfig {
            inertia,
            cg_angle_at_latch,
            hinge_tilt,
            spring: mount,
            travel,
            friction_torque,
            damping: 0.0,
            drive_torque,
            hazard_radius,
        })
        .map(Mechanism::Rotating)
        .map_err(map_mech_error),
    }
}

/// Mechanism errors name local fields; place them in the scenario's tree.
fn map_mech_error(mut e: InputError) -> InputError {
    e.field = if let Some(rest) = e.field.strip_prefix("spring.") {
        format!("spring.mount.{rest}")
    } else if e.field == "spring" {
        "spring.model".into()
    } else {
        format!("part.{}", e.field)
    };
    e
}

fn buffer_of(b: &BufferModel) -> Result<Buffer<'_>, InputError> {
    let law = match &b.law {
        LawModel::Linear { rate, stroke } => BufferLaw::Linear {
            rate: *rate,
            stroke: *stroke,
        },
        LawModel::PowerLaw {
            coefficient,
            exponent,
            stroke,
        } => BufferLaw::PowerLaw {
            coefficient: *coefficient,
            exponent: *exponent,
            stroke: *stroke,
        },
        LawModel::Spring { spring, preload } => BufferLaw::Spring {
            spring: spring.as_ref(),
            preload_deflection: *preload,
        },
        LawModel::ConstantForce { force, stroke } => BufferLaw::ConstantForce {
            force: *force,
            stroke: *stroke,
        },
        LawModel::Absorber { stroke, efficiency } => BufferLaw::IdealAbsorber {
            stroke: *stroke,
            efficiency: *efficiency,
        },
        LawModel::Orifice {
            coefficient,
            stroke,
        } => BufferLaw::Orifice {
            coefficient: *coefficient,
            stroke: *stroke,
        },
    };
    Buffer::new(BufferConfig {
        law,
        count: b.count,
        rebound: match b.restitution {
            Some(e) => Rebound::Restitution(e),
            None => Rebound::Elastic,
        },
    })
    // The buffer names its fields `law.…`, `count` and `rebound`; the
    // scenario calls them `contact.law.…`, `contact.count` and
    // `contact.restitution`, and a buffer's spring `contact.law.model`.
    .map_err(|mut e| {
        e.field = match e.field.as_str() {
            "rebound" => "restitution".into(),
            "law.spring" => "law.model".into(),
            _ => e.field,
        };
        e.within("contact")
    })
}

/// Spring deflection (m or rad) of a mount at part position `q`, kept in the
/// spring's range (a detaching spring rests at its free end).
fn deflection_at(sp: &SpringSetup, q: f64) -> f64 {
    let s = match sp.mount {
        MountModel::Direct {
            deflection_at_latch,
            sense,
            ..
        } => deflection_at_latch + sense.slope() * q,
        MountModel::Strut {
            frame_point,
            part_radius,
            part_angle,
            free_length,
            mode,
        } => {
            let strut = Strut {
                spring: &sp.spring,
                frame_point,
                part_point_radius: part_radius,
                part_point_angle: part_angle,
                free_length,
                mode,
            };
            let l = strut.length(q);
            match mode {
                crate::mechanism::StrutMode::Compression => free_length - l,
                crate::mechanism::StrutMode::Extension => l - free_length,
            }
        }
    };
    let (lo, hi) = sp.spring.deflection_range();
    s.clamp(lo, hi)
}

fn part_travel(p: &PartModel) -> f64 {
    match p {
        PartModel::Translating { travel, .. } | PartModel::Rotating { travel, .. } => *travel,
    }
}

fn evaluate(model: &Model, detail: Detail) -> Outcome {
    let mut out = Outcome::default();
    // The gate check reads the force history (time above the residual
    // force), so a summary keeps it when that limit applies.
    let samples = match detail {
        Detail::Full => HISTORY_POINTS,
        Detail::Summary if model.limits.gate.is_some() => HISTORY_POINTS,
        _ => 0,
    };

    // Spring states: latched, released (at the contact position, which
    // needs the part's travel), extras.
    if let Some(sp) = &model.spring {
        let mut states = vec![State {
            name: "Latched".into(),
            deflection: deflection_at(sp, 0.0),
            role: StateRole::Latched,
        }];
        if let Some(part) = &model.part {
            states.push(State {
                name: "Released, on its stop".into(),
                deflection: deflection_at(sp, part_travel(part)),
                role: StateRole::Released,
            });
        }
        for (name, q) in &model.extra_states {
            states.push(State {
                name: name.clone(),
                deflection: *q,
                role: StateRole::Other,
            });
        }
        out.states = Some(analyse(&sp.spring, &states).map_err(|e| e.within("states")));
    }

    // Release, and the stroke into a buffer on the same clock.
    let Some(part) = &model.part else {
        return out;
    };
    if model.spring_given && model.spring.is_none() {
        return out; // the spring is unusable: its errors say why
    }
    let mech = match mechanism(part, model.spring.as_ref()) {
        Ok(m) => m,
        Err(e) => {
            out.release = Some(Err(e.to_string()));
            return out;
        }
    };
    let rcfg = ReleaseConfig {
        solver: solver(detail),
        samples,
    };
    let buffer = match &model.contact {
        ContactModel::Buffer(b) => Some(buffer_of(b)),
        _ => None,
    };
    match buffer {
        Some(Ok(buf)) => {
            let radius = match &model.contact {
                ContactModel::Buffer(b) => b.radius,
                _ => None,
            };
            match release_into_buffer(
                &mech,
                &buf,
                &ContinuousConfig {
                    release: rcfg,
                    buffer_radius: radius,
                    cycles_per_hour: model.cycles_per_hour.unwrap_or(0.0),
                },
            ) {
                Ok(ri) => {
                    out.impact = ri.impact;
                    out.release = Some(Ok(ri.release));
                }
                Err(e) => out.release = Some(Err(e.to_string())),
            }
        }
        Some(Err(e)) => {
            out.release = Some(release(&mech, &rcfg).map_err(|e| e.to_string()));
            out.buffer_error = Some(e);
        }
        None => out.release = Some(release(&mech, &rcfg).map_err(|e| e.to_string())),
    }
    let rel = match &out.release {
        Some(Ok(r)) => r.clone(),
        _ => return out,
    };
    match rel.end {
        ReleaseEnd::Contact => {}
        ReleaseEnd::Stall(st) => out.notes.push(format!(
            "The part stops {} short of the contact point ({}): {}.",
            describe_position(mech.axis(), st.short_of_contact),
            if st.holds {
                "it stays there"
            } else {
                "it then moves back towards the latch"
            },
            st.cause.describe()
        )),
        ReleaseEnd::SpringEndOfStroke { position } => out.notes.push(format!(
            "The attached spring reaches the end of its range {} from the latch, before the contact point: it stops the part there.",
            describe_position(mech.axis(), position)
        )),
    }

    // Forces at the contact point (generalised), turned to the hazard point.
    let engaged = rel.spring_engaged;
    let f = mech.forces(mech.travel(), 1.0, engaged);
    let at_hazard = |x: f64| mech.hazard_force(x);
    out.contact_forces = Some([
        at_hazard(f.spring),
        at_hazard(f.gravity),
        at_hazard(f.drive),
        at_hazard(f.friction),
    ]);

    // Body region: transient contact at the contact speed, then clamping.
    if let ContactModel::Body(b) = &model.contact {
        if rel.reached_contact() {
            out.transient = Some(body_transient(b, &rel, &mech));
        }
        out.clamping = Some(body_clamping(b, &out, model));
    }

    // Closing gap.
    if let Some(g) = &model.gap {
        let geometry = match g.geometry {
            GapGeometryModel::Closed => Some(ClosingGeometry::Closed),
            GapGeometryModel::Clearance(gap) => Some(ClosingGeometry::FixedClearance { gap }),
            GapGeometryModel::BufferStop(gap0) => {
                out.impact.as_ref().map(|imp| ClosingGeometry::BufferStop {
                    gap_at_buffer_contact: gap0,
                    stroke_used: imp.stroke_used,
                })
            }
        };
        out.gap = geometry.map(|g| closing_gap(&g).map_err(|e| e.within("gap")));
    }

    // Buffer sizing for this impact.
    if let (Some(limits), true, Detail::Full) = (&model.sizing, rel.reached_contact(), detail) {
        if let Some(input) = sizing_input(model, &mech, &rel, &out, limits) {
            match size_buffers(&input, &sizing_types(input.impact_speed)) {
                Ok(v) => out.sizing = v,
                Err(e) => out.notes.push(format!("Buffer sizing: {e}")),
            }
        }
    }
    out
}

fn describe_position(axis: Axis, q: f64) -> String {
    match axis {
        Axis::Linear => crate::units::tag(q, Dim::Length),
        Axis::Rotary => crate::units::tag(q, Dim::Angle),
    }
}

/// Buffer types sized, with the parameters the trade commonly assumes when
/// none is given (stated in the sizing figures): elastomer exponent 2,
/// hydraulic absorber efficiency 0.9, orifice damper handing over at 10 % of
/// the impact speed, gas spring progression 1.3 isothermal.
fn sizing_types(v: f64) -> Vec<BufferType> {
    vec![
        BufferType::LinearSpring,
        BufferType::PowerLaw { exponent: 2.0 },
        BufferType::ConstantForce { efficiency: 0.9 },
        BufferType::Orifice {
            residual_speed: 0.1 * v,
        },
        BufferType::GasSpring {
            progression: 1.3,
            polytropic_index: 1.0,
        },
    ]
}

fn sizing_input(
    model: &Model,
    mech: &Mechanism<'_>,
    rel: &ReleaseOutcome,
    out: &Outcome,
    limits: &crate::sizing::SizingLimits,
) -> Option<SizingInput> {
    let forces = out.contact_forces?;
    let radius = match &model.contact {
        ContactModel::Buffer(b) => b.radius,
        _ => None,
    };
    let moving = match model.part.as_ref()? {
        PartModel::Translating { .. } => MovingBody::Translating {
            mass: mech.hazard_mass(rel.spring_engaged),
        },
        PartModel::Rotating { hazard_radius, .. } => MovingBody::Rotating {
            inertia: rel.inertia,
            radius: radius.unwrap_or(*hazard_radius),
        },
    };
    let speed = match (model.part.as_ref()?, radius) {
        (PartModel::Rotating { hazard_radius, .. }, Some(rb)) => {
            rel.hazard_speed() * rb / hazard_radius
        }
        _ => rel.hazard_speed(),
    };
    Some(SizingInput {
        moving,
        impact_speed: speed,
        // The release spring's force at contact is taken as constant over
        // the buffer stroke (short stroke; stated in the notes).
        drive_force: forces[0] + forces[2],
        gravity_force: forces[1],
        friction_force: forces[3],
        cycles_per_hour: model.cycles_per_hour.unwrap_or(0.0),
        limits: *limits,
    })
}

fn region_model(b: &BodyModel) -> Result<BodyModelRegion, InputError> {
    BodyModelRegion::new(
        b.region.label(),
        b.region.mass(),
        b.region.spring_constant(),
    )
}

fn body_transient(
    b: &BodyModel,
    rel: &ReleaseOutcome,
    mech: &Mechanism<'_>,
) -> Result<TransientOutcome, InputError> {
    let region = region_model(b)?;
    let limits = if b.region.transient_contact_permitted() {
        TransientLimits::Permissible {
            max_force: b.region.transient_force(),
            max_pressure: b
                .region
                .transient_pressure(b.specific_area.as_deref())
                .map_err(|e| e.within("contact"))?,
        }
    } else {
        TransientLimits::NotPermissible {
            clause: "ISO/TS 15066:2016, A.3.2".into(),
        }
    };
    transient_contact(&TransientContact {
        part_mass: mech.hazard_mass(rel.spring_engaged),
        relative_speed: rel.hazard_speed(),
        region,
        contact_area: b.area,
        padding: b.padding,
        limits: Some(limits),
    })
    .map_err(|e| e.within("contact"))
}

fn body_clamping(
    b: &BodyModel,
    out: &Outcome,
    model: &Model,
) -> Result<ClampingOutcome, InputError> {
    let region = region_model(b)?;
    let Some([spring, gravity, drive, _friction]) = out.contact_forces else {
        return Err(InputError::invalid(
            "part",
            "the forces at the closing point could not be computed",
        ));
    };
    // The spring's rate at the closing point, along the motion at the hazard
    // point, for direct mounts on a sliding part (a spring relaxing as the
    // body yields lowers the clamping force); otherwise ignored, which is
    // conservative.
    let spring_rate = match (&model.spring, &model.part) {
        (Some(sp), Some(PartModel::Translating { travel, .. })) => match sp.mount {
            MountModel::Direct { .. } => {
                let q = deflection_at(sp, *travel);
                let k = sp.spring.rate(q);
                (k.is_finite() && k >= 0.0).then_some(k)
            }
            MountModel::Strut { .. } => None,
        },
        _ => None,
    };
    clamping(&Clamping {
        spring_force: spring,
        drive_force: drive,
        gravity_force: gravity,
        // Friction that holds the part back is left out: conservative.
        friction_force: 0.0,
        spring_rate,
        region,
        padding: b.padding,
        contact_area: b.area,
    })
    .map_err(|e| e.within("contact"))
}

// ----------------------------------------------------------------- figures

/// Errors whose path starts with one of `prefixes`, as reasons.
fn reasons(errors: &[InputError], prefixes: &[&str]) -> Vec<String> {
    errors
        .iter()
        .filter(|e| prefixes.iter().any(|p| e.field.starts_with(p)))
        .map(ToString::to_string)
        .collect()
}

fn missing_all(ids: &[(&str, &str, Dim)], why: &[String]) -> Vec<Figure> {
    ids.iter()
        .map(|(id, label, dim)| Figure::missing(id, label, *dim, why.to_vec()))
        .collect()
}

const SPRING_FIGURES: &[(&str, &str, Dim)] = &[
    (
        ids::ENERGY_STORED_LATCHED,
        "Energy stored, latched",
        Dim::Energy,
    ),
    (
        ids::ENERGY_RELEASED,
        "Energy released on release",
        Dim::Energy,
    ),
    (ids::ENERGY_RESIDUAL, "Energy left on the stop", Dim::Energy),
    (
        ids::SPRING_FORCE_LATCHED,
        "Spring force, latched",
        Dim::Force,
    ),
];

const RELEASE_FIGURES: &[(&str, &str, Dim)] = &[
    (ids::RELEASE_CONTACT_SPEED, "Speed at contact", Dim::Speed),
    (
        ids::RELEASE_KINETIC_ENERGY,
        "Kinetic energy at contact",
        Dim::Energy,
    ),
    (ids::RELEASE_TIME_TO_CONTACT, "Time to contact", Dim::Time),
];

const IMPACT_FIGURES: &[(&str, &str, Dim)] = &[
    (ids::IMPACT_PEAK_FORCE, "Peak buffer force", Dim::Force),
    (ids::IMPACT_STROKE_USED, "Buffer stroke used", Dim::Length),
    (
        ids::IMPACT_PEAK_DECELERATION,
        "Peak deceleration",
        Dim::Acceleration,
    ),
    (
        ids::IMPACT_MEAN_DECELERATION,
        "Mean deceleration",
        Dim::Acceleration,
    ),
];

const BODY_FIGURES: &[(&str, &str, Dim)] = &[
    (
        ids::BODY_TRANSIENT_FORCE,
        "Peak contact force on the body",
        Dim::Force,
    ),
    (
        ids::BODY_TRANSFER_ENERGY,
        "Energy transferred to the body",
        Dim::Energy,
    ),
    (
        ids::BODY_TRANSIENT_PRESSURE,
        "Peak contact pressure",
        Dim::Pressure,
    ),
];

const CLAMP_FIGURES: &[(&str, &str, Dim)] = &[
    (
        ids::BODY_CLAMPING_FORCE,
        "Clamping force at rest",
        Dim::Force,
    ),
    (
        ids::BODY_CLAMPING_PRESSURE,
        "Clamping pressure at rest",
        Dim::Pressure,
    ),
];

fn figures(model: &Model, out: &Outcome, errors: &[InputError]) -> Vec<Figure> {
    let mut f = Vec::new();
    let upstream = reasons(errors, &["part", "spring"]);

    // Spring and states: they need the spring; the released state also needs
    // the part's travel.
    match &out.states {
        Some(Ok(st)) => {
            let part_why = reasons(errors, &["part"]);
            f.extend(st.figures().into_iter().map(|mut fig| {
                if fig.value.is_none() && model.part.is_none() && !part_why.is_empty() {
                    fig.missing = part_why.clone();
                }
                fig
            }));
        }
        Some(Err(e)) => f.extend(missing_all(SPRING_FIGURES, &[e.to_string()])),
        None if model.spring_given => {
            let mut why = reasons(errors, &["spring", "states"]);
            if why.is_empty() {
                why.push("the spring could not be read".into());
            }
            f.extend(missing_all(SPRING_FIGURES, &why));
        }
        None => {}
    }

    // Release.
    let release_why: Vec<String> = match &out.release {
        Some(Ok(rel)) => {
            // The stall position is a figure only when the part stalls.
            f.extend(
                rel.figures()
                    .into_iter()
                    .filter(|x| x.id != ids::RELEASE_STALL_POSITION || x.value.is_some()),
            );
            if rel.reached_contact() {
                Vec::new()
            } else {
                vec!["the part does not reach the contact point (see the release notes)".into()]
            }
        }
        Some(Err(e)) => {
            let why = vec![format!("the release could not be computed: {e}")];
            f.extend(missing_all(RELEASE_FIGURES, &why));
            why
        }
        None => {
            let mut why = upstream.clone();
            if why.is_empty() {
                why.push("what moves could not be read".into());
            }
            f.extend(missing_all(RELEASE_FIGURES, &why));
            why
        }
    };

    // Contact.
    match &model.contact {
        ContactModel::Buffer(_) => match &out.impact {
            Some(imp) => f.extend(imp.figures()),
            None => {
                let mut why = reasons(errors, &["contact"]);
                why.extend(release_why.iter().cloned());
                f.extend(missing_all(IMPACT_FIGURES, &why));
            }
        },
        ContactModel::Body(_) => {
            match &out.transient {
                Some(Ok(t)) => f.extend(t.figures()),
                Some(Err(e)) => f.extend(missing_all(BODY_FIGURES, &[e.to_string()])),
                None => f.extend(missing_all(BODY_FIGURES, &release_why)),
            }
            match &out.clamping {
                Some(Ok(c)) => f.extend(c.figures()),
                Some(Err(e)) => f.extend(missing_all(CLAMP_FIGURES, &[e.to_string()])),
                None => f.extend(missing_all(CLAMP_FIGURES, &release_why)),
            }
        }
        ContactModel::Invalid => {
            let why = reasons(errors, &["contact"]);
            f.extend(missing_all(IMPACT_FIGURES, &why));
        }
        ContactModel::None => {}
    }

    // Gap.
    if model.gap.is_some() || !reasons(errors, &["gap"]).is_empty() {
        match &out.gap {
            Some(Ok(g)) => f.push(g.figure()),
            Some(Err(e)) => f.push(Figure::missing(
                ids::GAP_CLOSING_GAP,
                "Gap left at the closing point",
                Dim::Length,
                vec![e.to_string()],
            )),
            None => {
                let mut why = reasons(errors, &["gap"]);
                if why.is_empty() {
                    why.push("the buffer stroke used is not known".into());
                    why.extend(release_why.iter().cloned());
                }
                f.push(Figure::missing(
                    ids::GAP_CLOSING_GAP,
                    "Gap left at the closing point",
                    Dim::Length,
                    why,
                ));
            }
        }
    }

    // A heat load needs the cycle rate: an unusable entry removes it.
    if model.cycles_per_hour.is_none() {
        let why = reasons(errors, &["cycles_per_hour"]);
        for fig in f.iter_mut().filter(|x| x.id == ids::IMPACT_HEAT_LOAD) {
            fig.value = None;
            fig.missing = why.clone();
        }
    }

    // Sizing figures stay in `Report::sizing`, one outcome per buffer type
    // (their ids repeat per type, so they are not mixed in here).
    if let Some(est) = &model.identification {
        let mut fig = Figure::new(
            crate::identify::ids::IDENTIFY_RATE,
            "Spring rate identified in the field",
            Dim::LinearRate,
            est.rate.value,
        )
        .method(&est.formula)
        .source("GUM first-order propagation (JCGM 100:2008, 5.1.2)");
        fig.assumptions.push(format!(
            "standard uncertainty {} ({} %)",
            crate::units::tag(est.rate.standard_uncertainty, Dim::LinearRate),
            crate::units::format_sig(est.rate.relative() * 100.0, 3)
        ));
        fig.assumptions.extend(est.notes.iter().cloned());
        f.push(fig);
        for (freq, of) in est.frequency.iter().map(|q| (q, est)).chain(
            model
                .identification_check
                .iter()
                .filter_map(|c| c.frequency.as_ref().map(|q| (q, c))),
        ) {
            let (method, label) = match of.method {
                crate::identify::Method::StaticSag => (
                    "f = (1/2π)·√(g/δ) ≈ 15.76/√(δ in mm) Hz (SDOF theory)",
                    "Natural frequency of the test mass, from the sag",
                ),
                _ => (
                    "f = N/t (oscillations timed)",
                    "Natural frequency of the test mass, as timed",
                ),
            };
            let mut fig = Figure::new(
                crate::identify::ids::IDENTIFY_NATURAL_FREQUENCY,
                label,
                Dim::Frequency,
                freq.value,
            )
            .method(method)
            .source("GUM first-order propagation (JCGM 100:2008, 5.1.2)")
            .assume(&format!(
                "standard uncertainty {}",
                crate::units::tag(freq.standard_uncertainty, Dim::Frequency)
            ))
            .assume("the static and the timed frequencies of the same mass should agree: a quick check of either method");
            if !std::ptr::eq(of, est) {
                fig.id = format!("{}_check", crate::identify::ids::IDENTIFY_NATURAL_FREQUENCY);
            }
            f.push(fig);
        }
        if let Some(check) = &model.identification_check {
            let mut fig = Figure::new(
                crate::identify::ids::IDENTIFY_RATE_CHECK,
                "Spring rate by the cross-check method",
                Dim::LinearRate,
                check.rate.value,
            )
            .method(&check.formula)
            .source("GUM first-order propagation (JCGM 100:2008, 5.1.2)")
            .assume(&format!("method: {}", check.method.describe()))
            .assume(&check.rate.budget_line())
            .assume("a cross-check only: the figures above use the first method's rate");
            fig.assumptions.extend(check.notes.iter().cloned());
            f.push(fig);
            let comparison = crate::identify::compare(est, check);
            if comparison.normalized_error.is_finite() {
                f.extend(comparison.figures());
            }
        }
    }
    f
}

/// The value of figure `id` as [`figures`] reports it (the numbers only,
/// from each outcome's `figure_value`, the same function its figures take
/// their values from), without building the figures: the tolerance study
/// reads thousands of samples this way. Each id belongs to one outcome, so
/// the first outcome that has it answers; a figure that is missing gives
/// `None`, as in the report.
fn value_of(model: &Model, out: &Outcome, id: &str) -> Option<f64> {
    let states = || match &out.states {
        Some(Ok(st)) => st.figure_value(id),
        _ => None,
    };
    let release = || match &out.release {
        Some(Ok(rel)) => rel.figure_value(id),
        _ => None,
    };
    let contact = || match &model.contact {
        ContactModel::Buffer(_) => out.impact.as_ref().and_then(|i| i.figure_value(id)),
        ContactModel::Body(_) => {
            let transient = match &out.transient {
                Some(Ok(t)) => t.figure_value(id),
                _ => None,
            };
            transient.or_else(|| match &out.clamping {
                Some(Ok(c)) => c.figure_value(id),
                _ => None,
            })
        }
        ContactModel::Invalid | ContactModel::None => None,
    };
    let gap = || match &out.gap {
        Some(Ok(g)) if model.gap.is_some() => g.figure_value(id),
        _ => None,
    };
    let identified = || match &model.identification {
        Some(est) if id == crate::identify::ids::IDENTIFY_RATE => {
            Some(est.rate.value).filter(|v| v.is_finite())
        }
        _ => None,
    };
    states()
        .or_else(release)
        .or_else(contact)
        .or_else(gap)
        .or_else(identified)
}

/// Checks produce some figures of their own (e.g. deceleration at 20 % of a
/// crane's rated speed); nothing to add yet beyond the checks themselves.
fn add_check_figures(_figures: &mut [Figure], _checks: &[Check]) {}

// ------------------------------------------------------------------ checks

fn value(figures: &[Figure], id: &str) -> Option<f64> {
    figures.iter().find(|f| f.id == id).and_then(|f| f.value)
}

fn checks(model: &Model, out: &Outcome, figures: &[Figure]) -> Vec<Check> {
    let mut c = Vec::new();
    let push = |c: &mut Vec<Check>, r: Result<Vec<Check>, InputError>| match r {
        Ok(v) => c.extend(v),
        Err(e) => c.push(Check::not_applicable(
            limits::Subject::new("limits.error", "Limit check", "", Dim::Ratio),
            None,
            crate::figure::Provenance::new("Joulewise", "", crate::figure::SourceStatus::Derived),
            &e.to_string(),
        )),
    };
    let l = &model.limits;

    if let Some((kind, device)) = l.guard {
        push(
            &mut c,
            limits::guards::guard_checks(&limits::guards::GuardCase {
                kind,
                protective_device: device,
                closing_force: value(figures, ids::CLOSING_FORCE_STATIC),
                kinetic_energy: value(figures, ids::RELEASE_KINETIC_ENERGY),
                edge_actuation_force: None,
            }),
        );
    }

    if let (ContactModel::Body(b), true) = (&model.contact, l.body_region) {
        push(
            &mut c,
            limits::body::body_checks(&limits::body::BodyContactCase {
                region: b.region,
                specific_area: b.specific_area.clone(),
                transient: true,
                quasi_static: true,
                transient_force: value(figures, ids::BODY_TRANSIENT_FORCE),
                transient_pressure: value(figures, ids::BODY_TRANSIENT_PRESSURE),
                transfer_energy: value(figures, ids::BODY_TRANSFER_ENERGY),
                clamping_force: value(figures, ids::BODY_CLAMPING_FORCE),
                clamping_pressure: value(figures, ids::BODY_CLAMPING_PRESSURE),
            }),
        );
    }

    if let Some(g) = &model.gap {
        push(
            &mut c,
            limits::gaps::gap_checks(&g.parts, value(figures, ids::GAP_CLOSING_GAP)),
        );
    }

    let buffer = match &model.contact {
        ContactModel::Buffer(b) => Some(b),
        _ => None,
    };
    let mass = match &model.part {
        Some(PartModel::Translating { mass, .. }) => Some(*mass),
        _ => None,
    };
    let incline = match &model.part {
        Some(PartModel::Translating { incline, .. }) => *incline,
        _ => 0.0,
    };

    if let Some((buffer_type, rated)) = l.en81 {
        let stop = buffer.zip(mass).and_then(|(b, m)| {
            stop_at(
                b,
                m,
                1.15 * rated,
                incline,
                model.cycles_per_hour.unwrap_or(0.0),
            )
        });
        push(
            &mut c,
            limits::lift::en81_checks(&limits::lift::En81BufferCase {
                buffer_type,
                rated_speed: rated,
                stroke: buffer.and_then(stroke_of),
                monitored_slowdown_impact_speed: None,
                stop: stop.unwrap_or_default(),
                static_force_at_stroke: buffer.and_then(force_at_full_stroke),
                moving_mass: mass,
            }),
        );
    }
    if let Some((installation, buffer_type, rated, limiter)) = l.us {
        let stop = buffer.zip(mass).and_then(|(b, m)| {
            stop_at(
                b,
                m,
                1.15 * rated,
                incline,
                model.cycles_per_hour.unwrap_or(0.0),
            )
        });
        push(
            &mut c,
            limits::lift::us_checks(&limits::lift::UsBufferCase {
                installation,
                buffer_type,
                rated_speed: rated,
                stroke: buffer.and_then(stroke_of),
                terminal_speed_limiter: limiter,
                stop: stop.unwrap_or_default(),
                force_to_solid: buffer.and_then(force_at_full_stroke),
                car_and_rated_load_mass: mass,
            }),
        );
    }
    if let Some((travel, rated)) = l.crane {
        let decel_speed = limits::crane::deceleration_check_speed(travel, rated);
        let energy_speed = limits::crane::energy_check_speed(travel, rated);
        let (decel, capacity) = match buffer.zip(mass) {
            Some((b, m)) => (
                impact_at(b, m, decel_speed, 0.0, 0.0).map(|i| i.mean_deceleration()),
                capacity_at(b, m, energy_speed),
            ),
            None => (None, None),
        };
        push(
            &mut c,
            limits::crane::crane_bumper_checks(&limits::crane::CraneBumperCase {
                travel,
                rated_speed: rated,
                mass_excluding_load: mass.unwrap_or(0.0),
                bumper_energy_capacity: capacity,
                mean_deceleration: decel,
            }),
        );
    }
    if let Some(gap_width) = l.gate {
        let dynamic = value(figures, ids::IMPACT_PEAK_FORCE)
            .or_else(|| value(figures, ids::BODY_TRANSIENT_FORCE));
        let residual = value(figures, ids::BODY_CLAMPING_FORCE)
            .or_else(|| value(figures, ids::CLOSING_FORCE_STATIC).map(|x| x.max(0.0)));
        push(
            &mut c,
            limits::gates::gate_checks(&limits::gates::GateForceCase {
                gap_width,
                dynamic_force: dynamic,
                time_above_residual: out
                    .impact
                    .as_ref()
                    .filter(|i| !i.history.is_empty())
                    .map(|i| time_force_above(i, 150.0)),
                residual_force: residual,
                end_force: None,
            }),
        );
    }
    for u in &l.user {
        push(&mut c, u.check_figures(figures).map(|c| vec![c]));
    }
    c
}

/// Time the buffer force exceeds `threshold` (N) during the stroke, from
/// the sampled history with linear interpolation at the crossings (s).
fn time_force_above(imp: &ImpactOutcome, threshold: f64) -> f64 {
    let h = &imp.history;
    let mut total = 0.0;
    for w in h.windows(2) {
        let [a, b] = w else { continue };
        let (fa, fb) = (a.buffer_force - threshold, b.buffer_force - threshold);
        let dt = b.time - a.time;
        if dt.is_nan() || dt <= 0.0 {
            continue;
        }
        total += match (fa > 0.0, fb > 0.0) {
            (true, true) => dt,
            (false, false) => 0.0,
            (true, false) => dt * fa / (fa - fb),
            (false, true) => dt * fb / (fb - fa),
        };
    }
    total
}

fn stroke_of(b: &BufferModel) -> Option<f64> {
    match &b.law {
        LawModel::Linear { stroke, .. }
        | LawModel::PowerLaw { stroke, .. }
        | LawModel::ConstantForce { stroke, .. }
        | LawModel::Absorber { stroke, .. }
        | LawModel::Orifice { stroke, .. } => Some(*stroke),
        LawModel::Spring { spring, preload } => Some(spring.deflection_range().1 - preload),
    }
}

/// Static force of all the buffers at the end of their stroke (N), where a
/// force law defines one.
fn force_at_full_stroke(b: &BufferModel) -> Option<f64> {
    let n = f64::from(b.count);
    match &b.law {
        LawModel::Linear { rate, stroke } => Some(n * rate * stroke),
        LawModel::PowerLaw {
            coefficient,
            exponent,
            stroke,
        } => Some(n * coefficient * stroke.powf(*exponent)),
        LawModel::Spring { spring, .. } => {
            Some(n * spring.force(spring.deflection_range().1, Travel::Loading))
        }
        LawModel::ConstantForce { force, .. } => Some(n * force),
        LawModel::Absorber { .. } | LawModel::Orifice { .. } => None,
    }
}

fn impact_at(
    b: &BufferModel,
    mass: f64,
    speed: f64,
    incline: f64,
    cycles_per_hour: f64,
) -> Option<ImpactOutcome> {
    let buf = buffer_of(b).ok()?;
    impact(
        &ImpactInput {
            mass,
            speed,
            drive_force: 0.0,
            incline,
            friction_force: 0.0,
            cycles_per_hour,
        },
        &buf,
        &ImpactConfig {
            solver: solver(Detail::Full),
            samples: 0,
        },
    )
    .ok()
}

/// The stop a lift rule prescribes: the car (part mass) striking the buffer
/// at `speed` with gravity along its travel.
fn stop_at(
    b: &BufferModel,
    mass: f64,
    speed: f64,
    incline: f64,
    cycles_per_hour: f64,
) -> Option<limits::lift::BufferStop> {
    let imp = impact_at(b, mass, speed, incline, cycles_per_hour)?;
    Some(limits::lift::BufferStop {
        mean_deceleration: Some(imp.mean_deceleration()),
        peak_deceleration: Some(imp.peak_deceleration),
        time_above_2_5_g: Some(imp.time_above_deceleration(2.5 * G_N)),
        return_speed: imp.rebound_speed(),
    })
}

/// Energy the bumper absorbs stopping `mass` from `speed` (J): all of it
/// when the stroke suffices, otherwise what it took before bottoming.
fn capacity_at(b: &BufferModel, mass: f64, speed: f64) -> Option<f64> {
    let imp = impact_at(b, mass, speed, 0.0, 0.0)?;
    Some(imp.energy_per_cycle)
}

// ------------------------------------------------------------ plots, study

fn history(out: &Outcome) -> (Vec<crate::release::HistoryPoint>, Option<usize>) {
    let mut h = Vec::new();
    let mut contact = None;
    if let Some(Ok(rel)) = &out.release {
        h.extend(rel.history.iter().copied());
        if let Some(imp) = &out.impact {
            contact = Some(h.len());
            h.extend(imp.history.iter().copied());
        }
    }
    (h, contact)
}

/// Points on each branch of the spring curve for the plot.
const CURVE_POINTS: usize = 61;

fn spring_curve(model: &Model, out: &Outcome) -> Option<SpringCurve> {
    let sp = model.spring.as_ref()?;
    let st = match &out.states {
        Some(Ok(st)) => st,
        _ => return None,
    };
    let (lo, hi) = sp.spring.deflection_range();
    let q_max_state = st
        .states
        .iter()
        .map(|s| s.deflection)
        .fold(0.0_f64, f64::max);
    let top = if hi.is_finite() {
        hi.min((q_max_state * 1.15).max(q_max_state + (hi - lo) * 0.05))
    } else {
        q_max_state * 1.15
    };
    let bottom = lo.max(0.0).min(top);
    if top.is_nan() || top <= bottom {
        return None;
    }
    let branch = |t: Travel| -> Vec<[f64; 2]> {
        (0..CURVE_POINTS)
            .map(|i| {
                let q = bottom + (top - bottom) * i as f64 / (CURVE_POINTS - 1) as f64;
                [q, sp.spring.force(q, t)]
            })
            .collect()
    };
    let loading = branch(Travel::Loading);
    let unloading = branch(Travel::Unloading);
    let differs = loading
        .iter()
        .zip(&unloading)
        .any(|(a, b)| (a[1] - b[1]).abs() > 1e-9 * a[1].abs().max(1.0));
    Some(SpringCurve {
        axis: sp.spring.axis(),
        loading,
        unloading: differs.then_some(unloading),
        states: st
            .states
            .iter()
            .map(|s| (s.name.clone(), s.deflection))
            .collect(),
        latched: st
            .latched
            .and_then(|i| st.states.get(i))
            .map(|s| s.deflection),
        released: st
            .released
            .and_then(|i| st.states.get(i))
            .map(|s| s.deflection),
    })
}

/// Figures the tolerance study follows when the nominal report has them.
const STUDY_FIGURES: &[&str] = &[
    ids::ENERGY_STORED_LATCHED,
    ids::ENERGY_RELEASED,
    ids::ENERGY_RESIDUAL,
    ids::SPRING_FORCE_LATCHED,
    ids::RELEASE_CONTACT_SPEED,
    ids::RELEASE_KINETIC_ENERGY,
    ids::RELEASE_TIME_TO_CONTACT,
    ids::CLOSING_FORCE_STATIC,
    ids::IMPACT_PEAK_FORCE,
    ids::IMPACT_STROKE_USED,
    ids::IMPACT_PEAK_DECELERATION,
    ids::IMPACT_MEAN_DECELERATION,
    ids::IMPACT_STOP_TIME,
    ids::IMPACT_RESIDUAL_SPEED,
    ids::BODY_TRANSIENT_FORCE,
    ids::BODY_TRANSFER_ENERGY,
    ids::BODY_TRANSIENT_PRESSURE,
    ids::BODY_CLAMPING_FORCE,
    ids::BODY_CLAMPING_PRESSURE,
    ids::GAP_CLOSING_GAP,
];

// The largest study a scenario may ask for fits the Monte Carlo memory
// bound, so a valid request is never dropped.
const _: () = assert!(
    crate::scenario::MAX_STUDY_SAMPLES as usize * STUDY_FIGURES.len()
        <= crate::tolerance::monte_carlo::MAX_STORED_VALUES
);

/// A tolerance study in progress: worst-case corners first, then the Monte
/// Carlo samples, advanced in slices so a browser can show progress.
pub struct Study {
    scenario: Scenario,
    base: Vec<f64>,
    slots: Vec<usize>,
    inputs: Vec<TolerancedInput>,
    lines: Vec<StudyInputLine>,
    figure_ids: Vec<(String, Dim)>,
    limits: Vec<StudyLimit>,
    worst: Option<crate::tolerance::WorstCase>,
    worst_done: bool,
    mc: Option<MonteCarloRun>,
}

impl Study {
    /// Prepare the study of a scenario from its nominal report. `None` when
    /// no input carries a tolerance, or nothing can be computed.
    pub fn new(s: &Scenario, nominal: &Report) -> Option<Study> {
        let mut r = Reader::record();
        let _ = resolve(s, &mut r);
        if !r.errors.is_empty() {
            return None;
        }
        let base: Vec<f64> = r.records.iter().map(|x| x.si.unwrap_or(f64::NAN)).collect();
        let mut slots = Vec::new();
        let mut inputs = Vec::new();
        let mut lines = Vec::new();
        for (i, rec) in r.records.iter().enumerate() {
            let (Some(tol), Some(nominal_v)) = (rec.tol, rec.si) else {
                continue;
            };
            let dist = match rec.spread {
                Spread::Uniform => Distribution::Uniform,
                Spread::Normal => Distribution::Normal,
            };
            let t = match tol {
                TolText::Absolute(a) => Tolerance::absolute(a, dist),
                TolText::Relative(f) => Tolerance::relative(f, dist),
            };
            if t.half_width(nominal_v) <= 0.0 {
                continue;
            }
            let positive = matches!(rec.rule, crate::scenario::reader::Rule::Positive);
            let Ok(input) = TolerancedInput::new(&rec.path, nominal_v, t, positive) else {
                continue;
            };
            lines.push(StudyInputLine {
                path: rec.path.clone(),
                dim: rec.dim,
                nominal: nominal_v,
                low: input.low(),
                high: input.high(),
                spread: rec.spread,
            });
            inputs.push(input);
            slots.push(i);
        }
        if inputs.is_empty() {
            return None;
        }
        let figure_ids: Vec<(String, Dim)> = STUDY_FIGURES
            .iter()
            .filter_map(|id| nominal.figure(id))
            .filter(|f| f.value.is_some())
            .map(|f| (f.id.clone(), f.dim))
            .collect();
        if figure_ids.is_empty() {
            return None;
        }
        let limits: Vec<StudyLimit> = nominal
            .checks
            .iter()
            .filter(|c| !c.informative)
            .filter_map(|c| {
                let at_most = match c.comparison {
                    Comparison::AtMost => true,
                    Comparison::AtLeast => false,
                    _ => return None,
                };
                let threshold = c.limit?;
                let fig = nominal.figure(&c.figure)?;
                // Only checks that compare the figure itself.
                if fig.value != c.value {
                    return None;
                }
                figure_ids
                    .iter()
                    .any(|(id, _)| *id == c.figure)
                    .then(|| StudyLimit {
                        check: c.id.clone(),
                        label: c.label.clone(),
                        figure: c.figure.clone(),
                        threshold,
                        at_most,
                    })
            })
            .collect();
        let mc = if s.study.monte_carlo {
            let config = MonteCarloConfig {
                samples: s.study.samples as usize,
                seed: s.study.seed,
                limits: limits
                    .iter()
                    .filter_map(|l| {
                        let figure = figure_ids.iter().position(|(id, _)| *id == l.figure)?;
                        Some(tolerance::Limit {
                            id: l.check.clone(),
                            figure,
                            threshold: l.threshold,
                            comparison: if l.at_most {
                                tolerance::Comparison::AtMost
                            } else {
                                tolerance::Comparison::AtLeast
                            },
                        })
                    })
                    .collect(),
                histogram: Some(tolerance::HistogramSpec {
                    figure: headline_figure(&figure_ids),
                    bins: 30,
                }),
            };
            MonteCarloRun::new(&inputs, figure_ids.len(), config).ok()
        } else {
            None
        };
        Some(Study {
            scenario: s.clone(),
            base,
            slots,
            inputs,
            lines,
            figure_ids,
            limits,
            worst: None,
            worst_done: false,
            mc,
        })
    }

    /// Fraction done, 0..=1.
    pub fn progress(&self) -> f64 {
        let wc = if self.worst_done { 1.0 } else { 0.0 };
        match &self.mc {
            None => wc,
            Some(run) => {
                let p = run.progress();
                let mc = if p.total == 0 {
                    1.0
                } else {
                    p.done as f64 / p.total as f64
                };
                0.1 * wc + 0.9 * mc
            }
        }
    }

    /// Do up to `samples` Monte Carlo samples (the worst-case corners first,
    /// in one slice). Returns true when the study is complete.
    pub fn advance(&mut self, samples: usize) -> bool {
        let mut eval = Evaluator {
            scenario: &self.scenario,
            base: self.base.clone(),
            slots: &self.slots,
            ids: &self.figure_ids,
        };
        if !self.worst_done {
            self.worst = tolerance::worst_case(
                &self.inputs,
                self.figure_ids.len(),
                &mut |x: &[f64], y: &mut [f64]| eval.run(x, y),
                WorstCaseOptions::default(),
            )
            .ok();
            self.worst_done = true;
            return self.mc.is_none();
        }
        match &mut self.mc {
            None => true,
            Some(run) => run
                .advance(&mut |x: &[f64], y: &mut [f64]| eval.run(x, y), samples)
                .is_complete(),
        }
    }

    /// The study's result (what is done so far).
    pub fn finish(self) -> StudyReport {
        StudyReport {
            inputs: self.lines,
            figures: self.figure_ids,
            limits: self.limits,
            worst_case: self.worst,
            monte_carlo: self.mc.map(MonteCarloRun::finish),
        }
    }
}

/// The figure the histogram shows: the first of peak force, contact force,
/// kinetic energy, stored energy that the study follows.
fn headline_figure(ids_: &[(String, Dim)]) -> usize {
    for want in [
        ids::IMPACT_PEAK_FORCE,
        ids::BODY_TRANSIENT_FORCE,
        ids::RELEASE_KINETIC_ENERGY,
        ids::ENERGY_STORED_LATCHED,
    ] {
        if let Some(i) = ids_.iter().position(|(id, _)| id == want) {
            return i;
        }
    }
    0
}

/// Re-runs the evaluation with perturbed inputs.
struct Evaluator<'a> {
    scenario: &'a Scenario,
    base: Vec<f64>,
    slots: &'a [usize],
    ids: &'a [(String, Dim)],
}

impl Evaluator<'_> {
    fn run(&mut self, x: &[f64], y: &mut [f64]) -> Result<(), InputError> {
        for (j, &slot) in self.slots.iter().enumerate() {
            if let (Some(dst), Some(src)) = (self.base.get_mut(slot), x.get(j)) {
                *dst = *src;
            }
        }
        let mut r = Reader::replay(&self.base);
        let model = resolve(self.scenario, &mut r);
        let out = evaluate(&model, Detail::Numbers);
        for (k, (id, _)) in self.ids.iter().enumerate() {
            if let Some(slot) = y.get_mut(k) {
                *slot = value_of(&model, &out, id).unwrap_or(f64::NAN);
            }
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::scenario::demos;

    /// Every figure id the report of a scenario carries (and every id the
    /// study follows) has the same value from [`value_of`] as from
    /// [`figures`], bit for bit, nominal and at perturbed inputs: the study
    /// reads exactly the numbers the report prints.
    /// Returns how many figures were missing (so the test can tell that
    /// missing figures were met, not only computed ones).
    fn assert_value_of_matches_figures(s: &Scenario, perturb: &[f64]) -> usize {
        let mut missing = 0;
        let mut r = Reader::record();
        let _ = resolve(s, &mut r);
        let base: Vec<f64> = r.records.iter().map(|x| x.si.unwrap_or(f64::NAN)).collect();
        for (k, f) in perturb.iter().enumerate() {
            let mut values = base.clone();
            for (i, v) in values.iter_mut().enumerate() {
                // Each input moves by its own share of the factor.
                if i % (k + 2) == 0 {
                    *v *= f;
                }
            }
            let mut rr = Reader::replay(&values);
            let model = resolve(s, &mut rr);
            for detail in [Detail::Numbers, Detail::Full] {
                let out = evaluate(&model, detail);
                let figs = figures(&model, &out, &[]);
                let ids = figs
                    .iter()
                    .map(|f| f.id.as_str())
                    .chain(STUDY_FIGURES.iter().copied());
                for id in ids {
                    let want = value(&figs, id);
                    let got = value_of(&model, &out, id);
                    missing += usize::from(want.is_none());
                    assert_eq!(
                        got.map(f64::to_bits),
                        want.map(f64::to_bits),
                        "{id} at factor {f}: {got:?} against {want:?}"
                    );
                }
            }
        }
        missing
    }

    #[test]
    fn scenario_hash_is_the_sha256_of_the_scenario_json() {
        // FIPS 180-4 SHA-256 of the JSON text, as lowercase hex: the same
        // digest as hashing the whole text at once (sha2 crate).
        for d in demos::all() {
            let s = (d.build)();
            let want: String = Sha256::digest(serde_json::to_vec(&s).unwrap())
                .iter()
                .map(|b| format!("{b:02x}"))
                .collect();
            assert_eq!(scenario_hash(&s), want, "{}", d.key);
        }
    }

    #[test]
    fn value_of_gives_what_the_figures_say_for_every_demo() {
        // Factors that move demos across regimes (contact, stall, bottoming).
        let factors = [1.0, 0.5, 0.9, 1.1, 1.7, 3.0, 0.05];
        let mut missing = 0;
        for d in demos::all() {
            missing += assert_value_of_matches_figures(&(d.build)(), &factors);
        }
        assert!(missing > 0, "no missing figure was met");
    }
}
