//! Keeping the user's work: autosave of the open assessment, the library's
//! records, quarantine of unreadable records, and two tabs on one
//! assessment.
//!
//! Autosave: every change of the scenario (texts exactly as typed, those
//! the core refuses included) is written [`AUTOSAVE_MS`] after the last
//! keystroke, and at once when the page is hidden (`pagehide`,
//! `visibilitychange`), then synchronously to localStorage as a rescue copy
//! because an IndexedDB write may not finish while the page goes away.
//! A write that fails (quota exceeded, storage blocked) leaves the change
//! in memory and a rescue copy where one can be written, and says so in a
//! banner that urges an export; the next change tries again.
//!
//! Two tabs: each record carries a revision. A tab writes only if the
//! stored revision is the one it last read or wrote; otherwise (another tab
//! wrote in between) it stops and asks: keep both, overwrite, or take the
//! other version. Tabs also tell each other of every write on a
//! `BroadcastChannel`, so a tab with no unsaved change simply follows the
//! other's write, and one with unsaved changes asks at once.
//!
//! A stored text that cannot be read never stops the page: it is set aside
//! (left untouched in the store, listed, exportable as raw text) and the
//! user is told.

use crate::state::{Sheet, View};
use crate::store::record::{decode, encode, Record};
use crate::store::{self, Kind};
use crate::verdict::verdict_key;
use joulewise_core::scenario::Scenario;
use leptos::prelude::*;
use leptos::task::spawn_local;
use std::cell::RefCell;
use std::collections::BTreeMap;
use std::time::Duration;
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;

/// Milliseconds from the last change to the autosave: short enough that
/// closing the tab a second after typing loses nothing, long enough that a
/// burst of typing is one write.
pub const AUTOSAVE_MS: u64 = 300;

/// sessionStorage key of the assessment open in this tab (so a reload
/// reopens it).
const OPEN_KEY: &str = "joulewise.open";

/// Name of the channel tabs use to tell each other of writes.
const CHANNEL: &str = "joulewise";

/// One line of the library.
#[derive(Debug, Clone, PartialEq)]
pub struct Entry {
    /// Record id.
    pub id: String,
    /// Title as typed.
    pub title: String,
    /// Machine tag as typed.
    pub tag: String,
    /// Date of the assessment as typed.
    pub dated: String,
    /// When last saved (ms since 1970).
    pub saved_ms: f64,
    /// Revision.
    pub revision: u64,
    /// Worst verdict key when saved.
    pub verdict: String,
    /// Lower-case text searched by the library's search box.
    pub hay: String,
}

impl Entry {
    fn of(r: &Record) -> Self {
        let i = &r.scenario.identity;
        let hay = [
            &i.title,
            &i.machine_tag,
            &i.location,
            &i.assessor,
            &i.date,
            &i.revision,
            &i.notes,
        ]
        .iter()
        .map(|s| s.to_lowercase())
        .collect::<Vec<_>>()
        .join("\n");
        Self {
            id: r.id.clone(),
            title: i.title.clone(),
            tag: i.machine_tag.clone(),
            dated: i.date.clone(),
            saved_ms: r.saved_ms,
            revision: r.revision,
            verdict: r.verdict.clone(),
            hay,
        }
    }
}

/// A stored text that could not be read.
#[derive(Debug, Clone, PartialEq)]
pub struct SetAside {
    /// Its key in the store.
    pub key: String,
    /// The text as stored.
    pub raw: String,
    /// Why it could not be read.
    pub reason: String,
}

/// A message with, for a deletion, what Undo puts back.
#[derive(Debug, Clone, PartialEq)]
pub enum Notice {
    /// A record was removed; Undo writes `raw` back under `key`.
    Removed {
        /// Key.
        key: String,
        /// Text as it was stored.
        raw: String,
        /// What to call it.
        what: String,
    },
    /// Plain news.
    Text(String),
}

