//! The design as echoed in the results (SI units), so a JSON file says what it is about.

use padwright_solver::prelude::*;
use padwright_solver::thermal::DEFAULT_TEMPERATURE_TOLERANCE;
use serde::Serialize;

use super::FiniteGuard;

/// Pad outline, SI.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum OutlineEcho {
    /// Annular sector.
    Sector {
        /// Inner radius, m.
        inner_radius_m: f64,
        /// Outer radius, m.
        outer_radius_m: f64,
        /// Pad arc, rad.
        arc_rad: f64,
    },
    /// Rectangle.
    Rectangle {
        /// Length along the motion, m.
        length_m: f64,
        /// Width across the motion, m.
        width_m: f64,
    },
}

/// Pad support, offsets as fractions (0 to 1).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum SupportEcho {
    /// Tilting pad on a point pivot.
    TiltingPoint {
        /// Pivot offset along the motion, fraction of the arc from the leading edge.
        pivot_offset_along: f64,
        /// Pivot offset across the motion, fraction of the width from the inner edge.
        pivot_offset_across: f64,
    },
    /// Tilting pad on a line pivot.
    TiltingLine {
        /// Pivot offset along the motion, fraction of the arc from the leading edge.
        pivot_offset_along: f64,
    },
    /// Fixed tapered-land pad.
    TaperedLand {
        /// Fraction of the arc covered by the taper.
        taper_extent: f64,
        /// Taper depth at the leading edge, m.
        taper_depth_m: f64,
    },
    /// Fixed flat pad.
    Flat,
}

/// Runner speed, SI.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum SpeedEcho {
    /// Rotating collar.
    Rotating {
        /// Angular speed, rad/s.
        angular_speed_rad_s: f64,
    },
    /// Sliding runner.
    Sliding {
        /// Sliding speed, m/s.
        speed_m_s: f64,
    },
}

/// The duty, SI.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum DutyEcho {
    /// A given total load.
    TotalLoad {
        /// Total axial load asked for, N.
        total_load_n: f64,
    },
    /// A given minimum film.
    MinFilm {
        /// Minimum film asked for, m.
        min_film_m: f64,
    },
}

/// The oil as defined, SI.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OilEcho {
    /// `"iso_grade"`, `"measured"` or `"constant"`.
    pub kind: &'static str,
    /// ISO VG number (null unless given by grade).
    pub iso_vg: Option<u32>,
    /// Viscosity index (null for a constant-viscosity oil).
    pub viscosity_index: Option<f64>,
    /// Kinematic viscosity at 40 °C, m²/s (null for a constant-viscosity oil).
    pub nu40_m2_s: Option<f64>,
    /// Kinematic viscosity at 100 °C, m²/s (null for a constant-viscosity oil).
    pub nu100_m2_s: Option<f64>,
    /// Density at 15 °C, kg/m³.
    pub density_15c_kg_m3: f64,
}

/// Conduction through the pad to its bath, SI.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PadConductionEcho {
    /// Pad thickness, m.
    pub thickness_m: f64,
    /// Thermal conductivity of the pad, W/(m·K).
    pub conductivity_w_per_m_k: f64,
    /// Heat-transfer coefficient from the pad back to the bath, W/(m²·K).
    pub back_coefficient_w_per_m2_k: f64,
    /// Bath temperature, K.
    pub bath_temperature_k: f64,
    /// Linear thermal expansion coefficient of the pad, 1/K.
    pub expansion_per_k: f64,
}

