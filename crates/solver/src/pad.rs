//! One pad at one film state: the pressure solve and everything integrated from it — load,
//! moments about the pivot axes, centre of pressure, friction, power loss and flows.
//!
//! Integrals over the pad use the control volumes of the grid as weights (the trapezoidal rule
//! in `(s, t)` with the metric `m(t)`), which is second-order accurate. The friction of the film
//! on the runner is `τ = μU/h + (h/2) ∂p/∂x`; its pressure part is integrated over the strips
//! between neighbouring nodes along the motion, `(h_e Δt/2)(p_{i+1} − p_i)`, which makes the
//! runner power equal, to the solver residual, to the dissipation `∫ μU²/h + h³|∇p|²/(12μ) dA`
//! summed from the same faces (the check the energy equation relies on). Edge flows are the
//! fluxes through the physical pad edges obtained from the flow balance of the edge (half)
//! control volumes, with the same face fluxes as the discretisation; the four edge flows
//! therefore balance to the solver residual (see [`Flows::imbalance`]).

use crate::error::SolverError;
use crate::film::FilmState;
pub use crate::flow::Flows;
use crate::flow::edge_flows;
use crate::reynolds::{ReynoldsSolver, SolveReport, Start};

/// Everything integrated from one pressure solution of one pad (SI units).
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct PadIntegrals {
    /// Pressure resultant, N.
    pub load: f64,
    /// Moment of the pressure about the pitch axis through the pivot, N·m; positive when the
    /// centre of pressure lies towards the leading edge of the pivot.
    pub moment_pitch: f64,
    /// Moment of the pressure about the roll axis through the pivot, N·m; positive when the
    /// centre of pressure lies outward of the pivot.
    pub moment_roll: f64,
    /// Centre of pressure, fraction of the arc from the leading edge.
    pub centre_along: f64,
    /// Centre of pressure, fraction of the width from the inner edge.
    pub centre_across: f64,
    /// Peak pressure, Pa.
    pub peak_pressure: f64,
    /// Peak pressure location `(ξ, η)`.
    pub peak_at: (f64, f64),
    /// Smallest film, m.
    pub min_film: f64,
    /// Location of the smallest film `(ξ, η)`.
    pub min_film_at: (f64, f64),
    /// Largest film, m.
    pub max_film: f64,
    /// Friction force of the film on the runner, opposing its motion, N (sum over the pad).
    pub friction_force: f64,
    /// Friction torque about the shaft axis, N·m (sector pads; zero for rectangles).
    pub friction_torque: f64,
    /// Power taken from the runner by the film, W.
    pub power_loss: f64,
    /// Edge flows, m³/s.
    pub flows: Flows,
    /// Fraction of the pad area at the cavitation pressure.
    pub cavitated_fraction: f64,
    /// The pressure solve's report.
    pub solve: SolveReport,
}

/// Solves the pressure of `state` and integrates it.
pub fn evaluate(
    solver: &mut ReynoldsSolver,
    state: &FilmState,
    mu: &[f64],
    start: Start,
) -> Result<PadIntegrals, SolverError> {
    let rep = solver.solve(state, mu, start)?;
    Ok(integrate(solver, mu, rep))
}

/// Integrates the last solution of `solver` again, if it has one (viscosity `mu`, Pa·s).
pub fn integrate_last(solver: &ReynoldsSolver, mu: &[f64]) -> Option<PadIntegrals> {
    let rep = solver.last_report()?;
    Some(integrate(solver, mu, rep))
}

/// Solves the pressure of `state` and returns only its load and moments.
pub fn evaluate_forces(
    solver: &mut ReynoldsSolver,
    state: &FilmState,
    mu: &[f64],
    start: Start,
) -> Result<crate::equilibrium::Forces, SolverError> {
    solver.solve(state, mu, start)?;
    let (load, moment_pitch, moment_roll) = resultants(solver);
    Ok(crate::equilibrium::Forces {
        load,
        moment_pitch,
        moment_roll,
    })
}

/// Pressure resultant and moments only (cheap): `(load, moment_pitch, moment_roll)`.
pub fn resultants(solver: &ReynoldsSolver) -> (f64, f64, f64) {
    let p = solver.pressure();
    let area = solver.node_area();
    let basis = solver.node_basis();
    let mut w = 0.0;
    let mut mp = 0.0;
    let mut mr = 0.0;
    // Boundary nodes hold the ambient pressure and add nothing.
    for (k, (&pk, &a)) in p.iter().zip(area).enumerate() {
        let f = pk * a;
        let b = basis_at(basis, k);
        w += f;
        mp += f * b.0;
        mr += f * b.1;
    }
    (w, mp, mr)
}

fn basis_at(b: &crate::film::BasisArrays, k: usize) -> (f64, f64) {
    b.lead_out(k)
}

