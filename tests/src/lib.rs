//! Shared reference formulas and small numerical helpers for the Padwright validation suite.
//!
//! Nothing in this crate calls the solver's numerics: the formulas here are re-derived from
//! published closed forms so that the checks in `tests/tests/*.rs` compare the solver against
//! something outside the project.
//!
//! * [`slider`]: the infinitely wide fixed-incline and tapered-land (taper–flat) sliders —
//!   Reynolds (1886); closed forms as in Cameron, *Basic Lubrication Theory*, and Hamrock,
//!   Schmid & Jacobson, *Fundamentals of Fluid Film Lubrication*.
//! * [`convergence`]: observed order of accuracy and Richardson extrapolation — Roache (1998),
//!   *Verification and Validation in Computational Science and Engineering*.
//! * [`quadrature`]: trapezoidal weights and one-sided differences on (possibly non-uniform)
//!   node sets — textbook numerical analysis.
#![forbid(unsafe_code)]

pub mod slider {
    //! The infinitely wide (no side leakage) slider bearing with a piecewise-linear film.
    //!
    //! Reynolds (1886) integrated the one-dimensional equation for the plane inclined slider;
    //! the closed forms below follow Cameron, *Basic Lubrication Theory* (the inclined
    //! slider), and Hamrock, Schmid & Jacobson, *Fundamentals of Fluid Film Lubrication*
    //! (analytical solutions for thrust bearings; chapter numbers not given, cited from
    //! memory).
    //!
    //! Dimensionless variables: `ξ = x/L` from the leading (inlet) edge, `H = h/h0` with `h0`
    //! the smallest (outlet or land) film, `P = p h0²/(μ U L)`. The runner moves from the
    //! leading to the trailing edge at speed `U` over a stationary pad. The one-dimensional
    //! Reynolds equation with constant flow per unit width `q = U h*/2` is
    //!
    //! ```text
    //! dP/dξ = 6 (H − H*) / H³ ,   P(0) = P(1) = 0 ,   H* = 2 q/(U h0).
    //! ```
    //!
    //! With `J(k, m) = ∫₀¹ ξᵏ H⁻ᵐ dξ` (closed-form on every linear piece of `H`):
    //!
    //! * `P(1) = 0` gives `H* = J(0,2)/J(0,3)`, so `q/(U h0) = H*/2`;
    //! * load per unit width, by parts (`P` vanishes at both ends):
    //!   `W' h0²/(μ U L²) = ∫P dξ = −∫ξ P' dξ = −6 [J(1,2) − H* J(1,3)]`;
    //! * moment about the leading edge: `∫ξ P dξ = −½∫ξ² P' dξ = −3 [J(2,2) − H* J(2,3)]`;
    //! * runner friction per unit width: the shear on the runner is `μU/h + (h/2) dp/dx`, so
    //!   `F h0/(μ U L) = ∫(1/H + (H/2) P') dξ = 4 J(0,1) − 3 H* J(0,2)`;
    //! * the pressure peaks where `H = H*`.

    /// A film `H(ξ) = h/h0` that is linear on each piece between the knots.
    #[derive(Clone, Debug, PartialEq)]
    pub struct PiecewiseLinearFilm {
        /// Knots `(ξ, H)` with increasing `ξ` from 0 to 1.
        knots: Vec<(f64, f64)>,
    }

    /// Everything the one-dimensional solution gives, dimensionless.
    #[derive(Clone, Copy, Debug, PartialEq)]
    pub struct SliderSolution {
        /// `W' h0² / (μ U L²)`: load per unit width.
        pub load: f64,
        /// `x_cp / L`: centre of pressure from the leading edge.
        pub centre_of_pressure: f64,
        /// `q / (U h0)`: volume flow per unit width.
        pub flow: f64,
        /// `F h0 / (μ U L)`: friction force on the runner per unit width.
        pub friction: f64,
        /// `p_max h0² / (μ U L)`: peak pressure.
        pub peak_pressure: f64,
        /// `x / L` of the peak pressure.
        pub peak_at: f64,
        /// `H* = h*/h0`: film where the pressure gradient vanishes.
        pub h_star: f64,
    }

