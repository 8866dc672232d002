//! Measured force–deflection table with a monotone cubic interpolant whose
//! integral is exact.
//!
//! Interpolant: piecewise cubic Hermite (PCHIP) with the Fritsch–Carlson
//! monotonicity conditions, slopes chosen as in Fritsch & Butland (1984): at
//! an interior point the weighted harmonic mean of the neighbouring secants
//! (zero where the data turn), at the ends the three-point formula limited to
//! keep monotonicity (the same rule as `scipy.interpolate.PchipInterpolator`).
//! Monotone data give a monotone curve with no overshoot.
//!
//! Energy: each cubic Hermite piece is integrated analytically,
//! ∫_{x_i}^{x_i + τh} p = h·[y_i·I₀₀ + h·d_i·I₁₀ + y_{i+1}·I₀₁ + h·d_{i+1}·I₁₁]
//! with I₀₀ = τ⁴/2 − τ³ + τ, I₁₀ = τ⁴/4 − 2τ³/3 + τ²/2, I₀₁ = −τ⁴/2 + τ³,
//! I₁₁ = τ⁴/4 − τ³/3, so stored energy and the hysteresis loss (area between
//! loading and unloading curves) are exact for the interpolant.
//!
//! Beyond the table the curve is extended by straight lines with the end
//! slopes, but [`Spring::deflection_range`] is the span of the data (the
//! overlap of both curves when an unloading curve is given), so travel
//! outside the measurement is refused, not guessed.

// The interpolant indexes its own knot arrays: every curve is validated to
// hold at least two strictly ordered rows before an interpolant is built,
// and every index is a loop counter or `locate`'s clamped 0..n−1.
#![allow(clippy::indexing_slicing)]

use super::{Axis, ForceLaw, Spring, Travel};
use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};

/// One measured point.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct TablePoint {
    /// Deflection from free (m or rad).
    pub deflection: f64,
    /// Force (N) or torque (N·m).
    pub force: f64,
}

/// Inputs of a measured spring.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct TableSpec {
    /// Linear (N over m) or rotary (N·m over rad).
    #[serde(default = "default_axis")]
    pub axis: Axis,
    /// Loading curve, deflections strictly increasing, at least 2 points.
    pub loading: Vec<TablePoint>,
    /// Unloading curve (optional), deflections strictly increasing or
    /// strictly decreasing (the order a test machine records them).
    #[serde(default)]
    pub unloading: Option<Vec<TablePoint>>,
    /// Share of the spring's mass moving with the part (kg); default 0.
    #[serde(default)]
    pub effective_mass: Option<f64>,
}

fn default_axis() -> Axis {
    Axis::Linear
}

/// Monotone piecewise cubic Hermite interpolant with exact integral.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Pchip {
    x: Vec<f64>,
    y: Vec<f64>,
    d: Vec<f64>,
    /// ∫ from x₀ to x_i.
    cum: Vec<f64>,
}

fn same_sign(a: f64, b: f64) -> bool {
    (a > 0.0 && b > 0.0) || (a < 0.0 && b < 0.0)
}

impl Pchip {
    /// Build from strictly increasing `x` (≥ 2 points) and finite `y`; the
    /// caller validates.
    fn new(x: Vec<f64>, y: Vec<f64>) -> Self {
        let n = x.len();
        let h: Vec<f64> = x.windows(2).map(|w| w[1] - w[0]).collect();
        let del: Vec<f64> = y
            .windows(2)
            .zip(&h)
            .map(|(w, hk)| (w[1] - w[0]) / hk)
            .collect();
        let mut d = vec![0.0; n];
        if n == 2 {
            d[0] = del[0];
            d[1] = del[0];
        } else {
            for k in 1..n - 1 {
                if same_sign(del[k - 1], del[k]) {
                    let w1 = 2.0 * h[k] + h[k - 1];
                    let w2 = h[k] + 2.0 * h[k - 1];
                    d[k] = (w1 + w2) / (w1 / del[k - 1] + w2 / del[k]);
                }
            }
            d[0] = Self::end_slope(h[0], h[1], del[0], del[1]);
            d[n - 1] = Self::end_slope(h[n - 2], h[n - 3], del[n - 2], del[n - 3]);
        }
        let mut p = Self {
            x,
            y,
            d,
            cum: vec![0.0; n],
        };
        for i in 0..n - 1 {
            p.cum[i + 1] = p.cum[i] + p.piece_integral(i, 1.0);
        }
        p
    }

