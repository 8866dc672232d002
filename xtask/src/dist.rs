//! The second half of `cargo xtask dist`: turns trunk's output into the
//! deployable offline app and the single self-contained file (std only).
//!
//! What it writes, after `trunk build` has filled `dist/`:
//! - `dist/index.html` with no inline script: trunk's inline start-up module
//!   becomes `boot-<hash>.js`, the hand-written `static/offline.js` (service
//!   worker registration, update notice, notice for pages opened from disk)
//!   becomes `offline-<hash>.js`, every URL is relative (the folder works
//!   under any path prefix), and the Content-Security-Policy [`CSP`] is set
//!   as a meta tag;
//! - `dist/sw.js`, the service worker, from the template `xtask/src/sw.js`
//!   with the list of every file of the build and a cache named by the
//!   build's content hash (SHA-256 over every file's path and bytes);
//! - `dist-single/joulewise.html`: the same page with the CSS, the icon, the
//!   scripts and the WebAssembly (gzip, then base64; the page inflates it
//!   with the browser's `DecompressionStream`) inlined, so it runs from `file://`
//!   and fetches nothing; its own CSP allows exactly its inline scripts and
//!   style by their `sha256-` hashes (CSP Level 3, "hash-source").
//!
//! SHA-256 (FIPS 180-4) and base64 (RFC 4648, section 4) are written out here
//! because xtask has no dependencies on purpose; both are tested against the
//! published test vectors.

use std::fs;
use std::path::Path;
use std::process::Command;

/// The Content-Security-Policy of the served app (issue 11), set as a meta
/// tag in `dist/index.html`; deployers may also send it as an HTTP header.
pub const CSP: &str =
    "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; object-src 'none'; base-uri 'none'";

/// Size budget of the single file, raw bytes (the performance issue).
pub const SINGLE_FILE_BUDGET: usize = 900_000;

/// The hand-written page script (registration, update notice, file notice).
const OFFLINE_JS: &str = include_str!("../../static/offline.js");

/// The service worker template; `__CACHE__` and `__FILES__` are filled in.
const SW_TEMPLATE: &str = include_str!("sw.js");

/// Post-process trunk's `dist/` (built with `--public-url public_url`) and
/// write `dist-single/joulewise.html` next to it. Prints the sizes.
pub fn finish(dist: &Path, public_url: &str) -> Result<(), String> {
    let index_path = dist.join("index.html");
    let trunk_html = read_text(&index_path)?;
    let (base, start) = take_trunk_start(&trunk_html, public_url)?;
    let base = relativize(&base, dist, public_url)?;

    let boot = boot_module(&start);
    let boot_name = hashed_name("boot", boot.as_bytes());
    let offline_name = hashed_name("offline", OFFLINE_JS.as_bytes());
    write(&dist.join(&boot_name), boot.as_bytes())?;
    write(&dist.join(&offline_name), OFFLINE_JS.as_bytes())?;

    let scripts = format!(
        "<script type=\"module\" src=\"{offline_name}\"></script>\n    \
         <script type=\"module\" src=\"{boot_name}\"></script>\n  "
    );
    let served = insert_before_head_end(&insert_csp(&base, CSP)?, &scripts)?;
    check_no_inline_script(&served)?;
    write(&index_path, served.as_bytes())?;

    let files = build_files(dist)?;
    let cache = format!("{:.16}", hex(&content_hash(dist, &files)?));
    write(
        &dist.join("sw.js"),
        service_worker(&cache, &files)?.as_bytes(),
    )?;

    let single = single_file(&base, dist, &start)?;
    let single_dir = dist.with_file_name("dist-single");
    fs::create_dir_all(&single_dir)
        .map_err(|e| format!("cannot create {}: {e}", single_dir.display()))?;
    let single_path = single_dir.join("joulewise.html");
    write(&single_path, single.as_bytes())?;

    report_sizes(dist, &files, &single_path);
    Ok(())
}

/// What trunk's inline start-up script names: the wasm-bindgen glue module
/// and the WebAssembly file (both relative to `dist/`).
struct Start {
    glue: String,
    wasm: String,
}

