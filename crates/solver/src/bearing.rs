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
    BearingResult, CoarseStart, PadAttitude, PadFields, PadResult, SolutionStats, ThermalModelKind,
    ThermalResult, ViscosityBasis,
};
use crate::reynolds::{ReynoldsSettings, ReynoldsSolver, Start};
use crate::thermal::energy::EnergyBalance;
use crate::thermal::{BulkPad, FieldPad, FieldSettings, LAMINAR_REYNOLDS_LIMIT, OilSupply};

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
    /// Quick bulk model: inlet temperature plus a fraction of the adiabatic rise, one viscosity.
    Bulk {
        /// Oil supply and carry-over.
        supply: OilSupply,
        /// Fraction of the adiabatic rise `P/(ρ c Q_in)` added to the inlet temperature.
        rise_fraction: f64,
    },
    /// Film-temperature field from the energy equation, viscosity varying over the pad.
    Field(FieldSettings),
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
        crate::error::within_um("the crown", self.crown, 0.0, 1e-3)?;
        // The runner speed must suit the outline, and the grid must be a valid size.
        PadFrame::new(self.outline, self.speed)?;
        Grid::new(self.numerics.nodes_along, self.numerics.nodes_across, None)?;
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
        match &self.temperature {
            FilmTemperature::Effective { temperature } => {
                positive("effective film temperature", *temperature)?
            }
            FilmTemperature::Bulk {
                supply,
                rise_fraction,
            } => {
                supply.validate()?;
                crate::geometry::within(
                    "fraction of the temperature rise",
                    *rise_fraction,
                    0.0,
                    1.0,
                )?;
            }
            FilmTemperature::Field(f) => f.validate()?,
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

    /// Sets a new uniform viscosity, Pa·s. The pad then no longer counts as isoviscous for
    /// the equilibrium (its viscosity may change between film states).
    pub fn set_viscosity(&mut self, mu: f64) {
        self.mu.fill(mu);
        self.isoviscous = false;
    }
}

impl FilmResponse for IsothermalPad {
    fn respond(&mut self, state: &FilmState, start: Start) -> Result<PadIntegrals, SolverError> {
        pad::evaluate(&mut self.solver, state, &self.mu, start)
    }

    fn relax_pressure_tolerance(&mut self, tol: Option<f64>) {
        self.solver.relax_tolerance(tol);
    }

    fn full_pressure_tolerance(&self) -> f64 {
        self.solver.settings.tolerance
    }

    fn respond_forces(
        &mut self,
        state: &FilmState,
        start: Start,
    ) -> Result<crate::equilibrium::Forces, SolverError> {
        pad::evaluate_forces(&mut self.solver, state, &self.mu, start)
    }

