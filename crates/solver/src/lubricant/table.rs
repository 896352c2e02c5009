//! The dynamic viscosity of a [`Lubricant`] tabulated for fast evaluation at many nodes.
//!
//! The thermal pad renews the viscosity of every grid node after every energy solve; the
//! Walther form costs a logarithm and two exponentials per node. [`ViscosityTable`] replaces
//! them by a piecewise cubic Hermite interpolant of `μ(T)` on uniform steps of
//! [`TABLE_STEP_K`], built from the exact values and the exact (analytic) derivatives
//! `dμ/dT` at the step ends.
//!
//! Accuracy: on a step `h` the cubic Hermite interpolant of a smooth `f` errs by at most
//! `h⁴ max|f⁗| / 384` (the standard bound, e.g. Burden & Faires, *Numerical Analysis*,
//! Hermite interpolation error theorem; quoted from memory). For a Walther oil `d ln μ/dT` stays
//! near or below 0.1 /K from 10 °C up, so `|μ⁗/μ|` is of order 1e-4 /K⁴ and with `h` = 0.5 K
//! the relative error is a few 1e-8 (below 1e-7 even for a thick gear oil at 10 °C), far below
//! what the film temperature is solved to (a 0.05 K tolerance is a viscosity change of order
//! 1e-3). The unit tests check this against the direct law for thin and thick oils.
//!
//! Units: temperature in kelvin, viscosity in Pa·s. Outside the tabulated range, or where the
//! law itself fails, the evaluation falls back to [`Lubricant::dynamic_viscosity_pa_s`] and
//! returns its value or its error.

use super::{Lubricant, LubricantError};

/// Temperature step of the table, K.
pub const TABLE_STEP_K: f64 = 0.5;

/// Largest number of steps a table holds (a 2000 K span at the default step): wider ranges
/// are truncated at the hot end and fall back to the direct law there.
const MAX_STEPS: usize = 4000;

/// `μ(T)` as a piecewise cubic on uniform temperature steps.
#[derive(Clone, Debug)]
pub struct ViscosityTable {
    lubricant: Lubricant,
    /// First tabulated temperature, K.
    t0: f64,
    /// Steps per kelvin, 1/K.
    per_k: f64,
    /// Cubic coefficients of each step in the local variable `s = (T − T_i)/h ∈ [0, 1]`:
    /// `μ = c₀ + s (c₁ + s (c₂ + s c₃))`, Pa·s.
    cubic: Vec<[f64; 4]>,
}

impl ViscosityTable {
    /// Tabulates `lubricant` from `t_low_k` to at least `t_high_k` (K). Step ends where the law
    /// fails (an overflow far below the pour point, a density that reaches zero far above any
    /// use) end the table there; those temperatures then take the direct law and its error.
    pub fn new(lubricant: &Lubricant, t_low_k: f64, t_high_k: f64) -> Self {
        let per_k = 1.0 / TABLE_STEP_K;
        let span = t_high_k - t_low_k;
        let steps = if t_low_k.is_finite() && span.is_finite() && span > 0.0 {
            ((span * per_k).ceil() as usize).min(MAX_STEPS)
        } else {
            0
        };
        let mut cubic = Vec::with_capacity(steps);
        let end = |t: f64| -> Option<(f64, f64)> {
            let v = lubricant.dynamic_viscosity_pa_s(t).ok()?;
            let d = lubricant.dynamic_viscosity_derivative_pa_s_per_k(t).ok()?;
            (v.is_finite() && d.is_finite()).then_some((v, d * TABLE_STEP_K))
        };
        let mut left = if steps > 0 { end(t_low_k) } else { None };
        for i in 0..steps {
            let Some((y0, d0)) = left else { break };
            let Some((y1, d1)) = end(t_low_k + (i + 1) as f64 * TABLE_STEP_K) else {
                break;
            };
            cubic.push([
                y0,
                d0,
                3.0 * (y1 - y0) - 2.0 * d0 - d1,
                2.0 * (y0 - y1) + d0 + d1,
            ]);
            left = Some((y1, d1));
        }
        ViscosityTable {
            lubricant: lubricant.clone(),
            t0: t_low_k,
            per_k,
            cubic,
        }
    }

