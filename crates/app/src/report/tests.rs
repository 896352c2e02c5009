//! Tests of the report: JSON keys and SI values, totals, the refusal of non-finite numbers,
//! and the unit conversions of the text table.

use padwright_solver::prelude::*;
use serde_json::Value;

use super::*;
use crate::design_file::DesignFile;
use crate::templates::Template;

pub(super) fn solved(t: Template) -> (BearingDesign, BearingResult) {
    let design = DesignFile::parse(t.text()).unwrap().to_design().unwrap();
    let result = analyze(&design).unwrap();
    (design, result)
}

pub(super) fn json(report: &Report) -> Value {
    serde_json::from_str(&report.to_json().unwrap()).unwrap()
}

/// Looks up a dotted path such as `pad.flows.leading_edge_in_m3_s`.
pub(super) fn at<'a>(v: &'a Value, path: &str) -> &'a Value {
    path.split('.').fold(v, |v, k| {
        v.get(k).unwrap_or_else(|| panic!("missing key {path}"))
    })
}

#[test]
fn json_has_the_documented_keys_in_si() {
    let (design, result) = solved(Template::Tilting);
    let v = json(&Report::new("t", &design, &result).unwrap());
    assert_eq!(at(&v, "format"), FORMAT_NAME);
    assert_eq!(at(&v, "schema_version"), SCHEMA_VERSION);
    for key in [
        "bearing.total_load_n",
        "bearing.mean_pressure_pa",
        "bearing.friction_torque_n_m",
        "bearing.power_loss_w",
        "bearing.stiffness_n_per_m",
        "bearing.flows.side_leakage_m3_s",
        "pad.load_n",
        "pad.min_film_thickness_m",
        "pad.min_film_location.xi",
        "pad.min_film_location.eta",
        "pad.max_film_thickness_m",
        "pad.pivot_film_thickness_m",
        "pad.pitch_rad",
        "pad.roll_rad",
        "pad.peak_pressure_pa",
        "pad.peak_pressure_location.xi",
        "pad.mean_pressure_pa",
        "pad.centre_of_pressure.eta",
        "pad.friction_torque_n_m",
        "pad.power_loss_w",
        "pad.flows.leading_edge_in_m3_s",
        "pad.flows.trailing_edge_out_m3_s",
        "pad.flows.inner_edge_out_m3_s",
        "pad.flows.outer_edge_out_m3_s",
        "pad.flows.mass_balance_residual",
        "pad.stiffness_n_per_m",
        "pad.cavitated_fraction",
        "viscosity.temperature_k",
        "viscosity.dynamic_viscosity_pa_s",
        "viscosity.density_kg_m3",
        "solver.pressure_residual",
        "solver.load_error",
        "solver.moment_error",
    ] {
        let x = at(&v, key)
            .as_f64()
            .unwrap_or_else(|| panic!("{key} is a number"));
        assert!(x.is_finite(), "{key}");
    }
    // SI, not engineering units: the values are the solver's own.
    assert_eq!(
        at(&v, "pad.min_film_thickness_m").as_f64(),
        Some(result.pad.min_film)
    );
    assert_eq!(
        at(&v, "bearing.power_loss_w").as_f64(),
        Some(result.power_loss)
    );
    assert_eq!(
        at(&v, "viscosity.temperature_k").as_f64(),
        result.viscosity.temperature
    );
    assert_eq!(at(&v, "viscosity.basis"), "temperature_field");
    assert_eq!(at(&v, "design.temperature_model"), "field");
    assert!(at(&v, "caution").as_str().unwrap().contains("preliminary"));
}

#[test]
fn the_effective_temperature_model_has_no_thermal_results() {
    // The rig demo sets its film temperature: 50 °C = 323.15 K.
    let (design, result) = solved(Template::Rig);
    let v = json(&Report::new("t", &design, &result).unwrap());
    assert_eq!(at(&v, "viscosity.temperature_k").as_f64(), Some(323.15));
    assert_eq!(
        at(&v, "design.effective_temperature_k").as_f64(),
        Some(323.15)
    );
    assert_eq!(at(&v, "viscosity.basis"), "effective_temperature");
    assert_eq!(at(&v, "design.temperature_model"), "effective");
    let note = at(&v, "viscosity.note").as_str().unwrap();
    assert!(
        note.contains("effective film temperature set by the user"),
        "{note}"
    );
    for key in [
        "thermal",
        "fields.temperature_k",
        "design.thermal_settings",
        "viscosity.lowest_dynamic_viscosity_pa_s",
        "viscosity.highest_dynamic_viscosity_pa_s",
    ] {
        assert!(at(&v, key).is_null(), "{key}");
    }
    assert_eq!(at(&v, "caution"), crate::CAUTION);
    let table = text::render(&Report::new("", &design, &result).unwrap());
    assert!(!table.contains("\nTemperatures"), "{table}");
    assert!(!table.contains("Heat balance"), "{table}");
}

