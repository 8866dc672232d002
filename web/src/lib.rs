//! Joulewise in the browser: the assessment sheet. Components format what
//! `joulewise_core` returns and compute nothing physical themselves.
//!
//! State: one `RwSignal<Scenario>` ([`state::Sheet`]) with every field a
//! binding to one member of it (by the input's path, [`lens`]); the report
//! is a memo of the scenario settled 150 ms after the last change; the
//! tolerance study runs in slices ([`study`]). Views: the assessment
//! ([`inputs`] and [`results`]), buffer sizing ([`sizing_view`]) and the
//! tolerance study ([`study_view`]), how the figures are checked
//! ([`checked_view`]) and the library of kept assessments ([`library`]).
//!
//! Keeping the work: [`store`] (IndexedDB, localStorage fallback, the
//! versioned record format in [`store::record`]), [`keep`] (autosave,
//! library operations, quarantine, two tabs), [`transfer`] (export and
//! import files), [`share`] (links carrying the scenario in the fragment)
//! and [`report_print`] (the printed report's title block, inputs with SI
//! values and signature block).
//!
//! Building blocks, one per file: [`field`] (quantity input with unit
//! chooser and tolerance), [`controls`] (the sheet's bound controls),
//! [`figure_card`], [`check_row`], [`cautions_panel`], [`verdict`], [`plot`]
//! (SVG line plots, histogram, margin bars), the display unit system in
//! [`system`] and two-way bindings in [`bind`]. [`bench`](mod@bench) puts a small timing
//! hook on `window` for the benchmark.
#![forbid(unsafe_code)]

pub mod bench;
pub mod bind;
pub mod blank;
pub mod cautions_panel;
pub mod check_row;
pub mod checked_view;
pub mod controls;
pub mod field;
pub mod figure_card;
pub mod html;
pub mod inputs;
pub mod keep;
pub mod labels;
pub mod lens;
pub mod library;
pub mod plot;
pub mod report_print;
pub mod results;
pub mod share;
pub mod sizing_view;
pub mod state;
pub mod store;
pub mod study;
pub mod study_view;
pub mod system;
pub mod transfer;
pub mod verdict;

use bind::Binding;
use joulewise_core::scenario::{demos, Scenario};
use joulewise_core::units::UnitSystem;
use leptos::prelude::*;
use state::{Sheet, View};
use system::{DisplaySystem, SystemSwitch};

/// Key of the demo the page opens with.
pub const FIRST_DEMO: &str = "guard-door";

/// Key of the blank assessment in the picker.
pub const BLANK: &str = "blank";

