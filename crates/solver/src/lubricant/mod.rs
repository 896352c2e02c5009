//! Lubricant properties: viscosity against temperature, density, specific heat
//! and thermal conductivity of a bearing oil.
//!
//! # What is modelled
//!
//! A [`Lubricant`] is a Newtonian, incompressible mineral oil whose properties
//! depend on temperature only (no pressure–viscosity or shear-thinning effect).
//! It can be defined three ways:
//!
//! - by an ISO 3448 grade ([`IsoVg`]) and a viscosity index: ν40 is the grade's
//!   mid-point and ν100 follows from the inverse of ASTM D2270;
//! - by measured kinematic viscosities at 40 °C and 100 °C;
//! - as isoviscous, with a constant dynamic viscosity, for validation against
//!   closed-form solutions and for quick looks.
//!
//! # Equations
//!
//! - Kinematic viscosity, ASTM D341 (Walther form), ν in mm²/s and T in K
//!   ([`walther`]): `log10 log10(ν + 0.7) = A − B·log10(T)`, fitted through
//!   (40 °C, ν40) and (100 °C, ν100).
//! - Viscosity index, ASTM D2270 Procedures A and B ([`viscosity_index`](mod@viscosity_index)).
//! - Density, linear thermal expansion about 15 °C:
//!   `ρ(T) = ρ15·(1 − α·(T − 288.15 K))`.
//! - Dynamic viscosity: `μ(T) = ρ(T)·ν(T)`, with ν converted from mm²/s to m²/s
//!   (1 mm²/s = 1e-6 m²/s).
//! - Its temperature derivative, analytic:
//!   `dμ/dT = (dρ/dT·ν + ρ·dν/dT)·1e-6`, `dρ/dT = −ρ15·α`,
//!   `dν/dT = −B·ln(10)·(ν + 0.7)·log10(ν + 0.7)/T` (ν in mm²/s).
//! - Specific heat and thermal conductivity: constants.
//!
//! # Units
//!
//! The [`Lubricant`] interface is SI throughout: temperatures in **kelvin**,
//! kinematic viscosity in **m²/s**, dynamic viscosity in **Pa·s**, density in
//! **kg/m³**, specific heat in **J/(kg·K)**, thermal conductivity in
//! **W/(m·K)**, thermal expansion coefficient in **1/K**. The standards'
//! own functions ([`walther`], [`viscosity_index`](mod@viscosity_index), [`grades`]) keep the
//! standards' units — kinematic viscosity in mm²/s, temperature in kelvin —
//! and say so in every name (`nu40_mm2_s`, `t_k`). Use [`mm2_s_to_m2_s`],
//! [`m2_s_to_mm2_s`] and [`celsius_to_kelvin`] to cross between them.
//!
//! # Defaults
//!
//! Unless set otherwise: ρ15 = 870 kg/m³ and α = 6.5e-4 1/K (common practice,
//! values from memory, typical of mineral turbine oils); specific heat
//! 2000 J/(kg·K) and thermal conductivity 0.13 W/(m·K) (common practice, values
//! from memory); lowest valid temperature −20 °C (253.15 K; common practice, no
//! source: near the pour point of a mineral turbine oil, below which the oil is
//! no longer a simple Newtonian liquid). The highest valid temperature is where
//! ν falls to 2 mm²/s, the lower limit of the simple ASTM D341 form.
//!
//! # Sources
//!
//! ASTM D341 (viscosity–temperature equation), ASTM D2270 (viscosity index,
//! Table 1 and formulas), ISO 3448 (viscosity grades). Defaults as noted above.

mod d2270_table;
mod error;
pub mod grades;
pub mod table;
pub mod viscosity_index;
pub mod walther;

use serde::{Deserialize, Serialize};

use error::{non_negative, positive, temperature_k};

pub use error::LubricantError;
pub use grades::{
    DEFAULT_TURBINE_OIL_VISCOSITY_INDEX, ISO_3448_BAND_FRACTION, IsoVg, Nu40BandMm2S,
};
pub use viscosity_index::{
    ReferenceViscosities, VI_MIN_NU100_MM2_S, VI_TABLE_MAX_NU100_MM2_S, ViscosityIndexDetail,
    ViscosityIndexProcedure, nu40_from_nu100_and_vi_mm2_s, nu100_from_nu40_and_vi_mm2_s,
    procedure_a_viscosity_index, procedure_b_exponent, procedure_b_viscosity_index,
    reference_viscosities_mm2_s, round_viscosity_index, viscosity_index, viscosity_index_detail,
};
pub use walther::{WALTHER_MIN_VALID_NU_MM2_S, WALTHER_OFFSET_MM2_S, WaltherLine};

/// Kelvin value of 0 °C: T in K = T in °C + 273.15.
pub const KELVIN_AT_0_C: f64 = 273.15;

/// 15 °C in kelvin, the reference temperature of the density law.
pub const T15_K: f64 = 288.15;

/// 40 °C in kelvin, the lower reference temperature of ISO 3448 and ASTM D2270.
pub const T40_K: f64 = 313.15;

/// 100 °C in kelvin, the upper reference temperature of ASTM D2270.
pub const T100_K: f64 = 373.15;

