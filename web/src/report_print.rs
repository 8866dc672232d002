//! The parts of the printed report that the screen does not show: the
//! title block (identity, date, revision, assessor, program version,
//! scenario hash, when printed), the inputs as typed with their SI values,
//! and the signature block. The figures, checks, plots and cautions are
//! printed from the very same elements the screen shows (print styles in
//! `static/app.css` hide the controls and the input form), so the report
//! and the screen cannot disagree.

use crate::html::{esc, push_esc, push_text};
use crate::keep::Keeper;
use crate::labels::label_of;
use crate::library::fmt_time;
use crate::state::Sheet;
use crate::system::DisplaySystem;
use joulewise_core::report::Report;
use joulewise_core::units::{format_sig, UnitSystem};
use leptos::prelude::*;
use std::fmt::Write;

/// Significant figures of the SI values in the inputs table: enough to
/// show every digit a person types.
const SI_SIG: usize = 6;

fn row(out: &mut String, head: &str, text: &str) {
    let _ = write!(out, "<tr><th scope=\"row\">{head}</th><td>");
    push_esc(out, if text.trim().is_empty() { "—" } else { text });
    out.push_str("</td></tr>");
}

/// The title block.
pub fn title_block_html(r: &Report, saved: Option<(u64, f64)>, now_ms: f64) -> String {
    let i = &r.identity;
    let mut out = String::from("<section class=\"report-block report-title\" aria-label=\"Report title block\"><h2>Assessment report: ");
    push_esc(
        &mut out,
        if i.title.trim().is_empty() {
            "Untitled assessment"
        } else {
            &i.title
        },
    );
    out.push_str("</h2><table class=\"report-table\"><tbody>");
    row(&mut out, "Machine tag or asset", &i.machine_tag);
    row(&mut out, "Location", &i.location);
    row(&mut out, "Assessor", &i.assessor);
    row(&mut out, "Date of the assessment", &i.date);
    row(&mut out, "Revision", &i.revision);
    let stored = saved.map_or("not saved in this browser".to_string(), |(rev, t)| {
        format!("revision {rev} saved {}", fmt_time(t))
    });
    row(&mut out, "Kept in this browser as", &stored);
    row(&mut out, "Program", &r.program);
    row(
        &mut out,
        "Scenario format version",
        &r.schema_version.to_string(),
    );
    row(&mut out, "Scenario hash (SHA-256)", &r.scenario_hash);
    row(&mut out, "Report produced", &fmt_time(now_ms));
    out.push_str("</tbody></table>");
    if !i.notes.trim().is_empty() {
        out.push_str("<p class=\"report-notes\"><strong>Notes:</strong> ");
        push_esc(&mut out, &i.notes);
        out.push_str("</p>");
    }
    out.push_str("</section>");
    out
}

/// The inputs as typed with their SI values, then the model notes.
pub fn inputs_html(r: &Report, sys: UnitSystem) -> String {
    let mut out = String::from("<section class=\"report-block report-inputs\" aria-label=\"Inputs as typed\"><h2>Inputs as typed</h2><table class=\"report-table\"><thead><tr><th scope=\"col\">Input</th><th scope=\"col\">As typed</th><th scope=\"col\">SI value</th><th scope=\"col\">Tolerance</th></tr></thead><tbody>");
    for line in &r.inputs {
        out.push_str("<tr><td>");
        push_esc(&mut out, &label_of(&line.path));
        let _ = write!(out, " <code>{}</code></td><td>", esc(&line.path));
        push_esc(&mut out, &line.text);
        out.push_str("</td><td>");
        match line.si {
            Some(v) if v.is_finite() => {
                let _ = write!(
                    out,
                    "{} {}",
                    format_sig(v, SI_SIG),
                    esc(line.dim.si_symbol())
                );
            }
            _ => out.push_str("not readable"),
        }
        out.push_str("</td><td>");
        push_esc(&mut out, &line.tolerance);
        out.push_str("</td></tr>");
    }
    out.push_str("</tbody></table>");
    if !r.errors.is_empty() {
        out.push_str("<h3>Inputs the program could not read</h3><ul>");
        for e in &r.errors {
            let _ = write!(out, "<li><code>{}</code>: ", esc(&e.field));
            push_esc(&mut out, &e.message());
            out.push_str("</li>");
        }
        out.push_str("</ul>");
    }
    if !r.notes.is_empty() {
        out.push_str("<h3>Notes from the models</h3><ul>");
        for n in &r.notes {
            out.push_str("<li>");
            push_text(&mut out, n, sys);
            out.push_str("</li>");
        }
        out.push_str("</ul>");
    }
    out.push_str("</section>");
    out
}

/// The signature block.
pub fn signature_html() -> &'static str {
    concat!(
        "<section class=\"report-block report-sign\" aria-label=\"Signatures\"><h2>Review and sign-off</h2>",
        "<p>The figures are estimates from the inputs above; confirm them by measurement. ",
        "A competent person reviews the assessment; local law and standards prevail.</p>",
        "<table class=\"report-table sign-table\"><thead><tr><th scope=\"col\">Role</th><th scope=\"col\">Name</th>",
        "<th scope=\"col\">Signature</th><th scope=\"col\">Date</th></tr></thead><tbody>",
        "<tr><td>Assessed by</td><td></td><td></td><td></td></tr>",
        "<tr><td>Reviewed and approved by (competent person)</td><td></td><td></td><td></td></tr>",
        "</tbody></table></section>"
    )
}

/// The title block, shown in print only (above the sheet).
pub fn title_block() -> AnyView {
    let sheet = Sheet::get();
    let k = Keeper::get();
    let html = Memo::new(move |_| {
        let saved = k.saved.get();
        sheet
            .report
            .with(|r| title_block_html(r, saved, js_sys::Date::now()))
    });
    view! { <div class="report-only" id="report-title" inner_html=html></div> }.into_any()
}

/// The inputs table and the signature block, shown in print only.
pub fn report_tail() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let html = Memo::new(move |_| {
        let s = sys.get();
        sheet.report.with(|r| inputs_html(r, s))
    });
    view! {
        <div class="report-only" id="report-inputs" inner_html=html></div>
        <div class="report-only" id="report-sign" inner_html=signature_html()></div>
    }
    .into_any()
}
