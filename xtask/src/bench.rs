//! `cargo xtask bench`: every performance goal of the project measured and
//! held to its budget (issue 10). Not part of `cargo xtask test`: budgets
//! depend on the machine, so they are checked here, never by timed unit
//! tests.
//!
//! Steps (each can be skipped with `--skip NAME`, or chosen with `--only`):
//! - `core`: the criterion benchmarks of `core/benches/core.rs` (`assess`
//!   per demo, one release + impact solve of the power-law buffer case,
//!   the carriage demo's Monte Carlo, `assess_summary` per demo), read from
//!   criterion's `estimates.json` (median);
//! - `scipy`: `bench/scipy_power_law.py` in the project's `.venv` times
//!   scipy's `solve_ivp` (RK45) on the same power-law case, in the same
//!   run, for the integrator ratio and the error against the closed form;
//! - `batch`: `joulewise batch` on 100 000 invented rows (`demo-register`),
//!   pinned to one core with `taskset -c 0` when available; rows per second
//!   by the wall clock and by the process's own CPU time, and the peak
//!   resident memory against a 10 000-row run (flat when streaming);
//! - `size`: the release build (`dist/`): WASM + JS + CSS after `gzip -9`,
//!   and the raw size of `dist-single/joulewise.html`;
//! - `browser`: `bench/browser.mjs` (playwright-core, Debian's Chromium) on
//!   `dist/` served locally: start-up with the CPU throttled 4×, recompute
//!   per demo and the Monte Carlo in the page, through the page's bench
//!   hook; "not measured yet" when the page has none.
//!
//! Prints a table (goal, figure, budget, ratio to the budget, verdict and
//! the change against the previous run and the committed baseline), writes
//! `bench-results/latest.json` (git-ignored) and fails when a measured
//! figure is over its budget. `--save-baseline` also writes
//! `bench-results/baseline.json`.

use crate::serve::Server;
use crate::tools::{self, describe, tool_path, workspace_root};
use std::collections::BTreeMap;
use std::fmt::Write as _;
use std::path::{Path, PathBuf};
use std::process::Command;

/// The steps, in order.
const STEPS: &[&str] = &["core", "scipy", "batch", "size", "browser"];

/// Rows of the batch goal.
const BATCH_ROWS: u64 = 100_000;
/// Rows of the reference run for the flat-memory check.
const BATCH_SMALL_ROWS: u64 = 10_000;
/// Peak memory may grow by this factor (plus [`RSS_SLACK_KB`]) from the
/// small to the large register and still count as flat: streaming keeps it
/// constant; allocator noise and a longer output buffer history remain.
const RSS_GROWTH: f64 = 1.25;
const RSS_SLACK_KB: f64 = 1024.0;

/// Whether a smaller or a larger figure is better.
#[derive(Clone, Copy, PartialEq)]
enum Better {
    Lower,
    Higher,
}

/// One measured (or not measured) goal.
struct Row {
    id: String,
    goal: String,
    unit: &'static str,
    value: Option<f64>,
    budget: Option<f64>,
    better: Better,
    note: String,
}

impl Row {
    fn new(id: &str, goal: &str, unit: &'static str, budget: Option<f64>, better: Better) -> Row {
        Row {
            id: id.into(),
            goal: goal.into(),
            unit,
            value: None,
            budget,
            better,
            note: String::new(),
        }
    }

    fn value(mut self, v: Option<f64>) -> Row {
        self.value = v.filter(|x| x.is_finite());
        self
    }

    fn note(mut self, n: impl Into<String>) -> Row {
        self.note = n.into();
        self
    }

    /// Figure / budget for "lower is better", budget / figure otherwise:
    /// at most 1 passes.
    fn ratio(&self) -> Option<f64> {
        let (v, b) = (self.value?, self.budget?);
        match self.better {
            Better::Lower => Some(v / b),
            Better::Higher => (v > 0.0).then(|| b / v),
        }
    }

    fn status(&self) -> &'static str {
        match (self.value, self.budget) {
            (None, _) => "not measured",
            (Some(_), None) => "info",
            (Some(_), Some(_)) => match self.ratio() {
                Some(r) if r <= 1.0 => "pass",
                _ => "FAIL",
            },
        }
    }
}

