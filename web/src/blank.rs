//! Blank inputs: the variant a user picks for the first time, and the
//! blank assessment. Every number starts empty (the sheet says what is
//! needed); only choices get a common default.

use joulewise_core::limits::body::BodyRegion;
use joulewise_core::scenario::*;
use joulewise_core::spring::gas::ForceReference;
use joulewise_core::spring::helical::{EndType, Seating};
use joulewise_core::spring::material::Grade;
use joulewise_core::spring::Axis;
use joulewise_core::units::UnitSystem;

fn b() -> Value {
    Value::default()
}

/// A new assessment: a sliding part driven by a linear spring, nothing
/// entered yet.
pub fn scenario(units: UnitSystem) -> Scenario {
    Scenario {
        schema_version: SCHEMA_VERSION,
        identity: Identity::default(),
        display_units: units,
        part: part("translating"),
        spring: Some(spring()),
        states: Vec::new(),
        contact: ContactInput::None,
        gap: None,
        limits: LimitsInput::default(),
        sizing: None,
        study: StudyInput::default(),
        cycles_per_hour: None,
    }
}

/// A spring with a blank linear model, directly mounted.
pub fn spring() -> SpringInput {
    SpringInput {
        model: model("linear"),
        mount: mount("direct"),
    }
}

/// Key of a part's variant.
pub fn part_kind(p: &PartInput) -> &'static str {
    match p {
        PartInput::Translating(_) => "translating",
        PartInput::Rotating(_) => "rotating",
    }
}

/// A blank part of kind `k`.
pub fn part(k: &str) -> PartInput {
    match k {
        "rotating" => PartInput::Rotating(RotatingInput {
            inertia: inertia("plate"),
            hinge_tilt: None,
            cg_angle_at_latch: None,
            travel: b(),
            friction_torque: None,
            drive_torque: None,
            hazard_radius: b(),
        }),
        _ => PartInput::Translating(TranslatingInput {
            mass: b(),
            travel: b(),
            incline: None,
            friction: FrictionInput::None,
            damping: None,
            drive_force: None,
            include_spring_mass: true,
        }),
    }
}

/// Key of an inertia shape.
pub fn inertia_kind(i: &InertiaInput) -> &'static str {
    match i {
        InertiaInput::Given { .. } => "given",
        InertiaInput::Plate { .. } => "plate",
        InertiaInput::Rod { .. } => "rod",
        InertiaInput::Disc { .. } => "disc",
        InertiaInput::Point { .. } => "point",
        InertiaInput::Offset { .. } => "offset",
    }
}

/// A blank inertia of shape `k`.
pub fn inertia(k: &str) -> InertiaInput {
    match k {
        "given" => InertiaInput::Given {
            inertia: b(),
            mass: b(),
            cg_radius: b(),
        },
        "rod" => InertiaInput::Rod {
            mass: b(),
            length: b(),
        },
        "disc" => InertiaInput::Disc {
            mass: b(),
            radius: b(),
        },
        "point" => InertiaInput::Point {
            mass: b(),
            radius: b(),
        },
        "offset" => InertiaInput::Offset {
            mass: b(),
            inertia_about_cg: b(),
            distance: b(),
        },
        _ => InertiaInput::Plate {
            mass: b(),
            width: b(),
        },
    }
}

/// Key of a friction variant.
pub fn friction_kind(f: &FrictionInput) -> &'static str {
    match f {
        FrictionInput::None => "none",
        FrictionInput::Coefficient { .. } => "coefficient",
        FrictionInput::Force { .. } => "force",
    }
}

/// A blank friction of kind `k`.
pub fn friction(k: &str) -> FrictionInput {
    match k {
        "coefficient" => FrictionInput::Coefficient { mu: b() },
        "force" => FrictionInput::Force { force: b() },
        _ => FrictionInput::None,
    }
}