/// Square millimetres per second in one square metre per second (1 m²/s = 1e6 mm²/s).
pub const MM2_S_PER_M2_S: f64 = 1.0e6;

/// Default density at 15 °C, in kg/m³: 870 (common practice, from memory; mineral turbine oil).
pub const DEFAULT_DENSITY_15C_KG_M3: f64 = 870.0;

/// Default volumetric thermal expansion coefficient of the density law, in 1/K:
/// 6.5e-4 (common practice, from memory; mineral oil).
pub const DEFAULT_THERMAL_EXPANSION_PER_K: f64 = 6.5e-4;

/// Default specific heat capacity, in J/(kg·K): 2000 (common practice, from memory; mineral oil).
pub const DEFAULT_SPECIFIC_HEAT_J_PER_KG_K: f64 = 2000.0;

/// Default thermal conductivity, in W/(m·K): 0.13 (common practice, from memory; mineral oil).
pub const DEFAULT_THERMAL_CONDUCTIVITY_W_PER_M_K: f64 = 0.13;

/// Default lowest valid temperature of a temperature-dependent oil, in kelvin:
/// 253.15 K = −20 °C (common practice, no source; near a mineral turbine oil's pour point).
pub const DEFAULT_MIN_VALID_TEMPERATURE_K: f64 = 253.15;

/// Converts a temperature from degrees Celsius to kelvin.
pub fn celsius_to_kelvin(t_c: f64) -> f64 {
    t_c + KELVIN_AT_0_C
}

/// Converts a temperature from kelvin to degrees Celsius.
pub fn kelvin_to_celsius(t_k: f64) -> f64 {
    t_k - KELVIN_AT_0_C
}

/// Converts a kinematic viscosity from mm²/s (cSt) to m²/s.
pub fn mm2_s_to_m2_s(nu_mm2_s: f64) -> f64 {
    nu_mm2_s / MM2_S_PER_M2_S
}

/// Converts a kinematic viscosity from m²/s to mm²/s (cSt).
pub fn m2_s_to_mm2_s(nu_m2_s: f64) -> f64 {
    nu_m2_s * MM2_S_PER_M2_S
}

/// How the viscosity of a [`Lubricant`] was defined; this is what is saved to a file.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum ViscositySpec {
    /// An ISO 3448 grade with a viscosity index; ν100 follows from ASTM D2270.
    IsoGrade {
        /// The grade, which fixes ν40 at its mid-point.
        grade: IsoVg,
        /// The viscosity index (dimensionless).
        viscosity_index: f64,
    },
    /// Measured kinematic viscosities at 40 °C and 100 °C.
    Measured {
        /// Kinematic viscosity at 40 °C, in m²/s.
        nu40_m2_s: f64,
        /// Kinematic viscosity at 100 °C, in m²/s.
        nu100_m2_s: f64,
    },
    /// A constant dynamic viscosity.
    Isoviscous {
        /// Dynamic viscosity, in Pa·s.
        dynamic_viscosity_pa_s: f64,
    },
}

/// A closed temperature interval, in kelvin.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct TemperatureRangeK {
    /// Lower limit, in kelvin.
    pub min_k: f64,
    /// Upper limit, in kelvin.
    pub max_k: f64,
}

impl TemperatureRangeK {
    /// Whether `t_k` (kelvin) lies in the range, limits included.
    pub fn contains(&self, t_k: f64) -> bool {
        (self.min_k..=self.max_k).contains(&t_k)
    }
}

/// The viscosity law derived from a [`ViscositySpec`].
#[derive(Clone, Copy, Debug, PartialEq)]
enum ViscosityLaw {
    /// ASTM D341 line through (40 °C, ν40) and (100 °C, ν100).
    Walther {
        line: WaltherLine,
        nu40_mm2_s: f64,
        nu100_mm2_s: f64,
        viscosity_index: f64,
        min_valid_temperature_k: f64,
        max_valid_temperature_k: f64,
    },
    /// Constant dynamic viscosity.
    Isoviscous { dynamic_viscosity_pa_s: f64 },
}

/// A bearing oil: viscosity, density and thermal properties as functions of
/// temperature, with an SI interface (temperatures in kelvin).
///
/// Build it with [`Lubricant::from_iso_vg`], [`Lubricant::from_measured_m2_s`],
/// [`Lubricant::isoviscous`] or [`Lubricant::from_spec`], then adjust the
/// thermal properties with the `with_*` methods. Every constructor validates its
/// inputs, so a `Lubricant` in existence is always usable; deserialization goes
/// through the same checks.
///
/// Property functions do not refuse temperatures outside
/// [`Lubricant::valid_temperature_range_k`] (iterative solvers may step outside
/// it); use [`Lubricant::check_temperature_k`] where the limit matters.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(try_from = "LubricantRecord", into = "LubricantRecord")]
pub struct Lubricant {
    spec: ViscositySpec,
    law: ViscosityLaw,
    density_15c_kg_m3: f64,
    thermal_expansion_per_k: f64,
    specific_heat_j_per_kg_k: f64,
    thermal_conductivity_w_per_m_k: f64,
}

