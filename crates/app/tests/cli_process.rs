//! Runs the real `padwright` binary on the demo designs, as a user would, and checks what it
//! prints: the table with units and the caution, and the JSON with SI values that agree with
//! the library.

use std::path::PathBuf;
use std::process::{Command, Output};

use padwright::design_file::DesignFile;
use padwright_solver::prelude::analyze;
use serde_json::Value;

fn asset(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("../../assets")
        .join(name)
}

fn padwright(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_padwright"))
        .args(args)
        .output()
        .expect("the padwright binary runs")
}

fn stdout(o: &Output) -> String {
    String::from_utf8(o.stdout.clone()).expect("UTF-8 output")
}

fn stderr(o: &Output) -> String {
    String::from_utf8(o.stderr.clone()).expect("UTF-8 output")
}

const TILTING: &str = "orrindale_p2_tilting_pad.ron";
const TAPERED: &str = "orrindale_booster_tapered_land.ron";

#[test]
fn text_table_has_units_and_the_caution() {
    for name in [TILTING, TAPERED] {
        let path = asset(name);
        let out = padwright(&["solve", path.to_str().unwrap()]);
        assert!(out.status.success(), "{name}: {}", stderr(&out));
        assert!(stderr(&out).is_empty(), "{}", stderr(&out));
        let text = stdout(&out);
        for unit in ["µm", "MPa", "kN", "kW", "L/min", "N/µm", "°C", "mPa·s"] {
            assert!(text.contains(unit), "{name}: no {unit} in\n{text}");
        }
        assert!(text.contains("CAUTION: preliminary sizing only"), "{text}");
        let words: Vec<&str> = text.split_whitespace().collect();
        for bad in ["NaN", "inf", "-inf"] {
            assert!(!words.contains(&bad), "{name}: {bad} in\n{text}");
        }
    }
}

/// Every number in a JSON value, with its path; nulls are listed as None.
fn numbers(v: &Value, path: String, out: &mut Vec<(String, Option<f64>)>) {
    match v {
        Value::Null => out.push((path, None)),
        Value::Number(n) => out.push((path, n.as_f64())),
        Value::Array(a) => a
            .iter()
            .enumerate()
            .for_each(|(i, x)| numbers(x, format!("{path}[{i}]"), out)),
        Value::Object(m) => m
            .iter()
            .for_each(|(k, x)| numbers(x, format!("{path}.{k}"), out)),
        _ => {}
    }
}

fn solve_json(name: &str) -> Value {
    let path = asset(name);
    let out = padwright(&["solve", path.to_str().unwrap(), "--json"]);
    assert!(out.status.success(), "{name}: {}", stderr(&out));
    serde_json::from_str(&stdout(&out)).expect("one JSON object")
}

fn f(v: &Value, path: &str) -> f64 {
    path.split('.')
        .fold(v, |v, k| &v[k])
        .as_f64()
        .unwrap_or_else(|| panic!("{path} is a number"))
}

