//! The `thermal` object of the results: temperatures, heat and fresh oil of a thermal analysis
//! (SI units, temperatures in kelvin), and the warning on hot pads.

use padwright_solver::prelude::*;
use padwright_solver::results::{ThermalModelKind, ThermalResult};
use serde::Serialize;

use super::{FiniteGuard, PadPoint};

/// Where the customary pad temperature sensor sits: 75 % of the arc from the leading edge and
/// 75 % of the width from the inner edge (common practice, no source).
pub const SENSOR_LOCATION: PadPoint = PadPoint {
    xi: 0.75,
    eta: 0.75,
};

/// Hottest pad temperature above which the results carry a warning, K (120 °C: white-metal
/// (babbitt) pad faces are commonly kept below about 120–130 °C; common practice, no source).
pub const HOT_PAD_WARNING_K: f64 = 393.15;

/// Energy totals of one pad, W.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct EnergyOut {
    /// Power dissipated in the film, W.
    pub dissipated_w: f64,
    /// Net enthalpy carried out of the pad by the oil, W.
    pub carried_by_oil_w: f64,
    /// Heat conducted to the runner and into the pad, W.
    pub to_surfaces_w: f64,
    /// Enthalpy attributed to the flow the cavitation condition adds in cavitated regions, W.
    pub cavitation_term_w: f64,
    /// (dissipated − carried − surfaces − cavitation term) / dissipated, dimensionless.
    pub residual: f64,
}

/// Temperatures and heat of a thermal analysis, SI units.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ThermalOut {
    /// `"bulk"` or `"field"`.
    pub model: &'static str,
    /// True when the pad temperatures are estimates from the bulk rise rather than values of a
    /// temperature field (bulk model).
    pub pad_temperatures_estimated: bool,
    /// Oil supply temperature, K.
    pub supply_temperature_k: f64,
    /// Mixed inlet temperature at the leading edge (supply plus hot-oil carry-over), K.
    pub inlet_temperature_k: f64,
    /// Flow-weighted temperature of the trailing-edge outflow, K.
    pub outlet_temperature_k: f64,
    /// Flow-weighted temperature of all oil leaving the pad, K.
    pub mean_outflow_temperature_k: f64,
    /// Hottest pad-surface temperature, K (bulk model: the outlet temperature).
    pub max_pad_temperature_k: f64,
    /// Where the hottest point is (bulk model: the trailing outer corner, nominally).
    pub max_pad_temperature_location: PadPoint,
    /// Pad temperature at the customary sensor position, K (bulk model: inlet plus 75 % of the
    /// rise).
    pub sensor_temperature_k: f64,
    /// The sensor position: 75 % of the arc, 75 % of the width.
    pub sensor_location: PadPoint,
    /// Effective film temperature, K (field model: area-mean film temperature).
    pub effective_temperature_k: f64,
    /// Viscosity at the effective temperature, Pa·s.
    pub effective_viscosity_pa_s: f64,
    /// Adiabatic bulk rise `P/(ρ c Q_in)` of one pad, K.
    pub adiabatic_rise_k: f64,
    /// Thermal crown of the pad from its through-thickness temperature difference, m.
    pub thermal_crown_m: f64,
    /// Pad-mean temperature difference through the pad thickness, K.
    pub through_thickness_difference_k: f64,
    /// Energy totals of one pad.
    pub energy: EnergyOut,
    /// Updates of the temperature field made during the analysis.
    pub temperature_updates: usize,
    /// Fresh oil the whole bearing draws from the supply, m³/s.
    pub fresh_oil_flow_m3_s: f64,
    /// Oil supplied to the whole bearing as given in the design, m³/s (null if not given).
    pub supplied_flow_m3_s: Option<f64>,
}

impl ThermalOut {
    /// The thermal object of a result (null for the effective-temperature model).
    pub(super) fn new(
        g: &mut FiniteGuard,
        th: &ThermalResult,
        supplied: Option<f64>,
    ) -> ThermalOut {
        let k = |name: &str| format!("thermal.{name}");
        let e = &th.energy;
        ThermalOut {
            model: match th.model {
                ThermalModelKind::Bulk => "bulk",
                ThermalModelKind::Field => "field",
            },
            pad_temperatures_estimated: th.model == ThermalModelKind::Bulk,
            supply_temperature_k: g.f(&k("supply_temperature_k"), th.supply_temperature),
            inlet_temperature_k: g.f(&k("inlet_temperature_k"), th.inlet_temperature),
            outlet_temperature_k: g.f(&k("outlet_temperature_k"), th.outlet_temperature),
            mean_outflow_temperature_k: g.f(
                &k("mean_outflow_temperature_k"),
                th.mean_outflow_temperature,
            ),
            max_pad_temperature_k: g.f(&k("max_pad_temperature_k"), th.max_pad_temperature),
            max_pad_temperature_location: g.point(
                &k("max_pad_temperature_location"),
                th.max_pad_temperature_at,
            ),
            sensor_temperature_k: g.f(&k("sensor_temperature_k"), th.sensor_temperature),
            sensor_location: SENSOR_LOCATION,
            effective_temperature_k: g.f(&k("effective_temperature_k"), th.effective_temperature),
            effective_viscosity_pa_s: g.f(&k("effective_viscosity_pa_s"), th.effective_viscosity),
            adiabatic_rise_k: g.f(&k("adiabatic_rise_k"), th.adiabatic_rise),
            thermal_crown_m: g.f(&k("thermal_crown_m"), th.thermal_crown),
            through_thickness_difference_k: g.f(
                &k("through_thickness_difference_k"),
                th.through_thickness_difference,
            ),
            energy: EnergyOut {
                dissipated_w: g.f(&k("energy.dissipated_w"), e.dissipated),
                carried_by_oil_w: g.f(&k("energy.carried_by_oil_w"), e.carried_by_oil),
                to_surfaces_w: g.f(&k("energy.to_surfaces_w"), e.to_surfaces),
                cavitation_term_w: g.f(&k("energy.cavitation_term_w"), e.cavitation_term),
                residual: g.f(&k("energy.residual"), e.residual()),
            },
            temperature_updates: th.iterations,
            fresh_oil_flow_m3_s: g.f(&k("fresh_oil_flow_m3_s"), th.fresh_oil_flow),
            supplied_flow_m3_s: supplied.map(|q| g.f(&k("supplied_flow_m3_s"), q)),
        }
    }

    /// The warning for a pad hotter than [`HOT_PAD_WARNING_K`], if any.
    pub fn hot_pad_warning(&self) -> Option<String> {
        (self.max_pad_temperature_k > HOT_PAD_WARNING_K).then(|| {
            format!(
                "warning: the hottest pad temperature, {:.0} °C{}, is above about {:.0} °C; \
                 white-metal (babbitt) pad faces are commonly kept below about 120–130 °C",
                crate::units::k_to_c(self.max_pad_temperature_k),
                if self.pad_temperatures_estimated {
                    " (bulk-model estimate)"
                } else {
                    ""
                },
                crate::units::k_to_c(HOT_PAD_WARNING_K)
            )
        })
    }
}

/// The oil supply given in a design, if the design has a thermal model.
pub(super) fn supply_of(t: &FilmTemperature) -> Option<&padwright_solver::thermal::OilSupply> {
    match t {
        FilmTemperature::Effective { .. } => None,
        FilmTemperature::Bulk { supply, .. } => Some(supply),
        FilmTemperature::Field(f) => Some(&f.supply),
    }
}

#[cfg(test)]
#[path = "thermal_tests.rs"]
mod tests;
