//! From the scenario as typed to the SI models the physics modules take.
//!
//! [`resolve()`] reads every input through a [`Reader`], so errors are
//! collected with their field paths and the pass can be replayed with
//! perturbed SI values for the tolerance study. Each section resolves on its
//! own: a bad spring input leaves the part, contact and limits usable.
//!
//! Default units of a bare number (what a field means when the user types
//! `12`): lengths mm, masses kg, forces N, linear rates N/mm, torsional rates
//! N·m/rad, angles degrees, speeds m/s, times s, torques N·m, inertia kg·m²,
//! pressures N/mm², damping N·s/m, orifice coefficients N·s²/m².

use super::reader::{Reader, Rule};
use super::value::{TolText, Value};
use super::*;
use crate::contact::body::{ContactArea, Padding};
use crate::identify::{self, RateEstimate};
use crate::limits::user::UserLimit;
use crate::mechanism::{Friction, InertiaSpec, Sense, StrutMode};
use crate::sizing::SizingLimits;
use crate::spring::extension::ExtensionRate;
use crate::spring::helical::CoilDiameter;
use crate::spring::table::TablePoint;
use crate::spring::torsion::TorsionRate;
use crate::spring::{
    DiscSpec, ExtensionSpec, GasSpec, HelicalSpec, LinearSpec, Material, SpringModel, SpringSpec,
    TableSpec, TorsionSpec,
};
use crate::units::Dim;
use std::f64::consts::PI;

/// Field identifications met while reading the spring.
#[derive(Debug, Clone, Default)]
pub struct Identified {
    /// The method the rate is taken from.
    pub primary: Option<RateEstimate>,
    /// A second method on the same spring, for comparison.
    pub check: Option<RateEstimate>,
}

/// Default unit of a bare number, per kind of quantity.
pub fn default_unit(dim: Dim) -> &'static str {
    match dim {
        Dim::Length => "mm",
        Dim::Area => "mm²",
        Dim::Force => "N",
        Dim::Mass => "kg",
        Dim::Energy => "J",
        Dim::LinearRate => "N/mm",
        Dim::TorsionalRate => "N·m/rad",
        Dim::Speed => "m/s",
        Dim::AngularSpeed => "rad/s",
        Dim::Acceleration => "m/s²",
        Dim::Pressure => "N/mm²",
        Dim::Angle => "deg",
        Dim::Torque => "N·m",
        Dim::Inertia => "kg·m²",
        Dim::Time => "s",
        Dim::Frequency => "1/h",
        Dim::Power => "W",
        Dim::LinearDamping => "N·s/m",
        Dim::QuadraticDamping => "N·s²/m²",
        Dim::Density => "kg/m³",
        Dim::Ratio | Dim::Probability => "",
    }
}

/// A scenario read into SI models.
#[derive(Debug, Clone)]
pub struct Model {
    /// What moves; `None` when its inputs are unusable.
    pub part: Option<PartModel>,
    /// The spring and mount; `None` when absent or unusable (see
    /// `spring_given`).
    pub spring: Option<SpringSetup>,
    /// Whether the scenario has a spring at all.
    pub spring_given: bool,
    /// Further named states (name, deflection).
    pub extra_states: Vec<(String, f64)>,
    /// The contact.
    pub contact: ContactModel,
    /// The closing gap.
    pub gap: Option<GapModel>,
    /// Limits that apply.
    pub limits: LimitsModel,
    /// Sizing request.
    pub sizing: Option<SizingLimits>,
    /// Releases per hour; `None` when what was entered is unusable.
    pub cycles_per_hour: Option<f64>,
    /// Field identification of the spring, when used.
    pub identification: Option<RateEstimate>,
    /// A second identification of the same spring, to compare with.
    pub identification_check: Option<RateEstimate>,
}

/// What moves, in SI.
#[derive(Debug, Clone, PartialEq)]
pub enum PartModel {
    /// A sliding part.
    Translating {
        /// kg.
        mass: f64,
        /// m.
        travel: f64,
        /// rad.
        incline: f64,
        /// Friction.
        friction: Friction,
        /// N·s/m.
        damping: f64,
        /// N.
        drive_force: f64,
        /// Add the spring's mass share.
        include_spring_mass: bool,
    },
    /// A hinged part.
    Rotating {
        /// Inertia.
        inertia: InertiaSpec,
        /// rad.
        hinge_tilt: f64,
        /// rad.
        cg_angle_at_latch: f64,
        /// rad.
        travel: f64,
        /// N·m.
        friction_torque: f64,
        /// N·m.
        drive_torque: f64,
        /// m.
        hazard_radius: f64,
    },
}

/// Spring and mount, in SI.
#[derive(Debug, Clone)]
pub struct SpringSetup {
    /// The spring model.
    pub spring: SpringModel,
    /// How it is mounted.
    pub mount: MountModel,
}

/// Mount, in SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum MountModel {
    /// Direct mount.
    Direct {
        /// m or rad.
        deflection_at_latch: f64,
        /// Sense.
        sense: Sense,
        /// Detaches at free length.
        detaches: bool,
    },
    /// Strut.
    Strut {
        /// m.
        frame_point: [f64; 2],
        /// m.
        part_radius: f64,
        /// rad.
        part_angle: f64,
        /// m.
        free_length: f64,
        /// Mode.
        mode: StrutMode,
    },
}

