//! The input sections of the sheet, in the order the user thinks: identity
//! → what moves → the spring → the path → the contact and the closing gap →
//! the limits that apply → tolerances. Every control is bound to one member
//! of the scenario ([`crate::controls`]); a variant's fields appear when it
//! is chosen.

use crate::bind::Binding;
use crate::blank;
use crate::controls::*;
use crate::html::esc;
use crate::labels::{field_dom_id, humanise_id, label_of};
use crate::lens::model_mut;
use crate::state::Sheet;
use crate::system::DisplaySystem;
use joulewise_core::limits::body::BodyRegion;
use joulewise_core::limits::crane::CraneTravel;
use joulewise_core::limits::gaps::BodyPart;
use joulewise_core::limits::guards::GuardKind;
use joulewise_core::limits::lift::{En81BufferType, UsBufferType, UsInstallation};
use joulewise_core::limits::Comparison;
use joulewise_core::report::{figure_catalogue, figure_dim};
use joulewise_core::scenario::*;
use joulewise_core::spring::gas::ForceReference;
use joulewise_core::spring::helical::{EndType, Seating};
use joulewise_core::spring::material::Grade;
use joulewise_core::spring::Axis;
use joulewise_core::units::Dim;
use leptos::prelude::*;
use std::sync::Arc;

fn rotating() -> Binding<bool> {
    flag(|s| Some(matches!(s.part, PartInput::Rotating(_))))
}

/// The part's kind, read only (the choice in "What moves" changes it).
fn part_kind() -> Binding<&'static str> {
    bind(
        |s| Some(blank::part_kind(&s.part)),
        |_, _| {},
        "translating",
    )
}

/// Options of a choice, from a table.
fn opts(t: &[(&'static str, &'static str)]) -> Vec<(&'static str, &'static str)> {
    t.to_vec()
}

// ───────────────────────────────────────────────────────────── identity ──

/// Who, what, where, when.
pub fn identity() -> AnyView {
    fn line(field: usize, multiline: bool) -> AnyView {
        const F: [(&str, &str); 7] = [
            ("title", "Title"),
            ("machine_tag", "Machine tag or asset number"),
            ("location", "Location (plant, line, cell)"),
            ("assessor", "Assessor"),
            ("date", "Date"),
            ("revision", "Revision"),
            ("notes", "Notes"),
        ];
        fn slot(s: &mut Scenario, i: usize) -> Option<&mut String> {
            let id = &mut s.identity;
            Some(match i {
                0 => &mut id.title,
                1 => &mut id.machine_tag,
                2 => &mut id.location,
                3 => &mut id.assessor,
                4 => &mut id.date,
                5 => &mut id.revision,
                6 => &mut id.notes,
                _ => return None,
            })
        }
        let (key, label) = F.get(field).copied().unwrap_or(("", ""));
        text_line(
            format!("f-identity-{key}"),
            label.to_string(),
            bind(
                move |s| slot(s, field).map(|t| t.clone()),
                move |s, v| {
                    if let Some(t) = slot(s, field) {
                        *t = v
                    }
                },
                String::new(),
            ),
            multiline,
        )
    }
    section(
        "sec-identity",
        "Identity",
        vec![
            block("grid-2", (0..6).map(|i| line(i, false)).collect()),
            line(6, true),
        ],
    )
}

// ─────────────────────────────────────────────────────────── what moves ──

const PART_KINDS: &[(&str, &str)] = &[
    ("translating", "Sliding part (moves in a straight line)"),
    ("rotating", "Hinged part (turns about a hinge)"),
];

const INERTIA_SHAPES: &[(&str, &str)] = &[
    ("plate", "Plate hinged along one edge, I = m·w²/3"),
    ("rod", "Rod pivoted at one end, I = m·L²/3"),
    ("disc", "Disc turning about its centre, I = m·R²/2"),
    ("point", "Mass concentrated at a radius, I = m·r²"),
    (
        "offset",
        "Known inertia about its centre of mass, offset from the hinge",
    ),
    ("given", "Moment of inertia given directly"),
];

/// What moves: a sliding part with its mass, or a hinged part with its
/// moment of inertia (from a shape preset or given) and closing edge.
pub fn what_moves() -> AnyView {
    let kind = enum_binding(|s| Some(&mut s.part), blank::part_kind, blank::part);
    let body: Build = Arc::new(|k| match k {
        "rotating" => {
            let shape = enum_binding(
                |s| match &mut s.part {
                    PartInput::Rotating(r) => Some(&mut r.inertia),
                    _ => None,
                },
                blank::inertia_kind,
                blank::inertia,
            );
            vec![
                choice(
                    "f-part-inertia-shape",
                    "Shape of the part (moment of inertia)",
                    opts(INERTIA_SHAPES),
                    shape,
                ),
                switch(
                    shape,
                    Arc::new(|shape| {
                        let fields: &[&str] = match shape {
                            "given" => &["inertia", "mass", "cg_radius"],
                            "rod" => &["mass", "length"],
                            "disc" | "point" => &["mass", "radius"],
                            "offset" => &["mass", "inertia_about_cg", "distance"],
                            _ => &["mass", "width"],
                        };
                        vec![block(
                            "grid-2",
                            fields
                                .iter()
                                .map(|f| qty(format!("part.inertia.{f}"), inertia_dim(f)))
                                .collect(),
                        )]
                    }),
                ),
                qty("part.hazard_radius", Dim::Length),
            ]
        }
        _ => vec![
            qty("part.mass", Dim::Mass),
            tick(
                "f-part-include_spring_mass",
                "Add the spring's own moving mass share (a third of a helical spring's mass)",
                bind(
                    |s| match &s.part {
                        PartInput::Translating(t) => Some(t.include_spring_mass),
                        _ => None,
                    },
                    |s, v| {
                        if let PartInput::Translating(t) = &mut s.part {
                            t.include_spring_mass = v;
                        }
                    },
                    true,
                ),
            ),
        ],
    });
    section(
        "sec-part",
        "What moves",
        vec![
            choice("f-part-kind", "Kind of part", opts(PART_KINDS), kind),
            switch(kind, body),
        ],
    )
}

fn inertia_dim(f: &str) -> Dim {
    match f {
        "inertia" | "inertia_about_cg" => Dim::Inertia,
        "mass" => Dim::Mass,
        _ => Dim::Length,
    }
}

// ───────────────────────────────────────────────────────────── the spring ──

const MODELS: &[(&str, &str)] = &[
    ("linear", "Linear spring, rate given"),
    (
        "helical",
        "Helical compression spring, from its geometry (EN 13906-1)",
    ),
    ("extension", "Extension spring, initial tension and rate"),
    ("torsion", "Torsion spring, rate per angle"),
    ("gas", "Gas spring (gas strut)"),
    ("disc", "Disc-spring stack (EN 16984)"),
    ("table", "Measured force–deflection table"),
    ("measured", "Spring measured in the field (no data sheet)"),
    ("series", "Springs in series (same force, deflections add)"),
    (
        "parallel",
        "Springs in parallel (same deflection, forces add)",
    ),
];

