//! The library view (every kept assessment: open, duplicate, rename,
//! export, delete with undo, search), the bar under the view buttons (what
//! is saved, export, share link, print) and the banners (storage faults,
//! records set aside, a conflict between tabs, an import waiting for a
//! choice, the latest notice with Undo).
//!
//! Lists and banners are written as markup text ([`crate::html`]: every
//! user text escaped) and their buttons carry `data-act` (and `data-id`);
//! one click handler per container reads them.

use crate::html::{esc, push_esc};
use crate::keep::{Entry, Keeper, Notice, Settle};
use crate::state::{Sheet, View};
use crate::transfer::{self, Choice, Transfer};
use crate::verdict::verdict_badge_html;
use joulewise_core::figure::Verdict;
use leptos::prelude::*;
use leptos::task::spawn_local;
use std::fmt::Write;
use wasm_bindgen::JsCast;

/// The verdict of a stored key.
pub fn verdict_of_key(k: &str) -> Option<Verdict> {
    Some(match k {
        "pass" => Verdict::Pass,
        "fail" => Verdict::Fail,
        "unknown" => Verdict::Unknown,
        "not-applicable" => Verdict::NotApplicable,
        _ => return None,
    })
}

/// A time as `YYYY-MM-DD HH:MM` in the browser's time zone.
pub fn fmt_time(ms: f64) -> String {
    if ms <= 0.0 || !ms.is_finite() {
        return "unknown time".into();
    }
    let d = js_sys::Date::new(&wasm_bindgen::JsValue::from_f64(ms));
    format!(
        "{:04}-{:02}-{:02} {:02}:{:02}",
        d.get_full_year(),
        d.get_month() + 1,
        d.get_date(),
        d.get_hours(),
        d.get_minutes()
    )
}

fn title_or_untitled(t: &str) -> String {
    if t.trim().is_empty() {
        "Untitled assessment".into()
    } else {
        t.to_string()
    }
}

/// Whether `e` matches every word of `query` (case-insensitive).
pub fn matches(e: &Entry, query: &str) -> bool {
    query
        .split_whitespace()
        .all(|w| e.hay.contains(&w.to_lowercase()))
}

/// The library list as markup.
pub fn list_html(
    entries: &[Entry],
    query: &str,
    current: Option<&str>,
    renaming: Option<&str>,
) -> String {
    let shown: Vec<&Entry> = entries.iter().filter(|e| matches(e, query)).collect();
    let mut out = String::new();
    if entries.is_empty() {
        out.push_str("<li class=\"lib-empty\">Nothing kept yet. Every assessment you change is kept here by itself.</li>");
        return out;
    }
    if shown.is_empty() {
        out.push_str("<li class=\"lib-empty\">No assessment matches the search.</li>");
        return out;
    }
    for e in shown {
        let title = title_or_untitled(&e.title);
        let id = esc(&e.id);
        let open = current == Some(e.id.as_str());
        let _ = write!(
            out,
            "<li class=\"lib-item\" data-id=\"{id}\"{}>",
            if open { " aria-current=\"true\"" } else { "" }
        );
        if renaming == Some(e.id.as_str()) {
            let _ = write!(
                out,
                "<div class=\"lib-rename\"><label for=\"rename-input\">New title</label><input id=\"rename-input\" type=\"text\" value=\"{}\"><button type=\"button\" data-act=\"rename-save\" data-id=\"{id}\">Save title</button><button type=\"button\" data-act=\"rename-cancel\">Cancel</button></div>",
                esc(&e.title)
            );
        } else {
            out.push_str("<h3 class=\"lib-title\">");
            push_esc(&mut out, &title);
            if open {
                out.push_str(" <span class=\"lib-open\">(open on the sheet)</span>");
            }
            out.push_str("</h3>");
        }
        out.push_str("<p class=\"lib-meta\">");
        if !e.tag.trim().is_empty() {
            out.push_str("<span class=\"lib-tag\">");
            push_esc(&mut out, &e.tag);
            out.push_str("</span> · ");
        }
        if !e.dated.trim().is_empty() {
            out.push_str("dated ");
            push_esc(&mut out, &e.dated);
            out.push_str(" · ");
        }
        let _ = write!(
            out,
            "saved {} · revision {}",
            fmt_time(e.saved_ms),
            e.revision
        );
        out.push_str("</p><div class=\"lib-verdict\">");
        match verdict_of_key(&e.verdict) {
            Some(v) => out.push_str(&verdict_badge_html(v)),
            None => out.push_str("<span class=\"quiet\">verdict not known yet</span>"),
        }
        out.push_str("</div><div class=\"lib-actions\">");
        let t = esc(&title);
        for (act, word) in [
            ("open", "Open"),
            ("duplicate", "Duplicate"),
            ("rename", "Rename"),
            ("export", "Export"),
            ("delete", "Delete"),
        ] {
            let _ = write!(out, "<button type=\"button\" data-act=\"{act}\" data-id=\"{id}\" aria-label=\"{word}: {t}\">{word}</button>");
        }
        out.push_str("</div></li>");
    }
    out
}