/// Contact, in SI.
#[derive(Debug, Clone)]
pub enum ContactModel {
    /// None.
    None,
    /// Buffer.
    Buffer(BufferModel),
    /// Body region.
    Body(BodyModel),
    /// The contact inputs are unusable.
    Invalid,
}

/// Buffer, in SI.
#[derive(Debug, Clone)]
pub struct BufferModel {
    /// Force law.
    pub law: LawModel,
    /// Count.
    pub count: u32,
    /// Restitution coefficient, if given.
    pub restitution: Option<f64>,
    /// Radius of action on a hinged part (m).
    pub radius: Option<f64>,
}

/// Buffer force law, in SI.
#[derive(Debug, Clone)]
pub enum LawModel {
    /// F = k·x.
    Linear {
        /// N/m.
        rate: f64,
        /// m.
        stroke: f64,
    },
    /// F = a·xⁿ.
    PowerLaw {
        /// N/mⁿ.
        coefficient: f64,
        /// n.
        exponent: f64,
        /// m.
        stroke: f64,
    },
    /// A spring model.
    Spring {
        /// The spring.
        spring: Box<SpringModel>,
        /// m.
        preload: f64,
    },
    /// Constant force.
    ConstantForce {
        /// N.
        force: f64,
        /// m.
        stroke: f64,
    },
    /// Ideal absorber.
    Absorber {
        /// m.
        stroke: f64,
        /// η.
        efficiency: f64,
    },
    /// F = c·v².
    Orifice {
        /// N·s²/m².
        coefficient: f64,
        /// m.
        stroke: f64,
    },
}

/// Body contact, in SI.
#[derive(Debug, Clone)]
pub struct BodyModel {
    /// Region.
    pub region: RegionId,
    /// Specific area key.
    pub specific_area: Option<String>,
    /// Area shape.
    pub area: ContactArea,
    /// Padding.
    pub padding: Option<Padding>,
}

/// Gap, in SI.
#[derive(Debug, Clone, PartialEq)]
pub struct GapModel {
    /// Geometry.
    pub geometry: GapGeometryModel,
    /// Body parts.
    pub parts: Vec<BodyPart>,
}

/// Gap geometry, in SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum GapGeometryModel {
    /// Closed.
    Closed,
    /// Fixed clearance (m).
    Clearance(f64),
    /// Buffer stop with gap at first contact (m).
    BufferStop(f64),
}

/// Limits, in SI.
#[derive(Debug, Clone, Default)]
pub struct LimitsModel {
    /// Guard.
    pub guard: Option<(GuardKind, bool)>,
    /// Body-region limits.
    pub body_region: bool,
    /// EN 81-20 (type, rated speed m/s).
    pub en81: Option<(En81BufferType, f64)>,
    /// US lift (installation, type, rated speed m/s, limiter).
    pub us: Option<(UsInstallation, UsBufferType, f64, bool)>,
    /// Crane (travel, rated speed m/s).
    pub crane: Option<(CraneTravel, f64)>,
    /// Gate (gap width m).
    pub gate: Option<f64>,
    /// User limits.
    pub user: Vec<UserLimit>,
}

/// Read a scenario. Errors are collected in `reader.errors`.
pub fn resolve(s: &Scenario, r: &mut Reader<'_>) -> Model {
    let part = r.within("part", |r| part(&s.part, r));
    let is_rotating = matches!(s.part, PartInput::Rotating(_));
    let mut identification = Identified::default();
    let spring = match &s.spring {
        None => None,
        Some(sp) => r.within("spring", |r| {
            let model = r.within("model", |r| spring_model(&sp.model, r, &mut identification));
            let mount = r.within("mount", |r| mount(&sp.mount, r, is_rotating));
            match (model, mount) {
                (Some(spring), Some(mount)) => Some(SpringSetup { spring, mount }),
                _ => None,
            }
        }),
    };
    let extra_states = r.within("states", |r| {
        let mut out = Vec::new();
        for (i, st) in s.states.iter().enumerate() {
            let dim = if is_rotating { Dim::Angle } else { Dim::Length };
            let v = r.within(&i.to_string(), |r| {
                r.num(
                    "deflection",
                    &st.deflection,
                    dim,
                    default_unit(dim),
                    Rule::Any,
                )
            });
            if let Some(v) = v {
                out.push((st.name.clone(), v));
            }
        }
        out
    });
    let contact = r.within("contact", |r| contact(&s.contact, r));
    let gap = s.gap.as_ref().and_then(|g| r.within("gap", |r| gap(g, r)));
    let limits = r.within("limits", |r| limits(&s.limits, r));
    let sizing = s
        .sizing
        .as_ref()
        .map(|z| r.within("sizing", |r| sizing(z, r)));
    if s.study.monte_carlo && !(1..=MAX_STUDY_SAMPLES).contains(&s.study.samples) && !r.is_replay()
    {
        r.within("study", |r| {
            r.error(
                "samples",
                format!("the Monte Carlo study takes 1 to {MAX_STUDY_SAMPLES} samples"),
            );
        });
    }
    let cycles_per_hour = r
        .or(
            "cycles_per_hour",
            &s.cycles_per_hour,
            Dim::Frequency,
            "1/h",
            Rule::NonNegative,
            0.0,
        )
        .map(|hz| hz * 3600.0);
    Model {
        part,
        spring,
        spring_given: s.spring.is_some(),
        extra_states,
        contact,
        gap,
        limits,
        sizing,
        cycles_per_hour,
        identification: identification.primary,
        identification_check: identification.check,
    }
}

