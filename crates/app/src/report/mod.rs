//! Results as the user sees them.
//!
//! [`Report`] gathers everything shown about one analysis in SI units, under the JSON keys of
//! the results schema (each key ends in its unit: `min_film_thickness_m`, `power_loss_w`). It
//! is built once, with every number checked to be finite; the JSON output is this struct
//! serialized ([`Report::to_json`]) and the text table ([`text::render`]) reads from it, so the
//! two can never disagree. Conversion to engineering units happens only in the table.
//!
//! The schema is identified by [`FORMAT_NAME`] and [`SCHEMA_VERSION`]; keys are only ever
//! added within a schema version, never renamed or removed, and a text value naming a kind or
//! model may gain new values as models are added. The `thermal` object, `fields.temperature_k`,
//! `design.thermal_settings` and the viscosity range were added within schema version 1.

use padwright_solver::pad::Flows;
use padwright_solver::prelude::*;
use serde::Serialize;

use crate::caution;
use crate::error::AppError;

mod design_echo;
pub mod text;
mod thermal;

pub use design_echo::{
    DesignEcho, DutyEcho, OilEcho, OutlineEcho, PadConductionEcho, SpeedEcho, SupportEcho,
    ThermalSettingsEcho,
};
pub use thermal::{EnergyOut, HOT_PAD_WARNING_K, SENSOR_LOCATION, ThermalOut};

/// Value of the `format` key of the JSON results.
pub const FORMAT_NAME: &str = "padwright-results";
/// Value of the `schema_version` key of the JSON results.
pub const SCHEMA_VERSION: u32 = 1;

/// A point on the pad in pad-local fractions: `xi` along the motion from the leading edge,
/// `eta` across it from the inner radius (or first side); both 0 to 1.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PadPoint {
    /// Fraction of the arc (or length) from the leading edge.
    pub xi: f64,
    /// Fraction of the width from the inner edge.
    pub eta: f64,
}

/// Edge flows, m³/s, and their balance.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct FlowsOut {
    /// Inflow through the leading edge, m³/s.
    pub leading_edge_in_m3_s: f64,
    /// Outflow through the trailing edge, m³/s.
    pub trailing_edge_out_m3_s: f64,
    /// Side leakage through the inner edge, m³/s.
    pub inner_edge_out_m3_s: f64,
    /// Side leakage through the outer edge, m³/s.
    pub outer_edge_out_m3_s: f64,
    /// Inner plus outer side leakage, m³/s.
    pub side_leakage_m3_s: f64,
    /// (inflow − outflows) / inflow, dimensionless.
    pub mass_balance_residual: f64,
}

/// Results of one pad, SI units.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PadOut {
    /// Load carried by the pad, N.
    pub load_n: f64,
    /// Minimum film thickness, m.
    pub min_film_thickness_m: f64,
    /// Where the minimum film is.
    pub min_film_location: PadPoint,
    /// Maximum film thickness, m.
    pub max_film_thickness_m: f64,
    /// Film at the pivot, m (null for fixed pads).
    pub pivot_film_thickness_m: Option<f64>,
    /// Pitch about the pivot, rad, positive opening the leading edge (null for fixed pads).
    pub pitch_rad: Option<f64>,
    /// Roll about the pivot, rad, positive opening the outer edge (null for fixed pads).
    pub roll_rad: Option<f64>,
    /// Crown of the pad face used in the film, m.
    pub crown_m: f64,
    /// Peak film pressure, Pa (gauge).
    pub peak_pressure_pa: f64,
    /// Where the peak pressure is.
    pub peak_pressure_location: PadPoint,
    /// Mean specific load: pad load / pad area, Pa.
    pub mean_pressure_pa: f64,
    /// Centre of pressure.
    pub centre_of_pressure: PadPoint,
    /// Friction force on the runner, N.
    pub friction_force_n: f64,
    /// Friction torque about the shaft axis, N·m (0 for rectangular pads).
    pub friction_torque_n_m: f64,
    /// Power loss, W.
    pub power_loss_w: f64,
    /// Edge flows.
    pub flows: FlowsOut,
    /// Axial film stiffness, N/m.
    pub stiffness_n_per_m: f64,
    /// Fraction of the pad area at the cavitation pressure, 0 to 1.
    pub cavitated_fraction: f64,
    /// Largest local film Reynolds number ρUh/μ on the pad, dimensionless.
    pub max_reynolds_number: f64,
}

