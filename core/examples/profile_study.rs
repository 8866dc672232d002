//! Profiling driver (development aid): runs one workload in a loop with no
//! timing of its own, for `valgrind --tool=callgrind` or `perf`.
//!
//! ```text
//! cargo build -p joulewise-core --example profile_study --profile fast
//! valgrind --tool=callgrind target/fast/examples/profile_study study 1000
//! ```
//! Workloads: `study N` (the carriage demo's tolerance study with N Monte
//! Carlo samples), `assess N` and `summary N` (N runs of `assess` /
//! `assess_summary` on every demo).

#![forbid(unsafe_code)]
use joulewise_core::assess::{assess, assess_summary, Study};
use joulewise_core::scenario::demos;

fn main() {
    let what = std::env::args().nth(1).unwrap_or_else(|| "study".into());
    let n: usize = std::env::args()
        .nth(2)
        .and_then(|s| s.parse().ok())
        .unwrap_or(2000);
    match what.as_str() {
        "study" => {
            let mut s = demos::carriage_stop();
            s.study.samples = u32::try_from(n).unwrap_or(u32::MAX);
            let Ok(report) = assess(&s) else { return };
            let Some(mut st) = Study::new(&s, &report) else {
                return;
            };
            while !st.advance(1000) {}
            let r = st.finish();
            println!("{:?} samples", r.monte_carlo.map(|m| m.samples_run));
        }
        "assess" | "summary" => {
            for d in demos::all() {
                let s = (d.build)();
                for _ in 0..n {
                    let r = if what == "assess" {
                        assess(&s)
                    } else {
                        assess_summary(&s)
                    };
                    std::hint::black_box(r).ok();
                }
            }
        }
        other => eprintln!("unknown workload `{other}`: study, assess or summary"),
    }
}
