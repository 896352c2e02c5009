//! Wide rectangular pads against the infinitely wide slider bearing.
//!
//! Reference: Reynolds (1886) for the plane inclined slider; closed forms in Cameron, *Basic
//! Lubrication Theory*, and Hamrock, Schmid & Jacobson, *Fundamentals of Fluid Film
//! Lubrication*. The tapered-land (taper–flat) slider is the same one-dimensional equation
//! integrated piecewise in closed form (see `padwright_validation::slider`).
//!
//! A rectangular pad much wider than long behaves like the infinitely wide slider away from
//! its sides: the side-leakage disturbance decays like `exp(−π y/L)` with the distance `y` from
//! a side, so on the mid-width line of a pad with `B/L = 12` it is below `exp(−6π) ≈ 7e-9` of
//! the pressure. The mid-line values are therefore compared with the closed forms, and the
//! remaining difference is the discretisation error, which must shrink at second order. Cells
//! are kept square (nodes across = `(B/L)(nodes along − 1) + 1`) because the multigrid smoother
//! is point-wise.
//!
//! Grid-error tolerances use the grid convergence index of Roache (1998), *Verification and
//! Validation in Computational Science and Engineering*: with two grids and the formal order
//! `p = 2`, the fine-grid error must lie within `GCI = F_s |f_coarse − f_fine|/(2ᵖ − 1)`.

use approx::assert_relative_eq;
use padwright_solver::film::{FilmState, Support};
use padwright_solver::geometry::{PadOutline, RunnerSpeed};
use padwright_solver::grid::Grid;
use padwright_solver::pad::{self, PadIntegrals};
use padwright_solver::reynolds::{ReynoldsSettings, Start};
use padwright_validation::convergence::{observed_order, observed_order_three};
use padwright_validation::pads;
use padwright_validation::quadrature::{derivative, trapezoid_weights};
use padwright_validation::slider::{PiecewiseLinearFilm, SliderSolution, inclined_optimum};

/// Pad length along the motion, m.
const LENGTH: f64 = 0.1;
/// Sliding speed, m/s.
const SPEED: f64 = 10.0;
/// Dynamic viscosity, Pa·s.
const MU: f64 = 0.02;
/// Smallest (outlet or land) film, m.
const H0: f64 = 20e-6;
/// Width over length of the "infinitely wide" pad.
const ASPECT: usize = 12;

/// Pressure scale `μ U L / h0²`, Pa.
fn pressure_scale() -> f64 {
    MU * SPEED * LENGTH / (H0 * H0)
}

/// Mid-line (and whole-pad) results of one wide-pad solve, dimensionless like the slider.
#[derive(Clone, Copy, Debug)]
struct MidLine {
    /// `W' h0²/(μ U L²)` from the trapezoidal rule over the mid-line pressure.
    load: f64,
    /// `x_cp/L` of the mid-line pressure.
    cp: f64,
    /// `q/(U h0)` through the first cell at the leading edge: `U h/2 − h³/(12μ) ∂p/∂x` at the
    /// cell middle, with the film from the closed form and the central difference of the
    /// mid-line pressure across the cell (second order).
    flow: f64,
    /// `F h0/(μ U L)`: `∫ μU/h + (h/2) ∂p/∂x dx` along the mid-line (three-point differences).
    friction: f64,
    /// `p_max h0²/(μ U L)` from the parabola through the largest node and its neighbours.
    peak: f64,
    /// `x/L` of that parabola's vertex.
    peak_at: f64,
    /// The solver's whole-pad integrals.
    pad: PadIntegrals,
    /// Node spacing along the motion (largest), fraction of L.
    dx: f64,
}