    impl PiecewiseLinearFilm {
        /// A film through the given knots `(ξ, H)`; `ξ` must start at 0, end at 1 and increase,
        /// and `H` must be positive.
        pub fn new(knots: Vec<(f64, f64)>) -> Self {
            assert!(knots.len() >= 2, "at least two knots");
            assert_eq!(knots[0].0, 0.0, "first knot at the leading edge");
            assert_eq!(
                knots[knots.len() - 1].0,
                1.0,
                "last knot at the trailing edge"
            );
            assert!(knots.windows(2).all(|w| w[1].0 > w[0].0), "increasing ξ");
            assert!(knots.iter().all(|k| k.1 > 0.0), "positive film");
            PiecewiseLinearFilm { knots }
        }

        /// The plane inclined slider `H = 1 + K (1 − ξ)` (inlet-to-outlet film ratio `1 + K`).
        pub fn inclined(k: f64) -> Self {
            Self::new(vec![(0.0, 1.0 + k), (1.0, 1.0)])
        }

        /// The tapered-land (taper–flat) slider: `H = 1 + D (1 − ξ/a)` for `ξ < a`, `H = 1`
        /// on the land; `a` is the taper fraction of the length, `D` the taper depth over `h0`.
        pub fn tapered_land(a: f64, d: f64) -> Self {
            if a >= 1.0 {
                Self::inclined(d)
            } else {
                Self::new(vec![(0.0, 1.0 + d), (a, 1.0), (1.0, 1.0)])
            }
        }

        /// `H(ξ)`.
        pub fn at(&self, xi: f64) -> f64 {
            let k = &self.knots;
            let s = k
                .windows(2)
                .position(|w| xi <= w[1].0)
                .unwrap_or(k.len() - 2);
            let ((x0, h0), (x1, h1)) = (k[s], k[s + 1]);
            h0 + (h1 - h0) * (xi - x0) / (x1 - x0)
        }

        /// `∫ ξᵏ H(ξ)⁻ᵐ dξ` from `lo` to `hi` (0 ≤ lo ≤ hi ≤ 1), in closed form on each piece.
        pub fn moment_integral(&self, k: u32, m: u32, lo: f64, hi: f64) -> f64 {
            let mut s = 0.0;
            for w in self.knots.windows(2) {
                let ((x0, h0), (x1, h1)) = (w[0], w[1]);
                let (a, b) = (lo.max(x0), hi.min(x1));
                if b <= a {
                    continue;
                }
                let slope = (h1 - h0) / (x1 - x0);
                s += linear_piece_integral(k, m, h0 - slope * x0, slope, a, b);
            }
            s
        }

        /// `J(k, m) = ∫₀¹ ξᵏ H⁻ᵐ dξ`.
        pub fn j(&self, k: u32, m: u32) -> f64 {
            self.moment_integral(k, m, 0.0, 1.0)
        }

        /// `H* = J(0,2)/J(0,3)` from `P(1) = 0`.
        pub fn h_star(&self) -> f64 {
            self.j(0, 2) / self.j(0, 3)
        }

        /// Dimensionless pressure `P(ξ) = 6 ∫₀^ξ (H⁻² − H* H⁻³) dξ'`.
        pub fn pressure(&self, xi: f64) -> f64 {
            let hs = self.h_star();
            6.0 * (self.moment_integral(0, 2, 0.0, xi) - hs * self.moment_integral(0, 3, 0.0, xi))
        }

