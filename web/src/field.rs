//! A field for a quantity with units: a text input that keeps exactly what
//! the user typed, a unit chooser beside it (so a tablet user can type
//! digits on a numeric keypad and pick the unit), an optional ± tolerance
//! with its spread, and a message at the field naming what is acceptable.
//!
//! The text is the state; nothing rewrites it while the user types. Only
//! the unit chooser writes it, and then only the unit part: `12,5 mm` with
//! `in` chosen becomes `12,5 in` (the number is kept as typed, not
//! converted). Parsing and messages are the core's ([`units::parse_quantity`],
//! [`units::UnitError::message`], [`parse_tolerance`]); this module only
//! splits the text into its number and unit parts.

use crate::bind::Binding;
use crate::system::DisplaySystem;
use joulewise_core::scenario::value::{parse_tolerance, Spread};
use joulewise_core::units::{self, Dim, Unit};
use leptos::html;
use leptos::prelude::*;

/// Split typed text into its number part and its unit part, both trimmed:
/// `" 12,5 mm"` → `("12,5", "mm")`, `"-3e2N"` → `("-3e2", "N")`, `"mm"` →
/// `("", "mm")`. A digit group after a space that is not itself a unit stays
/// with the number (`"12 500 N"` → `("12 500", "N")`), so choosing a unit
/// never drops digits the user typed; the parser then says why the grouping
/// is refused.
pub fn split_number(text: &str) -> (&str, &str) {
    let start = text.len() - text.trim_start().len();
    let rest = &text[start..];
    let mut end = 0;
    let mut saw_digit = false;
    let mut chars = rest.char_indices().peekable();
    if let Some(&(_, c)) = chars.peek() {
        if matches!(c, '+' | '-' | '−') {
            chars.next();
            end = c.len_utf8();
        }
    }
    while let Some(&(i, c)) = chars.peek() {
        if c.is_ascii_digit() || c == '.' || c == ',' {
            saw_digit |= c.is_ascii_digit();
            end = i + c.len_utf8();
            chars.next();
        } else {
            break;
        }
    }
    if saw_digit {
        end = exponent_end(rest, end);
    } else {
        return ("", text.trim());
    }
    // A digit group after a space that is not a unit (`12 500 N`).
    loop {
        let after = &rest[end..];
        let trimmed = after.trim_start();
        let starts_digit = trimmed.starts_with(|c: char| c.is_ascii_digit());
        if !starts_digit || units::find_any(trimmed.trim_end()).next().is_some() {
            break;
        }
        let skipped = after.len() - trimmed.len();
        let group = trimmed
            .find(|c: char| !(c.is_ascii_digit() || c == '.' || c == ','))
            .unwrap_or(trimmed.len());
        end += skipped + group;
    }
    (rest[..end].trim(), rest[end..].trim())
}

/// End of an exponent `e±digits` starting at byte `at`, or `at` when the
/// letter there does not start one (so `2 eV`-like units are left alone).
fn exponent_end(rest: &str, at: usize) -> usize {
    let tail = &rest[at..];
    let Some(after_e) = tail.strip_prefix(['e', 'E']) else {
        return at;
    };
    let after_sign = after_e.strip_prefix(['+', '-']).unwrap_or(after_e);
    let digits = after_sign.bytes().take_while(u8::is_ascii_digit).count();
    if digits == 0 {
        return at;
    }
    at + (tail.len() - after_sign.len()) + digits
}

/// The text with its unit part replaced by `unit`, the number kept exactly
/// as typed: `with_unit("12,5 mm", in)` → `"12,5 in"`; `"90 rad"` with `°`
/// → `"90°"`; an empty number gives the unit alone.
pub fn with_unit(text: &str, unit: &Unit) -> String {
    let (number, _) = split_number(text);
    match (number.is_empty(), unit.symbol) {
        (_, "") => number.to_string(),
        (true, symbol) => symbol.to_string(),
        (false, "°") => format!("{number}°"),
        (false, symbol) => format!("{number} {symbol}"),
    }
}

/// Index in [`units::units_of`]`(dim)` of the unit the text is written in
/// (the field's default unit for a bare number), or `None` when the unit
/// part names no unit of this kind.
pub fn unit_index(text: &str, dim: Dim, default_unit: &str) -> Option<usize> {
    let (_, unit_text) = split_number(text);
    let wanted = if unit_text.is_empty() {
        default_unit
    } else {
        unit_text
    };
    let found = units::find_in(dim, wanted)?;
    units::units_of(dim).position(|u| u.symbol == found.symbol)
}