/// Key of a spring model.
pub fn model_kind(m: &SpringModelInput) -> &'static str {
    match m {
        SpringModelInput::Linear { .. } => "linear",
        SpringModelInput::Helical(_) => "helical",
        SpringModelInput::Extension { .. } => "extension",
        SpringModelInput::Torsion { .. } => "torsion",
        SpringModelInput::Gas { .. } => "gas",
        SpringModelInput::Disc(_) => "disc",
        SpringModelInput::Table(_) => "table",
        SpringModelInput::Measured(_) => "measured",
        SpringModelInput::Series { .. } => "series",
        SpringModelInput::Parallel { .. } => "parallel",
    }
}

/// A blank table row.
pub fn point() -> PointInput {
    PointInput {
        deflection: b(),
        force: b(),
    }
}

/// A blank spring model of kind `k`.
pub fn model(k: &str) -> SpringModelInput {
    match k {
        "helical" => SpringModelInput::Helical(HelicalInput {
            wire_diameter: b(),
            coil_diameter: b(),
            diameter_kind: DiameterKind::Mean,
            active_coils: b(),
            total_coils: None,
            ends: EndType::ClosedGround,
            free_length: b(),
            material: Grade::En10270_1Sm,
            seating: Seating::BothFixed,
        }),
        "extension" => SpringModelInput::Extension {
            initial_tension: b(),
            rate: b(),
            max_deflection: b(),
        },
        "torsion" => SpringModelInput::Torsion {
            rate: b(),
            max_angle: b(),
        },
        "gas" => SpringModelInput::Gas {
            nominal_force: b(),
            progression: b(),
            stroke: b(),
            friction_band: None,
            force_reference: ForceReference::Extension,
            polytropic_index: None,
        },
        "disc" => SpringModelInput::Disc(DiscInput {
            outer_diameter: b(),
            inner_diameter: b(),
            thickness: b(),
            cone_height: b(),
            in_series: 1,
            in_parallel: 1,
            youngs_modulus: None,
            poisson_ratio: None,
        }),
        "table" => SpringModelInput::Table(TableInput {
            axis: Axis::Linear,
            loading: vec![point(), point(), point()],
            unloading: Vec::new(),
        }),
        "measured" => SpringModelInput::Measured(MeasuredInput {
            method: identify("static"),
            cross_check: None,
            max_deflection: b(),
        }),
        "series" => SpringModelInput::Series {
            members: vec![model("linear"), model("linear")],
        },
        "parallel" => SpringModelInput::Parallel {
            members: vec![model("linear"), model("linear")],
        },
        _ => SpringModelInput::Linear {
            rate: b(),
            max_deflection: b(),
        },
    }
}

/// Key of a field-identification method.
pub fn identify_kind(m: &IdentifyInput) -> &'static str {
    match m {
        IdentifyInput::Static { .. } => "static",
        IdentifyInput::Dynamic { .. } => "dynamic",
        IdentifyInput::TwoPoint { .. } => "two_point",
    }
}

/// Key of the cross-check method, `none` when there is none.
pub fn cross_check_kind(m: &Option<IdentifyInput>) -> &'static str {
    m.as_ref().map_or("none", identify_kind)
}

/// A blank cross-check of method `k`, or none.
pub fn cross_check(k: &str) -> Option<IdentifyInput> {
    (k != "none").then(|| identify(k))
}

/// A blank identification of method `k`.
pub fn identify(k: &str) -> IdentifyInput {
    match k {
        "dynamic" => IdentifyInput::Dynamic {
            mass: b(),
            oscillations: b(),
            time: b(),
            timing_uncertainty: None,
            spring_mass: None,
        },
        "two_point" => IdentifyInput::TwoPoint {
            length_1: b(),
            force_1: b(),
            length_2: b(),
            force_2: b(),
            force_uncertainty: b(),
            length_uncertainty: b(),
        },
        _ => IdentifyInput::Static {
            mass: b(),
            sag: b(),
            resolution: b(),
        },
    }
}

/// Key of a mount.
pub fn mount_kind(m: &MountInput) -> &'static str {
    match m {
        MountInput::Direct { .. } => "direct",
        MountInput::Strut { .. } => "strut",
    }
}

