//! A figure card: the value and unit in the display system, the label, and
//! on demand (a disclosure that works by keyboard and touch) the formula or
//! method, its source and the assumptions. A figure that could not be
//! computed keeps its place and says why, naming the fields at fault: never
//! NaN, never blank.
//!
//! The card's frame and its `<details>` are Leptos elements built once per
//! figure id, so an open disclosure stays open while the user types; the
//! texts inside are markup from [`figure_value_html`] and [`figure_how_html`].

use crate::cautions_panel::caution_dom_id;
use crate::html::{push_el, push_esc, push_list, push_text};
use crate::labels::{field_dom_id, label_of};
use crate::system::DisplaySystem;
use joulewise_core::cautions::AppliedCaution;
use joulewise_core::figure::Figure;
use joulewise_core::units::{Dim, UnitSystem};
use leptos::prelude::*;

/// Element id of the card for figure `id`: `fig-` and the id with dots as
/// hyphens (`release.contact_speed` → `fig-release-contact_speed`).
pub fn figure_dom_id(id: &str) -> String {
    format!("fig-{}", id.replace('.', "-"))
}

/// The reasons a figure is missing, as one sentence; never empty.
pub fn missing_text(reasons: &[String]) -> String {
    if reasons.is_empty() {
        "Not computed (no reason was recorded).".into()
    } else {
        format!("Not computed: {}.", reasons.join("; "))
    }
}

/// The input path a reason starts with (`part.mass: a value is required`),
/// if it names one.
pub fn reason_path(reason: &str) -> Option<(&str, &str)> {
    let (path, rest) = reason.split_once(": ")?;
    let is_path = path.contains('.') || path.chars().all(|c| c.is_ascii_lowercase() || c == '_');
    let plain = path
        .chars()
        .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_' || c == '.');
    (is_path && plain && !path.is_empty()).then_some((path, rest))
}

