//! Tests of the `thermal` object and the temperature sections of the table: finite values,
//! the relations any heat balance must satisfy, the library's own numbers, and the refusal of
//! non-finite values.

use padwright_solver::prelude::*;
use serde_json::Value;

use super::super::tests::{at, json, row, solved};
use super::super::{Report, text};
use crate::error::AppError;
use crate::templates::Template;

/// The demos with a thermal model.
const THERMAL: [Template; 3] = [Template::Tilting, Template::Centre, Template::Tapered];

fn num(v: &Value, key: &str) -> f64 {
    at(v, key)
        .as_f64()
        .unwrap_or_else(|| panic!("{key} is a number"))
}

#[test]
fn thermal_json_is_finite_and_physically_consistent() {
    for t in THERMAL {
        let (design, result) = solved(t);
        let v = json(&Report::new("t", &design, &result).unwrap());
        let name = t.asset_name();
        let keys = [
            "supply_temperature_k",
            "inlet_temperature_k",
            "outlet_temperature_k",
            "mean_outflow_temperature_k",
            "max_pad_temperature_k",
            "max_pad_temperature_location.xi",
            "max_pad_temperature_location.eta",
            "sensor_temperature_k",
            "sensor_location.xi",
            "effective_temperature_k",
            "effective_viscosity_pa_s",
            "adiabatic_rise_k",
            "thermal_crown_m",
            "through_thickness_difference_k",
            "energy.dissipated_w",
            "energy.carried_by_oil_w",
            "energy.to_surfaces_w",
            "energy.cavitation_term_w",
            "energy.residual",
            "temperature_updates",
            "fresh_oil_flow_m3_s",
        ];
        for key in keys {
            let x = num(&v, &format!("thermal.{key}"));
            assert!(x.is_finite(), "{name}: {key} = {x}");
        }
        let th = |k: &str| num(&v, &format!("thermal.{k}"));
        // Temperatures rise from the supply through the inlet to the outlet (carry-over only
        // adds heat; 1e-9 K allows for round-off where they coincide).
        let (supply, inlet, outlet) = (
            th("supply_temperature_k"),
            th("inlet_temperature_k"),
            th("outlet_temperature_k"),
        );
        assert!(
            inlet >= supply - 1e-9,
            "{name}: inlet {inlet} < supply {supply}"
        );
        assert!(
            outlet >= inlet - 1e-9,
            "{name}: outlet {outlet} < inlet {inlet}"
        );
        // The hottest point is at least as hot as the sensor point and any outflow average.
        let max = th("max_pad_temperature_k");
        assert!(max >= th("sensor_temperature_k") - 1e-9, "{name}");
        assert!(max >= outlet - 1e-9, "{name}");
        assert!(max >= th("mean_outflow_temperature_k") - 1e-9, "{name}");
        assert!(th("effective_temperature_k") >= inlet - 1e-9, "{name}");
        assert!(th("effective_temperature_k") <= max + 1e-9, "{name}");
        // The adiabatic rise is P/(ρ c Q_in) of one pad, ρ c at the supply temperature.
        let oil = &design.lubricant;
        let rho_c = oil.density_kg_m3(supply).unwrap() * oil.specific_heat_j_per_kg_k();
        let rise =
            num(&v, "pad.power_loss_w") / (rho_c * num(&v, "pad.flows.leading_edge_in_m3_s"));
        assert!(
            (th("adiabatic_rise_k") - rise).abs() <= 1e-9 * rise,
            "{name}: rise {} vs {rise}",
            th("adiabatic_rise_k")
        );
        // Fresh oil: none drawn beyond the bearing's total leading-edge inflow.
        let fresh = th("fresh_oil_flow_m3_s");
        assert!(
            fresh > 0.0 && fresh <= num(&v, "bearing.flows.leading_edge_in_m3_s") * (1.0 + 1e-12)
        );
        // The heat made is the power lost (one pad), and the balance closes (energy
        // conservation of the scheme: within 1 %).
        assert!(
            (th("energy.dissipated_w") - num(&v, "pad.power_loss_w")).abs()
                <= 1e-6 * num(&v, "pad.power_loss_w"),
            "{name}"
        );
        assert!(th("energy.residual").abs() < 0.01, "{name}");
        // One temperature per node, all within [supply, hottest].
        let nodes = num(&v, "fields.nodes_along") * num(&v, "fields.nodes_across");
        let field = at(&v, "fields.temperature_k").as_array().unwrap();
        assert_eq!(field.len() as f64, nodes, "{name}");
        for x in field {
            let x = x.as_f64().unwrap();
            assert!(x >= supply - 1e-9 && x <= max + 1e-9, "{name}: {x}");
        }
        // The viscosity echoes the effective temperature's.
        assert_eq!(
            th("effective_viscosity_pa_s"),
            num(&v, "viscosity.dynamic_viscosity_pa_s"),
            "{name}"
        );
    }
}

