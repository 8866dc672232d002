//! The sheet's controls, each bound to one member of the scenario: a
//! quantity field by input path ([`qty`]), a choice among the variants of
//! an enum ([`choice`] with [`enum_binding`]), plain text, a tick box, a
//! whole-number count, and the add/remove buttons of lists; and the few
//! containers the sections are built from ([`block`], [`section`], [`sub`],
//! [`switch`], [`when`], [`list`]).
//!
//! Why so few shapes: every distinct Leptos view shape and every reactive
//! closure compiles to rendering code of its own. Written as calls to these
//! functions (children as `Vec<AnyView>`, variable parts as boxed closures),
//! the many fields of the sheet share one copy of that code, which keeps
//! the WebAssembly within its size budget. Element ids come from the
//! input's path ([`field_dom_id`]), and the core's message for that path
//! shows at the control.

use crate::bind::Binding;
use crate::field::QuantityField;
use crate::labels::{field_dom_id, help_of, label_of};
use crate::state::Sheet;
use joulewise_core::scenario::resolve::default_unit;
use joulewise_core::scenario::Scenario;
use joulewise_core::units::Dim;
use leptos::html;
use leptos::prelude::*;
use std::sync::Arc;

/// Children of a container.
pub type Views = Vec<AnyView>;

/// Builds the children of a variant by its key.
pub type Build = Arc<dyn Fn(&'static str) -> Views + Send + Sync>;

/// Builds the row `i` of a list.
pub type Row = Arc<dyn Fn(usize) -> AnyView + Send + Sync>;

type Getter<T> = Arc<dyn Fn(&mut Scenario) -> Option<T> + Send + Sync>;
type Setter<T> = Arc<dyn Fn(&mut Scenario, T) + Send + Sync>;

/// A quantity field for the input at `path`, labelled from the label table.
pub fn qty(path: impl Into<String>, dim: Dim) -> AnyView {
    let path = path.into();
    let label = label_of(&path);
    qty_labelled(path, label, dim)
}

/// A quantity field for the input at `path` with a label of its own.
pub fn qty_labelled(path: String, label: String, dim: Dim) -> AnyView {
    let sheet = Sheet::get();
    let (text, tol, spread) = sheet.value(&path);
    let problem = sheet.problem(&path, Some(text));
    let show_tol: Signal<bool> = sheet.show_tol.into();
    view! {
        <QuantityField
            id=field_dom_id(&path)
            label=label
            dim=dim
            unit=default_unit(dim)
            text=text
            tol=tol
            spread=spread
            problem=problem
            show_tol=show_tol
            help=help_of(&path)
        />
    }
    .into_any()
}

/// A binding read through a memo (so what follows it changes only when the
/// value does) and written into the scenario.
pub fn bind<T: Clone + PartialEq + Send + Sync + 'static>(
    get: impl Fn(&mut Scenario) -> Option<T> + Send + Sync + 'static,
    set: impl Fn(&mut Scenario, T) + Send + Sync + 'static,
    default: T,
) -> Binding<T> {
    bind_dyn(Arc::new(get), Arc::new(set), default)
}

fn bind_dyn<T: Clone + PartialEq + Send + Sync + 'static>(
    get: Getter<T>,
    set: Setter<T>,
    default: T,
) -> Binding<T> {
    let sheet = Sheet::get();
    let read = Memo::new(move |_| {
        sheet
            .peek(|s| get(s))
            .flatten()
            .unwrap_or_else(|| default.clone())
    });
    Binding::new(
        move || read.get(),
        move |v| sheet.scenario.update(|s| set(s, v)),
    )
}

/// A binding to the variant of an enum in the scenario, by key. Choosing
/// another variant keeps the one left in a stash, so choosing it again
/// brings back what was typed there; a variant never chosen before starts
/// blank (`make`).
pub fn enum_binding<E: Send + Sync + 'static>(
    at: impl Fn(&mut Scenario) -> Option<&mut E> + Send + Sync + 'static,
    kind: fn(&E) -> &'static str,
    make: fn(&str) -> E,
) -> Binding<&'static str> {
    let stash: StoredValue<Vec<E>> = StoredValue::new(Vec::new());
    let at = Arc::new(at);
    let at2 = at.clone();
    bind(
        move |s| at(s).map(|e| kind(e)),
        move |s, key: &'static str| {
            if let Some(e) = at2(s) {
                if kind(e) == key {
                    return;
                }
                let fresh = stash
                    .try_update_value(|st| {
                        st.iter()
                            .position(|x| kind(x) == key)
                            .map(|i| st.swap_remove(i))
                    })
                    .flatten()
                    .unwrap_or_else(|| make(key));
                let old = std::mem::replace(e, fresh);
                stash.update_value(|st| st.push(old));
            }
        },
        "",
    )
}