/// Another tab's write met unsaved changes here.
#[derive(Debug, Clone, PartialEq)]
pub struct Conflict {
    /// The version stored by the other tab.
    pub theirs: Record,
}

/// How a conflict is settled.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Settle {
    /// Keep the other version under its id and this one as a copy.
    KeepBoth,
    /// Write this version over the other.
    Overwrite,
    /// Show the other version and drop the changes made here.
    TakeTheirs,
}

/// The keeper's state, provided as context (all handles are Copy).
#[derive(Clone, Copy)]
pub struct Keeper {
    /// Where records go (`None` while starting).
    pub kind: RwSignal<Option<Kind>>,
    /// What is wrong with storage, in words (banner), if anything.
    pub fault: RwSignal<Option<String>>,
    /// The library, newest first.
    pub entries: RwSignal<Vec<Entry>>,
    /// Records that could not be read.
    pub aside: RwSignal<Vec<SetAside>>,
    /// Id of the assessment open in the sheet (`None`: not in the library yet).
    pub current: RwSignal<Option<String>>,
    /// Revision and time of the last write of the open assessment.
    pub saved: RwSignal<Option<(u64, f64)>>,
    /// The open assessment has changes not yet stored.
    pub dirty: RwSignal<bool>,
    /// The latest notice.
    pub notice: RwSignal<Option<Notice>>,
    /// A conflict waiting for the user's choice.
    pub conflict: RwSignal<Option<Conflict>>,
    /// The library was loaded (autosave runs from then on).
    pub ready: RwSignal<bool>,
}

struct Local {
    records: BTreeMap<String, Record>,
    last_json: String,
    base_rev: u64,
    timer: Option<TimeoutHandle>,
    saving: bool,
    again: bool,
    tab: String,
    channel: Option<web_sys::BroadcastChannel>,
}

thread_local! {
    static LOCAL: RefCell<Local> = const { RefCell::new(Local {
        records: BTreeMap::new(),
        last_json: String::new(),
        base_rev: 0,
        timer: None,
        saving: false,
        again: false,
        tab: String::new(),
        channel: None,
    }) };
}

fn with<T>(f: impl FnOnce(&mut Local) -> T) -> T {
    LOCAL.with(|l| f(&mut l.borrow_mut()))
}

/// The scenario as the text compared to tell a change (compact JSON).
pub fn json_of(s: &Scenario) -> String {
    serde_json::to_string(s).unwrap_or_default()
}

/// A new record id: time and randomness, unique enough for one browser.
pub fn new_id() -> String {
    let t = js_sys::Date::now() as u64;
    let r = (js_sys::Math::random() * 1e12) as u64;
    format!("a{t:x}{r:x}")
}

fn session() -> Option<web_sys::Storage> {
    web_sys::window()?.session_storage().ok().flatten()
}

impl Keeper {
    /// Create the keeper, start loading the library and autosaving, and
    /// provide it as context.
    pub fn provide(sheet: Sheet) -> Self {
        let k = Self {
            kind: RwSignal::new(None),
            fault: RwSignal::new(None),
            entries: RwSignal::new(Vec::new()),
            aside: RwSignal::new(Vec::new()),
            current: RwSignal::new(None),
            saved: RwSignal::new(None),
            dirty: RwSignal::new(false),
            notice: RwSignal::new(None),
            conflict: RwSignal::new(None),
            ready: RwSignal::new(false),
        };
        provide_context(k);
        remember_sheet(sheet);
        with(|l| l.tab = new_id());
        // Autosave: a change marks the assessment dirty and (re)starts the timer.
        Effect::new(move |_| {
            let json = sheet.scenario.with(json_of);
            if !k.ready.get_untracked() || k.conflict.with_untracked(Option::is_some) {
                return;
            }
            if with(|l| l.last_json == json) {
                return;
            }
            k.dirty.set(true);
            k.schedule();
        });
        // A verdict that settles after the save is written too.
        Effect::new(move |_| {
            let v = sheet
                .report
                .with(|r| verdict_key(crate::verdict::shown_verdict(r)));
            if sheet.pending.get_untracked() || !k.ready.get_untracked() {
                return;
            }
            let Some(id) = k.current.get_untracked() else {
                return;
            };
            let stale = with(|l| l.records.get(&id).is_some_and(|r| r.verdict != v));
            if stale && !k.dirty.get_untracked() {
                k.schedule();
            }
        });
        k.listen_for_hide();
        // A link pasted into the address bar of an open page changes only
        // the fragment: no reload, so it is read here.
        let _ = window_event_listener(leptos::ev::hashchange, move |_| {
            if k.ready.get_untracked() {
                spawn_local(async move {
                    k.open_link(sheet).await;
                });
            }
        });
        k.listen_to_tabs(sheet);
        spawn_local(async move { k.start(sheet).await });
        k
    }