fn num(r: &mut Reader<'_>, field: &str, v: &Value, dim: Dim, rule: Rule) -> Option<f64> {
    r.num(field, v, dim, default_unit(dim), rule)
}

fn opt(r: &mut Reader<'_>, field: &str, v: &Option<Value>, dim: Dim, rule: Rule) -> Option<f64> {
    r.opt(field, v, dim, default_unit(dim), rule)
}

fn or(
    r: &mut Reader<'_>,
    field: &str,
    v: &Option<Value>,
    dim: Dim,
    rule: Rule,
    d: f64,
) -> Option<f64> {
    r.or(field, v, dim, default_unit(dim), rule, d)
}

fn part(p: &PartInput, r: &mut Reader<'_>) -> Option<PartModel> {
    match p {
        PartInput::Translating(t) => {
            let mass = num(r, "mass", &t.mass, Dim::Mass, Rule::Positive);
            let travel = num(r, "travel", &t.travel, Dim::Length, Rule::Positive);
            let incline = or(
                r,
                "incline",
                &t.incline,
                Dim::Angle,
                Rule::Range(-PI / 2.0, PI / 2.0),
                0.0,
            );
            let friction = match &t.friction {
                FrictionInput::None => Some(Friction::None),
                FrictionInput::Coefficient { mu } => r.within("friction", |r| {
                    num(r, "mu", mu, Dim::Ratio, Rule::Range(0.0, 2.0)).map(Friction::Coefficient)
                }),
                FrictionInput::Force { force } => r.within("friction", |r| {
                    num(r, "force", force, Dim::Force, Rule::NonNegative).map(Friction::Force)
                }),
            };
            let damping = or(
                r,
                "damping",
                &t.damping,
                Dim::LinearDamping,
                Rule::NonNegative,
                0.0,
            );
            let drive_force = or(r, "drive_force", &t.drive_force, Dim::Force, Rule::Any, 0.0);
            Some(PartModel::Translating {
                mass: mass?,
                travel: travel?,
                incline: incline?,
                friction: friction?,
                damping: damping?,
                drive_force: drive_force?,
                include_spring_mass: t.include_spring_mass,
            })
        }
        PartInput::Rotating(t) => {
            let inertia = r.within("inertia", |r| inertia(&t.inertia, r));
            let hinge_tilt = or(
                r,
                "hinge_tilt",
                &t.hinge_tilt,
                Dim::Angle,
                Rule::Range(0.0, PI / 2.0),
                PI / 2.0,
            );
            let cg_angle = or(
                r,
                "cg_angle_at_latch",
                &t.cg_angle_at_latch,
                Dim::Angle,
                Rule::Range(-2.0 * PI, 2.0 * PI),
                0.0,
            );
            let travel = num(
                r,
                "travel",
                &t.travel,
                Dim::Angle,
                Rule::Range(1e-9, 2.0 * PI),
            );
            let friction_torque = or(
                r,
                "friction_torque",
                &t.friction_torque,
                Dim::Torque,
                Rule::NonNegative,
                0.0,
            );
            let drive_torque = or(
                r,
                "drive_torque",
                &t.drive_torque,
                Dim::Torque,
                Rule::Any,
                0.0,
            );
            let hazard_radius = num(
                r,
                "hazard_radius",
                &t.hazard_radius,
                Dim::Length,
                Rule::Positive,
            );
            Some(PartModel::Rotating {
                inertia: inertia?,
                hinge_tilt: hinge_tilt?,
                cg_angle_at_latch: cg_angle?,
                travel: travel?,
                friction_torque: friction_torque?,
                drive_torque: drive_torque?,
                hazard_radius: hazard_radius?,
            })
        }
    }
}

fn inertia(i: &InertiaInput, r: &mut Reader<'_>) -> Option<InertiaSpec> {
    let mut pair = |a: (&str, &Value, Dim), b: (&str, &Value, Dim)| {
        let x = num(r, a.0, a.1, a.2, Rule::Positive);
        let y = num(r, b.0, b.1, b.2, Rule::Positive);
        Some((x?, y?))
    };
    match i {
        InertiaInput::Given {
            inertia,
            mass,
            cg_radius,
        } => {
            let ii = num(r, "inertia", inertia, Dim::Inertia, Rule::Positive);
            let m = num(r, "mass", mass, Dim::Mass, Rule::NonNegative);
            let c = num(r, "cg_radius", cg_radius, Dim::Length, Rule::NonNegative);
            Some(InertiaSpec::Given {
                inertia: ii?,
                mass: m?,
                cg_radius: c?,
            })
        }
        InertiaInput::Plate { mass, width } => {
            pair(("mass", mass, Dim::Mass), ("width", width, Dim::Length))
                .map(|(mass, width)| InertiaSpec::PlateAboutEdge { mass, width })
        }
        InertiaInput::Rod { mass, length } => {
            pair(("mass", mass, Dim::Mass), ("length", length, Dim::Length))
                .map(|(mass, length)| InertiaSpec::RodAboutEnd { mass, length })
        }
        InertiaInput::Disc { mass, radius } => {
            pair(("mass", mass, Dim::Mass), ("radius", radius, Dim::Length))
                .map(|(mass, radius)| InertiaSpec::DiscAboutCentre { mass, radius })
        }
        InertiaInput::Point { mass, radius } => {
            pair(("mass", mass, Dim::Mass), ("radius", radius, Dim::Length))
                .map(|(mass, radius)| InertiaSpec::PointMass { mass, radius })
        }
        InertiaInput::Offset {
            mass,
            inertia_about_cg,
            distance,
        } => {
            let m = num(r, "mass", mass, Dim::Mass, Rule::Positive);
            let ic = num(
                r,
                "inertia_about_cg",
                inertia_about_cg,
                Dim::Inertia,
                Rule::NonNegative,
            );
            let d = num(r, "distance", distance, Dim::Length, Rule::NonNegative);
            Some(InertiaSpec::Offset {
                mass: m?,
                inertia_about_cg: ic?,
                distance: d?,
            })
        }
    }
}

