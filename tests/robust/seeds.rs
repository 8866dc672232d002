//! Seed scenarios for fuzzing and the mutation smoke test: the four demos
//! plus variants that between them use every spring model, mount, part
//! shape, friction, contact law, body-area shape, gap geometry, limit set,
//! sizing and the field identification methods, so that mutations start
//! from every branch of the scenario format. All of them are invented
//! inputs for robustness tests, not checks of the physics.

use joulewise_core::limits::body::BodyRegion;
use joulewise_core::limits::crane::CraneTravel;
use joulewise_core::limits::gaps::BodyPart;
use joulewise_core::limits::guards::GuardKind;
use joulewise_core::limits::lift::{En81BufferType, UsBufferType, UsInstallation};
use joulewise_core::limits::Comparison;
use joulewise_core::scenario::*;
use joulewise_core::spring::gas::ForceReference;
use joulewise_core::spring::Axis;

fn v(text: &str) -> Value {
    Value::new(text)
}

fn sv(text: &str) -> Option<Value> {
    Some(Value::new(text))
}

fn pt(q: &str, f: &str) -> PointInput {
    PointInput {
        deflection: v(q),
        force: v(f),
    }
}

fn with_spring(mut s: Scenario, model: SpringModelInput, latch: &str) -> Scenario {
    s.spring = Some(SpringInput {
        model,
        mount: MountInput::Direct {
            deflection_at_latch: v(latch),
            sense: SenseInput::Unloads,
            detaches: false,
        },
    });
    s
}

fn with_law(mut s: Scenario, law: BufferLawInput) -> Scenario {
    s.contact = ContactInput::Buffer(BufferInput {
        law,
        count: 1,
        restitution: None,
        radius: None,
    });
    s
}

fn linear(rate: &str, max: &str) -> SpringModelInput {
    SpringModelInput::Linear {
        rate: v(rate),
        max_deflection: v(max),
    }
}

fn gas() -> SpringModelInput {
    SpringModelInput::Gas {
        nominal_force: v("150 N"),
        progression: v("1.4"),
        stroke: v("25 mm"),
        friction_band: sv("30 N"),
        force_reference: ForceReference::Extension,
        polytropic_index: None,
    }
}

