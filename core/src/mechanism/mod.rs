//! mechanism (being written).
