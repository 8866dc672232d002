//! Formatting SI values back in a working unit of SI or US customary.
//!
//! Model: the value shown is `si / unit.factor`, rounded to a number of
//! significant figures (4 by default, [`DEFAULT_SIG`]) by the standard
//! library's correctly rounded decimal conversion. Fixed notation is used for
//! ordinary magnitudes, 10⁻⁴ ≤ |x| < 10⁹; exponent notation (`1.2e-5`) only
//! outside. Trailing zeros after the decimal point are dropped (`12.5`, not
//! `12.50`), so a printed value pasted back into a field reads the same.
//! NaN and ±∞ are never printed: they show as `—`. Negative zero shows as `0`.
//!
//! Working units per system ([`display_unit`]) are chosen for the sizes met in
//! spring and buffer work: SI mm, N, kg, J, N/mm, N·m/rad, m/s, m/s², MPa, °,
//! N·m, kg·m², s, Hz, W; US in, lbf, lb, ft·lbf, lbf/in, lbf·in/rad, ft/s,
//! ft/s², psi, °, lbf·in, lb·in², s, Hz, W. In US units energy is shown in
//! ft·lbf and torque in lbf·in, so the two kinds that share a dimension never
//! share a display unit (as J and N·m keep them apart in SI); ft·lbf is also
//! the unit in which US practice states impact energy.

use super::table::{find_any, find_in, units_of, Unit};
use super::{Dim, UnitSystem};
use std::fmt;

/// Significant figures used by [`format_quantity`] and [`format_in`]: enough
/// to compare with a 3-figure limit, few enough not to suggest precision the
/// inputs rarely have.
pub const DEFAULT_SIG: usize = 4;

/// Smallest magnitude shown in fixed notation (exponent below it).
const FIXED_MIN_EXP: i32 = -4;
/// Magnitudes of 10^this and above use exponent notation.
const FIXED_MAX_EXP: i32 = 9;

/// Shown in place of a value that is not a finite number.
pub const NOT_A_NUMBER: &str = "—";

/// A formatted quantity: the number as text and its unit symbol.
/// `Display` joins them: `12.5 mm`, `90°`, `0.8` (plain number).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Formatted {
    /// The number, e.g. `12.5`, `-0.0012`, `1.2e-5`, or `—`.
    pub number: String,
    /// The unit symbol, e.g. `mm`; empty for a plain number.
    pub unit: &'static str,
}

impl fmt::Display for Formatted {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.unit {
            "" => f.write_str(&self.number),
            // The degree sign follows the number without a space (SI Brochure,
            // 9th ed., §5.4.3).
            "°" => write!(f, "{}°", self.number),
            unit => write!(f, "{} {unit}", self.number),
        }
    }
}

/// The working unit for kind `dim` in `system` (see the module doc for the
/// choice). Every kind has one in both systems.
pub fn display_unit(dim: Dim, system: UnitSystem) -> &'static Unit {
    let symbol = match system {
        UnitSystem::Si => match dim {
            Dim::Ratio => "",
            Dim::Length => "mm",
            Dim::Area => "mm²",
            Dim::Force => "N",
            Dim::Mass => "kg",
            Dim::Energy => "J",
            Dim::LinearRate => "N/mm",
            Dim::TorsionalRate => "N·m/rad",
            Dim::Speed => "m/s",
            Dim::AngularSpeed => "rad/s",
            Dim::Acceleration => "m/s²",
            Dim::Pressure => "MPa",
            Dim::Angle => "°",
            Dim::Torque => "N·m",
            Dim::Inertia => "kg·m²",
            Dim::Time => "s",
            Dim::Frequency => "Hz",
            Dim::Power => "W",
            Dim::LinearDamping => "N·s/m",
            Dim::QuadraticDamping => "N·s²/m²",
            Dim::Density => "kg/m³",
            Dim::Probability => "%",
        },
        UnitSystem::Us => match dim {
            Dim::Ratio => "",
            Dim::Length => "in",
            Dim::Area => "in²",
            Dim::Force => "lbf",
            Dim::Mass => "lb",
            Dim::Energy => "ft·lbf",
            Dim::LinearRate => "lbf/in",
            Dim::TorsionalRate => "lbf·in/rad",
            Dim::Speed => "ft/s",
            Dim::AngularSpeed => "rad/s",
            Dim::Acceleration => "ft/s²",
            Dim::Pressure => "psi",
            Dim::Angle => "°",
            Dim::Torque => "lbf·in",
            Dim::Inertia => "lb·in²",
            Dim::Time => "s",
            Dim::Frequency => "Hz",
            Dim::Power => "W",
            Dim::LinearDamping => "lbf·s/in",
            Dim::QuadraticDamping => "lbf·s²/in²",
            Dim::Density => "lb/in³",
            Dim::Probability => "%",
        },
    };
    // The symbols above are all in the table (checked by a test); should one
    // ever be missing, the kind's SI unit still gives a correct figure.
    find_in(dim, symbol)
        .or_else(|| units_of(dim).next())
        .unwrap_or(&FALLBACK)
}

