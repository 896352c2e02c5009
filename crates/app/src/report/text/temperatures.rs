//! The temperature parts of the table: the model in the header, the "Temperatures" and "Heat
//! balance" sections of a thermal analysis, and the "Viscosity used" section for every model.
//! Temperatures in °C, temperature differences in K, heat in kW, flows in L/min, crown in µm.

use std::fmt::Write as _;

use super::{Table, m2_s_to_mm2_s, num, point, setting};
use crate::report::{Report, ThermalOut};
use crate::units::*;

/// The film-temperature model in words, for the header.
pub(super) fn describe_model(r: &Report) -> String {
    let d = &r.design;
    if let Some(k) = d.effective_temperature_k {
        return format!(
            "effective film temperature {} °C, set by the user",
            num(k_to_c(k))
        );
    }
    let Some(s) = &d.thermal_settings else {
        return "from the thermal model".into();
    };
    let mut parts = vec![format!(
        "oil supplied at {} °C, {} % hot-oil carry-over",
        setting(tidy(k_to_c(s.supply_temperature_k))),
        setting(tidy(fraction_to_pct(s.carry_over)))
    )];
    if let Some(q) = s.supplied_flow_m3_s {
        parts.push(format!(
            "{} L/min supplied",
            setting(tidy(m3_s_to_l_min(q)))
        ));
    }
    match s.share_of_rise {
        Some(share) => {
            return format!(
                "bulk heat balance\n{}\nviscosity at the inlet temperature plus {} % of the \
                 adiabatic rise",
                parts.join(", "),
                setting(tidy(fraction_to_pct(share)))
            );
        }
        None => {
            match s.runner_coefficient_w_per_m2_k {
                Some(h) if h > 0.0 => {
                    parts.push(format!("heat to the runner at {} W/(m²·K)", setting(h)))
                }
                _ => parts.push("no heat to the runner".into()),
            }
            match &s.pad_conduction {
                Some(p) => parts.push(format!(
                    "heat through {} mm pads to a {} °C bath (thermal crown included)",
                    setting(tidy(m_to_mm(p.thickness_m))),
                    setting(tidy(k_to_c(p.bath_temperature_k)))
                )),
                None => parts.push("no heat through the pads".into()),
            }
        }
    }
    let heat = parts.split_off(parts.len() - 2).join("; ");
    format!(
        "film-temperature field from the energy equation\n{}\n{heat}",
        parts.join(", ")
    )
}

/// The "Temperatures" and "Heat balance" sections (thermal models only).
pub(super) fn render(t: &mut Table, r: &Report) {
    let Some(th) = &r.thermal else {
        return;
    };
    let bulk = th.pad_temperatures_estimated;
    let c = k_to_c;
    t.heading("Temperatures");
    if bulk {
        let _ = writeln!(
            t.0,
            "  Bulk model: one film temperature; the pad temperatures are rough estimates\n  \
             (hottest: the outlet temperature; sensor: inlet plus 75 % of the rise)."
        );
    }
    t.pad("Oil supply temperature", c(th.supply_temperature_k), "°C");
    t.pad("Mixed inlet temperature", c(th.inlet_temperature_k), "°C");
    t.pad(
        "Trailing-edge outlet temperature",
        c(th.outlet_temperature_k),
        "°C",
    );
    t.pad(
        "Mean temperature of all outflow",
        c(th.mean_outflow_temperature_k),
        "°C",
    );
    t.pad("Hottest pad temperature", c(th.max_pad_temperature_k), "°C");
    if !bulk {
        t.text("  where (ξ, η)", &point(&th.max_pad_temperature_location));
    }
    t.pad(
        &format!(
            "Pad at {:.0} % arc, {:.0} % width",
            fraction_to_pct(th.sensor_location.xi),
            fraction_to_pct(th.sensor_location.eta)
        ),
        c(th.sensor_temperature_k),
        "°C",
    );
    t.pad(
        if bulk {
            "Effective film temperature"
        } else {
            "Area-mean film temperature"
        },
        c(th.effective_temperature_k),
        "°C",
    );
    t.pad(
        "  viscosity there",
        pa_s_to_mpa_s(th.effective_viscosity_pa_s),
        "mPa·s",
    );
    t.pad("Adiabatic rise P/(ρ c Q_in)", th.adiabatic_rise_k, "K");
    let conducting = r
        .design
        .thermal_settings
        .is_some_and(|s| s.pad_conduction.is_some());
    if conducting {
        t.pad("Thermal crown", m_to_um(th.thermal_crown_m), "µm");
        t.pad(
            "Through-thickness difference",
            th.through_thickness_difference_k,
            "K",
        );
    }
    t.row(
        "Fresh oil drawn from the supply",
        "",
        &num(m3_s_to_l_min(th.fresh_oil_flow_m3_s)),
        "L/min",
    );
    if let Some(q) = th.supplied_flow_m3_s {
        t.row("Oil supplied", "", &num(m3_s_to_l_min(q)), "L/min");
    }
    heat_balance(t, th, r.design.pad_count as f64);
}