impl Lubricant {
    /// Builds a lubricant from a viscosity definition, with default density,
    /// expansion, specific heat, conductivity and valid range.
    ///
    /// # Errors
    /// As [`Lubricant::from_iso_vg`], [`Lubricant::from_measured_m2_s`] or
    /// [`Lubricant::isoviscous`], whichever the spec calls for.
    pub fn from_spec(spec: ViscositySpec) -> Result<Self, LubricantError> {
        let law = match spec {
            ViscositySpec::IsoGrade {
                grade,
                viscosity_index,
            } => {
                let nu40_mm2_s = grade.nominal_nu40_mm2_s();
                let nu100_mm2_s = nu100_from_nu40_and_vi_mm2_s(nu40_mm2_s, viscosity_index)?;
                walther_law(nu40_mm2_s, nu100_mm2_s, viscosity_index)?
            }
            ViscositySpec::Measured {
                nu40_m2_s,
                nu100_m2_s,
            } => {
                let nu40_mm2_s =
                    m2_s_to_mm2_s(positive("kinematic viscosity at 40 °C in m²/s", nu40_m2_s)?);
                let nu100_mm2_s = m2_s_to_mm2_s(positive(
                    "kinematic viscosity at 100 °C in m²/s",
                    nu100_m2_s,
                )?);
                // The Walther fit checks ν ≥ 2 mm²/s and ν40 > ν100 first, with the
                // more specific message; the VI then cannot fail.
                WaltherLine::from_nu40_nu100_mm2_s(nu40_mm2_s, nu100_mm2_s)?;
                let vi = viscosity_index(nu40_mm2_s, nu100_mm2_s)?;
                walther_law(nu40_mm2_s, nu100_mm2_s, vi)?
            }
            ViscositySpec::Isoviscous {
                dynamic_viscosity_pa_s,
            } => ViscosityLaw::Isoviscous {
                dynamic_viscosity_pa_s: positive(
                    "dynamic viscosity in Pa·s",
                    dynamic_viscosity_pa_s,
                )?,
            },
        };
        Ok(Self {
            spec,
            law,
            density_15c_kg_m3: DEFAULT_DENSITY_15C_KG_M3,
            thermal_expansion_per_k: DEFAULT_THERMAL_EXPANSION_PER_K,
            specific_heat_j_per_kg_k: DEFAULT_SPECIFIC_HEAT_J_PER_KG_K,
            thermal_conductivity_w_per_m_k: DEFAULT_THERMAL_CONDUCTIVITY_W_PER_M_K,
        })
    }