/// Only reachable if the table lost a whole kind (a test forbids it): shows
/// the SI value with its SI meaning spelled out rather than a wrong unit.
static FALLBACK: Unit = Unit {
    symbol: "(SI)",
    ascii: "(SI)",
    name: "SI unit",
    dim: Dim::Ratio,
    factor: 1.0,
    system: super::table::UnitFamily::Both,
    aliases: &[],
    source: "SI",
    pint: "dimensionless",
};

/// Format an SI value of kind `dim` in the working unit of `system`, to
/// [`DEFAULT_SIG`] significant figures: `format_quantity(0.0125, Length, Si)`
/// shows `12.5 mm`.
pub fn format_quantity(si: f64, dim: Dim, system: UnitSystem) -> Formatted {
    format_in(si, display_unit(dim, system))
}

/// Format an SI value in a given unit (`si / unit.factor`), to
/// [`DEFAULT_SIG`] significant figures.
pub fn format_in(si: f64, unit: &Unit) -> Formatted {
    Formatted {
        number: format_sig(unit.from_si(si), DEFAULT_SIG),
        unit: unit.symbol,
    }
}

/// The value of an SI quantity in the unit spelled `unit_symbol`
/// (`si / factor`), or `None` if no unit is spelled so, or if the spelling
/// names units of different factors in different kinds (`g`: gram or g_n).
/// A spelling shared with the same factor (`N·m`, energy or torque) converts.
pub fn convert_to(si: f64, unit_symbol: &str) -> Option<f64> {
    let mut units = find_any(unit_symbol);
    let first = units.next()?;
    if units.all(|u| u.factor == first.factor) {
        Some(first.from_si(si))
    } else {
        None
    }
}

/// `x` rounded to `sig` significant figures (clamped to 1..=17) as text:
/// fixed notation for 10⁻⁴ ≤ |x| < 10⁹, else `1.23e-5` / `4.5e12`; trailing
/// zeros after the point dropped; `0` for ±0; `—` for NaN and ±∞.
///
/// Rounding is the standard library's correctly rounded conversion of the
/// binary value (`{:.*e}`), done once; fixed notation is built from those
/// digits, so no second rounding can occur.
pub fn format_sig(x: f64, sig: usize) -> String {
    if !x.is_finite() {
        return NOT_A_NUMBER.to_string();
    }
    if x == 0.0 {
        return "0".to_string();
    }
    let sig = sig.clamp(1, 17);
    let sci = format!("{:.*e}", sig - 1, x.abs());
    let Some((mantissa, exp)) = sci.split_once('e') else {
        return sci;
    };
    let Ok(exp) = exp.parse::<i32>() else {
        return sci;
    };
    let sign = if x < 0.0 { "-" } else { "" };
    if !(FIXED_MIN_EXP..FIXED_MAX_EXP).contains(&exp) {
        let m = trim_fraction(mantissa);
        return format!("{sign}{m}e{exp}");
    }
    let digits: String = mantissa.chars().filter(char::is_ascii_digit).collect();
    let (int, frac) = if exp >= 0 {
        // exp is 0..=8 here, so the cast is exact.
        let n_int = exp.unsigned_abs() as usize + 1;
        if digits.len() > n_int {
            let (i, f) = digits.split_at(n_int);
            (i.to_string(), f.to_string())
        } else {
            let mut i = digits.clone();
            i.extend(std::iter::repeat_n('0', n_int - digits.len()));
            (i, String::new())
        }
    } else {
        let zeros = exp.unsigned_abs() as usize - 1;
        let mut f: String = std::iter::repeat_n('0', zeros).collect();
        f.push_str(&digits);
        ("0".to_string(), f)
    };
    let frac = frac.trim_end_matches('0');
    if frac.is_empty() {
        format!("{sign}{int}")
    } else {
        format!("{sign}{int}.{frac}")
    }
}

