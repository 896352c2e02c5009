//! Validation helpers (work in progress).
#![forbid(unsafe_code)]
