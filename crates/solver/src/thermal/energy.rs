//! The film-averaged energy equation on the pad grid.
//!
//! Steady, film-averaged energy balance of the oil (in-plane conduction neglected against
//! convection — film Péclet numbers are in the thousands):
//!
//! ```text
//! ρc q·∇T = μU²/h + h³|∇p|²/(12μ) − H_r (T − T_r) − H_p (T − T_b)
//! ```
//!
//! per unit pad area (W/m²), with `q` the film's volume flow per unit width (m²/s), `T` the
//! film temperature (K), `μU²/h` the shear-driven and `h³|∇p|²/(12μ)` the pressure-driven
//! dissipation, `H_r` the heat-transfer coefficient to the runner at `T_r` and `H_p` the overall
//! coefficient through the pad to its bath at `T_b` (W/(m²·K); both zero for an adiabatic film).
//!
//! Discretisation: the control volumes and face flows of the Reynolds scheme
//! ([`crate::flow::FaceFlows`]), first-order upwind. For the control volume of node `i`
//!
//! ```text
//! ρc Σ_in |Q_f| (T_i − T_up(f)) = Φ_i − A_i [H_r (T_i − T_r) + H_p (T_i − T_b)]
//! ```
//!
//! where the sum runs over the faces through which oil enters (including the physical leading
//! edge, where it enters at the inlet temperature), `Φ_i` is the dissipation of the volume: the
//! shear part `μ_i U² A_i/h_i` on the node and half of `G_f Δp_f²` of each adjacent face
//! (which sums exactly to the runner friction power, see [`crate::pad`]). Written in this
//! advective form the scheme never creates heat where the Swift–Stieber condition breaks mass
//! conservation (cavitated nodes); in a full film it is identical to the conservative form
//! `ρc Σ_f Q_f T_upwind` because the face flows balance. One volumetric heat capacity `ρc` at
//! the supply temperature is used throughout, as an incompressible film requires.
//!
//! The upwind system is solved column by column in the direction of the motion, each column
//! exactly as a tridiagonal system (side flows couple its nodes both ways); one pass is exact
//! where no oil flows backwards along the motion.

use crate::flow::FaceFlows;
use crate::geometry::PadFrame;
use crate::grid::Grid;
use crate::reynolds::stencil::Level;

/// Heat paths from the film, per unit area.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct SurfaceExchange {
    /// Heat-transfer coefficient to the runner, W/(m²·K).
    pub runner_coefficient: f64,
    /// Runner surface temperature, K.
    pub runner_temperature: f64,
    /// Overall heat-transfer coefficient from the film through the pad to its bath, W/(m²·K).
    pub pad_coefficient: f64,
    /// Bath temperature behind the pad, K.
    pub bath_temperature: f64,
}

/// Energy-equation workspace for one pad grid.
#[derive(Clone, Debug, Default)]
pub struct EnergySolver {
    /// Face flows of the last pressure field, m³/s.
    pub faces: FaceFlows,
    /// Dissipated power in each control volume, W.
    pub dissipation: Vec<f64>,
    /// Control-volume area of each node, m².
    pub area: Vec<f64>,
    /// Film temperature at each node, K.
    pub temperature: Vec<f64>,
    /// Shear factor `U² A` of each node, m⁴/s² (with `μ/h` the shear dissipation, W).
    shear: Vec<f64>,
    /// The pad frame and grid size the areas and shear factors belong to.
    geometry_of: Option<(PadFrame, usize, usize)>,
    /// The temperature-independent coefficients of the upwind system, see [`ColumnSystem`].
    sys: ColumnSystem,
}

/// The upwind energy system of every node, split into what does not depend on the
/// temperatures (all of it, as the flows are fixed) and factorised column by column:
/// `d T_j − lo T_{j−1} − up T_{j+1} = base + cw T_west + ce T_east`, in W/K and W.
#[derive(Clone, Debug, Default)]
struct ColumnSystem {
    /// Coupling to the node below / above in the column (south, north inflow), W/K.
    lo: Vec<f64>,
    up: Vec<f64>,
    /// Fixed part of the right-hand side (dissipation, edge inflow, surface exchange), W.
    base: Vec<f64>,
    /// Coupling to the upwind nodes of the neighbouring columns, W/K.
    cw: Vec<f64>,
    ce: Vec<f64>,
    /// Thomas factors: forward multiplier `lo_j / d'_{j−1}` and inverse pivot `1/d'_j`.
    m: Vec<f64>,
    inv: Vec<f64>,
    /// Eliminated right-hand side of one column.
    y: Vec<f64>,
}

/// Energy totals of one solution, W.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct EnergyBalance {
    /// Power dissipated in the film.
    pub dissipated: f64,
    /// Net enthalpy carried out of the pad by the oil, `ρc Σ Q_out T − ρc Σ Q_in T_in`.
    pub carried_by_oil: f64,
    /// Heat conducted to the runner and into the pad.
    pub to_surfaces: f64,
    /// Enthalpy attributed to the flow the Swift–Stieber condition adds in cavitated regions.
    pub cavitation_term: f64,
}

