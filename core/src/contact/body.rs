//! body contact (being written).
