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
const CENTRE: &str = "orrindale_t3_centre_pivot.ron";
const TAPERED: &str = "orrindale_booster_tapered_land.ron";
const RIG: &str = "orrindale_rig_line_pivot.ron";
/// Every demo design.
const ALL: [&str; 4] = [TILTING, CENTRE, TAPERED, RIG];

#[test]
fn text_table_has_units_and_the_caution() {
    for name in ALL {
        let path = asset(name);
        let out = padwright(&["solve", path.to_str().unwrap()]);
        assert!(out.status.success(), "{name}: {}", stderr(&out));
        assert!(stderr(&out).is_empty(), "{}", stderr(&out));
        let text = stdout(&out);
        for unit in ["µm", "MPa", "kN", "kW", "L/min", "N/µm", "°C", "mPa·s"] {
            assert!(text.contains(unit), "{name}: no {unit} in\n{text}");
        }
        assert!(text.contains("CAUTION: preliminary sizing only"), "{text}");
        // A thermal design shows its temperatures and heat; the rig sets its temperature.
        let thermal = name != RIG;
        for section in ["\nTemperatures\n", "\nHeat balance\n"] {
            assert_eq!(text.contains(section), thermal, "{name}: {section:?}");
        }
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

/// Whether the equilibrium of `v` starts from a coarser grid: a thermal model, a given load
/// and a grid that halves to at least 33 nodes per direction (as the solver documents).
fn expects_coarse_start(v: &Value) -> bool {
    let halves = |key: &str| {
        let n = v["solver"][key].as_u64().unwrap();
        (n - 1).is_multiple_of(2) && (n - 1) / 2 + 1 >= 33
    };
    v["design"]["temperature_model"] != "effective"
        && v["design"]["duty"]["kind"] == "total_load"
        && halves("nodes_along")
        && halves("nodes_across")
}

/// Whether `path` may be null in the results of `v`: only where a quantity does not apply.
fn may_be_null(v: &Value, path: &str) -> bool {
    let fixed = matches!(
        v["design"]["support"]["kind"].as_str(),
        Some("tapered_land" | "flat")
    );
    let model = v["design"]["temperature_model"].as_str().unwrap();
    let settings = &v["design"]["thermal_settings"];
    let not_given = |key: &str| settings[key].is_null();
    let oil = v["design"]["oil"]["kind"].as_str().unwrap();
    match path {
        ".design.oil.iso_vg" => oil != "iso_grade",
        ".design.oil.viscosity_index" | ".design.oil.nu40_m2_s" | ".design.oil.nu100_m2_s" => {
            oil == "constant"
        }
        ".pad.pivot_film_thickness_m" | ".pad.pitch_rad" | ".pad.roll_rad" => fixed,
        ".thermal" | ".fields.temperature_k" | ".design.thermal_settings" => model == "effective",
        ".viscosity.lowest_dynamic_viscosity_pa_s"
        | ".viscosity.highest_dynamic_viscosity_pa_s" => model != "field",
        ".design.effective_temperature_k" => model != "effective",
        ".design.thermal_settings.share_of_rise" => model == "field",
        ".design.thermal_settings.runner_coefficient_w_per_m2_k" => model == "bulk",
        ".design.thermal_settings.runner_temperature_k"
        | ".design.thermal_settings.pad_conduction" => true,
        ".design.thermal_settings.supplied_flow_m3_s" | ".thermal.supplied_flow_m3_s" => {
            not_given("supplied_flow_m3_s")
        }
        ".solver.coarse_start" => !expects_coarse_start(v),
        _ => false,
    }
}

#[test]
fn json_is_finite_consistent_and_matches_the_library() {
    for name in ALL {
        let v = solve_json(name);
        assert_eq!(v["format"], "padwright-results");
        assert_eq!(v["schema_version"], 1);
        let mut all = Vec::new();
        numbers(&v, String::new(), &mut all);
        assert!(all.len() > 1000, "the fields are included");
        for (path, x) in &all {
            match x {
                Some(x) => assert!(x.is_finite(), "{name}: {path} = {x}"),
                None => assert!(may_be_null(&v, path), "{name}: {path} is null"),
            }
        }
        // The coarse start is reported exactly where it applies, with its work counted.
        let start = &v["solver"]["coarse_start"];
        assert_eq!(!start.is_null(), expects_coarse_start(&v), "{name}");
        if !start.is_null() {
            let along = v["solver"]["nodes_along"].as_u64().unwrap();
            assert_eq!(
                start["nodes_along"].as_u64(),
                Some((along - 1) / 2 + 1),
                "{name}"
            );
            assert!(start["pressure_solves"].as_u64().unwrap() > 0, "{name}");
            assert!(
                start["temperature_renewals"].as_u64().unwrap() > 0,
                "{name}"
            );
        }
        let pads = v["bearing"]["pad_count"].as_u64().unwrap() as f64;
        let (total, pad) = (f(&v, "bearing.total_load_n"), f(&v, "pad.load_n"));
        assert!(
            (total - pad * pads).abs() <= 1e-9 * total,
            "{total} vs {pad} × {pads}"
        );
        let h_min = f(&v, "pad.min_film_thickness_m");
        assert!(h_min > 0.0 && h_min < f(&v, "pad.max_film_thickness_m"));

        // The same design through the library gives the same numbers (JSON prints every digit;
        // 1e-12 relative allows for the last bit of reading them back).
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
        match &direct.thermal {
            Some(th) => {
                assert!(
                    rel(
                        f(&v, "thermal.max_pad_temperature_k"),
                        th.max_pad_temperature
                    ) <= 1e-12,
                    "{name}: hottest pad temperature"
                );
                assert!(
                    rel(f(&v, "thermal.inlet_temperature_k"), th.inlet_temperature) <= 1e-12,
                    "{name}: inlet temperature"
                );
            }
            None => assert!(v["thermal"].is_null(), "{name}"),
        }
        // The field arrays have the documented sizes.
        let fields = &v["fields"];
        let n_along = fields["nodes_along"].as_u64().unwrap() as usize;
        let n_across = fields["nodes_across"].as_u64().unwrap() as usize;
        for key in ["pressure_pa", "film_m"] {
            assert_eq!(
                fields[key].as_array().unwrap().len(),
                n_along * n_across,
                "{name}: {key}"
            );
        }
        if let Some(t) = fields["temperature_k"].as_array() {
            assert_eq!(t.len(), n_along * n_across, "{name}: temperature_k");
        }
        assert_eq!(fields["xi"].as_array().unwrap().len(), n_along);
    }
}

#[test]
fn demo_results_are_in_a_plausible_range() {
    // Engineering sense, wide bands (common practice, no source): films of tens of µm,
    // specific loads of about 0.5–3 MPa, power losses from a few hundred W (the rig) to a few
    // kW, hottest pads of 50–110 °C (white-metal faces are commonly kept below 120–130 °C).
    for name in ALL {
        let v = solve_json(name);
        let h = f(&v, "pad.min_film_thickness_m") * 1e6;
        let p = f(&v, "pad.mean_pressure_pa") / 1e6;
        let power = f(&v, "bearing.power_loss_w") / 1e3;
        assert!((10.0..80.0).contains(&h), "{name}: min film {h} µm");
        assert!((0.5..3.0).contains(&p), "{name}: mean pressure {p} MPa");
        assert!(
            (0.1..20.0).contains(&power),
            "{name}: power loss {power} kW"
        );
        assert!(f(&v, "pad.peak_pressure_pa") > f(&v, "pad.mean_pressure_pa"));
        if !v["thermal"].is_null() {
            let hottest = f(&v, "thermal.max_pad_temperature_k") - 273.15;
            assert!(
                (50.0..110.0).contains(&hottest),
                "{name}: hottest pad {hottest} °C"
            );
        }
    }
}

#[test]
fn example_prints_the_demo_file() {
    for (kind, name) in [
        ("tilting", TILTING),
        ("centre", CENTRE),
        ("tapered", TAPERED),
        ("rig", RIG),
    ] {
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