        /// The whole solution.
        pub fn solve(&self) -> SliderSolution {
            let hs = self.h_star();
            let load = -6.0 * (self.j(1, 2) - hs * self.j(1, 3));
            let moment = -3.0 * (self.j(2, 2) - hs * self.j(2, 3));
            let friction = 4.0 * self.j(0, 1) - 3.0 * hs * self.j(0, 2);
            // H decreases monotonically from the inlet here (taper or incline, then land), so
            // the peak is where the first piece reaches H*; if H* is at or below the smallest
            // film the peak is at the end of the taper.
            let peak_at = self
                .knots
                .windows(2)
                .find_map(|w| {
                    let ((x0, h0), (x1, h1)) = (w[0], w[1]);
                    ((h0 - hs) * (h1 - hs) <= 0.0 && h0 != h1)
                        .then(|| x0 + (hs - h0) / (h1 - h0) * (x1 - x0))
                })
                .unwrap_or(self.knots[1].0);
            SliderSolution {
                load,
                centre_of_pressure: moment / load,
                flow: 0.5 * hs,
                friction,
                peak_pressure: self.pressure(peak_at),
                peak_at,
                h_star: hs,
            }
        }
    }

    /// `∫ₐᵇ xᵏ (A + B x)⁻ᵐ dx` in closed form for `k ≤ 2`, `m ≥ 1`.
    ///
    /// For `B ≠ 0` substitute `u = A + B x`, `x = (u − A)/B` and expand `(u − A)ᵏ` binomially:
    /// every term is a power of `u` (a logarithm for `u⁻¹`). For `B = 0` it is a polynomial.
    pub fn linear_piece_integral(k: u32, m: u32, a_coef: f64, b_coef: f64, a: f64, b: f64) -> f64 {
        assert!(k <= 2 && m >= 1);
        if b_coef.abs() < 1e-12 * a_coef.abs() {
            return (b.powi(k as i32 + 1) - a.powi(k as i32 + 1))
                / (k as f64 + 1.0)
                / a_coef.powi(m as i32);
        }
        let (ua, ub) = (a_coef + b_coef * a, b_coef * b + a_coef);
        let binom = |k: u32, j: u32| -> f64 {
            match (k, j) {
                (_, 0) => 1.0,
                (k, j) if j == k => 1.0,
                _ => k as f64, // (2, 1) is the only other case for k ≤ 2
            }
        };
        let mut s = 0.0;
        for j in 0..=k {
            let n = j as i32 - m as i32; // power of u
            let int_u = if n == -1 {
                (ub / ua).ln()
            } else {
                (ub.powi(n + 1) - ua.powi(n + 1)) / (n as f64 + 1.0)
            };
            s += binom(k, j) * (-a_coef).powi((k - j) as i32) * int_u;
        }
        s / b_coef.powi(k as i32 + 1)
    }

    /// Load per unit width of the plane inclined slider in Reynolds' closed form,
    /// `W' h0²/(μ U L²) = (6/K²) [ln(1 + K) − 2K/(2 + K)]` (Cameron; Hamrock, Schmid & Jacobson).
    pub fn inclined_load(k: f64) -> f64 {
        6.0 / (k * k) * ((1.0 + k).ln() - 2.0 * k / (2.0 + k))
    }

    /// Flow per unit width of the plane inclined slider, `q/(U h0) = (1 + K)/(2 + K)`
    /// (Cameron; Hamrock, Schmid & Jacobson).
    pub fn inclined_flow(k: f64) -> f64 {
        (1.0 + k) / (2.0 + k)
    }

    /// Runner friction per unit width of the plane inclined slider,
    /// `F h0/(μ U L) = 4 ln(1 + K)/K − 6/(2 + K)` (Cameron; Hamrock, Schmid & Jacobson).
    pub fn inclined_friction(k: f64) -> f64 {
        4.0 * (1.0 + k).ln() / k - 6.0 / (2.0 + k)
    }