/// Children in a `<div class=class>`.
pub fn block(class: &'static str, children: Views) -> AnyView {
    view! { <div class=class>{children}</div> }.into_any()
}

/// An input section.
pub fn section(id: &'static str, title: &'static str, children: Views) -> AnyView {
    view! {
        <fieldset class="section" id=id>
            <legend><h2>{title}</h2></legend>
            {children}
        </fieldset>
    }
    .into_any()
}

/// A titled part of a section.
pub fn sub(title: &'static str, children: Views) -> AnyView {
    view! {
        <div class="sub">
            <h3 class="sub-title">{title}</h3>
            {children}
        </div>
    }
    .into_any()
}

/// A framed group inside a section (a member spring, a limit of one's own).
pub fn group(title: String, children: Views) -> AnyView {
    view! {
        <fieldset class="member">
            <legend>{title}</legend>
            {children}
        </fieldset>
    }
    .into_any()
}

/// A short explanation.
pub fn hint(text: &'static str) -> AnyView {
    view! { <p class="hint">{text}</p> }.into_any()
}

/// The children for the variant chosen in `key`, rebuilt only when the
/// variant changes.
pub fn switch(key: Binding<&'static str>, build: Build) -> AnyView {
    (move || build(key.get())).into_any()
}

/// The children while `on` holds.
pub fn when(on: Binding<bool>, build: Arc<dyn Fn() -> Views + Send + Sync>) -> AnyView {
    (move || if on.get() { build() } else { Vec::new() }).into_any()
}

/// Rows `0..n`, rebuilt when rows come or go.
pub fn list(n: Binding<usize>, row: Row) -> AnyView {
    (move || (0..n.get()).map(|i| row(i)).collect::<Views>()).into_any()
}

/// A binding to a length or another count of the scenario (read only).
pub fn length(
    get: impl Fn(&mut Scenario) -> Option<usize> + Send + Sync + 'static,
) -> Binding<usize> {
    bind(get, |_, _| {}, 0)
}

/// A flag of the scenario (read only), e.g. whether the part is hinged.
pub fn flag(get: impl Fn(&mut Scenario) -> Option<bool> + Send + Sync + 'static) -> Binding<bool> {
    bind(get, |_, _| {}, false)
}

