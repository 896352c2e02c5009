//! The commented example designs written by `padwright example`.
//!
//! They are the demo designs in the repository's `assets/` folder, compiled in with
//! `include_str!`, so the example command and the demo files cannot drift apart.

/// Tilting-pad bearing: eight pads on point pivots, ISO VG 46 (Orrindale pump set P-2).
pub const TILTING_PAD: &str = include_str!("../../../assets/orrindale_p2_tilting_pad.ron");

/// Tapered-land bearing: six fixed pads, ISO VG 32 (Orrindale booster pump B-1).
pub const TAPERED_LAND: &str = include_str!("../../../assets/orrindale_booster_tapered_land.ron");

/// Centre-pivoted tilting pads for both directions of rotation, with the film-temperature
/// field and pad conduction (Orrindale transfer pump T-3).
pub const CENTRE_PIVOT: &str = include_str!("../../../assets/orrindale_t3_centre_pivot.ron");

/// A single rectangular pad on a line pivot on a slider rig, with a measured oil.
pub const LINE_PIVOT_RIG: &str = include_str!("../../../assets/orrindale_rig_line_pivot.ron");

/// The example designs that `padwright example` can write.
#[derive(Clone, Copy, Debug, PartialEq, Eq, clap::ValueEnum)]
pub enum Template {
    /// Tilting-pad bearing on point pivots, film-temperature field model.
    Tilting,
    /// Centre-pivoted tilting pads for both directions of rotation (thermal crown).
    Centre,
    /// Fixed-pad, tapered-land bearing, bulk thermal model.
    Tapered,
    /// Rectangular test-rig pad on a line pivot.
    Rig,
}

impl Template {
    /// All templates.
    pub const ALL: [Template; 4] = [
        Template::Tilting,
        Template::Centre,
        Template::Tapered,
        Template::Rig,
    ];

    /// The commented RON text of the template.
    pub fn text(self) -> &'static str {
        match self {
            Template::Tilting => TILTING_PAD,
            Template::Centre => CENTRE_PIVOT,
            Template::Tapered => TAPERED_LAND,
            Template::Rig => LINE_PIVOT_RIG,
        }
    }

    /// The name of the matching demo file in `assets/`.
    pub fn asset_name(self) -> &'static str {
        match self {
            Template::Tilting => "orrindale_p2_tilting_pad.ron",
            Template::Centre => "orrindale_t3_centre_pivot.ron",
            Template::Tapered => "orrindale_booster_tapered_land.ron",
            Template::Rig => "orrindale_rig_line_pivot.ron",
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design_file::{DesignFile, FilmTemperatureSpec, PadConductionSpec, SupportSpec};

    #[test]
    fn every_template_parses_and_converts() {
        for t in Template::ALL {
            let file =
                DesignFile::parse(t.text()).unwrap_or_else(|e| panic!("{}: {e}", t.asset_name()));
            file.to_design()
                .unwrap_or_else(|e| panic!("{}: {e}", t.asset_name()));
            assert!(!file.title.is_empty(), "{} has a title", t.asset_name());
        }
    }

    #[test]
    fn templates_have_the_support_their_names_promise() {
        let kind = |t: Template| DesignFile::parse(t.text()).unwrap().support;
        assert!(matches!(
            kind(Template::Tilting),
            SupportSpec::TiltingPoint { .. }
        ));
        assert!(matches!(
            kind(Template::Tapered),
            SupportSpec::TaperedLand { .. }
        ));
        assert!(matches!(
            kind(Template::Rig),
            SupportSpec::TiltingLine { .. }
        ));
        assert_eq!(
            kind(Template::Centre),
            SupportSpec::TiltingPoint {
                pivot_offset_along_pct: 50.0,
                pivot_offset_across_pct: 50.0
            }
        );
    }

    #[test]
    fn templates_show_each_temperature_model() {
        let model = |t: Template| DesignFile::parse(t.text()).unwrap().film_temperature;
        assert!(matches!(
            model(Template::Tilting),
            FilmTemperatureSpec::Field {
                pad_conduction: Some(_),
                ..
            }
        ));
        assert!(matches!(
            model(Template::Centre),
            FilmTemperatureSpec::Field {
                pad_conduction: Some(PadConductionSpec { expansion_um_per_m_k, .. }),
                ..
            } if expansion_um_per_m_k > 0.0
        ));
        assert!(matches!(
            model(Template::Tapered),
            FilmTemperatureSpec::Bulk { .. }
        ));
        assert!(matches!(
            model(Template::Rig),
            FilmTemperatureSpec::Effective { .. }
        ));
    }

    /// Every model named in a template's comments as an alternative (possibly over several
    /// comment lines) is a valid design in place of the template's own.
    #[test]
    fn the_alternatives_in_the_comments_parse() {
        let mut checked = 0;
        for t in Template::ALL {
            let text = t.text();
            // The template's own section: from its first line to the line closing it.
            let start = text.find("\n    film_temperature:").unwrap() + 1;
            let first = &text[start..start + text[start..].find('\n').unwrap()];
            let end = if first.ends_with("),") {
                start + first.len()
            } else {
                start + text[start..].find("\n    ),").unwrap() + "\n    ),".len()
            };
            let lines: Vec<&str> = text.lines().collect();
            for (n, line) in lines.iter().enumerate() {
                let Some(i) = line.find("film_temperature: ") else {
                    continue;
                };
                if !line.trim_start().starts_with("//") {
                    continue;
                }
                // Gather comment lines until the parentheses close.
                let mut alternative = String::new();
                let mut depth = 0i32;
                for (k, l) in lines[n..].iter().enumerate() {
                    let body = if k == 0 {
                        &l[i..]
                    } else {
                        l.trim_start().trim_start_matches('/')
                    };
                    depth += body.matches('(').count() as i32 - body.matches(')').count() as i32;
                    alternative.push_str(body);
                    alternative.push(' ');
                    if depth == 0 {
                        break;
                    }
                }
                let swapped = format!("{}{}{}", &text[..start], alternative, &text[end..]);
                DesignFile::parse(&swapped)
                    .and_then(|f| f.to_design())
                    .unwrap_or_else(|e| panic!("{}: {alternative}: {e}", t.asset_name()));
                checked += 1;
            }
        }
        assert!(checked >= 5, "only {checked} alternatives found");
    }

    #[test]
    fn templates_are_commented() {
        for t in Template::ALL {
            let comments = t
                .text()
                .lines()
                .filter(|l| l.trim_start().starts_with("//"));
            assert!(
                comments.count() >= 15,
                "{} explains its fields",
                t.asset_name()
            );
        }
    }
}