#[test]
fn json_is_finite_consistent_and_matches_the_library() {
    for name in [TILTING, TAPERED] {
        let v = solve_json(name);
        assert_eq!(v["format"], "padwright-results");
        assert_eq!(v["schema_version"], 1);
        let mut all = Vec::new();
        numbers(&v, String::new(), &mut all);
        assert!(all.len() > 1000, "the fields are included");
        for (path, x) in &all {
            match x {
                Some(x) => assert!(x.is_finite(), "{name}: {path} = {x}"),
                // Only the pivot attitude of a fixed pad may be null.
                None => assert!(
                    name == TAPERED
                        && [
                            ".pad.pivot_film_thickness_m",
                            ".pad.pitch_rad",
                            ".pad.roll_rad"
                        ]
                        .contains(&path.as_str()),
                    "{name}: {path} is null"
                ),
            }
        }
        let pads = v["bearing"]["pad_count"].as_u64().unwrap() as f64;
        let (total, pad) = (f(&v, "bearing.total_load_n"), f(&v, "pad.load_n"));
        assert!(
            (total - pad * pads).abs() <= 1e-9 * total,
            "{total} vs {pad} × {pads}"
        );
        let h_min = f(&v, "pad.min_film_thickness_m");
        assert!(h_min > 0.0 && h_min < f(&v, "pad.max_film_thickness_m"));

        // The same design through the library gives the same numbers.
        let text = std::fs::read_to_string(asset(name)).unwrap();
        let design = DesignFile::parse(&text).unwrap().to_design().unwrap();
        let direct = analyze(&design).unwrap();
        let rel = |a: f64, b: f64| (a - b).abs() / b.abs();
        assert!(rel(h_min, direct.pad.min_film) <= 1e-12, "{name}: min film");
        assert!(rel(f(&v, "bearing.power_loss_w"), direct.power_loss) <= 1e-12);
        assert!(rel(f(&v, "pad.peak_pressure_pa"), direct.pad.peak_pressure) <= 1e-12);
        assert!(
            rel(
                f(&v, "viscosity.dynamic_viscosity_pa_s"),
                direct.viscosity.dynamic_viscosity
            ) <= 1e-12
        );
        // The field arrays have the documented sizes.
        let fields = &v["fields"];
        let n_along = fields["nodes_along"].as_u64().unwrap() as usize;
        let n_across = fields["nodes_across"].as_u64().unwrap() as usize;
        assert_eq!(
            fields["pressure_pa"].as_array().unwrap().len(),
            n_along * n_across
        );
        assert_eq!(
            fields["film_m"].as_array().unwrap().len(),
            n_along * n_across
        );
        assert_eq!(fields["xi"].as_array().unwrap().len(), n_along);
    }
}

#[test]
fn demo_results_are_in_a_plausible_range() {
    // Engineering sense, wide bands: films of tens of µm, specific loads of 1–3 MPa, power
    // losses of a few kW for these machines.
    for name in [TILTING, TAPERED] {
        let v = solve_json(name);
        let h = f(&v, "pad.min_film_thickness_m") * 1e6;
        let p = f(&v, "pad.mean_pressure_pa") / 1e6;
        let power = f(&v, "bearing.power_loss_w") / 1e3;
        assert!((10.0..80.0).contains(&h), "{name}: min film {h} µm");
        assert!((1.0..3.0).contains(&p), "{name}: mean pressure {p} MPa");
        assert!(
            (0.5..20.0).contains(&power),
            "{name}: power loss {power} kW"
        );
        assert!(f(&v, "pad.peak_pressure_pa") > f(&v, "pad.mean_pressure_pa"));
    }
}

#[test]
fn example_prints_the_demo_file() {
    for (kind, name) in [("tilting", TILTING), ("tapered", TAPERED)] {
        let out = padwright(&["example", kind]);
        assert!(out.status.success(), "{}", stderr(&out));
        assert_eq!(stdout(&out), std::fs::read_to_string(asset(name)).unwrap());
    }
}

#[test]
fn a_bad_file_fails_with_a_message_and_no_results() {
    let dir = std::env::temp_dir().join(format!("padwright-cli-process-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("typo.ron");
    let text = std::fs::read_to_string(asset(TILTING))
        .unwrap()
        .replace("outer_radius_mm", "outer_radius_m");
    std::fs::write(&path, text).unwrap();
    let out = padwright(&["solve", path.to_str().unwrap(), "--json"]);
    assert_eq!(out.status.code(), Some(1));
    assert!(stdout(&out).is_empty());
    let message = stderr(&out);
    assert!(message.starts_with("error: "), "{message}");
    assert!(message.contains("outer_radius_m`"), "{message}");
    let _ = std::fs::remove_dir_all(&dir);

    let out = padwright(&["solve"]);
    assert_eq!(
        out.status.code(),
        Some(2),
        "a missing argument is a usage error"
    );
    let out = padwright(&["--help"]);
    assert_eq!(out.status.code(), Some(0));
    assert!(stdout(&out).contains("solve"));
}
