//! Thermohydrodynamic pad models: viscosity that varies with the film temperature, hot-oil
//! carry-over between pads, pad temperatures and thermal crowning.
//!
//! Two models share the oil-supply description ([`OilSupply`]):
//!
//! * [`FieldPad`] solves the film-averaged energy equation on the pad grid ([`energy`]),
//!   coupled to the Reynolds equation through `μ(T(r, θ))` until the temperature field changes by
//!   less than a tolerance (0.05 K by default). With conduction through the pad it also bends
//!   the pad by its through-thickness temperature difference (thermal crown).
//! * [`BulkPad`] is the quick model: one effective temperature `T_in + f·ΔT` with
//!   `ΔT = P/(ρ c Q_in)` the adiabatic bulk rise and `f` a user fraction, one viscosity.
//!
//! **Inlet mixing (hot-oil carry-over).** All pads are identical, so the oil leaving one pad's
//! trailing edge at the flow-weighted outlet temperature `T_out` meets the next pad's leading
//! edge. A fraction `λ` of that flow is carried over; fresh oil at the supply temperature makes
//! up the rest of the leading-edge inflow `Q_in`:
//! `T_in = [λ Q_out T_out + (Q_in − λ Q_out) T_supply] / Q_in`.
//!
//! **Pad temperature.** The pad surface temperature is taken equal to the film-averaged
//! temperature above it (the usual simplification of a film-averaged model). With the optional
//! conduction path, heat flows through the pad thickness `t` (conductivity `k`) and leaves the
//! back face to the bath at `T_b` through a convection coefficient `H_b`:
//! `q = (T − T_b)/(t/k + 1/H_b)`; the through-thickness difference is `ΔT = q t/k`.
//!
//! **Thermal crown.** A free plate with a linear temperature difference `ΔT` through its
//! thickness bends to the curvature `κ = α ΔT / t` (α the linear expansion coefficient of the pad
//! material), convex towards the hot face. With the pad-mean `ΔT` this is the crown
//! `δ = κ ρ̄²/2` of the crown shape in [`crate::film`], added to the mechanical crown.
//!
//! Assumptions: laminar, Newtonian oil; film-averaged temperature (no variation across the
//! film); in-plane conduction in the oil neglected; one volumetric heat capacity at the supply
//! temperature; the inlet temperature is uniform across the leading edge; side and trailing
//! inflows (rare, only where a film diverges) enter at the supply temperature.

pub mod energy;
pub mod mixing;

use crate::bearing::IsothermalPad;
use crate::equilibrium::FilmResponse;
use crate::error::{InputError, SolverError};
use crate::film::{FilmModel, FilmState};
use crate::geometry::{positive, within};
use crate::lubricant::Lubricant;
use crate::lubricant::table::ViscosityTable;
use crate::pad::{self, PadIntegrals};
use crate::reynolds::{ReynoldsSolver, Start};
use energy::{EnergyBalance, EnergySolver, SurfaceExchange};
use mixing::Mixer;

/// Default fraction of the previous pad's trailing-edge oil that enters the next pad
/// (common practice, no source: values between 0.5 and 0.8 are usual).
pub const DEFAULT_CARRY_OVER: f64 = 0.6;
/// Default fraction of the adiabatic rise that sets the effective temperature of the bulk model
/// (common practice, no source).
pub const DEFAULT_RISE_FRACTION: f64 = 0.8;
/// Default convergence tolerance of the temperature field, K.
pub const DEFAULT_TEMPERATURE_TOLERANCE: f64 = 0.05;
/// Local film Reynolds number `ρUh/μ` above which laminar theory becomes doubtful (common
/// practice, no source: "of the order of 1000").
pub const LAMINAR_REYNOLDS_LIMIT: f64 = 1000.0;

/// How oil reaches the pads.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OilSupply {
    /// Supply (groove) temperature, K.
    pub temperature: f64,
    /// Fraction of the previous pad's trailing-edge flow that enters the next pad.
    pub carry_over: f64,
    /// Oil supplied to the whole bearing, m³/s, if known (for the starvation check).
    pub flow: Option<f64>,
}

impl OilSupply {
    /// Checks the supply values.
    pub fn validate(&self) -> Result<(), InputError> {
        positive("supply temperature", self.temperature)?;
        within("hot-oil carry-over fraction", self.carry_over, 0.0, 1.0)?;
        if let Some(q) = self.flow {
            positive("supplied oil flow", q)?;
        }
        Ok(())
    }

