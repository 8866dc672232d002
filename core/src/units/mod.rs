//! Units: parse text typed by a user into an SI value of an expected
//! dimension, and format SI values back in SI or US customary units.
//!
//! Conversion factors are exact where a definition makes them so (NIST SP 811
//! (2008) Appendix B.8: 1 in = 0.0254 m, 1 lb = 0.453 592 37 kg,
//! g_n = 9.806 65 m/s², all exact); US customary factors are derived in code
//! from those definitions ([`factor`]). The table ([`all_units`]) lists every
//! unit with its spellings, kind, factor, system and source; [`parse_quantity`]
//! reads `12.5 mm`, `2,4 N/mm`, `3 lbf/in`, `100°`; [`format_quantity`] writes
//! an SI value in a working unit of either system.

mod dim;
mod format;
mod parse;
mod table;
mod tagged;

pub use dim::Dim;
pub use format::{
    convert_to, display_unit, format_in, format_quantity, format_sig, Formatted, DEFAULT_SIG,
    NOT_A_NUMBER,
};
pub use parse::{examples, parse_quantity, parse_with_unit, UnitError, MAX_INPUT_LEN};
pub use table::{
    all_units, factor, find_any, find_in, same_spelling, units_of, Normalized, Unit, UnitFamily,
};
pub use tagged::{render, tag};

use serde::{Deserialize, Serialize};

/// Which unit system figures are displayed in. Never changes stored inputs.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum UnitSystem {
    /// SI (N, mm, kg, J ...).
    #[default]
    Si,
    /// US customary (lbf, in, lb, ft·lbf ...).
    Us,
}