/// Remove trunk's inline `<script type="module">` (the one that calls the
/// glue's `init` with `module_or_path`) and read the two file names from it.
fn take_trunk_start(html: &str, public_url: &str) -> Result<(String, Start), String> {
    let mut from = 0;
    while let Some(rel) = html[from..].find("<script") {
        let open = from + rel;
        let body_start = open
            + html[open..]
                .find('>')
                .ok_or("unterminated <script> tag in trunk's index.html")?
            + 1;
        let body_len = html[body_start..]
            .find("</script>")
            .ok_or("<script> without </script> in trunk's index.html")?;
        let body = &html[body_start..body_start + body_len];
        let close = body_start + body_len + "</script>".len();
        if body.contains("module_or_path") {
            let strip = |s: &str| s.strip_prefix(public_url).unwrap_or(s).to_string();
            let glue = strip(quoted_after(body, "from ").ok_or(
                "trunk's start-up script has no `import ... from '...'`; has trunk changed?",
            )?);
            let wasm = strip(quoted_after(body, "module_or_path: ").ok_or(
                "trunk's start-up script has no `module_or_path: '...'`; has trunk changed?",
            )?);
            let mut rest = String::with_capacity(html.len());
            rest.push_str(html[..open].trim_end_matches([' ', '\n']));
            rest.push('\n');
            rest.push_str(html[close..].trim_start_matches('\n'));
            return Ok((rest, Start { glue, wasm }));
        }
        from = close;
    }
    Err(
        "trunk's index.html has no inline start-up script (module_or_path); has trunk changed?"
            .into(),
    )
}

/// The text inside the first pair of quotes (' or ") after `key` in `s`.
fn quoted_after<'a>(s: &'a str, key: &str) -> Option<&'a str> {
    let after = &s[s.find(key)? + key.len()..];
    let q = after.chars().next().filter(|c| *c == '\'' || *c == '"')?;
    let rest = &after[1..];
    rest.find(q).map(|end| &rest[..end])
}

/// Rewrite `"PUBLIC_URL<file>"` to `"<file>"` for every file trunk wrote, and
/// fail if any absolute URL under the public URL is left. Also drops the
/// blank lines trunk leaves where its `data-trunk` links were.
fn relativize(html: &str, dist: &Path, public_url: &str) -> Result<String, String> {
    let mut out: String = html
        .lines()
        .filter(|l| !l.trim().is_empty())
        .flat_map(|l| [l, "\n"])
        .collect();
    for name in build_files(dist)? {
        out = out.replace(&format!("\"{public_url}{name}\""), &format!("\"{name}\""));
    }
    for attr in ["href=\"", "src=\""] {
        let absolute = format!("{attr}{public_url}");
        if out.contains(&absolute) {
            return Err(format!(
                "index.html still holds an absolute URL (`{absolute}...`); every URL must be relative"
            ));
        }
    }
    Ok(out)
}

/// The start-up module that replaces trunk's inline script: same work,
/// relative to its own URL so the folder can live under any path.
fn boot_module(start: &Start) -> String {
    format!(
        "// Starts Joulewise: loads the WebAssembly module next to this file.\n\
         // Written by `cargo xtask dist` in place of trunk's inline script (CSP: no inline script).\n\
         import init from './{glue}';\n\
         const wasm = await init({{ module_or_path: new URL('{wasm}', import.meta.url) }});\n\
         dispatchEvent(new CustomEvent('TrunkApplicationStarted', {{ detail: {{ wasm }} }}));\n",
        glue = start.glue,
        wasm = start.wasm,
    )
}

/// `stem-<16 hex digits of SHA-256>.js`.
fn hashed_name(stem: &str, bytes: &[u8]) -> String {
    format!("{stem}-{:.16}.js", hex(&sha256(bytes)))
}

