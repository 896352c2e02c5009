//! The results as a readable table in engineering units: film in µm, pressure in MPa, load in
//! kN, power in kW, flows in L/min, stiffness in N/µm, temperature in °C (temperature
//! differences in K).

use std::fmt::Write as _;

use super::{DutyEcho, FlowsOut, OilEcho, OutlineEcho, PadPoint, Report, SpeedEcho, SupportEcho};
use crate::units::*;

mod temperatures;

/// Formats a setting as typed: a whole number without decimals (`60`), anything else with
/// about four significant digits.
pub fn setting(v: f64) -> String {
    if v.is_finite() && v == v.round() && v.abs() < 1e6 {
        format!("{v:.0}")
    } else {
        num(v)
    }
}

/// Formats a number with about four significant digits, in plain notation for the range met in
/// bearing results and in scientific notation outside it.
pub fn num(v: f64) -> String {
    if v == 0.0 {
        return "0".into();
    }
    let mag = v.abs().log10().floor() as i32;
    if !(-3..7).contains(&mag) {
        return format!("{v:.3e}");
    }
    let decimals = (3 - mag).max(0) as usize;
    format!("{v:.decimals$}")
}

fn point(p: &PadPoint) -> String {
    format!("{:.3}, {:.3}", p.xi, p.eta)
}

const RULE: &str =
    "-------------------------------------------------------------------------------";

/// Rows of the table: label, value per pad, value for the bearing (if it differs), unit.
struct Table(String);

impl Table {
    fn heading(&mut self, title: &str) {
        let _ = writeln!(self.0, "\n{title}");
    }
    fn row(&mut self, label: &str, pad: &str, bearing: &str, unit: &str) {
        let line = format!("  {label:<36}{pad:>14}{bearing:>14}  {unit}");
        let _ = writeln!(self.0, "{}", line.trim_end());
    }
    fn both(&mut self, label: &str, pad: f64, bearing: f64, unit: &str) {
        self.row(label, &num(pad), &num(bearing), unit);
    }
    fn pad(&mut self, label: &str, pad: f64, unit: &str) {
        self.row(label, &num(pad), "", unit);
    }
    fn text(&mut self, label: &str, pad: &str) {
        let _ = writeln!(self.0, "  {label:<36}{pad:>14}");
    }
}

fn describe_support(s: &SupportEcho, along: &str) -> String {
    match *s {
        SupportEcho::TiltingPoint {
            pivot_offset_along,
            pivot_offset_across,
        } => format!(
            "tilting on point pivots, pivot at {:.1} % of the {along} and {:.1} % of the width",
            fraction_to_pct(pivot_offset_along),
            fraction_to_pct(pivot_offset_across)
        ),
        SupportEcho::TiltingLine { pivot_offset_along } => format!(
            "tilting on line pivots, pivot at {:.1} % of the {along}",
            fraction_to_pct(pivot_offset_along)
        ),
        SupportEcho::TaperedLand {
            taper_extent,
            taper_depth_m,
        } => format!(
            "fixed tapered land, taper over {:.1} % of the {along}, {} µm deep",
            fraction_to_pct(taper_extent),
            num(m_to_um(taper_depth_m))
        ),
        SupportEcho::Flat => "fixed flat pad".into(),
    }
}

fn describe_outline(o: &OutlineEcho, count: usize) -> String {
    let plural = if count == 1 { "" } else { "s" };
    match *o {
        OutlineEcho::Sector {
            inner_radius_m,
            outer_radius_m,
            arc_rad,
        } => format!(
            "sector{plural}, radii {} to {} mm, arc {}°",
            num(m_to_mm(inner_radius_m)),
            num(m_to_mm(outer_radius_m)),
            num(rad_to_deg(arc_rad))
        ),
        OutlineEcho::Rectangle { length_m, width_m } => format!(
            "rectangle{plural}, {} mm long × {} mm wide",
            num(m_to_mm(length_m)),
            num(m_to_mm(width_m))
        ),
    }
}

fn describe_oil(o: &OilEcho) -> String {
    match (
        o.kind,
        o.iso_vg,
        o.viscosity_index,
        o.nu40_m2_s,
        o.nu100_m2_s,
    ) {
        ("iso_grade", Some(vg), Some(vi), ..) => format!("ISO VG {vg}, viscosity index {vi:.0}"),
        (_, _, _, Some(n40), Some(n100)) => format!(
            "measured ν40 {} mm²/s, ν100 {} mm²/s",
            num(m2_s_to_mm2_s(n40)),
            num(m2_s_to_mm2_s(n100))
        ),
        _ => "constant-viscosity oil".into(),
    }
}

fn m2_s_to_mm2_s(v: f64) -> f64 {
    padwright_solver::lubricant::m2_s_to_mm2_s(v)
}