    /// The keeper provided above.
    pub fn get() -> Self {
        // Every part of the page sits below `App`, which provides it.
        #[allow(clippy::expect_used)]
        use_context::<Self>().expect("Keeper::provide runs in App")
    }

    fn schedule(self) {
        let h = set_timeout_with_handle(
            move || spawn_local(async move { self.save_now().await }),
            Duration::from_millis(AUTOSAVE_MS),
        )
        .ok();
        if let Some(old) = with(|l| std::mem::replace(&mut l.timer, h)) {
            old.clear();
        }
    }

    async fn start(self, sheet: Sheet) {
        let (kind, why) = store::start().await;
        self.kind.set(Some(kind));
        match (kind, why) {
            (Kind::Idb, _) => {}
            (Kind::Local, Some(why)) => self.fault.set(Some(format!(
                "This browser would not open its database ({why}), so assessments are kept in its \
                 small storage (a few megabytes). Export your work now and then."
            ))),
            (_, why) => self.fault.set(Some(format!(
                "This browser is not letting Joulewise keep anything ({}). You can go on working: \
                 everything stays in this tab until you close it. Export your work before you close it.",
                why.unwrap_or_default()
            ))),
        }
        let items = match store::load_all().await {
            Ok(items) => items,
            Err(e) => {
                self.fault.set(Some(format!(
                    "Stored assessments could not be read ({e}). New work is kept in this tab; export it."
                )));
                Vec::new()
            }
        };
        let mut records = BTreeMap::new();
        let mut aside = Vec::new();
        for (key, raw) in items {
            match decode(&key, &raw) {
                Ok(r) => {
                    records.insert(key, r);
                }
                Err(e) => aside.push(SetAside {
                    key,
                    raw,
                    reason: e.reason,
                }),
            }
        }
        // Rescue copies left by a hidden page or a failed write.
        if kind == Kind::Idb {
            for (key, raw) in store::local_records() {
                let Ok(r) = decode(&key, &raw) else {
                    // Left where it is: an unreadable rescue copy is shown too.
                    aside.push(SetAside {
                        key: format!("{}{key}", store::LOCAL_PREFIX),
                        raw,
                        reason: "a rescue copy in localStorage that cannot be read".into(),
                    });
                    continue;
                };
                let stored = records.get(&key);
                let newer = stored.is_none_or(|s| r.revision > s.revision);
                let differs = stored.is_some_and(|s| s.scenario != r.scenario);
                if newer {
                    let ok = store::put(&key, &raw).await.is_ok();
                    if ok {
                        store::drop_rescue(&key);
                    }
                    records.insert(key, r);
                } else if differs {
                    // Same revision written twice with different contents
                    // (two tabs): keep both.
                    let mut copy = r;
                    copy.id = new_id();
                    copy.revision = 1;
                    let text = encode(&copy);
                    if store::put(&copy.id, &text).await.is_ok() {
                        store::drop_rescue(&key);
                    }
                    records.insert(copy.id.clone(), copy);
                } else {
                    store::drop_rescue(&key);
                }
            }
        }
        with(|l| l.records = records);
        self.refresh_entries();
        self.aside.set(aside);
        // What to show: a shared link, the assessment open before a reload,
        // or the newest.
        if !self.open_link(sheet).await {
            self.open_default(sheet);
        }
        self.ready.set(true);
    }

