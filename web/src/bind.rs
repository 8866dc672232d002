//! A two-way binding between a control and one piece of state: a read
//! signal and a write callback. A field bound to its own `RwSignal` and a
//! field bound to one member of a larger state (the scenario) look the same
//! to the component, so the components do not depend on how the sheet keeps
//! its state.

use leptos::prelude::*;

/// Read and write access to one value.
pub struct Binding<T: Send + Sync + 'static> {
    read: Signal<T>,
    write: Callback<T>,
}

impl<T: Send + Sync + 'static> Clone for Binding<T> {
    fn clone(&self) -> Self {
        *self
    }
}

impl<T: Send + Sync + 'static> Copy for Binding<T> {}

impl<T: Clone + Send + Sync + 'static> Binding<T> {
    /// A binding from a reader and a writer, e.g. one member of a larger
    /// state: `Binding::new(move || s.with(|s| s.rate.clone()), move |t| s.update(|s| s.rate = t))`.
    pub fn new(
        read: impl Fn() -> T + Send + Sync + 'static,
        write: impl Fn(T) + Send + Sync + 'static,
    ) -> Self {
        Self {
            read: Signal::derive(read),
            write: Callback::new(write),
        }
    }

    /// Current value (tracked).
    pub fn get(&self) -> T {
        self.read.get()
    }

    /// Current value (not tracked).
    pub fn get_untracked(&self) -> T {
        self.read.get_untracked()
    }

    /// Write a new value.
    pub fn set(&self, value: T) {
        self.write.run(value);
    }
}

impl<T: Clone + Send + Sync + 'static> From<RwSignal<T>> for Binding<T> {
    fn from(s: RwSignal<T>) -> Self {
        Self {
            read: s.into(),
            write: Callback::new(move |v| s.set(v)),
        }
    }
}
