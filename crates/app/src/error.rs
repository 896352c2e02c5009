//! Typed errors of the application, worded for the engineer reading them.
//!
//! Solver errors are passed through untouched: their messages are already written for people.

use std::path::PathBuf;

use padwright_solver::lubricant::LubricantError;
use padwright_solver::prelude::SolverError;

/// Why a design file could not be read into a design, or a design written out as a file.
#[derive(Debug, thiserror::Error)]
pub enum DesignError {
    /// The text is not RON, or does not have the fields and sections of a design file.
    #[error("line {}, column {}: {}", .0.span.start.line, .0.span.start.col, .0.code)]
    Syntax(#[from] ron::error::SpannedError),
    /// The file has no `format_version` line.
    #[error(
        "the file has no `format_version`; a design file starts with `format_version: {supported},`"
    )]
    MissingVersion {
        /// The version this program reads.
        supported: u32,
    },
    /// The file was written for another version of the format.
    #[error(
        "format_version {found} is not supported: this Padwright reads design files of \
         format_version {supported} (a file from a newer Padwright needs that newer version)"
    )]
    UnsupportedVersion {
        /// The version in the file.
        found: u32,
        /// The version this program reads.
        supported: u32,
    },
    /// A value that cannot be right, named by its field in the file.
    #[error("`{field}` = {value}: {reason}")]
    BadValue {
        /// The field, with its section (`outline.inner_radius_mm`).
        field: String,
        /// The value found.
        value: String,
        /// What is wrong and what is expected, with units.
        reason: String,
    },
    /// The oil could not be built from its properties.
    #[error("oil: {0}")]
    Oil(#[from] LubricantError),
    /// The values read fine but do not describe a bearing the solver accepts.
    #[error("{0}")]
    Design(#[from] SolverError),
    /// A design that the file format cannot express (for example a sector pad with a sliding
    /// speed).
    #[error("this design cannot be written as a design file: {0}")]
    NotRepresentable(String),
    /// Writing RON text failed.
    #[error("could not write the design as RON: {0}")]
    Write(#[from] ron::Error),
}

/// Everything the command line can report as a failure.
#[derive(Debug, thiserror::Error)]
pub enum AppError {
    /// A file could not be read.
    #[error("cannot read {}: {source}", path.display())]
    Read {
        /// The file.
        path: PathBuf,
        /// What the system said.
        source: std::io::Error,
    },
    /// A file could not be written.
    #[error("cannot write {}: {source}", path.display())]
    Write {
        /// The file.
        path: PathBuf,
        /// What the system said.
        source: std::io::Error,
    },
    /// The output file exists and overwriting was not asked for.
    #[error("{} already exists; pass --force to overwrite it", path.display())]
    WouldOverwrite {
        /// The file.
        path: PathBuf,
    },
    /// The design file is not valid.
    #[error("{}: {source}", path.display())]
    Design {
        /// The file.
        path: PathBuf,
        /// What is wrong with it.
        source: Box<DesignError>,
    },
    /// The analysis did not produce a result.
    #[error("the analysis failed: {0}")]
    Analysis(#[from] SolverError),
    /// A result value is not a finite number (a defect: it is refused rather than shown).
    #[error(
        "the result `{what}` is not a finite number ({value}); no results are shown. This \
         is a defect of Padwright: please report it with the design file"
    )]
    NonFinite {
        /// Which result.
        what: String,
        /// The value.
        value: f64,
    },
    /// Writing JSON failed.
    #[error("could not write the JSON results: {0}")]
    Json(#[from] serde_json::Error),
    /// Writing to the terminal failed.
    #[error("could not write the output: {0}")]
    Output(#[from] std::io::Error),
}
