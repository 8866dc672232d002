//! Spring-wire materials: shear modulus G, Young's modulus E, density ρ and
//! a minimum-tensile-strength law R_m(d), each value with its source and how
//! far it was confirmed.
//!
//! Moduli: EN 10270-1 patented cold-drawn wire G = 81 500 N/mm², E = 206 000
//! N/mm² (a spring maker's data quoting EN 10270-1; status R2). Other grades
//! come from the EN 13906-1 material table as recalled (status M), except the
//! stainless grades, where a spring maker's data sheet was read (R2).
//! Stainless 1.4310 carries an **unresolved discrepancy**: 70 000 N/mm² as
//! recalled from EN 13906-1 against 73 000 N/mm² on the maker's sheet; the
//! table uses 73 000 (better confirmed, and the higher G gives the higher rate
//! and so the higher stored energy at a given deflection) and says so in
//! [`Grade::data`]'s note, which the spring repeats in its notes.
//!
//! Tensile strength: the power law S_ut = A/d^m of Shigley, *Mechanical
//! Engineering Design* 10th ed., Table 10-4, for the nearest US grade. Only
//! the music-wire constants (A = 2 211 MPa·mm^m, m = 0.145) were confirmed,
//! through Problem 10-3 (status R); all other constants are from memory (M),
//! and the mapping of an EN grade onto a US grade is an approximation (M). A
//! tensile strength from the wire's certificate always takes precedence.

use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};

/// A tabulated value with its source and status.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Sourced {
    /// The value in SI units.
    pub value: f64,
    /// Document it comes from.
    pub source: &'static str,
    /// How far it was confirmed.
    pub status: SourceStatus,
}

/// One diameter band of the law S_ut = A/d^m (d in mm, S_ut in MPa).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct StrengthBand {
    /// Smallest wire diameter of the band (mm).
    pub d_min_mm: f64,
    /// Largest wire diameter of the band (mm).
    pub d_max_mm: f64,
    /// Constant A (MPa·mm^m).
    pub a: f64,
    /// Exponent m.
    pub m: f64,
}

/// Minimum tensile strength as a function of wire diameter.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct StrengthLaw {
    /// Diameter bands, in increasing diameter.
    pub bands: &'static [StrengthBand],
    /// Source of the constants.
    pub source: &'static str,
    /// How far they were confirmed.
    pub status: SourceStatus,
}

impl StrengthLaw {
    /// S_ut = A/d^m (Pa) for wire diameter `d` (m); `None` outside the bands
    /// the law was fitted to (no extrapolation).
    pub fn tensile_strength(&self, d: f64) -> Option<f64> {
        let d_mm = d * 1e3;
        self.bands
            .iter()
            .find(|b| d_mm >= b.d_min_mm && d_mm <= b.d_max_mm)
            .map(|b| b.a / d_mm.powf(b.m) * 1e6)
    }
}

/// Tabulated wire grades.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Grade {
    /// EN 10270-1 patented cold-drawn unalloyed wire, grades SL/SM/SH.
    En10270_1Sm,
    /// EN 10270-1 patented cold-drawn unalloyed wire, grades DM/DH (dynamic,
    /// music-wire class).
    En10270_1Dh,
    /// ASTM A228 music wire (Shigley's tables).
    MusicWireA228,
    /// EN 10270-2 oil-hardened and tempered valve-spring wire (unalloyed, VDC).
    En10270_2Valve,
    /// EN 10270-2 oil-hardened and tempered Cr-Si wire (VDSiCr).
    En10270_2CrSi,
    /// Stainless 1.4310 (X10CrNi18-8) to EN 10270-3.
    Stainless1_4310,
    /// Stainless 1.4401 (X5CrNiMo17-12-2) to EN 10270-3.
    Stainless1_4401,
    /// Phosphor bronze CuSn6 (EN 12166 wire, R950 class).
    PhosphorBronzeCuSn6,
}

/// Everything the table knows about a grade.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct GradeData {
    /// Name for people.
    pub name: &'static str,
    /// Shear modulus G (Pa).
    pub shear_modulus: Sourced,
    /// Young's modulus E (Pa).
    pub youngs_modulus: Sourced,
    /// Density ρ (kg/m³).
    pub density: Sourced,
    /// Minimum tensile strength law, when one is known.
    pub strength: Option<StrengthLaw>,
    /// Caveat to show with the values (empty when none).
    pub note: &'static str,
}