    /// Mixed inlet temperature from the previous pad's outlet (K) and the pad's flows (m³/s).
    pub fn inlet_temperature(&self, t_out: f64, q_in: f64, q_out: f64) -> f64 {
        if q_in <= 0.0 {
            return self.temperature;
        }
        let carried = (self.carry_over * q_out.max(0.0)).min(q_in);
        (carried * t_out + (q_in - carried) * self.temperature) / q_in
    }

    /// Fresh oil one pad draws from the supply, m³/s.
    pub fn fresh_flow(&self, q_in: f64, q_out: f64) -> f64 {
        (q_in - (self.carry_over * q_out.max(0.0)).min(q_in)).max(0.0)
    }
}

/// Conduction through the pad to its bath.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PadConduction {
    /// Pad thickness, m.
    pub thickness: f64,
    /// Thermal conductivity of the pad, W/(m·K).
    pub conductivity: f64,
    /// Convection coefficient from the pad back to the bath, W/(m²·K).
    pub back_coefficient: f64,
    /// Bath temperature, K.
    pub bath_temperature: f64,
    /// Linear thermal expansion coefficient of the pad material, 1/K (for the thermal crown).
    pub expansion: f64,
}

impl PadConduction {
    /// Overall coefficient from the pad face to the bath, W/(m²·K).
    pub fn overall_coefficient(&self) -> f64 {
        1.0 / (self.thickness / self.conductivity + 1.0 / self.back_coefficient)
    }

    /// Checks the values.
    pub fn validate(&self) -> Result<(), InputError> {
        within("pad thickness", self.thickness, 1e-3, 0.5)?;
        positive("pad conductivity", self.conductivity)?;
        positive(
            "pad back-face convection coefficient",
            self.back_coefficient,
        )?;
        positive("bath temperature", self.bath_temperature)?;
        within(
            "pad thermal expansion coefficient",
            self.expansion,
            0.0,
            1e-4,
        )
    }
}

/// Heat paths out of the film besides the oil flow.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct HeatPaths {
    /// Heat-transfer coefficient to the runner, W/(m²·K) (zero: adiabatic runner).
    pub runner_coefficient: f64,
    /// Runner temperature, K (none: the supply temperature).
    pub runner_temperature: Option<f64>,
    /// Conduction through the pad (none: adiabatic pad).
    pub pad: Option<PadConduction>,
}

/// Settings of the film-temperature field model.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FieldSettings {
    /// Oil supply.
    pub supply: OilSupply,
    /// Heat paths besides the oil.
    pub heat: HeatPaths,
    /// Stop when the film temperature changes by less than this between iterations, K.
    pub tolerance: f64,
    /// Largest number of renewals of the temperature field in one equilibrium.
    pub max_iterations: usize,
}

impl FieldSettings {
    /// Adiabatic film with the given supply.
    pub fn adiabatic(supply: OilSupply) -> Self {
        FieldSettings {
            supply,
            heat: HeatPaths::default(),
            tolerance: DEFAULT_TEMPERATURE_TOLERANCE,
            max_iterations: 40,
        }
    }

    /// Checks the values.
    pub fn validate(&self) -> Result<(), InputError> {
        self.supply.validate()?;
        within(
            "runner heat-transfer coefficient",
            self.heat.runner_coefficient,
            0.0,
            1e6,
        )?;
        if let Some(t) = self.heat.runner_temperature {
            positive("runner temperature", t)?;
        }
        if let Some(p) = &self.heat.pad {
            p.validate()?;
        }
        positive("temperature tolerance", self.tolerance)
    }

    fn exchange(&self) -> SurfaceExchange {
        SurfaceExchange {
            runner_coefficient: self.heat.runner_coefficient,
            runner_temperature: self
                .heat
                .runner_temperature
                .unwrap_or(self.supply.temperature),
            pad_coefficient: self.heat.pad.map_or(0.0, |p| p.overall_coefficient()),
            bath_temperature: self
                .heat
                .pad
                .map_or(self.supply.temperature, |p| p.bath_temperature),
        }
    }
}

