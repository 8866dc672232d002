//! Joulewise web front end (being written): formats what the core returns.
#![forbid(unsafe_code)]
