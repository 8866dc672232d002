//! Joulewise in the browser: the assessment sheet. Components format what
//! `joulewise_core` returns and compute nothing physical themselves.
//!
//! Building blocks, one per file: [`field`] (quantity input with unit
//! chooser and tolerance), [`figure_card`], [`check_row`], [`cautions_panel`],
//! [`verdict`], [`plot`] (SVG line plots, histogram, margin bars), with the
//! display unit system in [`system`] and two-way bindings in [`bind`].
//! [`trial`] is a provisional sheet wired to the core models directly.
#![forbid(unsafe_code)]

pub mod bind;
pub mod cautions_panel;
pub mod check_row;
pub mod field;
pub mod figure_card;
pub mod html;
pub mod plot;
pub mod system;
pub mod trial;
pub mod verdict;

use joulewise_core::units::UnitSystem;
use leptos::prelude::*;
use system::{DisplaySystem, SystemSwitch};

/// The page.
#[component]
pub fn App() -> impl IntoView {
    DisplaySystem::provide(UnitSystem::Si);
    // A printout carries every figure's method, source and assumptions:
    // open the disclosures before the browser lays out the pages.
    let _ = window_event_listener(leptos::ev::beforeprint, |_| open_all_details());
    view! {
        <header class="top">
            <div class="brand">
                <span class="brand-name">"Joulewise"</span>
                <span class="brand-line">"Spring energy and end-of-travel impact"</span>
            </div>
            <SystemSwitch />
        </header>
        <main id="sheet">
            <h1 class="sheet-title">"Assessment sheet"</h1>
            <trial::TrialSheet />
        </main>
        <footer class="foot">
            <p>
                "Figures are estimates from the inputs above: confirm them by measurement. "
                "A competent person signs off the assessment; local law and standards prevail. "
                "Joulewise " {joulewise_core::VERSION}
            </p>
        </footer>
    }
}

/// Open every `<details>` in the page (for print).
fn open_all_details() {
    let Ok(list) = document().query_selector_all("details") else {
        return;
    };
    for i in 0..list.length() {
        if let Some(el) = list
            .item(i)
            .and_then(|n| wasm_bindgen::JsCast::dyn_into::<web_sys::Element>(n).ok())
        {
            let _ = el.set_attribute("open", "");
        }
    }
}
