//! Tests of the Dormand–Prince integrator against closed-form solutions
//! (simple harmonic motion, free fall, the orifice damper) and of its bounds.

use super::*;
use std::f64::consts::PI;

/// Global error of a solve at rtol 1e-8 over about one period: the local
/// error per step is ≤ 1e-8 of the state and a few tens of steps accumulate,
/// so 1e-7 of the amplitude is a safe bound (measured: ~1e-8).
const GLOBAL_REL_AT_1E8: f64 = 1e-7;
/// A polynomial solution of degree ≤ 4 is integrated exactly by a 5th-order
/// method: only rounding over a few steps remains.
const ROUNDING: f64 = crate::test_tol::REL_EXACT;
/// Event times located on the order-4 dense output: its error is of the
/// order of the local error tolerance (rtol 1e-8) times the time scale.
const EVENT_TIME_REL: f64 = 1e-7;

struct Shm {
    omega2: f64,
}

impl OdeSystem<2> for Shm {
    fn rhs(&self, _t: f64, y: &[f64; 2], dy: &mut [f64; 2]) {
        dy[0] = y[1];
        dy[1] = -self.omega2 * y[0];
    }
    fn event_count(&self) -> usize {
        1
    }
    fn event(&self, _i: usize, _t: f64, y: &[f64; 2]) -> f64 {
        y[0]
    }
    fn event_spec(&self, _i: usize) -> EventSpec {
        EventSpec::reported(Direction::Rising)
    }
}

#[derive(Default)]
struct Crossings(Vec<f64>);

impl Observer<2> for Crossings {
    fn wants_steps(&self) -> bool {
        false
    }
    fn event(&mut self, _index: usize, t: f64, _y: &[f64; 2]) {
        self.0.push(t);
    }
}

#[test]
fn shm_follows_a_sine() {
    // x = A·sin(ωt) for x'' = −(k/m)·x, x(0) = 0, v(0) = A·ω (SHM closed
    // form; any dynamics textbook, common practice).
    let (m, k, a): (f64, f64, f64) = (2.0, 800.0, 0.05);
    let omega = (k / m).sqrt();
    let sys = Shm { omega2: k / m };
    let mut traj = Trajectory::new();
    let cfg = SolverConfig {
        t_end: 2.0 * PI / omega,
        ..SolverConfig::default()
    };
    let sol = solve(&sys, 0.0, [0.0, a * omega], &cfg, &mut traj).unwrap();
    assert_eq!(sol.stop, StopReason::ReachedEnd);
    assert_eq!(sol.t, cfg.t_end);
    for (t, y) in traj.sample(101) {
        assert!(
            (y[0] - a * (omega * t).sin()).abs() < GLOBAL_REL_AT_1E8 * a,
            "t = {t}"
        );
        assert!(
            (y[1] - a * omega * (omega * t).cos()).abs() < GLOBAL_REL_AT_1E8 * a * omega,
            "t = {t}"
        );
    }
    // Lean: one full period of SHM at rtol 1e-8 takes about 90 steps
    // (measured 548 evaluations, global error 0.5·rtol); a release is a
    // quarter period, so a few hundred evaluations per release + impact.
    assert!(sol.stats.rhs_evaluations < 600, "{:?}", sol.stats);
}

#[test]
fn shm_period_does_not_depend_on_amplitude() {
    // Period T = 2π·√(m/k) for any amplitude (SHM, common practice).
    let (m, k): (f64, f64) = (0.5, 200.0);
    let period = 2.0 * PI * (m / k).sqrt();
    let sys = Shm { omega2: k / m };
    for a in [1e-3, 1.0, 1e3] {
        let mut obs = Crossings::default();
        let cfg = SolverConfig {
            t_end: 3.5 * period,
            atol: 1e-12 * a,
            ..SolverConfig::default()
        };
        // A crossing exactly at t0 is never reported, so start at the
        // negative peak: rising crossings at T/4, 5T/4, 9T/4 and 13T/4.
        solve(&sys, 0.0, [-a, 0.0], &cfg, &mut obs).unwrap();
        assert_eq!(obs.0.len(), 4, "amplitude {a}");
        for w in obs.0.windows(2) {
            assert!(
                ((w[1] - w[0]) - period).abs() < EVENT_TIME_REL * period,
                "a = {a}"
            );
        }
        assert!((obs.0[0] - period / 4.0).abs() < EVENT_TIME_REL * period);
    }
}

struct FreeFall {
    g: f64,
}

impl OdeSystem<2> for FreeFall {
    fn rhs(&self, _t: f64, y: &[f64; 2], dy: &mut [f64; 2]) {
        dy[0] = y[1];
        dy[1] = -self.g;
    }
    fn event_count(&self) -> usize {
        1
    }
    fn event(&self, _i: usize, _t: f64, y: &[f64; 2]) -> f64 {
        y[0]
    }
    fn event_spec(&self, _i: usize) -> EventSpec {
        EventSpec::terminal(Direction::Falling)
    }
}

