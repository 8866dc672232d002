//! The command-line front end: the same `assess` as the web sheet, on one
//! scenario file or on a whole plant register.
//!
//! ```text
//! joulewise assess FILE|- [--format json|text|csv] [--study]
//! joulewise batch REGISTER.csv|.jsonl|.json [--format csv|json] [--output FILE]
//! joulewise schema
//! joulewise demo NAME | --list
//! joulewise register-template
//! ```
//! Exit codes: 0 every check passes; 1 some check fails (or cannot be made);
//! 2 bad input (the message on stderr names the file, line or field).
#![forbid(unsafe_code)]
// No index or slice that could panic on a file's content (as in the library).
#![cfg_attr(not(test), deny(clippy::indexing_slicing, clippy::string_slice))]

mod register;

use anyhow::{Context, Result};
use clap::{Parser, Subcommand, ValueEnum};
use joulewise_core::assess::{assess, assess_with_study};
use joulewise_core::figure::Verdict;
use joulewise_core::report::Report;
use joulewise_core::scenario::{demos, Scenario};
use joulewise_core::units::{format_quantity, render, UnitSystem};
use std::io::{Read, Write};
use std::process::ExitCode;

#[derive(Parser)]
#[command(
    name = "joulewise",
    version,
    about = "Stored spring energy, release and impact figures checked against published limits.",
    after_help = "Figures are estimates: confirm them by measurement. Release or block stored spring \
energy before work. A competent person signs off; local codes and licensed practice prevail."
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Assess one scenario file (JSON; `-` reads standard input).
    Assess {
        /// Scenario file, or `-`.
        file: String,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Json)]
        format: Format,
        /// Run the tolerance study (worst-case corners, and the Monte Carlo
        /// when the scenario asks for it).
        #[arg(long)]
        study: bool,
        /// Units for text output (default: the scenario's own).
        #[arg(long, value_enum)]
        units: Option<Units>,
    },
    /// Assess every mechanism of a plant register: CSV (one row per
    /// mechanism, see `register-template`), JSON Lines (one scenario per line)
    /// or a JSON array of scenarios. Streams: memory stays flat.
    Batch {
        /// Register file.
        file: String,
        /// Output format (one row or object per mechanism).
        #[arg(long, value_enum, default_value_t = BatchFormat::Csv)]
        format: BatchFormat,
        /// Write to this file instead of standard output.
        #[arg(long)]
        output: Option<String>,
    },
    /// Print the JSON Schema of the scenario format.
    Schema,
    /// Print an invented demo scenario.
    Demo {
        /// Demo key (see --list).
        name: Option<String>,
        /// List the demos.
        #[arg(long)]
        list: bool,
    },
    /// Print the header of a CSV register with one example row.
    RegisterTemplate,
    /// Write an invented register of N mechanisms (to try `batch`).
    DemoRegister {
        /// Number of rows.
        rows: u64,
        /// Seed of the generator.
        #[arg(long, default_value_t = 1)]
        seed: u64,
    },
}

#[derive(Clone, Copy, ValueEnum)]
enum Format {
    Json,
    Text,
    Csv,
}

#[derive(Clone, Copy, ValueEnum)]
enum BatchFormat {
    Csv,
    Json,
}

#[derive(Clone, Copy, ValueEnum)]
enum Units {
    Si,
    Us,
}

/// Exit code for bad input.
const BAD_INPUT: u8 = 2;

fn main() -> ExitCode {
    let cli = Cli::parse();
    match run(cli) {
        Ok(code) => ExitCode::from(code),
        // A reader that stops early (`| head`) is not an error of ours.
        Err(e)
            if e.downcast_ref::<std::io::Error>()
                .is_some_and(|io| io.kind() == std::io::ErrorKind::BrokenPipe) =>
        {
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("joulewise: {e:#}");
            ExitCode::from(BAD_INPUT)
        }
    }
}

fn run(cli: Cli) -> Result<u8> {
    match cli.command {
        Command::Assess {
            file,
            format,
            study,
            units,
        } => assess_cmd(&file, format, study, units),
        Command::Batch {
            file,
            format,
            output,
        } => register::batch(&file, format == BatchFormat::Json, output.as_deref()),
        Command::Schema => {
            let schema = schemars::schema_for!(Scenario);
            let mut out = std::io::stdout().lock();
            writeln!(out, "{}", serde_json::to_string_pretty(&schema)?)?;
            Ok(0)
        }
        Command::Demo { name, list } => {
            let mut out = std::io::stdout().lock();
            if list || name.is_none() {
                for d in demos::all() {
                    writeln!(out, "{:<16} {} — {}", d.key, d.title, d.summary)?;
                }
                return Ok(0);
            }
            let name = name.unwrap_or_default();
            match demos::by_key(&name) {
                Some(s) => {
                    writeln!(out, "{}", s.to_json())?;
                    Ok(0)
                }
                None => {
                    eprintln!(
                        "joulewise: no demo `{name}`; demos are: {}",
                        demos::all()
                            .iter()
                            .map(|d| d.key)
                            .collect::<Vec<_>>()
                            .join(", ")
                    );
                    Ok(BAD_INPUT)
                }
            }
        }
        Command::DemoRegister { rows, seed } => {
            register::demo_register(rows, seed, &mut std::io::stdout().lock())?;
            Ok(0)
        }
        Command::RegisterTemplate => {
            write!(std::io::stdout().lock(), "{}", register::template())?;
            Ok(0)
        }
    }
}

impl PartialEq for BatchFormat {
    fn eq(&self, other: &Self) -> bool {
        matches!(
            (self, other),
            (BatchFormat::Csv, BatchFormat::Csv) | (BatchFormat::Json, BatchFormat::Json)
        )
    }
}

