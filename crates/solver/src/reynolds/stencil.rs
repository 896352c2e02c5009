//! Finite-volume discretisation of the Reynolds equation on one grid level.
//!
//! Equation (steady, incompressible, laminar; stationary pad, runner moving along `+s`), written
//! in the pad-local coordinates of [`crate::geometry`] and multiplied by the metric `m`:
//!
//! ```text
//! ∂/∂t( m h³/(12μ) ∂p/∂t ) + ∂/∂s( h³/(12μ m) ∂p/∂s ) = (U(t) / 2) ∂h/∂s
//! ```
//!
//! which for a sector (`s = θ`, `t = r`, `m = r`, `U = ωr`) is the polar form
//! `∂/∂r(r h³/(12μ) ∂p/∂r) + ∂/∂θ(h³/(12μ r) ∂p/∂θ) = (ω r/2) ∂h/∂θ` and for a rectangle
//! (`s = x`, `t = y`, `m = 1`) the Cartesian form
//! `∂/∂x(h³/(12μ) ∂p/∂x) + ∂/∂y(h³/(12μ) ∂p/∂y) = (U/2) ∂h/∂x`.
//! Units: p in Pa, h in m, μ in Pa·s, lengths in m, angles in rad, U in m/s.
//!
//! Integrated over the control volume of an interior node, the equation is a volume-flow balance
//! (m³/s). Between nodes `(i, j)` and `(i+1, j)` the face carries
//!
//! ```text
//! Q_e = U(t_j) h_e Δt_j / 2 − G_e (p_{i+1,j} − p_{i,j}),   G_e = h_e³/(12 μ_e) · Δt_j / (m(t_j) Δs_{i+½})
//! ```
//!
//! and between `(i, j)` and `(i, j+1)`
//!
//! ```text
//! Q_n = − G_n (p_{i,j+1} − p_{i,j}),   G_n = h_n³/(12 μ_n) · m(t_{j+½}) Δs_i / Δt_{j+½}
//! ```
//!
//! with `h` evaluated *at the face* from the analytic film and `μ` averaged from the two nodes.
//! `Δt_j`, `Δs_i` are control-volume extents (half cells on the edges), `Δs_{i+½}`, `Δt_{j+½}`
//! node spacings. The balance `Q_e − Q_w + Q_n − Q_s = 0` gives the five-point system
//! `diag·p_P − Σ G_nb p_nb = b` with `b = U(t_j) Δt_j (h_w − h_e)/2`, and every control volume
//! conserves flow exactly. Boundary nodes hold the ambient pressure (zero gauge).

use crate::film::{BasisArrays, FilmModel, FilmState};
use crate::geometry::PadFrame;
use crate::grid::Grid;

/// Film-independent geometry of one level plus its assembled operator.
#[derive(Clone, Debug)]
pub struct Level {
    /// Node positions.
    pub grid: Grid,
    /// East-face geometric factor `Δt_j / (m(t_j) Δs_{i+½})` at index `(i, j)`, dimensionless.
    pub ge: Vec<f64>,
    /// North-face geometric factor `m(t_{j+½}) Δs_i / Δt_{j+½}` at index `(i, j)`, dimensionless.
    pub gn: Vec<f64>,
    /// Couette factor of the east face `U(t_j) Δt_j / 2`, m²/s (multiplies `h_e`).
    pub ue: Vec<f64>,
    /// Film basis at the east faces `(ξ_{i+½}, η_j)`.
    pub basis_e: BasisArrays,
    /// Film basis at the north faces `(ξ_i, η_{j+½})`.
    pub basis_n: BasisArrays,
    /// East-face conductance `G_e`, m³/(Pa·s).
    pub ce: Vec<f64>,
    /// North-face conductance `G_n`, m³/(Pa·s).
    pub cn: Vec<f64>,
    /// Diagonal `Σ G` of the interior nodes, m³/(Pa·s) (zero elsewhere).
    pub diag: Vec<f64>,
    /// Reciprocal of the diagonal `1/Σ G`, Pa·s/m³ (interior nodes; zero elsewhere).
    pub inv_diag: Vec<f64>,
    /// Film at the east faces, m.
    pub he: Vec<f64>,
    /// Film at the north faces, m.
    pub hn: Vec<f64>,
    /// Dynamic viscosity at the nodes, Pa·s (set through the solver, which also fills the
    /// coarse levels; read it through [`Level::viscosity`]).
    pub(crate) mu: Vec<f64>,
    /// The viscosity the face factors below were computed for, Pa·s.
    mu_seen: Vec<f64>,
    /// East-face factor `g_e / (12 μ̄_e)`, 1/(Pa·s) (`μ̄` the mean of the two nodes).
    fe: Vec<f64>,
    /// North-face factor `g_n / (12 μ̄_n)`, 1/(Pa·s).
    fnorth: Vec<f64>,
}

