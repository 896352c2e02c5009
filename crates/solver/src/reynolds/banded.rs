//! Banded Cholesky factorisation for the coarsest multigrid level.
//!
//! The five-point Reynolds operator on the interior nodes, numbered along the motion first,
//! is symmetric positive definite with half-bandwidth `nx − 1`. The coarsest level is small,
//! so a direct factorisation (reused until the operator changes) solves it exactly.

use super::stencil::Level;

/// Cholesky factor `L` of the interior operator of one level, stored by rows of its band.
#[derive(Clone, Debug, Default)]
pub struct BandedCholesky {
    m: usize,
    bw: usize,
    l: Vec<f64>,
    y: Vec<f64>,
}

impl BandedCholesky {
    /// Factorises the interior operator of `level`. The operator is SPD for any positive film
    /// and viscosity, so the factorisation cannot break down.
    pub fn factor(&mut self, level: &Level) {
        self.factor_masked(level, None, &level.inv_diag);
    }

    /// Factorises the interior operator with the rows and columns of masked nodes replaced by
    /// the identity (those unknowns are held at zero).
    /// `inv_diag` replaces the level's reciprocal diagonal.
    pub fn factor_masked(&mut self, level: &Level, mask: Option<&[bool]>, inv_diag: &[f64]) {
        let (nx, ny) = (level.grid.nx, level.grid.ny);
        let w = nx + 1;
        let bw = nx - 1;
        let m = (nx - 1) * (ny - 1);
        self.m = m;
        self.bw = bw;
        self.l.clear();
        self.l.resize(m * (bw + 1), 0.0);
        self.y.resize(m, 0.0);
        let node = |q: usize| {
            let (jj, ii) = (q / bw, q % bw);
            (jj + 1) * w + ii + 1
        };
        let a = |i: usize, j: usize| -> f64 {
            // Entry (i, j) of the interior operator, j <= i, i - j <= bw.
            let d = i - j;
            let k = node(i);
            if let Some(m) = mask
                && (m[k] || m[node(j)])
            {
                return if d == 0 { 1.0 } else { 0.0 };
            }
            if d == 0 {
                1.0 / inv_diag[k]
            } else if d == 1 && !i.is_multiple_of(bw) {
                -level.ce[k - 1]
            } else if d == bw {
                -level.cn[k - w]
            } else {
                0.0
            }
        };
        for i in 0..m {
            let j0 = i.saturating_sub(bw);
            for j in j0..=i {
                let mut s = a(i, j);
                let k0 = i.saturating_sub(bw).max(j.saturating_sub(bw));
                for k in k0..j {
                    s -= self.l[i * (bw + 1) + (i - k)] * self.l[j * (bw + 1) + (j - k)];
                }
                if i == j {
                    self.l[i * (bw + 1)] = s.max(f64::MIN_POSITIVE).sqrt();
                } else {
                    self.l[i * (bw + 1) + (i - j)] = s / self.l[j * (bw + 1)];
                }
            }
        }
    }

    /// Solves `A u = f` on the interior nodes of `level` (the level that was factorised);
    /// boundary entries of `u` are set to zero.
    pub fn solve(&mut self, level: &Level, f: &[f64], u: &mut [f64]) {
        let w = level.grid.nx + 1;
        let (m, bw) = (self.m, self.bw);
        let node = |q: usize| (q / bw + 1) * w + q % bw + 1;
        for i in 0..m {
            let mut s = f[node(i)];
            for k in i.saturating_sub(bw)..i {
                s -= self.l[i * (bw + 1) + (i - k)] * self.y[k];
            }
            self.y[i] = s / self.l[i * (bw + 1)];
        }
        u.fill(0.0);
        for i in (0..m).rev() {
            let mut s = self.y[i];
            for k in i + 1..(i + bw + 1).min(m) {
                s -= self.l[k * (bw + 1) + (k - i)] * u[node(k)];
            }
            u[node(i)] = s / self.l[i * (bw + 1)];
        }
    }
}
