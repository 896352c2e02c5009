//! Tests of the design file: unit conversions in both directions, version and unknown-field
//! checks, value checks, and round trips design → RON → design.

use std::f64::consts::PI;

use approx::assert_relative_eq;
use padwright_solver::lubricant::ViscositySpec;
use padwright_solver::prelude::*;

use super::*;
use crate::templates::Template;

/// A complete file with a value in every field, each chosen so its SI value is known by hand.
pub(super) const FULL: &str = r#"(
    format_version: 1,
    title: "conversion check",
    pad_count: 6,
    outline: Sector(inner_radius_mm: 75.0, outer_radius_mm: 140.0, arc_deg: 45.0),
    support: TaperedLand(taper_extent_pct: 80.0, taper_depth_um: 60.0),
    crown_um: 5.0,
    runner: Rotating(speed_rpm: 3000.0),
    duty: TotalLoad(total_load_kn: 62.0),
    oil: (
        viscosity: Measured(nu40_mm2_s: 44.1, nu100_mm2_s: 6.62),
        density_15c_kg_m3: 866.0,
        thermal_expansion_per_k: 0.0007,
        specific_heat_j_per_kg_k: 1950.0,
        thermal_conductivity_w_per_m_k: 0.125,
        lowest_valid_temperature_c: -10.0,
    ),
    film_temperature: Effective(temperature_c: 62.0),
    numerics: (
        nodes_along: 33,
        nodes_across: 41,
        pressure_tolerance: 1e-9,
        max_pressure_cycles: 80,
        cavitation: false,
        cavitation_pressure_kpa: -30.0,
        smallest_film_um: 2.0,
        equilibrium_tolerance: 1e-7,
        max_equilibrium_iterations: 40,
        smoothing_sweeps_before: 2,
        smoothing_sweeps_after: 3,
        relaxation_factor: 1.1,
        coarse_grid_visits: 2,
        line_smoothing: false,
        single_precision_corrections: false,
        adaptive_relaxation: false,
        projected_acceleration: false,
    ),
)"#;

/// The smallest file: every optional part left out.
const MINIMAL: &str = r#"(
    format_version: 1,
    pad_count: 8,
    outline: Rectangle(length_mm: 80, width_mm: 60),
    support: Flat,
    runner: Sliding(speed_m_s: 12),
    duty: MinFilm(min_film_um: 25),
    oil: (viscosity: Constant(dynamic_viscosity_mpa_s: 20)),
    film_temperature: Effective(temperature_c: 40),
)"#;

pub(super) fn design(text: &str) -> BearingDesign {
    DesignFile::parse(text).unwrap().to_design().unwrap()
}

pub(super) fn error(text: &str) -> DesignError {
    match DesignFile::parse(text).and_then(|f| f.to_design()) {
        Ok(_) => panic!("expected an error"),
        Err(e) => e,
    }
}

#[test]
fn engineering_units_become_si() {
    let d = design(FULL);
    assert_eq!(d.pad_count, 6);
    let PadOutline::Sector {
        inner_radius,
        outer_radius,
        arc,
    } = d.outline
    else {
        panic!("sector expected")
    };
    assert_relative_eq!(inner_radius, 0.075, max_relative = 1e-15);
    assert_relative_eq!(outer_radius, 0.140, max_relative = 1e-15);
    assert_relative_eq!(arc, PI / 4.0, max_relative = 1e-15);
    let Support::TaperedLand {
        taper_fraction,
        taper_depth,
    } = d.support
    else {
        panic!("tapered land expected")
    };
    assert_relative_eq!(taper_fraction, 0.8, max_relative = 1e-15);
    assert_relative_eq!(taper_depth, 60e-6, max_relative = 1e-15);
    assert_relative_eq!(d.crown, 5e-6, max_relative = 1e-15);
    // 3000 rpm = 50 rev/s = 100π rad/s.
    let RunnerSpeed::Angular(w) = d.speed else {
        panic!("angular speed expected")
    };
    assert_relative_eq!(w, 100.0 * PI, max_relative = 1e-15);
    assert_eq!(d.duty, Duty::Load(62_000.0));
    let FilmTemperature::Effective { temperature } = d.temperature else {
        panic!("effective temperature expected")
    };
    assert_relative_eq!(temperature, 335.15, max_relative = 1e-15);
}