/// `cargo xtask bench [--only a,b] [--skip a,b] [--save-baseline]`.
pub fn bench_cmd(args: &[String]) -> Result<(), String> {
    let choice = crate::StepChoice::from_args(args, STEPS, "bench step")?;
    let wanted = |name: &str| choice.wanted(name);
    let root = workspace_root();
    let load = std::fs::read_to_string("/proc/loadavg").unwrap_or_default();
    println!(
        "xtask bench: load average {} (figures are medians; other work on the machine slows them)",
        load.split_whitespace()
            .take(3)
            .collect::<Vec<_>>()
            .join(" ")
    );
    let mut rows: Vec<Row> = Vec::new();
    let mut native_solve_s = None;
    let mut native_error = None;

    if wanted("core") {
        match core_benches(&root) {
            Ok((r, solve_s, err)) => {
                rows.extend(r);
                native_solve_s = solve_s;
                native_error = err;
            }
            Err(e) => {
                eprintln!("xtask bench: core benchmarks: {e}");
                rows.push(
                    Row::new("core", "criterion benchmarks", "", None, Better::Lower).note(e),
                );
            }
        }
    }
    if wanted("scipy") {
        rows.extend(scipy_rows(&root, native_solve_s, native_error));
    }
    if wanted("batch") {
        rows.extend(batch_rows(&root));
    }
    let dist_ok = if wanted("size") || wanted("browser") {
        match tools::ensure_build_tools().and_then(|()| crate::steps::build_dist("/")) {
            Ok(()) => true,
            Err(e) => {
                eprintln!("xtask bench: the release build failed: {e}");
                false
            }
        }
    } else {
        false
    };
    if wanted("size") {
        rows.extend(size_rows(&root.join("dist"), dist_ok));
    }
    if wanted("browser") {
        rows.extend(browser_rows(&root, dist_ok));
    }

    let dir = root.join("bench-results");
    let previous = read_results(&dir.join("latest.json"));
    let baseline = read_results(&dir.join("baseline.json"));
    print_table(&rows, &previous, &baseline);
    let json = results_json(&rows, &load);
    std::fs::create_dir_all(&dir).map_err(|e| format!("creating {}: {e}", dir.display()))?;
    std::fs::write(dir.join("latest.json"), &json)
        .map_err(|e| format!("writing bench-results/latest.json: {e}"))?;
    println!("xtask bench: results in bench-results/latest.json");
    if args.iter().any(|a| a == "--save-baseline") {
        std::fs::write(dir.join("baseline.json"), &json)
            .map_err(|e| format!("writing bench-results/baseline.json: {e}"))?;
        println!("xtask bench: saved as bench-results/baseline.json");
    }
    let over: Vec<&str> = rows
        .iter()
        .filter(|r| r.status() == "FAIL")
        .map(|r| r.id.as_str())
        .collect();
    if over.is_empty() {
        Ok(())
    } else {
        Err(format!("over budget: {}", over.join(", ")))
    }
}

// ------------------------------------------------------------------- core

/// Criterion's median estimate (ns) of a benchmark.
fn criterion_median_ns(target: &Path, id: &str) -> Option<f64> {
    let path = target
        .join("criterion")
        .join(id)
        .join("new")
        .join("estimates.json");
    let text = std::fs::read_to_string(path).ok()?;
    let v = Json::parse(&text).ok()?;
    v.get("median")?.get("point_estimate")?.as_f64()
}

fn target_dir(root: &Path) -> PathBuf {
    std::env::var_os("CARGO_TARGET_DIR")
        .map(PathBuf::from)
        .unwrap_or_else(|| root.join("target"))
}

/// The `bench-figure {json}` lines of a benchmark run, by id.
fn bench_figures(output: &str) -> BTreeMap<String, Json> {
    output
        .lines()
        .filter_map(|l| l.trim().strip_prefix("bench-figure "))
        .filter_map(|j| Json::parse(j).ok())
        .filter_map(|j| Some((j.get("id")?.as_str()?.to_string(), j)))
        .collect()
}

type CoreOut = (Vec<Row>, Option<f64>, Option<f64>);

