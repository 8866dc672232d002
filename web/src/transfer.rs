//! Export and import of assessments as files.
//!
//! Export one: the core's scenario file (`Scenario::to_json`: the versioned
//! format, `schema_version` first, SI values filled in beside the texts).
//! Export all: `{"joulewise_export": 1, "schema_version": N,
//! "assessments": [scenario, …]}`. Files are offered as downloads made in
//! the page (a `blob:` URL); nothing is sent anywhere.
//!
//! Import reads each chosen file with the core's file reader
//! (`Scenario::from_bytes`: size, encoding, JSON, migration of older
//! versions, every field's shape, the refusal naming the field path), then
//! assesses it and lists the inputs the core refuses, each with its path
//! (such an assessment is still imported, texts as typed, to be fixed on
//! the sheet). A file over the size limit is refused from its size alone,
//! before a byte is read. An import never overwrites: an assessment with
//! the same title and machine tag as one in the library waits for the
//! user's choice (keep both, replace, cancel).

use crate::html::{esc, push_esc};
use crate::keep::{new_id, Keeper};
use crate::state::Sheet;
use crate::store::record::Record;
use joulewise_core::scenario::{Scenario, MAX_FILE_BYTES, SCHEMA_VERSION};
use leptos::prelude::*;
use leptos::task::spawn_local;
use std::fmt::Write;
use wasm_bindgen::JsCast;
use wasm_bindgen_futures::JsFuture;

/// Marker and version of a file holding several assessments.
pub const BUNDLE_KEY: &str = "joulewise_export";

/// An imported assessment that matches one in the library.
#[derive(Debug, Clone, PartialEq)]
pub struct Pending {
    /// The file it came from.
    pub file: String,
    /// The assessment read.
    pub scenario: Scenario,
    /// The library's assessment with the same title and tag.
    pub existing: String,
}

/// How a pending import is settled.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Choice {
    /// Add it beside the existing one.
    KeepBoth,
    /// Write it over the existing one.
    Replace,
    /// Leave the library as it is.
    Cancel,
}

/// Import state, provided as context.
#[derive(Clone, Copy)]
pub struct Transfer {
    /// Imports waiting for a choice, first shown first.
    pub pending: RwSignal<Vec<Pending>>,
    /// Markup of the last import's results (texts escaped).
    pub report: RwSignal<String>,
    /// How many imports have finished (tests wait on it).
    pub count: RwSignal<u32>,
}

impl Transfer {
    /// Create and provide.
    pub fn provide() -> Self {
        let t = Self {
            pending: RwSignal::new(Vec::new()),
            report: RwSignal::new(String::new()),
            count: RwSignal::new(0),
        };
        provide_context(t);
        t
    }

    /// The state provided above.
    pub fn get() -> Self {
        #[allow(clippy::expect_used)] // provided by App before any view
        use_context::<Self>().expect("Transfer::provide runs in App")
    }
}

/// A file name from a title: letters, digits and dashes.
pub fn file_name(title: &str) -> String {
    let mut out = String::new();
    for c in title.trim().chars() {
        if c.is_alphanumeric() {
            out.extend(c.to_lowercase());
        } else if !out.ends_with('-') && !out.is_empty() {
            out.push('-');
        }
        if out.len() > 60 {
            break;
        }
    }
    let out = out.trim_end_matches('-');
    if out.is_empty() {
        "assessment".into()
    } else {
        out.to_string()
    }
}

/// Offer `text` as a download named `name`.
pub fn download(name: &str, text: &str, mime: &str) {
    let parts = js_sys::Array::of1(&wasm_bindgen::JsValue::from_str(text));
    let bag = web_sys::BlobPropertyBag::new();
    bag.set_type(mime);
    let Ok(blob) = web_sys::Blob::new_with_str_sequence_and_options(&parts, &bag) else {
        return;
    };
    let Ok(url) = web_sys::Url::create_object_url_with_blob(&blob) else {
        return;
    };
    if let Ok(a) = document().create_element("a") {
        let _ = a.set_attribute("href", &url);
        let _ = a.set_attribute("download", name);
        if let Ok(a) = a.dyn_into::<web_sys::HtmlElement>() {
            a.click();
        }
    }
    // Revoked later: the download starts from the click above.
    let _ = set_timeout_with_handle(
        move || {
            let _ = web_sys::Url::revoke_object_url(&url);
        },
        std::time::Duration::from_secs(60),
    );
}

