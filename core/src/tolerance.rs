//! tolerance (being written).
