//! `cargo xtask`: the project's two newcomer commands and their helpers.
//!
//! - `serve`: install what is missing, build the release app, serve it on
//!   http://127.0.0.1:8080.
//! - `test`: install what the tests need and run every test; prints
//!   `N passed, N failed`.
//! - `dist`: write the deployable static folder `dist/` (offline-capable)
//!   and the single self-contained file `dist-single/joulewise.html`.
//! - `bench`: measure every performance goal against its budget (not part
//!   of `test`).
//!
//! Only the package registries are used (crates.io, npm, Debian); no tool is
//! ever downloaded from anywhere else.
#![forbid(unsafe_code)]

mod bench;
mod dist;
mod serve;
mod steps;
mod tools;

use std::process::ExitCode;

const USAGE: &str = "usage: cargo xtask <serve|dist|test|bench> [options]
  serve [--port N] [--public-url /path/]   build the release app and serve it on 127.0.0.1
  dist  [--public-url /path/]              write the deployable folder dist/ and dist-single/joulewise.html
  test  [--only NAME[,NAME...]] [--skip NAME[,NAME...]]
                                           run every test (names: fmt, clippy, unit, wasm, e2e)
  bench [--only NAME[,NAME...]] [--skip NAME[,NAME...]] [--save-baseline]
                                           measure the performance goals (names: core, scipy,
                                           batch, size, browser); fails when one is over budget";

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let Some(cmd) = args.first() else {
        eprintln!("{USAGE}");
        return ExitCode::from(2);
    };
    let rest = &args[1..];
    let result = match cmd.as_str() {
        "serve" => serve_cmd(rest),
        "dist" => dist_cmd(rest),
        "test" => steps::test_cmd(rest),
        "bench" => bench::bench_cmd(rest),
        "-h" | "--help" | "help" => {
            println!("{USAGE}");
            Ok(())
        }
        other => Err(format!("unknown command `{other}`\n{USAGE}")),
    };
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("xtask: {e}");
            ExitCode::FAILURE
        }
    }
}

/// Value of `--name VALUE` in `args`, if present.
pub fn flag_value(args: &[String], name: &str) -> Option<String> {
    args.iter()
        .position(|a| a == name)
        .and_then(|i| args.get(i + 1).cloned())
}

/// The steps chosen with `--only a,b` and `--skip a,b` among `steps`
/// (`what` names them in the error, e.g. "step" or "bench step").
pub struct StepChoice {
    only: Vec<String>,
    skip: Vec<String>,
}

impl StepChoice {
    /// Read `--only` and `--skip`; an unknown name is an error listing `steps`.
    pub fn from_args(args: &[String], steps: &[&str], what: &str) -> Result<Self, String> {
        let list = |flag: &str| -> Vec<String> {
            flag_value(args, flag)
                .map(|v| v.split(',').map(str::to_string).collect())
                .unwrap_or_default()
        };
        let choice = Self {
            only: list("--only"),
            skip: list("--skip"),
        };
        for n in choice.only.iter().chain(choice.skip.iter()) {
            if !steps.contains(&n.as_str()) {
                return Err(format!(
                    "unknown {what} `{n}`; steps are {}",
                    steps.join(", ")
                ));
            }
        }
        Ok(choice)
    }

    /// Whether step `name` runs.
    pub fn wanted(&self, name: &str) -> bool {
        (self.only.is_empty() || self.only.iter().any(|o| o == name))
            && !self.skip.iter().any(|s| s == name)
    }
}

fn public_url(args: &[String]) -> String {
    let mut p = flag_value(args, "--public-url").unwrap_or_else(|| "/".into());
    if !p.starts_with('/') {
        p.insert(0, '/');
    }
    if !p.ends_with('/') {
        p.push('/');
    }
    p
}

fn dist_cmd(args: &[String]) -> Result<(), String> {
    tools::ensure_build_tools()?;
    let url = public_url(args);
    steps::build_dist(&url)?;
    println!("xtask: dist/ written (public URL {url})");
    Ok(())
}

fn serve_cmd(args: &[String]) -> Result<(), String> {
    tools::ensure_build_tools()?;
    let url = public_url(args);
    steps::build_dist(&url)?;
    let port: u16 = match flag_value(args, "--port") {
        Some(p) => p
            .parse()
            .map_err(|_| format!("--port expects a number from 1 to 65535, got `{p}`"))?,
        None => 8080,
    };
    let root = tools::workspace_root().join("dist");
    let server = serve::Server::start(&root, port, &url)?;
    println!(
        "xtask: Joulewise is served at http://127.0.0.1:{}{url}  (Ctrl+C to stop)",
        server.port
    );
    server.wait();
    Ok(())
}