    /// Show the share link in the page's address, if there is one (as a
    /// new, unsaved assessment). Returns whether the sheet was replaced.
    async fn open_link(self, sheet: Sheet) -> bool {
        match crate::share::from_location().await {
            Some(Ok(s)) => {
                self.start_new(sheet, s);
                sheet.view.set(View::Assessment);
                self.notice.set(Some(Notice::Text(
                    "Opened from a link. It is not in your library until you change it.".into(),
                )));
                true
            }
            Some(Err(e)) => {
                self.notice.set(Some(Notice::Text(format!(
                    "The link could not be opened: {e}"
                ))));
                false
            }
            None => false,
        }
    }

    fn open_default(self, sheet: Sheet) {
        let wanted = session().and_then(|s| s.get_item(OPEN_KEY).ok().flatten());
        let id = with(|l| {
            wanted.filter(|w| l.records.contains_key(w)).or_else(|| {
                l.records
                    .values()
                    .max_by(|a, b| a.saved_ms.total_cmp(&b.saved_ms))
                    .map(|r| r.id.clone())
            })
        });
        match id {
            Some(id) => self.show(sheet, &id),
            None => with(|l| l.last_json = sheet.scenario.with_untracked(json_of)),
        }
    }

    /// Rebuild the library list from the records (newest first).
    pub fn refresh_entries(self) {
        let mut list: Vec<Entry> = with(|l| l.records.values().map(Entry::of).collect());
        list.sort_by(|a, b| b.saved_ms.total_cmp(&a.saved_ms));
        self.entries.set(list);
    }

    /// The record under `id`, if loaded.
    pub fn record(self, id: &str) -> Option<Record> {
        with(|l| l.records.get(id).cloned())
    }

    /// Every readable record (for Export all).
    pub fn all_records(self) -> Vec<Record> {
        let mut v: Vec<Record> = with(|l| l.records.values().cloned().collect());
        v.sort_by(|a, b| b.saved_ms.total_cmp(&a.saved_ms));
        v
    }

    fn show(self, sheet: Sheet, id: &str) {
        let Some(r) = self.record(id) else {
            return;
        };
        with(|l| {
            l.last_json = json_of(&r.scenario);
            l.base_rev = r.revision;
        });
        self.current.set(Some(id.to_string()));
        self.saved.set(Some((r.revision, r.saved_ms)));
        self.dirty.set(false);
        if let Some(s) = session() {
            let _ = s.set_item(OPEN_KEY, id);
        }
        sheet.load(r.scenario);
    }

    /// Open the assessment `id` in the sheet (the open one is saved first).
    pub fn open(self, sheet: Sheet, id: String) {
        spawn_local(async move {
            self.save_now().await;
            self.show(sheet, &id);
            sheet.view.set(View::Assessment);
        });
    }

    /// Show `s` as a new assessment, not in the library until it changes
    /// (a demo, a blank sheet, a shared link). The open one is saved first.
    pub fn start_new(self, sheet: Sheet, s: Scenario) {
        let unsaved = with(|l| sheet.scenario.with_untracked(json_of) != l.last_json);
        if self.ready.get_untracked() && (unsaved || self.dirty.get_untracked()) {
            // Kept synchronously (rescue copy), then written, then replaced.
            self.rescue_now(sheet);
            spawn_local(async move {
                self.save_now().await;
                self.begin_new(sheet, s);
            });
        } else {
            self.begin_new(sheet, s);
        }
    }

    fn begin_new(self, sheet: Sheet, s: Scenario) {
        with(|l| {
            l.last_json = json_of(&s);
            l.base_rev = 0;
        });
        self.current.set(None);
        self.saved.set(None);
        self.dirty.set(false);
        if let Some(st) = session() {
            let _ = st.remove_item(OPEN_KEY);
        }
        sheet.load(s);
    }

