//! The fuzzing regression suite, on the stable toolchain (cargo-fuzz and
//! libFuzzer need nightly; this needs nothing but `cargo test`):
//!
//! - every file of `tests/fuzz-corpus/<target>/` (the minimised inputs the
//!   fuzz runs found, crashes among them once fixed; see fuzz/README.md) is
//!   replayed through the same checks as its fuzz target;
//! - a seeded smoke run: a fixed number of mutations of the seed scenarios
//!   and of the corpus, from a fixed seed, through the structure-aware
//!   target's checks, plus random and mutated text through the unit
//!   parser's. Same inputs on every machine and every run.
//!
//! Set `JOULEWISE_FUZZ_SMOKE_CASES` to run more smoke cases locally.
#![forbid(unsafe_code)]

use joulewise_tests::robust::{
    check_bytes, check_scenario, check_unit_bytes,
    mutate::{Bytes, Mutator, SplitMix},
    Outcome,
};
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

/// Wall-clock bound for one case, as hang detection only (the fuzz runs
/// use libFuzzer's `-timeout=5` on optimised code). A debug build is 10 to
/// 50 times slower than the fuzzers' build: the slowest corpus file (a
/// series of tables as a buffer) takes about 2.7 s of CPU here, and 15–19 s
/// of wall clock on a 2-core machine at load average 10. 120 s leaves room
/// for such a machine while an unbounded solve would still be caught.
const MAX_PER_CASE: Duration = Duration::from_secs(120);

/// Smoke cases per run: a few seconds in a debug build.
const SMOKE_CASES: usize = 300;

/// Study settings for the replay: the study runs when at most three inputs
/// carry a tolerance, with the Monte Carlo capped at 20 samples (as in the
/// `scenario_mutate` fuzz target).
const STUDY: Option<(u32, usize)> = Some((20, 3));

fn corpus_dir(target: &str) -> PathBuf {
    joulewise_tests::workspace_root()
        .join("tests/fuzz-corpus")
        .join(target)
}

fn files(dir: &Path) -> Vec<PathBuf> {
    let mut out: Vec<PathBuf> = std::fs::read_dir(dir)
        .map(|d| {
            d.flatten()
                .map(|e| e.path())
                .filter(|p| p.is_file())
                .collect()
        })
        .unwrap_or_default();
    out.sort();
    out
}

fn timed<T>(what: &str, f: impl FnOnce() -> Result<T, String>) -> T {
    let t0 = Instant::now();
    let out = f().unwrap_or_else(|e| panic!("{what}: {e}"));
    let took = t0.elapsed();
    assert!(took < MAX_PER_CASE, "{what}: took {took:?}");
    out
}

#[test]
fn every_scenario_json_corpus_file_passes_the_checks() {
    let dir = corpus_dir("scenario_json");
    let all = files(&dir);
    assert!(!all.is_empty(), "no corpus in {}", dir.display());
    let (mut refused, mut assessed) = (0, 0);
    for path in &all {
        let bytes = std::fs::read(path).unwrap();
        match timed(&path.display().to_string(), || check_bytes(&bytes, STUDY)) {
            Outcome::Refused(_) => refused += 1,
            Outcome::Assessed { .. } => assessed += 1,
        }
    }
    println!(
        "scenario_json corpus: {} files, {refused} refused, {assessed} assessed",
        all.len()
    );
}

#[test]
fn every_scenario_mutate_corpus_file_passes_the_checks() {
    let m = Mutator::new();
    let dir = corpus_dir("scenario_mutate");
    let all = files(&dir);
    assert!(!all.is_empty(), "no corpus in {}", dir.display());
    for path in &all {
        let bytes = std::fs::read(path).unwrap();
        if let Some(s) = m.mutate(&mut Bytes::new(&bytes)) {
            timed(&path.display().to_string(), || check_scenario(&s, STUDY));
        }
    }
}

#[test]
fn every_units_parse_corpus_file_passes_the_checks() {
    let dir = corpus_dir("units_parse");
    let all = files(&dir);
    assert!(!all.is_empty(), "no corpus in {}", dir.display());
    for path in &all {
        let bytes = std::fs::read(path).unwrap();
        timed(&path.display().to_string(), || check_unit_bytes(&bytes));
    }
}

fn smoke_cases() -> usize {
    std::env::var("JOULEWISE_FUZZ_SMOKE_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(SMOKE_CASES)
}

/// A seeded mutation loop over the seeds and the scenario corpus: the
/// structure-aware target's checks on stable, in a few seconds.
#[test]
fn seeded_smoke_run_of_scenario_mutations() {
    let mut pool: Vec<serde_json::Value> = joulewise_tests::robust::seeds::seeds()
        .into_iter()
        .filter_map(|(_, s)| serde_json::to_value(&s).ok())
        .collect();
    for path in files(&corpus_dir("scenario_json")) {
        let text = std::fs::read_to_string(&path).unwrap_or_default();
        if let Ok(s) = joulewise_core::scenario::Scenario::from_json(&text) {
            pool.extend(serde_json::to_value(&s).ok());
        }
    }
    let m = Mutator::with_pool(pool);
    // Fixed seed: the same cases on every machine and run.
    let mut g = SplitMix(0x4A57_5EED);
    let mut read = 0;
    for case in 0..smoke_cases() {
        let bytes = g.bytes(64);
        if let Some(s) = m.mutate(&mut Bytes::new(&bytes)) {
            read += 1;
            timed(&format!("smoke case {case} (bytes {bytes:?})"), || {
                check_scenario(&s, STUDY)
            });
        }
    }
    println!(
        "smoke: {read} of {} mutations read as scenarios and passed",
        smoke_cases()
    );
    assert!(read > 0);
}

/// Random bytes and mutated texts through the unit parser's checks.
#[test]
fn seeded_smoke_run_of_the_unit_parser() {
    let mut g = SplitMix(0x0417_5EED);
    let texts = joulewise_tests::robust::mutate::HOSTILE_TEXTS;
    for case in 0..20 * smoke_cases() {
        let mut bytes = g.bytes(2);
        let n = (g.next_u64() % 24) as usize;
        if case % 2 == 0 {
            let base = texts[(g.next_u64() as usize) % texts.len()];
            bytes.extend_from_slice(base.as_bytes());
            // Flip, insert or drop a few bytes of the text.
            for _ in 0..(g.next_u64() % 3) {
                let at = 2 + (g.next_u64() as usize) % (bytes.len() - 1).max(1);
                let b = (g.next_u64() >> 56) as u8;
                match g.next_u64() % 3 {
                    0 if at < bytes.len() => bytes[at] = b,
                    1 => bytes.insert(at.min(bytes.len()), b),
                    _ if at < bytes.len() => {
                        bytes.remove(at);
                    }
                    _ => {}
                }
            }
        } else {
            bytes.extend(g.bytes(n));
        }
        check_unit_bytes(&bytes).unwrap_or_else(|e| panic!("case {case} {bytes:?}: {e}"));
    }
}