/// The file of one assessment.
pub fn export_one(s: &Scenario) {
    download(
        &format!("{}.joulewise.json", file_name(&s.identity.title)),
        &s.to_json(),
        "application/json",
    );
}

/// The text of a file holding several assessments.
pub fn bundle_text(list: &[Scenario]) -> String {
    let mut out = format!(
        "{{\n\"{BUNDLE_KEY}\": 1,\n\"schema_version\": {SCHEMA_VERSION},\n\"assessments\": [\n"
    );
    for (i, s) in list.iter().enumerate() {
        if i > 0 {
            out.push_str(",\n");
        }
        out.push_str(&s.to_json());
    }
    out.push_str("\n]\n}\n");
    out
}

/// Read a file's bytes: one scenario, or each of a bundle's.
///
/// # Errors
/// The core's refusal (`path: message`), for a bundle the first item's
/// refusal prefixed with `assessments.N`.
pub fn read_file(bytes: &[u8]) -> Result<Vec<Scenario>, Vec<(String, String)>> {
    match Scenario::from_bytes(bytes) {
        Ok(s) => Ok(vec![s]),
        Err(first) => {
            let bundle = std::str::from_utf8(bytes)
                .ok()
                .filter(|t| t.len() <= MAX_FILE_BYTES)
                .and_then(|t| serde_json::from_str::<serde_json::Value>(t).ok())
                .filter(|v| v.get(BUNDLE_KEY).is_some());
            let Some(v) = bundle else {
                return Err(vec![(first.path, first.message)]);
            };
            if v.get(BUNDLE_KEY).and_then(|x| x.as_u64()) != Some(1) {
                return Err(vec![(
                    BUNDLE_KEY.into(),
                    "a file of several assessments in a format this Joulewise does not know".into(),
                )]);
            }
            let Some(items) = v.get("assessments").and_then(|a| a.as_array()) else {
                return Err(vec![(
                    "assessments".into(),
                    "missing: the list of assessments".into(),
                )]);
            };
            let mut ok = Vec::new();
            let mut bad = Vec::new();
            for (i, item) in items.iter().enumerate() {
                match Scenario::from_json(&item.to_string()) {
                    Ok(s) => ok.push(s),
                    Err(e) => bad.push((
                        if e.path.is_empty() {
                            format!("assessments.{i}")
                        } else {
                            format!("assessments.{i}.{}", e.path)
                        },
                        e.message,
                    )),
                }
            }
            if bad.is_empty() {
                Ok(ok)
            } else {
                Err(bad)
            }
        }
    }
}

/// The refusal of a file over the size limit, from its size alone.
pub fn too_large(len: f64) -> String {
    format!(
        "the file is {:.1} MB; a scenario file is at most {:.0} MB, so this is not a Joulewise scenario",
        len / (1024.0 * 1024.0),
        MAX_FILE_BYTES as f64 / (1024.0 * 1024.0)
    )
}

fn same_identity(a: &Scenario, b: &Scenario) -> bool {
    let k = |s: &Scenario| {
        (
            s.identity.title.trim().to_lowercase(),
            s.identity.machine_tag.trim().to_lowercase(),
        )
    };
    k(a) == k(b)
}