    /// Three-point end slope, limited (Fritsch–Carlson conditions).
    fn end_slope(h0: f64, h1: f64, m0: f64, m1: f64) -> f64 {
        let d = ((2.0 * h0 + h1) * m0 - h0 * m1) / (h0 + h1);
        if !same_sign(d, m0) {
            0.0
        } else if !same_sign(m0, m1) && d.abs() > 3.0 * m0.abs() {
            3.0 * m0
        } else {
            d
        }
    }

    /// ∫ of piece `i` from x_i to x_i + τ·h.
    fn piece_integral(&self, i: usize, tau: f64) -> f64 {
        let h = self.x[i + 1] - self.x[i];
        let t2 = tau * tau;
        let t3 = t2 * tau;
        let t4 = t3 * tau;
        let i00 = t4 / 2.0 - t3 + tau;
        let i10 = t4 / 4.0 - 2.0 * t3 / 3.0 + t2 / 2.0;
        let i01 = -t4 / 2.0 + t3;
        let i11 = t4 / 4.0 - t3 / 3.0;
        h * (self.y[i] * i00 + h * self.d[i] * i10 + self.y[i + 1] * i01 + h * self.d[i + 1] * i11)
    }

    fn piece_value(&self, i: usize, tau: f64) -> f64 {
        let h = self.x[i + 1] - self.x[i];
        let t2 = tau * tau;
        let t3 = t2 * tau;
        self.y[i] * (2.0 * t3 - 3.0 * t2 + 1.0)
            + h * self.d[i] * (t3 - 2.0 * t2 + tau)
            + self.y[i + 1] * (-2.0 * t3 + 3.0 * t2)
            + h * self.d[i + 1] * (t3 - t2)
    }

    fn locate(&self, q: f64) -> (usize, f64) {
        let n = self.x.len();
        let i = self.x.partition_point(|&xi| xi <= q).clamp(1, n - 1) - 1;
        (i, (q - self.x[i]) / (self.x[i + 1] - self.x[i]))
    }

    /// Interpolated value, straight-line extension outside the data.
    pub fn value(&self, q: f64) -> f64 {
        let n = self.x.len();
        if q < self.x[0] {
            self.y[0] + self.d[0] * (q - self.x[0])
        } else if q > self.x[n - 1] {
            self.y[n - 1] + self.d[n - 1] * (q - self.x[n - 1])
        } else {
            let (i, tau) = self.locate(q);
            self.piece_value(i, tau)
        }
    }

    /// Slope of the interpolant.
    pub fn slope(&self, q: f64) -> f64 {
        let n = self.x.len();
        if q <= self.x[0] {
            return self.d[0];
        }
        if q >= self.x[n - 1] {
            return self.d[n - 1];
        }
        let (i, t) = self.locate(q);
        let h = self.x[i + 1] - self.x[i];
        (self.y[i] * (6.0 * t * t - 6.0 * t)
            + h * self.d[i] * (3.0 * t * t - 4.0 * t + 1.0)
            + self.y[i + 1] * (-6.0 * t * t + 6.0 * t)
            + h * self.d[i + 1] * (3.0 * t * t - 2.0 * t))
            / h
    }

    /// ∫ from x₀ to q, exact (straight-line extension outside the data).
    pub fn integral(&self, q: f64) -> f64 {
        let n = self.x.len();
        if q < self.x[0] {
            let u = q - self.x[0];
            self.y[0] * u + 0.5 * self.d[0] * u * u
        } else if q > self.x[n - 1] {
            let u = q - self.x[n - 1];
            self.cum[n - 1] + self.y[n - 1] * u + 0.5 * self.d[n - 1] * u * u
        } else {
            let (i, tau) = self.locate(q);
            self.cum[i] + self.piece_integral(i, tau)
        }
    }

    /// Whether every value, slope and integral of the interpolant can be
    /// evaluated without overflow: the slopes, the cumulative integrals and
    /// the largest terms of the cubic pieces (|y| and h·|d|, times h for the
    /// integral, divided by h for the slope) are finite.
    fn bounded(&self) -> bool {
        let h: Vec<f64> = self.x.windows(2).map(|w| w[1] - w[0]).collect();
        let hmax = h.iter().fold(0.0f64, |a, b| a.max(b.abs()));
        let hmin = h.iter().fold(f64::INFINITY, |a, b| a.min(b.abs()));
        let ymax = self.y.iter().fold(0.0f64, |a, b| a.max(b.abs()));
        let hdmax = h.iter().zip(self.d.windows(2)).fold(0.0f64, |a, (hk, dk)| {
            a.max(hk.abs() * dk.iter().fold(0.0f64, |m, x| m.max(x.abs())))
        });
        let term = 4.0 * (ymax + hdmax);
        self.d.iter().chain(&self.cum).all(|v| v.is_finite())
            && (term * hmax.max(1.0)).is_finite()
            && (2.0 * term / hmin).is_finite()
    }

