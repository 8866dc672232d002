//! Margin bars: every check's utilisation (the core's margin ratio: figure
//! over limit for "at most", limit over figure for "at least") on one
//! scale, with the limit (100 %) marked. A failing bar is hatched and every
//! row carries its verdict in words.

use super::frame::WIDTH;
use super::{push_hatch, push_line, push_text, push_title_desc, PlotFrame};
use crate::html::push_el;
use crate::verdict::verdict_key;
use joulewise_core::figure::Verdict;
use joulewise_core::limits::Check;
use joulewise_core::units::format_sig;
use leptos::prelude::*;
use std::fmt::Write;

/// Height of one check's row (label line and bar).
const ROW: f64 = 54.0;
/// Space above the rows for the limit label.
const HEAD: f64 = 26.0;
/// Length of a bar at the right end of the scale.
const BAR: f64 = 440.0;
/// Longest label drawn in one line, in characters (the full label is in
/// the description and in the check list).
const LABEL_CHARS: usize = 68;
/// Right end of the scale: at least 150 % so the limit mark never sits at
/// the edge, at most 300 % so one bad check does not squash the others.
const SCALE_MIN: f64 = 1.5;
/// See [`SCALE_MIN`].
const SCALE_MAX: f64 = 3.0;

fn short(label: &str) -> String {
    if label.chars().count() <= LABEL_CHARS {
        label.to_string()
    } else {
        let cut: String = label.chars().take(LABEL_CHARS - 1).collect();
        format!("{}…", cut.trim_end())
    }
}

fn percent(u: Option<f64>) -> String {
    u.map_or("no ratio".to_string(), |u| {
        format!("{} %", format_sig(u * 100.0, 3))
    })
}

/// Height of the drawing for `n` checks.
pub fn height(n: usize) -> f64 {
    HEAD + ROW * n.max(1) as f64 + 6.0
}

/// The SVG content for the checks.
pub fn render_svg(checks: &[Check], id: &str) -> String {
    let mut out = String::with_capacity(4096);
    let mut desc = String::from("Utilisation of each limit, 100 % is at the limit. ");
    for c in checks {
        let _ = write!(
            desc,
            "{}: {}, {}. ",
            c.label,
            percent(c.margin_ratio),
            c.verdict.word()
        );
    }
    push_title_desc(&mut out, id, "Margins of the checks", desc.trim_end());
    push_hatch(&mut out, id);
    let end = checks
        .iter()
        .filter_map(|c| c.margin_ratio)
        .fold(SCALE_MIN, f64::max)
        .min(SCALE_MAX);
    let x = |u: f64| BAR * u.clamp(0.0, end) / end;
    let limit_x = x(1.0);
    push_text(
        &mut out,
        limit_x,
        HEAD - 10.0,
        "middle",
        "label",
        "limit (100 %)",
    );
    for (i, c) in checks.iter().enumerate() {
        let top = HEAD + ROW * i as f64;
        let len = c.margin_ratio.map_or(0.0, x);
        push_text(
            &mut out,
            0.0,
            top + 16.0,
            "start",
            "label",
            &short(&c.label),
        );
        let bar_y = top + 24.0;
        let _ = write!(
            out,
            r#"<rect x="0" y="{bar_y:.1}" width="{BAR}" height="18" class="mb-track"/><rect x="0" y="{bar_y:.1}" width="{len:.1}" height="18" class="mb-fill mb-{}"/>"#,
            verdict_key(c.verdict)
        );
        if c.verdict == Verdict::Fail {
            let _ = write!(
                out,
                r#"<rect x="0" y="{bar_y:.1}" width="{len:.1}" height="18" fill="url(#{id}-hatch)"/>"#
            );
        }
        if c.margin_ratio.is_some_and(|u| u > end) {
            let _ = write!(
                out,
                r#"<path d="M{:.1} {bar_y:.1}l8 9l-8 9" class="mb-arrow"/>"#,
                BAR - 10.0
            );
        }
        // The limit mark across this row's bar only, clear of the labels.
        push_line(
            &mut out,
            limit_x,
            bar_y - 4.0,
            limit_x,
            bar_y + 22.0,
            "mb-limit",
        );
        push_text(
            &mut out,
            BAR + 12.0,
            top + 38.0,
            "start",
            "label",
            &format!("{} · {}", percent(c.margin_ratio), c.verdict.word()),
        );
    }
    out
}

/// The overview; `id` must be unique in the page.
#[component]
pub fn MarginOverview(
    /// Unique element id.
    #[prop(into)]
    id: String,
    /// The checks.
    #[prop(into)]
    checks: Signal<Vec<Check>>,
) -> impl IntoView {
    let view_box =
        Signal::derive(move || checks.with(|v| format!("0 0 {WIDTH} {:.0}", height(v.len()))));
    let svg = {
        let id = id.clone();
        Signal::derive(move || checks.with(|v| render_svg(v, &id)))
    };
    let caption = Signal::derive(|| {
        let mut out = String::new();
        push_el(&mut out, "span", "plot-title", "Margins of the checks");
        out
    });
    view! { <PlotFrame id=id class="margins" view_box=view_box svg=svg caption=caption /> }
}
