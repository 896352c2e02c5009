//! Padwright command line.
fn main() {}