    fn complete(&mut self) -> Option<PadIntegrals> {
        pad::integrate_last(&self.solver, &self.mu)
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

/// Smallest number of nodes per direction of the coarse grid that starts a thermal pad's
/// equilibrium under a load (see [`solve_nested`]). On coarser grids the temperature field
/// differs from the finer grid's by so much that the rounds saved are spent again on the
/// finer grid (measured: a 17 × 17 start for the 65 × 65 default grid gained nothing).
const COARSE_START_MIN_NODES: usize = 33;

/// A coarse-grid verdict of "no equilibrium" is taken as this grid's when the centre of
/// pressure stays at least this far (fraction of the pad length) aft of the pivot: the
/// centre of pressure of the grid with every other node lies within a few thousandths of the
/// finer grid's (second-order discretisation; common practice, no source).
const CLEARLY_SHORT_OF_PIVOT: f64 = 0.02;

/// A thermal response that can take over the state of the same pad solved on another grid.
trait NestedStart: FilmResponse + Sized {
    /// The response of `design` (whose temperature model is this response's) on `solver`.
    fn for_design(design: &BearingDesign, solver: ReynoldsSolver) -> Result<Self, SolverError>;
    /// Takes over the thermal state of `coarse`.
    fn start_from(&mut self, coarse: &Self) -> Result<(), SolverError>;
    /// The grid the response solves on.
    fn grid(&self) -> &Grid;
    /// Renewals of the thermal state so far.
    fn renewals(&self) -> usize;
}

impl NestedStart for FieldPad {
    fn for_design(design: &BearingDesign, solver: ReynoldsSolver) -> Result<Self, SolverError> {
        let FilmTemperature::Field(settings) = design.temperature else {
            return Err(SolverError::Input(InputError::Inconsistent(
                "the film-temperature field response needs the field model".into(),
            )));
        };
        FieldPad::new(solver, design.lubricant.clone(), settings)
    }
    fn start_from(&mut self, coarse: &Self) -> Result<(), SolverError> {
        FieldPad::start_from(self, coarse)
    }
    fn grid(&self) -> &Grid {
        self.solver.grid()
    }
    fn renewals(&self) -> usize {
        self.thermal().iterations
    }
}

impl NestedStart for BulkPad {
    fn for_design(design: &BearingDesign, solver: ReynoldsSolver) -> Result<Self, SolverError> {
        let FilmTemperature::Bulk {
            supply,
            rise_fraction,
        } = design.temperature
        else {
            return Err(SolverError::Input(InputError::Inconsistent(
                "the bulk-temperature response needs the bulk model".into(),
            )));
        };
        BulkPad::new(solver, design.lubricant.clone(), supply, rise_fraction)
    }
    fn start_from(&mut self, coarse: &Self) -> Result<(), SolverError> {
        BulkPad::start_from(self, coarse)
    }
    fn grid(&self) -> &Grid {
        self.pad.solver.grid()
    }
    fn renewals(&self) -> usize {
        BulkPad::renewals(self)
    }
}

/// The thermal pad of `design` on `solver` in equilibrium, and the coarse solution it started
/// from, if any. A pad under a given load (tilting or fixed) is first solved on the grid with
/// every other node (itself started the same way while the grid has at least
/// [`COARSE_START_MIN_NODES`] per direction), and the equilibrium on this grid starts from that
/// solution's temperatures and film (with the Jacobian, for a tilting pad): nested iteration.
/// The coupling rounds far from the answer, which take the most pressure solves and
/// temperature renewals, run at a quarter of the cost. The answer is this grid's, to the same
/// tolerances; only the path to it changes. A coarse solution that fails is ignored, and so
/// is a start that does not converge: the search then begins afresh on this grid.
fn solve_nested<P: NestedStart>(
    design: &BearingDesign,
    solver: ReynoldsSolver,
) -> Result<(P, Equilibrium, Option<CoarseStart>), SolverError> {
    let mut resp = P::for_design(design, solver)?;
    let g = resp.grid();
    let halve = |n: usize| (n - 1).is_multiple_of(2).then_some((n - 1) / 2 + 1);
    let coarse = match (design.duty, halve(g.nodes_along()), halve(g.nodes_across())) {
        (Duty::Load(w), Some(na), Some(nc))
            if na >= COARSE_START_MIN_NODES && nc >= COARSE_START_MIN_NODES =>
        {
            let mut d = design.clone();
            d.numerics.nodes_along = na;
            d.numerics.nodes_across = nc;
            match pad_solver(&d).and_then(|s| solve_nested::<P>(&d, s)) {
                Ok(c) => Some((c, w)),
                // Where the centre of pressure stays clearly aft of the pivot on the coarse
                // grid it does so on this one: the discretisation moves it far less.
                Err(
                    e @ SolverError::NoEquilibrium {
                        short_of_pivot: Some(s),
                        ..
                    },
                ) if s >= CLEARLY_SHORT_OF_PIVOT => return Err(e),
                Err(_) => None,
            }
        }
        _ => None,
    };
    let Some(((coarse_pad, coarse_eq, before), w)) = coarse else {
        let eq = solve_pad(&mut resp, design)?;
        return Ok((resp, eq, None));
    };
    resp.start_from(&coarse_pad)?;
    let (load, settings_eq) = (w / design.pad_count as f64, &design.numerics.equilibrium);
    let started = if design.support.is_tilting() {
        let start = Some(coarse_eq.restart());
        equilibrium::tilting_pad_from(&mut resp, load, design.crown, settings_eq, start)
    } else {
        let start = Some(coarse_pad.min_film(&coarse_eq.state));
        equilibrium::fixed_pad_at_load_from(&mut resp, load, design.crown, settings_eq, start)
    };
    let eq = match started {
        Ok(eq) => eq,
        Err(SolverError::NotConverged { .. }) => {
            let mut resp = P::for_design(design, pad_solver(design)?)?;
            let eq = solve_pad(&mut resp, design)?;
            return Ok((resp, eq, None));
        }
        Err(e) => return Err(e),
    };
    let start = CoarseStart {
        nodes_along: coarse_pad.grid().nodes_along(),
        nodes_across: coarse_pad.grid().nodes_across(),
        pressure_solves: coarse_eq.pressure_solves + before.map_or(0, |b| b.pressure_solves),
        temperature_renewals: coarse_pad.renewals() + before.map_or(0, |b| b.temperature_renewals),
    };
    Ok((resp, eq, Some(start)))
}

/// Analyses a bearing design at its operating point.
pub fn analyze(design: &BearingDesign) -> Result<BearingResult, SolverError> {
    design.validate()?;
    let lub = &design.lubricant;
    let solver = pad_solver(design)?;
    let mut notes = Vec::new();
    match design.temperature {
        FilmTemperature::Effective { temperature } => {
            let mu = lub
                .dynamic_viscosity_pa_s(temperature)
                .map_err(lubricant_error)?;
            let rho = lub.density_kg_m3(temperature).map_err(lubricant_error)?;
            let viscosity = if lub.is_isoviscous() {
                notes.push(
                    "constant viscosity (isoviscous oil): no temperature dependence is modelled"
                        .into(),
                );
                ViscosityBasis {
                    temperature: None,
                    dynamic_viscosity: mu,
                    density: rho,
                    note: "isoviscous oil".into(),
                }
            } else {
                check_range(lub, &[temperature], &mut notes);
                notes.push(format!(
                    "viscosity taken at the effective film temperature of {:.1} °C set in the \
                     design (no thermal model: the film is treated as isothermal)",
                    kelvin_to_celsius(temperature)
                ));
                ViscosityBasis {
                    temperature: Some(temperature),
                    dynamic_viscosity: mu,
                    density: rho,
                    note: "effective film temperature set by the user".into(),
                }
            };
            let mut resp = IsothermalPad::new(solver, mu);
            let eq = solve_pad(&mut resp, design)?;
            let mu_field = resp.viscosity().to_vec();
            Ok(assemble_result(
                design,
                &resp.solver,
                &eq,
                viscosity,
                &mu_field,
                None,
                notes,
            ))
        }
        FilmTemperature::Bulk {
            supply,
            rise_fraction,
        } => {
            let (resp, eq, coarse_start) = solve_nested::<BulkPad>(design, solver)?;
            // Report the inlet and rise of the final solution (the viscosity's temperature
            // agrees with them to the coupling tolerance).
            let (t_in, rise) = resp.inlet_and_rise(&eq.integrals);
            let t_eff = resp.effective_temperature;
            let mu = lub.dynamic_viscosity_pa_s(t_eff).map_err(lubricant_error)?;
            let rho = lub.density_kg_m3(t_eff).map_err(lubricant_error)?;
            check_range(lub, &[t_in, t_in + rise], &mut notes);
            notes.push(format!(
                "bulk thermal model: viscosity at the inlet temperature plus {:.0} % of the \
                 adiabatic rise, uniform over the pad",
                100.0 * rise_fraction
            ));
            let viscosity = ViscosityBasis {
                temperature: Some(t_eff),
                dynamic_viscosity: mu,
                density: rho,
                note: "bulk model: inlet temperature plus a fraction of the adiabatic rise".into(),
            };
            let i = &eq.integrals;
            let n = resp.pad.solver.grid().len();
            let thermal = ThermalResult {
                model: ThermalModelKind::Bulk,
                supply_temperature: supply.temperature,
                inlet_temperature: t_in,
                outlet_temperature: t_in + rise,
                mean_outflow_temperature: t_in + rise,
                max_pad_temperature: t_in + rise,
                max_pad_temperature_at: (1.0, 1.0),
                sensor_temperature: t_in + 0.75 * rise,
                effective_temperature: t_eff,
                effective_viscosity: mu,
                adiabatic_rise: rise,
                thermal_crown: 0.0,
                through_thickness_difference: 0.0,
                energy: EnergyBalance {
                    dissipated: i.power_loss,
                    carried_by_oil: i.power_loss,
                    ..Default::default()
                },
                iterations: 0,
                fresh_oil_flow: supply.fresh_flow(i.flows.leading_in, i.flows.trailing_out)
                    * design.pad_count as f64,
                temperature: vec![t_eff; n],
            };
            check_supply(&supply, thermal.fresh_oil_flow, &mut notes);
            let mu_field = resp.pad.viscosity().to_vec();
            let mut result = assemble_result(
                design,
                &resp.pad.solver,
                &eq,
                viscosity,
                &mu_field,
                Some(thermal),
                notes,
            );
            result.stats.coarse_start = coarse_start;
            Ok(result)
        }
        FilmTemperature::Field(settings) => {
            let (mut resp, eq, coarse_start) = solve_nested::<FieldPad>(design, solver)?;
            resp.refresh_report();
            let th = resp.thermal().clone();
            let g = resp.solver.grid();
            let area = &resp.energy.area;
            let a_tot: f64 = area.iter().sum();
            let t_mean = th
                .temperature
                .iter()
                .zip(area)
                .map(|(t, a)| t * a)
                .sum::<f64>()
                / a_tot;
            let mu_eff = lub
                .dynamic_viscosity_pa_s(t_mean)
                .map_err(lubricant_error)?;
            let rho = lub.density_kg_m3(t_mean).map_err(lubricant_error)?;
            let (kmax, tmax) = th.temperature.iter().copied().enumerate().fold(
                (0, f64::NEG_INFINITY),
                |a, (k, t)| if t > a.1 { (k, t) } else { a },
            );
            let at = (g.xi[kmax % (g.nx + 1)], g.eta[kmax / (g.nx + 1)]);
            let sensor = g.interpolate(&th.temperature, 0.75, 0.75);
            let tmin = th.temperature.iter().copied().fold(f64::INFINITY, f64::min);
            check_range(lub, &[tmin, tmax], &mut notes);
            notes.push(format!(
                "film temperature from the energy equation ({}); viscosity varies over the pad",
                match settings.heat.pad {
                    Some(_) => "heat conducted through the pad to the bath, thermal crown included",
                    None if settings.heat.runner_coefficient > 0.0 => "heat to the runner",
                    None => "adiabatic film",
                }
            ));
            let i = &eq.integrals;
            let q_in = i.flows.leading_in;
            let rise = if q_in > 0.0 {
                i.power_loss / (resp.rho_c() * q_in)
            } else {
                0.0
            };
            let thermal = ThermalResult {
                model: ThermalModelKind::Field,
                supply_temperature: settings.supply.temperature,
                inlet_temperature: th.inlet,
                outlet_temperature: th.outlet,
                mean_outflow_temperature: th.mean_outflow,
                max_pad_temperature: tmax,
                max_pad_temperature_at: at,
                sensor_temperature: sensor,
                effective_temperature: t_mean,
                effective_viscosity: mu_eff,
                adiabatic_rise: rise,
                thermal_crown: th.thermal_crown,
                through_thickness_difference: th.through_thickness,
                energy: th.balance,
                iterations: th.iterations,
                fresh_oil_flow: settings
                    .supply
                    .fresh_flow(i.flows.leading_in, i.flows.trailing_out)
                    * design.pad_count as f64,
                temperature: th.temperature.clone(),
            };
            check_supply(&settings.supply, thermal.fresh_oil_flow, &mut notes);
            let viscosity = ViscosityBasis {
                temperature: Some(t_mean),
                dynamic_viscosity: mu_eff,
                density: rho,
                note: "film temperature field; effective values at the area-mean film \
                       temperature"
                    .into(),
            };
            let mu_field = resp.viscosity().to_vec();
            let mut result = assemble_result(
                design,
                &resp.solver,
                &eq,
                viscosity,
                &mu_field,
                Some(thermal),
                notes,
            );
            result.stats.coarse_start = coarse_start;
            Ok(result)
        }
    }
}

fn check_range(lub: &Lubricant, temps: &[f64], notes: &mut Vec<String>) {
    if let Some(r) = lub.valid_temperature_range_k() {
        for &t in temps {
            if !r.contains(t) {
                notes.push(format!(
                    "warning: film temperature {:.1} °C lies outside the range in which the \
                     oil's viscosity law holds ({:.0} to {:.0} °C)",
                    kelvin_to_celsius(t),
                    kelvin_to_celsius(r.min_k),
                    kelvin_to_celsius(r.max_k)
                ));
                return;
            }
        }
    }
}

fn check_supply(supply: &OilSupply, fresh: f64, notes: &mut Vec<String>) {
    if let Some(q) = supply.flow
        && fresh > q
    {
        notes.push(format!(
            "warning: the pads draw {:.1} L/min of fresh oil but only {:.1} L/min is supplied: \
             risk of oil starvation (hotter inlet than computed)",
            fresh * 6e4,
            q * 6e4
        ));
    }
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
    e.into()
}

/// Collects the per-pad and bearing results from an equilibrium.
pub fn assemble_result(
    design: &BearingDesign,
    solver: &ReynoldsSolver,
    eq: &Equilibrium,
    viscosity: ViscosityBasis,
    mu: &[f64],
    thermal: Option<ThermalResult>,
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
        crown: eq.state.crown + thermal.as_ref().map_or(0.0, |t| t.thermal_crown),
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
    // Local film Reynolds number ρ U h / μ (laminar theory: well below ~1000).
    let o = solver.frame().outline;
    let mut re_max: f64 = 0.0;
    for j in 0..=g.ny {
        let u = solver.frame().surface_speed(o.t_at(g.eta[j]));
        for i in 0..=g.nx {
            let k = g.idx(i, j);
            re_max = re_max.max(viscosity.density * u * solver.film()[k] / mu[k]);
        }
    }
    if re_max > LAMINAR_REYNOLDS_LIMIT {
        notes.push(format!(
            "warning: the local film Reynolds number reaches {re_max:.0} (above about \
             {LAMINAR_REYNOLDS_LIMIT:.0}): laminar theory becomes doubtful and the power loss \
             is likely underestimated"
        ));
    }
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
        max_reynolds_number: re_max,
        thermal,
        stats: SolutionStats {
            nodes_along: g.nodes_along(),
            nodes_across: g.nodes_across(),
            pressure_residual: i.solve.relative_residual,
            pressure_cycles: i.solve.cycles,
            equilibrium_iterations: eq.iterations,
            pressure_solves: eq.pressure_solves,
            load_error: eq.load_error,
            moment_error: eq.moment_error,
            coarse_start: None,
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