/// Solves a `B/L = aspect` rectangular pad with the film of the tapered-land slider
/// `H = 1 + D (1 − ξ/a)` (`a = 1`: the plane inclined slider with `K = D`) and evaluates the
/// mid-line. `kink_on_grid` puts a grid line at `ξ = a`.
fn wide_pad(a: f64, d: f64, nodes_along: usize, aspect: usize, kink_on_grid: bool) -> MidLine {
    let outline = PadOutline::Rectangle {
        length: LENGTH,
        width: aspect as f64 * LENGTH,
    };
    // `TaperedLand` with the taper over the whole length is exactly the inclined plane.
    let support = Support::TaperedLand {
        taper_fraction: a,
        taper_depth: d * H0,
    };
    let across = aspect * (nodes_along - 1) + 1;
    let grid = Grid::new(
        nodes_along,
        across,
        if kink_on_grid {
            support.breakpoint()
        } else {
            None
        },
    )
    .unwrap();
    let settings = ReynoldsSettings {
        tolerance: 1e-12,
        ..Default::default()
    };
    let mut s = pads::solver_on(outline, RunnerSpeed::Linear(SPEED), support, grid, settings);
    let mu = vec![MU; s.grid().len()];
    let state = FilmState {
        reference: H0,
        ..Default::default()
    };
    let integrals = pad::evaluate(&mut s, &state, &mu, Start::Cold).unwrap();
    let g = s.grid().clone();
    assert_eq!(g.ny % 2, 0, "a node row on the mid-width line");
    let p: Vec<f64> = pads::row(&s, s.pressure(), g.ny / 2)
        .iter()
        .map(|p| p / pressure_scale())
        .collect();
    let x = &g.xi;
    let w = trapezoid_weights(x);
    let film = PiecewiseLinearFilm::tapered_land(a, d);
    let load: f64 = w.iter().zip(&p).map(|(w, p)| w * p).sum();
    let moment: f64 = (0..x.len()).map(|i| w[i] * p[i] * x[i]).sum();
    // Dimensionless flow: q/(U h0) = H/2 − H³ P'/12, at the middle of the first cell.
    let h_in = film.at(0.5 * (x[0] + x[1]));
    let flow = 0.5 * h_in - h_in.powi(3) * (p[1] - p[0]) / (x[1] - x[0]) / 12.0;
    // Dimensionless shear on the runner: 1/H + (H/2) P'.
    let friction: f64 = (0..x.len())
        .map(|i| {
            let h = film.at(x[i]);
            w[i] * (1.0 / h + 0.5 * h * derivative(x, &p, i))
        })
        .sum();
    let m = (1..x.len() - 1)
        .max_by(|&i, &j| p[i].total_cmp(&p[j]))
        .unwrap();
    let (peak, peak_at) = parabola_vertex([x[m - 1], x[m], x[m + 1]], [p[m - 1], p[m], p[m + 1]]);
    let dx = x.windows(2).map(|w| w[1] - w[0]).fold(0.0, f64::max);
    MidLine {
        load,
        cp: moment / load,
        flow,
        friction,
        peak,
        peak_at,
        pad: integrals,
        dx,
    }
}

/// Vertex `(value, position)` of the parabola through three points.
fn parabola_vertex(x: [f64; 3], y: [f64; 3]) -> (f64, f64) {
    let d1 = (y[1] - y[0]) / (x[1] - x[0]);
    let d2 = (y[2] - y[1]) / (x[2] - x[1]);
    let c2 = (d2 - d1) / (x[2] - x[0]);
    let c1 = d1 - c2 * (x[0] + x[1]);
    let c0 = y[0] - c1 * x[0] - c2 * x[0] * x[0];
    let xv = -c1 / (2.0 * c2);
    (c0 + c1 * xv + c2 * xv * xv, xv)
}

/// Asserts second-order convergence of one quantity to its closed form on two grids (spacing
/// ratio 2): observed order within [1.8, 2.2] (formal order 2; ±0.2 allows for the
/// higher-order terms still visible at these grids), and the fine-grid error inside the
/// grid convergence index with the safety factor `fs` (Roache 1998).
fn assert_second_order(what: &str, coarse: f64, fine: f64, exact: f64, fs: f64, check_order: bool) {
    let (ec, ef) = (coarse - exact, fine - exact);
    let order = observed_order(ec, ef, 2.0);
    let gci = fs * (coarse - fine).abs() / 3.0;
    eprintln!(
        "  {what:>9}: exact {exact:.6}  coarse {coarse:.6} (err {ec:+.2e})  fine {fine:.6} \
         (err {ef:+.2e})  order {order:.2}  GCI {gci:.2e}"
    );
    if check_order {
        assert!(
            (1.8..=2.2).contains(&order),
            "{what}: observed order {order:.3} is not second order"
        );
    }
    assert!(
        ef.abs() <= gci,
        "{what}: fine-grid error {ef:.3e} exceeds the grid convergence index {gci:.3e}"
    );
}