fn heat_balance(t: &mut Table, th: &ThermalOut, pads: f64) {
    let e = &th.energy;
    let kw = |w: f64| (w_to_kw(w), w_to_kw(w * pads));
    t.heading("Heat balance");
    let (p, b) = kw(e.dissipated_w);
    t.both("Dissipated in the film", p, b, "kW");
    let (p, b) = kw(e.carried_by_oil_w);
    t.both("Carried away by the oil", p, b, "kW");
    if th.pad_temperatures_estimated {
        let _ = writeln!(
            t.0,
            "  Bulk model: all the heat leaves with the oil (adiabatic pad and runner)."
        );
        return;
    }
    let (p, b) = kw(e.to_surfaces_w);
    t.both("To the runner and through the pad", p, b, "kW");
    // The cavitated-region term is shown only where it matters (above 0.1 % of the heat).
    if e.cavitation_term_w.abs() > 1e-3 * e.dissipated_w.abs() {
        let (p, b) = kw(e.cavitation_term_w);
        t.both("Cavitated-region term", p, b, "kW");
    }
    t.pad(
        "Balance residual",
        fraction_to_pct(e.residual),
        "% of dissipation",
    );
    t.text(
        "Temperature-field updates",
        &th.temperature_updates.to_string(),
    );
}

/// The "Viscosity used" section, adapted to the temperature model.
pub(super) fn viscosity(t: &mut Table, r: &Report) {
    t.heading("Viscosity used");
    let v = &r.viscosity;
    let label = match r.design.temperature_model {
        "bulk" => "Film temperature (bulk model)",
        "field" => "Area-mean film temperature",
        _ => "Effective film temperature (set)",
    };
    match v.temperature_k {
        Some(k) => t.pad(label, k_to_c(k), "°C"),
        None => t.text("Film temperature", "not used"),
    }
    t.pad(
        "Dynamic viscosity",
        pa_s_to_mpa_s(v.dynamic_viscosity_pa_s),
        "mPa·s",
    );
    if let (Some(lo), Some(hi)) = (
        v.lowest_dynamic_viscosity_pa_s,
        v.highest_dynamic_viscosity_pa_s,
    ) {
        t.pad("  lowest, at the hottest point", pa_s_to_mpa_s(lo), "mPa·s");
        t.pad(
            "  highest, at the coolest point",
            pa_s_to_mpa_s(hi),
            "mPa·s",
        );
    }
    t.pad(
        "Kinematic viscosity",
        m2_s_to_mm2_s(v.kinematic_viscosity_m2_s),
        "mm²/s",
    );
    t.pad("Density", v.density_kg_m3, "kg/m³");
    let _ = writeln!(t.0, "  Basis: {}", v.note);
}
