//! Reference harness: a thin JSON front end to the core for the Python
//! reference suite (`tests/reference/`), which recomputes the same figures
//! with general-purpose libraries (scipy, numpy, pint, uncertainties) and
//! compares.
//!
//! Protocol: one JSON request per line on standard input, one JSON answer
//! per line on standard output (flushed after each line), so one process
//! serves a whole suite. A request is `{"op": "<name>", ...}`; the answer is
//! `{"ok": <result>}` or `{"error": "<message>"}`. The operations call core
//! functions directly (no scenario layer): `catalogue`, `markdown`, `units`,
//! `spring`, `helical`, `release`, `impact`, `release_impact`, `body`,
//! `clamping`, `gap`, `limits`, `sizing`, `identify`, `stats`. The harness
//! adds no physics: it maps JSON onto the core's configuration structs and
//! the outcomes back onto JSON.
//!
//! `refharness markdown` (argument instead of standard input) prints the
//! "How the figures are checked" section generated from
//! `joulewise_core::verification`, for DEVELOPERS.md.
#![forbid(unsafe_code)]

use joulewise_core::contact::body::{self, Clamping, TransientContact};
use joulewise_core::contact::buffer::{
    self, Buffer, BufferConfig, BufferLaw, ContinuousConfig, ImpactConfig, ImpactInput,
    ImpactOutcome, Rebound, StrokeEnd,
};
use joulewise_core::contact::gap::{self, EdgeGapMeasure};
use joulewise_core::identify::{self, DynamicInput, StaticInput, TwoPointInput};
use joulewise_core::limits;
use joulewise_core::mechanism::{
    DirectSpring, Friction, InertiaSpec, Mechanism, RotatingConfig, RotatingPart, Sense,
    SpringMount, Strut, StrutMode, TranslatingConfig, TranslatingPart,
};
use joulewise_core::ode::SolverConfig;
use joulewise_core::release::{self, HistoryPoint, ReleaseConfig, ReleaseEnd, ReleaseOutcome};
use joulewise_core::sizing::{self, BufferType, SizingInput};
use joulewise_core::spring::{Spring, SpringModel, SpringSpec, Travel};
use joulewise_core::tolerance::stats;
use joulewise_core::units;
use serde::Deserialize;
use serde_json::{json, Value};
use std::io::{BufRead, Write};

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    if args.first().map(String::as_str) == Some("markdown") {
        print!("{}", joulewise_core::verification::markdown());
        return;
    }
    let stdin = std::io::stdin();
    let mut out = std::io::stdout().lock();
    for line in stdin.lock().lines() {
        let Ok(line) = line else { break };
        if line.trim().is_empty() {
            continue;
        }
        let answer = match serde_json::from_str::<Value>(&line) {
            Ok(req) => match dispatch(&req) {
                Ok(v) => json!({ "ok": v }),
                Err(e) => json!({ "error": e }),
            },
            Err(e) => json!({ "error": format!("request is not JSON: {e}") }),
        };
        if writeln!(out, "{answer}")
            .and_then(|()| out.flush())
            .is_err()
        {
            break;
        }
    }
}

type Res = Result<Value, String>;

fn parse<T: for<'de> Deserialize<'de>>(v: &Value) -> Result<T, String> {
    serde_json::from_value(v.clone()).map_err(|e| format!("bad request: {e}"))
}

fn to_json<T: serde::Serialize>(v: &T) -> Res {
    serde_json::to_value(v).map_err(|e| e.to_string())
}

fn dispatch(req: &Value) -> Res {
    let op = req["op"].as_str().ok_or("missing op")?;
    match op {
        "catalogue" => to_json(&joulewise_core::verification::catalogue()),
        "markdown" => Ok(json!(joulewise_core::verification::markdown())),
        "units" => units_op(),
        "spring" => spring_op(req),
        "helical" => helical_op(req),
        "release" => release_op(req),
        "impact" => impact_op(req),
        "release_impact" => release_impact_op(req),
        "body" => {
            let input: TransientContact = parse(&req["input"])?;
            to_json(&body::transient_contact(&input).map_err(|e| e.to_string())?)
        }
        "clamping" => {
            let input: Clamping = parse(&req["input"])?;
            to_json(&body::clamping(&input).map_err(|e| e.to_string())?)
        }
        "gap" => gap_op(req),
        "limits" => limits_op(req),
        "sizing" => {
            let input: SizingInput = parse(&req["input"])?;
            let buffer: BufferType = parse(&req["buffer"])?;
            to_json(&sizing::size_buffer(&input, &buffer).map_err(|e| e.to_string())?)
        }
        "identify" => identify_op(req),
        "stats" => stats_op(req),
        other => Err(format!("unknown op `{other}`")),
    }
}