/// Insert the CSP meta tag right after `<meta charset ...>` (a meta CSP only
/// governs what follows it), or right after `<head>`.
fn insert_csp(html: &str, policy: &str) -> Result<String, String> {
    let tag = format!("\n    <meta http-equiv=\"Content-Security-Policy\" content=\"{policy}\" />");
    let at = match html.find("<meta charset") {
        Some(i) => {
            i + html[i..]
                .find('>')
                .ok_or("unterminated <meta charset> tag")?
                + 1
        }
        None => {
            let i = html.find("<head>").ok_or("index.html has no <head>")?;
            i + "<head>".len()
        }
    };
    Ok(format!("{}{tag}{}", &html[..at], &html[at..]))
}

/// Insert `text` on its own lines just before `</head>`.
fn insert_before_head_end(html: &str, text: &str) -> Result<String, String> {
    let at = html.find("</head>").ok_or("index.html has no </head>")?;
    let before = html[..at].trim_end();
    Ok(format!("{before}\n    {text}{}", &html[at..]))
}

/// The served page must hold no inline script (the CSP forbids it).
fn check_no_inline_script(html: &str) -> Result<(), String> {
    let mut from = 0;
    while let Some(rel) = html[from..].find("<script") {
        let open = from + rel;
        let end = open + html[open..].find('>').ok_or("unterminated <script> tag")?;
        if !html[open..end].contains(" src=") {
            return Err("index.html holds an inline <script>; the CSP forbids it".into());
        }
        from = end;
    }
    Ok(())
}

/// Every file under `dist/` except the service worker itself, as relative
/// URLs with `/`, sorted.
fn build_files(dist: &Path) -> Result<Vec<String>, String> {
    fn walk(dir: &Path, prefix: &str, out: &mut Vec<String>) -> Result<(), String> {
        let entries =
            fs::read_dir(dir).map_err(|e| format!("cannot list {}: {e}", dir.display()))?;
        for entry in entries {
            let entry = entry.map_err(|e| format!("cannot list {}: {e}", dir.display()))?;
            let name = entry.file_name().to_string_lossy().into_owned();
            let rel = format!("{prefix}{name}");
            let path = entry.path();
            if path.is_dir() {
                walk(&path, &format!("{rel}/"), out)?;
            } else if rel != "sw.js" {
                out.push(rel);
            }
        }
        Ok(())
    }
    let mut out = Vec::new();
    walk(dist, "", &mut out)?;
    out.sort();
    Ok(out)
}

/// SHA-256 over every file's relative path, length and bytes, in order: any
/// change to any file changes the cache name.
fn content_hash(dist: &Path, files: &[String]) -> Result<[u8; 32], String> {
    let mut all = Vec::new();
    for f in files {
        let bytes = read_bytes(&dist.join(f))?;
        all.extend_from_slice(f.as_bytes());
        all.push(0);
        all.extend_from_slice(&(bytes.len() as u64).to_le_bytes());
        all.extend_from_slice(&bytes);
    }
    Ok(sha256(&all))
}

/// The service worker: the template with the cache name and the file list.
fn service_worker(cache: &str, files: &[String]) -> Result<String, String> {
    let mut list = String::from("[\n");
    for f in files {
        let plain = f
            .chars()
            .all(|c| c.is_ascii_alphanumeric() || "._-/".contains(c));
        if !plain {
            return Err(format!(
                "file name `{f}` in dist/ has characters the service worker list does not expect"
            ));
        }
        list.push_str(&format!("  '{f}',\n"));
    }
    list.push(']');
    if !SW_TEMPLATE.contains("__CACHE__") || !SW_TEMPLATE.contains("__FILES__") {
        return Err("xtask/src/sw.js lost its __CACHE__ or __FILES__ placeholder".into());
    }
    Ok(SW_TEMPLATE
        .replace("__CACHE__", cache)
        .replace("__FILES__", &list))
}

