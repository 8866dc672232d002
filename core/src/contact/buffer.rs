//! buffer contact (being written).
