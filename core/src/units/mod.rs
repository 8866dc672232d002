//! Units: parse text typed by a user into an SI value of an expected
//! dimension, and format SI values back in SI or US customary units.
//!
//! Conversion factors are exact where a definition makes them so (NIST SP 811
//! (2008) Appendix B.8: 1 in = 0.0254 m, 1 lb = 0.453 592 37 kg,
//! g_n = 9.806 65 m/s², all exact).

mod dim;
pub use dim::Dim;

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
