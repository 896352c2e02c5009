//! The design file: a bearing design in engineering units, read and written as RON.
//!
//! Every numeric field carries its unit in its name (`inner_radius_mm`, `speed_rpm`,
//! `taper_depth_um`), so a file can be read without a manual. Sections that a user rarely
//! touches (`numerics`, most oil properties) have defaults and may be left out. Unknown fields
//! are refused, so a misspelt field is an error rather than a silently ignored value, and the
//! file carries a `format_version` that is checked before anything else.
//!
//! The film temperature is one of three models: an `Effective` temperature set by the user,
//! a `Bulk` heat balance, or the `Field` of the energy equation with optional heat paths (runner,
//! conduction through the pad and its thermal crown). They were added to format version 1 as
//! new variants, so older files stay valid.
//!
//! [`DesignFile::to_design`] converts to the solver's SI
//! [`BearingDesign`](padwright_solver::prelude::BearingDesign) and validates it;
//! [`DesignFile::from_design`] goes the other way, so a design survives a round trip through a
//! file. All unit conversions go through [`crate::units`].

use padwright_solver::lubricant::{
    DEFAULT_DENSITY_15C_KG_M3, DEFAULT_SPECIFIC_HEAT_J_PER_KG_K,
    DEFAULT_THERMAL_CONDUCTIVITY_W_PER_M_K, DEFAULT_THERMAL_EXPANSION_PER_K,
    DEFAULT_TURBINE_OIL_VISCOSITY_INDEX,
};
use padwright_solver::prelude::Numerics;
use padwright_solver::thermal::{
    DEFAULT_CARRY_OVER, DEFAULT_RISE_FRACTION, DEFAULT_TEMPERATURE_TOLERANCE,
};
use serde::{Deserialize, Deserializer, Serialize};

use crate::error::DesignError;

mod convert;
mod film_temperature;

/// The design-file format version this program reads and writes.
pub const FORMAT_VERSION: u32 = 1;

/// Lowest valid oil temperature assumed when the file gives none, °C (the solver's default of
/// 253.15 K).
pub const DEFAULT_LOWEST_VALID_TEMPERATURE_C: f64 = -20.0;

/// A bearing design as written in a design file (engineering units, named in each field).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DesignFile {
    /// Version of the file format; must be [`FORMAT_VERSION`].
    pub format_version: u32,
    /// Free text naming the machine and the case (optional).
    #[serde(default)]
    pub title: String,
    /// Number of identical pads sharing the load.
    pub pad_count: usize,
    /// Shape and size of one pad.
    pub outline: OutlineSpec,
    /// How the pad is supported: tilting on a pivot, or fixed with a tapered land.
    pub support: SupportSpec,
    /// Crown of the pad face: height of the pad centre above its corners, µm (optional, 0).
    #[serde(default)]
    pub crown_um: f64,
    /// How fast the runner moves.
    pub runner: RunnerSpec,
    /// What the bearing must do: carry a load, or run at a given film (fixed pads).
    pub duty: DutySpec,
    /// The oil.
    pub oil: OilSpec,
    /// Where the film temperature comes from.
    pub film_temperature: FilmTemperatureSpec,
    /// Grid and solver settings (optional).
    #[serde(default)]
    pub numerics: NumericsSpec,
}

/// Pad outline in millimetres and degrees.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum OutlineSpec {
    /// Annular sector, the usual thrust pad.
    Sector {
        /// Inner radius, mm.
        inner_radius_mm: f64,
        /// Outer radius, mm.
        outer_radius_mm: f64,
        /// Pad arc, degrees.
        arc_deg: f64,
    },
    /// Rectangle (test rigs, slider checks); the runner slides along the length.
    Rectangle {
        /// Length along the motion, mm.
        length_mm: f64,
        /// Width across the motion, mm.
        width_mm: f64,
    },
}

