//! Film thickness models: how the gap between pad and runner depends on the pad support and
//! on the variables the equilibrium solves for.
//!
//! Every film is written as
//!
//! ```text
//! h(ξ, η) = h_ref + pitch · d_lead(ξ, η) + roll · d_out(ξ, η) + profile(ξ) + δ_crown · c(ξ, η)
//! ```
//!
//! in metres, where
//!
//! * `h_ref` is the pivot film for a tilting pad, and for a fixed pad the film at the land (or
//!   flat face) at the pad centre;
//! * `d_lead` is the distance of the point from the pitch axis — the line through the pivot
//!   along the pad width (radial for a sector) — counted positive towards the leading edge, and
//!   `d_out` the distance from the roll axis through the pivot, positive outward. Pitch and roll
//!   are small rotation angles in radians: a positive pitch opens the film at the leading edge.
//!   For a sector, with the pivot at `(r_p, θ_p)`: `d_lead = r sin(θ_p − θ)`,
//!   `d_out = r cos(θ_p − θ) − r_p`, which is exactly a plane tilted about the pivot;
//! * `profile` is the machined taper of a tapered-land pad: `depth (1 − ξ/a)` for `ξ < a`, zero
//!   on the land — linear in the angle, as tapers are cut;
//! * `c` is the crown shape: a paraboloid (a sphere to first order) about the pad centre,
//!   `ρ²/ρ̄²` with `ρ` the distance from the pad centre and `ρ̄²` the mean of the squared corner
//!   distances, so that `δ_crown` is the height of the pad centre above its corners. For a tilting
//!   pad the crown is measured from the pivot (`c(pivot) = 0`) so that `h_ref` stays the pivot
//!   film.

use crate::error::InputError;
use crate::geometry::{PadOutline, within};

/// How a pad is supported and shaped.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum Support {
    /// Tilting pad on a point (spherical) pivot: free to pitch and roll.
    TiltingPoint {
        /// Pivot offset along the motion, fraction of the arc from the leading edge.
        offset_along: f64,
        /// Pivot offset across the motion, fraction of the width from the inner edge.
        offset_across: f64,
    },
    /// Tilting pad on a line pivot across the pad (radial for a sector): pitch only.
    TiltingLine {
        /// Pivot offset along the motion, fraction of the arc from the leading edge.
        offset_along: f64,
    },
    /// Fixed pad with a taper from the leading edge followed by a flat land.
    TaperedLand {
        /// Fraction of the arc covered by the taper, from the leading edge.
        taper_fraction: f64,
        /// Depth of the taper at the leading edge below the land, m.
        taper_depth: f64,
    },
    /// Fixed, flat (parallel) pad.
    Flat,
}

impl Support {
    /// True for tilting pads.
    pub fn is_tilting(&self) -> bool {
        matches!(
            self,
            Support::TiltingPoint { .. } | Support::TiltingLine { .. }
        )
    }

    /// Pivot (or, for fixed pads, the pad centre) in pad-local coordinates `(ξ, η)`.
    pub fn reference_point(&self) -> (f64, f64) {
        match *self {
            Support::TiltingPoint {
                offset_along,
                offset_across,
            } => (offset_along, offset_across),
            Support::TiltingLine { offset_along } => (offset_along, 0.5),
            Support::TaperedLand { .. } | Support::Flat => (0.5, 0.5),
        }
    }

    /// The `ξ` where the film has a kink (end of the taper), if any.
    pub fn breakpoint(&self) -> Option<f64> {
        match *self {
            Support::TaperedLand { taper_fraction, .. } if taper_fraction < 1.0 => {
                Some(taper_fraction)
            }
            _ => None,
        }
    }

    /// Checks the support values.
    pub fn validate(&self) -> Result<(), InputError> {
        match *self {
            Support::TiltingPoint {
                offset_along,
                offset_across,
            } => {
                within("pivot offset along the arc", offset_along, 0.05, 0.95)?;
                within("pivot offset across the width", offset_across, 0.05, 0.95)
            }
            Support::TiltingLine { offset_along } => {
                within("pivot offset along the arc", offset_along, 0.05, 0.95)
            }
            Support::TaperedLand {
                taper_fraction,
                taper_depth,
            } => {
                within("taper fraction of the arc", taper_fraction, 0.05, 1.0)?;
                crate::error::within_um("the taper depth", taper_depth, 0.0, 1e-3)
            }
            Support::Flat => Ok(()),
        }
    }
}

