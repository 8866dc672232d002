//! Where assessments are kept in the browser: IndexedDB (database
//! `joulewise`, object store `assessments`, one text record per assessment
//! keyed by its id, see [`record`]), or, when IndexedDB cannot be opened,
//! `localStorage` (keys `joulewise.record.<id>`), or, when neither works,
//! nowhere but this tab's memory ([`Kind::Memory`]).
//!
//! `localStorage` also holds *rescue copies* under the same keys while
//! IndexedDB is in use: written synchronously when the page is hidden with
//! a change not yet stored, and when an IndexedDB write fails (quota
//! exceeded). The keeper merges them on the next load, the newer revision
//! winning, and removes them once IndexedDB holds that revision.
//!
//! Every operation returns the browser's own error name and message
//! (`QuotaExceededError: …`) so the banner can say what happened.

pub mod record;

use js_sys::{Array, Promise, Reflect};
use std::cell::RefCell;
use std::collections::BTreeMap;
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;
use wasm_bindgen_futures::JsFuture;
use web_sys::{IdbDatabase, IdbObjectStore, IdbRequest, IdbTransaction, IdbTransactionMode};

/// Database name.
pub const DB_NAME: &str = "joulewise";
/// Database version (one object store; raise it only with an upgrade step).
pub const DB_VERSION: u32 = 1;
/// Object store holding one text per assessment, keyed by id.
pub const STORE: &str = "assessments";
/// Prefix of `localStorage` keys of records and rescue copies.
pub const LOCAL_PREFIX: &str = "joulewise.record.";
/// How long opening IndexedDB may take before it counts as blocked (ms):
/// opening an existing database takes a few milliseconds; a browser that
/// never answers (blocked by policy or another connection) must not keep
/// the user waiting.
pub const OPEN_TIMEOUT_MS: i32 = 4000;

/// Where records go.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// IndexedDB, with localStorage rescue copies.
    Idb,
    /// localStorage only (IndexedDB could not be opened).
    Local,
    /// Neither: this tab's memory only.
    Memory,
}

enum Backend {
    Idb(IdbDatabase),
    Local,
    Memory,
}

thread_local! {
    static BACKEND: RefCell<Backend> = const { RefCell::new(Backend::Memory) };
    static MEMORY: RefCell<BTreeMap<String, String>> = const { RefCell::new(BTreeMap::new()) };
}

/// The browser's error as `Name: message` (or its text).
pub fn js_err(e: &JsValue) -> String {
    let field = |k: &str| {
        Reflect::get(e, &JsValue::from_str(k))
            .ok()
            .and_then(|v| v.as_string())
            .unwrap_or_default()
    };
    let (name, message) = (field("name"), field("message"));
    match (name.is_empty(), message.is_empty()) {
        (false, false) => format!("{name}: {message}"),
        (false, true) => name,
        (true, false) => message,
        (true, true) => e.as_string().unwrap_or_else(|| "unknown error".into()),
    }
}

fn local() -> Option<web_sys::Storage> {
    web_sys::window()?.local_storage().ok().flatten()
}

/// A promise settled by an IndexedDB request.
fn request_done(req: &IdbRequest) -> Promise {
    let req = req.clone();
    Promise::new(&mut |resolve, reject| {
        let r = req.clone();
        let ok = Closure::once_into_js(move |_: web_sys::Event| {
            let _ = resolve.call1(&JsValue::NULL, &r.result().unwrap_or(JsValue::UNDEFINED));
        });
        let r = req.clone();
        let bad = Closure::once_into_js(move |_: web_sys::Event| {
            let e = r.error().ok().flatten().map(JsValue::from);
            let _ = reject.call1(
                &JsValue::NULL,
                &e.unwrap_or_else(|| JsValue::from_str("the request failed")),
            );
        });
        req.set_onsuccess(Some(ok.unchecked_ref()));
        req.set_onerror(Some(bad.unchecked_ref()));
    })
}

