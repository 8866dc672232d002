//! Benchmarks of the core (criterion): `assess` per demo, one release +
//! impact solve of the power-law buffer case, the carriage demo's Monte
//! Carlo of 10 000 samples, and `assess_summary` per register row type.
//!
//! They print figures; the budgets they are held to live in `cargo xtask
//! bench`, which runs them, reads criterion's estimates and compares. Each
//! benchmark also prints one `bench-figure {json}` line with the work done
//! (right-hand-side evaluations, steps) and, for the power-law case, the
//! error against the closed form (work–energy theorem: ½·m·v² = ½·k·s₀² at
//! contact, ½·m·v² = a·x^(n+1)/(n+1) at the largest compression).
#![forbid(unsafe_code)]
// A benchmark whose fixture cannot be built must stop loudly: `expect` is
// the clearest way to say which fixture.
#![allow(clippy::expect_used)]

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use joulewise_core::assess::{assess, assess_summary, Study};
use joulewise_core::contact::buffer::{
    release_into_buffer, Buffer, BufferConfig, BufferLaw, ContinuousConfig, Rebound, ReleaseImpact,
};
use joulewise_core::mechanism::{
    DirectSpring, Friction, Mechanism, Sense, TranslatingConfig, TranslatingPart,
};
use joulewise_core::ode::SolverConfig;
use joulewise_core::release::ReleaseConfig;
use joulewise_core::scenario::demos;
use joulewise_core::spring::{LinearSpec, LinearSpring};
use std::time::Duration;

/// The power-law case of `bench/power_law_case.json` (shared with the
/// scipy comparison, so both solve the same problem).
struct Case {
    mass: f64,
    spring_rate: f64,
    latched_deflection: f64,
    spring_max_deflection: f64,
    travel: f64,
    buffer_coefficient: f64,
    buffer_exponent: f64,
    buffer_stroke: f64,
    restitution: f64,
    rtol: f64,
    atol: f64,
}

fn case() -> Case {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/../bench/power_law_case.json");
    let text = std::fs::read_to_string(path).expect("bench/power_law_case.json");
    let v: serde_json::Value = serde_json::from_str(&text).expect("valid JSON");
    let f = |k: &str| v[k].as_f64().unwrap_or_else(|| panic!("{k} in {path}"));
    Case {
        mass: f("mass"),
        spring_rate: f("spring_rate"),
        latched_deflection: f("latched_deflection"),
        spring_max_deflection: f("spring_max_deflection"),
        travel: f("travel"),
        buffer_coefficient: f("buffer_coefficient"),
        buffer_exponent: f("buffer_exponent"),
        buffer_stroke: f("buffer_stroke"),
        restitution: f("restitution"),
        rtol: f("rtol"),
        atol: f("atol"),
    }
}

fn solve(c: &Case, spring: &LinearSpring) -> ReleaseImpact {
    let mech = Mechanism::Translating(
        TranslatingPart::new(TranslatingConfig {
            mass: c.mass,
            spring: Some(DirectSpring {
                spring,
                deflection_at_latch: c.latched_deflection,
                sense: Sense::Unloads,
                detaches: true,
            }),
            travel: c.travel,
            incline: 0.0,
            friction: Friction::None,
            damping: 0.0,
            drive_force: 0.0,
            include_spring_mass: false,
        })
        .expect("valid part"),
    );
    let buffer = Buffer::new(BufferConfig {
        law: BufferLaw::PowerLaw {
            coefficient: c.buffer_coefficient,
            exponent: c.buffer_exponent,
            stroke: c.buffer_stroke,
        },
        count: 1,
        rebound: Rebound::Restitution(c.restitution),
    })
    .expect("valid buffer");
    let cfg = ContinuousConfig {
        release: ReleaseConfig {
            solver: SolverConfig {
                rtol: c.rtol,
                atol: c.atol,
                ..SolverConfig::default()
            },
            samples: 0,
        },
        buffer_radius: None,
        cycles_per_hour: 0.0,
    };
    release_into_buffer(&mech, &buffer, &cfg).expect("the case solves")
}

fn power_law(cr: &mut Criterion) {
    let c = case();
    let spring = LinearSpring::new(LinearSpec {
        rate: c.spring_rate,
        free_length: None,
        max_deflection: Some(c.spring_max_deflection),
        solid_length: None,
    })
    .expect("valid spring");
    let out = solve(&c, &spring);
    let imp = out.impact.as_ref().expect("contact");
    // Closed forms (work–energy theorem, common practice).
    let energy = 0.5 * c.spring_rate * c.latched_deflection * c.latched_deflection;
    let n = c.buffer_exponent;
    let x = ((n + 1.0) * energy / c.buffer_coefficient).powf(1.0 / (n + 1.0));
    let v = (2.0 * energy / c.mass).sqrt();
    let rhs = out.release.stats.rhs_evaluations + imp.stats.rhs_evaluations;
    let steps = out.release.stats.accepted_steps
        + out.release.stats.rejected_steps
        + imp.stats.accepted_steps
        + imp.stats.rejected_steps;
    println!(
        "bench-figure {{\"id\":\"power_law_solve\",\"rhs_evaluations\":{rhs},\"steps\":{steps},\
         \"release_rhs\":{},\"impact_rhs\":{},\
         \"stroke\":{},\"stroke_closed_form\":{x},\"stroke_rel_error\":{:e},\
         \"contact_speed_rel_error\":{:e}}}",
        out.release.stats.rhs_evaluations,
        imp.stats.rhs_evaluations,
        imp.stroke_used,
        (imp.stroke_used - x).abs() / x,
        (imp.contact_speed - v).abs() / v,
    );
    let mut g = cr.benchmark_group("solve");
    g.bench_function("power_law_release_impact", |b| {
        b.iter(|| solve(black_box(&c), black_box(&spring)))
    });
    g.finish();
}

fn assess_demos(cr: &mut Criterion) {
    let mut g = cr.benchmark_group("assess");
    for d in demos::all() {
        let s = (d.build)();
        g.bench_function(d.key, |b| b.iter(|| assess(black_box(&s))));
    }
    g.finish();
}

fn summary_rows(cr: &mut Criterion) {
    let mut g = cr.benchmark_group("assess_summary");
    for d in demos::all() {
        let s = (d.build)();
        g.bench_function(d.key, |b| b.iter(|| assess_summary(black_box(&s))));
    }
    g.finish();
}

/// The carriage demo's study as the page runs it: the worst-case corners,
/// then 10 000 Monte Carlo samples, in slices of 1 000.
fn run_study(s: &joulewise_core::scenario::Scenario) -> usize {
    let Ok(report) = assess(s) else { return 0 };
    let Some(mut study) = Study::new(s, &report) else {
        return 0;
    };
    while !study.advance(1_000) {}
    study
        .finish()
        .monte_carlo
        .map(|m| m.samples_run)
        .unwrap_or(0)
}

fn monte_carlo(cr: &mut Criterion) {
    let mut s = demos::carriage_stop();
    s.study.monte_carlo = true;
    s.study.samples = 10_000;
    let samples = run_study(&s);
    println!("bench-figure {{\"id\":\"monte_carlo\",\"samples\":{samples}}}");
    let mut g = cr.benchmark_group("monte_carlo");
    g.sample_size(10)
        .warm_up_time(Duration::from_millis(500))
        .measurement_time(Duration::from_secs(4));
    g.bench_function("carriage-stop_10000", |b| {
        b.iter(|| run_study(black_box(&s)))
    });
    g.finish();
}

criterion_group!(benches, power_law, assess_demos, summary_rows, monte_carlo);
criterion_main!(benches);
