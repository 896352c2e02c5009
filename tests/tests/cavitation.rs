//! The Reynolds (Swift–Stieber) cavitation condition: a converging–diverging film whose
//! pressure would go negative.
//!
//! With cavitation the discrete problem is the linear complementarity problem
//! `p ≥ p_cav`, `A p − b ≥ 0`, `(p − p_cav)·(A p − b) = 0` (Cryer, "The solution of a quadratic
//! programming problem using systematic overrelaxation", SIAM J. Control, 1971 — citation
//! details from memory; Brandt & Cryer (1983) for the projected multigrid the solver uses). For a symmetric M-matrix `A` it
//! has exactly one solution, which projected SOR also converges to (Cryer 1971), so an
//! independent projected SOR written here is the reference.

use padwright_solver::film::{FilmState, Support};
use padwright_solver::geometry::{PadOutline, RunnerSpeed};
use padwright_solver::pad;
use padwright_solver::reynolds::stencil::Level;
use padwright_solver::reynolds::{ReynoldsSettings, ReynoldsSolver, Start};
use padwright_validation::pads;

/// A crowned flat pad: a parallel film plus a crown makes the film converge over the first half
/// of the arc and diverge over the second, where the full-film pressure goes negative.
fn crowned_pad(outline: PadOutline, speed: RunnerSpeed, cavitation: bool) -> ReynoldsSolver {
    let settings = ReynoldsSettings {
        tolerance: 1e-12,
        cavitation,
        ..Default::default()
    };
    let mut s = pads::solver(outline, speed, Support::Flat, 65, 65, settings);
    let mu = vec![0.03; s.grid().len()];
    let state = FilmState {
        reference: 20e-6,
        crown: 10e-6,
        ..Default::default()
    };
    s.solve(&state, &mu, Start::Cold).unwrap();
    s
}

fn outlines() -> [(PadOutline, RunnerSpeed); 2] {
    [
        (
            PadOutline::Sector {
                inner_radius: 0.05,
                outer_radius: 0.10,
                arc: 50f64.to_radians(),
            },
            RunnerSpeed::Angular(314.0),
        ),
        (
            PadOutline::Rectangle {
                length: 0.1,
                width: 0.08,
            },
            RunnerSpeed::Linear(10.0),
        ),
    ]
}

/// Projected successive over-relaxation (Cryer 1971) of `A p = b`, `p ≥ 0` on the interior
/// nodes, with the matrix of the level written out here. Iterates until the largest update is
/// below 1e-13 of the largest pressure (round-off keeps updates at ~1e-15 from vanishing). Returns the pressure and the sweeps used.
fn projected_sor(level: &Level, b: &[f64]) -> (Vec<f64>, usize) {
    let g = &level.grid;
    let w = g.nx + 1;
    let n = g.nx.max(g.ny) as f64;
    // The SOR optimum of the model problem, 2/(1 + sin(π/n)) (Young's theory; e.g. Varga,
    // Matrix Iterative Analysis; from memory). Any 0 < ω < 2 converges; this one is fast.
    let omega = 2.0 / (1.0 + (std::f64::consts::PI / n).sin());
    let mut p = vec![0.0; g.len()];
    for sweep in 1..=50_000 {
        let mut change: f64 = 0.0;
        let mut largest: f64 = 0.0;
        for j in 1..g.ny {
            for i in 1..g.nx {
                let k = g.idx(i, j);
                let gs = (b[k]
                    + level.ce[k] * p[k + 1]
                    + level.ce[k - 1] * p[k - 1]
                    + level.cn[k] * p[k + w]
                    + level.cn[k - w] * p[k - w])
                    * level.inv_diag[k];
                let new = (p[k] + omega * (gs - p[k])).max(0.0);
                change = change.max((new - p[k]).abs());
                largest = largest.max(new);
                p[k] = new;
            }
        }
        if change <= 1e-13 * largest {
            return (p, sweep);
        }
    }
    panic!("projected SOR did not converge");
}

