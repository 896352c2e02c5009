//! Tests of the `film_temperature` section: the bulk and field models in engineering units
//! become SI and come back, defaults are the solver's, and likely unit mistakes are named.

use approx::assert_relative_eq;
use padwright_solver::prelude::*;

use super::super::tests::{FULL, assert_same_design, design, error, round_trip};
use super::super::*;
use crate::units::c_to_k;

/// A Field model with a value in every field, each with a known SI value.
const FIELD: &str = r#"Field(
        supply_temperature_c: 45.0,
        carry_over_pct: 70.0,
        supplied_flow_l_min: 30.0,
        runner_coefficient_w_per_m2_k: 150.0,
        runner_temperature_c: 55.0,
        pad_conduction: (
            thickness_mm: 20.0,
            conductivity_w_per_m_k: 45.0,
            back_coefficient_w_per_m2_k: 500.0,
            bath_temperature_c: 50.0,
            expansion_um_per_m_k: 11.5,
        ),
        tolerance_k: 0.02,
    )"#;

/// `FULL` with its film-temperature model replaced by `model`.
fn with_model(model: &str) -> String {
    FULL.replace("Effective(temperature_c: 62.0)", model)
}

fn field_settings(text: &str) -> FieldSettings {
    match design(text).temperature {
        FilmTemperature::Field(f) => f,
        other => panic!("field model expected, got {other:?}"),
    }
}

#[test]
fn field_model_becomes_si() {
    let f = field_settings(&with_model(FIELD));
    // 45 °C = 318.15 K; 70 % = 0.7; 30 L/min = 0.5 L/s = 5e-4 m³/s.
    assert_relative_eq!(f.supply.temperature, 318.15, max_relative = 1e-15);
    assert_relative_eq!(f.supply.carry_over, 0.7, max_relative = 1e-15);
    assert_relative_eq!(f.supply.flow.unwrap(), 5e-4, max_relative = 1e-15);
    assert_eq!(f.heat.runner_coefficient, 150.0);
    assert_relative_eq!(
        f.heat.runner_temperature.unwrap(),
        328.15,
        max_relative = 1e-15
    );
    let p = f.heat.pad.unwrap();
    // 20 mm = 0.02 m; 50 °C = 323.15 K; 11.5 µm/(m·K) = 1.15e-5 1/K.
    assert_relative_eq!(p.thickness, 0.02, max_relative = 1e-15);
    assert_eq!(p.conductivity, 45.0);
    assert_eq!(p.back_coefficient, 500.0);
    assert_relative_eq!(p.bath_temperature, 323.15, max_relative = 1e-15);
    assert_relative_eq!(p.expansion, 1.15e-5, max_relative = 1e-15);
    assert_eq!(f.tolerance, 0.02);
}

#[test]
fn bulk_model_becomes_si() {
    let text = with_model(
        "Bulk(supply_temperature_c: 40.0, carry_over_pct: 55.0, share_of_rise_pct: 75.0, \
         supplied_flow_l_min: 12.0)",
    );
    let FilmTemperature::Bulk {
        supply,
        rise_fraction,
    } = design(&text).temperature
    else {
        panic!("bulk model expected")
    };
    assert_relative_eq!(supply.temperature, 313.15, max_relative = 1e-15);
    assert_relative_eq!(supply.carry_over, 0.55, max_relative = 1e-15);
    // 12 L/min = 0.2 L/s = 2e-4 m³/s.
    assert_relative_eq!(supply.flow.unwrap(), 2e-4, max_relative = 1e-15);
    assert_relative_eq!(rise_fraction, 0.75, max_relative = 1e-15);
}

#[test]
fn thermal_models_left_out_fields_take_the_solver_defaults() {
    use padwright_solver::thermal::{
        DEFAULT_CARRY_OVER, DEFAULT_RISE_FRACTION, DEFAULT_TEMPERATURE_TOLERANCE,
    };
    let f = field_settings(&with_model("Field(supply_temperature_c: 45.0)"));
    let mut expected = FieldSettings::adiabatic(OilSupply {
        temperature: c_to_k(45.0),
        carry_over: DEFAULT_CARRY_OVER,
        flow: None,
    });
    expected.tolerance = DEFAULT_TEMPERATURE_TOLERANCE;
    assert_eq!(f, expected);
    assert_eq!(f.heat, HeatPaths::default());
    let FilmTemperature::Bulk {
        supply,
        rise_fraction,
    } = design(&with_model("Bulk(supply_temperature_c: 45.0)")).temperature
    else {
        panic!("bulk model expected")
    };
    assert_eq!(supply.carry_over, DEFAULT_CARRY_OVER);
    assert_eq!(supply.flow, None);
    assert_eq!(rise_fraction, DEFAULT_RISE_FRACTION);
}