/// The spring that stores the energy, if any.
pub fn spring() -> AnyView {
    let present = bind(
        |s| Some(s.spring.is_some()),
        |s, on| {
            if on != s.spring.is_some() {
                s.spring = on.then(blank::spring);
            }
        },
        true,
    );
    section(
        "sec-spring",
        "The spring",
        vec![
            tick(
                "f-spring-present",
                "A spring stores energy in this mechanism",
                present,
            ),
            when(
                present,
                Arc::new(|| vec![spring_model_editor("spring.model".to_string())]),
            ),
        ],
    )
}

/// The editor of the spring model at `prefix` (the spring's own, a member
/// of a combination, a buffer's spring).
pub fn spring_model_editor(prefix: String) -> AnyView {
    let p0 = prefix.clone();
    let kind = enum_binding(move |s| model_mut(s, &p0), blank::model_kind, blank::model);
    let label = if prefix.contains("members") {
        "Kind of member spring"
    } else {
        "Kind of spring"
    };
    let pre = prefix.clone();
    let body: Build = Arc::new(move |k| {
        let f = |name: &str| format!("{pre}.{name}");
        let pair = |a: (&str, Dim), b: (&str, Dim)| {
            block("grid-2", vec![qty(f(a.0), a.1), qty(f(b.0), b.1)])
        };
        match k {
            "linear" => vec![pair(
                ("rate", Dim::LinearRate),
                ("max_deflection", Dim::Length),
            )],
            "extension" => vec![block(
                "grid-2",
                vec![
                    qty(f("initial_tension"), Dim::Force),
                    qty(f("rate"), Dim::LinearRate),
                    qty(f("max_deflection"), Dim::Length),
                ],
            )],
            "torsion" => vec![pair(
                ("rate", Dim::TorsionalRate),
                ("max_angle", Dim::Angle),
            )],
            "helical" => vec![helical(&pre)],
            "gas" => vec![gas(&pre)],
            "disc" => vec![disc(&pre)],
            "table" => table(&pre),
            "measured" => measured(&pre),
            "series" | "parallel" => members(&pre),
            _ => Vec::new(),
        }
    });
    block(
        "model",
        vec![
            choice(
                field_dom_id(&format!("{prefix}.model")),
                label,
                opts(MODELS),
                kind,
            ),
            switch(kind, body),
        ],
    )
}

/// A choice of a plain (data-free) enum inside a spring model, by index
/// into `options` (key, words).
fn model_enum(
    prefix: &str,
    field: &'static str,
    label: &'static str,
    options: &[(&'static str, &'static str)],
    get: fn(&SpringModelInput) -> Option<usize>,
    set: fn(&mut SpringModelInput, usize),
) -> AnyView {
    let (p, q) = (prefix.to_string(), prefix.to_string());
    let keys: Vec<&'static str> = options.iter().map(|o| o.0).collect();
    let keys2 = keys.clone();
    let b = bind(
        move |s| keys.get(get(model_mut(s, &p)?)?).copied(),
        move |s, key| {
            if let (Some(m), Some(i)) = (model_mut(s, &q), keys2.iter().position(|k| *k == key)) {
                set(m, i);
            }
        },
        "",
    );
    choice(
        field_dom_id(&format!("{prefix}.{field}")),
        label,
        options.to_vec(),
        b,
    )
}

macro_rules! helical_enum {
    ($field:ident, $all:expr) => {
        (
            |m: &SpringModelInput| match m {
                SpringModelInput::Helical(h) => $all.iter().position(|x| *x == h.$field),
                _ => None,
            },
            |m: &mut SpringModelInput, i: usize| {
                if let (SpringModelInput::Helical(h), Some(v)) = (m, $all.get(i)) {
                    h.$field = *v;
                }
            },
        )
    };
}

const DIAMETER_KINDS: [DiameterKind; 3] = [
    DiameterKind::Mean,
    DiameterKind::Outside,
    DiameterKind::Inside,
];
const END_TYPES: [EndType; 4] = [
    EndType::ClosedGround,
    EndType::ClosedUnground,
    EndType::OpenGround,
    EndType::Open,
];
const SEATINGS: [Seating; 5] = [
    Seating::BothFixed,
    Seating::FixedPivoted,
    Seating::BothPivoted,
    Seating::FixedGuidedSideways,
    Seating::FixedFree,
];

fn helical(prefix: &str) -> AnyView {
    let f = |name: &str| format!("{prefix}.{name}");
    let (g1, s1) = helical_enum!(diameter_kind, DIAMETER_KINDS);
    let (g2, s2) = helical_enum!(ends, END_TYPES);
    let (g3, s3) = helical_enum!(material, Grade::ALL);
    let (g4, s4) = helical_enum!(seating, SEATINGS);
    let grades: Vec<(&'static str, &'static str)> = Grade::ALL
        .iter()
        .map(|&g| (g.data().name, g.data().name))
        .collect();
    block(
        "grid-2",
        vec![
            qty(f("wire_diameter"), Dim::Length),
            qty(f("coil_diameter"), Dim::Length),
            model_enum(
                prefix,
                "diameter_kind",
                "The coil diameter is the",
                &[
                    ("mean", "mean diameter D"),
                    ("outside", "outside diameter Dₑ = D + d"),
                    ("inside", "inside diameter Dᵢ = D − d"),
                ],
                g1,
                s1,
            ),
            qty(f("active_coils"), Dim::Ratio),
            qty(f("total_coils"), Dim::Ratio),
            model_enum(
                prefix,
                "ends",
                "Ends",
                &[
                    ("closed_ground", "closed and ground"),
                    ("closed_unground", "closed, not ground"),
                    ("open_ground", "open, ground"),
                    ("open", "open, not ground"),
                ],
                g2,
                s2,
            ),
            qty(f("free_length"), Dim::Length),
            model_enum(prefix, "material", "Wire material", &grades, g3, s3),
            model_enum(
                prefix,
                "seating",
                "How the ends are held (for buckling)",
                &[
                    ("both_fixed", "both on parallel plates, guided (ν = 0.5)"),
                    ("fixed_pivoted", "one fixed, one pivoted (ν = 0.7)"),
                    ("both_pivoted", "both pivoted (ν = 1)"),
                    (
                        "fixed_guided_sideways",
                        "one fixed, one guided but free sideways (ν = 1)",
                    ),
                    ("fixed_free", "one fixed, one free (ν = 2)"),
                ],
                g4,
                s4,
            ),
        ],
    )
}

const FORCE_REFS: [ForceReference; 3] = [
    ForceReference::Extension,
    ForceReference::Mean,
    ForceReference::Compression,
];

