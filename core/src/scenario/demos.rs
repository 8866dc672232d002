//! Demo scenarios to start from. Every machine, line and figure here is
//! invented for the demonstration; none describes a real product or site,
//! and none is used as a check of the physics.

use super::*;

fn v(text: &str) -> Value {
    Value::new(text)
}

fn vt(text: &str, tol: &str) -> Value {
    Value::with_tol(text, tol, Spread::Uniform)
}

fn identity(title: &str, tag: &str, location: &str, notes: &str) -> Identity {
    Identity {
        title: title.into(),
        machine_tag: tag.into(),
        location: location.into(),
        assessor: "Demo assessor".into(),
        date: "2026-11-30".into(),
        revision: "A".into(),
        notes: notes.into(),
    }
}

/// A demo: stable key, title and the scenario.
pub struct Demo {
    /// Stable key (`joulewise demo KEY`, URL, tests).
    pub key: &'static str,
    /// Title for the picker.
    pub title: &'static str,
    /// One line on what it shows.
    pub summary: &'static str,
    /// Builds the scenario.
    pub build: fn() -> Scenario,
}

/// Every demo, in the order the picker shows them.
pub fn all() -> Vec<Demo> {
    vec![
        Demo {
            key: "guard-door",
            title: "Spring-closed guard door, dough divider",
            summary: "Hinged door closed by a torsion spring; closing edge meets a hand.",
            build: guard_door,
        },
        Demo {
            key: "carriage-stop",
            title: "Transfer carriage end stop, parcel sorter",
            summary:
                "Belt-driven carriage into a progressive elastomer buffer; tolerances, sizing.",
            build: carriage_stop,
        },
        Demo {
            key: "brake-springs",
            title: "Spring-applied brake, test rig",
            summary: "Helical springs holding a brake: energy left for lockout.",
            build: brake_springs,
        },
        Demo {
            key: "ejector",
            title: "Part ejector, tray filler",
            summary:
                "Striker thrown by a preloaded spring it leaves, stopped by a gas-spring buffer.",
            build: ejector,
        },
    ]
}

/// The demo with this key.
pub fn by_key(key: &str) -> Option<Scenario> {
    all()
        .into_iter()
        .find(|d| d.key == key)
        .map(|d| (d.build)())
}

/// A self-closing guard door on a vertical hinge (no gravity torque), closed
/// by a torsion spring, its closing edge meeting a hand.
pub fn guard_door() -> Scenario {
    Scenario {
        schema_version: SCHEMA_VERSION,
        identity: identity(
            "Guard door, dough divider infeed",
            "DD-2-GD1",
            "Demo bakery, bread line 2",
            "Invented demo scenario. Door held open by a magnet latch; released, the spring swings it shut.",
        ),
        display_units: UnitSystem::Si,
        part: PartInput::Rotating(RotatingInput {
            inertia: InertiaInput::Plate {
                mass: vt("4.2 kg", "±5 %"),
                width: v("550 mm"),
            },
            hinge_tilt: Some(v("0 deg")),
            cg_angle_at_latch: None,
            travel: v("86 deg"),
            friction_torque: Some(v("0.05 N·m")),
            drive_torque: None,
            hazard_radius: v("550 mm"),
        }),
        spring: Some(SpringInput {
            model: SpringModelInput::Torsion {
                rate: vt("1.8 N·m/rad", "±10 %"),
                max_angle: v("150 deg"),
            },
            mount: MountInput::Direct {
                deflection_at_latch: v("110 deg"),
                sense: SenseInput::Unloads,
                detaches: false,
            },
        }),
        states: vec![],
        contact: ContactInput::Body(BodyInput {
            region: RegionId::HandFingers,
            specific_area: None,
            area: AreaInput::Edge {
                length: v("80 mm"),
                width: v("12 mm"),
            },
            padding: None,
        }),
        gap: Some(GapInput {
            geometry: GapGeometryInput::Closed,
            body_parts: vec![BodyPart::Finger, BodyPart::HandWristFist],
        }),
        limits: LimitsInput {
            guard: Some(GuardChoice {
                kind: GuardKind::SelfClosing,
                protective_device: false,
            }),
            ..LimitsInput::default()
        },
        sizing: None,
        study: StudyInput::default(),
        cycles_per_hour: None,
    }
}

