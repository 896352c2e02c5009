//! Acceleration of the film-temperature fixed point.
//!
//! The coupled thermal pad iterates `T ← E(T)`: the energy equation solved with the pressure
//! (and viscosity) of the temperature field `T`. Plain substitution oscillates, and diverges
//! when the film runs hot, because the viscosity feedback is strong. [`Mixer`] applies
//! Anderson acceleration (type II, in the form of Walker & Ni, *SIAM J. Numer. Anal.* 49 (2011)
//! 1715–1735, quoted from memory) to the residual `r = E(T) − T` in kelvin:
//!
//! ```text
//! γ = argmin ‖r_k − ΔR γ‖₂,    T_{k+1} = T_k + β r_k − (ΔT + β ΔR) γ
//! ```
//!
//! with `ΔT`, `ΔR` the differences of the last `m` iterates and residuals ([`DEPTH`]) and `β`
//! the relaxation of the plain step, set dynamically by Aitken's formula
//! `β ← −β (r_{k−1}·(r_k − r_{k−1})) / ‖r_k − r_{k−1}‖²`, clamped to `[0.05, 1]` (Irons &
//! Tuck's Δ² method as used for fluid–structure coupling; from memory). The least-squares
//! problem (at most `m` columns) is solved by its normal equations after scaling to a unit
//! diagonal, dropping the oldest differences while the system is nearly singular. Where the
//! residual grows instead of falling the history is dropped and the step is the relaxed plain
//! one: the acceleration can then never do worse than the relaxation alone for long.

use std::collections::VecDeque;

/// Number of earlier iterates the acceleration combines.
pub const DEPTH: usize = 3;

/// Smallest pivot, relative to the unit diagonal, kept in the normal equations.
const PIVOT_FLOOR: f64 = 1e-10;

/// Anderson acceleration state for a vector fixed point (see the module documentation).
#[derive(Clone, Debug)]
pub struct Mixer {
    /// Differences of successive iterates `T_{i+1} − T_i`, newest last, K.
    dt: VecDeque<Vec<f64>>,
    /// Differences of successive residuals `r_{i+1} − r_i`, newest last, K.
    dr: VecDeque<Vec<f64>>,
    /// The last iterate and its residual, K.
    last: Option<(Vec<f64>, Vec<f64>)>,
    /// Relaxation of the plain step.
    beta: f64,
}

impl Default for Mixer {
    fn default() -> Self {
        Mixer {
            dt: VecDeque::new(),
            dr: VecDeque::new(),
            last: None,
            beta: INITIAL_RELAXATION,
        }
    }
}

/// Relaxation of the first step after a restart.
pub const INITIAL_RELAXATION: f64 = 0.5;

impl Mixer {
    /// Forgets the history (the next step is a relaxed plain step).
    pub fn restart(&mut self) {
        *self = Mixer::default();
    }

    /// Forgets the history but keeps the relaxation `beta` (clamped to `[0.05, 1]`) for the
    /// next plain step: for the same fixed point on another grid, whose feedback is as strong.
    pub fn restart_relaxed(&mut self, beta: f64) {
        *self = Mixer {
            beta: beta.clamp(0.05, 1.0),
            ..Mixer::default()
        };
    }

    /// The relaxation of the plain step in force.
    pub fn relaxation(&self) -> f64 {
        self.beta
    }

    /// The step from iterate `t` with residual `r = E(t) − t` (both K at the nodes): writes
    /// the step into `step` (K), without applying it.
    pub fn step(&mut self, t: &[f64], r: &[f64], step: &mut [f64]) {
        let n = t.len();
        debug_assert!(r.len() == n && step.len() == n);
        if self
            .last
            .as_ref()
            .is_some_and(|(t_prev, _)| t_prev.len() != n)
        {
            // A field of another size: nothing to combine with.
            self.restart();
        }
        let norm2 = |v: &[f64]| v.iter().map(|x| x * x).sum::<f64>();
        if let Some((t_prev, r_prev)) = &self.last {
            // Reuse the storage of the oldest difference once the history is full.
            let (mut d_t, mut d_r) = if self.dt.len() == DEPTH {
                (self.dt.pop_front().unwrap(), self.dr.pop_front().unwrap())
            } else {
                (vec![0.0; n], vec![0.0; n])
            };
            let (mut num, mut den) = (0.0, 0.0);
            for k in 0..n {
                let d = r[k] - r_prev[k];
                num += r_prev[k] * d;
                den += d * d;
                d_t[k] = t[k] - t_prev[k];
                d_r[k] = d;
            }
            if den > 0.0 {
                self.beta = (-self.beta * num / den).clamp(0.05, 1.0);
            }
            if norm2(r) > norm2(r_prev) {
                // No progress: drop the combination, keep the relaxation.
                self.dt.clear();
                self.dr.clear();
            } else {
                self.dt.push_back(d_t);
                self.dr.push_back(d_r);
            }
        }
        let gamma = self.coefficients(r);
        for k in 0..n {
            let mut s = self.beta * r[k];
            for (c, (d_t, d_r)) in gamma.iter().zip(self.dt.iter().zip(&self.dr)) {
                s -= c * (d_t[k] + self.beta * d_r[k]);
            }
            step[k] = s;
        }
        match &mut self.last {
            Some((t_prev, r_prev)) if t_prev.len() == n => {
                t_prev.copy_from_slice(t);
                r_prev.copy_from_slice(r);
            }
            last => *last = Some((t.to_vec(), r.to_vec())),
        }
    }