/// Read a spring model and build it; the model's own validation errors are
/// reported under the current path.
fn spring_model(
    m: &SpringModelInput,
    r: &mut Reader<'_>,
    identification: &mut Identified,
) -> Option<SpringModel> {
    let spec = spring_spec(m, r, identification)?;
    match spec.build() {
        Ok(model) => Some(model),
        Err(e) => {
            if !r.is_replay() {
                r.model_error(e);
            }
            None
        }
    }
}

fn spring_spec(
    m: &SpringModelInput,
    r: &mut Reader<'_>,
    identification: &mut Identified,
) -> Option<SpringSpec> {
    match m {
        SpringModelInput::Linear {
            rate,
            max_deflection,
        } => {
            let k = num(r, "rate", rate, Dim::LinearRate, Rule::Positive);
            let q = num(
                r,
                "max_deflection",
                max_deflection,
                Dim::Length,
                Rule::Positive,
            );
            Some(SpringSpec::Linear(LinearSpec {
                rate: k?,
                free_length: None,
                max_deflection: Some(q?),
                solid_length: None,
            }))
        }
        SpringModelInput::Helical(h) => {
            let d = num(
                r,
                "wire_diameter",
                &h.wire_diameter,
                Dim::Length,
                Rule::Positive,
            );
            let dc = num(
                r,
                "coil_diameter",
                &h.coil_diameter,
                Dim::Length,
                Rule::Positive,
            );
            let n = num(
                r,
                "active_coils",
                &h.active_coils,
                Dim::Ratio,
                Rule::Positive,
            );
            let nt = opt(r, "total_coils", &h.total_coils, Dim::Ratio, Rule::Positive);
            let l0 = num(
                r,
                "free_length",
                &h.free_length,
                Dim::Length,
                Rule::Positive,
            );
            let dc = dc?;
            Some(SpringSpec::Helical(HelicalSpec {
                wire_diameter: d?,
                coil_diameter: match h.diameter_kind {
                    DiameterKind::Mean => CoilDiameter::Mean(dc),
                    DiameterKind::Outside => CoilDiameter::Outside(dc),
                    DiameterKind::Inside => CoilDiameter::Inside(dc),
                },
                active_coils: n?,
                total_coils: nt,
                ends: h.ends,
                free_length: l0?,
                material: Material::Grade { grade: h.material },
                solid_length: None,
                tensile_strength: None,
                permissible_stress_fraction: None,
                seating: h.seating,
            }))
        }
        SpringModelInput::Extension {
            initial_tension,
            rate,
            max_deflection,
        } => {
            let f0 = num(
                r,
                "initial_tension",
                initial_tension,
                Dim::Force,
                Rule::NonNegative,
            );
            let k = num(r, "rate", rate, Dim::LinearRate, Rule::Positive);
            let q = num(
                r,
                "max_deflection",
                max_deflection,
                Dim::Length,
                Rule::Positive,
            );
            Some(SpringSpec::Extension(ExtensionSpec {
                initial_tension: f0?,
                rate: ExtensionRate::Given { rate: k? },
                max_deflection: q?,
                free_length: None,
            }))
        }
        SpringModelInput::Torsion { rate, max_angle } => {
            let k = num(r, "rate", rate, Dim::TorsionalRate, Rule::Positive);
            let q = num(r, "max_angle", max_angle, Dim::Angle, Rule::Positive);
            Some(SpringSpec::Torsion(TorsionSpec {
                rate: TorsionRate::Given { rate: k? },
                max_angle: q?,
            }))
        }
        SpringModelInput::Gas {
            nominal_force,
            progression,
            stroke,
            friction_band,
            force_reference,
            polytropic_index,
        } => {
            let f1 = num(
                r,
                "nominal_force",
                nominal_force,
                Dim::Force,
                Rule::Positive,
            );
            let p = num(
                r,
                "progression",
                progression,
                Dim::Ratio,
                Rule::Range(1.0, 10.0),
            );
            let s = num(r, "stroke", stroke, Dim::Length, Rule::Positive);
            let fb = or(
                r,
                "friction_band",
                friction_band,
                Dim::Force,
                Rule::NonNegative,
                0.0,
            );
            let kappa = opt(
                r,
                "polytropic_index",
                polytropic_index,
                Dim::Ratio,
                Rule::Range(1.0, 1.67),
            );
            Some(SpringSpec::Gas(GasSpec {
                nominal_force: f1?,
                progression: p?,
                stroke: s?,
                friction_band: fb?,
                force_reference: *force_reference,
                polytropic_index: kappa,
                moving_mass: None,
            }))
        }
        SpringModelInput::Disc(d) => {
            let de = num(
                r,
                "outer_diameter",
                &d.outer_diameter,
                Dim::Length,
                Rule::Positive,
            );
            let di = num(
                r,
                "inner_diameter",
                &d.inner_diameter,
                Dim::Length,
                Rule::Positive,
            );
            let t = num(r, "thickness", &d.thickness, Dim::Length, Rule::Positive);
            let h0 = num(
                r,
                "cone_height",
                &d.cone_height,
                Dim::Length,
                Rule::Positive,
            );
            let e = or(
                r,
                "youngs_modulus",
                &d.youngs_modulus,
                Dim::Pressure,
                Rule::Positive,
                206e9,
            );
            let mu = or(
                r,
                "poisson_ratio",
                &d.poisson_ratio,
                Dim::Ratio,
                Rule::Range(0.0, 0.49),
                0.3,
            );
            Some(SpringSpec::Disc(DiscSpec {
                outer_diameter: de?,
                inner_diameter: di?,
                thickness: t?,
                cone_height: h0?,
                youngs_modulus: e?,
                poisson_ratio: mu?,
                in_series: d.in_series,
                in_parallel: d.in_parallel,
                constant: DiscConstant::En16984K1,
                friction: None,
                density: None,
            }))
        }
        SpringModelInput::Table(t) => {
            let (qd, fd) = match t.axis {
                Axis::Linear => (Dim::Length, Dim::Force),
                Axis::Rotary => (Dim::Angle, Dim::Torque),
            };
            let read_points = |name: &str, pts: &[PointInput], r: &mut Reader<'_>| {
                r.within(name, |r| {
                    let mut out = Vec::new();
                    let mut ok = true;
                    for (i, p) in pts.iter().enumerate() {
                        let pt = r.within(&i.to_string(), |r| {
                            let q = num(r, "deflection", &p.deflection, qd, Rule::Any);
                            let f = num(r, "force", &p.force, fd, Rule::Any);
                            Some(TablePoint {
                                deflection: q?,
                                force: f?,
                            })
                        });
                        match pt {
                            Some(p) => out.push(p),
                            None => ok = false,
                        }
                    }
                    ok.then_some(out)
                })
            };
            let loading = read_points("loading", &t.loading, r);
            let unloading = if t.unloading.is_empty() {
                Some(None)
            } else {
                read_points("unloading", &t.unloading, r).map(Some)
            };
            Some(SpringSpec::Table(TableSpec {
                axis: t.axis,
                loading: loading?,
                unloading: unloading?,
                effective_mass: None,
            }))
        }
        SpringModelInput::Measured(mi) => {
            let est = r.within("method", |r| identify_rate(&mi.method, r));
            let check = mi
                .cross_check
                .as_ref()
                .and_then(|c| r.within("cross_check", |r| identify_rate(c, r)));
            let q = num(
                r,
                "max_deflection",
                &mi.max_deflection,
                Dim::Length,
                Rule::Positive,
            );
            let est = est?;
            // The identified rate enters the tolerance study as an input of
            // its own: normal, with three standard uncertainties as the band.
            let u = est.rate.standard_uncertainty;
            let tol = (u > 0.0 && u.is_finite()).then_some(TolText::Absolute(3.0 * u));
            let k = r.derived("rate", Dim::LinearRate, est.rate.value, tol, Rule::Positive);
            if !r.is_replay() {
                identification.primary = Some(est);
                identification.check = check;
            }
            Some(SpringSpec::Linear(LinearSpec {
                rate: k?,
                free_length: None,
                max_deflection: Some(q?),
                solid_length: None,
            }))
        }
        SpringModelInput::Series { members } | SpringModelInput::Parallel { members } => {
            let mut specs = Vec::new();
            let mut ok = true;
            r.within("members", |r| {
                for (i, mm) in members.iter().enumerate() {
                    match r.within(&i.to_string(), |r| spring_spec(mm, r, identification)) {
                        Some(s) => specs.push(s),
                        None => ok = false,
                    }
                }
            });
            if !ok {
                return None;
            }
            Some(match m {
                SpringModelInput::Series { .. } => SpringSpec::Series { members: specs },
                _ => SpringSpec::Parallel { members: specs },
            })
        }
    }
}