    /// Pressure of the plane inclined slider,
    /// `P(ξ) = 6 K ξ (1 − ξ) / ((2 + K) (1 + K (1 − ξ))²)` (Cameron).
    pub fn inclined_pressure(k: f64, xi: f64) -> f64 {
        6.0 * k * xi * (1.0 - xi) / ((2.0 + k) * (1.0 + k * (1.0 - xi)).powi(2))
    }

    /// The film ratio `K` that maximises the load of the plane inclined slider
    /// (`d W'/dK = 0`, classically `K ≈ 1.1887`), by golden-section search.
    pub fn inclined_optimum() -> f64 {
        golden_max(inclined_load, 0.5, 2.5)
    }

    /// The taper depth `D` that maximises the load of a tapered-land slider with taper
    /// fraction `a`, by golden-section search on the closed form.
    pub fn tapered_land_optimum(a: f64) -> f64 {
        golden_max(
            |d| PiecewiseLinearFilm::tapered_land(a, d).solve().load,
            0.3,
            3.0,
        )
    }

    /// The film ratio `K` whose centre of pressure is at `cp` (x/L), by bisection
    /// (the centre of pressure increases monotonically with `K`).
    pub fn inclined_ratio_for_centre(cp: f64) -> f64 {
        let f = |k: f64| PiecewiseLinearFilm::inclined(k).solve().centre_of_pressure - cp;
        let (mut lo, mut hi) = (1e-3, 50.0);
        assert!(
            f(lo) < 0.0 && f(hi) > 0.0,
            "centre of pressure out of range"
        );
        for _ in 0..200 {
            let mid = 0.5 * (lo + hi);
            if f(mid) < 0.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        0.5 * (lo + hi)
    }

    fn golden_max(f: impl Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
        let g = 0.5 * (5f64.sqrt() - 1.0);
        let mut c = b - g * (b - a);
        let mut d = a + g * (b - a);
        while (b - a).abs() > 1e-10 {
            if f(c) > f(d) {
                b = d;
            } else {
                a = c;
            }
            c = b - g * (b - a);
            d = a + g * (b - a);
        }
        0.5 * (a + b)
    }

    #[cfg(test)]
    mod tests {
        use super::*;
        use approx::assert_abs_diff_eq;

        /// Tabulated closed-form values of the inclined slider (shared reference list, computed
        /// from Reynolds' closed form; Cameron; Hamrock, Schmid & Jacobson). The tables carry
        /// 4–5 significant figures, so agreement is asked to half a unit of the last digit.
        #[test]
        fn inclined_slider_table() {
            for (k, w, cp) in [
                (0.5, 0.13116, 0.5404),
                (1.0, 0.15888, 0.5687),
                (1.1887, 0.16024, 0.5774),
                (2.0, 0.14792, 0.6074),
                (3.0, 0.12420, 0.6338),
            ] {
                let s = PiecewiseLinearFilm::inclined(k).solve();
                assert_abs_diff_eq!(s.load, w, epsilon = 5e-6);
                assert_abs_diff_eq!(s.centre_of_pressure, cp, epsilon = 5e-5);
                // The general piecewise integration agrees with Reynolds' explicit formulas.
                assert_abs_diff_eq!(s.load, inclined_load(k), epsilon = 1e-13);
                assert_abs_diff_eq!(s.flow, inclined_flow(k), epsilon = 1e-13);
                assert_abs_diff_eq!(s.friction, inclined_friction(k), epsilon = 1e-12);
                for xi in [0.1, 0.37, 0.5, 0.81] {
                    assert_abs_diff_eq!(
                        PiecewiseLinearFilm::inclined(k).pressure(xi),
                        inclined_pressure(k, xi),
                        epsilon = 1e-12
                    );
                }
            }
        }

        /// At the optimum film ratio K = 1.1887 (shared reference list: flow 0.6864, friction
        /// 0.7542, peak 0.2555 at x/L = 0.686; Cameron; Hamrock, Schmid & Jacobson).
        #[test]
        fn inclined_slider_optimum() {
            let k = inclined_optimum();
            assert_abs_diff_eq!(k, 1.1887, epsilon = 5e-5);
            let s = PiecewiseLinearFilm::inclined(1.1887).solve();
            assert_abs_diff_eq!(s.load, 0.16024, epsilon = 1e-5);
            assert_abs_diff_eq!(s.centre_of_pressure, 0.5774, epsilon = 5e-5);
            assert_abs_diff_eq!(s.flow, 0.6864, epsilon = 5e-5);
            assert_abs_diff_eq!(s.friction, 0.7542, epsilon = 5e-5);
            assert_abs_diff_eq!(s.peak_pressure, 0.2555, epsilon = 5e-5);
            assert_abs_diff_eq!(s.peak_at, 0.686, epsilon = 5e-4);
        }

        /// Tapered-land table (shared reference list, from the piecewise closed form).
        #[test]
        fn tapered_land_table() {
            for (a, d, w, cp, q) in [
                (0.8, 0.5, 0.15346, 0.5237, 0.5690),
                (0.8, 1.0, 0.18969, 0.5499, 0.6000),
                (0.8, 1.5, 0.19022, 0.5696, 0.6132),
                (0.7, 1.0, 0.18519, 0.5284, 0.5778),
            ] {
                let s = PiecewiseLinearFilm::tapered_land(a, d).solve();
                assert_abs_diff_eq!(s.load, w, epsilon = 5e-6);
                assert_abs_diff_eq!(s.centre_of_pressure, cp, epsilon = 5e-5);
                assert_abs_diff_eq!(s.flow, q, epsilon = 5e-5);
            }
            // Optima: a = 0.8 → D = 1.241, 0.19230; a = 0.7 → D = 1.194, 0.18691.
            for (a, d_opt, w_max) in [(0.8, 1.241, 0.19230), (0.7, 1.194, 0.18691)] {
                let d = tapered_land_optimum(a);
                assert_abs_diff_eq!(d, d_opt, epsilon = 5e-4);
                let s = PiecewiseLinearFilm::tapered_land(a, d).solve();
                assert_abs_diff_eq!(s.load, w_max, epsilon = 5e-6);
            }
        }

        /// The closed-form integrals against a fine composite Simpson rule of the pressure
        /// (independent quadrature of the same ODE solution).
        #[test]
        fn closed_form_matches_quadrature() {
            let f = PiecewiseLinearFilm::tapered_land(0.7, 1.3);
            let s = f.solve();
            let n = 2000;
            let (mut w, mut m) = (0.0, 0.0);
            for i in 0..=n {
                let x = i as f64 / n as f64;
                let c = if i == 0 || i == n {
                    1.0
                } else if i % 2 == 1 {
                    4.0
                } else {
                    2.0
                } / (3.0 * n as f64);
                let p = f.pressure(x);
                w += c * p;
                m += c * p * x;
            }
            // Simpson on a kinked integrand (kink at 0.7, which is a node of this grid:
            // 0.7·2000 = 1400 is even) converges at fourth order: 1e-9 is ample.
            assert_abs_diff_eq!(w, s.load, epsilon = 1e-9);
            assert_abs_diff_eq!(m / w, s.centre_of_pressure, epsilon = 1e-9);
            assert_abs_diff_eq!(f.pressure(1.0), 0.0, epsilon = 1e-13);
            // The peak is where dP/dξ = 0.
            let e = 1e-6;
            assert!(f.pressure(s.peak_at) >= f.pressure(s.peak_at - e));
            assert!(f.pressure(s.peak_at) >= f.pressure(s.peak_at + e));
        }
    }
}

pub mod convergence {
    //! Observed order of accuracy and Richardson extrapolation (Roache 1998, *Verification
    //! and Validation in Computational Science and Engineering*; ASME V&V 20).