/// Pad support, with offsets in percent.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum SupportSpec {
    /// Tilting pad on a point (spherical) pivot, free to pitch and roll.
    TiltingPoint {
        /// Pivot offset along the motion, % of the arc from the leading edge.
        pivot_offset_along_pct: f64,
        /// Pivot offset across the motion, % of the width from the inner edge.
        pivot_offset_across_pct: f64,
    },
    /// Tilting pad on a line pivot across the pad (pitch only).
    TiltingLine {
        /// Pivot offset along the motion, % of the arc from the leading edge.
        pivot_offset_along_pct: f64,
    },
    /// Fixed pad: a taper from the leading edge, then a flat land.
    TaperedLand {
        /// Extent of the taper, % of the arc from the leading edge.
        taper_extent_pct: f64,
        /// Depth of the taper at the leading edge below the land, µm.
        taper_depth_um: f64,
    },
    /// Fixed, flat (parallel) pad.
    Flat,
}

/// Runner speed.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum RunnerSpec {
    /// A rotating collar (sector pads), rev/min.
    Rotating {
        /// Shaft speed, rpm.
        speed_rpm: f64,
    },
    /// A sliding runner (rectangular pads), m/s.
    Sliding {
        /// Sliding speed, m/s.
        speed_m_s: f64,
    },
}

/// What the bearing must do.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum DutySpec {
    /// Carry a total axial load (all pads together), kN.
    TotalLoad {
        /// Total axial load, kN.
        total_load_kn: f64,
    },
    /// Run at a given minimum film and find the load (fixed pads only), µm.
    MinFilm {
        /// Minimum film thickness, µm.
        min_film_um: f64,
    },
}

/// Oil viscosity and properties.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct OilSpec {
    /// How the viscosity is given.
    pub viscosity: ViscosityInput,
    /// Density at 15 °C, kg/m³ (optional).
    #[serde(default = "default_density")]
    pub density_15c_kg_m3: f64,
    /// Volumetric thermal expansion of the density law, 1/K (optional).
    #[serde(default = "default_expansion")]
    pub thermal_expansion_per_k: f64,
    /// Specific heat, J/(kg·K) (optional; used by the thermal models).
    #[serde(default = "default_specific_heat")]
    pub specific_heat_j_per_kg_k: f64,
    /// Thermal conductivity, W/(m·K) (optional; recorded only: the thermal models neglect
    /// conduction within the film).
    #[serde(default = "default_conductivity")]
    pub thermal_conductivity_w_per_m_k: f64,
    /// Below this temperature the results carry a warning, °C (optional; ignored for a
    /// constant-viscosity oil).
    #[serde(default = "default_lowest_valid_c")]
    pub lowest_valid_temperature_c: f64,
}

/// How the oil viscosity is given.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum ViscosityInput {
    /// An ISO VG grade (ν40 at the grade mid-point) and a viscosity index.
    IsoGrade {
        /// ISO VG number: 22, 32, 46, 68 or 100.
        iso_vg: u32,
        /// Viscosity index, dimensionless (optional, 100).
        #[serde(default = "default_vi")]
        viscosity_index: f64,
    },
    /// Measured kinematic viscosities.
    Measured {
        /// Kinematic viscosity at 40 °C, mm²/s (cSt).
        nu40_mm2_s: f64,
        /// Kinematic viscosity at 100 °C, mm²/s (cSt).
        nu100_mm2_s: f64,
    },
    /// A constant dynamic viscosity, independent of temperature.
    Constant {
        /// Dynamic viscosity, mPa·s (cP).
        dynamic_viscosity_mpa_s: f64,
    },
}