    /// An oil of ISO 3448 grade `grade` (ν40 = the grade's mid-point) with the
    /// viscosity index `viscosity_index` (dimensionless; use
    /// [`DEFAULT_TURBINE_OIL_VISCOSITY_INDEX`] when unknown). ν100 is found from
    /// the inverse of ASTM D2270, and the viscosity follows the ASTM D341 line
    /// through both points.
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] for a non-finite VI;
    /// [`LubricantError::ViscosityIndexUnreachableFromNu40`] if no ν100 between
    /// 2 mm²/s and ν40 gives that VI.
    pub fn from_iso_vg(grade: IsoVg, viscosity_index: f64) -> Result<Self, LubricantError> {
        Self::from_spec(ViscositySpec::IsoGrade {
            grade,
            viscosity_index,
        })
    }

    /// An oil with measured kinematic viscosities `nu40_m2_s` at 40 °C and
    /// `nu100_m2_s` at 100 °C, both in **m²/s** (46 mm²/s = 4.6e-5 m²/s; see
    /// [`mm2_s_to_m2_s`]). The viscosity follows the ASTM D341 line through both.
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] / [`LubricantError::NotPositive`] for a bad number;
    /// [`LubricantError::BelowWaltherRange`] if either is below 2e-6 m²/s (2 mm²/s);
    /// [`LubricantError::ViscosityNotDecreasing`] unless ν40 > ν100.
    pub fn from_measured_m2_s(nu40_m2_s: f64, nu100_m2_s: f64) -> Result<Self, LubricantError> {
        Self::from_spec(ViscositySpec::Measured {
            nu40_m2_s,
            nu100_m2_s,
        })
    }

    /// An isoviscous oil: constant dynamic viscosity `dynamic_viscosity_pa_s` in
    /// **Pa·s** at every temperature (density still follows the expansion law;
    /// set [`Lubricant::with_thermal_expansion_per_k`] to 0 for a constant one).
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] / [`LubricantError::NotPositive`] for a bad number.
    pub fn isoviscous(dynamic_viscosity_pa_s: f64) -> Result<Self, LubricantError> {
        Self::from_spec(ViscositySpec::Isoviscous {
            dynamic_viscosity_pa_s,
        })
    }

    /// Sets the density at 15 °C, in kg/m³.
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] / [`LubricantError::NotPositive`] for a bad number.
    pub fn with_density_15c_kg_m3(
        mut self,
        density_15c_kg_m3: f64,
    ) -> Result<Self, LubricantError> {
        self.density_15c_kg_m3 = positive("density at 15 °C in kg/m³", density_15c_kg_m3)?;
        Ok(self)
    }

    /// Sets the thermal expansion coefficient α of `ρ(T) = ρ15·(1 − α·(T − 288.15 K))`, in 1/K.
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] / [`LubricantError::Negative`] for a bad number.
    pub fn with_thermal_expansion_per_k(
        mut self,
        thermal_expansion_per_k: f64,
    ) -> Result<Self, LubricantError> {
        self.thermal_expansion_per_k = non_negative(
            "thermal expansion coefficient in 1/K",
            thermal_expansion_per_k,
        )?;
        Ok(self)
    }

    /// Sets the specific heat capacity, in J/(kg·K).
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] / [`LubricantError::NotPositive`] for a bad number.
    pub fn with_specific_heat_j_per_kg_k(
        mut self,
        specific_heat_j_per_kg_k: f64,
    ) -> Result<Self, LubricantError> {
        self.specific_heat_j_per_kg_k = positive(
            "specific heat capacity in J/(kg·K)",
            specific_heat_j_per_kg_k,
        )?;
        Ok(self)
    }

    /// Sets the thermal conductivity, in W/(m·K).
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] / [`LubricantError::NotPositive`] for a bad number.
    pub fn with_thermal_conductivity_w_per_m_k(
        mut self,
        thermal_conductivity_w_per_m_k: f64,
    ) -> Result<Self, LubricantError> {
        self.thermal_conductivity_w_per_m_k = positive(
            "thermal conductivity in W/(m·K)",
            thermal_conductivity_w_per_m_k,
        )?;
        Ok(self)
    }

    /// Sets the lowest valid temperature, in kelvin (default 253.15 K = −20 °C).
    ///
    /// # Errors
    /// [`LubricantError::InvalidTemperature`] for a value not finite and above 0 K;
    /// [`LubricantError::InvalidTemperatureRange`] if it is not below the temperature
    /// at which ν falls to 2 mm²/s; [`LubricantError::NotApplicableToIsoviscous`]
    /// for an isoviscous oil.
    pub fn with_min_valid_temperature_k(mut self, min_k: f64) -> Result<Self, LubricantError> {
        let min_k = temperature_k(min_k)?;
        match &mut self.law {
            ViscosityLaw::Walther {
                min_valid_temperature_k,
                max_valid_temperature_k,
                ..
            } => {
                if min_k >= *max_valid_temperature_k {
                    return Err(LubricantError::InvalidTemperatureRange {
                        min_k,
                        max_k: *max_valid_temperature_k,
                    });
                }
                *min_valid_temperature_k = min_k;
                Ok(self)
            }
            ViscosityLaw::Isoviscous { .. } => Err(LubricantError::NotApplicableToIsoviscous {
                setting: "a lowest valid temperature",
            }),
        }
    }

    /// How the viscosity was defined.
    pub fn spec(&self) -> ViscositySpec {
        self.spec
    }

    /// The ISO 3448 grade, if the oil was defined by one.
    pub fn iso_grade(&self) -> Option<IsoVg> {
        match self.spec {
            ViscositySpec::IsoGrade { grade, .. } => Some(grade),
            _ => None,
        }
    }

    /// Whether the oil is isoviscous (constant dynamic viscosity).
    pub fn is_isoviscous(&self) -> bool {
        matches!(self.law, ViscosityLaw::Isoviscous { .. })
    }

    /// The ASTM D341 line (ν in mm²/s, T in K), or `None` for an isoviscous oil.
    pub fn walther_line(&self) -> Option<WaltherLine> {
        match self.law {
            ViscosityLaw::Walther { line, .. } => Some(line),
            ViscosityLaw::Isoviscous { .. } => None,
        }
    }

    /// Kinematic viscosity at 40 °C in **m²/s** that defines the oil (the grade's
    /// mid-point or the measured value), or `None` for an isoviscous oil.
    pub fn nu40_m2_s(&self) -> Option<f64> {
        match (self.spec, self.law) {
            (ViscositySpec::Measured { nu40_m2_s, .. }, _) => Some(nu40_m2_s),
            (_, ViscosityLaw::Walther { nu40_mm2_s, .. }) => Some(mm2_s_to_m2_s(nu40_mm2_s)),
            (_, ViscosityLaw::Isoviscous { .. }) => None,
        }
    }

    /// Kinematic viscosity at 100 °C in **m²/s** that defines the oil (measured,
    /// or derived from grade and VI), or `None` for an isoviscous oil.
    pub fn nu100_m2_s(&self) -> Option<f64> {
        match (self.spec, self.law) {
            (ViscositySpec::Measured { nu100_m2_s, .. }, _) => Some(nu100_m2_s),
            (_, ViscosityLaw::Walther { nu100_mm2_s, .. }) => Some(mm2_s_to_m2_s(nu100_mm2_s)),
            (_, ViscosityLaw::Isoviscous { .. }) => None,
        }
    }

    /// Viscosity index (dimensionless, unrounded): the one given with the grade, or
    /// ASTM D2270's from the measured pair; `None` for an isoviscous oil.
    pub fn viscosity_index(&self) -> Option<f64> {
        match self.law {
            ViscosityLaw::Walther {
                viscosity_index, ..
            } => Some(viscosity_index),
            ViscosityLaw::Isoviscous { .. } => None,
        }
    }

    /// Density at 15 °C, in kg/m³.
    pub fn density_15c_kg_m3(&self) -> f64 {
        self.density_15c_kg_m3
    }

    /// Thermal expansion coefficient α of the density law, in 1/K.
    pub fn thermal_expansion_per_k(&self) -> f64 {
        self.thermal_expansion_per_k
    }

    /// Specific heat capacity, in J/(kg·K) (temperature-independent).
    pub fn specific_heat_j_per_kg_k(&self) -> f64 {
        self.specific_heat_j_per_kg_k
    }

    /// Thermal conductivity, in W/(m·K) (temperature-independent).
    pub fn thermal_conductivity_w_per_m_k(&self) -> f64 {
        self.thermal_conductivity_w_per_m_k
    }

    /// Temperature range, in kelvin, in which the viscosity model is meant to be
    /// used: from the lowest valid temperature (default −20 °C) to where ν falls
    /// to 2 mm²/s. `None` for an isoviscous oil, whose viscosity has no limit
    /// (its density law still fails far above 288.15 K + 1/α).
    pub fn valid_temperature_range_k(&self) -> Option<TemperatureRangeK> {
        match self.law {
            ViscosityLaw::Walther {
                min_valid_temperature_k,
                max_valid_temperature_k,
                ..
            } => Some(TemperatureRangeK {
                min_k: min_valid_temperature_k,
                max_k: max_valid_temperature_k,
            }),
            ViscosityLaw::Isoviscous { .. } => None,
        }
    }

    /// Checks that `t_k` (kelvin) is a valid temperature inside
    /// [`Lubricant::valid_temperature_range_k`], and returns it.
    ///
    /// # Errors
    /// [`LubricantError::InvalidTemperature`] if not finite and above 0 K;
    /// [`LubricantError::OutsideValidTemperatureRange`] if outside the range.
    pub fn check_temperature_k(&self, t_k: f64) -> Result<f64, LubricantError> {
        let t_k = temperature_k(t_k)?;
        match self.valid_temperature_range_k() {
            Some(range) if !range.contains(t_k) => {
                Err(LubricantError::OutsideValidTemperatureRange {
                    t_k,
                    min_k: range.min_k,
                    max_k: range.max_k,
                })
            }
            _ => Ok(t_k),
        }
    }

    /// Density in **kg/m³** at `t_k` in **kelvin**: `ρ15·(1 − α·(T − 288.15 K))`.
    ///
    /// # Errors
    /// [`LubricantError::InvalidTemperature`] if `t_k` is not finite and above 0 K;
    /// [`LubricantError::NonPositiveDensity`] if the law gives ρ ≤ 0 (T far too high).
    pub fn density_kg_m3(&self, t_k: f64) -> Result<f64, LubricantError> {
        let t_k = temperature_k(t_k)?;
        let density_kg_m3 =
            self.density_15c_kg_m3 * (1.0 - self.thermal_expansion_per_k * (t_k - T15_K));
        if density_kg_m3 > 0.0 && density_kg_m3.is_finite() {
            Ok(density_kg_m3)
        } else {
            Err(LubricantError::NonPositiveDensity { t_k, density_kg_m3 })
        }
    }

    /// Kinematic viscosity in **m²/s** at `t_k` in **kelvin**: the ASTM D341 line
    /// converted from mm²/s, or μ/ρ(T) for an isoviscous oil.
    ///
    /// # Errors
    /// [`LubricantError::InvalidTemperature`] for a bad temperature;
    /// [`LubricantError::ViscosityOverflow`] far below the valid range;
    /// [`LubricantError::NonPositiveDensity`] (isoviscous only) far above it.
    pub fn kinematic_viscosity_m2_s(&self, t_k: f64) -> Result<f64, LubricantError> {
        match self.law {
            ViscosityLaw::Walther { line, .. } => Ok(mm2_s_to_m2_s(line.nu_mm2_s(t_k)?)),
            ViscosityLaw::Isoviscous {
                dynamic_viscosity_pa_s,
            } => Ok(dynamic_viscosity_pa_s / self.density_kg_m3(t_k)?),
        }
    }

    /// Dynamic viscosity in **Pa·s** at `t_k` in **kelvin**: μ = ρ(T)·ν(T), or the
    /// constant for an isoviscous oil.
    ///
    /// # Errors
    /// [`LubricantError::InvalidTemperature`] for a bad temperature;
    /// [`LubricantError::ViscosityOverflow`] far below the valid range;
    /// [`LubricantError::NonPositiveDensity`] far above it.
    pub fn dynamic_viscosity_pa_s(&self, t_k: f64) -> Result<f64, LubricantError> {
        match self.law {
            ViscosityLaw::Walther { line, .. } => {
                let nu_m2_s = mm2_s_to_m2_s(line.nu_mm2_s(t_k)?);
                Ok(self.density_kg_m3(t_k)? * nu_m2_s)
            }
            ViscosityLaw::Isoviscous {
                dynamic_viscosity_pa_s,
            } => {
                temperature_k(t_k)?;
                Ok(dynamic_viscosity_pa_s)
            }
        }
    }

    /// Temperature derivative of the dynamic viscosity, dμ/dT, in **Pa·s per kelvin**
    /// (negative for a Walther oil, zero for an isoviscous one), at `t_k` in kelvin.
    /// Analytic: `dμ/dT = dρ/dT·ν + ρ·dν/dT` with ν in m²/s.
    ///
    /// # Errors
    /// As [`Lubricant::dynamic_viscosity_pa_s`].
    pub fn dynamic_viscosity_derivative_pa_s_per_k(&self, t_k: f64) -> Result<f64, LubricantError> {
        match self.law {
            ViscosityLaw::Walther { line, .. } => {
                let rho_kg_m3 = self.density_kg_m3(t_k)?;
                let drho_dt_kg_m3_k = -self.density_15c_kg_m3 * self.thermal_expansion_per_k;
                let nu_m2_s = mm2_s_to_m2_s(line.nu_mm2_s(t_k)?);
                let dnu_dt_m2_s_k = mm2_s_to_m2_s(line.dnu_dt_mm2_s_per_k(t_k)?);
                let slope = drho_dt_kg_m3_k * nu_m2_s + rho_kg_m3 * dnu_dt_m2_s_k;
                if slope.is_finite() {
                    Ok(slope)
                } else {
                    Err(LubricantError::ViscosityOverflow { t_k })
                }
            }
            ViscosityLaw::Isoviscous { .. } => {
                temperature_k(t_k)?;
                Ok(0.0)
            }
        }
    }
}