/// What the thermal model found at the last film state (SI units).
#[derive(Clone, Debug, PartialEq, Default)]
pub struct ThermalState {
    /// Film (and pad surface) temperature at the nodes, K.
    pub temperature: Vec<f64>,
    /// Mixed inlet temperature, K.
    pub inlet: f64,
    /// Flow-weighted temperature of the trailing-edge outflow, K.
    pub outlet: f64,
    /// Flow-weighted temperature of all oil leaving the pad, K.
    pub mean_outflow: f64,
    /// Thermal crown, m.
    pub thermal_crown: f64,
    /// Energy totals, W.
    pub balance: EnergyBalance,
    /// Reynolds–energy iterations of the last film state.
    pub iterations: usize,
    /// Pad-mean temperature difference through the pad thickness, K.
    pub through_thickness: f64,
}

/// The thermohydrodynamic pad: Reynolds and energy equations coupled through `μ(T)`.
#[derive(Clone, Debug)]
pub struct FieldPad {
    /// The pressure solver.
    pub solver: ReynoldsSolver,
    /// The energy workspace (face flows, dissipation, temperature).
    pub energy: EnergySolver,
    /// `μ(T)` of the lubricant tabulated over the temperatures the film can reach.
    viscosity: ViscosityTable,
    settings: FieldSettings,
    mu: Vec<f64>,
    rho_c: f64,
    state: ThermalState,
    residual: Vec<f64>,
    /// The step of the last renewal, K.
    step: Vec<f64>,
    mixer: Mixer,
}

impl FieldPad {
    /// A thermal pad on `solver` with oil `lubricant`.
    pub fn new(
        solver: ReynoldsSolver,
        lubricant: Lubricant,
        settings: FieldSettings,
    ) -> Result<Self, SolverError> {
        settings.validate()?;
        let t0 = settings.supply.temperature;
        let rho = lubricant.density_kg_m3(t0).map_err(lub)?;
        let rho_c = rho * lubricant.specific_heat_j_per_kg_k();
        let n = solver.grid().len();
        let mu0 = lubricant.dynamic_viscosity_pa_s(t0).map_err(lub)?;
        let energy = EnergySolver::starting_at(vec![t0; n]);
        // The film is never colder than the coldest surface or supply it meets (heat is only
        // made in the film), nor hotter than the limit where the analysis stops; the table
        // covers that range with a few kelvin to spare (relaxed iterates may stray).
        let surf = settings.exchange();
        let coldest = t0.min(surf.runner_temperature).min(surf.bath_temperature);
        let viscosity = ViscosityTable::new(&lubricant, coldest - 5.0, MAX_FILM_TEMPERATURE);
        Ok(FieldPad {
            solver,
            energy,
            viscosity,
            settings,
            mu: vec![mu0; n],
            rho_c,
            state: ThermalState {
                temperature: vec![t0; n],
                inlet: t0,
                outlet: t0,
                mean_outflow: t0,
                ..Default::default()
            },
            residual: vec![0.0; n],
            step: vec![0.0; n],
            mixer: Mixer::default(),
        })
    }

    /// Takes over the temperatures of `coarse`, the same pad solved on another (usually
    /// coarser) grid: the film temperature interpolated bilinearly to this grid's nodes, the
    /// viscosity from it, the outlet temperature the inlet mixing starts from and the thermal
    /// crown; the coupling's history starts afresh, with the relaxation the coarse coupling
    /// ended with (the strength of the viscosity feedback does not depend on the grid).
    pub fn start_from(&mut self, coarse: &FieldPad) -> Result<(), SolverError> {
        let (g, gc) = (self.solver.grid(), coarse.solver.grid());
        let tc = &coarse.state.temperature;
        let w = g.nx + 1;
        for (k, t) in self.state.temperature.iter_mut().enumerate() {
            *t = gc.interpolate(tc, g.xi[k % w], g.eta[k / w]);
        }
        for (m, &tk) in self.mu.iter_mut().zip(&self.state.temperature) {
            *m = self.viscosity.dynamic_viscosity_pa_s(tk).map_err(lub)?;
        }
        self.energy.temperature.clone_from(&self.state.temperature);
        let c = &coarse.state;
        self.state.inlet = c.inlet;
        self.state.outlet = c.outlet;
        self.state.mean_outflow = c.mean_outflow;
        self.state.thermal_crown = c.thermal_crown;
        self.state.through_thickness = c.through_thickness;
        self.mixer.restart_relaxed(coarse.mixer.relaxation());
        Ok(())
    }