const GPA: f64 = 1e9;
const MPA: f64 = 1e6;

const EN13906_TABLE_M: &str = "EN 13906-1, material table (as recalled)";
const MAKER_EN10270_1: &str = "EN 10270-1 data as quoted by a spring maker";
const MAKER_STAINLESS: &str = "spring maker's data sheet for EN 10270-3 wire";
const STEEL_DENSITY: &str = "7.85 kg/dm³ for spring steel (spring maker's data)";
const SHIGLEY_T10_4: &str = "Shigley MED 10th ed., Table 10-4 (constants as recalled)";

/// Music wire, Shigley Table 10-4; confirmed through Problem 10-3 (S_ut =
/// 1 936 MPa at d = 2.5 mm).
const LAW_MUSIC: StrengthLaw = StrengthLaw {
    bands: &[StrengthBand {
        d_min_mm: 0.10,
        d_max_mm: 6.5,
        a: 2211.0,
        m: 0.145,
    }],
    source: "Shigley MED 10th ed., Table 10-4, music wire A228 (confirmed through Problem 10-3)",
    status: SourceStatus::Confirmed,
};
const LAW_HARD_DRAWN: StrengthLaw = StrengthLaw {
    bands: &[StrengthBand {
        d_min_mm: 0.7,
        d_max_mm: 12.7,
        a: 1783.0,
        m: 0.190,
    }],
    source: SHIGLEY_T10_4,
    status: SourceStatus::FromMemory,
};
const LAW_OQT: StrengthLaw = StrengthLaw {
    bands: &[StrengthBand {
        d_min_mm: 0.5,
        d_max_mm: 12.7,
        a: 1855.0,
        m: 0.187,
    }],
    source: SHIGLEY_T10_4,
    status: SourceStatus::FromMemory,
};
const LAW_CRSI: StrengthLaw = StrengthLaw {
    bands: &[StrengthBand {
        d_min_mm: 1.6,
        d_max_mm: 9.5,
        a: 1974.0,
        m: 0.108,
    }],
    source: SHIGLEY_T10_4,
    status: SourceStatus::FromMemory,
};
const LAW_302: StrengthLaw = StrengthLaw {
    bands: &[
        StrengthBand {
            d_min_mm: 0.3,
            d_max_mm: 2.5,
            a: 1867.0,
            m: 0.146,
        },
        StrengthBand {
            d_min_mm: 2.5,
            d_max_mm: 5.0,
            a: 2065.0,
            m: 0.263,
        },
        StrengthBand {
            d_min_mm: 5.0,
            d_max_mm: 10.0,
            a: 2911.0,
            m: 0.478,
        },
    ],
    source: SHIGLEY_T10_4,
    status: SourceStatus::FromMemory,
};
const LAW_PHOSPHOR_BRONZE: StrengthLaw = StrengthLaw {
    bands: &[
        StrengthBand {
            d_min_mm: 0.1,
            d_max_mm: 0.6,
            a: 1000.0,
            m: 0.0,
        },
        StrengthBand {
            d_min_mm: 0.6,
            d_max_mm: 2.0,
            a: 913.0,
            m: 0.028,
        },
        StrengthBand {
            d_min_mm: 2.0,
            d_max_mm: 7.5,
            a: 932.0,
            m: 0.064,
        },
    ],
    source: SHIGLEY_T10_4,
    status: SourceStatus::FromMemory,
};

impl Grade {
    /// Every tabulated grade, for pick lists and tests.
    pub const ALL: [Grade; 8] = [
        Grade::En10270_1Sm,
        Grade::En10270_1Dh,
        Grade::MusicWireA228,
        Grade::En10270_2Valve,
        Grade::En10270_2CrSi,
        Grade::Stainless1_4310,
        Grade::Stainless1_4401,
        Grade::PhosphorBronzeCuSn6,
    ];

