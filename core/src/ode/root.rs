//! Bracketed scalar root finder (Brent's method: inverse quadratic
//! interpolation and secant steps, safeguarded by bisection).
//!
//! Source: R. P. Brent, *Algorithms for Minimization without Derivatives*,
//! Prentice-Hall 1973, chapter 4 (procedure `zero`). Given a bracket
//! `[a, b]` with `f(a)·f(b) ≤ 0` it never leaves the bracket and converges in
//! at most about `(log₂((b − a)/tol))²` evaluations; the loop is capped
//! regardless.

/// Largest number of function evaluations; Brent's bound for a bracket of
/// 2⁶⁰ tolerances is well below this, so the cap only guards against a
/// misbehaving `f` (e.g. one returning NaN).
const MAX_ITERATIONS: usize = 200;

/// A root of `f` in the bracket `[a, b]` to within `tol` (absolute, in the
/// argument), where `fa = f(a)` and `fb = f(b)` have opposite signs or one is
/// zero. Returns the end with the smaller |f| if the bracket is not a
/// bracket. Never panics; at most [`MAX_ITERATIONS`] calls of `f`.
pub(crate) fn brent<F: FnMut(f64) -> f64>(
    mut f: F,
    a: f64,
    b: f64,
    fa: f64,
    fb: f64,
    tol: f64,
) -> f64 {
    if fa == 0.0 {
        return a;
    }
    if fb == 0.0 {
        return b;
    }
    if (fa > 0.0) == (fb > 0.0) || !fa.is_finite() || !fb.is_finite() {
        return if fa.abs() < fb.abs() { a } else { b };
    }
    let (mut a, mut b, mut fa, mut fb) = (a, b, fa, fb);
    let (mut c, mut fc) = (a, fa);
    let mut d = b - a;
    let mut e = d;
    for _ in 0..MAX_ITERATIONS {
        if (fb > 0.0) == (fc > 0.0) {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol1 = 2.0 * f64::EPSILON * b.abs() + 0.5 * tol;
        let xm = 0.5 * (c - b);
        if xm.abs() <= tol1 || fb == 0.0 {
            return b;
        }
        if e.abs() >= tol1 && fa.abs() > fb.abs() {
            // Interpolation: secant when only two points, else inverse quadratic.
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                p = 2.0 * xm * s;
                q = 1.0 - s;
            } else {
                let qq = fa / fc;
                let r = fb / fc;
                p = s * (2.0 * xm * qq * (qq - r) - (b - a) * (r - 1.0));
                q = (qq - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            if 2.0 * p < (3.0 * xm * q - (tol1 * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
            } else {
                d = xm;
                e = d;
            }
        } else {
            d = xm;
            e = d;
        }
        a = b;
        fa = fb;
        b += if d.abs() > tol1 { d } else { tol1.copysign(xm) };
        fb = f(b);
        if !fb.is_finite() {
            // Fall back to the last finite end: the bracket is still [a, c].
            return a;
        }
    }
    b
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Requested argument tolerance: tighter than any event needs.
    const TOL: f64 = 1e-14;

    #[test]
    fn finds_square_root_of_two() {
        // √2 to double precision is 1.4142135623730951 (exact arithmetic fact).
        let mut calls = 0;
        let r = brent(
            |x| {
                calls += 1;
                x * x - 2.0
            },
            0.0,
            2.0,
            -2.0,
            2.0,
            TOL,
        );
        assert!((r - std::f64::consts::SQRT_2).abs() < 4.0 * TOL);
        assert!(calls < 20, "{calls} evaluations");
    }

    #[test]
    fn survives_a_flat_then_steep_function() {
        // x¹⁵ − 0.1 has its root at 0.1^(1/15); bisection safeguard must cope.
        let f = |x: f64| x.powi(15) - 0.1;
        let r = brent(f, 0.0, 1.0, f(0.0), f(1.0), TOL);
        assert!((r - 0.1f64.powf(1.0 / 15.0)).abs() < 1e-12);
    }

    #[test]
    fn non_bracket_returns_an_end() {
        let r = brent(|x| x * x + 1.0, -1.0, 2.0, 2.0, 5.0, TOL);
        assert_eq!(r, -1.0);
    }
}