    /// Thermal results of the last film state.
    pub fn thermal(&self) -> &ThermalState {
        &self.state
    }

    /// Nodal viscosity used by the last pressure solve, Pa·s.
    pub fn viscosity(&self) -> &[f64] {
        &self.mu
    }

    /// Volumetric heat capacity used in the energy equation, J/(m³·K).
    pub fn rho_c(&self) -> f64 {
        self.rho_c
    }
}

fn lub(e: crate::lubricant::LubricantError) -> SolverError {
    e.into()
}

impl FieldPad {
    /// Recomputes the reported thermal state (temperature field, outlet temperatures, energy
    /// balance) from the current pressure solution without touching the viscosity field, so that
    /// the report belongs to the final equilibrium. The film temperature then differs from the
    /// one the viscosity came from by less than the coupling tolerance.
    pub fn refresh_report(&mut self) {
        let t_in = self.solve_energy();
        let (supply, surf) = (self.settings.supply, self.settings.exchange());
        let g = self.solver.grid();
        self.state.balance = self
            .energy
            .balance(g, self.rho_c, t_in, supply.temperature, &surf);
        let t = &self.energy.temperature;
        let (outlet, mean) = outflow_temperatures(g, &self.energy.faces, t, t_in);
        self.state.inlet = t_in;
        self.state.outlet = outlet;
        self.state.mean_outflow = mean;
        self.state.temperature.clone_from(t);
    }

    /// Solves the energy equation for the current pressure solution and viscosity field, with
    /// the inlet mixed from the supply and the outlet of the previous iterate (hot-oil
    /// carry-over; the fixed point converges together with the temperature field). Leaves the
    /// solved field in the energy workspace and returns the inlet temperature, K.
    fn solve_energy(&mut self) -> f64 {
        let surf = self.settings.exchange();
        let supply = self.settings.supply;
        let g = self.solver.grid();
        let frame = *self.solver.frame();
        self.energy.prepare(
            &frame,
            self.solver.level(),
            self.solver.pressure(),
            &self.mu,
            self.solver.film(),
        );
        let flows = self.energy.faces.edges(g);
        let t_in =
            supply.inlet_temperature(self.state.outlet, flows.leading_in, flows.trailing_out);
        self.energy
            .solve(g, self.rho_c, t_in, supply.temperature, &surf);
        t_in
    }

    /// Renews the temperature field from the last pressure solution: energy equation with
    /// the mixed inlet, then viscosity and thermal crown. Returns the largest change of the
    /// film temperature, K.
    fn renew(&mut self) -> Result<f64, SolverError> {
        let t_in = self.solve_energy();
        let g = self.solver.grid();
        let r2 = self.solver.film_model().crown_reference_radius2();
        // Fixed-point residual: the solved field against the field the viscosity came from.
        let used = &self.state.temperature;
        let solved = &self.energy.temperature;
        for (r, (s, u)) in self.residual.iter_mut().zip(solved.iter().zip(used)) {
            *r = s - u;
        }
        let change = self.residual.iter().fold(0.0f64, |m, r| m.max(r.abs()));
        if !change.is_finite() {
            return Err(SolverError::Overheated {
                temperature_c: crate::lubricant::kelvin_to_celsius(MAX_FILM_TEMPERATURE),
            });
        }
        // Anderson acceleration with Aitken's relaxation (see [`mixing`]): the viscosity
        // feedback makes plain substitution oscillate (and diverge when the film runs hot).
        self.mixer
            .step(&self.state.temperature, &self.residual, &mut self.step);
        let largest = self.step.iter().fold(0.0f64, |m, s| m.max(s.abs()));
        let limit = if largest > MAX_TEMPERATURE_STEP {
            MAX_TEMPERATURE_STEP / largest
        } else {
            1.0
        };
        for (t, s) in self.state.temperature.iter_mut().zip(&self.step) {
            *t += limit * s;
        }
        self.energy.temperature.clone_from(&self.state.temperature);
        let t = &self.state.temperature;
        let t_max = t.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        if t_max > MAX_FILM_TEMPERATURE {
            return Err(SolverError::Overheated {
                temperature_c: crate::lubricant::kelvin_to_celsius(t_max),
            });
        }
        let (outlet, mean_outflow) = outflow_temperatures(g, &self.energy.faces, t, t_in);
        // Thermal crown from the pad-mean through-thickness difference.
        let (crown, dt_mean) = match self.settings.heat.pad {
            Some(pc) => {
                let u = pc.overall_coefficient();
                let (mut s, mut a) = (0.0, 0.0);
                for (k, &tk) in t.iter().enumerate() {
                    s += u * (tk - pc.bath_temperature) * pc.thickness / pc.conductivity
                        * self.energy.area[k];
                    a += self.energy.area[k];
                }
                let dt = s / a;
                ((0.5 * pc.expansion * dt / pc.thickness * r2).max(0.0), dt)
            }
            None => (0.0, 0.0),
        };
        self.state.inlet = t_in;
        self.state.outlet = outlet;
        self.state.mean_outflow = mean_outflow;
        self.state.through_thickness = dt_mean;
        self.state.iterations += 1;
        self.state.thermal_crown = crown;
        for (m, &tk) in self.mu.iter_mut().zip(t) {
            *m = self.viscosity.dynamic_viscosity_pa_s(tk).map_err(lub)?;
        }
        Ok(change)
    }
}

