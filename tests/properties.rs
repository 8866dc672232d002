//! Property tests across the models and the scenario layer (proptest):
//! non-finite or absurd inputs (NaN, ±∞, 1e300, negative masses, zero
//! rates, deflection past the solid length, stroke 0, zero travel, huge
//! counts...) give typed errors naming the field, never a panic and never
//! a NaN.
//!
//! - Scenario level: any numeric input of any seed scenario set to a
//!   hostile text (`NaN`, `1e300 kg`, `-0 mm`, `inf`...) or a random number
//!   with a random unit: the report has no non-finite number, and a text
//!   that is not finite, or absurd in size, is an input error naming that
//!   input's path.
//! - Model level: each model's constructor with one field made non-finite
//!   is refused naming that field; with any mix of hostile values it never
//!   panics, and a model it accepts gives no NaN anywhere in its outputs
//!   (and only finite outputs when every input lies in the magnitudes the
//!   scenario layer accepts, 1e-12 to 1e12 SI units).
#![forbid(unsafe_code)]

use joulewise_core::assess::assess;
use joulewise_core::contact::body::{
    clamping, transient_contact, BodyRegion, Clamping, ContactArea, Padding, TransientContact,
};
use joulewise_core::contact::buffer::{
    impact, Buffer, BufferConfig, BufferLaw, ImpactConfig, ImpactInput, Rebound,
};
use joulewise_core::contact::gap::{closing_gap, ClosingGeometry, EdgeGapMeasure};
use joulewise_core::identify::{
    dynamic_rate, static_rate, two_point, DynamicInput, GaugedSpring, StaticInput, TwoPointInput,
};
use joulewise_core::mechanism::{
    DirectSpring, Friction, InertiaSpec, Mechanism, RotatingConfig, RotatingPart, Sense,
    SpringMount, TranslatingConfig, TranslatingPart,
};
use joulewise_core::ode::SolverConfig;
use joulewise_core::release::{release, ReleaseConfig, ReleaseOutcome};
use joulewise_core::scenario::resolve::visit_values;
use joulewise_core::scenario::Scenario;
use joulewise_core::sizing::{size_buffer, BufferType, MovingBody, SizingInput, SizingLimits};
use joulewise_core::spring::disc::DiscConstant;
use joulewise_core::spring::extension::ExtensionRate;
use joulewise_core::spring::gas::ForceReference;
use joulewise_core::spring::helical::{CoilDiameter, EndType, Seating};
use joulewise_core::spring::table::TablePoint;
use joulewise_core::spring::torsion::TorsionRate;
use joulewise_core::spring::{
    Axis, DiscSpec, ExtensionSpec, GasSpec, Grade, HelicalSpec, LinearSpec, Material, Spring,
    SpringModel, SpringSpec, TableSpec, TorsionSpec, Travel,
};
use joulewise_core::InputError;
use joulewise_tests::robust::{check_report, mutate::HOSTILE_TEXTS, scan, seeds::seeds};
use proptest::prelude::*;
use proptest::test_runner::TestCaseError;

/// The magnitudes the scenario layer accepts (SI units).
const PLAUSIBLE: (f64, f64) = (1e-12, 1e12);

/// Cases per property: each runs one model evaluation (a release or an
/// impact is an ODE solve); 128 keeps the file under a minute in a debug
/// build while every hostile value is drawn many times.
const CASES: u32 = 128;

fn config() -> ProptestConfig {
    ProptestConfig {
        cases: CASES,
        // Failures are written as regressions in tests/fuzz-corpus by hand
        // (with the bug's fix); no proptest-regressions files.
        failure_persistence: None,
        ..ProptestConfig::default()
    }
}

/// Values no model should accept or mis-handle.
fn hostile() -> impl Strategy<Value = f64> {
    prop_oneof![
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(0.0),
        Just(-0.0),
        Just(-1.0),
        Just(1e300),
        Just(-1e300),
        Just(1e-300),
        Just(f64::MAX),
        Just(f64::MIN_POSITIVE),
        Just(5e-324),
        any::<f64>(),
    ]
}