#[test]
fn free_fall_lands_at_the_closed_form_time() {
    // z = h − ½·g·t² reaches 0 at t = √(2h/g), speed √(2gh) (free fall,
    // common practice); g_n exact (CGPM 1901).
    let (h, g) = (1.25, crate::G_N);
    let sol = integrate(&FreeFall { g }, 0.0, [h, 0.0], &SolverConfig::default()).unwrap();
    assert_eq!(sol.stop, StopReason::Event { index: 0 });
    let t_exact = (2.0 * h / g).sqrt();
    assert!((sol.t - t_exact).abs() < ROUNDING * t_exact);
    assert!((sol.y[1] + (2.0 * g * h).sqrt()).abs() < ROUNDING * (2.0 * g * h).sqrt());
    assert!(sol.y[0].abs() < ROUNDING * h);
}

struct Orifice {
    c_over_m: f64,
    stroke: f64,
}

impl OdeSystem<2> for Orifice {
    fn rhs(&self, _t: f64, y: &[f64; 2], dy: &mut [f64; 2]) {
        dy[0] = y[1];
        dy[1] = -self.c_over_m * y[1] * y[1].abs();
    }
    fn event_count(&self) -> usize {
        1
    }
    fn event(&self, _i: usize, _t: f64, y: &[f64; 2]) -> f64 {
        y[0] - self.stroke
    }
    fn event_spec(&self, _i: usize) -> EventSpec {
        EventSpec::terminal(Direction::Rising)
    }
}

#[test]
fn orifice_damper_speed_decays_exponentially_with_travel() {
    // m·dv/dt = −c·v² ⇒ v·dv/dx = −(c/m)·v² ⇒ v(x) = v₀·exp(−c·x/m), and
    // t(x) = (m/c)·(exp(c·x/m) − 1)/v₀ (separation of variables, common
    // practice).
    let (m, c, v0, s) = (20.0, 400.0, 1.5, 0.08);
    let sys = Orifice {
        c_over_m: c / m,
        stroke: s,
    };
    let sol = integrate(&sys, 0.0, [0.0, v0], &SolverConfig::default()).unwrap();
    assert_eq!(sol.stop, StopReason::Event { index: 0 });
    let v_exact = v0 * (-c * s / m).exp();
    let t_exact = (m / c) * ((c * s / m).exp() - 1.0) / v0;
    assert!((sol.y[1] - v_exact).abs() < GLOBAL_REL_AT_1E8 * v0);
    assert!((sol.t - t_exact).abs() < EVENT_TIME_REL * t_exact);
}

struct HalfAmplitude {
    omega2: f64,
    level: f64,
}

impl OdeSystem<2> for HalfAmplitude {
    fn rhs(&self, _t: f64, y: &[f64; 2], dy: &mut [f64; 2]) {
        dy[0] = y[1];
        dy[1] = -self.omega2 * y[0];
    }
    fn event_count(&self) -> usize {
        2
    }
    fn event(&self, i: usize, _t: f64, y: &[f64; 2]) -> f64 {
        match i {
            0 => y[0] - self.level, // reached only after event 1
            _ => y[1],              // speed falls through zero at the peak
        }
    }
    fn event_spec(&self, i: usize) -> EventSpec {
        match i {
            0 => EventSpec::terminal(Direction::Falling),
            _ => EventSpec::reported(Direction::Falling),
        }
    }
}

#[test]
fn events_are_located_on_the_dense_output_and_the_earliest_terminal_wins() {
    // x = A·sin(ωt): the speed is zero at ωt = π/2 (reported), then x falls
    // through A/2 at ωt = 5π/6 (terminal). SHM closed form, common practice.
    let (omega, a) = (7.0, 0.3);
    let sys = HalfAmplitude {
        omega2: omega * omega,
        level: 0.5 * a,
    };
    struct Peaks(Vec<f64>);
    impl Observer<2> for Peaks {
        fn event(&mut self, _i: usize, t: f64, _y: &[f64; 2]) {
            self.0.push(t);
        }
    }
    let mut peaks = Peaks(Vec::new());
    let sol = solve(
        &sys,
        0.0,
        [0.0, a * omega],
        &SolverConfig::default(),
        &mut peaks,
    )
    .unwrap();
    assert_eq!(sol.stop, StopReason::Event { index: 0 });
    let t_half = 5.0 * PI / (6.0 * omega);
    assert!((sol.t - t_half).abs() < EVENT_TIME_REL * t_half);
    assert!((sol.y[0] - 0.5 * a).abs() < GLOBAL_REL_AT_1E8 * a);
    assert_eq!(peaks.0.len(), 1);
    assert!((peaks.0[0] - PI / (2.0 * omega)).abs() < EVENT_TIME_REL * t_half);
}