/// Append the reasons a figure is missing, each naming its input by label
/// with a link to the field; never empty.
pub fn push_missing_html(out: &mut String, reasons: &[String], sys: UnitSystem) {
    out.push_str(r#"<span class="why">Not computed"#);
    if reasons.is_empty() {
        out.push_str(" (no reason was recorded).</span>");
        return;
    }
    out.push_str(": ");
    for (i, r) in reasons.iter().enumerate() {
        if i > 0 {
            out.push_str("; ");
        }
        match reason_path(r) {
            Some((path, rest)) => {
                let base = path.strip_suffix(".tol").unwrap_or(path);
                out.push_str(r##"<a href="#"##);
                push_esc(out, &field_dom_id(base));
                out.push_str(r#"">"#);
                push_esc(out, &label_of(path));
                out.push_str("</a>: ");
                push_text(out, rest, sys);
            }
            None => push_text(out, r, sys),
        }
    }
    out.push_str(".</span>");
}

/// The value line: `<span class="num">12.5</span> <span class="unit">mm</span>`
/// in `system`, or why it is missing.
pub fn figure_value_html(f: &Figure, system: UnitSystem) -> String {
    let mut out = String::new();
    match f.value {
        Some(v) => {
            let shown = joulewise_core::units::format_quantity(v, f.dim, system);
            push_el(&mut out, "span", "num", &shown.number);
            if !shown.unit.is_empty() {
                // As the core writes it: no space before the degree sign.
                if shown.unit != "°" {
                    out.push(' ');
                }
                push_el(&mut out, "span", "unit", shown.unit);
            }
        }
        None => push_missing_html(&mut out, &f.missing, system),
    }
    out
}

/// Method, source and assumptions as a definition list; "not stated" where
/// the core gave nothing.
pub fn figure_how_html(f: &Figure, sys: UnitSystem) -> String {
    let or_not = |s: &str| {
        if s.trim().is_empty() {
            "not stated".to_string()
        } else {
            s.to_string()
        }
    };
    let mut out = String::from("<dl><dt>Method</dt><dd>");
    push_text(&mut out, &or_not(&f.method), sys);
    out.push_str("</dd><dt>Source</dt><dd>");
    push_text(&mut out, &or_not(&f.source), sys);
    out.push_str("</dd><dt>Assumptions</dt><dd>");
    if f.assumptions.is_empty() {
        out.push_str("None stated beyond the method.");
    } else {
        push_list(&mut out, "", &f.assumptions, sys);
    }
    out.push_str("</dd></dl>");
    out
}

/// Links to the cautions this figure brought up (the core names the figure
/// by its label in what brought each caution up), or nothing.
pub fn caution_links_html(label: &str, cautions: &[AppliedCaution]) -> String {
    let mut out = String::new();
    for a in cautions.iter().filter(|a| !a.caution.general) {
        let mentions = a.because.iter().any(|b| {
            b.strip_prefix(label)
                .is_some_and(|rest| rest.starts_with(" is ") || rest.starts_with(" could not"))
        });
        if mentions {
            if out.is_empty() {
                out.push_str(r#"<span>Caution: </span><ul>"#);
            }
            out.push_str(r##"<li><a href="#"##);
            out.push_str(&caution_dom_id(a.caution.id));
            out.push_str(r#"">"#);
            push_esc(&mut out, &a.caution.title);
            out.push_str("</a></li>");
        }
    }
    if !out.is_empty() {
        out.push_str("</ul>");
    }
    out
}

/// One figure, with the cautions it brought up beside it.
#[component]
pub fn FigureCard(
    /// The figure (value in SI, with provenance).
    #[prop(into)]
    figure: Signal<Figure>,
    /// The assessment's cautions (the card shows those this figure brought up).
    #[prop(optional, into)]
    cautions: Signal<Vec<AppliedCaution>>,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let dom_id = figure.with_untracked(|f| figure_dom_id(&f.id));
    let state = Signal::derive(move || {
        figure.with(|f| if f.value.is_some() { "ok" } else { "missing" }.to_string())
    });
    let label = Signal::derive(move || figure.with(|f| f.label.clone()));
    let value = Signal::derive(move || figure.with(|f| figure_value_html(f, sys.get())));
    let how = Signal::derive(move || {
        let s = sys.get();
        figure.with(|f| figure_how_html(f, s))
    });
    let warn =
        Memo::new(move |_| figure.with(|f| cautions.with(|c| caution_links_html(&f.label, c))));
    view! {
        <article class="figure" id=dom_id data-state=state>
            <h4 class="figure-label">{label}</h4>
            <p class="figure-value" inner_html=value></p>
            <div class="figure-cautions" hidden=move || warn.with(String::is_empty) inner_html=warn></div>
            <details class="figure-how">
                <summary>"How it is found"</summary>
                <div inner_html=how></div>
            </details>
        </article>
    }
}

/// A group of figure cards under a heading, keyed by figure id so cards
/// (and their open disclosures) survive recomputation.
#[component]
pub fn FigureGroup(
    /// Heading of the group.
    #[prop(into)]
    title: String,
    /// The figures, in display order.
    #[prop(into)]
    figures: Signal<Vec<Figure>>,
    /// The assessment's cautions, shown beside the figures that bring them up.
    #[prop(optional, into)]
    cautions: Signal<Vec<AppliedCaution>>,
) -> impl IntoView {
    let ids = move || figures.with(|v| v.iter().map(|f| f.id.clone()).collect::<Vec<_>>());
    let card = move |id: String| {
        let f = Signal::derive(move || {
            figures.with(|v| {
                v.iter().find(|f| f.id == id).cloned().unwrap_or_else(|| {
                    // Only seen for the instant the keyed list removes the card.
                    Figure::missing(&id, &id, Dim::Ratio, vec!["no longer computed".into()])
                })
            })
        });
        view! { <FigureCard figure=f cautions=cautions /> }
    };
    view! {
        <section class="figure-group" aria-label=title.clone()>
            <h3>{title.clone()}</h3>
            <div class="figure-grid">
                <For each=ids key=|id| id.clone() children=card />
            </div>
        </section>
    }
}