    /// The table row of this grade.
    pub fn data(self) -> GradeData {
        let steel_density = Sourced {
            value: 7850.0,
            source: STEEL_DENSITY,
            status: SourceStatus::Secondary,
        };
        let en10270_1 = |name, strength| GradeData {
            name,
            shear_modulus: Sourced {
                value: 81.5 * GPA,
                source: MAKER_EN10270_1,
                status: SourceStatus::Secondary,
            },
            youngs_modulus: Sourced {
                value: 206.0 * GPA,
                source: MAKER_EN10270_1,
                status: SourceStatus::Secondary,
            },
            density: steel_density,
            strength: Some(strength),
            note: "tensile strength from the nearest US grade's law (Shigley Table 10-4), an \
                   approximation of the EN 10270-1 minimum values: enter the certificate value",
        };
        let en10270_2 = |name, strength| GradeData {
            name,
            shear_modulus: Sourced {
                value: 79.5 * GPA,
                source: EN13906_TABLE_M,
                status: SourceStatus::FromMemory,
            },
            youngs_modulus: Sourced {
                value: 206.0 * GPA,
                source: EN13906_TABLE_M,
                status: SourceStatus::FromMemory,
            },
            density: steel_density,
            strength: Some(strength),
            note: "G and E from memory of EN 13906-1; tensile strength from the nearest US \
                   grade's law (Shigley Table 10-4, from memory): enter the certificate value",
        };
        match self {
            Grade::En10270_1Sm => en10270_1(
                "patented cold-drawn steel EN 10270-1 SL/SM/SH",
                LAW_HARD_DRAWN,
            ),
            Grade::En10270_1Dh => en10270_1(
                "patented cold-drawn steel EN 10270-1 DM/DH",
                StrengthLaw {
                    source: "Shigley MED 10th ed., Table 10-4, music wire A228 (confirmed through \
                             Problem 10-3); its use for EN 10270-1 DH is an approximation",
                    status: SourceStatus::FromMemory,
                    ..LAW_MUSIC
                },
            ),
            Grade::MusicWireA228 => GradeData {
                name: "music wire ASTM A228",
                shear_modulus: Sourced {
                    value: 81.0 * GPA,
                    source: "Shigley MED 10th ed., Table 10-5 (d = 1.61–3 mm)",
                    status: SourceStatus::Confirmed,
                },
                youngs_modulus: Sourced {
                    value: 196.5 * GPA,
                    source: "Shigley MED 10th ed., Table 10-5 (d = 1.61–3 mm, as recalled)",
                    status: SourceStatus::FromMemory,
                },
                density: steel_density,
                strength: Some(LAW_MUSIC),
                note: "Shigley Table 10-5 gives G and E by diameter band; the 1.61–3 mm values \
                       are used for all diameters (about ±2 % elsewhere, from memory)",
            },
            Grade::En10270_2Valve => en10270_2(
                "oil-hardened valve-spring wire EN 10270-2 (VDC)",
                LAW_OQT,
            ),
            Grade::En10270_2CrSi => en10270_2("oil-hardened Cr-Si wire EN 10270-2 (VDSiCr)", LAW_CRSI),
            Grade::Stainless1_4310 => GradeData {
                name: "stainless 1.4310 EN 10270-3",
                shear_modulus: Sourced {
                    value: 73.0 * GPA,
                    source: MAKER_STAINLESS,
                    status: SourceStatus::Secondary,
                },
                youngs_modulus: Sourced {
                    value: 185.0 * GPA,
                    source: MAKER_STAINLESS,
                    status: SourceStatus::Secondary,
                },
                density: Sourced {
                    value: 7900.0,
                    source: "typical density of 18-8 stainless steel (as recalled)",
                    status: SourceStatus::FromMemory,
                },
                strength: Some(LAW_302),
                note: "unresolved discrepancy in G: 73 000 N/mm² on a spring maker's sheet (used) \
                       against 70 000 N/mm² as recalled from EN 13906-1; the rate may be up to \
                       4 % lower than shown. Tensile strength from AISI 302 (Shigley Table 10-4, \
                       from memory): enter the certificate value",
            },
            Grade::Stainless1_4401 => GradeData {
                name: "stainless 1.4401 EN 10270-3",
                shear_modulus: Sourced {
                    value: 71.0 * GPA,
                    source: MAKER_STAINLESS,
                    status: SourceStatus::Secondary,
                },
                youngs_modulus: Sourced {
                    value: 180.0 * GPA,
                    source: MAKER_STAINLESS,
                    status: SourceStatus::Secondary,
                },
                density: Sourced {
                    value: 8000.0,
                    source: "typical density of Mo-alloyed stainless steel (as recalled)",
                    status: SourceStatus::FromMemory,
                },
                strength: None,
                note: "no tensile-strength law on file: enter the certificate value to get a stress ratio",
            },
            Grade::PhosphorBronzeCuSn6 => GradeData {
                name: "phosphor bronze CuSn6",
                shear_modulus: Sourced {
                    value: 42.0 * GPA,
                    source: EN13906_TABLE_M,
                    status: SourceStatus::FromMemory,
                },
                youngs_modulus: Sourced {
                    value: 115.0 * GPA,
                    source: EN13906_TABLE_M,
                    status: SourceStatus::FromMemory,
                },
                density: Sourced {
                    value: 8800.0,
                    source: "typical density of tin bronze (as recalled)",
                    status: SourceStatus::FromMemory,
                },
                strength: Some(LAW_PHOSPHOR_BRONZE),
                note: "G, E and density from memory; tensile strength from ASTM B159 (Shigley \
                       Table 10-4, from memory): enter the certificate value",
            },
        }
    }
}