    /// Least-squares coefficients `γ` of `min ‖r − ΔR γ‖` over the stored differences (zero
    /// for the ones dropped as degenerate).
    // Index loops read best in this small dense Cholesky factorisation.
    #[allow(clippy::needless_range_loop)]
    fn coefficients(&self, r: &[f64]) -> Vec<f64> {
        let m = self.dr.len();
        let mut gamma = vec![0.0; m];
        if m == 0 {
            return gamma;
        }
        let mut g = [[0.0f64; DEPTH]; DEPTH];
        let mut b = [0.0f64; DEPTH];
        for i in 0..m {
            for j in 0..=i {
                g[i][j] = dot(&self.dr[i], &self.dr[j]);
            }
            b[i] = dot(&self.dr[i], r);
        }
        // Scale to a unit diagonal; drop the oldest differences until the Cholesky factor of
        // the remaining (newest) columns has healthy pivots.
        let s: Vec<f64> = (0..m)
            .map(|i| {
                if g[i][i] > 0.0 {
                    1.0 / g[i][i].sqrt()
                } else {
                    0.0
                }
            })
            .collect();
        for first in 0..m {
            let k = m - first;
            let idx: Vec<usize> = (first..m).collect();
            let mut l = [[0.0f64; DEPTH]; DEPTH];
            let mut ok = true;
            for a in 0..k {
                for c in 0..=a {
                    let (i, j) = (idx[a], idx[c]);
                    let mut v = g[i][j] * s[i] * s[j];
                    for q in 0..c {
                        v -= l[a][q] * l[c][q];
                    }
                    if a == c {
                        if v <= PIVOT_FLOOR || !v.is_finite() {
                            ok = false;
                            break;
                        }
                        l[a][a] = v.sqrt();
                    } else {
                        l[a][c] = v / l[c][c];
                    }
                }
                if !ok {
                    break;
                }
            }
            if !ok {
                continue;
            }
            // Forward and back substitution on the scaled system.
            let mut y = [0.0f64; DEPTH];
            for a in 0..k {
                let mut v = b[idx[a]] * s[idx[a]];
                for q in 0..a {
                    v -= l[a][q] * y[q];
                }
                y[a] = v / l[a][a];
            }
            for a in (0..k).rev() {
                let mut v = y[a];
                for q in a + 1..k {
                    v -= l[q][a] * y[q];
                }
                y[a] = v / l[a][a];
            }
            for a in 0..k {
                gamma[idx[a]] = y[a] * s[idx[a]];
            }
            break;
        }
        gamma
    }
}

fn dot(a: &[f64], b: &[f64]) -> f64 {
    a.iter().zip(b).map(|(x, y)| x * y).sum()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// On a linear fixed point `x = M x + c` in n dimensions, Anderson acceleration with depth
    /// m ≥ n is essentially GMRES and reaches the fixed point in at most n + 1 steps in exact
    /// arithmetic (Walker & Ni 2011, from memory): here n = 3, so four steps (one more allowed
    /// for rounding), where the relaxed substitution it starts from (the same mixer restarted
    /// before every step) needs well over fifty.
    #[test]
    fn linear_fixed_point_converges_like_gmres() {
        let m = [[0.9, 0.2, 0.0], [-0.3, 0.5, 0.4], [0.1, 0.0, -0.8]];
        let c = [1.0, -2.0, 0.5];
        let g = |x: &[f64]| -> Vec<f64> {
            (0..3)
                .map(|i| (0..3).map(|j| m[i][j] * x[j]).sum::<f64>() + c[i])
                .collect()
        };
        let steps_to_converge = |accelerate: bool| {
            let mut mixer = Mixer::default();
            let mut x = vec![0.0; 3];
            let mut step = vec![0.0; 3];
            for it in 0..500 {
                let r: Vec<f64> = g(&x).iter().zip(&x).map(|(gx, xi)| gx - xi).collect();
                if r.iter().map(|v| v * v).sum::<f64>().sqrt() < 1e-10 {
                    return it;
                }
                if !accelerate {
                    mixer.restart();
                }
                mixer.step(&x, &r, &mut step);
                for (xi, s) in x.iter_mut().zip(&step) {
                    *xi += s;
                }
            }
            usize::MAX
        };
        let accelerated = steps_to_converge(true);
        let plain = steps_to_converge(false);
        assert!(accelerated <= 5, "accelerated: {accelerated} steps");
        assert!(
            plain > 50 && plain < usize::MAX,
            "relaxed substitution: {plain} steps"
        );
    }

    /// Degenerate history (repeated identical residual differences) is dropped, not divided by.
    #[test]
    fn degenerate_history_gives_finite_steps() {
        let mut mixer = Mixer::default();
        let mut step = vec![0.0; 2];
        for k in 0..6 {
            let t = [k as f64, k as f64];
            let r = [1.0 / (k + 1) as f64, 1.0 / (k + 1) as f64];
            mixer.step(&t, &r, &mut step);
            assert!(step.iter().all(|s| s.is_finite()), "{step:?}");
        }
    }
}