fn core_benches(root: &Path) -> Result<CoreOut, String> {
    let mut cmd = Command::new("cargo");
    cmd.args([
        "bench",
        "-p",
        "joulewise-core",
        "--bench",
        "core",
        "--",
        "--noplot",
    ])
    .current_dir(root);
    let out = run_capture(&mut cmd)?;
    let figs = bench_figures(&out);
    let target = target_dir(root);
    let ms = |id: &str| criterion_median_ns(&target, id).map(|ns| ns * 1e-6);
    let mut rows = Vec::new();
    for key in ["guard-door", "carriage-stop", "brake-springs", "ejector"] {
        rows.push(
            Row::new(
                &format!("native.assess.{key}"),
                &format!("assess {key}, native (criterion median)"),
                "ms",
                None,
                Better::Lower,
            )
            .value(ms(&format!("assess/{key}")))
            .note("browser budget 1 ms (see browser.recompute)"),
        );
    }
    for key in ["guard-door", "carriage-stop", "brake-springs", "ejector"] {
        rows.push(
            Row::new(
                &format!("native.assess_summary.{key}"),
                &format!("assess_summary {key} (one register row), native"),
                "ms",
                None,
                Better::Lower,
            )
            .value(ms(&format!("assess_summary/{key}"))),
        );
    }
    let mc_samples = figs
        .get("monte_carlo")
        .and_then(|j| j.get("samples")?.as_f64());
    rows.push(
        Row::new(
            "native.monte_carlo",
            "Monte Carlo 10 000 samples of carriage-stop, native",
            "ms",
            None,
            Better::Lower,
        )
        .value(ms("monte_carlo/carriage-stop_10000"))
        .note(format!(
            "{} samples; browser budget 150 ms (see browser.monte_carlo)",
            mc_samples.map_or("?".into(), |s| format!("{s:.0}"))
        )),
    );
    let solve_ms = ms("solve/power_law_release_impact");
    let pl = figs.get("power_law_solve");
    let rhs = pl.and_then(|j| j.get("rhs_evaluations")?.as_f64());
    let err = pl.and_then(|j| j.get("stroke_rel_error")?.as_f64());
    rows.push(
        Row::new(
            "native.power_law_solve",
            "one release + impact solve, power-law buffer, native",
            "µs",
            None,
            Better::Lower,
        )
        .value(solve_ms.map(|m| m * 1e3))
        .note(format!(
            "{} RHS evaluations; stroke error {} against the closed form",
            rhs.map_or("?".into(), |r| format!("{r:.0}")),
            err.map_or("?".into(), |e| format!("{e:.1e}"))
        )),
    );
    Ok((rows, solve_ms.map(|m| m * 1e-3), err))
}

// ------------------------------------------------------------------ scipy

fn scipy_rows(root: &Path, native_s: Option<f64>, native_err: Option<f64>) -> Vec<Row> {
    let ratio_row = Row::new(
        "integrator.ratio",
        "integrator: scipy solve_ivp RK45 time / native time (same problem, same run)",
        "×",
        Some(500.0),
        Better::Higher,
    );
    let err_row = Row::new(
        "integrator.error",
        "integrator: native stroke error / scipy stroke error (closed form)",
        "×",
        Some(1.0),
        Better::Lower,
    );
    let python = match tools::ensure_reference_env() {
        Ok(p) => p,
        Err(e) => {
            let why = format!("the Python environment could not be made: {e}");
            return vec![ratio_row.note(why.clone()), err_row.note(why)];
        }
    };
    let mut cmd = Command::new(python);
    cmd.arg("bench/scipy_power_law.py").current_dir(root);
    let out = match run_capture(&mut cmd) {
        Ok(o) => o,
        Err(e) => return vec![ratio_row.note(e.clone()), err_row.note(e)],
    };
    let Some(j) = out.lines().rev().find_map(|l| Json::parse(l.trim()).ok()) else {
        return vec![ratio_row.note("no result line from the scipy script")];
    };
    let scipy_s = j.get("median_s").and_then(Json::as_f64);
    let scipy_err = j.get("stroke_rel_error").and_then(Json::as_f64);
    let scipy_rhs = j.get("rhs_evaluations").and_then(Json::as_f64);
    let ratio = match (scipy_s, native_s) {
        (Some(a), Some(b)) if b > 0.0 => Some(a / b),
        _ => None,
    };
    let scipy_row = Row::new(
        "scipy.power_law_solve",
        "same solve, scipy solve_ivp RK45 rtol 1e-8 (median)",
        "µs",
        None,
        Better::Lower,
    )
    .value(scipy_s.map(|s| s * 1e6))
    .note(format!(
        "{} RHS evaluations; stroke error {}",
        scipy_rhs.map_or("?".into(), |r| format!("{r:.0}")),
        scipy_err.map_or("?".into(), |e| format!("{e:.1e}"))
    ));
    // An error below rounding on both sides compares as equal.
    let floor = 1e-15;
    let err_ratio = match (native_err, scipy_err) {
        (Some(a), Some(b)) => Some(a.max(floor) / b.max(floor)),
        _ => None,
    };
    vec![
        scipy_row,
        ratio_row.value(ratio).note(if native_s.is_none() {
            "needs the core step (native time)".to_string()
        } else {
            String::new()
        }),
        err_row.value(err_ratio),
    ]
}

// ------------------------------------------------------------------ batch

/// Closing line of `joulewise batch`: rows, seconds, rows/s, peak memory
/// (kB) and CPU seconds.
struct BatchRun {
    rows: f64,
    rows_per_s: f64,
    cpu_s: Option<f64>,
    peak_kb: Option<f64>,
}