fn aside_html(k: Keeper) -> String {
    let mut out = String::new();
    k.aside.with(|v| {
        for a in v {
            out.push_str("<li class=\"aside-item\"><p>");
            let _ = write!(out, "<code>{}</code>: ", esc(&a.key));
            push_esc(&mut out, &a.reason);
            let _ = write!(out, " ({} characters kept as they are)</p><div class=\"lib-actions\">", a.raw.chars().count());
            let id = esc(&a.key);
            let _ = write!(out, "<button type=\"button\" data-act=\"aside-export\" data-id=\"{id}\">Save the raw text</button>");
            let _ = write!(out, "<button type=\"button\" data-act=\"delete\" data-id=\"{id}\">Remove it</button></div></li>");
        }
    });
    out
}

/// `data-act` and `data-id` of the button an event came from.
fn action(ev: &leptos::ev::MouseEvent) -> Option<(String, String)> {
    let target: web_sys::Element = ev.target()?.dyn_into().ok()?;
    let button = target.closest("[data-act]").ok()??;
    Some((
        button.get_attribute("data-act")?,
        button.get_attribute("data-id").unwrap_or_default(),
    ))
}

fn act(sheet: Sheet, k: Keeper, renaming: RwSignal<Option<String>>, what: &str, id: String) {
    match what {
        "open" => k.open(sheet, id),
        "duplicate" => k.duplicate(id),
        "rename" => renaming.set(Some(id)),
        "rename-cancel" => renaming.set(None),
        "rename-save" => {
            let title = document()
                .get_element_by_id("rename-input")
                .and_then(|e| e.dyn_into::<web_sys::HtmlInputElement>().ok())
                .map(|i| i.value());
            renaming.set(None);
            if let Some(t) = title {
                k.rename(sheet, id, t);
            }
        }
        "export" => {
            let s = if k.current.get_untracked().as_deref() == Some(id.as_str()) {
                Some(sheet.scenario.get_untracked())
            } else {
                k.record(&id).map(|r| r.scenario)
            };
            if let Some(s) = s {
                transfer::export_one(&s);
            }
        }
        "export-all" => export_all(sheet, k),
        "delete" => k.remove(id),
        "undo" => k.undo(),
        "dismiss" => k.notice.set(None),
        "aside-export" => {
            if let Some(a) = k
                .aside
                .with_untracked(|v| v.iter().find(|a| a.key == id).cloned())
            {
                transfer::download(
                    &format!("unreadable-{}.txt", transfer::file_name(&a.key)),
                    &a.raw,
                    "text/plain",
                );
            }
        }
        "show-library" => sheet.view.set(View::Library),
        "keep" => k.keep_now(),
        "conflict-both" => k.settle(sheet, Settle::KeepBoth),
        "conflict-mine" => k.settle(sheet, Settle::Overwrite),
        "conflict-theirs" => k.settle(sheet, Settle::TakeTheirs),
        "import-both" => transfer::choose(sheet, Choice::KeepBoth),
        "import-replace" => transfer::choose(sheet, Choice::Replace),
        "import-cancel" => transfer::choose(sheet, Choice::Cancel),
        _ => {}
    }
}

/// Every kept assessment in one file (the open one as it is now).
pub fn export_all(sheet: Sheet, k: Keeper) {
    let current = k.current.get_untracked();
    let mut list: Vec<_> = k
        .all_records()
        .into_iter()
        .map(|r| {
            if current.as_deref() == Some(r.id.as_str()) {
                sheet.scenario.get_untracked()
            } else {
                r.scenario
            }
        })
        .collect();
    if current.is_none() && k.dirty.get_untracked() {
        list.insert(0, sheet.scenario.get_untracked());
    }
    if list.is_empty() {
        list.push(sheet.scenario.get_untracked());
    }
    transfer::download(
        "joulewise-assessments.json",
        &transfer::bundle_text(&list),
        "application/json",
    );
}

