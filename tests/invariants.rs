//! Architecture invariants, checked mechanically.
//!
//! **joulewise-core knows nothing of the DOM, Leptos, clocks, entropy or
//! I/O**: its dependency graph (without the `cli` feature) must not contain a
//! web, browser-glue or OS-entropy crate. The check reads `cargo metadata`.
#![forbid(unsafe_code)]

use std::process::Command;

/// Crates that would mean the core has learned about the browser, the clock or
/// the OS entropy source.
const FORBIDDEN: &[&str] = &[
    "leptos",
    "wasm-bindgen",
    "web-sys",
    "js-sys",
    "gloo",
    "gloo-storage",
    "gloo-timers",
    "getrandom",
    "instant",
    "web-time",
    "chrono",
    "time",
    "tokio",
    "reqwest",
];

/// `cargo metadata` of the workspace (offline), with `extra` arguments.
// A test helper: a failure here is a failed test, said loudly.
#[allow(clippy::expect_used, clippy::unwrap_used)]
fn cargo_metadata(root: &std::path::Path, extra: &[&str]) -> serde_json::Value {
    let out = Command::new(env!("CARGO"))
        .args(["metadata", "--format-version", "1", "--offline"])
        .args(extra)
        .arg("--manifest-path")
        .arg(root.join("Cargo.toml"))
        .output()
        .expect("cargo metadata runs");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).unwrap()
}

#[test]
fn core_library_has_no_web_clock_or_io_dependency() {
    let root = joulewise_tests::workspace_root();
    let meta = cargo_metadata(&root, &[]);
    let packages = meta["packages"].as_array().unwrap();
    let core = packages
        .iter()
        .find(|p| p["name"] == "joulewise-core")
        .expect("joulewise-core is a workspace member");
    // Walk the normal (non-dev), non-optional dependencies transitively.
    let mut seen = std::collections::BTreeSet::new();
    let mut stack: Vec<&serde_json::Value> = vec![core];
    while let Some(pkg) = stack.pop() {
        for dep in pkg["dependencies"].as_array().unwrap() {
            let is_normal = dep["kind"].is_null();
            let optional = dep["optional"].as_bool().unwrap_or(false);
            if !is_normal || optional {
                continue;
            }
            let name = dep["name"].as_str().unwrap().to_string();
            if seen.insert(name.clone()) {
                if let Some(p) = packages.iter().find(|p| p["name"] == name.as_str()) {
                    stack.push(p);
                }
            }
        }
    }
    let bad: Vec<_> = seen
        .iter()
        .filter(|n| FORBIDDEN.contains(&n.as_str()))
        .collect();
    assert!(
        bad.is_empty(),
        "joulewise-core must stay pure, but depends on {bad:?}"
    );
}

#[test]
fn core_sources_read_no_clock_and_do_no_io() {
    let root = joulewise_tests::workspace_root().join("core/src");
    let mut offenders = Vec::new();
    for path in rust_files(&root) {
        if path.components().any(|c| c.as_os_str() == "bin") {
            continue; // the CLI binary may do I/O
        }
        let text = std::fs::read_to_string(&path).unwrap();
        for needle in [
            "Instant::now",
            "SystemTime",
            "std::fs",
            "std::net",
            "std::env::var",
            "thread_rng",
        ] {
            if text.contains(needle) {
                offenders.push(format!("{}: {needle}", path.display()));
            }
        }
    }
    assert!(offenders.is_empty(), "{offenders:#?}");
}

#[test]
fn every_rust_file_starts_with_a_module_doc() {
    let root = joulewise_tests::workspace_root();
    let mut missing = Vec::new();
    for dir in ["core/src", "web/src", "xtask/src"] {
        for path in rust_files(&root.join(dir)) {
            let text = std::fs::read_to_string(&path).unwrap();
            if !text.trim_start().starts_with("//!") {
                missing.push(path.display().to_string());
            }
        }
    }
    assert!(missing.is_empty(), "files without a //! doc: {missing:#?}");
}