/// A promise settled when a transaction commits or aborts (a full disk
/// shows as an abort with `QuotaExceededError`).
fn transaction_done(tx: &IdbTransaction) -> Promise {
    let tx = tx.clone();
    Promise::new(&mut |resolve, reject| {
        let ok = Closure::once_into_js(move |_: web_sys::Event| {
            let _ = resolve.call0(&JsValue::NULL);
        });
        let t = tx.clone();
        let reject2 = reject.clone();
        let bad = Closure::once_into_js(move |_: web_sys::Event| {
            let e = t.error().map(JsValue::from);
            let _ = reject.call1(
                &JsValue::NULL,
                &e.unwrap_or_else(|| JsValue::from_str("the write was not completed")),
            );
        });
        let t = tx.clone();
        let aborted = Closure::once_into_js(move |_: web_sys::Event| {
            let e = t.error().map(JsValue::from);
            let _ = reject2.call1(
                &JsValue::NULL,
                &e.unwrap_or_else(|| JsValue::from_str("the write was aborted")),
            );
        });
        tx.set_oncomplete(Some(ok.unchecked_ref()));
        tx.set_onerror(Some(bad.unchecked_ref()));
        tx.set_onabort(Some(aborted.unchecked_ref()));
    })
}

fn timeout(ms: i32) -> Promise {
    Promise::new(&mut |_, reject| {
        let f = Closure::once_into_js(move || {
            let _ = reject.call1(
                &JsValue::NULL,
                &JsValue::from_str("the browser did not open its database (blocked?)"),
            );
        });
        if let Some(w) = web_sys::window() {
            let _ = w.set_timeout_with_callback_and_timeout_and_arguments_0(f.unchecked_ref(), ms);
        }
    })
}

async fn open_idb() -> Result<IdbDatabase, String> {
    let w = web_sys::window().ok_or("no window")?;
    let factory = w
        .indexed_db()
        .map_err(|e| js_err(&e))?
        .ok_or("this browser offers no IndexedDB")?;
    let req = factory
        .open_with_u32(DB_NAME, DB_VERSION)
        .map_err(|e| js_err(&e))?;
    let r = req.clone();
    let upgrade = Closure::once_into_js(move |_: web_sys::Event| {
        // Version 0 → 1: the one store. Later versions add steps here.
        if let Ok(db) = r.result().and_then(|d| d.dyn_into::<IdbDatabase>()) {
            let _ = db.create_object_store(STORE);
        }
    });
    req.set_onupgradeneeded(Some(upgrade.unchecked_ref()));
    let done = request_done(&req);
    let winner = Promise::race(&Array::of2(&done, &timeout(OPEN_TIMEOUT_MS)));
    let db = JsFuture::from(winner).await.map_err(|e| js_err(&e))?;
    db.dyn_into::<IdbDatabase>()
        .map_err(|_| "the browser returned no database".to_string())
}

fn local_works() -> Result<(), String> {
    let s = local().ok_or("this browser offers no localStorage")?;
    let probe = "joulewise.probe";
    s.set_item(probe, "1").map_err(|e| js_err(&e))?;
    s.remove_item(probe).map_err(|e| js_err(&e))?;
    Ok(())
}

/// Open the best storage there is. Returns where records will go and, when
/// that is not IndexedDB, why (the browser's words).
pub async fn start() -> (Kind, Option<String>) {
    let idb = open_idb().await;
    let (backend, kind, why) = match idb {
        Ok(db) => (Backend::Idb(db), Kind::Idb, None),
        Err(e) => match local_works() {
            Ok(()) => (Backend::Local, Kind::Local, Some(e)),
            Err(l) => (
                Backend::Memory,
                Kind::Memory,
                Some(format!("IndexedDB: {e}; localStorage: {l}")),
            ),
        },
    };
    BACKEND.with(|b| *b.borrow_mut() = backend);
    (kind, why)
}

fn db() -> Option<IdbDatabase> {
    BACKEND.with(|b| match &*b.borrow() {
        Backend::Idb(db) => Some(db.clone()),
        _ => None,
    })
}

/// Where records go now.
pub fn kind() -> Kind {
    BACKEND.with(|b| match &*b.borrow() {
        Backend::Idb(_) => Kind::Idb,
        Backend::Local => Kind::Local,
        Backend::Memory => Kind::Memory,
    })
}

fn object_store(
    db: &IdbDatabase,
    mode: IdbTransactionMode,
) -> Result<(IdbTransaction, IdbObjectStore), String> {
    let tx = db
        .transaction_with_str_and_mode(STORE, mode)
        .map_err(|e| js_err(&e))?;
    let st = tx.object_store(STORE).map_err(|e| js_err(&e))?;
    Ok((tx, st))
}