fn parse_batch_line(stderr: &str) -> Option<BatchRun> {
    let line = stderr.lines().rev().find(|l| l.contains(" rows in "))?;
    let after = line.split("joulewise: ").nth(1)?;
    let rows: f64 = after.split_whitespace().next()?.parse().ok()?;
    let rate = line
        .split('(')
        .nth(1)?
        .split_whitespace()
        .next()?
        .parse()
        .ok()?;
    let peak_kb = line
        .split("peak memory ")
        .nth(1)
        .and_then(|s| s.split_whitespace().next())
        .and_then(|s| s.parse().ok());
    let cpu_s = line
        .split("CPU ")
        .nth(1)
        .and_then(|s| s.split_whitespace().next())
        .and_then(|s| s.parse().ok());
    Some(BatchRun {
        rows,
        rows_per_s: rate,
        cpu_s,
        peak_kb,
    })
}

fn batch_rows(root: &Path) -> Vec<Row> {
    let rate_row = Row::new(
        "batch.rows_per_s",
        "joulewise batch, 100 000 invented rows, one core (wall clock)",
        "rows/s",
        Some(20_000.0),
        Better::Higher,
    );
    let cpu_row = Row::new(
        "batch.rows_per_cpu_s",
        "joulewise batch, 100 000 rows, per CPU second of the process",
        "rows/s",
        Some(20_000.0),
        Better::Higher,
    );
    let mem_row = Row::new(
        "batch.peak_rss_growth",
        "batch peak memory, 100 000 rows / 10 000 rows (flat when streaming)",
        "×",
        Some(RSS_GROWTH),
        Better::Lower,
    );
    let build = Command::new("cargo")
        .args([
            "build",
            "--profile",
            "fast",
            "-p",
            "joulewise-core",
            "--features",
            "cli",
            "--bin",
            "joulewise",
        ])
        .current_dir(root)
        .status();
    if !build.map(|s| s.success()).unwrap_or(false) {
        let why = "the CLI did not build";
        return vec![rate_row.note(why), cpu_row.note(why), mem_row.note(why)];
    }
    let exe = target_dir(root).join("fast").join("joulewise");
    let dir = target_dir(root).join("bench");
    let _ = std::fs::create_dir_all(&dir);
    let run = |rows: u64| -> Result<BatchRun, String> {
        let register = dir.join(format!("register-{rows}.csv"));
        if !register.exists() {
            let out = Command::new(&exe)
                .args(["demo-register", &rows.to_string()])
                .output()
                .map_err(|e| format!("demo-register: {e}"))?;
            std::fs::write(&register, out.stdout).map_err(|e| format!("{e}"))?;
        }
        let pinned = Path::new("/usr/bin/taskset").exists();
        let mut cmd = if pinned {
            let mut c = Command::new("/usr/bin/taskset");
            c.args(["-c", "0"]).arg(&exe);
            c
        } else {
            Command::new(&exe)
        };
        cmd.arg("batch")
            .arg(&register)
            .args(["--output", "/dev/null"]);
        println!("xtask: $ {}", describe(&cmd));
        let out = cmd.output().map_err(|e| format!("batch: {e}"))?;
        let err = String::from_utf8_lossy(&out.stderr);
        parse_batch_line(&err).ok_or_else(|| format!("no closing line from batch: {err}"))
    };
    let small = run(BATCH_SMALL_ROWS);
    let large = run(BATCH_ROWS);
    match large {
        Err(e) => vec![
            rate_row.note(e.clone()),
            cpu_row.note(e.clone()),
            mem_row.note(e),
        ],
        Ok(big) => {
            let growth = match (&small, big.peak_kb) {
                (Ok(s), Some(b)) => s.peak_kb.map(|a| {
                    // Within the slack the memory counts as flat.
                    if b <= a * RSS_GROWTH + RSS_SLACK_KB {
                        (b / a).min(RSS_GROWTH)
                    } else {
                        b / a
                    }
                }),
                _ => None,
            };
            let pinned = if Path::new("/usr/bin/taskset").exists() {
                "pinned with taskset -c 0"
            } else {
                "not pinned (no taskset)"
            };
            vec![
                rate_row
                    .value(Some(big.rows_per_s))
                    .note(format!("{:.0} rows, {pinned}", big.rows)),
                cpu_row
                    .value(big.cpu_s.map(|c| big.rows / c.max(1e-9)))
                    .note(
                    "the rate the process reached while it had the CPU (less sensitive to load)",
                ),
                mem_row.value(growth).note(format!(
                    "peak {} kB at 100 000 rows, {} kB at 10 000",
                    big.peak_kb.map_or("?".into(), |k| format!("{k:.0}")),
                    small
                        .as_ref()
                        .ok()
                        .and_then(|s| s.peak_kb)
                        .map_or("?".into(), |k| format!("{k:.0}"))
                )),
            ]
        }
    }
}

