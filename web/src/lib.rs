//! Joulewise in the browser: the assessment sheet. Components format what
//! `joulewise_core` returns and compute nothing physical themselves.
#![forbid(unsafe_code)]

pub mod field;

use field::QuantityField;
use joulewise_core::spring::linear::{LinearSpec, LinearSpring};
use joulewise_core::spring::{Spring, Travel};
use joulewise_core::units::{self, Dim, UnitSystem};
use leptos::prelude::*;

/// Stored energy between two deflections of a linear spring, as text for the
/// sheet, or the reasons it cannot be computed.
pub fn stored_energy_text(rate: &str, from: &str, to: &str) -> Result<String, Vec<String>> {
    let mut problems = Vec::new();
    let mut read = |text: &str, dim: Dim, unit: &str, field: &str| {
        units::parse_quantity(text, dim, unit)
            .map_err(|e| problems.push(format!("{field}: {}", e.message(dim))))
            .ok()
    };
    let k = read(rate, Dim::LinearRate, "N/mm", "Spring rate");
    let x1 = read(from, Dim::Length, "mm", "Deflection, released");
    let x2 = read(to, Dim::Length, "mm", "Deflection, latched");
    let (Some(k), Some(x1), Some(x2)) = (k, x1, x2) else {
        return Err(problems);
    };
    let spec = LinearSpec {
        rate: k,
        free_length: None,
        max_deflection: Some(x1.abs().max(x2.abs()).max(f64::MIN_POSITIVE)),
        solid_length: None,
    };
    let spring =
        LinearSpring::new(spec).map_err(|e| vec![format!("Spring rate: {}", e.message())])?;
    // Energy given back between the latched and released deflections.
    let e = spring.work(x1, x2, Travel::Unloading);
    Ok(units::format_quantity(e, Dim::Energy, UnitSystem::Si).to_string())
}

/// The page.
#[component]
pub fn App() -> impl IntoView {
    let rate = RwSignal::new(String::from("3 N/mm"));
    let from = RwSignal::new(String::from("10 mm"));
    let to = RwSignal::new(String::from("40 mm"));
    let energy = Memo::new(move |_| stored_energy_text(&rate.get(), &from.get(), &to.get()));
    view! {
        <main>
            <h1>"Joulewise"</h1>
            <QuantityField id="rate" label="Spring rate" dim=Dim::LinearRate unit="N/mm" text=rate />
            <QuantityField id="x-released" label="Deflection, released" dim=Dim::Length unit="mm" text=from />
            <QuantityField id="x-latched" label="Deflection, latched" dim=Dim::Length unit="mm" text=to />
            <section aria-live="polite">
                <h2>"Energy released"</h2>
                {move || match energy.get() {
                    Ok(text) => view! { <p id="energy" class="figure-value">{text}</p> }.into_any(),
                    Err(reasons) => view! {
                        <p id="energy" class="figure-missing">
                            "Cannot compute: " {reasons.join("; ")}
                        </p>
                    }.into_any(),
                }}
            </section>
        </main>
    }
}