    /// First and last abscissa.
    pub fn span(&self) -> (f64, f64) {
        (self.x[0], self.x[self.x.len() - 1])
    }
}

/// A validated measured spring.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TableSpring {
    spec: TableSpec,
    loading: Pchip,
    unloading: Option<Pchip>,
    range: (f64, f64),
    notes: Vec<String>,
}

/// The interpolant of a validated curve, refused when its values are so
/// large, or its rows so close, that evaluating it would overflow.
fn interpolant(name: &str, x: Vec<f64>, y: Vec<f64>) -> Result<Pchip, InputError> {
    let p = Pchip::new(x, y);
    if p.bounded() {
        Ok(p)
    } else {
        Err(InputError::invalid(
            name,
            "the measured values are too large, or the rows too close together, to interpolate: \
             check the numbers and their units",
        ))
    }
}

fn validate_curve(
    name: &str,
    pts: &[TablePoint],
    allow_decreasing: bool,
) -> Result<(Vec<f64>, Vec<f64>), InputError> {
    if pts.len() < 2 {
        return Err(InputError::invalid(
            name,
            "at least two measured points are needed",
        ));
    }
    for (i, p) in pts.iter().enumerate() {
        check::finite(&format!("{name}.{i}.deflection"), p.deflection)?;
        check::finite(&format!("{name}.{i}.force"), p.force)?;
    }
    let decreasing = allow_decreasing && pts[1].deflection < pts[0].deflection;
    for i in 1..pts.len() {
        let ok = if decreasing {
            pts[i].deflection < pts[i - 1].deflection
        } else {
            pts[i].deflection > pts[i - 1].deflection
        };
        if !ok {
            let order = if decreasing { "decrease" } else { "increase" };
            return Err(InputError::invalid(
                format!("{name}.{i}.deflection"),
                format!(
                    "deflections must {order} strictly: row {i} ({}) does not follow row {} ({})",
                    pts[i].deflection,
                    i - 1,
                    pts[i - 1].deflection
                ),
            ));
        }
    }
    let mut pts = pts.to_vec();
    if decreasing {
        pts.reverse();
    }
    Ok((
        pts.iter().map(|p| p.deflection).collect(),
        pts.iter().map(|p| p.force).collect(),
    ))
}

impl TableSpring {
    /// Validate the table and build the interpolants.
    ///
    /// # Errors
    /// Fewer than two points; a non-finite value; deflections not strictly
    /// monotone (the error names the row); loading and unloading curves that
    /// do not overlap; a negative effective mass.
    pub fn new(spec: TableSpec) -> Result<Self, InputError> {
        let (x, y) = validate_curve("loading", &spec.loading, false)?;
        let loading = interpolant("loading", x, y)?;
        let mut range = loading.span();
        let mut notes = Vec::new();
        let unloading = match &spec.unloading {
            None => None,
            Some(pts) => {
                let (x, y) = validate_curve("unloading", pts, true)?;
                let u = interpolant("unloading", x, y)?;
                let (a, b) = u.span();
                range = (range.0.max(a), range.1.min(b));
                if range.0 >= range.1 {
                    return Err(InputError::invalid(
                        "unloading",
                        "the unloading curve must overlap the loading curve's deflections",
                    ));
                }
                let above: Vec<usize> = pts
                    .iter()
                    .enumerate()
                    .filter(|(_, p)| {
                        p.deflection >= range.0
                            && p.deflection <= range.1
                            && p.force > loading.value(p.deflection) * (1.0 + 1e-9)
                    })
                    .map(|(i, _)| i)
                    .collect();
                if !above.is_empty() {
                    notes.push(format!(
                        "unloading rows {above:?} lie above the loading curve: a passive spring \
                         cannot give back more than it took; check the measurement"
                    ));
                }
                Some(u)
            }
        };
        if let Some(m) = spec.effective_mass {
            check::non_negative("effective_mass", m)?;
        }
        if range.0 > 0.0 {
            notes.push(
                "the table starts above zero deflection: energy from the free state cannot be given"
                    .into(),
            );
        }
        Ok(Self {
            spec,
            loading,
            unloading,
            range,
            notes,
        })
    }

    /// The inputs as entered.
    pub fn spec(&self) -> &TableSpec {
        &self.spec
    }