// ── Units ────────────────────────────────────────────────────────────────

/// Every unit of the table with its factor, its pint expression, and what
/// the parser makes of `1 <spelling>` for each of its spellings.
fn units_op() -> Res {
    let mut rows = Vec::new();
    for u in units::all_units() {
        let parse_one = |spelling: &str| {
            let text = if spelling.is_empty() {
                "1".to_string()
            } else {
                format!("1 {spelling}")
            };
            match units::parse_quantity(&text, u.dim, "") {
                Ok(v) => json!({ "text": text, "value": v }),
                Err(e) => json!({ "text": text, "error": e.message(u.dim) }),
            }
        };
        let spellings: Vec<Value> = u.spellings().map(parse_one).collect();
        rows.push(json!({
            "symbol": u.symbol,
            "ascii": u.ascii,
            "name": u.name,
            "dim": u.dim,
            "si_symbol": u.dim.si_symbol(),
            "factor": u.factor,
            "pint": u.pint,
            "source": u.source,
            "parsed": spellings,
        }));
    }
    Ok(Value::Array(rows))
}

// ── Springs ──────────────────────────────────────────────────────────────

fn travel(v: &Value) -> Travel {
    if v.as_str() == Some("unloading") {
        Travel::Unloading
    } else {
        Travel::Loading
    }
}

/// Forces, rates and exact work of any spring model at the given points.
fn spring_op(req: &Value) -> Res {
    let spec: SpringSpec = parse(&req["spec"])?;
    let s = spec.build().map_err(|e| e.to_string())?;
    let qs: Vec<f64> = parse(&req["q"])?;
    let pairs: Vec<(f64, f64)> = parse(&req["pairs"])?;
    let t = travel(&req["travel"]);
    Ok(json!({
        "range": s.deflection_range(),
        "effective_mass": s.effective_mass(),
        "force": qs.iter().map(|&q| s.force(q, t)).collect::<Vec<_>>(),
        "rate": qs.iter().map(|&q| s.rate(q)).collect::<Vec<_>>(),
        "work": pairs.iter().map(|&(a, b)| s.work(a, b, t)).collect::<Vec<_>>(),
        "extra": spring_extra(&s, req),
    }))
}

/// Model-specific figures: disc flat force, helical rate and stress.
fn spring_extra(s: &SpringModel, req: &Value) -> Value {
    match s {
        SpringModel::Disc(d) => json!({ "flat_force": d.flat_force() }),
        SpringModel::Helical(h) => json!({ "rate": h.spring_rate() }),
        SpringModel::Torsion(t) => json!({ "rate": t.spring_rate() }),
        SpringModel::Extension(e) => {
            json!({ "rate": e.spring_rate(), "initial_tension": e.initial_tension() })
        }
        SpringModel::Series(se) => {
            let qs: Vec<f64> = parse(&req["q"]).unwrap_or_default();
            let t = travel(&req["travel"]);
            json!({
                "split": qs.iter().map(|&q| {
                    let sp = se.split(q, t);
                    json!({ "force": sp.force, "deflections": sp.deflections })
                }).collect::<Vec<_>>()
            })
        }
        _ => Value::Null,
    }
}

