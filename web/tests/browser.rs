//! In-browser tests of the sheet's building blocks (wasm-bindgen-test in
//! headless Chromium): run with
//! `cargo test --target wasm32-unknown-unknown -p joulewise-web`.
//!
//! Each component test mounts into its own fresh `<div>` with its own ids,
//! since all tests share one page.

// A panic in a test is a failed test, not a user-facing crash; the helpers
// below are not `#[test]` functions, so clippy's test allowance misses them.
#![allow(clippy::unwrap_used, clippy::expect_used)]

use joulewise_core::figure::{Figure, Provenance, SourceStatus, Verdict};
use joulewise_core::limits::{Check, Subject};
use joulewise_core::units::{self, Dim, UnitSystem};
use joulewise_web::bind::Binding;
use joulewise_web::check_row::{bar_geometry, check_html, utilisation_text};
use joulewise_web::field::{split_number, unit_index, with_unit, QuantityField};
use joulewise_web::figure_card::{figure_how_html, figure_value_html};
use joulewise_web::html::esc;
use joulewise_web::plot::{nice_ticks, tick_label};
use joulewise_web::trial::{compute, TrialInputs};
use leptos::prelude::*;
use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{Event, EventInit, HtmlElement, HtmlInputElement, HtmlSelectElement};

wasm_bindgen_test_configure!(run_in_browser);

fn doc() -> web_sys::Document {
    web_sys::window().unwrap().document().unwrap()
}

fn fresh_host() -> HtmlElement {
    let host: HtmlElement = doc().create_element("div").unwrap().unchecked_into();
    doc().body().unwrap().append_child(&host).unwrap();
    host
}

fn fire(el: &web_sys::EventTarget, kind: &str) {
    let init = EventInit::new();
    init.set_bubbles(true);
    el.dispatch_event(&Event::new_with_event_init_dict(kind, &init).unwrap())
        .unwrap();
}

fn input(id: &str) -> HtmlInputElement {
    doc().get_element_by_id(id).unwrap().unchecked_into()
}

fn text_of(id: &str) -> String {
    doc().get_element_by_id(id).unwrap().text_content().unwrap()
}

// ── Text helpers of the quantity field ─────────────────────────────────────

#[wasm_bindgen_test]
fn split_number_separates_number_and_unit_as_typed() {
    assert_eq!(split_number(" 12,5 mm "), ("12,5", "mm"));
    assert_eq!(split_number("-3e2N"), ("-3e2", "N"));
    assert_eq!(split_number("−0.5 in"), ("−0.5", "in"));
    assert_eq!(split_number("mm"), ("", "mm"));
    assert_eq!(split_number(""), ("", ""));
    assert_eq!(split_number("90°"), ("90", "°"));
    // A digit group stays with the number, so no typed digit is dropped.
    assert_eq!(split_number("12 500 N"), ("12 500", "N"));
    // A unit that starts with a digit is a unit.
    assert_eq!(split_number("5 1/min"), ("5", "1/min"));
    // An `e` not followed by digits is not an exponent.
    assert_eq!(split_number("3 e"), ("3", "e"));
}

#[wasm_bindgen_test]
fn with_unit_rewrites_only_the_unit_part() {
    let inch = units::find_in(Dim::Length, "in").unwrap();
    let deg = units::find_in(Dim::Angle, "°").unwrap();
    let mm = units::find_in(Dim::Length, "mm").unwrap();
    assert_eq!(with_unit("12,5 mm", inch), "12,5 in");
    assert_eq!(with_unit("12,5", inch), "12,5 in");
    assert_eq!(with_unit("1e-3   m", mm), "1e-3 mm");
    assert_eq!(with_unit("90 rad", deg), "90°");
    assert_eq!(with_unit("", mm), "mm");
}

#[wasm_bindgen_test]
fn unit_index_names_the_unit_typed_or_the_default() {
    let pos = |s: &str| units::units_of(Dim::Length).position(|u| u.symbol == s);
    assert_eq!(unit_index("3 in", Dim::Length, "mm"), pos("in"));
    assert_eq!(unit_index("3 inches", Dim::Length, "mm"), pos("in"));
    assert_eq!(unit_index("3", Dim::Length, "mm"), pos("mm"));
    assert_eq!(unit_index("3 kg", Dim::Length, "mm"), None);
}

// ── Quantity field component ───────────────────────────────────────────────