fn gas(prefix: &str) -> AnyView {
    let f = |name: &str| format!("{prefix}.{name}");
    block(
        "grid-2",
        vec![
            qty(f("nominal_force"), Dim::Force),
            qty(f("progression"), Dim::Ratio),
            qty(f("stroke"), Dim::Length),
            qty(f("friction_band"), Dim::Force),
            model_enum(
                prefix,
                "force_reference",
                "The nominal force is read on the",
                &[
                    (
                        "extension",
                        "extension curve (the force it pushes out with)",
                    ),
                    ("mean", "mean of the two curves (gas force)"),
                    ("compression", "compression curve"),
                ],
                |m| match m {
                    SpringModelInput::Gas {
                        force_reference, ..
                    } => FORCE_REFS.iter().position(|x| x == force_reference),
                    _ => None,
                },
                |m, i| {
                    if let (
                        SpringModelInput::Gas {
                            force_reference, ..
                        },
                        Some(v),
                    ) = (m, FORCE_REFS.get(i))
                    {
                        *force_reference = *v
                    }
                },
            ),
            qty(f("polytropic_index"), Dim::Ratio),
        ],
    )
}

fn disc(prefix: &str) -> AnyView {
    let f = |name: &str| format!("{prefix}.{name}");
    let counter = |field: &'static str, second: bool| {
        let (p, q) = (prefix.to_string(), prefix.to_string());
        count(
            field_dom_id(&f(field)),
            if second {
                "Discs nested in parallel per group".into()
            } else {
                "Discs stacked in series".into()
            },
            bind(
                move |s| match model_mut(s, &p)? {
                    SpringModelInput::Disc(d) => {
                        Some(if second { d.in_parallel } else { d.in_series })
                    }
                    _ => None,
                },
                move |s, v| {
                    if let Some(SpringModelInput::Disc(d)) = model_mut(s, &q) {
                        if second {
                            d.in_parallel = v
                        } else {
                            d.in_series = v
                        }
                    }
                },
                1,
            ),
            1,
            1000,
        )
    };
    block(
        "grid-2",
        vec![
            qty(f("outer_diameter"), Dim::Length),
            qty(f("inner_diameter"), Dim::Length),
            qty(f("thickness"), Dim::Length),
            qty(f("cone_height"), Dim::Length),
            counter("in_series", false),
            counter("in_parallel", true),
            qty(f("youngs_modulus"), Dim::Pressure),
            qty(f("poisson_ratio"), Dim::Ratio),
        ],
    )
}

fn table_rows(m: &mut SpringModelInput, unloading: bool) -> Option<&mut Vec<PointInput>> {
    match m {
        SpringModelInput::Table(t) => Some(if unloading {
            &mut t.unloading
        } else {
            &mut t.loading
        }),
        _ => None,
    }
}

fn table(prefix: &str) -> Views {
    let p = prefix.to_string();
    let rotary = flag(move |s| match model_mut(s, &p)? {
        SpringModelInput::Table(t) => Some(t.axis == Axis::Rotary),
        _ => None,
    });
    vec![
        model_enum(
            prefix,
            "axis",
            "Measured as",
            &[
                ("linear", "force against deflection (N, mm)"),
                ("rotary", "torque against angle (N·m, °)"),
            ],
            |m| match m {
                SpringModelInput::Table(t) => Some(usize::from(t.axis == Axis::Rotary)),
                _ => None,
            },
            |m, i| {
                if let SpringModelInput::Table(t) = m {
                    t.axis = if i == 1 { Axis::Rotary } else { Axis::Linear }
                }
            },
        ),
        rows(prefix, false, rotary),
        rows(prefix, true, rotary),
    ]
}

fn rows(prefix: &str, unloading: bool, rotary: Binding<bool>) -> AnyView {
    let which = if unloading { "unloading" } else { "loading" };
    let p = prefix.to_string();
    let n = length(move |s| table_rows(model_mut(s, &p)?, unloading).map(|v| v.len()));
    let pre = prefix.to_string();
    let row: Row = Arc::new(move |i| {
        let (qd, fd) = if rotary.get() {
            (Dim::Angle, Dim::Torque)
        } else {
            (Dim::Length, Dim::Force)
        };
        let base = format!("{pre}.{which}.{i}");
        let q = pre.clone();
        block(
            "row",
            vec![
                qty(format!("{base}.deflection"), qd),
                qty(format!("{base}.force"), fd),
                action(
                    field_dom_id(&format!("{base}.remove")),
                    format!("Remove point {}", i + 1),
                    move |s| {
                        if let Some(v) = model_mut(s, &q).and_then(|m| table_rows(m, unloading)) {
                            if i < v.len() {
                                v.remove(i);
                            }
                        }
                    },
                ),
            ],
        )
    });
    let q = prefix.to_string();
    sub(
        if unloading {
            "Unloading, if measured (for hysteresis)"
        } else {
            "Loading (deflection rising)"
        },
        vec![
            block("rows", vec![list(n, row)]),
            action(
                field_dom_id(&format!("{prefix}.{which}.add")),
                "Add a point".into(),
                move |s| {
                    if let Some(v) = model_mut(s, &q).and_then(|m| table_rows(m, unloading)) {
                        v.push(blank::point());
                    }
                },
            ),
        ],
    )
}

const IDENTIFY: &[(&str, &str)] = &[
    (
        "static",
        "Static sag: a known mass hung on the spring, k = m·g/δ",
    ),
    (
        "dynamic",
        "Oscillation: a known mass bouncing on the spring, timed",
    ),
    ("two_point", "Two-point gauge: forces read at two lengths"),
];

const CROSS_CHECK: &[(&str, &str)] = &[
    ("none", "None"),
    ("static", "Static sag"),
    ("dynamic", "Oscillation"),
    ("two_point", "Two-point gauge"),
];

/// The inputs of one identification method, under `at` (`….method` or
/// `….cross_check`).
fn identify_fields(at: String) -> Build {
    Arc::new(move |k| {
        let list: &[(&str, Dim)] = match k {
            "dynamic" => &[
                ("mass", Dim::Mass),
                ("oscillations", Dim::Ratio),
                ("time", Dim::Time),
                ("timing_uncertainty", Dim::Time),
                ("spring_mass", Dim::Mass),
            ],
            "two_point" => &[
                ("length_1", Dim::Length),
                ("force_1", Dim::Force),
                ("length_2", Dim::Length),
                ("force_2", Dim::Force),
                ("force_uncertainty", Dim::Force),
                ("length_uncertainty", Dim::Length),
            ],
            _ => &[
                ("mass", Dim::Mass),
                ("sag", Dim::Length),
                ("resolution", Dim::Length),
            ],
        };
        vec![block(
            "grid-2",
            list.iter()
                .map(|(f, d)| qty(format!("{at}.{f}"), *d))
                .collect(),
        )]
    })
}

