//! The unit system figures are shown in (SI or US customary), held in a
//! context newtype so every figure, check and plot follows one switch. The
//! switch changes display only: what the user typed is never rewritten.

use crate::bind::Binding;
use joulewise_core::units::{self, Dim, Formatted, UnitSystem};
use leptos::prelude::*;

/// App-wide display unit system, provided once at the top of the page.
#[derive(Clone, Copy)]
pub struct DisplaySystem(pub Binding<UnitSystem>);

impl DisplaySystem {
    /// Create a setting of its own and provide it to every component below.
    pub fn provide(initial: UnitSystem) -> Self {
        Self::provide_bound(RwSignal::new(initial).into())
    }

    /// Provide a setting kept elsewhere (the scenario's display units).
    pub fn provide_bound(b: Binding<UnitSystem>) -> Self {
        let s = Self(b);
        provide_context(s);
        s
    }

    /// The setting provided above, or SI when a component is mounted alone
    /// (a test): never a panic.
    pub fn expect() -> Self {
        use_context::<Self>().unwrap_or_else(|| Self(RwSignal::new(UnitSystem::Si).into()))
    }

    /// Current system (tracked).
    pub fn get(self) -> UnitSystem {
        self.0.get()
    }

    /// Change the system.
    pub fn set(self, u: UnitSystem) {
        self.0.set(u)
    }

    /// Format an SI value of kind `dim` in the current system (tracked).
    pub fn format(self, si: f64, dim: Dim) -> Formatted {
        units::format_quantity(si, dim, self.get())
    }

    /// Symbol of the working unit of `dim` in the current system (tracked).
    pub fn unit(self, dim: Dim) -> &'static str {
        units::display_unit(dim, self.get()).symbol
    }
}

/// The SI / US customary switch: a pair of radio buttons, each a 44 px
/// target, with a visible legend.
#[component]
pub fn SystemSwitch() -> impl IntoView {
    let sys = DisplaySystem::expect();
    let choice = move |value: UnitSystem, id: &'static str, text: &'static str| {
        view! {
            <label class="seg" for=id>
                <input
                    type="radio"
                    id=id
                    name="display-system"
                    prop:checked=move || sys.get() == value
                    on:change=move |_| sys.set(value)
                />
                <span>{text}</span>
            </label>
        }
    };
    view! {
        <fieldset class="system-switch">
            <legend>"Figures in"</legend>
            {choice(UnitSystem::Si, "units-si", "SI")}
            {choice(UnitSystem::Us, "units-us", "US customary")}
        </fieldset>
    }
}