/// The banners above the sheet.
pub fn banners() -> AnyView {
    let sheet = Sheet::get();
    let k = Keeper::get();
    let t = Transfer::get();
    let renaming = RwSignal::new(None::<String>);
    let html = Memo::new(move |_| {
        let mut out = String::new();
        if let Some(f) = k.fault.get() {
            out.push_str(
                "<div class=\"banner banner-fault\" id=\"storage-banner\" role=\"alert\"><p>",
            );
            push_esc(&mut out, &f);
            out.push_str("</p><div class=\"buttons\"><button type=\"button\" data-act=\"export-all\">Export everything now</button></div></div>");
        }
        let n = k.aside.with(Vec::len);
        if n > 0 {
            let _ = write!(
                out,
                "<div class=\"banner banner-fault\" id=\"aside-banner\" role=\"alert\"><p>{n} stored record{} could not be read and {} set aside, untouched. Everything else loaded. You can save {} raw text from the library.</p><div class=\"buttons\"><button type=\"button\" data-act=\"show-library\">Show in the library</button></div></div>",
                if n == 1 { "" } else { "s" },
                if n == 1 { "was" } else { "were" },
                if n == 1 { "its" } else { "their" }
            );
        }
        if let Some(c) = k.conflict.get() {
            let _ = write!(
                out,
                "<div class=\"banner banner-ask\" id=\"conflict\" role=\"alertdialog\" aria-labelledby=\"conflict-text\"><p id=\"conflict-text\">This assessment was saved in another tab or window (revision {}, {}) while you were changing it here. Nothing has been written over; choose what to keep.</p><div class=\"buttons\"><button type=\"button\" data-act=\"conflict-both\">Keep both (mine as a copy)</button><button type=\"button\" data-act=\"conflict-mine\">Use mine, replace the other</button><button type=\"button\" data-act=\"conflict-theirs\">Use the other, drop mine</button></div></div>",
                c.theirs.revision,
                fmt_time(c.theirs.saved_ms)
            );
        }
        t.pending.with(|p| {
            if let Some(p) = p.first() {
                let old = k.record(&p.existing);
                out.push_str("<div class=\"banner banner-ask\" id=\"import-ask\" role=\"alertdialog\" aria-labelledby=\"import-ask-text\"><p id=\"import-ask-text\">“");
                push_esc(&mut out, &title_or_untitled(&p.scenario.identity.title));
                out.push_str("” from ");
                push_esc(&mut out, &p.file);
                out.push_str(" has the same title and machine tag as an assessment in your library");
                if let Some(o) = old {
                    let _ = write!(out, " (saved {}, revision {})", fmt_time(o.saved_ms), o.revision);
                }
                out.push_str(".</p><div class=\"buttons\"><button type=\"button\" data-act=\"import-both\">Keep both</button><button type=\"button\" data-act=\"import-replace\">Replace the one in the library</button><button type=\"button\" data-act=\"import-cancel\">Cancel this import</button></div></div>");
            }
        });
        match k.notice.get() {
            Some(Notice::Removed { what, .. }) => {
                out.push_str(
                    "<div class=\"banner banner-note\" id=\"notice\" role=\"status\"><p>Removed ",
                );
                push_esc(&mut out, &what);
                out.push_str(".</p><div class=\"buttons\"><button type=\"button\" data-act=\"undo\">Undo</button><button type=\"button\" data-act=\"dismiss\">Dismiss</button></div></div>");
            }
            Some(Notice::Text(text)) => {
                out.push_str("<div class=\"banner banner-note\" id=\"notice\" role=\"status\"><p>");
                push_esc(&mut out, &text);
                out.push_str("</p><div class=\"buttons\"><button type=\"button\" data-act=\"dismiss\">Dismiss</button></div></div>");
            }
            None => {}
        }
        out
    });
    view! {
        <div id="banners" class="banners no-print" inner_html=html
            on:click=move |ev| {
                if let Some((a, id)) = action(&ev) {
                    act(sheet, k, renaming, &a, id)
                }
            }></div>
    }
    .into_any()
}