fn measured(prefix: &str) -> Views {
    let p = prefix.to_string();
    let method = enum_binding(
        move |s| match model_mut(s, &p)? {
            SpringModelInput::Measured(m) => Some(&mut m.method),
            _ => None,
        },
        blank::identify_kind,
        blank::identify,
    );
    let fields = identify_fields(format!("{prefix}.method"));
    let q = prefix.to_string();
    let check = enum_binding(
        move |s| match model_mut(s, &q)? {
            SpringModelInput::Measured(m) => Some(&mut m.cross_check),
            _ => None,
        },
        blank::cross_check_kind,
        blank::cross_check,
    );
    let check_fields = identify_fields(format!("{prefix}.cross_check"));
    let check_fields: Build = Arc::new(move |k| {
        if k == "none" {
            Vec::new()
        } else {
            check_fields(k)
        }
    });
    let mut out = vec![
        choice(
            field_dom_id(&format!("{prefix}.method.method")),
            "How the rate was measured",
            opts(IDENTIFY),
            method,
        ),
        hint("The mass's tolerance is taken as its uncertainty; the identified rate enters the tolerance study with its own uncertainty."),
        switch(method, fields),
        qty(format!("{prefix}.max_deflection"), Dim::Length),
        choice(
            field_dom_id(&format!("{prefix}.cross_check.method")),
            "Cross-check by a second method",
            opts(CROSS_CHECK),
            check,
        ),
        switch(check, check_fields),
    ];
    if prefix == "spring.model" {
        out.push(identified_rate());
    }
    out
}

/// The rate identified from the field measurements, with its uncertainty
/// (the core's GUM budget), in the display units.
fn identified_rate() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let html = Memo::new(move |_| {
        let s = sys.get();
        sheet.report.with(|r| match &r.identification {
            Some(est) => {
                let v = joulewise_core::units::format_quantity(est.rate.value, Dim::LinearRate, s);
                let u = joulewise_core::units::format_quantity(
                    est.rate.standard_uncertainty,
                    Dim::LinearRate,
                    s,
                );
                let mut out = format!(
                    r#"<p><span class="ident-label">Identified rate</span> <strong class="ident-value">{}</strong> ± {} <span class="hint">(standard uncertainty, k = 1: {} %)</span></p><p class="hint">{}: {}</p>"#,
                    esc(&v.to_string()),
                    esc(&u.to_string()),
                    joulewise_core::units::format_sig(100.0 * est.rate.relative(), 2),
                    esc(est.method.describe()),
                    esc(&joulewise_core::units::render(&est.formula, s))
                );
                crate::html::push_list(&mut out, "hint", &est.notes, s);
                out
            }
            None => r#"<p class="hint">The identified rate shows here once the measurements read.</p>"#.into(),
        })
    });
    view! { <div class="identified" id="identified-rate" aria-live="polite" inner_html=html></div> }
        .into_any()
}

fn combo_members(m: &mut SpringModelInput) -> Option<&mut Vec<SpringModelInput>> {
    match m {
        SpringModelInput::Series { members } | SpringModelInput::Parallel { members } => {
            Some(members)
        }
        _ => None,
    }
}

fn members(prefix: &str) -> Views {
    let p = prefix.to_string();
    let n = length(move |s| combo_members(model_mut(s, &p)?).map(|v| v.len()));
    let pre = prefix.to_string();
    let row: Row = Arc::new(move |i| {
        let path = format!("{pre}.members.{i}");
        let q = pre.clone();
        group(
            format!("Member {}", i + 1),
            vec![
                spring_model_editor(path.clone()),
                action(
                    field_dom_id(&format!("{path}.remove")),
                    format!("Remove member {}", i + 1),
                    move |s| {
                        if let Some(v) = model_mut(s, &q).and_then(combo_members) {
                            if i < v.len() && v.len() > 1 {
                                v.remove(i);
                            }
                        }
                    },
                ),
            ],
        )
    });
    let q = prefix.to_string();
    vec![
        block("members", vec![list(n, row)]),
        action(
            field_dom_id(&format!("{prefix}.members.add")),
            "Add a member spring".into(),
            move |s| {
                if let Some(v) = model_mut(s, &q).and_then(combo_members) {
                    v.push(blank::model("linear"));
                }
            },
        ),
    ]
}

// ───────────────────────────────────────────────────────────── the path ──

const FRICTION: &[(&str, &str)] = &[
    ("none", "None"),
    ("coefficient", "Coefficient μ (times the normal force)"),
    ("force", "A fixed force (e.g. read with a force gauge)"),
];

const SENSE: &[(&str, &str)] = &[
    ("unloads", "drives the part (unloads as the part moves)"),
    ("loads", "resists the part (loads as the part moves)"),
];

/// The path: travel, incline or hinge, friction, damping, drive; how the
/// spring is mounted (latched deflection, sense, whether the part leaves
/// it, or a strut's geometry); further named states; releases per hour.
pub fn path() -> AnyView {
    let part = part_kind();
    let part_fields: Build = Arc::new(|k| {
        if k == "rotating" {
            return vec![block(
                "grid-2",
                vec![
                    qty("part.travel", Dim::Angle),
                    qty("part.hinge_tilt", Dim::Angle),
                    qty("part.cg_angle_at_latch", Dim::Angle),
                    qty("part.friction_torque", Dim::Torque),
                    qty("part.drive_torque", Dim::Torque),
                ],
            )];
        }
        let friction = enum_binding(
            |s| match &mut s.part {
                PartInput::Translating(t) => Some(&mut t.friction),
                _ => None,
            },
            blank::friction_kind,
            blank::friction,
        );
        vec![block(
            "grid-2",
            vec![
                qty("part.travel", Dim::Length),
                qty("part.incline", Dim::Angle),
                choice("f-part-friction-kind", "Friction", opts(FRICTION), friction),
                switch(
                    friction,
                    Arc::new(|k| match k {
                        "coefficient" => vec![qty("part.friction.mu", Dim::Ratio)],
                        "force" => vec![qty("part.friction.force", Dim::Force)],
                        _ => Vec::new(),
                    }),
                ),
                qty("part.damping", Dim::LinearDamping),
                qty("part.drive_force", Dim::Force),
            ],
        )]
    });
    let has_spring = flag(|s| Some(s.spring.is_some()));
    section(
        "sec-path",
        "The path",
        vec![
            switch(part, part_fields),
            when(has_spring, Arc::new(|| vec![mount_editor()])),
            states(),
            qty("cycles_per_hour", Dim::Frequency),
        ],
    )
}

fn mount_of(s: &mut Scenario) -> Option<&mut MountInput> {
    s.spring.as_mut().map(|sp| &mut sp.mount)
}

