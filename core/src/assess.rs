//! assess (being written).
