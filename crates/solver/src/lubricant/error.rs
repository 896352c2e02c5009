//! Errors of the lubricant module.
//!
//! Every fallible function of [`crate::lubricant`] returns [`LubricantError`]
//! instead of letting a NaN or an infinity through. Each message is a full
//! sentence that names the quantity, its value and its unit.

use thiserror::Error;

/// What can go wrong when building or evaluating a lubricant model.
///
/// Viscosities in the variants are kinematic viscosities in mm²/s unless the
/// field name says otherwise; temperatures are in kelvin.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum LubricantError {
    /// An input was NaN or infinite.
    #[error("The {quantity} must be a finite number, but {value} was given.")]
    NonFinite {
        /// Name of the quantity, with its unit.
        quantity: &'static str,
        /// The offending value.
        value: f64,
    },

    /// An input that must be strictly positive was zero or negative.
    #[error("The {quantity} must be greater than zero, but {value} was given.")]
    NotPositive {
        /// Name of the quantity, with its unit.
        quantity: &'static str,
        /// The offending value.
        value: f64,
    },

    /// An input that must not be negative was negative.
    #[error("The {quantity} must not be negative, but {value} was given.")]
    Negative {
        /// Name of the quantity, with its unit.
        quantity: &'static str,
        /// The offending value.
        value: f64,
    },

    /// Two defining points of a viscosity–temperature line share a temperature.
    #[error(
        "The two measured viscosities must be taken at different temperatures, but both are at {t_k} K."
    )]
    SameTemperature {
        /// The common temperature, in kelvin.
        t_k: f64,
    },

    /// The viscosity does not fall as the temperature rises.
    #[error(
        "The kinematic viscosity must fall as the oil warms, but it is {nu_cold_mm2_s} mm²/s at {t_cold_k} K and {nu_hot_mm2_s} mm²/s at {t_hot_k} K."
    )]
    ViscosityNotDecreasing {
        /// Colder temperature, in kelvin.
        t_cold_k: f64,
        /// Kinematic viscosity at the colder temperature, in mm²/s.
        nu_cold_mm2_s: f64,
        /// Warmer temperature, in kelvin.
        t_hot_k: f64,
        /// Kinematic viscosity at the warmer temperature, in mm²/s.
        nu_hot_mm2_s: f64,
    },

    /// A defining viscosity lies below the range of the ASTM D341 form.
    #[error(
        "The kinematic viscosity {nu_mm2_s} mm²/s is below 2 mm²/s, where the ASTM D341 form log log(ν + 0.7) is not meant to be used; give measured points of at least 2 mm²/s."
    )]
    BelowWaltherRange {
        /// The offending kinematic viscosity, in mm²/s.
        nu_mm2_s: f64,
    },

    /// A viscosity asked of the inverse Walther relation cannot occur on any line.
    #[error(
        "No temperature gives a kinematic viscosity of {nu_mm2_s} mm²/s on an ASTM D341 line: the line only approaches 0.3 mm²/s when hot, so the viscosity must exceed that."
    )]
    ViscosityUnreachable {
        /// The requested kinematic viscosity, in mm²/s.
        nu_mm2_s: f64,
    },

    /// The Walther line gives a number too large to represent.
    #[error(
        "At {t_k} K the viscosity line gives a viscosity too large to represent; the temperature is far below the range where the oil is a liquid."
    )]
    ViscosityOverflow {
        /// The temperature at which evaluation was asked, in kelvin.
        t_k: f64,
    },

    /// The inverse Walther relation gives a temperature too large to represent.
    #[error(
        "The viscosity line would reach {nu_mm2_s} mm²/s only at a temperature too large to represent."
    )]
    TemperatureOverflow {
        /// The requested kinematic viscosity, in mm²/s.
        nu_mm2_s: f64,
    },

    /// The kinematic viscosity at 100 °C is below the range of ASTM D2270.
    #[error(
        "The viscosity index is defined only for a kinematic viscosity at 100 °C of at least 2 mm²/s (ASTM D2270), but {nu100_mm2_s} mm²/s was given."
    )]
    BelowViscosityIndexRange {
        /// The offending kinematic viscosity at 100 °C, in mm²/s.
        nu100_mm2_s: f64,
    },

    /// The kinematic viscosity at 40 °C is not above that at 100 °C.
    #[error(
        "The kinematic viscosity at 40 °C ({nu40_mm2_s} mm²/s) must be greater than at 100 °C ({nu100_mm2_s} mm²/s), since an oil thins as it warms."
    )]
    Nu40NotAboveNu100 {
        /// Kinematic viscosity at 40 °C, in mm²/s.
        nu40_mm2_s: f64,
        /// Kinematic viscosity at 100 °C, in mm²/s.
        nu100_mm2_s: f64,
    },

    /// No kinematic viscosity at 40 °C gives the requested VI with the given ν100.
    #[error(
        "A viscosity index of {viscosity_index} cannot be reached with a kinematic viscosity at 100 °C of {nu100_mm2_s} mm²/s: the matching viscosity at 40 °C would not be above the one at 100 °C."
    )]
    ViscosityIndexUnreachableFromNu100 {
        /// Kinematic viscosity at 100 °C, in mm²/s.
        nu100_mm2_s: f64,
        /// The requested viscosity index.
        viscosity_index: f64,
    },

    /// No kinematic viscosity at 100 °C gives the requested VI with the given ν40.
    #[error(
        "A viscosity index of {viscosity_index} cannot be reached with a kinematic viscosity at 40 °C of {nu40_mm2_s} mm²/s: {reason}"
    )]
    ViscosityIndexUnreachableFromNu40 {
        /// Kinematic viscosity at 40 °C, in mm²/s.
        nu40_mm2_s: f64,
        /// The requested viscosity index.
        viscosity_index: f64,
        /// Why no solution exists.
        reason: &'static str,
    },

    /// The temperature is zero or negative on the kelvin scale, or not finite.
    #[error("The temperature must be a finite value above 0 K, but {t_k} K was given.")]
    InvalidTemperature {
        /// The offending temperature, in kelvin.
        t_k: f64,
    },

    /// The linear density law gives a non-positive density.
    #[error(
        "At {t_k} K the linear thermal-expansion law gives a density of {density_kg_m3} kg/m³, which is not physical; the temperature is far outside the oil's range."
    )]
    NonPositiveDensity {
        /// The temperature, in kelvin.
        t_k: f64,
        /// The density the law gives, in kg/m³.
        density_kg_m3: f64,
    },

    /// A number is not one of the ISO 3448 grades this module knows.
    #[error("ISO VG {grade} is not a supported grade; choose one of ISO VG 22, 32, 46, 68 or 100.")]
    UnknownIsoGrade {
        /// The grade number that was asked for.
        grade: u32,
    },

    /// The lower limit of the valid temperature range is not below the upper limit.
    #[error(
        "The lowest valid temperature ({min_k} K) must be below the temperature at which the oil thins to 2 mm²/s ({max_k} K)."
    )]
    InvalidTemperatureRange {
        /// Requested lower limit, in kelvin.
        min_k: f64,
        /// Upper limit set by the viscosity line, in kelvin.
        max_k: f64,
    },

    /// A temperature lies outside the range in which the viscosity model is meant to be used.
    #[error(
        "The temperature {t_k} K is outside the valid range of this oil's viscosity model, {min_k} K to {max_k} K."
    )]
    OutsideValidTemperatureRange {
        /// The temperature, in kelvin.
        t_k: f64,
        /// Lowest valid temperature, in kelvin.
        min_k: f64,
        /// Highest valid temperature, in kelvin.
        max_k: f64,
    },

    /// A setting that only applies to a temperature-dependent oil was given to an isoviscous one.
    #[error(
        "An isoviscous lubricant has no viscosity–temperature line, so {setting} does not apply to it."
    )]
    NotApplicableToIsoviscous {
        /// The setting that was refused.
        setting: &'static str,
    },
}

