//! Pressure-solver benchmarks on identical grids and matrices.
//!
//! For grids of 33², 65², 129² and 257² nodes this compares, all to the same relative residual
//! `‖b − A p‖ / ‖b‖ ≤ 1e-8`:
//!
//! * (a) the project's solver (multigrid; cold start, warm start from a nearby design, and a
//!   cavitating film);
//! * (b) textbook red–black SOR with its near-optimal fixed factor `ω = 2/(1 + sin(π/(n−1)))`;
//! * (c) a general-purpose sparse direct solver: faer's sparse Cholesky, symbolic analysis done
//!   once outside the timing, numeric factorisation plus solve timed, one thread.
//!
//! Besides criterion's own report, a table of iterations, best time and *work units* (time
//! divided by one fine-grid residual evaluation on the same grid, the two timed in alternation)
//! is printed at the end and written to `target/bench-reynolds.md`. The ratio to the cold
//! multigrid solve is the ratio of work units, which the machine's drifting speed disturbs
//! least.

use criterion::{BenchmarkId, Criterion};
use faer::Mat;
use faer::Side;
use faer::linalg::solvers::Solve;
use faer::sparse::linalg::solvers::{Llt, SymbolicLlt};
use faer::sparse::{SparseColMat, Triplet};
use padwright_solver::film::{FilmModel, FilmState, Support};
use padwright_solver::geometry::{PadFrame, PadOutline, RunnerSpeed};
use padwright_solver::grid::Grid;
use padwright_solver::reynolds::stencil::Level;
use padwright_solver::reynolds::{ReynoldsSettings, ReynoldsSolver, Start};
use std::hint::black_box;
use std::time::{Duration, Instant};

const TOL: f64 = 1e-8;
const SIZES: [usize; 4] = [33, 65, 129, 257];

/// The benchmark pad: a sector of usual proportions (bench data, invented).
const PAD: PadOutline = PadOutline::Sector {
    inner_radius: 0.06,
    outer_radius: 0.12,
    arc: 45.0 * std::f64::consts::PI / 180.0,
};

/// The benchmark pad on a point pivot.
fn solver(n: usize, support: Support, cavitation: bool) -> ReynoldsSolver {
    shaped_solver(PAD, n, support, cavitation, true)
}

/// A pad of outline `o` at 3000 rpm (sector) or 20 m/s (rectangle); `lines`: automatic line
/// smoothing allowed.
fn shaped_solver(
    o: PadOutline,
    n: usize,
    support: Support,
    cavitation: bool,
    lines: bool,
) -> ReynoldsSolver {
    let speed = match o {
        PadOutline::Sector { .. } => RunnerSpeed::Angular(3000.0 * std::f64::consts::PI / 30.0),
        PadOutline::Rectangle { .. } => RunnerSpeed::Linear(20.0),
    };
    let frame = PadFrame::new(o, speed).unwrap();
    let film = FilmModel::new(o, support).unwrap();
    let mut settings = ReynoldsSettings {
        tolerance: TOL,
        max_cycles: 500,
        cavitation,
        ..Default::default()
    };
    settings.cycle.lines = lines;
    ReynoldsSolver::new(frame, film, Grid::new(n, n, None).unwrap(), settings)
}

/// Pad shapes whose cells range from strongly anisotropic one way to the other (bench data,
/// invented): name and outline.
fn shapes() -> Vec<(&'static str, PadOutline)> {
    let sector = |inner_radius: f64, outer_radius: f64, arc_deg: f64| PadOutline::Sector {
        inner_radius,
        outer_radius,
        arc: arc_deg.to_radians(),
    };
    vec![
        ("sector 100–120 mm, 20° (narrow)", sector(0.10, 0.12, 20.0)),
        ("sector 60–120 mm, 45° (the pad above)", PAD),
        ("sector 60–120 mm, 30°", sector(0.06, 0.12, 30.0)),
        ("sector 100–250 mm, 45°", sector(0.10, 0.25, 45.0)),
        (
            "sector 100–250 mm, 20° (short, wide)",
            sector(0.10, 0.25, 20.0),
        ),
        (
            "sector 100–250 mm, 10° (short, wide)",
            sector(0.10, 0.25, 10.0),
        ),
        (
            "rectangle 25 × 50 mm (short, wide)",
            PadOutline::Rectangle {
                length: 0.025,
                width: 0.05,
            },
        ),
        (
            "rectangle 100 × 50 mm (long)",
            PadOutline::Rectangle {
                length: 0.1,
                width: 0.05,
            },
        ),
    ]
}

