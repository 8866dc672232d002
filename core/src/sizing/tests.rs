//! Tests of buffer sizing: published and derived cases with their sources,
//! an independent forward check by a fixed-step integrator written here,
//! and properties.

use super::*;
use crate::test_tol::REL_EXACT;
use approx::assert_relative_eq;
use proptest::prelude::*;

/// Closed forms evaluated through a short chain of operations (a division,
/// a square root): a few units of rounding.
const REL_CLOSED: f64 = 1e-12;
/// Values printed to 4 significant figures in the reference table.
const REL_PRINTED_4SF: f64 = crate::test_tol::REL_PRINTED_4SF;
/// The independent forward integration below (RK4, 20 000 steps over the
/// stop, crossing located by linear interpolation between steps): its own
/// error is ~1e-9 relative for smooth laws and ~1e-7 for a power law with a
/// non-integer exponent (force not smooth at first contact); allow 1e-6.
const REL_FORWARD: f64 = 1e-6;
/// The same for a power law with exponent below 1: its force ∝ xⁿ has an
/// infinite slope at contact, which costs RK4 its order over the first
/// steps (measured 3e-6 relative on the stroke at n = 0.2 with 20 000
/// steps); allow 1e-4. The sized stroke itself is exact: the energy balance
/// is checked in closed form in
/// `closed_forms_of_the_energy_balance_hold_for_sized_buffers`.
const REL_FORWARD_ROUGH: f64 = 1e-4;
/// An orifice design whose terminal speed is within this fraction of the
/// residual speed is not integrated forward: the approach to v_r is
/// asymptotic and RK4's own ~1e-10 error in v decides the crossing.
const ILL_CONDITIONED: f64 = 1e-6;
/// Steps of the forward integration over the predicted stopping time.
const FORWARD_STEPS: usize = 20_000;

const FT: f64 = 0.3048; // m, exact (NIST SP 811 B.8)
const INCH: f64 = 0.0254; // m, exact (NIST SP 811 B.8)

fn input(m: f64, v: f64, drive: f64, limits: SizingLimits) -> SizingInput {
    SizingInput {
        moving: MovingBody::Translating { mass: m },
        impact_speed: v,
        drive_force: drive,
        gravity_force: 0.0,
        friction_force: 0.0,
        cycles_per_hour: 0.0,
        limits,
    }
}

fn feasible(o: &SizingOutcome) -> (Option<&SizedBuffer>, Option<&SizedBuffer>) {
    match &o.result {
        SizingResult::Feasible {
            required,
            using_available_stroke,
            ..
        } => (required.as_ref(), using_available_stroke.as_ref()),
        SizingResult::Infeasible { reasons } => panic!("expected feasible, got {reasons:?}"),
    }
}

fn reasons(o: &SizingOutcome) -> &[Infeasibility] {
    match &o.result {
        SizingResult::Infeasible { reasons } => reasons,
        other => panic!("expected infeasible, got {other:?}"),
    }
}

// ---------------------------------------------------------------------------
// Reference cases.

#[test]
fn t28_drive_force_energy_ideal_and_spring() {
    // reference-values.md T28 (D): 100 kg at 1.5 m/s plus a 500 N drive over
    // 50 mm: E_total = 137.5 J; ideal absorber 2 750 N, linear spring 5 500 N;
    // 600 cycles/h → 82 500 J/h; ideal deceleration (2750 − 500)/100 =
    // 22.5 m/s².
    let mut inp = input(
        100.0,
        1.5,
        500.0,
        SizingLimits {
            stroke: Some(0.05),
            ..Default::default()
        },
    );
    inp.cycles_per_hour = 600.0;
    let o = size_buffer(&inp, &BufferType::ConstantForce { efficiency: 1.0 }).unwrap();
    let (req, avail) = feasible(&o);
    assert!(req.is_none(), "only a stroke limit: no least stroke");
    let d = avail.unwrap();
    assert_relative_eq!(d.energy_per_cycle, 137.5, max_relative = REL_CLOSED);
    assert_relative_eq!(d.peak_force, 2750.0, max_relative = REL_CLOSED);
    assert_relative_eq!(d.peak_deceleration, 22.5, max_relative = REL_CLOSED);
    assert_relative_eq!(d.mean_deceleration, 22.5, max_relative = REL_CLOSED);
    assert_relative_eq!(d.energy_per_hour, 82_500.0, max_relative = REL_CLOSED);
    assert_relative_eq!(d.heat_load, 82_500.0 / 3600.0, max_relative = REL_CLOSED);
    // Effective mass 2·137.5/1.5² (derived from T28's E_total).
    assert_relative_eq!(
        d.effective_mass,
        2.0 * 137.5 / 2.25,
        max_relative = REL_CLOSED
    );
    match d.setting {
        BufferSetting::ConstantForce { mean_force, .. } => {
            assert_relative_eq!(mean_force, 2750.0, max_relative = REL_CLOSED)
        }
        other => panic!("{other:?}"),
    }

    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    let d = feasible(&o).1.unwrap();
    assert_relative_eq!(d.peak_force, 5500.0, max_relative = REL_CLOSED);
    assert_relative_eq!(d.energy_per_cycle, 137.5, max_relative = REL_CLOSED);

    // The same ideal absorber found from a force limit of 2 750 N instead.
    inp.limits = SizingLimits {
        peak_force: Some(2750.0),
        ..Default::default()
    };
    let o = size_buffer(&inp, &BufferType::ConstantForce { efficiency: 1.0 }).unwrap();
    let d = feasible(&o).0.unwrap();
    assert_relative_eq!(d.stroke, 0.05, max_relative = REL_CLOSED);
}

