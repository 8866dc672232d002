//! Sample statistics of the Monte Carlo: quantiles, mean and spread,
//! histogram, and the confidence interval of an exceedance probability.
//!
//! Quantile: R. J. Hyndman and Y. Fan, "Sample quantiles in statistical
//! packages", The American Statistician 50(4), 361–365, 1996, Definition 7
//! (numpy's default `method="linear"`, R's default `type = 7`): on the sorted
//! sample x₀ ≤ … ≤ x_{n−1}, h = (n − 1)·p, j = ⌊h⌋, g = h − j,
//! Q(p) = x_j + g·(x_{j+1} − x_j). The interpolation is evaluated as numpy
//! 2.x `_lerp` does (from x_{j+1} downwards when g ≥ ½), so an outside check
//! with `numpy.quantile` agrees to the last bit.
//!
//! Exceedance interval: E. B. Wilson, "Probable inference, the law of
//! succession, and statistical inference", J. Amer. Statist. Assoc. 22,
//! 209–212, 1927; the score interval for k successes in n trials with
//! p̂ = k/n and z = Φ⁻¹(0.975):
//! centre = (p̂ + z²/2n)/(1 + z²/n),
//! half-width = z·√(p̂(1 − p̂)/n + z²/4n²)/(1 + z²/n).
//! It stays inside [0, 1] and behaves at k = 0 and k = n, where the normal
//! approximation collapses to a zero-width interval (A. Agresti and B. A.
//! Coull, "Approximate is better than 'exact' for interval estimation of
//! binomial proportions", The American Statistician 52(2), 119–126, 1998).

use serde::{Deserialize, Serialize};

/// z = Φ⁻¹(0.975) = 1.959 963 984 540 054 for a two-sided 95 % interval
/// (scipy 1.17 `scipy.stats.norm.ppf(0.975)`; NIST/SEMATECH e-Handbook of
/// Statistical Methods §1.3.6.7.1 tabulates 1.96).
pub const Z_95: f64 = 1.959_963_984_540_054;

/// Hyndman–Fan type-7 quantile of an ascending, finite sample; `None` when
/// the sample is empty or `p` is not in [0, 1].
///
/// The caller sorts (`sort_unstable_by(f64::total_cmp)`); the function does
/// not check the order.
pub fn quantile_sorted(sorted: &[f64], p: f64) -> Option<f64> {
    if sorted.is_empty() || !(0.0..=1.0).contains(&p) {
        return None;
    }
    let last = sorted.len() - 1;
    let h = last as f64 * p;
    let j = h.floor();
    let g = h - j;
    // j ≤ last because p ≤ 1; the cast is exact for any realistic length.
    let j = (j as usize).min(last);
    let a = *sorted.get(j)?;
    let b = *sorted.get((j + 1).min(last))?;
    let d = b - a;
    if !d.is_finite() {
        // Neighbours of opposite sign near ±f64::MAX: their difference would
        // overflow, the weighted mean cannot.
        return Some(a * (1.0 - g) + b * g);
    }
    Some(if g >= 0.5 {
        b - d * (1.0 - g)
    } else {
        a + d * g
    })
}

/// A two-sided confidence interval on a probability.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Interval {
    /// Lower bound, in [0, 1].
    pub low: f64,
    /// Upper bound, in [0, 1].
    pub high: f64,
}

/// Wilson score interval at 95 % for `k` successes in `n` trials (formula in
/// the module doc); `None` when `n = 0` or `k > n`.
pub fn wilson_95(k: usize, n: usize) -> Option<Interval> {
    wilson(k, n, Z_95)
}

/// Wilson score interval for `k` of `n` with the normal quantile `z` (> 0).
pub fn wilson(k: usize, n: usize, z: f64) -> Option<Interval> {
    if n == 0 || k > n || !(z.is_finite() && z > 0.0) {
        return None;
    }
    let nf = n as f64;
    let p = k as f64 / nf;
    let z2 = z * z;
    let denom = 1.0 + z2 / nf;
    let centre = (p + z2 / (2.0 * nf)) / denom;
    let half = z * (p * (1.0 - p) / nf + z2 / (4.0 * nf * nf)).max(0.0).sqrt() / denom;
    let mut low = (centre - half).clamp(0.0, 1.0);
    let mut high = (centre + half).clamp(0.0, 1.0);
    // At k = 0 (k = n) the exact bound is 0 (1); rounding may leave 1e-17.
    if k == 0 {
        low = 0.0;
    }
    if k == n {
        high = 1.0;
    }
    Some(Interval { low, high })
}