fn mount_editor() -> AnyView {
    let part = part_kind();
    let kind = enum_binding(mount_of, blank::mount_kind, blank::mount);
    let chooser: Build = Arc::new(move |p| {
        let mut options = vec![(
            "direct",
            "Directly: its deflection changes one-for-one with the travel",
        )];
        if p == "rotating" {
            options.push(("strut", "As a strut pinned between the frame and the part"));
        }
        vec![choice(
            "f-spring-mount-kind",
            "The spring is mounted",
            options,
            kind,
        )]
    });
    let body: Build = Arc::new(move |k| {
        if k == "strut" {
            let mode = bind(
                |s| match mount_of(s)? {
                    MountInput::Strut { mode, .. } => Some(if *mode == StrutModeInput::Extension {
                        "extension"
                    } else {
                        "compression"
                    }),
                    _ => None,
                },
                |s, v| {
                    if let Some(MountInput::Strut { mode, .. }) = mount_of(s) {
                        *mode = if v == "extension" {
                            StrutModeInput::Extension
                        } else {
                            StrutModeInput::Compression
                        };
                    }
                },
                "compression",
            );
            return vec![block(
                "grid-2",
                vec![
                    qty("spring.mount.frame_x", Dim::Length),
                    qty("spring.mount.frame_y", Dim::Length),
                    qty("spring.mount.part_radius", Dim::Length),
                    qty("spring.mount.part_angle", Dim::Angle),
                    qty("spring.mount.free_length", Dim::Length),
                    choice(
                        "f-spring-mount-mode",
                        "The strut is a",
                        vec![
                            ("compression", "compression or gas spring"),
                            ("extension", "extension spring"),
                        ],
                        mode,
                    ),
                ],
            )];
        }
        let sense = bind(
            |s| match mount_of(s)? {
                MountInput::Direct { sense, .. } => Some(if *sense == SenseInput::Loads {
                    "loads"
                } else {
                    "unloads"
                }),
                _ => None,
            },
            |s, v| {
                if let Some(MountInput::Direct { sense, .. }) = mount_of(s) {
                    *sense = if v == "loads" {
                        SenseInput::Loads
                    } else {
                        SenseInput::Unloads
                    };
                }
            },
            "unloads",
        );
        let detaches = bind(
            |s| match mount_of(s)? {
                MountInput::Direct { detaches, .. } => Some(*detaches),
                _ => None,
            },
            |s, v| {
                if let Some(MountInput::Direct { detaches, .. }) = mount_of(s) {
                    *detaches = v;
                }
            },
            false,
        );
        vec![
            block(
                "grid-2",
                vec![
                    switch(
                        part,
                        Arc::new(|p| {
                            vec![qty(
                                "spring.mount.deflection_at_latch",
                                if p == "rotating" {
                                    Dim::Angle
                                } else {
                                    Dim::Length
                                },
                            )]
                        }),
                    ),
                    choice("f-spring-mount-sense", "The spring", opts(SENSE), sense),
                ],
            ),
            tick(
                "f-spring-mount-detaches",
                "The part leaves the spring at its free length (an ejector)",
                detaches,
            ),
        ]
    });
    sub(
        "How the spring is mounted",
        vec![switch(part, chooser), switch(kind, body)],
    )
}

fn states() -> AnyView {
    let n = length(|s| Some(s.states.len()));
    let part = part_kind();
    let row: Row = Arc::new(move |i| {
        let name = bind(
            move |s| s.states.get(i).map(|st| st.name.clone()),
            move |s, v| {
                if let Some(st) = s.states.get_mut(i) {
                    st.name = v
                }
            },
            String::new(),
        );
        block(
            "row",
            vec![
                text_line(
                    format!("f-states-{i}-name"),
                    format!("Name of further state {}", i + 1),
                    name,
                    false,
                ),
                switch(
                    part,
                    Arc::new(move |p| {
                        vec![qty(
                            format!("states.{i}.deflection"),
                            if p == "rotating" {
                                Dim::Angle
                            } else {
                                Dim::Length
                            },
                        )]
                    }),
                ),
                action(
                    format!("f-states-{i}-remove"),
                    format!("Remove state {}", i + 1),
                    move |s| {
                        if i < s.states.len() {
                            s.states.remove(i);
                        }
                    },
                ),
            ],
        )
    });
    sub(
        "Further states of the spring (e.g. a maintenance position)",
        vec![
            block("rows", vec![list(n, row)]),
            action("f-states-add".into(), "Add a state".into(), |s| {
                s.states.push(StateInput {
                    name: String::new(),
                    deflection: Value::default(),
                })
            }),
        ],
    )
}

// ─────────────────────────────────────────────────────────── the contact ──

const CONTACTS: &[(&str, &str)] = &[
    ("none", "Nothing modelled (release figures only)"),
    ("buffer", "An end-of-travel buffer"),
    ("body", "A part of a person's body"),
];

const LAWS: &[(&str, &str)] = &[
    ("linear", "Linear spring buffer, F = k·x"),
    ("power_law", "Progressive elastomer, F = a·xⁿ"),
    ("spring", "A spring model (gas spring, measured table…)"),
    (
        "constant_force",
        "Constant force (set hydraulic absorber, friction brake)",
    ),
    ("absorber", "Self-adjusting hydraulic absorber"),
    ("orifice", "Orifice damper, F = c·v²"),
];

const AREAS: &[(&str, &str)] = &[
    ("edge", "An edge pressing across a width"),
    ("circle", "A round face"),
    ("given", "An area given directly"),
];

const GAPS: &[(&str, &str)] = &[
    ("none", "Not assessed"),
    ("closed", "The parts meet: no gap"),
    ("clearance", "A clearance that stays"),
    ("buffer_stop", "A buffer stops the part short of the frame"),
];

/// What the part meets at the end of its travel, and the closing gap.
pub fn contact() -> AnyView {
    let kind = enum_binding(
        |s| Some(&mut s.contact),
        blank::contact_kind,
        blank::contact,
    );
    section(
        "sec-contact",
        "The contact",
        vec![
            choice(
                "f-contact-kind",
                "At the end of its travel the part meets",
                opts(CONTACTS),
                kind,
            ),
            switch(
                kind,
                Arc::new(|k| match k {
                    "buffer" => vec![buffer_editor()],
                    "body" => vec![body_editor()],
                    _ => Vec::new(),
                }),
            ),
            gap_editor(),
        ],
    )
}

fn buffer_of(s: &mut Scenario) -> Option<&mut BufferInput> {
    match &mut s.contact {
        ContactInput::Buffer(b) => Some(b),
        _ => None,
    }
}

