//! The hostile import corpus (`joulewise_tests::robust::hostile`), written
//! to a git-ignored folder under `target/` and read back from disk: every
//! file is refused by `Scenario::from_bytes` with a message naming the
//! problem (and the field path where the problem sits in one field),
//! quickly, without a panic, and without overflowing the stack of a test
//! thread (2 MiB) on 10 000-deep nesting.
#![forbid(unsafe_code)]

use joulewise_core::scenario::Scenario;
use joulewise_tests::robust::hostile::{self, HostileFile};
use std::time::{Duration, Instant};

/// Time one file may take to be refused, including reading it from disk.
/// Refusals are checks of size and encoding, a parse that stops at the
/// first error, or one deserialisation: milliseconds even for the 50 MB
/// file in a debug build. The bound is wide so a loaded CI machine cannot
/// fail it, yet a quadratic or unbounded path (a refusal that scans 50 MB
/// repeatedly, a deep recursion) would.
const MAX_PER_FILE: Duration = Duration::from_secs(10);

/// The corpus must hold at least this many files (the issue's count).
const MIN_FILES: usize = 200;

fn check(f: &HostileFile, bytes: &[u8]) -> Result<(), String> {
    let t0 = Instant::now();
    let outcome = std::panic::catch_unwind(|| Scenario::from_bytes(bytes));
    let took = t0.elapsed();
    let result = outcome.map_err(|_| format!("{}: panicked", f.name))?;
    let e = match result {
        Ok(_) => return Err(format!("{}: accepted ({})", f.name, f.description)),
        Err(e) => e,
    };
    if took > MAX_PER_FILE {
        return Err(format!("{}: took {took:?}", f.name));
    }
    if e.message.trim().is_empty() {
        return Err(format!("{}: refused without a message", f.name));
    }
    let lower = e.message.to_lowercase();
    if !f.message_has.is_empty()
        && !f
            .message_has
            .iter()
            .any(|w| lower.contains(&w.to_lowercase()))
    {
        return Err(format!(
            "{}: message does not name the problem (wanted one of {:?}): {e}",
            f.name, f.message_has
        ));
    }
    if let Some(p) = &f.path {
        let names_it = e.path == *p || e.path.starts_with(&format!("{p}."));
        if !names_it {
            return Err(format!(
                "{}: path {:?}, wanted {p:?} (or below it): {e}",
                f.name, e.path
            ));
        }
    }
    Ok(())
}

#[test]
fn every_hostile_file_is_refused_with_a_clear_message() {
    // A git-ignored folder under target/ (cargo's per-test temporary dir).
    let dir = std::path::Path::new(env!("CARGO_TARGET_TMPDIR")).join("hostile-corpus");
    let _ = std::fs::remove_dir_all(&dir);
    let written = hostile::write_corpus(&dir).expect("the corpus can be written");
    let files = hostile::corpus();
    assert_eq!(written, files.len());
    assert!(
        files.len() >= MIN_FILES,
        "only {} hostile files",
        files.len()
    );
    let mut failures = Vec::new();
    let mut per_category = std::collections::BTreeMap::<&str, usize>::new();
    for f in &files {
        let bytes = std::fs::read(dir.join(&f.name)).expect("written file reads back");
        assert_eq!(bytes, f.bytes, "{}", f.name);
        match check(f, &bytes) {
            Ok(()) => *per_category.entry(f.category).or_default() += 1,
            Err(e) => failures.push(e),
        }
    }
    println!(
        "hostile files: {} tried, {} refused as required; per category: {per_category:?}",
        files.len(),
        files.len() - failures.len()
    );
    assert!(failures.is_empty(), "{}", failures.join("\n"));
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_manifest_lists_every_file_once() {
    let files = hostile::corpus();
    let mut names: Vec<&str> = files.iter().map(|f| f.name.as_str()).collect();
    names.sort_unstable();
    names.dedup();
    assert_eq!(names.len(), files.len(), "file names are unique");
    assert!(files
        .iter()
        .any(|f| f.bytes.len() >= hostile::HUGE_FILE_BYTES));
}

/// Spring combinations nested as deep as the JSON parser allows (60 levels
/// of `members` lists: 125 brackets deep with the scenario around them, the
/// parser's limit being 128) inside an otherwise valid scenario:
/// read without overflowing a test thread's 2 MiB stack (serde buffers
/// each tagged level), then assessed: same-kind nesting flattens, and
/// alternating series and parallel is refused as an input error.
#[test]
fn spring_combinations_nested_to_the_parser_limit() {
    let leaf =
        r#"{"model": "linear", "rate": {"text": "8 N/mm"}, "max_deflection": {"text": "45 mm"}}"#;
    for alternate in [false, true] {
        let mut model = leaf.to_string();
        for level in 0..60 {
            let kind = if alternate && level % 2 == 1 {
                "parallel"
            } else {
                "series"
            };
            model = format!(r#"{{"model": "{kind}", "members": [{model}]}}"#);
        }
        let mut v: serde_json::Value =
            serde_json::from_str(&joulewise_core::scenario::demos::ejector().to_json()).unwrap();
        v["spring"]["model"] = serde_json::from_str(&model).unwrap();
        let text = serde_json::to_string(&v).unwrap();
        let t0 = Instant::now();
        match Scenario::from_json(&text) {
            Err(e) => panic!("alternate {alternate}: {e}"),
            Ok(s) => {
                let r = joulewise_core::assess::assess(&s).unwrap();
                joulewise_tests::robust::check_report(&r).unwrap();
                if alternate {
                    assert!(
                        r.errors.iter().any(|e| e.field.starts_with("spring.model")),
                        "{:?}",
                        r.errors
                    );
                }
            }
        }
        assert!(t0.elapsed() < MAX_PER_FILE, "took {:?}", t0.elapsed());
    }
}