/// Every seed with a short name, the demos first.
pub fn seeds() -> Vec<(String, Scenario)> {
    let mut out: Vec<(String, Scenario)> = demos::all()
        .into_iter()
        .map(|d| (format!("demo-{}", d.key), (d.build)()))
        .collect();
    let ejector = demos::ejector();
    let brake = demos::brake_springs();
    let door = demos::guard_door();
    let carriage = demos::carriage_stop();
    let mut add = |name: &str, s: Scenario| out.push((name.to_string(), s));

    // Spring models on the ejector's sliding striker.
    add(
        "extension-spring",
        with_spring(
            ejector.clone(),
            SpringModelInput::Extension {
                initial_tension: v("5 N"),
                rate: v("2 N/mm"),
                max_deflection: v("40 mm"),
            },
            "30 mm",
        ),
    );
    let mut disc = with_spring(
        brake.clone(),
        SpringModelInput::Disc(DiscInput {
            outer_diameter: v("40 mm"),
            inner_diameter: v("20.4 mm"),
            thickness: v("2 mm"),
            cone_height: v("0.9 mm"),
            in_series: 4,
            in_parallel: 1,
            youngs_modulus: None,
            poisson_ratio: None,
        }),
        "2 mm",
    );
    disc.states.clear();
    add("disc-stack", disc);
    add(
        "table-with-unloading",
        with_spring(
            ejector.clone(),
            SpringModelInput::Table(TableInput {
                axis: Axis::Linear,
                loading: vec![
                    pt("0 mm", "0 N"),
                    pt("10 mm", "50 N"),
                    pt("20 mm", "120 N"),
                    pt("40 mm", "260 N"),
                ],
                unloading: vec![
                    pt("0 mm", "0 N"),
                    pt("10 mm", "35 N"),
                    pt("20 mm", "90 N"),
                    pt("40 mm", "230 N"),
                ],
            }),
            "30 mm",
        ),
    );
    let measured = |method: IdentifyInput| {
        SpringModelInput::Measured(MeasuredInput {
            method,
            cross_check: None,
            max_deflection: v("45 mm"),
        })
    };
    add(
        "measured-cross-checked",
        with_spring(
            ejector.clone(),
            SpringModelInput::Measured(MeasuredInput {
                method: IdentifyInput::Static {
                    mass: v("5 kg"),
                    sag: v("6.1 mm"),
                    resolution: v("0.5 mm"),
                },
                cross_check: Some(IdentifyInput::Dynamic {
                    mass: v("5 kg"),
                    oscillations: v("10"),
                    time: v("1.6 s"),
                    timing_uncertainty: None,
                    spring_mass: None,
                }),
                max_deflection: v("45 mm"),
            }),
            "30 mm",
        ),
    );
    add(
        "measured-static",
        with_spring(
            ejector.clone(),
            measured(IdentifyInput::Static {
                mass: Value::with_tol("5 kg", "±1 %", Spread::Uniform),
                sag: v("6.1 mm"),
                resolution: v("0.5 mm"),
            }),
            "30 mm",
        ),
    );
    add(
        "measured-dynamic",
        with_spring(
            ejector.clone(),
            measured(IdentifyInput::Dynamic {
                mass: v("5 kg"),
                oscillations: v("10"),
                time: v("1.6 s"),
                timing_uncertainty: None,
                spring_mass: sv("0.2 kg"),
            }),
            "30 mm",
        ),
    );
    add(
        "measured-two-point",
        with_spring(
            ejector.clone(),
            measured(IdentifyInput::TwoPoint {
                length_1: v("80 mm"),
                force_1: v("100 N"),
                length_2: v("60 mm"),
                force_2: v("260 N"),
                force_uncertainty: v("2 N"),
                length_uncertainty: v("0.5 mm"),
            }),
            "30 mm",
        ),
    );
    add(
        "series-springs",
        with_spring(
            ejector.clone(),
            SpringModelInput::Series {
                members: vec![linear("8 N/mm", "45 mm"), linear("20 N/mm", "30 mm")],
            },
            "30 mm",
        ),
    );
    add(
        "parallel-springs",
        with_spring(
            ejector.clone(),
            SpringModelInput::Parallel {
                members: vec![
                    linear("8 N/mm", "45 mm"),
                    SpringModelInput::Extension {
                        initial_tension: v("2 N"),
                        rate: v("1 N/mm"),
                        max_deflection: v("50 mm"),
                    },
                ],
            },
            "30 mm",
        ),
    );

    // A hinged lid on a gas strut, with each inertia shape.
    let mut lid = door.clone();
    lid.spring = Some(SpringInput {
        model: gas(),
        mount: MountInput::Strut {
            frame_x: v("200 mm"),
            frame_y: v("-40 mm"),
            part_radius: v("150 mm"),
            part_angle: v("10 deg"),
            free_length: v("260 mm"),
            mode: StrutModeInput::Compression,
        },
    });
    if let PartInput::Rotating(r) = &mut lid.part {
        r.hinge_tilt = sv("90 deg");
        r.cg_angle_at_latch = sv("80 deg");
        r.travel = v("70 deg");
    }
    add("strut-gas-lid", lid.clone());
    let shapes = [
        (
            "rod",
            InertiaInput::Rod {
                mass: v("3 kg"),
                length: v("600 mm"),
            },
        ),
        (
            "disc",
            InertiaInput::Disc {
                mass: v("3 kg"),
                radius: v("300 mm"),
            },
        ),
        (
            "point",
            InertiaInput::Point {
                mass: v("3 kg"),
                radius: v("400 mm"),
            },
        ),
        (
            "offset",
            InertiaInput::Offset {
                mass: v("3 kg"),
                inertia_about_cg: v("0.05 kg·m²"),
                distance: v("250 mm"),
            },
        ),
        (
            "given",
            InertiaInput::Given {
                inertia: v("0.4 kg·m²"),
                mass: v("3 kg"),
                cg_radius: v("275 mm"),
            },
        ),
    ];
    for (name, shape) in shapes {
        let mut s = door.clone();
        if let PartInput::Rotating(r) = &mut s.part {
            r.inertia = shape;
            r.drive_torque = sv("0.5 N·m");
        }
        add(&format!("inertia-{name}"), s);
    }

    // Buffer laws on the carriage.
    let laws = [
        (
            "linear",
            BufferLawInput::Linear {
                rate: v("300 N/mm"),
                stroke: v("50 mm"),
            },
        ),
        (
            "constant-force",
            BufferLawInput::ConstantForce {
                force: v("4 kN"),
                stroke: v("40 mm"),
            },
        ),
        (
            "absorber",
            BufferLawInput::Absorber {
                stroke: v("40 mm"),
                efficiency: sv("0.85"),
            },
        ),
        (
            "orifice",
            BufferLawInput::Orifice {
                coefficient: v("2000 N·s²/m²"),
                stroke: v("50 mm"),
            },
        ),
        (
            "spring-table",
            BufferLawInput::Spring {
                model: SpringModelInput::Table(TableInput {
                    axis: Axis::Linear,
                    loading: vec![pt("0", "0"), pt("20", "2000"), pt("40", "9000")],
                    unloading: vec![pt("0", "0"), pt("20", "800"), pt("40", "6000")],
                }),
                preload_deflection: sv("1 mm"),
            },
        ),
    ];
    for (name, law) in laws {
        add(&format!("buffer-{name}"), with_law(carriage.clone(), law));
    }
    let mut two = with_law(
        ejector.clone(),
        BufferLawInput::Linear {
            rate: v("5 N/mm"),
            stroke: v("30 mm"),
        },
    );
    if let ContactInput::Buffer(b) = &mut two.contact {
        b.count = 2;
        b.restitution = sv("0.3");
    }
    add("buffer-pair-restitution", two);

    // Body contact with padding and each area shape.
    let mut padded = door.clone();
    padded.contact = ContactInput::Body(BodyInput {
        region: BodyRegion::LowerArmWrist,
        specific_area: None,
        area: AreaInput::Circle {
            diameter: v("20 mm"),
        },
        padding: Some(PaddingInput {
            stiffness: v("30 N/mm"),
            thickness: sv("8 mm"),
        }),
    });
    add("body-padded-circle", padded);
    let mut given = door.clone();
    given.contact = ContactInput::Body(BodyInput {
        region: BodyRegion::Chest,
        specific_area: Some("sternum".into()),
        area: AreaInput::Given { area: v("4 cm²") },
        padding: None,
    });
    add("body-given-area", given);

    // Gaps, limit sets, sizing, states, study.
    let mut clearance = door.clone();
    clearance.gap = Some(GapInput {
        geometry: GapGeometryInput::Clearance { gap: v("30 mm") },
        body_parts: vec![BodyPart::Finger, BodyPart::Head, BodyPart::Foot],
    });
    clearance.limits.guard = Some(GuardChoice {
        kind: GuardKind::PowerOperated,
        protective_device: true,
    });
    clearance.limits.gate = Some(GateChoice {
        gap_width: v("300 mm"),
    });
    add("gap-clearance-gate", clearance);
    let mut lift = with_law(
        carriage.clone(),
        BufferLawInput::Linear {
            rate: v("150 N/mm"),
            stroke: v("120 mm"),
        },
    );
    if let PartInput::Translating(t) = &mut lift.part {
        t.incline = sv("-90 deg");
        t.friction = FrictionInput::None;
        t.drive_force = None;
        t.travel = v("0.3 m");
        t.mass = v("900 kg");
    }
    lift.limits.lift_en81 = Some(En81Choice {
        buffer_type: En81BufferType::LinearAccumulation,
        rated_speed: v("1 m/s"),
    });
    lift.limits.lift_us = Some(UsLiftChoice {
        installation: UsInstallation::Elevator,
        buffer_type: UsBufferType::Spring,
        rated_speed: v("200 ft/min"),
        terminal_speed_limiter: false,
    });
    lift.limits.crane = Some(CraneChoice {
        travel: CraneTravel::Bridge,
        rated_speed: v("1 m/s"),
    });
    lift.limits.user.push(UserLimitInput {
        name: "at least some stroke".into(),
        figure: "impact.stroke_used".into(),
        threshold: v("1 mm"),
        comparison: Comparison::AtLeast,
        source: String::new(),
    });
    lift.sizing = Some(SizingSpec {
        peak_force: None,
        peak_deceleration: sv("2.5 g"),
        mean_deceleration: sv("1 g"),
        stroke: sv("150 mm"),
    });
    add("lift-limits-sizing", lift);
    let mut loads = brake.clone();
    if let Some(sp) = &mut loads.spring {
        sp.mount = MountInput::Direct {
            deflection_at_latch: v("2 mm"),
            sense: SenseInput::Loads,
            detaches: false,
        };
    }
    if let PartInput::Translating(t) = &mut loads.part {
        t.drive_force = sv("300 N");
        t.damping = sv("20 N·s/m");
        t.incline = sv("30 deg");
        t.friction = FrictionInput::Coefficient { mu: v("0.1") };
    }
    loads.states.push(StateInput {
        name: "half way".into(),
        deflection: v("3 mm"),
    });
    loads.display_units = joulewise_core::units::UnitSystem::Us;
    add("spring-loads-us-units", loads);
    let mut study = carriage.clone();
    study.study.samples = 50;
    study.study.seed = 7;
    add("small-study", study);
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use joulewise_core::assess::assess;

    /// Every seed reads and assesses without an input error, so mutations
    /// start from scenarios that reach the physics.
    #[test]
    fn every_seed_assesses_without_input_errors() {
        for (name, s) in seeds() {
            let r = assess(&s).unwrap_or_else(|e| panic!("{name}: {e}"));
            assert!(r.errors.is_empty(), "{name}: {:#?}", r.errors);
            let back = Scenario::from_json(&s.to_json()).unwrap();
            assert_eq!(back.to_json(), s.to_json(), "{name}");
        }
    }
}