/// Totals of the whole bearing, SI units.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct BearingOut {
    /// Number of pads.
    pub pad_count: usize,
    /// Total axial load, N.
    pub total_load_n: f64,
    /// Mean specific load over the total pad area, Pa.
    pub mean_pressure_pa: f64,
    /// Total friction force, N.
    pub friction_force_n: f64,
    /// Total friction torque, N·m.
    pub friction_torque_n_m: f64,
    /// Total power loss, W.
    pub power_loss_w: f64,
    /// Total edge flows.
    pub flows: FlowsOut,
    /// Total axial film stiffness, N/m.
    pub stiffness_n_per_m: f64,
}

/// The viscosity the solution used.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ViscosityOut {
    /// `"effective_temperature"` (set by the user), `"bulk_temperature"` (bulk model),
    /// `"temperature_field"` (field model: the values below are at the area-mean film
    /// temperature) or `"isoviscous"` (constant-viscosity oil).
    pub basis: &'static str,
    /// Temperature at which the viscosity was taken, K (null for an isoviscous oil with the
    /// effective-temperature model).
    pub temperature_k: Option<f64>,
    /// Dynamic viscosity, Pa·s.
    pub dynamic_viscosity_pa_s: f64,
    /// Field model: the lowest dynamic viscosity on the pad, at its hottest point, Pa·s (null
    /// for the other models, whose viscosity is uniform).
    pub lowest_dynamic_viscosity_pa_s: Option<f64>,
    /// Field model: the highest dynamic viscosity on the pad, at its coolest point, Pa·s (null
    /// for the other models).
    pub highest_dynamic_viscosity_pa_s: Option<f64>,
    /// Kinematic viscosity, m²/s.
    pub kinematic_viscosity_m2_s: f64,
    /// Density, kg/m³.
    pub density_kg_m3: f64,
    /// Where the temperature came from, in words.
    pub note: String,
}

/// Numerical facts of the solution.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SolverOut {
    /// Grid nodes along the motion.
    pub nodes_along: usize,
    /// Grid nodes across the motion.
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
    /// Relative moment error at the equilibrium (0 for fixed pads).
    pub moment_error: f64,
    /// The coarser-grid solution a thermal pad's equilibrium under a load started from (null if
    /// none).
    pub coarse_start: Option<CoarseStartOut>,
}

/// The coarser-grid solution an equilibrium started from (its work is not in the counts above).
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct CoarseStartOut {
    /// Nodes along the motion of the next coarser grid.
    pub nodes_along: usize,
    /// Nodes across the motion of the next coarser grid.
    pub nodes_across: usize,
    /// Pressure solves on all coarser grids.
    pub pressure_solves: usize,
    /// Temperature renewals on all coarser grids.
    pub temperature_renewals: usize,
}

/// Pressure and film on the pad grid.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct FieldsOut {
    /// How the arrays are laid out, in words.
    pub layout: &'static str,
    /// Nodes along the motion (length of `xi`).
    pub nodes_along: usize,
    /// Nodes across the motion (length of `eta`).
    pub nodes_across: usize,
    /// `ξ` of each node column, 0 (leading edge) to 1 (trailing edge).
    pub xi: Vec<f64>,
    /// `η` of each node row, 0 (inner edge) to 1 (outer edge).
    pub eta: Vec<f64>,
    /// Gauge pressure at each node, Pa, row-major.
    pub pressure_pa: Vec<f64>,
    /// Film thickness at each node, m, row-major.
    pub film_m: Vec<f64>,
    /// Film (and pad-surface) temperature at each node, K, row-major (null for the
    /// effective-temperature model; uniform for the bulk model).
    pub temperature_k: Option<Vec<f64>>,
}

/// Layout note of the field arrays.
pub const FIELD_LAYOUT: &str = "row-major, xi fastest: the value at column i (xi[i]) and row j \
(eta[j]) is at index j * nodes_along + i";

/// Everything reported about one analysis, in SI units, as serialized to JSON.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Report {
    /// Always [`FORMAT_NAME`].
    pub format: &'static str,
    /// Always [`SCHEMA_VERSION`].
    pub schema_version: u32,
    /// Version of the program that wrote the results.
    pub padwright_version: &'static str,
    /// The caution that goes with every result.
    pub caution: &'static str,
    /// The design analysed.
    pub design: DesignEcho,
    /// Bearing totals.
    pub bearing: BearingOut,
    /// The representative pad.
    pub pad: PadOut,
    /// The viscosity used.
    pub viscosity: ViscosityOut,
    /// Temperatures and heat (null for the effective-temperature model).
    pub thermal: Option<ThermalOut>,
    /// Numerical facts.
    pub solver: SolverOut,
    /// Warnings and notes, in words.
    pub notes: Vec<String>,
    /// Pressure and film fields on the grid.
    pub fields: FieldsOut,
}