/// Where the film temperature comes from: set by the user, or from one of the two thermal
/// models of the solver.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum FilmTemperatureSpec {
    /// One effective film temperature set by the user; the viscosity is taken there.
    Effective {
        /// Effective film temperature, °C.
        temperature_c: f64,
    },
    /// Bulk heat balance: the viscosity is taken at the mixed inlet temperature plus a share of
    /// the adiabatic rise `P/(ρ c Q_in)`, one value for the whole pad.
    Bulk {
        /// Oil supply temperature, °C.
        supply_temperature_c: f64,
        /// Hot-oil carry-over: share of one pad's trailing-edge oil that enters the next pad,
        /// % (optional, the solver's default).
        #[serde(default = "default_carry_over_pct")]
        carry_over_pct: f64,
        /// Share of the adiabatic rise added to the inlet temperature, % (optional, the
        /// solver's default).
        #[serde(default = "default_share_of_rise_pct")]
        share_of_rise_pct: f64,
        /// Oil supplied to the whole bearing, L/min (optional; when given, the results warn if
        /// the pads draw more fresh oil than this).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        supplied_flow_l_min: Option<f64>,
    },
    /// Film-temperature field from the energy equation; the viscosity varies over the pad.
    Field {
        /// Oil supply temperature, °C.
        supply_temperature_c: f64,
        /// Hot-oil carry-over: share of one pad's trailing-edge oil that enters the next pad,
        /// % (optional, the solver's default).
        #[serde(default = "default_carry_over_pct")]
        carry_over_pct: f64,
        /// Oil supplied to the whole bearing, L/min (optional; when given, the results warn if
        /// the pads draw more fresh oil than this).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        supplied_flow_l_min: Option<f64>,
        /// Heat-transfer coefficient from the film to the runner, W/(m²·K) (optional, 0: no
        /// heat to the runner).
        #[serde(default)]
        runner_coefficient_w_per_m2_k: f64,
        /// Runner surface temperature, °C (optional: the supply temperature).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        runner_temperature_c: Option<f64>,
        /// Heat conducted through the pad to the oil bath behind it, and the thermal crown it
        /// causes (optional: no heat through the pad, no thermal crown).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        pad_conduction: Option<PadConductionSpec>,
        /// Stop when the film temperature changes by less than this between updates, K
        /// (optional, the solver's default).
        #[serde(default = "default_tolerance_k")]
        tolerance_k: f64,
    },
}

/// Conduction through the pad body to the oil bath behind it.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PadConductionSpec {
    /// Pad thickness from the sliding face to the back, mm.
    pub thickness_mm: f64,
    /// Thermal conductivity of the pad body, W/(m·K).
    pub conductivity_w_per_m_k: f64,
    /// Heat-transfer coefficient from the pad back to the bath, W/(m²·K).
    pub back_coefficient_w_per_m2_k: f64,
    /// Bath temperature behind the pad, °C.
    pub bath_temperature_c: f64,
    /// Linear thermal expansion coefficient of the pad body, µm/(m·K) (11.5 for steel); 0
    /// leaves out the thermal crown.
    pub expansion_um_per_m_k: f64,
}

/// Grid and solver settings. Every field is optional.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct NumericsSpec {
    /// Grid nodes along the motion.
    pub nodes_along: usize,
    /// Grid nodes across the motion.
    pub nodes_across: usize,
    /// Pressure solve: stop at this residual relative to the source, dimensionless.
    pub pressure_tolerance: f64,
    /// Pressure solve: most multigrid cycles per solve.
    pub max_pressure_cycles: usize,
    /// Apply the Reynolds (Swift–Stieber) cavitation condition.
    pub cavitation: bool,
    /// Cavitation pressure, kPa gauge, at most 0 (the edges of the pad are at ambient
    /// pressure).
    pub cavitation_pressure_kpa: f64,
    /// Smallest film the pad may run at; a load needing less is an overload, µm.
    pub smallest_film_um: f64,
    /// Equilibrium: relative tolerance on load and moments, dimensionless.
    pub equilibrium_tolerance: f64,
    /// Equilibrium: most iterations.
    pub max_equilibrium_iterations: usize,
    /// Multigrid: smoothing sweeps before the coarse-grid correction.
    pub smoothing_sweeps_before: usize,
    /// Multigrid: smoothing sweeps after the coarse-grid correction.
    pub smoothing_sweeps_after: usize,
    /// Multigrid: relaxation factor of the smoother, dimensionless.
    pub relaxation_factor: f64,
    /// Multigrid: coarse-grid visits per level (1: V-cycle, 2: W-cycle).
    pub coarse_grid_visits: usize,
    /// Multigrid: smooth along lines where the cells couple more strongly in one direction
    /// everywhere: across the motion (narrow or long pads) or along it (short, wide pads).
    pub line_smoothing: bool,
    /// Multigrid: compute the corrections of pressure solves in single precision inside
    /// iterative refinement (the solution still meets the tolerance in double precision).
    pub single_precision_corrections: bool,
    /// Multigrid: raise the relaxation factor of point smoothing where cells couple much more
    /// strongly along the motion than across it (wide rings, small pad arcs).
    pub adaptive_relaxation: bool,
    /// Multigrid: where the film cavitates, combine each iterate with the two before it so
    /// that the residual is least (Krylov acceleration of the projected cycles).
    pub projected_acceleration: bool,
}