    /// Observed order from errors on two grids whose spacings differ by `ratio`:
    /// `p = ln(e_coarse/e_fine)/ln(ratio)`.
    pub fn observed_order(e_coarse: f64, e_fine: f64, ratio: f64) -> f64 {
        (e_coarse.abs() / e_fine.abs()).ln() / ratio.ln()
    }

    /// Observed order from three solutions on grids refined by a constant `ratio`
    /// (coarse, medium, fine), without the exact answer:
    /// `p = ln((f₁ − f₂)/(f₂ − f₃))/ln r`.
    pub fn observed_order_three(f_coarse: f64, f_medium: f64, f_fine: f64, ratio: f64) -> f64 {
        ((f_coarse - f_medium) / (f_medium - f_fine)).ln() / ratio.ln()
    }

    /// Richardson extrapolation of the fine solution with order `p`:
    /// `f∞ = f_fine + (f_fine − f_coarse)/(rᵖ − 1)`.
    pub fn richardson(f_coarse: f64, f_fine: f64, ratio: f64, p: f64) -> f64 {
        f_fine + (f_fine - f_coarse) / (ratio.powf(p) - 1.0)
    }

    #[cfg(test)]
    mod tests {
        use super::*;
        use approx::assert_relative_eq;

        /// A sequence `f(h) = 1 + 3h²` has order 2 and extrapolates to 1 exactly.
        #[test]
        fn exact_on_a_quadratic_sequence() {
            let f = |h: f64| 1.0 + 3.0 * h * h;
            assert_relative_eq!(
                observed_order_three(f(0.4), f(0.2), f(0.1), 2.0),
                2.0,
                epsilon = 1e-12
            );
            assert_relative_eq!(observed_order(f(0.2) - 1.0, f(0.1) - 1.0, 2.0), 2.0);
            assert_relative_eq!(richardson(f(0.2), f(0.1), 2.0, 2.0), 1.0, epsilon = 1e-14);
        }
    }
}

pub mod quadrature {
    //! Trapezoidal weights and finite differences on node sets (textbook numerical analysis;
    //! e.g. Press et al., *Numerical Recipes*).