/// Helical compression spring figures (EN 13906-1 model).
fn helical_op(req: &Value) -> Res {
    let spec: joulewise_core::spring::HelicalSpec = parse(&req["spec"])?;
    let h = joulewise_core::spring::HelicalSpring::new(spec).map_err(|e| e.to_string())?;
    let force = req["force"].as_f64().unwrap_or(0.0);
    let load = req["load_mass"].as_f64().unwrap_or(1.0);
    let b = h.buckling();
    Ok(json!({
        "rate": h.spring_rate(),
        "mean_diameter": h.mean_diameter(),
        "index": h.index(),
        "total_coils": h.total_coils(),
        "solid_length": h.solid_length().0,
        "deflection_to_solid": h.deflection_to_solid(),
        "stress_factor": h.stress_factor(),
        "shear_stress": h.shear_stress(force),
        "spring_mass": h.spring_mass(),
        "effective_mass": h.effective_mass(),
        "natural_frequency_with_load": h.natural_frequency_with_load(load),
        "surge_frequency": h.surge_frequency(),
        "critical_free_length": b.as_ref().map(|b| b.critical_free_length),
        "buckling_deflection": b.as_ref().and_then(|b| b.buckling_deflection),
    }))
}

// ── Mechanisms ───────────────────────────────────────────────────────────

/// A spring mount as JSON: direct (along the travel or at the hinge) or a
/// strut between frame and part.
#[derive(Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
enum MountJson {
    Direct {
        spec: SpringSpec,
        deflection_at_latch: f64,
        sense: String,
        #[serde(default)]
        detaches: bool,
    },
    Strut {
        spec: SpringSpec,
        frame_point: [f64; 2],
        part_point_radius: f64,
        part_point_angle: f64,
        free_length: f64,
        #[serde(default)]
        extension: bool,
    },
}

impl MountJson {
    fn spec(&self) -> &SpringSpec {
        match self {
            MountJson::Direct { spec, .. } | MountJson::Strut { spec, .. } => spec,
        }
    }

    fn mount<'a>(&self, spring: &'a SpringModel) -> SpringMount<'a> {
        match self {
            MountJson::Direct {
                deflection_at_latch,
                sense,
                detaches,
                ..
            } => SpringMount::Direct(DirectSpring {
                spring,
                deflection_at_latch: *deflection_at_latch,
                sense: if sense == "loads" {
                    Sense::Loads
                } else {
                    Sense::Unloads
                },
                detaches: *detaches,
            }),
            MountJson::Strut {
                frame_point,
                part_point_radius,
                part_point_angle,
                free_length,
                extension,
                ..
            } => SpringMount::Strut(Strut {
                spring,
                frame_point: *frame_point,
                part_point_radius: *part_point_radius,
                part_point_angle: *part_point_angle,
                free_length: *free_length,
                mode: if *extension {
                    StrutMode::Extension
                } else {
                    StrutMode::Compression
                },
            }),
        }
    }
}

#[derive(Deserialize)]
#[serde(tag = "shape", rename_all = "snake_case")]
enum InertiaJson {
    Given {
        inertia: f64,
        mass: f64,
        cg_radius: f64,
    },
    PlateAboutEdge {
        mass: f64,
        width: f64,
    },
    RodAboutEnd {
        mass: f64,
        length: f64,
    },
    PointMass {
        mass: f64,
        radius: f64,
    },
}

impl InertiaJson {
    fn spec(&self) -> InertiaSpec {
        match *self {
            InertiaJson::Given {
                inertia,
                mass,
                cg_radius,
            } => InertiaSpec::Given {
                inertia,
                mass,
                cg_radius,
            },
            InertiaJson::PlateAboutEdge { mass, width } => {
                InertiaSpec::PlateAboutEdge { mass, width }
            }
            InertiaJson::RodAboutEnd { mass, length } => InertiaSpec::RodAboutEnd { mass, length },
            InertiaJson::PointMass { mass, radius } => InertiaSpec::PointMass { mass, radius },
        }
    }
}

/// A moving part as JSON.
#[derive(Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
enum PartJson {
    Translating {
        mass: f64,
        travel: f64,
        #[serde(default)]
        incline: f64,
        #[serde(default)]
        friction_coefficient: Option<f64>,
        #[serde(default)]
        friction_force: Option<f64>,
        #[serde(default)]
        damping: f64,
        #[serde(default)]
        drive_force: f64,
        #[serde(default)]
        include_spring_mass: bool,
        #[serde(default)]
        spring: Option<MountJson>,
    },
    Rotating {
        inertia: InertiaJson,
        #[serde(default)]
        cg_angle_at_latch: f64,
        #[serde(default)]
        hinge_tilt: f64,
        travel: f64,
        #[serde(default)]
        friction_torque: f64,
        #[serde(default)]
        damping: f64,
        #[serde(default)]
        drive_torque: f64,
        hazard_radius: f64,
        #[serde(default)]
        spring: Option<MountJson>,
    },
}