/// Builds the Walther law for an already validated ν40 > ν100 ≥ 2 mm²/s.
fn walther_law(
    nu40_mm2_s: f64,
    nu100_mm2_s: f64,
    viscosity_index: f64,
) -> Result<ViscosityLaw, LubricantError> {
    let line = WaltherLine::from_nu40_nu100_mm2_s(nu40_mm2_s, nu100_mm2_s)?;
    let max_valid_temperature_k = line.max_valid_temperature_k()?;
    if DEFAULT_MIN_VALID_TEMPERATURE_K >= max_valid_temperature_k {
        return Err(LubricantError::InvalidTemperatureRange {
            min_k: DEFAULT_MIN_VALID_TEMPERATURE_K,
            max_k: max_valid_temperature_k,
        });
    }
    Ok(ViscosityLaw::Walther {
        line,
        nu40_mm2_s,
        nu100_mm2_s,
        viscosity_index,
        min_valid_temperature_k: DEFAULT_MIN_VALID_TEMPERATURE_K,
        max_valid_temperature_k,
    })
}

fn default_density_15c_kg_m3() -> f64 {
    DEFAULT_DENSITY_15C_KG_M3
}
fn default_thermal_expansion_per_k() -> f64 {
    DEFAULT_THERMAL_EXPANSION_PER_K
}
fn default_specific_heat_j_per_kg_k() -> f64 {
    DEFAULT_SPECIFIC_HEAT_J_PER_KG_K
}
fn default_thermal_conductivity_w_per_m_k() -> f64 {
    DEFAULT_THERMAL_CONDUCTIVITY_W_PER_M_K
}