#[wasm_bindgen_test]
async fn field_keeps_the_typed_text_and_the_unit_chooser_rewrites_only_the_unit() {
    let text = RwSignal::new(String::from("12,5 mm"));
    let host = fresh_host();
    let _mounted = leptos::mount::mount_to(host, move || {
        view! { <QuantityField id="t1" label="Stroke" dim=Dim::Length unit="mm" text=text /> }
    });
    leptos::task::tick().await;
    let el = input("t1");
    assert_eq!(el.value(), "12,5 mm");

    // Typing keeps exactly what was typed (a half-typed number included).
    el.set_value("0.");
    fire(&el, "input");
    leptos::task::tick().await;
    assert_eq!(text.get_untracked(), "0.");
    assert_eq!(el.value(), "0.");
    el.set_value("0.25 in");
    fire(&el, "input");
    leptos::task::tick().await;
    assert_eq!(el.value(), "0.25 in");
    assert_eq!(text_of("t1-error"), "", "a valid length has no message");

    // Choosing `mm` rewrites the unit and keeps the number.
    let select: HtmlSelectElement = doc().get_element_by_id("t1-unit").unwrap().unchecked_into();
    let mm = units::units_of(Dim::Length)
        .position(|u| u.symbol == "mm")
        .unwrap();
    select.set_value(&mm.to_string());
    fire(&select, "change");
    leptos::task::tick().await;
    assert_eq!(text.get_untracked(), "0.25 mm");
    assert_eq!(el.value(), "0.25 mm");
}

#[wasm_bindgen_test]
async fn bad_input_is_marked_at_the_field_with_what_is_acceptable() {
    let text = RwSignal::new(String::from("3 kg"));
    let tol = RwSignal::new(String::from("±5 %"));
    let host = fresh_host();
    let _mounted = leptos::mount::mount_to(host, move || {
        view! { <QuantityField id="t2" label="Stroke" dim=Dim::Length unit="mm" text=text tol=tol /> }
    });
    leptos::task::tick().await;
    let el = input("t2");
    assert_eq!(el.get_attribute("aria-invalid").as_deref(), Some("true"));
    let msg = text_of("t2-error");
    assert!(msg.contains("expected a length"), "{msg}");
    assert!(
        el.get_attribute("aria-describedby")
            .unwrap()
            .contains("t2-error"),
        "the message is tied to the input"
    );
    assert_eq!(text_of("t2-tol-error"), "");

    let tol_el = input("t2-tol");
    tol_el.set_value("±5 kg");
    fire(&tol_el, "input");
    el.set_value("3 mm");
    fire(&el, "input");
    leptos::task::tick().await;
    assert_eq!(el.get_attribute("aria-invalid").as_deref(), Some("false"));
    assert!(
        text_of("t2-tol-error").contains("percentage"),
        "{}",
        text_of("t2-tol-error")
    );
}

#[wasm_bindgen_test]
async fn a_field_bound_to_a_member_of_a_larger_state_writes_there() {
    #[derive(Clone, Default)]
    struct State {
        rate: String,
    }
    let s = RwSignal::new(State {
        rate: "3 N/mm".into(),
    });
    let b = Binding::new(
        move || s.with(|s| s.rate.clone()),
        move |t| s.update(|s| s.rate = t),
    );
    let host = fresh_host();
    let _mounted = leptos::mount::mount_to(host, move || {
        view! { <QuantityField id="t3" label="Rate" dim=Dim::LinearRate unit="N/mm" text=b /> }
    });
    leptos::task::tick().await;
    let el = input("t3");
    el.set_value("17 lbf/in");
    fire(&el, "input");
    leptos::task::tick().await;
    assert_eq!(s.with_untracked(|s| s.rate.clone()), "17 lbf/in");
    // Loading new state from outside (a demo) updates the input.
    s.update(|s| s.rate = "5 N/mm".into());
    leptos::task::tick().await;
    assert_eq!(el.value(), "5 N/mm");
}

// ── Figures and checks ─────────────────────────────────────────────────────

#[wasm_bindgen_test]
fn a_missing_figure_says_why_and_never_shows_nan() {
    let f = Figure::new("x", "X", Dim::Energy, f64::NAN);
    let html = figure_value_html(&f, UnitSystem::Si);
    assert!(html.contains("Not computed"), "{html}");
    assert!(!html.contains("NaN"));
    let m = Figure::missing(
        "y",
        "Y",
        Dim::Force,
        vec!["Spring rate: no value entered".into()],
    );
    assert!(figure_value_html(&m, UnitSystem::Us).contains("Spring rate: no value entered"));
    let how = figure_how_html(&m);
    assert!(
        how.contains("not stated"),
        "empty method and source are said"
    );
}

#[wasm_bindgen_test]
fn a_figure_follows_the_display_system() {
    // 0.0254 m is exactly 1 in (NIST SP 811 (2008) App. B.8).
    let f = Figure::new("s", "Stroke", Dim::Length, 0.0254);
    assert!(figure_value_html(&f, UnitSystem::Si).contains(">25.4<"));
    assert!(figure_value_html(&f, UnitSystem::Us).contains(">1<"));
}