impl PartJson {
    fn mount_json(&self) -> Option<&MountJson> {
        match self {
            PartJson::Translating { spring, .. } | PartJson::Rotating { spring, .. } => {
                spring.as_ref()
            }
        }
    }

    fn mechanism<'a>(&self, spring: Option<&'a SpringModel>) -> Result<Mechanism<'a>, String> {
        let mount = match (self.mount_json(), spring) {
            (Some(m), Some(s)) => Some(m.mount(s)),
            _ => None,
        };
        match self {
            PartJson::Translating {
                mass,
                travel,
                incline,
                friction_coefficient,
                friction_force,
                damping,
                drive_force,
                include_spring_mass,
                ..
            } => {
                let friction = match (friction_coefficient, friction_force) {
                    (Some(mu), _) => Friction::Coefficient(*mu),
                    (None, Some(f)) => Friction::Force(*f),
                    (None, None) => Friction::None,
                };
                let spring = match mount {
                    Some(SpringMount::Direct(d)) => Some(d),
                    Some(SpringMount::Strut(_)) => {
                        return Err("a sliding part takes a direct spring".into())
                    }
                    None => None,
                };
                TranslatingPart::new(TranslatingConfig {
                    mass: *mass,
                    spring,
                    travel: *travel,
                    incline: *incline,
                    friction,
                    damping: *damping,
                    drive_force: *drive_force,
                    include_spring_mass: *include_spring_mass,
                })
                .map(Mechanism::Translating)
                .map_err(|e| e.to_string())
            }
            PartJson::Rotating {
                inertia,
                cg_angle_at_latch,
                hinge_tilt,
                travel,
                friction_torque,
                damping,
                drive_torque,
                hazard_radius,
                ..
            } => RotatingPart::new(RotatingConfig {
                inertia: inertia.spec(),
                cg_angle_at_latch: *cg_angle_at_latch,
                hinge_tilt: *hinge_tilt,
                spring: mount,
                travel: *travel,
                friction_torque: *friction_torque,
                damping: *damping,
                drive_torque: *drive_torque,
                hazard_radius: *hazard_radius,
            })
            .map(Mechanism::Rotating)
            .map_err(|e| e.to_string()),
        }
    }
}

/// Solver settings from the request: `rtol` and `atol` when given, the
/// product defaults otherwise.
fn solver(req: &Value) -> SolverConfig {
    let mut s = SolverConfig::default();
    if let Some(r) = req["rtol"].as_f64() {
        s.rtol = r;
    }
    if let Some(a) = req["atol"].as_f64() {
        s.atol = a;
    }
    s
}

fn samples(req: &Value) -> usize {
    req["samples"]
        .as_u64()
        .and_then(|n| usize::try_from(n).ok())
        .unwrap_or(0)
}

fn history(h: &[HistoryPoint]) -> Value {
    h.iter()
        .map(|p| {
            json!({
                "t": p.time, "q": p.position, "v": p.speed, "hazard_speed": p.hazard_speed,
                "spring_force": p.spring_force, "buffer_force": p.buffer_force,
            })
        })
        .collect()
}

fn release_json(r: &ReleaseOutcome) -> Value {
    let (end, stall) = match r.end {
        ReleaseEnd::Contact => ("contact", Value::Null),
        ReleaseEnd::Stall(s) => (
            "stall",
            json!({ "position": s.position, "holds": s.holds, "cause": s.cause.describe(),
                    "spring_exhausted": s.spring_exhausted }),
        ),
        ReleaseEnd::SpringEndOfStroke { .. } => ("spring_end", Value::Null),
    };
    json!({
        "end": end,
        "stall": stall,
        "time": r.time,
        "position": r.position,
        "speed_ode": r.speed_ode,
        "speed_energy_balance": r.speed_energy_balance,
        "speed": r.speed(),
        "hazard_speed": r.hazard_speed(),
        "kinetic_energy": r.kinetic_energy(),
        "left_spring_at": r.left_spring_at,
        "spring_engaged": r.spring_engaged,
        "inertia": r.inertia,
        "hazard_mass": r.hazard_mass,
        "closing_force_static": r.closing_force_static,
        "work": {
            "spring": r.work.spring, "gravity": r.work.gravity, "drive": r.work.drive,
            "friction": r.work.friction, "damping": r.work.damping,
        },
        "rhs_evaluations": r.stats.rhs_evaluations,
        "history": history(&r.history),
    })
}

