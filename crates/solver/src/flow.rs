//! Volume flows of the film: the face flows of the finite-volume discretisation and the flows
//! through the four physical pad edges.
//!
//! With the pressure solved, the flow through the face between nodes `(i, j)` and `(i+1, j)` is
//! `Q_e = U(t_j) Δt_j h_e/2 − G_e (p_{i+1,j} − p_{i,j})` and through the face between `(i, j)`
//! and `(i, j+1)` it is `Q_n = −G_n (p_{i,j+1} − p_{i,j})`, in m³/s (see
//! [`crate::reynolds::stencil`]). Faces between two boundary nodes carry only the Couette part.
//! Every interior control volume balances its face flows to the solver residual, so flows built
//! from these faces are conservative; the energy equation uses the same faces.

use crate::grid::Grid;
use crate::reynolds::stencil::Level;

/// Volume flows through the four pad edges, m³/s, each positive in its natural direction.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct Flows {
    /// Inflow through the leading edge.
    pub leading_in: f64,
    /// Outflow through the trailing edge.
    pub trailing_out: f64,
    /// Side leakage through the inner edge (inner radius, or first side).
    pub inner_out: f64,
    /// Side leakage through the outer edge (outer radius, or second side).
    pub outer_out: f64,
}

impl Flows {
    /// Total side leakage, m³/s.
    pub fn side_leakage(&self) -> f64 {
        self.inner_out + self.outer_out
    }

    /// Flow-balance residual: (inflow − outflows) / inflow, dimensionless. Near the solver
    /// tolerance for a full film; with cavitation the Swift–Stieber condition does not
    /// conserve mass and this shows by how much.
    pub fn imbalance(&self) -> f64 {
        if self.leading_in > 0.0 {
            (self.leading_in - self.trailing_out - self.side_leakage()) / self.leading_in
        } else {
            0.0
        }
    }
}

/// Face flows of a solved pressure field, m³/s, indexed like the nodes: `east[k]` is the flow
/// from node `k = (i, j)` to `(i+1, j)`, `north[k]` from `(i, j)` to `(i, j+1)`. Entries for
/// faces that do not exist (last column, last row) are zero.
#[derive(Clone, Debug, Default)]
pub struct FaceFlows {
    /// Flow through the east faces, m³/s.
    pub east: Vec<f64>,
    /// Flow through the north faces, m³/s.
    pub north: Vec<f64>,
}

impl FaceFlows {
    /// Computes the face flows of pressure `p` (Pa) on `lvl`, reusing the buffers.
    pub fn compute(&mut self, lvl: &Level, p: &[f64]) {
        let g = &lvl.grid;
        let (nx, ny) = (g.nx, g.ny);
        let w = nx + 1;
        let n = g.len();
        self.east.resize(n, 0.0);
        self.north.resize(n, 0.0);
        for j in 0..=ny {
            for i in 0..=nx {
                let k = j * w + i;
                self.east[k] = if i < nx {
                    lvl.ue[k] * lvl.he[k] - lvl.ce[k] * (p[k + 1] - p[k])
                } else {
                    0.0
                };
                self.north[k] = if j < ny {
                    -lvl.cn[k] * (p[k + w] - p[k])
                } else {
                    0.0
                };
            }
        }
    }

    /// Flow out of the pad through the physical edge at boundary node `(i, j)`, m³/s (negative:
    /// inflow), from the balance of its edge control volume. Corner quarter-volumes belong to
    /// the leading or trailing edge. Zero for interior nodes.
    pub fn edge_outflow(&self, g: &Grid, i: usize, j: usize) -> f64 {
        let (nx, ny) = (g.nx, g.ny);
        let k = g.idx(i, j);
        if i == 0 {
            -self.east[k]
        } else if i == nx {
            self.east[k - 1]
        } else if j == 0 {
            self.east[k - 1] - self.east[k] - self.north[k]
        } else if j == ny {
            self.east[k - 1] - self.east[k] + self.north[g.idx(i, j - 1)]
        } else {
            0.0
        }
    }

    /// The flows through the four edges.
    pub fn edges(&self, g: &Grid) -> Flows {
        let (nx, ny) = (g.nx, g.ny);
        Flows {
            leading_in: (0..=ny).map(|j| -self.edge_outflow(g, 0, j)).sum(),
            trailing_out: (0..=ny).map(|j| self.edge_outflow(g, nx, j)).sum(),
            inner_out: (1..nx).map(|i| self.edge_outflow(g, i, 0)).sum(),
            outer_out: (1..nx).map(|i| self.edge_outflow(g, i, ny)).sum(),
        }
    }
}

/// Flows through the four physical edges from the balance of the edge control volumes.
///
/// With the face flows `Q_e(i, j) = U Δt h_e/2 − G_e (p_{i+1,j} − p_{i,j})` and
/// `Q_n(i, j) = −G_n (p_{i,j+1} − p_{i,j})` of the discretisation (m³/s), the half control
/// volume of a boundary node passes on through its physical edge whatever its other faces
/// do not balance. Corner quarter-volumes are assigned to the leading and trailing edges.
pub fn edge_flows(lvl: &Level, p: &[f64]) -> Flows {
    // Only the faces next to the edges matter: O(nx + ny) work, no allocation.
    let g = &lvl.grid;
    let (nx, ny) = (g.nx, g.ny);
    let w = nx + 1;
    let east = |k: usize| lvl.ue[k] * lvl.he[k] - lvl.ce[k] * (p[k + 1] - p[k]);
    let north = |k: usize| -lvl.cn[k] * (p[k + w] - p[k]);
    let leading_in = (0..=ny).map(|j| east(j * w)).sum();
    let trailing_out = (0..=ny).map(|j| east(j * w + nx - 1)).sum();
    let inner_out = (1..nx).map(|i| east(i - 1) - east(i) - north(i)).sum();
    let outer_out = (1..nx)
        .map(|i| {
            let k = ny * w + i;
            east(k - 1) - east(k) + north(k - w)
        })
        .sum();
    Flows {
        leading_in,
        trailing_out,
        inner_out,
        outer_out,
    }
}