    /// Trapezoidal weights of the nodes `x` (non-uniform allowed): half of each adjacent
    /// interval. Second-order accurate for smooth integrands and for integrands with kinks at
    /// nodes.
    pub fn trapezoid_weights(x: &[f64]) -> Vec<f64> {
        let n = x.len();
        (0..n)
            .map(|i| {
                let lo = if i == 0 {
                    x[0]
                } else {
                    0.5 * (x[i - 1] + x[i])
                };
                let hi = if i + 1 == n {
                    x[n - 1]
                } else {
                    0.5 * (x[i] + x[i + 1])
                };
                hi - lo
            })
            .collect()
    }

    /// `df/dx` at node `i` of a (possibly non-uniform) node set: the derivative of the
    /// quadratic through three neighbouring nodes (central inside, one-sided at the ends).
    /// Second-order accurate.
    pub fn derivative(x: &[f64], f: &[f64], i: usize) -> f64 {
        let n = x.len();
        let (a, b, c) = if i == 0 {
            (0, 1, 2)
        } else if i + 1 == n {
            (n - 3, n - 2, n - 1)
        } else {
            (i - 1, i, i + 1)
        };
        // Derivative of the Lagrange interpolant through (a, b, c) at x[i].
        let xi = x[i];
        let (xa, xb, xc) = (x[a], x[b], x[c]);
        f[a] * ((xi - xb) + (xi - xc)) / ((xa - xb) * (xa - xc))
            + f[b] * ((xi - xa) + (xi - xc)) / ((xb - xa) * (xb - xc))
            + f[c] * ((xi - xa) + (xi - xb)) / ((xc - xa) * (xc - xb))
    }

    #[cfg(test)]
    mod tests {
        use super::*;
        use approx::assert_relative_eq;