/// `1.500` → `1.5`, `2.000` → `2`; an integer mantissa is kept.
fn trim_fraction(m: &str) -> &str {
    if m.contains('.') {
        m.trim_end_matches('0').trim_end_matches('.')
    } else {
        m
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::parse::parse_quantity;
    use crate::units::table::factor;
    use proptest::prelude::*;

    /// Four significant figures: the printed value is within half a unit
    /// of the fourth figure, at most 5e-4 relative (see `crate::test_tol`).
    const REL_PRINTED_4SF: f64 = crate::test_tol::REL_PRINTED_4SF;
    /// One conversion and one division: floating-point rounding only.
    const REL_EXACT: f64 = crate::test_tol::REL_EXACT;
    /// NIST SP 811 (2008) Appendix B.8 prints factors to 7 significant
    /// figures: half a unit in the 7th figure is at most 5e-7 relative
    /// (reference-values.md, check T29).
    const REL_SP811_7SF: f64 = 5e-7;

    fn rel(a: f64, b: f64) -> f64 {
        (a - b).abs() / b.abs()
    }

    #[test]
    fn significant_figures_and_notation() {
        let cases = [
            (12.5, "12.5"),
            (12.499_99, "12.5"),
            (0.012_345_6, "0.01235"),
            (123_456.0, "123500"),
            (999_960.0, "1000000"),
            (1.0, "1"),
            (-2.5, "-2.5"),
            (0.000_123_4, "0.0001234"),
            (0.000_012_34, "1.234e-5"),
            (1.5e9, "1.5e9"),
            (999_940_000.0, "999900000"),
            (999_960_000.0, "1e9"),
            (-0.0, "0"),
            (0.0, "0"),
        ];
        for (x, want) in cases {
            assert_eq!(format_sig(x, DEFAULT_SIG), want, "{x}");
        }
        assert_eq!(format_sig(f64::NAN, 4), "—");
        assert_eq!(format_sig(f64::INFINITY, 4), "—");
        assert_eq!(format_sig(f64::NEG_INFINITY, 4), "—");
        assert_eq!(format_sig(std::f64::consts::PI, 0), "3");
        assert_eq!(format_sig(std::f64::consts::PI, 99), "3.1415926535897931");
    }

    #[test]
    fn formatted_display() {
        assert_eq!(
            format_quantity(0.0125, Dim::Length, UnitSystem::Si).to_string(),
            "12.5 mm"
        );
        assert_eq!(
            format_quantity(std::f64::consts::FRAC_PI_2, Dim::Angle, UnitSystem::Si).to_string(),
            "90°"
        );
        assert_eq!(
            format_quantity(0.8, Dim::Ratio, UnitSystem::Us).to_string(),
            "0.8"
        );
        assert_eq!(
            format_quantity(0.05, Dim::Probability, UnitSystem::Si).to_string(),
            "5 %"
        );
        assert_eq!(
            format_quantity(f64::NAN, Dim::Force, UnitSystem::Si).to_string(),
            "— N"
        );
        assert_eq!(
            format_quantity(-0.0, Dim::Force, UnitSystem::Us).to_string(),
            "0 lbf"
        );
        assert_eq!(
            format_quantity(0.0254, Dim::Length, UnitSystem::Us).to_string(),
            "1 in"
        );
    }

    #[test]
    fn every_kind_has_a_display_unit_of_its_kind_in_both_systems() {
        for dim in Dim::ALL {
            for system in [UnitSystem::Si, UnitSystem::Us] {
                let u = display_unit(dim, system);
                assert_eq!(u.dim, dim, "{dim:?} {system:?}");
                assert!(u.system.includes(system), "{} in {system:?}", u.symbol);
            }
        }
        // Energy and torque never share a US display unit.
        assert_ne!(
            display_unit(Dim::Energy, UnitSystem::Us).symbol,
            display_unit(Dim::Torque, UnitSystem::Us).symbol
        );
    }

    #[test]
    fn convert_to_refuses_ambiguous_spellings() {
        assert_eq!(convert_to(0.0254, "in"), Some(1.0));
        assert_eq!(convert_to(1.0, "N·m"), Some(1.0));
        assert_eq!(convert_to(1.0, "g"), None, "gram or standard gravity");
        assert_eq!(convert_to(1.0, "furlong"), None);
        let psi = convert_to(1e6, "psi").unwrap();
        assert!(rel(psi, 1e6 / factor::PSI) <= REL_EXACT);
    }

    // ── NIST SP 811 checks (reference-values.md §9; check T29) ──────────────
    // Exact values are derived by exact decimal arithmetic from the defined
    // base units (status D); SP 811's printed rounded factors are status R2
    // (read in a secondary source quoting SP 811) unless marked otherwise.

    #[test]
    fn nist_pound_force() {
        // Exact: 0.453 592 37 kg × 9.806 65 m/s² = 4.448 221 615 260 5 N (D).
        let lbf = parse_quantity("1 lbf", Dim::Force, "N").unwrap();
        assert!(rel(lbf, 4.448_221_615_260_5) <= REL_EXACT);
        // NIST SP 811 (2008) App. B.8: pound-force → newton 4.448 222 (R2).
        assert!(rel(lbf, 4.448_222) <= REL_SP811_7SF);
    }

    #[test]
    fn nist_foot_pound_force() {
        // Exact: 0.3048 × 4.448 221 615 260 5 = 1.355 817 948 331 4 J (D).
        let e = parse_quantity("1 ft·lbf", Dim::Energy, "J").unwrap();
        assert!(rel(e, 1.355_817_948_331_400_4) <= REL_EXACT);
        // NIST SP 811 (2008) App. B.8: foot pound-force → joule 1.355 818 (R2).
        assert!(rel(e, 1.355_818) <= REL_SP811_7SF);
    }

    #[test]
    fn nist_pound_force_inch() {
        // NIST SP 811 (2008) App. B.8: pound-force inch → newton metre
        // 0.112 984 8 (R2); exact 0.0254 × 4.448 221 615 260 5 (D).
        let t = parse_quantity("1 lbf·in", Dim::Torque, "N·m").unwrap();
        assert!(rel(t, 0.112_984_829_027_616_7) <= REL_EXACT);
        assert!(rel(t, 0.112_984_8) <= REL_SP811_7SF);
    }

    #[test]
    fn nist_pound_force_per_inch() {
        // Exact: 4.448 221 615 260 5 / 0.0254 = 175.126 835 246 5 N/m (D).
        let k = parse_quantity("1 lbf/in", Dim::LinearRate, "N/mm").unwrap();
        assert!(rel(k, 175.126_835_246_476_4) <= REL_EXACT);
        // NIST SP 811 (2008) App. B.8: pound-force per inch → newton per
        // metre 175.126 8 (R2).
        assert!(rel(k, 175.126_8) <= REL_SP811_7SF);
    }

    #[test]
    fn nist_psi() {
        // Exact: 4.448 221 615 260 5 / 0.0254² = 6 894.757 293 168 4 Pa (D).
        let p = parse_quantity("1 psi", Dim::Pressure, "MPa").unwrap();
        assert!(rel(p, 6_894.757_293_168_361) <= REL_EXACT);
        // NIST SP 811 (2008) App. B.8: psi → pascal 6.894 757 E+03; the
        // listing itself is from memory (reference-values.md §9, status M).
        assert!(rel(p, 6_894.757) <= REL_SP811_7SF);
    }

    #[test]
    fn nist_standard_gravity_in_feet() {
        // g_n = 9.806 65 m/s² exactly (3rd CGPM 1901; NIST SP 811 (2008)
        // App. B.8, R2); in ft/s²: 9.806 65 / 0.3048 = 32.174 048 556 430 4 (D).
        let g = parse_quantity("1 g", Dim::Acceleration, "m/s²").unwrap();
        assert_eq!(g, 9.806_65);
        let in_ft = convert_to(g, "ft/s²").unwrap();
        assert!(rel(in_ft, 32.174_048_556_430_44) <= REL_EXACT);
        // reference-values.md §9 quotes 32.174 05 ft/s² (7 figures).
        assert!(rel(in_ft, 32.174_05) <= REL_SP811_7SF);
    }

    #[test]
    fn nist_exact_base_definitions() {
        // NIST SP 811 (2008) App. B.8, exact definitions (R2).
        assert_eq!(parse_quantity("1 in", Dim::Length, "mm").unwrap(), 0.0254);
        assert_eq!(parse_quantity("1 ft", Dim::Length, "mm").unwrap(), 0.3048);
        assert_eq!(
            parse_quantity("1 lb", Dim::Mass, "kg").unwrap(),
            0.453_592_37
        );
        assert_eq!(parse_quantity("1 kgf", Dim::Force, "N").unwrap(), 9.806_65);
        assert_eq!(parse_quantity("1 bar", Dim::Pressure, "MPa").unwrap(), 1e5);
        // SP 811 prints the pound as 0.453 592 4 kg (7 figures, R2).
        assert!(rel(factor::POUND, 0.453_592_4) <= REL_SP811_7SF);
        // 1 mi/h = 0.447 04 m/s exactly (SP 811 App. B.8, from memory).
        assert!(
            rel(
                parse_quantity("1 mph", Dim::Speed, "m/s").unwrap(),
                0.447_04
            ) <= REL_EXACT
        );
    }

    #[test]
    fn horsepower_and_rpm() {
        // 1 hp = 550 ft·lbf/s by definition = 745.699 871 582 270 2 W (D);
        // NIST SP 811 (2008) App. B.8 lists 7.456 999 E+02 W (from memory;
        // secondary conversion tables print 745.6999).
        let hp = parse_quantity("1 hp", Dim::Power, "W").unwrap();
        assert!(rel(hp, 745.699_871_582_270_2) <= REL_EXACT);
        assert!(rel(hp, 745.699_9) <= REL_SP811_7SF);
        // 1 rpm = 2π/60 rad/s = 0.104 719 755 119 659 8 (D, definition of
        // the revolution; common practice).
        let w = parse_quantity("1 rpm", Dim::AngularSpeed, "rad/s").unwrap();
        assert!(rel(w, 0.104_719_755_119_659_8) <= REL_EXACT);
    }

    #[test]
    fn every_display_unit_round_trips_a_typical_value() {
        for dim in Dim::ALL {
            for system in [UnitSystem::Si, UnitSystem::Us] {
                let si = 1.234_5 * display_unit(dim, system).factor;
                let shown = format_quantity(si, dim, system).to_string();
                let back = parse_quantity(&shown, dim, "").unwrap();
                assert!(rel(back, si) <= REL_PRINTED_4SF, "{shown} {dim:?}");
            }
        }
    }

    fn any_dim() -> impl Strategy<Value = Dim> {
        (0..Dim::ALL.len()).prop_map(|i| Dim::ALL[i])
    }

    fn any_system() -> impl Strategy<Value = UnitSystem> {
        prop_oneof![Just(UnitSystem::Si), Just(UnitSystem::Us)]
    }

    /// Nonzero values across the magnitudes met in practice and beyond, in
    /// the display unit: mantissa in [1, 10), exponent −12..12, either sign.
    fn any_shown_value() -> impl Strategy<Value = f64> {
        (1.0f64..10.0, -12i32..12, any::<bool>())
            .prop_map(|(m, e, neg)| if neg { -m } else { m } * 10f64.powi(e))
    }

    proptest! {
        #[test]
        fn format_then_parse_is_within_printed_precision(
            dim in any_dim(), system in any_system(), shown in any_shown_value()
        ) {
            let unit = display_unit(dim, system);
            let si = unit.to_si(shown);
            let text = format_quantity(si, dim, system).to_string();
            let back = parse_quantity(&text, dim, "").unwrap();
            prop_assert!(rel(back, si) <= REL_PRINTED_4SF, "{} -> {} -> {}", si, text, back);
        }

        #[test]
        fn format_sig_never_prints_nan_or_inf(x in any::<f64>(), sig in 0usize..30) {
            let s = format_sig(x, sig);
            prop_assert!(!s.contains("NaN") && !s.contains("inf"), "{}", s);
            prop_assert!(!s.is_empty());
        }

        #[test]
        fn format_sig_round_trips_through_f64_parse(x in any::<f64>()) {
            prop_assume!(x.is_finite() && x != 0.0);
            let s = format_sig(x, DEFAULT_SIG);
            let back: f64 = s.parse().unwrap();
            prop_assert!(rel(back, x) <= REL_PRINTED_4SF, "{} -> {}", x, s);
        }
    }
}
