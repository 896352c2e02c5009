//! A whole bearing at one operating point: the design in SI units and the analysis that turns
//! it into results.
//!
//! The bearing has `pad_count` identical pads sharing the axial load equally. One pad is solved
//! (its equilibrium for the support type) and the totals follow by multiplication.

use crate::equilibrium::{self, Equilibrium, EquilibriumSettings, FilmResponse};
use crate::error::{InputError, SolverError};
use crate::film::{FilmModel, FilmState, Support};
use crate::geometry::{PadFrame, PadOutline, RunnerSpeed, positive};
use crate::grid::Grid;
use crate::lubricant::{Lubricant, kelvin_to_celsius};
use crate::pad::{self, Flows, PadIntegrals};
use crate::results::{
    BearingResult, PadAttitude, PadFields, PadResult, SolutionStats, ViscosityBasis,
};
use crate::reynolds::{ReynoldsSettings, ReynoldsSolver, Start};

/// Default grid nodes along the motion (see the convergence study in the README).
pub const DEFAULT_NODES_ALONG: usize = 65;
/// Default grid nodes across the motion.
pub const DEFAULT_NODES_ACROSS: usize = 65;

/// Numerical settings of an analysis.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Numerics {
    /// Grid nodes along the motion.
    pub nodes_along: usize,
    /// Grid nodes across the motion.
    pub nodes_across: usize,
    /// Pressure solve settings.
    pub reynolds: ReynoldsSettings,
    /// Equilibrium settings (including the smallest allowed film).
    pub equilibrium: EquilibriumSettings,
}

impl Default for Numerics {
    fn default() -> Self {
        Numerics {
            nodes_along: DEFAULT_NODES_ALONG,
            nodes_across: DEFAULT_NODES_ACROSS,
            reynolds: ReynoldsSettings::default(),
            equilibrium: EquilibriumSettings::default(),
        }
    }
}

/// Where the film temperature comes from.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FilmTemperature {
    /// One effective film temperature set by the user, K. The viscosity is uniform over the pad.
    Effective {
        /// Effective film temperature, K.
        temperature: f64,
    },
}

/// What the pad must do.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Duty {
    /// Carry a total axial load, N: the analysis finds the film.
    Load(f64),
    /// Run at a given minimum film, m (fixed pads): the analysis finds the load.
    MinFilm(f64),
}

/// A bearing design at one operating point, in SI units.
#[derive(Clone, Debug, PartialEq)]
pub struct BearingDesign {
    /// Number of pads.
    pub pad_count: usize,
    /// Pad outline.
    pub outline: PadOutline,
    /// Pad support and shape.
    pub support: Support,
    /// Mechanical crown of the pad face, m (height of the centre above the corners).
    pub crown: f64,
    /// Runner speed.
    pub speed: RunnerSpeed,
    /// What the bearing must do.
    pub duty: Duty,
    /// The oil.
    pub lubricant: Lubricant,
    /// Film temperature model.
    pub temperature: FilmTemperature,
    /// Numerical settings.
    pub numerics: Numerics,
}

impl BearingDesign {
    /// Checks the design for values that cannot describe a bearing.
    pub fn validate(&self) -> Result<(), InputError> {
        if self.pad_count == 0 || self.pad_count > 64 {
            return Err(InputError::OutOfRange {
                what: "number of pads".into(),
                value: self.pad_count as f64,
                lo: 1.0,
                hi: 64.0,
            });
        }
        self.outline.validate()?;
        self.support.validate()?;
        if let PadOutline::Sector { arc, .. } = self.outline
            && self.pad_count as f64 * arc >= 2.0 * std::f64::consts::PI
        {
            return Err(InputError::Inconsistent(format!(
                "{} pads of {:.1}° do not fit on the circle (pad count × arc must stay below \
                 360°)",
                self.pad_count,
                arc.to_degrees()
            )));
        }
        crate::geometry::within("crown", self.crown, 0.0, 1e-3)?;
        match self.duty {
            Duty::Load(w) => positive("axial load", w)?,
            Duty::MinFilm(h) => {
                positive("minimum film", h)?;
                if self.support.is_tilting() {
                    return Err(InputError::Inconsistent(
                        "a tilting-pad bearing is analysed at a given load, not at a given film"
                            .into(),
                    ));
                }
            }
        }
        match self.temperature {
            FilmTemperature::Effective { temperature } => {
                positive("effective film temperature", temperature)?
            }
        }
        positive("smallest allowed film", self.numerics.equilibrium.min_film)?;
        Ok(())
    }
}

