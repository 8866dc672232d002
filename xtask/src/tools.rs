//! Installs the tools the build and the tests need, from the package
//! registries only, and only when missing or at the wrong version. A second
//! run installs nothing.
//!
//! Pinned versions (why each, see DEVELOPERS.md "Toolchain"):
//! - trunk 0.21.14: the newest release that builds on rustc 1.95.
//! - wasm-bindgen-cli: exactly the `wasm-bindgen` version in Cargo.lock.
//! - wasm-opt: binaryen 132.0.0 from npm (package-lock.json).
//! - Chromium and chromedriver: Debian packages.
//! - Python reference libraries: `.venv` at the root, from PyPI, exactly the
//!   versions in tests/reference/requirements.txt.

use std::path::{Path, PathBuf};
use std::process::Command;

/// trunk version that builds on this toolchain (0.22 needs rustc 1.96.1).
pub const TRUNK_VERSION: &str = "0.21.14";

/// The workspace root (the folder holding Cargo.lock).
pub fn workspace_root() -> PathBuf {
    let here = PathBuf::from(env!("CARGO_MANIFEST_DIR"));
    here.parent().map(Path::to_path_buf).unwrap_or(here)
}

/// Run a command, echoing it, and fail with its name if it fails.
pub fn run(cmd: &mut Command) -> Result<(), String> {
    println!("xtask: $ {}", describe(cmd));
    let status = cmd
        .status()
        .map_err(|e| format!("could not start `{}`: {e}", describe(cmd)))?;
    if status.success() {
        Ok(())
    } else {
        Err(format!("`{}` failed ({status})", describe(cmd)))
    }
}

/// The command line as text, for messages.
pub fn describe(cmd: &Command) -> String {
    let mut s = cmd.get_program().to_string_lossy().into_owned();
    for a in cmd.get_args() {
        s.push(' ');
        s.push_str(&a.to_string_lossy());
    }
    s
}

/// First line of `program --version`, if it runs.
fn version_of(program: &str, arg: &str) -> Option<String> {
    let out = Command::new(program).arg(arg).output().ok()?;
    if !out.status.success() {
        return None;
    }
    let text = String::from_utf8_lossy(&out.stdout);
    text.lines().next().map(|l| l.trim().to_string())
}

/// `~/.cargo/bin` (or `$CARGO_HOME/bin`), where `cargo install` puts tools.
pub fn cargo_bin_dir() -> PathBuf {
    if let Ok(home) = std::env::var("CARGO_HOME") {
        return PathBuf::from(home).join("bin");
    }
    let home = std::env::var("HOME").unwrap_or_else(|_| "/root".into());
    PathBuf::from(home).join(".cargo/bin")
}

/// PATH with `node_modules/.bin` and the cargo bin folder in front, so trunk
/// finds the pinned wasm-opt and wasm-bindgen.
pub fn tool_path() -> String {
    let root = workspace_root();
    let old = std::env::var("PATH").unwrap_or_default();
    format!(
        "{}:{}:{old}",
        root.join("node_modules/.bin").display(),
        cargo_bin_dir().display()
    )
}

/// The `wasm-bindgen` version recorded in Cargo.lock.
pub fn locked_wasm_bindgen_version() -> Result<String, String> {
    let lock = std::fs::read_to_string(workspace_root().join("Cargo.lock"))
        .map_err(|e| format!("cannot read Cargo.lock: {e}"))?;
    let mut lines = lock.lines();
    while let Some(line) = lines.next() {
        if line.trim() == "name = \"wasm-bindgen\"" {
            if let Some(v) = lines.next() {
                if let Some(rest) = v.trim().strip_prefix("version = \"") {
                    return Ok(rest.trim_end_matches('"').to_string());
                }
            }
        }
    }
    Err("Cargo.lock has no wasm-bindgen entry; run `cargo generate-lockfile`".into())
}

/// Everything `trunk build --release` needs.
pub fn ensure_build_tools() -> Result<(), String> {
    ensure_wasm_target()?;
    ensure_trunk()?;
    ensure_wasm_bindgen()?;
    ensure_npm_packages()?;
    Ok(())
}

fn ensure_wasm_target() -> Result<(), String> {
    let out = Command::new("rustup")
        .args(["target", "list", "--installed"])
        .output()
        .map_err(|e| format!("rustup is needed to add the wasm32 target: {e}"))?;
    if String::from_utf8_lossy(&out.stdout)
        .lines()
        .any(|l| l.trim() == "wasm32-unknown-unknown")
    {
        return Ok(());
    }
    run(Command::new("rustup").args(["target", "add", "wasm32-unknown-unknown"]))
}

fn ensure_trunk() -> Result<(), String> {
    let want = format!("trunk {TRUNK_VERSION}");
    let bin = cargo_bin_dir().join("trunk");
    if version_of(&bin.to_string_lossy(), "--version").as_deref() == Some(want.as_str()) {
        return Ok(());
    }
    println!("xtask: installing {want} (about 14 minutes on 2 cores, once)");
    run(Command::new("cargo").args(["install", "--locked", "trunk", "--version", TRUNK_VERSION]))
}