    /// Keep the unsaved assessment shown (a link) in the library now.
    pub fn keep_now(self) {
        with(|l| l.last_json = String::new());
        self.dirty.set(true);
        spawn_local(async move { self.save_now().await });
    }

    fn verdict_now(sheet: Sheet, previous: &str) -> String {
        if sheet.pending.get_untracked() {
            previous.to_string()
        } else {
            verdict_key(
                sheet
                    .report
                    .with_untracked(|r| crate::verdict::shown_verdict(r)),
            )
            .to_string()
        }
    }

    /// Write the open assessment now if it changed (one write at a time).
    pub async fn save_now(self) {
        if let Some(h) = with(|l| l.timer.take()) {
            h.clear();
        }
        if with(|l| {
            if l.saving {
                l.again = true;
            }
            l.saving
        }) {
            return;
        }
        with(|l| l.saving = true);
        loop {
            if let Some(sheet) = SHEET.with(|s| *s.borrow()) {
                self.save_once(sheet).await;
            }
            let again = with(|l| std::mem::take(&mut l.again));
            if !again {
                break;
            }
        }
        with(|l| l.saving = false);
    }

    async fn save_once(self, sheet: Sheet) {
        if self.conflict.with_untracked(Option::is_some) || !self.ready.get_untracked() {
            return;
        }
        let s = sheet.scenario.get_untracked();
        let json = json_of(&s);
        let id = self.current.get_untracked();
        if id.is_none() && with(|l| l.last_json == json) {
            // A demo, blank sheet or link nobody has changed yet.
            self.dirty.set(false);
            return;
        }
        let previous = id.as_ref().and_then(|i| self.record(i));
        let verdict =
            Self::verdict_now(sheet, previous.as_ref().map_or("", |r| r.verdict.as_str()));
        let unchanged = with(|l| l.last_json == json)
            && previous.as_ref().is_some_and(|p| p.verdict == verdict);
        if unchanged {
            self.dirty.set(false);
            return;
        }
        let id = match id {
            Some(id) => id,
            None => {
                let id = new_id();
                with(|l| l.base_rev = 0);
                self.current.set(Some(id.clone()));
                if let Some(st) = session() {
                    let _ = st.set_item(OPEN_KEY, &id);
                }
                crate::share::forget_location();
                id
            }
        };
        let rev = with(|l| l.base_rev) + 1;
        let r = Record {
            id: id.clone(),
            revision: rev,
            saved_ms: js_sys::Date::now(),
            writer: with(|l| l.tab.clone()),
            verdict,
            scenario: s,
        };
        let text = encode(&r);
        with(|l| l.records.insert(id.clone(), r.clone()));
        self.refresh_entries();
        let base = with(|l| l.base_rev);
        // Written only if the stored revision is still the one this tab
        // read or wrote last (or nothing is stored, or it is unreadable).
        let expect = move |now: Option<&str>| match now {
            None => true,
            Some(raw) => store::revision_of(raw).is_none_or(|r| r == base),
        };
        match store::put_if(&id, &text, expect).await {
            Ok(store::PutIf::Changed(theirs)) => {
                let theirs = theirs.and_then(|raw| decode(&id, &raw).ok());
                let previous = previous.filter(|p| p.id == id);
                with(|l| match previous {
                    Some(p) => l.records.insert(id.clone(), p),
                    None => l.records.remove(&id),
                });
                if let Some(theirs) = theirs {
                    with(|l| l.records.insert(id.clone(), theirs.clone()));
                    if theirs.scenario == r.scenario {
                        with(|l| {
                            l.base_rev = theirs.revision;
                            l.last_json = json;
                        });
                        self.dirty.set(false);
                    } else {
                        self.conflict.set(Some(Conflict { theirs }));
                    }
                }
                self.refresh_entries();
            }
            Ok(store::PutIf::Written) => {
                if store::kind() == Kind::Idb {
                    store::drop_rescue(&id);
                }
                with(|l| {
                    l.base_rev = rev;
                    if sheet.scenario.with_untracked(json_of) == json {
                        l.last_json = json;
                    }
                });
                let still = with(|l| sheet.scenario.with_untracked(json_of) != l.last_json);
                self.dirty.set(still);
                self.saved.set(Some((rev, r.saved_ms)));
                if self
                    .fault
                    .with_untracked(|f| f.as_deref().is_some_and(|t| t.starts_with(WRITE_FAILED)))
                {
                    self.fault.set(None);
                }
                self.tell_tabs(&id, rev, false);
            }
            Err(e) => {
                let kept = store::rescue(&id, &text);
                let where_ = match kept {
                    Ok(()) => "A copy was kept in the browser's small storage (localStorage), and this tab still holds everything.",
                    Err(_) => "Everything is still in this tab, but only there.",
                };
                self.fault.set(Some(format!(
                    "{WRITE_FAILED} ({e}). {where_} Export this assessment now to be safe; saving is tried again at the next change."
                )));
            }
        }
    }

