//! Markup written as text for the output-only parts of the sheet (figure
//! values, checks, cautions, plots), set with `inner_html`.
//!
//! Why text: every distinct Leptos view shape compiles to its own generic
//! rendering code, and the output parts have many shapes; written as text
//! they cost a few string writes each, which keeps the WebAssembly within its
//! size budget. Inputs and anything holding user state (fields, the unit
//! switch, disclosures) stay Leptos views. Everything from outside the
//! program's own literals, core texts included, passes through [`esc`].

use joulewise_core::units::{render, UnitSystem};
use std::fmt::Write;

/// `s` with `& < > " '` escaped, safe in element text and in quoted
/// attribute values.
pub fn esc(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 8);
    push_esc(&mut out, s);
    out
}

/// Append `s` to `out`, escaped as by [`esc`].
pub fn push_esc(out: &mut String, s: &str) {
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
}

/// Append `<tag class="class">text</tag>` with `text` escaped.
pub fn push_el(out: &mut String, tag: &str, class: &str, text: &str) {
    if class.is_empty() {
        let _ = write!(out, "<{tag}>");
    } else {
        let _ = write!(out, "<{tag} class=\"{class}\">");
    }
    push_esc(out, text);
    let _ = write!(out, "</{tag}>");
}

/// Append a text from the core, escaped, with the quantities it carries
/// ([`joulewise_core::units::tag`]) written in `sys`.
pub fn push_text(out: &mut String, s: &str, sys: UnitSystem) {
    push_esc(out, &render(s, sys));
}

/// Append a `<ul class="class">` of texts from the core, as by
/// [`push_text`] (nothing when empty).
pub fn push_list<'a>(
    out: &mut String,
    class: &str,
    items: impl IntoIterator<Item = &'a String>,
    sys: UnitSystem,
) {
    let mut items = items.into_iter().peekable();
    if items.peek().is_none() {
        return;
    }
    let _ = write!(out, "<ul class=\"{class}\">");
    for i in items {
        out.push_str("<li>");
        push_text(out, i, sys);
        out.push_str("</li>");
    }
    out.push_str("</ul>");
}
