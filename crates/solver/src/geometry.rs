//! Pad outlines and the pad-local coordinate frame.
//!
//! Every pad is described in a structured, pad-local frame:
//!
//! * `ξ ∈ [0, 1]` runs **along the motion**, from the leading edge (`ξ = 0`, where the runner
//!   drags oil in) to the trailing edge (`ξ = 1`);
//! * `η ∈ [0, 1]` runs **across the motion**, from the inner radius (sector) or the first side
//!   (rectangle) to the outer radius or second side.
//!
//! The physical coordinates behind them are
//!
//! | outline   | along, `s`        | across, `t`                    | metric `m(t)` | surface speed `U(t)` |
//! |-----------|-------------------|--------------------------------|---------------|----------------------|
//! | sector    | `θ = β ξ` (rad)   | `r = r_i + (r_o − r_i) η` (m)   | `r`           | `ω r`                |
//! | rectangle | `x = L ξ` (m)     | `y = B η` (m)                  | `1`           | `U`                  |
//!
//! so that a physical length along the motion is `m(t) ds` and across it `dt`. All values are SI
//! (metres, radians, seconds); conversion from engineering units happens at the edges of the tool.

use crate::error::InputError;

/// The outline of one pad in the runner plane. SI units.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum PadOutline {
    /// Annular sector: the usual thrust pad. The runner turns in `+θ`.
    Sector {
        /// Inner radius, m.
        inner_radius: f64,
        /// Outer radius, m.
        outer_radius: f64,
        /// Pad arc angle β, rad.
        arc: f64,
    },
    /// Rectangle: test rigs and validation against slider theory. The runner slides along the
    /// length.
    Rectangle {
        /// Length along the motion L, m.
        length: f64,
        /// Width across the motion B, m.
        width: f64,
    },
}

impl PadOutline {
    /// Checks that the outline is a real, finite shape.
    pub fn validate(&self) -> Result<(), InputError> {
        match *self {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                arc,
            } => {
                positive("inner radius", inner_radius)?;
                positive("outer radius", outer_radius)?;
                positive("pad arc", arc)?;
                if outer_radius <= inner_radius {
                    return Err(InputError::Inconsistent(format!(
                        "the outer radius ({:.1} mm) must be larger than the inner radius ({:.1} mm)",
                        outer_radius * 1e3,
                        inner_radius * 1e3
                    )));
                }
                if arc >= std::f64::consts::PI {
                    return Err(InputError::Inconsistent(
                        "a pad arc must be smaller than 180°".into(),
                    ));
                }
                Ok(())
            }
            PadOutline::Rectangle { length, width } => {
                positive("pad length", length)?;
                positive("pad width", width)
            }
        }
    }

    /// Pad area, m².
    pub fn area(&self) -> f64 {
        match *self {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                arc,
            } => 0.5 * arc * (outer_radius * outer_radius - inner_radius * inner_radius),
            PadOutline::Rectangle { length, width } => length * width,
        }
    }

    /// Length of the pad along the motion at mid-width, m (the arc length at the mean radius of
    /// a sector). Used as the reference length of pitch and roll.
    pub fn mean_length(&self) -> f64 {
        match *self {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                arc,
            } => 0.5 * (inner_radius + outer_radius) * arc,
            PadOutline::Rectangle { length, .. } => length,
        }
    }

    /// Width of the pad across the motion, m (radial width of a sector).
    pub fn width(&self) -> f64 {
        match *self {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                ..
            } => outer_radius - inner_radius,
            PadOutline::Rectangle { width, .. } => width,
        }
    }

    /// Span of the along-motion coordinate `s`: β (rad) for a sector, L (m) for a rectangle.
    pub fn s_span(&self) -> f64 {
        match *self {
            PadOutline::Sector { arc, .. } => arc,
            PadOutline::Rectangle { length, .. } => length,
        }
    }

    /// The across-motion coordinate `t` at `η`: radius (m) or side distance (m).
    pub fn t_at(&self, eta: f64) -> f64 {
        match *self {
            PadOutline::Sector {
                inner_radius,
                outer_radius,
                ..
            } => inner_radius + (outer_radius - inner_radius) * eta,
            PadOutline::Rectangle { width, .. } => width * eta,
        }
    }

    /// The metric factor `m(t)`: physical length along the motion per unit of `s`
    /// (`r` for a sector, 1 for a rectangle).
    pub fn metric(&self, t: f64) -> f64 {
        match self {
            PadOutline::Sector { .. } => t,
            PadOutline::Rectangle { .. } => 1.0,
        }
    }

    /// Position in the runner plane, m, of the pad-local point `(ξ, η)`. The sector is centred on
    /// the shaft axis with its leading edge on the x axis; the rectangle has its leading,
    /// first-side corner at the origin.
    pub fn position(&self, xi: f64, eta: f64) -> [f64; 2] {
        self.position_turned(xi, eta, self.turn(xi))
    }

    /// The part of [`PadOutline::position`] that depends on `ξ` alone and costs most: the
    /// cosine and sine of the sector's angle `arc · ξ` (`[1, 0]` for a rectangle).
    pub fn turn(&self, xi: f64) -> [f64; 2] {
        match *self {
            PadOutline::Sector { arc, .. } => {
                let theta = arc * xi;
                [theta.cos(), theta.sin()]
            }
            PadOutline::Rectangle { .. } => [1.0, 0.0],
        }
    }

    /// [`PadOutline::position`] with `turn` = [`PadOutline::turn`]`(xi)` computed beforehand,
    /// m.
    pub fn position_turned(&self, xi: f64, eta: f64, turn: [f64; 2]) -> [f64; 2] {
        let t = self.t_at(eta);
        match *self {
            PadOutline::Sector { .. } => [t * turn[0], t * turn[1]],
            PadOutline::Rectangle { length, .. } => [length * xi, t],
        }
    }

    /// Unit vectors at the pad-local point `(ξ, η)`: along the motion and across it (outward),
    /// in the runner plane.
    pub fn local_axes(&self, xi: f64) -> ([f64; 2], [f64; 2]) {
        match *self {
            PadOutline::Sector { arc, .. } => {
                let theta = arc * xi;
                let (s, c) = theta.sin_cos();
                ([-s, c], [c, s])
            }
            PadOutline::Rectangle { .. } => ([1.0, 0.0], [0.0, 1.0]),
        }
    }
}

