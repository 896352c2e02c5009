//! Symmetries the discrete problem must keep.
//!
//! A symmetry of the continuous problem survives discretisation only if the grid, the
//! conductances, the source and the iteration are all mirror images too. Here they are: the
//! grids are uniform with an even number of intervals (so a mirror maps nodes to nodes, and
//! the red–black colouring `i + j` even/odd to itself), the face films are evaluated from the
//! analytic film at mirrored faces, the transfers of the multigrid are symmetric, and the
//! coarsest solve is exact. The fields must therefore be (anti)symmetric to round-off.
//!
//! Source: symmetry of the Reynolds equation (Reynolds 1886): reversing `x` reverses the sign
//! of the wedge term `(U/2) ∂h/∂x`, the diffusion term is unchanged; a mirror across the
//! motion changes nothing if film and speed are mirrored. Common practice, no further source.

use padwright_solver::film::{FilmState, Support};
use padwright_solver::geometry::{PadOutline, RunnerSpeed};
use padwright_solver::reynolds::{ReynoldsSettings, ReynoldsSolver, Start};
use padwright_validation::pads;

fn solve(
    outline: PadOutline,
    speed: RunnerSpeed,
    support: Support,
    state: FilmState,
    cavitation: bool,
) -> ReynoldsSolver {
    let settings = ReynoldsSettings {
        tolerance: 1e-12,
        cavitation,
        ..Default::default()
    };
    let mut s = pads::solver(outline, speed, support, 65, 49, settings);
    let mu = vec![0.03; s.grid().len()];
    s.solve(&state, &mu, Start::Cold).unwrap();
    s
}

/// Largest `|p(i, j) − sign·p(mirror)|` over the pad, relative to the largest `|p|`.
fn mirror_defect(s: &ReynoldsSolver, along: bool, sign: f64) -> f64 {
    let g = s.grid();
    let p = s.pressure();
    let scale = p.iter().fold(0.0f64, |m, x| m.max(x.abs()));
    let mut d: f64 = 0.0;
    for j in 0..=g.ny {
        for i in 0..=g.nx {
            let m = if along {
                g.idx(g.nx - i, j)
            } else {
                g.idx(i, g.ny - j)
            };
            d = d.max((p[g.idx(i, j)] - sign * p[m]).abs());
        }
    }
    d / scale
}

fn rectangle() -> PadOutline {
    PadOutline::Rectangle {
        length: 0.1,
        width: 0.08,
    }
}

fn sector() -> PadOutline {
    PadOutline::Sector {
        inner_radius: 0.05,
        outer_radius: 0.10,
        arc: 50f64.to_radians(),
    }
}

/// A rectangular pad with uniform runner speed and a film that does not depend on the
/// across-motion coordinate (line-pivot tilt; tapered land) or depends on it symmetrically
/// (crown about the pad centre, here with cavitation active) has a pressure field symmetric
/// about the mid-width line.
///
/// Tolerance: 1e-12 of the peak — round-off of a solve to a relative residual of 1e-12
/// (measured ≤ 1e-14).
#[test]
fn rectangle_is_symmetric_about_mid_width() {
    let u = RunnerSpeed::Linear(10.0);
    let cases = [
        (
            "line-pivot tilt",
            Support::TiltingLine { offset_along: 0.6 },
            FilmState {
                reference: 30e-6,
                pitch: 3e-4,
                ..Default::default()
            },
        ),
        (
            "tapered land",
            Support::TaperedLand {
                taper_fraction: 0.75,
                taper_depth: 25e-6,
            },
            FilmState {
                reference: 20e-6,
                ..Default::default()
            },
        ),
        (
            "crowned flat, cavitating",
            Support::Flat,
            FilmState {
                reference: 20e-6,
                crown: 10e-6,
                ..Default::default()
            },
        ),
    ];
    for (name, support, state) in cases {
        let s = solve(rectangle(), u, support, state, true);
        let d = mirror_defect(&s, false, 1.0);
        let cav = s.last_report().unwrap().cavitated_nodes;
        eprintln!("{name}: mirror defect across the width {d:.1e}, cavitated nodes {cav}");
        assert!(d <= 1e-12, "{name}: {d}");
        if name.contains("cavitating") {
            assert!(cav > 0);
        }
    }
}

/// A crowned flat pad (symmetric converging–diverging film) without the cavitation condition:
/// mirroring the film along the motion reverses the wedge term, so the pressure is
/// antisymmetric about mid-arc, `p(ξ) = −p(1 − ξ)`, on a rectangle and on a sector (whose
/// speed and metric depend only on the radius). With cavitation this antisymmetry is broken
/// (the negative half is clipped); checked as well, to show that the measure discriminates.
///
/// Tolerance: 1e-12 of the peak (round-off; measured ≤ 1e-14); the cavitating field is
/// asymmetric by more than 10 % of its peak.
#[test]
fn crowned_flat_pad_is_antisymmetric_without_cavitation() {
    let state = FilmState {
        reference: 20e-6,
        crown: 10e-6,
        ..Default::default()
    };
    for (outline, speed) in [
        (rectangle(), RunnerSpeed::Linear(10.0)),
        (sector(), RunnerSpeed::Angular(314.0)),
    ] {
        let lin = solve(outline, speed, Support::Flat, state, false);
        let d = mirror_defect(&lin, true, -1.0);
        let cav = solve(outline, speed, Support::Flat, state, true);
        let dc = mirror_defect(&cav, true, -1.0);
        eprintln!(
            "{outline:?}: antisymmetry defect along the motion {d:.1e} without cavitation, \
             {dc:.2} with"
        );
        assert!(d <= 1e-12);
        assert!(dc > 0.1);
    }
}

/// A sector pad has no mirror symmetry across its width: the runner speed `ω r` and the
/// metric grow with the radius, so even a film independent of the radius (tapered land)
/// gives a field with more pressure outward. Only the absence of the symmetry is asserted
/// (defect above 1 % of the peak, a physical fact), to show that the mid-width check above is
/// not satisfied by construction.
#[test]
fn sector_is_not_symmetric_across_the_width() {
    let s = solve(
        sector(),
        RunnerSpeed::Angular(314.0),
        Support::TaperedLand {
            taper_fraction: 0.8,
            taper_depth: 30e-6,
        },
        FilmState {
            reference: 20e-6,
            ..Default::default()
        },
        true,
    );
    let d = mirror_defect(&s, false, 1.0);
    eprintln!("sector tapered land: mirror defect across the width {d:.2}");
    assert!(d > 0.01);
}