/// Records the first value that is not finite, with its JSON key.
#[derive(Default)]
pub(crate) struct FiniteGuard {
    bad: Option<(String, f64)>,
}

impl FiniteGuard {
    /// Passes `v` through, remembering it if it is NaN or infinite.
    pub(crate) fn f(&mut self, key: &str, v: f64) -> f64 {
        if !v.is_finite() && self.bad.is_none() {
            self.bad = Some((key.to_string(), v));
        }
        v
    }

    fn point(&mut self, key: &str, (xi, eta): (f64, f64)) -> PadPoint {
        PadPoint {
            xi: self.f(&format!("{key}.xi"), xi),
            eta: self.f(&format!("{key}.eta"), eta),
        }
    }

    fn all(&mut self, key: &str, values: &[f64]) -> Vec<f64> {
        if let Some(v) = values.iter().find(|v| !v.is_finite()) {
            self.f(key, *v);
        }
        values.to_vec()
    }

    fn flows(&mut self, key: &str, f: &Flows) -> FlowsOut {
        FlowsOut {
            leading_edge_in_m3_s: self.f(&format!("{key}.leading_edge_in_m3_s"), f.leading_in),
            trailing_edge_out_m3_s: self
                .f(&format!("{key}.trailing_edge_out_m3_s"), f.trailing_out),
            inner_edge_out_m3_s: self.f(&format!("{key}.inner_edge_out_m3_s"), f.inner_out),
            outer_edge_out_m3_s: self.f(&format!("{key}.outer_edge_out_m3_s"), f.outer_out),
            side_leakage_m3_s: self.f(&format!("{key}.side_leakage_m3_s"), f.side_leakage()),
            mass_balance_residual: self.f(&format!("{key}.mass_balance_residual"), f.imbalance()),
        }
    }

    fn finish(self) -> Result<(), AppError> {
        match self.bad {
            None => Ok(()),
            Some((what, value)) => Err(AppError::NonFinite { what, value }),
        }
    }
}

