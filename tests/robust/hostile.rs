//! A corpus of hostile and broken scenario files, generated (never
//! committed: one of them is 50 MB), for the core's import test
//! (`tests/hostile_files.rs`) and the web sheet's end-to-end import test.
//! Write it with `cargo run -p joulewise-tests --bin hostile-corpus -- DIR`:
//! one file per case plus `manifest.json` listing each file with its
//! category and what the refusal must say.
//!
//! Every file must be refused by `Scenario::from_bytes` (the core's file
//! reader: size, encoding, then `Scenario::from_json`) with a message that
//! names the problem, and with the field path where the problem sits in one
//! field. Categories: truncated files, a wrong type in each field, wrong
//! schema versions, huge numbers, deep nesting, oversized files, wrong
//! encodings, valid JSON of other shapes, empty files, binary garbage, and
//! JSON syntax a hand edit produces.

use super::mutate::SplitMix;
use joulewise_core::scenario::{demos, MAX_FILE_BYTES};
use serde::Serialize;
use serde_json::{json, Value as Json};

/// One hostile file.
#[derive(Debug, Clone, Serialize)]
pub struct HostileFile {
    /// File name (unique, safe on every file system).
    pub name: String,
    /// What kind of damage it carries.
    pub category: &'static str,
    /// What the case is, in words.
    pub description: String,
    /// The field path the refusal must name (`FileError::path`), when the
    /// damage sits in one field.
    pub path: Option<String>,
    /// Words the refusal's message must contain (any one of them, case
    /// insensitive), so it names the problem.
    pub message_has: Vec<&'static str>,
    /// The bytes (not written into the manifest).
    #[serde(skip)]
    pub bytes: Vec<u8>,
}

/// Size of the oversized file (50 MB).
pub const HUGE_FILE_BYTES: usize = 50 * 1024 * 1024;

/// Depth of the deeply nested files.
pub const DEEP_NESTING: usize = 10_000;

struct Corpus {
    files: Vec<HostileFile>,
}