/// Returns `value` if it is finite, otherwise a [`LubricantError::NonFinite`] naming `quantity`.
pub(crate) fn finite(quantity: &'static str, value: f64) -> Result<f64, LubricantError> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(LubricantError::NonFinite { quantity, value })
    }
}

/// Returns `value` if it is finite and strictly positive, otherwise the matching error.
pub(crate) fn positive(quantity: &'static str, value: f64) -> Result<f64, LubricantError> {
    let value = finite(quantity, value)?;
    if value > 0.0 {
        Ok(value)
    } else {
        Err(LubricantError::NotPositive { quantity, value })
    }
}

/// Returns `value` if it is finite and not negative, otherwise the matching error.
pub(crate) fn non_negative(quantity: &'static str, value: f64) -> Result<f64, LubricantError> {
    let value = finite(quantity, value)?;
    if value >= 0.0 {
        Ok(value)
    } else {
        Err(LubricantError::Negative { quantity, value })
    }
}

/// Returns `t_k` if it is a finite temperature above absolute zero, in kelvin.
pub(crate) fn temperature_k(t_k: f64) -> Result<f64, LubricantError> {
    if t_k.is_finite() && t_k > 0.0 {
        Ok(t_k)
    } else {
        Err(LubricantError::InvalidTemperature { t_k })
    }
}