/// The single self-contained page, built from the served page before its
/// script tags and CSP were added.
fn single_file(base: &str, dist: &Path, start: &Start) -> Result<String, String> {
    let mut html = String::with_capacity(base.len() + 400_000);
    let mut style_hashes = Vec::new();
    let mut rest = base;
    while let Some(open) = rest.find("<link") {
        let end = open + rest[open..].find('>').ok_or("unterminated <link> tag")? + 1;
        html.push_str(&rest[..open]);
        let tag = &rest[open..end];
        rest = &rest[end..];
        let rel = attr(tag, "rel").unwrap_or_default();
        let href = attr(tag, "href").unwrap_or_default();
        match rel {
            "stylesheet" => {
                let css = read_text(&dist.join(href))?;
                check_embeddable(&css, "</style", href)?;
                style_hashes.push(csp_hash(&css));
                html.push_str(&format!("<style>{css}</style>"));
            }
            // Nothing to preload; installing the app (manifest, home-screen
            // icon) needs a server.
            "modulepreload" | "preload" | "manifest" | "apple-touch-icon" => {
                let trimmed = html.trim_end_matches([' ', '\n']).len();
                html.truncate(trimmed);
            }
            "icon" => {
                let bytes = read_bytes(&dist.join(href))?;
                let mime = match href.rsplit('.').next() {
                    Some("svg") => "image/svg+xml",
                    Some("png") => "image/png",
                    _ => return Err(format!("icon `{href}` is neither SVG nor PNG")),
                };
                html.push_str(&format!(
                    "<link rel=\"{rel}\" href=\"data:{mime};base64,{}\" />",
                    base64(&bytes)
                ));
            }
            _ => {
                return Err(format!(
                    "the single file cannot inline `{tag}`; teach xtask/src/dist.rs about it"
                ))
            }
        }
    }
    html.push_str(rest);

    let glue = read_text(&dist.join(&start.glue))?;
    let init = default_export(&glue)?;
    for line in glue.lines() {
        if line.trim_start().starts_with("import ") {
            return Err(format!(
                "the glue `{}` imports another module (`{line}`); the single file cannot follow it",
                start.glue
            ));
        }
    }
    let wasm = read_bytes(&dist.join(&start.wasm))?;
    let packed = gzip_bytes(&wasm)?;
    let app = format!(
        "{glue}\n// Joulewise single file: the WebAssembly module, gzip (RFC 1952) then base64 (RFC 4648),\n\
         // inflated by the browser's own DecompressionStream and started from bytes (no fetch: works\n\
         // from file:// and under the strict CSP). A block, so no clash with the glue's top-level names.\n\
         {{\n\
         if (typeof DecompressionStream !== 'function') {{\n\
         throw new Error('Joulewise needs a browser with DecompressionStream (Chrome 80, Firefox 113, Safari 16.4 or later).');\n\
         }}\n\
         const text = atob('{}');\n\
         const packed = new Uint8Array(text.length);\n\
         for (let i = 0; i < text.length; i++) packed[i] = text.charCodeAt(i);\n\
         const inflated = new Blob([packed]).stream().pipeThrough(new DecompressionStream('gzip'));\n\
         const bytes = new Uint8Array(await new Response(inflated).arrayBuffer());\n\
         const started = await {init}({{ module_or_path: bytes }});\n\
         dispatchEvent(new CustomEvent('TrunkApplicationStarted', {{ detail: {{ wasm: started }} }}));\n\
         }}\n",
        base64(&packed)
    );
    for (text, what) in [
        (OFFLINE_JS, "static/offline.js"),
        (&app, start.glue.as_str()),
    ] {
        check_embeddable(text, "</script", what)?;
        check_embeddable(text, "<!--", what)?;
        check_embeddable(text, "<script", what)?;
    }
    let policy = format!(
        "default-src 'none'; script-src {} {} 'wasm-unsafe-eval'; style-src {}; img-src data:; \
         object-src 'none'; base-uri 'none'; form-action 'none'",
        csp_hash(OFFLINE_JS),
        csp_hash(&app),
        style_hashes.join(" "),
    );
    let scripts = format!(
        "<script type=\"module\">{OFFLINE_JS}</script>\n    <script type=\"module\">{app}</script>\n  "
    );
    insert_before_head_end(&insert_csp(&html, &policy)?, &scripts)
}

/// The value of `name="..."` in a tag.
fn attr<'a>(tag: &'a str, name: &str) -> Option<&'a str> {
    let key = format!(" {name}=\"");
    let start = tag.find(&key)? + key.len();
    tag[start..].find('"').map(|end| &tag[start..start + end])
}

