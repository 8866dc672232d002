//! Share links: the scenario, compressed, in the URL fragment
//! (`#s=` + base64url of the raw-deflate of its compact JSON). A fragment
//! never leaves the browser (it is not part of any request), so sharing
//! sends nothing anywhere. Compression is the browser's own
//! `CompressionStream('deflate-raw')` (RFC 1951), so no compressor ships in
//! the WebAssembly.
//!
//! Opening a link reads it as data only: the text is decoded, inflated
//! with a size cap ([`joulewise_core::scenario::MAX_FILE_BYTES`], so a
//! small link cannot expand into gigabytes) and read by the core's file
//! reader, which checks everything an imported file is checked for. Nothing
//! in it is executed, fetched or inserted as markup.

use joulewise_core::scenario::{Scenario, MAX_FILE_BYTES};
use js_sys::{Array, Function, Promise, Reflect, Uint8Array};
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;
use wasm_bindgen_futures::JsFuture;

/// Fragment prefix of a share link.
pub const PREFIX: &str = "#s=";

/// Longest fragment read (characters): base64 of a compressed scenario is
/// a few kilobytes; far beyond that it is not one of our links.
pub const MAX_FRAGMENT: usize = 1 << 20;

const B64: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

/// base64url without padding (RFC 4648 §5).
pub fn b64url_encode(bytes: &[u8]) -> String {
    let mut out = String::with_capacity(bytes.len().div_ceil(3) * 4);
    for chunk in bytes.chunks(3) {
        let b = [
            chunk.first().copied().unwrap_or(0),
            chunk.get(1).copied().unwrap_or(0),
            chunk.get(2).copied().unwrap_or(0),
        ];
        let n = (u32::from(b[0]) << 16) | (u32::from(b[1]) << 8) | u32::from(b[2]);
        let digits = chunk.len() + 1;
        for i in 0..digits {
            let idx = ((n >> (18 - 6 * i)) & 63) as usize;
            out.push(char::from(B64.get(idx).copied().unwrap_or(b'A')));
        }
    }
    out
}

/// Decode base64url (padding and whitespace tolerated).
///
/// # Errors
/// A character outside the alphabet, or a length no encoder writes.
pub fn b64url_decode(text: &str) -> Result<Vec<u8>, String> {
    let mut out = Vec::with_capacity(text.len() / 4 * 3 + 3);
    let mut acc: u32 = 0;
    let mut bits = 0;
    for c in text.bytes() {
        let v = match c {
            b'A'..=b'Z' => c - b'A',
            b'a'..=b'z' => c - b'a' + 26,
            b'0'..=b'9' => c - b'0' + 52,
            b'-' | b'+' => 62,
            b'_' | b'/' => 63,
            b'=' | b' ' | b'\n' | b'\r' => continue,
            _ => {
                return Err(format!(
                    "the link holds a character that is not part of one ({:?})",
                    char::from(c)
                ))
            }
        };
        acc = (acc << 6) | u32::from(v);
        bits += 6;
        if bits >= 8 {
            bits -= 8;
            out.push(((acc >> bits) & 0xFF) as u8);
        }
    }
    if bits >= 6 {
        return Err("the link is cut short".into());
    }
    Ok(out)
}

fn call(obj: &JsValue, name: &str, args: &[&JsValue]) -> Result<JsValue, String> {
    let f: Function = Reflect::get(obj, &JsValue::from_str(name))
        .map_err(|e| crate::store::js_err(&e))?
        .dyn_into()
        .map_err(|_| format!("this browser has no {name}"))?;
    let a = Array::new();
    for x in args {
        a.push(x);
    }
    f.apply(obj, &a).map_err(|e| crate::store::js_err(&e))
}