    /// Write the open assessment synchronously to localStorage if it has
    /// unsaved changes (the page is going away).
    fn rescue_now(self, sheet: Sheet) {
        if !self.ready.get_untracked() {
            return;
        }
        let s = sheet.scenario.get_untracked();
        let json = json_of(&s);
        if with(|l| l.last_json == json) {
            return;
        }
        let conflict = self.conflict.with_untracked(Option::is_some);
        let id = match (self.current.get_untracked(), conflict) {
            (Some(id), false) => id,
            // In conflict: kept as a copy of its own.
            (_, true) => new_id(),
            // New: it gets its id now, so the write that follows uses it too.
            (None, false) => {
                let id = new_id();
                with(|l| l.base_rev = 0);
                self.current.set(Some(id.clone()));
                if let Some(st) = session() {
                    let _ = st.set_item(OPEN_KEY, &id);
                }
                id
            }
        };
        let rev = if conflict {
            1
        } else {
            with(|l| l.base_rev) + 1
        };
        let r = Record {
            id: id.clone(),
            revision: rev,
            saved_ms: js_sys::Date::now(),
            writer: with(|l| l.tab.clone()),
            verdict: String::new(),
            scenario: s,
        };
        let _ = store::rescue(&id, &encode(&r));
    }

    fn listen_for_hide(self) {
        let flush = move || {
            if let Some(sheet) = SHEET.with(|s| *s.borrow()) {
                self.rescue_now(sheet);
            }
            spawn_local(async move { self.save_now().await });
        };
        let f1 = flush;
        let _ = window_event_listener(leptos::ev::pagehide, move |_| f1());
        let _ = leptos::prelude::window_event_listener_untyped("visibilitychange", move |_| {
            let hidden = document().visibility_state() == web_sys::VisibilityState::Hidden;
            if hidden {
                flush();
            }
        });
    }

    fn tell_tabs(self, id: &str, revision: u64, removed: bool) {
        let msg = serde_json::json!({
            "id": id, "revision": revision, "removed": removed, "tab": with(|l| l.tab.clone())
        })
        .to_string();
        with(|l| {
            if let Some(c) = &l.channel {
                let _ = c.post_message(&JsValue::from_str(&msg));
            }
        });
    }

    fn listen_to_tabs(self, sheet: Sheet) {
        let Ok(channel) = web_sys::BroadcastChannel::new(CHANNEL) else {
            return;
        };
        let on =
            Closure::<dyn FnMut(web_sys::MessageEvent)>::new(move |ev: web_sys::MessageEvent| {
                let Some(text) = ev.data().as_string() else {
                    return;
                };
                let Ok(msg) = serde_json::from_str::<serde_json::Value>(&text) else {
                    return;
                };
                let id = msg
                    .get("id")
                    .and_then(|v| v.as_str())
                    .unwrap_or_default()
                    .to_string();
                if msg.get("tab").and_then(|v| v.as_str()) == Some(with(|l| l.tab.clone()).as_str())
                {
                    return;
                }
                spawn_local(async move { self.follow(sheet, id).await });
            });
        channel.set_onmessage(Some(on.as_ref().unchecked_ref()));
        on.forget();
        with(|l| l.channel = Some(channel));
    }

