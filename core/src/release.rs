//! release (being written).