fn flows(t: &mut Table, pad: &FlowsOut, bearing: &FlowsOut) {
    let l = m3_s_to_l_min;
    t.both(
        "Leading edge, in",
        l(pad.leading_edge_in_m3_s),
        l(bearing.leading_edge_in_m3_s),
        "L/min",
    );
    t.both(
        "Trailing edge, out",
        l(pad.trailing_edge_out_m3_s),
        l(bearing.trailing_edge_out_m3_s),
        "L/min",
    );
    t.both(
        "Inner edge, out",
        l(pad.inner_edge_out_m3_s),
        l(bearing.inner_edge_out_m3_s),
        "L/min",
    );
    t.both(
        "Outer edge, out",
        l(pad.outer_edge_out_m3_s),
        l(bearing.outer_edge_out_m3_s),
        "L/min",
    );
    t.pad(
        "Flow balance residual",
        fraction_to_pct(pad.mass_balance_residual),
        "% of inflow",
    );
}

/// Renders the report as a text table, ending with the caution.
pub fn render(r: &Report) -> String {
    let d = &r.design;
    let mut t = Table(String::new());
    let _ = writeln!(
        t.0,
        "Padwright {} — thrust bearing analysis",
        r.padwright_version
    );
    if !d.title.is_empty() {
        let _ = writeln!(t.0, "{}", d.title);
    }
    let _ = writeln!(t.0, "{RULE}");
    let along = match d.outline {
        OutlineEcho::Sector { .. } => "arc",
        OutlineEcho::Rectangle { .. } => "length",
    };
    let speed = match d.speed {
        SpeedEcho::Rotating {
            angular_speed_rad_s,
        } => format!(
            "{} rpm (mean surface speed {} m/s)",
            num(rad_s_to_rpm(angular_speed_rad_s)),
            num(d.mean_surface_speed_m_s)
        ),
        SpeedEcho::Sliding { speed_m_s } => format!("sliding at {} m/s", num(speed_m_s)),
    };
    let duty = match d.duty {
        DutyEcho::TotalLoad { total_load_n } => {
            format!("total axial load {} kN", num(n_to_kn(total_load_n)))
        }
        DutyEcho::MinFilm { min_film_m } => {
            format!("run at a minimum film of {} µm", num(m_to_um(min_film_m)))
        }
    };
    let temperature = temperatures::describe_model(r);
    let pads = format!(
        "{} × {}",
        d.pad_count,
        describe_outline(&d.outline, d.pad_count)
    );
    for (label, value) in [
        ("Pads", pads),
        ("Support", describe_support(&d.support, along)),
        ("Runner", speed),
        ("Duty", duty),
        ("Oil", describe_oil(&d.oil)),
        ("Film", temperature),
    ] {
        let _ = writeln!(t.0, "{label:<9}{}", hang(&value, 79, 9));
    }

    let (p, b) = (&r.pad, &r.bearing);
    t.0.push('\n');
    t.row("", "per pad", "bearing", "unit");
    t.0.push_str(RULE);
    t.0.push('\n');
    t.heading("Load");
    t.both(
        "Axial load",
        n_to_kn(p.load_n),
        n_to_kn(b.total_load_n),
        "kN",
    );
    t.pad(
        "Mean specific load (load / pad area)",
        pa_to_mpa(p.mean_pressure_pa),
        "MPa",
    );
    t.pad("Peak pressure", pa_to_mpa(p.peak_pressure_pa), "MPa");
    t.text("  where (ξ, η)", &point(&p.peak_pressure_location));
    t.text("Centre of pressure (ξ, η)", &point(&p.centre_of_pressure));

    t.heading("Film");
    t.pad(
        "Minimum film thickness",
        m_to_um(p.min_film_thickness_m),
        "µm",
    );
    t.text("  where (ξ, η)", &point(&p.min_film_location));
    t.pad(
        "Maximum film thickness",
        m_to_um(p.max_film_thickness_m),
        "µm",
    );
    if let (Some(h), Some(pitch), Some(roll)) = (p.pivot_film_thickness_m, p.pitch_rad, p.roll_rad)
    {
        t.pad("Film at the pivot", m_to_um(h), "µm");
        t.pad("Pitch (+ opens the leading edge)", pitch * 1e3, "mrad");
        t.pad("Roll (+ opens the outer edge)", roll * 1e3, "mrad");
    }
    if p.crown_m > 0.0 {
        t.pad("Crown of the pad face, in all", m_to_um(p.crown_m), "µm");
    }
    t.pad(
        "Cavitated area",
        fraction_to_pct(p.cavitated_fraction),
        "% of pad",
    );
    t.pad(
        "Largest film Reynolds number ρUh/μ",
        p.max_reynolds_number,
        "",
    );
    t.both(
        "Axial film stiffness",
        n_per_m_to_n_per_um(p.stiffness_n_per_m),
        n_per_m_to_n_per_um(b.stiffness_n_per_m),
        "N/µm",
    );

    t.heading("Friction and power");
    t.both(
        "Friction force",
        p.friction_force_n,
        b.friction_force_n,
        "N",
    );
    if matches!(d.speed, SpeedEcho::Rotating { .. }) {
        t.both(
            "Friction torque",
            p.friction_torque_n_m,
            b.friction_torque_n_m,
            "N·m",
        );
    }
    t.both(
        "Power loss",
        w_to_kw(p.power_loss_w),
        w_to_kw(b.power_loss_w),
        "kW",
    );

    t.heading("Oil flow through the pad edges");
    flows(&mut t, &p.flows, &b.flows);

    temperatures::render(&mut t, r);
    temperatures::viscosity(&mut t, r);

    let s = &r.solver;
    t.heading("Solution");
    let _ = writeln!(
        t.0,
        "  Grid {} × {} nodes; final pressure residual {:.1e} after {} cycles",
        s.nodes_along, s.nodes_across, s.pressure_residual, s.pressure_cycles
    );
    let _ = writeln!(
        t.0,
        "  Equilibrium: {} iterations, {} pressure solves; load error {:.1e}, moment error {:.1e}",
        s.equilibrium_iterations, s.pressure_solves, s.load_error, s.moment_error
    );
    if let Some(c) = &s.coarse_start {
        let _ = writeln!(
            t.0,
            "  Started from the solution on the {} × {} grid ({} pressure solves and {} \
             temperature renewals on coarser grids)",
            c.nodes_along, c.nodes_across, c.pressure_solves, c.temperature_renewals
        );
    }
    let _ = writeln!(
        t.0,
        "  ξ runs along the motion from the leading edge (0) to the trailing edge (1); η across \
         it from the inner edge (0) to the outer edge (1)."
    );
    if !r.notes.is_empty() {
        t.heading("Notes");
        for n in &r.notes {
            let _ = writeln!(t.0, "  - {}", hang(n, 79, 4));
        }
    }
    let _ = writeln!(t.0, "\n{RULE}");
    let _ = writeln!(t.0, "{}", wrap(r.caution, 79));
    t.0
}