/// A blank mount of kind `k`.
pub fn mount(k: &str) -> MountInput {
    match k {
        "strut" => MountInput::Strut {
            frame_x: b(),
            frame_y: b(),
            part_radius: b(),
            part_angle: b(),
            free_length: b(),
            mode: StrutModeInput::Compression,
        },
        _ => MountInput::Direct {
            deflection_at_latch: b(),
            sense: SenseInput::Unloads,
            detaches: false,
        },
    }
}

/// Key of a contact.
pub fn contact_kind(c: &ContactInput) -> &'static str {
    match c {
        ContactInput::None => "none",
        ContactInput::Buffer(_) => "buffer",
        ContactInput::Body(_) => "body",
    }
}

/// A blank contact of kind `k`.
pub fn contact(k: &str) -> ContactInput {
    match k {
        "buffer" => ContactInput::Buffer(BufferInput {
            law: law("linear"),
            count: 1,
            restitution: None,
            radius: None,
        }),
        "body" => ContactInput::Body(BodyInput {
            region: BodyRegion::HandFingers,
            specific_area: None,
            area: area("edge"),
            padding: None,
        }),
        _ => ContactInput::None,
    }
}

/// Key of a buffer law.
pub fn law_kind(l: &BufferLawInput) -> &'static str {
    match l {
        BufferLawInput::Linear { .. } => "linear",
        BufferLawInput::PowerLaw { .. } => "power_law",
        BufferLawInput::Spring { .. } => "spring",
        BufferLawInput::ConstantForce { .. } => "constant_force",
        BufferLawInput::Absorber { .. } => "absorber",
        BufferLawInput::Orifice { .. } => "orifice",
    }
}

/// A blank buffer law of kind `k`.
pub fn law(k: &str) -> BufferLawInput {
    match k {
        "power_law" => BufferLawInput::PowerLaw {
            force_at_stroke: b(),
            exponent: b(),
            stroke: b(),
        },
        "spring" => BufferLawInput::Spring {
            model: model("gas"),
            preload_deflection: None,
        },
        "constant_force" => BufferLawInput::ConstantForce {
            force: b(),
            stroke: b(),
        },
        "absorber" => BufferLawInput::Absorber {
            stroke: b(),
            efficiency: None,
        },
        "orifice" => BufferLawInput::Orifice {
            coefficient: b(),
            stroke: b(),
        },
        _ => BufferLawInput::Linear {
            rate: b(),
            stroke: b(),
        },
    }
}

/// Key of a contact-area shape.
pub fn area_kind(a: &AreaInput) -> &'static str {
    match a {
        AreaInput::Edge { .. } => "edge",
        AreaInput::Circle { .. } => "circle",
        AreaInput::Given { .. } => "given",
    }
}

/// A blank contact area of shape `k`.
pub fn area(k: &str) -> AreaInput {
    match k {
        "circle" => AreaInput::Circle { diameter: b() },
        "given" => AreaInput::Given { area: b() },
        _ => AreaInput::Edge {
            length: b(),
            width: b(),
        },
    }
}

/// Key of the closing-gap geometry (`none` when no gap is assessed).
pub fn gap_kind(g: &Option<GapInput>) -> &'static str {
    match g.as_ref().map(|g| &g.geometry) {
        None => "none",
        Some(GapGeometryInput::Closed) => "closed",
        Some(GapGeometryInput::Clearance { .. }) => "clearance",
        Some(GapGeometryInput::BufferStop { .. }) => "buffer_stop",
    }
}

/// A blank gap geometry of kind `k`.
pub fn gap_geometry(k: &str) -> GapGeometryInput {
    match k {
        "clearance" => GapGeometryInput::Clearance { gap: b() },
        "buffer_stop" => GapGeometryInput::BufferStop {
            gap_at_buffer_contact: b(),
        },
        _ => GapGeometryInput::Closed,
    }
}

/// A blank user limit.
pub fn user_limit() -> UserLimitInput {
    UserLimitInput {
        name: String::new(),
        figure: joulewise_core::figure::ids::IMPACT_PEAK_FORCE.into(),
        threshold: b(),
        comparison: joulewise_core::limits::Comparison::AtMost,
        source: String::new(),
    }
}