fn buffer_editor() -> AnyView {
    let law = enum_binding(
        |s| buffer_of(s).map(|b| &mut b.law),
        blank::law_kind,
        blank::law,
    );
    let fields: Build = Arc::new(|k| {
        if k == "spring" {
            return vec![
                spring_model_editor("contact.law.model".into()),
                qty("contact.law.preload_deflection", Dim::Length),
            ];
        }
        let list: &[(&str, Dim)] = match k {
            "power_law" => &[
                ("force_at_stroke", Dim::Force),
                ("exponent", Dim::Ratio),
                ("stroke", Dim::Length),
            ],
            "constant_force" => &[("force", Dim::Force), ("stroke", Dim::Length)],
            "absorber" => &[("stroke", Dim::Length), ("efficiency", Dim::Ratio)],
            "orifice" => &[
                ("coefficient", Dim::QuadraticDamping),
                ("stroke", Dim::Length),
            ],
            _ => &[("rate", Dim::LinearRate), ("stroke", Dim::Length)],
        };
        vec![block(
            "grid-2",
            list.iter()
                .map(|(f, d)| qty(format!("contact.law.{f}"), *d))
                .collect(),
        )]
    });
    let n = bind(
        |s| buffer_of(s).map(|b| b.count),
        |s, v| {
            if let Some(b) = buffer_of(s) {
                b.count = v
            }
        },
        1,
    );
    sub(
        "The buffer",
        vec![
            choice("f-contact-law-type", "Kind of buffer", opts(LAWS), law),
            switch(law, fields),
            block(
                "grid-2",
                vec![
                    count(
                        "f-contact-count".into(),
                        "Identical buffers acting together".into(),
                        n,
                        1,
                        100,
                    ),
                    qty("contact.restitution", Dim::Ratio),
                    when(
                        rotating(),
                        Arc::new(|| vec![qty("contact.radius", Dim::Length)]),
                    ),
                ],
            ),
        ],
    )
}

fn body_of(s: &mut Scenario) -> Option<&mut BodyInput> {
    match &mut s.contact {
        ContactInput::Body(b) => Some(b),
        _ => None,
    }
}

fn body_editor() -> AnyView {
    let region = bind(
        |s| body_of(s).map(|b| b.region.label()),
        |s, v| {
            if let Some(b) = body_of(s) {
                if let Some(r) = BodyRegion::ALL.iter().find(|r| r.label() == v) {
                    if b.region != *r {
                        b.region = *r;
                        b.specific_area = None;
                    }
                }
            }
        },
        "",
    );
    let specific = bind(
        |s| {
            let b = body_of(s)?;
            let key = b.specific_area.as_deref()?;
            b.region
                .limits()
                .areas
                .iter()
                .find(|a| a.key == key)
                .map(|a| a.key)
        },
        |s, v: &'static str| {
            if let Some(b) = body_of(s) {
                b.specific_area = (!v.is_empty()).then(|| v.to_string());
            }
        },
        "",
    );
    let area_choice: Build = Arc::new(move |label| {
        let r = BodyRegion::ALL
            .iter()
            .find(|r| r.label() == label)
            .copied()
            .unwrap_or(BodyRegion::HandFingers);
        let mut options = vec![(
            "",
            "the most demanding area of the region (lowest pressure limit)",
        )];
        options.extend(r.limits().areas.iter().map(|a| (a.key, a.label)));
        vec![choice(
            "f-contact-specific_area",
            "Specific area for the pressure limit",
            options,
            specific,
        )]
    });
    let shape = enum_binding(
        |s| body_of(s).map(|b| &mut b.area),
        blank::area_kind,
        blank::area,
    );
    let padded = bind(
        |s| body_of(s).map(|b| b.padding.is_some()),
        |s, on| {
            if let Some(b) = body_of(s) {
                if on != b.padding.is_some() {
                    b.padding = on.then(|| PaddingInput {
                        stiffness: Value::default(),
                        thickness: None,
                    });
                }
            }
        },
        false,
    );
    sub(
        "The body region",
        vec![
            choice(
                "f-contact-region",
                "Body region (ISO/TS 15066 list)",
                BodyRegion::ALL
                    .iter()
                    .map(|r| (r.label(), r.label()))
                    .collect(),
                region,
            ),
            switch(region, area_choice),
            choice(
                "f-contact-area-shape",
                "Shape of the contact area",
                opts(AREAS),
                shape,
            ),
            switch(
                shape,
                Arc::new(|k| {
                    let list: &[(&str, Dim)] = match k {
                        "circle" => &[("diameter", Dim::Length)],
                        "given" => &[("area", Dim::Area)],
                        _ => &[("length", Dim::Length), ("width", Dim::Length)],
                    };
                    vec![block(
                        "grid-2",
                        list.iter()
                            .map(|(f, d)| qty(format!("contact.area.{f}"), *d))
                            .collect(),
                    )]
                }),
            ),
            tick("f-contact-padding", "The part's edge is padded", padded),
            when(
                padded,
                Arc::new(|| {
                    vec![block(
                        "grid-2",
                        vec![
                            qty("contact.padding.stiffness", Dim::LinearRate),
                            qty("contact.padding.thickness", Dim::Length),
                        ],
                    )]
                }),
            ),
        ],
    )
}

fn gap_editor() -> AnyView {
    let kind = bind(
        |s| Some(blank::gap_kind(&s.gap)),
        |s, k| {
            if blank::gap_kind(&s.gap) == k {
                return;
            }
            if k == "none" {
                s.gap = None;
            } else {
                let parts = s.gap.take().map(|g| g.body_parts).unwrap_or_default();
                s.gap = Some(GapInput {
                    geometry: blank::gap_geometry(k),
                    body_parts: parts,
                });
            }
        },
        "none",
    );
    let body: Build = Arc::new(|k| {
        let mut out = match k {
            "clearance" => vec![qty("gap.geometry.gap", Dim::Length)],
            "buffer_stop" => vec![qty("gap.geometry.gap_at_buffer_contact", Dim::Length)],
            _ => Vec::new(),
        };
        if k != "none" {
            out.push(body_parts());
        }
        out
    });
    sub(
        "The closing gap",
        vec![
            choice("f-gap-kind", "Where the part closes", opts(GAPS), kind),
            switch(kind, body),
        ],
    )
}

fn body_parts() -> AnyView {
    let boxes = BodyPart::ALL
        .iter()
        .map(|&p| {
            tick(
                format!("f-gap-part-{p:?}").to_lowercase(),
                p.label(),
                bind(
                    move |s| Some(s.gap.as_ref()?.body_parts.contains(&p)),
                    move |s, on| {
                        if let Some(g) = s.gap.as_mut() {
                            let has = g.body_parts.contains(&p);
                            if on && !has {
                                g.body_parts.push(p);
                            } else if !on && has {
                                g.body_parts.retain(|x| *x != p);
                            }
                        }
                    },
                    false,
                ),
            )
        })
        .collect();
    let problem = Sheet::get().problem("gap.body_parts", None);
    view! {
        <fieldset class="body-parts" id="f-gap-body_parts">
            <legend>"Body parts that can reach the gap (ISO 13854)"</legend>
            {block("grid-2", boxes)}
            <p class="field-error" aria-live="polite">{move || problem.get()}</p>
        </fieldset>
    }
    .into_any()
}

// ──────────────────────────────────────────────────────────── the limits ──