fn tilting() -> Support {
    Support::TiltingPoint {
        offset_along: 0.6,
        offset_across: 0.5,
    }
}

fn state(h: f64) -> FilmState {
    FilmState {
        reference: h,
        pitch: 3e-4,
        roll: 5e-5,
        crown: 0.0,
    }
}

/// A crowned pad pivoted at mid-arc: the film converges then diverges, so about half of the
/// pad cavitates.
fn cavitating_state() -> FilmState {
    FilmState {
        reference: 25e-6,
        pitch: 1e-4,
        roll: 0.0,
        crown: 15e-6,
    }
}

fn rel_residual(l: &Level, p: &[f64], b: &[f64], r: &mut [f64]) -> f64 {
    l.residual(p, b, r);
    let rn: f64 = r.iter().map(|x| x * x).sum::<f64>().sqrt();
    let bn: f64 = b.iter().map(|x| x * x).sum::<f64>().sqrt();
    rn / bn
}

/// Textbook red–black SOR on the same five-point system; the residual is checked every ten
/// sweeps (its cost is included). Returns the sweeps used.
fn sor(l: &Level, b: &[f64], p: &mut [f64], r: &mut [f64]) -> usize {
    let (nx, ny) = (l.grid.nx, l.grid.ny);
    let n = nx.max(ny) + 1;
    let omega = 2.0 / (1.0 + (std::f64::consts::PI / (n as f64 - 1.0)).sin());
    let w = nx + 1;
    p.fill(0.0);
    let mut sweeps = 0;
    loop {
        for _ in 0..10 {
            for color in 0..2 {
                for j in 1..ny {
                    let start = if (1 + j) % 2 == color { 1 } else { 2 };
                    let mut k = j * w + start;
                    let end = j * w + nx;
                    while k < end {
                        let s = b[k]
                            + l.ce[k] * p[k + 1]
                            + l.ce[k - 1] * p[k - 1]
                            + l.cn[k] * p[k + w]
                            + l.cn[k - w] * p[k - w];
                        p[k] += omega * (s * l.inv_diag[k] - p[k]);
                        k += 2;
                    }
                }
            }
            sweeps += 1;
        }
        if rel_residual(l, p, b, r) <= TOL || sweeps > 100_000 {
            return sweeps;
        }
    }
}

/// The interior system as a sparse matrix (lower triangle) and the index map.
fn sparse_matrix(l: &Level) -> (SparseColMat<usize, f64>, Vec<usize>) {
    let (nx, ny) = (l.grid.nx, l.grid.ny);
    let w = nx + 1;
    let mut index = vec![usize::MAX; l.grid.len()];
    let mut nodes = Vec::new();
    for j in 1..ny {
        for i in 1..nx {
            index[j * w + i] = nodes.len();
            nodes.push(j * w + i);
        }
    }
    let mut t = Vec::new();
    for (q, &k) in nodes.iter().enumerate() {
        t.push(Triplet::new(q, q, 1.0 / l.inv_diag[k]));
        // Lower triangle: neighbours with a larger index (east and north).
        if index[k + 1] != usize::MAX {
            t.push(Triplet::new(index[k + 1], q, -l.ce[k]));
        }
        if index[k + w] != usize::MAX {
            t.push(Triplet::new(index[k + w], q, -l.cn[k]));
        }
    }
    let m = nodes.len();
    (
        SparseColMat::try_new_from_triplets(m, m, &t).unwrap(),
        nodes,
    )
}

/// Best (shortest) wall time of `f` over repetitions filling about `budget`: on a shared
/// machine the minimum is the estimate least disturbed by other load.
fn time<F: FnMut()>(mut f: F, budget: Duration) -> Duration {
    f();
    let mut v = Vec::new();
    let start = Instant::now();
    while v.len() < 5 || (start.elapsed() < budget && v.len() < 2000) {
        let t = Instant::now();
        f();
        v.push(t.elapsed());
    }
    v.into_iter().min().unwrap()
}

