//! A text field for a quantity with units: keeps exactly what the user typed,
//! and shows at the field what is wrong and what would be acceptable.

use joulewise_core::units::{self, Dim};
use leptos::prelude::*;

/// A labelled input for a quantity of `dim`; bare numbers are in `unit`.
#[component]
pub fn QuantityField(
    /// Element id (also the label's `for`).
    id: &'static str,
    /// Label text.
    label: &'static str,
    /// Expected kind of quantity.
    dim: Dim,
    /// Unit of a bare number.
    unit: &'static str,
    /// The text as typed (never rewritten by the app).
    text: RwSignal<String>,
) -> impl IntoView {
    let error = Memo::new(move |_| {
        units::parse_quantity(&text.get(), dim, unit)
            .err()
            .map(|e| e.message(dim))
    });
    let err_id = format!("{id}-error");
    let initial = text.get_untracked();
    view! {
        <div class="field" data-invalid=move || error.get().is_some().to_string()>
            <label for=id>{label}" "<span class="unit-hint">"("{unit}")"</span></label>
            <input
                id=id
                type="text"
                inputmode="decimal"
                autocomplete="off"
                spellcheck="false"
                value=initial
                aria-invalid=move || error.get().is_some().to_string()
                aria-describedby=err_id.clone()
                on:input=move |ev| text.set(event_target_value(&ev))
            />
            <p class="field-error" id=err_id role="status">{move || error.get()}</p>
        </div>
    }
}