/// Rectangular half-width `a` to a standard uncertainty `a/√3` (GUM 4.3.7).
fn rect(a: Option<TolText>, nominal: f64) -> f64 {
    match a {
        Some(TolText::Absolute(a)) => a / 3f64.sqrt(),
        Some(TolText::Relative(f)) => f * nominal.abs() / 3f64.sqrt(),
        None => 0.0,
    }
}

fn identify_rate(m: &IdentifyInput, r: &mut Reader<'_>) -> Option<RateEstimate> {
    let outcome = match m {
        IdentifyInput::Static {
            mass,
            sag,
            resolution,
        } => {
            let mv = num(r, "mass", mass, Dim::Mass, Rule::Positive)?;
            let um = rect(r.take_tolerance(), mv);
            let s = num(r, "sag", sag, Dim::Length, Rule::Positive)?;
            let a = num(r, "resolution", resolution, Dim::Length, Rule::NonNegative)?;
            identify::static_rate(&identify::StaticInput {
                mass: mv,
                mass_uncertainty: um,
                sag: s,
                sag_tolerance: a,
                gravity: None,
                gravity_uncertainty: None,
            })
        }
        IdentifyInput::Dynamic {
            mass,
            oscillations,
            time,
            timing_uncertainty,
            spring_mass,
        } => {
            let mv = num(r, "mass", mass, Dim::Mass, Rule::Positive)?;
            let um = rect(r.take_tolerance(), mv);
            let n = num(
                r,
                "oscillations",
                oscillations,
                Dim::Ratio,
                Rule::Range(1.0, 1e6),
            )?;
            let t = num(r, "time", time, Dim::Time, Rule::Positive)?;
            let ut = opt(
                r,
                "timing_uncertainty",
                timing_uncertainty,
                Dim::Time,
                Rule::NonNegative,
            );
            let ms = opt(r, "spring_mass", spring_mass, Dim::Mass, Rule::NonNegative);
            if n.fract() != 0.0 {
                r.error(
                    "oscillations",
                    "a whole number of full oscillations, e.g. 10",
                );
                return None;
            }
            identify::dynamic_rate(&identify::DynamicInput {
                mass: mv,
                mass_uncertainty: um,
                // In range 1..=1e6 and whole, checked above.
                oscillations: n as u32,
                time: t,
                timing_uncertainty: ut,
                spring_mass: ms,
                spring_mass_uncertainty: 0.0,
            })
        }
        IdentifyInput::TwoPoint {
            length_1,
            force_1,
            length_2,
            force_2,
            force_uncertainty,
            length_uncertainty,
        } => {
            let l1 = num(r, "length_1", length_1, Dim::Length, Rule::Positive);
            let f1 = num(r, "force_1", force_1, Dim::Force, Rule::Any);
            let l2 = num(r, "length_2", length_2, Dim::Length, Rule::Positive);
            let f2 = num(r, "force_2", force_2, Dim::Force, Rule::Any);
            let uf = num(
                r,
                "force_uncertainty",
                force_uncertainty,
                Dim::Force,
                Rule::NonNegative,
            );
            let ul = num(
                r,
                "length_uncertainty",
                length_uncertainty,
                Dim::Length,
                Rule::NonNegative,
            );
            identify::two_point(&identify::TwoPointInput {
                kind: identify::GaugedSpring::Compression,
                length_1: l1?,
                force_1: f1?,
                length_2: l2?,
                force_2: f2?,
                length_uncertainty: ul?,
                force_uncertainty: uf?,
                gauge_zero_uncertainty: 0.0,
                at_length: None,
                closed_length: None,
            })
            .map(|t| t.rate)
        }
    };
    match outcome {
        Ok(e) => Some(e),
        Err(e) => {
            if !r.is_replay() {
                r.model_error(e);
            }
            None
        }
    }
}

