//! End-to-end checks of the command line through `padwright::cli::run`, in process: each
//! example is written to a file, solved as text and as JSON, and the two outputs are compared;
//! invalid files and impossible duties give a readable error and a non-zero exit code.

use std::path::{Path, PathBuf};

use padwright::cli::{EXIT_ANALYSIS, EXIT_INPUT, EXIT_OK, EXIT_USAGE, run};
use padwright::templates::Template;
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

#[test]
fn each_example_round_trips_through_a_file_and_solves() {
    let dir = scratch("round-trip");
    for (kind, template) in [
        ("tilting", Template::Tilting),
        ("tapered", Template::Tapered),
    ] {
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

        // Text and JSON tell the same story: µm vs m, MPa vs Pa, kW vs W (4 significant
        // digits in the table, so agreement to 0.05 %).
        let close = |table_v: f64, json_v: f64, what: &str| {
            assert!(
                (table_v - json_v).abs() <= 5e-4 * json_v.abs(),
                "{kind}: {what}: table {table_v} vs JSON {json_v}"
            );
        };
        let pad = &v["pad"];
        close(
            table_value(&table, "Minimum film thickness"),
            pad["min_film_thickness_m"].as_f64().unwrap() * 1e6,
            "minimum film (µm)",
        );
        close(
            table_value(&table, "Peak pressure"),
            pad["peak_pressure_pa"].as_f64().unwrap() / 1e6,
            "peak pressure (MPa)",
        );
        close(
            table_value(&table, "Power loss"),
            pad["power_loss_w"].as_f64().unwrap() / 1e3,
            "power loss per pad (kW)",
        );
        close(
            table_value(&table, "Leading edge, in"),
            pad["flows"]["leading_edge_in_m3_s"].as_f64().unwrap() * 60_000.0,
            "inflow (L/min)",
        );
        close(
            table_value(&table, "Effective film temperature (set)"),
            v["viscosity"]["temperature_k"].as_f64().unwrap() - 273.15,
            "film temperature (°C)",
        );
    }
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
    // The tapered example runs at about 32 µm; asking for at least 40 µm cannot be met.
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