impl EnergyBalance {
    /// (dissipated − carried − surfaces − cavitation term) / dissipated.
    pub fn residual(&self) -> f64 {
        if self.dissipated > 0.0 {
            (self.dissipated - self.carried_by_oil - self.to_surfaces - self.cavitation_term)
                / self.dissipated
        } else {
            0.0
        }
    }
}

impl EnergySolver {
    /// A workspace whose first temperature field is `temperature` (K at the nodes).
    pub fn starting_at(temperature: Vec<f64>) -> Self {
        EnergySolver {
            temperature,
            ..Default::default()
        }
    }

    /// Prepares the face flows, dissipation and areas for a solved pressure `p` (Pa) on `lvl`
    /// with nodal viscosity `mu` (Pa·s) and film `h` (m).
    pub fn prepare(&mut self, frame: &PadFrame, lvl: &Level, p: &[f64], mu: &[f64], h: &[f64]) {
        let g = &lvl.grid;
        let n = g.len();
        let o = &frame.outline;
        let (s_span, t_span) = (o.s_span(), o.t_at(1.0) - o.t_at(0.0));
        self.faces.compute(lvl, p);
        self.dissipation.resize(n, 0.0);
        if self.temperature.len() != n {
            self.temperature = vec![0.0; n];
        }
        self.sys.y.resize(lvl.grid.ny + 1, 0.0);
        let w = g.nx + 1;
        // Areas and the shear factor U² A depend on the geometry only: computed once per
        // pad frame and grid.
        let key = (*frame, g.nx, g.ny);
        if self.geometry_of != Some(key) {
            self.area.resize(n, 0.0);
            self.shear.resize(n, 0.0);
            for j in 0..=g.ny {
                let t = o.t_at(g.eta[j]);
                let u = frame.surface_speed(t);
                let dt = g.eta_extent(j) * t_span;
                for i in 0..=g.nx {
                    let k = j * w + i;
                    let da = o.metric(t) * g.xi_extent(i) * s_span * dt;
                    self.area[k] = da;
                    self.shear[k] = u * u * da;
                }
            }
            self.geometry_of = Some(key);
        }
        // Shear dissipation μ U² A / h of each node.
        let (mu, h) = (&mu[..n], &h[..n]);
        for (k, d) in self.dissipation.iter_mut().enumerate() {
            *d = mu[k] * self.shear[k] / h[k];
        }
        // Pressure-driven dissipation G Δp² of each face, half to each side.
        for j in 0..=g.ny {
            for i in 0..=g.nx {
                let k = j * w + i;
                if i < g.nx {
                    let dp = p[k + 1] - p[k];
                    let d = 0.5 * lvl.ce[k] * dp * dp;
                    self.dissipation[k] += d;
                    self.dissipation[k + 1] += d;
                }
                if j < g.ny {
                    let dp = p[k + w] - p[k];
                    let d = 0.5 * lvl.cn[k] * dp * dp;
                    self.dissipation[k] += d;
                    self.dissipation[k + w] += d;
                }
            }
        }
    }