/// A labelled choice (a `<select>`) among `options` (key, words).
pub fn choice<W: Into<String>>(
    id: impl Into<String>,
    label: impl Into<String>,
    options: Vec<(&'static str, W)>,
    value: Binding<&'static str>,
) -> AnyView {
    choice_of(
        id.into(),
        label.into(),
        options.into_iter().map(|(k, w)| (k, w.into())).collect(),
        value,
    )
}

fn choice_of(
    id: String,
    label: String,
    options: Vec<(&'static str, String)>,
    value: Binding<&'static str>,
) -> AnyView {
    let sheet = Sheet::get();
    let path = id.trim_start_matches("f-").replace('-', ".");
    let problem = sheet.problem(&path, None);
    let err_id = format!("{id}-error");
    let keys: Vec<&'static str> = options.iter().map(|o| o.0).collect();
    let pick = move |ev: leptos::ev::Event| {
        if let Some(k) = event_target_value(&ev)
            .parse::<usize>()
            .ok()
            .and_then(|i| keys.get(i))
        {
            value.set(k);
        }
    };
    let words: Vec<String> = options.iter().map(|o| o.1.clone()).collect();
    let printed = {
        let keys: Vec<&'static str> = options.iter().map(|o| o.0).collect();
        move || {
            let k = value.get();
            keys.iter()
                .position(|x| *x == k)
                .and_then(|i| words.get(i).cloned())
                .unwrap_or_default()
        }
    };
    let opts = options
        .into_iter()
        .enumerate()
        .map(|(i, (k, words))| {
            view! { <option value=i.to_string() prop:selected=move || value.get() == k>{words}</option> }
        })
        .collect_view();
    view! {
        <div class="field">
            <label for=id.clone()>{label}</label>
            <select id=id class="choice" on:change=pick aria-describedby=err_id.clone()>{opts}</select>
            <p class="qty-print">{printed}</p>
            <p class="field-error" id=err_id aria-live="polite">{move || problem.get()}</p>
        </div>
    }
    .into_any()
}

/// A labelled line (or box, `multiline`) of plain text: identity, names,
/// sources. The text is kept as typed.
pub fn text_line(id: String, label: String, value: Binding<String>, multiline: bool) -> AnyView {
    let printed = move || value.get();
    let input = if multiline {
        let r = NodeRef::<html::Textarea>::new();
        Effect::new(move |_| {
            let t = value.get();
            if let Some(el) = r.get() {
                if el.value() != t {
                    el.set_value(&t);
                }
            }
        });
        view! {
            <textarea node_ref=r id=id.clone() rows="3" on:input=move |ev| value.set(event_target_value(&ev))>
                {value.get_untracked()}
            </textarea>
        }
        .into_any()
    } else {
        let r = NodeRef::<html::Input>::new();
        Effect::new(move |_| {
            let t = value.get();
            if let Some(el) = r.get() {
                if el.value() != t {
                    el.set_value(&t);
                }
            }
        });
        view! {
            <input node_ref=r type="text" id=id.clone() autocomplete="off" value=value.get_untracked()
                on:input=move |ev| value.set(event_target_value(&ev)) />
        }
        .into_any()
    };
    view! {
        <div class="field">
            <label for=id>{label}</label>
            {input}
            <p class="qty-print">{printed}</p>
        </div>
    }
    .into_any()
}

/// A tick box with its label.
pub fn tick(id: impl Into<String>, label: impl Into<String>, value: Binding<bool>) -> AnyView {
    let id: String = id.into();
    let for_id = id.clone();
    view! {
        <label class="check-option" for=for_id>
            <input
                type="checkbox"
                id=id
                prop:checked=move || value.get()
                on:change=move |ev| value.set(event_target_checked(&ev))
            />
            <span>{label.into()}</span>
        </label>
    }
    .into_any()
}

/// A whole number from `min` to `max` (discs in a stack, buffers, samples).
/// The text is kept as typed; the scenario takes it when it reads.
pub fn count(id: String, label: String, value: Binding<u32>, min: u32, max: u32) -> AnyView {
    let text = RwSignal::new(value.get_untracked().to_string());
    let r = NodeRef::<html::Input>::new();
    // A new scenario (a demo loaded) shows its own count.
    Effect::new(move |_| {
        let v = value.get();
        if text.get_untracked().trim().parse::<u32>().ok() != Some(v) {
            let t = v.to_string();
            text.set(t.clone());
            if let Some(el) = r.get() {
                el.set_value(&t);
            }
        }
    });
    let problem = move || {
        let t = text.get();
        match t.trim().parse::<u32>() {
            Ok(v) if (min..=max).contains(&v) => None,
            _ => Some(format!("a whole number from {min} to {max}")),
        }
    };
    let invalid = move || problem().is_some().to_string();
    let err_id = format!("{id}-error");
    view! {
        <div class="field" data-invalid=invalid>
            <label for=id.clone()>{label}</label>
            <input
                node_ref=r
                type="text"
                inputmode="numeric"
                class="count"
                id=id.clone()
                autocomplete="off"
                value=text.get_untracked()
                aria-invalid=invalid
                aria-describedby=err_id.clone()
                on:input=move |ev| {
                    let t = event_target_value(&ev);
                    if let Ok(v) = t.trim().parse::<u32>() {
                        if (min..=max).contains(&v) {
                            value.set(v);
                        }
                    }
                    text.set(t);
                }
            />
            <p class="qty-print">{move || text.get()}</p>
            <p class="field-error" id=err_id aria-live="polite">{problem}</p>
        </div>
    }
    .into_any()
}

/// A button that does something to the scenario (add or remove a row).
pub fn action(
    id: String,
    words: String,
    f: impl Fn(&mut Scenario) + Send + Sync + 'static,
) -> AnyView {
    action_dyn(id, words, Arc::new(move |s: &mut Scenario, _: ()| f(s)))
}

fn action_dyn(id: String, words: String, f: Setter<()>) -> AnyView {
    let sheet = Sheet::get();
    view! {
        <button type="button" id=id class="small" on:click=move |_| sheet.scenario.update(|s| f(s, ()))>{words}</button>
    }
    .into_any()
}