fn release_op(req: &Value) -> Res {
    let part: PartJson = parse(&req["part"])?;
    let spring = part
        .mount_json()
        .map(|m| m.spec().build())
        .transpose()
        .map_err(|e| e.to_string())?;
    let mech = part.mechanism(spring.as_ref())?;
    let cfg = ReleaseConfig {
        solver: solver(req),
        samples: samples(req),
    };
    let r = release::release(&mech, &cfg).map_err(|e| e.to_string())?;
    Ok(release_json(&r))
}

/// A buffer as JSON, with the spring model it may hold.
#[derive(Deserialize)]
#[serde(tag = "law", rename_all = "snake_case")]
enum LawJson {
    Linear {
        rate: f64,
        stroke: f64,
    },
    PowerLaw {
        coefficient: f64,
        exponent: f64,
        stroke: f64,
    },
    Spring {
        spec: SpringSpec,
        #[serde(default)]
        preload_deflection: f64,
    },
    ConstantForce {
        force: f64,
        stroke: f64,
    },
    IdealAbsorber {
        stroke: f64,
        efficiency: f64,
    },
    Orifice {
        coefficient: f64,
        stroke: f64,
    },
}

#[derive(Deserialize)]
struct BufferJson {
    #[serde(flatten)]
    law: LawJson,
    #[serde(default = "one")]
    count: u32,
    /// Restitution coefficient; absent: elastic (the unloading law).
    #[serde(default)]
    restitution: Option<f64>,
}

fn one() -> u32 {
    1
}

impl BufferJson {
    fn spring(&self) -> Result<Option<SpringModel>, String> {
        match &self.law {
            LawJson::Spring { spec, .. } => spec.build().map(Some).map_err(|e| e.to_string()),
            _ => Ok(None),
        }
    }

    fn buffer<'a>(&self, spring: Option<&'a SpringModel>) -> Result<Buffer<'a>, String> {
        let law = match (&self.law, spring) {
            (LawJson::Linear { rate, stroke }, _) => BufferLaw::Linear {
                rate: *rate,
                stroke: *stroke,
            },
            (
                LawJson::PowerLaw {
                    coefficient,
                    exponent,
                    stroke,
                },
                _,
            ) => BufferLaw::PowerLaw {
                coefficient: *coefficient,
                exponent: *exponent,
                stroke: *stroke,
            },
            (
                LawJson::Spring {
                    preload_deflection, ..
                },
                Some(s),
            ) => BufferLaw::Spring {
                spring: s,
                preload_deflection: *preload_deflection,
            },
            (LawJson::Spring { .. }, None) => return Err("spring buffer without a spring".into()),
            (LawJson::ConstantForce { force, stroke }, _) => BufferLaw::ConstantForce {
                force: *force,
                stroke: *stroke,
            },
            (LawJson::IdealAbsorber { stroke, efficiency }, _) => BufferLaw::IdealAbsorber {
                stroke: *stroke,
                efficiency: *efficiency,
            },
            (
                LawJson::Orifice {
                    coefficient,
                    stroke,
                },
                _,
            ) => BufferLaw::Orifice {
                coefficient: *coefficient,
                stroke: *stroke,
            },
        };
        Buffer::new(BufferConfig {
            law,
            count: self.count,
            rebound: self
                .restitution
                .map_or(Rebound::Elastic, Rebound::Restitution),
        })
        .map_err(|e| e.to_string())
    }
}

