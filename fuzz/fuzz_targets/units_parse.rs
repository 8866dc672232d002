//! Fuzz target: the unit parser on any text, for every kind of quantity
//! (`joulewise_tests::robust::check_unit_text`): a value read is finite and
//! never −0, formatting it in the unit typed and reading it back gives the
//! same value, a refusal has a message, a tolerance read is finite and not
//! negative; nothing panics.
#![no_main]
#![forbid(unsafe_code)]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    if let Err(e) = joulewise_tests::robust::check_unit_bytes(data) {
        panic!("{e}");
    }
});