/// The film variables for one pad: what the equilibrium solves for (SI units).
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub struct FilmState {
    /// Pivot film (tilting pad) or film at the land at the pad centre (fixed pad), m.
    pub reference: f64,
    /// Pitch about the pivot's pitch axis, rad; positive opens the leading edge.
    pub pitch: f64,
    /// Roll about the pivot's roll axis, rad; positive opens the outer edge.
    pub roll: f64,
    /// Crown height of the pad centre above its corners, m (mechanical plus thermal).
    pub crown: f64,
}

/// The geometric parts of the film at one point, which the film variables multiply.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FilmBasis {
    /// Distance from the pitch axis towards the leading edge, m.
    pub lead: f64,
    /// Distance from the roll axis outward, m.
    pub out: f64,
    /// Machined profile (taper), m.
    pub profile: f64,
    /// Crown shape factor (dimensionless).
    pub crown: f64,
}

impl FilmBasis {
    /// Film thickness at this point for the given state, m.
    #[inline]
    pub fn thickness(&self, s: &FilmState) -> f64 {
        s.reference + s.pitch * self.lead + s.roll * self.out + self.profile + s.crown * self.crown
    }
}

/// Evaluates the film basis anywhere on one pad.
#[derive(Clone, Debug, PartialEq)]
pub struct FilmModel {
    outline: PadOutline,
    support: Support,
    pivot_xy: [f64; 2],
    axis_along: [f64; 2],
    axis_out: [f64; 2],
    centre_xy: [f64; 2],
    inv_rho2: f64,
    crown_at_ref: f64,
}

impl FilmModel {
    /// Film model of a pad with this outline and support.
    pub fn new(outline: PadOutline, support: Support) -> Result<Self, InputError> {
        outline.validate()?;
        support.validate()?;
        let (xp, ep) = support.reference_point();
        let pivot_xy = outline.position(xp, ep);
        let (axis_along, axis_out) = outline.local_axes(xp);
        let centre_xy = outline.position(0.5, 0.5);
        let corners = [(0.0, 0.0), (1.0, 0.0), (0.0, 1.0), (1.0, 1.0)];
        let rho2_mean = corners
            .iter()
            .map(|&(x, e)| dist2(outline.position(x, e), centre_xy))
            .sum::<f64>()
            / 4.0;
        let mut m = FilmModel {
            outline,
            support,
            pivot_xy,
            axis_along,
            axis_out,
            centre_xy,
            inv_rho2: 1.0 / rho2_mean,
            crown_at_ref: 0.0,
        };
        m.crown_at_ref = m.raw_crown(pivot_xy);
        Ok(m)
    }

    /// The pad outline.
    pub fn outline(&self) -> &PadOutline {
        &self.outline
    }

    /// The pad support.
    pub fn support(&self) -> &Support {
        &self.support
    }

    /// Mean squared distance of the pad corners from the pad centre, m²: the crown of height
    /// `δ` is the paraboloid `δ ρ²/ρ̄²`, i.e. a sphere of curvature `2δ/ρ̄²`.
    pub fn crown_reference_radius2(&self) -> f64 {
        1.0 / self.inv_rho2
    }

    fn raw_crown(&self, xy: [f64; 2]) -> f64 {
        dist2(xy, self.centre_xy) * self.inv_rho2
    }

    /// Film basis at the pad-local point `(ξ, η)`.
    pub fn basis(&self, xi: f64, eta: f64) -> FilmBasis {
        self.basis_turned(xi, eta, self.outline.turn(xi))
    }

    /// [`FilmModel::basis`] with `turn` = [`PadOutline::turn`]`(xi)` computed beforehand.
    fn basis_turned(&self, xi: f64, eta: f64, turn: [f64; 2]) -> FilmBasis {
        let xy = self.outline.position_turned(xi, eta, turn);
        let d = [xy[0] - self.pivot_xy[0], xy[1] - self.pivot_xy[1]];
        let profile = match self.support {
            Support::TaperedLand {
                taper_fraction,
                taper_depth,
            } if xi < taper_fraction => taper_depth * (1.0 - xi / taper_fraction),
            _ => 0.0,
        };
        FilmBasis {
            lead: -(d[0] * self.axis_along[0] + d[1] * self.axis_along[1]),
            out: d[0] * self.axis_out[0] + d[1] * self.axis_out[1],
            profile,
            crown: self.raw_crown(xy) - self.crown_at_ref,
        }
    }

