//! ISO 3448 viscosity grades used for bearing oils.
//!
//! # Model
//!
//! ISO 3448 names industrial liquid lubricants by their mid-point kinematic
//! viscosity at 40 °C in mm²/s ("ISO VG 46" = 46 mm²/s), and allows the
//! measured 40 °C viscosity of an oil of that grade to lie within ±10 % of the
//! mid-point. This module covers the grades met in hydrodynamic thrust
//! bearings, ISO VG 22 to ISO VG 100.
//!
//! Viscosities are in **mm²/s**, the unit in which the standard states them;
//! the names say so. A grade alone does not fix the oil's 100 °C viscosity: it
//! needs a viscosity index too (see [`DEFAULT_TURBINE_OIL_VISCOSITY_INDEX`] and
//! [`super::Lubricant::from_iso_vg`]).
//!
//! Source: ISO 3448, Industrial liquid lubricants — ISO viscosity
//! classification (mid-point kinematic viscosity at 40 °C and ±10 % limits).

use std::fmt;

use serde::{Deserialize, Serialize};

use super::error::LubricantError;

/// Half-width of the ISO 3448 band around the mid-point viscosity, as a fraction (±10 %).
pub const ISO_3448_BAND_FRACTION: f64 = 0.10;

/// Viscosity index assumed for a mineral (paraffinic, solvent-refined) turbine oil
/// when none is given: 100.
///
/// Common practice, no source: such oils typically have VI between about 95 and
/// 105 (value from memory); 100 is the round middle of that range.
pub const DEFAULT_TURBINE_OIL_VISCOSITY_INDEX: f64 = 100.0;

/// An ISO 3448 viscosity grade (ISO VG) of those used for bearing oils.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
pub enum IsoVg {
    /// ISO VG 22: mid-point 22 mm²/s at 40 °C.
    #[serde(rename = "ISO VG 22")]
    Vg22,
    /// ISO VG 32: mid-point 32 mm²/s at 40 °C.
    #[serde(rename = "ISO VG 32")]
    Vg32,
    /// ISO VG 46: mid-point 46 mm²/s at 40 °C.
    #[serde(rename = "ISO VG 46")]
    Vg46,
    /// ISO VG 68: mid-point 68 mm²/s at 40 °C.
    #[serde(rename = "ISO VG 68")]
    Vg68,
    /// ISO VG 100: mid-point 100 mm²/s at 40 °C.
    #[serde(rename = "ISO VG 100")]
    Vg100,
}

/// The ISO 3448 band of kinematic viscosity at 40 °C for a grade, in mm²/s.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Nu40BandMm2S {
    /// Lowest kinematic viscosity at 40 °C allowed for the grade, in mm²/s.
    pub min_mm2_s: f64,
    /// Highest kinematic viscosity at 40 °C allowed for the grade, in mm²/s.
    pub max_mm2_s: f64,
}

impl Nu40BandMm2S {
    /// Whether `nu40_mm2_s` (mm²/s) lies in the band, limits included.
    pub fn contains(&self, nu40_mm2_s: f64) -> bool {
        (self.min_mm2_s..=self.max_mm2_s).contains(&nu40_mm2_s)
    }
}

impl IsoVg {
    /// All supported grades, thinnest first.
    pub const ALL: [IsoVg; 5] = [
        IsoVg::Vg22,
        IsoVg::Vg32,
        IsoVg::Vg46,
        IsoVg::Vg68,
        IsoVg::Vg100,
    ];

    /// The grade number (22, 32, 46, 68 or 100).
    pub fn grade_number(self) -> u32 {
        match self {
            IsoVg::Vg22 => 22,
            IsoVg::Vg32 => 32,
            IsoVg::Vg46 => 46,
            IsoVg::Vg68 => 68,
            IsoVg::Vg100 => 100,
        }
    }

    /// The grade with the given number.
    ///
    /// # Errors
    /// [`LubricantError::UnknownIsoGrade`] for any number other than 22, 32, 46, 68, 100.
    pub fn from_grade_number(grade: u32) -> Result<Self, LubricantError> {
        IsoVg::ALL
            .into_iter()
            .find(|g| g.grade_number() == grade)
            .ok_or(LubricantError::UnknownIsoGrade { grade })
    }

    /// Mid-point kinematic viscosity at 40 °C, in mm²/s (equal to the grade number).
    pub fn nominal_nu40_mm2_s(self) -> f64 {
        f64::from(self.grade_number())
    }

    /// The ISO 3448 band of kinematic viscosity at 40 °C, in mm²/s: the mid-point ±10 %.
    pub fn nu40_band_mm2_s(self) -> Nu40BandMm2S {
        let nominal = self.nominal_nu40_mm2_s();
        Nu40BandMm2S {
            min_mm2_s: nominal * (1.0 - ISO_3448_BAND_FRACTION),
            max_mm2_s: nominal * (1.0 + ISO_3448_BAND_FRACTION),
        }
    }
}

impl fmt::Display for IsoVg {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "ISO VG {}", self.grade_number())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn grade_numbers_round_trip() {
        for g in IsoVg::ALL {
            assert_eq!(IsoVg::from_grade_number(g.grade_number()).unwrap(), g);
        }
        assert!(matches!(
            IsoVg::from_grade_number(150),
            Err(LubricantError::UnknownIsoGrade { grade: 150 })
        ));
    }

    #[test]
    fn display_names_the_grade() {
        assert_eq!(IsoVg::Vg46.to_string(), "ISO VG 46");
    }

    /// The grades are listed thinnest first and their bands do not overlap
    /// (ISO 3448: adjacent grades are separated by gaps).
    #[test]
    fn bands_are_ordered_and_disjoint() {
        for pair in IsoVg::ALL.windows(2) {
            assert!(pair[0].nu40_band_mm2_s().max_mm2_s < pair[1].nu40_band_mm2_s().min_mm2_s);
        }
    }
}
