//! The floating-point types the multigrid kernels run in.
//!
//! The multigrid hierarchy is generic over its working precision: `f64` for the solution and
//! for projected (cavitating) solves, `f32` for corrections inside iterative refinement, where
//! half the bytes per node make every sweep faster (the residual that drives the correction is
//! formed in `f64`, so the solution keeps full precision). Values cross between the two only
//! through [`Real::of`] and [`Real::f64`].

use std::fmt::Debug;
use std::ops::{Add, AddAssign, Div, Mul, MulAssign, Neg, Sub};

/// A floating-point type the multigrid kernels can run in (`f64` or `f32`).
pub trait Real:
    Copy
    + Debug
    + Default
    + PartialOrd
    + Send
    + Sync
    + 'static
    + Add<Output = Self>
    + Sub<Output = Self>
    + Mul<Output = Self>
    + Div<Output = Self>
    + Neg<Output = Self>
    + AddAssign
    + MulAssign
{
    /// Zero.
    const ZERO: Self;
    /// One.
    const ONE: Self;
    /// The nearest value of this type to `x` (exact for `f64`).
    fn of(x: f64) -> Self;
    /// The value as `f64` (exact).
    fn f64(self) -> f64;
    /// The larger of the two (either if equal; `self` if `other` is NaN).
    #[inline(always)]
    fn max_of(self, other: Self) -> Self {
        if other > self { other } else { self }
    }
}

impl Real for f64 {
    const ZERO: Self = 0.0;
    const ONE: Self = 1.0;
    #[inline(always)]
    fn of(x: f64) -> Self {
        x
    }
    #[inline(always)]
    fn f64(self) -> f64 {
        self
    }
    #[inline(always)]
    fn max_of(self, other: Self) -> Self {
        self.max(other)
    }
}

impl Real for f32 {
    const ZERO: Self = 0.0;
    const ONE: Self = 1.0;
    #[inline(always)]
    fn of(x: f64) -> Self {
        x as f32
    }
    #[inline(always)]
    fn f64(self) -> f64 {
        f64::from(self)
    }
    #[inline(always)]
    fn max_of(self, other: Self) -> Self {
        self.max(other)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Round trips: f64 → f64 is the identity; f32 keeps 24 significant bits (IEEE 754
    /// binary32: relative rounding error at most 2⁻²⁴).
    #[test]
    fn conversions_round_as_ieee_754_says() {
        let x = 0.1f64;
        assert_eq!(<f64 as Real>::of(x).to_bits(), x.to_bits());
        let y = <f32 as Real>::of(x).f64();
        assert!(((y - x) / x).abs() <= 2f64.powi(-24));
        assert!(y != x);
        assert_eq!(<f32 as Real>::ONE.max_of(2.0), 2.0);
    }
}
