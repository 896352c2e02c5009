//! Conversion of the `film_temperature` section between the design file (°C, %, L/min, mm,
//! µm/(m·K)) and the solver's SI [`FilmTemperature`], with the checks that catch unit mistakes
//! (a temperature in kelvin, a percentage given as a fraction, a flow in m³/s, a thickness in
//! metres, an expansion coefficient in 1/K).

use padwright_solver::prelude::*;

use super::convert::{bad, in_range};
use super::*;
use crate::units::*;

/// Checks a temperature in °C and converts it to kelvin.
fn temperature(field: &str, value_c: f64, what: &str) -> Result<f64, DesignError> {
    let what = format!("{what} in °C (a value near 300 is probably in kelvin)");
    Ok(c_to_k(in_range(field, value_c, -50.0, 250.0, &what)?))
}

/// Checks a share in percent (0 to 100) and converts it to a fraction. A value strictly
/// between 0 and 1 is refused: it is almost certainly a fraction written where a percentage
/// belongs (no bearing runs with 0.6 % carry-over).
fn share(field: &str, value_pct: f64, what: &str) -> Result<f64, DesignError> {
    let v = in_range(field, value_pct, 0.0, 100.0, &format!("{what} in percent"))?;
    if v > 0.0 && v < 1.0 {
        return Err(bad(
            field,
            v,
            format!(
                "expected {what} in percent from 0 to 100; a value between 0 and 1 is probably \
                 a fraction (write {} for {v})",
                tidy(fraction_to_pct(v))
            ),
        ));
    }
    Ok(pct_to_fraction(v))
}

/// Checks the supplied oil flow in L/min and converts it to m³/s.
fn supplied_flow(field: &str, value_l_min: Option<f64>) -> Result<Option<f64>, DesignError> {
    value_l_min
        .map(|q| {
            in_range(
                field,
                q,
                0.01,
                1e5,
                "the oil supplied to the whole bearing in L/min (a value below 0.01 is probably \
                 in m³/s)",
            )
            .map(l_min_to_m3_s)
        })
        .transpose()
}

/// Checks a heat-transfer coefficient in W/(m²·K).
fn coefficient(field: &str, value: f64, lo: f64) -> Result<f64, DesignError> {
    in_range(
        field,
        value,
        lo,
        1e6,
        "a heat-transfer coefficient in W/(m²·K)",
    )
}

impl PadConductionSpec {
    /// The solver's pad conduction, SI.
    pub fn to_conduction(&self) -> Result<PadConduction, DesignError> {
        const F: &str = "film_temperature.pad_conduction";
        let expansion = in_range(
            &format!("{F}.expansion_um_per_m_k"),
            self.expansion_um_per_m_k,
            0.0,
            100.0,
            "a linear expansion coefficient in µm/(m·K) (steel about 11.5)",
        )?;
        if expansion > 0.0 && expansion < 0.1 {
            return Err(bad(
                &format!("{F}.expansion_um_per_m_k"),
                expansion,
                "expected a linear expansion coefficient in µm/(m·K), such as 11.5 for steel; \
                 a value below 0.1 is probably in 1/K (11.5e-6 1/K is 11.5 µm/(m·K)); 0 leaves \
                 out the thermal crown",
            ));
        }
        Ok(PadConduction {
            thickness: mm_to_m(in_range(
                &format!("{F}.thickness_mm"),
                self.thickness_mm,
                1.0,
                500.0,
                "the pad thickness in millimetres (a value below 1 is probably in metres)",
            )?),
            conductivity: in_range(
                &format!("{F}.conductivity_w_per_m_k"),
                self.conductivity_w_per_m_k,
                0.05,
                1000.0,
                "a thermal conductivity in W/(m·K) (steel about 45)",
            )?,
            back_coefficient: coefficient(
                &format!("{F}.back_coefficient_w_per_m2_k"),
                self.back_coefficient_w_per_m2_k,
                0.1,
            )?,
            bath_temperature: temperature(
                &format!("{F}.bath_temperature_c"),
                self.bath_temperature_c,
                "the bath temperature",
            )?,
            expansion: um_per_m_k_to_per_k(expansion),
        })
    }

    /// The file form of the solver's pad conduction.
    pub fn from_conduction(p: &PadConduction) -> Self {
        PadConductionSpec {
            thickness_mm: tidy(m_to_mm(p.thickness)),
            conductivity_w_per_m_k: tidy(p.conductivity),
            back_coefficient_w_per_m2_k: tidy(p.back_coefficient),
            bath_temperature_c: tidy(k_to_c(p.bath_temperature)),
            expansion_um_per_m_k: tidy(per_k_to_um_per_m_k(p.expansion)),
        }
    }
}