fn non_finite() -> impl Strategy<Value = f64> {
    prop_oneof![Just(f64::NAN), Just(f64::INFINITY), Just(f64::NEG_INFINITY)]
}

/// Log-uniform between `lo` and `hi` (both > 0).
fn between(lo: f64, hi: f64) -> impl Strategy<Value = f64> {
    (lo.ln()..hi.ln()).prop_map(f64::exp)
}

/// Mostly a sensible value, sometimes a hostile one.
fn value(lo: f64, hi: f64) -> impl Strategy<Value = f64> {
    prop_oneof![3 => between(lo, hi), 1 => hostile()]
}

fn is_plausible(xs: &[f64]) -> bool {
    xs.iter()
        .all(|x| *x == 0.0 || (PLAUSIBLE.0..=PLAUSIBLE.1).contains(&x.abs()))
}

/// An error must name a field and say what is acceptable.
fn named(e: &InputError) -> Result<(), TestCaseError> {
    prop_assert!(!e.field.is_empty(), "error without a field: {e:?}");
    prop_assert!(!e.message().trim().is_empty(), "error without words: {e:?}");
    Ok(())
}

/// No NaN; no infinity either when `finite` is asked for.
fn sound(what: &str, x: f64, finite: bool) -> Result<(), TestCaseError> {
    prop_assert!(!x.is_nan(), "{what} is NaN");
    if finite {
        prop_assert!(x.is_finite(), "{what} = {x}");
    }
    Ok(())
}

/// Every number in an outcome: no NaN; no infinity either when `finite`.
fn outcome<T: serde::Serialize>(what: &str, v: &T, finite: bool) -> Result<(), TestCaseError> {
    let bad: Vec<String> = scan::non_finite_paths(v)
        .into_iter()
        .filter(|p| finite || p.ends_with("NaN"))
        .collect();
    prop_assert!(bad.is_empty(), "{what}: {bad:?}");
    Ok(())
}

// ── Springs ──────────────────────────────────────────────────────────────

/// Evaluate a spring across and just beyond its range on both branches.
fn check_spring(s: &SpringModel, finite: bool) -> Result<(), TestCaseError> {
    let (lo, hi) = s.deflection_range();
    prop_assert!(!lo.is_nan() && !hi.is_nan() && lo <= hi, "range {lo}..{hi}");
    sound("effective mass", s.effective_mass(), finite)?;
    prop_assert!(s.effective_mass() >= 0.0);
    let span = hi - lo;
    let mut qs = vec![lo, hi, lo + 0.5 * span, lo + 0.25 * span];
    if span.is_finite() {
        qs.push(lo - 0.1 * span);
        qs.push(hi + 0.1 * span);
    }
    for q in qs.into_iter().filter(|q| q.is_finite()) {
        for travel in [Travel::Loading, Travel::Unloading] {
            sound(&format!("force({q})"), s.force(q, travel), finite)?;
            sound(&format!("work({lo}, {q})"), s.work(lo, q, travel), finite)?;
        }
        sound(&format!("rate({q})"), s.rate(q), finite)?;
        if let Some(st) = s.stress(q) {
            sound("stress", st.stress, finite)?;
        }
    }
    Ok(())
}

/// Build a spec: an error names a field; a model gives no NaN (nor
/// infinity when `finite`).
fn build_and_check(spec: &SpringSpec, finite: bool) -> Result<(), TestCaseError> {
    match spec.build() {
        Err(e) => named(&e),
        Ok(s) => check_spring(&s, finite),
    }
}

fn linear(v: [f64; 4]) -> SpringSpec {
    SpringSpec::Linear(LinearSpec {
        rate: v[0],
        free_length: Some(v[1]),
        max_deflection: Some(v[2]),
        solid_length: Some(v[3]),
    })
}
const LINEAR_OK: [f64; 4] = [8000.0, 0.08, 0.045, 0.02];
const LINEAR_FIELDS: [&str; 4] = ["rate", "free_length", "max_deflection", "solid_length"];