fn ensure_wasm_bindgen() -> Result<(), String> {
    let v = locked_wasm_bindgen_version()?;
    let want = format!("wasm-bindgen {v}");
    let bin = cargo_bin_dir().join("wasm-bindgen");
    if version_of(&bin.to_string_lossy(), "--version").as_deref() == Some(want.as_str()) {
        return Ok(());
    }
    println!("xtask: installing wasm-bindgen-cli {v} (about 4 minutes, once)");
    // Not --locked: its lockfile wants a webpki-roots version the registry lacks.
    run(Command::new("cargo").args(["install", "wasm-bindgen-cli", "--version", &format!("={v}")]))
}

/// `npm ci` when node_modules is missing or older than package-lock.json.
pub fn ensure_npm_packages() -> Result<(), String> {
    let root = workspace_root();
    let lock = root.join("package-lock.json");
    let stamp = root.join("node_modules/.package-lock.json");
    let fresh = match (std::fs::metadata(&lock), std::fs::metadata(&stamp)) {
        (Ok(l), Ok(s)) => match (l.modified(), s.modified()) {
            (Ok(lm), Ok(sm)) => sm >= lm,
            _ => false,
        },
        _ => false,
    };
    if fresh && root.join("node_modules/.bin/wasm-opt").exists() {
        return Ok(());
    }
    if version_of("npm", "--version").is_none() {
        apt_install(&["nodejs", "npm"])?;
    }
    run(Command::new("npm")
        .args(["ci", "--no-audit", "--no-fund"])
        .current_dir(&root))
}

/// Everything the browser tests need, on top of the build tools.
pub fn ensure_test_tools() -> Result<(), String> {
    ensure_build_tools()?;
    let mut missing = Vec::new();
    if !Path::new("/usr/bin/chromium").exists() {
        missing.push("chromium");
    }
    if !Path::new("/usr/bin/chromedriver").exists() {
        missing.push("chromium-driver");
    }
    if !Path::new("/usr/bin/pdftotext").exists() {
        missing.push("poppler-utils");
    }
    if !missing.is_empty() {
        apt_install(&missing)?;
    }
    Ok(())
}

/// The Python of the reference suite: `.venv` at the workspace root, made
/// with `python3 -m venv` when missing, holding exactly the versions pinned
/// in tests/reference/requirements.txt (installed from PyPI only when one is
/// missing or differs, so a second run installs nothing).
pub fn ensure_reference_env() -> Result<PathBuf, String> {
    let root = workspace_root();
    let venv = root.join(".venv");
    let python = venv.join("bin/python");
    if !python.exists() {
        if version_of("python3", "--version").is_none() {
            apt_install(&["python3", "python3-venv"])?;
        }
        println!("xtask: creating the Python environment .venv (python3 -m venv)");
        if run(Command::new("python3").args(["-m", "venv"]).arg(&venv)).is_err() {
            // Debian's python3 needs python3-venv for ensurepip.
            apt_install(&["python3-venv"])?;
            run(Command::new("python3")
                .args(["-m", "venv", "--clear"])
                .arg(&venv))?;
        }
    }
    let req = root.join("tests/reference/requirements.txt");
    let text =
        std::fs::read_to_string(&req).map_err(|e| format!("cannot read {}: {e}", req.display()))?;
    let pinned: Vec<(String, String)> = text
        .lines()
        .map(|l| l.split('#').next().unwrap_or("").trim())
        .filter_map(|l| l.split_once("=="))
        .map(|(n, v)| (normalise(n), v.trim().to_string()))
        .collect();
    let out = Command::new(&python)
        .args([
            "-m",
            "pip",
            "list",
            "--format=freeze",
            "--disable-pip-version-check",
        ])
        .output()
        .map_err(|e| format!("cannot run {}: {e}", python.display()))?;
    let installed: Vec<(String, String)> = String::from_utf8_lossy(&out.stdout)
        .lines()
        .filter_map(|l| l.split_once("=="))
        .map(|(n, v)| (normalise(n), v.trim().to_string()))
        .collect();
    let stale: Vec<String> = pinned
        .iter()
        .filter(|p| !installed.contains(p))
        .map(|(n, v)| format!("{n}=={v}"))
        .collect();
    if stale.is_empty() {
        println!(
            "xtask: Python reference libraries as pinned ({} packages)",
            pinned.len()
        );
        return Ok(python);
    }
    println!(
        "xtask: installing pinned Python reference libraries: {}",
        stale.join(" ")
    );
    run(Command::new(&python)
        .args(["-m", "pip", "install", "--disable-pip-version-check", "-r"])
        .arg(&req))?;
    Ok(python)
}

/// A Python package name compared the way pip does: case and `-`/`_`/`.` fold.
fn normalise(name: &str) -> String {
    name.trim().to_ascii_lowercase().replace(['_', '.'], "-")
}

/// Install Debian packages (as root, or through sudo).
fn apt_install(pkgs: &[&str]) -> Result<(), String> {
    println!("xtask: installing Debian packages {}", pkgs.join(" "));
    let is_root = Command::new("id")
        .arg("-u")
        .output()
        .map(|o| String::from_utf8_lossy(&o.stdout).trim() == "0")
        .unwrap_or(false);
    let apt = |args: &[&str]| {
        let mut c = if is_root {
            Command::new("apt-get")
        } else {
            let mut c = Command::new("sudo");
            c.arg("apt-get");
            c
        };
        c.args(args).env("DEBIAN_FRONTEND", "noninteractive");
        c
    };
    run(&mut apt(&["update"]))?;
    let mut args = vec!["install", "-y", "--no-install-recommends"];
    args.extend_from_slice(pkgs);
    run(&mut apt(&args))
}