    /// Film thickness at `(ξ, η)` for a state, m.
    pub fn thickness(&self, state: &FilmState, xi: f64, eta: f64) -> f64 {
        self.basis(xi, eta).thickness(state)
    }
}

fn dist2(a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2)
}

/// Film basis values at a set of points, stored as separate arrays so that the film for a new
/// state is one fused pass over memory.
#[derive(Clone, Debug, Default)]
pub struct BasisArrays {
    lead: Vec<f64>,
    out: Vec<f64>,
    profile: Vec<f64>,
    crown: Vec<f64>,
}

impl BasisArrays {
    /// Evaluates the basis at every point of `points` (pad-local `(ξ, η)`).
    pub fn new(model: &FilmModel, points: impl Iterator<Item = (f64, f64)>) -> Self {
        let n = points.size_hint().0;
        let mut b = BasisArrays {
            lead: Vec::with_capacity(n),
            out: Vec::with_capacity(n),
            profile: Vec::with_capacity(n),
            crown: Vec::with_capacity(n),
        };
        // Grid points come row by row and share a few distinct ξ: the angle's cosine and sine
        // once for each, remembered in the order met (a row repeats the previous one's).
        let mut memo: Vec<(f64, [f64; 2])> = Vec::new();
        let mut next = 0;
        for (x, e) in points {
            let turn = if memo.get(next).is_some_and(|m| m.0 == x) {
                next += 1;
                memo[next - 1].1
            } else if let Some(at) = memo.iter().position(|m| m.0 == x) {
                next = at + 1;
                memo[at].1
            } else {
                let t = model.outline.turn(x);
                memo.push((x, t));
                next = memo.len();
                t
            };
            let v = model.basis_turned(x, e, turn);
            b.lead.push(v.lead);
            b.out.push(v.out);
            b.profile.push(v.profile);
            b.crown.push(v.crown);
        }
        b
    }

    /// Number of points.
    pub fn len(&self) -> usize {
        self.lead.len()
    }

    /// True if there are no points.
    pub fn is_empty(&self) -> bool {
        self.lead.is_empty()
    }

    /// Writes the film thickness for `state` at every point into `h`, m.
    pub fn fill(&self, state: &FilmState, h: &mut [f64]) {
        debug_assert_eq!(h.len(), self.len());
        let n = h.len();
        // Equal-length slices so the fused pass vectorises without bounds checks.
        let (lead, out) = (&self.lead[..n], &self.out[..n]);
        let (profile, crown) = (&self.profile[..n], &self.crown[..n]);
        for k in 0..n {
            h[k] = state.reference
                + state.pitch * lead[k]
                + state.roll * out[k]
                + profile[k]
                + state.crown * crown[k];
        }
    }

    /// The `(d_lead, d_out)` pair of point `k`, m.
    #[inline]
    pub fn lead_out(&self, k: usize) -> (f64, f64) {
        (self.lead[k], self.out[k])
    }