fn impact_json(o: &ImpactOutcome, thresholds: &[f64]) -> Value {
    let (end, rebound) = match o.end {
        StrokeEnd::Held => ("held", None),
        StrokeEnd::Rebound { speed } => ("rebound", Some(speed)),
        StrokeEnd::Bottomed { .. } => ("bottomed", None),
    };
    json!({
        "end": end,
        "mass": o.mass,
        "contact_speed": o.contact_speed,
        "stroke_used": o.stroke_used,
        "stroke_available": o.stroke_available,
        "peak_force": o.peak_force,
        "peak_deceleration": o.peak_deceleration,
        "mean_deceleration": o.mean_deceleration(),
        "compression_time": o.compression_time,
        "stop_time": o.stop_time(),
        "rebound_speed": rebound,
        "residual_speed": o.residual_speed(),
        "energy_per_cycle": o.energy_per_cycle,
        "heat_load": o.heat_load(),
        "effective_mass": o.effective_mass(),
        "time_above": thresholds.iter().map(|&a| o.time_above_deceleration(a)).collect::<Vec<_>>(),
        "rhs_evaluations": o.stats.rhs_evaluations,
        "history": history(&o.history),
    })
}

fn impact_op(req: &Value) -> Res {
    let b: BufferJson = parse(&req["buffer"])?;
    let spring = b.spring()?;
    let buffer = b.buffer(spring.as_ref())?;
    let input = ImpactInput {
        mass: req["mass"].as_f64().ok_or("mass")?,
        speed: req["speed"].as_f64().ok_or("speed")?,
        drive_force: req["drive_force"].as_f64().unwrap_or(0.0),
        incline: req["incline"].as_f64().unwrap_or(0.0),
        friction_force: req["friction_force"].as_f64().unwrap_or(0.0),
        cycles_per_hour: req["cycles_per_hour"].as_f64().unwrap_or(0.0),
    };
    let cfg = ImpactConfig {
        solver: solver(req),
        samples: samples(req),
    };
    let thresholds: Vec<f64> = parse(&req["thresholds"]).unwrap_or_default();
    let o = buffer::impact(&input, &buffer, &cfg).map_err(|e| e.to_string())?;
    Ok(impact_json(&o, &thresholds))
}

fn release_impact_op(req: &Value) -> Res {
    let part: PartJson = parse(&req["part"])?;
    let spring = part
        .mount_json()
        .map(|m| m.spec().build())
        .transpose()
        .map_err(|e| e.to_string())?;
    let mech = part.mechanism(spring.as_ref())?;
    let b: BufferJson = parse(&req["buffer"])?;
    let bspring = b.spring()?;
    let buffer = b.buffer(bspring.as_ref())?;
    let cfg = ContinuousConfig {
        release: ReleaseConfig {
            solver: solver(req),
            samples: samples(req),
        },
        buffer_radius: req["buffer_radius"].as_f64(),
        cycles_per_hour: 0.0,
    };
    let both = buffer::release_into_buffer(&mech, &buffer, &cfg).map_err(|e| e.to_string())?;
    Ok(json!({
        "release": release_json(&both.release),
        "impact": both.impact.as_ref().map(|i| impact_json(i, &[])),
    }))
}

// ── Gaps, limits ─────────────────────────────────────────────────────────

fn gap_op(req: &Value) -> Res {
    let measure = match req["measure"].as_str() {
        Some("chord") => EdgeGapMeasure::Chord,
        Some("arc") => EdgeGapMeasure::Arc,
        _ => EdgeGapMeasure::Normal,
    };
    let r = req["radius"].as_f64().ok_or("radius")?;
    let a = req["angle"].as_f64().ok_or("angle")?;
    let gap = gap::hinged_edge_gap(r, a, measure).map_err(|e| e.to_string())?;
    let back = gap::hinged_angle_for_gap(r, gap, measure).map_err(|e| e.to_string())?;
    Ok(json!({ "gap": gap, "angle_back": back }))
}