fn mount(m: &MountInput, r: &mut Reader<'_>, rotating: bool) -> Option<MountModel> {
    match m {
        MountInput::Direct {
            deflection_at_latch,
            sense,
            detaches,
        } => {
            let dim = if rotating { Dim::Angle } else { Dim::Length };
            let q = num(
                r,
                "deflection_at_latch",
                deflection_at_latch,
                dim,
                Rule::Any,
            )?;
            Some(MountModel::Direct {
                deflection_at_latch: q,
                sense: match sense {
                    SenseInput::Unloads => Sense::Unloads,
                    SenseInput::Loads => Sense::Loads,
                },
                detaches: *detaches,
            })
        }
        MountInput::Strut {
            frame_x,
            frame_y,
            part_radius,
            part_angle,
            free_length,
            mode,
        } => {
            if !rotating {
                r.error(
                    "kind",
                    "a strut mount needs a hinged part; a sliding part takes a direct mount",
                );
                return None;
            }
            let x = num(r, "frame_x", frame_x, Dim::Length, Rule::Any);
            let y = num(r, "frame_y", frame_y, Dim::Length, Rule::Any);
            let rb = num(r, "part_radius", part_radius, Dim::Length, Rule::Positive);
            let b = num(
                r,
                "part_angle",
                part_angle,
                Dim::Angle,
                Rule::Range(-2.0 * PI, 2.0 * PI),
            );
            let l0 = num(r, "free_length", free_length, Dim::Length, Rule::Positive);
            Some(MountModel::Strut {
                frame_point: [x?, y?],
                part_radius: rb?,
                part_angle: b?,
                free_length: l0?,
                mode: match mode {
                    StrutModeInput::Compression => StrutMode::Compression,
                    StrutModeInput::Extension => StrutMode::Extension,
                },
            })
        }
    }
}