fn helical(v: [f64; 6]) -> SpringSpec {
    SpringSpec::Helical(HelicalSpec {
        wire_diameter: v[0],
        coil_diameter: CoilDiameter::Mean(v[1]),
        active_coils: v[2],
        total_coils: Some(v[3]),
        ends: EndType::ClosedGround,
        free_length: v[4],
        material: Material::Grade {
            grade: Grade::En10270_1Dh,
        },
        solid_length: None,
        tensile_strength: None,
        permissible_stress_fraction: Some(v[5]),
        seating: Seating::BothFixed,
    })
}
const HELICAL_OK: [f64; 6] = [2.5e-3, 16e-3, 6.0, 8.0, 38e-3, 0.5];
const HELICAL_FIELDS: [&str; 6] = [
    "wire_diameter",
    "coil_diameter",
    "active_coils",
    "total_coils",
    "free_length",
    "permissible_stress_fraction",
];

fn extension(v: [f64; 4]) -> SpringSpec {
    SpringSpec::Extension(ExtensionSpec {
        initial_tension: v[0],
        rate: ExtensionRate::Given { rate: v[1] },
        max_deflection: v[2],
        free_length: Some(v[3]),
    })
}
const EXTENSION_OK: [f64; 4] = [5.0, 2000.0, 0.04, 0.1];
const EXTENSION_FIELDS: [&str; 4] = ["initial_tension", "rate", "max_deflection", "free_length"];

fn torsion(v: [f64; 2]) -> SpringSpec {
    SpringSpec::Torsion(TorsionSpec {
        rate: TorsionRate::Given { rate: v[0] },
        max_angle: v[1],
    })
}
const TORSION_OK: [f64; 2] = [1.8, 2.6];
const TORSION_FIELDS: [&str; 2] = ["rate", "max_angle"];

fn gas(v: [f64; 6]) -> SpringSpec {
    SpringSpec::Gas(GasSpec {
        nominal_force: v[0],
        progression: v[1],
        stroke: v[2],
        friction_band: v[3],
        force_reference: ForceReference::Mean,
        polytropic_index: Some(v[4]),
        moving_mass: Some(v[5]),
    })
}
const GAS_OK: [f64; 6] = [150.0, 1.4, 0.025, 30.0, 1.2, 0.1];
const GAS_FIELDS: [&str; 6] = [
    "nominal_force",
    "progression",
    "stroke",
    "friction_band",
    "polytropic_index",
    "moving_mass",
];

fn disc(v: [f64; 6], series: u32, parallel: u32) -> SpringSpec {
    SpringSpec::Disc(DiscSpec {
        outer_diameter: v[0],
        inner_diameter: v[1],
        thickness: v[2],
        cone_height: v[3],
        youngs_modulus: v[4],
        poisson_ratio: v[5],
        in_series: series,
        in_parallel: parallel,
        constant: DiscConstant::En16984K1,
        friction: None,
        density: None,
    })
}
const DISC_OK: [f64; 6] = [40e-3, 20.4e-3, 2e-3, 0.9e-3, 206e9, 0.3];
const DISC_FIELDS: [&str; 6] = [
    "outer_diameter",
    "inner_diameter",
    "thickness",
    "cone_height",
    "youngs_modulus",
    "poisson_ratio",
];

fn table(points: &[(f64, f64)], unloading: bool) -> SpringSpec {
    let pts: Vec<TablePoint> = points
        .iter()
        .map(|&(q, f)| TablePoint {
            deflection: q,
            force: f,
        })
        .collect();
    let unload = unloading.then(|| {
        pts.iter()
            .map(|p| TablePoint {
                deflection: p.deflection,
                force: 0.8 * p.force,
            })
            .collect()
    });
    SpringSpec::Table(TableSpec {
        axis: Axis::Linear,
        loading: pts,
        unloading: unload,
        effective_mass: None,
    })
}

/// Set one field to `bad` and check the refusal names it.
fn one_bad<const N: usize>(
    ok: [f64; N],
    fields: [&str; N],
    i: usize,
    bad: f64,
    build: impl Fn([f64; N]) -> Result<(), InputError>,
) -> Result<(), TestCaseError> {
    let i = i % N;
    let mut v = ok;
    v[i] = bad;
    match build(v) {
        Ok(()) => prop_assert!(false, "{} = {bad} accepted", fields[i]),
        Err(e) => {
            named(&e)?;
            prop_assert!(
                e.field.contains(fields[i]),
                "{} = {bad}: error names {:?}",
                fields[i],
                e.field
            );
        }
    }
    Ok(())
}

