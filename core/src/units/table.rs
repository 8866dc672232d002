//! The unit table: every unit the core reads or writes, with its symbol,
//! accepted spellings, quantity kind ([`Dim`]), factor to SI and system.
//!
//! Model: a value `v` written in unit `u` is `v · u.factor` in the SI unit of
//! `u.dim` ([`Dim::si_symbol`]). Factors of US customary units are computed in
//! code from the exact base definitions (1 in = 0.0254 m, 1 ft = 0.3048 m,
//! 1 lb = 0.453 592 37 kg, g_n = 9.806 65 m/s², NIST SP 811 (2008)
//! Appendix B.8), never copied from rounded decimals; each factor constant in
//! [`factor`] names its source. The same spelling may belong to several kinds
//! (`N·m` is a torque or an energy, `g` a gram or standard gravity): it is
//! resolved by the kind the caller expects ([`find_in`]).
//!
//! Spellings are compared after a light normalisation ([`same_spelling`]):
//! `·`, `⋅`, `*`, `×`, `.`, a hyphen and spaces all mean multiplication;
//! `^` is dropped and superscripts become digits (`m/s²` = `m/s^2` = `m/s2`);
//! `µ` and `μ` become `u`; `°` becomes `deg`. Letter case is kept: `mm` and
//! `Mm`, `mPa` and `MPa` differ by a factor of 10⁹, so a case slip is never
//! accepted silently (the error message suggests the unit instead).

use super::Dim;
use super::UnitSystem;

/// Conversion factors to SI, each with its source. US customary factors are
/// derived in code from the exact base definitions, so they carry no rounding
/// beyond one or two floating-point operations.
pub mod factor {
    use std::f64::consts::PI;

    /// SI prefix micro, 10⁻⁶, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const MICRO: f64 = 1e-6;
    /// SI prefix milli, 10⁻³, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const MILLI: f64 = 1e-3;
    /// SI prefix centi, 10⁻², exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const CENTI: f64 = 1e-2;
    /// SI prefix deci, 10⁻¹, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const DECI: f64 = 1e-1;
    /// SI prefix deca, 10¹, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const DECA: f64 = 1e1;
    /// SI prefix kilo, 10³, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const KILO: f64 = 1e3;
    /// SI prefix mega, 10⁶, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const MEGA: f64 = 1e6;
    /// SI prefix giga, 10⁹, exact by definition (BIPM SI Brochure, 9th ed., 2019).
    pub const GIGA: f64 = 1e9;

    /// International inch, m: 1 in = 0.0254 m exactly (NIST SP 811 (2008)
    /// Appendix B.8: 2.54 E−02, exact).
    pub const INCH: f64 = 0.0254;
    /// International foot, m: 1 ft = 0.3048 m exactly (NIST SP 811 (2008)
    /// Appendix B.8: 3.048 E−01, exact). Written as the defined decimal, not
    /// as 12 × 0.0254, so the constant is the nearest double to the definition.
    pub const FOOT: f64 = 0.3048;
    /// International mile, m: 5280 ft = 1609.344 m exactly (NIST SP 811 (2008)
    /// Appendix B.8: 1.609 344 E+03, exact).
    pub const MILE: f64 = 1609.344;
    /// Avoirdupois pound (mass), kg: 1 lb = 0.453 592 37 kg exactly (NIST SP 811
    /// (2008) Appendix B.8: 4.535 923 7 E−01, exact).
    pub const POUND: f64 = 0.453_592_37;
    /// Avoirdupois ounce, kg: 1 oz = 1/16 lb exactly (definition of the
    /// avoirdupois system; NIST SP 811 (2008) Appendix B.8 lists
    /// 2.834 952 E−02, from memory).
    pub const OUNCE: f64 = POUND / 16.0;
    /// Tonne (metric ton), kg: 1 t = 1000 kg exactly (BIPM SI Brochure, 9th ed.,
    /// non-SI units accepted for use with the SI).
    pub const TONNE: f64 = 1000.0;
    /// Standard acceleration of gravity g_n, m/s²: 9.806 65 exactly (3rd CGPM
    /// 1901; NIST SP 811 (2008) Appendix B.8).
    pub const STANDARD_GRAVITY: f64 = crate::G_N;
    /// Pound-force, N: the weight of 1 lb under g_n, 0.453 592 37 × 9.806 65
    /// = 4.448 221 615 260 5 N exactly (NIST SP 811 (2008) Appendix B.8 prints
    /// the rounded 4.448 222 E+00).
    pub const POUND_FORCE: f64 = POUND * STANDARD_GRAVITY;
    /// Kilogram-force (kilopond), N: 1 kgf = 9.806 65 N exactly (NIST SP 811
    /// (2008) Appendix B.8).
    pub const KILOGRAM_FORCE: f64 = STANDARD_GRAVITY;
    /// Pound-force per square inch, Pa: lbf/in² = 6 894.757 293 168 Pa exactly
    /// (NIST SP 811 (2008) Appendix B.8 prints the rounded 6.894 757 E+03).
    pub const PSI: f64 = POUND_FORCE / (INCH * INCH);
    /// Bar, Pa: 1 bar = 10⁵ Pa exactly (NIST SP 811 (2008) Appendix B.8).
    pub const BAR: f64 = 1e5;
    /// Degree of plane angle, rad: π/180 exactly (BIPM SI Brochure, 9th ed.,
    /// non-SI units accepted for use with the SI; NIST SP 811 (2008)
    /// Appendix B.8 prints 1.745 329 E−02).
    pub const DEGREE: f64 = PI / 180.0;
    /// Revolution (one full turn), rad: 2π by definition (common practice).
    pub const REVOLUTION: f64 = 2.0 * PI;
    /// Minute, s: 60 s exactly (BIPM SI Brochure, 9th ed., non-SI units
    /// accepted for use with the SI).
    pub const MINUTE: f64 = 60.0;
    /// Hour, s: 3600 s exactly (BIPM SI Brochure, 9th ed., non-SI units
    /// accepted for use with the SI).
    pub const HOUR: f64 = 3600.0;
    /// Horsepower (mechanical), W: 550 ft·lbf/s by definition
    /// = 745.699 871 582 270 22 W (NIST SP 811 (2008) Appendix B.8 lists
    /// 7.456 999 E+02, from memory; secondary conversion tables agree).
    pub const HORSEPOWER: f64 = 550.0 * FOOT * POUND_FORCE;
}

