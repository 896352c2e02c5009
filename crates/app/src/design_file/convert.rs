//! Conversion between the design file (engineering units) and the solver's SI design, with
//! the checks that catch unit mistakes (a radius in metres, a percentage given as a fraction,
//! a temperature in kelvin) before they reach the solver.

use padwright_solver::grid::Grid;
use padwright_solver::lubricant::{ViscositySpec, m2_s_to_mm2_s, mm2_s_to_m2_s};
use padwright_solver::prelude::*;

use super::*;
use crate::units::*;

/// A value error for `field`.
pub(super) fn bad(
    field: &str,
    value: impl std::fmt::Display,
    reason: impl Into<String>,
) -> DesignError {
    DesignError::BadValue {
        field: field.into(),
        value: value.to_string(),
        reason: reason.into(),
    }
}

/// Splits "what (hint)" into the expectation and its parenthesised hint.
fn split_hint(what: &str) -> (&str, &str) {
    match what.find(" (") {
        Some(i) => (&what[..i], &what[i..]),
        None => (what, ""),
    }
}

/// Checks that a value is finite and inside `[lo, hi]`. `what` names the expected quantity with
/// its unit and may end in a parenthesised hint: "a radius in millimetres (below 1 looks like
/// metres)".
pub(super) fn in_range(
    field: &str,
    value: f64,
    lo: f64,
    hi: f64,
    what: &str,
) -> Result<f64, DesignError> {
    let (main, hint) = split_hint(what);
    if value.is_finite() && value >= lo && value <= hi {
        Ok(value)
    } else {
        Err(bad(
            field,
            value,
            format!("expected {main} from {lo} to {hi}{hint}"),
        ))
    }
}

/// Checks that a value is finite and strictly positive.
fn positive(field: &str, value: f64, what: &str) -> Result<f64, DesignError> {
    let (main, hint) = split_hint(what);
    if value.is_finite() && value > 0.0 {
        Ok(value)
    } else {
        Err(bad(
            field,
            value,
            format!("expected {main} greater than zero{hint}"),
        ))
    }
}