fn contact(c: &ContactInput, r: &mut Reader<'_>) -> ContactModel {
    match c {
        ContactInput::None => ContactModel::None,
        ContactInput::Buffer(b) => {
            let law = r.within("law", |r| buffer_law(&b.law, r));
            let e = opt(
                r,
                "restitution",
                &b.restitution,
                Dim::Ratio,
                Rule::Range(0.0, 1.0),
            );
            let radius = opt(r, "radius", &b.radius, Dim::Length, Rule::Positive);
            if b.count == 0 {
                r.error("count", "at least 1 buffer");
                return ContactModel::Invalid;
            }
            match law {
                Some(law) => ContactModel::Buffer(BufferModel {
                    law,
                    count: b.count,
                    restitution: e,
                    radius,
                }),
                None => ContactModel::Invalid,
            }
        }
        ContactInput::Body(b) => {
            let area = r.within("area", |r| match &b.area {
                AreaInput::Edge { length, width } => {
                    let l = num(r, "length", length, Dim::Length, Rule::Positive);
                    let w = num(r, "width", width, Dim::Length, Rule::Positive);
                    Some(ContactArea::Edge {
                        length: l?,
                        width: w?,
                    })
                }
                AreaInput::Circle { diameter } => {
                    num(r, "diameter", diameter, Dim::Length, Rule::Positive)
                        .map(|diameter| ContactArea::Circle { diameter })
                }
                AreaInput::Given { area } => num(r, "area", area, Dim::Area, Rule::Positive)
                    .map(|area| ContactArea::Given { area }),
            });
            let padding = match &b.padding {
                None => Some(None),
                Some(p) => r.within("padding", |r| {
                    let k = num(
                        r,
                        "stiffness",
                        &p.stiffness,
                        Dim::LinearRate,
                        Rule::Positive,
                    );
                    let t = opt(r, "thickness", &p.thickness, Dim::Length, Rule::Positive);
                    Some(Some(Padding {
                        stiffness: k?,
                        thickness: t,
                    }))
                }),
            };
            if let Some(key) = &b.specific_area {
                if let Err(e) = b.region.area(Some(key)) {
                    if !r.is_replay() {
                        r.error("specific_area", e.message());
                    }
                    return ContactModel::Invalid;
                }
            }
            match (area, padding) {
                (Some(area), Some(padding)) => ContactModel::Body(BodyModel {
                    region: b.region,
                    specific_area: b.specific_area.clone(),
                    area,
                    padding,
                }),
                _ => ContactModel::Invalid,
            }
        }
    }
}

fn buffer_law(l: &BufferLawInput, r: &mut Reader<'_>) -> Option<LawModel> {
    match l {
        BufferLawInput::Linear { rate, stroke } => {
            let k = num(r, "rate", rate, Dim::LinearRate, Rule::Positive);
            let s = num(r, "stroke", stroke, Dim::Length, Rule::Positive);
            Some(LawModel::Linear {
                rate: k?,
                stroke: s?,
            })
        }
        BufferLawInput::PowerLaw {
            force_at_stroke,
            exponent,
            stroke,
        } => {
            let f = num(
                r,
                "force_at_stroke",
                force_at_stroke,
                Dim::Force,
                Rule::Positive,
            );
            let n = num(r, "exponent", exponent, Dim::Ratio, Rule::Range(0.2, 10.0));
            let s = num(r, "stroke", stroke, Dim::Length, Rule::Positive);
            let (f, n, s) = (f?, n?, s?);
            // F = a·xⁿ through (s, F_s): a = F_s/sⁿ.
            Some(LawModel::PowerLaw {
                coefficient: f / s.powf(n),
                exponent: n,
                stroke: s,
            })
        }
        BufferLawInput::Spring {
            model,
            preload_deflection,
        } => {
            let mut ident = Identified::default();
            let spring = r.within("model", |r| spring_model(model, r, &mut ident));
            let pre = or(
                r,
                "preload_deflection",
                preload_deflection,
                Dim::Length,
                Rule::NonNegative,
                0.0,
            );
            Some(LawModel::Spring {
                spring: Box::new(spring?),
                preload: pre?,
            })
        }
        BufferLawInput::ConstantForce { force, stroke } => {
            let f = num(r, "force", force, Dim::Force, Rule::Positive);
            let s = num(r, "stroke", stroke, Dim::Length, Rule::Positive);
            Some(LawModel::ConstantForce {
                force: f?,
                stroke: s?,
            })
        }
        BufferLawInput::Absorber { stroke, efficiency } => {
            let s = num(r, "stroke", stroke, Dim::Length, Rule::Positive);
            let eta = or(
                r,
                "efficiency",
                efficiency,
                Dim::Ratio,
                Rule::Range(0.05, 1.0),
                0.9,
            );
            Some(LawModel::Absorber {
                stroke: s?,
                efficiency: eta?,
            })
        }
        BufferLawInput::Orifice {
            coefficient,
            stroke,
        } => {
            let c = num(
                r,
                "coefficient",
                coefficient,
                Dim::QuadraticDamping,
                Rule::Positive,
            );
            let s = num(r, "stroke", stroke, Dim::Length, Rule::Positive);
            Some(LawModel::Orifice {
                coefficient: c?,
                stroke: s?,
            })
        }
    }
}

fn gap(g: &GapInput, r: &mut Reader<'_>) -> Option<GapModel> {
    let geometry = r.within("geometry", |r| match &g.geometry {
        GapGeometryInput::Closed => Some(GapGeometryModel::Closed),
        GapGeometryInput::Clearance { gap } => {
            num(r, "gap", gap, Dim::Length, Rule::NonNegative).map(GapGeometryModel::Clearance)
        }
        GapGeometryInput::BufferStop {
            gap_at_buffer_contact,
        } => num(
            r,
            "gap_at_buffer_contact",
            gap_at_buffer_contact,
            Dim::Length,
            Rule::NonNegative,
        )
        .map(GapGeometryModel::BufferStop),
    })?;
    if g.body_parts.is_empty() && !r.is_replay() {
        r.error(
            "body_parts",
            "name at least one body part that can reach the gap",
        );
    }
    Some(GapModel {
        geometry,
        parts: g.body_parts.clone(),
    })
}