impl Default for NumericsSpec {
    fn default() -> Self {
        NumericsSpec::from_numerics(&Numerics::default())
    }
}

fn default_density() -> f64 {
    DEFAULT_DENSITY_15C_KG_M3
}
fn default_expansion() -> f64 {
    DEFAULT_THERMAL_EXPANSION_PER_K
}
fn default_specific_heat() -> f64 {
    DEFAULT_SPECIFIC_HEAT_J_PER_KG_K
}
fn default_conductivity() -> f64 {
    DEFAULT_THERMAL_CONDUCTIVITY_W_PER_M_K
}
fn default_lowest_valid_c() -> f64 {
    DEFAULT_LOWEST_VALID_TEMPERATURE_C
}
fn default_vi() -> f64 {
    DEFAULT_TURBINE_OIL_VISCOSITY_INDEX
}
fn default_carry_over_pct() -> f64 {
    crate::units::fraction_to_pct(DEFAULT_CARRY_OVER)
}
fn default_share_of_rise_pct() -> f64 {
    crate::units::fraction_to_pct(DEFAULT_RISE_FRACTION)
}
fn default_tolerance_k() -> f64 {
    DEFAULT_TEMPERATURE_TOLERANCE
}

/// Reads only `format_version`, ignoring everything else, so that a file of another version is
/// named as such rather than failing on fields this version does not know.
#[derive(Deserialize)]
struct VersionProbe {
    #[serde(default, deserialize_with = "some_u32")]
    format_version: Option<u32>,
}

fn some_u32<'de, D: Deserializer<'de>>(d: D) -> Result<Option<u32>, D::Error> {
    u32::deserialize(d).map(Some)
}

/// RON settings of design files: an optional value is written plainly (`runner_temperature_c:
/// 50.0`, not `Some(50.0)`), and a left-out optional value is absent.
fn ron_options() -> ron::Options {
    ron::Options::default().with_default_extension(ron::extensions::Extensions::IMPLICIT_SOME)
}

fn check_version(found: u32) -> Result<(), DesignError> {
    if found == FORMAT_VERSION {
        Ok(())
    } else {
        Err(DesignError::UnsupportedVersion {
            found,
            supported: FORMAT_VERSION,
        })
    }
}

impl DesignFile {
    /// Parses the RON text of a design file. The version is checked first; then the text must
    /// have exactly the fields of this version.
    pub fn parse(text: &str) -> Result<Self, DesignError> {
        // A syntax error is left to the full parse below, which names its line and column.
        if let Ok(probe) = ron::from_str::<VersionProbe>(text) {
            match probe.format_version {
                None => {
                    return Err(DesignError::MissingVersion {
                        supported: FORMAT_VERSION,
                    });
                }
                Some(v) => check_version(v)?,
            }
        }
        let file: DesignFile = ron_options().from_str(text)?;
        check_version(file.format_version)?;
        Ok(file)
    }

    /// Writes the design file as RON text, with a short header comment.
    pub fn to_ron(&self) -> Result<String, DesignError> {
        let config = ron::ser::PrettyConfig::new()
            .indentor("    ")
            .struct_names(false);
        let body = ron_options().to_string_pretty(self, config)?;
        Ok(format!(
            "// Padwright design file (format_version {FORMAT_VERSION}). Each unit is in its \
             field name:\n// _mm millimetres, _um micrometres, _deg degrees, _pct percent, \
             _kn kilonewtons, _c degrees Celsius,\n// _k kelvin (temperature differences), \
             _l_min litres per minute, _w_per_m2_k W/(m²·K).\n{body}\n"
        ))
    }
}

#[cfg(test)]
mod tests;