fn built(spec: SpringSpec) -> Result<(), InputError> {
    spec.build().map(|_| ())
}

proptest! {
    #![proptest_config(config())]

    #[test]
    fn a_non_finite_spring_input_is_refused_naming_it(i in 0usize..6, bad in non_finite()) {
        one_bad(LINEAR_OK, LINEAR_FIELDS, i, bad, |v| built(linear(v)))?;
        one_bad(HELICAL_OK, HELICAL_FIELDS, i, bad, |v| built(helical(v)))?;
        one_bad(EXTENSION_OK, EXTENSION_FIELDS, i, bad, |v| built(extension(v)))?;
        one_bad(TORSION_OK, TORSION_FIELDS, i, bad, |v| built(torsion(v)))?;
        one_bad(GAS_OK, GAS_FIELDS, i, bad, |v| built(gas(v)))?;
        one_bad(DISC_OK, DISC_FIELDS, i, bad, |v| built(disc(v, 2, 1)))?;
    }

    #[test]
    fn springs_with_hostile_inputs_give_errors_or_no_nan(
        a in value(1e-4, 1e6), b in value(1e-4, 1.0), c in value(1e-4, 1.0),
        d in value(1e-4, 1.0), e in value(0.1, 2.0), f in value(1e-3, 1e3),
        n_series in prop_oneof![Just(0u32), Just(1), 1u32..64, Just(u32::MAX)],
        n_parallel in prop_oneof![Just(0u32), Just(1), 1u32..8, Just(u32::MAX)],
    ) {
        let p = is_plausible(&[a, b, c, d, e, f]);
        build_and_check(&linear([a, b, c, d]), p)?;
        build_and_check(&helical([c * 1e-2, b * 0.2, f, f + e, b, e * 0.4]), p)?;
        build_and_check(&extension([f, a, c, b]), p)?;
        build_and_check(&torsion([a, e]), p)?;
        build_and_check(&gas([a, e, c, f, e, d]), p)?;
        build_and_check(&disc([b * 0.1, c * 0.05, d * 0.01, c * 0.01, a * 1e5, e * 0.2], n_series, n_parallel), p)?;
        build_and_check(&SpringSpec::Series { members: vec![linear([a, 1.0, c, 0.5]), linear([f, 1.0, d, 0.5])] }, p)?;
        build_and_check(&SpringSpec::Parallel { members: vec![linear([a, 1.0, c, 0.5]), extension([f, a, c, b])] }, p)?;
    }

    #[test]
    fn tables_with_hostile_points_give_errors_or_no_nan(
        pts in prop::collection::vec((value(1e-4, 1.0), value(1e-3, 1e4)), 0..12),
        sorted in any::<bool>(), unloading in any::<bool>(),
    ) {
        let mut pts = pts;
        if sorted {
            pts.sort_by(|x, y| x.0.total_cmp(&y.0).then(x.1.total_cmp(&y.1)));
        }
        let flat: Vec<f64> = pts.iter().flat_map(|p| [p.0, p.1]).collect();
        build_and_check(&table(&pts, unloading), is_plausible(&flat))?;
    }
}

#[test]
fn absurd_spring_geometry_is_refused() {
    // Deflection past the solid length: a solid length longer than free.
    let e = linear([8000.0, 0.02, 0.045, 0.03]).build().unwrap_err();
    assert_eq!(e.field, "solid_length");
    // A zero rate, a zero stroke, a gas spring without travel.
    assert_eq!(
        linear([0.0, 0.08, 0.045, 0.02]).build().unwrap_err().field,
        "rate"
    );
    assert_eq!(
        gas([150.0, 1.4, 0.0, 30.0, 1.2, 0.1])
            .build()
            .unwrap_err()
            .field,
        "stroke"
    );
    // A table of one point, and of falling deflections.
    assert!(table(&[(0.0, 0.0)], false).build().is_err());
    assert!(table(&[(0.02, 10.0), (0.01, 20.0)], false).build().is_err());
    // Huge counts in a disc stack.
    let e = disc(DISC_OK, 0, 1).build().unwrap_err();
    assert!(e.field.contains("in_series"), "{e}");
}

