//! Bracketed bisection for monotone characteristics, used to invert a
//! spring's force law (series stacks) and to solve for a stack's shared force.
//!
//! Method: plain bisection on a closed bracket `[a, b]` for the boundary
//! `x* = sup{x ∈ [a, b] : f(x) ≤ 0}` of a non-decreasing function. Bisection
//! never leaves the bracket and tolerates jumps (an extension spring's initial
//! tension, a gas spring's nominal force at q = 0) where Brent or secant
//! steps would stall. The iteration count is fixed by the bracket: after
//! [`BISECTION_STEPS`] halvings the bracket is 2⁻⁶⁰ of its start, far below
//! any measured deflection or force, so the loop is bounded and cannot fail.

/// Halvings of the bracket: 2⁻⁶⁰ ≈ 8.7e-19 of the starting width, below the
/// f64 resolution of the bracket's ends, so more steps cannot improve it.
pub(crate) const BISECTION_STEPS: usize = 60;

/// `sup{x ∈ [a, b] : f(x) ≤ 0}` for `f` non-decreasing, found by bisection.
///
/// Returns `a` when `f(a) > 0` (even the start is above zero) and `b` when
/// `f(b) ≤ 0` (the boundary lies beyond the bracket). Requires `a ≤ b`, both
/// finite; a NaN from `f` counts as "above zero", so it cannot widen the result.
pub(crate) fn boundary(f: impl Fn(f64) -> f64, a: f64, b: f64) -> f64 {
    if a.is_nan() || b.is_nan() || a > b {
        return a;
    }
    let below = |x: f64| f(x) <= 0.0;
    if below(b) {
        return b;
    }
    if !below(a) {
        return a;
    }
    let (mut lo, mut hi) = (a, b);
    for _ in 0..BISECTION_STEPS {
        let mid = lo + 0.5 * (hi - lo);
        if mid <= lo || mid >= hi {
            break;
        }
        if below(mid) {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    lo + 0.5 * (hi - lo)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// 2⁻⁶⁰ of a unit bracket plus rounding: what bisection can deliver.
    const ABS_BISECTION: f64 = 1e-15;

    #[test]
    fn finds_a_smooth_root() {
        let x = boundary(|x| x * x - 2.0, 0.0, 2.0);
        assert!((x - 2f64.sqrt()).abs() < ABS_BISECTION);
    }

    #[test]
    fn finds_the_edge_of_a_jump() {
        // f jumps from −1 to +1 at x = 0.3: the boundary is the jump.
        let x = boundary(|x| if x <= 0.3 { -1.0 } else { 1.0 }, 0.0, 1.0);
        assert!((x - 0.3).abs() < ABS_BISECTION);
    }

    #[test]
    fn clamps_to_the_bracket() {
        assert_eq!(boundary(|x| x - 5.0, 0.0, 1.0), 1.0);
        assert_eq!(boundary(|x| x + 5.0, 0.0, 1.0), 0.0);
        assert_eq!(boundary(|_| f64::NAN, 0.0, 1.0), 0.0);
    }
}