// ------------------------------------------------------------------- size

/// Size of `path` after `gzip -9` (bytes).
fn gzip9(path: &Path) -> Option<f64> {
    let out = Command::new("gzip")
        .args(["-9", "-c"])
        .arg(path)
        .output()
        .ok()?;
    out.status.success().then_some(out.stdout.len() as f64)
}

fn size_rows(dist: &Path, built: bool) -> Vec<Row> {
    let transfer = Row::new(
        "size.transfer_gzip",
        "transfer size: WASM + JS + CSS of the release build, gzip -9",
        "KB",
        Some(250.0),
        Better::Lower,
    );
    let single = Row::new(
        "size.single_file_html",
        "single-file HTML, raw",
        "KB",
        Some(900.0),
        Better::Lower,
    );
    if !built {
        let why = "the release build failed";
        return vec![transfer.note(why), single.note(why)];
    }
    let files: Vec<PathBuf> = std::fs::read_dir(dist)
        .map(|d| d.flatten().map(|e| e.path()).collect())
        .unwrap_or_default();
    let ext = |p: &Path| {
        p.extension()
            .and_then(|e| e.to_str())
            .unwrap_or("")
            .to_string()
    };
    let mut total = 0.0;
    let mut parts = Vec::new();
    for f in files
        .iter()
        .filter(|f| ["wasm", "js", "css"].contains(&ext(f).as_str()))
    {
        if let Some(z) = gzip9(f) {
            total += z;
            parts.push(format!(
                "{} {:.1}",
                f.file_name().and_then(|n| n.to_str()).unwrap_or("?"),
                z / 1000.0
            ));
        }
    }
    parts.sort();
    // The single-file build that `cargo xtask dist` writes beside dist/.
    let single_path = dist.with_file_name("dist-single").join("joulewise.html");
    let html = std::fs::metadata(&single_path)
        .ok()
        .map(|m| (m.len(), &single_path));
    vec![
        transfer
            .value((total > 0.0).then_some(total / 1000.0))
            .note(format!("KB = 1000 bytes; {}", parts.join(", "))),
        match html {
            Some((len, f)) => single
                .value(Some(len as f64 / 1000.0))
                .note(f.file_name().and_then(|n| n.to_str()).unwrap_or("?")),
            None => single.note("not measured yet: no dist-single/joulewise.html"),
        },
    ]
}

// ---------------------------------------------------------------- browser

fn browser_rows(root: &Path, built: bool) -> Vec<Row> {
    let startup = Row::new(
        "browser.startup",
        "start-up to the first demo's figures, CPU 4× throttled, median of 10 loads",
        "ms",
        Some(1000.0),
        Better::Lower,
    );
    let mc = Row::new(
        "browser.monte_carlo",
        "Monte Carlo 10 000 samples of carriage-stop in the page",
        "ms",
        Some(150.0),
        Better::Lower,
    );
    let long = Row::new(
        "browser.longest_task",
        "longest main-thread task while the Monte Carlo runs (Long Tasks API)",
        "ms",
        Some(50.0),
        Better::Lower,
    );
    let recompute: Vec<Row> = ["guard-door", "carriage-stop", "brake-springs", "ejector"]
        .iter()
        .map(|k| {
            Row::new(
                &format!("browser.recompute.{k}"),
                &format!("recompute (assess) {k} in the page, median of 200 runs"),
                "ms",
                Some(1.0),
                Better::Lower,
            )
        })
        .collect();
    let all_not = |why: &str| -> Vec<Row> {
        let mut v = vec![startup_clone(&startup, why)];
        v.extend(recompute.iter().map(|r| startup_clone(r, why)));
        v.push(startup_clone(&mc, why));
        v.push(startup_clone(&long, why));
        v
    };
    if !built {
        return all_not("the release build failed");
    }
    if tools::ensure_test_tools().is_err() {
        return all_not("Chromium or playwright-core is missing");
    }
    let server = match Server::start(&root.join("dist"), 0, "/") {
        Ok(s) => s,
        Err(e) => return all_not(&e),
    };
    let base = format!("http://127.0.0.1:{}/", server.port);
    let mut cmd = Command::new("node");
    cmd.arg("bench/browser.mjs")
        .current_dir(root)
        .env("BASE_URL", &base)
        .env("PATH", tool_path());
    let out = match run_capture(&mut cmd) {
        Ok(o) => o,
        Err(e) => return all_not(&e),
    };
    let Some(j) = out.lines().rev().find_map(|l| {
        l.trim()
            .strip_prefix("bench-browser ")
            .and_then(|s| Json::parse(s).ok())
    }) else {
        return all_not("no result line from bench/browser.mjs");
    };
    let num = |path: &[&str]| -> Option<f64> {
        let mut v = &j;
        for p in path {
            v = v.get(p)?;
        }
        v.as_f64()
    };
    let why = |key: &str| -> String {
        j.get(key)
            .and_then(|v| v.get("status"))
            .and_then(Json::as_str)
            .unwrap_or("")
            .to_string()
    };
    let mut rows = vec![startup
        .value(num(&["startup", "median_ms"]))
        .note(why("startup"))];
    for r in recompute {
        let key = r.id.trim_start_matches("browser.recompute.").to_string();
        let v = num(&["recompute", &key, "median_ms"]);
        rows.push(r.value(v).note(why("recompute")));
    }
    rows.push(
        mc.value(num(&["monte_carlo", "ms"]))
            .note(why("monte_carlo")),
    );
    rows.push(
        long.value(num(&["monte_carlo", "longest_task_ms"]))
            .note(why("monte_carlo")),
    );
    rows
}