use factor::*;

/// Which system of units a unit belongs to, for offering choices in a user
/// interface. `Si` includes the metric units in use beside the SI (bar, kgf,
/// tonne); `Both` marks units used alike in both systems (s, min, h, Hz, rad,
/// °, rpm, W, %).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum UnitFamily {
    /// SI or metric.
    Si,
    /// US customary.
    Us,
    /// Used in both systems.
    Both,
}

impl UnitFamily {
    /// Whether a unit of this family belongs to `system`.
    pub fn includes(self, system: UnitSystem) -> bool {
        matches!(
            (self, system),
            (UnitFamily::Both, _)
                | (UnitFamily::Si, UnitSystem::Si)
                | (UnitFamily::Us, UnitSystem::Us)
        )
    }
}

/// One unit: `v` of this unit is `v · factor` in the SI unit of `dim`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Unit {
    /// Canonical symbol as displayed, Unicode: `N·mm`, `m/s²`, `°`, `gₙ`.
    /// Empty for a plain number.
    pub symbol: &'static str,
    /// The same symbol in ASCII: `N*mm`, `m/s^2`, `deg`, `g_n`.
    pub ascii: &'static str,
    /// Name in words: `newton millimetre`.
    pub name: &'static str,
    /// Quantity kind measured by this unit.
    pub dim: Dim,
    /// Value of one of this unit in the SI unit of `dim` (e.g. 0.0254 for in).
    pub factor: f64,
    /// System the unit belongs to.
    pub system: UnitFamily,
    /// Further accepted spellings, besides `symbol` and `ascii` (compared
    /// after normalisation, see [`same_spelling`]).
    pub aliases: &'static [&'static str],
    /// Source of the factor: definition or publication and clause.
    pub source: &'static str,
    /// The same unit as an expression for the Python library pint (used by
    /// the trust suite to cross-check every factor): `inch * force_pound`.
    pub pint: &'static str,
}

impl Unit {
    /// SI value of `value` written in this unit: `value · factor`.
    pub fn to_si(&self, value: f64) -> f64 {
        value * self.factor
    }

    /// Value in this unit of an SI value: `si / factor` (factors are all
    /// strictly positive, see the table test).
    pub fn from_si(&self, si: f64) -> f64 {
        si / self.factor
    }

    /// Every accepted spelling: symbol, ASCII symbol, then the aliases.
    pub fn spellings(&self) -> impl Iterator<Item = &'static str> {
        [self.symbol, self.ascii]
            .into_iter()
            .chain(self.aliases.iter().copied())
    }

    /// Whether `text` is one of this unit's spellings (after normalisation).
    pub fn is_spelled(&self, text: &str) -> bool {
        self.spellings().any(|s| same_spelling(s, text))
    }
}

// Sources of factors, named once. Each is the reason the factor is what it is.
const S_SI: &str = "coherent SI unit, factor 1 by definition (BIPM SI Brochure, 9th ed., 2019)";
const S_PREFIX: &str = "SI prefixes, exact by definition (BIPM SI Brochure, 9th ed., 2019)";
const S_ACCEPTED: &str =
    "non-SI unit accepted for use with the SI, exact (BIPM SI Brochure, 9th ed., 2019): min = 60 s, h = 3600 s, ° = π/180 rad, t = 1000 kg";
const S_PERCENT: &str = "1 % = 0.01 by definition (ISO 80000-1)";
const S_REV: &str = "1 rev = 2π rad (one full turn), by definition (common practice)";
const S_INCH: &str = "1 in = 0.0254 m exactly (NIST SP 811 (2008) App. B.8)";
const S_FOOT: &str = "1 ft = 0.3048 m exactly (NIST SP 811 (2008) App. B.8)";
const S_MILE: &str = "1 mi = 1609.344 m exactly (NIST SP 811 (2008) App. B.8)";
const S_POUND: &str = "1 lb = 0.453 592 37 kg exactly (NIST SP 811 (2008) App. B.8)";
const S_OUNCE: &str = "1 oz = 1/16 lb exactly (avoirdupois); 1 lb = 0.453 592 37 kg exactly (NIST SP 811 (2008) App. B.8)";
const S_GN: &str = "g_n = 9.806 65 m/s² exactly (3rd CGPM 1901; NIST SP 811 (2008) App. B.8)";
const S_LBF: &str =
    "1 lbf = 0.453 592 37 kg × 9.806 65 m/s² exactly (NIST SP 811 (2008) App. B.8 prints 4.448 222 N)";
const S_KGF: &str = "1 kgf = 9.806 65 N exactly (NIST SP 811 (2008) App. B.8)";
const S_BAR: &str = "1 bar = 10⁵ Pa exactly (NIST SP 811 (2008) App. B.8)";
const S_PSI: &str =
    "1 psi = 1 lbf/in², exact from lbf = lb × g_n and in = 0.0254 m (NIST SP 811 (2008) App. B.8 prints 6.894 757 E+03 Pa)";
const S_US: &str =
    "exact product of 1 lbf = 0.453 592 37 × 9.806 65 N, 1 in = 0.0254 m, 1 ft = 0.3048 m (NIST SP 811 (2008) App. B.8, B.9)";
