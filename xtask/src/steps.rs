//! The build and the test pipeline: every test the project has, run in one
//! go, with a summary line `N passed, N failed` counted from the individual
//! tests each step reports (cargo's `test result:` lines, the end-to-end
//! runner's own tally) and one count for each all-or-nothing step (fmt,
//! clippy, docs, build).

use crate::serve::Server;
use crate::tools::{self, describe, run, tool_path, workspace_root};
use std::io::{BufRead, BufReader};
use std::process::{Command, Stdio};
use std::sync::mpsc;
use std::thread;
use std::time::Instant;

/// Build the release web app into `dist/` for the given public URL, then
/// make it work offline and write the single file (`crate::dist::finish`).
pub fn build_dist(public_url: &str) -> Result<(), String> {
    let root = workspace_root();
    run(Command::new(tools::cargo_bin_dir().join("trunk"))
        .args([
            "--config",
            "trunk.toml",
            "build",
            "--release",
            "--public-url",
            public_url,
        ])
        .env("PATH", tool_path())
        .current_dir(&root))?;
    crate::dist::finish(&root.join("dist"), public_url)
}

/// Tally of one step.
struct Tally {
    name: &'static str,
    passed: u64,
    failed: u64,
    seconds: f64,
}

/// Run a command, streaming its output, and return (success, output).
fn run_streaming(cmd: &mut Command) -> (bool, String) {
    println!("xtask: $ {}", describe(cmd));
    cmd.stdout(Stdio::piped()).stderr(Stdio::piped());
    let mut child = match cmd.spawn() {
        Ok(c) => c,
        Err(e) => return (false, format!("could not start: {e}")),
    };
    let (tx, rx) = mpsc::channel::<String>();
    let mut readers = Vec::new();
    if let Some(out) = child.stdout.take() {
        let tx = tx.clone();
        readers.push(thread::spawn(move || {
            for line in BufReader::new(out).lines().map_while(Result::ok) {
                println!("{line}");
                let _ = tx.send(line);
            }
        }));
    }
    if let Some(err) = child.stderr.take() {
        let tx = tx.clone();
        readers.push(thread::spawn(move || {
            for line in BufReader::new(err).lines().map_while(Result::ok) {
                eprintln!("{line}");
                let _ = tx.send(line);
            }
        }));
    }
    drop(tx);
    let mut text = String::new();
    for line in rx {
        text.push_str(&line);
        text.push('\n');
    }
    for r in readers {
        let _ = r.join();
    }
    let ok = child.wait().map(|s| s.success()).unwrap_or(false);
    (ok, text)
}

/// Sum of `N passed; M failed` over cargo/wasm-bindgen `test result:` lines
/// and `e2e: N passed, M failed` / `pytest`-style tallies.
fn count_tests(output: &str) -> (u64, u64) {
    let mut passed = 0;
    let mut failed = 0;
    for line in output.lines() {
        let l = line.trim();
        let is_tally = l.starts_with("test result:") || l.starts_with("tally:");
        if !is_tally {
            continue;
        }
        passed += number_before(l, " passed");
        failed += number_before(l, " failed");
    }
    (passed, failed)
}

fn number_before(line: &str, word: &str) -> u64 {
    line.find(word)
        .and_then(|i| line[..i].split(|c: char| !c.is_ascii_digit()).next_back())
        .and_then(|n| n.parse().ok())
        .unwrap_or(0)
}

/// The names of the steps, in order.
const STEPS: &[&str] = &[
    "fmt",
    "clippy",
    "doc",
    "unit",
    "cli",
    "reference",
    "wasm",
    "dist",
    "e2e",
];

/// Build the reference harness (a binary of the tests crate) and return its
/// path.
fn build_harness() -> Result<std::path::PathBuf, String> {
    run(Command::new("cargo")
        .args(["build", "-p", "joulewise-tests", "--bin", "refharness"])
        .current_dir(workspace_root()))?;
    let target = std::env::var_os("CARGO_TARGET_DIR")
        .map(std::path::PathBuf::from)
        .unwrap_or_else(|| workspace_root().join("target"));
    Ok(target.join("debug").join("refharness"))
}

/// What the `reference` step runs: the pinned Python environment and the
/// harness, then `run.py`, whose last line is `tally: N passed, M failed`.
/// When the environment or the harness cannot be made, the command names a
/// program that does not exist, so the step fails with the reason printed.
fn reference_command() -> Command {
    match tools::ensure_reference_env().and_then(|py| Ok((py, build_harness()?))) {
        Ok((python, harness)) => {
            let mut c = Command::new(python);
            c.arg("tests/reference/run.py")
                .arg("--harness")
                .arg(harness);
            c
        }
        Err(e) => {
            eprintln!("xtask: the reference suite cannot run: {e}");
            Command::new("reference-suite-could-not-be-prepared")
        }
    }
}

/// Write the hostile import corpus (`joulewise-tests`'s `hostile-corpus`
/// bin: 290-odd broken scenario files and `manifest.json`, one of them
/// 50 MB, so generated rather than committed) into `target/hostile-corpus`
/// for the end-to-end import test, which finds it through
/// `HOSTILE_CORPUS_DIR`. `None` (with the reason printed) when it cannot be
/// written.
fn hostile_corpus() -> Option<std::path::PathBuf> {
    let target = std::env::var_os("CARGO_TARGET_DIR")
        .map(std::path::PathBuf::from)
        .unwrap_or_else(|| workspace_root().join("target"));
    let dir = target.join("hostile-corpus");
    let made = run(Command::new("cargo")
        .args([
            "run",
            "-q",
            "-p",
            "joulewise-tests",
            "--bin",
            "hostile-corpus",
            "--",
        ])
        .arg(&dir)
        .current_dir(workspace_root()));
    match made {
        Ok(()) => Some(dir),
        Err(e) => {
            eprintln!("xtask: the hostile import corpus could not be written: {e}");
            None
        }
    }
}

