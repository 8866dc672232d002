//! limits (being written).
