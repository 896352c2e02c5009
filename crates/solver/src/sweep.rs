//! Parameter sweeps: many independent analyses run in parallel with rayon.
//!
//! Each design gets its own solver workspace, so the analyses share nothing and scale with the
//! number of cores. The order of the results follows the order of the designs.

use crate::bearing::{BearingDesign, analyze};
use crate::error::SolverError;
use crate::results::BearingResult;
use rayon::prelude::*;

/// Analyses every design, in parallel on the current rayon thread pool.
pub fn analyze_many(designs: &[BearingDesign]) -> Vec<Result<BearingResult, SolverError>> {
    designs.par_iter().map(analyze).collect()
}

/// The designs of a one-parameter sweep: `base` with `vary` applied for each value.
pub fn variants<T: Copy>(
    base: &BearingDesign,
    values: &[T],
    vary: impl Fn(&mut BearingDesign, T),
) -> Vec<BearingDesign> {
    values
        .iter()
        .map(|&v| {
            let mut d = base.clone();
            vary(&mut d, v);
            d
        })
        .collect()
}