/// What the chooser shows for a unit.
fn option_text(u: &Unit) -> &'static str {
    if u.symbol.is_empty() {
        "plain"
    } else {
        u.symbol
    }
}

/// A labelled quantity input with unit chooser, optional tolerance and an
/// inline message. Ids: `{id}` (text), `{id}-unit`, `{id}-error`,
/// `{id}-reads`, `{id}-tol`, `{id}-spread`, `{id}-tol-error`.
#[component]
pub fn QuantityField(
    /// Element id of the text input (also the label's `for`).
    #[prop(into)]
    id: String,
    /// Label text, in plain words of the trade.
    #[prop(into)]
    label: String,
    /// Expected kind of quantity.
    dim: Dim,
    /// Unit of a bare number (a spelling from the unit table for `dim`).
    unit: &'static str,
    /// The text as typed (never rewritten except by the unit chooser).
    #[prop(into)]
    text: Binding<String>,
    /// Tolerance text as typed (`±5 %`, `0.2 mm`); shows the tolerance row.
    #[prop(optional, into)]
    tol: Option<Binding<String>>,
    /// Spread of the tolerance in the tolerance study.
    #[prop(optional, into)]
    spread: Option<Binding<Spread>>,
    /// A problem the model found with this input (e.g. "must be greater
    /// than zero"), shown when the text itself reads well.
    #[prop(optional, into)]
    problem: MaybeProp<String>,
    /// Offer the unit chooser (default on).
    #[prop(default = true)]
    unit_choice: bool,
    /// Show the tolerance row even when no tolerance is entered (a field
    /// with a tolerance always shows it).
    #[prop(optional, into)]
    show_tol: MaybeProp<bool>,
    /// One line of help under the label (what to measure, what a blank
    /// means); none when empty.
    #[prop(optional)]
    help: &'static str,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let input_ref = NodeRef::<html::Input>::new();

    // Blank text is the core's to judge (blank is fine for an optional
    // input, "a value is required" for a required one).
    let parse_error = Memo::new(move |_| {
        let t = text.get();
        if t.trim().is_empty() {
            return None;
        }
        units::parse_quantity(&t, dim, unit)
            .err()
            .map(|e| e.message(dim))
    });
    let message = Memo::new(move |_| parse_error.get().or_else(|| problem.get()));
    let invalid = move || message.with(Option::is_some).to_string();
    // What the text reads as in the display system, when written otherwise.
    let reads = Memo::new(move |_| {
        let (si, typed) = units::parse_with_unit(&text.get(), dim, unit).ok()?;
        let shown = units::display_unit(dim, sys.get());
        (typed.symbol != shown.symbol).then(|| format!("= {}", units::format_in(si, shown)))
    });
    let current_unit = Memo::new(move |_| unit_index(&text.get(), dim, unit));
    // For print, where the controls are hidden: the text with its unit.
    let printed = move || {
        let t = text.get();
        let (number, unit_part) = split_number(&t);
        match (
            unit_part.is_empty() && !number.is_empty(),
            units::find_in(dim, unit),
        ) {
            (true, Some(u)) if !u.symbol.is_empty() => with_unit(&t, u),
            _ => t,
        }
    };

    // The DOM input follows the state only when they differ (a unit chosen,
    // a demo loaded): never while the user types, so the caret and the
    // typed characters are never disturbed (TOOLCHAIN pitfall 6).
    Effect::new(move |_| {
        let t = text.get();
        if let Some(el) = input_ref.get() {
            if el.value() != t {
                el.set_value(&t);
            }
        }
    });

    let choose_unit = move |ev: leptos::ev::Event| {
        let Ok(i) = event_target_value(&ev).parse::<usize>() else {
            return;
        };
        let Some(u) = units::units_of(dim).nth(i) else {
            return;
        };
        let new = with_unit(&text.get_untracked(), u);
        let number_missing = split_number(&new).0.is_empty();
        if let Some(el) = input_ref.get_untracked() {
            el.set_value(&new);
            if number_missing {
                // Unit picked first: put the caret before it for the digits.
                let _ = el.focus();
                let _ = el.set_selection_range(0, 0);
            }
        }
        text.set(new);
    };

    let err_id = format!("{id}-error");
    let reads_id = format!("{id}-reads");
    let unit_id = format!("{id}-unit");
    let help_id = format!("{id}-help");
    let described = if help.is_empty() {
        format!("{err_id} {reads_id}")
    } else {
        format!("{help_id} {err_id} {reads_id}")
    };
    let chooser = unit_choice.then(|| {
        let options = units::units_of(dim)
            .enumerate()
            .map(|(i, u)| {
                view! {
                    <option value=i.to_string() prop:selected=move || current_unit.get() == Some(i)>
                        {option_text(u)}
                    </option>
                }
            })
            .collect_view();
        view! {
            <select
                id=unit_id.clone()
                class="qty-unit"
                aria-label=format!("Unit of {label}")
                on:change=choose_unit
            >
                <option value="" disabled=true prop:selected=move || current_unit.get().is_none()>
                    "unit?"
                </option>
                {options}
            </select>
        }
    });

    let tol_row = tol.map(|tol| {
        let visible =
            Signal::derive(move || show_tol.get().unwrap_or(false) || !tol.get().trim().is_empty());
        tolerance_row(&id, &label, dim, unit, tol, spread, visible)
    });
    let initial = text.get_untracked();

    view! {
        <div class="field" data-invalid=invalid>
            <label for=id.clone()>{label.clone()}</label>
            <p class="field-help" id=help_id hidden=help.is_empty()>{help}</p>
            <div class="qty">
                <input
                    node_ref=input_ref
                    id=id.clone()
                    class="qty-text"
                    type="text"
                    inputmode="decimal"
                    autocomplete="off"
                    autocapitalize="off"
                    spellcheck="false"
                    value=initial
                    aria-invalid=invalid
                    aria-describedby=described
                    on:input=move |ev| text.set(event_target_value(&ev))
                />
                {chooser}
            </div>
            <p class="qty-print">{printed}</p>
            <p class="field-reads" id=reads_id>{move || reads.get()}</p>
            <p class="field-error" id=err_id aria-live="polite">{move || message.get()}</p>
            {tol_row}
        </div>
    }
}