#[wasm_bindgen_test]
fn labels_from_outside_are_escaped() {
    assert_eq!(
        esc(r#"<b>"x" & 'y'"#),
        "&lt;b&gt;&quot;x&quot; &amp; &#39;y&#39;"
    );
    let f = Figure::new("s", "<script>", Dim::Length, 1.0).method("a < b");
    assert!(!figure_how_html(&f).contains("a < b"));
}

#[wasm_bindgen_test]
fn a_check_from_memory_says_so_with_verdict_word_and_margin() {
    let c = Check::at_most(
        Subject::new("t.energy", "Energy", "release.kinetic_energy", Dim::Energy),
        Some(6.0),
        4.0,
        Provenance::new("ISO 14120:2015", "", SourceStatus::FromMemory),
    );
    assert_eq!(c.verdict, Verdict::Fail);
    let html = check_html(&c, UnitSystem::Si);
    assert!(html.contains("exceeds limit"), "{html}");
    assert!(html.contains("from memory: confirm against the current edition"));
    assert!(html.contains("uses 150 % of the limit"));
    assert!(html.contains("over the limit by 2 J"));
    assert!(html.contains(r#"data-verdict="fail""#));
    assert!(html.contains("verdict-icon"), "an icon beside the word");
}

#[wasm_bindgen_test]
fn margin_texts_and_bar() {
    assert_eq!(utilisation_text(Some(0.5)), "uses 50 % of the limit");
    assert!(utilisation_text(None).starts_with("no ratio"));
    let (end, len, mark, arrow) = bar_geometry(0.75);
    assert_eq!((end, arrow), (1.5, false));
    assert!((len - 50.0).abs() < 1e-9 && (mark - 100.0 / 1.5).abs() < 1e-9);
    assert!(
        bar_geometry(5.0).3,
        "beyond the cap the bar ends in an arrow"
    );
}

// ── Plot ticks ─────────────────────────────────────────────────────────────

#[wasm_bindgen_test]
fn ticks_are_one_two_five_steps_covering_the_data() {
    for (lo, hi) in [
        (0.0, 617.4),
        (-3.2, 7.9),
        (0.0, 0.098),
        (1e-4, 3e-4),
        (5.0, 5.0),
        (-1e-12, 617.4),
    ] {
        let t = nice_ticks(lo, hi, 5);
        let mantissa = t.step / 10f64.powf(t.step.log10().floor());
        assert!(
            [1.0, 2.0, 5.0, 10.0]
                .iter()
                .any(|m| (mantissa - m).abs() < 1e-9),
            "step {} for {lo}..{hi}",
            t.step
        );
        assert!(
            t.lo <= lo + t.step * 1e-6 && t.hi >= hi - t.step * 1e-6,
            "{t:?}"
        );
        assert!(t.values.len() >= 2 && t.values.len() <= 12, "{t:?}");
    }
    // Rounding dust below zero does not add a negative tick.
    assert_eq!(nice_ticks(-1e-12, 617.4, 5).lo, 0.0);
    let t = nice_ticks(0.0, 0.1, 5);
    assert_eq!(tick_label(0.04, &t), "0.04");
    assert_eq!(tick_label(-0.0, &t), "0.00");
}

// ── The trial sheet end to end ─────────────────────────────────────────────

#[wasm_bindgen_test]
fn trial_model_gives_figures_checks_and_cautions_and_names_bad_fields() {
    let o = compute(&TrialInputs::default());
    let stored = o
        .spring
        .iter()
        .find(|f| f.id == "energy.stored_latched")
        .and_then(|f| f.value)
        .unwrap();
    // ½·k·x² = ½ · 250 N/m · (0.18 m)² = 4.05 J (Hooke's law, exact).
    const REL_EXACT: f64 = 1e-12;
    assert!((stored - 4.05).abs() <= REL_EXACT * 4.05, "{stored}");
    assert!(!o.checks.is_empty() && !o.cautions.is_empty());
    assert!(
        o.cautions.iter().any(|c| c.caution.general),
        "general cautions always"
    );
    assert!(!o.history.is_empty() && !o.curve.is_empty() && o.histogram.is_some());

    let bad = TrialInputs {
        rate: "0.25 kg".into(),
        ..TrialInputs::default()
    };
    let o = compute(&bad);
    let f = o
        .spring
        .iter()
        .find(|f| f.id == "energy.stored_latched")
        .unwrap();
    assert!(f.value.is_none());
    assert!(
        f.missing.iter().any(|m| m.starts_with("Spring rate:")),
        "{:?}",
        f.missing
    );
    assert!(o.checks.iter().all(|c| c.verdict == Verdict::Unknown));

    let refused = TrialInputs {
        mass: "-2 kg".into(),
        ..TrialInputs::default()
    };
    let o = compute(&refused);
    assert!(
        o.field_problems.iter().any(|(id, _)| id == "part-mass"),
        "a model's refusal is shown at the field: {:?}",
        o.field_problems
    );
}

#[wasm_bindgen_test]
async fn app_mounts_and_the_energy_figure_follows_the_spring_rate() {
    let host = fresh_host();
    let _mounted = leptos::mount::mount_to(host, joulewise_web::App);
    leptos::task::tick().await;
    let value = || {
        doc()
            .query_selector("#fig-energy-stored_latched .figure-value")
            .unwrap()
            .unwrap()
            .text_content()
            .unwrap()
    };
    assert_eq!(value(), "4.05 J");
    let rate = input("spring-rate");
    rate.set_value("0.5 N/mm");
    fire(&rate, "input");
    leptos::task::tick().await;
    // ½ · 500 N/m · (0.18 m)² = 8.1 J (Hooke's law, exact).
    assert_eq!(value(), "8.1 J");
}