/// The settings of a thermal model, SI.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct ThermalSettingsEcho {
    /// Oil supply temperature, K.
    pub supply_temperature_k: f64,
    /// Hot-oil carry-over: fraction of one pad's trailing-edge oil entering the next, 0 to 1.
    pub carry_over: f64,
    /// Oil supplied to the whole bearing, m³/s (null if not given).
    pub supplied_flow_m3_s: Option<f64>,
    /// Bulk model: fraction of the adiabatic rise added to the inlet temperature (null for the
    /// field model).
    pub share_of_rise: Option<f64>,
    /// Field model: heat-transfer coefficient to the runner, W/(m²·K) (null for the bulk
    /// model).
    pub runner_coefficient_w_per_m2_k: Option<f64>,
    /// Field model: runner temperature, K (null: the supply temperature, or the bulk model).
    pub runner_temperature_k: Option<f64>,
    /// Field model: conduction through the pad (null: none, or the bulk model).
    pub pad_conduction: Option<PadConductionEcho>,
    /// Convergence tolerance of the film temperature, K.
    pub tolerance_k: f64,
}

/// The design analysed, SI.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignEcho {
    /// Title from the design file.
    pub title: String,
    /// Number of pads.
    pub pad_count: usize,
    /// Pad outline.
    pub outline: OutlineEcho,
    /// Pad support.
    pub support: SupportEcho,
    /// Mechanical crown, m.
    pub crown_m: f64,
    /// Runner speed.
    pub speed: SpeedEcho,
    /// Runner surface speed at mid-width of the pad, m/s.
    pub mean_surface_speed_m_s: f64,
    /// What the bearing must do.
    pub duty: DutyEcho,
    /// Area of one pad, m².
    pub pad_area_m2: f64,
    /// The oil.
    pub oil: OilEcho,
    /// Film temperature model: `"effective"` (a temperature set by the user), `"bulk"` (bulk
    /// heat balance) or `"field"` (film-temperature field).
    pub temperature_model: &'static str,
    /// The effective film temperature set by the user, K (null for other models).
    pub effective_temperature_k: Option<f64>,
    /// Settings of the thermal model (null for the effective-temperature model).
    pub thermal_settings: Option<ThermalSettingsEcho>,
}

impl DesignEcho {
    pub(super) fn new(g: &mut FiniteGuard, title: &str, d: &BearingDesign) -> Self {
        let outline = match d.outline {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                arc,
            } => OutlineEcho::Sector {
                inner_radius_m: g.f("design.outline.inner_radius_m", inner_radius),
                outer_radius_m: g.f("design.outline.outer_radius_m", outer_radius),
                arc_rad: g.f("design.outline.arc_rad", arc),
            },
            PadOutline::Rectangle { length, width } => OutlineEcho::Rectangle {
                length_m: g.f("design.outline.length_m", length),
                width_m: g.f("design.outline.width_m", width),
            },
        };
        let support = match d.support {
            Support::TiltingPoint {
                offset_along,
                offset_across,
            } => SupportEcho::TiltingPoint {
                pivot_offset_along: g.f("design.support.pivot_offset_along", offset_along),
                pivot_offset_across: g.f("design.support.pivot_offset_across", offset_across),
            },
            Support::TiltingLine { offset_along } => SupportEcho::TiltingLine {
                pivot_offset_along: g.f("design.support.pivot_offset_along", offset_along),
            },
            Support::TaperedLand {
                taper_fraction,
                taper_depth,
            } => SupportEcho::TaperedLand {
                taper_extent: g.f("design.support.taper_extent", taper_fraction),
                taper_depth_m: g.f("design.support.taper_depth_m", taper_depth),
            },
            Support::Flat => SupportEcho::Flat,
        };
        let (speed, surface) = match d.speed {
            RunnerSpeed::Angular(w) => (
                SpeedEcho::Rotating {
                    angular_speed_rad_s: g.f("design.speed.angular_speed_rad_s", w),
                },
                w * d.outline.t_at(0.5),
            ),
            RunnerSpeed::Linear(u) => (
                SpeedEcho::Sliding {
                    speed_m_s: g.f("design.speed.speed_m_s", u),
                },
                u,
            ),
        };
        let duty = match d.duty {
            Duty::Load(w) => DutyEcho::TotalLoad {
                total_load_n: g.f("design.duty.total_load_n", w),
            },
            Duty::MinFilm(h) => DutyEcho::MinFilm {
                min_film_m: g.f("design.duty.min_film_m", h),
            },
        };
        let oil = &d.lubricant;
        let kind = if oil.is_isoviscous() {
            "constant"
        } else if oil.iso_grade().is_some() {
            "iso_grade"
        } else {
            "measured"
        };
        let (temperature_model, effective_temperature_k) = match d.temperature {
            FilmTemperature::Effective { temperature } => (
                "effective",
                Some(g.f("design.effective_temperature_k", temperature)),
            ),
            FilmTemperature::Bulk { .. } => ("bulk", None),
            FilmTemperature::Field(_) => ("field", None),
        };
        let thermal_settings = thermal_settings(g, &d.temperature);
        DesignEcho {
            title: title.to_string(),
            pad_count: d.pad_count,
            outline,
            support,
            crown_m: g.f("design.crown_m", d.crown),
            speed,
            mean_surface_speed_m_s: g.f("design.mean_surface_speed_m_s", surface),
            duty,
            pad_area_m2: g.f("design.pad_area_m2", d.outline.area()),
            oil: OilEcho {
                kind,
                iso_vg: oil.iso_grade().map(|v| v.grade_number()),
                viscosity_index: oil
                    .viscosity_index()
                    .map(|v| g.f("design.oil.viscosity_index", v)),
                nu40_m2_s: oil.nu40_m2_s().map(|v| g.f("design.oil.nu40_m2_s", v)),
                nu100_m2_s: oil.nu100_m2_s().map(|v| g.f("design.oil.nu100_m2_s", v)),
                density_15c_kg_m3: g.f("design.oil.density_15c_kg_m3", oil.density_15c_kg_m3()),
            },
            temperature_model,
            effective_temperature_k,
            thermal_settings,
        }
    }
}

