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
//!
//! ```
//! // Write the tilting-pad example design, then analyse it, all in-process.
//! let (mut out, mut err) = (Vec::new(), Vec::new());
//! assert_eq!(padwright::cli::run(["padwright", "example", "tilting"], &mut out, &mut err), 0);
//! let path = std::env::temp_dir().join("padwright-doc-example.ron");
//! std::fs::write(&path, &out).unwrap();
//! let mut json = Vec::new();
//! let code = padwright::cli::run(["padwright", "solve", path.to_str().unwrap(), "--json"], &mut json, &mut err);
//! assert_eq!(code, 0);
//! assert!(String::from_utf8(json).unwrap().contains("min_film_thickness_m"));
//! ```
#![forbid(unsafe_code)]

pub mod cli;
pub mod design_file;
pub mod error;
pub mod report;
pub mod templates;
pub mod units;

/// Builds a caution text around the sentence that names the temperature model.
macro_rules! caution_text {
    ($model:literal) => {
        concat!(
            "CAUTION: preliminary sizing only. These figures come from a simplified model (laminar \
             film, rigid pads apart from any crown given or computed) ",
            $model,
            ". Before relying on them, check the design against the applicable standards, the \
             bearing maker's data and the judgement of a licensed engineer."
        )
    };
}

/// The caution printed with results of the effective-temperature model: this tool sizes, it
/// does not certify.
pub const CAUTION: &str = caution_text!("with an effective film temperature assumed by the user");

/// The caution printed with results of the bulk thermal model.
pub const CAUTION_BULK: &str = caution_text!(
    "with one film temperature from a bulk heat balance; its pad temperatures are rough \
     estimates"
);

/// The caution printed with results of the film-temperature field model.
pub const CAUTION_FIELD: &str = caution_text!(
    "with a film-averaged temperature field from a simplified heat balance; real pad \
     temperatures depend on details it leaves out"
);

/// The caution that goes with results of a design with film-temperature model `t`.
pub fn caution(t: &padwright_solver::prelude::FilmTemperature) -> &'static str {
    use padwright_solver::prelude::FilmTemperature;
    match t {
        FilmTemperature::Effective { .. } => CAUTION,
        FilmTemperature::Bulk { .. } => CAUTION_BULK,
        FilmTemperature::Field(_) => CAUTION_FIELD,
    }
}
