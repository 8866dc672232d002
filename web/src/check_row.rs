//! Check rows: the figure against its limit, the margin as a bar and as a
//! ratio and a difference, the verdict in words and icon, the source of the
//! limit with how far it was confirmed (a limit recalled from memory says so
//! in plain sight), the notes, and the cautions the check brings up, each a
//! link to its text in the cautions panel.
//!
//! Margins are the core's ([`Check::margin_ratio`], utilisation: ≤ 1 is
//! within the limit; [`Check::margin_difference`], headroom: ≥ 0 is within).

use crate::cautions_panel::caution_dom_id;
use crate::html::{push_el, push_esc, push_list, push_text};
use crate::system::DisplaySystem;
use crate::verdict::{verdict_badge_html, verdict_key};
use joulewise_core::cautions;
use joulewise_core::figure::{SourceStatus, Verdict};
use joulewise_core::limits::{Check, Comparison};
use joulewise_core::units::{format_quantity, format_sig, UnitSystem};
use leptos::prelude::*;
use std::fmt::Write;

/// Element id of the row for check `id` (dots as hyphens).
pub fn check_dom_id(id: &str) -> String {
    format!("check-{}", id.replace('.', "-"))
}

/// Class suffix of a source status.
pub fn status_key(s: SourceStatus) -> &'static str {
    match s {
        SourceStatus::Confirmed => "confirmed",
        SourceStatus::Secondary => "secondary",
        SourceStatus::Derived => "derived",
        SourceStatus::CommonPractice => "common-practice",
        SourceStatus::FromMemory => "from-memory",
        SourceStatus::UserSupplied => "user-supplied",
    }
}

/// Utilisation in words: `uses 72 % of the limit`.
pub fn utilisation_text(ratio: Option<f64>) -> String {
    match ratio {
        Some(u) => format!("uses {} % of the limit", format_sig(u * 100.0, 3)),
        None => "no ratio (the limit or the figure is zero or missing)".into(),
    }
}

/// Longest bar drawn, as a utilisation: beyond it the bar ends in an arrow.
const BAR_CAP: f64 = 3.0;
/// Utilisation at the right end of the bar's scale when the figure is
/// within 1.5 × the limit, so the limit mark always sits at two thirds.
const BAR_SCALE_MIN: f64 = 1.5;

/// Geometry of a margin bar in a 0..100 wide box: (scale end, bar length,
/// limit mark position, arrow when the utilisation exceeds 3, i.e. 300 %).
pub fn bar_geometry(ratio: f64) -> (f64, f64, f64, bool) {
    let u = ratio.max(0.0);
    let end = u.clamp(BAR_SCALE_MIN, BAR_CAP);
    (end, 100.0 * u.min(end) / end, 100.0 / end, u > BAR_CAP)
}

/// The margin as a small SVG bar with a mark at the limit (decorative: the
/// ratio is written beside it).
pub fn margin_bar_svg(ratio: Option<f64>, verdict: Verdict) -> String {
    let mut out = String::from(concat!(
        r#"<svg class="margin-bar" viewBox="0 0 100 16" preserveAspectRatio="none" aria-hidden="true" focusable="false">"#,
        r#"<rect x="0" y="3" width="100" height="10" class="mb-track"/>"#
    ));
    let mark = match ratio {
        Some(r) => {
            let (_, len, mark, arrow) = bar_geometry(r);
            let _ = write!(
                out,
                r#"<rect x="0" y="3" width="{len:.2}" height="10" class="mb-fill mb-{}"/>"#,
                verdict_key(verdict)
            );
            if arrow {
                out.push_str(r#"<path d="M95 4l4 4l-4 4" class="mb-arrow"/>"#);
            }
            mark
        }
        None => 100.0 / BAR_SCALE_MIN,
    };
    let _ = write!(
        out,
        r#"<line x1="{mark:.2}" y1="0" x2="{mark:.2}" y2="16" class="mb-limit" vector-effect="non-scaling-stroke"/></svg>"#
    );
    out
}

/// One check as an `<article>`.
pub fn check_html(c: &Check, sys: UnitSystem) -> String {
    let fmt = |v: f64| format_quantity(v, c.dim, sys).to_string();
    let mut out = String::new();
    let _ = write!(
        out,
        r#"<article class="check" id="{}" data-verdict="{}"><div class="check-head">{}<h3 class="check-label">"#,
        crate::html::esc(&check_dom_id(&c.id)),
        verdict_key(c.verdict),
        verdict_badge_html(c.verdict)
    );
    push_text(&mut out, &c.label, sys);
    if c.informative {
        out.push_str(r#" <span class="tag">for information, not counted</span>"#);
    }
    out.push_str(r#"</h3></div><dl class="check-compare"><div><dt>Figure</dt>"#);
    let value = c.value.map_or("not computed".to_string(), fmt);
    push_el(&mut out, "dd", "check-value", &value);
    out.push_str("</div><div><dt>Limit</dt>");
    let limit = match (c.comparison, c.limit) {
        (Comparison::NotPermitted, _) => "not permitted at any value".to_string(),
        (cmp, Some(l)) => format!("{} {}", cmp.words(), fmt(l)),
        (_, None) => "none applies".into(),
    };
    push_el(&mut out, "dd", "check-limit", &limit);
    out.push_str(r#"</div></dl><div class="check-margin">"#);
    out.push_str(&margin_bar_svg(c.margin_ratio, c.verdict));
    out.push_str("<p>");
    push_el(
        &mut out,
        "span",
        "check-ratio",
        &utilisation_text(c.margin_ratio),
    );
    if let Some(d) = c.margin_difference {
        let amount = fmt(d.abs());
        let words = match (d >= 0.0, c.comparison) {
            (true, _) => format!("headroom {amount}"),
            (false, Comparison::AtLeast) => format!("short of the limit by {amount}"),
            (false, _) => format!("over the limit by {amount}"),
        };
        out.push_str(" · ");
        push_el(&mut out, "span", "check-headroom", &words);
    }
    out.push_str(r#"</p></div><p class="check-source">Limit from <cite>"#);
    let p = &c.provenance;
    push_esc(&mut out, &p.document);
    if !p.clause.is_empty() {
        out.push_str(", ");
        push_esc(&mut out, &p.clause);
    }
    let _ = write!(
        out,
        r#"</cite> <span class="status" data-status="{}">{}</span></p>"#,
        status_key(p.status),
        p.status.describe()
    );
    push_list(&mut out, "check-notes", &c.notes, sys);
    if !c.cautions.is_empty() {
        out.push_str(r#"<div class="check-cautions"><span>Cautions: </span><ul>"#);
        for &id in &c.cautions {
            let _ = write!(out, r##"<li><a href="#{}">"##, caution_dom_id(id));
            push_esc(&mut out, &cautions::caution(id).title);
            out.push_str("</a></li>");
        }
        out.push_str("</ul></div>");
    }
    out.push_str("</article>");
    out
}

/// The checks as rows.
#[component]
pub fn CheckList(
    /// The checks, in display order.
    #[prop(into)]
    checks: Signal<Vec<Check>>,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let html = Signal::derive(move || {
        let s = sys.get();
        checks.with(|v| v.iter().map(|c| check_html(c, s)).collect::<String>())
    });
    view! { <div class="check-list" inner_html=html></div> }
}