#[test]
fn t7_railway_wagon_on_two_spring_buffers() {
    // Bhandari, Design of Machine Elements, 3rd ed., Ex. 10.6 (R for KE, P,
    // k): 1 500 kg at 1.5 m/s, 150 mm compression, two springs → KE =
    // 1 687.5 J, P = 11 250 N per spring, k = 75 N/mm per spring. Peak
    // deceleration 15.0 m/s² and stopping time 0.1571 s are D (T7).
    let inp = input(
        1500.0,
        1.5,
        0.0,
        SizingLimits {
            stroke: Some(0.150),
            ..Default::default()
        },
    );
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    assert_relative_eq!(o.kinetic_energy, 1687.5, max_relative = REL_CLOSED);
    let d = feasible(&o).1.unwrap();
    assert_relative_eq!(d.peak_force / 2.0, 11_250.0, max_relative = REL_CLOSED);
    match d.setting {
        BufferSetting::LinearSpring { rate } => {
            assert_relative_eq!(rate / 2.0, 75.0e3, max_relative = REL_CLOSED)
        }
        other => panic!("{other:?}"),
    }
    assert_relative_eq!(d.peak_deceleration, 15.0, max_relative = REL_CLOSED);
    assert_relative_eq!(d.stop_time, 0.1571, max_relative = REL_PRINTED_4SF);
}

#[test]
fn t8_mass_striking_a_linear_spring_sized_from_its_peak_force() {
    // reference-values.md T8 (D): 10 kg at 2 m/s on 20 N/mm: x = 44.72 mm,
    // F = 894.43 N, a = 89.44 m/s², t = 35.12 ms, mean 56.94 m/s². Sizing
    // with the force limit F = v·√(m·k) = 894.427 191 N (exact) returns
    // the rate and the rest.
    let f = 2.0 * (10.0_f64 * 20_000.0).sqrt();
    let inp = input(
        10.0,
        2.0,
        0.0,
        SizingLimits {
            peak_force: Some(f),
            ..Default::default()
        },
    );
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    let d = feasible(&o).0.unwrap();
    match d.setting {
        BufferSetting::LinearSpring { rate } => {
            assert_relative_eq!(rate, 20_000.0, max_relative = REL_CLOSED)
        }
        other => panic!("{other:?}"),
    }
    assert_relative_eq!(d.stroke, 0.04472, max_relative = REL_PRINTED_4SF);
    assert_relative_eq!(d.peak_deceleration, 89.44, max_relative = REL_PRINTED_4SF);
    assert_relative_eq!(d.stop_time, 0.03512, max_relative = REL_PRINTED_4SF);
    assert_relative_eq!(d.mean_deceleration, 56.94, max_relative = REL_PRINTED_4SF);
    assert_relative_eq!(d.energy_per_cycle, 20.0, max_relative = REL_CLOSED);
    // The mean-deceleration limit alone gives the same spring back
    // (bisection on the closed-form time).
    let inp = input(
        10.0,
        2.0,
        0.0,
        SizingLimits {
            mean_deceleration: Some(d.mean_deceleration),
            ..Default::default()
        },
    );
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    let back = feasible(&o).0.unwrap();
    assert_relative_eq!(back.stroke, d.stroke, max_relative = REL_TOL_BOUNDARY);
}

#[test]
fn closed_forms_of_the_energy_balance_hold_for_sized_buffers() {
    // Linear spring with a drive: the forward closed form
    // x = (F_n + √(F_n² + k·m·v²))/k (from k·x²/2 = ½·m·v² + F_n·x, basic
    // mechanics) returns the sized stroke for the sized rate.
    let (m, v, fnet) = (100.0, 1.5, 500.0);
    let inp = input(
        m,
        v,
        fnet,
        SizingLimits {
            peak_force: Some(8000.0),
            ..Default::default()
        },
    );
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    let d = feasible(&o).0.unwrap();
    let BufferSetting::LinearSpring { rate: k } = d.setting else {
        panic!("{:?}", d.setting)
    };
    let x = (fnet + (fnet * fnet + k * m * v * v).sqrt()) / k;
    assert_relative_eq!(x, d.stroke, max_relative = REL_CLOSED);
    assert_relative_eq!(k * x, 8000.0, max_relative = REL_CLOSED);
    // Power law: a·s^(n+1)/(n+1) = ½·m·v² + F_n·s (issue 4's power-law
    // energy balance, with the drive's work added).
    let o = size_buffer(&inp, &BufferType::PowerLaw { exponent: 2.5 }).unwrap();
    let d = feasible(&o).0.unwrap();
    let BufferSetting::PowerLaw {
        coefficient: Some(a),
        exponent: n,
        ..
    } = d.setting
    else {
        panic!("{:?}", d.setting)
    };
    assert_relative_eq!(
        a * d.stroke.powf(n + 1.0) / (n + 1.0),
        0.5 * m * v * v + fnet * d.stroke,
        max_relative = REL_CLOSED
    );
    assert_relative_eq!(a * d.stroke.powf(n), 8000.0, max_relative = REL_CLOSED);
}

