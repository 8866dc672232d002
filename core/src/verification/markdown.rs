//! The catalogue as a Markdown section ("How the figures are checked"), for
//! DEVELOPERS.md. A test in `tests/verification.rs` fails when the section
//! there differs from this text; `cargo run -p joulewise-tests --bin
//! refharness -- markdown` prints it.

use super::{catalogue, Basis, Check, Runner, Subject, SubjectKind};
use std::collections::BTreeMap;
use std::fmt::Write;

/// Heading of the generated section.
pub const HEADING: &str = "## How the figures are checked";

/// Escape a table cell: a `|` would end it.
fn cell(s: &str) -> String {
    s.replace('|', "\\|")
}

/// A tolerance for people: `1e-8`, `5e-4`, `exact`.
pub fn tol(x: f64) -> String {
    if x == 0.0 {
        "exact".into()
    } else {
        let e = x.log10().floor();
        let m = x / 10f64.powf(e);
        if (m - 1.0).abs() < 1e-9 {
            format!("1e{e}")
        } else {
            format!("{}e{e}", (m * 10.0).round() / 10.0)
        }
    }
}

fn runner(c: &Check) -> String {
    match c.runner {
        Runner::CoreUnitTest { path } => format!("core test `{path}`"),
        Runner::CrossCrateTest { file, name } => format!("`tests/{file}` `{name}`"),
        Runner::PythonSuite => "Python reference suite".into(),
    }
}

fn subject_block(out: &mut String, s: &Subject) {
    let cat = catalogue();
    let _ = writeln!(out, "#### {} (`{}`)\n", s.name, s.id);
    let label = match s.kind {
        SubjectKind::Model => "Formula",
        SubjectKind::LimitSet => "Rule",
    };
    let _ = writeln!(out, "- {label}: {}", s.formula);
    let _ = writeln!(out, "- Source: {} ({})", s.source, s.status.describe());
    let _ = writeln!(out, "- Code: `{}`\n", s.module);
    let _ = writeln!(
        out,
        "| check | compared with | tolerance | why this tolerance | runs in |"
    );
    let _ = writeln!(out, "|---|---|---|---|---|");
    for c in cat.checks_of(s.id) {
        let detail = if c.reference.detail.is_empty() {
            String::new()
        } else {
            format!(", {}", c.reference.detail)
        };
        let _ = writeln!(
            out,
            "| {} (`{}`) | {}: {}{} ({}) | {} | {}: {} | {} |",
            cell(c.title),
            c.id,
            c.reference.basis.describe(),
            cell(c.reference.name),
            cell(&detail),
            c.reference.status.describe(),
            tol(c.tolerance.relative),
            c.tolerance.kind.describe(),
            cell(c.tolerance.why),
            runner(c),
        );
    }
    out.push('\n');
}

/// The section "How the figures are checked", generated from
/// [`catalogue`]: a summary of the checks per basis and per source, then
/// for each model and limit set its formula, source and the checks that
/// cover it with their tolerance and its reason.
pub fn markdown() -> String {
    let cat = catalogue();
    let mut out = String::new();
    let _ = writeln!(out, "{HEADING}\n");
    out.push_str(
        "<!-- Generated from joulewise_core::verification::catalogue(); do not edit by hand.\n     \
         Regenerate: cargo run -q -p joulewise-tests --bin refharness -- markdown -->\n\n",
    );
    out.push_str(
        "Every figure Joulewise prints comes from a model whose formula and source are listed \
         below, with the checks that compare it against something nobody on this project wrote: \
         published values (standards, regulations, textbook examples, NIST), independent \
         computations by reference libraries (scipy, numpy, pint, uncertainties) whose equations \
         were written from the physics description rather than translated from our code, facts \
         of the trade, and round trips between parts of Joulewise. Each check states its \
         tolerance and why it has that size. The same data drives the tests: the Python \
         reference suite (`cargo xtask test --only reference`) runs exactly the checks marked \
         for it with the tolerance stated here, and `tests/verification.rs` confirms that every \
         named Rust test exists and that this section matches the data.\n\n",
    );
    // Counts per basis and per source.
    let mut by_basis: BTreeMap<Basis, usize> = BTreeMap::new();
    let mut by_source: BTreeMap<&str, usize> = BTreeMap::new();
    for c in cat.checks {
        *by_basis.entry(c.reference.basis).or_default() += 1;
        *by_source.entry(c.reference.name).or_default() += 1;
    }
    let _ = writeln!(out, "### Checks per basis and source\n");
    let _ = writeln!(out, "| basis | checks |\n|---|---|");
    for (b, n) in &by_basis {
        let _ = writeln!(out, "| {} | {n} |", b.describe());
    }
    let _ = writeln!(out, "| **total** | **{}** |\n", cat.checks.len());
    let _ = writeln!(out, "| source | checks |\n|---|---|");
    for (s, n) in &by_source {
        let _ = writeln!(out, "| {} | {n} |", cell(s));
    }
    out.push('\n');
    let _ = writeln!(out, "### Models\n");
    for s in cat.subjects.iter().filter(|s| s.kind == SubjectKind::Model) {
        subject_block(&mut out, s);
    }
    let _ = writeln!(out, "### Limit sets\n");
    for s in cat
        .subjects
        .iter()
        .filter(|s| s.kind == SubjectKind::LimitSet)
    {
        subject_block(&mut out, s);
    }
    // One trailing newline.
    while out.ends_with("\n\n") {
        out.pop();
    }
    out
}