impl Level {
    /// Precomputes the geometry of `grid` on the pad of `frame` with film model `film`.
    pub fn new(frame: &PadFrame, film: &FilmModel, grid: Grid) -> Self {
        let n = grid.len();
        let (nx, ny) = (grid.nx, grid.ny);
        let o = &frame.outline;
        let s_span = o.s_span();
        let t_of = |eta: f64| o.t_at(eta);
        let mut ge = vec![0.0; n];
        let mut gn = vec![0.0; n];
        let mut ue = vec![0.0; n];
        for j in 0..=ny {
            let tj = t_of(grid.eta[j]);
            let dt_j = grid.eta_extent(j) * (t_of(1.0) - t_of(0.0));
            for i in 0..=nx {
                let k = grid.idx(i, j);
                if i < nx {
                    let ds = (grid.xi[i + 1] - grid.xi[i]) * s_span;
                    ge[k] = dt_j / (o.metric(tj) * ds);
                    ue[k] = 0.5 * frame.surface_speed(tj) * dt_j;
                }
                if j < ny {
                    let t_face = t_of(grid.eta_face(j));
                    let dt = t_of(grid.eta[j + 1]) - tj;
                    let ds_i = grid.xi_extent(i) * s_span;
                    gn[k] = o.metric(t_face) * ds_i / dt;
                }
            }
        }
        // Face positions; the faces past the last column / row do not exist and are evaluated
        // at the edge only to keep the arrays rectangular (their factors are zero).
        let basis_e = BasisArrays::new(
            film,
            (0..=ny).flat_map(|j| {
                let g = &grid;
                (0..=nx).map(move |i| (g.xi_face(i.min(nx - 1)), g.eta[j]))
            }),
        );
        let basis_n = BasisArrays::new(
            film,
            (0..=ny).flat_map(|j| {
                let g = &grid;
                (0..=nx).map(move |i| (g.xi[i], g.eta_face(j.min(ny - 1))))
            }),
        );
        Level {
            ge,
            gn,
            ue,
            basis_e,
            basis_n,
            ce: vec![0.0; n],
            cn: vec![0.0; n],
            diag: vec![0.0; n],
            inv_diag: vec![0.0; n],
            he: vec![0.0; n],
            hn: vec![0.0; n],
            mu: vec![0.0; n],
            mu_seen: vec![f64::NAN; n],
            fe: vec![0.0; n],
            fnorth: vec![0.0; n],
            grid,
        }
    }

    /// Dynamic viscosity at the nodes of the last assembly, Pa·s.
    pub fn viscosity(&self) -> &[f64] {
        &self.mu
    }

    /// Assembles the face conductances and the diagonal for a film state and a nodal viscosity
    /// field (already stored in `self.mu`, Pa·s). Returns the smallest face film, m.
    pub fn assemble(&mut self, state: &FilmState) -> f64 {
        let (nx, ny) = (self.grid.nx, self.grid.ny);
        let w = nx + 1;
        self.basis_e.fill(state, &mut self.he);
        self.basis_n.fill(state, &mut self.hn);
        // The viscosity changes less often than the film: the face factors g/(12 μ̄), with μ̄
        // the mean of the two nodes' viscosities, are renewed only when it does.
        if self.mu != self.mu_seen {
            for j in 0..=ny {
                let row = j * w;
                let mu = &self.mu[row..row + w];
                let (ge, fe) = (&self.ge[row..row + nx], &mut self.fe[row..row + w]);
                for i in 0..nx {
                    fe[i] = ge[i] / (6.0 * (mu[i] + mu[i + 1]));
                }
                fe[nx] = 0.0;
                let fnorth = &mut self.fnorth[row..row + w];
                if j < ny {
                    let mu_n = &self.mu[row + w..row + 2 * w];
                    let gn = &self.gn[row..row + w];
                    for i in 0..w {
                        fnorth[i] = gn[i] / (6.0 * (mu[i] + mu_n[i]));
                    }
                } else {
                    fnorth.fill(0.0);
                }
            }
            self.mu_seen.copy_from_slice(&self.mu);
        }
        // Face conductances G = h³ g/(12 μ̄), m³/(Pa·s).
        for ((c, &h), &f) in self.ce.iter_mut().zip(&self.he).zip(&self.fe) {
            *c = h * h * h * f;
        }
        for ((c, &h), &f) in self.cn.iter_mut().zip(&self.hn).zip(&self.fnorth) {
            *c = h * h * h * f;
        }
        // Smallest face film (the faces past the last column and row are not faces), in four
        // lanes so the comparison chain vectorises.
        let mut lanes = [f64::INFINITY; 4];
        let mut fold = |v: &[f64]| {
            let mut c = v.chunks_exact(4);
            for q in &mut c {
                for (l, &h) in lanes.iter_mut().zip(q) {
                    *l = if h < *l { h } else { *l };
                }
            }
            for &h in c.remainder() {
                lanes[0] = if h < lanes[0] { h } else { lanes[0] };
            }
        };
        for j in 0..=ny {
            let row = j * w;
            fold(&self.he[row..row + nx]);
            if j < ny {
                fold(&self.hn[row..row + w]);
            }
        }
        let hmin = lanes
            .iter()
            .fold(f64::INFINITY, |m, &l| if l < m { l } else { m });
        // Diagonal Σ G of the interior nodes and its reciprocal.
        for j in 1..ny {
            let row = j * w;
            let ce = &self.ce[row..row + w];
            let (cn_s, cn_n) = (&self.cn[row - w..row], &self.cn[row..row + w]);
            let diag = &mut self.diag[row + 1..row + nx];
            let inv = &mut self.inv_diag[row + 1..row + nx];
            for m in 0..nx - 1 {
                let i = m + 1;
                let d = ce[i] + ce[i - 1] + cn_n[i] + cn_s[i];
                diag[m] = d;
                inv[m] = 1.0 / d;
            }
        }
        hmin
    }