#[test]
fn t25_t26_constant_deceleration_strokes_of_crane_bumpers() {
    // 29 CFR 1910.179(e)(2)(i) (R): bridge bumpers stop the crane at an
    // average deceleration ≤ 3 ft/s² at 20 % of rated speed. T25 (arithmetic
    // D): rated 200 fpm → 40 fpm = 0.2032 m/s; constant-deceleration stroke
    // 0.889 in; energy at 40 % (80 fpm = 0.4064 m/s) for 20 t: 1 651.6 J.
    let bridge = input(
        20_000.0,
        40.0 * FT / 60.0,
        0.0,
        SizingLimits {
            mean_deceleration: Some(3.0 * FT),
            ..Default::default()
        },
    );
    let ideal = BufferType::ConstantForce { efficiency: 1.0 };
    let o = size_buffer(&bridge, &ideal).unwrap();
    let d = feasible(&o).0.unwrap();
    assert_relative_eq!(d.stroke / INCH, 0.889, max_relative = REL_PRINTED_4SF);
    assert_relative_eq!(d.mean_deceleration, 3.0 * FT, max_relative = REL_CLOSED);
    // A peak-deceleration limit of the same value gives the same stroke for
    // the ideal absorber (constant deceleration).
    let mut peak = bridge;
    peak.limits = SizingLimits {
        peak_deceleration: Some(3.0 * FT),
        ..Default::default()
    };
    let p = size_buffer(&peak, &ideal).unwrap();
    assert_relative_eq!(
        feasible(&p).0.unwrap().stroke,
        d.stroke,
        max_relative = REL_CLOSED
    );
    let mut cap = bridge;
    cap.impact_speed = 80.0 * FT / 60.0;
    let e = size_buffer(&cap, &ideal).unwrap();
    assert_relative_eq!(e.kinetic_energy, 1651.6, max_relative = REL_PRINTED_4SF);

    // 29 CFR 1910.179(e)(3)(i) (R): trolley bumpers ≤ 4.7 ft/s² at ⅓ of
    // rated speed. T26 (arithmetic D): 5 000 kg, rated 0.5 m/s → stroke
    // 9.70 mm, E = 69.44 J.
    let trolley = input(
        5000.0,
        0.5 / 3.0,
        0.0,
        SizingLimits {
            mean_deceleration: Some(4.7 * FT),
            ..Default::default()
        },
    );
    let o = size_buffer(&trolley, &ideal).unwrap();
    let d = feasible(&o).0.unwrap();
    assert_relative_eq!(d.stroke, 9.70e-3, max_relative = REL_PRINTED_4SF);
    assert_relative_eq!(o.kinetic_energy, 69.44, max_relative = REL_PRINTED_4SF);
}

// ---------------------------------------------------------------------------
// Infeasible cases are data.

#[test]
fn force_limit_at_or_below_the_floor_is_reported() {
    // A linear spring under a constant 500 N drive peaks at no less than
    // 2 × 500 N (suddenly applied load; basic mechanics); an ideal absorber
    // at no less than 500 N; one of efficiency 0.8 at 625 N.
    let inp = input(
        100.0,
        1.5,
        500.0,
        SizingLimits {
            peak_force: Some(900.0),
            ..Default::default()
        },
    );
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    let why = reasons(&o)[0].explain();
    assert!(crate::units::render(&why, crate::units::UnitSystem::Si)
        .contains("900 N is at or below 1000 N"));
    assert_eq!(
        reasons(&o),
        &[Infeasibility::BelowFloor {
            limit: LimitKind::PeakForce,
            limit_value: 900.0,
            floor: 1000.0
        }]
    );
    let o = size_buffer(&inp, &BufferType::ConstantForce { efficiency: 1.0 }).unwrap();
    let (req, _) = feasible(&o);
    assert!(req.unwrap().meets_all_limits());
    let o = size_buffer(&inp, &BufferType::ConstantForce { efficiency: 0.5 }).unwrap();
    assert!(
        matches!(reasons(&o)[0], Infeasibility::BelowFloor { floor, .. } if (floor - 1000.0).abs() <= 1000.0 * REL_CLOSED)
    );
    // Figures stay in place as missing, with the reason.
    let figs = o.figures();
    assert!(figs
        .iter()
        .all(|f| f.value.is_none() && !f.missing.is_empty()));
}