    fn curve(&self, travel: Travel) -> &Pchip {
        match (travel, &self.unloading) {
            (Travel::Unloading, Some(u)) => u,
            _ => &self.loading,
        }
    }

    /// Energy lost in a cycle q₁ → q₂ → q₁: the area between the curves (J).
    pub fn hysteresis_loss(&self, q1: f64, q2: f64) -> f64 {
        (self.work(q1, q2, Travel::Loading) - self.work(q1, q2, Travel::Unloading)).abs()
    }
}

impl Spring for TableSpring {
    fn axis(&self) -> Axis {
        self.spec.axis
    }

    /// PCHIP value of the loading or unloading curve (N or N·m).
    fn force(&self, q: f64, travel: Travel) -> f64 {
        self.curve(travel).value(q)
    }

    /// Exact integral of the interpolant (J).
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64 {
        let c = self.curve(travel);
        c.integral(q2) - c.integral(q1)
    }

    fn deflection_range(&self) -> (f64, f64) {
        self.range
    }

    fn effective_mass(&self) -> f64 {
        self.spec.effective_mass.unwrap_or(0.0)
    }

    fn rate(&self, q: f64) -> f64 {
        self.loading.slope(q)
    }

    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: "measured force–deflection table".into(),
            formula: "monotone piecewise cubic Hermite interpolant (PCHIP); W = exact integral of the cubic pieces"
                .into(),
            source: "Fritsch & Carlson (1980); Fritsch & Butland (1984) slopes".into(),
            status: SourceStatus::CommonPractice,
        }
    }

    fn notes(&self) -> Vec<String> {
        self.notes.clone()
    }
}

#[cfg(test)]
mod tests {
    use super::super::testkit;
    use super::super::testkit::REL_FEW_OPS;
    use super::*;
    use proptest::prelude::*;

    fn pts(v: &[(f64, f64)]) -> Vec<TablePoint> {
        v.iter()
            .map(|&(deflection, force)| TablePoint { deflection, force })
            .collect()
    }