#[test]
fn json_fields_are_row_major_with_xi_fastest() {
    let (design, result) = solved(Template::Tapered);
    let report = Report::new("t", &design, &result).unwrap();
    let f = &report.fields;
    assert_eq!(f.xi.len(), f.nodes_along);
    assert_eq!(f.eta.len(), f.nodes_across);
    assert_eq!(f.pressure_pa.len(), f.nodes_along * f.nodes_across);
    assert_eq!(f.film_m.len(), f.pressure_pa.len());
    // Index j·nodes_along + i is (xi[i], eta[j]): the film depends on xi only on a tapered
    // land without crown, so every row must repeat the first one.
    let n = f.nodes_along;
    for j in 0..f.nodes_across {
        for i in 0..n {
            let (a, b) = (f.film_m[j * n + i], f.film_m[i]);
            assert!((a - b).abs() <= 1e-15, "row {j} column {i}: {a} vs {b}");
        }
    }
    // ...and falls along a row from the taper towards the land.
    assert!(f.film_m[0] > f.film_m[n - 1]);
    // The edges carry ambient pressure.
    assert_eq!(f.pressure_pa[0], 0.0);
    assert!(f.layout.contains("j * nodes_along + i"));
}

#[test]
fn fixed_pads_have_no_attitude() {
    let (design, result) = solved(Template::Tapered);
    let v = json(&Report::new("t", &design, &result).unwrap());
    for key in [
        "pad.pivot_film_thickness_m",
        "pad.pitch_rad",
        "pad.roll_rad",
    ] {
        assert!(at(&v, key).is_null(), "{key}");
    }
}

#[test]
fn bearing_totals_are_pad_values_times_pad_count() {
    let (design, result) = solved(Template::Tilting);
    let r = Report::new("t", &design, &result).unwrap();
    let n = design.pad_count as f64;
    let same = |a: f64, b: f64| (a - b).abs() <= 1e-9 * a.abs().max(b.abs());
    assert!(same(r.bearing.total_load_n, r.pad.load_n * n));
    assert!(same(r.bearing.power_loss_w, r.pad.power_loss_w * n));
    assert!(same(r.bearing.friction_force_n, r.pad.friction_force_n * n));
    assert!(same(
        r.bearing.flows.leading_edge_in_m3_s,
        r.pad.flows.leading_edge_in_m3_s * n
    ));
    // The load asked is the load found, to the equilibrium tolerance.
    assert!((r.bearing.total_load_n - 62_000.0).abs() < 62_000.0 * 1e-6);
}

#[test]
fn non_finite_values_are_refused_and_named() {
    let (design, result) = solved(Template::Tilting);
    let mut bad = result.clone();
    bad.pad.min_film = f64::NAN;
    match Report::new("t", &design, &bad) {
        Err(AppError::NonFinite { what, .. }) => assert_eq!(what, "pad.min_film_thickness_m"),
        other => panic!("expected a refusal, got {other:?}"),
    }
    let mut bad = result.clone();
    bad.fields.pressure[7] = f64::INFINITY;
    match Report::new("t", &design, &bad) {
        Err(AppError::NonFinite { what, .. }) => assert_eq!(what, "fields.pressure_pa"),
        other => panic!("expected a refusal, got {other:?}"),
    }
    let mut bad = result;
    bad.flows.outer_out = f64::NEG_INFINITY;
    assert!(matches!(
        Report::new("t", &design, &bad),
        Err(AppError::NonFinite { .. })
    ));
}

/// The table row that starts with `label`, split into its words.
pub(super) fn row(table: &str, label: &str) -> Vec<String> {
    let line = table
        .lines()
        .find(|l| l.trim_start().starts_with(label))
        .unwrap_or_else(|| panic!("no row {label}\n{table}"));
    line[line.find(label).unwrap() + label.len()..]
        .split_whitespace()
        .map(String::from)
        .collect()
}