/// How the runner moves over the pad.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum RunnerSpeed {
    /// Rotation at an angular speed ω, rad/s (sector pads).
    Angular(f64),
    /// Sliding at a speed U, m/s (rectangular pads).
    Linear(f64),
}

/// A pad together with the runner moving over it: the pad-local frame the discretisation uses.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PadFrame {
    /// The pad outline.
    pub outline: PadOutline,
    /// Angular speed ω (rad/s) for a sector, sliding speed U (m/s) for a rectangle.
    speed: f64,
}

impl PadFrame {
    /// Couples an outline with the runner speed. A sector needs an angular speed, a rectangle
    /// a sliding speed.
    pub fn new(outline: PadOutline, speed: RunnerSpeed) -> Result<Self, InputError> {
        outline.validate()?;
        let speed = match (outline, speed) {
            (PadOutline::Sector { .. }, RunnerSpeed::Angular(w)) => w,
            (PadOutline::Rectangle { .. }, RunnerSpeed::Linear(u)) => u,
            (PadOutline::Sector { .. }, RunnerSpeed::Linear(_)) => {
                return Err(InputError::Inconsistent(
                    "a sector pad needs the runner speed as a rotational speed".into(),
                ));
            }
            (PadOutline::Rectangle { .. }, RunnerSpeed::Angular(_)) => {
                return Err(InputError::Inconsistent(
                    "a rectangular pad needs the runner speed as a sliding speed".into(),
                ));
            }
        };
        positive("runner speed", speed)?;
        Ok(PadFrame { outline, speed })
    }

    /// The runner speed as given: ω (rad/s) or U (m/s).
    pub fn speed(&self) -> RunnerSpeed {
        match self.outline {
            PadOutline::Sector { .. } => RunnerSpeed::Angular(self.speed),
            PadOutline::Rectangle { .. } => RunnerSpeed::Linear(self.speed),
        }
    }

    /// Surface speed of the runner at across-coordinate `t`, m/s: `ω r` or `U`.
    #[inline]
    pub fn surface_speed(&self, t: f64) -> f64 {
        match self.outline {
            PadOutline::Sector { .. } => self.speed * t,
            PadOutline::Rectangle { .. } => self.speed,
        }
    }

    /// Surface speed at the middle of the pad width, m/s.
    pub fn mean_surface_speed(&self) -> f64 {
        self.surface_speed(self.outline.t_at(0.5))
    }
}

/// Returns an error unless `value` is finite and strictly positive.
pub(crate) fn positive(what: &str, value: f64) -> Result<(), InputError> {
    if value.is_finite() && value > 0.0 {
        Ok(())
    } else {
        Err(InputError::NotPositive {
            what: what.to_string(),
            value,
        })
    }
}

/// Returns an error unless `value` is finite and within `[lo, hi]`.
pub(crate) fn within(what: &str, value: f64, lo: f64, hi: f64) -> Result<(), InputError> {
    if value.is_finite() && value >= lo && value <= hi {
        Ok(())
    } else {
        Err(InputError::OutOfRange {
            what: what.to_string(),
            value,
            lo,
            hi,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn sector_area_matches_annulus_share() {
        // Area of an annular sector: β/2 (r_o² − r_i²) (elementary geometry).
        let o = PadOutline::Sector {
            inner_radius: 0.1,
            outer_radius: 0.2,
            arc: std::f64::consts::FRAC_PI_4,
        };
        let full = std::f64::consts::PI * (0.2f64.powi(2) - 0.1f64.powi(2));
        assert_relative_eq!(o.area(), full / 8.0, max_relative = 1e-14);
    }

    #[test]
    fn local_axes_are_orthonormal_and_follow_rotation() {
        let o = PadOutline::Sector {
            inner_radius: 0.1,
            outer_radius: 0.2,
            arc: 0.7,
        };
        let (a, b) = o.local_axes(0.5);
        assert_relative_eq!(a[0] * b[0] + a[1] * b[1], 0.0, epsilon = 1e-15);
        // Moving along +ξ must move the point along the first axis.
        let p0 = o.position(0.5, 0.5);
        let p1 = o.position(0.5 + 1e-7, 0.5);
        let d = [p1[0] - p0[0], p1[1] - p0[1]];
        let n = (d[0] * d[0] + d[1] * d[1]).sqrt();
        assert_relative_eq!((d[0] * a[0] + d[1] * a[1]) / n, 1.0, epsilon = 1e-6);
    }

    #[test]
    fn rejects_inverted_radii_and_wrong_speed_kind() {
        let o = PadOutline::Sector {
            inner_radius: 0.2,
            outer_radius: 0.1,
            arc: 0.5,
        };
        assert!(o.validate().is_err());
        let r = PadOutline::Rectangle {
            length: 0.1,
            width: 0.1,
        };
        assert!(PadFrame::new(r, RunnerSpeed::Angular(10.0)).is_err());
        assert!(PadFrame::new(r, RunnerSpeed::Linear(f64::NAN)).is_err());
    }
}