/// Wraps text that starts `indent` characters into a line, to lines of at most `width`
/// characters, indenting the lines after the first by `indent` spaces. Line breaks in `text`
/// are kept.
fn hang(text: &str, width: usize, indent: usize) -> String {
    let pad = format!("\n{}", " ".repeat(indent));
    text.lines()
        .map(|l| wrap(l, width - indent).replace('\n', &pad))
        .collect::<Vec<_>>()
        .join(&pad)
}

/// Wraps text at word boundaries to lines of at most `width` characters. A unit that starts
/// with `°` or `%` stays on the line of its number.
fn wrap(text: &str, width: usize) -> String {
    let mut words: Vec<String> = Vec::new();
    for word in text.split_whitespace() {
        match words.last_mut() {
            Some(last) if word.starts_with(['°', '%']) => {
                last.push(' ');
                last.push_str(word);
            }
            _ => words.push(word.to_string()),
        }
    }
    let mut out = String::new();
    let mut line = 0;
    for word in &words {
        let len = word.chars().count();
        if line > 0 && line + 1 + len > width {
            out.push('\n');
            line = 0;
        } else if line > 0 {
            out.push(' ');
            line += 1;
        }
        out.push_str(word);
        line += len;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_keep_four_significant_digits() {
        assert_eq!(num(0.0), "0");
        assert_eq!(num(23.456), "23.46");
        assert_eq!(num(1.7654), "1.765");
        assert_eq!(num(1234.4), "1234");
        assert_eq!(num(-0.5), "-0.5000");
        assert_eq!(num(12_345_678.0), "1.235e7");
        assert_eq!(num(2.5e-5), "2.500e-5");
    }

    #[test]
    fn wrapping_keeps_words_and_width() {
        let w = wrap(crate::CAUTION, 40);
        assert!(w.lines().all(|l| l.chars().count() <= 40));
        assert_eq!(
            w.split_whitespace().collect::<Vec<_>>(),
            crate::CAUTION.split_whitespace().collect::<Vec<_>>()
        );
    }

    #[test]
    fn wrapping_keeps_units_with_their_numbers() {
        let w = wrap("oil supplied at 45 °C with 60 % carry-over", 18);
        assert_eq!(w, "oil supplied at\n45 °C with 60 %\ncarry-over");
        // A hanging indent under a label, and the caller's own line breaks kept.
        assert_eq!(
            hang("first line\nsecond line is longer", 14, 4),
            "first line\n    second\n    line is\n    longer"
        );
    }

    #[test]
    fn settings_print_as_typed() {
        assert_eq!(setting(45.0), "45");
        assert_eq!(setting(62.5), "62.50");
        assert_eq!(setting(0.0), "0");
    }
}