/// Serialized form of [`Lubricant`]: the definition and the settable properties,
/// rebuilt and validated on the way in. Omitted properties take the defaults.
#[derive(Clone, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct LubricantRecord {
    viscosity: ViscositySpec,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    min_valid_temperature_k: Option<f64>,
    #[serde(default = "default_density_15c_kg_m3")]
    density_15c_kg_m3: f64,
    #[serde(default = "default_thermal_expansion_per_k")]
    thermal_expansion_per_k: f64,
    #[serde(default = "default_specific_heat_j_per_kg_k")]
    specific_heat_j_per_kg_k: f64,
    #[serde(default = "default_thermal_conductivity_w_per_m_k")]
    thermal_conductivity_w_per_m_k: f64,
}

impl TryFrom<LubricantRecord> for Lubricant {
    type Error = LubricantError;

    fn try_from(record: LubricantRecord) -> Result<Self, Self::Error> {
        let mut lubricant = Lubricant::from_spec(record.viscosity)?
            .with_density_15c_kg_m3(record.density_15c_kg_m3)?
            .with_thermal_expansion_per_k(record.thermal_expansion_per_k)?
            .with_specific_heat_j_per_kg_k(record.specific_heat_j_per_kg_k)?
            .with_thermal_conductivity_w_per_m_k(record.thermal_conductivity_w_per_m_k)?;
        if let Some(min_k) = record.min_valid_temperature_k {
            lubricant = lubricant.with_min_valid_temperature_k(min_k)?;
        }
        Ok(lubricant)
    }
}

