//! gap contact (being written).
