//! Butcher tableau of the Dormand–Prince 5(4) pair (7 stages, first same as
//! last) and the coefficients of its order-4 continuous extension.
//!
//! Source: J. R. Dormand and P. J. Prince, "A family of embedded Runge–Kutta
//! formulae", J. Comput. Appl. Math. 6 (1980) 19–26, Table 2 (RK5(4)7M);
//! dense-output coefficients from E. Hairer, S. P. Nørsett and G. Wanner,
//! *Solving Ordinary Differential Equations I*, 2nd ed., Springer 1993,
//! section II.6 (the continuous extension used by their code DOPRI5).
//! The solution is advanced with the 5th-order weights `B` (local
//! extrapolation); `E = B − B*` gives the embedded 4th-order error estimate.

/// Nodes c₂…c₆ (c₇ = 1 is the FSAL stage).
pub(crate) const C2: f64 = 1.0 / 5.0;
pub(crate) const C3: f64 = 3.0 / 10.0;
pub(crate) const C4: f64 = 4.0 / 5.0;
pub(crate) const C5: f64 = 8.0 / 9.0;

pub(crate) const A21: f64 = 1.0 / 5.0;

pub(crate) const A31: f64 = 3.0 / 40.0;
pub(crate) const A32: f64 = 9.0 / 40.0;

pub(crate) const A41: f64 = 44.0 / 45.0;
pub(crate) const A42: f64 = -56.0 / 15.0;
pub(crate) const A43: f64 = 32.0 / 9.0;

pub(crate) const A51: f64 = 19_372.0 / 6_561.0;
pub(crate) const A52: f64 = -25_360.0 / 2_187.0;
pub(crate) const A53: f64 = 64_448.0 / 6_561.0;
pub(crate) const A54: f64 = -212.0 / 729.0;

pub(crate) const A61: f64 = 9_017.0 / 3_168.0;
pub(crate) const A62: f64 = -355.0 / 33.0;
pub(crate) const A63: f64 = 46_732.0 / 5_247.0;
pub(crate) const A64: f64 = 49.0 / 176.0;
pub(crate) const A65: f64 = -5_103.0 / 18_656.0;

/// 5th-order weights b₁…b₆ (b₂ = 0, b₇ = 0); also row 7 of A (FSAL).
pub(crate) const B1: f64 = 35.0 / 384.0;
pub(crate) const B3: f64 = 500.0 / 1_113.0;
pub(crate) const B4: f64 = 125.0 / 192.0;
pub(crate) const B5: f64 = -2_187.0 / 6_784.0;
pub(crate) const B6: f64 = 11.0 / 84.0;

/// Error weights e = b − b* (e₂ = 0).
pub(crate) const E1: f64 = 71.0 / 57_600.0;
pub(crate) const E3: f64 = -71.0 / 16_695.0;
pub(crate) const E4: f64 = 71.0 / 1_920.0;
pub(crate) const E5: f64 = -17_253.0 / 339_200.0;
pub(crate) const E6: f64 = 22.0 / 525.0;
pub(crate) const E7: f64 = -1.0 / 40.0;

/// Continuous-extension weights d₁…d₇ (d₂ = 0), Hairer–Nørsett–Wanner II.6.
pub(crate) const D1: f64 = -12_715_105_075.0 / 11_282_082_432.0;
pub(crate) const D3: f64 = 87_487_479_700.0 / 32_700_410_799.0;
pub(crate) const D4: f64 = -10_690_763_975.0 / 1_880_347_072.0;
pub(crate) const D5: f64 = 701_980_252_875.0 / 199_316_789_632.0;
pub(crate) const D6: f64 = -1_453_857_185.0 / 822_651_844.0;
pub(crate) const D7: f64 = 69_997_945.0 / 29_380_423.0;

#[cfg(test)]
mod tests {
    use super::*;

    /// Sums of rational coefficients evaluated in f64: a few ulp of rounding.
    const ROUNDING: f64 = 1e-14;

    #[test]
    fn rows_sum_to_their_nodes() {
        // Consistency condition Σⱼ aᵢⱼ = cᵢ (Hairer–Nørsett–Wanner I, II.1).
        assert!((A21 - C2).abs() < ROUNDING);
        assert!((A31 + A32 - C3).abs() < ROUNDING);
        assert!((A41 + A42 + A43 - C4).abs() < ROUNDING);
        assert!((A51 + A52 + A53 + A54 - C5).abs() < ROUNDING);
        assert!((A61 + A62 + A63 + A64 + A65 - 1.0).abs() < ROUNDING);
        assert!((B1 + B3 + B4 + B5 + B6 - 1.0).abs() < ROUNDING);
        // The error weights sum to zero (both weight sets sum to one).
        assert!((E1 + E3 + E4 + E5 + E6 + E7).abs() < ROUNDING);
    }

    #[test]
    fn fifth_order_weights_meet_the_quadrature_conditions() {
        // Σ bᵢ cᵢ^(q−1) = 1/q for q = 1..5 (order conditions of the bushy trees).
        let c = [0.0, C2, C3, C4, C5, 1.0];
        let b = [B1, 0.0, B3, B4, B5, B6];
        for q in 1..=5 {
            let s: f64 = b
                .iter()
                .zip(c.iter())
                .map(|(bi, ci)| bi * ci.powi(q - 1))
                .sum();
            assert!((s - 1.0 / f64::from(q)).abs() < ROUNDING, "q = {q}: {s}");
        }
    }
}