fn startup_clone(r: &Row, why: &str) -> Row {
    Row::new(&r.id, &r.goal, r.unit, r.budget, r.better).note(format!("not measured yet: {why}"))
}

// ------------------------------------------------------------------ table

fn print_table(rows: &[Row], previous: &BTreeMap<String, f64>, baseline: &BTreeMap<String, f64>) {
    let fmt = |v: Option<f64>| match v {
        None => "—".to_string(),
        Some(x) if x.abs() >= 1000.0 => format!("{x:.0}"),
        Some(x) if x.abs() >= 10.0 => format!("{x:.1}"),
        Some(x) => format!("{x:.3}"),
    };
    let change =
        |id: &str, v: Option<f64>, against: &BTreeMap<String, f64>| match (v, against.get(id)) {
            (Some(a), Some(b)) if *b != 0.0 => format!("{:+.0} %", (a / b - 1.0) * 100.0),
            _ => "—".into(),
        };
    println!();
    println!(
        "{:<34} {:>12} {:<7} {:>9} {:>7} {:<12} {:>9} {:>9}",
        "goal", "figure", "unit", "budget", "ratio", "verdict", "vs last", "vs base"
    );
    for r in rows {
        println!(
            "{:<34} {:>12} {:<7} {:>9} {:>7} {:<12} {:>9} {:>9}",
            r.id,
            fmt(r.value),
            r.unit,
            fmt(r.budget),
            r.ratio().map_or("—".into(), |x| format!("{x:.2}")),
            r.status(),
            change(&r.id, r.value, previous),
            change(&r.id, r.value, baseline),
        );
    }
    println!(
        "\nratio: figure over budget (budget over figure where higher is better); at most 1 passes"
    );
    for r in rows.iter().filter(|r| !r.note.is_empty()) {
        println!("  {}: {} — {}", r.id, r.goal, r.note);
    }
}

fn results_json(rows: &[Row], load: &str) -> String {
    let mut s = String::from("{\n  \"load_average\": ");
    s.push_str(&json_string(load.trim()));
    s.push_str(",\n  \"results\": [\n");
    for (i, r) in rows.iter().enumerate() {
        let num = |v: Option<f64>| v.map_or("null".to_string(), |x| format!("{x}"));
        let _ = writeln!(
            s,
            "    {{\"id\": {}, \"goal\": {}, \"unit\": {}, \"value\": {}, \"budget\": {}, \"status\": {}, \"note\": {}}}{}",
            json_string(&r.id),
            json_string(&r.goal),
            json_string(r.unit),
            num(r.value),
            num(r.budget),
            json_string(r.status()),
            json_string(&r.note),
            if i + 1 < rows.len() { "," } else { "" }
        );
    }
    s.push_str("  ]\n}\n");
    s
}

/// The figures of a saved results file, by id.
fn read_results(path: &Path) -> BTreeMap<String, f64> {
    let Ok(text) = std::fs::read_to_string(path) else {
        return BTreeMap::new();
    };
    let Ok(j) = Json::parse(&text) else {
        return BTreeMap::new();
    };
    let Some(Json::Arr(items)) = j.get("results") else {
        return BTreeMap::new();
    };
    items
        .iter()
        .filter_map(|r| {
            Some((
                r.get("id")?.as_str()?.to_string(),
                r.get("value")?.as_f64()?,
            ))
        })
        .collect()
}

fn json_string(s: &str) -> String {
    let mut out = String::from("\"");
    for c in s.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            '\n' => out.push_str("\\n"),
            c if (c as u32) < 0x20 => {
                let _ = write!(out, "\\u{:04x}", c as u32);
            }
            c => out.push(c),
        }
    }
    out.push('"');
    out
}