/// Swift–Stieber cavitation on crowned flat pads (sector and rectangle): the solver's pressure
/// is non-negative; it satisfies the complementarity conditions with the matrix written out
/// here (free nodes: residual ≈ 0; nodes held at zero: `A p − b ≥ 0`, nothing would lift
/// them); some nodes are actively held; the result differs from the linear solve without the
/// condition, which has negative pressures; and it agrees with an independent projected SOR
/// on the same matrix.
///
/// Source: the Swift–Stieber condition (Swift 1932, Stieber 1933; years from memory) as a
/// complementarity problem; Cryer
/// (1971) for projected SOR and uniqueness; Brandt & Cryer (1983).
///
/// Tolerances: the solver stops at a projected residual of 1e-12 · ‖b‖, so each free node's
/// residual is ≤ 1e-12 ‖b‖ and each held node's `b − A p` ≤ 1e-12 ‖b‖ (asserted with 1e-11,
/// allowing for the different summation order here). Multigrid against PSOR: max difference
/// ≤ 1e-8 of the peak — both are converged far below that (PSOR stops at updates of 1e-13;
/// its error is about the update divided by `1 − ρ`, `ρ ≈ 1 − 2π/n`, ≈ 1e-12), and the LCP
/// solution is Lipschitz in the residual with constant `‖A⁻¹‖` as in the linear case
/// (≈ κ·1e-12 ≲ 1e-8).
#[test]
fn cavitation_is_a_complementarity_solution() {
    for (outline, speed) in outlines() {
        let cav = crowned_pad(outline, speed, true);
        let lin = crowned_pad(outline, speed, false);
        let (p, pl) = (cav.pressure(), lin.pressure());
        let nodes = pads::interior(cav.level());
        let b = cav.rhs();
        let bnorm = b.iter().map(|x| x * x).sum::<f64>().sqrt();
        let ap = pads::apply_operator(cav.level(), p);
        let peak = p.iter().fold(0.0f64, |m, &x| m.max(x));
        let (mut held, mut active, mut worst_free, mut worst_held) = (0, 0, 0.0f64, f64::MIN);
        for &k in &nodes {
            assert!(p[k] >= 0.0, "negative pressure {}", p[k]);
            let r = b[k] - ap[k];
            if p[k] == 0.0 {
                held += 1;
                worst_held = worst_held.max(r);
                if r < -1e-6 * bnorm {
                    active += 1;
                }
            } else {
                worst_free = worst_free.max(r.abs());
            }
        }
        eprintln!(
            "{outline:?}: {held} nodes held at zero ({active} strictly active), largest free \
             residual {:.1e}, largest held b − Ap {:.1e} (of ‖b‖)",
            worst_free / bnorm,
            worst_held / bnorm
        );
        assert!(worst_free <= 1e-11 * bnorm);
        assert!(worst_held <= 1e-11 * bnorm);
        assert!(active > nodes.len() / 10, "a real cavitated region");
        // The linear solve goes negative where the cavitating one is held.
        let lin_min = pl.iter().fold(0.0f64, |m, &x| m.min(x));
        eprintln!(
            "  without cavitation: min {lin_min:.3e} Pa, peak {:.3e} Pa; with: peak {peak:.3e} Pa",
            pl.iter().fold(0.0f64, |m, &x| m.max(x))
        );
        assert!(lin_min < -0.1 * peak);
        let differ = nodes
            .iter()
            .fold(0.0f64, |m, &k| m.max((p[k] - pl[k]).abs()));
        assert!(differ > 0.05 * peak);
        // Independent projected SOR on the same matrix and source.
        let (psor, sweeps) = projected_sor(cav.level(), b);
        let diff = nodes
            .iter()
            .fold(0.0f64, |m, &k| m.max((p[k] - psor[k]).abs()));
        eprintln!(
            "  projected SOR: {sweeps} sweeps, max |p_mg − p_psor| / peak = {:.2e}",
            diff / peak
        );
        assert!(diff <= 1e-8 * peak);
    }
}

/// The cavitated fraction and the flow balance with cavitation: the solver's cavitated area
/// fraction matches the fraction of control-volume area of the held nodes computed here, and
/// the Swift–Stieber condition, which does not conserve mass across the cavitation boundary,
/// shows a non-zero flow imbalance, while the linear solve of the same film balances.
///
/// Source: Swift–Stieber as above; the non-conservation across the film-rupture boundary is
/// the known limitation of the condition (e.g. Hamrock, Schmid & Jacobson, *Fundamentals of
/// Fluid Film Lubrication*, on the Reynolds boundary condition versus mass-conserving
/// cavitation models). Tolerance: area fraction to 1e-12 (same control volumes); imbalance of
/// the linear solve below 1e-6 (solver tolerance 1e-12 plus round-off), of the cavitating one
/// above 1e-3.
#[test]
fn cavitated_fraction_and_flow_balance() {
    for (outline, speed) in outlines() {
        let mut results = Vec::new();
        for cavitation in [true, false] {
            let mut s = crowned_pad(outline, speed, cavitation);
            let mu = vec![0.03; s.grid().len()];
            let state = FilmState {
                reference: 20e-6,
                crown: 10e-6,
                ..Default::default()
            };
            let i = pad::evaluate(&mut s, &state, &mu, Start::Warm).unwrap();
            // Own cavitated area: control volumes of the interior nodes held at zero, with
            // the metric (r for a sector).
            let g = s.grid();
            let (mut cav_area, mut area) = (0.0, 0.0);
            for j in 0..=g.ny {
                let t = outline.t_at(g.eta[j]);
                for ii in 0..=g.nx {
                    let da = g.xi_extent(ii) * g.eta_extent(j) * outline.metric(t);
                    area += da;
                    let interior = ii > 0 && ii < g.nx && j > 0 && j < g.ny;
                    if cavitation && interior && s.pressure()[g.idx(ii, j)] <= 0.0 {
                        cav_area += da;
                    }
                }
            }
            eprintln!(
                "{outline:?}, cavitation {cavitation}: cavitated {:.4} (own {:.4}), imbalance \
                 {:.2e}",
                i.cavitated_fraction,
                cav_area / area,
                i.flows.imbalance()
            );
            assert!((i.cavitated_fraction - cav_area / area).abs() < 1e-12);
            results.push(i);
        }
        assert!(results[0].cavitated_fraction > 0.2);
        assert_eq!(results[1].cavitated_fraction, 0.0);
        assert!(results[0].flows.imbalance().abs() > 1e-3);
        assert!(results[1].flows.imbalance().abs() < 1e-6);
    }
}
