//! In-browser tests of the sheet's building blocks (wasm-bindgen-test in
//! headless Chromium): run with
//! `cargo test --target wasm32-unknown-unknown -p joulewise-web`.
//!
//! Each component test mounts into its own fresh `<div>` with its own ids,
//! since all tests share one page.

// A panic in a test is a failed test, not a user-facing crash; the helpers
// below are not `#[test]` functions, so clippy's test allowance misses them.
#![allow(clippy::unwrap_used, clippy::expect_used)]

use joulewise_core::assess::{assess, Study};
use joulewise_core::figure::{Figure, Provenance, SourceStatus, Verdict};
use joulewise_core::limits::{Check, Subject};
use joulewise_core::scenario::demos;
use joulewise_core::units::{self, Dim, UnitSystem};
use joulewise_web::bind::Binding;
use joulewise_web::blank;
use joulewise_web::check_row::{bar_geometry, check_html, utilisation_text};
use joulewise_web::checked_view::checked_html;
use joulewise_web::field::{split_number, unit_index, with_unit, QuantityField};
use joulewise_web::figure_card::{caution_links_html, push_missing_html, reason_path};
use joulewise_web::figure_card::{figure_how_html, figure_value_html};
use joulewise_web::html::esc;
use joulewise_web::labels::{field_dom_id, label_of};
use joulewise_web::lens::{model_mut, value_mut};
use joulewise_web::plot::{nice_ticks, tick_label};
use joulewise_web::results::verdict_html;
use joulewise_web::state::SETTLE_MS;
use joulewise_web::study::run_in_slices;
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
    let how = figure_how_html(&m, UnitSystem::Si);
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
    assert!(!figure_how_html(&f, UnitSystem::Si).contains("a < b"));
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

// ── The scenario sheet ─────────────────────────────────────────────────────

#[wasm_bindgen_test]
fn every_input_the_core_reads_is_reachable_by_its_path_and_has_a_label() {
    for d in demos::all() {
        let mut s = (d.build)();
        let report = assess(&s).unwrap();
        assert!(!report.inputs.is_empty());
        for line in &report.inputs {
            if line.text.is_empty() {
                continue; // a rate derived from field measurements
            }
            let v = value_mut(&mut s, &line.path, false).map(|v| v.text.clone());
            assert_eq!(v, Some(line.text.clone()), "{}: {}", d.key, line.path);
            assert_ne!(label_of(&line.path), line.path, "{}: no label", line.path);
        }
    }
}

#[wasm_bindgen_test]
fn a_spring_model_is_found_by_its_path_at_any_depth() {
    let mut s = blank::scenario(UnitSystem::Si);
    if let Some(sp) = s.spring.as_mut() {
        sp.model = blank::model("series");
    }
    assert!(model_mut(&mut s, "spring.model.members.1").is_some());
    assert!(model_mut(&mut s, "spring.model.members.2").is_none());
    let v = value_mut(&mut s, "spring.model.members.1.rate", true).unwrap();
    v.text = "7 N/mm".into();
    assert_eq!(
        value_mut(&mut s, "spring.model.members.1.rate", false).map(|v| v.text.clone()),
        Some("7 N/mm".to_string())
    );
    // An optional input is created only when written.
    assert!(value_mut(&mut s, "part.drive_force", false).is_none());
    assert!(value_mut(&mut s, "part.drive_force", true).is_some());
    assert_eq!(
        label_of("spring.model.members.1.rate"),
        "Member 2, spring rate"
    );
    assert_eq!(
        label_of("spring.model.loading.0.force"),
        "Point 1, force (loading)"
    );
    assert_eq!(label_of("part.mass.tol"), "Moving mass (tolerance)");
    assert_eq!(
        field_dom_id("spring.model.members.1.rate"),
        "f-spring-model-members-1-rate"
    );
}

