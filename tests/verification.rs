//! The verification catalogue (`joulewise_core::verification`) against the
//! tests that exist and the page that shows it, so neither can drift:
//! - every check run by a Rust test names a test function that exists (a
//!   core unit test by its module path, a cross-crate test by its file,
//!   registered in tests/Cargo.toml), and every test of the cross-crate files
//!   that check outside values is in the catalogue;
//! - every check of the Python suite is implemented there (its id appears in
//!   tests/reference/checks), and every check id the Python code uses is in
//!   the catalogue;
//! - every core module that computes figures and every limit set has a
//!   subject, and a limit set's status is its weakest entry's;
//! - the section "How the figures are checked" at the end of DEVELOPERS.md
//!   is exactly `verification::markdown()`.
#![forbid(unsafe_code)]

use joulewise_core::figure::SourceStatus;
use joulewise_core::limits::{self, LimitSetId};
use joulewise_core::verification::{self, Runner, SubjectKind};
use std::collections::BTreeSet;
use std::path::{Path, PathBuf};

fn root() -> PathBuf {
    joulewise_tests::workspace_root()
}

fn read(path: &Path) -> String {
    std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

/// Whether `text` defines a function `name`.
fn defines_fn(text: &str, name: &str) -> bool {
    text.contains(&format!("fn {name}("))
}

/// The files a core test path can live in: `a::b::tests::t` lives in
/// core/src/a/b.rs, core/src/a/b/mod.rs or core/src/a/b/tests.rs (and
/// a nested `mod props` stays in the same file).
fn core_test_files(path: &str) -> (Vec<PathBuf>, String) {
    let parts: Vec<&str> = path.split("::").collect();
    let name = parts.last().copied().unwrap_or_default().to_string();
    let cut = parts
        .iter()
        .position(|p| *p == "tests")
        .unwrap_or(parts.len() - 1);
    let module = parts[..cut].join("/");
    let base = root().join("core/src");
    let files = vec![
        base.join(format!("{module}.rs")),
        base.join(&module).join("mod.rs"),
        base.join(&module).join("tests.rs"),
    ];
    (files, name)
}

#[test]
fn every_rust_check_names_a_test_that_exists() {
    let cargo = read(&root().join("tests/Cargo.toml"));
    let mut missing = Vec::new();
    for c in verification::catalogue().checks {
        match c.runner {
            Runner::CoreUnitTest { path } => {
                let (files, name) = core_test_files(path);
                let found = files
                    .iter()
                    .filter(|f| f.exists())
                    .any(|f| defines_fn(&read(f), &name));
                if !found {
                    missing.push(format!("{}: core test {path}", c.id));
                }
            }
            Runner::CrossCrateTest { file, name } => {
                let p = root().join("tests").join(file);
                if !p.exists() || !defines_fn(&read(&p), name) {
                    missing.push(format!("{}: tests/{file} fn {name}", c.id));
                }
                if !cargo.contains(&format!("path = \"{file}\"")) {
                    missing.push(format!("{}: tests/{file} is not a [[test]]", c.id));
                }
            }
            Runner::PythonSuite => {}
        }
    }
    assert!(missing.is_empty(), "{missing:#?}");
}

/// Files of the tests crate whose every test checks an outside value.
const REFERENCE_FILES: &[&str] = &["published_values.rs", "sizing_round_trip.rs"];

#[test]
fn every_reference_test_of_this_crate_is_in_the_catalogue() {
    let listed: BTreeSet<(String, String)> = verification::catalogue()
        .checks
        .iter()
        .filter_map(|c| match c.runner {
            Runner::CrossCrateTest { file, name } => Some((file.to_string(), name.to_string())),
            _ => None,
        })
        .collect();
    let mut unlisted = Vec::new();
    for file in REFERENCE_FILES {
        let text = read(&root().join("tests").join(file));
        let mut lines = text.lines();
        while let Some(line) = lines.next() {
            if line.trim() == "#[test]" {
                let next = lines.next().unwrap_or_default();
                let name = next
                    .trim()
                    .trim_start_matches("fn ")
                    .split('(')
                    .next()
                    .unwrap_or_default()
                    .to_string();
                if !listed.contains(&(file.to_string(), name.clone())) {
                    unlisted.push(format!("{file}: {name}"));
                }
            }
        }
    }
    assert!(
        unlisted.is_empty(),
        "tests not in the catalogue: {unlisted:#?}"
    );
}

/// Every `py.…` id the Python suite uses: string literals in its sources
/// and the `check` of each case in its case files.
fn python_ids() -> BTreeSet<String> {
    let mut ids = BTreeSet::new();
    let mut files = Vec::new();
    for (dir, ext) in [
        ("tests/reference/checks", "py"),
        ("tests/reference/cases", "json"),
    ] {
        files.extend(
            std::fs::read_dir(root().join(dir))
                .unwrap_or_else(|e| panic!("{dir}: {e}"))
                .flatten()
                .map(|e| e.path())
                .filter(|p| p.extension().is_some_and(|x| x == ext)),
        );
    }
    files.push(root().join("tests/reference/common.py"));
    for f in files {
        let text = read(&f);
        for piece in text.split('"').skip(1).step_by(2) {
            if piece.starts_with("py.")
                && piece
                    .chars()
                    .all(|c| c.is_ascii_alphanumeric() || c == '.' || c == '_')
            {
                ids.insert(piece.to_string());
            }
        }
    }
    ids
}

#[test]
fn the_python_suite_implements_exactly_its_catalogue_checks() {
    let want: BTreeSet<String> = verification::catalogue()
        .checks
        .iter()
        .filter(|c| matches!(c.runner, Runner::PythonSuite))
        .map(|c| c.id.to_string())
        .collect();
    let got = python_ids();
    let not_implemented: Vec<_> = want.difference(&got).collect();
    let not_listed: Vec<_> = got.difference(&want).collect();
    assert!(
        not_implemented.is_empty() && not_listed.is_empty(),
        "in the catalogue but not in the Python suite: {not_implemented:?}; \
         in the Python suite but not in the catalogue: {not_listed:?}"
    );
}

/// Subject ids each core module's figures are described by. A module added
/// to lib.rs must be added here (with its subjects, or with none and the
/// reason).
const MODULE_SUBJECTS: &[(&str, &[&str])] = &[
    // The Scenario → Report layer only assembles figures of the models below.
    ("assess", &[]),
    ("report", &[]),
    ("scenario", &[]),
    // Cautions are text in our own words; no figure to check.
    ("cautions", &[]),
    // Errors, figures and this catalogue hold no physics.
    ("error", &[]),
    ("figure", &[]),
    ("verification", &[]),
    (
        "contact",
        &[
            "buffer.linear",
            "buffer.power_law",
            "buffer.spring_model",
            "buffer.constant_force",
            "buffer.ideal_absorber",
            "buffer.orifice",
            "contact.body",
            "contact.gap",
        ],
    ),
    ("identify", &["identify"]),
    (
        "limits",
        &[
            "limits.guards",
            "limits.body_regions",
            "limits.crushing_gaps",
            "limits.lift_en81",
            "limits.lift_us",
            "limits.crane",
            "limits.gates",
            "limits.user",
        ],
    ),
    ("mechanism", &["release.translating", "release.rotating"]),
    ("ode", &["ode"]),
    ("release", &["release.translating", "release.rotating"]),
    ("sizing", &["sizing"]),
    (
        "spring",
        &[
            "spring.linear",
            "spring.helical",
            "spring.extension",
            "spring.torsion",
            "spring.gas",
            "spring.disc",
            "spring.table",
            "spring.combine",
        ],
    ),
    ("tolerance", &["tolerance"]),
    ("units", &["units"]),
];

#[test]
fn every_core_module_and_limit_set_has_its_subjects() {
    let cat = verification::catalogue();
    let lib = read(&root().join("core/src/lib.rs"));
    for line in lib.lines() {
        if let Some(m) = line.strip_prefix("pub mod ") {
            let m = m.trim_end_matches(';');
            let Some((_, ids)) = MODULE_SUBJECTS.iter().find(|(name, _)| *name == m) else {
                panic!("core module `{m}` is not mapped to verification subjects");
            };
            for id in *ids {
                assert!(cat.subject(id).is_some(), "{m}: no subject {id}");
            }
        }
    }
    // Every subject is claimed by some module.
    for s in cat.subjects {
        assert!(
            MODULE_SUBJECTS.iter().any(|(_, ids)| ids.contains(&s.id)),
            "{} belongs to no module",
            s.id
        );
    }
}

fn weakness(s: SourceStatus) -> u8 {
    match s {
        SourceStatus::Confirmed => 0,
        SourceStatus::Derived => 1,
        SourceStatus::Secondary => 2,
        SourceStatus::CommonPractice => 3,
        SourceStatus::FromMemory => 4,
        SourceStatus::UserSupplied => 5,
    }
}

fn subject_of(id: LimitSetId) -> &'static str {
    match id {
        LimitSetId::Guards => "limits.guards",
        LimitSetId::BodyRegions => "limits.body_regions",
        LimitSetId::CrushingGaps => "limits.crushing_gaps",
        LimitSetId::LiftBuffersEn81 => "limits.lift_en81",
        LimitSetId::LiftBuffersUs => "limits.lift_us",
        LimitSetId::CraneBumpers => "limits.crane",
        LimitSetId::PoweredGates => "limits.gates",
        LimitSetId::UserDefined => "limits.user",
    }
}