impl Report {
    /// Gathers the report of an analysis. Fails if any value is NaN or infinite, naming it.
    pub fn new(title: &str, design: &BearingDesign, r: &BearingResult) -> Result<Self, AppError> {
        let mut g = FiniteGuard::default();
        let p = &r.pad;
        let n = r.pad_count as f64;
        let att = p.attitude;
        let pad = PadOut {
            load_n: g.f("pad.load_n", p.load),
            min_film_thickness_m: g.f("pad.min_film_thickness_m", p.min_film),
            min_film_location: g.point("pad.min_film_location", p.min_film_at),
            max_film_thickness_m: g.f("pad.max_film_thickness_m", p.max_film),
            pivot_film_thickness_m: att.map(|a| g.f("pad.pivot_film_thickness_m", a.pivot_film)),
            pitch_rad: att.map(|a| g.f("pad.pitch_rad", a.pitch)),
            roll_rad: att.map(|a| g.f("pad.roll_rad", a.roll)),
            crown_m: g.f("pad.crown_m", p.crown),
            peak_pressure_pa: g.f("pad.peak_pressure_pa", p.peak_pressure),
            peak_pressure_location: g.point("pad.peak_pressure_location", p.peak_at),
            mean_pressure_pa: g.f("pad.mean_pressure_pa", p.mean_pressure),
            centre_of_pressure: g.point("pad.centre_of_pressure", p.centre_of_pressure),
            friction_force_n: g.f("pad.friction_force_n", p.friction_force),
            friction_torque_n_m: g.f("pad.friction_torque_n_m", p.friction_torque),
            power_loss_w: g.f("pad.power_loss_w", p.power_loss),
            flows: g.flows("pad.flows", &p.flows),
            stiffness_n_per_m: g.f("pad.stiffness_n_per_m", p.stiffness),
            cavitated_fraction: g.f("pad.cavitated_fraction", p.cavitated_fraction),
            max_reynolds_number: g.f("pad.max_reynolds_number", r.max_reynolds_number),
        };
        let bearing = BearingOut {
            pad_count: r.pad_count,
            total_load_n: g.f("bearing.total_load_n", r.load),
            mean_pressure_pa: g.f("bearing.mean_pressure_pa", r.mean_pressure),
            friction_force_n: g.f("bearing.friction_force_n", p.friction_force * n),
            friction_torque_n_m: g.f("bearing.friction_torque_n_m", r.friction_torque),
            power_loss_w: g.f("bearing.power_loss_w", r.power_loss),
            flows: g.flows("bearing.flows", &r.flows),
            stiffness_n_per_m: g.f("bearing.stiffness_n_per_m", r.stiffness),
        };
        let v = &r.viscosity;
        let oil = &design.lubricant;
        // Field model: the viscosity range over the pad, from the extreme film temperatures.
        let range = match (&design.temperature, &r.thermal) {
            (FilmTemperature::Field(_), Some(th)) if !th.temperature.is_empty() => {
                let (lo, hi) = th
                    .temperature
                    .iter()
                    .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), &t| {
                        (a.min(t), b.max(t))
                    });
                oil.dynamic_viscosity_pa_s(hi)
                    .and_then(|a| Ok((a, oil.dynamic_viscosity_pa_s(lo)?)))
                    .ok()
            }
            _ => None,
        };
        let viscosity = ViscosityOut {
            basis: match design.temperature {
                _ if oil.is_isoviscous() => "isoviscous",
                FilmTemperature::Effective { .. } => "effective_temperature",
                FilmTemperature::Bulk { .. } => "bulk_temperature",
                FilmTemperature::Field(_) => "temperature_field",
            },
            temperature_k: v.temperature.map(|t| g.f("viscosity.temperature_k", t)),
            dynamic_viscosity_pa_s: g.f("viscosity.dynamic_viscosity_pa_s", v.dynamic_viscosity),
            lowest_dynamic_viscosity_pa_s: range
                .map(|(lo, _)| g.f("viscosity.lowest_dynamic_viscosity_pa_s", lo)),
            highest_dynamic_viscosity_pa_s: range
                .map(|(_, hi)| g.f("viscosity.highest_dynamic_viscosity_pa_s", hi)),
            kinematic_viscosity_m2_s: g.f(
                "viscosity.kinematic_viscosity_m2_s",
                v.dynamic_viscosity / v.density,
            ),
            density_kg_m3: g.f("viscosity.density_kg_m3", v.density),
            note: v.note.clone(),
        };
        let s = &r.stats;
        let solver = SolverOut {
            nodes_along: s.nodes_along,
            nodes_across: s.nodes_across,
            pressure_residual: g.f("solver.pressure_residual", s.pressure_residual),
            pressure_cycles: s.pressure_cycles,
            equilibrium_iterations: s.equilibrium_iterations,
            pressure_solves: s.pressure_solves,
            load_error: g.f("solver.load_error", s.load_error),
            moment_error: g.f("solver.moment_error", s.moment_error),
            coarse_start: s.coarse_start.map(|c| CoarseStartOut {
                nodes_along: c.nodes_along,
                nodes_across: c.nodes_across,
                pressure_solves: c.pressure_solves,
                temperature_renewals: c.temperature_renewals,
            }),
        };
        let fields = FieldsOut {
            layout: FIELD_LAYOUT,
            nodes_along: r.fields.xi.len(),
            nodes_across: r.fields.eta.len(),
            xi: g.all("fields.xi", &r.fields.xi),
            eta: g.all("fields.eta", &r.fields.eta),
            pressure_pa: g.all("fields.pressure_pa", &r.fields.pressure),
            film_m: g.all("fields.film_m", &r.fields.film),
            temperature_k: r
                .thermal
                .as_ref()
                .map(|th| g.all("fields.temperature_k", &th.temperature)),
        };
        let supplied = thermal::supply_of(&design.temperature).and_then(|s| s.flow);
        let thermal = r
            .thermal
            .as_ref()
            .map(|th| ThermalOut::new(&mut g, th, supplied));
        let mut notes = r.notes.clone();
        notes.extend(thermal.as_ref().and_then(ThermalOut::hot_pad_warning));
        let caution = caution(&design.temperature);
        let design = DesignEcho::new(&mut g, title, design);
        g.finish()?;
        Ok(Report {
            format: FORMAT_NAME,
            schema_version: SCHEMA_VERSION,
            padwright_version: env!("CARGO_PKG_VERSION"),
            caution,
            design,
            bearing,
            pad,
            viscosity,
            thermal,
            solver,
            notes,
            fields,
        })
    }

    /// The report as one pretty-printed JSON object.
    pub fn to_json(&self) -> Result<String, AppError> {
        Ok(serde_json::to_string_pretty(self)?)
    }
}

#[cfg(test)]
#[path = "tests.rs"]
mod tests;