/// A pad with one viscosity value over its whole face: the isothermal response.
#[derive(Clone, Debug)]
pub struct IsothermalPad {
    /// The pressure solver.
    pub solver: ReynoldsSolver,
    mu: Vec<f64>,
    isoviscous: bool,
}

impl IsothermalPad {
    /// A pad with uniform viscosity `mu` (Pa·s).
    pub fn new(solver: ReynoldsSolver, mu: f64) -> Self {
        let n = solver.grid().len();
        IsothermalPad {
            solver,
            mu: vec![mu; n],
            isoviscous: true,
        }
    }

    /// The nodal viscosity field, Pa·s.
    pub fn viscosity(&self) -> &[f64] {
        &self.mu
    }
}

impl FilmResponse for IsothermalPad {
    fn respond(&mut self, state: &FilmState, start: Start) -> Result<PadIntegrals, SolverError> {
        pad::evaluate(&mut self.solver, state, &self.mu, start)
    }

    fn scales_inverse_square(&self) -> bool {
        self.isoviscous
    }

    fn film_model(&self) -> &FilmModel {
        self.solver.film_model()
    }

    fn min_film(&self, state: &FilmState) -> f64 {
        self.solver.node_basis().min_thickness(state)
    }
}

/// Builds the pressure solver for a design.
pub fn pad_solver(design: &BearingDesign) -> Result<ReynoldsSolver, SolverError> {
    let frame = PadFrame::new(design.outline, design.speed)?;
    let film = FilmModel::new(design.outline, design.support)?;
    let grid = Grid::new(
        design.numerics.nodes_along,
        design.numerics.nodes_across,
        design.support.breakpoint(),
    )?;
    Ok(ReynoldsSolver::new(
        frame,
        film,
        grid,
        design.numerics.reynolds,
    ))
}

/// Analyses a bearing design at its operating point.
pub fn analyze(design: &BearingDesign) -> Result<BearingResult, SolverError> {
    design.validate()?;
    let FilmTemperature::Effective { temperature } = design.temperature;
    let lub = &design.lubricant;
    let mu = lub
        .dynamic_viscosity_pa_s(temperature)
        .map_err(lubricant_error)?;
    let rho = lub.density_kg_m3(temperature).map_err(lubricant_error)?;
    let mut notes = Vec::new();
    let viscosity = if lub.is_isoviscous() {
        notes.push(
            "constant viscosity (isoviscous oil): no temperature dependence is modelled".into(),
        );
        ViscosityBasis {
            temperature: None,
            dynamic_viscosity: mu,
            density: rho,
            note: "isoviscous oil".into(),
        }
    } else {
        if let Err(e) = lub.check_temperature_k(temperature) {
            notes.push(format!("warning: {e}"));
        }
        notes.push(format!(
            "viscosity taken at the effective film temperature of {:.1} °C set in the design \
             (no thermal model: the film is treated as isothermal)",
            kelvin_to_celsius(temperature)
        ));
        ViscosityBasis {
            temperature: Some(temperature),
            dynamic_viscosity: mu,
            density: rho,
            note: "effective film temperature set by the user".into(),
        }
    };
    let solver = pad_solver(design)?;
    let mut resp = IsothermalPad::new(solver, mu);
    let pads = design.pad_count as f64;
    let eq = solve_pad(&mut resp, design)?;
    let res = assemble_result(design, &resp.solver, &eq, viscosity, notes);
    debug_assert!(res.load > 0.0 || pads == 0.0);
    Ok(res)
}