#[wasm_bindgen_test]
fn every_variant_key_makes_that_variant() {
    for k in [
        "linear",
        "helical",
        "extension",
        "torsion",
        "gas",
        "disc",
        "table",
        "measured",
        "series",
        "parallel",
    ] {
        assert_eq!(blank::model_kind(&blank::model(k)), k);
    }
    for k in ["translating", "rotating"] {
        assert_eq!(blank::part_kind(&blank::part(k)), k);
    }
    for k in ["given", "plate", "rod", "disc", "point", "offset"] {
        assert_eq!(blank::inertia_kind(&blank::inertia(k)), k);
    }
    for k in ["none", "buffer", "body"] {
        assert_eq!(blank::contact_kind(&blank::contact(k)), k);
    }
    for k in [
        "linear",
        "power_law",
        "spring",
        "constant_force",
        "absorber",
        "orifice",
    ] {
        assert_eq!(blank::law_kind(&blank::law(k)), k);
    }
    for k in ["static", "dynamic", "two_point"] {
        assert_eq!(blank::identify_kind(&blank::identify(k)), k);
    }
    for k in ["direct", "strut"] {
        assert_eq!(blank::mount_kind(&blank::mount(k)), k);
    }
    for k in ["edge", "circle", "given"] {
        assert_eq!(blank::area_kind(&blank::area(k)), k);
    }
    for k in ["none", "coefficient", "force"] {
        assert_eq!(blank::friction_kind(&blank::friction(k)), k);
    }
}