// ── Field identification ─────────────────────────────────────────────────

proptest! {
    #![proptest_config(config())]

    #[test]
    fn identification_with_hostile_readings_gives_errors_or_no_nan(
        m in value(0.01, 100.0), um in value(1e-4, 1.0), sag in value(1e-4, 0.1),
        a in value(1e-5, 1e-3), n in prop_oneof![Just(0u32), 1u32..1000, Just(u32::MAX)],
        t in value(0.1, 100.0), ut in value(1e-3, 1.0), ms in value(1e-3, 10.0),
        l1 in value(0.01, 0.2), l2 in value(0.01, 0.2), f1 in value(1.0, 1e3), f2 in value(1.0, 1e3),
    ) {
        let p = is_plausible(&[m, um, sag, a, t, ut, ms, l1, l2, f1, f2]);
        let s = static_rate(&StaticInput {
            mass: m, mass_uncertainty: um, sag, sag_tolerance: a,
            gravity: None, gravity_uncertainty: None,
        });
        match s { Ok(r) => outcome("static", &r, p)?, Err(e) => named(&e)? }
        let d = dynamic_rate(&DynamicInput {
            mass: m, mass_uncertainty: um, oscillations: n, time: t,
            timing_uncertainty: Some(ut), spring_mass: Some(ms), spring_mass_uncertainty: um,
        });
        match d { Ok(r) => outcome("dynamic", &r, p)?, Err(e) => named(&e)? }
        for kind in [GaugedSpring::Compression, GaugedSpring::Extension] {
            let tp = two_point(&TwoPointInput {
                kind, length_1: l1, force_1: f1, length_2: l2, force_2: f2,
                length_uncertainty: a, force_uncertainty: um, gauge_zero_uncertainty: um,
                at_length: Some(l1), closed_length: None,
            });
            match tp { Ok(r) => outcome("two point", &r, p)?, Err(e) => named(&e)? }
        }
    }
}

// ── Mechanisms and release ───────────────────────────────────────────────

fn solver() -> SolverConfig {
    SolverConfig {
        max_steps: 20_000,
        t_end: 600.0,
        ..SolverConfig::default()
    }
}

fn check_release(r: &ReleaseOutcome, finite: bool) -> Result<(), TestCaseError> {
    sound("time", r.time, finite)?;
    sound("position", r.position, finite)?;
    sound("speed", r.speed(), finite)?;
    sound("hazard mass", r.hazard_mass, finite)?;
    sound("closing force", r.closing_force_static, finite)?;
    for h in &r.history {
        outcome("history point", h, finite)?;
    }
    Ok(())
}

