//! Mounts the app (being written).
fn main() {}
