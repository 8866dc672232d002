//! Write the corpus of hostile and broken scenario files into a folder:
//! `cargo run -p joulewise-tests --bin hostile-corpus -- DIR`.
//!
//! One file per case and `manifest.json` listing each file's name,
//! category, description, the field path its refusal must name (if any) and
//! words the refusal's message must contain. The core's import test
//! (`tests/hostile_files.rs`) and the web sheet's end-to-end import test use
//! the same corpus; it is generated (one file is 50 MB), never committed.
//!
//! `hostile-corpus --seeds DIR` writes the valid seed scenarios instead
//! (`joulewise_tests::robust::seeds`), the starting corpus of the
//! `scenario_json` fuzz target (see fuzz/README.md).
#![forbid(unsafe_code)]

use std::process::ExitCode;

fn write_seeds(dir: &std::path::Path) -> std::io::Result<usize> {
    std::fs::create_dir_all(dir)?;
    let seeds = joulewise_tests::robust::seeds::seeds();
    for (name, s) in &seeds {
        std::fs::write(dir.join(format!("seed-{name}.json")), s.to_json())?;
    }
    Ok(seeds.len())
}

fn main() -> ExitCode {
    let args: Vec<std::ffi::OsString> = std::env::args_os().skip(1).collect();
    let (seeds, dir) = match args.as_slice() {
        [flag, dir] if flag == "--seeds" => (true, dir),
        [dir] => (false, dir),
        _ => {
            eprintln!("usage: hostile-corpus [--seeds] DIR");
            return ExitCode::from(2);
        }
    };
    let dir = std::path::PathBuf::from(dir);
    let written = if seeds {
        write_seeds(&dir).map(|n| format!("{n} seed scenarios"))
    } else {
        joulewise_tests::robust::hostile::write_corpus(&dir)
            .map(|n| format!("{n} hostile files and manifest.json"))
    };
    match written {
        Ok(what) => {
            println!("{what} written to {}", dir.display());
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("hostile-corpus: {}: {e}", dir.display());
            ExitCode::FAILURE
        }
    }
}