fn rust_files(dir: &std::path::Path) -> Vec<std::path::PathBuf> {
    let mut out = Vec::new();
    let Ok(entries) = std::fs::read_dir(dir) else {
        return out;
    };
    for e in entries.flatten() {
        let p = e.path();
        if p.is_dir() {
            out.extend(rust_files(&p));
        } else if p.extension().is_some_and(|x| x == "rs") {
            out.push(p);
        }
    }
    out
}

/// trunk refuses (offline) any wasm-bindgen whose version differs from its
/// pin, and the pin must match the library version in Cargo.lock, or the
/// generated JS glue would not match the module.
#[test]
fn trunk_pins_the_wasm_bindgen_version_of_cargo_lock() {
    let root = joulewise_tests::workspace_root();
    let lock = std::fs::read_to_string(root.join("Cargo.lock")).unwrap();
    let locked = lock
        .split("[[package]]")
        .find(|block| block.contains("name = \"wasm-bindgen\"\n"))
        .and_then(|block| block.lines().find(|l| l.starts_with("version = ")))
        .map(|l| {
            l.trim_start_matches("version = ")
                .trim_matches('"')
                .to_string()
        })
        .expect("wasm-bindgen in Cargo.lock");
    let trunk = std::fs::read_to_string(root.join("trunk.toml")).unwrap();
    assert!(
        trunk.contains(&format!("wasm_bindgen = \"{locked}\"")),
        "trunk.toml must pin wasm_bindgen = \"{locked}\" (Cargo.lock)"
    );
    assert!(
        trunk.contains("offline = true"),
        "trunk must never download tools"
    );
    assert!(
        trunk.contains("wasm_opt = \"version_132\""),
        "wasm-opt must be pinned"
    );
}

/// **`unsafe` is forbidden in every crate of ours.** Two layers: the
/// workspace lint `unsafe_code = "forbid"` that every member inherits
/// (`[lints] workspace = true`), which the compiler enforces on every
/// target; and `#![forbid(unsafe_code)]` at the root of every target of the
/// core, xtask and tests packages and of the fuzz targets, so the rule is
/// visible where code starts and holds if a manifest drops the lint table.
/// (The web package's roots are covered by the workspace lint; its sheet
/// is maintained separately.)
#[test]
fn unsafe_code_is_forbidden_in_every_crate() {
    let root = joulewise_tests::workspace_root();
    let manifest = std::fs::read_to_string(root.join("Cargo.toml")).unwrap();
    assert!(
        manifest.contains("[workspace.lints.rust]\nunsafe_code = \"forbid\""),
        "the workspace must forbid unsafe code"
    );
    let meta = cargo_metadata(&root, &["--no-deps"]);
    let mut missing = Vec::new();
    for pkg in meta["packages"].as_array().unwrap() {
        let name = pkg["name"].as_str().unwrap_or("");
        let manifest = std::fs::read_to_string(pkg["manifest_path"].as_str().unwrap()).unwrap();
        if !manifest.contains("[lints]\nworkspace = true") {
            missing.push(format!(
                "{name}: Cargo.toml does not inherit the workspace lints"
            ));
        }
        if name == "joulewise-web" {
            continue;
        }
        for target in pkg["targets"].as_array().unwrap() {
            let path = target["src_path"].as_str().unwrap();
            let text = std::fs::read_to_string(path).unwrap();
            if !text.contains("#![forbid(unsafe_code)]") {
                missing.push(format!("{name}: {path}"));
            }
        }
    }
    for path in rust_files(&root.join("fuzz/fuzz_targets")) {
        let text = std::fs::read_to_string(&path).unwrap();
        if !text.contains("#![forbid(unsafe_code)]") {
            missing.push(path.display().to_string());
        }
    }
    assert!(
        missing.is_empty(),
        "without #![forbid(unsafe_code)]: {missing:#?}"
    );
}