/// The stored text of a value: a string as is, anything else (a record
/// damaged by hand) as JSON text, so it is quarantined, never dropped.
fn as_text(v: &JsValue) -> String {
    v.as_string().unwrap_or_else(|| {
        js_sys::JSON::stringify(v)
            .ok()
            .and_then(|s| s.as_string())
            .unwrap_or_else(|| format!("{v:?}"))
    })
}

/// Every `(key, text)` in the store in use.
///
/// # Errors
/// The browser's words when the store cannot be read.
pub async fn load_all() -> Result<Vec<(String, String)>, String> {
    match db() {
        Some(db) => {
            let (_tx, st) = object_store(&db, IdbTransactionMode::Readonly)?;
            let keys = st.get_all_keys().map_err(|e| js_err(&e))?;
            let vals = st.get_all().map_err(|e| js_err(&e))?;
            let keys = JsFuture::from(request_done(&keys))
                .await
                .map_err(|e| js_err(&e))?;
            let vals = JsFuture::from(request_done(&vals))
                .await
                .map_err(|e| js_err(&e))?;
            let keys: Array = keys
                .dyn_into()
                .map_err(|_| "keys are not a list".to_string())?;
            let vals: Array = vals
                .dyn_into()
                .map_err(|_| "values are not a list".to_string())?;
            Ok(keys
                .iter()
                .zip(vals.iter())
                .map(|(k, v)| (as_text(&k), as_text(&v)))
                .collect())
        }
        None if kind() == Kind::Local => Ok(local_records()),
        None => Ok(MEMORY.with(|m| {
            m.borrow()
                .iter()
                .map(|(k, v)| (k.clone(), v.clone()))
                .collect()
        })),
    }
}

/// The text under `key`, if any.
///
/// # Errors
/// The browser's words when the store cannot be read.
pub async fn get(key: &str) -> Result<Option<String>, String> {
    match db() {
        Some(db) => {
            let (_tx, st) = object_store(&db, IdbTransactionMode::Readonly)?;
            let req = st.get(&JsValue::from_str(key)).map_err(|e| js_err(&e))?;
            let v = JsFuture::from(request_done(&req))
                .await
                .map_err(|e| js_err(&e))?;
            Ok((!v.is_undefined() && !v.is_null()).then(|| as_text(&v)))
        }
        None if kind() == Kind::Local => {
            Ok(local().and_then(|s| s.get_item(&format!("{LOCAL_PREFIX}{key}")).ok().flatten()))
        }
        None => Ok(MEMORY.with(|m| m.borrow().get(key).cloned())),
    }
}

/// Store `text` under `key` and wait until the browser has committed it.
///
/// # Errors
/// The browser's words (`QuotaExceededError: …`) when it was not stored.
pub async fn put(key: &str, text: &str) -> Result<(), String> {
    match db() {
        Some(db) => {
            let (tx, st) = object_store(&db, IdbTransactionMode::Readwrite)?;
            let done = transaction_done(&tx);
            if let Err(e) = st.put_with_key(&JsValue::from_str(text), &JsValue::from_str(key)) {
                let _ = tx.abort();
                return Err(js_err(&e));
            }
            JsFuture::from(done)
                .await
                .map(|_| ())
                .map_err(|e| js_err(&e))
        }
        None if kind() == Kind::Local => local_put(key, text),
        None => {
            MEMORY.with(|m| m.borrow_mut().insert(key.to_string(), text.to_string()));
            Ok(())
        }
    }
}

/// Remove the record under `key`.
///
/// # Errors
/// The browser's words when it could not be removed.
pub async fn remove(key: &str) -> Result<(), String> {
    match db() {
        Some(db) => {
            let (tx, st) = object_store(&db, IdbTransactionMode::Readwrite)?;
            let done = transaction_done(&tx);
            st.delete(&JsValue::from_str(key)).map_err(|e| js_err(&e))?;
            JsFuture::from(done)
                .await
                .map(|_| ())
                .map_err(|e| js_err(&e))?;
            drop_rescue(key);
            Ok(())
        }
        None if kind() == Kind::Local => {
            drop_rescue(key);
            Ok(())
        }
        None => {
            MEMORY.with(|m| m.borrow_mut().remove(key));
            Ok(())
        }
    }
}

