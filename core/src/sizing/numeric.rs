//! Bounded numerics for sizing: composite Gauss–Legendre quadrature and a bracketing bisection on a monotone predicate.
//!
//! Gauss–Legendre with 10 nodes integrates polynomials of degree ≤ 19
//! exactly (Abramowitz & Stegun, Handbook of Mathematical Functions, 25.4.29
//! and Table 25.4; the nodes and weights below were recomputed with
//! `numpy.polynomial.legendre.leggauss(10)`). The bisection expands its
//! bracket geometrically and halves it a bounded number of times, so every
//! call ends; a bracket it cannot find is reported as `None`.

/// Positive nodes of the 10-point Gauss–Legendre rule on `[-1, 1]`.
const GL10_NODES: [f64; 5] = [
    0.148_874_338_981_631_22,
    0.433_395_394_129_247_2,
    0.679_409_568_299_024_4,
    0.865_063_366_688_984_5,
    0.973_906_528_517_171_7,
];

/// Weights matching [`GL10_NODES`] (each node `±x` has the same weight).
const GL10_WEIGHTS: [f64; 5] = [
    0.295_524_224_714_752_8,
    0.269_266_719_309_996_5,
    0.219_086_362_515_982,
    0.149_451_349_150_580_4,
    0.066_671_344_308_688_14,
];

/// Panels of the composite rule: 16 panels × 10 nodes. The integrands here
/// (time to stop of a buffer, after the substitution that removes the
/// end-point singularity) are smooth except for a weak power at one end when
/// a power-law exponent is not an integer; 160 nodes reach ~1e-9 relative
/// there and rounding level for smooth integrands (checked in the tests).
pub(super) const PANELS: usize = 16;

/// `∫ₐᵇ f(x) dx` by composite 10-point Gauss–Legendre over `panels` equal
/// panels.
pub(super) fn integrate(f: impl Fn(f64) -> f64, a: f64, b: f64, panels: usize) -> f64 {
    let panels = panels.max(1);
    let h = (b - a) / panels as f64;
    let mut sum = 0.0;
    for p in 0..panels {
        let mid = a + (p as f64 + 0.5) * h;
        let half = 0.5 * h;
        for (x, w) in GL10_NODES.iter().zip(GL10_WEIGHTS.iter()) {
            sum += w * (f(mid - half * x) + f(mid + half * x)) * half;
        }
    }
    sum
}

/// Most bracket expansions: the step doubles each time, so 64 expansions
/// span far more than the f64 exponent range.
const MAX_EXPAND: usize = 64;
/// Most halvings of the bracket: from a width of 2⁶⁴ down to 1e-14 takes
/// about 110; 200 is a cap that is never the reason to stop in practice.
const MAX_HALVINGS: usize = 200;
/// Bracket width (in the log-like coordinate `z`) at which bisection stops:
/// a relative precision of about 1e-14 in the sized quantity.
const Z_TOL: f64 = 1e-14;

/// The largest `z` for which `pred(z)` holds, where `pred` is true below a
/// threshold and false above it. Starts from `z0`; `None` when no bracket is
/// found within the expansion cap. Returns the last `z` where `pred` held,
/// so the answer always lies on the side that meets the predicate.
pub(super) fn largest_true(pred: impl Fn(f64) -> bool, z0: f64) -> Option<f64> {
    let (mut lo, mut hi);
    let mut step = 1.0;
    if pred(z0) {
        lo = z0;
        hi = z0 + step;
        let mut n = 0;
        while pred(hi) {
            lo = hi;
            step *= 2.0;
            hi += step;
            n += 1;
            if n >= MAX_EXPAND || !hi.is_finite() {
                return None;
            }
        }
    } else {
        hi = z0;
        lo = z0 - step;
        let mut n = 0;
        while !pred(lo) {
            hi = lo;
            step *= 2.0;
            lo -= step;
            n += 1;
            if n >= MAX_EXPAND || !lo.is_finite() {
                return None;
            }
        }
    }
    for _ in 0..MAX_HALVINGS {
        if hi - lo <= Z_TOL * (1.0 + lo.abs().max(hi.abs())) {
            break;
        }
        let mid = 0.5 * (lo + hi);
        if pred(mid) {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Some(lo)
}

/// The smallest `z` for which `pred(z)` holds, where `pred` is false below a
/// threshold and true above it (mirror of [`largest_true`]).
pub(super) fn smallest_true(pred: impl Fn(f64) -> bool, z0: f64) -> Option<f64> {
    largest_true(|z| pred(-z), -z0).map(|z| -z)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;

    #[test]
    fn gauss_legendre_is_exact_to_degree_19() {
        // A 10-point Gauss–Legendre rule is exact for degree ≤ 2·10 − 1
        // (Abramowitz & Stegun 25.4.29): weights sum to 2 on [-1, 1].
        let wsum: f64 = 2.0 * GL10_WEIGHTS.iter().sum::<f64>();
        assert_relative_eq!(wsum, 2.0, max_relative = REL_EXACT);
        for deg in 0..=19 {
            let got = integrate(|u| u.powi(deg), 0.0, 1.0, 1);
            assert_relative_eq!(
                got,
                1.0 / f64::from(deg + 1),
                max_relative = REL_EXACT * 10.0
            );
        }
        // Composite panels integrate a smooth non-polynomial to rounding.
        let got = integrate(|u| (3.0 * u).exp(), 0.0, 1.0, PANELS);
        assert_relative_eq!(
            got,
            (3.0_f64.exp() - 1.0) / 3.0,
            max_relative = REL_EXACT * 10.0
        );
    }

    /// The bisection stops at a bracket of 1e-14·(1 + |z|): 1e-13 near
    /// |z| ≈ 4, 3e-12 near |z| ≈ 250.
    const ABS_Z_SMALL: f64 = 1e-13;
    const ABS_Z_LARGE: f64 = 1e-11;

    #[test]
    fn bisection_finds_a_threshold_on_the_true_side() {
        let z = largest_true(|z| z <= 3.7, 0.0).unwrap();
        assert!(z <= 3.7 && 3.7 - z < ABS_Z_SMALL);
        let z = largest_true(|z| z <= -250.0, 10.0).unwrap();
        assert!(z <= -250.0 && -250.0 - z < ABS_Z_LARGE);
        let z = smallest_true(|z| z >= 1.25, 40.0).unwrap();
        assert!(z >= 1.25 && z - 1.25 < ABS_Z_SMALL);
        assert_eq!(largest_true(|_| true, 0.0), None);
        assert_eq!(largest_true(|_| false, 0.0), None);
    }
}