/// The work unit: one fine-grid residual evaluation on the benchmark's own level.
struct Unit {
    lvl: Level,
    p: Vec<f64>,
    b: Vec<f64>,
    r: Vec<f64>,
}

impl Unit {
    fn time(&mut self, budget: Duration) -> Duration {
        let Unit { lvl, p, b, r } = self;
        time(|| lvl.residual(black_box(p), b, r), budget)
    }
}

/// Best times of `f` and of the work unit, measured in alternation so that both minima come
/// from the same stretch of the machine's (drifting) speed.
fn paired<F: FnMut()>(mut f: F, unit: &mut Unit, budget: Duration) -> (Duration, Duration) {
    let (mut tf, mut tu) = (Duration::MAX, Duration::MAX);
    for _ in 0..4 {
        tu = tu.min(unit.time(budget / 16));
        tf = tf.min(time(&mut f, budget / 4));
    }
    (tf, tu)
}

/// Assembles `s` for `state` (viscosity 0.02 Pa·s) and times its cold solve against the work
/// unit of its own level: the report and the work units.
fn cold_work_units(
    s: &mut ReynoldsSolver,
    state: &FilmState,
    budget: Duration,
) -> (padwright_solver::reynolds::SolveReport, f64) {
    let len = s.grid().len();
    s.assemble(state, &vec![0.02; len]).unwrap();
    let mut unit = Unit {
        lvl: s.level().clone(),
        p: vec![0.0; len],
        b: s.rhs().to_vec(),
        r: vec![0.0; len],
    };
    let rep = s.solve_assembled(Start::Cold).unwrap();
    let (t, tu) = paired(
        || {
            s.solve_assembled(Start::Cold).unwrap();
        },
        &mut unit,
        budget,
    );
    (rep, t.as_secs_f64() / tu.as_secs_f64())
}

struct Row {
    n: usize,
    method: &'static str,
    iterations: String,
    time: Duration,
    work_units: f64,
}

