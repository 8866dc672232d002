//! Published worked examples that the core's unit tests do not already
//! cover, each compared with the value printed in the book, within the
//! tolerance the verification catalogue states for it
//! (`joulewise_core::verification`). Source and status beside each check.
#![forbid(unsafe_code)]

use joulewise_core::spring::helical::{CoilDiameter, EndType, Seating};
use joulewise_core::spring::{HelicalSpec, HelicalSpring, Material};
use joulewise_core::verification;

/// Shear modulus used in Bhandari's examples for patented cold-drawn wire,
/// 81 370 N/mm² (Bhandari, Design of Machine Elements 3rd ed., Ex. 10.1
/// ff.; reference table §6, status R).
const G_BHANDARI: f64 = 81_370e6;

fn tolerance(id: &str) -> f64 {
    verification::check(id)
        .unwrap_or_else(|| panic!("{id} is not in the verification catalogue"))
        .tolerance
        .relative
}

fn rel(got: f64, want: f64) -> f64 {
    (got - want).abs() / want.abs()
}

/// A squared-and-ground helical spring of Bhandari's steel.
fn bhandari_spring(d: f64, mean_d: f64, n: f64, free_length: f64) -> HelicalSpring {
    HelicalSpring::new(HelicalSpec {
        wire_diameter: d,
        coil_diameter: CoilDiameter::Mean(mean_d),
        active_coils: n,
        total_coils: None,
        ends: EndType::ClosedGround,
        free_length,
        material: Material::Custom {
            name: None,
            shear_modulus: G_BHANDARI,
            youngs_modulus: None,
            density: None,
            tensile_strength: None,
        },
        solid_length: None,
        tensile_strength: None,
        permissible_stress_fraction: None,
        seating: Seating::BothFixed,
    })
    .unwrap_or_else(|e| panic!("a valid spring: {e}"))
}

#[test]
fn bhandari_ex_10_5_spring_balance_rate() {
    // Bhandari, Design of Machine Elements 3rd ed., Ex. 10.5 (status R):
    // spring balance, d = 7 mm, D = 42 mm, N = 22 active coils ⇒ actual
    // rate 14.98 N/mm (printed to 4 significant figures).
    let s = bhandari_spring(0.007, 0.042, 22.0, 0.30);
    let tol = tolerance("cross.helical.bhandari_10_5");
    assert!(rel(s.spring_rate(), 14.98e3) <= tol, "{}", s.spring_rate());
}

#[test]
fn bhandari_ex_10_6_wagon_buffer_spring_rate() {
    // Bhandari 3rd ed., Ex. 10.6 (status R): railway wagon buffer spring,
    // d = 20 mm, D = 120 mm, N = 13 ⇒ actual rate 72.44 N/mm; squared and
    // ground ends, N_t = 15.
    let s = bhandari_spring(0.020, 0.120, 13.0, 0.484);
    let tol = tolerance("cross.helical.bhandari_10_6");
    assert!(rel(s.spring_rate(), 72.44e3) <= tol, "{}", s.spring_rate());
    assert!(rel(s.total_coils(), 15.0) <= tol, "{}", s.total_coils());
}

#[test]
fn bhandari_ex_10_10_solid_length() {
    // Bhandari 3rd ed., Ex. 10.10 (status R): d = 18 mm, D = 108 mm, N = 10,
    // squared and ground ends ⇒ N_t = 12 and solid length N_t·d = 216 mm.
    let s = bhandari_spring(0.018, 0.108, 10.0, 0.325);
    let tol = tolerance("cross.helical.bhandari_10_10");
    assert!(rel(s.total_coils(), 12.0) <= tol);
    assert!(
        rel(s.solid_length().0, 0.216) <= tol,
        "{}",
        s.solid_length().0
    );
}