#[test]
fn stroke_too_short_for_the_force_limit_is_reported() {
    let inp = input(
        100.0,
        1.5,
        500.0,
        SizingLimits {
            peak_force: Some(2750.0),
            stroke: Some(0.04),
            ..Default::default()
        },
    );
    let o = size_buffer(&inp, &BufferType::ConstantForce { efficiency: 1.0 }).unwrap();
    match reasons(&o) {
        [Infeasibility::StrokeTooShort {
            available,
            required,
            governing,
        }] => {
            assert_eq!(*available, 0.04);
            assert_relative_eq!(*required, 0.05, max_relative = REL_CLOSED);
            assert_eq!(*governing, LimitKind::PeakForce);
        }
        other => panic!("{other:?}"),
    }
    assert!(reasons(&o)[0].explain().contains("available stroke"));
}

#[test]
fn both_designs_and_the_governing_limit() {
    // Force and deceleration limits with room to spare in the stroke: the
    // required design sits on the governing limit; the softer one uses the
    // whole stroke and has margin on every limit.
    let inp = input(
        40.0,
        1.2,
        150.0,
        SizingLimits {
            peak_force: Some(3000.0),
            peak_deceleration: Some(50.0),
            stroke: Some(0.08),
            ..Default::default()
        },
    );
    for b in [
        BufferType::LinearSpring,
        BufferType::PowerLaw { exponent: 2.0 },
        BufferType::ConstantForce { efficiency: 0.9 },
        BufferType::GasSpring {
            progression: 1.4,
            polytropic_index: 1.4,
        },
        // With a 150 N drive the damper must still slow the part to v_r:
        // c·v_r² > 150 N, so its entry force exceeds 150·(v/v_r)² = 600 N.
        BufferType::Orifice {
            residual_speed: 0.6,
        },
    ] {
        let o = size_buffer(&inp, &b).unwrap();
        let (req, avail) = feasible(&o);
        let (req, avail) = (req.unwrap(), avail.unwrap());
        assert!(req.meets_all_limits() && avail.meets_all_limits(), "{b:?}");
        assert!(req.stroke <= avail.stroke);
        assert!(avail.peak_force <= req.peak_force);
        let SizingResult::Feasible { governing, .. } = &o.result else {
            unreachable!()
        };
        // Deceleration governs: (F − F_n)/m = 50 needs F = 2150 N < 3000 N.
        assert_eq!(*governing, Some(LimitKind::PeakDeceleration), "{b:?}");
        let m = req
            .margins
            .iter()
            .find(|m| m.limit == LimitKind::PeakDeceleration)
            .unwrap();
        assert_relative_eq!(m.value, 50.0, max_relative = REL_TOL_BOUNDARY);
        assert!(!o.figures().is_empty());
    }
}

#[test]
fn orifice_damper_closed_forms_without_drive() {
    // m·v·dv/dx = −c·v²: v = v₀·e^(−c·x/m) (exact). A force limit sets
    // c = F/v₀²; the stroke to v_r is (m/c)·ln(v₀/v_r).
    let inp = input(
        20.0,
        2.0,
        0.0,
        SizingLimits {
            peak_force: Some(1600.0),
            ..Default::default()
        },
    );
    let o = size_buffer(
        &inp,
        &BufferType::Orifice {
            residual_speed: 0.2,
        },
    )
    .unwrap();
    let d = feasible(&o).0.unwrap();
    let c = 1600.0 / 4.0;
    assert_relative_eq!(
        d.stroke,
        20.0 / c * 10.0_f64.ln(),
        max_relative = REL_CLOSED
    );
    assert_relative_eq!(
        d.residual_energy,
        0.5 * 20.0 * 0.04,
        max_relative = REL_CLOSED
    );
    // Energy the damper absorbs: ½·m·v₀² − ½·m·v_r² = 40 − 0.4 J.
    assert_relative_eq!(d.energy_per_cycle, 39.6, max_relative = REL_CLOSED);
    // Mean deceleration without drive is c·v₀·v_r/m (from
    // t = (m/c)·(1/v_r − 1/v₀)); as a limit it gives c back.
    let mean = c * 2.0 * 0.2 / 20.0;
    assert_relative_eq!(d.mean_deceleration, mean, max_relative = REL_CLOSED);
    let inp2 = input(
        20.0,
        2.0,
        0.0,
        SizingLimits {
            mean_deceleration: Some(mean),
            ..Default::default()
        },
    );
    let o2 = size_buffer(
        &inp2,
        &BufferType::Orifice {
            residual_speed: 0.2,
        },
    )
    .unwrap();
    assert_relative_eq!(
        feasible(&o2).0.unwrap().stroke,
        d.stroke,
        max_relative = REL_TOL_BOUNDARY
    );
    // With a stroke limit the coefficient is solved back from the stroke.
    let inp3 = input(
        20.0,
        2.0,
        0.0,
        SizingLimits {
            stroke: Some(d.stroke),
            ..Default::default()
        },
    );
    let o3 = size_buffer(
        &inp3,
        &BufferType::Orifice {
            residual_speed: 0.2,
        },
    )
    .unwrap();
    match feasible(&o3).1.unwrap().setting {
        BufferSetting::Orifice { coefficient, .. } => {
            assert_relative_eq!(coefficient, c, max_relative = REL_TOL_BOUNDARY)
        }
        other => panic!("{other:?}"),
    }
}

