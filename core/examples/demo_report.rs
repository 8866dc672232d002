//! Prints the key figures and checks of every demo scenario (a quick look
//! while developing: `cargo run -p joulewise-core --example demo_report`).
#![forbid(unsafe_code)]
use joulewise_core::scenario::demos;
use joulewise_core::units::{format_quantity, UnitSystem};

fn main() {
    for d in demos::all() {
        let s = (d.build)();
        let r = match joulewise_core::assess::assess_with_study(&s) {
            Ok(r) => r,
            Err(e) => {
                println!("{}: {e}", d.key);
                continue;
            }
        };
        println!("=== {} ({:?}, {} errors)", d.key, r.verdict, r.errors.len());
        for e in &r.errors {
            println!("  ERROR {e}");
        }
        for f in &r.figures {
            match f.value {
                Some(v) => println!(
                    "  {:<34} {}",
                    f.id,
                    format_quantity(v, f.dim, UnitSystem::Si)
                ),
                None => println!("  {:<34} missing: {}", f.id, f.missing.join("; ")),
            }
        }
        for c in &r.checks {
            println!(
                "  CHECK {:<40} {:?} value {:?} limit {:?}",
                c.label, c.verdict, c.value, c.limit
            );
        }
        for n in &r.notes {
            println!("  NOTE {n}");
        }
        println!(
            "  cautions: {}",
            r.cautions
                .iter()
                .map(|c| c.caution.title.clone())
                .collect::<Vec<_>>()
                .join(" | ")
        );
        if let Some(st) = &r.study {
            if let Some(mc) = &st.monte_carlo {
                for (i, (id, dim)) in st.figures.iter().enumerate() {
                    if let Some(s) = mc.figures[i].summary {
                        println!(
                            "  MC {:<34} p50 {} p95 {} max {}",
                            id,
                            format_quantity(s.p50, *dim, UnitSystem::Si),
                            format_quantity(s.p95, *dim, UnitSystem::Si),
                            format_quantity(s.max, *dim, UnitSystem::Si)
                        );
                    }
                }
                for l in &mc.limits {
                    println!("  MC limit {} P(exceed) = {:?}", l.limit.id, l.probability);
                }
            }
        }
    }
}
