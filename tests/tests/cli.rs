//! End-to-end checks of the command line through `padwright::cli::run`, in process: each
//! example is written to a file, solved as text and as JSON, and the two outputs are compared
//! (temperatures too, for the thermal models); invalid files and impossible duties give a
//! readable error and a non-zero exit code.

use std::path::{Path, PathBuf};

use padwright::cli::{EXIT_ANALYSIS, EXIT_INPUT, EXIT_OK, EXIT_USAGE, run};
use padwright::design_file::DesignFile;
use padwright::templates::Template;
use padwright_solver::prelude::analyze;
use serde_json::Value;

/// A fresh scratch directory for one test.
fn scratch(test: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!(
        "padwright-validation-cli-{}-{test}",
        std::process::id()
    ));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Runs the command line; returns (exit code, stdout, stderr).
fn padwright(args: &[&str]) -> (u8, String, String) {
    let (mut out, mut err) = (Vec::new(), Vec::new());
    let argv = std::iter::once("padwright").chain(args.iter().copied());
    let code = run(argv, &mut out, &mut err);
    (
        code,
        String::from_utf8(out).unwrap(),
        String::from_utf8(err).unwrap(),
    )
}

fn path_str(p: &Path) -> &str {
    p.to_str().unwrap()
}

/// The number in the text table row that starts with `label` (first value column).
fn table_value(table: &str, label: &str) -> f64 {
    let line = table
        .lines()
        .find(|l| l.trim_start().starts_with(label))
        .unwrap_or_else(|| panic!("no row {label} in\n{table}"));
    line[line.find(label).unwrap() + label.len()..]
        .split_whitespace()
        .next()
        .unwrap()
        .parse()
        .unwrap()
}

/// The examples by their command-line names.
const EXAMPLES: [(&str, Template); 4] = [
    ("tilting", Template::Tilting),
    ("centre", Template::Centre),
    ("tapered", Template::Tapered),
    ("rig", Template::Rig),
];

/// A JSON number by its dotted path.
fn json_f64(v: &Value, path: &str) -> f64 {
    path.split('.')
        .fold(v, |v, k| &v[k])
        .as_f64()
        .unwrap_or_else(|| panic!("{path} is a number"))
}

