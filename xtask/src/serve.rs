//! A small static file server for `dist/` on 127.0.0.1 (std only), used by
//! `cargo xtask serve` and by the browser tests. It serves the folder under a
//! public URL prefix (e.g. `/tools/joulewise/`) to mimic an intranet server,
//! with the MIME types browsers need (`application/wasm` for streaming
//! compilation) and `Cache-Control: no-cache` so a new build is always seen
//! (the service worker does the offline caching).

use std::io::{BufRead, BufReader, Write};
use std::net::{TcpListener, TcpStream};
use std::path::{Path, PathBuf};
use std::sync::Arc;
use std::thread;

/// A running server.
pub struct Server {
    /// The port it listens on (useful when started on port 0).
    pub port: u16,
    handle: thread::JoinHandle<()>,
}

impl Server {
    /// Serve `root` under `prefix` on 127.0.0.1:`port` (0 picks a free port).
    pub fn start(root: &Path, port: u16, prefix: &str) -> Result<Server, String> {
        let listener = TcpListener::bind(("127.0.0.1", port))
            .map_err(|e| format!("cannot listen on 127.0.0.1:{port}: {e}"))?;
        let port = listener
            .local_addr()
            .map_err(|e| format!("no local address: {e}"))?
            .port();
        let root = Arc::new(root.to_path_buf());
        let prefix = Arc::new(prefix.to_string());
        let handle = thread::spawn(move || {
            for stream in listener.incoming().flatten() {
                let root = Arc::clone(&root);
                let prefix = Arc::clone(&prefix);
                thread::spawn(move || {
                    let _ = handle(stream, &root, &prefix);
                });
            }
        });
        Ok(Server { port, handle })
    }

    /// Block until the server stops (it does not, short of Ctrl+C).
    pub fn wait(self) {
        let _ = self.handle.join();
    }
}

fn handle(mut stream: TcpStream, root: &Path, prefix: &str) -> std::io::Result<()> {
    let mut reader = BufReader::new(stream.try_clone()?);
    let mut request_line = String::new();
    reader.read_line(&mut request_line)?;
    // Drain the headers.
    loop {
        let mut line = String::new();
        if reader.read_line(&mut line)? == 0 || line == "\r\n" || line == "\n" {
            break;
        }
    }
    let mut parts = request_line.split_whitespace();
    let method = parts.next().unwrap_or("");
    let target = parts.next().unwrap_or("/");
    let path = target.split(['?', '#']).next().unwrap_or("/");
    if method != "GET" && method != "HEAD" {
        return respond(&mut stream, 405, "text/plain", b"method not allowed", false);
    }
    // The app's URLs are relative: it must be opened at the folder, with `/`.
    let bare_prefix = prefix.trim_end_matches('/');
    if prefix != "/" && (path == "/" || path == bare_prefix) {
        let loc = format!(
            "HTTP/1.1 302 Found\r\nLocation: {prefix}\r\nContent-Length: 0\r\nConnection: close\r\n\r\n"
        );
        return stream.write_all(loc.as_bytes());
    }
    let Some(rel) = path.strip_prefix(bare_prefix) else {
        return respond(
            &mut stream,
            404,
            "text/plain",
            b"not found",
            method == "HEAD",
        );
    };
    match resolve(root, rel) {
        Some(file) => match std::fs::read(&file) {
            Ok(body) => respond(&mut stream, 200, mime(&file), &body, method == "HEAD"),
            Err(_) => respond(
                &mut stream,
                404,
                "text/plain",
                b"not found",
                method == "HEAD",
            ),
        },
        None => respond(
            &mut stream,
            404,
            "text/plain",
            b"not found",
            method == "HEAD",
        ),
    }
}

/// Map a URL path under the prefix to a file in `root`, refusing `..`.
fn resolve(root: &Path, rel: &str) -> Option<PathBuf> {
    let rel = percent_decode(rel.trim_start_matches('/'));
    let mut p = root.to_path_buf();
    for seg in rel.split('/') {
        if seg.is_empty() || seg == "." {
            continue;
        }
        if seg == ".." || seg.contains('\\') {
            return None;
        }
        p.push(seg);
    }
    if p.is_dir() {
        p.push("index.html");
    }
    p.is_file().then_some(p)
}

fn percent_decode(s: &str) -> String {
    let bytes = s.as_bytes();
    let mut out = Vec::with_capacity(bytes.len());
    let mut i = 0;
    while i < bytes.len() {
        if bytes[i] == b'%' && i + 2 < bytes.len() {
            let hex = |b: u8| (b as char).to_digit(16);
            if let (Some(h), Some(l)) = (hex(bytes[i + 1]), hex(bytes[i + 2])) {
                out.push((h * 16 + l) as u8);
                i += 3;
                continue;
            }
        }
        out.push(bytes[i]);
        i += 1;
    }
    String::from_utf8_lossy(&out).into_owned()
}

fn mime(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()).unwrap_or("") {
        "html" => "text/html; charset=utf-8",
        "js" | "mjs" => "text/javascript; charset=utf-8",
        "wasm" => "application/wasm",
        "css" => "text/css; charset=utf-8",
        "json" => "application/json",
        "webmanifest" => "application/manifest+json",
        "svg" => "image/svg+xml",
        "png" => "image/png",
        "ico" => "image/x-icon",
        "txt" => "text/plain; charset=utf-8",
        _ => "application/octet-stream",
    }
}

fn respond(
    stream: &mut TcpStream,
    status: u16,
    ctype: &str,
    body: &[u8],
    head_only: bool,
) -> std::io::Result<()> {
    let reason = match status {
        200 => "OK",
        404 => "Not Found",
        405 => "Method Not Allowed",
        _ => "Error",
    };
    let header = format!(
        "HTTP/1.1 {status} {reason}\r\nContent-Type: {ctype}\r\nContent-Length: {}\r\nCache-Control: no-cache\r\nX-Content-Type-Options: nosniff\r\nConnection: close\r\n\r\n",
        body.len()
    );
    stream.write_all(header.as_bytes())?;
    if !head_only {
        stream.write_all(body)?;
    }
    stream.flush()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn resolve_refuses_parent_segments() {
        let root = std::env::temp_dir();
        assert!(resolve(&root, "/../etc/passwd").is_none());
    }

    #[test]
    fn percent_decoding_handles_escapes_and_stray_percent() {
        assert_eq!(percent_decode("a%20b"), "a b");
        assert_eq!(percent_decode("100%"), "100%");
    }
}