    /// Right-hand side `b = U Δt (h_w − h_e)/2` (m³/s) of the interior nodes into `b`;
    /// boundary entries are zeroed. Uses the east-face films of the last [`Level::assemble`].
    pub fn source(&self, b: &mut [f64]) {
        let (nx, ny) = (self.grid.nx, self.grid.ny);
        let w = nx + 1;
        b.fill(0.0);
        for j in 1..ny {
            for i in 1..nx {
                let k = j * w + i;
                // Couette inflow through the west face minus outflow through the east face.
                b[k] = self.ue[k - 1] * self.he[k - 1] - self.ue[k] * self.he[k];
            }
        }
    }

    /// Residual `r = b − A p` on interior nodes (m³/s); boundary entries zero.
    pub fn residual(&self, p: &[f64], b: &[f64], r: &mut [f64]) {
        let (nx, ny) = (self.grid.nx, self.grid.ny);
        let w = nx + 1;
        r[..w].fill(0.0);
        r[ny * w..].fill(0.0);
        for j in 1..ny {
            let row = j * w;
            r[row] = 0.0;
            r[row + nx] = 0.0;
            for k in row + 1..row + nx {
                let ap = self.diag[k] * p[k]
                    - self.ce[k] * p[k + 1]
                    - self.ce[k - 1] * p[k - 1]
                    - self.cn[k] * p[k + w]
                    - self.cn[k - w] * p[k - w];
                r[k] = b[k] - ap;
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::film::Support;
    use crate::geometry::{PadOutline, RunnerSpeed};
    use approx::assert_relative_eq;

    /// For a parallel film the east-face Couette flows are equal, so the source vanishes
    /// (a parallel, isoviscous film generates no pressure — classical result).
    #[test]
    fn parallel_film_has_no_source() {
        let o = PadOutline::Rectangle {
            length: 0.1,
            width: 0.05,
        };
        let frame = PadFrame::new(o, RunnerSpeed::Linear(10.0)).unwrap();
        let film = FilmModel::new(o, Support::Flat).unwrap();
        let mut l = Level::new(&frame, &film, Grid::new(9, 9, None).unwrap());
        l.mu.fill(0.01);
        l.assemble(&FilmState {
            reference: 1e-5,
            ..Default::default()
        });
        let mut b = vec![1.0; l.grid.len()];
        l.source(&mut b);
        assert!(b.iter().all(|&x| x.abs() < 1e-20));
    }

    /// The conductances of a uniform rectangular grid with a constant film are
    /// `h³/(12μ)·Δy/Δx` (five-point Laplacian scaled by the film conductivity).
    #[test]
    fn uniform_conductances() {
        let o = PadOutline::Rectangle {
            length: 0.2,
            width: 0.1,
        };
        let frame = PadFrame::new(o, RunnerSpeed::Linear(5.0)).unwrap();
        let film = FilmModel::new(o, Support::Flat).unwrap();
        let mut l = Level::new(&frame, &film, Grid::new(9, 5, None).unwrap());
        l.mu.fill(0.02);
        l.assemble(&FilmState {
            reference: 2e-5,
            ..Default::default()
        });
        let k0 = (2e-5f64).powi(3) / (12.0 * 0.02);
        let k = l.grid.idx(3, 2);
        assert_relative_eq!(
            l.ce[k],
            k0 * (0.1 / 4.0) / (0.2 / 8.0),
            max_relative = 1e-12
        );
        assert_relative_eq!(
            l.cn[k],
            k0 * (0.2 / 8.0) / (0.1 / 4.0),
            max_relative = 1e-12
        );
    }
}
