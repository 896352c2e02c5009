//! The commented example designs written by `padwright example`.
//!
//! They are the demo designs in the repository's `assets/` folder, compiled in with
//! `include_str!`, so the example command and the demo files cannot drift apart.

/// Tilting-pad bearing: eight pads on point pivots, ISO VG 46 (Orrindale pump set P-2).
pub const TILTING_PAD: &str = include_str!("../../../assets/orrindale_p2_tilting_pad.ron");

/// Tapered-land bearing: six fixed pads, ISO VG 32 (Orrindale booster pump B-1).
pub const TAPERED_LAND: &str = include_str!("../../../assets/orrindale_booster_tapered_land.ron");

/// A single rectangular pad on a line pivot on a slider rig, with a measured oil.
pub const LINE_PIVOT_RIG: &str = include_str!("../../../assets/orrindale_rig_line_pivot.ron");

/// The example designs that `padwright example` can write.
#[derive(Clone, Copy, Debug, PartialEq, Eq, clap::ValueEnum)]
pub enum Template {
    /// Tilting-pad bearing on point pivots.
    Tilting,
    /// Fixed-pad, tapered-land bearing.
    Tapered,
    /// Rectangular test-rig pad on a line pivot.
    Rig,
}

impl Template {
    /// All templates.
    pub const ALL: [Template; 3] = [Template::Tilting, Template::Tapered, Template::Rig];

    /// The commented RON text of the template.
    pub fn text(self) -> &'static str {
        match self {
            Template::Tilting => TILTING_PAD,
            Template::Tapered => TAPERED_LAND,
            Template::Rig => LINE_PIVOT_RIG,
        }
    }

    /// The name of the matching demo file in `assets/`.
    pub fn asset_name(self) -> &'static str {
        match self {
            Template::Tilting => "orrindale_p2_tilting_pad.ron",
            Template::Tapered => "orrindale_booster_tapered_land.ron",
            Template::Rig => "orrindale_rig_line_pivot.ron",
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design_file::{DesignFile, SupportSpec};

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