impl From<Lubricant> for LubricantRecord {
    fn from(lubricant: Lubricant) -> Self {
        LubricantRecord {
            viscosity: lubricant.spec,
            min_valid_temperature_k: lubricant.valid_temperature_range_k().map(|r| r.min_k),
            density_15c_kg_m3: lubricant.density_15c_kg_m3,
            thermal_expansion_per_k: lubricant.thermal_expansion_per_k,
            specific_heat_j_per_kg_k: lubricant.specific_heat_j_per_kg_k,
            thermal_conductivity_w_per_m_k: lubricant.thermal_conductivity_w_per_m_k,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::{assert_abs_diff_eq, assert_relative_eq};

    fn vg46() -> Lubricant {
        Lubricant::from_iso_vg(IsoVg::Vg46, DEFAULT_TURBINE_OIL_VISCOSITY_INDEX).unwrap()
    }

    /// SI definitions: 0 °C = 273.15 K; 1 mm²/s = 1e-6 m²/s.
    #[test]
    fn unit_conversions() {
        assert_eq!(celsius_to_kelvin(40.0), T40_K);
        assert_eq!(celsius_to_kelvin(100.0), T100_K);
        assert_eq!(celsius_to_kelvin(15.0), T15_K);
        assert_abs_diff_eq!(kelvin_to_celsius(T40_K), 40.0, epsilon = 1e-12);
        assert_eq!(mm2_s_to_m2_s(46.0), 4.6e-5);
        assert_relative_eq!(m2_s_to_mm2_s(4.6e-5), 46.0, max_relative = 1e-15);
    }

    /// The density law reproduces ρ15 at 15 °C and falls by ρ15·α per kelvin.
    #[test]
    fn density_law() {
        let oil = vg46();
        assert_eq!(oil.density_kg_m3(T15_K).unwrap(), 870.0);
        assert_relative_eq!(
            oil.density_kg_m3(T40_K).unwrap(),
            870.0 * (1.0 - 6.5e-4 * 25.0),
            max_relative = 1e-12
        );
        assert!(matches!(
            oil.density_kg_m3(5000.0),
            Err(LubricantError::NonPositiveDensity { .. })
        ));
        assert!(matches!(
            oil.density_kg_m3(-3.0),
            Err(LubricantError::InvalidTemperature { .. })
        ));
    }

    /// μ = ρ·ν with ν in m²/s: at 40 °C it equals ρ(40 °C)·ν40·1e-6.
    #[test]
    fn dynamic_viscosity_is_density_times_kinematic() {
        let oil = vg46();
        let rho = oil.density_kg_m3(T40_K).unwrap();
        assert_relative_eq!(
            oil.dynamic_viscosity_pa_s(T40_K).unwrap(),
            rho * 46.0e-6,
            max_relative = 1e-11
        );
        assert_relative_eq!(
            oil.kinematic_viscosity_m2_s(T40_K).unwrap(),
            46.0e-6,
            max_relative = 1e-11
        );
        assert_relative_eq!(oil.nu40_m2_s().unwrap(), 46.0e-6, max_relative = 1e-15);
    }

    /// The analytic dμ/dT agrees with a central difference.
    #[test]
    fn viscosity_derivative_matches_central_difference() {
        let oil = vg46();
        for t_c in [-10.0, 20.0, 45.0, 80.0, 120.0] {
            let t = celsius_to_kelvin(t_c);
            let h = 1e-3;
            let fd = (oil.dynamic_viscosity_pa_s(t + h).unwrap()
                - oil.dynamic_viscosity_pa_s(t - h).unwrap())
                / (2.0 * h);
            let an = oil.dynamic_viscosity_derivative_pa_s_per_k(t).unwrap();
            assert!(an < 0.0);
            assert_relative_eq!(an, fd, max_relative = 1e-6);
        }
    }

    /// A grade-defined oil keeps the requested VI and reproduces it from its ν40/ν100.
    #[test]
    fn grade_oil_read_outs() {
        let oil = vg46();
        assert_eq!(oil.iso_grade(), Some(IsoVg::Vg46));
        assert_eq!(oil.viscosity_index(), Some(100.0));
        let vi = viscosity_index(
            m2_s_to_mm2_s(oil.nu40_m2_s().unwrap()),
            m2_s_to_mm2_s(oil.nu100_m2_s().unwrap()),
        )
        .unwrap();
        assert_relative_eq!(vi, 100.0, max_relative = 1e-9);
        let range = oil.valid_temperature_range_k().unwrap();
        assert_eq!(range.min_k, DEFAULT_MIN_VALID_TEMPERATURE_K);
        assert_relative_eq!(
            oil.kinematic_viscosity_m2_s(range.max_k).unwrap(),
            2e-6,
            max_relative = 1e-9
        );
        assert!(oil.check_temperature_k(T40_K).is_ok());
        assert!(matches!(
            oil.check_temperature_k(celsius_to_kelvin(-30.0)),
            Err(LubricantError::OutsideValidTemperatureRange { .. })
        ));
    }

    #[test]
    fn measured_oil_read_outs() {
        let oil = Lubricant::from_measured_m2_s(73.30e-6, 8.86e-6).unwrap();
        assert_eq!(oil.nu40_m2_s(), Some(73.30e-6));
        assert_eq!(oil.nu100_m2_s(), Some(8.86e-6));
        assert_eq!(oil.iso_grade(), None);
        assert_relative_eq!(
            oil.viscosity_index().unwrap(),
            viscosity_index(73.30, 8.86).unwrap(),
            max_relative = 1e-12
        );
        assert_relative_eq!(
            oil.kinematic_viscosity_m2_s(T100_K).unwrap(),
            8.86e-6,
            max_relative = 1e-11
        );
    }

    #[test]
    fn isoviscous_behaviour() {
        let oil = Lubricant::isoviscous(0.03).unwrap();
        assert!(oil.is_isoviscous());
        for t in [250.0, 300.0, 400.0] {
            assert_eq!(oil.dynamic_viscosity_pa_s(t).unwrap(), 0.03);
            assert_eq!(oil.dynamic_viscosity_derivative_pa_s_per_k(t).unwrap(), 0.0);
        }
        assert_eq!(oil.valid_temperature_range_k(), None);
        assert_eq!(oil.viscosity_index(), None);
        assert_eq!(oil.nu40_m2_s(), None);
        assert!(oil.check_temperature_k(1000.0).is_ok());
        assert!(matches!(
            oil.clone().with_min_valid_temperature_k(260.0),
            Err(LubricantError::NotApplicableToIsoviscous { .. })
        ));
        assert!(matches!(
            oil.dynamic_viscosity_pa_s(f64::NAN),
            Err(LubricantError::InvalidTemperature { .. })
        ));
    }

    #[test]
    fn builders_validate() {
        let oil = vg46();
        assert!(oil.clone().with_density_15c_kg_m3(0.0).is_err());
        assert!(oil.clone().with_density_15c_kg_m3(f64::NAN).is_err());
        assert!(oil.clone().with_thermal_expansion_per_k(-1e-4).is_err());
        assert!(oil.clone().with_thermal_expansion_per_k(0.0).is_ok());
        assert!(oil.clone().with_specific_heat_j_per_kg_k(-5.0).is_err());
        assert!(
            oil.clone()
                .with_thermal_conductivity_w_per_m_k(f64::INFINITY)
                .is_err()
        );
        assert!(matches!(
            oil.clone().with_min_valid_temperature_k(600.0),
            Err(LubricantError::InvalidTemperatureRange { .. })
        ));
        let set = oil
            .with_density_15c_kg_m3(880.0)
            .and_then(|o| o.with_specific_heat_j_per_kg_k(1900.0))
            .and_then(|o| o.with_thermal_conductivity_w_per_m_k(0.12))
            .and_then(|o| o.with_min_valid_temperature_k(263.15))
            .unwrap();
        assert_eq!(set.density_15c_kg_m3(), 880.0);
        assert_eq!(set.specific_heat_j_per_kg_k(), 1900.0);
        assert_eq!(set.thermal_conductivity_w_per_m_k(), 0.12);
        assert_eq!(set.valid_temperature_range_k().unwrap().min_k, 263.15);

        assert!(Lubricant::isoviscous(0.0).is_err());
        assert!(Lubricant::isoviscous(f64::NAN).is_err());
        assert!(matches!(
            Lubricant::from_measured_m2_s(8.86e-6, 73.3e-6),
            Err(LubricantError::ViscosityNotDecreasing { .. })
        ));
        assert!(matches!(
            Lubricant::from_measured_m2_s(10e-6, 1.5e-6),
            Err(LubricantError::BelowWaltherRange { .. })
        ));
        assert!(Lubricant::from_iso_vg(IsoVg::Vg22, f64::NAN).is_err());
    }

    /// The record round-trips, and invalid records are refused (the serde path).
    #[test]
    fn record_round_trip_and_validation() {
        let oil = vg46()
            .with_min_valid_temperature_k(263.15)
            .and_then(|o| o.with_density_15c_kg_m3(875.0))
            .unwrap();
        let record = LubricantRecord::from(oil.clone());
        assert_eq!(Lubricant::try_from(record.clone()).unwrap(), oil);

        let mut bad = record.clone();
        bad.thermal_conductivity_w_per_m_k = -1.0;
        assert!(Lubricant::try_from(bad).is_err());
        let mut bad = record;
        bad.viscosity = ViscositySpec::Measured {
            nu40_m2_s: f64::NAN,
            nu100_m2_s: 6.8e-6,
        };
        assert!(Lubricant::try_from(bad).is_err());

        let iso = Lubricant::isoviscous(0.02).unwrap();
        let mut record = LubricantRecord::from(iso.clone());
        assert_eq!(record.min_valid_temperature_k, None);
        assert_eq!(Lubricant::try_from(record.clone()).unwrap(), iso);
        record.min_valid_temperature_k = Some(250.0);
        assert!(Lubricant::try_from(record).is_err());
    }

    /// No temperature makes a property NaN or infinite: values or typed errors only.
    #[test]
    fn never_returns_non_finite() {
        let oils = [vg46(), Lubricant::isoviscous(0.04).unwrap()];
        let temps = [
            f64::NAN,
            f64::INFINITY,
            -1.0,
            0.0,
            1e-300,
            1.0,
            50.0,
            300.0,
            1e4,
            1e300,
        ];
        for oil in &oils {
            for &t in &temps {
                let results = [
                    oil.dynamic_viscosity_pa_s(t),
                    oil.kinematic_viscosity_m2_s(t),
                    oil.density_kg_m3(t),
                    oil.dynamic_viscosity_derivative_pa_s_per_k(t),
                ];
                for v in results.into_iter().flatten() {
                    assert!(v.is_finite(), "non-finite value at T = {t} K");
                }
            }
        }
    }
}
