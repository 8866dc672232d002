//! Quantities inside texts: a model that writes "the stroke 0.06 m is
//! shorter than…" into a note would show metres to a user who chose US
//! units. Texts therefore carry quantities as tags, `⟦0.06|length⟧` (SI
//! value, kind), written by [`tag`], and every front end shows a text through
//! [`render`], which formats each tag in the chosen unit system. A JSON
//! report keeps the tags, so a program reading it can do the same.

use super::{format_quantity, Dim, UnitSystem};
use std::borrow::Cow;

const OPEN: char = '⟦';
const CLOSE: char = '⟧';

/// A quantity for a text: SI value and kind, formatted later by [`render`].
pub fn tag(si: f64, dim: Dim) -> String {
    format!("{OPEN}{si}|{}{CLOSE}", dim.key())
}

/// The text with every tag formatted in `system` (4 significant figures);
/// a malformed tag is left as it is.
pub fn render(text: &str, system: UnitSystem) -> Cow<'_, str> {
    if !text.contains(OPEN) {
        return Cow::Borrowed(text);
    }
    let mut out = String::with_capacity(text.len());
    let mut rest = text;
    while let Some((before, tagged)) = rest.split_once(OPEN) {
        out.push_str(before);
        let Some((inner, after)) = tagged.split_once(CLOSE) else {
            out.push(OPEN);
            out.push_str(tagged);
            return Cow::Owned(out);
        };
        let parsed = inner.split_once('|').and_then(|(v, d)| {
            let v: f64 = v.parse().ok()?;
            Some((v, Dim::from_key(d)?))
        });
        match parsed {
            Some((v, d)) => out.push_str(&format_quantity(v, d, system).to_string()),
            None => {
                out.push(OPEN);
                out.push_str(inner);
                out.push(CLOSE);
            }
        }
        rest = after;
    }
    out.push_str(rest);
    Cow::Owned(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tags_render_in_either_system_and_plain_text_is_untouched() {
        let t = format!("stroke {} is short", tag(0.0254, Dim::Length));
        assert_eq!(render(&t, UnitSystem::Si), "stroke 25.4 mm is short");
        // 1 in = 25.4 mm exactly (NIST SP 811 B.8).
        assert_eq!(render(&t, UnitSystem::Us), "stroke 1 in is short");
        assert!(matches!(
            render("plain", UnitSystem::Us),
            Cow::Borrowed("plain")
        ));
    }

    #[test]
    fn malformed_tags_are_left_alone_and_never_panic() {
        for t in ["⟦", "⟦1|", "⟦x|length⟧", "a⟦1|nope⟧b", "⟦⟦1|length⟧"] {
            let _ = render(t, UnitSystem::Si);
        }
        assert_eq!(render("a⟦1|nope⟧b", UnitSystem::Si), "a⟦1|nope⟧b");
    }

    #[test]
    fn every_kind_round_trips_through_its_key() {
        for d in Dim::ALL {
            assert_eq!(Dim::from_key(d.key()), Some(d));
        }
    }
}