#[test]
fn oil_properties_become_si() {
    let oil = design(FULL).lubricant;
    let ViscositySpec::Measured {
        nu40_m2_s,
        nu100_m2_s,
    } = oil.spec()
    else {
        panic!("measured oil expected")
    };
    assert_relative_eq!(nu40_m2_s, 44.1e-6, max_relative = 1e-15);
    assert_relative_eq!(nu100_m2_s, 6.62e-6, max_relative = 1e-15);
    assert_eq!(oil.density_15c_kg_m3(), 866.0);
    assert_eq!(oil.thermal_expansion_per_k(), 0.0007);
    assert_eq!(oil.specific_heat_j_per_kg_k(), 1950.0);
    assert_eq!(oil.thermal_conductivity_w_per_m_k(), 0.125);
    let range = oil.valid_temperature_range_k().unwrap();
    assert_relative_eq!(range.min_k, 263.15, max_relative = 1e-15);
    // 20 mPa·s = 0.02 Pa·s.
    let constant = design(MINIMAL).lubricant;
    assert_eq!(
        constant.spec(),
        ViscositySpec::Isoviscous {
            dynamic_viscosity_pa_s: 0.02
        }
    );
}

#[test]
fn numerics_become_si() {
    let n = design(FULL).numerics;
    assert_eq!((n.nodes_along, n.nodes_across), (33, 41));
    assert_eq!(n.reynolds.tolerance, 1e-9);
    assert_eq!(n.reynolds.max_cycles, 80);
    assert!(!n.reynolds.cavitation);
    assert_eq!(n.reynolds.cavitation_pressure, -30_000.0);
    assert_relative_eq!(n.equilibrium.min_film, 2e-6, max_relative = 1e-15);
    assert_eq!(n.equilibrium.tolerance, 1e-7);
    assert_eq!(n.equilibrium.max_iterations, 40);
    let c = n.reynolds.cycle;
    assert_eq!((c.pre_sweeps, c.post_sweeps, c.gamma), (2, 3, 2));
    assert_eq!(c.omega, 1.1);
    assert!(!c.lines && !c.mixed_precision && !c.adaptive_omega && !c.accelerate_projected);
}

#[test]
fn a_cavitation_pressure_above_ambient_is_refused() {
    // The pad's edges are held at ambient pressure (0 kPa gauge); a cavitation floor above it
    // would contradict that boundary condition (the model's own boundary condition; common
    // practice, no source).
    let above = FULL.replace(
        "cavitation_pressure_kpa: -30.0",
        "cavitation_pressure_kpa: 10.0",
    );
    assert_ne!(above, FULL);
    match error(&above) {
        DesignError::BadValue { field, reason, .. } => {
            assert_eq!(field, "numerics.cavitation_pressure_kpa");
            assert!(reason.contains("ambient"), "{reason}");
        }
        e => panic!("wrong error {e}"),
    }
    let ambient = FULL.replace(
        "cavitation_pressure_kpa: -30.0",
        "cavitation_pressure_kpa: 0.0",
    );
    assert_eq!(design(&ambient).numerics.reynolds.cavitation_pressure, 0.0);
}

#[test]
fn left_out_sections_take_the_solver_defaults() {
    let d = design(MINIMAL);
    assert_eq!(d.numerics, Numerics::default());
    assert_eq!(d.crown, 0.0);
    assert_eq!(
        d.outline,
        PadOutline::Rectangle {
            length: 0.08,
            width: 0.06
        }
    );
    assert_eq!(d.speed, RunnerSpeed::Linear(12.0));
    assert_relative_eq!(
        match d.duty {
            Duty::MinFilm(h) => h,
            Duty::Load(_) => panic!("film duty expected"),
        },
        25e-6,
        max_relative = 1e-15
    );
    let oil = Lubricant::isoviscous(0.02).unwrap();
    assert_eq!(d.lubricant, oil);
    // A grade with no viscosity index takes the solver's default turbine-oil index.
    let text = MINIMAL.replace(
        "Constant(dynamic_viscosity_mpa_s: 20)",
        "IsoGrade(iso_vg: 46)",
    );
    assert_eq!(
        design(&text).lubricant,
        Lubricant::from_iso_vg(IsoVg::Vg46, 100.0).unwrap()
    );
}