/// Integrates the current solution of `solver` (viscosity `mu`, Pa·s at the nodes).
pub fn integrate(solver: &ReynoldsSolver, mu: &[f64], solve: SolveReport) -> PadIntegrals {
    let g = solver.grid();
    let frame = solver.frame();
    let o = frame.outline;
    let p = solver.pressure();
    let h = solver.film();
    let lvl = solver.level();
    let t_span = o.t_at(1.0) - o.t_at(0.0);
    let is_sector = matches!(o, crate::geometry::PadOutline::Sector { .. });

    let (load, moment_pitch, moment_roll) = resultants(solver);

    // Centre of pressure from the pressure-weighted position in the runner plane.
    let mut cx = 0.0;
    let mut cy = 0.0;
    let mut peak = (f64::NEG_INFINITY, (0.0, 0.0));
    let mut hmin = (f64::INFINITY, (0.0, 0.0));
    let mut hmax = f64::NEG_INFINITY;
    let mut friction_force = 0.0;
    let mut friction_torque = 0.0;
    let mut power = 0.0;
    let mut cav_area = 0.0;
    let mut area = 0.0;
    let floor = solver.settings.cavitation_pressure;
    let cav_on = solver.settings.cavitation;
    let node_area = solver.node_area();
    let node_xy = solver.node_position();
    let w = g.nx + 1;
    for j in 0..=g.ny {
        let t = o.t_at(g.eta[j]);
        let u = frame.surface_speed(t);
        let dt = g.eta_extent(j) * t_span;
        let row = j * w..(j + 1) * w;
        let (pr, hr, mr, ar, xyr) = (
            &p[row.clone()],
            &h[row.clone()],
            &mu[row.clone()],
            &node_area[row.clone()],
            &node_xy[row.clone()],
        );
        // Row sums; the speed and radius are constant along a row and multiply afterwards.
        let (mut a_sum, mut px, mut py, mut shear) = (0.0, 0.0, 0.0, 0.0);
        for i in 0..w {
            let da = ar[i];
            a_sum += da;
            px += pr[i] * xyr[i][0] * da;
            py += pr[i] * xyr[i][1] * da;
            // Couette shear μU/h on the control volume of the node (U applied below).
            shear += mr[i] / hr[i] * da;
        }
        // Pressure-gradient shear (h/2) ∂p/∂x integrated over the strip between this node and
        // the next along the motion: (h_e Δt / 2)(p_{i+1} − p_i).
        let he = &lvl.he[j * w..j * w + g.nx];
        let mut grad = 0.0;
        for i in 0..g.nx {
            grad += he[i] * (pr[i + 1] - pr[i]);
        }
        let grad = 0.5 * dt * grad;
        area += a_sum;
        cx += px;
        cy += py;
        friction_force += u * shear + grad;
        power += u * u * shear + grad * u;
        if is_sector {
            friction_torque += (u * shear + grad) * t;
        }
        for i in 0..w {
            if pr[i] > peak.0 {
                peak = (pr[i], (g.xi[i], g.eta[j]));
            }
            if hr[i] < hmin.0 {
                hmin = (hr[i], (g.xi[i], g.eta[j]));
            }
            hmax = hmax.max(hr[i]);
        }
        if cav_on && j > 0 && j < g.ny {
            for i in 1..g.nx {
                if pr[i] <= floor {
                    cav_area += ar[i];
                }
            }
        }
    }
    let (centre_along, centre_across) = if load > 0.0 {
        local_coordinates(&o, [cx / load, cy / load])
    } else {
        (0.5, 0.5)
    };
    PadIntegrals {
        load,
        moment_pitch,
        moment_roll,
        centre_along,
        centre_across,
        peak_pressure: peak.0.max(0.0),
        peak_at: peak.1,
        min_film: hmin.0,
        min_film_at: hmin.1,
        max_film: hmax,
        friction_force,
        friction_torque,
        power_loss: power,
        flows: edge_flows(lvl, p),
        cavitated_fraction: cav_area / area,
        solve,
    }
}

/// Maps a runner-plane position back to pad-local `(ξ, η)`.
fn local_coordinates(o: &crate::geometry::PadOutline, xy: [f64; 2]) -> (f64, f64) {
    match *o {
        crate::geometry::PadOutline::Sector {
            inner_radius,
            outer_radius,
            arc,
        } => {
            let r = (xy[0] * xy[0] + xy[1] * xy[1]).sqrt();
            let th = xy[1].atan2(xy[0]);
            (th / arc, (r - inner_radius) / (outer_radius - inner_radius))
        }
        crate::geometry::PadOutline::Rectangle { length, width } => (xy[0] / length, xy[1] / width),
    }
}