    /// Another tab wrote or removed `id`: update the library, and the sheet
    /// if that is the open assessment.
    async fn follow(self, sheet: Sheet, id: String) {
        let stored = store::get(&id).await.ok().flatten();
        let theirs = stored.as_deref().and_then(|raw| decode(&id, raw).ok());
        match &theirs {
            Some(r) => with(|l| l.records.insert(id.clone(), r.clone())),
            None => with(|l| l.records.remove(&id)),
        };
        self.refresh_entries();
        if self.current.get_untracked().as_deref() != Some(id.as_str()) {
            return;
        }
        let Some(theirs) = theirs else {
            self.notice.set(Some(Notice::Text(
                "The assessment open here was deleted in another tab. It stays open here; change anything to keep it again.".into(),
            )));
            with(|l| l.base_rev = 0);
            return;
        };
        if theirs.revision <= with(|l| l.base_rev) {
            return;
        }
        // Compared directly, not through the `dirty` flag, which an effect
        // sets a moment after each keystroke.
        let unsaved = with(|l| sheet.scenario.with_untracked(json_of) != l.last_json);
        if unsaved || self.dirty.get_untracked() {
            self.conflict.set(Some(Conflict { theirs }));
        } else {
            self.show(sheet, &id);
            self.notice.set(Some(Notice::Text(
                "Updated with the changes saved in another tab.".into(),
            )));
        }
    }

    /// Settle a conflict the way the user chose.
    pub fn settle(self, sheet: Sheet, how: Settle) {
        let Some(c) = self.conflict.get_untracked() else {
            return;
        };
        let theirs = c.theirs;
        with(|l| l.records.insert(theirs.id.clone(), theirs.clone()));
        self.conflict.set(None);
        match how {
            Settle::Overwrite => {
                with(|l| {
                    l.base_rev = theirs.revision;
                    l.last_json = String::new();
                });
                self.dirty.set(true);
                spawn_local(async move { self.save_now().await });
            }
            Settle::KeepBoth => {
                // This version becomes a new assessment; the other stays.
                with(|l| {
                    l.base_rev = 0;
                    l.last_json = String::new();
                });
                self.current.set(None);
                sheet.scenario.update(|s| {
                    s.identity.title = format!("{} (my copy)", s.identity.title.trim());
                });
                self.dirty.set(true);
                spawn_local(async move { self.save_now().await });
            }
            Settle::TakeTheirs => {
                self.show(sheet, &theirs.id);
            }
        }
        self.refresh_entries();
    }

    /// Write a record (a duplicate, an import, a rename of another) and
    /// add it to the library.
    pub async fn write(self, r: Record) -> Result<(), String> {
        let text = encode(&r);
        with(|l| l.records.insert(r.id.clone(), r.clone()));
        self.refresh_entries();
        let out = store::put(&r.id, &text).await;
        match &out {
            Ok(()) => self.tell_tabs(&r.id, r.revision, false),
            Err(e) => {
                let _ = store::rescue(&r.id, &text);
                self.fault.set(Some(format!(
                    "{WRITE_FAILED} ({e}). It is kept in this tab; export it to be safe."
                )));
            }
        }
        out
    }

    /// Copy of `id` as a new assessment.
    pub fn duplicate(self, id: String) {
        let Some(mut r) = self.current_or_stored(&id) else {
            return;
        };
        r.id = new_id();
        r.revision = 1;
        r.saved_ms = js_sys::Date::now();
        r.scenario.identity.title = format!("{} (copy)", r.scenario.identity.title.trim());
        let title = r.scenario.identity.title.clone();
        spawn_local(async move {
            let _ = self.write(r).await;
            self.notice
                .set(Some(Notice::Text(format!("Duplicated as “{title}”."))));
        });
    }