/// Run a command, echo it, pass its output through as it comes (so long
/// runs show progress) and return its standard output.
fn run_capture(cmd: &mut Command) -> Result<String, String> {
    use std::io::BufRead;
    println!("xtask: $ {}", describe(cmd));
    let mut child = cmd
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::inherit())
        .spawn()
        .map_err(|e| format!("could not start `{}`: {e}", describe(cmd)))?;
    let mut text = String::new();
    if let Some(out) = child.stdout.take() {
        for line in std::io::BufReader::new(out).lines().map_while(Result::ok) {
            println!("{line}");
            text.push_str(&line);
            text.push('\n');
        }
    }
    let status = child.wait().map_err(|e| format!("{e}"))?;
    if status.success() {
        Ok(text)
    } else {
        Err(format!(
            "`{}` failed ({status}): {}",
            describe(cmd),
            text.lines().rev().take(5).collect::<Vec<_>>().join(" | ")
        ))
    }
}

// ------------------------------------------------------------------- JSON

/// A minimal JSON value (xtask has no dependencies): enough to read
/// criterion's estimates, the scripts' result lines and saved results.
#[derive(Debug, Clone, PartialEq)]
enum Json {
    Null,
    Bool(bool),
    Num(f64),
    Str(String),
    Arr(Vec<Json>),
    Obj(Vec<(String, Json)>),
}

impl Json {
    fn parse(text: &str) -> Result<Json, String> {
        let mut p = Parser {
            s: text.as_bytes(),
            i: 0,
        };
        let v = p.value(0)?;
        p.ws();
        if p.i == p.s.len() {
            Ok(v)
        } else {
            Err(format!("trailing text at byte {}", p.i))
        }
    }

    fn get(&self, key: &str) -> Option<&Json> {
        match self {
            Json::Obj(kv) => kv.iter().find(|(k, _)| k == key).map(|(_, v)| v),
            _ => None,
        }
    }

    fn as_f64(&self) -> Option<f64> {
        match self {
            Json::Num(x) => Some(*x),
            _ => None,
        }
    }

    fn as_str(&self) -> Option<&str> {
        match self {
            Json::Str(s) => Some(s),
            _ => None,
        }
    }
}

struct Parser<'a> {
    s: &'a [u8],
    i: usize,
}

/// Nesting limit of the reader (the files read here nest 3 deep).
const MAX_DEPTH: usize = 64;