impl DesignFile {
    /// Converts to the solver's SI design and checks that it describes a bearing.
    pub fn to_design(&self) -> Result<BearingDesign, DesignError> {
        check_version(self.format_version)?;
        let outline = match self.outline {
            OutlineSpec::Sector {
                inner_radius_mm,
                outer_radius_mm,
                arc_deg,
            } => {
                let what = "a radius in millimetres (a value below 1 is probably in metres)";
                PadOutline::Sector {
                    inner_radius: mm_to_m(in_range(
                        "outline.inner_radius_mm",
                        inner_radius_mm,
                        1.0,
                        5000.0,
                        what,
                    )?),
                    outer_radius: mm_to_m(in_range(
                        "outline.outer_radius_mm",
                        outer_radius_mm,
                        1.0,
                        5000.0,
                        what,
                    )?),
                    arc: deg_to_rad(in_range(
                        "outline.arc_deg",
                        arc_deg,
                        1.0,
                        179.0,
                        "the pad arc in degrees (a value below 1 is probably in radians)",
                    )?),
                }
            }
            OutlineSpec::Rectangle {
                length_mm,
                width_mm,
            } => {
                let what = "a length in millimetres (a value below 1 is probably in metres)";
                PadOutline::Rectangle {
                    length: mm_to_m(in_range("outline.length_mm", length_mm, 1.0, 5000.0, what)?),
                    width: mm_to_m(in_range("outline.width_mm", width_mm, 1.0, 5000.0, what)?),
                }
            }
        };
        let pct = "a percentage (60 means 60 %, not 0.6)";
        // Pivot offsets: 5–95 % of the arc or width.
        let pivot = |field: &str, v: f64| in_range(field, v, 5.0, 95.0, pct).map(pct_to_fraction);
        let support = match self.support {
            SupportSpec::TiltingPoint {
                pivot_offset_along_pct,
                pivot_offset_across_pct,
            } => Support::TiltingPoint {
                offset_along: pivot("support.pivot_offset_along_pct", pivot_offset_along_pct)?,
                offset_across: pivot("support.pivot_offset_across_pct", pivot_offset_across_pct)?,
            },
            SupportSpec::TiltingLine {
                pivot_offset_along_pct,
            } => Support::TiltingLine {
                offset_along: pivot("support.pivot_offset_along_pct", pivot_offset_along_pct)?,
            },
            SupportSpec::TaperedLand {
                taper_extent_pct,
                taper_depth_um,
            } => Support::TaperedLand {
                taper_fraction: pct_to_fraction(in_range(
                    "support.taper_extent_pct",
                    taper_extent_pct,
                    5.0,
                    100.0,
                    pct,
                )?),
                taper_depth: um_to_m(in_range(
                    "support.taper_depth_um",
                    taper_depth_um,
                    0.0,
                    10_000.0,
                    "the taper depth in micrometres",
                )?),
            },
            SupportSpec::Flat => Support::Flat,
        };
        let crown = um_to_m(in_range(
            "crown_um",
            self.crown_um,
            0.0,
            1000.0,
            "the crown height in micrometres",
        )?);
        match (self.outline, self.runner) {
            (OutlineSpec::Sector { .. }, RunnerSpec::Sliding { .. }) => {
                return Err(bad(
                    "runner",
                    "Sliding",
                    "a Sector pad turns under a collar: give Rotating(speed_rpm: ...)",
                ));
            }
            (OutlineSpec::Rectangle { .. }, RunnerSpec::Rotating { .. }) => {
                return Err(bad(
                    "runner",
                    "Rotating",
                    "a Rectangle pad has a sliding runner: give Sliding(speed_m_s: ...)",
                ));
            }
            _ => {}
        }
        let speed = match self.runner {
            RunnerSpec::Rotating { speed_rpm } => RunnerSpeed::Angular(rpm_to_rad_s(positive(
                "runner.speed_rpm",
                speed_rpm,
                "the shaft speed in rev/min",
            )?)),
            RunnerSpec::Sliding { speed_m_s } => RunnerSpeed::Linear(positive(
                "runner.speed_m_s",
                speed_m_s,
                "the sliding speed in m/s",
            )?),
        };
        let duty = match self.duty {
            DutySpec::TotalLoad { total_load_kn } => Duty::Load(kn_to_n(positive(
                "duty.total_load_kn",
                total_load_kn,
                "the total axial load of all pads in kN",
            )?)),
            DutySpec::MinFilm { min_film_um } => Duty::MinFilm(um_to_m(positive(
                "duty.min_film_um",
                min_film_um,
                "the minimum film thickness in micrometres",
            )?)),
        };
        let temperature = self.film_temperature.to_film_temperature()?;
        let design = BearingDesign {
            pad_count: self.pad_count,
            outline,
            support,
            crown,
            speed,
            duty,
            lubricant: self.oil.to_lubricant()?,
            temperature,
            numerics: self.numerics.to_numerics()?,
        };
        design.validate().map_err(SolverError::from)?;
        Ok(design)
    }

    /// Writes a solver design as a design file (values rounded to 15 significant digits).
    pub fn from_design(design: &BearingDesign, title: &str) -> Result<Self, DesignError> {
        let outline = match design.outline {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                arc,
            } => OutlineSpec::Sector {
                inner_radius_mm: tidy(m_to_mm(inner_radius)),
                outer_radius_mm: tidy(m_to_mm(outer_radius)),
                arc_deg: tidy(rad_to_deg(arc)),
            },
            PadOutline::Rectangle { length, width } => OutlineSpec::Rectangle {
                length_mm: tidy(m_to_mm(length)),
                width_mm: tidy(m_to_mm(width)),
            },
        };
        let support = match design.support {
            Support::TiltingPoint {
                offset_along,
                offset_across,
            } => SupportSpec::TiltingPoint {
                pivot_offset_along_pct: tidy(fraction_to_pct(offset_along)),
                pivot_offset_across_pct: tidy(fraction_to_pct(offset_across)),
            },
            Support::TiltingLine { offset_along } => SupportSpec::TiltingLine {
                pivot_offset_along_pct: tidy(fraction_to_pct(offset_along)),
            },
            Support::TaperedLand {
                taper_fraction,
                taper_depth,
            } => SupportSpec::TaperedLand {
                taper_extent_pct: tidy(fraction_to_pct(taper_fraction)),
                taper_depth_um: tidy(m_to_um(taper_depth)),
            },
            Support::Flat => SupportSpec::Flat,
        };
        let runner = match (design.outline, design.speed) {
            (PadOutline::Sector { .. }, RunnerSpeed::Angular(w)) => RunnerSpec::Rotating {
                speed_rpm: tidy(rad_s_to_rpm(w)),
            },
            (PadOutline::Rectangle { .. }, RunnerSpeed::Linear(u)) => {
                RunnerSpec::Sliding { speed_m_s: tidy(u) }
            }
            _ => {
                return Err(DesignError::NotRepresentable(
                    "a sector pad needs a rotating runner and a rectangular pad a sliding one"
                        .into(),
                ));
            }
        };
        let duty = match design.duty {
            Duty::Load(w) => DutySpec::TotalLoad {
                total_load_kn: tidy(n_to_kn(w)),
            },
            Duty::MinFilm(h) => DutySpec::MinFilm {
                min_film_um: tidy(m_to_um(h)),
            },
        };
        let film_temperature = FilmTemperatureSpec::from_film_temperature(&design.temperature)?;
        Ok(DesignFile {
            format_version: FORMAT_VERSION,
            title: title.to_string(),
            pad_count: design.pad_count,
            outline,
            support,
            crown_um: tidy(m_to_um(design.crown)),
            runner,
            duty,
            oil: OilSpec::from_lubricant(&design.lubricant),
            film_temperature,
            numerics: NumericsSpec::from_numerics(&design.numerics),
        })
    }
}

