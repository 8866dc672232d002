//! The stored record of one assessment, and how older records are read.
//!
//! A record is one JSON text per assessment:
//! `{"record_format": 1, "schema_version": 1, "id", "revision", "saved_ms",
//! "writer", "verdict", "scenario": {…}}`. `record_format` versions the
//! envelope; `schema_version` is the core's scenario format version
//! ([`SCHEMA_VERSION`]) at the time of writing, and the scenario inside
//! carries its own. Reading ([`decode`]):
//! 1. The text is parsed; a text that is not a JSON object is corrupt.
//! 2. The envelope is upgraded step by step to [`RECORD_FORMAT`]. Format 0
//!    is a bare scenario stored without an envelope (what a sheet without
//!    a library would have kept); it is wrapped with revision 0.
//!    A format newer than this program's is refused, never guessed.
//! 3. The scenario goes through [`Scenario::from_json`], which migrates
//!    older scenario versions and names the field path of any damage.
//!
//! The texts the user typed are stored as typed, including those the core
//! refuses (`Value.text`); nothing is dropped on the way in or out.

use joulewise_core::scenario::{Scenario, SCHEMA_VERSION};
use serde::Deserialize;
use serde_json::Value as Json;

/// Envelope format written by this program.
pub const RECORD_FORMAT: u32 = 1;

/// One stored assessment.
#[derive(Debug, Clone, PartialEq)]
pub struct Record {
    /// Key in the store (stable for the life of the assessment).
    pub id: String,
    /// Counts the writes of this assessment; a write expects the stored
    /// revision to be the one it started from (two tabs, see `keep`).
    pub revision: u64,
    /// When it was last written, milliseconds since 1970 (browser clock).
    pub saved_ms: f64,
    /// The tab that last wrote it (to tell our own writes from others').
    pub writer: String,
    /// Worst verdict key when last written (`pass`, `fail`, `unknown`,
    /// `not-applicable`), empty when unknown.
    pub verdict: String,
    /// The assessment, texts as typed.
    pub scenario: Scenario,
}

#[derive(Deserialize)]
struct Envelope {
    // `record_format` and `schema_version` are read from the raw object
    // (to pick the upgrade step); the scenario carries its own version.
    id: String,
    #[serde(default)]
    revision: u64,
    #[serde(default)]
    saved_ms: f64,
    #[serde(default)]
    writer: String,
    #[serde(default)]
    verdict: String,
    scenario: Json,
}

/// Why a stored text could not be read (the record is quarantined).
#[derive(Debug, Clone, PartialEq)]
pub struct Unreadable {
    /// What is wrong, in words.
    pub reason: String,
}

/// The record as stored text. Written by hand around the scenario's
/// compact JSON (the serialiser the scenario hash already uses), so the
/// WebAssembly carries no second serialiser of the whole scenario.
pub fn encode(r: &Record) -> String {
    let scenario = serde_json::to_string(&r.scenario).unwrap_or_default();
    let text = |s: &str| serde_json::to_string(s).unwrap_or_default();
    format!(
        "{{\"record_format\":{RECORD_FORMAT},\"schema_version\":{SCHEMA_VERSION},\"id\":{},\"revision\":{},\"saved_ms\":{},\"writer\":{},\"verdict\":{},\"scenario\":{scenario}}}",
        text(&r.id),
        r.revision,
        if r.saved_ms.is_finite() { r.saved_ms.round() } else { 0.0 },
        text(&r.writer),
        text(&r.verdict),
    )
}

/// Read a stored text kept under `key`, upgrading an older envelope.
///
/// # Errors
/// Text that is not JSON, an envelope of an unknown or newer format, or a
/// scenario the core refuses (with its field path).
pub fn decode(key: &str, raw: &str) -> Result<Record, Unreadable> {
    let bad = |reason: String| Unreadable { reason };
    let value: Json =
        serde_json::from_str(raw).map_err(|e| bad(format!("not readable JSON ({e})")))?;
    let Json::Object(map) = &value else {
        return Err(bad("not a JSON object".into()));
    };
    let format = match map.get("record_format") {
        None => 0,
        Some(v) => v
            .as_u64()
            .and_then(|v| u32::try_from(v).ok())
            .ok_or_else(|| bad("record_format is not a whole number".into()))?,
    };
    let env = match format {
        0 => Envelope {
            id: key.to_string(),
            revision: 0,
            saved_ms: 0.0,
            writer: String::new(),
            verdict: String::new(),
            scenario: value,
        },
        RECORD_FORMAT => serde_json::from_value(value)
            .map_err(|e| bad(format!("the record's envelope is damaged ({e})")))?,
        n => {
            return Err(bad(format!(
                "record format {n} was written by a newer Joulewise (this one reads up to {RECORD_FORMAT})"
            )))
        }
    };
    let text = serde_json::to_string(&env.scenario).unwrap_or_default();
    let scenario = Scenario::from_json(&text)
        .map_err(|e| bad(format!("the assessment inside is damaged: {e}")))?;
    Ok(Record {
        id: if env.id.is_empty() {
            key.to_string()
        } else {
            env.id
        },
        revision: env.revision,
        saved_ms: if env.saved_ms.is_finite() {
            env.saved_ms
        } else {
            0.0
        },
        writer: env.writer,
        verdict: env.verdict,
        scenario,
    })
}