fn limits(l: &LimitsInput, r: &mut Reader<'_>) -> LimitsModel {
    let mut out = LimitsModel {
        guard: l.guard.as_ref().map(|g| (g.kind, g.protective_device)),
        body_region: l.body_region,
        ..LimitsModel::default()
    };
    if let Some(c) = &l.lift_en81 {
        out.en81 = r.within("lift_en81", |r| {
            num(r, "rated_speed", &c.rated_speed, Dim::Speed, Rule::Positive)
                .map(|v| (c.buffer_type, v))
        });
    }
    if let Some(c) = &l.lift_us {
        out.us = r.within("lift_us", |r| {
            num(r, "rated_speed", &c.rated_speed, Dim::Speed, Rule::Positive)
                .map(|v| (c.installation, c.buffer_type, v, c.terminal_speed_limiter))
        });
    }
    if let Some(c) = &l.crane {
        out.crane = r.within("crane", |r| {
            num(r, "rated_speed", &c.rated_speed, Dim::Speed, Rule::Positive).map(|v| (c.travel, v))
        });
    }
    if let Some(c) = &l.gate {
        out.gate = r.within("gate", |r| {
            num(r, "gap_width", &c.gap_width, Dim::Length, Rule::NonNegative)
        });
    }
    r.within("user", |r| {
        for (i, u) in l.user.iter().enumerate() {
            r.within(&i.to_string(), |r| {
                let Some(dim) = crate::report::figure_dim(&u.figure) else {
                    if !r.is_replay() {
                        r.error(
                            "figure",
                            format!(
                                "unknown figure `{}`; use one of the figure ids the report lists",
                                u.figure
                            ),
                        );
                    }
                    return;
                };
                if let Some(t) = num(r, "threshold", &u.threshold, dim, Rule::Any) {
                    out.user.push(UserLimit {
                        name: u.name.clone(),
                        figure: u.figure.clone(),
                        dim,
                        threshold: t,
                        comparison: u.comparison,
                        source: u.source.clone(),
                    });
                }
            });
        }
    });
    out
}

fn sizing(z: &SizingSpec, r: &mut Reader<'_>) -> SizingLimits {
    let g = |v: Option<f64>| v;
    SizingLimits {
        peak_force: g(opt(
            r,
            "peak_force",
            &z.peak_force,
            Dim::Force,
            Rule::Positive,
        )),
        peak_deceleration: opt(
            r,
            "peak_deceleration",
            &z.peak_deceleration,
            Dim::Acceleration,
            Rule::Positive,
        ),
        mean_deceleration: opt(
            r,
            "mean_deceleration",
            &z.mean_deceleration,
            Dim::Acceleration,
            Rule::Positive,
        ),
        stroke: opt(r, "stroke", &z.stroke, Dim::Length, Rule::Positive),
    }
}

/// Fill the informative `si` of every value in a scenario (for writing files).
pub fn fill_si(s: &mut Scenario) {
    let mut r = Reader::record();
    let _ = resolve(s, &mut r);
    let map: std::collections::HashMap<String, Option<f64>> = r
        .records
        .into_iter()
        .map(|rec| (rec.path, rec.si))
        .collect();
    visit_values(s, &mut |path, v| {
        v.si = map.get(path).copied().flatten();
    });
}

/// Call `f` on every `Value` of the scenario with its dotted path, in no
/// particular order. Used to fill SI values and by front ends that list the
/// inputs.
pub fn visit_values(s: &mut Scenario, f: &mut dyn FnMut(&str, &mut Value)) {
    let mut json = match serde_json::to_value(&*s) {
        Ok(j) => j,
        Err(_) => return,
    };
    walk(&mut json, String::new(), f);
    if let Ok(back) = serde_json::from_value::<Scenario>(json) {
        *s = back;
    }
}

fn is_value(obj: &serde_json::Map<String, serde_json::Value>) -> bool {
    obj.get("text").is_some_and(serde_json::Value::is_string)
        && obj
            .keys()
            .all(|k| matches!(k.as_str(), "text" | "si" | "tol" | "spread"))
}

fn walk(v: &mut serde_json::Value, path: String, f: &mut dyn FnMut(&str, &mut Value)) {
    match v {
        serde_json::Value::Object(obj) => {
            if is_value(obj) {
                if let Ok(mut val) = serde_json::from_value::<Value>(v.clone()) {
                    f(&path, &mut val);
                    if let Ok(back) = serde_json::to_value(&val) {
                        *v = back;
                    }
                }
                return;
            }
            for (k, child) in obj.iter_mut() {
                let p = if path.is_empty() {
                    k.clone()
                } else {
                    format!("{path}.{k}")
                };
                walk(child, p, f);
            }
        }
        serde_json::Value::Array(items) => {
            for (i, child) in items.iter_mut().enumerate() {
                walk(child, format!("{path}.{i}"), f);
            }
        }
        _ => {}
    }
}
