//! Fuzz target, structure-aware: the bytes choose a seed scenario (demos
//! and variants covering every model) and a few edits (hostile numeric
//! texts, tolerances, subtrees spliced from other seeds, springs wrapped in
//! series or parallel, edge integers, flipped flags, list elements
//! duplicated or dropped; `joulewise_tests::robust::mutate`). The result is
//! assessed in full and in summary, and a tolerance study runs when at most
//! two inputs carry a tolerance (Monte Carlo capped at 8 samples); every
//! number must be finite and nothing may panic.
#![no_main]
#![forbid(unsafe_code)]

use joulewise_tests::robust::mutate::{Bytes, Mutator};
use libfuzzer_sys::fuzz_target;
use std::sync::OnceLock;

static MUTATOR: OnceLock<Mutator> = OnceLock::new();

fuzz_target!(|data: &[u8]| {
    let m = MUTATOR.get_or_init(Mutator::new);
    if let Some(s) = m.mutate(&mut Bytes::new(data)) {
        if let Err(e) = joulewise_tests::robust::check_scenario(&s, Some((8, 2))) {
            panic!("{e}\nscenario: {}", s.to_json());
        }
    }
});