#[test]
fn the_table_converts_si_to_engineering_units() {
    let (design, mut result) = solved(Template::Tilting);
    // Set round SI values and read them back from the table in engineering units.
    result.pad.min_film = 25e-6; // 25 µm
    result.pad.max_film = 7.1e-5; // 71 µm
    result.pad.load = 7_750.0; // 7.75 kN
    result.load = 62_000.0; // 62 kN
    result.pad.mean_pressure = 1.5e6; // 1.5 MPa
    result.pad.peak_pressure = 4.25e6; // 4.25 MPa
    result.pad.power_loss = 740.0; // 0.74 kW
    result.power_loss = 5_920.0; // 5.92 kW
    result.pad.flows.leading_in = 2.0e-3 / 60.0; // 2 L/min
    result.flows.leading_in = 16.0e-3 / 60.0; // 16 L/min
    result.pad.stiffness = 3.7e8; // 370 N/µm
    result.stiffness = 2.96e9; // 2960 N/µm
    result.pad.attitude.as_mut().unwrap().pitch = 4.8e-4; // 0.48 mrad
    result.pad.cavitated_fraction = 0.125; // 12.5 %
    result.viscosity.dynamic_viscosity = 0.0162; // 16.2 mPa·s
    result.viscosity.temperature = Some(335.15); // 62 °C
    let th = result.thermal.as_mut().unwrap();
    th.supply_temperature = 318.15; // 45 °C
    th.inlet_temperature = 325.65; // 52.5 °C
    th.max_pad_temperature = 363.15; // 90 °C
    th.sensor_temperature = 353.15; // 80 °C
    th.adiabatic_rise = 12.5; // 12.5 K
    th.thermal_crown = 1.5e-6; // 1.5 µm
    th.fresh_oil_flow = 2e-4; // 12 L/min
    th.energy.dissipated = 740.0; // 0.74 kW per pad, 5.92 kW for 8 pads
    th.effective_temperature = 335.15; // 62 °C, shown again under "Viscosity used"
    th.effective_viscosity = 0.0189; // 18.9 mPa·s
    let table = text::render(&Report::new("T", &design, &result).unwrap());
    assert_eq!(row(&table, "Minimum film thickness"), ["25.00", "µm"]);
    assert_eq!(row(&table, "Maximum film thickness"), ["71.00", "µm"]);
    assert_eq!(row(&table, "Axial load"), ["7.750", "62.00", "kN"]);
    assert_eq!(
        row(&table, "Mean specific load (load / pad area)"),
        ["1.500", "MPa"]
    );
    assert_eq!(row(&table, "Peak pressure"), ["4.250", "MPa"]);
    assert_eq!(row(&table, "Power loss"), ["0.7400", "5.920", "kW"]);
    assert_eq!(row(&table, "Leading edge, in"), ["2.000", "16.00", "L/min"]);
    assert_eq!(
        row(&table, "Axial film stiffness"),
        ["370.0", "2960", "N/µm"]
    );
    assert_eq!(
        row(&table, "Pitch (+ opens the leading edge)"),
        ["0.4800", "mrad"]
    );
    assert_eq!(row(&table, "Cavitated area"), ["12.50", "%", "of", "pad"]);
    assert_eq!(row(&table, "Dynamic viscosity"), ["16.20", "mPa·s"]);
    assert_eq!(row(&table, "Area-mean film temperature"), ["62.00", "°C"]);
    assert_eq!(row(&table, "Oil supply temperature"), ["45.00", "°C"]);
    assert_eq!(row(&table, "Mixed inlet temperature"), ["52.50", "°C"]);
    assert_eq!(row(&table, "Hottest pad temperature"), ["90.00", "°C"]);
    assert_eq!(row(&table, "Pad at 75 % arc, 75 % width"), ["80.00", "°C"]);
    assert_eq!(row(&table, "Adiabatic rise P/(ρ c Q_in)"), ["12.50", "K"]);
    assert_eq!(row(&table, "Thermal crown"), ["1.500", "µm"]);
    assert_eq!(
        row(&table, "Fresh oil drawn from the supply"),
        ["12.00", "L/min"]
    );
    assert_eq!(
        row(&table, "Dissipated in the film"),
        ["0.7400", "5.920", "kW"]
    );
    assert_eq!(row(&table, "viscosity there"), ["18.90", "mPa·s"]);
    // The design header is in engineering units too.
    assert!(
        table.contains("radii 75.00 to 140.0 mm, arc 36.00°"),
        "{table}"
    );
    assert!(table.contains("1780 rpm"), "{table}");
    assert!(table.contains("total axial load 62.00 kN"), "{table}");
}

#[test]
fn the_table_ends_with_the_caution() {
    let (design, result) = solved(Template::Rig);
    let table = text::render(&Report::new("", &design, &result).unwrap());
    let tail: String = table.lines().rev().take(6).collect::<Vec<_>>().join(" ");
    assert!(tail.contains("CAUTION: preliminary sizing only"), "{tail}");
    assert!(tail.contains("licensed engineer"), "{tail}");
    // A rectangular pad slides: no torque row, and its pivot is placed along the length.
    assert!(!table.contains("Friction torque"));
    assert!(table.contains("58.0 % of the length"), "{table}");
}