/// Flow-weighted temperatures of the trailing-edge outflow and of all outflow, K (the inlet
/// temperature `t_in` if nothing flows out).
fn outflow_temperatures(
    g: &crate::grid::Grid,
    faces: &crate::flow::FaceFlows,
    t: &[f64],
    t_in: f64,
) -> (f64, f64) {
    let (mut qt, mut q, mut qa, mut qta) = (0.0, 0.0, 0.0, 0.0);
    for j in 0..=g.ny {
        for i in 0..=g.nx {
            if i == 0 || i == g.nx || j == 0 || j == g.ny {
                let out = faces.edge_outflow(g, i, j);
                if out > 0.0 {
                    let tk = t[g.idx(i, j)];
                    qa += out;
                    qta += out * tk;
                    if i == g.nx {
                        q += out;
                        qt += out * tk;
                    }
                }
            }
        }
    }
    (
        if q > 0.0 { qt / q } else { t_in },
        if qa > 0.0 { qta / qa } else { t_in },
    )
}

/// Largest change of the film temperature applied in one update, K.
const MAX_TEMPERATURE_STEP: f64 = 30.0;

/// Film temperature above which an analysis stops, K (250 °C: far beyond any oil's use).
pub const MAX_FILM_TEMPERATURE: f64 = 523.15;

impl FilmResponse for FieldPad {
    fn respond(&mut self, state: &FilmState, start: Start) -> Result<PadIntegrals, SolverError> {
        let st = FilmState {
            crown: state.crown + self.state.thermal_crown,
            ..*state
        };
        pad::evaluate(&mut self.solver, &st, &self.mu, start)
    }

    fn update(&mut self) -> Result<f64, SolverError> {
        self.renew()
    }

    fn update_tolerance(&self) -> f64 {
        self.settings.tolerance
    }

    fn update_limit(&self) -> usize {
        self.settings.max_iterations
    }

    fn restart_updates(&mut self) {
        self.mixer.restart();
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
        let st = FilmState {
            crown: state.crown + self.state.thermal_crown,
            ..*state
        };
        pad::evaluate_forces(&mut self.solver, &st, &self.mu, start)
    }

    fn complete(&mut self) -> Option<PadIntegrals> {
        pad::integrate_last(&self.solver, &self.mu)
    }

    fn scales_inverse_square(&self) -> bool {
        false
    }

    fn film_model(&self) -> &FilmModel {
        self.solver.film_model()
    }

    fn min_film(&self, state: &FilmState) -> f64 {
        let st = FilmState {
            crown: state.crown + self.state.thermal_crown,
            ..*state
        };
        self.solver.node_basis().min_thickness(&st)
    }
}

/// The bulk-temperature pad: one effective temperature from the adiabatic rise.
#[derive(Clone, Debug)]
pub struct BulkPad {
    /// The isothermal pad the effective viscosity is applied to.
    pub pad: IsothermalPad,
    lubricant: Lubricant,
    supply: OilSupply,
    rise_fraction: f64,
    rho_c: f64,
    /// Effective temperature of the last film state, K.
    pub effective_temperature: f64,
    /// Mixed inlet temperature of the last film state, K.
    pub inlet: f64,
    /// Adiabatic bulk rise `P/(ρ c Q_in)` of the last film state, K.
    pub rise: f64,
    last: Option<PadIntegrals>,
    previous_residual: Option<f64>,
    omega: f64,
    renewals: usize,
}