    fn current_or_stored(self, id: &str) -> Option<Record> {
        let mut r = self.record(id)?;
        if self.current.get_untracked().as_deref() == Some(id) {
            if let Some(sheet) = SHEET.with(|s| *s.borrow()) {
                r.scenario = sheet.scenario.get_untracked();
            }
        }
        Some(r)
    }

    /// Give `id` a new title.
    pub fn rename(self, sheet: Sheet, id: String, title: String) {
        if self.current.get_untracked().as_deref() == Some(id.as_str()) {
            // The sheet's own title field changes; autosave writes it.
            sheet.scenario.update(|s| s.identity.title = title);
            return;
        }
        let Some(mut r) = self.record(&id) else {
            return;
        };
        r.scenario.identity.title = title;
        r.revision += 1;
        r.saved_ms = js_sys::Date::now();
        spawn_local(async move {
            let _ = self.write(r).await;
        });
    }

    /// Remove `key` (a record or a set-aside text), with one Undo.
    pub fn remove(self, key: String) {
        let (raw, what) = if let Some(r) = self.current_or_stored(&key) {
            let t = r.scenario.identity.title.trim().to_string();
            (
                encode(&r),
                if t.is_empty() {
                    "Untitled assessment".to_string()
                } else {
                    t
                },
            )
        } else if let Some(a) = self
            .aside
            .with_untracked(|v| v.iter().find(|a| a.key == key).cloned())
        {
            (a.raw, "the unreadable record".to_string())
        } else {
            return;
        };
        with(|l| l.records.remove(&key));
        self.aside.update(|v| v.retain(|a| a.key != key));
        if self.current.get_untracked().as_deref() == Some(key.as_str()) {
            // The sheet keeps showing it, outside the library now.
            self.current.set(None);
            self.saved.set(None);
            if let Some(sheet) = SHEET.with(|s| *s.borrow()) {
                with(|l| {
                    l.last_json = sheet.scenario.with_untracked(json_of);
                    l.base_rev = 0;
                });
            }
        }
        self.refresh_entries();
        self.notice.set(Some(Notice::Removed {
            key: key.clone(),
            raw,
            what,
        }));
        spawn_local(async move {
            let stored = if let Some(local) = key.strip_prefix(store::LOCAL_PREFIX) {
                store::drop_rescue(local);
                Ok(())
            } else {
                store::remove(&key).await
            };
            if let Err(e) = stored {
                self.fault.set(Some(format!(
                    "Could not remove it from the browser's storage ({e})."
                )));
            } else {
                self.tell_tabs(&key, 0, true);
            }
        });
    }

    /// Put back what the last removal took away.
    pub fn undo(self) {
        let Some(Notice::Removed { key, raw, .. }) = self.notice.get_untracked() else {
            return;
        };
        self.notice.set(None);
        match decode(&key, &raw) {
            Ok(r) => {
                spawn_local(async move {
                    let _ = self.write(r).await;
                });
            }
            Err(e) => {
                self.aside.update(|v| {
                    v.push(SetAside {
                        key: key.clone(),
                        raw: raw.clone(),
                        reason: e.reason,
                    })
                });
                spawn_local(async move {
                    let _ = store::put(&key, &raw).await;
                });
            }
        }
    }
}

/// Start of the banner text of a failed write.
pub const WRITE_FAILED: &str = "The last change could not be saved in this browser";

thread_local! {
    static SHEET: RefCell<Option<Sheet>> = const { RefCell::new(None) };
}

/// Remember the sheet for callbacks that run outside the component tree.
pub fn remember_sheet(sheet: Sheet) {
    SHEET.with(|s| *s.borrow_mut() = Some(sheet));
}