#[wasm_bindgen_test]
fn a_missing_reason_names_the_field_by_label_and_links_to_it() {
    let mut out = String::new();
    push_missing_html(
        &mut out,
        &[
            "part.mass: a value is required".into(),
            "the part stops before contact".into(),
        ],
        UnitSystem::Si,
    );
    assert!(
        out.contains(r##"<a href="#f-part-mass">Moving mass</a>: a value is required"##),
        "{out}"
    );
    assert!(out.contains("the part stops before contact"));
    assert_eq!(
        reason_path("part.mass.tol: bad"),
        Some(("part.mass.tol", "bad"))
    );
    assert_eq!(reason_path("Spring rate: no value"), None);
}

#[wasm_bindgen_test]
fn quantities_inside_core_texts_follow_the_display_system() {
    let f = Figure::new("x", "X", Dim::Energy, 1.0)
        .assume(&format!("stroke {}", units::tag(0.0254, Dim::Length)));
    // 0.0254 m = 25.4 mm = 1 in exactly (NIST SP 811 (2008) App. B.8).
    assert!(figure_how_html(&f, UnitSystem::Si).contains("stroke 25.4 mm"));
    assert!(figure_how_html(&f, UnitSystem::Us).contains("stroke 1 in"));
    let mut out = String::new();
    push_missing_html(
        &mut out,
        &[format!(
            "part.travel: less than {}",
            units::tag(0.0254, Dim::Length)
        )],
        UnitSystem::Us,
    );
    assert!(out.contains("less than 1 in"), "{out}");
}

#[wasm_bindgen_test]
fn cautions_sit_beside_the_figure_that_brought_them_up() {
    let r = assess(&demos::by_key("ejector").unwrap()).unwrap();
    let stored = r.figure("energy.stored_latched").unwrap();
    let html = caution_links_html(&stored.label, &r.cautions);
    assert!(html.contains("#caution-lock-out-stored-energy"), "{html}");
    let speed = r.figure("release.contact_speed").unwrap();
    assert_eq!(caution_links_html(&speed.label, &r.cautions), "");
}

#[wasm_bindgen_test]
fn no_check_reads_not_applicable_never_pass() {
    let r = assess(&demos::by_key("brake-springs").unwrap()).unwrap();
    assert!(r.checks.is_empty());
    let html = verdict_html(&r);
    assert!(
        html.contains("not applicable") && html.contains("no limit set applies"),
        "{html}"
    );
}

#[wasm_bindgen_test]
fn sizing_reasons_follow_the_display_units() {
    use joulewise_core::sizing::{Infeasibility, LimitKind};
    let i = Infeasibility::StrokeTooShort {
        available: 0.0254,
        required: 0.0508,
        governing: LimitKind::PeakForce,
    };
    // 0.0254 m = 1 in exactly (NIST SP 811 (2008) App. B.8).
    let us = joulewise_web::sizing_view::explain(&i, UnitSystem::Us);
    assert!(us.contains("1 in") && us.contains("2 in"), "{us}");
    let si = joulewise_web::sizing_view::explain(&i, UnitSystem::Si);
    assert!(si.contains("25.4 mm"), "{si}");
}

#[wasm_bindgen_test]
fn the_bench_hook_times_each_run() {
    let ms = joulewise_web::bench::assess_demo("guard-door", 3);
    assert_eq!(ms.len(), 3);
    assert!(ms.iter().all(|t| t.is_finite() && *t >= 0.0));
    assert!(joulewise_web::bench::assess_demo("nothing", 3).is_empty());
}

#[wasm_bindgen_test]
async fn the_study_runs_in_slices_and_can_be_cancelled() {
    let mut s = demos::by_key("ejector").unwrap();
    s.study.monte_carlo = true;
    s.study.samples = 400;
    let r = assess(&s).unwrap();
    let mut seen = Vec::new();
    let out = run_in_slices(Study::new(&s, &r).unwrap(), |p| {
        seen.push(p);
        true
    })
    .await
    .unwrap();
    assert!(seen.len() >= 3, "several slices: {seen:?}");
    assert!(seen.windows(2).all(|w| w[0] <= w[1]), "progress rises");
    assert_eq!(seen.last().copied(), Some(1.0));
    assert_eq!(out.monte_carlo.unwrap().samples_run, 400);
    let cancelled = run_in_slices(Study::new(&s, &r).unwrap(), |_| false).await;
    assert!(cancelled.is_none());
}

async fn sleep(ms: i32) {
    let p = js_sys::Promise::new(&mut |resolve, _| {
        web_sys::window()
            .unwrap()
            .set_timeout_with_callback_and_timeout_and_arguments_0(&resolve, ms)
            .unwrap();
    });
    wasm_bindgen_futures::JsFuture::from(p).await.unwrap();
}

#[wasm_bindgen_test]
async fn app_loads_a_demo_and_the_energy_follows_the_typed_rate() {
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
    let pick: HtmlSelectElement = doc()
        .get_element_by_id("demo-pick")
        .unwrap()
        .unchecked_into();
    pick.set_value("ejector");
    fire(&pick, "change");
    let load: HtmlElement = doc()
        .get_element_by_id("demo-load")
        .unwrap()
        .unchecked_into();
    load.click();
    leptos::task::tick().await;
    // ½·k·x² = ½ · 8000 N/m · (0.03 m)² = 3.6 J (Hooke's law, common practice).
    assert_eq!(value(), "3.6 J");
    let rate = input("f-spring-model-rate");
    assert_eq!(rate.value(), "8 N/mm");
    rate.set_value("10 N/mm");
    fire(&rate, "input");
    // The report follows once the input has settled.
    sleep(SETTLE_MS as i32 + 150).await;
    leptos::task::tick().await;
    // ½ · 10 000 N/m · (0.03 m)² = 4.5 J (Hooke's law, common practice).
    assert_eq!(value(), "4.5 J");
    assert_eq!(rate.value(), "10 N/mm", "typed text kept");
}

// ── How the figures are checked ─────────────────────────────────────────────

#[wasm_bindgen_test]
fn the_checked_page_lists_every_model_limit_set_and_check() {
    let page = checked_html();
    let cat = joulewise_core::verification::catalogue();
    for s in cat.subjects {
        assert!(page.contains(&esc(s.name)), "{}", s.id);
    }
    for c in cat.checks {
        assert!(page.contains(&esc(c.title)), "{}", c.id);
    }
    assert!(page.contains(&format!(r#"id="checked-total">{}<"#, cat.checks.len())));
}

// ───────────────────────────────────────────── keeping the work (issue 7) ──

fn demo_record(id: &str) -> joulewise_web::store::record::Record {
    joulewise_web::store::record::Record {
        id: id.into(),
        revision: 7,
        saved_ms: 1_700_000_000_000.0,
        writer: "tab".into(),
        verdict: "fail".into(),
        scenario: demos::by_key("guard-door").unwrap(),
    }
}

#[wasm_bindgen_test]
fn a_record_reads_back_as_written_with_refused_texts_as_typed() {
    use joulewise_web::store::record::{decode, encode};
    let mut r = demo_record("a1");
    r.scenario.identity.title = "Lid \"quoted\" <b>".into();
    if let joulewise_core::scenario::PartInput::Rotating(p) = &mut r.scenario.part {
        p.travel.text = "86 bananas".into();
    }
    let back = decode("a1", &encode(&r)).unwrap();
    assert_eq!(back, r);
}

#[wasm_bindgen_test]
fn a_bare_scenario_of_format_0_is_migrated_and_newer_formats_refused() {
    use joulewise_web::store::record::{decode, RECORD_FORMAT};
    let s = demos::by_key("ejector").unwrap();
    let r = decode("old-key", &s.to_json()).unwrap();
    assert_eq!((r.id.as_str(), r.revision), ("old-key", 0));
    // The file carries SI values beside the texts (`to_json`); the demo not.
    assert_eq!(r.scenario.to_json(), s.to_json());
    let newer = format!(
        "{{\"record_format\":{},\"schema_version\":1,\"id\":\"x\",\"scenario\":{{}}}}",
        RECORD_FORMAT + 1
    );
    assert!(decode("x", &newer).unwrap_err().reason.contains("newer"));
    assert!(decode("x", "{\"record_format\":1").is_err());
    assert!(decode("x", "[1,2]").is_err());
}

#[wasm_bindgen_test]
fn base64url_round_trips_every_length_and_refuses_strangers() {
    use joulewise_web::share::{b64url_decode, b64url_encode};
    let data: Vec<u8> = (0..=255u8).collect();
    for n in 0..data.len() {
        let e = b64url_encode(&data[..n]);
        assert!(e
            .bytes()
            .all(|c| c.is_ascii_alphanumeric() || c == b'-' || c == b'_'));
        assert_eq!(b64url_decode(&e).unwrap(), &data[..n]);
    }
    // RFC 4648 §10 test vector, in the URL alphabet without padding.
    assert_eq!(b64url_encode(b"foobar"), "Zm9vYmFy");
    assert_eq!(b64url_encode(b"fo"), "Zm8");
    assert!(b64url_decode("ab<c").is_err());
    assert!(b64url_decode("A").is_err());
}

#[wasm_bindgen_test]
fn an_export_of_several_reads_back_and_a_damaged_one_names_its_item() {
    use joulewise_web::transfer::{bundle_text, file_name, read_file};
    let list = vec![
        demos::by_key("guard-door").unwrap(),
        demos::by_key("ejector").unwrap(),
    ];
    let text = bundle_text(&list);
    let files = |v: &[joulewise_core::scenario::Scenario]| {
        v.iter().map(|s| s.to_json()).collect::<Vec<_>>()
    };
    assert_eq!(files(&read_file(text.as_bytes()).unwrap()), files(&list));
    let one = list[0].to_json();
    assert_eq!(
        files(&read_file(one.as_bytes()).unwrap()),
        files(&list[..1])
    );
    let broken = text.replacen("\"kind\": \"rotating\"", "\"kind\": \"levitating\"", 1);
    let errs = read_file(broken.as_bytes()).unwrap_err();
    assert!(errs[0].0.starts_with("assessments.0"), "{errs:?}");
    assert_eq!(file_name("Hopper lid, line 2 / <x>"), "hopper-lid-line-2-x");
    assert_eq!(file_name("  "), "assessment");
}

#[wasm_bindgen_test]
fn library_search_needs_every_word_and_escapes_titles() {
    use joulewise_web::keep::Entry;
    use joulewise_web::library::{list_html, matches};
    let e = Entry {
        id: "a\"1".into(),
        title: "<script>Lid".into(),
        tag: "HL-2".into(),
        dated: String::new(),
        saved_ms: 0.0,
        revision: 1,
        verdict: "pass".into(),
        hay: "<script>lid\nhl-2".into(),
    };
    assert!(matches(&e, "LID hl-2"));
    assert!(!matches(&e, "lid door"));
    let html = list_html(&[e], "", None, None);
    assert!(!html.contains("<script>"));
    assert!(html.contains("&lt;script&gt;Lid"));
    assert!(html.contains("data-id=\"a&quot;1\""));
}