    #[test]
    fn linear_data_give_the_linear_spring() {
        // Points on F = 2000·q: PCHIP reproduces a line exactly, energy ½·k·q².
        let s = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[(0.0, 0.0), (0.01, 20.0), (0.025, 50.0), (0.04, 80.0)]),
            unloading: None,
            effective_mass: None,
        })
        .unwrap();
        assert!((s.force(0.017, Travel::Loading) - 34.0).abs() < REL_FEW_OPS * 34.0);
        assert!((s.work(0.0, 0.04, Travel::Loading) - 1.6).abs() < REL_FEW_OPS * 1.6);
    }

    #[test]
    fn hysteresis_loss_is_the_area_between_straight_curves() {
        // Loading F = 3000·q, unloading F = 2000·q (entered in decreasing order):
        // loss over 0..0.03 m = ½·1000·0.03² = 0.45 J.
        let s = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[(0.0, 0.0), (0.01, 30.0), (0.03, 90.0)]),
            unloading: Some(pts(&[(0.03, 60.0), (0.02, 40.0), (0.0, 0.0)])),
            effective_mass: None,
        })
        .unwrap();
        assert!((s.hysteresis_loss(0.0, 0.03) - 0.45).abs() < REL_FEW_OPS);
        assert!(s.notes().is_empty());
    }

    #[test]
    fn errors_name_the_row() {
        let e = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[(0.0, 0.0), (0.01, 30.0), (0.01, 40.0)]),
            unloading: None,
            effective_mass: None,
        })
        .unwrap_err();
        assert_eq!(e.field, "loading.2.deflection");
        let e = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[(0.0, 0.0), (0.01, 30.0), (0.02, 40.0)]),
            unloading: Some(pts(&[(0.02, 30.0), (0.015, 20.0), (0.018, 10.0)])),
            effective_mass: None,
        })
        .unwrap_err();
        assert_eq!(e.field, "unloading.2.deflection");
        assert!(TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[(0.0, 0.0)]),
            unloading: None,
            effective_mass: None,
        })
        .is_err());
    }

    #[test]
    fn monotone_data_give_no_overshoot() {
        // A knee in the data (elastomer-like): the interpolant stays within
        // each interval's data (Fritsch–Carlson property).
        let s = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[
                (0.0, 0.0),
                (0.01, 10.0),
                (0.02, 12.0),
                (0.03, 100.0),
                (0.04, 400.0),
            ]),
            unloading: None,
            effective_mass: None,
        })
        .unwrap();
        let mut last = -1.0;
        for i in 0..=400 {
            let q = 0.04 * f64::from(i) / 400.0;
            let f = s.force(q, Travel::Loading);
            assert!(f >= last, "not monotone at {q}");
            last = f;
        }
        assert!(s.check_deflection("q", 0.041).is_err());
    }

    #[test]
    fn matches_scipy_pchip() {
        // Reference library: scipy.interpolate.PchipInterpolator (scipy 1.17.1,
        // run by hand on the knee data below); values and integrals printed with
        // repr, so only double rounding separates them.
        const REL_REFERENCE_LIBRARY: f64 = 1e-12;
        let s = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[
                (0.0, 0.0),
                (0.01, 10.0),
                (0.02, 12.0),
                (0.03, 100.0),
                (0.04, 400.0),
            ]),
            unloading: None,
            effective_mass: None,
        })
        .unwrap();
        let close = |a: f64, b: f64| (a / b - 1.0).abs() < REL_REFERENCE_LIBRARY;
        for (q, f) in [
            (0.005, 6.333333333333334),
            (0.015, 10.927777777777777),
            (0.025, 39.478579610538404),
            (0.0355, 232.3144355670102),
        ] {
            assert!(close(s.force(q, Travel::Loading), f), "F({q})");
        }
        assert!(close(
            s.work(0.0, 0.04, Travel::Loading),
            2.8933333333333344
        ));
        assert!(close(
            s.work(0.005, 0.0355, Travel::Loading),
            1.4673380526560704
        ));
        // End and interior slopes: 1400, 333.33, 391.11, 13608.25, 40600 N/m.
        assert!(close(s.rate(0.0), 1400.0));
        assert!(close(s.rate(0.04), 40600.0));
        assert!(close(s.rate(0.03), 13608.24742268041));
    }

    #[test]
    fn unloading_above_loading_is_noted() {
        let s = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: pts(&[(0.0, 0.0), (0.03, 90.0)]),
            unloading: Some(pts(&[(0.0, 0.0), (0.015, 60.0), (0.03, 90.0)])),
            effective_mass: None,
        })
        .unwrap();
        assert!(s.notes().iter().any(|n| n.contains("above the loading")));
    }

    proptest! {
        #[test]
        fn work_is_the_integral_of_force(steps in proptest::collection::vec((1e-4..0.01f64, 0.0..500.0f64), 2..12), a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let mut q = 0.0;
            let mut f = 0.0;
            let mut load = vec![TablePoint { deflection: 0.0, force: 0.0 }];
            for (dq, df) in &steps { q += dq; f += df; load.push(TablePoint { deflection: q, force: f }); }
            let unload: Vec<TablePoint> = load.iter().map(|p| TablePoint { deflection: p.deflection, force: 0.7 * p.force }).collect();
            let s = TableSpring::new(TableSpec { axis: Axis::Linear, loading: load, unloading: Some(unload), effective_mass: None }).unwrap();
            let hi = s.deflection_range().1;
            for t in [Travel::Loading, Travel::Unloading] {
                testkit::check_work_is_integral(&s, a * hi, b * hi, t);
                testkit::check_work_algebra(&s, a * hi, b * hi, 0.5 * hi, t);
                testkit::check_energy_monotone(&s, t);
            }
            // Scaled data scale the interpolant: loss = 0.3 × loading energy.
            let wl = s.work(0.0, hi, Travel::Loading);
            prop_assert!((s.hysteresis_loss(0.0, hi) - 0.3 * wl).abs() <= REL_FEW_OPS * wl.max(1e-300));
        }
    }
}

/// Inputs each valid but of extreme size (found by the property tests in
/// `tests/properties.rs`).
#[cfg(test)]
mod extreme_inputs {
    use super::*;

    fn pt(deflection: f64, force: f64) -> TablePoint {
        TablePoint { deflection, force }
    }

    /// A row with a force of 1.8e308 N: the Hermite terms overflowed and
    /// the force between rows came out NaN. Such a table is now refused
    /// naming the curve; ordinary large values still interpolate.
    #[test]
    fn values_that_overflow_the_interpolant_are_refused() {
        let e = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: vec![pt(0.0012, 1.0), pt(1.0, f64::MAX)],
            unloading: None,
            effective_mass: None,
        })
        .unwrap_err();
        assert_eq!(e.field, "loading", "{e}");
        let big = TableSpring::new(TableSpec {
            axis: Axis::Linear,
            loading: vec![pt(0.0, 0.0), pt(0.5, 1e12), pt(1.0, 3e12)],
            unloading: None,
            effective_mass: None,
        })
        .unwrap();
        assert!(big.force(0.7, Travel::Loading).is_finite());
    }
}