/// Counts of a figure's values in equal-width bins.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Histogram {
    /// Index of the figure in the model's output.
    pub figure: usize,
    /// Left edge of the first bin (the smallest value), SI.
    pub low: f64,
    /// Right edge of the last bin (the largest value), SI.
    pub high: f64,
    /// Count per bin; bin i covers [low + i·w, low + (i+1)·w) with
    /// w = (high − low)/bins, the last bin closed on the right. When every
    /// value is the same (w = 0) all counts are in the first bin.
    pub counts: Vec<usize>,
}

impl Histogram {
    /// Histogram of `values` (finite) over their own min..max in `bins` bins
    /// (≥ 1). `None` when `values` is empty or `bins` is 0.
    pub fn of(figure: usize, values: &[f64], bins: usize) -> Option<Self> {
        if bins == 0 {
            return None;
        }
        let low = values.iter().copied().reduce(f64::min)?;
        let high = values.iter().copied().reduce(f64::max)?;
        let mut counts = vec![0usize; bins];
        // Halved so that high − low cannot overflow near ±f64::MAX.
        let half_width = 0.5 * high - 0.5 * low;
        for &x in values {
            let i = if half_width > 0.0 {
                let pos = (0.5 * x - 0.5 * low) / half_width * bins as f64;
                // pos ≥ 0; the float→usize cast saturates, `min` closes the last bin.
                (pos as usize).min(bins - 1)
            } else {
                0
            };
            if let Some(c) = counts.get_mut(i) {
                *c += 1;
            }
        }
        Some(Self {
            figure,
            low,
            high,
            counts,
        })
    }
}

/// Summary of one figure's finite sample values.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Summary {
    /// Smallest value (SI).
    pub min: f64,
    /// 1st percentile, Hyndman–Fan type 7 (SI).
    pub p01: f64,
    /// 5th percentile (SI).
    pub p05: f64,
    /// Median (SI).
    pub p50: f64,
    /// 95th percentile (SI).
    pub p95: f64,
    /// 99th percentile (SI).
    pub p99: f64,
    /// Largest value (SI).
    pub max: f64,
    /// Arithmetic mean (SI).
    pub mean: f64,
    /// Sample standard deviation with the n − 1 divisor (SI); `None` for a
    /// single value.
    pub std_dev: Option<f64>,
}

impl Summary {
    /// Summary of `values` in sample order; sorts them in place (the order is
    /// lost). `None` when empty. Values must be finite.
    ///
    /// Mean: Σ(xᵢ/n) with Neumaier's compensated summation (A. Neumaier,
    /// ZAMM 54, 39–51, 1974), in sample order, so it cannot overflow and is
    /// the same however the run was sliced. Spread: two-pass, scaled by the
    /// largest magnitude so squares cannot overflow.
    pub fn of(values: &mut [f64]) -> Option<Self> {
        let n = values.len();
        if n == 0 {
            return None;
        }
        let nf = n as f64;
        let mean = neumaier_sum(values.iter().map(|&x| x / nf));
        let scale = values.iter().fold(0.0_f64, |m, &x| m.max(x.abs()));
        let std_dev = if n < 2 {
            None
        } else if scale > 0.0 {
            let ss = neumaier_sum(values.iter().map(|&x| {
                let d = (x - mean) / scale;
                d * d
            }));
            Some(scale * (ss / (nf - 1.0)).sqrt())
        } else {
            Some(0.0)
        };
        values.sort_unstable_by(f64::total_cmp);
        let q = |p: f64| quantile_sorted(values, p);
        Some(Self {
            min: *values.first()?,
            p01: q(0.01)?,
            p05: q(0.05)?,
            p50: q(0.50)?,
            p95: q(0.95)?,
            p99: q(0.99)?,
            max: *values.last()?,
            // Rounding can put the mean a hair outside [min, max] only when
            // all values are equal; keep it inside.
            mean: mean.clamp(*values.first()?, *values.last()?),
            std_dev,
        })
    }
}