/// The local name the glue exports as `default` (its `init`).
fn default_export(glue: &str) -> Result<String, String> {
    for line in glue.lines().rev() {
        let l = line.trim();
        if let Some(list) = l.strip_prefix("export {") {
            for item in list.trim_end_matches(['}', ';', ' ']).split(',') {
                if let Some(local) = item.trim().strip_suffix(" as default") {
                    return Ok(local.trim().to_string());
                }
            }
        }
    }
    Err(
        "the wasm-bindgen glue has no `export { ... as default }`; has wasm-bindgen changed?"
            .into(),
    )
}

/// Text inlined into the page must not end its element early.
fn check_embeddable(text: &str, needle: &str, what: &str) -> Result<(), String> {
    if text.to_ascii_lowercase().contains(needle) {
        Err(format!(
            "`{what}` holds `{needle}`, which would break the inlined element"
        ))
    } else {
        Ok(())
    }
}

/// A CSP hash-source for an inline element's text: `'sha256-<base64>'`.
fn csp_hash(text: &str) -> String {
    format!("'sha256-{}'", base64(&sha256(text.as_bytes())))
}

fn report_sizes(dist: &Path, files: &[String], single: &Path) {
    println!("xtask: dist/ files (bytes raw, gzip -9):");
    let mut raw_total = 0;
    let mut gz_total = 0;
    for f in files.iter().map(String::as_str).chain(["sw.js"]) {
        let path = dist.join(f);
        let raw = fs::metadata(&path).map(|m| m.len() as usize).unwrap_or(0);
        let gz = gzip_size(&path);
        raw_total += raw;
        gz_total += gz.unwrap_or(0);
        println!("  {f:<44} {raw:>9} {:>9}", show(gz));
    }
    println!("  {:<44} {raw_total:>9} {gz_total:>9}", "total");
    let raw = fs::metadata(single).map(|m| m.len() as usize).unwrap_or(0);
    let gz = gzip_size(single);
    let verdict = if raw <= SINGLE_FILE_BUDGET {
        "within"
    } else {
        "OVER"
    };
    println!(
        "xtask: dist-single/joulewise.html: {raw} bytes raw, {} bytes gzip -9 ({verdict} the budget of {SINGLE_FILE_BUDGET} bytes raw)",
        show(gz)
    );
}

fn show(n: Option<usize>) -> String {
    n.map_or_else(|| "?".into(), |n| n.to_string())
}

/// `bytes` compressed by `gzip -9 -n` (no name, no time stamp, so the same
/// input gives the same single file). The single file embeds the wasm this
/// way: base64 of the gzip stream is about 55 % of base64 of the raw module,
/// which is what keeps the file within [`SINGLE_FILE_BUDGET`].
fn gzip_bytes(bytes: &[u8]) -> Result<Vec<u8>, String> {
    use std::io::Write;
    use std::process::Stdio;
    let mut child = Command::new("gzip")
        .args(["-9", "-n", "-c"])
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .spawn()
        .map_err(|e| format!("the single file needs the `gzip` program to pack the wasm: {e}"))?;
    let mut stdin = child.stdin.take().ok_or("gzip: no stdin")?;
    // Write from another thread: gzip's output pipe would fill while we write.
    let input = bytes.to_vec();
    let writer = std::thread::spawn(move || stdin.write_all(&input));
    let out = child
        .wait_with_output()
        .map_err(|e| format!("gzip failed: {e}"))?;
    writer
        .join()
        .map_err(|_| "gzip: the writer thread panicked".to_string())?
        .map_err(|e| format!("gzip: cannot write its input: {e}"))?;
    if !out.status.success() || out.stdout.len() < 18 {
        return Err(format!("gzip -9 -n failed ({})", out.status));
    }
    Ok(out.stdout)
}

/// Size of `gzip -9 -c file`, if the gzip program is there.
fn gzip_size(path: &Path) -> Option<usize> {
    let out = Command::new("gzip")
        .args(["-9", "-c"])
        .arg(path)
        .output()
        .ok()?;
    out.status.success().then_some(out.stdout.len())
}

fn read_text(path: &Path) -> Result<String, String> {
    fs::read_to_string(path).map_err(|e| format!("cannot read {}: {e}", path.display()))
}