/// The pad equilibrium for the design's support and duty.
pub fn solve_pad<R: FilmResponse>(
    resp: &mut R,
    design: &BearingDesign,
) -> Result<Equilibrium, SolverError> {
    let settings = &design.numerics.equilibrium;
    let pads = design.pad_count as f64;
    match (design.support.is_tilting(), design.duty) {
        (true, Duty::Load(w)) => equilibrium::tilting_pad(resp, w / pads, design.crown, settings),
        (false, Duty::Load(w)) => {
            equilibrium::fixed_pad_at_load(resp, w / pads, design.crown, settings)
        }
        (false, Duty::MinFilm(h)) => equilibrium::fixed_pad_at_film(resp, h, design.crown),
        (true, Duty::MinFilm(_)) => Err(SolverError::Input(InputError::Inconsistent(
            "a tilting-pad bearing is analysed at a given load".into(),
        ))),
    }
}

fn lubricant_error(e: crate::lubricant::LubricantError) -> SolverError {
    SolverError::Input(InputError::Inconsistent(e.to_string()))
}

/// Collects the per-pad and bearing results from an equilibrium.
pub fn assemble_result(
    design: &BearingDesign,
    solver: &ReynoldsSolver,
    eq: &Equilibrium,
    viscosity: ViscosityBasis,
    mut notes: Vec<String>,
) -> BearingResult {
    let i = &eq.integrals;
    let n = design.pad_count as f64;
    let area = design.outline.area();
    let attitude = design.support.is_tilting().then_some(PadAttitude {
        pivot_film: eq.state.reference,
        pitch: eq.state.pitch,
        roll: eq.state.roll,
    });
    let pad = PadResult {
        load: i.load,
        min_film: i.min_film,
        min_film_at: i.min_film_at,
        max_film: i.max_film,
        attitude,
        crown: eq.state.crown,
        peak_pressure: i.peak_pressure,
        peak_at: i.peak_at,
        mean_pressure: i.load / area,
        centre_of_pressure: (i.centre_along, i.centre_across),
        friction_force: i.friction_force,
        friction_torque: i.friction_torque,
        power_loss: i.power_loss,
        flows: i.flows,
        stiffness: eq.stiffness,
        cavitated_fraction: i.cavitated_fraction,
    };
    if i.cavitated_fraction > 0.0 {
        notes.push(format!(
            "{:.0} % of the pad area is cavitated (Swift–Stieber condition); flows there are \
             full-film estimates",
            100.0 * i.cavitated_fraction
        ));
    }
    let g = solver.grid();
    let scale = |f: &Flows| Flows {
        leading_in: f.leading_in * n,
        trailing_out: f.trailing_out * n,
        inner_out: f.inner_out * n,
        outer_out: f.outer_out * n,
    };
    BearingResult {
        pad_count: design.pad_count,
        load: i.load * n,
        power_loss: i.power_loss * n,
        friction_torque: i.friction_torque * n,
        stiffness: eq.stiffness * n,
        flows: scale(&i.flows),
        mean_pressure: i.load / area,
        viscosity,
        stats: SolutionStats {
            nodes_along: g.nodes_along(),
            nodes_across: g.nodes_across(),
            pressure_residual: i.solve.relative_residual,
            pressure_cycles: i.solve.cycles,
            equilibrium_iterations: eq.iterations,
            pressure_solves: eq.pressure_solves,
            load_error: eq.load_error,
            moment_error: eq.moment_error,
        },
        fields: PadFields {
            xi: g.xi.clone(),
            eta: g.eta.clone(),
            pressure: solver.pressure().to_vec(),
            film: solver.film().to_vec(),
        },
        pad,
        notes,
    }
}