    /// Solves the upwind energy balance for the film temperature with the oil entering the
    /// leading edge at `t_inlet` and any other edge at `t_side` (K); `rho_c` is the volumetric
    /// heat capacity, J/(m³·K). Returns the number of sweeps.
    pub fn solve(
        &mut self,
        g: &Grid,
        rho_c: f64,
        t_inlet: f64,
        t_side: f64,
        surf: &SurfaceExchange,
    ) -> usize {
        let (nx, ny) = (g.nx, g.ny);
        let w = nx + 1;
        let e = &self.faces.east;
        let nth = &self.faces.north;
        let h_tot = surf.runner_coefficient + surf.pad_coefficient;
        let h_ref = surf.runner_coefficient * surf.runner_temperature
            + surf.pad_coefficient * surf.bath_temperature;
        // The coefficients do not depend on the temperatures: build and factorise them once,
        // row by row (the columns' eliminations are independent), so that the sweep below is
        // a chain of multiply-adds without divisions.
        let n = g.len();
        let sys = &mut self.sys;
        for v in [
            &mut sys.lo,
            &mut sys.up,
            &mut sys.base,
            &mut sys.cw,
            &mut sys.ce,
            &mut sys.m,
            &mut sys.inv,
        ] {
            v.resize(n, 0.0);
        }
        let mut backflow = false;
        for j in 0..=ny {
            for i in 0..=nx {
                let k = j * w + i;
                let mut inflow = 0.0;
                let mut carried = 0.0;
                let (mut cw, mut ce) = (0.0, 0.0);
                // West face (or the leading edge) and east face: temperatures of the
                // neighbouring columns.
                if i > 0 && e[k - 1] > 0.0 {
                    inflow += e[k - 1];
                    cw = rho_c * e[k - 1];
                }
                if i < nx && e[k] < 0.0 {
                    inflow -= e[k];
                    ce = -rho_c * e[k];
                    backflow = true;
                }
                if i == 0 || i == nx || j == 0 || j == ny {
                    let q = -self.faces.edge_outflow(g, i, j);
                    if q > 0.0 {
                        inflow += q;
                        carried += q * if i == 0 { t_inlet } else { t_side };
                    }
                }
                // South and north faces: unknowns of this column.
                let from_south = if j > 0 { nth[k - w].max(0.0) } else { 0.0 };
                let from_north = if j < ny { (-nth[k]).max(0.0) } else { 0.0 };
                let a = self.area[k];
                let den = rho_c * (inflow + from_south + from_north) + a * h_tot;
                let d = if den > 0.0 {
                    sys.lo[k] = rho_c * from_south;
                    sys.up[k] = rho_c * from_north;
                    sys.base[k] = self.dissipation[k] + rho_c * carried + a * h_ref;
                    sys.cw[k] = cw;
                    sys.ce[k] = ce;
                    den
                } else {
                    // No oil enters and no heat leaves: take the upstream value.
                    sys.lo[k] = 0.0;
                    sys.up[k] = 0.0;
                    sys.base[k] = if i > 0 { 0.0 } else { t_inlet };
                    sys.cw[k] = if i > 0 { 1.0 } else { 0.0 };
                    sys.ce[k] = 0.0;
                    1.0
                };
                // Thomas elimination along the column: d'_j = d_j − (lo_j/d'_{j−1}) up_{j−1}.
                let dp = if j > 0 {
                    let m = sys.lo[k] * sys.inv[k - w];
                    sys.m[k] = m;
                    d - m * sys.up[k - w]
                } else {
                    sys.m[k] = 0.0;
                    d
                };
                sys.inv[k] = 1.0 / dp;
            }
        }
        let t = &mut self.temperature;
        // Column by column along the motion: the coupling across the motion (side flows run
        // both ways) is solved exactly in each column with the neighbouring columns' current
        // temperatures; one pass is exact unless oil flows backwards along the motion
        // somewhere, which further passes take care of.
        let mut sweeps = 0;
        for sweep in 0..50 {
            sweeps = sweep + 1;
            let mut change: f64 = 0.0;
            for i in 0..=nx {
                let mut prev = 0.0;
                for j in 0..=ny {
                    let k = j * w + i;
                    let mut r = sys.base[k];
                    if i > 0 {
                        r += sys.cw[k] * t[k - 1];
                    }
                    if i < nx {
                        r += sys.ce[k] * t[k + 1];
                    }
                    prev = r + sys.m[k] * prev;
                    sys.y[j] = prev;
                }
                let mut next = 0.0;
                if backflow {
                    for j in (0..=ny).rev() {
                        let k = j * w + i;
                        let tn = (sys.y[j] + sys.up[k] * next) * sys.inv[k];
                        change = change.max((tn - t[k]).abs());
                        t[k] = tn;
                        next = tn;
                    }
                } else {
                    for j in (0..=ny).rev() {
                        let k = j * w + i;
                        let tn = (sys.y[j] + sys.up[k] * next) * sys.inv[k];
                        t[k] = tn;
                        next = tn;
                    }
                }
            }
            // Without backflow the columns only read upstream temperatures, which were final
            // when read: the pass was exact (and its change is not needed).
            if !backflow || change < 1e-9 {
                break;
            }
        }
        sweeps
    }

    /// Energy totals of the current temperature field.
    pub fn balance(
        &self,
        g: &Grid,
        rho_c: f64,
        t_inlet: f64,
        t_side: f64,
        surf: &SurfaceExchange,
    ) -> EnergyBalance {
        let (nx, ny) = (g.nx, g.ny);
        let w = nx + 1;
        let t = &self.temperature;
        let mut b = EnergyBalance::default();
        for j in 0..=ny {
            for i in 0..=nx {
                let k = j * w + i;
                b.dissipated += self.dissipation[k];
                b.to_surfaces += self.area[k]
                    * (surf.runner_coefficient * (t[k] - surf.runner_temperature)
                        + surf.pad_coefficient * (t[k] - surf.bath_temperature));
                if i == 0 || i == nx || j == 0 || j == ny {
                    let out = self.faces.edge_outflow(g, i, j);
                    let t_edge = if i == 0 { t_inlet } else { t_side };
                    b.carried_by_oil += rho_c * if out > 0.0 { out * t[k] } else { out * t_edge };
                }
                // Net outflow of the control volume (non-zero only where cavitated): the
                // advective form lets it leave at the node temperature.
                let mut net = 0.0;
                if i < nx {
                    net += self.faces.east[k];
                }
                if i > 0 {
                    net -= self.faces.east[k - 1];
                }
                if j < ny {
                    net += self.faces.north[k];
                }
                if j > 0 {
                    net -= self.faces.north[k - w];
                }
                if i == 0 || i == nx || j == 0 || j == ny {
                    net += self.faces.edge_outflow(g, i, j);
                }
                b.cavitation_term -= rho_c * net * t[k];
            }
        }
        b
    }
}
