//! Viscosity–temperature line of ASTM D341 (Walther form).
//!
//! # Model
//!
//! ASTM D341 plots mineral oils as straight lines on a chart whose ordinate is
//! `log10 log10(ν + 0.7)` and whose abscissa is `log10 T`:
//!
//! ```text
//! log10 log10(ν + 0.7) = A − B · log10(T)
//! ```
//!
//! with ν the kinematic viscosity in **mm²/s** (cSt) and T the absolute
//! temperature in **kelvin**. These are the standard's own units, so every
//! function here takes and returns them, and the names say so. Convert to SI
//! (m²/s) with [`super::mm2_s_to_m2_s`] before handing a value to the solver.
//!
//! Two measured points fix A and B. Writing `Z(ν) = log10 log10(ν + 0.7)`:
//!
//! ```text
//! B = (Z(ν1) − Z(ν2)) / (log10 T2 − log10 T1),    A = Z(ν1) + B · log10 T1
//! ```
//!
//! and the line is read in both directions:
//!
//! ```text
//! ν(T) = 10^(10^(A − B·log10 T)) − 0.7
//! T(ν) = 10^((A − Z(ν)) / B)
//! dν/dT = −B · ln(10) · (ν + 0.7) · log10(ν + 0.7) / T      [mm²/s per K]
//! ```
//!
//! # Range of validity
//!
//! The simple `ν + 0.7` form is meant for ν ≥ 2 mm²/s (ASTM D341); later
//! editions of the standard add correction terms below that, which this module
//! does not model. The defining points must therefore be at least 2 mm²/s, and
//! [`WaltherLine::max_valid_temperature_k`] gives the temperature at which the
//! line falls to 2 mm²/s. Evaluation itself is not refused outside that range
//! (a thermal solver may step past it while iterating); callers that need the
//! limit should check it.
//!
//! Source: ASTM D341, Standard Practice for Viscosity–Temperature Equations and
//! Charts for Liquid Petroleum or Hydrocarbon Products.

use serde::{Deserialize, Serialize};

use super::error::{LubricantError, positive, temperature_k};

/// The constant added to ν (in mm²/s) inside the double logarithm of the ASTM D341 form.
pub const WALTHER_OFFSET_MM2_S: f64 = 0.7;

/// The lowest kinematic viscosity, in mm²/s, for which the simple ASTM D341 form is meant.
pub const WALTHER_MIN_VALID_NU_MM2_S: f64 = 2.0;

/// A straight line on the ASTM D341 chart: `log10 log10(ν + 0.7) = A − B·log10(T)`,
/// ν in mm²/s and T in kelvin.
///
/// The constants are private so that every line in existence has finite `A`
/// and a strictly positive `B` (viscosity falls as temperature rises); this
/// also holds for lines read back through serde, which are validated.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(try_from = "WaltherLineRecord", into = "WaltherLineRecord")]
pub struct WaltherLine {
    a: f64,
    b: f64,
}

/// Serialized form of [`WaltherLine`], validated on the way in.
#[derive(Clone, Copy, Serialize, Deserialize)]
struct WaltherLineRecord {
    a: f64,
    b: f64,
}

impl TryFrom<WaltherLineRecord> for WaltherLine {
    type Error = LubricantError;

    fn try_from(record: WaltherLineRecord) -> Result<Self, Self::Error> {
        WaltherLine::new(record.a, record.b)
    }
}

impl From<WaltherLine> for WaltherLineRecord {
    fn from(line: WaltherLine) -> Self {
        WaltherLineRecord {
            a: line.a,
            b: line.b,
        }
    }
}

/// `Z(ν) = log10 log10(ν + 0.7)` for ν in mm²/s; finite for ν > 0.3 mm²/s.
fn walther_z(nu_mm2_s: f64) -> f64 {
    (nu_mm2_s + WALTHER_OFFSET_MM2_S).log10().log10()
}