fn read_bytes(path: &Path) -> Result<Vec<u8>, String> {
    fs::read(path).map_err(|e| format!("cannot read {}: {e}", path.display()))
}

fn write(path: &Path, bytes: &[u8]) -> Result<(), String> {
    fs::write(path, bytes).map_err(|e| format!("cannot write {}: {e}", path.display()))
}

/// Lower-case hexadecimal.
fn hex(bytes: &[u8]) -> String {
    bytes.iter().map(|b| format!("{b:02x}")).collect()
}

/// Base64 with the standard alphabet and `=` padding (RFC 4648, section 4).
pub fn base64(bytes: &[u8]) -> String {
    const ALPHABET: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";
    let mut out = String::with_capacity(bytes.len().div_ceil(3) * 4);
    for chunk in bytes.chunks(3) {
        let b = [
            chunk.first().copied().unwrap_or(0),
            chunk.get(1).copied().unwrap_or(0),
            chunk.get(2).copied().unwrap_or(0),
        ];
        let n = (u32::from(b[0]) << 16) | (u32::from(b[1]) << 8) | u32::from(b[2]);
        for (i, shift) in [18u32, 12, 6, 0].into_iter().enumerate() {
            if i <= chunk.len() {
                out.push(char::from(ALPHABET[((n >> shift) & 63) as usize]));
            } else {
                out.push('=');
            }
        }
    }
    out
}