/// Load, centre of pressure and leading-edge flow per unit width on the mid-line of a wide
/// plane inclined pad (`B/L = 12`) against Reynolds' closed form for K = 0.5, 1, 1.1887, 2, 3.
///
/// Source: Reynolds (1886); Cameron, *Basic Lubrication Theory*; Hamrock, Schmid & Jacobson,
/// *Fundamentals of Fluid Film Lubrication* (`W' h0²/(μUL²) = 6/K² [ln(1+K) − 2K/(2+K)]`,
/// `q/(U h0) = (1+K)/(2+K)`, centre of pressure from the closed-form moment). Also asserts
/// the tabulated values of the reference list.
///
/// Tolerance: grids of 41 and 81 nodes along; observed order in [1.8, 2.2] and the 81-node
/// error within the two-grid GCI with `F_s = 1.25` (p = 2 formal; Roache 1998). Measured
/// relative errors at 81 nodes: 7e-6 to 7e-4; observed orders 2.00 (±0.01).
#[test]
fn wide_inclined_pad_midline_matches_reynolds_slider() {
    let table = [
        (0.5, 0.13116, 0.5404),
        (1.0, 0.15888, 0.5687),
        (1.1887, 0.16024, 0.5774),
        (2.0, 0.14792, 0.6074),
        (3.0, 0.12420, 0.6338),
    ];
    for (k, w_tab, cp_tab) in table {
        let exact = PiecewiseLinearFilm::inclined(k).solve();
        // The closed form reproduces the tabulated values (5 and 4 significant figures).
        assert!(
            (exact.load - w_tab).abs() < 5e-6 && (exact.centre_of_pressure - cp_tab).abs() < 5e-5
        );
        let coarse = wide_pad(1.0, k, 41, ASPECT, true);
        let fine = wide_pad(1.0, k, 81, ASPECT, true);
        eprintln!("K = {k}");
        compare_midline(&exact, &coarse, &fine, 1.25, true);
    }
}

fn compare_midline(exact: &SliderSolution, c: &MidLine, f: &MidLine, fs: f64, order: bool) {
    assert_second_order("load", c.load, f.load, exact.load, fs, order);
    assert_second_order("cp", c.cp, f.cp, exact.centre_of_pressure, fs, order);
    assert_second_order("flow", c.flow, f.flow, exact.flow, fs, order);
}