/// A choice among the variants of a plain enum held in an optional limit
/// set, by index into `options`.
fn limit_enum(
    id: &'static str,
    label: &'static str,
    options: &[(&'static str, &'static str)],
    get: fn(&mut Scenario) -> Option<usize>,
    set: fn(&mut Scenario, usize),
) -> AnyView {
    let keys: Vec<&'static str> = options.iter().map(|o| o.0).collect();
    let keys2 = keys.clone();
    choice(
        id,
        label,
        options.to_vec(),
        bind(
            move |s| keys.get(get(s)?).copied(),
            move |s, k| {
                if let Some(i) = keys2.iter().position(|x| *x == k) {
                    set(s, i)
                }
            },
            "",
        ),
    )
}

/// A tick that switches an optional limit set on (blank) or off.
fn limit_switch(is_on: fn(&Scenario) -> bool, turn: fn(&mut Scenario, bool)) -> Binding<bool> {
    bind(
        move |s| Some(is_on(s)),
        move |s, on| {
            if on != is_on(s) {
                turn(s, on)
            }
        },
        false,
    )
}

const EN81_TYPES: [En81BufferType; 3] = [
    En81BufferType::LinearAccumulation,
    En81BufferType::NonLinearAccumulation,
    En81BufferType::Dissipation,
];

/// The limit sets that apply, with their options, and the user's own limits.
pub fn limits() -> AnyView {
    let guard = bind(
        |s| {
            Some(match &s.limits.guard {
                None => "none",
                Some(g) => match g.kind {
                    GuardKind::PowerOperated => "power_operated",
                    GuardKind::SelfClosing => "self_closing",
                },
            })
        },
        |s, k| {
            let kind = match k {
                "power_operated" => GuardKind::PowerOperated,
                "self_closing" => GuardKind::SelfClosing,
                _ => {
                    s.limits.guard = None;
                    return;
                }
            };
            match &mut s.limits.guard {
                Some(g) => g.kind = kind,
                None => {
                    s.limits.guard = Some(GuardChoice {
                        kind,
                        protective_device: false,
                    })
                }
            }
        },
        "none",
    );
    let guard_on = flag(|s| Some(s.limits.guard.is_some()));
    let body_contact = flag(|s| Some(matches!(s.contact, ContactInput::Body(_))));
    let en81 = limit_switch(
        |s| s.limits.lift_en81.is_some(),
        |s, on| {
            s.limits.lift_en81 = on.then(|| En81Choice {
                buffer_type: En81BufferType::LinearAccumulation,
                rated_speed: Value::default(),
            })
        },
    );
    let us = limit_switch(
        |s| s.limits.lift_us.is_some(),
        |s, on| {
            s.limits.lift_us = on.then(|| UsLiftChoice {
                installation: UsInstallation::Elevator,
                buffer_type: UsBufferType::Spring,
                rated_speed: Value::default(),
                terminal_speed_limiter: false,
            })
        },
    );
    let crane = limit_switch(
        |s| s.limits.crane.is_some(),
        |s, on| {
            s.limits.crane = on.then(|| CraneChoice {
                travel: CraneTravel::Bridge,
                rated_speed: Value::default(),
            })
        },
    );
    let gate = limit_switch(
        |s| s.limits.gate.is_some(),
        |s, on| {
            s.limits.gate = on.then(|| GateChoice {
                gap_width: Value::default(),
            })
        },
    );
    section(
        "sec-limits",
        "The limits that apply",
        vec![
            choice(
                "f-limits-guard",
                "Guard force and energy limits",
                vec![
                    ("none", "not a guard"),
                    ("power_operated", "power-operated guard"),
                    (
                        "self_closing",
                        "self-closing guard (spring, weight or gas strut)",
                    ),
                ],
                guard,
            ),
            when(
                guard_on,
                Arc::new(|| {
                    vec![tick(
                        "f-limits-guard-protective_device",
                        "A protective device (e.g. a pressure-sensitive edge) stops or reverses the guard on contact",
                        bind(
                            |s| s.limits.guard.as_ref().map(|g| g.protective_device),
                            |s, v| {
                                if let Some(g) = s.limits.guard.as_mut() {
                                    g.protective_device = v
                                }
                            },
                            false,
                        ),
                    )]
                }),
            ),
            when(
                body_contact,
                Arc::new(|| {
                    vec![tick(
                        "f-limits-body_region",
                        "Body-region force, pressure and energy limits (ISO/TS 15066)",
                        bind(
                            |s| Some(s.limits.body_region),
                            |s, v| s.limits.body_region = v,
                            true,
                        ),
                    )]
                }),
            ),
            tick("f-limits-lift_en81", "Lift buffer rules, EN 81-20", en81),
            when(
                en81,
                Arc::new(|| {
                    vec![block(
                        "grid-2 indent",
                        vec![
                            limit_enum(
                                "f-limits-lift_en81-buffer_type",
                                "Buffer type",
                                &[
                                    ("linear", "energy accumulation, linear (coil spring)"),
                                    ("non_linear", "energy accumulation, non-linear (elastomer)"),
                                    ("dissipation", "energy dissipation (hydraulic)"),
                                ],
                                |s| {
                                    let t = s.limits.lift_en81.as_ref()?.buffer_type;
                                    EN81_TYPES.iter().position(|x| *x == t)
                                },
                                |s, i| {
                                    if let (Some(c), Some(t)) =
                                        (s.limits.lift_en81.as_mut(), EN81_TYPES.get(i))
                                    {
                                        c.buffer_type = *t
                                    }
                                },
                            ),
                            qty("limits.lift_en81.rated_speed", Dim::Speed),
                        ],
                    )]
                }),
            ),
            tick(
                "f-limits-lift_us",
                "Lift and hoist buffer rules, US (Cal. Code Regs. Title 8)",
                us,
            ),
            when(
                us,
                Arc::new(|| {
                    vec![block(
                        "grid-2 indent",
                        vec![
                            limit_enum(
                                "f-limits-lift_us-installation",
                                "Installation",
                                &[
                                    ("elevator", "passenger or freight elevator"),
                                    ("hoist", "construction personnel hoist"),
                                ],
                                |s| {
                                    Some(usize::from(
                                        s.limits.lift_us.as_ref()?.installation
                                            == UsInstallation::ConstructionHoist,
                                    ))
                                },
                                |s, i| {
                                    if let Some(c) = s.limits.lift_us.as_mut() {
                                        c.installation = if i == 1 {
                                            UsInstallation::ConstructionHoist
                                        } else {
                                            UsInstallation::Elevator
                                        }
                                    }
                                },
                            ),
                            limit_enum(
                                "f-limits-lift_us-buffer_type",
                                "Buffer",
                                &[("spring", "spring buffer"), ("oil", "oil buffer")],
                                |s| {
                                    Some(usize::from(
                                        s.limits.lift_us.as_ref()?.buffer_type == UsBufferType::Oil,
                                    ))
                                },
                                |s, i| {
                                    if let Some(c) = s.limits.lift_us.as_mut() {
                                        c.buffer_type = if i == 1 {
                                            UsBufferType::Oil
                                        } else {
                                            UsBufferType::Spring
                                        }
                                    }
                                },
                            ),
                            qty("limits.lift_us.rated_speed", Dim::Speed),
                            tick(
                                "f-limits-lift_us-terminal_speed_limiter",
                                "A terminal speed limiting device is fitted",
                                bind(
                                    |s| s.limits.lift_us.as_ref().map(|c| c.terminal_speed_limiter),
                                    |s, v| {
                                        if let Some(c) = s.limits.lift_us.as_mut() {
                                            c.terminal_speed_limiter = v
                                        }
                                    },
                                    false,
                                ),
                            ),
                        ],
                    )]
                }),
            ),
            tick(
                "f-limits-crane",
                "Crane bumper rules (29 CFR 1910.179)",
                crane,
            ),
            when(
                crane,
                Arc::new(|| {
                    vec![block(
                        "grid-2 indent",
                        vec![
                            limit_enum(
                                "f-limits-crane-travel",
                                "The bumper stops",
                                &[("bridge", "bridge travel"), ("trolley", "trolley travel")],
                                |s| {
                                    Some(usize::from(
                                        s.limits.crane.as_ref()?.travel == CraneTravel::Trolley,
                                    ))
                                },
                                |s, i| {
                                    if let Some(c) = s.limits.crane.as_mut() {
                                        c.travel = if i == 1 {
                                            CraneTravel::Trolley
                                        } else {
                                            CraneTravel::Bridge
                                        }
                                    }
                                },
                            ),
                            qty("limits.crane.rated_speed", Dim::Speed),
                        ],
                    )]
                }),
            ),
            tick(
                "f-limits-gate",
                "Power-operated door or gate force limits (EN 12453)",
                gate,
            ),
            when(
                gate,
                Arc::new(|| {
                    vec![block(
                        "indent",
                        vec![qty("limits.gate.gap_width", Dim::Length)],
                    )]
                }),
            ),
            user_limits(),
        ],
    )
}