#[test]
fn rotating_part_uses_i_over_r_squared() {
    // Effective mass at radius r: I/r² (kinetic energy ½·I·ω² = ½·(I/r²)·v²).
    let mut inp = input(
        1.0,
        2.0,
        0.0,
        SizingLimits {
            peak_force: Some(500.0),
            ..Default::default()
        },
    );
    inp.moving = MovingBody::Rotating {
        inertia: 0.6,
        radius: 0.6,
    };
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    assert_relative_eq!(o.part_mass, 0.6 / 0.36, max_relative = REL_EXACT);
}

#[test]
fn resisting_force_and_unaided_stop() {
    // Going up an incline into the buffer: gravity resists. With a stroke
    // longer than the unaided stopping distance E_k/|F_n|, no buffer is
    // needed and the outcome says so.
    let mut inp = input(
        10.0,
        1.0,
        0.0,
        SizingLimits {
            stroke: Some(0.2),
            ..Default::default()
        },
    );
    inp.gravity_force = -50.0; // stops unaided over 5 J / 50 N = 0.1 m
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    match &o.result {
        SizingResult::Feasible {
            required: None,
            using_available_stroke: None,
            stops_unaided_within: Some(s),
            ..
        } => assert_relative_eq!(*s, 0.1, max_relative = REL_EXACT),
        other => panic!("{other:?}"),
    }
    assert!(o.figures().iter().all(|f| f.value.is_none()));
    // A peak-deceleration limit below the unaided 5 m/s² cannot be met.
    inp.limits = SizingLimits {
        peak_deceleration: Some(4.0),
        ..Default::default()
    };
    let o = size_buffer(&inp, &BufferType::LinearSpring).unwrap();
    assert!(
        matches!(reasons(&o)[0], Infeasibility::BelowFloor { floor, .. } if (floor - 5.0).abs() <= 5.0 * REL_CLOSED)
    );
}

#[test]
fn invalid_inputs_name_their_field() {
    let inp = input(10.0, 1.0, 0.0, SizingLimits::default());
    assert_eq!(
        size_buffer(&inp, &BufferType::LinearSpring)
            .unwrap_err()
            .field,
        "limits"
    );
    let mut inp = input(
        10.0,
        1.0,
        0.0,
        SizingLimits {
            stroke: Some(0.1),
            ..Default::default()
        },
    );
    let e = size_buffer(
        &inp,
        &BufferType::Orifice {
            residual_speed: 1.0,
        },
    )
    .unwrap_err();
    assert_eq!(e.field, "buffer.residual_speed");
    let e = size_buffers(
        &inp,
        &[
            BufferType::LinearSpring,
            BufferType::PowerLaw { exponent: 0.0 },
        ],
    )
    .unwrap_err();
    assert_eq!(e.field, "buffers.1.exponent");
    inp.limits.peak_force = Some(-1.0);
    assert_eq!(
        size_buffer(&inp, &BufferType::LinearSpring)
            .unwrap_err()
            .field,
        "limits.peak_force"
    );
    inp.limits.peak_force = None;
    inp.moving = MovingBody::Rotating {
        inertia: 1.0,
        radius: 0.0,
    };
    assert_eq!(
        size_buffer(&inp, &BufferType::LinearSpring)
            .unwrap_err()
            .field,
        "moving.radius"
    );
}

// ---------------------------------------------------------------------------
// Independent forward check: integrate m·dv/dt = F_n − F_buffer(x, v) from
// contact with a fixed-step classical Runge–Kutta (RK4) written here, using
// only the sized setting (rate, coefficient, force level), and compare.

struct Forward {
    stroke: f64,
    peak_force: f64,
    peak_deceleration: f64,
    stop_time: f64,
}

fn buffer_force(setting: &BufferSetting, stroke_for_gas: f64, x: f64, v: f64) -> f64 {
    match *setting {
        BufferSetting::LinearSpring { rate } => rate * x,
        BufferSetting::PowerLaw {
            coefficient,
            exponent,
            ..
        } => coefficient.unwrap() * x.max(0.0).powf(exponent),
        BufferSetting::ConstantForce { mean_force, .. } => mean_force,
        BufferSetting::Orifice { coefficient, .. } => coefficient * v * v.abs(),
        BufferSetting::GasSpring {
            force_at_contact,
            progression,
            polytropic_index,
        } => {
            // Polytropic: F = F₁·(V₀/V)^κ with V falling linearly and
            // (V₀/V_end)^κ = p over the stroke used.
            let ratio_end = progression.powf(1.0 / polytropic_index);
            let vol = 1.0 - (1.0 - 1.0 / ratio_end) * x / stroke_for_gas;
            force_at_contact * vol.powf(-polytropic_index)
        }
    }
}