impl Corpus {
    fn add(
        &mut self,
        category: &'static str,
        name: &str,
        description: &str,
        path: Option<&str>,
        message_has: &[&'static str],
        bytes: Vec<u8>,
    ) {
        let n = self.files.len();
        self.files.push(HostileFile {
            name: format!("{n:03}-{category}-{name}.json"),
            category,
            description: description.to_string(),
            path: path.map(str::to_string),
            message_has: message_has.to_vec(),
            bytes,
        });
    }
}

fn demo_trees() -> Vec<(&'static str, Json)> {
    demos::all()
        .into_iter()
        .filter_map(|d| {
            serde_json::from_str((d.build)().to_json().as_str())
                .ok()
                .map(|j| (d.key, j))
        })
        .collect()
}

/// Every leaf and inner node of a tree, with its dotted path (the root
/// excluded).
fn paths(node: &Json, prefix: &str, out: &mut Vec<(String, Json)>) {
    let children: Vec<(String, &Json)> = match node {
        Json::Object(m) => m.iter().map(|(k, v)| (k.clone(), v)).collect(),
        Json::Array(a) => a
            .iter()
            .enumerate()
            .map(|(i, v)| (i.to_string(), v))
            .collect(),
        _ => return,
    };
    for (k, v) in children {
        let p = if prefix.is_empty() {
            k
        } else {
            format!("{prefix}.{k}")
        };
        out.push((p.clone(), v.clone()));
        paths(v, &p, out);
    }
}

fn set(root: &mut Json, path: &str, value: Json) {
    let mut node = root;
    for seg in path.split('.') {
        let next = match node {
            Json::Object(m) => m.get_mut(seg),
            Json::Array(a) => seg.parse::<usize>().ok().and_then(|i| a.get_mut(i)),
            _ => None,
        };
        match next {
            Some(n) => node = n,
            None => return,
        }
    }
    *node = value;
}

/// A value of another JSON type than `v`, never `null` (which an optional
/// field accepts).
fn other_type(v: &Json) -> Json {
    match v {
        Json::String(_) => json!(42),
        Json::Number(_) => json!("forty-two"),
        Json::Bool(_) => json!("yes"),
        Json::Object(_) => json!([1, 2, 3]),
        Json::Array(_) => json!({ "item": 1 }),
        // A number: an object would only be named by the enclosing
        // section when it sits inside a tagged choice (see the path note in
        // `Scenario::from_value`).
        Json::Null => json!(42),
    }
}

fn pretty(v: &Json) -> Vec<u8> {
    serde_json::to_vec_pretty(v).unwrap_or_default()
}

/// Latin-1 bytes of a text whose characters are all below U+0100; other
/// characters become `?`.
fn latin1(text: &str) -> Vec<u8> {
    text.chars()
        .map(|c| u8::try_from(u32::from(c)).unwrap_or(b'?'))
        .collect()
}

fn utf16(text: &str, little: bool, bom: bool) -> Vec<u8> {
    let mut out = Vec::new();
    let units = (if bom { "\u{feff}" } else { "" })
        .encode_utf16()
        .chain(text.encode_utf16());
    for u in units {
        let b = if little {
            u.to_le_bytes()
        } else {
            u.to_be_bytes()
        };
        out.extend_from_slice(&b);
    }
    out
}

/// The whole corpus. Deterministic: the same bytes on every run.
pub fn corpus() -> Vec<HostileFile> {
    let mut c = Corpus { files: Vec::new() };
    let trees = demo_trees();
    let door = trees
        .iter()
        .find(|(k, _)| *k == "guard-door")
        .map(|(_, t)| t.clone())
        .unwrap_or(Json::Null);
    let door_text = String::from_utf8(pretty(&door)).unwrap_or_default();

    // Truncated: each demo cut at 30 points (every cut leaves an unclosed
    // object; cuts inside a multi-byte character also break the encoding).
    for (key, tree) in &trees {
        let bytes = pretty(tree);
        let len = bytes.len();
        for k in 1..=30 {
            let at = k * len / 31;
            c.add(
                "truncated",
                &format!("{key}-at-{at}"),
                &format!("the demo {key} cut after {at} of {len} bytes"),
                None,
                &["ends before", "cut short", "not utf-8", "EOF"],
                bytes.get(..at).unwrap_or(&[]).to_vec(),
            );
        }
    }

    // Wrong type in each field of the guard-door demo.
    let mut fields = Vec::new();
    paths(&door, "", &mut fields);
    for (path, value) in &fields {
        if path == "schema_version" {
            continue; // its own category below
        }
        let mut t = door.clone();
        let wrong = other_type(value);
        set(&mut t, path, wrong.clone());
        c.add(
            "wrong-type",
            &path.replace('.', "_"),
            &format!("{path} set to {wrong}"),
            Some(path),
            &["invalid type", "invalid length", "expected"],
            pretty(&t),
        );
    }

    // Unknown and missing fields.
    for (path, description) in [
        ("part.mas", "a misspelt field inside the part"),
        ("colour", "a field no scenario has"),
        ("spring.model.rate.unit", "an extra key in a numeric input"),
    ] {
        let mut t = door.clone();
        let (parent, key) = path.rsplit_once('.').unwrap_or(("", path));
        let node = if parent.is_empty() {
            Some(&mut t)
        } else {
            let mut n = Some(&mut t);
            for seg in parent.split('.') {
                n = n.and_then(|x| x.get_mut(seg));
            }
            n
        };
        if let Some(Json::Object(m)) = node {
            m.insert(key.to_string(), json!(1));
        }
        c.add(
            "unknown-field",
            &path.replace('.', "_"),
            description,
            Some(path),
            &["unknown field"],
            pretty(&t),
        );
    }
    for (path, field) in [("", "part"), ("part", "travel"), ("spring.model", "rate")] {
        let mut t = door.clone();
        let mut n = Some(&mut t);
        for seg in path.split('.').filter(|s| !s.is_empty()) {
            n = n.and_then(|x| x.get_mut(seg));
        }
        if let Some(Json::Object(m)) = n {
            m.remove(field);
        }
        let name = if path.is_empty() {
            field.to_string()
        } else {
            format!("{path}.{field}")
        };
        c.add(
            "missing-field",
            &name.replace('.', "_"),
            &format!("{name} left out"),
            None,
            &["missing field"],
            pretty(&t),
        );
    }

    // Schema versions.
    let versions: [(&str, Option<Json>, &'static str); 11] = [
        ("0", Some(json!(0)), "no format version 0"),
        ("2", Some(json!(2)), "newer"),
        ("99", Some(json!(99)), "newer"),
        ("minus-1", Some(json!(-1)), "whole number"),
        ("string-1", Some(json!("1")), "whole number"),
        ("float-1", Some(json!(1.0)), "whole number"),
        ("float-1.5", Some(json!(1.5)), "whole number"),
        ("null", Some(Json::Null), "whole number"),
        ("bool", Some(json!(true)), "whole number"),
        ("array", Some(json!([1])), "whole number"),
        ("missing", None, "missing"),
    ];
    for (name, v, says) in versions {
        let mut t = door.clone();
        if let Json::Object(m) = &mut t {
            match v {
                Some(v) => {
                    m.insert("schema_version".into(), v);
                }
                None => {
                    m.remove("schema_version");
                }
            }
        }
        c.add(
            "schema-version",
            name,
            &format!("schema_version {name}"),
            Some("schema_version"),
            &[says],
            pretty(&t),
        );
    }
    c.add(
        "schema-version",
        "huge",
        "schema_version beyond 64 bits",
        None,
        &["whole number", "out of range"],
        door_text
            .replacen(
                "\"schema_version\": 1",
                "\"schema_version\": 123456789012345678901234567890",
                1,
            )
            .into_bytes(),
    );

    // Huge numbers in JSON (numeric inputs are text and are checked by the
    // model; these break the file format itself).
    for (name, from, to, path) in [
        ("si-1e999", "\"si\": 0.55", "\"si\": 1e999", None),
        (
            "samples-2pow32",
            "\"samples\": 10000",
            "\"samples\": 4294967296",
            Some("study.samples"),
        ),
        (
            "samples-1e30",
            "\"samples\": 10000",
            "\"samples\": 1e30",
            Some("study.samples"),
        ),
        (
            "seed-2pow64",
            "\"seed\": 20261202",
            "\"seed\": 18446744073709551616",
            Some("study.seed"),
        ),
        (
            "seed-negative",
            "\"seed\": 20261202",
            "\"seed\": -1",
            Some("study.seed"),
        ),
        (
            "samples-1e400",
            "\"samples\": 10000",
            "\"samples\": 1e400",
            None,
        ),
    ] {
        let text = door_text.replacen(from, to, 1);
        c.add(
            "huge-number",
            name,
            &format!("{from} replaced by {to}"),
            path,
            &["out of range", "invalid", "expected"],
            text.into_bytes(),
        );
    }

    // Deep nesting: bare, and inside an otherwise valid scenario.
    let deep_array = format!("{}{}", "[".repeat(DEEP_NESTING), "]".repeat(DEEP_NESTING));
    let deep_object = format!(
        "{}1{}",
        "{\"a\":".repeat(DEEP_NESTING),
        "}".repeat(DEEP_NESTING)
    );
    let unclosed = "[".repeat(DEEP_NESTING);
    for (name, text) in [
        ("arrays", deep_array.clone()),
        ("objects", deep_object),
        ("unclosed-arrays", unclosed),
        (
            "in-notes",
            door_text.replacen(
                "\"notes\": \"",
                &format!("\"notes\": {deep_array}, \"x\": \""),
                1,
            ),
        ),
        (
            "in-spring",
            door_text.replacen(
                "\"spring\": {",
                &format!("\"spring\": {{\"model\": {deep_array},"),
                1,
            ),
        ),
        (
            "129-levels",
            format!("{}{}", "[".repeat(129), "]".repeat(129)),
        ),
    ] {
        c.add(
            "deep-nesting",
            name,
            &format!("brackets nested {DEEP_NESTING} deep ({name})"),
            None,
            &["nested deeper", "ends before"],
            text.into_bytes(),
        );
    }

    // Oversized: 50 MB (a valid scenario carrying 50 MB of notes) and one
    // byte over the limit.
    let pad = |total: usize| {
        let filler = total.saturating_sub(door_text.len());
        door_text.replacen(
            "\"notes\": \"",
            &format!("\"notes\": \"{}", "x".repeat(filler)),
            1,
        )
    };
    c.add(
        "oversized",
        "50MB",
        "a valid scenario with 50 MB of notes",
        None,
        &["at most"],
        pad(HUGE_FILE_BYTES).into_bytes(),
    );
    c.add(
        "oversized",
        "limit-plus-1",
        "one byte over the size limit",
        None,
        &["at most"],
        pad(MAX_FILE_BYTES + 1).into_bytes(),
    );
    c.add(
        "oversized",
        "50MB-spaces",
        "50 MB of spaces",
        None,
        &["at most"],
        vec![b' '; HUGE_FILE_BYTES],
    );

    // Wrong encodings.
    let encodings: Vec<(&str, Vec<u8>, &'static str)> = vec![
        ("utf16le-bom", utf16(&door_text, true, true), "UTF-16"),
        ("utf16be-bom", utf16(&door_text, false, true), "UTF-16"),
        ("utf16le-no-bom", utf16(&door_text, true, false), "UTF-16"),
        ("utf16be-no-bom", utf16(&door_text, false, false), "UTF-16"),
        (
            "utf32le-bom",
            [0xFF, 0xFE, 0, 0]
                .into_iter()
                .chain(door_text.chars().flat_map(|ch| u32::from(ch).to_le_bytes()))
                .collect(),
            "UTF-32",
        ),
        ("latin1", latin1(&door_text), "not UTF-8"),
        (
            "windows-1252-quotes",
            door_text
                .replacen("Demo assessor", "Demo \u{93}assessor\u{94}", 1)
                .chars()
                .map(|ch| u8::try_from(u32::from(ch)).unwrap_or(b'?'))
                .collect(),
            "not UTF-8",
        ),
        (
            "lone-continuation-byte",
            door_text
                .replacen("Guard", "G\u{1}uard", 1)
                .replace('\u{1}', "\u{80}")
                .into_bytes(),
            "not UTF-8",
        ),
        (
            "overlong-slash",
            [door_text.as_bytes(), &[0xC0, 0xAF]].concat(),
            "not UTF-8",
        ),
        (
            "utf8-surrogate",
            {
                let (head, tail) = door_text.as_bytes().split_at(20.min(door_text.len()));
                [head, &[0xED, 0xA0, 0x80], tail].concat()
            },
            "not UTF-8",
        ),
        (
            "cut-multibyte",
            {
                let mut b = door_text
                    .replacen("Guard door", "Guard door \u{b7}", 1)
                    .into_bytes();
                if let Some(i) = b.windows(2).position(|w| w == [0xC2, 0xB7]) {
                    b.truncate(i + 1);
                }
                b
            },
            "not UTF-8",
        ),
    ];
    for (name, mut bytes, says) in encodings {
        if name == "lone-continuation-byte" {
            // U+0080 is two valid bytes (C2 80): drop the lead byte so a
            // bare continuation byte remains.
            if let Some(i) = bytes.windows(2).position(|w| w == [0xC2, 0x80]) {
                bytes.remove(i);
            }
        }
        c.add(
            "encoding",
            name,
            &format!("the guard-door demo as {name}"),
            None,
            &[says],
            bytes,
        );
    }

    // Valid JSON of other shapes.
    let report = joulewise_core::assess::assess(&demos::guard_door())
        .ok()
        .and_then(|r| serde_json::to_value(&r).ok())
        .unwrap_or(Json::Null);
    let others: Vec<(&str, Json, Option<&str>, &'static str)> = vec![
        (
            "package-json",
            json!({"name": "some-app", "version": "1.0.0", "dependencies": {"left-pad": "1"}}),
            Some("schema_version"),
            "does not look like a Joulewise scenario",
        ),
        (
            "geojson",
            json!({"type": "FeatureCollection", "features": [{"type": "Feature", "geometry": {"type": "Point", "coordinates": [8.5, 47.4]}}]}),
            Some("schema_version"),
            "does not look like a Joulewise scenario",
        ),
        (
            "json-schema",
            json!({"$schema": "http://json-schema.org/draft-07/schema#", "type": "object"}),
            Some("schema_version"),
            "does not look like a Joulewise scenario",
        ),
        ("joulewise-report", report, None, "unknown field"),
        (
            "register-array",
            json!([door.clone(), door.clone()]),
            None,
            "JSON object",
        ),
        (
            "other-versioned",
            json!({"schema_version": 1, "spreadsheet": {"cells": [[1, 2], [3, 4]]}}),
            Some("spreadsheet"),
            "unknown field",
        ),
        ("null", Json::Null, None, "JSON object"),
        ("true", json!(true), None, "JSON object"),
        ("number", json!(42), None, "JSON object"),
        ("string", json!("schema_version"), None, "JSON object"),
        ("empty-array", json!([]), None, "JSON object"),
        ("empty-object", json!({}), Some("schema_version"), "missing"),
    ];
    for (name, v, path, says) in others {
        c.add(
            "other-shape",
            name,
            &format!("valid JSON of another shape: {name}"),
            path,
            &[says],
            pretty(&v),
        );
    }

    // Empty and blank.
    for (name, bytes) in [
        ("empty", Vec::new()),
        ("spaces", b"   \n\t  \r\n".to_vec()),
        ("utf8-bom-only", vec![0xEF, 0xBB, 0xBF]),
        ("nul-byte", vec![0]),
    ] {
        c.add(
            "empty",
            name,
            &format!("an empty file ({name})"),
            None,
            &["empty", "UTF-16", "JSON"],
            bytes,
        );
    }

    // Binary garbage, seeded.
    let mut g = SplitMix(0x4A57_0001);
    for size in [1usize, 2, 16, 100, 1000, 65_536, 1_000_000] {
        c.add(
            "binary",
            &format!("random-{size}"),
            &format!("{size} random bytes"),
            None,
            &[
                "not UTF-8",
                "UTF-16",
                "UTF-32",
                "JSON",
                "empty",
                "ends before",
            ],
            g.bytes(size),
        );
    }
    let mut magic: Vec<(&str, Vec<u8>)> = vec![
        ("png", b"\x89PNG\r\n\x1a\n\0\0\0\rIHDR".to_vec()),
        ("zip-xlsx", b"PK\x03\x04\x14\0\x06\0\x08\0\0\0!\0".to_vec()),
        ("gzip", vec![0x1F, 0x8B, 0x08, 0, 0, 0, 0, 0, 0, 0x03]),
        ("pdf", b"%PDF-1.7\n%\xE2\xE3\xCF\xD3\n1 0 obj".to_vec()),
        ("elf", b"\x7FELF\x02\x01\x01\0".to_vec()),
    ];
    for (_, b) in &mut magic {
        b.extend(g.bytes(512));
    }
    for (name, bytes) in magic {
        c.add(
            "binary",
            name,
            &format!("a {name} file renamed .json"),
            None,
            &["not UTF-8", "JSON", "UTF-16"],
            bytes,
        );
    }

    // What a hand edit or another tool produces.
    let edits: Vec<(&str, String, &'static str)> = vec![
        (
            "trailing-comma",
            door_text.replacen("\"revision\": \"A\",", "\"revision\": \"A\",,", 1),
            "JSON",
        ),
        (
            "comment",
            format!("// exported from the sheet\n{door_text}"),
            "JSON",
        ),
        (
            "single-quotes",
            door_text.replacen("\"title\"", "'title'", 1),
            "JSON",
        ),
        (
            "nan-literal",
            door_text.replacen("\"si\": 0.55", "\"si\": NaN", 1),
            "JSON",
        ),
        (
            "infinity-literal",
            door_text.replacen("\"si\": 0.55", "\"si\": Infinity", 1),
            "JSON",
        ),
        (
            "raw-newline-in-string",
            door_text.replacen("Demo assessor", "Demo\nassessor", 1),
            "JSON",
        ),
        (
            "lone-surrogate-escape",
            door_text.replacen("Demo assessor", "Demo \\ud800 assessor", 1),
            "JSON",
        ),
        (
            "two-scenarios",
            format!("{door_text}\n{door_text}"),
            "trailing",
        ),
        (
            "jsonl-register",
            format!(
                "{}\n{}",
                serde_json::to_string(&door).unwrap_or_default(),
                serde_json::to_string(&door).unwrap_or_default()
            ),
            "trailing",
        ),
        (
            "csv-register",
            "tag,part,mass,travel\nA1,translating,2 kg,60 mm\n".to_string(),
            "JSON",
        ),
        (
            "html",
            "<!doctype html><script>alert(1)</script>".to_string(),
            "JSON",
        ),
        (
            "xml",
            "<?xml version=\"1.0\"?><scenario schema_version=\"1\"/>".to_string(),
            "JSON",
        ),
        (
            "yaml",
            "schema_version: 1\npart:\n  kind: translating\n".to_string(),
            "JSON",
        ),
        (
            "script-in-title",
            door_text.replacen(
                "\"schema_version\": 1",
                "\"schema_version\": \"<img src=x onerror=alert(1)>\"",
                1,
            ),
            "whole number",
        ),
    ];
    for (name, text, says) in edits {
        c.add(
            "syntax",
            name,
            &format!("hand-edit damage: {name}"),
            None,
            &[says],
            text.into_bytes(),
        );
    }
    c.files
}

/// Write the corpus into `dir` (created if needed): one file per case and
/// `manifest.json` (an array of `{name, category, description, path,
/// message_has}`). Returns the number of files.
///
/// # Errors
/// The folder or a file cannot be written.
pub fn write_corpus(dir: &std::path::Path) -> std::io::Result<usize> {
    std::fs::create_dir_all(dir)?;
    let files = corpus();
    for f in &files {
        std::fs::write(dir.join(&f.name), &f.bytes)?;
    }
    let manifest = serde_json::to_vec_pretty(&files).map_err(std::io::Error::other)?;
    std::fs::write(dir.join("manifest.json"), manifest)?;
    Ok(files.len())
}
