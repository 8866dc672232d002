//! The scenario: the whole description of one assessment, as the user typed
//! it (being written).

pub mod reader;
pub mod value;
