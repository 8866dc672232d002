//! Fuzz target: any bytes as a scenario file. `Scenario::from_bytes` either
//! refuses them with a message, or the scenario is assessed (full and
//! summary) and every number in both reports must be finite, every input
//! error must name its field, and nothing may panic
//! (`joulewise_tests::robust::check_bytes`).
#![no_main]
#![forbid(unsafe_code)]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    if let Err(e) = joulewise_tests::robust::check_bytes(data, None) {
        panic!("{e}");
    }
});
