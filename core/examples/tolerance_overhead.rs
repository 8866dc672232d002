//! Micro benchmark of the tolerance study's own overhead per sample (not a
//! test: it times nothing that can fail). The model is a closed-form
//! power-law buffer, F = k·xⁿ stopping a mass m at speed v: the stroke
//! x = ((n + 1)·½·m·v²/k)^(1/(n+1)) absorbs the kinetic energy (energy
//! balance, ∫k·xⁿ dx = k·x^(n+1)/(n+1)), so nearly all of the time measured
//! is sampling and bookkeeping. All numbers are invented.
//!
//! Run: `cargo run -p joulewise-core --profile fast --example tolerance_overhead`.
//! Criterion benches with the real integrator come later (issue 10).
#![forbid(unsafe_code)]

use joulewise_core::tolerance::*;
use joulewise_core::InputError;
use std::time::Instant;

fn main() -> Result<(), InputError> {
    let inputs = vec![
        TolerancedInput::new(
            "mass",
            4.0,
            Tolerance::relative(0.05, Distribution::Normal),
            true,
        )?,
        TolerancedInput::new(
            "speed",
            1.2,
            Tolerance::relative(0.10, Distribution::Normal),
            true,
        )?,
        TolerancedInput::new(
            "buffer.k",
            8.0e6,
            Tolerance::relative(0.15, Distribution::Uniform),
            true,
        )?,
        TolerancedInput::new(
            "buffer.n",
            2.0,
            Tolerance::absolute(0.2, Distribution::Uniform),
            true,
        )?,
        TolerancedInput::new(
            "buffer.stroke",
            0.02,
            Tolerance::absolute(0.001, Distribution::Uniform),
            true,
        )?,
        TolerancedInput::new(
            "drive_force",
            50.0,
            Tolerance::relative(0.2, Distribution::NormalUnbounded),
            false,
        )?,
    ];
    let mut model = |x: &[f64], y: &mut [f64]| -> Result<(), InputError> {
        let (m, v, k, n, stroke, drive) = (x[0], x[1], x[2], x[3], x[4], x[5]);
        let energy = 0.5 * m * v * v + drive * stroke;
        let travel = ((n + 1.0) * energy / k).powf(1.0 / (n + 1.0));
        let force = k * travel.powf(n);
        y[0] = energy;
        y[1] = travel;
        y[2] = force;
        y[3] = force / m;
        Ok(())
    };
    let config = MonteCarloConfig {
        limits: vec![Limit {
            id: "stroke".into(),
            figure: 1,
            threshold: 0.0125,
            comparison: Comparison::AtMost,
        }],
        histogram: Some(HistogramSpec {
            figure: 2,
            bins: 40,
        }),
        ..MonteCarloConfig::default()
    };

    let t = Instant::now();
    let whole = monte_carlo(&inputs, 4, config.clone(), &mut model)?;
    let one_go = t.elapsed();

    let t = Instant::now();
    let mut run = MonteCarloRun::new(&inputs, 4, config)?;
    while !run.advance(&mut model, 500).is_complete() {}
    let sliced = run.finish();
    let in_slices = t.elapsed();
    assert_eq!(format!("{whole:?}"), format!("{sliced:?}"));

    // The engine alone: a model that only copies inputs out.
    let mut trivial = |x: &[f64], y: &mut [f64]| -> Result<(), InputError> {
        y[0] = x[0];
        y[1] = x[1];
        y[2] = x[2];
        y[3] = x[3];
        Ok(())
    };
    let mut run = MonteCarloRun::new(&inputs, 4, MonteCarloConfig::default())?;
    let t = Instant::now();
    run.advance(&mut trivial, usize::MAX);
    let sampling = t.elapsed();
    let t = Instant::now();
    let _ = run.finish();
    let finishing = t.elapsed();

    let t = Instant::now();
    let wc = worst_case(&inputs, 4, &mut model, WorstCaseOptions::default())?;
    let corners = t.elapsed();

    let n = whole.samples_run as f64;
    println!(
        "Monte Carlo, {} samples × {} inputs × 4 figures:",
        whole.samples_run,
        inputs.len()
    );
    println!(
        "  one go     {:>8.2} ms  ({:.0} ns/sample)",
        one_go.as_secs_f64() * 1e3,
        one_go.as_secs_f64() * 1e9 / n
    );
    println!("  slices 500 {:>8.2} ms", in_slices.as_secs_f64() * 1e3);
    println!(
        "  engine alone (trivial model): sampling {:.0} ns/sample, finish (sort 4 × 10 000) {:.2} ms",
        sampling.as_secs_f64() * 1e9 / n,
        finishing.as_secs_f64() * 1e3
    );
    println!(
        "Worst case, {} evaluations: {:.2} ms",
        wc.evaluations,
        corners.as_secs_f64() * 1e3
    );
    if let Some(s) = whole.figures[2].summary {
        println!(
            "peak force P50 {:.0} N, P95 {:.0} N, P99 {:.0} N, max {:.0} N",
            s.p50, s.p95, s.p99, s.max
        );
    }
    if let Some(p) = whole.limits[0].probability {
        println!("P(travel > 12.5 mm) = {p:.4}");
    }
    Ok(())
}