/// The wire material of a spring: a tabulated grade or user values.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Material {
    /// A grade from the table in this module.
    Grade {
        /// Which grade.
        grade: Grade,
    },
    /// Values entered by the user (from the wire certificate or a data sheet).
    Custom {
        /// Name for the report, e.g. `spring steel per drawing 4711`.
        #[serde(default)]
        name: Option<String>,
        /// Shear modulus G (Pa), > 0.
        shear_modulus: f64,
        /// Young's modulus E (Pa), needed for torsion springs and the
        /// buckling check.
        #[serde(default)]
        youngs_modulus: Option<f64>,
        /// Density (kg/m³), needed for the spring's own mass.
        #[serde(default)]
        density: Option<f64>,
        /// Tensile strength R_m of this wire (Pa), for the stress ratio.
        #[serde(default)]
        tensile_strength: Option<f64>,
    },
}

/// A resolved material: the values a spring model computes with.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MaterialProps {
    /// Name for the report.
    pub name: String,
    /// Shear modulus G (Pa).
    pub shear_modulus: f64,
    /// Young's modulus E (Pa), when known.
    pub youngs_modulus: Option<f64>,
    /// Density (kg/m³), when known.
    pub density: Option<f64>,
    /// Fixed tensile strength (Pa) entered by the user.
    pub fixed_strength: Option<f64>,
    /// Tensile-strength law of the grade, when tabulated.
    pub strength_law: Option<StrengthLaw>,
    /// One line per value: where it came from.
    pub sources: Vec<String>,
    /// Caveats to repeat in the spring's notes.
    pub notes: Vec<String>,
}

impl MaterialProps {
    /// Tensile strength R_m (Pa) of wire of diameter `d` (m) with the source
    /// used: the entered value if any, else the grade's law; `None` when
    /// neither applies (then the stress ratio cannot be given).
    pub fn tensile_strength(&self, d: f64) -> Option<(f64, String)> {
        if let Some(r) = self.fixed_strength {
            return Some((r, "tensile strength entered by the user".into()));
        }
        let law = self.strength_law?;
        law.tensile_strength(d).map(|r| {
            let status = if law.status == SourceStatus::Confirmed {
                "confirmed"
            } else {
                "from memory"
            };
            (r, format!("S_ut = A/d^m, {} ({status})", law.source))
        })
    }
}

fn cite(what: &str, s: &Sourced, unit_factor: f64, unit: &str) -> String {
    format!(
        "{what} = {} {unit}: {} ({})",
        s.value / unit_factor,
        s.source,
        s.status.describe()
    )
}

