//! Joulewise core: the physics of stored spring energy, its release, and the
//! impact at the end of travel, with the limits a machine-safety assessment
//! compares them against.
//!
//! The crate is pure: no I/O, no clock, no entropy, no browser. Every
//! quantity is an SI `f64` inside; text with units is parsed and formatted
//! only at the edges ([`units`]). The front ends (web, CLI, tests) call one
//! function, [`assess`](crate::assess::assess), that turns a
//! [`Scenario`](crate::scenario::Scenario) into a [`Report`](crate::report::Report).
//!
//! Module map (one module per physical model):
//! - [`units`]: dimensions, unit parsing and formatting (NIST SP 811 factors).
//! - [`spring`]: force–deflection models and stored energy (EN 13906-1/-2,
//!   EN 16984 Almen–László, gas springs, measured tables, combinations).
//! - [`identify`]: rate of an undocumented spring from field measurements.
//! - [`ode`]: Dormand–Prince 5(4) integrator with dense output and events.
//! - [`mechanism`] and [`release`]: what moves, and its motion after release.
//! - [`contact`]: impact on end-of-travel buffers and on body regions; gaps.
//! - [`sizing`]: the inverse problem, buffer size from limits.
//! - [`tolerance`]: worst-case corners and seeded Monte Carlo.
//! - [`limits`] and [`cautions`]: published limits with sources; cautions.
//! - [`scenario`], [`report`], [`assess`]: the one `Scenario -> Report` API.
//! - [`verification`]: how each figure was checked (data for the tests and
//!   the "how these figures were checked" page).
#![forbid(unsafe_code)]
#![warn(missing_docs)]
// No index or slice that could panic on user input: indexing is denied in
// the library (tests may index), and the few modules that index their own
// fixed-size or validated arrays allow it with the reason beside it.
#![cfg_attr(not(test), deny(clippy::indexing_slicing, clippy::string_slice))]

pub mod assess;
pub mod cautions;
pub mod contact;
pub mod error;
pub mod figure;
pub mod identify;
pub mod limits;
pub mod mechanism;
pub mod ode;
pub mod release;
pub mod report;
pub mod scenario;
pub mod sizing;
pub mod spring;
pub mod tolerance;
pub mod units;
pub mod verification;

pub use error::{InputError, Problem};
pub use figure::{Figure, Provenance, SourceStatus, Verdict};
pub use units::{Dim, UnitSystem};

/// Standard acceleration of gravity g_n = 9.806 65 m/s², exact by definition
/// (3rd CGPM 1901; NIST SP 811 (2008) Appendix B.8).
pub const G_N: f64 = 9.806_65;

/// Program version carried in every report, so a printed figure can be traced
/// to the code that produced it.
pub const VERSION: &str = env!("CARGO_PKG_VERSION");

/// Named tolerances for the crate's own tests, each with the reason for its
/// value. Never write a bare `1e-6` in an assertion: name it here.
#[cfg(test)]
pub(crate) mod test_tol {
    /// Closed-form formula against the same formula evaluated another way:
    /// only floating-point rounding separates them.
    pub const REL_EXACT: f64 = 1e-12;
    /// A textbook value printed to 4 significant figures: half a unit in the
    /// last printed digit is at most 5e-4 relative.
    pub const REL_PRINTED_4SF: f64 = 5e-4;
}
