//! `cargo xtask` (being written).
fn main() {}