impl BulkPad {
    /// A bulk-temperature pad on `solver`.
    pub fn new(
        solver: ReynoldsSolver,
        lubricant: Lubricant,
        supply: OilSupply,
        rise_fraction: f64,
    ) -> Result<Self, SolverError> {
        supply.validate()?;
        within("fraction of the temperature rise", rise_fraction, 0.0, 1.0)?;
        let t0 = supply.temperature;
        let rho_c =
            lubricant.density_kg_m3(t0).map_err(lub)? * lubricant.specific_heat_j_per_kg_k();
        let mu0 = lubricant.dynamic_viscosity_pa_s(t0).map_err(lub)?;
        Ok(BulkPad {
            pad: IsothermalPad::new(solver, mu0),
            lubricant,
            supply,
            rise_fraction,
            rho_c,
            effective_temperature: t0,
            inlet: t0,
            rise: 0.0,
            last: None,
            previous_residual: None,
            omega: 0.5,
            renewals: 0,
        })
    }

    /// Renewals of the effective temperature so far.
    pub fn renewals(&self) -> usize {
        self.renewals
    }

    /// Takes over the effective temperature (and its viscosity), inlet temperature, rise and
    /// relaxation of `coarse`, the same pad solved on another (usually coarser) grid.
    pub fn start_from(&mut self, coarse: &BulkPad) -> Result<(), SolverError> {
        self.effective_temperature = coarse.effective_temperature;
        self.inlet = coarse.inlet;
        self.rise = coarse.rise;
        self.omega = coarse.omega;
        self.previous_residual = None;
        self.last = None;
        let mu = self
            .lubricant
            .dynamic_viscosity_pa_s(self.effective_temperature)
            .map_err(lub)?;
        self.pad.set_viscosity(mu);
        Ok(())
    }
}

impl BulkPad {
    /// Inlet temperature and adiabatic rise `P/(ρ c Q_in)` of a pad solution, K:
    /// `T_in = c (T_in + ΔT) + (1 − c) T_supply`, with `c` the carried share of the inflow,
    /// is linear in `T_in`: `T_in = T_supply + c ΔT / (1 − c)`.
    pub fn inlet_and_rise(&self, i: &PadIntegrals) -> (f64, f64) {
        let q_in = i.flows.leading_in;
        let rise = if q_in > 0.0 {
            i.power_loss / (self.rho_c * q_in)
        } else {
            0.0
        };
        let c = if q_in > 0.0 {
            (self.supply.carry_over * i.flows.trailing_out.max(0.0)).min(q_in) / q_in
        } else {
            0.0
        };
        (
            self.supply.temperature + c * rise / (1.0 - c).max(1e-3),
            rise,
        )
    }
}

impl FilmResponse for BulkPad {
    fn respond(&mut self, state: &FilmState, start: Start) -> Result<PadIntegrals, SolverError> {
        let i = self.pad.respond(state, start)?;
        self.last = Some(i);
        Ok(i)
    }

    fn relax_pressure_tolerance(&mut self, tol: Option<f64>) {
        self.pad.relax_pressure_tolerance(tol);
    }

    fn full_pressure_tolerance(&self) -> f64 {
        self.pad.full_pressure_tolerance()
    }

    fn complete(&mut self) -> Option<PadIntegrals> {
        // The renewal needs the flows and the power, so every response is a full one.
        self.last
    }