fn local_put(key: &str, text: &str) -> Result<(), String> {
    local()
        .ok_or("this browser offers no localStorage")?
        .set_item(&format!("{LOCAL_PREFIX}{key}"), text)
        .map_err(|e| js_err(&e))
}

/// Every record or rescue copy in localStorage, `(id, text)`.
pub fn local_records() -> Vec<(String, String)> {
    let Some(s) = local() else {
        return Vec::new();
    };
    let n = s.length().unwrap_or(0);
    (0..n)
        .filter_map(|i| s.key(i).ok().flatten())
        .filter_map(|k| {
            let id = k.strip_prefix(LOCAL_PREFIX)?.to_string();
            let v = s.get_item(&k).ok().flatten()?;
            Some((id, v))
        })
        .collect()
}

/// Keep `text` under `key` in localStorage at once (synchronous: safe in
/// `pagehide`). With IndexedDB in use this is a rescue copy.
///
/// # Errors
/// The browser's words when localStorage refuses it too.
pub fn rescue(key: &str, text: &str) -> Result<(), String> {
    match kind() {
        Kind::Memory => {
            MEMORY.with(|m| m.borrow_mut().insert(key.to_string(), text.to_string()));
            Err("this browser keeps nothing for this page".into())
        }
        _ => local_put(key, text),
    }
}

/// Remove a rescue copy (IndexedDB now holds it).
pub fn drop_rescue(key: &str) {
    if let Some(s) = local() {
        let _ = s.remove_item(&format!("{LOCAL_PREFIX}{key}"));
    }
}

/// What a conditional write did.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum PutIf {
    /// The stored text was as expected and is now `text`.
    Written,
    /// Something else was stored (its text, `None` if nothing): not written.
    Changed(Option<String>),
}

/// Store `text` under `key` only if `expect` accepts what is stored now,
/// read and written in one IndexedDB transaction (transactions on one
/// store run one after the other, so two tabs cannot both pass the check
/// and the second overwrite the first).
///
/// # Errors
/// The browser's words when the write failed (quota exceeded…).
pub async fn put_if(
    key: &str,
    text: &str,
    expect: impl Fn(Option<&str>) -> bool + 'static,
) -> Result<PutIf, String> {
    let Some(db) = db() else {
        let now = get(key).await?;
        if !expect(now.as_deref()) {
            return Ok(PutIf::Changed(now));
        }
        return put(key, text).await.map(|()| PutIf::Written);
    };
    use std::rc::Rc;
    let (tx, st) = object_store(&db, IdbTransactionMode::Readwrite)?;
    let done = transaction_done(&tx);
    let req = st.get(&JsValue::from_str(key)).map_err(|e| js_err(&e))?;
    let outcome: Rc<RefCell<Option<PutIf>>> = Rc::new(RefCell::new(None));
    let failure: Rc<RefCell<Option<String>>> = Rc::new(RefCell::new(None));
    let (o, f, r, t) = (outcome.clone(), failure.clone(), req.clone(), tx.clone());
    let (key_v, text_v) = (JsValue::from_str(key), JsValue::from_str(text));
    let on = Closure::once_into_js(move |_: web_sys::Event| {
        let v = r.result().unwrap_or(JsValue::UNDEFINED);
        let now = (!v.is_undefined() && !v.is_null()).then(|| as_text(&v));
        if expect(now.as_deref()) {
            match st.put_with_key(&text_v, &key_v) {
                Ok(_) => *o.borrow_mut() = Some(PutIf::Written),
                Err(e) => {
                    *f.borrow_mut() = Some(js_err(&e));
                    let _ = t.abort();
                }
            }
        } else {
            *o.borrow_mut() = Some(PutIf::Changed(now));
        }
    });
    req.set_onsuccess(Some(on.unchecked_ref()));
    let committed = JsFuture::from(done).await;
    if let Some(e) = failure.borrow_mut().take() {
        return Err(e);
    }
    committed.map_err(|e| js_err(&e))?;
    let out = outcome.borrow_mut().take();
    out.ok_or_else(|| "the browser did not answer".to_string())
}

/// The revision written in a stored text (0 when it has none or cannot be
/// read), for [`put_if`] checks.
pub fn revision_of(raw: &str) -> Option<u64> {
    let v: serde_json::Value = serde_json::from_str(raw).ok()?;
    v.get("revision").and_then(serde_json::Value::as_u64)
}