#[test]
fn optional_values_may_be_written_plainly_or_with_some() {
    let plain = field_settings(&with_model(FIELD));
    let wrapped = field_settings(
        &with_model(FIELD)
            .replace(
                "supplied_flow_l_min: 30.0",
                "supplied_flow_l_min: Some(30.0)",
            )
            .replace(
                "runner_temperature_c: 55.0",
                "runner_temperature_c: Some(55.0)",
            ),
    );
    assert_eq!(plain, wrapped);
    let none = field_settings(
        &with_model(FIELD).replace("supplied_flow_l_min: 30.0", "supplied_flow_l_min: None"),
    );
    assert_eq!(none.supply.flow, None);
}

#[test]
fn si_thermal_models_become_engineering_units() {
    let mut d = design(FULL);
    let supply = OilSupply {
        temperature: 318.15,
        carry_over: 0.65,
        flow: Some(2.5e-4),
    };
    let mut f = FieldSettings::adiabatic(supply);
    f.heat.pad = Some(PadConduction {
        thickness: 0.025,
        conductivity: 45.0,
        back_coefficient: 500.0,
        bath_temperature: 323.15,
        expansion: 11.5e-6,
    });
    d.temperature = FilmTemperature::Field(f);
    let file = DesignFile::from_design(&d, "t").unwrap();
    assert_eq!(
        file.film_temperature,
        FilmTemperatureSpec::Field {
            supply_temperature_c: 45.0,
            carry_over_pct: 65.0,
            // 2.5e-4 m³/s = 0.25 L/s = 15 L/min.
            supplied_flow_l_min: Some(15.0),
            runner_coefficient_w_per_m2_k: 0.0,
            runner_temperature_c: None,
            pad_conduction: Some(PadConductionSpec {
                thickness_mm: 25.0,
                conductivity_w_per_m_k: 45.0,
                back_coefficient_w_per_m2_k: 500.0,
                bath_temperature_c: 50.0,
                expansion_um_per_m_k: 11.5,
            }),
            tolerance_k: 0.05,
        }
    );
    d.temperature = FilmTemperature::Bulk {
        supply: OilSupply {
            flow: None,
            ..supply
        },
        rise_fraction: 0.7,
    };
    assert_eq!(
        DesignFile::from_design(&d, "t").unwrap().film_temperature,
        FilmTemperatureSpec::Bulk {
            supply_temperature_c: 45.0,
            carry_over_pct: 65.0,
            share_of_rise_pct: 70.0,
            supplied_flow_l_min: None,
        }
    );
}

#[test]
fn thermal_designs_survive_a_round_trip() {
    let exact = [
        with_model(FIELD),
        with_model("Field(supply_temperature_c: 45.0)"),
        with_model("Bulk(supply_temperature_c: 38.5, share_of_rise_pct: 90.0)"),
    ];
    for text in &exact {
        assert_eq!(round_trip(&design(text)), design(text), "{text}");
    }
    // Awkward SI values come back within the 15 significant digits a file keeps.
    let mut d = design(FULL);
    let supply = OilSupply {
        temperature: 317.123_456_7,
        carry_over: 0.573_333_3,
        flow: Some(3.141_592_6e-4),
    };
    let mut f = FieldSettings::adiabatic(supply);
    f.heat = HeatPaths {
        runner_coefficient: 123.456,
        runner_temperature: Some(330.987_6),
        pad: Some(PadConduction {
            thickness: 0.021_7,
            conductivity: 38.25,
            back_coefficient: 612.5,
            bath_temperature: 322.456_789,
            expansion: 1.234_567e-5,
        }),
    };
    f.tolerance = 0.012_345;
    d.temperature = FilmTemperature::Field(f);
    assert_same_design(&round_trip(&d), &d);
    d.temperature = FilmTemperature::Bulk {
        supply,
        rise_fraction: 0.777_777_7,
    };
    assert_same_design(&round_trip(&d), &d);
}

#[test]
fn written_thermal_files_are_plain() {
    let text = DesignFile::from_design(&design(&with_model(FIELD)), "x")
        .unwrap()
        .to_ron()
        .unwrap();
    assert!(text.contains("pad_conduction: ("), "{text}");
    assert!(text.contains("supplied_flow_l_min: 30.0"), "{text}");
    assert!(!text.contains("Some(") && !text.contains("None"), "{text}");
    // Options left unset are left out.
    let text = DesignFile::from_design(&design(&with_model("Field(supply_temperature_c: 45)")), "")
        .unwrap()
        .to_ron()
        .unwrap();
    for absent in [
        "pad_conduction",
        "runner_temperature_c",
        "supplied_flow_l_min",
    ] {
        assert!(!text.contains(absent), "{absent} in\n{text}");
    }
}