/// SHA-256 of `data` (FIPS 180-4, sections 4.1.2, 4.2.2, 5.1.1, 6.2).
pub fn sha256(data: &[u8]) -> [u8; 32] {
    // First 32 bits of the fractional parts of the cube roots of the first
    // 64 primes (FIPS 180-4, 4.2.2).
    const K: [u32; 64] = [
        0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4,
        0xab1c5ed5, 0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe,
        0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f,
        0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7,
        0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc,
        0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b,
        0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116,
        0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3,
        0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7,
        0xc67178f2,
    ];
    // Initial hash value (FIPS 180-4, 5.3.3).
    let mut h: [u32; 8] = [
        0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab,
        0x5be0cd19,
    ];
    // Padding (5.1.1): a 1 bit, zeros, then the length in bits as 64 bits.
    let mut msg = data.to_vec();
    msg.push(0x80);
    while msg.len() % 64 != 56 {
        msg.push(0);
    }
    msg.extend_from_slice(&((data.len() as u64).wrapping_mul(8)).to_be_bytes());

    for block in msg.chunks_exact(64) {
        let mut w = [0u32; 64];
        for (t, word) in block.chunks_exact(4).enumerate() {
            w[t] = u32::from_be_bytes([word[0], word[1], word[2], word[3]]);
        }
        for t in 16..64 {
            let s0 = w[t - 15].rotate_right(7) ^ w[t - 15].rotate_right(18) ^ (w[t - 15] >> 3);
            let s1 = w[t - 2].rotate_right(17) ^ w[t - 2].rotate_right(19) ^ (w[t - 2] >> 10);
            w[t] = w[t - 16]
                .wrapping_add(s0)
                .wrapping_add(w[t - 7])
                .wrapping_add(s1);
        }
        let [mut a, mut b, mut c, mut d, mut e, mut f, mut g, mut hh] = h;
        for t in 0..64 {
            let big_s1 = e.rotate_right(6) ^ e.rotate_right(11) ^ e.rotate_right(25);
            let ch = (e & f) ^ (!e & g);
            let t1 = hh
                .wrapping_add(big_s1)
                .wrapping_add(ch)
                .wrapping_add(K[t])
                .wrapping_add(w[t]);
            let big_s0 = a.rotate_right(2) ^ a.rotate_right(13) ^ a.rotate_right(22);
            let maj = (a & b) ^ (a & c) ^ (b & c);
            let t2 = big_s0.wrapping_add(maj);
            hh = g;
            g = f;
            f = e;
            e = d.wrapping_add(t1);
            d = c;
            c = b;
            b = a;
            a = t1.wrapping_add(t2);
        }
        for (hi, v) in h.iter_mut().zip([a, b, c, d, e, f, g, hh]) {
            *hi = hi.wrapping_add(v);
        }
    }
    let mut out = [0u8; 32];
    for (chunk, word) in out.chunks_exact_mut(4).zip(h) {
        chunk.copy_from_slice(&word.to_be_bytes());
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The packed wasm is a gzip stream (RFC 1952 magic 1f 8b, method 8 =
    /// deflate) that `gzip -d` turns back into exactly the input, and packing
    /// is deterministic (no name, no time stamp in the header).
    #[test]
    fn gzip_bytes_round_trips_and_is_reproducible() {
        use std::io::Write;
        use std::process::Stdio;
        let input: Vec<u8> = (0..200_000u32).map(|i| (i * 7 % 251) as u8).collect();
        let packed = gzip_bytes(&input).unwrap();
        assert_eq!(&packed[..3], &[0x1f, 0x8b, 8]);
        assert_eq!(packed, gzip_bytes(&input).unwrap());
        let mut child = Command::new("gzip")
            .args(["-d", "-c"])
            .stdin(Stdio::piped())
            .stdout(Stdio::piped())
            .spawn()
            .unwrap();
        let mut stdin = child.stdin.take().unwrap();
        let p = packed.clone();
        let w = std::thread::spawn(move || stdin.write_all(&p));
        let out = child.wait_with_output().unwrap();
        w.join().unwrap().unwrap();
        assert_eq!(out.stdout, input);
    }

    /// FIPS 180-4 examples, as published by NIST ("Cryptographic Standards
    /// and Guidelines: Examples with Intermediate Values", SHA256.pdf, one-
    /// and two-block messages) and FIPS 180-2 Appendix B.3 (one million
    /// `a`); the empty message is `Len = 0` of NIST CAVP SHA256ShortMsg.rsp.
    /// All four also cross-checked with coreutils `sha256sum`.
    #[test]
    fn sha256_matches_the_fips_180_examples() {
        assert_eq!(
            hex(&sha256(b"abc")),
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
        );
        assert_eq!(
            hex(&sha256(
                b"abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"
            )),
            "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1"
        );
        assert_eq!(
            hex(&sha256(b"")),
            "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"
        );
        assert_eq!(
            hex(&sha256(&vec![b'a'; 1_000_000])),
            "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0"
        );
    }

    /// Messages whose padding falls on each side of a block boundary (55, 56,
    /// 63, 64 bytes) against coreutils `sha256sum` of N bytes of `a`
    /// (`python3 -c "import sys; sys.stdout.write('a'*N)" | sha256sum`).
    #[test]
    fn sha256_padding_edges_match_sha256sum() {
        let cases = [
            (
                55,
                "9f4390f8d30c2dd92ec9f095b65e2b9ae9b0a925a5258e241c9f1e910f734318",
            ),
            (
                56,
                "b35439a4ac6f0948b6d6f9e3c6af0f5f590ce20f1bde7090ef7970686ec6738a",
            ),
            (
                63,
                "7d3e74a05d7db15bce4ad9ec0658ea98e3f06eeecf16b4c6fff2da457ddc2f34",
            ),
            (
                64,
                "ffe054fe7ae0cb6dc65c3af9b61d5209f439851db43d0ba5997337df154668eb",
            ),
        ];
        for (n, want) in cases {
            assert_eq!(hex(&sha256(&vec![b'a'; n])), want, "{n} bytes of `a`");
        }
    }

    /// RFC 4648, section 10, test vectors.
    #[test]
    fn base64_matches_rfc_4648_section_10() {
        for (input, want) in [
            ("", ""),
            ("f", "Zg=="),
            ("fo", "Zm8="),
            ("foo", "Zm9v"),
            ("foob", "Zm9vYg=="),
            ("fooba", "Zm9vYmE="),
            ("foobar", "Zm9vYmFy"),
        ] {
            assert_eq!(base64(input.as_bytes()), want, "base64({input:?})");
        }
    }

    /// The CSP hash of `alert('Hello, world.');` as printed in the CSP Level 3
    /// specification (W3C, section 2.3.1 "Source Lists", hash-source example;
    /// from memory, and cross-checked with `openssl dgst -sha256 -binary | base64`).
    #[test]
    fn csp_hash_matches_the_csp3_example() {
        assert_eq!(
            csp_hash("alert('Hello, world.');"),
            "'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='"
        );
    }

    const TRUNK_PAGE: &str = "<!DOCTYPE html>\n<html lang=\"en\">\n  <head>\n    <meta charset=\"utf-8\" />\n    <link rel=\"stylesheet\" href=\"/tools/jw/app-1.css\" integrity=\"sha384-x\"/>\n    \n<script type=\"module\">\nimport init, * as bindings from '/tools/jw/web-2.js';\nconst wasm = await init({ module_or_path: '/tools/jw/web-2_bg.wasm' });\n</script>\n  <link rel=\"modulepreload\" href=\"/tools/jw/web-2.js\"></head>\n  <body></body>\n</html>\n";

    #[test]
    fn trunk_start_script_is_taken_out_and_read() {
        let (rest, start) = take_trunk_start(TRUNK_PAGE, "/tools/jw/").unwrap();
        assert_eq!(start.glue, "web-2.js");
        assert_eq!(start.wasm, "web-2_bg.wasm");
        let boot = boot_module(&start);
        assert!(boot.contains("import init from './web-2.js';"));
        assert!(boot.contains("new URL('web-2_bg.wasm', import.meta.url)"));
        assert!(!rest.contains("<script"));
        assert!(rest.contains("<link rel=\"modulepreload\""));
        let with_csp = insert_csp(&rest, CSP).unwrap();
        let charset = with_csp.find("<meta charset").unwrap();
        let csp = with_csp.find("Content-Security-Policy").unwrap();
        let css = with_csp.find("stylesheet").unwrap();
        assert!(
            charset < csp && csp < css,
            "CSP comes before anything it governs"
        );
    }

    #[test]
    fn urls_become_relative_and_absolute_leftovers_are_refused() {
        let dir = std::env::temp_dir().join(format!("jw-dist-test-{}", std::process::id()));
        fs::create_dir_all(dir.join("icons")).unwrap();
        fs::write(dir.join("app-1.css"), "").unwrap();
        fs::write(dir.join("icons/i.png"), "").unwrap();
        let html =
            "<head>\n  \n<link href=\"/p/app-1.css\"><link href=\"/p/icons/i.png\">\n</head>\n";
        let out = relativize(html, &dir, "/p/").unwrap();
        assert_eq!(
            out,
            "<head>\n<link href=\"app-1.css\"><link href=\"icons/i.png\">\n</head>\n"
        );
        assert!(relativize("<a href=\"/p/elsewhere.html\">", &dir, "/p/").is_err());
        fs::remove_dir_all(&dir).unwrap();
    }

    #[test]
    fn inline_scripts_are_refused_in_the_served_page() {
        assert!(check_no_inline_script("<script type=\"module\" src=\"a.js\"></script>").is_ok());
        assert!(check_no_inline_script("<script type=\"module\">x()</script>").is_err());
    }

    #[test]
    fn default_export_is_found() {
        let glue = "function a() {}\nexport { initSync, __wbg_init as default };\n";
        assert_eq!(default_export(glue).unwrap(), "__wbg_init");
        assert!(default_export("export { a };").is_err());
    }

    #[test]
    fn service_worker_lists_files_and_refuses_odd_names() {
        let sw = service_worker("abc", &["index.html".into(), "icons/a.png".into()]).unwrap();
        assert!(sw.contains("'index.html',") && sw.contains("'icons/a.png',"));
        assert!(!sw.contains("__CACHE__") && !sw.contains("__FILES__"));
        assert!(service_worker("abc", &["a'b.js".into()]).is_err());
    }

    #[test]
    fn attributes_are_read() {
        let tag = "<link rel=\"icon\" href=\"icons/icon.svg\" type=\"image/svg+xml\" />";
        assert_eq!(attr(tag, "rel"), Some("icon"));
        assert_eq!(attr(tag, "href"), Some("icons/icon.svg"));
        assert_eq!(attr(tag, "integrity"), None);
    }
}