/// Runner friction and peak pressure per unit width of the wide inclined pad at the
/// load-optimal film ratio K = 1.1887 against the closed forms: `F h0/(μUL) = 4 ln(1+K)/K −
/// 6/(2+K) = 0.7542`, `p_max h0²/(μUL) = 0.2555` at `x/L = 0.686`.
///
/// Source: Cameron, *Basic Lubrication Theory*; Hamrock, Schmid & Jacobson, *Fundamentals of
/// Fluid Film Lubrication*; tabulated values from the shared reference list.
///
/// Tolerances: three grids (21, 41, 81 nodes along). Friction: observed order of the three
/// grids in [1.5, 2.5] and the 81-node error within the GCI with `F_s = 1.25` and that order
/// (Roache 1998) — the mid-line friction uses three-point differences of the pressure, whose
/// error is not yet fully asymptotic (observed order ≈ 1.8). Peak (vertex of the parabola
/// through the largest node and its neighbours): error within the two-grid GCI with
/// `F_s = 3`, and the location within a quarter of a node spacing of the closed form.
///
/// Also checks the solver's whole-pad friction against the exact identity for a plane film
/// `∫(h/2)∂p/∂x dA = (K h0/(2L)) W` (integration by parts, `p = 0` on the edges), so that
/// `F = μU ∫dA/h + (K h0/2L) W` with `∫dA/h = B L ln(1+K)/(K h0)` in closed form. The solver's
/// load carries side leakage; the identity holds for any width. Tolerance 1e-4 relative: the
/// trapezoidal rule for `∫dx/h` at 81 nodes errs by `Δx²/12 ∫(1/h)'' dx ≈ 3e-5` relative.
#[test]
fn wide_inclined_pad_friction_and_peak_at_optimum() {
    let k = inclined_optimum();
    let exact = PiecewiseLinearFilm::inclined(k).solve();
    assert!((exact.friction - 0.7542).abs() < 5e-5 && (exact.peak_pressure - 0.2555).abs() < 5e-5);
    let r: Vec<MidLine> = [21, 41, 81]
        .iter()
        .map(|&n| wide_pad(1.0, k, n, ASPECT, true))
        .collect();
    let f = [r[0].friction, r[1].friction, r[2].friction];
    let p = observed_order_three(f[0], f[1], f[2], 2.0);
    let gci = 1.25 * (f[1] - f[2]).abs() / (2f64.powf(p) - 1.0);
    eprintln!(
        "friction: exact {:.6}, grids {f:.6?}, observed order {p:.2}, GCI {gci:.2e}, \
         error {:+.2e}",
        exact.friction,
        f[2] - exact.friction
    );
    assert!((1.5..=2.5).contains(&p), "friction: order {p}");
    assert!(
        (f[2] - exact.friction).abs() <= gci,
        "friction: error beyond the GCI"
    );
    // The sampled peak converges irregularly (the vertex moves relative to the nodes), so the
    // two finest grids are used with the two-grid safety factor F_s = 3 (Roache 1998).
    let gci = 3.0 * (r[1].peak - r[2].peak).abs() / 3.0;
    eprintln!(
        "peak: exact {:.6}, grids {:.6} {:.6} {:.6}, GCI {gci:.2e}, error {:+.2e}",
        exact.peak_pressure,
        r[0].peak,
        r[1].peak,
        r[2].peak,
        r[2].peak - exact.peak_pressure
    );
    assert!((r[2].peak - exact.peak_pressure).abs() <= gci);
    assert!(
        (r[2].peak_at - exact.peak_at).abs() <= 0.25 * r[2].dx,
        "peak at {} instead of {}",
        r[2].peak_at,
        exact.peak_at
    );
    // The solver's own peak (largest node of the pad) cannot exceed the true peak by more
    // than the grid error of the pressure (GCI above), nor fall short of it by more than the
    // sampling error of a node grid, |P''| Δx²/8 with P'' = −6K/H*³ at the peak.
    let sampling = 6.0 * k / exact.h_star.powi(3) * r[2].dx.powi(2) / 8.0;
    let solver_peak = r[2].pad.peak_pressure / pressure_scale();
    eprintln!("solver peak {solver_peak:.6}, sampling bound {sampling:.2e}");
    assert!(solver_peak <= exact.peak_pressure + 1e-4);
    assert!(solver_peak >= exact.peak_pressure - sampling - 1e-4);
    // Whole-pad friction identity.
    let i = &r[2].pad;
    let width = ASPECT as f64 * LENGTH;
    let couette = MU * SPEED * width * LENGTH * (1.0 + k).ln() / (k * H0);
    let expected = couette + k * H0 / (2.0 * LENGTH) * i.load;
    eprintln!(
        "solver friction {:.6e} N, identity {expected:.6e} N",
        i.friction_force
    );
    assert_relative_eq!(i.friction_force, expected, max_relative = 1e-4);
    assert_relative_eq!(i.power_loss, expected * SPEED, max_relative = 1e-4);
}

/// The load per unit width of a finite pad approaches the infinitely wide value as `B/L`
/// grows, with a side-leakage deficit proportional to `L/B`.
///
/// Source: the side-leakage disturbance of each side is confined to a strip of width ∝ L
/// (it decays like `exp(−λ y)` with `λ ≈ π/L`; separation of variables in the Reynolds
/// equation, e.g. Cameron, *Basic Lubrication Theory*, finite-width pads), so the load
/// lost is a fixed amount per side: `W = B W'_∞ − 2 ΔW_side + O(e^{−λB})`, i.e.
/// `(1 − W/(B W'))·(B/L)` is independent of `B/L`.
///
/// The deficit is measured against the mid-line load of the widest pad on the same grid along
/// the motion (so the along-motion discretisation error cancels). Tolerance:
/// `(1 − W/(BW'))·B/L` equal for B/L = 4, 8 and 16 within 1e-4 relative (the neglected
/// interaction of the two sides is of order `e^{−4π} ≈ 3e-6` at B/L = 4), and the deficit at
/// B/L = 16 below 5 %.
#[test]
fn side_leakage_deficit_shrinks_like_length_over_width() {
    let k = 1.0;
    let aspects = [4usize, 8, 16];
    let runs: Vec<MidLine> = aspects
        .iter()
        .map(|&b| wide_pad(1.0, k, 33, b, true))
        .collect();
    // The infinitely wide reference: the mid-line of the widest pad (its sides are 8 L away,
    // e^{−8π} ≈ 1e-11), on the same grid along the motion as the others.
    let w_inf = runs[2].load;
    let mut scaled = Vec::new();
    for (&aspect, r) in aspects.iter().zip(&runs) {
        let width = aspect as f64 * LENGTH;
        let per_width = r.pad.load / width / (pressure_scale() * LENGTH);
        let deficit = 1.0 - per_width / w_inf;
        eprintln!(
            "B/L = {aspect:2}: W/B = {per_width:.6}, W'∞ = {w_inf:.6}, deficit {deficit:.5}, \
             deficit·B/L = {:.6}",
            deficit * aspect as f64
        );
        assert!(deficit > 0.0);
        scaled.push(deficit * aspect as f64);
    }
    assert_relative_eq!(scaled[0], scaled[1], max_relative = 1e-4);
    assert_relative_eq!(scaled[1], scaled[2], max_relative = 1e-4);
    assert!(scaled[2] / 16.0 < 0.05);
}