    /// Smallest film over the points for `state`, m.
    pub fn min_thickness(&self, state: &FilmState) -> f64 {
        let n = self.len();
        let (lead, out) = (&self.lead[..n], &self.out[..n]);
        let (profile, crown) = (&self.profile[..n], &self.crown[..n]);
        // Four lanes so the comparison chain vectorises (same minimum as a sequential fold).
        let mut lanes = [f64::INFINITY; 4];
        for k in 0..n {
            let h = state.reference
                + state.pitch * lead[k]
                + state.roll * out[k]
                + profile[k]
                + state.crown * crown[k];
            let l = &mut lanes[k % 4];
            *l = if h < *l { h } else { *l };
        }
        lanes
            .iter()
            .fold(f64::INFINITY, |m, &l| if l < m { l } else { m })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    fn sector() -> PadOutline {
        PadOutline::Sector {
            inner_radius: 0.1,
            outer_radius: 0.2,
            arc: 0.6,
        }
    }

    /// The basis arrays compute the sector angle's cosine and sine once per distinct ξ
    /// (remembered in the order the points come); every point's values must equal the film
    /// model's own, bit for bit, whether the points come row by row (as from a grid), in an
    /// order that revisits ξ out of turn, or on a rectangle. Internal consistency, no source.
    #[test]
    fn basis_arrays_equal_the_pointwise_basis() {
        let rect = PadOutline::Rectangle {
            length: 0.05,
            width: 0.03,
        };
        for outline in [sector(), rect] {
            let m = FilmModel::new(
                outline,
                Support::TiltingPoint {
                    offset_along: 0.6,
                    offset_across: 0.5,
                },
            )
            .unwrap();
            let rows: Vec<(f64, f64)> = (0..5)
                .flat_map(|j| (0..7).map(move |i| (i as f64 / 6.0, j as f64 / 4.0)))
                .collect();
            let shuffled: Vec<(f64, f64)> = (0..35)
                .map(|k| rows[(k * 11) % 35])
                .chain([(0.3, 0.1), (0.3, 0.9)])
                .collect();
            for points in [rows, shuffled] {
                let b = BasisArrays::new(&m, points.iter().copied());
                assert_eq!(b.len(), points.len());
                for (k, &(x, e)) in points.iter().enumerate() {
                    let v = m.basis(x, e);
                    assert_eq!(b.lead_out(k), (v.lead, v.out));
                    assert_eq!((b.profile[k], b.crown[k]), (v.profile, v.crown));
                }
            }
            assert_eq!(
                outline.position(0.37, 0.6),
                outline.position_turned(0.37, 0.6, outline.turn(0.37))
            );
        }
    }

    #[test]
    fn tilted_film_is_a_plane_through_the_pivot() {
        let m = FilmModel::new(
            sector(),
            Support::TiltingPoint {
                offset_along: 0.6,
                offset_across: 0.5,
            },
        )
        .unwrap();
        let s = FilmState {
            reference: 20e-6,
            pitch: 2e-4,
            roll: -5e-5,
            crown: 0.0,
        };
        assert_relative_eq!(m.thickness(&s, 0.6, 0.5), 20e-6, epsilon = 1e-18);
        // A plane: h is affine in Cartesian position. Check h(mid of two points) = mean.
        let (a, b) = ((0.1, 0.2), (0.9, 0.7));
        let pa = sector().position(a.0, a.1);
        let pb = sector().position(b.0, b.1);
        let mid = [(pa[0] + pb[0]) / 2.0, (pa[1] + pb[1]) / 2.0];
        // Find the pad-local coordinates of the midpoint.
        let r = (mid[0].powi(2) + mid[1].powi(2)).sqrt();
        let th = mid[1].atan2(mid[0]);
        let (xm, em) = (th / 0.6, (r - 0.1) / 0.1);
        let hm = m.thickness(&s, xm, em);
        let avg = 0.5 * (m.thickness(&s, a.0, a.1) + m.thickness(&s, b.0, b.1));
        assert_relative_eq!(hm, avg, max_relative = 1e-12);
        // Positive pitch opens the leading edge.
        assert!(m.thickness(&s, 0.0, 0.5) > m.thickness(&s, 1.0, 0.5));
    }

    #[test]
    fn taper_profile_and_crown() {
        let m = FilmModel::new(
            sector(),
            Support::TaperedLand {
                taper_fraction: 0.8,
                taper_depth: 30e-6,
            },
        )
        .unwrap();
        let s = FilmState {
            reference: 10e-6,
            crown: 5e-6,
            ..Default::default()
        };
        assert_relative_eq!(m.basis(0.0, 0.3).profile, 30e-6);
        assert_relative_eq!(m.basis(0.4, 0.3).profile, 15e-6);
        assert_eq!(m.basis(0.9, 0.3).profile, 0.0);
        // Crown: zero at the centre, on average δ at the corners.
        assert_eq!(m.basis(0.5, 0.5).crown, 0.0);
        assert_relative_eq!(
            m.thickness(&s, 0.9, 0.5),
            10e-6 + 5e-6 * m.basis(0.9, 0.5).crown
        );
        let corners: f64 = [(0.0, 0.0), (1.0, 0.0), (0.0, 1.0), (1.0, 1.0)]
            .iter()
            .map(|&(x, e)| m.basis(x, e).crown)
            .sum::<f64>()
            / 4.0;
        assert_relative_eq!(corners, 1.0, max_relative = 1e-12);
    }
}