const S_US_MASS: &str =
    "exact product of 1 lb = 0.453 592 37 kg, 1 in = 0.0254 m, 1 ft = 0.3048 m (NIST SP 811 (2008) App. B.8, B.9)";
const S_HP: &str =
    "1 hp = 550 ft·lbf/s by definition, exact from lbf and ft (NIST SP 811 (2008) App. B.8 lists 7.456 999 E+02 W, from memory)";

/// Builds one table row; braces keep rustfmt from spreading a row over ten
/// lines, so the table reads as a table.
macro_rules! unit {
    ($sym:literal, $ascii:literal, $name:literal, $dim:ident, $factor:expr, $fam:ident,
     [$($alias:literal),* $(,)?], $src:expr, $pint:literal) => {
        Unit {
            symbol: $sym,
            ascii: $ascii,
            name: $name,
            dim: Dim::$dim,
            factor: $factor,
            system: UnitFamily::$fam,
            aliases: &[$($alias),*],
            source: $src,
            pint: $pint,
        }
    };
}

/// Every unit, grouped by kind in the order of [`Dim::ALL`]. Within a kind
/// the first unit is the SI unit of [`Dim::si_symbol`].
static UNITS: &[Unit] = &[
    // ── Ratio (plain number) ──────────────────────────────────────────────
    unit! { "", "", "plain number", Ratio, 1.0, Both, [], S_SI, "dimensionless" },
    unit! { "%", "%", "percent", Ratio, CENTI, Both, ["percent", "pct"], S_PERCENT, "percent" },
    // ── Length ────────────────────────────────────────────────────────────
    unit! { "m", "m", "metre", Length, 1.0, Si, ["metre", "meter", "metres", "meters"], S_SI, "meter" },
    unit! { "µm", "um", "micrometre", Length, MICRO, Si, ["micron", "microns", "micrometre", "micrometer", "micrometres", "micrometers"], S_PREFIX, "micrometer" },
    unit! { "mm", "mm", "millimetre", Length, MILLI, Si, ["millimetre", "millimeter", "millimetres", "millimeters"], S_PREFIX, "millimeter" },
    unit! { "cm", "cm", "centimetre", Length, CENTI, Si, ["centimetre", "centimeter", "centimetres", "centimeters"], S_PREFIX, "centimeter" },
    unit! { "in", "in", "inch", Length, INCH, Us, ["inch", "inches", "\""], S_INCH, "inch" },
    unit! { "ft", "ft", "foot", Length, FOOT, Us, ["foot", "feet", "'"], S_FOOT, "foot" },
    // ── Area ──────────────────────────────────────────────────────────────
    unit! { "m²", "m^2", "square metre", Area, 1.0, Si, ["sq m"], S_SI, "meter**2" },
    unit! { "mm²", "mm^2", "square millimetre", Area, MILLI * MILLI, Si, ["sq mm"], S_PREFIX, "millimeter**2" },
    unit! { "cm²", "cm^2", "square centimetre", Area, CENTI * CENTI, Si, ["sq cm"], S_PREFIX, "centimeter**2" },
    unit! { "in²", "in^2", "square inch", Area, INCH * INCH, Us, ["sq in", "square inch", "square inches"], S_INCH, "inch**2" },
    unit! { "ft²", "ft^2", "square foot", Area, FOOT * FOOT, Us, ["sq ft", "square foot", "square feet"], S_FOOT, "foot**2" },
    // ── Force ─────────────────────────────────────────────────────────────
    unit! { "N", "N", "newton", Force, 1.0, Si, ["newton", "newtons"], S_SI, "newton" },
    unit! { "daN", "daN", "decanewton", Force, DECA, Si, ["decanewton", "decanewtons"], S_PREFIX, "decanewton" },
    unit! { "kN", "kN", "kilonewton", Force, KILO, Si, ["KN", "kilonewton", "kilonewtons"], S_PREFIX, "kilonewton" },
    unit! { "kgf", "kgf", "kilogram-force", Force, KILOGRAM_FORCE, Si, ["kp", "kilogram-force", "kilopond"], S_KGF, "kilogram_force" },
    unit! { "lbf", "lbf", "pound-force", Force, POUND_FORCE, Us, ["pound-force", "pounds-force"], S_LBF, "force_pound" },
    // ── Mass ──────────────────────────────────────────────────────────────
    unit! { "kg", "kg", "kilogram", Mass, 1.0, Si, ["Kg", "KG", "kilogram", "kilograms"], S_SI, "kilogram" },
    unit! { "g", "g", "gram", Mass, MILLI, Si, ["gram", "grams"], S_PREFIX, "gram" },
    unit! { "t", "t", "tonne", Mass, TONNE, Si, ["tonne", "tonnes"], S_ACCEPTED, "metric_ton" },
    unit! { "lb", "lb", "pound (mass)", Mass, POUND, Us, ["lbs", "lbm", "pound", "pounds"], S_POUND, "pound" },
    unit! { "oz", "oz", "ounce (avoirdupois)", Mass, OUNCE, Us, ["ounce", "ounces"], S_OUNCE, "ounce" },
    // ── Energy ────────────────────────────────────────────────────────────
    unit! { "J", "J", "joule", Energy, 1.0, Si, ["joule", "joules"], S_SI, "joule" },
    unit! { "mJ", "mJ", "millijoule", Energy, MILLI, Si, ["millijoule", "millijoules"], S_PREFIX, "millijoule" },
    unit! { "kJ", "kJ", "kilojoule", Energy, KILO, Si, ["KJ", "kilojoule", "kilojoules"], S_PREFIX, "kilojoule" },
    unit! { "N·m", "N*m", "newton metre (energy)", Energy, 1.0, Si, ["Nm"], S_SI, "newton * meter" },
    unit! { "N·mm", "N*mm", "newton millimetre (energy)", Energy, MILLI, Si, ["Nmm"], S_PREFIX, "newton * millimeter" },
    unit! { "ft·lbf", "ft*lbf", "foot pound-force", Energy, FOOT * POUND_FORCE, Us, ["lbf·ft", "ftlbf", "lbfft"], S_US, "foot * force_pound" },
    unit! { "in·lbf", "in*lbf", "inch pound-force", Energy, INCH * POUND_FORCE, Us, ["lbf·in", "inlbf", "lbfin"], S_US, "inch * force_pound" },
    // ── Linear spring rate ────────────────────────────────────────────────
    unit! { "N/m", "N/m", "newton per metre", LinearRate, 1.0, Si, [], S_SI, "newton / meter" },
    unit! { "N/cm", "N/cm", "newton per centimetre", LinearRate, 1.0 / CENTI, Si, [], S_PREFIX, "newton / centimeter" },
    unit! { "N/mm", "N/mm", "newton per millimetre", LinearRate, 1.0 / MILLI, Si, [], S_PREFIX, "newton / millimeter" },
    unit! { "kN/m", "kN/m", "kilonewton per metre", LinearRate, KILO, Si, ["KN/m"], S_PREFIX, "kilonewton / meter" },
    unit! { "kN/mm", "kN/mm", "kilonewton per millimetre", LinearRate, KILO / MILLI, Si, ["KN/mm"], S_PREFIX, "kilonewton / millimeter" },
    unit! { "kgf/mm", "kgf/mm", "kilogram-force per millimetre", LinearRate, KILOGRAM_FORCE / MILLI, Si, ["kp/mm"], S_KGF, "kilogram_force / millimeter" },
    unit! { "lbf/in", "lbf/in", "pound-force per inch", LinearRate, POUND_FORCE / INCH, Us, ["lbf/inch"], S_US, "force_pound / inch" },
    unit! { "lbf/ft", "lbf/ft", "pound-force per foot", LinearRate, POUND_FORCE / FOOT, Us, ["lbf/foot"], S_US, "force_pound / foot" },
    // ── Torsional spring rate ─────────────────────────────────────────────
    unit! { "N·m/rad", "N*m/rad", "newton metre per radian", TorsionalRate, 1.0, Si, ["Nm/rad"], S_SI, "newton * meter / radian" },
    unit! { "N·mm/rad", "N*mm/rad", "newton millimetre per radian", TorsionalRate, MILLI, Si, ["Nmm/rad"], S_PREFIX, "newton * millimeter / radian" },
    unit! { "N·m/deg", "N*m/deg", "newton metre per degree", TorsionalRate, 1.0 / DEGREE, Si, ["Nm/deg"], S_ACCEPTED, "newton * meter / degree" },
    unit! { "N·mm/deg", "N*mm/deg", "newton millimetre per degree", TorsionalRate, MILLI / DEGREE, Si, ["Nmm/deg"], S_ACCEPTED, "newton * millimeter / degree" },
    unit! { "lbf·in/rad", "lbf*in/rad", "pound-force inch per radian", TorsionalRate, POUND_FORCE * INCH, Us, ["in·lbf/rad", "lbfin/rad", "inlbf/rad"], S_US, "force_pound * inch / radian" },
    unit! { "lbf·in/deg", "lbf*in/deg", "pound-force inch per degree", TorsionalRate, POUND_FORCE * INCH / DEGREE, Us, ["in·lbf/deg", "lbfin/deg", "inlbf/deg"], S_US, "force_pound * inch / degree" },
    unit! { "lbf·ft/rad", "lbf*ft/rad", "pound-force foot per radian", TorsionalRate, POUND_FORCE * FOOT, Us, ["ft·lbf/rad", "lbfft/rad", "ftlbf/rad"], S_US, "force_pound * foot / radian" },
    unit! { "lbf·ft/deg", "lbf*ft/deg", "pound-force foot per degree", TorsionalRate, POUND_FORCE * FOOT / DEGREE, Us, ["ft·lbf/deg", "lbfft/deg", "ftlbf/deg"], S_US, "force_pound * foot / degree" },
    // ── Speed ─────────────────────────────────────────────────────────────
    unit! { "m/s", "m/s", "metre per second", Speed, 1.0, Si, ["m/sec"], S_SI, "meter / second" },
    unit! { "mm/s", "mm/s", "millimetre per second", Speed, MILLI, Si, ["mm/sec"], S_PREFIX, "millimeter / second" },
    unit! { "m/min", "m/min", "metre per minute", Speed, 1.0 / MINUTE, Si, [], S_ACCEPTED, "meter / minute" },
    unit! { "km/h", "km/h", "kilometre per hour", Speed, KILO / HOUR, Si, ["km/hr", "kph"], S_ACCEPTED, "kilometer / hour" },
    unit! { "ft/s", "ft/s", "foot per second", Speed, FOOT, Us, ["ft/sec"], S_FOOT, "foot / second" },
    unit! { "in/s", "in/s", "inch per second", Speed, INCH, Us, ["in/sec", "ips"], S_INCH, "inch / second" },
    unit! { "ft/min", "ft/min", "foot per minute", Speed, FOOT / MINUTE, Us, ["fpm"], S_FOOT, "foot / minute" },
    unit! { "mph", "mph", "mile per hour", Speed, MILE / HOUR, Us, ["mi/h"], S_MILE, "mile / hour" },
    // ── Angular speed ─────────────────────────────────────────────────────
    unit! { "rad/s", "rad/s", "radian per second", AngularSpeed, 1.0, Both, ["rad/sec"], S_SI, "radian / second" },
    unit! { "°/s", "deg/s", "degree per second", AngularSpeed, DEGREE, Both, ["deg/sec"], S_ACCEPTED, "degree / second" },
    unit! { "rpm", "rpm", "revolution per minute", AngularSpeed, REVOLUTION / MINUTE, Both, ["rev/min", "r/min", "RPM", "revs/min"], S_REV, "revolution / minute" },
    unit! { "rev/s", "rev/s", "revolution per second", AngularSpeed, REVOLUTION, Both, ["r/s", "rps"], S_REV, "revolution / second" },
    // ── Acceleration ──────────────────────────────────────────────────────
    unit! { "m/s²", "m/s^2", "metre per second squared", Acceleration, 1.0, Si, ["m/sec2", "m/s/s"], S_SI, "meter / second**2" },
    unit! { "mm/s²", "mm/s^2", "millimetre per second squared", Acceleration, MILLI, Si, ["mm/sec2"], S_PREFIX, "millimeter / second**2" },
    unit! { "ft/s²", "ft/s^2", "foot per second squared", Acceleration, FOOT, Us, ["ft/sec2", "ft/s/s"], S_FOOT, "foot / second**2" },
    unit! { "in/s²", "in/s^2", "inch per second squared", Acceleration, INCH, Us, ["in/sec2"], S_INCH, "inch / second**2" },
    unit! { "gₙ", "g_n", "standard acceleration of gravity", Acceleration, STANDARD_GRAVITY, Both, ["g", "gn", "g0", "g₀"], S_GN, "standard_gravity" },
    // ── Pressure and stress ───────────────────────────────────────────────
    unit! { "Pa", "Pa", "pascal", Pressure, 1.0, Si, ["N/m²", "pascal", "pascals"], S_SI, "pascal" },
    unit! { "kPa", "kPa", "kilopascal", Pressure, KILO, Si, [], S_PREFIX, "kilopascal" },
    unit! { "MPa", "MPa", "megapascal", Pressure, MEGA, Si, [], S_PREFIX, "megapascal" },
    unit! { "GPa", "GPa", "gigapascal", Pressure, GIGA, Si, [], S_PREFIX, "gigapascal" },
    unit! { "N/mm²", "N/mm^2", "newton per square millimetre", Pressure, 1.0 / (MILLI * MILLI), Si, [], S_PREFIX, "newton / millimeter**2" },
    unit! { "N/cm²", "N/cm^2", "newton per square centimetre", Pressure, 1.0 / (CENTI * CENTI), Si, [], S_PREFIX, "newton / centimeter**2" },
    unit! { "bar", "bar", "bar", Pressure, BAR, Si, [], S_BAR, "bar" },
    unit! { "kgf/cm²", "kgf/cm^2", "kilogram-force per square centimetre", Pressure, KILOGRAM_FORCE / (CENTI * CENTI), Si, ["kp/cm²"], S_KGF, "kilogram_force / centimeter**2" },
    unit! { "kgf/mm²", "kgf/mm^2", "kilogram-force per square millimetre", Pressure, KILOGRAM_FORCE / (MILLI * MILLI), Si, ["kp/mm²"], S_KGF, "kilogram_force / millimeter**2" },
    unit! { "psi", "psi", "pound-force per square inch", Pressure, PSI, Us, ["lbf/in²", "PSI"], S_PSI, "psi" },
    unit! { "ksi", "ksi", "kilopound-force per square inch", Pressure, KILO * PSI, Us, ["kpsi"], S_PSI, "ksi" },
    unit! { "Mpsi", "Mpsi", "million pound-force per square inch", Pressure, MEGA * PSI, Us, [], S_PSI, "1e6 * psi" },
    // ── Plane angle ───────────────────────────────────────────────────────
    unit! { "rad", "rad", "radian", Angle, 1.0, Both, ["radian", "radians"], S_SI, "radian" },
    unit! { "°", "deg", "degree", Angle, DEGREE, Both, ["degree", "degrees"], S_ACCEPTED, "degree" },
    unit! { "rev", "rev", "revolution", Angle, REVOLUTION, Both, ["revs", "revolution", "revolutions", "turn", "turns"], S_REV, "revolution" },
    // ── Torque ────────────────────────────────────────────────────────────
    unit! { "N·m", "N*m", "newton metre", Torque, 1.0, Si, ["Nm"], S_SI, "newton * meter" },
    unit! { "N·cm", "N*cm", "newton centimetre", Torque, CENTI, Si, ["Ncm"], S_PREFIX, "newton * centimeter" },
    unit! { "N·mm", "N*mm", "newton millimetre", Torque, MILLI, Si, ["Nmm"], S_PREFIX, "newton * millimeter" },
    unit! { "kN·m", "kN*m", "kilonewton metre", Torque, KILO, Si, ["kNm"], S_PREFIX, "kilonewton * meter" },
    unit! { "lbf·in", "lbf*in", "pound-force inch", Torque, POUND_FORCE * INCH, Us, ["in·lbf", "lbfin", "inlbf"], S_US, "force_pound * inch" },
    unit! { "lbf·ft", "lbf*ft", "pound-force foot", Torque, POUND_FORCE * FOOT, Us, ["ft·lbf", "lbfft", "ftlbf"], S_US, "force_pound * foot" },
    // ── Moment of inertia ─────────────────────────────────────────────────
    unit! { "kg·m²", "kg*m^2", "kilogram square metre", Inertia, 1.0, Si, ["kgm²"], S_SI, "kilogram * meter**2" },
    unit! { "kg·cm²", "kg*cm^2", "kilogram square centimetre", Inertia, CENTI * CENTI, Si, ["kgcm²"], S_PREFIX, "kilogram * centimeter**2" },
    unit! { "kg·mm²", "kg*mm^2", "kilogram square millimetre", Inertia, MILLI * MILLI, Si, ["kgmm²"], S_PREFIX, "kilogram * millimeter**2" },
    unit! { "g·cm²", "g*cm^2", "gram square centimetre", Inertia, MILLI * CENTI * CENTI, Si, ["gcm²"], S_PREFIX, "gram * centimeter**2" },
    unit! { "lb·in²", "lb*in^2", "pound square inch", Inertia, POUND * INCH * INCH, Us, ["lbin²"], S_US_MASS, "pound * inch**2" },
    unit! { "lb·ft²", "lb*ft^2", "pound square foot", Inertia, POUND * FOOT * FOOT, Us, ["lbft²"], S_US_MASS, "pound * foot**2" },
    unit! { "lbf·in·s²", "lbf*in*s^2", "pound-force inch second squared", Inertia, POUND_FORCE * INCH, Us, ["in·lbf·s²", "lbf·s²·in"], S_US, "force_pound * inch * second**2" },
    unit! { "lbf·ft·s²", "lbf*ft*s^2", "pound-force foot second squared (slug foot squared)", Inertia, POUND_FORCE * FOOT, Us, ["ft·lbf·s²", "slug·ft²"], S_US, "force_pound * foot * second**2" },
    // ── Time ──────────────────────────────────────────────────────────────
    unit! { "s", "s", "second", Time, 1.0, Both, ["sec", "secs", "second", "seconds"], S_SI, "second" },
    unit! { "ms", "ms", "millisecond", Time, MILLI, Both, ["msec", "millisecond", "milliseconds"], S_PREFIX, "millisecond" },
    unit! { "min", "min", "minute", Time, MINUTE, Both, ["mins", "minute", "minutes"], S_ACCEPTED, "minute" },
    unit! { "h", "h", "hour", Time, HOUR, Both, ["hr", "hrs", "hour", "hours"], S_ACCEPTED, "hour" },
    // ── Frequency and rate of events ──────────────────────────────────────
    unit! { "Hz", "Hz", "hertz", Frequency, 1.0, Both, ["hz", "1/s", "/s", "s⁻¹", "per second", "cycles/s", "cps"], S_SI, "hertz" },
    unit! { "1/min", "1/min", "per minute", Frequency, 1.0 / MINUTE, Both, ["/min", "min⁻¹", "per minute"], S_ACCEPTED, "1 / minute" },
    unit! { "cycles/min", "cycles/min", "cycles per minute", Frequency, 1.0 / MINUTE, Both, ["cycle/min", "cycles per minute", "cpm"], S_ACCEPTED, "1 / minute" },
    unit! { "1/h", "1/h", "per hour", Frequency, 1.0 / HOUR, Both, ["/h", "/hr", "1/hr", "h⁻¹", "per hour", "per hr"], S_ACCEPTED, "1 / hour" },
    unit! { "cycles/h", "cycles/h", "cycles per hour", Frequency, 1.0 / HOUR, Both, ["cycle/h", "cycles/hr", "cycle/hr", "cycles per hour", "cph"], S_ACCEPTED, "1 / hour" },
    // ── Power ─────────────────────────────────────────────────────────────
    unit! { "W", "W", "watt", Power, 1.0, Both, ["watt", "watts", "J/s"], S_SI, "watt" },
    unit! { "kW", "kW", "kilowatt", Power, KILO, Si, ["KW", "kilowatt", "kilowatts"], S_PREFIX, "kilowatt" },
    unit! { "J/h", "J/h", "joule per hour", Power, 1.0 / HOUR, Si, ["J/hr"], S_ACCEPTED, "joule / hour" },
    unit! { "kJ/h", "kJ/h", "kilojoule per hour", Power, KILO / HOUR, Si, ["kJ/hr"], S_ACCEPTED, "kilojoule / hour" },
    unit! { "ft·lbf/s", "ft*lbf/s", "foot pound-force per second", Power, FOOT * POUND_FORCE, Us, ["lbf·ft/s"], S_US, "foot * force_pound / second" },
    unit! { "ft·lbf/h", "ft*lbf/h", "foot pound-force per hour", Power, FOOT * POUND_FORCE / HOUR, Us, ["lbf·ft/h", "ft·lbf/hr"], S_US, "foot * force_pound / hour" },
    unit! { "hp", "hp", "horsepower (550 ft·lbf/s)", Power, HORSEPOWER, Us, ["HP", "horsepower"], S_HP, "horsepower" },
    // ── Linear (viscous) damping ──────────────────────────────────────────
    unit! { "N·s/m", "N*s/m", "newton second per metre", LinearDamping, 1.0, Si, ["Ns/m", "kg/s"], S_SI, "newton * second / meter" },
    unit! { "N·s/mm", "N*s/mm", "newton second per millimetre", LinearDamping, 1.0 / MILLI, Si, ["Ns/mm"], S_PREFIX, "newton * second / millimeter" },
    unit! { "kN·s/m", "kN*s/m", "kilonewton second per metre", LinearDamping, KILO, Si, ["kNs/m"], S_PREFIX, "kilonewton * second / meter" },
    unit! { "lbf·s/in", "lbf*s/in", "pound-force second per inch", LinearDamping, POUND_FORCE / INCH, Us, ["lbfs/in"], S_US, "force_pound * second / inch" },
    unit! { "lbf·s/ft", "lbf*s/ft", "pound-force second per foot", LinearDamping, POUND_FORCE / FOOT, Us, ["lbfs/ft"], S_US, "force_pound * second / foot" },
    // ── Quadratic (orifice) damping ───────────────────────────────────────
    unit! { "N·s²/m²", "N*s^2/m^2", "newton second squared per square metre", QuadraticDamping, 1.0, Si, ["Ns²/m²", "kg/m"], S_SI, "newton * second**2 / meter**2" },
    unit! { "N·s²/mm²", "N*s^2/mm^2", "newton second squared per square millimetre", QuadraticDamping, 1.0 / (MILLI * MILLI), Si, ["Ns²/mm²"], S_PREFIX, "newton * second**2 / millimeter**2" },
    unit! { "lbf·s²/in²", "lbf*s^2/in^2", "pound-force second squared per square inch", QuadraticDamping, POUND_FORCE / (INCH * INCH), Us, ["lbfs²/in²"], S_US, "force_pound * second**2 / inch**2" },
    unit! { "lbf·s²/ft²", "lbf*s^2/ft^2", "pound-force second squared per square foot", QuadraticDamping, POUND_FORCE / (FOOT * FOOT), Us, ["lbfs²/ft²"], S_US, "force_pound * second**2 / foot**2" },
    // ── Density ───────────────────────────────────────────────────────────
    unit! { "kg/m³", "kg/m^3", "kilogram per cubic metre", Density, 1.0, Si, [], S_SI, "kilogram / meter**3" },
    unit! { "g/cm³", "g/cm^3", "gram per cubic centimetre", Density, MILLI / (CENTI * CENTI * CENTI), Si, ["g/cc", "g/ml", "g/mL"], S_PREFIX, "gram / centimeter**3" },
    unit! { "kg/dm³", "kg/dm^3", "kilogram per cubic decimetre", Density, 1.0 / (DECI * DECI * DECI), Si, [], S_PREFIX, "kilogram / decimeter**3" },
    unit! { "t/m³", "t/m^3", "tonne per cubic metre", Density, TONNE, Si, [], S_ACCEPTED, "metric_ton / meter**3" },
    unit! { "lb/in³", "lb/in^3", "pound per cubic inch", Density, POUND / (INCH * INCH * INCH), Us, ["lbs/in³"], S_US_MASS, "pound / inch**3" },
    unit! { "lb/ft³", "lb/ft^3", "pound per cubic foot", Density, POUND / (FOOT * FOOT * FOOT), Us, ["lbs/ft³", "pcf"], S_US_MASS, "pound / foot**3" },
    // ── Probability ───────────────────────────────────────────────────────
    unit! { "", "", "plain fraction (0 to 1)", Probability, 1.0, Both, [], S_SI, "dimensionless" },
    unit! { "%", "%", "percent", Probability, CENTI, Both, ["percent", "pct"], S_PERCENT, "percent" },
];

