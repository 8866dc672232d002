//! In-browser tests of the sheet (wasm-bindgen-test in headless Chromium):
//! run with `cargo test --target wasm32-unknown-unknown -p joulewise-web`.

// Test helpers may panic: a panic here is a failed test.
#![allow(clippy::unwrap_used, clippy::expect_used)]

use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{Event, EventInit, HtmlInputElement};

wasm_bindgen_test_configure!(run_in_browser);

fn set_input(id: &str, text: &str) {
    let doc = web_sys::window().unwrap().document().unwrap();
    let input: HtmlInputElement = doc.get_element_by_id(id).unwrap().unchecked_into();
    input.set_value(text);
    let init = EventInit::new();
    init.set_bubbles(true);
    input
        .dispatch_event(&Event::new_with_event_init_dict("input", &init).unwrap())
        .unwrap();
}

fn text_of(id: &str) -> String {
    let doc = web_sys::window().unwrap().document().unwrap();
    doc.get_element_by_id(id).unwrap().text_content().unwrap()
}

#[wasm_bindgen_test]
async fn energy_updates_live_and_bad_input_is_named_at_the_field() {
    leptos::mount::mount_to_body(joulewise_web::App);
    // ½·3 N/mm·(40² − 10²) mm² = 2.25 J (Hooke's law, exact).
    assert_eq!(text_of("energy"), "2.25 J");
    set_input("rate", "6 N/mm");
    leptos::task::tick().await;
    assert_eq!(text_of("energy"), "4.5 J");
    set_input("rate", "6 kg");
    leptos::task::tick().await;
    assert!(
        text_of("rate-error").contains("spring rate"),
        "{}",
        text_of("rate-error")
    );
    assert!(text_of("energy").starts_with("Cannot compute"));
}
