//! Contact at the end of travel: impact on an end-of-travel buffer
//! ([`buffer`]), two-body contact with a human body region ([`body`]), and the
//! gap left at a closing point ([`gap`]).

pub mod body;
pub mod buffer;
pub mod gap;