fn forward(inp: &SizingInput, d: &SizedBuffer) -> Option<Forward> {
    let m = inp.moving.effective_mass().unwrap();
    let fnet = inp.drive_force + inp.gravity_force - inp.friction_force;
    let target = d.residual_speed;
    let dt = d.stop_time / FORWARD_STEPS as f64;
    let acc = |x: f64, v: f64| (fnet - buffer_force(&d.setting, d.stroke, x, v)) / m;
    let (mut t, mut x, mut v) = (0.0, 0.0, inp.impact_speed);
    let mut peak_force: f64 = buffer_force(&d.setting, d.stroke, 0.0, v);
    for _ in 0..(4 * FORWARD_STEPS) {
        let (k1x, k1v) = (v, acc(x, v));
        let (k2x, k2v) = (
            v + 0.5 * dt * k1v,
            acc(x + 0.5 * dt * k1x, v + 0.5 * dt * k1v),
        );
        let (k3x, k3v) = (
            v + 0.5 * dt * k2v,
            acc(x + 0.5 * dt * k2x, v + 0.5 * dt * k2v),
        );
        let (k4x, k4v) = (v + dt * k3v, acc(x + dt * k3x, v + dt * k3v));
        let xn = x + dt / 6.0 * (k1x + 2.0 * k2x + 2.0 * k3x + k4x);
        let vn = v + dt / 6.0 * (k1v + 2.0 * k2v + 2.0 * k3v + k4v);
        if vn <= target {
            // Crossing located by linear interpolation of v within the step.
            let f = (v - target) / (v - vn);
            let xs = x + f * (xn - x);
            let ts = t + f * dt;
            peak_force = peak_force.max(buffer_force(&d.setting, d.stroke, xs, target));
            return Some(Forward {
                stroke: xs,
                peak_force,
                peak_deceleration: (peak_force - fnet) / m,
                stop_time: ts,
            });
        }
        t += dt;
        x = xn;
        v = vn;
        peak_force = peak_force.max(buffer_force(&d.setting, d.stroke, x, v));
    }
    None
}

/// Checks a design against the independent integration and its limits.
fn check_forward(inp: &SizingInput, d: &SizedBuffer) -> Result<(), String> {
    match d.setting {
        BufferSetting::ConstantForce { efficiency, .. } if efficiency < 1.0 => {
            return Ok(()); // the force profile of a real absorber is not modelled
        }
        BufferSetting::Orifice {
            residual_speed,
            terminal_speed: Some(vt),
            ..
        } if residual_speed - vt < ILL_CONDITIONED * residual_speed => {
            // The drive balances the damper within a hair of v_r: the
            // crossing of v_r is asymptotic and no fixed-step integration
            // locates it; the design carries a sensitivity note instead.
            return Ok(());
        }
        _ => {}
    }
    let Some(f) = forward(inp, d) else {
        return Err(format!(
            "the forward integration did not stop the part: {d:?}"
        ));
    };
    let rel = |a: f64, b: f64| (a - b).abs() / b.abs().max(f64::MIN_POSITIVE);
    let tol = match d.setting {
        BufferSetting::PowerLaw { exponent, .. } if exponent < 1.0 => REL_FORWARD_ROUGH,
        _ => REL_FORWARD,
    };
    for (name, got, want) in [
        ("stroke", f.stroke, d.stroke),
        ("peak force", f.peak_force, d.peak_force),
        ("stop time", f.stop_time, d.stop_time),
    ] {
        if rel(got, want) > tol {
            return Err(format!("{name}: forward {got} vs sized {want}"));
        }
    }
    let l = inp.limits;
    let within = |val: f64, lim: Option<f64>| lim.is_none_or(|l| val <= l * (1.0 + tol));
    let mean = (inp.impact_speed - d.residual_speed) / f.stop_time;
    if !(within(f.peak_force, l.peak_force)
        && within(f.peak_deceleration, l.peak_deceleration)
        && within(mean, l.mean_deceleration)
        && within(f.stroke, l.stroke))
    {
        return Err(format!(
            "forward values exceed a limit: F {} a {} mean {} s {} vs {l:?}",
            f.peak_force, f.peak_deceleration, mean, f.stroke
        ));
    }
    Ok(())
}

fn all_types() -> Vec<BufferType> {
    vec![
        BufferType::LinearSpring,
        BufferType::PowerLaw { exponent: 1.0 },
        BufferType::PowerLaw { exponent: 2.5 },
        BufferType::PowerLaw { exponent: 0.7 },
        BufferType::ConstantForce { efficiency: 1.0 },
        BufferType::GasSpring {
            progression: 1.3,
            polytropic_index: 1.4,
        },
        BufferType::GasSpring {
            progression: 2.0,
            polytropic_index: 1.0,
        },
        // Residual speed high enough that the damper can beat a drive of
        // up to 450 N within the force limit (floor F_n·(v/v_r)² = 3 528 N).
        BufferType::Orifice {
            residual_speed: 0.5,
        },
    ]
}