impl OilSpec {
    /// Builds the solver's lubricant.
    pub fn to_lubricant(&self) -> Result<Lubricant, DesignError> {
        let spec = match self.viscosity {
            ViscosityInput::IsoGrade {
                iso_vg,
                viscosity_index,
            } => ViscositySpec::IsoGrade {
                grade: IsoVg::from_grade_number(iso_vg)?,
                viscosity_index,
            },
            ViscosityInput::Measured {
                nu40_mm2_s,
                nu100_mm2_s,
            } => ViscositySpec::Measured {
                nu40_m2_s: mm2_s_to_m2_s(nu40_mm2_s),
                nu100_m2_s: mm2_s_to_m2_s(nu100_mm2_s),
            },
            ViscosityInput::Constant {
                dynamic_viscosity_mpa_s,
            } => ViscositySpec::Isoviscous {
                dynamic_viscosity_pa_s: mpa_s_to_pa_s(dynamic_viscosity_mpa_s),
            },
        };
        let mut oil = Lubricant::from_spec(spec)?
            .with_density_15c_kg_m3(self.density_15c_kg_m3)?
            .with_thermal_expansion_per_k(self.thermal_expansion_per_k)?
            .with_specific_heat_j_per_kg_k(self.specific_heat_j_per_kg_k)?
            .with_thermal_conductivity_w_per_m_k(self.thermal_conductivity_w_per_m_k)?;
        let lowest = self.lowest_valid_temperature_c;
        if lowest != DEFAULT_LOWEST_VALID_TEMPERATURE_C {
            if oil.is_isoviscous() {
                return Err(bad(
                    "oil.lowest_valid_temperature_c",
                    lowest,
                    "does not apply to a constant-viscosity oil; leave it out",
                ));
            }
            let lowest = in_range(
                "oil.lowest_valid_temperature_c",
                lowest,
                -100.0,
                200.0,
                "a temperature in °C",
            )?;
            oil = oil.with_min_valid_temperature_k(c_to_k(lowest))?;
        }
        Ok(oil)
    }

    /// The file form of a solver lubricant.
    pub fn from_lubricant(oil: &Lubricant) -> Self {
        let viscosity = match oil.spec() {
            ViscositySpec::IsoGrade {
                grade,
                viscosity_index,
            } => ViscosityInput::IsoGrade {
                iso_vg: grade.grade_number(),
                viscosity_index: tidy(viscosity_index),
            },
            ViscositySpec::Measured {
                nu40_m2_s,
                nu100_m2_s,
            } => ViscosityInput::Measured {
                nu40_mm2_s: tidy(m2_s_to_mm2_s(nu40_m2_s)),
                nu100_mm2_s: tidy(m2_s_to_mm2_s(nu100_m2_s)),
            },
            ViscositySpec::Isoviscous {
                dynamic_viscosity_pa_s,
            } => ViscosityInput::Constant {
                dynamic_viscosity_mpa_s: tidy(pa_s_to_mpa_s(dynamic_viscosity_pa_s)),
            },
        };
        let lowest_valid_temperature_c = oil
            .valid_temperature_range_k()
            .map_or(DEFAULT_LOWEST_VALID_TEMPERATURE_C, |r| {
                tidy(k_to_c(r.min_k))
            });
        OilSpec {
            viscosity,
            density_15c_kg_m3: tidy(oil.density_15c_kg_m3()),
            thermal_expansion_per_k: tidy(oil.thermal_expansion_per_k()),
            specific_heat_j_per_kg_k: tidy(oil.specific_heat_j_per_kg_k()),
            thermal_conductivity_w_per_m_k: tidy(oil.thermal_conductivity_w_per_m_k()),
            lowest_valid_temperature_c,
        }
    }
}