#[test]
fn dense_output_is_continuous_and_matches_the_slope_at_the_nodes() {
    let sys = Shm { omega2: 9.0 };
    let mut traj = Trajectory::new();
    let cfg = SolverConfig {
        t_end: 2.0,
        ..SolverConfig::default()
    };
    solve(&sys, 0.0, [1.0, 0.0], &cfg, &mut traj).unwrap();
    let steps = traj.steps();
    assert!(steps.len() > 3);
    for w in steps.windows(2) {
        let (s0, s1) = (&w[0], &w[1]);
        let end = s0.eval(s0.t_stop);
        let start = s1.eval(s1.t0);
        // Both are the same accepted state: equal up to rounding.
        assert!((end[0] - start[0]).abs() < ROUNDING);
        let d_end = s0.derivative(s0.t_stop);
        let d_start = s1.derivative(s1.t0);
        assert!((d_end[0] - d_start[0]).abs() < ROUNDING * 10.0);
        assert!((d_end[0] - start[1]).abs() < ROUNDING * 10.0);
    }
    // Mid-step accuracy against cos(3t).
    for s in steps {
        let tm = s.t0 + 0.5 * s.h;
        assert!((s.eval(tm)[0] - (3.0 * tm).cos()).abs() < GLOBAL_REL_AT_1E8);
    }
}

#[test]
fn a_blow_up_ends_with_a_typed_error_not_a_hang() {
    // y' = y², y(0) = 1 has y = 1/(1 − t): singular at t = 1.
    let sys = FnSystem(|_t: f64, y: &[f64; 1], dy: &mut [f64; 1]| dy[0] = y[0] * y[0]);
    let cfg = SolverConfig {
        t_end: 2.0,
        ..SolverConfig::default()
    };
    let err = integrate(&sys, 0.0, [1.0], &cfg).unwrap_err();
    assert!(
        matches!(
            err,
            OdeError::StepUnderflow { .. }
                | OdeError::NonFinite { .. }
                | OdeError::TooManySteps { .. }
        ),
        "{err:?}"
    );
}

#[test]
fn the_step_cap_is_enforced() {
    let sys = Shm { omega2: 1e6 };
    let cfg = SolverConfig {
        t_end: 100.0,
        max_steps: 50,
        ..SolverConfig::default()
    };
    let err = integrate(&sys, 0.0, [1.0, 0.0], &cfg).unwrap_err();
    assert!(
        matches!(err, OdeError::TooManySteps { steps: 50, .. }),
        "{err:?}"
    );
}

#[test]
fn bad_settings_are_input_errors() {
    let sys = Shm { omega2: 1.0 };
    for cfg in [
        SolverConfig {
            rtol: 0.0,
            t_end: 1.0,
            ..SolverConfig::default()
        },
        SolverConfig {
            atol: f64::NAN,
            t_end: 1.0,
            ..SolverConfig::default()
        },
        SolverConfig {
            t_end: -1.0,
            ..SolverConfig::default()
        },
        SolverConfig {
            max_step: 0.0,
            t_end: 1.0,
            ..SolverConfig::default()
        },
    ] {
        assert!(matches!(
            integrate(&sys, 0.0, [1.0, 0.0], &cfg),
            Err(OdeError::Input(_))
        ));
    }
    let cfg = SolverConfig {
        t_end: 1.0,
        ..SolverConfig::default()
    };
    assert!(matches!(
        integrate(&sys, 0.0, [f64::NAN, 0.0], &cfg),
        Err(OdeError::Input(_))
    ));
}

#[test]
fn step_rejections_recover_from_a_kink() {
    // |x|-type kink in the right-hand side: still converges and counts work.
    let sys = FnSystem(|t: f64, _y: &[f64; 1], dy: &mut [f64; 1]| {
        dy[0] = if t < 0.3 { 1.0 } else { -2.0 }
    });
    let cfg = SolverConfig {
        t_end: 1.0,
        ..SolverConfig::default()
    };
    let sol = integrate(&sys, 0.0, [0.0], &cfg).unwrap();
    // ∫ = 0.3 − 2·0.7 = −1.1; the kink costs accuracy only near 1e-8.
    assert!((sol.y[0] + 1.1).abs() < GLOBAL_REL_AT_1E8 * 10.0);
    assert!(sol.stats.rejected_steps > 0);
}

#[test]
fn approximate_power_of_the_controller_is_close_enough() {
    // The controller's x^p must track powf to ~1e-5 (its truncated series:
    // 2·(1/3)⁹/9 for the logarithm, (ln 2)⁸/8! for the exponential).
    const APPROX_POW_REL: f64 = 2e-5;
    for &p in &[EXPO1, BETA, 0.2] {
        for i in -300..300 {
            let x = 1.37f64.powi(i);
            let r = (approx_pow(x, p) - x.powf(p)).abs() / x.powf(p);
            assert!(r < APPROX_POW_REL, "{x}^{p}: {r}");
        }
    }
    assert_eq!(approx_pow(0.0, 0.17), 0.0);
}
