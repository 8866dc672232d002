//! Round trip: every buffer type sized by `sizing::size_buffer` is fed back
//! into the forward model `contact::buffer::impact` (a Dormand–Prince
//! integration of the stroke), which must reproduce the sized stroke, peak
//! force and stopping time and meet every limit, within the tolerance the
//! verification catalogue states for `cross.sizing.impact_round_trip`.
//!
//! Mapping of the sized settings onto the impact model's buffer laws (see
//! the module docs of `sizing` and `contact::buffer`):
//! - linear spring `k` → `BufferLaw::Linear`; power law `a·xⁿ` →
//!   `BufferLaw::PowerLaw`; each with a usable stroke longer than the sized
//!   one, so that the part stops inside it and the stroke used is measured;
//! - hydraulic absorber of efficiency η → `BufferLaw::IdealAbsorber` over the
//!   sized stroke (it adjusts its force to stop the part there; the peak
//!   force E_T/(η·s) must match), and for η = 1 also
//!   `BufferLaw::ConstantForce` at the sized mean force;
//! - orifice damper `c` → `BufferLaw::Orifice` over the sized stroke: the
//!   part must reach the end of it at the sized residual speed;
//! - gas spring (force at contact F₁, progression p, polytropic index κ) →
//!   `BufferLaw::Spring` holding a `spring::GasSpring` with no friction band,
//!   its stroke lengthened to S' = f·s and its progression to
//!   p' = (1 − b·f)^(−κ), b = 1 − p^(−1/κ), which is the same polytropic law
//!   (the gas volume falls by the same fraction per metre) carried on past
//!   the sized stroke. The gap: sizing accepts κ up to 1.67, the gas spring
//!   model up to 5/3 = 1.6667, so a sized κ in (5/3, 1.67] has no gas-spring
//!   counterpart (this test does not use one).
//!
//! The drive and gravity components act as one constant push
//! (`drive_force` = drive + gravity, incline 0), friction as the impact
//! model's Coulomb friction.
#![forbid(unsafe_code)]

use joulewise_core::contact::buffer::{
    impact, Buffer, BufferConfig, BufferLaw, ImpactConfig, ImpactInput, ImpactOutcome, Rebound,
    StrokeEnd,
};
use joulewise_core::ode::SolverConfig;
use joulewise_core::sizing::{
    size_buffer, BufferSetting, BufferType, MovingBody, SizedBuffer, SizingInput, SizingLimits,
    SizingResult,
};
use joulewise_core::spring::{GasSpec, GasSpring};
use joulewise_core::verification;

const CHECK: &str = "cross.sizing.impact_round_trip";

/// Usable stroke given to spring-type buffers, as a multiple of the sized
/// stroke: room to stop inside it.
const STROKE_ROOM: f64 = 1.25;

fn tolerance() -> f64 {
    verification::check(CHECK)
        .unwrap_or_else(|| panic!("{CHECK} is not in the verification catalogue"))
        .tolerance
        .relative
}

fn rel(got: f64, want: f64) -> f64 {
    (got - want).abs() / want.abs().max(f64::MIN_POSITIVE)
}

fn duties() -> Vec<(&'static str, SizingInput)> {
    let limits = SizingLimits {
        peak_force: Some(6000.0),
        peak_deceleration: Some(70.0),
        mean_deceleration: Some(30.0),
        stroke: Some(0.2),
    };
    let base = SizingInput {
        moving: MovingBody::Translating { mass: 60.0 },
        impact_speed: 1.4,
        drive_force: 400.0,
        gravity_force: 100.0,
        friction_force: 50.0,
        cycles_per_hour: 120.0,
        limits,
    };
    vec![
        ("driven, downhill, with friction", base),
        (
            "free mass",
            SizingInput {
                drive_force: 0.0,
                gravity_force: 0.0,
                friction_force: 0.0,
                ..base
            },
        ),
        (
            "uphill against friction",
            SizingInput {
                drive_force: 0.0,
                gravity_force: -80.0,
                friction_force: 20.0,
                ..base
            },
        ),
        (
            "rotating part, force limit only",
            SizingInput {
                moving: MovingBody::Rotating {
                    inertia: 2.4,
                    radius: 0.5,
                },
                impact_speed: 2.0,
                drive_force: 0.0,
                gravity_force: 0.0,
                friction_force: 0.0,
                cycles_per_hour: 0.0,
                limits: SizingLimits {
                    peak_force: Some(2500.0),
                    stroke: Some(0.12),
                    ..SizingLimits::default()
                },
            },
        ),
    ]
}

