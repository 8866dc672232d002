//! Rough timing of `assess` per demo (development aid; the benchmarks with
//! budgets live in `cargo xtask bench`).
#![forbid(unsafe_code)]
use joulewise_core::scenario::demos;
use std::time::Instant;

fn main() {
    for d in demos::all() {
        let s = (d.build)();
        let n = 200;
        let t0 = Instant::now();
        for _ in 0..n {
            let _ = joulewise_core::assess::assess(&s);
        }
        let per = t0.elapsed().as_secs_f64() / n as f64;
        let Ok(report) = joulewise_core::assess::assess(&s) else {
            continue;
        };
        let t1 = Instant::now();
        let mut samples = 0;
        if let Some(mut st) = joulewise_core::assess::Study::new(&s, &report) {
            while !st.advance(1000) {}
            let r = st.finish();
            samples = r.monte_carlo.map(|m| m.samples_run).unwrap_or(0);
        }
        let study = t1.elapsed().as_secs_f64();
        println!(
            "{:<16} assess {:>8.1} µs   study {:>8.1} ms ({} MC samples)",
            d.key,
            per * 1e6,
            study * 1e3,
            samples
        );
    }
}
