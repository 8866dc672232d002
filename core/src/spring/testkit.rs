//! Test support for the spring models: an independent adaptive Simpson
//! quadrature (so `work` can be checked against `∫ force dq` computed without
//! the model's own closed form) and generic property checks every model runs.

use super::{Spring, Travel};

/// Energy = integral of force, closed form against adaptive quadrature: the
/// quadrature is asked for 1e-13 of the scale and rounding of the closed
/// forms is 1e-14, so 1e-9 leaves room for kinks (table knots, the initial
/// tension step) that the quadrature resolves only to its depth limit.
pub const REL_WORK_VS_QUADRATURE: f64 = 1e-9;

/// A closed form evaluated through exp/ln, a sum of pieces or a bisection:
/// rounding of a few dozen operations, well above 1e-16 per step.
pub const REL_FEW_OPS: f64 = 1e-11;

/// Lengths of order 0.1 m compared after a few operations (m).
pub const ABS_ROUNDING_M: f64 = 1e-15;

/// W(a, c) − W(a, b) − W(b, c): three closed forms that each round at 1e-16
/// of their own magnitude, which can exceed the magnitude of the sum.
const REL_ALGEBRA: f64 = 1e-10;

/// The quadrature self-test asks for 1e-14 to 1e-15 and must land within 1e-12.
const ABS_QUADRATURE_SELF_TEST: f64 = 1e-12;

/// Simpson's rule on one panel.
fn simpson(f: &dyn Fn(f64) -> f64, a: f64, fa: f64, b: f64, fb: f64) -> (f64, f64, f64) {
    let m = 0.5 * (a + b);
    let fm = f(m);
    (m, fm, (b - a) / 6.0 * (fa + 4.0 * fm + fb))
}

#[allow(clippy::too_many_arguments)] // recursion state of the textbook algorithm
fn adapt(
    f: &dyn Fn(f64) -> f64,
    a: f64,
    fa: f64,
    b: f64,
    fb: f64,
    m: f64,
    fm: f64,
    whole: f64,
    tol: f64,
    depth: u32,
) -> f64 {
    let (lm, flm, left) = simpson(f, a, fa, m, fm);
    let (rm, frm, right) = simpson(f, m, fm, b, fb);
    let delta = left + right - whole;
    if depth == 0 || delta.abs() <= 15.0 * tol {
        return left + right + delta / 15.0;
    }
    adapt(f, a, fa, m, fm, lm, flm, left, tol / 2.0, depth - 1)
        + adapt(f, m, fm, b, fb, rm, frm, right, tol / 2.0, depth - 1)
}

/// ∫ f from a to b by adaptive Simpson with Richardson correction
/// (Lyness 1969), absolute tolerance `tol`, recursion depth at most 48.
pub fn integrate(f: &dyn Fn(f64) -> f64, a: f64, b: f64, tol: f64) -> f64 {
    if a == b {
        return 0.0;
    }
    let (fa, fb) = (f(a), f(b));
    let (m, fm, whole) = simpson(f, a, fa, b, fb);
    adapt(f, a, fa, b, fb, m, fm, whole, tol, 48)
}

/// Check `work(q1, q2)` against the quadrature of `force` on one branch.
pub fn check_work_is_integral(s: &dyn Spring, q1: f64, q2: f64, travel: Travel) {
    let scale = s
        .force(q1, travel)
        .abs()
        .max(s.force(q2, travel).abs())
        .max(s.force(0.5 * (q1 + q2), travel).abs())
        * (q2 - q1).abs();
    let numeric = integrate(&|q| s.force(q, travel), q1, q2, 1e-13 * scale.max(1e-300));
    let exact = s.work(q1, q2, travel);
    assert!(
        (numeric - exact).abs() <= REL_WORK_VS_QUADRATURE * scale.max(1e-300),
        "work({q1}, {q2}, {travel:?}) = {exact} but ∫F dq = {numeric}"
    );
}

/// Work antisymmetry and additivity: W(a,b) = −W(b,a); W(a,c) = W(a,b) + W(b,c).
pub fn check_work_algebra(s: &dyn Spring, a: f64, b: f64, c: f64, travel: Travel) {
    let scale = s.work(a, b, travel).abs() + s.work(b, c, travel).abs() + 1e-300;
    let anti = s.work(a, b, travel) + s.work(b, a, travel);
    assert!(
        anti.abs() <= crate::test_tol::REL_EXACT * scale,
        "antisymmetry broken by {anti}"
    );
    let add = s.work(a, c, travel) - s.work(a, b, travel) - s.work(b, c, travel);
    assert!(
        add.abs() <= REL_ALGEBRA * scale,
        "additivity broken by {add}"
    );
}

/// For a spring whose force is non-negative on [0, max]: the stored energy
/// from free is non-negative and does not fall with deflection.
pub fn check_energy_monotone(s: &dyn Spring, travel: Travel) {
    let (lo, hi) = s.deflection_range();
    let lo = lo.max(0.0);
    let mut last = 0.0_f64;
    for i in 0..=64 {
        let q = lo + (hi - lo) * f64::from(i) / 64.0;
        let e = s.work(lo, q, travel);
        assert!(
            e >= -1e-12 * e.abs().max(1e-300),
            "negative energy {e} at {q}"
        );
        assert!(
            e >= last - 1e-12 * last.abs(),
            "energy fell from {last} to {e} at {q}"
        );
        last = e;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn quadrature_integrates_known_functions() {
        // ∫0^π sin = 2; ∫0^1 x⁴ = 1/5 (calculus).
        let a = integrate(&f64::sin, 0.0, std::f64::consts::PI, 1e-14);
        assert!((a - 2.0).abs() < ABS_QUADRATURE_SELF_TEST);
        let b = integrate(&|x: f64| x.powi(4), 0.0, 1.0, 1e-15);
        assert!((b - 0.2).abs() < ABS_QUADRATURE_SELF_TEST);
        // A unit step at 0.3 on [0, 1]: area 0.7.
        let c: f64 = integrate(&|x| if x > 0.3 { 1.0 } else { 0.0 }, 0.0, 1.0, 1e-14);
        assert!((c - 0.7).abs() < ABS_QUADRATURE_SELF_TEST);
    }
}
