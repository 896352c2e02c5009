//! # padwright (application)
//!
//! Everything between a person and the numerical core: the design file in engineering units,
//! the command line, and the results as a text table or as JSON. The physics lives in
//! `padwright-solver`, which works in SI units only; this crate converts at its edges and
//! nowhere else.
//!
//! * [`units`] — every conversion between engineering units and SI, tested both ways;
//! * [`design_file`] — the RON design file (format version, fields with units, defaults) and
//!   its conversion to and from the solver's design;
//! * [`report`] — the results as a readable table and as JSON with unit-suffixed keys;
//! * [`templates`] — the commented example designs behind `padwright example`;
//! * [`cli`] — the command line, callable in-process through [`cli::run`];
//! * [`error`] — the typed errors shown to the user.
#![forbid(unsafe_code)]

pub mod cli;
pub mod design_file;
pub mod error;
pub mod report;
pub mod templates;
pub mod units;

/// The caution printed with every result: this tool sizes, it does not certify.
pub const CAUTION: &str = "CAUTION: preliminary sizing only. These figures come from a \
simplified model with an assumed effective film temperature. Before relying on them, check the \
design against the applicable standards, the bearing maker's data and the judgement of a \
licensed engineer.";