/// Every unit the core knows, grouped by kind in the order of [`Dim::ALL`];
/// the first unit of each kind is its SI unit.
pub fn all_units() -> &'static [Unit] {
    UNITS
}

/// The units of one kind, in table order (SI unit first).
pub fn units_of(dim: Dim) -> impl Iterator<Item = &'static Unit> {
    UNITS.iter().filter(move |u| u.dim == dim)
}

/// The unit of kind `dim` spelled `text` (any accepted spelling), if any.
/// This is where a spelling shared by several kinds is resolved by the kind
/// expected: `N·m` is a torque in a torque field and an energy in an energy
/// field; `g` is a gram in a mass field and g_n in an acceleration field.
pub fn find_in(dim: Dim, text: &str) -> Option<&'static Unit> {
    // An exact spelling first (the usual case: `kg`, `mm`, `N/mm`), a plain
    // string comparison; no spelling names two units of one kind (tested
    // below), so it finds the unit the normalised comparison would.
    units_of(dim)
        .find(|u| u.spellings().any(|s| s == text))
        .or_else(|| units_of(dim).find(|u| u.is_spelled(text)))
}

/// Every unit, of any kind, spelled `text`.
pub fn find_any(text: &str) -> impl Iterator<Item = &'static Unit> + '_ {
    UNITS.iter().filter(move |u| u.is_spelled(text))
}

