//! Upgrading scenario files written by older versions of the format.
//!
//! Every file carries `schema_version`. Reading a file:
//! 1. A version newer than [`SCHEMA_VERSION`] is refused: the user is told
//!    the file was written by a newer Joulewise, and nothing is guessed.
//! 2. An older version is upgraded one step at a time, each step a pure
//!    function `JSON value (version n) -> JSON value (version n + 1)` that
//!    moves, renames or defaults fields and never drops what the user typed
//!    (a field that has no place any more is kept under `identity.notes`).
//! 3. The result is deserialised into the current types with field paths in
//!    the errors.
//!
//! How to change the format: add the new field with a serde default when
//! that is enough (no new version). When a field is renamed, moved or its
//! meaning changes, bump [`SCHEMA_VERSION`], add a step `v{n}_to_v{n+1}`
//! here, and a test that a version-n file reads with the same figures.
//!
//! History: version 1 (first published format).

use super::{FileError, SCHEMA_VERSION};
use serde_json::Value;

/// Upgrade a parsed file to the current version.
///
/// # Errors
/// Missing or non-integer `schema_version`, a version newer than this
/// program's, or a file that is not a JSON object.
pub fn to_current(value: Value) -> Result<Value, FileError> {
    let Value::Object(map) = &value else {
        return Err(FileError {
            path: String::new(),
            message: "a scenario file is a JSON object with a \"schema_version\" field".into(),
        });
    };
    let version = match map.get("schema_version") {
        Some(Value::Number(n)) => n.as_u64(),
        None => {
            return Err(FileError {
                path: "schema_version".into(),
                message: format!(
                    "missing: this does not look like a Joulewise scenario (expected \"schema_version\": {SCHEMA_VERSION})"
                ),
            })
        }
        _ => None,
    };
    let Some(version) = version else {
        return Err(FileError {
            path: "schema_version".into(),
            message: format!(
                "must be a whole number such as {SCHEMA_VERSION} (no quotes, no sign, no decimal point)"
            ),
        });
    };
    if version == 0 {
        return Err(FileError {
            path: "schema_version".into(),
            message: format!("no format version 0 exists; the current one is {SCHEMA_VERSION}"),
        });
    }
    if version > u64::from(SCHEMA_VERSION) {
        return Err(FileError {
            path: "schema_version".into(),
            message: format!(
                "this file was written in format version {version} by a newer Joulewise; \
                 this one reads versions up to {SCHEMA_VERSION}. Open it with the newer version."
            ),
        });
    }
    // Steps from older versions go here, in order (none yet: version 1 is
    // the first published format).
    Ok(value)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn newer_versions_and_foreign_files_are_refused_with_a_reason() {
        let newer = serde_json::json!({"schema_version": SCHEMA_VERSION + 1});
        let e = to_current(newer).unwrap_err();
        assert!(e.message.contains("newer Joulewise"), "{}", e.message);
        let foreign = serde_json::json!({"name": "something else"});
        assert_eq!(to_current(foreign).unwrap_err().path, "schema_version");
        assert!(to_current(serde_json::json!([1, 2])).is_err());
        assert!(to_current(serde_json::json!({"schema_version": "1"})).is_err());
    }
}