impl Parser<'_> {
    fn ws(&mut self) {
        while self.s.get(self.i).is_some_and(|c| c.is_ascii_whitespace()) {
            self.i += 1;
        }
    }

    fn eat(&mut self, c: u8) -> Result<(), String> {
        self.ws();
        if self.s.get(self.i) == Some(&c) {
            self.i += 1;
            Ok(())
        } else {
            Err(format!("expected `{}` at byte {}", c as char, self.i))
        }
    }

    fn value(&mut self, depth: usize) -> Result<Json, String> {
        if depth > MAX_DEPTH {
            return Err("nested too deep".into());
        }
        self.ws();
        match self.s.get(self.i) {
            Some(b'{') => {
                self.i += 1;
                let mut kv = Vec::new();
                self.ws();
                if self.s.get(self.i) == Some(&b'}') {
                    self.i += 1;
                    return Ok(Json::Obj(kv));
                }
                loop {
                    self.ws();
                    let k = self.string()?;
                    self.eat(b':')?;
                    kv.push((k, self.value(depth + 1)?));
                    self.ws();
                    match self.s.get(self.i) {
                        Some(b',') => self.i += 1,
                        Some(b'}') => {
                            self.i += 1;
                            return Ok(Json::Obj(kv));
                        }
                        _ => return Err(format!("expected `,` or `}}` at byte {}", self.i)),
                    }
                }
            }
            Some(b'[') => {
                self.i += 1;
                let mut items = Vec::new();
                self.ws();
                if self.s.get(self.i) == Some(&b']') {
                    self.i += 1;
                    return Ok(Json::Arr(items));
                }
                loop {
                    items.push(self.value(depth + 1)?);
                    self.ws();
                    match self.s.get(self.i) {
                        Some(b',') => self.i += 1,
                        Some(b']') => {
                            self.i += 1;
                            return Ok(Json::Arr(items));
                        }
                        _ => return Err(format!("expected `,` or `]` at byte {}", self.i)),
                    }
                }
            }
            Some(b'"') => Ok(Json::Str(self.string()?)),
            Some(b't') => self.word("true", Json::Bool(true)),
            Some(b'f') => self.word("false", Json::Bool(false)),
            Some(b'n') => self.word("null", Json::Null),
            Some(_) => {
                let start = self.i;
                while self
                    .s
                    .get(self.i)
                    .is_some_and(|c| c.is_ascii_digit() || b"+-.eE".contains(c))
                {
                    self.i += 1;
                }
                std::str::from_utf8(&self.s[start..self.i])
                    .ok()
                    .and_then(|t| t.parse().ok())
                    .map(Json::Num)
                    .ok_or_else(|| format!("bad number at byte {start}"))
            }
            None => Err("unexpected end".into()),
        }
    }

    fn word(&mut self, w: &str, v: Json) -> Result<Json, String> {
        if self.s[self.i..].starts_with(w.as_bytes()) {
            self.i += w.len();
            Ok(v)
        } else {
            Err(format!("bad literal at byte {}", self.i))
        }
    }

    fn string(&mut self) -> Result<String, String> {
        if self.s.get(self.i) != Some(&b'"') {
            return Err(format!("expected a string at byte {}", self.i));
        }
        self.i += 1;
        let mut out = Vec::new();
        loop {
            match self.s.get(self.i) {
                None => return Err("unterminated string".into()),
                Some(b'"') => {
                    self.i += 1;
                    return String::from_utf8(out).map_err(|e| e.to_string());
                }
                Some(b'\\') => {
                    let esc = self.s.get(self.i + 1).copied();
                    self.i += 2;
                    match esc {
                        Some(b'n') => out.push(b'\n'),
                        Some(b't') => out.push(b'\t'),
                        Some(b'r') => out.push(b'\r'),
                        Some(b'b') => out.push(8),
                        Some(b'f') => out.push(12),
                        Some(b'u') => {
                            let hex = self
                                .s
                                .get(self.i..self.i + 4)
                                .and_then(|h| std::str::from_utf8(h).ok())
                                .and_then(|h| u32::from_str_radix(h, 16).ok())
                                .ok_or("bad \\u escape")?;
                            self.i += 4;
                            let c = char::from_u32(hex).unwrap_or('\u{fffd}');
                            let mut buf = [0; 4];
                            out.extend_from_slice(c.encode_utf8(&mut buf).as_bytes());
                        }
                        Some(c) => out.push(c),
                        None => return Err("unterminated escape".into()),
                    }
                }
                Some(&c) => {
                    out.push(c);
                    self.i += 1;
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_criterion_estimates_and_result_lines() {
        let est = r#"{"mean":{"confidence_interval":{"confidence_level":0.95,"lower_bound":1.0,"upper_bound":2.0},"point_estimate":1.5,"standard_error":0.1},"median":{"confidence_interval":{"confidence_level":0.95,"lower_bound":1.1,"upper_bound":1.9},"point_estimate":1.25e3,"standard_error":0.2}}"#;
        let j = Json::parse(est).unwrap();
        assert_eq!(
            j.get("median")
                .unwrap()
                .get("point_estimate")
                .unwrap()
                .as_f64(),
            Some(1250.0)
        );
        let line = "noise\nbench-figure {\"id\":\"x\",\"a\":[1,true,null,\"q\\\"\\u00e9\"]}\n";
        let figs = bench_figures(line);
        assert!(figs.contains_key("x"));
        assert!(Json::parse("{\"a\":").is_err());
    }

    #[test]
    fn results_round_trip_through_the_file_format() {
        let rows = vec![
            Row::new("a", "goal \"a\"", "ms", Some(2.0), Better::Lower).value(Some(1.5)),
            Row::new("b", "goal b", "×", Some(500.0), Better::Higher).value(Some(400.0)),
            Row::new("c", "goal c", "ms", Some(1.0), Better::Lower),
        ];
        assert_eq!(rows[0].status(), "pass");
        assert_eq!(rows[1].status(), "FAIL");
        assert_eq!(rows[2].status(), "not measured");
        let back = read_results_from(&results_json(&rows, "1 2 3"));
        assert_eq!(back.get("a"), Some(&1.5));
        assert_eq!(back.get("b"), Some(&400.0));
        assert_eq!(back.get("c"), None);
    }

    fn read_results_from(text: &str) -> BTreeMap<String, f64> {
        let dir = std::env::temp_dir().join(format!("xtask-bench-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let f = dir.join("r.json");
        std::fs::write(&f, text).unwrap();
        let r = read_results(&f);
        let _ = std::fs::remove_dir_all(&dir);
        r
    }

    #[test]
    fn parses_the_batch_closing_line() {
        let l = "joulewise: 100000 rows in 4.10 s (24390 rows/s); 3 with failing or uncheckable limits, 0 bad input; peak memory 4896 kB; CPU 3.90 s\n";
        let b = parse_batch_line(l).unwrap();
        assert_eq!(b.rows, 100_000.0);
        assert_eq!(b.rows_per_s, 24_390.0);
        assert_eq!(b.peak_kb, Some(4896.0));
        assert_eq!(b.cpu_s, Some(3.9));
    }
}
