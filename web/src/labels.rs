//! Labels of the scenario's inputs by their dotted path, from the core's
//! field catalogue ([`joulewise_core::scenario::fields`]), so the sheet, the
//! printed report and the CLI name a field the same way. The sheet adds only
//! what tells apart fields the catalogue describes alike: the member of a
//! combination, the buffer's own spring, the row of a table, the further
//! state, the limit of one's own. One function serves the field labels and
//! the reasons a figure is missing (`part.mass: a value is required` reads
//! `Moving mass: a value is required`, with a link to the field).

use joulewise_core::scenario::fields::{info, Coordinate};

/// Element id of the control for input `path` (`part.mass` → `f-part-mass`).
pub fn field_dom_id(path: &str) -> String {
    let mut id = String::with_capacity(path.len() + 2);
    id.push_str("f-");
    for c in path.chars() {
        id.push(if c == '.' { '-' } else { c });
    }
    id
}

/// One line of help for the input at `path` (what to measure, what a blank
/// means), or empty.
pub fn help_of(path: &str) -> &'static str {
    info(path, Coordinate::Linear).map_or("", |f| f.help)
}

/// Label of the input at `path`; the path itself when it is not known.
pub fn label_of(path: &str) -> String {
    if let Some(base) = path.strip_suffix(".tol") {
        return format!("{} (tolerance)", label_of(base));
    }
    let Some(f) = info(path, Coordinate::Linear) else {
        return control_label(path).unwrap_or_else(|| path.to_string());
    };
    let segs: Vec<&str> = path.split('.').collect();
    let mut prefix = String::new();
    if path.starts_with("contact.law.model") {
        prefix.push_str("Buffer spring, ");
    }
    for w in segs.windows(2) {
        let Ok(i) = w[1].parse::<usize>() else {
            continue;
        };
        let what = match w[0] {
            "members" => "member",
            "loading" | "unloading" => "point",
            "states" => "further state",
            "user" => "own limit",
            _ => continue,
        };
        prefix.push_str(&format!("{what} {}, ", i + 1));
    }
    if prefix.is_empty() {
        return f.label.to_string();
    }
    let mut out = String::with_capacity(prefix.len() + f.label.len());
    let mut chars = prefix.chars();
    if let Some(first) = chars.next() {
        out.extend(first.to_uppercase());
    }
    out.push_str(chars.as_str());
    let mut label = f.label.chars();
    if let Some(first) = label.next() {
        // "Member 2, spring rate": the label reads on in lower case, unless
        // it starts with a symbol or a name (two capitals, "EN", "Young's").
        let keep = label.as_str().starts_with(|c: char| c.is_uppercase()) || first == 'Y';
        if keep {
            out.push(first);
        } else {
            out.extend(first.to_lowercase());
        }
    }
    out.push_str(label.as_str());
    out
}

/// Labels of the choices and counts the core names in its messages.
fn control_label(path: &str) -> Option<String> {
    Some(match path {
        "contact.count" => "Identical buffers acting together".into(),
        "contact.specific_area" => "Specific area of the region".into(),
        "gap.body_parts" => "Body parts that can reach the gap".into(),
        "spring.mount.kind" => "How the spring is mounted".into(),
        "schema_version" => "Format version of the assessment".into(),
        p => {
            let i = p.strip_prefix("limits.user.")?.strip_suffix(".figure")?;
            format!("Own limit {}, figure", i.parse::<usize>().ok()? + 1)
        }
    })
}

/// A figure id in words when the report has no label for it
/// (`impact.peak_force` → `impact: peak force`).
pub fn humanise_id(id: &str) -> String {
    id.replacen('.', ": ", 1).replace('_', " ")
}
