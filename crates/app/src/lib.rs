//! Padwright application library (work in progress).
#![forbid(unsafe_code)]