/// `cargo xtask test`.
pub fn test_cmd(args: &[String]) -> Result<(), String> {
    let choice = crate::StepChoice::from_args(args, STEPS, "step")?;
    let wanted = |name: &str| choice.wanted(name);
    let needs_browser = ["wasm", "dist", "e2e"].iter().any(|s| wanted(s));
    if needs_browser {
        tools::ensure_test_tools()?;
    }
    let root = workspace_root();
    let mut tallies: Vec<Tally> = Vec::new();
    let mut step = |name: &'static str, cmd: &mut Command, counted: bool| {
        if !wanted(name) {
            return;
        }
        let t0 = Instant::now();
        cmd.current_dir(&root).env("PATH", tool_path());
        let (ok, out) = run_streaming(cmd);
        let (mut p, mut f) = if counted { count_tests(&out) } else { (0, 0) };
        if !ok && f == 0 {
            f = 1; // the step failed without a test tally (build error, lint...)
        }
        if ok && p == 0 {
            p = 1;
        }
        if !counted && ok {
            p = 1;
        }
        tallies.push(Tally {
            name,
            passed: p,
            failed: f,
            seconds: t0.elapsed().as_secs_f64(),
        });
    };

    step(
        "fmt",
        Command::new("cargo").args(["fmt", "--all", "--", "--check"]),
        false,
    );
    step(
        "clippy",
        Command::new("cargo").args([
            "clippy",
            "--workspace",
            "--all-targets",
            "--all-features",
            "--",
            "-D",
            "warnings",
        ]),
        false,
    );
    // The web crate is built for the browser: lint it for that target too
    // (code behind `cfg(target_arch = "wasm32")` and the browser tests).
    step(
        "clippy",
        Command::new("cargo").args([
            "clippy",
            "-p",
            "joulewise-web",
            "--all-targets",
            "--target",
            "wasm32-unknown-unknown",
            "--",
            "-D",
            "warnings",
        ]),
        false,
    );
    step(
        "doc",
        Command::new("cargo")
            .args(["doc", "--no-deps", "-p", "joulewise-core", "--all-features"])
            .env("RUSTDOCFLAGS", "-D warnings"),
        false,
    );
    step(
        "unit",
        Command::new("cargo").args(["test", "--workspace", "--exclude", "joulewise-web"]),
        true,
    );
    step(
        "cli",
        Command::new("cargo").args([
            "test",
            "-p",
            "joulewise-core",
            "--features",
            "cli",
            "--test",
            "cli",
        ]),
        true,
    );
    if wanted("reference") {
        step("reference", &mut reference_command(), true);
    }
    step(
        "wasm",
        Command::new("cargo")
            .args([
                "test",
                "--target",
                "wasm32-unknown-unknown",
                "-p",
                "joulewise-web",
            ])
            .env("CHROMEDRIVER", "/usr/bin/chromedriver"),
        true,
    );
    if wanted("dist") || wanted("e2e") {
        let t0 = Instant::now();
        let ok = build_dist("/").is_ok();
        tallies.push(Tally {
            name: "dist",
            passed: u64::from(ok),
            failed: u64::from(!ok),
            seconds: t0.elapsed().as_secs_f64(),
        });
    }
    if wanted("e2e") {
        let t0 = Instant::now();
        let hostile = hostile_corpus();
        let (p, f) = match Server::start(&root.join("dist"), 0, "/") {
            Ok(server) => {
                let base = format!("http://127.0.0.1:{}/", server.port);
                let mut node = Command::new("node");
                node.arg("tests/e2e/run.mjs")
                    .current_dir(&root)
                    .env("BASE_URL", &base)
                    .env("DIST_DIR", root.join("dist"));
                if let Some(dir) = &hostile {
                    node.env("HOSTILE_CORPUS_DIR", dir);
                }
                let (ok, out) = run_streaming(&mut node);
                let (p, f) = count_tests(&out);
                if !ok && f == 0 {
                    (p, 1)
                } else {
                    (p, f)
                }
            }
            Err(e) => {
                eprintln!("xtask: {e}");
                (0, 1)
            }
        };
        tallies.push(Tally {
            name: "e2e",
            passed: p,
            failed: f,
            seconds: t0.elapsed().as_secs_f64(),
        });
    }

    println!("\nxtask test summary");
    for t in &tallies {
        println!(
            "  {:<8} {:>5} passed {:>4} failed  {:>7.1} s",
            t.name, t.passed, t.failed, t.seconds
        );
    }
    let passed: u64 = tallies.iter().map(|t| t.passed).sum();
    let failed: u64 = tallies.iter().map(|t| t.failed).sum();
    println!("{passed} passed, {failed} failed");
    if failed == 0 {
        Ok(())
    } else {
        Err(format!("{failed} failed"))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn counts_cargo_and_e2e_tallies() {
        let out = "test result: ok. 12 passed; 0 failed; 1 ignored\n\
                   test result: FAILED. 3 passed; 2 failed; 0 ignored\n\
                   tally: 7 passed, 1 failed\n";
        assert_eq!(count_tests(out), (22, 3));
    }
}