/// A belt-driven transfer carriage running into a progressive elastomer
/// buffer at the end of its track.
pub fn carriage_stop() -> Scenario {
    Scenario {
        schema_version: SCHEMA_VERSION,
        identity: identity(
            "Transfer carriage end stop, sorter lane 4",
            "PS-L4-EB",
            "Demo parcel hub, sorter hall",
            "Invented demo scenario. Drive keeps pushing into the end buffer after a missed slow-down.",
        ),
        display_units: UnitSystem::Si,
        part: PartInput::Translating(TranslatingInput {
            mass: vt("85 kg", "±5 %"),
            travel: v("1.2 m"),
            incline: None,
            friction: FrictionInput::Coefficient { mu: v("0.02") },
            damping: None,
            drive_force: Some(vt("150 N", "±10 %")),
            include_spring_mass: true,
        }),
        spring: None,
        states: vec![],
        contact: ContactInput::Buffer(BufferInput {
            law: BufferLawInput::PowerLaw {
                force_at_stroke: vt("12 kN", "±15 %"),
                exponent: v("2.2"),
                stroke: v("40 mm"),
            },
            count: 1,
            restitution: Some(v("0.4")),
            radius: None,
        }),
        gap: Some(GapInput {
            geometry: GapGeometryInput::BufferStop {
                gap_at_buffer_contact: v("140 mm"),
            },
            body_parts: vec![BodyPart::HandWristFist, BodyPart::Arm],
        }),
        limits: LimitsInput {
            user: vec![UserLimitInput {
                name: "Frame design load at the end stop".into(),
                figure: crate::figure::ids::IMPACT_PEAK_FORCE.into(),
                threshold: v("6 kN"),
                comparison: Comparison::AtMost,
                source: "Demo frame calculation, rev. B (invented)".into(),
            }],
            ..LimitsInput::default()
        },
        sizing: Some(SizingSpec {
            peak_force: Some(v("5 kN")),
            peak_deceleration: None,
            mean_deceleration: None,
            stroke: Some(v("60 mm")),
        }),
        study: StudyInput {
            monte_carlo: true,
            ..StudyInput::default()
        },
        cycles_per_hour: Some(v("120 /h")),
    }
}

/// Helical compression springs holding a spring-applied brake: the energy
/// locked in them when the brake is released (coil energised) and applied.
pub fn brake_springs() -> Scenario {
    Scenario {
        schema_version: SCHEMA_VERSION,
        identity: identity(
            "Spring-applied brake, dynamometer test rig",
            "TR-7-BRK",
            "Demo test hall, rig 7",
            "Invented demo scenario. Six springs act on the armature plate; one spring modelled with the plate's share of mass.",
        ),
        display_units: UnitSystem::Si,
        part: PartInput::Translating(TranslatingInput {
            mass: v("0.35 kg"),
            travel: v("0.6 mm"),
            incline: None,
            friction: FrictionInput::None,
            damping: None,
            drive_force: None,
            include_spring_mass: true,
        }),
        spring: Some(SpringInput {
            model: SpringModelInput::Helical(HelicalInput {
                wire_diameter: vt("2.5 mm", "±0.02 mm"),
                coil_diameter: v("16 mm"),
                diameter_kind: DiameterKind::Mean,
                active_coils: v("6"),
                total_coils: None,
                ends: EndType::ClosedGround,
                free_length: v("38 mm"),
                material: Grade::En10270_1Dh,
                seating: Seating::BothFixed,
            }),
            mount: MountInput::Direct {
                deflection_at_latch: v("9.6 mm"),
                sense: SenseInput::Unloads,
                detaches: false,
            },
        }),
        states: vec![StateInput {
            name: "Maintenance: adjusting nuts backed off 5 mm".into(),
            deflection: v("4 mm"),
        }],
        contact: ContactInput::None,
        gap: None,
        limits: LimitsInput::default(),
        sizing: None,
        study: StudyInput::default(),
        cycles_per_hour: None,
    }
}

/// A striker thrown by a preloaded spring that it leaves, stopped by a gas
/// spring buffer.
pub fn ejector() -> Scenario {
    Scenario {
        schema_version: SCHEMA_VERSION,
        identity: identity(
            "Part ejector, tray filler",
            "TF-3-EJ",
            "Demo packaging line 3",
            "Invented demo scenario. Striker leaves its spring after 30 mm and coasts into a gas-spring buffer.",
        ),
        display_units: UnitSystem::Si,
        part: PartInput::Translating(TranslatingInput {
            mass: vt("2 kg", "±3 %"),
            travel: v("60 mm"),
            incline: Some(v("0 deg")),
            friction: FrictionInput::Force { force: v("4 N") },
            damping: None,
            drive_force: None,
            include_spring_mass: true,
        }),
        spring: Some(SpringInput {
            model: SpringModelInput::Linear {
                rate: vt("8 N/mm", "±8 %"),
                max_deflection: v("45 mm"),
            },
            mount: MountInput::Direct {
                deflection_at_latch: v("30 mm"),
                sense: SenseInput::Unloads,
                detaches: true,
            },
        }),
        states: vec![],
        contact: ContactInput::Buffer(BufferInput {
            law: BufferLawInput::Spring {
                model: SpringModelInput::Gas {
                    nominal_force: v("150 N"),
                    progression: v("1.4"),
                    stroke: v("25 mm"),
                    friction_band: Some(v("30 N")),
                    force_reference: crate::spring::gas::ForceReference::Extension,
                    polytropic_index: None,
                },
                preload_deflection: None,
            },
            count: 1,
            restitution: None,
            radius: None,
        }),
        gap: None,
        limits: LimitsInput::default(),
        sizing: None,
        study: StudyInput::default(),
        cycles_per_hour: Some(v("900 /h")),
    }
}