/// The bytes of a scenario file (`-`: standard input); their encoding is
/// checked by `Scenario::from_bytes`, which names what is wrong.
fn read_input(file: &str) -> Result<Vec<u8>> {
    if file == "-" {
        let mut b = Vec::new();
        std::io::stdin()
            .read_to_end(&mut b)
            .context("reading standard input")?;
        Ok(b)
    } else {
        std::fs::read(file).with_context(|| format!("reading {file}"))
    }
}

/// Exit code for a report: 1 when any check that counts fails or cannot be
/// made, else 0.
fn verdict_code(r: &Report) -> u8 {
    match r.verdict {
        Verdict::Fail | Verdict::Unknown => 1,
        Verdict::Pass | Verdict::NotApplicable => 0,
    }
}

fn assess_cmd(file: &str, format: Format, study: bool, units: Option<Units>) -> Result<u8> {
    let bytes = read_input(file)?;
    let scenario = match Scenario::from_bytes(&bytes) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("joulewise: {file}: {e}");
            return Ok(BAD_INPUT);
        }
    };
    let report = if study {
        assess_with_study(&scenario)
    } else {
        assess(&scenario)
    }
    .map_err(|e| anyhow::anyhow!("{file}: {e}"))?;
    let system = match units {
        Some(Units::Si) => UnitSystem::Si,
        Some(Units::Us) => UnitSystem::Us,
        None => report.display_units,
    };
    let mut out = std::io::stdout().lock();
    match format {
        Format::Json => {
            serde_json::to_writer_pretty(&mut out, &report)?;
            writeln!(out)?;
        }
        Format::Text => write_text(&mut out, &report, system)?,
        Format::Csv => write_csv(&mut out, &report)?,
    }
    for e in &report.errors {
        eprintln!("joulewise: {file}: {e}");
    }
    if report.errors.is_empty() {
        Ok(verdict_code(&report))
    } else {
        Ok(BAD_INPUT)
    }
}

fn write_text(out: &mut impl Write, r: &Report, system: UnitSystem) -> Result<()> {
    let id = &r.identity;
    writeln!(
        out,
        "{}",
        if id.title.is_empty() {
            "(untitled)"
        } else {
            &id.title
        }
    )?;
    writeln!(
        out,
        "machine {} · {} · assessor {} · {} · rev {}",
        id.machine_tag, id.location, id.assessor, id.date, id.revision
    )?;
    let short = r.scenario_hash.get(..16).unwrap_or(&r.scenario_hash);
    writeln!(out, "{} · scenario {}", r.program, short)?;
    writeln!(
        out,
        "\nVerdict: {} ({} within, {} exceeding, {} not checkable)",
        r.verdict.word(),
        r.counts.pass,
        r.counts.fail,
        r.counts.unknown
    )?;
    if joulewise_core::limits::worst_verdict(&r.checks).is_none() {
        writeln!(
            out,
            "  No limit was checked: choose the limit sets that apply to this mechanism."
        )?;
    }
    if !r.errors.is_empty() {
        writeln!(out, "\nInput problems")?;
        for e in &r.errors {
            writeln!(out, "  {}", render(&e.to_string(), system))?;
        }
    }
    writeln!(out, "\nFigures")?;
    for f in &r.figures {
        match f.value {
            Some(v) => writeln!(
                out,
                "  {:<40} {:>14}   {}",
                render(&f.label, system),
                format_quantity(v, f.dim, system).to_string(),
                render(&f.method, system)
            )?,
            None => writeln!(
                out,
                "  {:<40} {:>14}   {}",
                render(&f.label, system),
                "—",
                render(&f.missing.join("; "), system)
            )?,
        }
    }
    if !r.checks.is_empty() {
        writeln!(out, "\nChecks")?;
        for c in &r.checks {
            let v = c
                .value
                .map(|v| format_quantity(v, c.dim, system).to_string())
                .unwrap_or_else(|| "—".into());
            let l = c
                .limit
                .map(|v| format_quantity(v, c.dim, system).to_string())
                .unwrap_or_else(|| "—".into());
            writeln!(
                out,
                "  [{}] {}: {} {} {}   ({})",
                c.verdict.word(),
                render(&c.label, system),
                v,
                c.comparison.symbol(),
                l,
                c.provenance.cite()
            )?;
        }
    }
    if !r.notes.is_empty() {
        writeln!(out, "\nNotes")?;
        for n in &r.notes {
            writeln!(out, "  - {}", render(n, system))?;
        }
    }
    writeln!(out, "\nCautions")?;
    for c in &r.cautions {
        writeln!(out, "  - {}: {}", c.caution.title, c.caution.text)?;
        for why in &c.because {
            writeln!(out, "      because {}", render(why, system))?;
        }
    }
    Ok(())
}

fn write_csv(out: &mut impl Write, r: &Report) -> Result<()> {
    let mut w = csv::Writer::from_writer(out);
    w.write_record([
        "kind",
        "id",
        "label",
        "value_si",
        "unit_si",
        "limit_si",
        "verdict",
        "method_or_source",
    ])?;
    for f in &r.figures {
        w.write_record([
            "figure",
            &f.id,
            &f.label,
            &f.value.map(|v| v.to_string()).unwrap_or_default(),
            f.dim.si_symbol(),
            "",
            "",
            &render(&f.method, UnitSystem::Si),
        ])?;
    }
    for c in &r.checks {
        w.write_record([
            "check",
            &c.id,
            &c.label,
            &c.value.map(|v| v.to_string()).unwrap_or_default(),
            c.dim.si_symbol(),
            &c.limit.map(|v| v.to_string()).unwrap_or_default(),
            c.verdict.word(),
            &c.provenance.cite(),
        ])?;
    }
    w.flush()?;
    Ok(())
}