        /// Both rules are exact for quadratics (trapezoid: for linear functions).
        #[test]
        fn exact_for_low_degree() {
            let x = [0.0, 0.1, 0.35, 0.5, 0.9, 1.0];
            let f: Vec<f64> = x.iter().map(|&x| 2.0 + 3.0 * x - x * x).collect();
            for i in 0..x.len() {
                assert_relative_eq!(derivative(&x, &f, i), 3.0 - 2.0 * x[i], epsilon = 1e-12);
            }
            let w = trapezoid_weights(&x);
            let lin: f64 = w.iter().zip(&x).map(|(w, x)| w * (1.0 + x)).sum();
            assert_relative_eq!(lin, 1.5, epsilon = 1e-14);
        }
    }
}

pub mod pads {
    //! Small builders and field accessors around the solver, shared by the checks. They set
    //! up inputs and read outputs; they compute no reference values.

    use padwright_solver::film::{FilmModel, Support};
    use padwright_solver::geometry::{PadFrame, PadOutline, RunnerSpeed};
    use padwright_solver::grid::Grid;
    use padwright_solver::reynolds::stencil::Level;
    use padwright_solver::reynolds::{ReynoldsSettings, ReynoldsSolver};

    /// A pressure solver for a pad; the grid gets a line at the support's kink (if any).
    pub fn solver(
        outline: PadOutline,
        speed: RunnerSpeed,
        support: Support,
        nodes_along: usize,
        nodes_across: usize,
        settings: ReynoldsSettings,
    ) -> ReynoldsSolver {
        let grid = Grid::new(nodes_along, nodes_across, support.breakpoint()).unwrap();
        solver_on(outline, speed, support, grid, settings)
    }

    /// A pressure solver for a pad on a given grid.
    pub fn solver_on(
        outline: PadOutline,
        speed: RunnerSpeed,
        support: Support,
        grid: Grid,
        settings: ReynoldsSettings,
    ) -> ReynoldsSolver {
        let frame = PadFrame::new(outline, speed).unwrap();
        let film = FilmModel::new(outline, support).unwrap();
        ReynoldsSolver::new(frame, film, grid, settings)
    }

    /// Row `j` (fixed `η`) of a nodal field, along the motion.
    pub fn row(solver: &ReynoldsSolver, field: &[f64], j: usize) -> Vec<f64> {
        let g = solver.grid();
        (0..=g.nx).map(|i| field[g.idx(i, j)]).collect()
    }

    /// `A p` of the finite-volume operator at the interior nodes of a level, from its face
    /// conductances (`ce`, `cn`) and diagonal (`1/inv_diag`): the five-point matrix written
    /// out here, independently of the solver's own residual routine. Boundary entries are
    /// zero (the boundary pressure is the ambient, zero gauge).
    pub fn apply_operator(level: &Level, p: &[f64]) -> Vec<f64> {
        let g = &level.grid;
        let w = g.nx + 1;
        let mut out = vec![0.0; g.len()];
        for j in 1..g.ny {
            for i in 1..g.nx {
                let k = g.idx(i, j);
                out[k] = p[k] / level.inv_diag[k]
                    - level.ce[k] * p[k + 1]
                    - level.ce[k - 1] * p[k - 1]
                    - level.cn[k] * p[k + w]
                    - level.cn[k - w] * p[k - w];
            }
        }
        out
    }

    /// Flat indices of the interior nodes, in the solver's node order.
    pub fn interior(level: &Level) -> Vec<usize> {
        let g = &level.grid;
        (1..g.ny)
            .flat_map(|j| (1..g.nx).map(move |i| g.idx(i, j)))
            .collect()
    }

    /// Column `i` (fixed `ξ`) of a nodal field, across the motion.
    pub fn column(solver: &ReynoldsSolver, field: &[f64], i: usize) -> Vec<f64> {
        let g = solver.grid();
        (0..=g.ny).map(|j| field[g.idx(i, j)]).collect()
    }
}
