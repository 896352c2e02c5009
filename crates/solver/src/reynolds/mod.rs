//! The Reynolds equation on one pad: discretisation ([`stencil`]), multigrid solution with
//! cavitation ([`multigrid`]) and the reusable solver workspace ([`ReynoldsSolver`]).
//!
//! The solver finds the gauge pressure `p(ξ, η)` (Pa) under a stationary pad for a given film
//! state and nodal viscosity field, with ambient pressure (zero gauge) on all four edges and the
//! Reynolds (Swift–Stieber) condition `p ≥ p_cav` where the film diverges.

pub mod banded;
pub mod multigrid;
pub mod real;
pub mod stencil;

use crate::error::SolverError;
use crate::film::{BasisArrays, FilmModel, FilmState};
use crate::geometry::PadFrame;
use crate::grid::Grid;
use multigrid::{CycleSettings, Multigrid};
use stencil::Level;

/// Settings of the pressure solve.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ReynoldsSettings {
    /// Stop when the residual norm falls below this fraction of the source norm.
    pub tolerance: f64,
    /// Largest number of multigrid cycles per solve.
    pub max_cycles: usize,
    /// Apply the Reynolds (Swift–Stieber) cavitation condition.
    pub cavitation: bool,
    /// Cavitation pressure, Pa gauge (zero: ambient). At most zero: the pad's edges hold the
    /// ambient pressure, and a floor above it would contradict that boundary condition.
    pub cavitation_pressure: f64,
    /// Multigrid cycle parameters.
    pub cycle: CycleSettings,
}

impl Default for ReynoldsSettings {
    fn default() -> Self {
        ReynoldsSettings {
            tolerance: 1e-9,
            max_cycles: 100,
            cavitation: true,
            cavitation_pressure: 0.0,
            cycle: CycleSettings::default(),
        }
    }
}

/// How to start a pressure solve.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Start {
    /// From zero pressure, by full multigrid.
    Cold,
    /// From the pressure of the previous solve (falls back to cold if there is none).
    Warm,
}

/// What a pressure solve did.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct SolveReport {
    /// Multigrid cycles after the start (full multigrid counts as none).
    pub cycles: usize,
    /// Final residual norm divided by the source norm.
    pub relative_residual: f64,
    /// Interior nodes held at the cavitation pressure.
    pub cavitated_nodes: usize,
    /// Whether the solve started from zero (full multigrid).
    pub cold_start: bool,
}

/// Reusable workspace that solves the Reynolds equation on one pad for many film states.
#[derive(Clone, Debug)]
pub struct ReynoldsSolver {
    frame: PadFrame,
    film: FilmModel,
    mg: Multigrid,
    node_basis: BasisArrays,
    node_area: Vec<f64>,
    node_xy: Vec<[f64; 2]>,
    h_node: Vec<f64>,
    /// Solve settings.
    pub settings: ReynoldsSettings,
    has_solution: bool,
    last: Option<SolveReport>,
    relaxed: Option<f64>,
}

impl ReynoldsSolver {
    /// Builds the workspace for a pad: grid levels, geometric factors and film bases.
    pub fn new(frame: PadFrame, film: FilmModel, grid: Grid, settings: ReynoldsSettings) -> Self {
        let node_basis = BasisArrays::new(
            &film,
            (0..=grid.ny).flat_map(|j| {
                let g = &grid;
                (0..=g.nx).map(move |i| (g.xi[i], g.eta[j]))
            }),
        );
        // Control-volume areas (half and quarter cells on the edges) and positions, m² and m.
        let o = frame.outline;
        let (s_span, t_span) = (o.s_span(), o.t_at(1.0) - o.t_at(0.0));
        let mut node_area = Vec::with_capacity(grid.len());
        let mut node_xy = Vec::with_capacity(grid.len());
        let turns: Vec<[f64; 2]> = grid.xi.iter().map(|&x| o.turn(x)).collect();
        for j in 0..=grid.ny {
            let t = o.t_at(grid.eta[j]);
            for (i, (&xi, &turn)) in grid.xi.iter().zip(&turns).enumerate() {
                node_area
                    .push(o.metric(t) * grid.xi_extent(i) * s_span * grid.eta_extent(j) * t_span);
                node_xy.push(o.position_turned(xi, grid.eta[j], turn));
            }
        }
        let finest = Level::new(&frame, &film, grid);
        let mut mg = Multigrid::new(finest, |g| Level::new(&frame, &film, g));
        mg.cycle = settings.cycle;
        let n = mg.levels[0].grid.len();
        ReynoldsSolver {
            frame,
            film,
            mg,
            node_basis,
            node_area,
            node_xy,
            h_node: vec![0.0; n],
            settings,
            has_solution: false,
            relaxed: None,
            last: None,
        }
    }

    /// The pad frame.
    pub fn frame(&self) -> &PadFrame {
        &self.frame
    }

    /// The film model.
    pub fn film_model(&self) -> &FilmModel {
        &self.film
    }

    /// The finest grid.
    pub fn grid(&self) -> &Grid {
        &self.mg.levels[0].grid
    }

    /// The finest level with its assembled operator and face films.
    pub fn level(&self) -> &Level {
        &self.mg.levels[0]
    }

    /// Film basis at the finest nodes.
    pub fn node_basis(&self) -> &BasisArrays {
        &self.node_basis
    }

    /// Control-volume area of each finest node (half and quarter cells on the edges), m².
    pub fn node_area(&self) -> &[f64] {
        &self.node_area
    }

    /// Position of each finest node in the runner plane, m.
    pub fn node_position(&self) -> &[[f64; 2]] {
        &self.node_xy
    }

    /// Number of multigrid levels.
    pub fn depth(&self) -> usize {
        self.mg.depth()
    }

