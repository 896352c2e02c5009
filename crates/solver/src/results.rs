//! Results of a bearing analysis, per pad and for the whole bearing, in SI units.
//!
//! All pads of a bearing are identical and share the load equally, so one pad is solved and the
//! bearing totals are that pad times the pad count.

use crate::pad::Flows;

/// How the tilting pad sits on its pivot.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PadAttitude {
    /// Film at the pivot, m.
    pub pivot_film: f64,
    /// Pitch about the pivot, rad (positive opens the leading edge).
    pub pitch: f64,
    /// Roll about the pivot, rad (positive opens the outer edge).
    pub roll: f64,
}

/// Results for one pad (SI units).
#[derive(Clone, Debug, PartialEq)]
pub struct PadResult {
    /// Load carried by the pad, N.
    pub load: f64,
    /// Minimum film thickness, m.
    pub min_film: f64,
    /// Where the minimum film is, `(ξ, η)`: fractions of arc and width.
    pub min_film_at: (f64, f64),
    /// Maximum film thickness, m.
    pub max_film: f64,
    /// Pivot film, pitch and roll (tilting pads only).
    pub attitude: Option<PadAttitude>,
    /// Crown of the pad face used in the film (mechanical plus thermal), m.
    pub crown: f64,
    /// Peak pressure, Pa.
    pub peak_pressure: f64,
    /// Where the peak pressure is, `(ξ, η)`.
    pub peak_at: (f64, f64),
    /// Mean specific load: load divided by pad area, Pa.
    pub mean_pressure: f64,
    /// Centre of pressure `(ξ, η)`.
    pub centre_of_pressure: (f64, f64),
    /// Friction force of the film on the runner, N.
    pub friction_force: f64,
    /// Friction torque about the shaft axis, N·m (sector pads).
    pub friction_torque: f64,
    /// Power loss, W.
    pub power_loss: f64,
    /// Edge flows, m³/s.
    pub flows: Flows,
    /// Axial film stiffness −dW/dh, N/m.
    pub stiffness: f64,
    /// Fraction of the pad area at the cavitation pressure.
    pub cavitated_fraction: f64,
}

/// Numerical facts of a solution, for the record.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SolutionStats {
    /// Nodes along the motion.
    pub nodes_along: usize,
    /// Nodes across the motion.
    pub nodes_across: usize,
    /// Relative residual of the final pressure solve.
    pub pressure_residual: f64,
    /// Multigrid cycles of the final pressure solve.
    pub pressure_cycles: usize,
    /// Iterations of the equilibrium search.
    pub equilibrium_iterations: usize,
    /// Pressure solves in all.
    pub pressure_solves: usize,
    /// Relative load error at the equilibrium.
    pub load_error: f64,
    /// Relative moment error at the equilibrium (tilting pads).
    pub moment_error: f64,
    /// The coarser-grid solution the equilibrium started from (thermal pads under a load), if
    /// any.
    pub coarse_start: Option<CoarseStart>,
}

/// The solution of the same pad on a coarser grid that a thermal pad's equilibrium under a load
/// started from (nested iteration); the counts cover every coarser grid involved.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CoarseStart {
    /// Nodes along the motion of the next coarser grid.
    pub nodes_along: usize,
    /// Nodes across the motion of the next coarser grid.
    pub nodes_across: usize,
    /// Pressure solves on the coarser grids.
    pub pressure_solves: usize,
    /// Temperature renewals on the coarser grids.
    pub temperature_renewals: usize,
}

/// The viscosity the solution used and where it came from.
#[derive(Clone, Debug, PartialEq)]
pub struct ViscosityBasis {
    /// Temperature at which the viscosity was taken, K (none for an isoviscous oil).
    pub temperature: Option<f64>,
    /// Dynamic viscosity, Pa·s.
    pub dynamic_viscosity: f64,
    /// Density, kg/m³.
    pub density: f64,
    /// How the temperature was chosen, in words.
    pub note: String,
}