impl WaltherLine {
    /// Builds a line from its constants `A` and `B` (dimensionless; the line is in
    /// mm²/s and kelvin).
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] if either constant is not finite,
    /// [`LubricantError::NotPositive`] if `b ≤ 0` (viscosity would not fall with temperature).
    pub fn new(a: f64, b: f64) -> Result<Self, LubricantError> {
        let a = super::error::finite("Walther constant A", a)?;
        let b = positive("Walther constant B", b)?;
        Ok(Self { a, b })
    }

    /// Fits the line through two measured points `(t1_k, nu1_mm2_s)` and
    /// `(t2_k, nu2_mm2_s)`; temperatures in kelvin, kinematic viscosities in mm²/s.
    /// The points may be given in either order.
    ///
    /// # Errors
    /// - [`LubricantError::InvalidTemperature`] for a temperature that is not finite and above 0 K;
    /// - [`LubricantError::NonFinite`] / [`LubricantError::NotPositive`] for a bad viscosity;
    /// - [`LubricantError::BelowWaltherRange`] if a viscosity is below 2 mm²/s;
    /// - [`LubricantError::SameTemperature`] if both temperatures are equal;
    /// - [`LubricantError::ViscosityNotDecreasing`] if the warmer point is not thinner.
    pub fn through_points(
        t1_k: f64,
        nu1_mm2_s: f64,
        t2_k: f64,
        nu2_mm2_s: f64,
    ) -> Result<Self, LubricantError> {
        let t1_k = temperature_k(t1_k)?;
        let t2_k = temperature_k(t2_k)?;
        let nu1_mm2_s = positive("kinematic viscosity in mm²/s", nu1_mm2_s)?;
        let nu2_mm2_s = positive("kinematic viscosity in mm²/s", nu2_mm2_s)?;
        for nu_mm2_s in [nu1_mm2_s, nu2_mm2_s] {
            if nu_mm2_s < WALTHER_MIN_VALID_NU_MM2_S {
                return Err(LubricantError::BelowWaltherRange { nu_mm2_s });
            }
        }
        if t1_k == t2_k {
            return Err(LubricantError::SameTemperature { t_k: t1_k });
        }
        let ((t_cold_k, nu_cold_mm2_s), (t_hot_k, nu_hot_mm2_s)) = if t1_k < t2_k {
            ((t1_k, nu1_mm2_s), (t2_k, nu2_mm2_s))
        } else {
            ((t2_k, nu2_mm2_s), (t1_k, nu1_mm2_s))
        };
        if nu_hot_mm2_s >= nu_cold_mm2_s {
            return Err(LubricantError::ViscosityNotDecreasing {
                t_cold_k,
                nu_cold_mm2_s,
                t_hot_k,
                nu_hot_mm2_s,
            });
        }
        let z_cold = walther_z(nu_cold_mm2_s);
        let z_hot = walther_z(nu_hot_mm2_s);
        let b = (z_cold - z_hot) / (t_hot_k.log10() - t_cold_k.log10());
        let a = z_cold + b * t_cold_k.log10();
        Self::new(a, b)
    }

    /// Fits the line through the kinematic viscosities at 40 °C (313.15 K) and
    /// 100 °C (373.15 K), both in mm²/s — the pair an oil data sheet gives.
    ///
    /// # Errors
    /// As [`WaltherLine::through_points`].
    pub fn from_nu40_nu100_mm2_s(
        nu40_mm2_s: f64,
        nu100_mm2_s: f64,
    ) -> Result<Self, LubricantError> {
        Self::through_points(super::T40_K, nu40_mm2_s, super::T100_K, nu100_mm2_s)
    }

    /// The constant `A` of `log10 log10(ν + 0.7) = A − B·log10(T)` (ν in mm²/s, T in K).
    pub fn a(&self) -> f64 {
        self.a
    }

    /// The constant `B` (> 0) of `log10 log10(ν + 0.7) = A − B·log10(T)` (ν in mm²/s, T in K).
    pub fn b(&self) -> f64 {
        self.b
    }

    /// Kinematic viscosity in **mm²/s** at the temperature `t_k` in **kelvin**.
    ///
    /// The result is always above 0.3 mm²/s (the line's hot asymptote). Outside
    /// `[.., max_valid_temperature_k()]` the value is an extrapolation.
    ///
    /// # Errors
    /// [`LubricantError::InvalidTemperature`] if `t_k` is not finite and above 0 K;
    /// [`LubricantError::ViscosityOverflow`] if the temperature is so low that the
    /// viscosity cannot be represented.
    pub fn nu_mm2_s(&self, t_k: f64) -> Result<f64, LubricantError> {
        let t_k = temperature_k(t_k)?;
        // 10^x as exp(x ln 10): the same value, cheaper than a general power.
        let ln10 = std::f64::consts::LN_10;
        let log_nu_plus = ((self.a - self.b * t_k.log10()) * ln10).exp();
        let nu_plus = (log_nu_plus * ln10).exp();
        if !nu_plus.is_finite() {
            return Err(LubricantError::ViscosityOverflow { t_k });
        }
        Ok(nu_plus - WALTHER_OFFSET_MM2_S)
    }

    /// Temperature derivative of the kinematic viscosity, dν/dT, in **mm²/s per kelvin**
    /// (negative), at `t_k` in kelvin. Analytic derivative of the Walther form:
    /// `dν/dT = −B · ln(10) · (ν + 0.7) · log10(ν + 0.7) / T`.
    ///
    /// # Errors
    /// As [`WaltherLine::nu_mm2_s`].
    pub fn dnu_dt_mm2_s_per_k(&self, t_k: f64) -> Result<f64, LubricantError> {
        let nu_mm2_s = self.nu_mm2_s(t_k)?;
        let nu_plus = nu_mm2_s + WALTHER_OFFSET_MM2_S;
        let slope = -self.b * std::f64::consts::LN_10 * nu_plus * nu_plus.log10() / t_k;
        if slope.is_finite() {
            Ok(slope)
        } else {
            Err(LubricantError::ViscosityOverflow { t_k })
        }
    }

    /// Temperature in **kelvin** at which the line reaches the kinematic viscosity
    /// `nu_mm2_s` (in **mm²/s**); the inverse of [`WaltherLine::nu_mm2_s`].
    ///
    /// # Errors
    /// [`LubricantError::NonFinite`] for a non-finite viscosity;
    /// [`LubricantError::ViscosityUnreachable`] for ν ≤ 0.3 mm²/s, which no line reaches;
    /// [`LubricantError::TemperatureOverflow`] if the temperature cannot be represented.
    pub fn temperature_k_at(&self, nu_mm2_s: f64) -> Result<f64, LubricantError> {
        let nu_mm2_s = super::error::finite("kinematic viscosity in mm²/s", nu_mm2_s)?;
        if nu_mm2_s + WALTHER_OFFSET_MM2_S <= 1.0 {
            return Err(LubricantError::ViscosityUnreachable { nu_mm2_s });
        }
        let log_t = (self.a - walther_z(nu_mm2_s)) / self.b;
        let t_k = 10f64.powf(log_t);
        if t_k.is_finite() && t_k > 0.0 {
            Ok(t_k)
        } else {
            Err(LubricantError::TemperatureOverflow { nu_mm2_s })
        }
    }

    /// Highest temperature, in kelvin, at which the line is within the range of the
    /// simple ASTM D341 form: the temperature where ν falls to 2 mm²/s.
    ///
    /// # Errors
    /// [`LubricantError::TemperatureOverflow`] if that temperature cannot be represented
    /// (only for a nearly flat, non-physical line).
    pub fn max_valid_temperature_k(&self) -> Result<f64, LubricantError> {
        self.temperature_k_at(WALTHER_MIN_VALID_NU_MM2_S)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Typical ISO VG 46 turbine oil pair (ν40 = 46, ν100 = 6.8 mm²/s), common practice, no source.
    fn vg46() -> WaltherLine {
        WaltherLine::from_nu40_nu100_mm2_s(46.0, 6.8).unwrap()
    }

    /// The fitted line passes through both defining points (ASTM D341 equation).
    #[test]
    fn passes_through_defining_points() {
        let line = vg46();
        assert_relative_eq!(line.nu_mm2_s(313.15).unwrap(), 46.0, max_relative = 1e-12);
        assert_relative_eq!(line.nu_mm2_s(373.15).unwrap(), 6.8, max_relative = 1e-12);
    }

    /// The order of the two points does not matter.
    #[test]
    fn point_order_is_irrelevant() {
        let a = WaltherLine::through_points(313.15, 46.0, 373.15, 6.8).unwrap();
        let b = WaltherLine::through_points(373.15, 6.8, 313.15, 46.0).unwrap();
        assert_relative_eq!(a.a(), b.a(), max_relative = 1e-14);
        assert_relative_eq!(a.b(), b.b(), max_relative = 1e-14);
    }

    /// The constants satisfy the defining equation computed by hand (ASTM D341 form).
    #[test]
    fn constants_satisfy_the_equation() {
        let line = vg46();
        for (t_k, nu) in [(313.15_f64, 46.0_f64), (373.15, 6.8)] {
            let lhs = (nu + 0.7).log10().log10();
            let rhs = line.a() - line.b() * t_k.log10();
            assert_relative_eq!(lhs, rhs, epsilon = 1e-13);
        }
    }

    /// The analytic derivative agrees with a central difference (calculus, no source needed).
    #[test]
    fn derivative_matches_central_difference() {
        let line = vg46();
        for t_k in [260.0, 300.0, 330.0, 360.0, 400.0] {
            let h = 1e-3;
            let fd =
                (line.nu_mm2_s(t_k + h).unwrap() - line.nu_mm2_s(t_k - h).unwrap()) / (2.0 * h);
            let an = line.dnu_dt_mm2_s_per_k(t_k).unwrap();
            assert!(an < 0.0);
            assert_relative_eq!(an, fd, max_relative = 1e-6);
        }
    }

    /// Inverse and forward agree.
    #[test]
    fn inverse_round_trip() {
        let line = vg46();
        for nu in [2.0, 3.5, 10.0, 46.0, 500.0, 5000.0] {
            let t = line.temperature_k_at(nu).unwrap();
            assert_relative_eq!(line.nu_mm2_s(t).unwrap(), nu, max_relative = 1e-10);
        }
    }

    /// ν = 2 mm²/s is reached above 100 °C for an oil with ν100 > 2 mm²/s.
    #[test]
    fn max_valid_temperature_is_above_the_100c_point() {
        let t_max = vg46().max_valid_temperature_k().unwrap();
        assert!(t_max > 373.15);
        assert_relative_eq!(vg46().nu_mm2_s(t_max).unwrap(), 2.0, max_relative = 1e-10);
    }

    #[test]
    fn rejects_bad_inputs() {
        assert!(matches!(
            WaltherLine::from_nu40_nu100_mm2_s(6.8, 46.0),
            Err(LubricantError::ViscosityNotDecreasing { .. })
        ));
        assert!(matches!(
            WaltherLine::from_nu40_nu100_mm2_s(46.0, 46.0),
            Err(LubricantError::ViscosityNotDecreasing { .. })
        ));
        assert!(matches!(
            WaltherLine::from_nu40_nu100_mm2_s(10.0, 1.5),
            Err(LubricantError::BelowWaltherRange { .. })
        ));
        assert!(matches!(
            WaltherLine::from_nu40_nu100_mm2_s(f64::NAN, 6.8),
            Err(LubricantError::NonFinite { .. })
        ));
        assert!(matches!(
            WaltherLine::from_nu40_nu100_mm2_s(-46.0, 6.8),
            Err(LubricantError::NotPositive { .. })
        ));
        assert!(matches!(
            WaltherLine::through_points(300.0, 46.0, 300.0, 6.8),
            Err(LubricantError::SameTemperature { .. })
        ));
        assert!(matches!(
            WaltherLine::through_points(-1.0, 46.0, 300.0, 6.8),
            Err(LubricantError::InvalidTemperature { .. })
        ));
        assert!(matches!(
            WaltherLine::new(1.0, 0.0),
            Err(LubricantError::NotPositive { .. })
        ));
        assert!(matches!(
            WaltherLine::new(f64::INFINITY, 3.0),
            Err(LubricantError::NonFinite { .. })
        ));
        let line = vg46();
        assert!(matches!(
            line.nu_mm2_s(0.0),
            Err(LubricantError::InvalidTemperature { .. })
        ));
        assert!(matches!(
            line.nu_mm2_s(f64::NAN),
            Err(LubricantError::InvalidTemperature { .. })
        ));
        assert!(matches!(
            line.nu_mm2_s(1.0),
            Err(LubricantError::ViscosityOverflow { .. })
        ));
        assert!(matches!(
            line.temperature_k_at(0.3),
            Err(LubricantError::ViscosityUnreachable { .. })
        ));
        assert!(matches!(
            line.temperature_k_at(f64::NAN),
            Err(LubricantError::NonFinite { .. })
        ));
    }

    /// Every temperature gives a finite viscosity or an error, never NaN or infinity.
    #[test]
    fn never_returns_non_finite() {
        let line = vg46();
        let mut t = 1e-3;
        while t < 1e7 {
            if let Ok(nu) = line.nu_mm2_s(t) {
                assert!(nu.is_finite() && nu > 0.3 - 1e-12);
            }
            if let Ok(d) = line.dnu_dt_mm2_s_per_k(t) {
                assert!(d.is_finite());
            }
            t *= 1.37;
        }
    }
}