    /// Pressure at the finest nodes, Pa gauge (after a solve).
    pub fn pressure(&self) -> &[f64] {
        self.mg.solution()
    }

    /// Film at the finest nodes, m (after a solve).
    pub fn film(&self) -> &[f64] {
        &self.h_node
    }

    /// The report of the last solve.
    pub fn last_report(&self) -> Option<SolveReport> {
        self.last
    }

    /// Sets the pressure (Pa at the finest nodes) a following warm start begins from, e.g. the
    /// solution of a nearby design. The pressure held before (a given start or the last
    /// solution) moves into the solver's history of two earlier solutions, which a warm start
    /// also projects on: loading the solutions of the last designs of a path oldest first, as
    /// every solve does by itself, gives the extrapolating start. [`ReynoldsSolver::reset`]
    /// empties the history.
    pub fn set_initial_pressure(&mut self, p: &[f64]) {
        self.mg.set_solution(p);
        self.has_solution = true;
    }

    /// Loosens the relative-residual tolerance of the following solves to `tol` (never below
    /// the settings' tolerance), or restores it with `None`. For the intermediate iterates of
    /// an outer iteration (an equilibrium search far from its answer), whose pressures need not
    /// be exact.
    pub fn relax_tolerance(&mut self, tol: Option<f64>) {
        self.relaxed = tol;
    }

    /// The relative-residual tolerance the next solve uses.
    pub fn tolerance(&self) -> f64 {
        match self.relaxed {
            Some(t) if t.is_finite() => self.settings.tolerance.max(t),
            _ => self.settings.tolerance,
        }
    }

    /// Forgets the previous pressure and the history of earlier solutions, so that the next
    /// warm start is cold.
    pub fn reset(&mut self) {
        self.has_solution = false;
        self.mg.forget();
    }

    /// Assembles the operator for `state` and viscosity `mu` (Pa·s at the finest nodes)
    /// without solving. Returns the smallest film, m, or an error if the film closes.
    pub fn assemble(&mut self, state: &FilmState, mu: &[f64]) -> Result<f64, SolverError> {
        assert_eq!(mu.len(), self.h_node.len(), "viscosity field size");
        self.node_basis.fill(state, &mut self.h_node);
        let hmin_nodes = self.h_node.iter().copied().fold(f64::INFINITY, f64::min);
        if hmin_nodes.is_nan() || hmin_nodes <= 0.0 {
            return Err(SolverError::FilmClosed {
                min_film_um: finite_or_zero(hmin_nodes) * 1e6,
            });
        }
        self.mg.set_viscosity(mu);
        let hmin_faces = self.mg.assemble(state);
        if hmin_faces.is_nan() || hmin_faces <= 0.0 {
            return Err(SolverError::FilmClosed {
                min_film_um: finite_or_zero(hmin_faces) * 1e6,
            });
        }
        self.mg.set_source();
        Ok(hmin_nodes.min(hmin_faces))
    }

    /// Solves for the pressure of `state` with viscosity `mu` (Pa·s at the finest nodes).
    pub fn solve(
        &mut self,
        state: &FilmState,
        mu: &[f64],
        start: Start,
    ) -> Result<SolveReport, SolverError> {
        self.assemble(state, mu)?;
        self.solve_assembled(start)
    }

    /// Solves the system assembled by the last [`ReynoldsSolver::assemble`] (the source may
    /// have been replaced through [`ReynoldsSolver::rhs_mut`]).
    pub fn solve_assembled(&mut self, start: Start) -> Result<SolveReport, SolverError> {
        let floor = self
            .settings
            .cavitation
            .then_some(self.settings.cavitation_pressure);
        self.mg.cycle = self.settings.cycle;
        let cold = start == Start::Cold || !self.has_solution;
        if self.mg.rhs_norm() == 0.0 {
            // A parallel, isoviscous film: no source, ambient pressure everywhere.
            let n = self.grid().len();
            self.mg.set_solution(&vec![0.0; n]);
            let rep = SolveReport {
                cycles: 0,
                relative_residual: 0.0,
                cavitated_nodes: 0,
                cold_start: cold,
            };
            self.has_solution = true;
            self.last = Some(rep);
            return Ok(rep);
        }
        let out = self
            .mg
            .solve(floor, self.tolerance(), self.settings.max_cycles, cold);
        if !out.converged {
            self.has_solution = false;
            return Err(SolverError::NotConverged {
                what: "pressure solution",
                iterations: out.cycles,
                residual: finite_or_zero(out.relative_residual),
            });
        }
        let cavitated_nodes = match floor {
            Some(fl) => count_interior(self.grid(), self.mg.solution(), |p| p <= fl),
            None => 0,
        };
        self.has_solution = true;
        let rep = SolveReport {
            cycles: out.cycles,
            relative_residual: out.relative_residual,
            cavitated_nodes,
            cold_start: cold,
        };
        self.last = Some(rep);
        Ok(rep)
    }

    /// Mutable right-hand side of the finest level, m³/s (for manufactured-solution checks).
    pub fn rhs_mut(&mut self) -> &mut [f64] {
        self.mg.rhs_mut()
    }

    /// The right-hand side of the finest level, m³/s.
    pub fn rhs(&self) -> &[f64] {
        self.mg.rhs()
    }
}

fn count_interior(g: &Grid, p: &[f64], pred: impl Fn(f64) -> bool) -> usize {
    let mut n = 0;
    for j in 1..g.ny {
        for i in 1..g.nx {
            if pred(p[g.idx(i, j)]) {
                n += 1;
            }
        }
    }
    n
}

fn finite_or_zero(x: f64) -> f64 {
    if x.is_finite() { x } else { 0.0 }
}
