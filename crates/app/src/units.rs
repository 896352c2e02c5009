//! Unit conversions between the engineering units of design files and reports and the SI units
//! of the solver.
//!
//! Every conversion is a plain function whose name says both units, so a call site reads like
//! the formula it is (`mm_to_m(inner_radius_mm)`). Each one is tested in both directions against
//! values worked out by hand.

use padwright_solver::lubricant::{celsius_to_kelvin, kelvin_to_celsius};

/// Metres in one millimetre.
pub const M_PER_MM: f64 = 1e-3;
/// Metres in one micrometre.
pub const M_PER_UM: f64 = 1e-6;
/// Newtons in one kilonewton.
pub const N_PER_KN: f64 = 1e3;
/// Pascals in one megapascal.
pub const PA_PER_MPA: f64 = 1e6;
/// Pascals in one kilopascal.
pub const PA_PER_KPA: f64 = 1e3;
/// Watts in one kilowatt.
pub const W_PER_KW: f64 = 1e3;
/// Pascal-seconds in one millipascal-second (1 mPa·s = 1 cP).
pub const PA_S_PER_MPA_S: f64 = 1e-3;
/// Litres per minute in one cubic metre per second (1 m³/s = 1000 L × 60 s/min).
pub const L_MIN_PER_M3_S: f64 = 60_000.0;
/// Micrometres per metre per kelvin in one 1/K (a strain of 1 per kelvin is 10⁶ µm/m per K).
pub const UM_PER_M_K_PER_PER_K: f64 = 1e6;
/// Radians per second in one revolution per minute (2π rad / 60 s).
pub const RAD_S_PER_RPM: f64 = std::f64::consts::PI / 30.0;

/// Millimetres to metres.
pub fn mm_to_m(mm: f64) -> f64 {
    mm * M_PER_MM
}

/// Metres to millimetres.
pub fn m_to_mm(m: f64) -> f64 {
    m / M_PER_MM
}

/// Micrometres to metres.
pub fn um_to_m(um: f64) -> f64 {
    um * M_PER_UM
}

/// Metres to micrometres.
pub fn m_to_um(m: f64) -> f64 {
    m / M_PER_UM
}

/// Degrees to radians.
pub fn deg_to_rad(deg: f64) -> f64 {
    deg.to_radians()
}

/// Radians to degrees.
pub fn rad_to_deg(rad: f64) -> f64 {
    rad.to_degrees()
}

/// Revolutions per minute to radians per second.
pub fn rpm_to_rad_s(rpm: f64) -> f64 {
    rpm * RAD_S_PER_RPM
}

/// Radians per second to revolutions per minute.
pub fn rad_s_to_rpm(rad_s: f64) -> f64 {
    rad_s / RAD_S_PER_RPM
}

/// Kilonewtons to newtons.
pub fn kn_to_n(kn: f64) -> f64 {
    kn * N_PER_KN
}

/// Newtons to kilonewtons.
pub fn n_to_kn(n: f64) -> f64 {
    n / N_PER_KN
}

/// Pascals to megapascals.
pub fn pa_to_mpa(pa: f64) -> f64 {
    pa / PA_PER_MPA
}

/// Megapascals to pascals.
pub fn mpa_to_pa(mpa: f64) -> f64 {
    mpa * PA_PER_MPA
}

/// Kilopascals to pascals.
pub fn kpa_to_pa(kpa: f64) -> f64 {
    kpa * PA_PER_KPA
}

/// Pascals to kilopascals.
pub fn pa_to_kpa(pa: f64) -> f64 {
    pa / PA_PER_KPA
}

/// Watts to kilowatts.
pub fn w_to_kw(w: f64) -> f64 {
    w / W_PER_KW
}

/// Kilowatts to watts.
pub fn kw_to_w(kw: f64) -> f64 {
    kw * W_PER_KW
}

/// Millipascal-seconds (centipoise) to pascal-seconds.
pub fn mpa_s_to_pa_s(mpa_s: f64) -> f64 {
    mpa_s * PA_S_PER_MPA_S
}

/// Pascal-seconds to millipascal-seconds (centipoise).
pub fn pa_s_to_mpa_s(pa_s: f64) -> f64 {
    pa_s / PA_S_PER_MPA_S
}

/// Cubic metres per second to litres per minute.
pub fn m3_s_to_l_min(m3_s: f64) -> f64 {
    m3_s * L_MIN_PER_M3_S
}

/// Litres per minute to cubic metres per second.
pub fn l_min_to_m3_s(l_min: f64) -> f64 {
    l_min / L_MIN_PER_M3_S
}

/// Newtons per metre to newtons per micrometre.
pub fn n_per_m_to_n_per_um(n_per_m: f64) -> f64 {
    n_per_m * M_PER_UM
}

/// Newtons per micrometre to newtons per metre.
pub fn n_per_um_to_n_per_m(n_per_um: f64) -> f64 {
    n_per_um / M_PER_UM
}

/// A linear expansion coefficient in 1/K to µm/(m·K) (11.5e-6 1/K → 11.5 µm/(m·K)).
pub fn per_k_to_um_per_m_k(per_k: f64) -> f64 {
    per_k * UM_PER_M_K_PER_PER_K
}

/// A linear expansion coefficient in µm/(m·K) to 1/K.
pub fn um_per_m_k_to_per_k(um_per_m_k: f64) -> f64 {
    um_per_m_k / UM_PER_M_K_PER_PER_K
}