proptest! {
    #![proptest_config(config())]

    #[test]
    fn a_released_part_with_hostile_inputs_gives_errors_or_no_nan(
        mass in value(0.01, 1e3), travel in value(1e-4, 2.0), incline in value(0.01, 1.5),
        mu in value(1e-3, 1.0), damping in value(0.1, 1e3), drive in value(1.0, 1e3),
        k in value(10.0, 1e6), latch in value(1e-3, 0.1),
        rotating in any::<bool>(), shape in 0usize..6,
    ) {
        let spring = SpringSpec::Linear(LinearSpec {
            rate: 1000.0, free_length: None, max_deflection: Some(0.2), solid_length: None,
        }).build().map_err(|e| TestCaseError::fail(e.to_string()))?;
        let spring_k = SpringSpec::Linear(LinearSpec {
            rate: k, free_length: None, max_deflection: Some(0.2), solid_length: None,
        }).build();
        let spring_ref: &SpringModel = match &spring_k { Ok(s) => s, Err(_) => &spring };
        let direct = DirectSpring { spring: spring_ref, deflection_at_latch: latch, sense: Sense::Unloads, detaches: false };
        let plausible = is_plausible(&[mass, travel, incline, mu, damping, drive, k, latch]);
        let mech = if rotating {
            let inertia = match shape {
                0 => InertiaSpec::Given { inertia: mass, mass, cg_radius: travel },
                1 => InertiaSpec::PlateAboutEdge { mass, width: travel },
                2 => InertiaSpec::RodAboutEnd { mass, length: travel },
                3 => InertiaSpec::DiscAboutCentre { mass, radius: travel },
                4 => InertiaSpec::PointMass { mass, radius: travel },
                _ => InertiaSpec::Offset { mass, inertia_about_cg: damping, distance: travel },
            };
            RotatingPart::new(RotatingConfig {
                inertia, cg_angle_at_latch: incline, hinge_tilt: incline,
                spring: Some(SpringMount::Direct(direct)), travel: incline,
                friction_torque: mu, damping, drive_torque: drive, hazard_radius: travel,
            }).map(Mechanism::Rotating)
        } else {
            TranslatingPart::new(TranslatingConfig {
                mass, spring: Some(direct), travel, incline, friction: Friction::Coefficient(mu),
                damping, drive_force: drive, include_spring_mass: true,
            }).map(Mechanism::Translating)
        };
        match mech {
            Err(e) => named(&e)?,
            Ok(m) => {
                let cfg = ReleaseConfig { solver: solver(), samples: 20 };
                if let Ok(r) = release(&m, &cfg) {
                    check_release(&r, plausible)?;
                }
            }
        }
    }

    #[test]
    fn a_non_finite_part_input_is_refused_naming_it(i in 0usize..6, bad in non_finite()) {
        let fields = ["mass", "travel", "incline", "damping", "drive_force", "friction"];
        let mut v = [2.0, 0.06, 0.0, 0.0, 0.0, 0.1];
        v[i] = bad;
        let e = TranslatingPart::new(TranslatingConfig {
            mass: v[0], spring: None, travel: v[1], incline: v[2],
            friction: Friction::Coefficient(v[5]), damping: v[3], drive_force: v[4],
            include_spring_mass: false,
        }).err();
        let Some(e) = e else { return Err(TestCaseError::fail(format!("{} = {bad} accepted", fields[i]))) };
        named(&e)?;
        prop_assert!(e.field.contains(fields[i]) || (i == 5 && e.field.contains("mu")), "{}: {e}", fields[i]);
    }
}

// ── Buffers and impact ───────────────────────────────────────────────────

proptest! {
    #![proptest_config(config())]

    #[test]
    fn an_impact_with_hostile_inputs_gives_errors_or_no_nan(
        law in 0usize..6, x in value(1.0, 1e6), n in value(0.3, 5.0), stroke in value(1e-4, 0.5),
        count in prop_oneof![Just(0u32), Just(1), 2u32..10, Just(u32::MAX)],
        e in prop_oneof![Just(None), value(1e-3, 1.0).prop_map(Some)],
        mass in value(0.01, 1e4), speed in value(1e-3, 10.0), drive in value(1.0, 1e4),
        incline in value(0.01, 1.5), friction in value(0.1, 100.0), cycles in value(1e-4, 1.0),
    ) {
        let spring = SpringSpec::Linear(LinearSpec {
            rate: x, free_length: None, max_deflection: Some(1.0), solid_length: None,
        }).build();
        let law = match (law, &spring) {
            (0, _) => BufferLaw::Linear { rate: x, stroke },
            (1, _) => BufferLaw::PowerLaw { coefficient: x, exponent: n, stroke },
            (2, Ok(s)) => BufferLaw::Spring { spring: s, preload_deflection: stroke * 0.1 },
            (3, _) => BufferLaw::ConstantForce { force: x, stroke },
            (4, _) => BufferLaw::IdealAbsorber { stroke, efficiency: n / 5.0 },
            _ => BufferLaw::Orifice { coefficient: x, stroke },
        };
        let rebound = e.map_or(Rebound::Elastic, Rebound::Restitution);
        match Buffer::new(BufferConfig { law, count, rebound }) {
            Err(err) => named(&err)?,
            Ok(b) => {
                let input = ImpactInput {
                    mass, speed, drive_force: drive, incline, friction_force: friction,
                    cycles_per_hour: cycles,
                };
                let cfg = ImpactConfig { solver: solver(), samples: 20 };
                let p = is_plausible(&[x, n, stroke, mass, speed, drive, incline, friction, cycles]);
                if let Ok(o) = impact(&input, &b, &cfg) {
                    for (what, v) in [
                        ("peak force", o.peak_force), ("stroke used", o.stroke_used),
                        ("peak deceleration", o.peak_deceleration),
                        ("compression time", o.compression_time),
                        ("energy per cycle", o.energy_per_cycle),
                        ("residual speed", o.residual_speed()),
                        ("mean deceleration", o.mean_deceleration()),
                        ("heat load", o.heat_load()),
                    ] {
                        sound(what, v, p)?;
                    }
                    for h in &o.history {
                        outcome("impact history", h, p)?;
                    }
                }
            }
        }
    }
}