/// Pressure and film on the pad grid (finest level), row-major with `ξ` fastest.
#[derive(Clone, Debug, PartialEq)]
pub struct PadFields {
    /// `ξ` of each node column.
    pub xi: Vec<f64>,
    /// `η` of each node row.
    pub eta: Vec<f64>,
    /// Gauge pressure, Pa.
    pub pressure: Vec<f64>,
    /// Film thickness, m.
    pub film: Vec<f64>,
}

/// The result of analysing a bearing at one operating point.
#[derive(Clone, Debug, PartialEq)]
pub struct BearingResult {
    /// Number of pads.
    pub pad_count: usize,
    /// The representative pad.
    pub pad: PadResult,
    /// Total axial load, N.
    pub load: f64,
    /// Total power loss, W.
    pub power_loss: f64,
    /// Total friction torque, N·m (sector pads).
    pub friction_torque: f64,
    /// Total axial film stiffness, N/m.
    pub stiffness: f64,
    /// Total flows, m³/s (each pad's flows times the pad count).
    pub flows: Flows,
    /// Mean specific load over the total pad area, Pa.
    pub mean_pressure: f64,
    /// The viscosity used.
    pub viscosity: ViscosityBasis,
    /// Largest local film Reynolds number `ρUh/μ` on the pad.
    pub max_reynolds_number: f64,
    /// Temperatures (thermal models only).
    pub thermal: Option<ThermalResult>,
    /// Numerical facts.
    pub stats: SolutionStats,
    /// Fields on the pad grid.
    pub fields: PadFields,
    /// Warnings and notes for the user, in words.
    pub notes: Vec<String>,
}

/// Which thermal model produced a [`ThermalResult`].
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ThermalModelKind {
    /// Inlet temperature plus a fraction of the adiabatic rise, one viscosity.
    Bulk,
    /// Film-temperature field from the energy equation.
    Field,
}

/// Temperatures and heat of a thermal analysis (SI units; temperatures in K).
#[derive(Clone, Debug, PartialEq)]
pub struct ThermalResult {
    /// The model.
    pub model: ThermalModelKind,
    /// Oil supply temperature, K.
    pub supply_temperature: f64,
    /// Mixed inlet temperature at the leading edge, K.
    pub inlet_temperature: f64,
    /// Flow-weighted temperature of the trailing-edge outflow, K.
    pub outlet_temperature: f64,
    /// Flow-weighted temperature of all oil leaving the pad, K.
    pub mean_outflow_temperature: f64,
    /// Hottest pad-surface temperature, K (bulk model: the adiabatic outlet temperature).
    pub max_pad_temperature: f64,
    /// Where the hottest point is, `(ξ, η)`.
    pub max_pad_temperature_at: (f64, f64),
    /// Pad temperature at 75 % of the arc and 75 % of the width (the customary sensor
    /// position), K (bulk model: inlet plus 75 % of the rise).
    pub sensor_temperature: f64,
    /// Effective film temperature, K (field model: area-mean film temperature).
    pub effective_temperature: f64,
    /// Viscosity at the effective temperature, Pa·s.
    pub effective_viscosity: f64,
    /// Adiabatic bulk rise `P/(ρ c Q_in)` of one pad, K.
    pub adiabatic_rise: f64,
    /// Thermal crown of the pad, m.
    pub thermal_crown: f64,
    /// Pad-mean temperature difference through the pad thickness, K.
    pub through_thickness_difference: f64,
    /// Energy totals of one pad, W.
    pub energy: crate::thermal::energy::EnergyBalance,
    /// Renewals of the temperature field during the analysis (zero for the bulk model).
    pub iterations: usize,
    /// Fresh oil the whole bearing draws from the supply, m³/s.
    pub fresh_oil_flow: f64,
    /// Film temperature at the grid nodes, K.
    pub temperature: Vec<f64>,
}