#[test]
fn si_becomes_engineering_units() {
    let d = BearingDesign {
        pad_count: 6,
        outline: PadOutline::Sector {
            inner_radius: 0.05,
            outer_radius: 0.095,
            arc: PI / 4.0,
        },
        support: Support::TiltingPoint {
            offset_along: 0.6,
            offset_across: 0.5,
        },
        crown: 3e-6,
        speed: RunnerSpeed::Angular(100.0 * PI),
        duty: Duty::Load(22_000.0),
        lubricant: Lubricant::from_iso_vg(IsoVg::Vg32, 95.0).unwrap(),
        temperature: FilmTemperature::Effective {
            temperature: 328.15,
        },
        numerics: Numerics::default(),
    };
    let f = DesignFile::from_design(&d, "t").unwrap();
    assert_eq!(
        f.outline,
        OutlineSpec::Sector {
            inner_radius_mm: 50.0,
            outer_radius_mm: 95.0,
            arc_deg: 45.0
        }
    );
    assert_eq!(
        f.support,
        SupportSpec::TiltingPoint {
            pivot_offset_along_pct: 60.0,
            pivot_offset_across_pct: 50.0
        }
    );
    assert_eq!(f.crown_um, 3.0);
    assert_eq!(f.runner, RunnerSpec::Rotating { speed_rpm: 3000.0 });
    assert_eq!(
        f.duty,
        DutySpec::TotalLoad {
            total_load_kn: 22.0
        }
    );
    assert_eq!(
        f.film_temperature,
        FilmTemperatureSpec::Effective {
            temperature_c: 55.0
        }
    );
    assert_eq!(
        f.oil.viscosity,
        ViscosityInput::IsoGrade {
            iso_vg: 32,
            viscosity_index: 95.0
        }
    );
    assert_eq!(f.numerics.smallest_film_um, 1.0);
    assert_eq!(f.numerics, NumericsSpec::default());
}

/// Every number of two designs agrees to 1e-13 relative (files keep 15 significant digits).
pub(super) fn assert_same_design(a: &BearingDesign, b: &BearingDesign) {
    let close = |x: f64, y: f64| (x - y).abs() <= 1e-13 * x.abs().max(y.abs());
    let text = |d: &BearingDesign| format!("{d:?}");
    // Compare the debug texts number by number: same structure, numbers within tolerance.
    let (ta, tb) = (text(a), text(b));
    let split = |t: &str| {
        t.split(|c: char| !(c.is_ascii_digit() || c == '.' || c == '-' || c == 'e'))
            .filter_map(|s| s.parse::<f64>().ok())
            .collect::<Vec<_>>()
    };
    let strip = |t: &str| {
        t.chars()
            .filter(|c| c.is_alphabetic() && *c != 'e')
            .collect::<String>()
    };
    assert_eq!(strip(&ta), strip(&tb), "same structure");
    let (na, nb) = (split(&ta), split(&tb));
    assert_eq!(na.len(), nb.len());
    for (x, y) in na.iter().zip(&nb) {
        assert!(close(*x, *y), "{x} vs {y}\n{ta}\n{tb}");
    }
}

pub(super) fn round_trip(d: &BearingDesign) -> BearingDesign {
    let text = DesignFile::from_design(d, "round trip")
        .unwrap()
        .to_ron()
        .unwrap();
    DesignFile::parse(&text)
        .unwrap_or_else(|e| panic!("{e}\n{text}"))
        .to_design()
        .unwrap()
}

#[test]
fn templates_survive_a_round_trip_exactly() {
    for t in Template::ALL {
        let d = design(t.text());
        assert_eq!(round_trip(&d), d, "{}", t.asset_name());
    }
    assert_eq!(round_trip(&design(FULL)), design(FULL));
    assert_eq!(round_trip(&design(MINIMAL)), design(MINIMAL));
}

#[test]
fn awkward_si_values_survive_a_round_trip() {
    let mut d = design(FULL);
    d.outline = PadOutline::Sector {
        inner_radius: 0.061_234_567,
        outer_radius: 0.118_765_432,
        arc: 0.7,
    };
    d.support = Support::TiltingPoint {
        offset_along: 0.583_333_333_3,
        offset_across: 0.47,
    };
    d.speed = RunnerSpeed::Angular(157.3);
    d.duty = Duty::Load(12_345.678_9);
    d.temperature = FilmTemperature::Effective {
        temperature: 331.234_5,
    };
    d.crown = 0.0;
    d.lubricant = Lubricant::from_iso_vg(IsoVg::Vg68, 97.5)
        .unwrap()
        .with_min_valid_temperature_k(258.0)
        .unwrap();
    assert_same_design(&round_trip(&d), &d);
    d.support = Support::Flat;
    d.duty = Duty::MinFilm(1.234_5e-5);
    assert_same_design(&round_trip(&d), &d);
}

#[test]
fn a_sector_with_a_sliding_speed_cannot_be_written() {
    let mut d = design(FULL);
    d.speed = RunnerSpeed::Linear(10.0);
    assert!(matches!(
        DesignFile::from_design(&d, ""),
        Err(DesignError::NotRepresentable(_))
    ));
}

#[test]
fn other_versions_are_named_before_anything_else() {
    // A newer file may have fields this version does not know: the version is what to report.
    let newer = FULL.replace(
        "format_version: 1",
        "format_version: 2, heat_model: Adiabatic",
    );
    match error(&newer) {
        DesignError::UnsupportedVersion { found, supported } => {
            assert_eq!((found, supported), (2, FORMAT_VERSION))
        }
        e => panic!("wrong error: {e}"),
    }
    assert!(matches!(
        error(&FULL.replace("format_version: 1", "format_version: 0")),
        DesignError::UnsupportedVersion { found: 0, .. }
    ));
    let missing = FULL.replace("format_version: 1,", "");
    assert!(matches!(
        error(&missing),
        DesignError::MissingVersion { supported: 1 }
    ));
    let message = error(&missing).to_string();
    assert!(message.contains("format_version: 1"), "{message}");
}