/// What is saved, and export, share and print for the open assessment.
pub fn keep_bar() -> AnyView {
    let sheet = Sheet::get();
    let k = Keeper::get();
    let link = RwSignal::new(String::new());
    let state = move || {
        if !k.ready.get() {
            return "Opening your assessments…".to_string();
        }
        let memory = k.kind.get() == Some(crate::store::Kind::Memory);
        match (k.current.get(), k.dirty.get(), k.saved.get()) {
            (None, false, _) => {
                "Not in your library yet: it is kept as soon as you change something.".into()
            }
            (_, true, _) if memory => {
                "Kept in this tab only (the browser keeps nothing here).".into()
            }
            (_, true, _) => "Changes are being saved…".into(),
            (Some(_), false, Some((rev, t))) if memory => {
                format!("Kept in this tab only, revision {rev}, {}.", fmt_time(t))
            }
            (Some(_), false, Some((rev, t))) => {
                format!("Saved in this browser, revision {rev}, {}.", fmt_time(t))
            }
            (Some(_), false, None) => "Saved in this browser.".into(),
        }
    };
    let make_link = move |_| {
        let s = sheet.scenario.get_untracked();
        spawn_local(async move {
            match crate::share::link(&s, &crate::share::base()).await {
                Ok(l) => link.set(l),
                Err(e) => link.set(format!("No link: {e}")),
            }
        });
    };
    view! {
        <div class="keep-bar no-print">
            <p id="save-state" aria-live="polite" data-dirty=move || k.dirty.get().to_string()
                data-ready=move || k.ready.get().to_string()>{state}</p>
            <div class="buttons">
                <button type="button" id="keep-link" hidden=move || k.current.get().is_some() || !k.ready.get()
                    on:click=move |_| k.keep_now()>"Keep in my library"</button>
                <button type="button" id="export-this" on:click=move |_| transfer::export_one(&sheet.scenario.get_untracked())>"Export file"</button>
                <button type="button" id="share-make" on:click=make_link>"Share link"</button>
                <button type="button" id="print-report" on:click=move |_| {
                    if let Some(w) = web_sys::window() {
                        let _ = w.print();
                    }
                }>"Print report"</button>
            </div>
            <div class="share-box" hidden=move || link.with(String::is_empty)>
                <label for="share-url">"Link to this assessment as it is now (the whole assessment is inside the link; nothing is uploaded)"</label>
                <input id="share-url" type="text" readonly prop:value=move || link.get()
                    on:focus=move |ev| {
                        if let Some(i) = ev.target().and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok()) {
                            i.select();
                        }
                    } />
            </div>
        </div>
    }
    .into_any()
}

/// The library view.
pub fn library_view() -> AnyView {
    let sheet = Sheet::get();
    let k = Keeper::get();
    let t = Transfer::get();
    let query = RwSignal::new(String::new());
    let renaming = RwSignal::new(None::<String>);
    let list = Memo::new(move |_| {
        let q = query.get();
        let cur = k.current.get();
        let ren = renaming.get();
        k.entries
            .with(|e| list_html(e, &q, cur.as_deref(), ren.as_deref()))
    });
    let aside = Memo::new(move |_| aside_html(k));
    let click = move |ev: leptos::ev::MouseEvent| {
        if let Some((a, id)) = action(&ev) {
            act(sheet, k, renaming, &a, id)
        }
    };
    let key = move |ev: leptos::ev::KeyboardEvent| {
        let on_rename = ev
            .target()
            .and_then(|t| t.dyn_into::<web_sys::Element>().ok())
            .is_some_and(|e| e.id() == "rename-input");
        if !on_rename {
            return;
        }
        match ev.key().as_str() {
            "Enter" => {
                ev.prevent_default();
                if let Some(id) = renaming.get_untracked() {
                    act(sheet, k, renaming, "rename-save", id);
                }
            }
            "Escape" => renaming.set(None),
            _ => {}
        }
    };
    view! {
        <section class="library" aria-labelledby="library-title">
            <h2 id="library-title">"Your assessments"</h2>
            <p class="hint">"Kept in this browser on this device only. Export to keep a copy elsewhere or to pass it on."</p>
            <div class="lib-tools">
                <div class="lib-search">
                    <label for="lib-search">"Search titles, tags, places, people, notes"</label>
                    <input id="lib-search" type="search" prop:value=move || query.get()
                        on:input=move |ev| query.set(event_target_value(&ev)) />
                </div>
                <div class="lib-import">
                    <label for="import-file">"Import assessment files (.json)"</label>
                    <input id="import-file" type="file" accept=".json,application/json" multiple
                        on:change=move |ev| {
                            if let Some(i) = ev.target().and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok()) {
                                transfer::import_from(i);
                            }
                        } />
                </div>
                <div class="buttons">
                    <button type="button" id="export-all" on:click=move |_| export_all(sheet, k)>"Export all"</button>
                </div>
            </div>
            <div id="import-report" class="import-report" role="status" data-count=move || t.count.get().to_string()
                inner_html=move || t.report.get()></div>
            <ul id="lib-list" class="lib-list" inner_html=list on:click=click on:keydown=key></ul>
            <section class="aside" hidden=move || k.aside.with(Vec::is_empty) aria-labelledby="aside-title">
                <h2 id="aside-title">"Set aside: stored records that could not be read"</h2>
                <p class="hint">"They are left exactly as found. Save the raw text to repair it by hand or to send it to whoever looks after your tablets."</p>
                <ul id="aside-list" class="lib-list" inner_html=aside on:click=click></ul>
            </section>
        </section>
    }
    .into_any()
}