/// The ± tolerance input and its spread chooser.
fn tolerance_row(
    id: &str,
    label: &str,
    dim: Dim,
    unit: &'static str,
    tol: Binding<String>,
    spread: Option<Binding<Spread>>,
    visible: Signal<bool>,
) -> impl IntoView {
    let tol_id = format!("{id}-tol");
    let err_id = format!("{id}-tol-error");
    let error = Memo::new(move |_| parse_tolerance(&tol.get(), dim, unit).err());
    let invalid = move || error.with(Option::is_some).to_string();
    let spread_view = spread.map(|spread| {
        let spread_id = format!("{id}-spread");
        let pick = move |ev: leptos::ev::Event| {
            spread.set(match event_target_value(&ev).as_str() {
                "normal" => Spread::Normal,
                _ => Spread::Uniform,
            })
        };
        view! {
            <span class="tol-pair" hidden=move || tol.get().trim().is_empty()>
                <label for=spread_id.clone()>"spread"</label>
                <select id=spread_id aria-label=format!("spread of the tolerance of {label}") on:change=pick>
                    <option value="uniform" prop:selected=move || spread.get() == Spread::Uniform>
                        "even"
                    </option>
                    <option value="normal" prop:selected=move || spread.get() == Spread::Normal>
                        "bell, band = 3σ"
                    </option>
                </select>
                <span class="print-only">
                    {move || match spread.get() {
                        Spread::Uniform => "even",
                        Spread::Normal => "bell, band = 3σ",
                    }}
                </span>
            </span>
        }
    });
    let input_ref = NodeRef::<html::Input>::new();
    Effect::new(move |_| {
        let t = tol.get();
        if let Some(el) = input_ref.get() {
            if el.value() != t {
                el.set_value(&t);
            }
        }
    });
    let initial = tol.get_untracked();
    view! {
        <div class="tol" data-invalid=invalid hidden=move || !visible.get()>
            <span class="tol-pair">
            <label for=tol_id.clone()>"± tolerance"</label>
            <input
                node_ref=input_ref
                id=tol_id
                type="text"
                inputmode="decimal"
                autocomplete="off"
                spellcheck="false"
                placeholder="none"
                value=initial
                aria-label=format!("± tolerance of {label}")
                aria-invalid=invalid
                aria-describedby=err_id.clone()
                on:input=move |ev| tol.set(event_target_value(&ev))
            />
            </span>
            {spread_view}
        </div>
        <p class="field-error" id=err_id aria-live="polite">{move || error.get()}</p>
    }
}