/// The page.
#[component]
pub fn App() -> impl IntoView {
    let first = demos::by_key(FIRST_DEMO).unwrap_or_else(|| blank::scenario(UnitSystem::Si));
    let sheet = Sheet::provide(first);
    let units = Memo::new(move |_| sheet.scenario.with(|s| s.display_units));
    DisplaySystem::provide_bound(Binding::new(
        move || units.get(),
        move |u| sheet.scenario.update(|s| s.display_units = u),
    ));
    let keeper = keep::Keeper::provide(sheet);
    transfer::Transfer::provide();
    bench::install();
    // A printout carries every figure's method, source and assumptions:
    // open the disclosures before the browser lays out the pages.
    let _ = window_event_listener(leptos::ev::beforeprint, |_| open_all_details());
    let shown = move |v: View| move || sheet.view.get() != v;
    view! {
        <header class="top">
            <div class="brand">
                <span class="brand-name">"Joulewise"</span>
                <span class="brand-line">"Spring energy and end-of-travel impact"</span>
            </div>
            {demo_picker()}
            <SystemSwitch />
        </header>
        {library::banners()}
        {report_print::title_block()}
        {summary_bar()}
        {library::keep_bar()}
        {view_nav()}
        <main id="sheet" data-pending=move || sheet.pending.get().to_string()
            data-keep=move || if keeper.ready.get() { "ready" } else { "starting" }>
            <div id="view-assessment" hidden=shown(View::Assessment)>{assessment_view()}</div>
            <div id="view-sizing" hidden=shown(View::Sizing)>{sizing_view::sizing_view()}</div>
            <div id="view-study" hidden=shown(View::Study)>{study_view::study_view()}</div>
            <div id="view-checked" hidden=shown(View::Checked)>
                {checked_view::checked_view(Signal::derive(move || sheet.view.get() == View::Checked))}
            </div>
            <div id="view-library" hidden=shown(View::Library)>{library::library_view()}</div>
            {report_print::report_tail()}
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

/// The inputs beside the results.
fn assessment_view() -> AnyView {
    let sheet = Sheet::get();
    let problems = Memo::new(move |_| sheet.report.with(|r| results::problems_html(r)));
    view! {
        <div class="sheet">
            <form class="inputs" aria-label="Inputs" on:submit=|ev| ev.prevent_default()>
                <section class="problems" id="problems" aria-live="polite"
                    hidden=move || problems.with(String::is_empty) inner_html=problems></section>
                {inputs::identity()}
                {inputs::what_moves()}
                {inputs::spring()}
                {inputs::path()}
                {inputs::contact()}
                {inputs::limits()}
                {inputs::tolerances()}
            </form>
            <div class="results">{results::results()}</div>
        </div>
    }
    .into_any()
}

/// The verdict and a few key figures, kept in sight while scrolling.
fn summary_bar() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let verdict = Memo::new(move |_| sheet.report.with(|r| results::verdict_html(r)));
    let head = Memo::new(move |_| {
        let s = sys.get();
        sheet.report.with(|r| results::headline_html(r, s))
    });
    let title = Memo::new(move |_| sheet.scenario.with(|s| s.identity.title.clone()));
    view! {
        <section class="summary-bar" aria-label="Verdict">
            <h1 class="sheet-title">
                {move || {
                    let t = title.get();
                    if t.trim().is_empty() { "Untitled assessment".to_string() } else { t }
                }}
            </h1>
            <p id="overall" aria-live="polite" inner_html=verdict></p>
            <p class="headline" inner_html=head></p>
            <p class="jump" hidden=move || sheet.view.get() != View::Assessment>
                <a href="#figures-title">"Figures"</a>
                <a href="#checks-title">"Checks"</a>
                <a href="#plots-title">"Plots"</a>
                <a href="#cautions-title">"Cautions"</a>
            </p>
        </section>
    }
    .into_any()
}

/// The three views as a row of buttons (the pressed one is shown).
fn view_nav() -> AnyView {
    let sheet = Sheet::get();
    let button = move |v: View, id: &'static str, words: &'static str| {
        view! {
            <button
                type="button"
                id=id
                class="view-button"
                aria-pressed=move || (sheet.view.get() == v).to_string()
                on:click=move |_| sheet.view.set(v)
            >
                {words}
            </button>
        }
    };
    view! {
        <nav class="views" aria-label="Views">
            {button(View::Assessment, "show-assessment", "Assessment")}
            {button(View::Sizing, "show-sizing", "Buffer sizing")}
            {button(View::Study, "show-study", "Tolerance study")}
            {button(View::Checked, "show-checked", "How figures are checked")}
            {button(View::Library, "show-library", "Library")}
        </nav>
    }
    .into_any()
}

/// Start from a demo or a blank assessment (the display units stay as set);
/// the assessment left can be brought back once.
fn demo_picker() -> AnyView {
    let sheet = Sheet::get();
    let chosen = RwSignal::new(FIRST_DEMO.to_string());
    let keeper = keep::Keeper::get();
    let previous: RwSignal<Option<(Option<String>, Scenario)>> = RwSignal::new(None);
    let options = demos::all()
        .into_iter()
        .map(|d| {
            let key = d.key;
            view! {
                <option value=key prop:selected=move || chosen.get() == key title=d.summary>{d.title}</option>
            }
        })
        .collect_view();
    let load = move |_| {
        let key = chosen.get_untracked();
        let current = sheet.scenario.get_untracked();
        let units = current.display_units;
        let mut s = demos::by_key(&key).unwrap_or_else(|| blank::scenario(units));
        s.display_units = units;
        previous.set(Some((keeper.current.get_untracked(), current)));
        // A demo or a blank sheet is a new assessment: the one shown is
        // saved first and stays in the library.
        keeper.start_new(sheet, s);
    };
    let undo = move |_| {
        if let Some((id, mut s)) = previous.get_untracked() {
            s.display_units = sheet.scenario.with_untracked(|x| x.display_units);
            previous.set(None);
            match id.filter(|i| keeper.record(i).is_some()) {
                Some(id) => keeper.open(sheet, id),
                None => keeper.start_new(sheet, s),
            }
        }
    };
    view! {
        <div class="demo-picker">
            <label for="demo-pick">"Start from"</label>
            <select id="demo-pick" on:change=move |ev| chosen.set(event_target_value(&ev))>
                {options}
                <option value=BLANK prop:selected=move || chosen.get() == BLANK>"New blank assessment"</option>
            </select>
            <button type="button" id="demo-load" on:click=load>"Load"</button>
            <button type="button" id="demo-undo" hidden=move || previous.with(Option::is_none) on:click=undo>
                "Back to the assessment before"
            </button>
        </div>
    }
    .into_any()
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