/// The limit catalogue, and the rule functions evaluated at given inputs.
fn limits_op(req: &Value) -> Res {
    use limits::{crane, gates, guards, lift};
    let speeds: Vec<f64> = parse(&req["speeds"]).unwrap_or_default();
    let gaps: Vec<f64> = parse(&req["gap_widths"]).unwrap_or_default();
    let rated: Vec<f64> = speeds.clone();
    let ac = lift::En81BufferType::LinearAccumulation;
    let dis = lift::En81BufferType::Dissipation;
    Ok(json!({
        "catalogue": limits::catalogue(),
        "en81_linear_stroke": speeds.iter().map(|&v| lift::en81_required_stroke(ac, v)).collect::<Vec<_>>(),
        "en81_dissipation_stroke": speeds.iter().map(|&v| lift::en81_required_stroke(dis, v)).collect::<Vec<_>>(),
        "en81_reduced_stroke": speeds.iter().map(|&v| lift::en81_reduced_stroke(v)).collect::<Vec<_>>(),
        "us_gravity_stopping_distance": speeds.iter().map(|&v| lift::us_gravity_stopping_distance(v)).collect::<Vec<_>>(),
        "us_oil_buffer_minimum_stroke": speeds.iter().map(|&v| lift::us_oil_buffer_minimum_stroke(v)).collect::<Vec<_>>(),
        "crane_bridge_stroke": rated.iter().map(|&v| crane::minimum_constant_deceleration_stroke(crane::CraneTravel::Bridge, v)).collect::<Vec<_>>(),
        "crane_trolley_stroke": rated.iter().map(|&v| crane::minimum_constant_deceleration_stroke(crane::CraneTravel::Trolley, v)).collect::<Vec<_>>(),
        "crane_bridge_energy_speed": rated.iter().map(|&v| crane::energy_check_speed(crane::CraneTravel::Bridge, v)).collect::<Vec<_>>(),
        "crane_trolley_energy_speed": rated.iter().map(|&v| crane::energy_check_speed(crane::CraneTravel::Trolley, v)).collect::<Vec<_>>(),
        "gate_dynamic_limit": gaps.iter().map(|&g| gates::dynamic_force_limit(g)).collect::<Vec<_>>(),
        "guard_limits": [guards::limits(false), guards::limits(true)],
        "body_regions": limits::body::BodyRegion::ALL.iter().map(|r| json!({
            "label": r.label(),
            "quasi_static_force": r.quasi_static_force(),
            "transient_force": r.transient_force(),
            "spring_constant": r.spring_constant(),
            "mass": r.mass(),
            "transient_energy": r.transient_energy(),
            "quasi_static_energy": r.quasi_static_energy(),
        })).collect::<Vec<_>>(),
    }))
}

// ── Identification and statistics ────────────────────────────────────────

fn identify_op(req: &Value) -> Res {
    match req["method"].as_str() {
        Some("static") => {
            let i: StaticInput = parse(&req["input"])?;
            to_json(&identify::static_rate(&i).map_err(|e| e.to_string())?)
        }
        Some("dynamic") => {
            let i: DynamicInput = parse(&req["input"])?;
            to_json(&identify::dynamic_rate(&i).map_err(|e| e.to_string())?)
        }
        Some("two_point") => {
            let i: TwoPointInput = parse(&req["input"])?;
            to_json(&identify::two_point(&i).map_err(|e| e.to_string())?)
        }
        Some("frequency_from_sag") => {
            let sag = req["sag"].as_f64().ok_or("sag")?;
            let tol = req["sag_tolerance"].as_f64().unwrap_or(0.0);
            to_json(&identify::frequency_from_sag(sag, tol, None).map_err(|e| e.to_string())?)
        }
        _ => {
            Err("identify: method must be static, dynamic, two_point or frequency_from_sag".into())
        }
    }
}

fn stats_op(req: &Value) -> Res {
    let mut sample: Vec<f64> = parse(&req["sample"]).unwrap_or_default();
    sample.sort_unstable_by(f64::total_cmp);
    let ps: Vec<f64> = parse(&req["p"]).unwrap_or_default();
    let binomial: Vec<(usize, usize)> = parse(&req["binomial"]).unwrap_or_default();
    Ok(json!({
        "quantiles": ps.iter().map(|&p| stats::quantile_sorted(&sample, p)).collect::<Vec<_>>(),
        "wilson_95": binomial.iter().map(|&(k, n)| stats::wilson_95(k, n)).collect::<Vec<_>>(),
        "z_95": stats::Z_95,
    }))
}
