//! A verdict shown by shape and word, never by colour alone: a ring with a
//! tick (within limit), a diamond with a cross (exceeds limit), a broken
//! ring with a question mark (cannot check), a square with a bar (not
//! applicable). The colour only repeats what the shape and word say.

use joulewise_core::figure::Verdict;
use leptos::prelude::*;

/// Class suffix of a verdict, for styles and tests: `pass`, `fail`,
/// `unknown`, `not-applicable`.
pub fn verdict_key(v: Verdict) -> &'static str {
    match v {
        Verdict::Pass => "pass",
        Verdict::Fail => "fail",
        Verdict::Unknown => "unknown",
        Verdict::NotApplicable => "not-applicable",
    }
}

/// The verdict a report is shown with: its worst verdict, or not
/// applicable when no check applies at all (nothing to be within).
pub fn shown_verdict(r: &joulewise_core::report::Report) -> Verdict {
    let c = r.counts;
    if c.pass + c.fail + c.unknown + c.not_applicable == 0 {
        Verdict::NotApplicable
    } else {
        r.verdict
    }
}

/// The icon as SVG markup (decorative: always shown beside the word).
pub fn verdict_icon_svg(v: Verdict) -> &'static str {
    match v {
        Verdict::Pass => concat!(
            r#"<svg class="verdict-icon" viewBox="0 0 24 24" aria-hidden="true" focusable="false">"#,
            r#"<circle cx="12" cy="12" r="9.5" class="vi-frame"/>"#,
            r#"<path d="M7 12.5l3.2 3.2L17 8.8" class="vi-mark"/></svg>"#
        ),
        Verdict::Fail => concat!(
            r#"<svg class="verdict-icon" viewBox="0 0 24 24" aria-hidden="true" focusable="false">"#,
            r#"<path d="M12 1.8L22.2 12L12 22.2L1.8 12Z" class="vi-frame vi-solid"/>"#,
            r#"<path d="M8.6 8.6l6.8 6.8M15.4 8.6l-6.8 6.8" class="vi-mark vi-on-solid"/></svg>"#
        ),
        Verdict::Unknown => concat!(
            r#"<svg class="verdict-icon" viewBox="0 0 24 24" aria-hidden="true" focusable="false">"#,
            r#"<circle cx="12" cy="12" r="9.5" class="vi-frame vi-dashed"/>"#,
            r#"<path d="M9.3 9.3a2.8 2.8 0 1 1 3.9 2.6c-.8.4-1.2 1-1.2 1.9v.6" class="vi-mark"/>"#,
            r#"<circle cx="12" cy="17.4" r="1.2" class="vi-dot"/></svg>"#
        ),
        Verdict::NotApplicable => concat!(
            r#"<svg class="verdict-icon" viewBox="0 0 24 24" aria-hidden="true" focusable="false">"#,
            r#"<rect x="3" y="3" width="18" height="18" rx="2" class="vi-frame"/>"#,
            r#"<path d="M7.5 12h9" class="vi-mark"/></svg>"#
        ),
    }
}

/// Icon and word as markup: `<span class="verdict" data-verdict="pass">…</span>`.
pub fn verdict_badge_html(v: Verdict) -> String {
    format!(
        r#"<span class="verdict" data-verdict="{}">{}<span class="verdict-word">{}</span></span>"#,
        verdict_key(v),
        verdict_icon_svg(v),
        v.word()
    )
}

/// Icon and word, following a verdict signal.
#[component]
pub fn VerdictBadge(
    /// The verdict.
    #[prop(into)]
    verdict: Signal<Verdict>,
) -> impl IntoView {
    let html = Signal::derive(move || verdict_badge_html(verdict.get()));
    view! { <span class="verdict-holder" inner_html=html></span> }
}
