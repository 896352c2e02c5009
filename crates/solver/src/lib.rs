//! # padwright-solver
//!
//! The numerical core of Padwright: the 2D Reynolds equation on fixed (tapered-land, flat) and
//! tilting thrust pads, pad equilibrium on a pivot, lubricant models, and per-pad and bearing
//! results. Pure Rust, no I/O, no user interface; SI units throughout (m, s, kg, Pa, N, W, K).
//!
//! ```
//! use padwright_solver::prelude::*;
//!
//! let design = BearingDesign {
//!     pad_count: 6,
//!     outline: PadOutline::Sector { inner_radius: 0.05, outer_radius: 0.10, arc: 50f64.to_radians() },
//!     support: Support::TiltingPoint { offset_along: 0.6, offset_across: 0.5 },
//!     crown: 0.0,
//!     speed: RunnerSpeed::Angular(3000.0 * std::f64::consts::PI / 30.0),
//!     duty: Duty::Load(20e3),
//!     lubricant: Lubricant::from_iso_vg(IsoVg::Vg46, 100.0).unwrap(),
//!     temperature: FilmTemperature::Effective { temperature: 273.15 + 60.0 },
//!     numerics: Numerics::default(),
//! };
//! let result = analyze(&design).expect("this bearing carries its load");
//! assert!(result.pad.min_film > 5e-6);
//! assert!(result.power_loss > 0.0);
//! ```
#![forbid(unsafe_code)]

pub mod bearing;
pub mod equilibrium;
pub mod error;
pub mod film;
pub mod flow;
pub mod geometry;
pub mod grid;
pub mod lubricant;
pub mod pad;
pub mod results;
pub mod reynolds;
pub mod sweep;
pub mod thermal;

/// The types most programs need.
pub mod prelude {
    pub use crate::bearing::{BearingDesign, Duty, FilmTemperature, Numerics, analyze};
    pub use crate::error::{InputError, SolverError};
    pub use crate::film::Support;
    pub use crate::geometry::{PadOutline, RunnerSpeed};
    pub use crate::lubricant::{IsoVg, Lubricant};
    pub use crate::results::BearingResult;
    pub use crate::thermal::{FieldSettings, HeatPaths, OilSupply, PadConduction};
}