fn main() {
    let mut c = Criterion::default().configure_from_args();
    let mut rows = Vec::new();
    let budget = Duration::from_millis(800);
    for n in SIZES {
        let mut s = solver(n, tilting(), false);
        s.assemble(&state(30e-6), &vec![0.02; n * n]).unwrap();
        let lvl = s.level().clone();
        let b = s.rhs().to_vec();
        let mut r = vec![0.0; b.len()];
        let p0 = vec![0.0; b.len()];
        // Work unit: one fine-grid residual evaluation.
        let mut unit = Unit {
            lvl: lvl.clone(),
            p: p0.clone(),
            b: b.clone(),
            r: r.clone(),
        };
        let mut push = |method, iterations: String, t: Duration, tu: Duration| {
            rows.push(Row {
                n,
                method,
                iterations,
                time: t,
                work_units: t.as_secs_f64() / tu.as_secs_f64(),
            })
        };

        // (a) cold start.
        let (t, tu) = paired(
            || {
                s.solve_assembled(Start::Cold).unwrap();
            },
            &mut unit,
            budget,
        );
        let rep = s.solve_assembled(Start::Cold).unwrap();
        assert!(rel_residual(&lvl, s.pressure(), &b, &mut r) <= TOL);
        push(
            "(a) multigrid, cold",
            format!("FMG + {}", rep.cycles),
            t,
            tu,
        );
        let mut g = c.benchmark_group("pressure solve");
        g.sample_size(20);
        g.bench_function(BenchmarkId::new("(a) multigrid cold", n), |bch| {
            bch.iter(|| s.solve_assembled(Start::Cold).unwrap())
        });

        // (a) warm starts from the solution of a nearby design: pivot film 1 % and 0.1 %
        // thinner (a design step, and a slider moved by a small step). `reset` first, so that
        // the solver has nothing but the given start.
        let near = |h: f64| {
            let mut near = solver(n, tilting(), false);
            near.assemble(&state(h), &vec![0.02; n * n]).unwrap();
            near.solve_assembled(Start::Cold).unwrap();
            near.pressure().to_vec()
        };
        for (label, h) in [
            ("(a) multigrid, warm (1 % film change)", 29.7e-6),
            ("(a) multigrid, warm (0.1 % film change)", 29.97e-6),
        ] {
            let start_p = near(h);
            let mut cycles = 0;
            let (t, tu) = paired(
                || {
                    s.reset();
                    s.set_initial_pressure(&start_p);
                    cycles = s.solve_assembled(Start::Warm).unwrap().cycles;
                },
                &mut unit,
                budget,
            );
            assert!(rel_residual(&lvl, s.pressure(), &b, &mut r) <= TOL);
            push(label, format!("{cycles}"), t, tu);
            g.bench_function(BenchmarkId::new(label, n), |bch| {
                bch.iter(|| {
                    s.reset();
                    s.set_initial_pressure(&start_p);
                    s.solve_assembled(Start::Warm).unwrap()
                })
            });
        }
        // A slider moved in equal steps: the solutions of the three previous positions (film
        // 1, 2 and 3 % thinner, or 0.1, 0.2 and 0.3 %) are in the solver, as they are while
        // dragging. Loading them is not part of the solve: its time is measured alone and
        // subtracted.
        for (label, step) in [
            ("(a) multigrid, slider steps of 1 %", 0.01),
            ("(a) multigrid, slider steps of 0.1 %", 0.001),
        ] {
            let p: Vec<Vec<f64>> = (1..=3)
                .rev()
                .map(|q| near(30e-6 * (1.0 - step * q as f64)))
                .collect();
            let load = |s: &mut ReynoldsSolver| {
                s.reset();
                for pq in &p {
                    s.set_initial_pressure(pq);
                }
            };
            let mut cycles = 0;
            let (t_all, tu_all) = paired(
                || {
                    load(&mut s);
                    cycles = s.solve_assembled(Start::Warm).unwrap().cycles;
                },
                &mut unit,
                budget,
            );
            assert!(rel_residual(&lvl, s.pressure(), &b, &mut r) <= TOL);
            let (t_load, tu_load) = paired(|| load(&mut s), &mut unit, budget);
            push(
                label,
                format!("{cycles}"),
                t_all.saturating_sub(t_load),
                tu_all.min(tu_load),
            );
        }

        // (a) with cavitation active.
        let centre = Support::TiltingPoint {
            offset_along: 0.5,
            offset_across: 0.5,
        };
        let mut sc = solver(n, centre, true);
        sc.assemble(&cavitating_state(), &vec![0.02; n * n])
            .unwrap();
        let rep = sc.solve_assembled(Start::Cold).unwrap();
        let (t, tu) = paired(
            || {
                sc.solve_assembled(Start::Cold).unwrap();
            },
            &mut unit,
            budget,
        );
        push(
            "(a) multigrid, cavitating, cold",
            format!(
                "FMG + {} ({} % cavitated)",
                rep.cycles,
                100 * rep.cavitated_nodes / ((n - 2) * (n - 2))
            ),
            t,
            tu,
        );
        g.bench_function(BenchmarkId::new("(a) multigrid cavitating", n), |bch| {
            bch.iter(|| sc.solve_assembled(Start::Cold).unwrap())
        });
        // Warm starts on the cavitating pad from the solution of a film 1 % and 0.1 % thinner
        // (the start touches the floor), as for the linear pad above.
        for (label, frac) in [
            ("(a) multigrid, cavitating, warm (1 % film change)", 0.01),
            ("(a) multigrid, cavitating, warm (0.1 % film change)", 0.001),
        ] {
            let start_p = {
                let mut near = solver(n, centre, true);
                let mut st = cavitating_state();
                st.reference *= 1.0 - frac;
                near.assemble(&st, &vec![0.02; n * n]).unwrap();
                near.solve_assembled(Start::Cold).unwrap();
                near.pressure().to_vec()
            };
            let mut cycles = 0;
            let (t, tu) = paired(
                || {
                    sc.reset();
                    sc.set_initial_pressure(&start_p);
                    cycles = sc.solve_assembled(Start::Warm).unwrap().cycles;
                },
                &mut unit,
                budget,
            );
            push(label, format!("{cycles}"), t, tu);
        }

        // (b) red–black SOR.
        let mut p = vec![0.0; b.len()];
        let sweeps = sor(&lvl, &b, &mut p, &mut r);
        let (t, tu) = paired(
            || {
                sor(&lvl, &b, &mut p, &mut r);
            },
            &mut unit,
            budget,
        );
        push("(b) red-black SOR", format!("{sweeps}"), t, tu);
        g.bench_function(BenchmarkId::new("(b) red-black SOR", n), |bch| {
            bch.iter(|| sor(&lvl, &b, &mut p, &mut r))
        });

        // (c) faer sparse Cholesky, symbolic analysis reused.
        let (a, nodes) = sparse_matrix(&lvl);
        let symbolic = SymbolicLlt::try_new(a.symbolic(), Side::Lower).unwrap();
        let rhs = Mat::from_fn(nodes.len(), 1, |q, _| b[nodes[q]]);
        let direct = |out: &mut Mat<f64>| {
            let llt =
                Llt::try_new_with_symbolic(symbolic.clone(), a.as_ref(), Side::Lower).unwrap();
            out.copy_from(&rhs);
            llt.solve_in_place(out.as_mut());
        };
        let mut x = Mat::zeros(nodes.len(), 1);
        direct(&mut x);
        let mut px = vec![0.0; b.len()];
        for (q, &k) in nodes.iter().enumerate() {
            px[k] = x[(q, 0)];
        }
        assert!(rel_residual(&lvl, &px, &b, &mut r) <= TOL);
        let (t, tu) = paired(|| direct(&mut x), &mut unit, budget);
        push("(c) faer sparse Cholesky", "direct".into(), t, tu);
        g.bench_function(BenchmarkId::new("(c) sparse Cholesky", n), |bch| {
            bch.iter(|| direct(&mut x))
        });
        g.finish();
    }
    // Cold solves at 129² on pads of other shapes, with the automatic choice of smoother and
    // with point smoothing only; and a crowned film on a centre pivot, which cavitates over
    // the diverging half (automatic smoother).
    let mut shape_table = String::from(
        "| pad (129² nodes, cold) | cycles, automatic smoother | work units | cycles, point smoothing only | work units | crowned, cavitating: cycles (automatic) | work units |\n|---|---|---|---|---|---|---|\n",
    );
    for (name, o) in shapes() {
        let n = 129;
        let film_state = FilmState {
            reference: 30e-6,
            pitch: 20e-6 / o.area().sqrt(),
            roll: 0.0,
            crown: 0.0,
        };
        let mut cells = Vec::new();
        for lines in [true, false] {
            let mut s = shaped_solver(o, n, tilting(), false, lines);
            let (rep, wu) = cold_work_units(&mut s, &film_state, budget / 2);
            cells.push(format!("FMG + {} | {wu:.0}", rep.cycles));
        }
        {
            let centre = Support::TiltingPoint {
                offset_along: 0.5,
                offset_across: 0.5,
            };
            let crowned = FilmState {
                reference: 25e-6,
                pitch: 0.0,
                roll: 0.0,
                crown: 20e-6,
            };
            let mut s = shaped_solver(o, n, centre, true, true);
            let (rep, wu) = cold_work_units(&mut s, &crowned, budget / 2);
            cells.push(format!(
                "FMG + {} ({} % cavitated) | {wu:.0}",
                rep.cycles,
                100 * rep.cavitated_nodes / ((n - 2) * (n - 2)),
            ));
        }
        shape_table.push_str(&format!(
            "| {name} | {} | {} | {} |\n",
            cells[0], cells[1], cells[2]
        ));
    }
    c.final_summary();

    let mut out = String::new();
    out.push_str(
        "| nodes | method | iterations | best time | work units | vs (a) cold |\n|---|---|---|---|---|---|\n",
    );
    for row in &rows {
        let cold = rows
            .iter()
            .find(|x| x.n == row.n && x.method == "(a) multigrid, cold")
            .unwrap();
        out.push_str(&format!(
            "| {}² | {} | {} | {:.3} ms | {:.1} | {:.1}× |\n",
            row.n,
            row.method,
            row.iterations,
            row.time.as_secs_f64() * 1e3,
            row.work_units,
            row.work_units / cold.work_units
        ));
    }
    out.push('\n');
    out.push_str(&shape_table);
    println!("\n{out}");
    let path =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../target/bench-reynolds.md");
    let _ = std::fs::write(path, &out);
}