fn types() -> Vec<BufferType> {
    vec![
        BufferType::LinearSpring,
        BufferType::PowerLaw { exponent: 1.0 },
        BufferType::PowerLaw { exponent: 2.5 },
        BufferType::PowerLaw { exponent: 0.7 },
        BufferType::ConstantForce { efficiency: 1.0 },
        BufferType::ConstantForce { efficiency: 0.8 },
        BufferType::GasSpring {
            progression: 1.3,
            polytropic_index: 1.4,
        },
        BufferType::GasSpring {
            progression: 2.0,
            polytropic_index: 1.0,
        },
        BufferType::Orifice {
            residual_speed: 0.5,
        },
    ]
}

fn buffer(law: BufferLaw<'_>) -> Buffer<'_> {
    Buffer::new(BufferConfig {
        law,
        count: 1,
        rebound: Rebound::Elastic,
    })
    .unwrap_or_else(|e| panic!("a valid buffer: {e}"))
}

/// The impact of the duty on one buffer law.
fn strike(inp: &SizingInput, law: BufferLaw<'_>) -> ImpactOutcome {
    let input = ImpactInput {
        mass: inp
            .moving
            .effective_mass()
            .unwrap_or_else(|e| panic!("a valid mass: {e}")),
        speed: inp.impact_speed,
        drive_force: inp.drive_force + inp.gravity_force,
        incline: 0.0,
        friction_force: inp.friction_force,
        cycles_per_hour: inp.cycles_per_hour,
    };
    let cfg = ImpactConfig {
        solver: SolverConfig {
            rtol: 1e-10,
            atol: 1e-14,
            ..SolverConfig::default()
        },
        samples: 0,
    };
    impact(&input, &buffer(law), &cfg).unwrap_or_else(|e| panic!("the impact integrates: {e}"))
}

/// Compare one forward stroke with the sized design and the limits; returns
/// the largest relative deviation.
fn compare(label: &str, inp: &SizingInput, d: &SizedBuffer, out: &ImpactOutcome) -> f64 {
    let tol = tolerance();
    let mut worst: f64 = 0.0;
    let stop = match out.end {
        StrokeEnd::Bottomed { residual_speed } => {
            worst = worst.max(rel(residual_speed, d.residual_speed));
            assert!(
                rel(residual_speed, d.residual_speed) <= tol,
                "{label}: residual speed {residual_speed} vs sized {}",
                d.residual_speed
            );
            out.compression_time
        }
        _ => out
            .stop_time()
            .unwrap_or_else(|| panic!("{label}: no stop time")),
    };
    for (what, got, want) in [
        ("stroke", out.stroke_used, d.stroke),
        ("peak force", out.peak_force, d.peak_force),
        ("stop time", stop, d.stop_time),
        (
            "mean deceleration",
            out.mean_deceleration(),
            d.mean_deceleration,
        ),
    ] {
        worst = worst.max(rel(got, want));
        assert!(
            rel(got, want) <= tol,
            "{label}: {what} forward {got} vs sized {want}"
        );
    }
    let l = inp.limits;
    let within = |v: f64, lim: Option<f64>| lim.is_none_or(|l| v <= l * (1.0 + tol));
    assert!(within(out.peak_force, l.peak_force), "{label}: peak force");
    assert!(
        within(out.peak_deceleration, l.peak_deceleration),
        "{label}: peak deceleration {} vs {:?}",
        out.peak_deceleration,
        l.peak_deceleration
    );
    assert!(
        within(out.mean_deceleration(), l.mean_deceleration),
        "{label}: mean deceleration"
    );
    assert!(within(out.stroke_used, l.stroke), "{label}: stroke");
    worst
}

/// The gas spring of the impact model with the sized law, carried past the
/// sized stroke `s` to `f·s`.
fn gas_spring(f1: f64, p: f64, kappa: f64, s: f64) -> GasSpring {
    let b = -(-(p.ln()) / kappa).exp_m1(); // 1 − p^(−1/κ)
    let f = STROKE_ROOM.min(0.5 * (1.0 + 1.0 / b));
    GasSpring::new(GasSpec {
        nominal_force: f1,
        progression: (1.0 - b * f).powf(-kappa),
        stroke: f * s,
        friction_band: 0.0,
        force_reference: Default::default(),
        polytropic_index: Some(kappa),
        moving_mass: None,
    })
    .unwrap_or_else(|e| panic!("a valid gas spring: {e}"))
}

#[test]
fn sized_buffers_meet_every_limit_in_the_impact_model() {
    let mut compared = 0;
    let mut worst = (0.0, String::new());
    let mut note = |dev: f64, label: &str| {
        if dev > worst.0 {
            worst = (dev, label.to_string());
        }
    };
    for (name, inp) in duties() {
        for bt in types() {
            let o = size_buffer(&inp, &bt).expect("valid sizing input");
            let SizingResult::Feasible {
                required,
                using_available_stroke,
                ..
            } = &o.result
            else {
                panic!("{name}, {bt:?}: no design: {:?}", o.result);
            };
            for d in [required, using_available_stroke].into_iter().flatten() {
                let label = format!("{name}, {bt:?}, stroke {}", d.stroke);
                let room = STROKE_ROOM * d.stroke;
                match d.setting {
                    BufferSetting::LinearSpring { rate } => {
                        let out = strike(&inp, BufferLaw::Linear { rate, stroke: room });
                        note(compare(&label, &inp, d, &out), &label);
                    }
                    BufferSetting::PowerLaw {
                        coefficient,
                        exponent,
                        ..
                    } => {
                        let coefficient = coefficient.expect("a finite coefficient");
                        let law = BufferLaw::PowerLaw {
                            coefficient,
                            exponent,
                            stroke: room,
                        };
                        note(compare(&label, &inp, d, &strike(&inp, law)), &label);
                    }
                    BufferSetting::ConstantForce {
                        mean_force,
                        efficiency,
                    } => {
                        let law = BufferLaw::IdealAbsorber {
                            stroke: d.stroke,
                            efficiency,
                        };
                        note(compare(&label, &inp, d, &strike(&inp, law)), &label);
                        if efficiency == 1.0 {
                            let law = BufferLaw::ConstantForce {
                                force: mean_force,
                                stroke: room,
                            };
                            note(compare(&label, &inp, d, &strike(&inp, law)), &label);
                        }
                    }
                    BufferSetting::Orifice { coefficient, .. } => {
                        let law = BufferLaw::Orifice {
                            coefficient,
                            stroke: d.stroke,
                        };
                        let out = strike(&inp, law);
                        assert!(
                            matches!(out.end, StrokeEnd::Bottomed { .. }),
                            "{label}: an orifice damper hands the part to the end stop"
                        );
                        note(compare(&label, &inp, d, &out), &label);
                    }
                    BufferSetting::GasSpring {
                        force_at_contact,
                        progression,
                        polytropic_index,
                    } => {
                        let g =
                            gas_spring(force_at_contact, progression, polytropic_index, d.stroke);
                        let law = BufferLaw::Spring {
                            spring: &g,
                            preload_deflection: 0.0,
                        };
                        note(compare(&label, &inp, d, &strike(&inp, law)), &label);
                    }
                }
                compared += 1;
            }
        }
    }
    println!(
        "{compared} designs fed back; largest relative deviation {:.2e} ({})",
        worst.0, worst.1
    );
    // Every type in every duty gives at least one design.
    assert!(compared >= duties().len() * types().len(), "{compared}");
}
