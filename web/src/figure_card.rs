//! A figure card: the value and unit in the display system, the label, and
//! on demand (a disclosure that works by keyboard and touch) the formula or
//! method, its source and the assumptions. A figure that could not be
//! computed keeps its place and says why, naming the fields at fault: never
//! NaN, never blank.
//!
//! The card's frame and its `<details>` are Leptos elements built once per
//! figure id, so an open disclosure stays open while the user types; the
//! texts inside are markup from [`figure_value_html`] and [`figure_how_html`].

use crate::html::{push_el, push_esc, push_list};
use crate::system::DisplaySystem;
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

/// The value line: `<span class="num">12.5</span> <span class="unit">mm</span>`
/// in `system`, or why it is missing.
pub fn figure_value_html(f: &Figure, system: UnitSystem) -> String {
    let mut out = String::new();
    match f.value {
        Some(v) => {
            let shown = joulewise_core::units::format_quantity(v, f.dim, system);
            push_el(&mut out, "span", "num", &shown.number);
            if !shown.unit.is_empty() {
                out.push(' ');
                push_el(&mut out, "span", "unit", shown.unit);
            }
        }
        None => push_el(&mut out, "span", "why", &missing_text(&f.missing)),
    }
    out
}

/// Method, source and assumptions as a definition list; "not stated" where
/// the core gave nothing.
pub fn figure_how_html(f: &Figure) -> String {
    let or_not = |s: &str| {
        if s.trim().is_empty() {
            "not stated".to_string()
        } else {
            s.to_string()
        }
    };
    let mut out = String::from("<dl><dt>Method</dt><dd>");
    push_esc(&mut out, &or_not(&f.method));
    out.push_str("</dd><dt>Source</dt><dd>");
    push_esc(&mut out, &or_not(&f.source));
    out.push_str("</dd><dt>Assumptions</dt><dd>");
    if f.assumptions.is_empty() {
        out.push_str("None stated beyond the method.");
    } else {
        push_list(&mut out, "", &f.assumptions);
    }
    out.push_str("</dd></dl>");
    out
}

/// One figure.
#[component]
pub fn FigureCard(
    /// The figure (value in SI, with provenance).
    #[prop(into)]
    figure: Signal<Figure>,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let dom_id = figure.with_untracked(|f| figure_dom_id(&f.id));
    let state = Signal::derive(move || {
        figure.with(|f| if f.value.is_some() { "ok" } else { "missing" }.to_string())
    });
    let label = Signal::derive(move || figure.with(|f| f.label.clone()));
    let value = Signal::derive(move || figure.with(|f| figure_value_html(f, sys.get())));
    let how = Signal::derive(move || figure.with(figure_how_html));
    view! {
        <article class="figure" id=dom_id data-state=state>
            <h4 class="figure-label">{label}</h4>
            <p class="figure-value" inner_html=value></p>
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
        view! { <FigureCard figure=f /> }
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