/// Whether two unit spellings are the same after normalisation (see
/// [`Normalized`]). Allocation-free: both are compared char by char.
pub fn same_spelling(a: &str, b: &str) -> bool {
    Normalized::new(a).eq(Normalized::new(b))
}

/// The same comparison ignoring ASCII letter case: used only to suggest a
/// unit in an error message, never to accept one.
pub(crate) fn same_spelling_ignoring_case(a: &str, b: &str) -> bool {
    Normalized::new(a)
        .map(|c| c.to_ascii_lowercase())
        .eq(Normalized::new(b).map(|c| c.to_ascii_lowercase()))
}

/// A unit spelling, normalised char by char without allocating.
///
/// - `·` `⋅` `•` `*` `×` `.`, a hyphen not followed by a digit, and any
///   whitespace are one multiplication sign `·`; runs collapse into one, and
///   none is kept at either end or beside `/`;
/// - `^` is dropped; `²` `³` `¹` become digits and `⁻` becomes `-`, so
///   `m/s²`, `m/s^2` and `m/s2` are one spelling, as are `s⁻¹` and `s^-1`;
/// - `µ` (micro sign) and `μ` (Greek mu) become `u`;
/// - `°`, `º` and `˚` become `deg`;
/// - `⁄` and `∕` become `/`; `″` becomes `"` and `′` `’` become `'`.
pub struct Normalized<'a> {
    chars: std::iter::Peekable<std::str::Chars<'a>>,
    queue: [char; 4],
    queue_len: usize,
    queue_pos: usize,
    pending_sep: bool,
    started: bool,
    after_slash: bool,
}

