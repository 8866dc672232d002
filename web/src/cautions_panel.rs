//! The cautions panel: the cautions that apply to this mechanism, each with
//! what in the assessment brought it up and its sources, then the general
//! cautions that go with every assessment. The texts and the choice are the
//! core's ([`joulewise_core::cautions::cautions_for`]).

use crate::check_row::status_key;
use crate::html::{push_el, push_esc, push_list};
use crate::system::DisplaySystem;
use joulewise_core::cautions::{AppliedCaution, CautionId};
use joulewise_core::units::UnitSystem;
use leptos::prelude::*;
use std::fmt::Write;

/// Element id of a caution: `caution-` and its id in kebab case
/// (`CautionId::LockOutStoredEnergy` → `caution-lock-out-stored-energy`).
pub fn caution_dom_id(id: CautionId) -> String {
    let name = format!("{id:?}");
    let mut out = String::from("caution");
    for c in name.chars() {
        if c.is_ascii_uppercase() {
            out.push('-');
        }
        out.push(c.to_ascii_lowercase());
    }
    out
}

fn push_caution(out: &mut String, a: &AppliedCaution, sys: UnitSystem) {
    let c = &a.caution;
    let _ = write!(
        out,
        r#"<article class="caution" id="{}" data-general="{}">"#,
        caution_dom_id(c.id),
        c.general
    );
    push_el(out, "h4", "", &c.title);
    push_el(out, "p", "", &c.text);
    if !c.general && !a.because.is_empty() {
        out.push_str(r#"<div class="caution-why"><span>Why here: </span>"#);
        push_list(out, "", &a.because, sys);
        out.push_str("</div>");
    }
    if !c.sources.is_empty() {
        out.push_str(
            r#"<p class="caution-sources-title">Sources:</p><ul class="caution-sources">"#,
        );
        for p in &c.sources {
            out.push_str("<li><cite>");
            push_esc(out, &p.document);
            if !p.clause.is_empty() {
                out.push_str(", ");
                push_esc(out, &p.clause);
            }
            let _ = write!(
                out,
                r#"</cite> <span class="status" data-status="{}">{}</span></li>"#,
                status_key(p.status),
                p.status.describe()
            );
        }
        out.push_str("</ul>");
    }
    out.push_str("</article>");
}

/// The panel's body: the specific cautions (or a line saying there are
/// none yet), then the general ones.
pub fn cautions_html(list: &[AppliedCaution], sys: UnitSystem) -> String {
    let mut out = String::from(r#"<h3>For this mechanism</h3><div class="caution-list">"#);
    let mut any = false;
    for a in list.iter().filter(|a| !a.caution.general) {
        push_caution(&mut out, a, sys);
        any = true;
    }
    if !any {
        out.push_str(r#"<p class="quiet">No caution specific to this mechanism so far.</p>"#);
    }
    out.push_str(r#"</div><h3>With every assessment</h3><div class="caution-list">"#);
    for a in list.iter().filter(|a| a.caution.general) {
        push_caution(&mut out, a, sys);
    }
    out.push_str("</div>");
    out
}

/// The panel.
#[component]
pub fn CautionsPanel(
    /// The cautions picked for this assessment (general ones included).
    #[prop(into)]
    cautions: Signal<Vec<AppliedCaution>>,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let html = Signal::derive(move || {
        let s = sys.get();
        cautions.with(|v| cautions_html(v, s))
    });
    view! {
        <section class="cautions" id="cautions" aria-labelledby="cautions-title">
            <h2 id="cautions-title">"Cautions"</h2>
            <div inner_html=html></div>
        </section>
    }
}