/// Percent to a fraction (60 % → 0.6).
pub fn pct_to_fraction(pct: f64) -> f64 {
    pct / 100.0
}

/// A fraction to percent (0.6 → 60 %).
pub fn fraction_to_pct(fraction: f64) -> f64 {
    fraction * 100.0
}

/// Degrees Celsius to kelvin (the solver's own conversion, so both sides agree exactly).
pub fn c_to_k(c: f64) -> f64 {
    celsius_to_kelvin(c)
}

/// Kelvin to degrees Celsius.
pub fn k_to_c(k: f64) -> f64 {
    kelvin_to_celsius(k)
}

/// Rounds to 15 significant digits, so that values converted back from SI print as the short
/// decimals an engineer typed (`60` rather than `60.00000000000001`). Non-finite values and zero
/// pass through unchanged.
pub fn tidy(x: f64) -> f64 {
    if !x.is_finite() || x == 0.0 {
        return x;
    }
    format!("{x:.14e}").parse().unwrap_or(x)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Checks a forward conversion against a hand value and that the reverse brings it back.
    fn both_ways(forward: fn(f64) -> f64, back: fn(f64) -> f64, input: f64, expected: f64) {
        assert_relative_eq!(forward(input), expected, max_relative = 1e-14);
        assert_relative_eq!(back(expected), input, max_relative = 1e-14);
        assert_relative_eq!(back(forward(input)), input, max_relative = 1e-14);
    }

    #[test]
    fn lengths() {
        both_ways(mm_to_m, m_to_mm, 120.0, 0.12);
        both_ways(um_to_m, m_to_um, 25.0, 25e-6);
        both_ways(mm_to_m, m_to_mm, 1.0, 0.001);
    }

    #[test]
    fn angles_and_speeds() {
        both_ways(deg_to_rad, rad_to_deg, 180.0, std::f64::consts::PI);
        both_ways(deg_to_rad, rad_to_deg, 36.0, std::f64::consts::PI / 5.0);
        // 3000 rpm = 50 rev/s = 100π rad/s.
        both_ways(
            rpm_to_rad_s,
            rad_s_to_rpm,
            3000.0,
            100.0 * std::f64::consts::PI,
        );
        // 60 rpm = one revolution per second = 2π rad/s.
        both_ways(rpm_to_rad_s, rad_s_to_rpm, 60.0, 2.0 * std::f64::consts::PI);
    }

    #[test]
    fn forces_pressures_powers() {
        both_ways(kn_to_n, n_to_kn, 45.0, 45_000.0);
        both_ways(mpa_to_pa, pa_to_mpa, 2.5, 2.5e6);
        both_ways(kpa_to_pa, pa_to_kpa, -30.0, -30_000.0);
        both_ways(kw_to_w, w_to_kw, 3.2, 3200.0);
    }

    #[test]
    fn viscosity_flow_stiffness() {
        // 1 cP = 1 mPa·s = 0.001 Pa·s.
        both_ways(mpa_s_to_pa_s, pa_s_to_mpa_s, 20.0, 0.02);
        // 60 L/min = 1 L/s = 0.001 m³/s.
        both_ways(l_min_to_m3_s, m3_s_to_l_min, 60.0, 1e-3);
        // 2 L/min = 2/60 L/s = 3.333… × 10⁻⁵ m³/s.
        both_ways(l_min_to_m3_s, m3_s_to_l_min, 2.0, 2.0 / 60.0 * 1e-3);
        // 1 N/µm = 1e6 N/m = 1 MN/m.
        both_ways(n_per_um_to_n_per_m, n_per_m_to_n_per_um, 1500.0, 1.5e9);
    }

    #[test]
    fn fractions_and_temperatures() {
        both_ways(pct_to_fraction, fraction_to_pct, 60.0, 0.6);
        both_ways(c_to_k, k_to_c, 0.0, 273.15);
        both_ways(c_to_k, k_to_c, 60.0, 333.15);
        both_ways(c_to_k, k_to_c, -40.0, 233.15);
    }

    #[test]
    fn expansion_coefficients() {
        // Steel: 11.5 × 10⁻⁶ 1/K = 11.5 µm per metre per kelvin.
        both_ways(per_k_to_um_per_m_k, um_per_m_k_to_per_k, 11.5e-6, 11.5);
        // A bronze-like 18 µm/(m·K) = 1.8 × 10⁻⁵ 1/K.
        both_ways(um_per_m_k_to_per_k, per_k_to_um_per_m_k, 18.0, 1.8e-5);
        // A temperature difference is the same number in K and in °C: only levels shift.
        assert_relative_eq!(
            k_to_c(c_to_k(45.0) + 12.5) - 45.0,
            12.5,
            max_relative = 1e-12
        );
    }

    #[test]
    fn tidy_removes_float_noise_only() {
        assert_eq!(tidy(0.06 / M_PER_MM), 60.0);
        assert_eq!(tidy(m_to_um(3.5e-5)), 35.0);
        assert_eq!(tidy(1e-10), 1e-10);
        assert_eq!(tidy(0.0), 0.0);
        assert!(tidy(f64::NAN).is_nan());
        assert_relative_eq!(
            tidy(std::f64::consts::PI),
            std::f64::consts::PI,
            max_relative = 1e-11
        );
    }
}
