//! A small hook for the performance benchmark, on `window.__joulewise_bench`:
//!
//! - `demos`: the demo keys;
//! - `assessDemo(key, runs)`: the time of each of `runs` nominal assessments
//!   of that demo, in ms (`performance.now()` around the assessment only,
//!   nothing drawn);
//! - `monteCarlo(key)`: a promise of `{ms, samples}` for the demo's
//!   tolerance study with its Monte Carlo switched on, run in slices exactly
//!   as the sheet runs it (yielding to the browser between slices).
//!
//! It reads only the built-in demos and changes nothing on the page.
//!
//! [`mark_figures_visible`] sets the performance mark
//! `joulewise:figures-visible` once the first figures are on the page (the
//! benchmark's start-up figure is the time from navigation to it).

use crate::study::{now_ms, run_in_slices};
use joulewise_core::assess::{assess, Study};
use joulewise_core::scenario::demos;
use js_sys::{Array, Object, Promise, Reflect};
use wasm_bindgen::prelude::*;

fn set(target: &JsValue, key: &str, value: &JsValue) {
    let _ = Reflect::set(target, &JsValue::from_str(key), value);
}

/// Time `runs` assessments of demo `key` (an empty array for an unknown key).
pub fn assess_demo(key: &str, runs: u32) -> Vec<f64> {
    let Some(s) = demos::by_key(key) else {
        return Vec::new();
    };
    (0..runs)
        .map(|_| {
            let t0 = now_ms();
            let r = assess(&s);
            let t1 = now_ms();
            std::hint::black_box(r.map(|r| r.figures.len()).unwrap_or(0));
            t1 - t0
        })
        .collect()
}

/// Run demo `key`'s study (Monte Carlo on) in slices: (ms, samples).
pub async fn monte_carlo(key: &str) -> (f64, usize) {
    let Some(mut s) = demos::by_key(key) else {
        return (0.0, 0);
    };
    s.study.monte_carlo = true;
    let t0 = now_ms();
    let Ok(report) = assess(&s) else {
        return (0.0, 0);
    };
    let Some(study) = Study::new(&s, &report) else {
        return (now_ms() - t0, 0);
    };
    let out = run_in_slices(study, |_| true).await;
    let samples = out
        .and_then(|r| r.monte_carlo.map(|m| m.samples_run))
        .unwrap_or(0);
    (now_ms() - t0, samples)
}

/// Name of the start-up mark (`bench/browser.mjs` waits for it).
pub const FIGURES_VISIBLE: &str = "joulewise:figures-visible";

/// Set the [`FIGURES_VISIBLE`] performance mark in the first animation
/// frame that finds a figure value in the page (the frame before the first
/// paint that shows it); tries for at most 600 frames.
pub fn mark_figures_visible() {
    fn next_frame(left: u32) {
        let Some(window) = web_sys::window() else {
            return;
        };
        let check = Closure::once_into_js(move || {
            let window = web_sys::window();
            let shown = window
                .as_ref()
                .and_then(web_sys::Window::document)
                .and_then(|d| d.query_selector(".figure-value").ok().flatten())
                .is_some();
            if shown {
                if let Some(p) = window.and_then(|w| w.performance()) {
                    let _ = p.mark(FIGURES_VISIBLE);
                }
            } else if left > 0 {
                next_frame(left - 1);
            }
        });
        let _ = window.request_animation_frame(check.unchecked_ref());
    }
    next_frame(600);
}

/// Put the hook on `window`.
pub fn install() {
    let Some(window) = web_sys::window() else {
        return;
    };
    let hook = Object::new();
    let keys = Array::new();
    for d in demos::all() {
        keys.push(&JsValue::from_str(d.key));
    }
    set(&hook, "demos", &keys);
    let assess_fn = Closure::<dyn Fn(String, u32) -> Array>::new(|key: String, runs: u32| {
        assess_demo(&key, runs)
            .into_iter()
            .map(JsValue::from_f64)
            .collect::<Array>()
    });
    set(&hook, "assessDemo", assess_fn.as_ref());
    assess_fn.forget();
    let mc_fn = Closure::<dyn Fn(String) -> Promise>::new(|key: String| {
        wasm_bindgen_futures::future_to_promise(async move {
            let (ms, samples) = monte_carlo(&key).await;
            let out = Object::new();
            set(&out, "ms", &JsValue::from_f64(ms));
            set(&out, "samples", &JsValue::from_f64(samples as f64));
            Ok(out.into())
        })
    });
    set(&hook, "monteCarlo", mc_fn.as_ref());
    mc_fn.forget();
    set(&window, "__joulewise_bench", &hook);
}