#[test]
fn each_example_round_trips_through_a_file_and_solves() {
    let dir = scratch("round-trip");
    for (kind, template) in EXAMPLES {
        let file = dir.join(format!("{kind}.ron"));
        let (code, out, err) = padwright(&["example", kind, "-o", path_str(&file)]);
        assert_eq!(code, EXIT_OK, "{err}");
        assert!(
            out.is_empty(),
            "the file, not the terminal, gets the example"
        );
        assert!(
            err.contains("padwright solve"),
            "tells how to run it: {err}"
        );
        assert_eq!(std::fs::read_to_string(&file).unwrap(), template.text());

        let (code, table, err) = padwright(&["solve", path_str(&file)]);
        assert_eq!(code, EXIT_OK, "{kind}: {err}");
        assert!(err.is_empty(), "{err}");
        assert!(
            table.contains("CAUTION: preliminary sizing only"),
            "{table}"
        );
        assert!(table.contains("licensed engineer"), "{table}");
        for unit in ["µm", "MPa", "kN", "kW", "L/min", "N/µm", "°C"] {
            assert!(table.contains(unit), "{kind}: no {unit}");
        }

        let (code, json, err) = padwright(&["solve", path_str(&file), "--json"]);
        assert_eq!(code, EXIT_OK, "{kind}: {err}");
        let v: Value = serde_json::from_str(&json).expect("one JSON object");
        assert_eq!(v["format"], "padwright-results");

        // Text and JSON tell the same story: µm vs m, MPa vs Pa, kW vs W, °C vs K, L/min vs
        // m³/s (4 significant digits in the table, so agreement to 0.05 %).
        let close = |table_v: f64, json_v: f64, what: &str| {
            assert!(
                (table_v - json_v).abs() <= 5e-4 * json_v.abs(),
                "{kind}: {what}: table {table_v} vs JSON {json_v}"
            );
        };
        let j = |path: &str| json_f64(&v, path);
        close(
            table_value(&table, "Minimum film thickness"),
            j("pad.min_film_thickness_m") * 1e6,
            "minimum film (µm)",
        );
        close(
            table_value(&table, "Peak pressure"),
            j("pad.peak_pressure_pa") / 1e6,
            "peak pressure (MPa)",
        );
        close(
            table_value(&table, "Power loss"),
            j("pad.power_loss_w") / 1e3,
            "power loss per pad (kW)",
        );
        close(
            table_value(&table, "Leading edge, in"),
            j("pad.flows.leading_edge_in_m3_s") * 60_000.0,
            "inflow (L/min)",
        );
        close(
            table_value(&table, "Dynamic viscosity"),
            j("viscosity.dynamic_viscosity_pa_s") * 1e3,
            "viscosity (mPa·s)",
        );
        // The thermal section is there exactly when the design has a thermal model.
        let thermal = !v["thermal"].is_null();
        assert_eq!(thermal, template != Template::Rig, "{kind}");
        assert_eq!(table.contains("\nTemperatures\n"), thermal, "{kind}");
        assert_eq!(table.contains("\nHeat balance\n"), thermal, "{kind}");
        if !thermal {
            close(
                table_value(&table, "Effective film temperature (set)"),
                j("viscosity.temperature_k") - 273.15,
                "film temperature (°C)",
            );
            continue;
        }
        for (label, key) in [
            ("Oil supply temperature", "supply_temperature_k"),
            ("Mixed inlet temperature", "inlet_temperature_k"),
            ("Trailing-edge outlet temperature", "outlet_temperature_k"),
            ("Hottest pad temperature", "max_pad_temperature_k"),
            ("Pad at 75 % arc, 75 % width", "sensor_temperature_k"),
        ] {
            close(
                table_value(&table, label),
                j(&format!("thermal.{key}")) - 273.15,
                label,
            );
        }
        close(
            table_value(&table, "Adiabatic rise P/(ρ c Q_in)"),
            j("thermal.adiabatic_rise_k"),
            "adiabatic rise (K)",
        );
        // The fresh-oil row has only a bearing value.
        close(
            table_value(&table, "Fresh oil drawn from the supply"),
            j("thermal.fresh_oil_flow_m3_s") * 60_000.0,
            "fresh oil (L/min)",
        );
        close(
            table_value(&table, "Dissipated in the film"),
            j("thermal.energy.dissipated_w") / 1e3,
            "dissipated per pad (kW)",
        );
        if table.contains("Thermal crown") {
            close(
                table_value(&table, "Thermal crown"),
                j("thermal.thermal_crown_m") * 1e6,
                "thermal crown (µm)",
            );
        }
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// The JSON hottest pad temperature is the library's, to the last bits a JSON reader may lose.
#[test]
fn json_hottest_pad_temperature_is_the_librarys() {
    let dir = scratch("library");
    for (kind, template) in EXAMPLES {
        let design = DesignFile::parse(template.text())
            .unwrap()
            .to_design()
            .unwrap();
        let direct = analyze(&design).unwrap();
        let file = dir.join(format!("{kind}.ron"));
        std::fs::write(&file, template.text()).unwrap();
        let (code, json, err) = padwright(&["solve", path_str(&file), "--json"]);
        assert_eq!(code, EXIT_OK, "{kind}: {err}");
        let v: Value = serde_json::from_str(&json).unwrap();
        match &direct.thermal {
            None => assert!(v["thermal"].is_null(), "{kind}"),
            Some(th) => {
                let lib = th.max_pad_temperature;
                let out = json_f64(&v, "thermal.max_pad_temperature_k");
                assert!(
                    (out - lib).abs() <= 1e-12 * lib,
                    "{kind}: JSON {out} K vs library {lib} K"
                );
            }
        }
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// A rigid, isoviscous pad pivoted at its centre carries no load (Raimondi & Boyd, Trans.
/// ASME 1955, from memory); the centre-pivot demo carries its load only with the thermal
/// model, whose viscosity wedge and thermal crown the isoviscous model lacks.
#[test]
fn the_centre_pivot_demo_needs_the_thermal_model() {
    let dir = scratch("centre");
    let text = Template::Centre.text();
    let start = text.find("\n    film_temperature: Field(").unwrap() + 1;
    let end = start + text[start..].find("\n    ),").unwrap() + "\n    ),".len();
    let effective = format!(
        "{}    film_temperature: Effective(temperature_c: 65.0),{}",
        &text[..start],
        &text[end..]
    );
    let file = dir.join("centre_effective.ron");
    std::fs::write(&file, effective).unwrap();
    let (code, out, err) = padwright(&["solve", path_str(&file)]);
    assert_eq!(code, EXIT_ANALYSIS, "{err}");
    assert!(out.is_empty());
    assert!(err.contains("no converging equilibrium"), "{err}");

    let file = dir.join("centre.ron");
    std::fs::write(&file, text).unwrap();
    let (code, json, err) = padwright(&["solve", path_str(&file), "--json"]);
    assert_eq!(code, EXIT_OK, "{err}");
    let v: Value = serde_json::from_str(&json).unwrap();
    assert!(json_f64(&v, "thermal.thermal_crown_m") > 0.0);
    assert!(json_f64(&v, "pad.min_film_thickness_m") > 10e-6);
    // Centre pivot: the centre of pressure sits on it, at mid-arc.
    assert!((json_f64(&v, "pad.centre_of_pressure.xi") - 0.5).abs() < 1e-3);
    let _ = std::fs::remove_dir_all(&dir);
}

/// Less oil supplied than the pads draw is reported as a starvation risk, in the table's
/// notes and in the JSON.
#[test]
fn a_short_oil_supply_is_reported() {
    let dir = scratch("starved");
    let text = Template::Tilting
        .text()
        .replace("supplied_flow_l_min: 40.0", "supplied_flow_l_min: 5.0");
    assert_ne!(text, Template::Tilting.text());
    let file = dir.join("starved.ron");
    std::fs::write(&file, text).unwrap();
    let (code, table, err) = padwright(&["solve", path_str(&file)]);
    assert_eq!(code, EXIT_OK, "{err}");
    let notes = &table[table.find("\nNotes\n").expect("a notes section")..];
    assert!(notes.contains("starvation"), "{notes}");
    assert_eq!(table_value(&table, "Oil supplied"), 5.0);
    let (_, json, _) = padwright(&["solve", path_str(&file), "--json"]);
    let v: Value = serde_json::from_str(&json).unwrap();
    let supplied = json_f64(&v, "thermal.supplied_flow_m3_s");
    assert!((supplied - 5.0 / 60_000.0).abs() < 1e-15);
    assert!(json_f64(&v, "thermal.fresh_oil_flow_m3_s") > supplied);
    assert!(
        v["notes"]
            .as_array()
            .unwrap()
            .iter()
            .any(|n| n.as_str().unwrap().contains("starvation"))
    );
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn example_goes_to_stdout_and_does_not_overwrite_by_accident() {
    let (code, out, _) = padwright(&["example", "tapered"]);
    assert_eq!(code, EXIT_OK);
    assert_eq!(out, Template::Tapered.text());

    let dir = scratch("overwrite");
    let file = dir.join("mine.ron");
    std::fs::write(&file, "my own design").unwrap();
    let (code, _, err) = padwright(&["example", "tilting", "-o", path_str(&file)]);
    assert_eq!(code, EXIT_INPUT);
    assert!(
        err.contains("already exists") && err.contains("--force"),
        "{err}"
    );
    assert_eq!(std::fs::read_to_string(&file).unwrap(), "my own design");
    let (code, _, _) = padwright(&["example", "tilting", "-o", path_str(&file), "--force"]);
    assert_eq!(code, EXIT_OK);
    assert_eq!(
        std::fs::read_to_string(&file).unwrap(),
        Template::Tilting.text()
    );
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn invalid_files_give_a_readable_error_and_a_nonzero_code() {
    let dir = scratch("invalid");
    let tilting = Template::Tilting.text();
    let cases = [
        (
            "version.ron",
            tilting.replace("format_version: 1", "format_version: 7"),
            "format_version 7 is not supported",
        ),
        (
            "typo.ron",
            tilting.replace("arc_deg", "arc_degree"),
            "arc_degree",
        ),
        (
            "metres.ron",
            tilting.replace("outer_radius_mm: 140.0", "outer_radius_mm: 0.14"),
            "outline.outer_radius_mm",
        ),
        ("not_ron.ron", "pad_count = 8\n".to_string(), "line 1"),
    ];
    for (name, text, expected) in cases {
        let file = dir.join(name);
        std::fs::write(&file, text).unwrap();
        for json in [false, true] {
            let mut args = vec!["solve", path_str(&file)];
            if json {
                args.push("--json");
            }
            let (code, out, err) = padwright(&args);
            assert_eq!(code, EXIT_INPUT, "{name}: {err}");
            assert!(out.is_empty(), "{name}: no results on failure");
            assert!(err.starts_with("error: "), "{err}");
            assert!(err.contains(name), "{name}: the file is named: {err}");
            assert!(err.contains(expected), "{name}: {err}");
        }
    }
    let (code, _, err) = padwright(&["solve", path_str(&dir.join("missing.ron"))]);
    assert_eq!(code, EXIT_INPUT);
    assert!(err.contains("cannot read"), "{err}");
    let (code, _, _) = padwright(&["example", "spiral"]);
    assert_eq!(code, EXIT_USAGE);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn an_impossible_duty_shows_the_solver_message() {
    // The tapered example runs at about 30 µm; asking for at least 40 µm cannot be met.
    let dir = scratch("overload");
    let text = Template::Tapered.text().replace(
        "    // The numerics section is left out",
        "    numerics: (smallest_film_um: 40.0),\n    // The numerics section was left out",
    );
    let file = dir.join("overload.ron");
    std::fs::write(&file, text).unwrap();
    let (code, out, err) = padwright(&["solve", path_str(&file)]);
    assert_eq!(code, EXIT_ANALYSIS, "{err}");
    assert!(out.is_empty());
    assert!(err.contains("the analysis failed"), "{err}");
    assert!(err.contains("exceeds what this pad can carry"), "{err}");
    assert!(err.contains("40.00 µm"), "{err}");
    let _ = std::fs::remove_dir_all(&dir);
}