#[test]
fn sized_buffers_stop_the_part_as_predicted() {
    for (drive, gravity, friction) in [(0.0, 0.0, 0.0), (400.0, 100.0, 50.0), (0.0, -80.0, 20.0)] {
        let mut inp = input(
            60.0,
            1.4,
            drive,
            SizingLimits {
                peak_force: Some(6000.0),
                peak_deceleration: Some(70.0),
                mean_deceleration: Some(30.0),
                stroke: Some(0.2),
            },
        );
        inp.gravity_force = gravity;
        inp.friction_force = friction;
        for b in all_types() {
            let o = size_buffer(&inp, &b).unwrap();
            let (req, avail) = feasible(&o);
            for d in [req, avail].into_iter().flatten() {
                assert!(d.meets_all_limits(), "{b:?}: {:?}", d.margins);
                if let Err(e) = check_forward(&inp, d) {
                    panic!("{b:?} F_n = {}: {e}", o.propelling_force);
                }
            }
        }
    }
}

// ---------------------------------------------------------------------------
// Properties.

fn arb_type() -> impl Strategy<Value = BufferType> {
    prop_oneof![
        Just(BufferType::LinearSpring),
        (0.2f64..6.0).prop_map(|n| BufferType::PowerLaw { exponent: n }),
        (0.3f64..=1.0).prop_map(|e| BufferType::ConstantForce { efficiency: e }),
        (0.01f64..0.5).prop_map(|f| BufferType::Orifice { residual_speed: f }),
        (1.0f64..4.0, 1.0f64..1.67).prop_map(|(p, k)| BufferType::GasSpring {
            progression: p,
            polytropic_index: k
        }),
    ]
}

prop_compose! {
    /// A duty and some limits; the orifice's residual speed is a fraction of
    /// the impact speed (see `with_speed_fraction`).
    fn arb_case()(
        m in 0.1f64..5000.0,
        v in 0.05f64..5.0,
        drive in 0.0f64..2000.0,
        gravity in -500.0f64..500.0,
        friction in 0.0f64..200.0,
        cycles in 0.0f64..3600.0,
        f_max in prop::option::of(10.0f64..1e6),
        a_max in prop::option::of(1.0f64..2000.0),
        a_mean in prop::option::of(0.5f64..1000.0),
        stroke in prop::option::of(1e-3f64..2.0),
    ) -> SizingInput {
        let mut inp = input(m, v, drive, SizingLimits {
            peak_force: f_max,
            peak_deceleration: a_max,
            mean_deceleration: a_mean,
            stroke,
        });
        inp.gravity_force = gravity;
        inp.friction_force = friction;
        inp.cycles_per_hour = cycles;
        if f_max.is_none() && a_max.is_none() && a_mean.is_none() && stroke.is_none() {
            inp.limits.stroke = Some(0.1);
        }
        inp
    }
}

/// The orifice's residual speed as a fraction of the impact speed, so that
/// it is always below it.
fn with_speed_fraction(b: BufferType, v: f64) -> BufferType {
    match b {
        BufferType::Orifice { residual_speed } => BufferType::Orifice {
            residual_speed: residual_speed * v,
        },
        other => other,
    }
}