impl FilmTemperatureSpec {
    /// The solver's film-temperature model, SI, with every value checked.
    pub fn to_film_temperature(&self) -> Result<FilmTemperature, DesignError> {
        const F: &str = "film_temperature";
        let supply = |t_c: f64, carry_pct: f64, flow: Option<f64>| -> Result<_, DesignError> {
            Ok(OilSupply {
                temperature: temperature(
                    &format!("{F}.supply_temperature_c"),
                    t_c,
                    "the oil supply temperature",
                )?,
                carry_over: share(
                    &format!("{F}.carry_over_pct"),
                    carry_pct,
                    "the hot-oil carry-over",
                )?,
                flow: supplied_flow(&format!("{F}.supplied_flow_l_min"), flow)?,
            })
        };
        Ok(match *self {
            FilmTemperatureSpec::Effective { temperature_c } => FilmTemperature::Effective {
                temperature: temperature(
                    &format!("{F}.temperature_c"),
                    temperature_c,
                    "the film temperature",
                )?,
            },
            FilmTemperatureSpec::Bulk {
                supply_temperature_c,
                carry_over_pct,
                share_of_rise_pct,
                supplied_flow_l_min,
            } => FilmTemperature::Bulk {
                supply: supply(supply_temperature_c, carry_over_pct, supplied_flow_l_min)?,
                rise_fraction: share(
                    &format!("{F}.share_of_rise_pct"),
                    share_of_rise_pct,
                    "the share of the adiabatic rise",
                )?,
            },
            FilmTemperatureSpec::Field {
                supply_temperature_c,
                carry_over_pct,
                supplied_flow_l_min,
                runner_coefficient_w_per_m2_k,
                runner_temperature_c,
                pad_conduction,
                tolerance_k,
            } => {
                let mut settings = FieldSettings::adiabatic(supply(
                    supply_temperature_c,
                    carry_over_pct,
                    supplied_flow_l_min,
                )?);
                settings.heat = HeatPaths {
                    runner_coefficient: coefficient(
                        &format!("{F}.runner_coefficient_w_per_m2_k"),
                        runner_coefficient_w_per_m2_k,
                        0.0,
                    )?,
                    runner_temperature: runner_temperature_c
                        .map(|t| {
                            temperature(
                                &format!("{F}.runner_temperature_c"),
                                t,
                                "the runner temperature",
                            )
                        })
                        .transpose()?,
                    pad: pad_conduction
                        .as_ref()
                        .map(PadConductionSpec::to_conduction)
                        .transpose()?,
                };
                settings.tolerance = in_range(
                    &format!("{F}.tolerance_k"),
                    tolerance_k,
                    1e-6,
                    10.0,
                    "a temperature change in K",
                )?;
                FilmTemperature::Field(settings)
            }
        })
    }

    /// The file form of the solver's film-temperature model (values rounded to 15 significant
    /// digits). Fails for a setting the file cannot hold.
    pub fn from_film_temperature(t: &FilmTemperature) -> Result<Self, DesignError> {
        let flow = |s: &OilSupply| s.flow.map(|q| tidy(m3_s_to_l_min(q)));
        Ok(match t {
            FilmTemperature::Effective { temperature } => FilmTemperatureSpec::Effective {
                temperature_c: tidy(k_to_c(*temperature)),
            },
            FilmTemperature::Bulk {
                supply,
                rise_fraction,
            } => FilmTemperatureSpec::Bulk {
                supply_temperature_c: tidy(k_to_c(supply.temperature)),
                carry_over_pct: tidy(fraction_to_pct(supply.carry_over)),
                share_of_rise_pct: tidy(fraction_to_pct(*rise_fraction)),
                supplied_flow_l_min: flow(supply),
            },
            FilmTemperature::Field(f) => {
                // The iteration limit has no field in the file (the solver bounds the coupling
                // itself); a design that changed it cannot be written without losing it.
                let default = FieldSettings::adiabatic(f.supply).max_iterations;
                if f.max_iterations != default {
                    return Err(DesignError::NotRepresentable(format!(
                        "the film-temperature field model's iteration limit of {} (the file \
                         format holds only the default of {default})",
                        f.max_iterations
                    )));
                }
                FilmTemperatureSpec::Field {
                    supply_temperature_c: tidy(k_to_c(f.supply.temperature)),
                    carry_over_pct: tidy(fraction_to_pct(f.supply.carry_over)),
                    supplied_flow_l_min: flow(&f.supply),
                    runner_coefficient_w_per_m2_k: tidy(f.heat.runner_coefficient),
                    runner_temperature_c: f.heat.runner_temperature.map(|t| tidy(k_to_c(t))),
                    pad_conduction: f.heat.pad.as_ref().map(PadConductionSpec::from_conduction),
                    tolerance_k: tidy(f.tolerance),
                }
            }
        })
    }
}

#[cfg(test)]
#[path = "film_temperature_tests.rs"]
mod tests;