/// Neumaier's improved Kahan summation.
fn neumaier_sum(terms: impl Iterator<Item = f64>) -> f64 {
    let mut sum = 0.0_f64;
    let mut c = 0.0_f64;
    for x in terms {
        let t = sum + x;
        if sum.abs() >= x.abs() {
            c += (sum - t) + x;
        } else {
            c += (x - t) + sum;
        }
        sum = t;
    }
    sum + c
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Wilson bounds are printed by statsmodels to ~16 digits; we compare to
    /// 1e-12 relative, far tighter than the 4th digit anyone reads.
    const REL_REFERENCE_LIBRARY: f64 = 1e-12;

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * b.abs().max(1e-300)
    }

    /// numpy 2.4.6 `numpy.quantile(x, p)` (default method "linear",
    /// Hyndman–Fan 7), x = [3.1, -2.0, 7.25, 0.5, 11.0, 4.4, -0.75], values
    /// printed with `repr`: bit-identical agreement is expected.
    #[test]
    fn type7_quantile_matches_numpy_bit_for_bit() {
        let mut x = [3.1, -2.0, 7.25, 0.5, 11.0, 4.4, -0.75];
        x.sort_unstable_by(f64::total_cmp);
        let cases = [
            (0.0, -2.0),
            (0.01, -1.925),
            (0.05, -1.625),
            (0.25, -0.125),
            (0.5, 3.1),
            (0.95, 9.874999999999996),
            (0.99, 10.774999999999999),
            (1.0, 11.0),
        ];
        for (p, want) in cases {
            assert_eq!(quantile_sorted(&x, p), Some(want), "p = {p}");
        }
        assert_eq!(quantile_sorted(&x, 1.5), None);
        assert_eq!(quantile_sorted(&[], 0.5), None);
        assert_eq!(quantile_sorted(&[4.0], 0.95), Some(4.0));
    }

    /// Printed normal quantile, 4 significant figures: z(0.975) = 1.960
    /// (NIST/SEMATECH e-Handbook of Statistical Methods §1.3.6.7.1, normal
    /// table; `from memory`). Our constant carries the full value of scipy
    /// 1.17 `norm.ppf(0.975)`.
    #[test]
    fn z_95_agrees_with_the_printed_normal_table() {
        use crate::test_tol::REL_PRINTED_4SF;
        assert!(close(Z_95, 1.960, REL_PRINTED_4SF));
    }

    /// statsmodels 0.15.0
    /// `statsmodels.stats.proportion.proportion_confint(k, n, alpha=0.05,
    /// method="wilson")`.
    #[test]
    fn wilson_matches_statsmodels() {
        let cases = [
            (81, 263, 0.2552885198782742, 0.36620957698280004),
            (15, 148, 0.06238639953073628, 0.16048724172330803),
            (0, 20, 0.0, 0.1611251580528194),
            (1, 29, 0.006113214292762667, 0.17175521879320294),
            (200, 10_000, 0.01743471167513658, 0.022933926760712948),
        ];
        for (k, n, lo, hi) in cases {
            let i = wilson_95(k, n).unwrap();
            assert!(
                close(i.low, lo, REL_REFERENCE_LIBRARY) || (lo == 0.0 && i.low == 0.0),
                "{k}/{n}: {i:?}"
            );
            assert!(close(i.high, hi, REL_REFERENCE_LIBRARY), "{k}/{n}: {i:?}");
        }
        assert_eq!(wilson_95(3, 0), None);
        assert_eq!(wilson_95(5, 4), None);
        assert_eq!(wilson_95(7, 7).unwrap().high, 1.0);
    }

    #[test]
    fn histogram_counts_every_value_and_closes_the_last_bin() {
        let h = Histogram::of(0, &[0.0, 0.1, 0.5, 0.99, 1.0], 4).unwrap();
        assert_eq!(h.counts, vec![2, 0, 1, 2]);
        let flat = Histogram::of(2, &[3.0; 5], 10).unwrap();
        assert_eq!(flat.counts[0], 5);
        assert_eq!(Histogram::of(0, &[], 4), None);
        assert_eq!(Histogram::of(0, &[1.0], 0), None);
    }

    #[test]
    fn quantile_and_histogram_of_values_near_the_float_limits_stay_finite() {
        let v = [-1.7e308, 1.7e308];
        let q = quantile_sorted(&v, 0.5).unwrap();
        assert!(q.is_finite() && q.abs() < 1e300);
        assert_eq!(Histogram::of(0, &v, 2).unwrap().counts, vec![1, 1]);
    }

    #[test]
    fn summary_of_huge_values_does_not_overflow() {
        let mut v = [1e308, 1.5e308, 1.7e308];
        let s = Summary::of(&mut v).unwrap();
        assert!(s.mean.is_finite() && s.std_dev.unwrap().is_finite());
        assert!(s.mean > 1.39e308 && s.mean < 1.41e308);
    }
}