fn all_finite(d: &SizedBuffer) -> bool {
    [
        d.stroke,
        d.peak_force,
        d.peak_deceleration,
        d.mean_deceleration,
        d.stop_time,
        d.energy_per_cycle,
        d.effective_mass,
        d.energy_per_hour,
        d.heat_load,
        d.residual_energy,
    ]
    .iter()
    .all(|x| x.is_finite())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// No panic and no NaN for finite inputs; every design meets every limit;
    /// an infeasible case comes back as data with at least one reason.
    #[test]
    fn sized_buffers_meet_their_limits(inp in arb_case(), b in arb_type()) {
        let b = with_speed_fraction(b, inp.impact_speed);
        let o = size_buffer(&inp, &b).unwrap();
        match &o.result {
            SizingResult::Feasible { required, using_available_stroke, .. } => {
                for d in [required, using_available_stroke].into_iter().flatten() {
                    prop_assert!(all_finite(d), "{d:?}");
                    prop_assert!(d.meets_all_limits(), "{:?}", d.margins);
                    prop_assert!(d.stroke > 0.0 && d.peak_force > 0.0);
                }
            }
            SizingResult::Infeasible { reasons } => prop_assert!(!reasons.is_empty()),
        }
        for f in o.figures() {
            prop_assert!(f.value.is_none_or(f64::is_finite));
        }
    }

    /// Required stroke does not fall when the speed grows.
    #[test]
    fn required_stroke_is_monotone_in_speed(inp in arb_case(), b in arb_type(), grow in 1.0f64..2.0) {
        let b = with_speed_fraction(b, inp.impact_speed);
        let mut big = inp;
        big.impact_speed *= grow;
        if let (Some(a), Some(z)) = (required_stroke(&inp, &b), required_stroke(&big, &b)) {
            prop_assert!(z >= a * (1.0 - REL_TOL_BOUNDARY), "{a} → {z}");
        }
    }

    /// Required stroke does not fall when the mass grows, where that holds
    /// physically: with no net force along the motion (deceleration limits
    /// then give a stroke independent of the mass), or when a force limit
    /// alone sets the stroke. With a net force and a deceleration limit the
    /// stroke can fall as the mass grows, because that force's share of the
    /// deceleration, F_n/m, shrinks (see
    /// `deceleration_governed_stroke_falls_with_mass_under_drive`).
    #[test]
    fn required_stroke_is_monotone_in_mass(
        mut inp in arb_case(), b in arb_type(), grow in 1.0f64..2.0, force_only in any::<bool>(),
    ) {
        let b = with_speed_fraction(b, inp.impact_speed);
        if force_only {
            inp.limits.peak_deceleration = None;
            inp.limits.mean_deceleration = None;
            inp.limits.peak_force.get_or_insert(1e4);
        } else {
            inp.drive_force = 0.0;
            inp.gravity_force = 0.0;
            inp.friction_force = 0.0;
        }
        let mut big = inp;
        if let MovingBody::Translating { mass } = inp.moving {
            big.moving = MovingBody::Translating { mass: mass * grow };
        }
        if let (Some(a), Some(z)) = (required_stroke(&inp, &b), required_stroke(&big, &b)) {
            prop_assert!(z >= a * (1.0 - REL_TOL_BOUNDARY), "{a} → {z}");
        }
    }
}

fn required_stroke(i: &SizingInput, b: &BufferType) -> Option<f64> {
    match size_buffer(i, b).unwrap().result {
        SizingResult::Feasible {
            required: Some(d), ..
        } => Some(d.stroke),
        _ => None,
    }
}

#[test]
fn deceleration_governed_stroke_falls_with_mass_under_drive() {
    // Linear spring, peak-deceleration limit a, propelling force F_n:
    // a·m = √(F_n² + k·m·v²) and k·s²/2 = ½·m·v² + F_n·s give
    // s = m·v²/(m·a − F_n): it falls towards v²/a as m grows, because the
    // drive's share F_n/m of the deceleration shrinks (derived, basic
    // mechanics). Not a defect: the property above excludes this case.
    let s = |m: f64| {
        let inp = input(
            m,
            1.0,
            100.0,
            SizingLimits {
                peak_deceleration: Some(20.0),
                ..Default::default()
            },
        );
        required_stroke(&inp, &BufferType::LinearSpring).unwrap()
    };
    assert_relative_eq!(s(10.0), 10.0 / (200.0 - 100.0), max_relative = REL_CLOSED);
    assert_relative_eq!(s(40.0), 40.0 / (800.0 - 100.0), max_relative = REL_CLOSED);
    assert!(s(40.0) < s(10.0));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]

    /// Sized designs, fed to the independent forward integration, stop the
    /// part over the predicted stroke and time and within every limit.
    #[test]
    fn sized_buffers_round_trip_through_a_forward_integration(inp in arb_case(), b in arb_type()) {
        let b = with_speed_fraction(b, inp.impact_speed);
        let o = size_buffer(&inp, &b).unwrap();
        if let SizingResult::Feasible { required, using_available_stroke, .. } = &o.result {
            for d in [required, using_available_stroke].into_iter().flatten() {
                let r = check_forward(&inp, d);
                prop_assert!(r.is_ok(), "{b:?} F_n = {}: {:?}", o.propelling_force, r);
            }
        }
    }
}

/// Found by the property tests in `tests/properties.rs`: an impact speed of
/// 2.2e-308 m/s underflowed the kinetic energy to 0 and the mean
/// deceleration came out 0/0 = NaN; a stroke of 1e-300 m gave a design
/// with NaN in it. The energy must be positive, and a design whose numbers
/// are not finite is reported as not solved.
#[test]
fn extreme_speeds_and_strokes_give_no_nan() {
    let stroke_only = SizingLimits {
        stroke: Some(1.0),
        ..SizingLimits::default()
    };
    let e = size_buffer(
        &input(1.0, 2.2e-308, 1.0, stroke_only),
        &BufferType::LinearSpring,
    )
    .unwrap_err();
    assert_eq!(e.field, "impact_speed", "{e}");
    let tiny = SizingLimits {
        stroke: Some(1e-300),
        ..SizingLimits::default()
    };
    let o = size_buffer(&input(1.0, 1.0, 1.0, tiny), &BufferType::LinearSpring).unwrap();
    if let SizingResult::Feasible {
        using_available_stroke: Some(d),
        ..
    } = &o.result
    {
        assert!(d.is_finite(), "{d:?}");
    }
}