/// Load, centre of pressure and flow per unit width on the mid-line of a wide tapered-land
/// pad (`B/L = 12`) against the closed-form tapered-land slider for a = 0.8 with D = 0.5,
/// 1.0, 1.5 and a = 0.7 with D = 1.0 (reference list: 0.15346/0.5237/0.5690,
/// 0.18969/0.5499/0.6000, 0.19022/0.5696/0.6132, 0.18519/0.5284/0.5778).
///
/// Source: Reynolds' one-dimensional equation integrated piecewise in closed form
/// (`padwright_validation::slider`; Cameron, *Basic Lubrication Theory*, for the method).
///
/// The grids (41 and 81 nodes along) put the kink `ξ = a` on a grid line and are uniform and
/// nested (`a·(n−1)` is an integer), so the error is a smooth function of the spacing.
/// Tolerance: observed order in [1.8, 2.2] and the 81-node error inside the two-grid GCI with
/// `F_s = 1.25` (Roache 1998). Measured relative errors at 81 nodes: ≤ 1.1e-4; observed
/// orders 1.97–2.01.
#[test]
fn wide_tapered_land_pad_midline_matches_closed_form() {
    for (a, d, w_tab, cp_tab, q_tab) in [
        (0.8, 0.5, 0.15346, 0.5237, 0.5690),
        (0.8, 1.0, 0.18969, 0.5499, 0.6000),
        (0.8, 1.5, 0.19022, 0.5696, 0.6132),
        (0.7, 1.0, 0.18519, 0.5284, 0.5778),
    ] {
        let exact = PiecewiseLinearFilm::tapered_land(a, d).solve();
        assert!((exact.load - w_tab).abs() < 5e-6);
        assert!((exact.centre_of_pressure - cp_tab).abs() < 5e-5);
        assert!((exact.flow - q_tab).abs() < 5e-5);
        let coarse = wide_pad(a, d, 41, ASPECT, true);
        let fine = wide_pad(a, d, 81, ASPECT, true);
        eprintln!("a = {a}, D = {d}");
        compare_midline(&exact, &coarse, &fine, 1.25, true);
    }
}

/// The grid line at the end of the taper: the solver places one at `ξ = a`, and with it the
/// load converges regularly at second order even on grids where `a·(n − 1)` is not an
/// integer (the spacing then differs slightly between taper and land). Without the grid
/// line the kink sits inside a control volume, whose face film misses the corner, and the
/// error loses its smooth dependence on the spacing.
///
/// Source: reference list 1b (closed form), a = 0.8, D = 1.0. Tolerance: the error with the
/// grid line falls by a factor in [3.2, 4.8] (order 1.7–2.3; the taper and land spacings are
/// not exactly halved) per halving. The error without the grid line is only reported.
#[test]
fn tapered_land_kink_on_a_grid_line() {
    let (a, d) = (0.8, 1.0);
    let exact = PiecewiseLinearFilm::tapered_land(a, d).solve();
    let g = Grid::new(
        65,
        9,
        Support::TaperedLand {
            taper_fraction: a,
            taper_depth: d * H0,
        }
        .breakpoint(),
    )
    .unwrap();
    let line =
        g.xi.iter()
            .map(|x| (x - a).abs())
            .fold(f64::INFINITY, f64::min);
    eprintln!("grid line nearest the kink: |ξ − a| = {line:.1e}");
    assert!(line < 1e-15);
    let mut on = Vec::new();
    for n in [17, 33, 65] {
        let with = wide_pad(a, d, n, ASPECT, true);
        let without = wide_pad(a, d, n, ASPECT, false);
        eprintln!(
            "n = {n}: load error with the grid line {:+.2e}, without {:+.2e}",
            with.load - exact.load,
            without.load - exact.load
        );
        on.push(with.load - exact.load);
    }
    for w in on.windows(2) {
        let ratio = w[0] / w[1];
        assert!((3.2..=4.8).contains(&ratio), "error ratio {ratio}");
    }
}