#[test]
fn a_changed_iteration_limit_cannot_be_written() {
    let mut f = field_settings(&with_model(FIELD));
    f.max_iterations += 1;
    let mut d = design(FULL);
    d.temperature = FilmTemperature::Field(f);
    let e = DesignFile::from_design(&d, "").unwrap_err();
    assert!(matches!(e, DesignError::NotRepresentable(_)), "{e}");
}

#[test]
fn thermal_unit_mistakes_are_named_with_their_field() {
    let field = with_model(FIELD);
    for (from, to, name, hint) in [
        (
            "supply_temperature_c: 45.0",
            "supply_temperature_c: 318.15",
            "film_temperature.supply_temperature_c",
            "kelvin",
        ),
        (
            "carry_over_pct: 70.0",
            "carry_over_pct: 0.7",
            "film_temperature.carry_over_pct",
            "fraction",
        ),
        (
            "carry_over_pct: 70.0",
            "carry_over_pct: 170.0",
            "film_temperature.carry_over_pct",
            "percent",
        ),
        (
            "supplied_flow_l_min: 30.0",
            "supplied_flow_l_min: 0.0005",
            "film_temperature.supplied_flow_l_min",
            "m³/s",
        ),
        (
            "runner_coefficient_w_per_m2_k: 150.0",
            "runner_coefficient_w_per_m2_k: -1.0",
            "film_temperature.runner_coefficient_w_per_m2_k",
            "W/(m²·K)",
        ),
        (
            "runner_temperature_c: 55.0",
            "runner_temperature_c: 328.15",
            "film_temperature.runner_temperature_c",
            "kelvin",
        ),
        (
            "thickness_mm: 20.0",
            "thickness_mm: 0.02",
            "film_temperature.pad_conduction.thickness_mm",
            "metres",
        ),
        (
            "conductivity_w_per_m_k: 45.0",
            "conductivity_w_per_m_k: 0.0",
            "film_temperature.pad_conduction.conductivity_w_per_m_k",
            "W/(m·K)",
        ),
        (
            "back_coefficient_w_per_m2_k: 500.0",
            "back_coefficient_w_per_m2_k: NaN",
            "film_temperature.pad_conduction.back_coefficient_w_per_m2_k",
            "W/(m²·K)",
        ),
        (
            "bath_temperature_c: 50.0",
            "bath_temperature_c: 323.15",
            "film_temperature.pad_conduction.bath_temperature_c",
            "kelvin",
        ),
        (
            "expansion_um_per_m_k: 11.5",
            "expansion_um_per_m_k: 0.0000115",
            "film_temperature.pad_conduction.expansion_um_per_m_k",
            "1/K",
        ),
        (
            "tolerance_k: 0.02",
            "tolerance_k: 0.0",
            "film_temperature.tolerance_k",
            "K",
        ),
    ] {
        assert!(field.contains(from), "{from}");
        match error(&field.replace(from, to)) {
            DesignError::BadValue {
                field: f, reason, ..
            } => {
                assert_eq!(f, name, "{to}");
                assert!(reason.contains(hint), "{to}: {reason}");
            }
            e => panic!("{to}: wrong error {e}"),
        }
    }
    let bulk = with_model("Bulk(supply_temperature_c: 45.0, share_of_rise_pct: 0.8)");
    assert!(matches!(
        error(&bulk),
        DesignError::BadValue { ref field, .. } if field == "film_temperature.share_of_rise_pct"
    ));
    // Zero is a share, not a slip: no carry-over, or the inlet temperature as the film's.
    design(&with_model(
        "Bulk(supply_temperature_c: 45.0, carry_over_pct: 0.0, share_of_rise_pct: 0.0)",
    ));
    // An expansion of zero leaves out the thermal crown.
    let f = field_settings(&field.replace("expansion_um_per_m_k: 11.5", "expansion_um_per_m_k: 0"));
    assert_eq!(f.heat.pad.unwrap().expansion, 0.0);
}

#[test]
fn thermal_fields_are_checked_for_spelling() {
    let field = with_model(FIELD);
    for (from, to, name) in [
        ("thickness_mm", "thickness_m", "thickness_m"),
        ("tolerance_k", "tolerance_c", "tolerance_c"),
        ("carry_over_pct", "carryover_pct", "carryover_pct"),
        (
            "supply_temperature_c",
            "supply_temperature_k",
            "supply_temperature_k",
        ),
    ] {
        let e = error(&field.replace(from, to));
        assert!(matches!(e, DesignError::Syntax(_)), "{name}: {e}");
        assert!(e.to_string().contains(name), "{e}");
    }
    // The bulk model has no heat paths.
    let e = error(&with_model(
        "Bulk(supply_temperature_c: 45.0, runner_coefficient_w_per_m2_k: 10.0)",
    ));
    assert!(
        e.to_string().contains("runner_coefficient_w_per_m2_k"),
        "{e}"
    );
}
