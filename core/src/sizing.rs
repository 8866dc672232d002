//! sizing (being written).