#[test]
fn unknown_fields_are_refused_everywhere() {
    for (from, to, name) in [
        ("pad_count: 6", "pad_count: 6, pad_cout: 7", "pad_cout"),
        ("arc_deg: 45.0", "arc_degs: 45.0", "arc_degs"),
        ("taper_depth_um", "taper_depth_mm", "taper_depth_mm"),
        ("density_15c_kg_m3", "density_kg_m3", "density_kg_m3"),
        ("nodes_along", "nodes_along_x", "nodes_along_x"),
        (
            "temperature_c: 62.0",
            "temperature_k: 335.15",
            "temperature_k",
        ),
        ("speed_rpm", "speed_rps", "speed_rps"),
    ] {
        let text = FULL.replace(from, to);
        let e = error(&text);
        assert!(matches!(e, DesignError::Syntax(_)), "{name}: {e}");
        let message = e.to_string();
        assert!(message.contains(name), "{message}");
        assert!(message.starts_with("line "), "{message}");
    }
}

#[test]
fn likely_unit_mistakes_are_named_with_their_field() {
    for (from, to, field) in [
        (
            "inner_radius_mm: 75.0",
            "inner_radius_mm: 0.075",
            "outline.inner_radius_mm",
        ),
        ("arc_deg: 45.0", "arc_deg: 0.785", "outline.arc_deg"),
        (
            "taper_extent_pct: 80.0",
            "taper_extent_pct: 0.8",
            "support.taper_extent_pct",
        ),
        (
            "temperature_c: 62.0",
            "temperature_c: 335.15",
            "film_temperature.temperature_c",
        ),
        ("crown_um: 5.0", "crown_um: 5000.0", "crown_um"),
        (
            "total_load_kn: 62.0",
            "total_load_kn: -62.0",
            "duty.total_load_kn",
        ),
        ("arc_deg: 45.0", "arc_deg: NaN", "outline.arc_deg"),
        ("speed_rpm: 3000.0", "speed_rpm: inf", "runner.speed_rpm"),
        (
            "smallest_film_um: 2.0",
            "smallest_film_um: 0.0",
            "numerics.smallest_film_um",
        ),
    ] {
        match error(&FULL.replace(from, to)) {
            DesignError::BadValue { field: f, .. } => assert_eq!(f, field),
            e => panic!("{to}: wrong error {e}"),
        }
    }
    let e = error(&FULL.replace("inner_radius_mm: 75.0", "inner_radius_mm: 0.075"));
    assert!(e.to_string().contains("metres"), "{e}");
}

#[test]
fn inconsistent_designs_are_refused_with_the_solver_message() {
    let e = error(&FULL.replace("Rotating(speed_rpm: 3000.0)", "Sliding(speed_m_s: 10.0)"));
    assert!(matches!(e, DesignError::BadValue { ref field, .. } if field == "runner"));
    // Eight 50° pads do not fit on a circle: the solver's own check speaks.
    let e = error(
        &FULL
            .replace("pad_count: 6", "pad_count: 8")
            .replace("arc_deg: 45.0", "arc_deg: 50.0"),
    );
    assert!(matches!(e, DesignError::Design(_)), "{e}");
    assert!(e.to_string().contains("do not fit"), "{e}");
    let e = error(&FULL.replace("nodes_along: 33", "nodes_along: 3"));
    assert!(e.to_string().contains("nodes along"), "{e}");
    let e = error(&MINIMAL.replace(
        "dynamic_viscosity_mpa_s: 20)",
        "dynamic_viscosity_mpa_s: 20), lowest_valid_temperature_c: 0",
    ));
    assert!(
        matches!(e, DesignError::BadValue { ref field, .. } if field == "oil.lowest_valid_temperature_c"),
        "{e}"
    );
    let e = error(&FULL.replace(
        "Measured(nu40_mm2_s: 44.1, nu100_mm2_s: 6.62)",
        "IsoGrade(iso_vg: 47)",
    ));
    assert!(matches!(e, DesignError::Oil(_)), "{e}");
}

#[test]
fn written_files_carry_the_version_and_a_header() {
    let text = DesignFile::from_design(&design(MINIMAL), "x")
        .unwrap()
        .to_ron()
        .unwrap();
    assert!(text.starts_with("// Padwright design file"));
    assert!(text.contains("format_version: 1"));
    assert!(text.contains("length_mm: 80.0"), "{text}");
}
