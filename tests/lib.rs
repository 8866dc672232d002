//! Shared helpers for the cross-crate test suites (tolerances, paths) and
//! the robustness checks shared with the fuzz targets ([`robust`]).
#![forbid(unsafe_code)]

use std::path::PathBuf;

pub mod robust;

/// The workspace root (parent of this crate's folder).
pub fn workspace_root() -> PathBuf {
    let here = PathBuf::from(env!("CARGO_MANIFEST_DIR"));
    here.parent().map(PathBuf::from).unwrap_or(here)
}
