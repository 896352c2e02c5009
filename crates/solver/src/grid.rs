//! Structured grids on the pad-local unit square `(ξ, η) ∈ [0, 1]²`.
//!
//! Nodes are numbered `i = 0..=nx` along the motion and `j = 0..=ny` across it; the flat index
//! of node `(i, j)` is `j (nx + 1) + i`, so rows along the motion are contiguous in memory.
//! The boundary nodes carry the ambient pressure; the interior nodes are the unknowns.
//!
//! Spacing is uniform across the motion. Along the motion it is uniform too, except that a
//! *breakpoint* (the end of a tapered land) can be made a grid line: the spacing is then
//! uniform on each side of it. A kink of the film inside a control volume costs accuracy; on a
//! grid line it does not.

use crate::error::InputError;

/// Node positions of one structured grid level.
#[derive(Clone, Debug, PartialEq)]
pub struct Grid {
    /// Number of intervals along the motion.
    pub nx: usize,
    /// Number of intervals across the motion.
    pub ny: usize,
    /// `ξ` of node columns `0..=nx`.
    pub xi: Vec<f64>,
    /// `η` of node rows `0..=ny`.
    pub eta: Vec<f64>,
}

/// Smallest number of nodes per direction accepted.
pub const MIN_NODES: usize = 5;
/// Largest number of nodes per direction accepted.
pub const MAX_NODES: usize = 1025;

impl Grid {
    /// A grid with `nodes_along × nodes_across` nodes, optionally with a grid line at
    /// `ξ = breakpoint` (0 < breakpoint < 1).
    pub fn new(
        nodes_along: usize,
        nodes_across: usize,
        breakpoint: Option<f64>,
    ) -> Result<Self, InputError> {
        for (what, n) in [
            ("nodes along the motion", nodes_along),
            ("nodes across the motion", nodes_across),
        ] {
            if !(MIN_NODES..=MAX_NODES).contains(&n) {
                return Err(InputError::OutOfRange {
                    what: what.into(),
                    value: n as f64,
                    lo: MIN_NODES as f64,
                    hi: MAX_NODES as f64,
                });
            }
        }
        let nx = nodes_along - 1;
        let ny = nodes_across - 1;
        let xi = match breakpoint {
            Some(a) if a > 0.0 && a < 1.0 => {
                let k = ((a * nx as f64).round() as usize).clamp(1, nx - 1);
                (0..=nx)
                    .map(|i| {
                        if i <= k {
                            a * i as f64 / k as f64
                        } else {
                            a + (1.0 - a) * (i - k) as f64 / (nx - k) as f64
                        }
                    })
                    .collect()
            }
            _ => uniform(nx),
        };
        Ok(Grid {
            nx,
            ny,
            xi,
            eta: uniform(ny),
        })
    }

    /// Number of nodes along the motion.
    pub fn nodes_along(&self) -> usize {
        self.nx + 1
    }

    /// Number of nodes across the motion.
    pub fn nodes_across(&self) -> usize {
        self.ny + 1
    }

    /// Total number of nodes.
    pub fn len(&self) -> usize {
        (self.nx + 1) * (self.ny + 1)
    }