// ── Body contact, gaps, sizing ───────────────────────────────────────────

proptest! {
    #![proptest_config(config())]

    #[test]
    fn body_contact_with_hostile_inputs_gives_errors_or_no_nan(
        m in value(0.01, 100.0), v in value(1e-3, 10.0), mh in value(0.1, 40.0),
        kh in value(1e3, 1e8), a in value(1e-4, 0.1), b in value(1e-4, 0.1),
        pad in prop_oneof![Just(None), (value(1e2, 1e7), prop_oneof![Just(None), value(1e-4, 0.05).prop_map(Some)]).prop_map(Some)],
        shape in 0usize..3, force in value(1.0, 1e4),
    ) {
        let mut all = vec![m, v, mh, kh, a, b, force];
        if let Some((k, t)) = pad {
            all.push(k);
            all.extend(t);
        }
        let p = is_plausible(&all);
        let area = match shape {
            0 => ContactArea::Edge { length: a, width: b },
            1 => ContactArea::Circle { diameter: a },
            _ => ContactArea::Given { area: a * b },
        };
        let padding = pad.map(|(stiffness, thickness)| Padding { stiffness, thickness });
        let region = BodyRegion { label: "hand".into(), mass: mh, stiffness: kh };
        match transient_contact(&TransientContact {
            part_mass: m, relative_speed: v, region: region.clone(), contact_area: area,
            padding, limits: None,
        }) {
            Ok(o) => outcome("transient contact", &o, p)?,
            Err(e) => named(&e)?,
        }
        match clamping(&Clamping {
            spring_force: force, drive_force: force * 0.1, gravity_force: -force * 0.05,
            friction_force: force * 0.01, spring_rate: Some(kh), region, padding,
            contact_area: area,
        }) {
            Ok(o) => outcome("clamping", &o, p)?,
            Err(e) => named(&e)?,
        }
    }

    #[test]
    fn gaps_with_hostile_inputs_give_errors_or_no_nan(
        g in value(1e-4, 0.5), s in value(1e-4, 0.5), angle in value(1e-3, 3.0), which in 0usize..6,
    ) {
        let geometry = match which {
            0 => ClosingGeometry::Closed,
            1 => ClosingGeometry::FixedClearance { gap: g },
            2 => ClosingGeometry::BufferStop { gap_at_buffer_contact: g, stroke_used: s },
            3 => ClosingGeometry::HingedEdge { radius: g, angle, measure: EdgeGapMeasure::Chord },
            4 => ClosingGeometry::HingedEdge { radius: g, angle, measure: EdgeGapMeasure::Arc },
            _ => ClosingGeometry::HingedEdge { radius: g, angle, measure: EdgeGapMeasure::Normal },
        };
        match closing_gap(&geometry) {
            Ok(o) => outcome("gap", &o, is_plausible(&[g, s, angle]))?,
            Err(e) => named(&e)?,
        }
    }

    #[test]
    fn sizing_with_hostile_inputs_gives_errors_or_no_nan(
        mass in value(0.01, 1e4), radius in value(0.01, 2.0), rotating in any::<bool>(),
        speed in value(1e-3, 10.0), drive in value(1.0, 1e4), gravity in value(1.0, 1e4),
        friction in value(0.1, 100.0), cycles in value(1e-4, 1.0),
        f in prop_oneof![Just(None), value(10.0, 1e6).prop_map(Some)],
        dec in prop_oneof![Just(None), value(1.0, 1e4).prop_map(Some)],
        mean in prop_oneof![Just(None), value(1.0, 1e4).prop_map(Some)],
        stroke in prop_oneof![Just(None), value(1e-3, 1.0).prop_map(Some)],
        x in value(0.2, 10.0), kind in 0usize..5,
    ) {
        let moving = if rotating {
            MovingBody::Rotating { inertia: mass, radius }
        } else {
            MovingBody::Translating { mass }
        };
        let input = SizingInput {
            moving, impact_speed: speed, drive_force: drive, gravity_force: gravity,
            friction_force: friction, cycles_per_hour: cycles,
            limits: SizingLimits { peak_force: f, peak_deceleration: dec, mean_deceleration: mean, stroke },
        };
        let buffer = match kind {
            0 => BufferType::LinearSpring,
            1 => BufferType::PowerLaw { exponent: x },
            2 => BufferType::ConstantForce { efficiency: x / 10.0 },
            3 => BufferType::Orifice { residual_speed: x / 100.0 },
            _ => BufferType::GasSpring { progression: x, polytropic_index: 1.0 + x / 30.0 },
        };
        let mut all = vec![mass, radius, speed, drive, gravity, friction, cycles, x];
        all.extend([f, dec, mean, stroke].into_iter().flatten());
        match size_buffer(&input, &buffer) {
            Ok(o) => outcome("sizing", &o, is_plausible(&all))?,
            Err(e) => named(&e)?,
        }
    }
}