/// What one input char becomes.
enum Mapped {
    Skip,
    Sep,
    One(char),
    Deg,
}

impl<'a> Normalized<'a> {
    /// Normalise `text`.
    pub fn new(text: &'a str) -> Self {
        Self {
            chars: text.chars().peekable(),
            queue: ['\0'; 4],
            queue_len: 0,
            queue_pos: 0,
            pending_sep: false,
            started: false,
            after_slash: false,
        }
    }

    fn map(c: char, next: Option<char>) -> Mapped {
        match c {
            '^' => Mapped::Skip,
            '·' | '⋅' | '•' | '*' | '×' | '.' => Mapped::Sep,
            '-' | '‐' | '‑' | '−' => {
                if next.is_some_and(|n| n.is_ascii_digit()) {
                    Mapped::One('-')
                } else {
                    Mapped::Sep
                }
            }
            '²' => Mapped::One('2'),
            '³' => Mapped::One('3'),
            '¹' => Mapped::One('1'),
            '⁻' => Mapped::One('-'),
            'µ' | 'μ' => Mapped::One('u'),
            '°' | 'º' | '˚' => Mapped::Deg,
            '⁄' | '∕' => Mapped::One('/'),
            '″' => Mapped::One('"'),
            '′' | '’' => Mapped::One('\''),
            c if c.is_whitespace() => Mapped::Sep,
            c => Mapped::One(c),
        }
    }
}