/// The settings of a thermal model, checked finite (none for the effective temperature).
fn thermal_settings(g: &mut FiniteGuard, t: &FilmTemperature) -> Option<ThermalSettingsEcho> {
    const K: &str = "design.thermal_settings";
    let (supply, share, field) = match t {
        FilmTemperature::Effective { .. } => return None,
        FilmTemperature::Bulk {
            supply,
            rise_fraction,
        } => (supply, Some(*rise_fraction), None),
        FilmTemperature::Field(f) => (&f.supply, None, Some(f)),
    };
    let heat = field.map(|f| f.heat);
    Some(ThermalSettingsEcho {
        supply_temperature_k: g.f(&format!("{K}.supply_temperature_k"), supply.temperature),
        carry_over: g.f(&format!("{K}.carry_over"), supply.carry_over),
        supplied_flow_m3_s: supply
            .flow
            .map(|q| g.f(&format!("{K}.supplied_flow_m3_s"), q)),
        share_of_rise: share.map(|x| g.f(&format!("{K}.share_of_rise"), x)),
        runner_coefficient_w_per_m2_k: heat.map(|h| {
            g.f(
                &format!("{K}.runner_coefficient_w_per_m2_k"),
                h.runner_coefficient,
            )
        }),
        runner_temperature_k: heat
            .and_then(|h| h.runner_temperature)
            .map(|x| g.f(&format!("{K}.runner_temperature_k"), x)),
        pad_conduction: heat.and_then(|h| h.pad).map(|p| {
            let k = |name: &str| format!("{K}.pad_conduction.{name}");
            PadConductionEcho {
                thickness_m: g.f(&k("thickness_m"), p.thickness),
                conductivity_w_per_m_k: g.f(&k("conductivity_w_per_m_k"), p.conductivity),
                back_coefficient_w_per_m2_k: g
                    .f(&k("back_coefficient_w_per_m2_k"), p.back_coefficient),
                bath_temperature_k: g.f(&k("bath_temperature_k"), p.bath_temperature),
                expansion_per_k: g.f(&k("expansion_per_k"), p.expansion),
            }
        }),
        tolerance_k: g.f(
            &format!("{K}.tolerance_k"),
            field.map_or(DEFAULT_TEMPERATURE_TOLERANCE, |f| f.tolerance),
        ),
    })
}