    /// Dynamic viscosity at `t_k` (K), Pa·s: the table inside its range, the direct law
    /// elsewhere.
    ///
    /// # Errors
    /// As [`Lubricant::dynamic_viscosity_pa_s`], outside the table.
    #[inline]
    pub fn dynamic_viscosity_pa_s(&self, t_k: f64) -> Result<f64, LubricantError> {
        let x = (t_k - self.t0) * self.per_k;
        // A NaN fails both comparisons and goes to the direct law, which reports it.
        if x >= 0.0 && x < self.cubic.len() as f64 {
            let i = x as usize;
            let s = x - i as f64;
            let c = &self.cubic[i];
            Ok(c[0] + s * (c[1] + s * (c[2] + s * c[3])))
        } else {
            self.lubricant.dynamic_viscosity_pa_s(t_k)
        }
    }

    /// The tabulated range `[low, high]`, K (empty when `low == high`).
    pub fn range_k(&self) -> (f64, f64) {
        (self.t0, self.t0 + self.cubic.len() as f64 * TABLE_STEP_K)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::lubricant::IsoVg;

    /// The interpolant against the direct Walther law (ASTM D341) on a fine sweep that hits
    /// every step at several interior points: relative error within the Hermite bound estimated
    /// in the module documentation (below 1e-7 at 0.5 K steps from 10 °C to 200 °C).
    #[test]
    fn table_reproduces_the_walther_law() {
        // The thinnest and thickest grades, and a thick gear oil given by ν40 = 680 mm²/s,
        // ν100 = 40 mm²/s (viscosities from memory, typical of an ISO VG 680 gear oil).
        let oils = [
            (
                "ISO VG 22",
                Lubricant::from_iso_vg(IsoVg::Vg22, 95.0).unwrap(),
            ),
            (
                "ISO VG 100",
                Lubricant::from_iso_vg(IsoVg::Vg100, 100.0).unwrap(),
            ),
            (
                "680/40",
                Lubricant::from_measured_m2_s(680e-6, 40e-6).unwrap(),
            ),
        ];
        for (grade, oil) in oils {
            let table = ViscosityTable::new(&oil, 283.15, 473.15);
            let (lo, hi) = table.range_k();
            assert!(lo <= 283.15 && hi >= 473.15, "{grade}: range {lo}..{hi}");
            let mut worst: f64 = 0.0;
            let mut t = 283.15;
            while t < 473.15 {
                let exact = oil.dynamic_viscosity_pa_s(t).unwrap();
                let tab = table.dynamic_viscosity_pa_s(t).unwrap();
                worst = worst.max((tab / exact - 1.0).abs());
                t += 0.0137;
            }
            assert!(worst < 1e-7, "{grade}: worst relative error {worst:e}");
        }
    }

    /// Step ends are exact, and outside the range the direct law (with its errors) answers.
    #[test]
    fn table_ends_and_outside_use_the_law() {
        let oil = Lubricant::from_iso_vg(IsoVg::Vg32, 100.0).unwrap();
        let table = ViscosityTable::new(&oil, 300.0, 320.0);
        for t in [300.0, 310.5, 319.5] {
            assert_eq!(
                table.dynamic_viscosity_pa_s(t).unwrap(),
                oil.dynamic_viscosity_pa_s(t).unwrap()
            );
        }
        for t in [290.0, 320.0, 400.0] {
            assert_eq!(
                table.dynamic_viscosity_pa_s(t).unwrap(),
                oil.dynamic_viscosity_pa_s(t).unwrap()
            );
        }
        assert!(table.dynamic_viscosity_pa_s(f64::NAN).is_err());
        assert!(table.dynamic_viscosity_pa_s(-1.0).is_err());
    }

    /// An isoviscous oil tabulates to its constant.
    #[test]
    fn isoviscous_table_is_constant() {
        let oil = Lubricant::isoviscous(0.02).unwrap();
        let table = ViscosityTable::new(&oil, 300.0, 400.0);
        for t in [300.0, 333.3, 399.9] {
            assert_eq!(table.dynamic_viscosity_pa_s(t).unwrap(), 0.02);
        }
    }
}