fn user_limits() -> AnyView {
    let sheet = Sheet::get();
    let n = length(|s| Some(s.limits.user.len()));
    // Figure names: the report's label where the figure is computed, else
    // the id in words; read when the rows are built.
    let row: Row = Arc::new(move |i| {
        let options: Vec<(&'static str, String)> = sheet.report.with_untracked(|r| {
            figure_catalogue()
                .into_iter()
                .map(|(id, _)| {
                    let label = r
                        .figure(id)
                        .map(|f| f.label.clone())
                        .unwrap_or_else(|| humanise_id(id));
                    (id, label)
                })
                .collect()
        });
        let figure = bind(
            move |s| {
                let f = &s.limits.user.get(i)?.figure;
                figure_catalogue()
                    .into_iter()
                    .find(|(id, _)| id == f)
                    .map(|(id, _)| id)
            },
            move |s, v: &'static str| {
                if let Some(u) = s.limits.user.get_mut(i) {
                    u.figure = v.to_string()
                }
            },
            "",
        );
        let cmp = bind(
            move |s| {
                Some(if s.limits.user.get(i)?.comparison == Comparison::AtLeast {
                    "at_least"
                } else {
                    "at_most"
                })
            },
            move |s, k| {
                if let Some(u) = s.limits.user.get_mut(i) {
                    u.comparison = if k == "at_least" {
                        Comparison::AtLeast
                    } else {
                        Comparison::AtMost
                    }
                }
            },
            "at_most",
        );
        let text = |second: bool| {
            bind(
                move |s| {
                    s.limits.user.get(i).map(|u| {
                        if second {
                            u.source.clone()
                        } else {
                            u.name.clone()
                        }
                    })
                },
                move |s, v| {
                    if let Some(u) = s.limits.user.get_mut(i) {
                        if second {
                            u.source = v
                        } else {
                            u.name = v
                        }
                    }
                },
                String::new(),
            )
        };
        group(
            format!("Own limit {}", i + 1),
            vec![
                text_line(
                    format!("f-limits-user-{i}-name"),
                    "Name shown beside the check".into(),
                    text(false),
                    false,
                ),
                block(
                    "grid-2",
                    vec![
                        choice(
                            format!("f-limits-user-{i}-figure"),
                            "Figure it applies to",
                            options,
                            figure,
                        ),
                        choice(
                            format!("f-limits-user-{i}-comparison"),
                            "The figure must be",
                            vec![
                                ("at_most", "at most the limit"),
                                ("at_least", "at least the limit"),
                            ],
                            cmp,
                        ),
                        switch(
                            figure,
                            Arc::new(move |f| {
                                vec![qty(
                                    format!("limits.user.{i}.threshold"),
                                    figure_dim(f).unwrap_or(Dim::Ratio),
                                )]
                            }),
                        ),
                    ],
                ),
                text_line(
                    format!("f-limits-user-{i}-source"),
                    "Where the limit comes from".into(),
                    text(true),
                    false,
                ),
                action(
                    format!("f-limits-user-{i}-remove"),
                    format!("Remove own limit {}", i + 1),
                    move |s| {
                        if i < s.limits.user.len() {
                            s.limits.user.remove(i);
                        }
                    },
                ),
            ],
        )
    });
    sub(
        "Your own limits",
        vec![
            block("rows", vec![list(n, row)]),
            action(
                "f-limits-user-add".into(),
                "Add a limit of your own".into(),
                |s| s.limits.user.push(blank::user_limit()),
            ),
        ],
    )
}

// ─────────────────────────────────────────────────────────── tolerances ──

/// The tolerance switch and the list of the inputs that carry one.
pub fn tolerances() -> AnyView {
    let sheet = Sheet::get();
    let list = Memo::new(move |_| {
        sheet.report.with(|r| {
            let mut out = String::new();
            for i in r.inputs.iter().filter(|i| !i.tolerance.trim().is_empty()) {
                out.push_str(&format!(
                    r##"<li><a href="#{}">{}</a>: {} ± {}</li>"##,
                    field_dom_id(&i.path),
                    esc(&label_of(&i.path)),
                    esc(&i.text),
                    esc(i.tolerance.trim_start_matches('±').trim())
                ));
            }
            if out.is_empty() {
                r#"<p class="quiet">No input carries a tolerance yet.</p>"#.to_string()
            } else {
                format!(r#"<ul class="tol-list">{out}</ul>"#)
            }
        })
    });
    section(
        "sec-tolerances",
        "Tolerances",
        vec![
            tick(
                "f-show-tolerances",
                "Show a ± box under every number",
                sheet.show_tol.into(),
            ),
            hint("A tolerance is a percentage (±5 %) or an amount in the field's kind (±0.2 mm). The tolerance study varies every input that carries one."),
            view! { <div id="tolerance-list" inner_html=list></div> }.into_any(),
        ],
    )
}