impl NumericsSpec {
    /// Builds the solver's numerical settings.
    pub fn to_numerics(&self) -> Result<Numerics, DesignError> {
        let mut n = Numerics {
            nodes_along: self.nodes_along,
            nodes_across: self.nodes_across,
            ..Numerics::default()
        };
        let r = &mut n.reynolds;
        r.tolerance = positive(
            "numerics.pressure_tolerance",
            self.pressure_tolerance,
            "a relative residual such as 1e-9",
        )?;
        r.max_cycles = self.max_pressure_cycles;
        r.cavitation = self.cavitation;
        r.cavitation_pressure = kpa_to_pa(in_range(
            "numerics.cavitation_pressure_kpa",
            self.cavitation_pressure_kpa,
            -101.325,
            0.0,
            "a gauge pressure in kPa from −101.325 (a perfect vacuum) to 0: the pad's edges \
             are at ambient pressure, so the film cannot cavitate above it",
        )?);
        r.cycle.pre_sweeps = self.smoothing_sweeps_before;
        r.cycle.post_sweeps = self.smoothing_sweeps_after;
        r.cycle.omega = in_range(
            "numerics.relaxation_factor",
            self.relaxation_factor,
            0.1,
            1.95,
            "a relaxation factor",
        )?;
        r.cycle.gamma = self.coarse_grid_visits;
        r.cycle.lines = self.line_smoothing;
        r.cycle.mixed_precision = self.single_precision_corrections;
        r.cycle.adaptive_omega = self.adaptive_relaxation;
        r.cycle.accelerate_projected = self.projected_acceleration;
        let e = &mut n.equilibrium;
        e.min_film = um_to_m(positive(
            "numerics.smallest_film_um",
            self.smallest_film_um,
            "the smallest allowed film in micrometres",
        )?);
        e.tolerance = positive(
            "numerics.equilibrium_tolerance",
            self.equilibrium_tolerance,
            "a relative tolerance such as 1e-6",
        )?;
        e.max_iterations = self.max_equilibrium_iterations;
        for (field, v) in [
            ("numerics.max_pressure_cycles", self.max_pressure_cycles),
            (
                "numerics.max_equilibrium_iterations",
                self.max_equilibrium_iterations,
            ),
            ("numerics.coarse_grid_visits", self.coarse_grid_visits),
        ] {
            if v == 0 {
                return Err(bad(field, v, "must be at least 1"));
            }
        }
        if self.smoothing_sweeps_before + self.smoothing_sweeps_after == 0 {
            return Err(bad(
                "numerics.smoothing_sweeps_before",
                0,
                "at least one smoothing sweep (before or after) is needed",
            ));
        }
        // The grid's own check gives the allowed node counts.
        Grid::new(self.nodes_along, self.nodes_across, None).map_err(SolverError::from)?;
        Ok(n)
    }

    /// The file form of the solver's numerical settings.
    pub fn from_numerics(n: &Numerics) -> Self {
        NumericsSpec {
            nodes_along: n.nodes_along,
            nodes_across: n.nodes_across,
            pressure_tolerance: tidy(n.reynolds.tolerance),
            max_pressure_cycles: n.reynolds.max_cycles,
            cavitation: n.reynolds.cavitation,
            cavitation_pressure_kpa: tidy(pa_to_kpa(n.reynolds.cavitation_pressure)),
            smallest_film_um: tidy(m_to_um(n.equilibrium.min_film)),
            equilibrium_tolerance: tidy(n.equilibrium.tolerance),
            max_equilibrium_iterations: n.equilibrium.max_iterations,
            smoothing_sweeps_before: n.reynolds.cycle.pre_sweeps,
            smoothing_sweeps_after: n.reynolds.cycle.post_sweeps,
            relaxation_factor: tidy(n.reynolds.cycle.omega),
            coarse_grid_visits: n.reynolds.cycle.gamma,
            line_smoothing: n.reynolds.cycle.lines,
            single_precision_corrections: n.reynolds.cycle.mixed_precision,
            adaptive_relaxation: n.reynolds.cycle.adaptive_omega,
            projected_acceleration: n.reynolds.cycle.accelerate_projected,
        }
    }
}