impl Material {
    /// Resolve to the values used in calculation, validating custom values.
    /// A `tensile_strength_override` (Pa), when given, replaces the grade's law.
    ///
    /// # Errors
    /// A custom value that is not finite and positive.
    pub fn resolve(
        &self,
        tensile_strength_override: Option<f64>,
    ) -> Result<MaterialProps, InputError> {
        if let Some(r) = tensile_strength_override {
            check::positive("tensile_strength", r)?;
        }
        match self {
            Material::Grade { grade } => {
                let g = grade.data();
                let mut notes = Vec::new();
                if !g.note.is_empty() {
                    notes.push(format!("{}: {}", g.name, g.note));
                }
                Ok(MaterialProps {
                    name: g.name.into(),
                    shear_modulus: g.shear_modulus.value,
                    youngs_modulus: Some(g.youngs_modulus.value),
                    density: Some(g.density.value),
                    fixed_strength: tensile_strength_override,
                    strength_law: g.strength,
                    sources: vec![
                        cite("G", &g.shear_modulus, MPA, "N/mm²"),
                        cite("E", &g.youngs_modulus, MPA, "N/mm²"),
                        cite("ρ", &g.density, 1.0, "kg/m³"),
                    ],
                    notes,
                })
            }
            Material::Custom {
                name,
                shear_modulus,
                youngs_modulus,
                density,
                tensile_strength,
            } => {
                check::positive("material.shear_modulus", *shear_modulus)?;
                if let Some(e) = youngs_modulus {
                    check::positive("material.youngs_modulus", *e)?;
                    if *e <= *shear_modulus {
                        return Err(InputError::invalid(
                            "material.youngs_modulus",
                            "must exceed the shear modulus (E = 2·G·(1 + ν) with ν > 0)",
                        ));
                    }
                }
                if let Some(r) = density {
                    check::positive("material.density", *r)?;
                }
                if let Some(r) = tensile_strength {
                    check::positive("material.tensile_strength", *r)?;
                }
                Ok(MaterialProps {
                    name: name
                        .clone()
                        .unwrap_or_else(|| "material entered by the user".into()),
                    shear_modulus: *shear_modulus,
                    youngs_modulus: *youngs_modulus,
                    density: *density,
                    fixed_strength: tensile_strength_override.or(*tensile_strength),
                    strength_law: None,
                    sources: vec!["G, E, ρ and R_m entered by the user".into()],
                    notes: Vec::new(),
                })
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_PRINTED_4SF;

    #[test]
    fn music_wire_strength_matches_shigley_problem_10_3() {
        // Shigley MED 10th ed., Problem 10-3 (status R): d = 2.5 mm,
        // A = 2 211 MPa·mm^m, m = 0.145 → S_ut = 1 936 MPa (printed to 4 s.f.).
        let r = Grade::MusicWireA228
            .data()
            .strength
            .unwrap()
            .tensile_strength(2.5e-3)
            .unwrap();
        assert!((r / 1936e6 - 1.0).abs() < REL_PRINTED_4SF);
    }

    #[test]
    fn en10270_1_moduli_as_quoted() {
        // reference-values.md §6: G = 81 500, E = 206 000 N/mm² (status R2).
        let d = Grade::En10270_1Dh.data();
        assert_eq!(d.shear_modulus.value, 81.5e9);
        assert_eq!(d.youngs_modulus.value, 206e9);
        assert_eq!(d.shear_modulus.status, SourceStatus::Secondary);
    }

    #[test]
    fn stainless_1_4310_discrepancy_is_surfaced() {
        let m = Material::Grade {
            grade: Grade::Stainless1_4310,
        }
        .resolve(None)
        .unwrap();
        assert_eq!(m.shear_modulus, 73e9);
        assert!(m
            .notes
            .iter()
            .any(|n| n.contains("70 000") && n.contains("73 000")));
    }

    #[test]
    fn every_grade_is_physical_and_sourced() {
        for g in Grade::ALL {
            let d = g.data();
            assert!(d.youngs_modulus.value > d.shear_modulus.value, "{g:?}");
            // ν = E/(2G) − 1 lies between 0.2 and 0.45 for metals (common practice).
            let nu = d.youngs_modulus.value / (2.0 * d.shear_modulus.value) - 1.0;
            assert!((0.2..0.45).contains(&nu), "{g:?}: ν = {nu}");
            assert!(!d.shear_modulus.source.is_empty() && !d.density.source.is_empty());
        }
    }

    #[test]
    fn strength_law_refuses_to_extrapolate() {
        assert!(LAW_CRSI.tensile_strength(1.0e-3).is_none());
        assert!(LAW_CRSI.tensile_strength(5.0e-3).is_some());
    }

    #[test]
    fn custom_material_is_validated() {
        let m = Material::Custom {
            name: None,
            shear_modulus: 80e9,
            youngs_modulus: Some(50e9),
            density: None,
            tensile_strength: None,
        };
        assert_eq!(
            m.resolve(None).unwrap_err().field,
            "material.youngs_modulus"
        );
    }
}
