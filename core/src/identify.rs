//! identify (being written).