/// Import every file chosen in `input`, then clear it (so the same file
/// can be chosen again).
pub fn import_from(input: web_sys::HtmlInputElement) {
    let Some(files) = input.files() else {
        return;
    };
    let list: Vec<web_sys::File> = (0..files.length()).filter_map(|i| files.item(i)).collect();
    input.set_value("");
    let keeper = Keeper::get();
    let t = Transfer::get();
    spawn_local(async move {
        let mut out = String::from("<ul class=\"import-list\">");
        let (mut added, mut refused, mut asked) = (0, 0, 0);
        for f in list {
            let name = f.name();
            let result = if f.size() > MAX_FILE_BYTES as f64 {
                Err(vec![(String::new(), too_large(f.size()))])
            } else {
                match JsFuture::from(f.array_buffer()).await {
                    Ok(buf) => read_file(&js_sys::Uint8Array::new(&buf).to_vec()),
                    Err(e) => Err(vec![(
                        String::new(),
                        format!("the file could not be read ({})", crate::store::js_err(&e)),
                    )]),
                }
            };
            match result {
                Err(problems) => {
                    refused += 1;
                    let _ = write!(
                        out,
                        "<li class=\"import-bad\" data-file=\"{}\"><strong>",
                        esc(&name)
                    );
                    push_esc(&mut out, &name);
                    out.push_str("</strong>: not imported.<ul>");
                    for (path, msg) in problems {
                        out.push_str("<li>");
                        if !path.is_empty() {
                            let _ =
                                write!(out, "<code class=\"import-path\">{}</code>: ", esc(&path));
                        }
                        push_esc(&mut out, &msg);
                        out.push_str("</li>");
                    }
                    out.push_str("</ul></li>");
                }
                Ok(list) => {
                    for s in list {
                        let title = if s.identity.title.trim().is_empty() {
                            "Untitled assessment".to_string()
                        } else {
                            s.identity.title.clone()
                        };
                        let _ = write!(
                            out,
                            "<li class=\"import-ok\" data-file=\"{}\"><strong>",
                            esc(&name)
                        );
                        push_esc(&mut out, &name);
                        out.push_str("</strong>: “");
                        push_esc(&mut out, &title);
                        let existing = keeper
                            .all_records()
                            .into_iter()
                            .find(|r| same_identity(&r.scenario, &s))
                            .map(|r| r.id);
                        match existing {
                            Some(id) => {
                                asked += 1;
                                out.push_str("” is already in the library: choose what to do in the question at the top of the page.");
                                t.pending.update(|p| {
                                    p.push(Pending {
                                        file: name.clone(),
                                        scenario: s.clone(),
                                        existing: id,
                                    })
                                });
                            }
                            None => {
                                added += 1;
                                out.push_str("” imported.");
                                let _ = keeper.write(new_record(s.clone())).await;
                            }
                        }
                        input_problems(&mut out, &s);
                        out.push_str("</li>");
                    }
                }
            }
        }
        out.push_str("</ul>");
        let head = format!(
            "<p class=\"import-sum\">Import: {added} added, {asked} waiting for your choice, {refused} refused.</p>"
        );
        t.report.set(head + &out);
        t.count.update(|c| *c += 1);
    });
}

/// List the inputs the core refuses in `s` (imported as typed).
fn input_problems(out: &mut String, s: &Scenario) {
    let report = crate::state::assess_or_explain(s);
    if report.errors.is_empty() {
        return;
    }
    let _ = write!(
        out,
        " {} input(s) to fix on the sheet:<ul>",
        report.errors.len()
    );
    for e in &report.errors {
        let _ = write!(
            out,
            "<li><code class=\"import-path\">{}</code>: ",
            esc(&e.field)
        );
        push_esc(out, &e.message());
        out.push_str("</li>");
    }
    out.push_str("</ul>");
}

fn new_record(s: Scenario) -> Record {
    let verdict = crate::verdict::verdict_key(crate::verdict::shown_verdict(
        &crate::state::assess_or_explain(&s),
    ))
    .to_string();
    Record {
        id: new_id(),
        revision: 1,
        saved_ms: js_sys::Date::now(),
        writer: String::new(),
        verdict,
        scenario: s,
    }
}

/// Settle the first pending import.
pub fn choose(sheet: Sheet, c: Choice) {
    let t = Transfer::get();
    let keeper = Keeper::get();
    let Some(p) = t.pending.with_untracked(|v| v.first().cloned()) else {
        return;
    };
    t.pending.update(|v| {
        if !v.is_empty() {
            v.remove(0);
        }
    });
    let title = p.scenario.identity.title.clone();
    match c {
        Choice::Cancel => keeper.notice.set(Some(crate::keep::Notice::Text(format!(
            "“{title}” from {} was not imported.",
            p.file
        )))),
        Choice::KeepBoth => {
            let r = new_record(p.scenario);
            spawn_local(async move {
                let _ = keeper.write(r).await;
                keeper.notice.set(Some(crate::keep::Notice::Text(format!(
                    "“{title}” imported beside the one already there."
                ))));
            });
        }
        Choice::Replace => {
            let Some(old) = keeper.record(&p.existing) else {
                return;
            };
            let mut r = new_record(p.scenario.clone());
            r.id = old.id.clone();
            r.revision = old.revision + 1;
            let open = keeper.current.get_untracked().as_deref() == Some(old.id.as_str());
            // Undo of a replace: the old version is offered back.
            keeper.notice.set(Some(crate::keep::Notice::Removed {
                key: old.id.clone(),
                raw: crate::store::record::encode(&old),
                what: format!(
                    "the earlier “{}” (replaced by the import)",
                    old.scenario.identity.title
                ),
            }));
            spawn_local(async move {
                let _ = keeper.write(r).await;
                if open {
                    keeper.open(sheet, old.id);
                }
            });
        }
    }
}