#[test]
fn thermal_json_carries_the_library_values() {
    for t in THERMAL {
        let (design, result) = solved(t);
        let v = json(&Report::new("t", &design, &result).unwrap());
        let th = result.thermal.as_ref().unwrap();
        let rel = |key: &str, lib: f64| {
            let x = num(&v, &format!("thermal.{key}"));
            assert!(
                (x - lib).abs() <= 1e-12 * lib.abs(),
                "{}: {key}: JSON {x} vs library {lib}",
                t.asset_name()
            );
        };
        rel("max_pad_temperature_k", th.max_pad_temperature);
        rel("sensor_temperature_k", th.sensor_temperature);
        rel("outlet_temperature_k", th.outlet_temperature);
        rel("fresh_oil_flow_m3_s", th.fresh_oil_flow);
        rel("energy.dissipated_w", th.energy.dissipated);
        let field = at(&v, "fields.temperature_k").as_array().unwrap();
        // JSON numbers are printed to round-trip, but read back by a parser that may miss
        // the last bit: 1e-12 relative.
        assert_eq!(field.len(), th.temperature.len());
        for (x, lib) in field.iter().zip(&th.temperature) {
            assert!((x.as_f64().unwrap() - lib).abs() <= 1e-12 * lib);
        }
    }
}

#[test]
fn field_model_reports_where_it_is_hottest_and_its_viscosity_range() {
    let (design, result) = solved(Template::Centre);
    let r = Report::new("t", &design, &result).unwrap();
    let th = r.thermal.as_ref().unwrap();
    assert_eq!(th.model, "field");
    assert!(!th.pad_temperatures_estimated);
    // The hottest node of the field is the reported hottest temperature.
    let field = r.fields.temperature_k.as_ref().unwrap();
    let hottest = field.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    assert_eq!(hottest, th.max_pad_temperature_k);
    // Pad conduction bends the centre-pivoted pad: the crown its load depends on.
    assert!(th.thermal_crown_m > 0.0 && th.through_thickness_difference_k > 0.0);
    let v = &r.viscosity;
    assert_eq!(v.basis, "temperature_field");
    let (lo, hi) = (
        v.lowest_dynamic_viscosity_pa_s.unwrap(),
        v.highest_dynamic_viscosity_pa_s.unwrap(),
    );
    assert!(lo < v.dynamic_viscosity_pa_s && v.dynamic_viscosity_pa_s < hi);
    let settings = r.design.thermal_settings.unwrap();
    let pad = settings.pad_conduction.unwrap();
    // The demo's 20 mm steel pad at 11.5 µm/(m·K), 45 °C supply, echoed in SI.
    assert_eq!(pad.thickness_m, 0.02);
    assert_eq!(pad.expansion_per_k, 11.5e-6);
    assert_eq!(settings.supply_temperature_k, 318.15);
    assert_eq!(settings.share_of_rise, None);
    let table = text::render(&r);
    assert!(table.contains("\nTemperatures\n"), "{table}");
    assert!(table.contains("\nHeat balance\n"), "{table}");
    assert_eq!(row(&table, "Temperature-field updates").len(), 1);
    assert!(r.caution.contains("temperature field"), "{}", r.caution);
}

#[test]
fn bulk_model_says_its_pad_temperatures_are_estimates() {
    let (design, result) = solved(Template::Tapered);
    let r = Report::new("t", &design, &result).unwrap();
    let th = r.thermal.as_ref().unwrap();
    assert_eq!(th.model, "bulk");
    assert!(th.pad_temperatures_estimated);
    assert_eq!(r.viscosity.basis, "bulk_temperature");
    assert_eq!(r.design.temperature_model, "bulk");
    assert_eq!(r.design.thermal_settings.unwrap().share_of_rise, Some(0.8));
    // Uniform film: every node at the effective temperature.
    let field = r.fields.temperature_k.as_ref().unwrap();
    assert!(field.iter().all(|&t| t == th.effective_temperature_k));
    let table = text::render(&r);
    assert!(table.contains("rough estimates"), "{table}");
    assert!(table.contains("bulk heat balance"), "{table}");
    assert!(r.caution.contains("rough estimates"), "{}", r.caution);
    // No location for an estimated hottest point, no surface heat rows.
    let after = &table[table.find("Hottest pad temperature").unwrap()..];
    assert!(!after.lines().nth(1).unwrap().contains("where"), "{table}");
    assert!(!table.contains("To the runner and through the pad"));
}

#[test]
fn a_hot_pad_gets_a_warning() {
    let (design, result) = solved(Template::Tilting);
    let warned = |t_k: f64| {
        let mut r = result.clone();
        r.thermal.as_mut().unwrap().max_pad_temperature = t_k;
        Report::new("t", &design, &r)
            .unwrap()
            .notes
            .iter()
            .any(|n| n.contains("babbitt"))
    };
    // 130 °C warns, 110 °C does not (the threshold is 120 °C).
    assert!(warned(403.15));
    assert!(!warned(383.15));
}

#[test]
fn non_finite_thermal_values_are_refused_and_named() {
    let (design, result) = solved(Template::Tilting);
    let refused = |r: &BearingResult| match Report::new("t", &design, r) {
        Err(AppError::NonFinite { what, .. }) => what,
        other => panic!("expected a refusal, got {other:?}"),
    };
    let mut bad = result.clone();
    bad.thermal.as_mut().unwrap().max_pad_temperature = f64::NAN;
    assert_eq!(refused(&bad), "thermal.max_pad_temperature_k");
    let mut bad = result.clone();
    bad.thermal.as_mut().unwrap().temperature[3] = f64::INFINITY;
    assert_eq!(refused(&bad), "fields.temperature_k");
    let mut bad = result;
    bad.thermal.as_mut().unwrap().energy.to_surfaces = f64::NEG_INFINITY;
    assert_eq!(refused(&bad), "thermal.energy.to_surfaces_w");
}
