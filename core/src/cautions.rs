//! cautions (being written).