    /// True for a grid without nodes (never constructed by [`Grid::new`]).
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }

    /// Flat index of node `(i, j)`.
    #[inline(always)]
    pub fn idx(&self, i: usize, j: usize) -> usize {
        j * (self.nx + 1) + i
    }

    /// `ξ` at the face midway between columns `i` and `i + 1`.
    #[inline]
    pub fn xi_face(&self, i: usize) -> f64 {
        0.5 * (self.xi[i] + self.xi[i + 1])
    }

    /// `η` at the face midway between rows `j` and `j + 1`.
    #[inline]
    pub fn eta_face(&self, j: usize) -> f64 {
        0.5 * (self.eta[j] + self.eta[j + 1])
    }

    /// Extent in `ξ` of the control volume of column `i` (half cells on the edges).
    #[inline]
    pub fn xi_extent(&self, i: usize) -> f64 {
        extent(&self.xi, i)
    }

    /// Extent in `η` of the control volume of row `j` (half cells on the edges).
    #[inline]
    pub fn eta_extent(&self, j: usize) -> f64 {
        extent(&self.eta, j)
    }

    /// Bilinear interpolation of the nodal field `f` at `(ξ, η)` (clamped to the pad).
    pub fn interpolate(&self, f: &[f64], xi: f64, eta: f64) -> f64 {
        let locate = |x: &[f64], v: f64| {
            let n = x.len() - 1;
            let mut i = x.partition_point(|&a| a <= v).saturating_sub(1).min(n - 1);
            if x[i + 1] < v {
                i = n - 1;
            }
            let t = ((v - x[i]) / (x[i + 1] - x[i])).clamp(0.0, 1.0);
            (i, t)
        };
        let (i, a) = locate(&self.xi, xi);
        let (j, b) = locate(&self.eta, eta);
        let v = |ii: usize, jj: usize| f[self.idx(ii, jj)];
        (1.0 - a) * (1.0 - b) * v(i, j)
            + a * (1.0 - b) * v(i + 1, j)
            + (1.0 - a) * b * v(i, j + 1)
            + a * b * v(i + 1, j + 1)
    }

    /// The next coarser grid (every other node), if both directions have an even number of
    /// intervals and at least four of them.
    pub fn coarsen(&self) -> Option<Grid> {
        if !self.nx.is_multiple_of(2) || !self.ny.is_multiple_of(2) || self.nx < 4 || self.ny < 4 {
            return None;
        }
        Some(Grid {
            nx: self.nx / 2,
            ny: self.ny / 2,
            xi: self.xi.iter().step_by(2).copied().collect(),
            eta: self.eta.iter().step_by(2).copied().collect(),
        })
    }
}

fn uniform(n: usize) -> Vec<f64> {
    (0..=n).map(|i| i as f64 / n as f64).collect()
}

fn extent(x: &[f64], i: usize) -> f64 {
    let n = x.len() - 1;
    let lo = if i == 0 {
        x[0]
    } else {
        0.5 * (x[i - 1] + x[i])
    };
    let hi = if i == n {
        x[n]
    } else {
        0.5 * (x[i] + x[i + 1])
    };
    hi - lo
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Bilinear interpolation reproduces a bilinear function `a + b ξ + c η + d ξ η` exactly on
    /// any tensor grid (its defining property), also between unevenly spaced lines and at the
    /// edges; outside the pad it takes the edge value.
    #[test]
    fn interpolation_is_exact_for_bilinear_fields() {
        let g = Grid::new(17, 9, Some(0.7)).unwrap();
        let f = |x: f64, e: f64| 2.0 - 3.0 * x + 0.5 * e + 7.0 * x * e;
        let w = g.nx + 1;
        let field: Vec<f64> = (0..g.len()).map(|k| f(g.xi[k % w], g.eta[k / w])).collect();
        for &(x, e) in &[
            (0.0, 0.0),
            (1.0, 1.0),
            (0.69, 0.31),
            (0.7, 0.5),
            (0.93, 0.07),
            (0.123, 0.999),
        ] {
            assert_relative_eq!(g.interpolate(&field, x, e), f(x, e), epsilon = 1e-13);
        }
        assert_relative_eq!(
            g.interpolate(&field, 1.2, -0.1),
            f(1.0, 0.0),
            epsilon = 1e-13
        );
    }

    #[test]
    fn breakpoint_is_a_grid_line() {
        let g = Grid::new(65, 33, Some(0.8)).unwrap();
        assert!(g.xi.iter().any(|&x| (x - 0.8).abs() < 1e-15));
        assert_relative_eq!(g.xi[64], 1.0);
        // Control volumes tile the unit interval.
        let total: f64 = (0..=g.nx).map(|i| g.xi_extent(i)).sum();
        assert_relative_eq!(total, 1.0, epsilon = 1e-14);
    }

    #[test]
    fn coarsening_keeps_every_other_node() {
        let g = Grid::new(65, 17, None).unwrap();
        let c = g.coarsen().unwrap();
        assert_eq!((c.nx, c.ny), (32, 8));
        assert_eq!(c.xi[5], g.xi[10]);
        let c2 = Grid::new(7, 7, None).unwrap();
        assert!(c2.coarsen().is_some());
        assert!(c2.coarsen().unwrap().coarsen().is_none());
    }

    #[test]
    fn rejects_tiny_grids() {
        assert!(Grid::new(3, 33, None).is_err());
    }
}
