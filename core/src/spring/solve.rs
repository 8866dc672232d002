//! Bracketed root finding for monotone characteristics, used to invert a
//! spring's force law (series stacks) and to solve for a stack's shared force.
//!
//! Method: the boundary `x* = sup{x ∈ [a, b] : f(x) ≤ 0}` of a
//! non-decreasing function on a closed bracket, by the Illinois variant of
//! false position (Dowell & Jarratt, BIT 11 (1971)) safeguarded by
//! bisection: when three steps running have not halved the bracket the
//! next step bisects, and a candidate outside the bracket or at its ends is
//! replaced by the midpoint. The bracket never
//! grows, so jumps (an extension spring's initial tension, a gas spring's
//! nominal force at q = 0) and flat stretches are handled as plain
//! bisection handles them, while a smooth characteristic converges in a
//! handful of evaluations instead of sixty. That matters because a series
//! stack nests two of these solves inside every force evaluation, and the
//! release integrator asks for the force thousands of times.
//!
//! Termination: the bracket is refined until it is 2⁻⁶⁰ of its start (far
//! below any measured deflection or force) or a few units of rounding of its
//! ends wide, with at most [`MAX_STEPS`] evaluations, so the loop is bounded
//! and cannot fail; the result is the bracket's middle.

/// Refinement of the bracket: 2⁻⁶⁰ ≈ 8.7e-19 of the starting width, below
/// the f64 resolution of the bracket's ends.
const RESOLUTION: f64 = 8.673_617_379_884_035e-19; // 2⁻⁶⁰

/// Most evaluations: every fourth step at least halves the bracket, so 60
/// halvings take at most 240 steps; the cap is a bound, not a tolerance.
pub(crate) const MAX_STEPS: usize = 250;

/// `sup{x ∈ [a, b] : f(x) ≤ 0}` for `f` non-decreasing.
///
/// Returns `a` when `f(a) > 0` (even the start is above zero) and `b` when
/// `f(b) ≤ 0` (the boundary lies beyond the bracket). Requires `a ≤ b`, both
/// finite; a NaN from `f` counts as "above zero", so it cannot widen the result.
pub(crate) fn boundary(f: impl Fn(f64) -> f64, a: f64, b: f64) -> f64 {
    if a.is_nan() || b.is_nan() || a > b {
        return a;
    }
    let below = |v: f64| v <= 0.0;
    let fb = f(b);
    if below(fb) {
        return b;
    }
    let fa = f(a);
    if !below(fa) {
        return a;
    }
    let target = RESOLUTION * (b - a);
    let (mut lo, mut hi) = (a, b);
    // Function values used for false position: Illinois halves the value at
    // an end that stays put twice running, so both ends close in.
    let (mut f_lo, mut f_hi) = (fa, fb);
    let mut last_side = 0i8;
    // Width at the last checkpoint: a run of three steps that does not halve
    // the bracket is followed by a bisection step.
    let mut checkpoint = b - a;
    let mut steps_since = 0u8;
    for _ in 0..MAX_STEPS {
        let width = hi - lo;
        let mid = lo + 0.5 * width;
        // A few units of rounding of the ends: no finer bracket means
        // anything in f64.
        let resolvable = 4.0 * f64::EPSILON * lo.abs().max(hi.abs());
        if width <= target.max(resolvable) || mid <= lo || mid >= hi {
            break;
        }
        let stalled = steps_since >= 3 && width > 0.5 * checkpoint;
        let secant = lo - f_lo * width / (f_hi - f_lo);
        let x = if !stalled && secant.is_finite() && secant > lo && secant < hi {
            secant
        } else {
            mid
        };
        if stalled || width <= 0.5 * checkpoint {
            checkpoint = width;
            steps_since = 0;
        }
        steps_since += 1;
        let fx = f(x);
        if below(fx) {
            lo = x;
            f_lo = fx;
            if last_side == 1 {
                f_hi *= 0.5;
            }
            last_side = 1;
        } else {
            hi = x;
            // A NaN counts as above zero; keep a usable value for the secant.
            f_hi = if fx.is_finite() { fx } else { f_hi };
            if last_side == -1 {
                f_lo *= 0.5;
            }
            last_side = -1;
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

    /// Plain bisection to the same resolution: the reference the safeguarded
    /// method must agree with.
    fn bisection(f: impl Fn(f64) -> f64, a: f64, b: f64) -> f64 {
        if f(b) <= 0.0 {
            return b;
        }
        if f(a) > 0.0 {
            return a;
        }
        let (mut lo, mut hi) = (a, b);
        for _ in 0..60 {
            let mid = lo + 0.5 * (hi - lo);
            if mid <= lo || mid >= hi {
                break;
            }
            if f(mid) <= 0.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        lo + 0.5 * (hi - lo)
    }

    /// Found while fuzzing: a series stack of two measured tables used as a
    /// buffer took 0.6 s per assessment (60 × 60 evaluations per force) and
    /// minutes for a tolerance study. A smooth characteristic now converges
    /// in a few evaluations; the step cap still bounds the worst case.
    #[test]
    fn a_smooth_characteristic_needs_few_evaluations() {
        let calls = std::cell::Cell::new(0);
        let f = |x: f64| {
            calls.set(calls.get() + 1);
            1e4 * x + 2e5 * x * x * x - 37.0
        };
        let x = boundary(f, 0.0, 0.05);
        assert!(calls.get() <= 20, "{} evaluations", calls.get());
        let reference = bisection(|x| 1e4 * x + 2e5 * x * x * x - 37.0, 0.0, 0.05);
        assert!((x - reference).abs() < ABS_BISECTION * 0.05);
        calls.set(0);
        let _ = boundary(
            |x| {
                if x <= 0.3 {
                    -1.0
                } else {
                    calls.set(calls.get() + 1);
                    1.0
                }
            },
            0.0,
            1.0,
        );
        assert!(calls.get() <= MAX_STEPS);
    }

    proptest::proptest! {
        /// Monotone laws with steps and flat stretches: the same boundary as
        /// plain bisection, to its resolution.
        #[test]
        fn agrees_with_bisection(
            k in 1e-3f64..1e6, n in 0.3f64..4.0, step in 0.0f64..50.0,
            at in 0.0f64..1.0, flat in 0.0f64..0.3, target in -10.0f64..200.0,
        ) {
            let f = |x: f64| {
                let x_eff = if x < at { x } else if x < at + flat { at } else { x - flat };
                let jump = if x > at { step } else { 0.0 };
                k * x_eff.max(0.0).powf(n) + jump - target
            };
            let a = boundary(f, 0.0, 2.0);
            let b = bisection(f, 0.0, 2.0);
            proptest::prop_assert!((a - b).abs() <= 1e-12, "{a} vs {b}");
        }
    }

    #[test]
    fn clamps_to_the_bracket() {
        assert_eq!(boundary(|x| x - 5.0, 0.0, 1.0), 1.0);
        assert_eq!(boundary(|x| x + 5.0, 0.0, 1.0), 0.0);
        assert_eq!(boundary(|_| f64::NAN, 0.0, 1.0), 0.0);
    }
}
