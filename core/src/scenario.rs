//! scenario (being written).