impl Iterator for Normalized<'_> {
    type Item = char;

    fn next(&mut self) -> Option<char> {
        if self.queue_pos < self.queue_len {
            let c = self.queue.get(self.queue_pos).copied();
            self.queue_pos += 1;
            return c;
        }
        loop {
            // End of input: a pending separator is trailing, so it is dropped.
            let c = self.chars.next()?;
            let next = self.chars.peek().copied();
            let (first, rest): (char, &[char]) = match Self::map(c, next) {
                Mapped::Skip => continue,
                Mapped::Sep => {
                    if self.started && !self.after_slash {
                        self.pending_sep = true;
                    }
                    continue;
                }
                Mapped::One(x) => (x, &[]),
                Mapped::Deg => ('d', &['e', 'g']),
            };
            if first == '/' {
                self.pending_sep = false;
            }
            self.started = true;
            self.after_slash = rest.last().copied().unwrap_or(first) == '/';
            self.queue_len = 0;
            self.queue_pos = 0;
            let out = if self.pending_sep {
                self.pending_sep = false;
                self.push(first);
                '·'
            } else {
                first
            };
            for &r in rest {
                self.push(r);
            }
            return Some(out);
        }
    }
}

impl Normalized<'_> {
    fn push(&mut self, c: char) {
        if let Some(slot) = self.queue.get_mut(self.queue_len) {
            *slot = c;
            self.queue_len += 1;
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn norm(s: &str) -> String {
        Normalized::new(s).collect()
    }

    #[test]
    fn normalisation_unifies_the_usual_spellings() {
        for s in ["N·mm", "N*mm", "N.mm", "N mm", "N⋅mm", "N-mm", " N · mm "] {
            assert_eq!(norm(s), "N·mm", "{s}");
        }
        for s in ["m/s²", "m/s^2", "m/s2", "m / s²"] {
            assert_eq!(norm(s), "m/s2", "{s}");
        }
        assert_eq!(norm("s⁻¹"), "s-1");
        assert_eq!(norm("s^-1"), "s-1");
        assert_eq!(norm("°"), "deg");
        assert_eq!(norm("N·mm/°"), "N·mm/deg");
        assert_eq!(norm("µm"), "um");
        assert_eq!(norm("μm"), "um");
        assert_eq!(norm("in."), "in");
        assert_eq!(norm("sq. in"), "sq·in");
        assert_eq!(norm("kg*m^2"), "kg·m2");
        assert_eq!(norm(""), "");
    }

    #[test]
    fn every_factor_is_finite_and_positive() {
        for u in all_units() {
            assert!(u.factor.is_finite() && u.factor > 0.0, "{}", u.name);
            assert!(!u.source.is_empty() && !u.pint.is_empty(), "{}", u.name);
        }
    }

    #[test]
    fn every_kind_has_units_and_its_si_unit_first() {
        for dim in Dim::ALL {
            let first = units_of(dim).next().expect("every kind has a unit");
            assert_eq!(first.symbol, dim.si_symbol(), "{dim:?}");
            assert_eq!(first.factor, 1.0, "{dim:?}");
        }
    }

    #[test]
    fn no_spelling_names_two_units_of_one_kind() {
        for dim in Dim::ALL {
            let units: Vec<_> = units_of(dim).collect();
            for (i, a) in units.iter().enumerate() {
                for b in &units[i + 1..] {
                    for s in a.spellings() {
                        assert!(
                            !b.is_spelled(s),
                            "{s:?} names both {} and {} ({dim:?})",
                            a.name,
                            b.name
                        );
                    }
                }
            }
        }
    }

    #[test]
    fn symbols_are_clean() {
        for u in all_units() {
            assert_eq!(u.symbol.trim(), u.symbol);
            assert!(u.ascii.is_ascii(), "{}", u.ascii);
            // The ASCII form is the symbol in ASCII; only the subscript of
            // gₙ has no ASCII normal form (its ASCII `g_n` is SP 811's).
            if u.symbol != "gₙ" {
                assert!(
                    same_spelling(u.symbol, u.ascii),
                    "{} vs {}",
                    u.symbol,
                    u.ascii
                );
            }
        }
    }

    #[test]
    fn shared_spellings_resolve_by_the_expected_kind() {
        assert_eq!(find_in(Dim::Mass, "g").map(|u| u.factor), Some(1e-3));
        assert_eq!(
            find_in(Dim::Acceleration, "g").map(|u| u.factor),
            Some(crate::G_N)
        );
        assert_eq!(find_in(Dim::Torque, "Nm").map(|u| u.dim), Some(Dim::Torque));
        assert_eq!(
            find_in(Dim::Energy, "N·m").map(|u| u.dim),
            Some(Dim::Energy)
        );
        assert!(find_in(Dim::Force, "lb").is_none());
        assert!(find_in(Dim::Energy, "ft·lb").is_none());
    }
}