// ── The scenario layer ───────────────────────────────────────────────────

/// A text that must be refused in any numeric field: not finite, or beyond
/// the magnitudes accepted.
const ALWAYS_REFUSED: &[&str] = &[
    "NaN",
    "nan",
    "inf",
    "-inf",
    "+inf",
    "Infinity",
    "∞",
    "-∞",
    "1e300",
    "1e300 kg",
    "-1e300",
    "1e308",
    "1.8e308",
    "1e-300",
    "4.9e-324",
    "1e20",
    "-1e20",
    "1e-20",
    "9e15",
    "99999999999999999999",
];

fn hostile_text() -> impl Strategy<Value = String> {
    let units: Vec<&'static str> = joulewise_core::units::all_units()
        .iter()
        .map(|u| u.symbol)
        .collect();
    prop_oneof![
        prop::sample::select(HOSTILE_TEXTS).prop_map(str::to_string),
        (any::<f64>(), prop::sample::select(units)).prop_map(|(x, u)| format!("{x} {u}")),
        (-30i32..30, 0.0f64..10.0).prop_map(|(e, m)| format!("{m}e{e}")),
    ]
}

proptest! {
    #![proptest_config(config())]

    #[test]
    fn any_numeric_input_of_any_seed_set_to_hostile_text(
        seed in 0usize..64, input in 0usize..256, text in hostile_text(),
    ) {
        let all = seeds();
        let (name, mut s) = all[seed % all.len()].clone();
        let nominal = assess(&s).map_err(|e| TestCaseError::fail(e.to_string()))?;
        let paths: Vec<String> = nominal.inputs.iter()
            .filter(|i| !i.text.is_empty())
            .map(|i| i.path.clone())
            .collect();
        prop_assume!(!paths.is_empty());
        let target = paths[input % paths.len()].clone();
        let mut hit = false;
        visit_values(&mut s, &mut |path, v| {
            if path == target {
                v.text = text.clone();
                hit = true;
            }
        });
        prop_assert!(hit, "{name}: no input at {target}");
        let r = assess(&s).map_err(|e| TestCaseError::fail(e.to_string()))?;
        if let Err(e) = check_report(&r) {
            return Err(TestCaseError::fail(format!("{name}, {target} = {text:?}: {e}")));
        }
        if ALWAYS_REFUSED.contains(&text.trim()) {
            prop_assert!(
                r.errors.iter().any(|e| e.field == target),
                "{name}: {target} = {text:?} accepted; errors {:?}", r.errors
            );
        }
        // The file round trip keeps the text as typed.
        let back = Scenario::from_json(&s.to_json()).map_err(|e| TestCaseError::fail(e.to_string()))?;
        prop_assert_eq!(back.to_json(), s.to_json());
    }
}