/// Run `bytes` through the browser's `CompressionStream` or
/// `DecompressionStream` (`ctor`) in raw-deflate mode, refusing output
/// longer than `cap` bytes.
async fn through(ctor: &str, bytes: &[u8], cap: usize) -> Result<Vec<u8>, String> {
    let global = js_sys::global();
    let c: Function = Reflect::get(&global, &JsValue::from_str(ctor))
        .ok()
        .and_then(|c| c.dyn_into().ok())
        .ok_or_else(|| format!("this browser has no {ctor}"))?;
    let stream = Reflect::construct(&c, &Array::of1(&JsValue::from_str("deflate-raw")))
        .map_err(|e| crate::store::js_err(&e))?;
    let parts = Array::of1(&Uint8Array::from(bytes));
    let blob =
        web_sys::Blob::new_with_u8_array_sequence(&parts).map_err(|e| crate::store::js_err(&e))?;
    let piped = call(&call(&blob, "stream", &[])?, "pipeThrough", &[&stream])?;
    let reader = call(&piped, "getReader", &[])?;
    let mut out = Vec::new();
    loop {
        let p: Promise = call(&reader, "read", &[])?
            .dyn_into()
            .map_err(|_| "the stream did not answer".to_string())?;
        let chunk = JsFuture::from(p)
            .await
            .map_err(|_| "the link is damaged (its compressed data cannot be read)".to_string())?;
        if Reflect::get(&chunk, &JsValue::from_str("done"))
            .ok()
            .and_then(|d| d.as_bool())
            == Some(true)
        {
            break;
        }
        let value: Uint8Array = Reflect::get(&chunk, &JsValue::from_str("value"))
            .ok()
            .and_then(|v| v.dyn_into().ok())
            .ok_or("the stream gave no bytes")?;
        if out.len() + value.length() as usize > cap {
            let _ = call(&reader, "cancel", &[]);
            return Err(format!(
                "the link expands to more than {} MB, more than any assessment",
                cap / (1024 * 1024)
            ));
        }
        out.extend(value.to_vec());
    }
    Ok(out)
}

/// The share link of `s` for the page at `base` (the page's address
/// without its fragment).
///
/// # Errors
/// A browser without `CompressionStream`.
pub async fn link(s: &Scenario, base: &str) -> Result<String, String> {
    let json = serde_json::to_string(s).map_err(|e| e.to_string())?;
    let packed = through("CompressionStream", json.as_bytes(), usize::MAX).await?;
    Ok(format!("{base}{PREFIX}{}", b64url_encode(&packed)))
}

/// Read the scenario of a link's fragment (with or without `#s=`).
///
/// # Errors
/// Damaged, oversized or refused by the core (with the field path).
pub async fn read(fragment: &str) -> Result<Scenario, String> {
    let body = fragment.strip_prefix(PREFIX).unwrap_or(fragment);
    if body.len() > MAX_FRAGMENT {
        return Err("the link is far longer than any assessment's".into());
    }
    let packed = b64url_decode(body)?;
    let bytes = through("DecompressionStream", &packed, MAX_FILE_BYTES).await?;
    Scenario::from_bytes(&bytes).map_err(|e| e.to_string())
}

/// The page's address without the fragment.
pub fn base() -> String {
    let Some(w) = web_sys::window() else {
        return String::new();
    };
    let href = w.location().href().unwrap_or_default();
    href.split('#').next().unwrap_or_default().to_string()
}

/// The scenario of a share link in the page's address, if it carries one.
pub async fn from_location() -> Option<Result<Scenario, String>> {
    let hash = web_sys::window()?.location().hash().ok()?;
    if !hash.starts_with(PREFIX) {
        return None;
    }
    Some(read(&hash).await)
}

/// Take a share link out of the address (once it is in the library, a
/// reload must reopen the saved one, not the link).
pub fn forget_location() {
    let Some(w) = web_sys::window() else {
        return;
    };
    if w.location().hash().is_ok_and(|h| h.starts_with(PREFIX)) {
        if let Ok(h) = w.history() {
            let _ = h.replace_state_with_url(&JsValue::NULL, "", Some(&base()));
        }
    }
}