    fn update(&mut self) -> Result<f64, SolverError> {
        let Some(i) = self.last else {
            return Ok(f64::INFINITY);
        };
        let (t_in, rise) = self.inlet_and_rise(&i);
        let target = t_in + self.rise_fraction * rise;
        let r = target - self.effective_temperature;
        if !r.is_finite() {
            return Err(SolverError::Overheated {
                temperature_c: crate::lubricant::kelvin_to_celsius(MAX_FILM_TEMPERATURE),
            });
        }
        // Aitken (secant) relaxation of the scalar fixed point, with a capped step.
        if let Some(rp) = self.previous_residual
            && r != rp
        {
            self.omega = (-self.omega * rp / (r - rp)).clamp(0.05, 1.0);
        }
        self.previous_residual = Some(r);
        let step = (self.omega * r).clamp(-MAX_TEMPERATURE_STEP, MAX_TEMPERATURE_STEP);
        let t_eff = self.effective_temperature + step;
        if t_eff > MAX_FILM_TEMPERATURE {
            return Err(SolverError::Overheated {
                temperature_c: crate::lubricant::kelvin_to_celsius(t_eff),
            });
        }
        let change = r.abs();
        self.inlet = t_in;
        self.rise = rise;
        self.effective_temperature = t_eff;
        self.renewals += 1;
        let mu = self.lubricant.dynamic_viscosity_pa_s(t_eff).map_err(lub)?;
        self.pad.set_viscosity(mu);
        Ok(change)
    }

    fn update_tolerance(&self) -> f64 {
        DEFAULT_TEMPERATURE_TOLERANCE
    }

    fn scales_inverse_square(&self) -> bool {
        false
    }

    fn film_model(&self) -> &FilmModel {
        self.pad.film_model()
    }

    fn min_film(&self, state: &FilmState) -> f64 {
        self.pad.min_film(state)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::film::Support;
    use crate::geometry::{PadFrame, PadOutline, RunnerSpeed};
    use crate::grid::Grid;
    use crate::lubricant::IsoVg;
    use crate::reynolds::ReynoldsSettings;
    use approx::assert_relative_eq;

    /// A thermal tilting pad (invented demo proportions) on an `n × n` grid.
    fn field_pad(n: usize) -> FieldPad {
        let outline = PadOutline::Sector {
            inner_radius: 0.05,
            outer_radius: 0.10,
            arc: 50f64.to_radians(),
        };
        let support = Support::TiltingPoint {
            offset_along: 0.6,
            offset_across: 0.5,
        };
        let solver = ReynoldsSolver::new(
            PadFrame::new(outline, RunnerSpeed::Angular(300.0)).unwrap(),
            FilmModel::new(outline, support).unwrap(),
            Grid::new(n, n, None).unwrap(),
            ReynoldsSettings::default(),
        );
        let supply = OilSupply {
            temperature: 273.15 + 45.0,
            carry_over: 0.6,
            flow: None,
        };
        let oil = Lubricant::from_iso_vg(IsoVg::Vg46, 100.0).unwrap();
        FieldPad::new(solver, oil, FieldSettings::adiabatic(supply)).unwrap()
    }

    /// A coarse pad's temperatures reach the fine grid by bilinear interpolation (exact for a
    /// bilinear field), the viscosity follows the oil's law at them (the table is a piecewise
    /// cubic on 0.5 K steps: 1e-6 relative is far looser than its error), and the outlet
    /// temperature, thermal crown and coupling relaxation come along.
    #[test]
    fn start_from_carries_the_coarse_temperatures_over() {
        let mut coarse = field_pad(9);
        let g = coarse.solver.grid().clone();
        let law = |x: f64, e: f64| 320.0 + 15.0 * x + 4.0 * e + 2.0 * x * e;
        let w = g.nx + 1;
        coarse.state.temperature = (0..g.len())
            .map(|k| law(g.xi[k % w], g.eta[k / w]))
            .collect();
        coarse.state.outlet = 333.0;
        coarse.state.thermal_crown = 2e-6;
        coarse.mixer.restart_relaxed(0.3);

        let mut fine = field_pad(17);
        fine.start_from(&coarse).unwrap();
        let gf = fine.solver.grid().clone();
        let wf = gf.nx + 1;
        let oil = Lubricant::from_iso_vg(IsoVg::Vg46, 100.0).unwrap();
        for k in 0..gf.len() {
            let t = law(gf.xi[k % wf], gf.eta[k / wf]);
            assert_relative_eq!(fine.state.temperature[k], t, epsilon = 1e-10);
            assert_relative_eq!(fine.energy.temperature[k], t, epsilon = 1e-10);
            let mu = oil.dynamic_viscosity_pa_s(t).unwrap();
            assert_relative_eq!(fine.mu[k], mu, max_relative = 1e-6);
        }
        assert_eq!(fine.state.outlet, 333.0);
        assert_eq!(fine.state.thermal_crown, 2e-6);
        assert_eq!(fine.mixer.relaxation(), 0.3);
    }
}