#[test]
fn every_limit_set_has_a_subject_with_its_weakest_status() {
    let cat = verification::catalogue();
    let sets = limits::catalogue();
    for set in &sets {
        let s = cat
            .subject(subject_of(set.id))
            .unwrap_or_else(|| panic!("{:?} has no subject", set.id));
        assert_eq!(s.kind, SubjectKind::LimitSet, "{}", s.id);
        let weakest = set
            .entries
            .iter()
            .map(|e| e.provenance.status)
            .max_by_key(|st| weakness(*st))
            .expect("entries");
        assert_eq!(s.status, weakest, "{}: status", s.id);
    }
    let limit_subjects = cat
        .subjects
        .iter()
        .filter(|s| s.kind == SubjectKind::LimitSet)
        .count();
    // The catalogue's sets plus the user-defined set.
    assert_eq!(limit_subjects, sets.len() + 1);
}

#[test]
fn developers_md_ends_with_the_generated_section() {
    let text = read(&root().join("DEVELOPERS.md"));
    let heading = "\n## How the figures are checked\n";
    let at = text
        .find(heading)
        .expect("DEVELOPERS.md has the section \"How the figures are checked\"");
    let section = &text[at + 1..];
    let want = verification::markdown();
    if section != want {
        let (i, (a, b)) = section
            .lines()
            .zip(want.lines())
            .enumerate()
            .find(|(_, (a, b))| a != b)
            .unwrap_or((0, ("", "")));
        panic!(
            "the section differs from verification::markdown() (regenerate with \
             `cargo run -q -p joulewise-tests --bin refharness -- markdown`); first \
             difference at line {}:\n  file:      {a}\n  generated: {b}",
            i + 1
        );
    }
}
