//! "How the figures are checked": for every model and limit set, its
//! formula and source and the checks that compare it with something nobody
//! on this project wrote, each with its tolerance and why. Rendered from
//! `joulewise_core::verification::catalogue()`, the same data the tests run
//! (and DEVELOPERS.md's generated section), so the page cannot drift from
//! what is actually checked.

use crate::html::esc;
use joulewise_core::verification::{
    catalogue, tolerance_text, Basis, Check, Runner, Subject, SubjectKind,
};
use leptos::prelude::*;
use std::collections::BTreeMap;
use std::fmt::Write;

/// Where a check runs, in words.
fn runs_in(c: &Check) -> String {
    match c.runner {
        Runner::CoreUnitTest { path } => format!("core test {path}"),
        Runner::CrossCrateTest { file, name } => format!("tests/{file}: {name}"),
        Runner::PythonSuite => "reference suite (Python)".into(),
    }
}

fn subject_html(out: &mut String, s: &Subject) {
    let cat = catalogue();
    let rule = match s.kind {
        SubjectKind::Model => "Formula",
        SubjectKind::LimitSet => "Rule",
    };
    let checks: Vec<&Check> = cat.checks_of(s.id).collect();
    let _ = write!(
        out,
        r#"<details class="checked-subject" id="checked-{}"><summary><span class="checked-name">{}</span> <span class="hint">{} check{}</span></summary>"#,
        esc(&s.id.replace('.', "-")),
        esc(s.name),
        checks.len(),
        if checks.len() == 1 { "" } else { "s" }
    );
    let _ = write!(
        out,
        r#"<dl class="checked-facts"><dt>{rule}</dt><dd>{}</dd><dt>Source</dt><dd>{} ({})</dd><dt>Code</dt><dd><code>{}</code></dd></dl>"#,
        esc(s.formula),
        esc(s.source),
        esc(s.status.describe()),
        esc(s.module)
    );
    // The table may scroll sideways on a tablet: keyboard users reach it.
    let _ = write!(
        out,
        r#"<div class="table-wrap" tabindex="0" role="region" aria-label="Checks of {}">"#,
        esc(s.name)
    );
    out.push_str(
        r#"<table class="checked-table"><thead><tr><th scope="col">Check</th><th scope="col">Compared with</th><th scope="col">Tolerance</th><th scope="col">Why this tolerance</th><th scope="col">Runs in</th></tr></thead><tbody>"#,
    );
    for c in checks {
        let detail = if c.reference.detail.is_empty() {
            String::new()
        } else {
            format!(", {}", c.reference.detail)
        };
        let _ = write!(
            out,
            "<tr><td>{}</td><td>{}: {}{} ({})</td><td>{}</td><td>{}: {}</td><td>{}</td></tr>",
            esc(c.title),
            esc(c.reference.basis.describe()),
            esc(c.reference.name),
            esc(&detail),
            esc(c.reference.status.describe()),
            esc(&tolerance_text(c.tolerance.relative)),
            esc(c.tolerance.kind.describe()),
            esc(c.tolerance.why),
            esc(&runs_in(c)),
        );
    }
    out.push_str("</tbody></table></div></details>");
}

/// The whole page as markup (every text escaped).
pub fn checked_html() -> String {
    let cat = catalogue();
    let mut out = String::from(
        r#"<h2 id="checked-title">How the figures are checked</h2><p class="lead">Every figure comes from a model with a named formula and source. Each model and limit set below lists the checks that compare it with something nobody on this project wrote: published values (standards, regulations, textbook examples, NIST), independent computations by reference libraries (scipy, numpy, pint, uncertainties), facts of the trade, and round trips. Each check states the deviation it accepts and why. The program's own tests run exactly these checks; a value marked "from memory" has not been confirmed against the current edition of its source.</p>"#,
    );
    let mut by_basis: BTreeMap<Basis, usize> = BTreeMap::new();
    for c in cat.checks {
        *by_basis.entry(c.reference.basis).or_default() += 1;
    }
    out.push_str(r#"<table class="checked-counts" id="checked-counts"><caption>Checks by what they compare with</caption><tbody>"#);
    for (b, n) in &by_basis {
        let _ = write!(
            out,
            r#"<tr><th scope="row">{}</th><td>{n}</td></tr>"#,
            esc(b.describe())
        );
    }
    let _ = write!(
        out,
        r#"<tr class="total"><th scope="row">all checks</th><td id="checked-total">{}</td></tr></tbody></table>"#,
        cat.checks.len()
    );
    for (kind, title) in [
        (SubjectKind::Model, "Models"),
        (SubjectKind::LimitSet, "Limit sets"),
    ] {
        let _ = write!(out, "<h3>{title}</h3>");
        for s in cat.subjects.iter().filter(|s| s.kind == kind) {
            subject_html(&mut out, s);
        }
    }
    out
}

/// The view; its markup is built the first time it is shown.
pub fn checked_view(shown: Signal<bool>) -> AnyView {
    let html = Memo::new(move |prev: Option<&String>| match prev {
        Some(p) if !p.is_empty() => p.clone(),
        _ if shown.get() => checked_html(),
        _ => String::new(),
    });
    view! { <section class="checked" aria-labelledby="checked-title" inner_html=html></section> }
        .into_any()
}
