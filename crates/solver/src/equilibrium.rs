//! Pad equilibrium: the film state at which a pad carries its share of the load.
//!
//! * **Fixed pad** (tapered land, flat): one unknown, the minimum film. The load falls
//!   monotonically as the film opens, so the root of `ln W(h) − ln W_target` is bracketed
//!   between the smallest allowed film and a film that carries less than the target, then found
//!   by a safeguarded secant (Illinois) iteration in `ln h`. The reverse problem — the load at a
//!   given film — is a single evaluation.
//! * **Tilting pad**: unknowns pivot film `h_p`, pitch and roll (pitch only on a line pivot).
//!   The pressure resultant must equal the pad load and both moments about the pivot must vanish.
//!   Shape variables `a = pitch·L/h_p`, `g = roll·B/h_p` (L the mean arc length, B the width)
//!   make the moment conditions independent of `h_p` for a rigid, isoviscous pad, whose pressure
//!   then scales exactly as `1/h_p²`: the shape is solved first and `h_p` follows in closed form.
//!   Otherwise (crown, temperature-dependent viscosity) Newton's method runs on
//!   `(ln h_p, a, g)` with a finite-difference Jacobian, a backtracking line search and bounds
//!   that keep the film converging and positive.
//! * **No equilibrium** is recognised, not iterated into: when the iteration drives the pad
//!   towards a parallel film (the centre of pressure cannot reach a pivot too far forward — the
//!   rigid, isoviscous pad pivoted at mid-arc is the classical case), towards an unbounded tilt
//!   (pivot too far aft), or stalls on a singular Jacobian (the zero-moment curves fold).

use crate::error::SolverError;
use crate::film::{FilmModel, FilmState, Support};
use crate::pad::PadIntegrals;
use crate::reynolds::Start;

/// Tolerance of an intermediate frozen tilting equilibrium in the thermal coupling, per kelvin
/// of the last film-temperature change. A renewal that moves the temperatures by ΔT shifts the
/// equilibrium residual (load and moments, relative) by about 0.01–0.04 per kelvin on the
/// benchmark pads, and the next renewal moves them by about a third of ΔT (measured; common
/// practice for inexact fixed-point coupling, no source): solving each intermediate
/// equilibrium to 4e-4 ΔT keeps its error an order below the shift still to come.
const ROUND_TOLERANCE_PER_KELVIN: f64 = 4e-4;

/// Pressure tolerance of a Newton trial point per unit of the present equilibrium residual
/// (relative load and moments). An error ε in the relative pressure residual moves the
/// integrated load and moments by about ε (multigrid leaves no smooth error behind), so the
/// trial's residual is known to about a thousandth of the one it must improve on.
const PRESSURE_TOL_PER_RESIDUAL: f64 = 1e-3;
/// Pressure tolerance of the finite-difference Jacobian of a Newton iteration (the reported
/// stiffness uses the full tolerance).
const NEWTON_JACOBIAN_PRESSURE_TOL: f64 = 1e-7;
/// Loosest pressure tolerance of a Newton trial point.
const MAX_RELAXED_PRESSURE_TOL: f64 = 1e-5;
/// Relaxed pressure tolerances below this multiple of the full one are replaced by the full
/// one (see `Counted::relax`).
const FULL_TOLERANCE_SNAP: f64 = 4.0;

/// Settings of the equilibrium iterations.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct EquilibriumSettings {
    /// Smallest film the pad may run at, m. Loads needing less are reported as overload.
    pub min_film: f64,
    /// Relative tolerance on the load and on the moments (moments relative to load × length).
    pub tolerance: f64,
    /// Largest number of Newton or secant iterations.
    pub max_iterations: usize,
}

impl Default for EquilibriumSettings {
    fn default() -> Self {
        EquilibriumSettings {
            min_film: 1e-6,
            tolerance: 1e-6,
            max_iterations: 60,
        }
    }
}

/// A pad model the equilibrium can interrogate: film state in, pressure integrals out.
///
/// A *coupled* model (thermal) carries an internal state — the viscosity field and the thermal
/// crown — that `respond` holds fixed and `update` renews from the last solution. The
/// equilibrium then alternates: an exact equilibrium for the frozen internal state, an update,
/// and again, until the update changes less than its tolerance. Keeping `respond` a smooth
/// function of the film state is what lets Newton's method converge to tight tolerances.
pub trait FilmResponse {
    /// Solves the pad at `state` with the internal state frozen, and integrates the pressure.
    fn respond(&mut self, state: &FilmState, start: Start) -> Result<PadIntegrals, SolverError>;
    /// Renews the internal state from the last solution; returns how much it changed
    /// (the largest film-temperature change, K). Uncoupled models return zero.
    fn update(&mut self) -> Result<f64, SolverError> {
        Ok(0.0)
    }
    /// Largest change of [`FilmResponse::update`] accepted as converged; infinite for
    /// uncoupled models.
    fn update_tolerance(&self) -> f64 {
        f64::INFINITY
    }
    /// Largest number of renewals of the internal state in one equilibrium.
    fn update_limit(&self) -> usize {
        MAX_COUPLING_ROUNDS
    }
    /// Starts a new sequence of renewals (e.g. forgets the relaxation history after the film
    /// state moved far).
    fn restart_updates(&mut self) {}
    /// Loosens the pressure solver's tolerance to `tol` for the following responses, or
    /// restores it with `None` (see [`crate::reynolds::ReynoldsSolver::relax_tolerance`]).
    fn relax_pressure_tolerance(&mut self, _tol: Option<f64>) {}
    /// The pressure solver's full relative-residual tolerance (0 if the model has none).
    fn full_pressure_tolerance(&self) -> f64 {
        0.0
    }
    /// Solves the pad at `state` like [`FilmResponse::respond`] but returns only the load and
    /// moments, for the iterations that need nothing else (cheaper where the model can skip
    /// the other integrals).
    fn respond_forces(&mut self, state: &FilmState, start: Start) -> Result<Forces, SolverError> {
        self.respond(state, start).map(|i| Forces::of(&i))
    }
    /// All integrals of the last solution without solving again, if the model can give them
    /// (after [`FilmResponse::respond_forces`]).
    fn complete(&mut self) -> Option<PadIntegrals> {
        None
    }
    /// True if the pressure at a fixed film shape scales exactly as `1/h_ref²` (rigid,
    /// isoviscous, no crown).
    fn scales_inverse_square(&self) -> bool;
    /// The film model (outline and support).
    fn film_model(&self) -> &FilmModel;
    /// Smallest film over the grid nodes for a state, m.
    fn min_film(&self, state: &FilmState) -> f64;
}

/// The load and moments of a pressure field: what the equilibrium iterations need.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Forces {
    /// Load, N.
    pub load: f64,
    /// Moment about the pivot's axis across the motion, N·m.
    pub moment_pitch: f64,
    /// Moment about the pivot's axis along the motion, N·m.
    pub moment_roll: f64,
}

impl Forces {
    /// The forces part of full integrals.
    pub fn of(i: &PadIntegrals) -> Self {
        Forces {
            load: i.load,
            moment_pitch: i.moment_pitch,
            moment_roll: i.moment_roll,
        }
    }
}

/// What the memory of [`Counted`] holds for its last state.
#[derive(Clone, Copy, Debug)]
enum Answer {
    Full(PadIntegrals),
    Forces(Forces),
}

impl Answer {
    fn forces(&self) -> Forces {
        match self {
            Answer::Full(i) => Forces::of(i),
            Answer::Forces(f) => *f,
        }
    }
}

/// A pad in equilibrium.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Equilibrium {
    /// The film state found.
    pub state: FilmState,
    /// Integrals at that state.
    pub integrals: PadIntegrals,
    /// Axial film stiffness `−dW/dh` of the pad, N/m, with `h` the pivot film (tilting pads,
    /// free to tilt) or the minimum film (fixed pads).
    pub stiffness: f64,
    /// Outer iterations used.
    pub iterations: usize,
    /// Pressure solves used (including those for the stiffness).
    pub pressure_solves: usize,
    /// `|W − W_target| / W_target` at the solution.
    pub load_error: f64,
    /// Largest moment about the pivot divided by (load × pad length); zero for fixed pads.
    pub moment_error: f64,
    /// Jacobian of the tilting equilibrium at the solution, on its active shape variables
    /// (see [`TiltStart`]); none for fixed pads and for the rigid isoviscous pad.
    jacobian: Option<SizedJacobian>,
}

impl Equilibrium {
    /// A start for the equilibrium of the same pad, under the same load, in a finer or
    /// otherwise nearby model: this solution's film state and Jacobian.
    pub fn restart(&self) -> TiltStart {
        TiltStart {
            state: self.state,
            jacobian: self.jacobian,
        }
    }
}

/// Where a tilting-pad equilibrium search starts instead of its own estimate: the film state
/// and the Jacobian of a nearby solution, as the same pad solved on a coarser grid. The
/// residual's Jacobian with respect to the dimensionless shape (log pivot film, tilt
/// and roll relative to the film) depends on the grid only through the discretisation error,
/// so the search needs no finite differences to begin.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TiltStart {
    /// Film state of the nearby solution.
    pub state: FilmState,
    jacobian: Option<SizedJacobian>,
}

/// A response with a count of its pressure solves and a memory of the last one: asking again
/// for the state just solved (with the internal state unchanged) costs nothing.
struct Counted<'a, R: FilmResponse> {
    r: &'a mut R,
    solves: usize,
    /// The last state, its answer and the pressure tolerance it was solved to (0: full).
    last: Option<(FilmState, Answer, f64)>,
    /// The loosened pressure tolerance in force (0: full).
    relaxed: f64,
}

impl<'a, R: FilmResponse> Counted<'a, R> {
    fn new(r: &'a mut R) -> Self {
        Counted {
            r,
            solves: 0,
            last: None,
            relaxed: 0.0,
        }
    }

    /// Loosens the pressure tolerance of the following evaluations to `tol` (0: full). A
    /// tolerance within [`FULL_TOLERANCE_SNAP`] times the full one is taken as full: it costs
    /// about the same, and a following request for a full solution of the same state then
    /// costs nothing.
    fn relax(&mut self, tol: f64) {
        let tol = if tol < FULL_TOLERANCE_SNAP * self.r.full_pressure_tolerance() {
            0.0
        } else {
            tol
        };
        if tol != self.relaxed {
            self.relaxed = tol;
            self.r.relax_pressure_tolerance((tol > 0.0).then_some(tol));
        }
    }

    /// All integrals at `s`.
    fn eval(&mut self, s: &FilmState, start: Start) -> Result<PadIntegrals, SolverError> {
        if let Some((ls, a, lt)) = self.last
            && ls == *s
            && lt <= self.relaxed
        {
            match a {
                Answer::Full(i) => return Ok(i),
                Answer::Forces(_) => {
                    if let Some(i) = self.r.complete() {
                        self.last = Some((ls, Answer::Full(i), lt));
                        return Ok(i);
                    }
                }
            }
        }
        self.solves += 1;
        self.last = None;
        let i = self.r.respond(s, start)?;
        self.last = Some((*s, Answer::Full(i), self.relaxed));
        Ok(i)
    }

    /// Load and moments at `s` only.
    fn forces(&mut self, s: &FilmState, start: Start) -> Result<Forces, SolverError> {
        if let Some((ls, a, lt)) = self.last
            && ls == *s
            && lt <= self.relaxed
        {
            return Ok(a.forces());
        }
        self.solves += 1;
        self.last = None;
        let f = self.r.respond_forces(s, start)?;
        self.last = Some((*s, Answer::Forces(f), self.relaxed));
        Ok(f)
    }

    /// Renews the response's internal state (which changes every answer).
    fn update(&mut self) -> Result<f64, SolverError> {
        self.last = None;
        self.r.update()
    }
}

/// Offset between the reference film and the minimum film of a fixed pad:
/// `min film = reference + offset`.
fn fixed_offset<R: FilmResponse>(r: &R, crown: f64) -> f64 {
    r.min_film(&FilmState {
        reference: 0.0,
        crown,
        ..Default::default()
    })
}

/// The load a fixed pad carries at a given minimum film (the reverse problem).
pub fn fixed_pad_at_film<R: FilmResponse>(
    r: &mut R,
    min_film: f64,
    crown: f64,
) -> Result<Equilibrium, SolverError> {
    crate::geometry::positive("minimum film", min_film)?;
    let at = |r: &R| FilmState {
        reference: min_film - fixed_offset(r, crown),
        crown,
        ..Default::default()
    };
    let coupled = r.update_tolerance().is_finite();
    let mut c = Counted::new(r);
    let mut state = at(c.r);
    let mut integrals = c.eval(&state, Start::Cold)?;
    let mut rounds = 0;
    // Coupled model: renew the internal state until it settles (the thermal crown moves the
    // minimum film, so the reference film follows it).
    while coupled && rounds < MAX_COUPLING_ROUNDS + 1 {
        let change = c.update()?;
        state = at(c.r);
        integrals = c.eval(&state, Start::Warm)?;
        rounds += 1;
        if change < c.r.update_tolerance() {
            break;
        }
        if rounds >= MAX_COUPLING_ROUNDS {
            return Err(SolverError::NotConverged {
                what: "film temperature at the given film",
                iterations: rounds,
                residual: change,
            });
        }
    }
    let stiffness = fixed_stiffness(&mut c, &state, integrals.load)?;
    c.eval(&state, Start::Warm)?;
    Ok(Equilibrium {
        state,
        integrals,
        stiffness,
        iterations: rounds,
        pressure_solves: c.solves,
        load_error: 0.0,
        moment_error: 0.0,
        jacobian: None,
    })
}

fn fixed_stiffness<R: FilmResponse>(
    c: &mut Counted<R>,
    state: &FilmState,
    _load: f64,
) -> Result<f64, SolverError> {
    let dh = 0.005 * c.r.min_film(state);
    let up = c.forces(
        &FilmState {
            reference: state.reference + dh,
            ..*state
        },
        Start::Warm,
    )?;
    let dn = c.forces(
        &FilmState {
            reference: state.reference - dh,
            ..*state
        },
        Start::Warm,
    )?;
    Ok(-(up.load - dn.load) / (2.0 * dh))
}

/// The minimum film at which a fixed pad carries `load` (N). Coupled (thermal) models
/// alternate frozen solutions (inexact before the last) with updates of their internal state.
pub fn fixed_pad_at_load<R: FilmResponse>(
    r: &mut R,
    load: f64,
    crown: f64,
    settings: &EquilibriumSettings,
) -> Result<Equilibrium, SolverError> {
    fixed_pad_at_load_from(r, load, crown, settings, None)
}

/// [`fixed_pad_at_load`] from the minimum film `start` (m) of a nearby solution, such as the
/// same pad on a coarser grid, whose internal state a coupled model should have taken over
/// (see [`crate::thermal::FieldPad::start_from`]): the search brackets around it, and a
/// coupled model renews its state once at that film before the rounds.
pub fn fixed_pad_at_load_from<R: FilmResponse>(
    r: &mut R,
    load: f64,
    crown: f64,
    settings: &EquilibriumSettings,
    start: Option<f64>,
) -> Result<Equilibrium, SolverError> {
    let coupled = r.update_tolerance().is_finite();
    if !coupled {
        return fixed_frozen(r, load, crown, settings, true, start);
    }
    // Inexact rounds, as for the tilting pad: each frozen equilibrium before the last is solved
    // only to a fraction of the shift the next renewal brings. Without a start the first
    // renewal moves the temperatures from the supply's by kelvins: that round is solved as for
    // a change of 10 K.
    let round = |change: f64| EquilibriumSettings {
        tolerance: settings.tolerance.max(ROUND_TOLERANCE_PER_KELVIN * change),
        ..*settings
    };
    let (mut solves, mut iterations) = (0, 0);
    // Where the next round searches from: the state of the last frozen equilibrium, or the
    // start's minimum film.
    enum From {
        State(FilmState),
        MinFilm(f64),
    }
    let mut from = match start {
        Some(h) => {
            // The carried-over temperatures belong to the nearby solution: renew them from this
            // model's pressure at its film (a rough pressure suffices).
            let off = fixed_offset(r, crown);
            let mut c = Counted::new(r);
            c.relax(MAX_RELAXED_PRESSURE_TOL);
            let state = FilmState {
                reference: h - off,
                crown,
                ..Default::default()
            };
            c.forces(&state, Start::Warm)?;
            solves += c.solves;
            From::MinFilm(h)
        }
        None => {
            let eq = fixed_frozen(r, load, crown, &round(FIRST_ROUND_KELVIN), false, None)?;
            solves += eq.pressure_solves;
            iterations += eq.iterations;
            From::State(eq.state)
        }
    };
    for _ in 0..r.update_limit() {
        // The last solve left the solver at that film: renew the temperatures, then search
        // from the same reference film (the thermal crown may have moved the minimum film).
        let change = r.update()?;
        let guess = match &from {
            From::State(state) => r.min_film(state),
            From::MinFilm(h) => *h,
        };
        let last = change < r.update_tolerance();
        let settings = if last { *settings } else { round(change) };
        let mut eq = fixed_frozen(r, load, crown, &settings, last, Some(guess))?;
        solves += eq.pressure_solves;
        iterations += eq.iterations;
        if last {
            eq.pressure_solves = solves;
            eq.iterations = iterations;
            return Ok(eq);
        }
        from = From::State(eq.state);
    }
    Err(SolverError::NotConverged {
        what: "coupling of film temperature and load",
        iterations: r.update_limit(),
        residual: 0.0,
    })
}

/// The temperature change the first coupling round of a fixed pad is solved for, K.
const FIRST_ROUND_KELVIN: f64 = 10.0;

/// Rounds of frozen equilibrium and internal update allowed for coupled models.
const MAX_COUPLING_ROUNDS: usize = 40;

/// The film at which a fixed pad carries `load` with the response's internal state frozen:
/// a bracket in `ln h` (from `guess`, or up from the smallest allowed film), then Illinois.
/// An `exact` search (the answer, or the last coupling round) ends on full-accuracy solves and
/// computes the stiffness; an inexact one (an intermediate coupling round) accepts its last
/// loosened solve.
fn fixed_frozen<R: FilmResponse>(
    r: &mut R,
    load: f64,
    crown: f64,
    settings: &EquilibriumSettings,
    exact: bool,
    guess: Option<f64>,
) -> Result<Equilibrium, SolverError> {
    crate::geometry::positive("pad load", load)?;
    let off = fixed_offset(r, crown);
    let at = |h_min: f64| FilmState {
        reference: h_min - off,
        crown,
        ..Default::default()
    };
    let mut c = Counted::new(r);
    let h_lo = settings.min_film;
    // The bracket only has to show on which side the answer lies: rough pressures suffice.
    c.relax(MAX_RELAXED_PRESSURE_TOL);
    // With a nearby answer (a later coupling round), bracket around it first.
    let mut bracket = None;
    if let Some(g) = guess.filter(|&g| g > 1.5 * h_lo) {
        let f = load_residual(&mut c, &at, load, g.ln())?;
        bracket = secant_bracket(&mut c, &at, load, h_lo, g.ln(), f)?;
    }
    let (mut a, mut fa, mut b, mut fb) = match bracket {
        Some(br) => br,
        None => fixed_bracket(&mut c, &at, load, h_lo)?,
    };
    if !fb.is_finite() {
        // Fall back to bisection until a finite value is found.
        fb = -1.0;
    }
    // Illinois (modified regula falsi) on f(ln h) = ln W − ln W_target. Each point only has
    // to improve on the bracket: its pressure is solved to a thousandth of the smaller end
    // value (full accuracy near the answer, where that falls below four times the full
    // tolerance), and a point that meets the tolerance on a loosened solve is solved again
    // in full before it is accepted.
    let mut side = 0i32;
    for it in 0..settings.max_iterations {
        let x = if fb.is_finite() && fa.is_finite() && fa != fb {
            (a * fb - b * fa) / (fb - fa)
        } else {
            0.5 * (a + b)
        };
        let near = fa.abs().min(fb.abs());
        c.relax((PRESSURE_TOL_PER_RESIDUAL * near).min(MAX_RELAXED_PRESSURE_TOL));
        let mut fx = load_residual(&mut c, &at, load, x)?;
        if fx.abs() <= settings.tolerance * 0.5 && c.relaxed > 0.0 && exact {
            c.relax(0.0);
            fx = load_residual(&mut c, &at, load, x)?;
        }
        if fx.abs() <= settings.tolerance * 0.5 || (b - a).abs() < 1e-14 {
            let state = at(x.exp());
            if exact {
                c.relax(0.0);
            }
            let integrals = c.eval(&state, Start::Warm)?;
            let (stiffness, integrals) = if exact {
                let k = fixed_stiffness(&mut c, &state, load)?;
                // Leave the solver holding the equilibrium pressure.
                (k, c.eval(&state, Start::Warm)?)
            } else {
                (0.0, integrals)
            };
            return Ok(Equilibrium {
                state,
                integrals,
                stiffness,
                iterations: it + 1,
                pressure_solves: c.solves,
                load_error: (integrals.load / load - 1.0).abs(),
                moment_error: 0.0,
                jacobian: None,
            });
        }
        if fx > 0.0 {
            a = x;
            fa = fx;
            if side == 1 {
                fb *= 0.5;
            }
            side = 1;
        } else {
            b = x;
            fb = fx;
            if side == -1 {
                fa *= 0.5;
            }
            side = -1;
        }
    }
    Err(SolverError::NotConverged {
        what: "search for the film that carries the load",
        iterations: settings.max_iterations,
        residual: (b - a).abs(),
    })
}

/// `ln(W/W_target)` of the fixed pad at the film `exp(x)` (minus infinity where it carries
/// nothing), at the pressure tolerance in force.
fn load_residual<R: FilmResponse>(
    c: &mut Counted<R>,
    at: &impl Fn(f64) -> FilmState,
    load: f64,
    x: f64,
) -> Result<f64, SolverError> {
    let w = c.forces(&at(x.exp()), Start::Warm)?.load;
    Ok(if w > 0.0 {
        (w / load).ln()
    } else {
        f64::NEG_INFINITY
    })
}

/// Brackets the root of `f(x) = ln(W/W_target)`, `x = ln h`, from a point `(x0, f0)` by secant
/// steps: the load of a wedge of fixed shape falls as `h⁻²` (slope −2 in logarithms, the
/// first estimate) and a fixed taper steepens that towards `h⁻³` as the film grows past the
/// taper depth, so each step aims a quarter beyond the estimated root and usually brackets
/// it at once (steps of 2 % to a factor of 16). `(ln h_a, f_a, ln h_b, f_b)` with `f_a ≥ 0 >
/// f_b`, or `None` if the films down to `h_lo` all carry less than the load.
fn secant_bracket<R: FilmResponse>(
    c: &mut Counted<R>,
    at: &impl Fn(f64) -> FilmState,
    load: f64,
    h_lo: f64,
    x0: f64,
    f0: f64,
) -> Result<Option<(f64, f64, f64, f64)>, SolverError> {
    let (mut x, mut f) = (x0, f0);
    let mut slope = -2.0f64;
    let lowest = h_lo.ln();
    for _ in 0..40 {
        let aim = -1.25 * f / slope;
        let step = aim.signum() * aim.abs().clamp(0.02, 16f64.ln());
        let xn = (x + step).max(lowest);
        if xn == x {
            return Ok(None);
        }
        let fnew = load_residual(c, at, load, xn)?;
        if (fnew >= 0.0) != (f >= 0.0) {
            return Ok(Some(if f >= 0.0 {
                (x, f, xn, fnew)
            } else {
                (xn, fnew, x, f)
            }));
        }
        if fnew.is_finite() && f.is_finite() {
            // A falling load keeps the secant's slope; anything flatter keeps the last one.
            let s = (fnew - f) / (xn - x);
            if s < -0.1 {
                slope = s;
            }
        }
        (x, f) = (xn, fnew);
    }
    Ok(None)
}

/// Brackets the film of a fixed pad from the smallest allowed film upward: `(ln h_a, f_a,
/// ln h_b, f_b)` with `f = ln(W/W_target)` positive at `a` and negative at `b`; reports an
/// overload or a film that builds no pressure.
fn fixed_bracket<R: FilmResponse>(
    c: &mut Counted<R>,
    at: &impl Fn(f64) -> FilmState,
    load: f64,
    h_lo: f64,
) -> Result<(f64, f64, f64, f64), SolverError> {
    // The smallest allowed film bounds the capacity.
    let w_lo = c.forces(&at(h_lo), Start::Cold)?.load;
    if w_lo <= 0.0 {
        return Err(SolverError::NoLoadCapacity(no_wedge_message(
            c.r.film_model().support(),
        )));
    }
    if w_lo < load {
        return Err(SolverError::Overload {
            load_n: load,
            min_film_um: h_lo * 1e6,
            capacity_n: w_lo,
        });
    }
    // Bracket from above by secant steps (see [`secant_bracket`]).
    let (a, fa) = (h_lo.ln(), (w_lo / load).ln());
    match secant_bracket(c, at, load, h_lo, a, fa)? {
        Some(br) => Ok(br),
        None => Err(SolverError::NotConverged {
            what: "search for the film that carries the load",
            iterations: 40,
            residual: fa,
        }),
    }
}

fn no_wedge_message(s: &Support) -> String {
    match s {
        Support::Flat => "a flat, parallel film with constant viscosity builds no pressure; \
                          give the pad a taper, a crown or a tilting support"
            .into(),
        _ => "the film builds no pressure at the smallest allowed film".into(),
    }
}

/// Dimensionless shape variables and the film state they describe.
#[derive(Clone, Copy, Debug)]
struct Shape {
    ln_h: f64,
    a: f64,
    g: f64,
}

struct TiltFrame {
    len: f64,
    width: f64,
    crown: f64,
    line: bool,
    pivot: (f64, f64),
}

impl TiltFrame {
    /// The shape of a film state (inverse of [`TiltFrame::state`] for the crown of the frame).
    fn shape(&self, s: &FilmState) -> Shape {
        let h = s.reference;
        Shape {
            ln_h: h.ln(),
            a: s.pitch * self.len / h,
            g: if self.line {
                0.0
            } else {
                s.roll * self.width / h
            },
        }
    }

    fn state(&self, x: &Shape) -> FilmState {
        let h = x.ln_h.exp();
        FilmState {
            reference: h,
            pitch: x.a * h / self.len,
            roll: if self.line { 0.0 } else { x.g * h / self.width },
            crown: self.crown,
        }
    }
}

/// Start values from the infinitely wide inclined slider: the film ratio `1 + K` whose centre
/// of pressure (Reynolds' closed form) lies at the pivot, converted to the shape variable `a`.
fn slider_start(pivot_along: f64) -> f64 {
    // Centre of pressure of the wide slider, x/L from the inlet, for h = h0(1 + K(1 − x/L)):
    // p ∝ K x(1 − x)/((2 + K)(1 + K(1 − x))²) (closed form; Cameron, Basic Lubrication Theory).
    let cp = |k: f64| {
        let n = 200;
        let (mut m0, mut m1) = (0.0, 0.0);
        for i in 0..=n {
            let x = i as f64 / n as f64;
            let w = if i == 0 || i == n {
                1.0
            } else if i % 2 == 1 {
                4.0
            } else {
                2.0
            };
            let p = x * (1.0 - x) / (1.0 + k * (1.0 - x)).powi(2);
            m0 += w * p;
            m1 += w * p * x;
        }
        m1 / m0
    };
    let k = if pivot_along <= cp(1e-3) + 1e-3 {
        1.0
    } else if pivot_along >= cp(20.0) {
        20.0
    } else {
        let (mut lo, mut hi) = (1e-3f64, 20.0f64);
        for _ in 0..50 {
            let mid = (lo * hi).sqrt();
            if cp(mid) < pivot_along {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        (lo * hi).sqrt()
    };
    // (1 + a ξp)/(1 − a(1 − ξp)) = 1 + K along the mid line.
    k / (pivot_along + (1.0 + k) * (1.0 - pivot_along))
}

/// The wide-slider start shape ([`slider_start`]) with its film kept open over the sector and
/// its pivot film scaled to the load (exact for a rigid isoviscous pad).
fn wide_slider_start<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    load: f64,
) -> Result<Shape, SolverError> {
    // Reference pivot film for the shape iteration: a film of the order of the answer keeps
    // the pressures well scaled. Estimate from the wide slider load at the start shape.
    let mut x = Shape {
        ln_h: (20e-6f64).ln(),
        a: slider_start(frame.pivot.0),
        g: 0.0,
    };
    // The wide-slider start ignores the sector's corners: keep its film open everywhere.
    for _ in 0..40 {
        let st = frame.state(&x);
        if c.r.min_film(&st) >= 0.3 * st.reference {
            break;
        }
        x.a *= 0.8;
    }
    // The scale needs only a rough pressure.
    c.relax(MAX_RELAXED_PRESSURE_TOL);
    let first = c.forces(&frame.state(&x), Start::Cold)?;
    if first.load > 0.0 {
        x.ln_h += 0.5 * (first.load / load).ln();
    }
    Ok(x)
}

/// Lets a coupled model's internal state (temperatures) settle at the start shape `x` and the
/// load before the first frozen equilibrium, so that the viscosity variation is in the film;
/// the pivot film follows the load. Settling goes on only while the temperatures still move by
/// more than a hundred coupling tolerances (5 K at the default): the shape will move anyway,
/// and the inexact rounds of the equilibrium finish the job for less. The start shape is only
/// a start: its pressures need no more than a rough solve.
fn settle<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    mut x: Shape,
    load: f64,
) -> Result<Shape, SolverError> {
    c.relax(MAX_RELAXED_PRESSURE_TOL);
    for _ in 0..8 {
        let i = c.forces(&frame.state(&x), Start::Warm)?;
        if i.load > 0.0 {
            x.ln_h += 0.5 * (i.load / load).ln();
        }
        let change = c.update()?;
        if change < 100.0 * c.r.update_tolerance() {
            break;
        }
    }
    c.relax(0.0);
    // The rounds that follow are a different fixed-point map: start their relaxation afresh.
    c.r.restart_updates();
    Ok(x)
}

/// Equilibrium of a tilting pad carrying `load` (N), with a mechanical crown `crown` (m).
pub fn tilting_pad<R: FilmResponse>(
    r: &mut R,
    load: f64,
    crown: f64,
    settings: &EquilibriumSettings,
) -> Result<Equilibrium, SolverError> {
    tilting_pad_from(r, load, crown, settings, None)
}

/// [`tilting_pad`] from a given start (the solution of the same pad on a coarser grid, say)
/// instead of the wide-slider estimate. A coupled model's internal state should have been
/// carried over as well (see [`crate::thermal::FieldPad::start_from`]): the search then
/// renews it once at the start and goes on with the coupling rounds.
pub fn tilting_pad_from<R: FilmResponse>(
    r: &mut R,
    load: f64,
    crown: f64,
    settings: &EquilibriumSettings,
    start: Option<TiltStart>,
) -> Result<Equilibrium, SolverError> {
    crate::geometry::positive("pad load", load)?;
    let model = r.film_model().clone();
    let support = *model.support();
    let (line, pivot) = match support {
        Support::TiltingPoint {
            offset_along,
            offset_across,
        } => (false, (offset_along, offset_across)),
        Support::TiltingLine { offset_along } => (true, (offset_along, 0.5)),
        _ => {
            return Err(SolverError::Input(crate::error::InputError::Inconsistent(
                "a tilting-pad equilibrium needs a tilting support".into(),
            )));
        }
    };
    let frame = TiltFrame {
        len: model.outline().mean_length(),
        width: model.outline().width(),
        crown,
        line,
        pivot,
    };
    let scaling = r.scales_inverse_square() && crown == 0.0;
    let mut c = Counted::new(r);

    let mut n_it = 0;
    let coupled = c.r.update_tolerance().is_finite();
    let mut cache = JacobianCache::default();
    // The last change of the internal state before the first frozen equilibrium, K (none for
    // an uncoupled model).
    let mut settled = 0.0;
    let x = match start {
        Some(s) => {
            let x = frame.shape(&s.state);
            cache.jac = s.jacobian;
            if coupled {
                // The carried-over temperatures belong to the nearby solution: renew them
                // once from this model's pressure at its shape (a rough pressure suffices),
                // and solve the first frozen equilibrium as an inexact round for that change.
                c.relax(MAX_RELAXED_PRESSURE_TOL);
                c.forces(&frame.state(&x), Start::Warm)?;
                settled = c.update()?;
                c.relax(0.0);
            }
            x
        }
        None => {
            let x = wide_slider_start(&mut c, &frame, load)?;
            if coupled {
                settle(&mut c, &frame, x, load)?
            } else {
                x
            }
        }
    };
    let first = EquilibriumSettings {
        tolerance: settings.tolerance.max(ROUND_TOLERANCE_PER_KELVIN * settled),
        ..*settings
    };
    let mut x = frozen_tilt(
        &mut c, &frame, x, load, scaling, &first, &mut n_it, &mut cache,
    )?;
    if coupled {
        let mut done = false;
        for _ in 0..c.r.update_limit() {
            // The frozen Newton ends on an evaluation at its solution, so the solver holds
            // the pressure the renewal needs.
            let change = c.update()?;
            let last_round = change < c.r.update_tolerance();
            // Inexact rounds: while the temperatures still move, the next renewal will shift
            // the equilibrium again, so each frozen equilibrium is solved only to a fraction of
            // that shift; the round that meets the coupling tolerance is solved in full.
            let round = if last_round {
                *settings
            } else {
                EquilibriumSettings {
                    tolerance: settings.tolerance.max(ROUND_TOLERANCE_PER_KELVIN * change),
                    ..*settings
                }
            };
            x = frozen_tilt(
                &mut c, &frame, x, load, scaling, &round, &mut n_it, &mut cache,
            )?;
            if last_round {
                done = true;
                break;
            }
        }
        if !done {
            return Err(SolverError::NotConverged {
                what: "coupling of film temperature and pad equilibrium",
                iterations: MAX_COUPLING_ROUNDS,
                residual: 0.0,
            });
        }
    }
    let mut state = frame.state(&x);
    let mut integrals = c.eval(&state, Start::Warm)?;
    if scaling {
        // Exact: W ∝ 1/h_p² at fixed shape.
        let f = (integrals.load / load).sqrt();
        state.reference *= f;
        state.pitch *= f;
        state.roll *= f;
        integrals = c.eval(&state, Start::Warm)?;
    }
    let min_film = c.r.min_film(&state);
    if min_film < settings.min_film {
        // Capacity at the smallest allowed film. Exact for the scaling pad; otherwise by the
        // same scaling from this equilibrium, which is a close estimate.
        let capacity = load * (min_film / settings.min_film).powi(2);
        return Err(SolverError::Overload {
            load_n: load,
            min_film_um: settings.min_film * 1e6,
            capacity_n: capacity,
        });
    }
    let len = frame.len;
    let moment_error = (integrals.moment_pitch.abs() / len).max(if line {
        0.0
    } else {
        integrals.moment_roll.abs() / frame.width
    }) / load;
    let (stiffness, jacobian) = if scaling {
        (2.0 * integrals.load / state.reference, None)
    } else {
        let (k, jac) = tilting_stiffness(&mut c, &frame, &x, load)?;
        (k, Some(jac))
    };
    // Leave the solver holding the equilibrium pressure.
    let integrals = c.eval(&state, Start::Warm)?;
    Ok(Equilibrium {
        state,
        integrals,
        stiffness,
        iterations: n_it,
        pressure_solves: c.solves,
        load_error: (integrals.load / load - 1.0).abs(),
        moment_error,
        jacobian,
    })
}

/// Equilibrium of the frozen response: Newton from `x`, with the pitch scan as fallback.
#[allow(clippy::too_many_arguments)]
fn frozen_tilt<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    x: Shape,
    load: f64,
    scaling: bool,
    settings: &EquilibriumSettings,
    n_it: &mut usize,
    cache: &mut JacobianCache,
) -> Result<Shape, SolverError> {
    let first = newton_tilt(c, frame, x, load, scaling, settings, n_it, cache, true);
    c.relax(0.0);
    match first {
        Ok(x) => Ok(x),
        Err(SolverError::NoEquilibrium { .. }) | Err(SolverError::NotConverged { .. }) => {
            // Newton could not find a root from this start: scan the pitch to either bracket
            // the equilibrium (and restart Newton there) or show that none exists.
            let start = scan_pitch(c, frame, x, load)?;
            cache.jac = None;
            newton_tilt(c, frame, start, load, scaling, settings, n_it, cache, false)
        }
        Err(e) => Err(e),
    }
}

/// `−dW/dh_p` with the pad free to tilt (N/m), from the Jacobian of the equilibrium at the
/// solution: a load change `d ln W` moves the solution by `J⁻¹ (d ln W, 0, 0)`, so
/// `d ln h_p / d ln W = (J⁻¹)₀₀` and `−dW/dh_p = −W / (h_p (J⁻¹)₀₀)` (for a rigid isoviscous pad
/// `(J⁻¹)₀₀ = −1/2`, the exact `2W/h_p`). Returns the Jacobian too, with its size.
fn tilting_stiffness<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    x: &Shape,
    load: f64,
) -> Result<(f64, SizedJacobian), SolverError> {
    let vars: &[usize] = if frame.line { &[0, 1] } else { &[0, 1, 2] };
    let i = c.forces(&frame.state(x), Start::Warm)?;
    let f = tilt_residual(&i, frame, load).unwrap_or_default();
    let no = || SolverError::NotConverged {
        what: "film stiffness at the equilibrium",
        iterations: 1,
        residual: 0.0,
    };
    let jac = fd_jacobian(c, frame, vars, x, &f, load)?.ok_or_else(no)?;
    let mut e0 = vec![0.0; vars.len()];
    e0[0] = 1.0;
    let y = solve_small(&jac, &e0, vars.len()).ok_or_else(no)?;
    let h = x.ln_h.exp();
    let k = -i.load / (h * y[0]);
    if k.is_finite() {
        Ok((k, (jac, vars.len())))
    } else {
        Err(no())
    }
}

/// Residual vector of the tilting equilibrium: `[ln(W/W_t), M_pitch/(W L), M_roll/(W B)]`.
fn tilt_residual(i: &Forces, frame: &TiltFrame, load: f64) -> Option<[f64; 3]> {
    if i.load.is_nan() || i.load <= 0.0 {
        return None;
    }
    Some([
        (i.load / load).ln(),
        i.moment_pitch / (i.load * frame.len),
        if frame.line {
            0.0
        } else {
            i.moment_roll / (i.load * frame.width)
        },
    ])
}

const A_MIN: f64 = 2e-3;

/// A Newton step cut below this fraction by the line search ...
const STALL_STEP: f64 = 0.1;
/// ... that reduces the residual norm by less than this fraction ...
const STALL_GAIN: f64 = 0.02;
/// ... this many times in a row, along fresh Jacobians, ends the first Newton search from a
/// start (and hands over to the pitch scan). Common practice for damped Newton methods
/// (Dennis & Schnabel, *Numerical Methods for Unconstrained Optimization and Nonlinear
/// Equations*, 1983: a line search stuck at short steps signals a local minimiser of |f|;
/// from memory); the values are this project's choice.
const STALL_STEPS: usize = 3;

/// Component `v` of a shape: 0 the log pivot film, 1 the pitch shape, 2 the roll shape.
fn shape_get(s: &Shape, v: usize) -> f64 {
    match v {
        0 => s.ln_h,
        1 => s.a,
        _ => s.g,
    }
}

fn shape_set(s: &mut Shape, v: usize, val: f64) {
    match v {
        0 => s.ln_h = val,
        1 => s.a = val,
        _ => s.g = val,
    }
}

/// Finite-difference Jacobian of the tilting residual on the active variables `vars`, from
/// the residual `f` at `x` (forward differences, relative steps of 1e-5). `None` if a step
/// closes the film.
fn fd_jacobian<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    vars: &[usize],
    x: &Shape,
    f: &[f64; 3],
    load: f64,
) -> Result<Option<[[f64; 3]; 3]>, SolverError> {
    let mut jac = [[0.0; 3]; 3];
    for (col, &v) in vars.iter().enumerate() {
        let x0 = shape_get(x, v);
        let step = match v {
            0 => 1e-5,
            _ => 1e-5 * x0.abs().max(0.05),
        };
        let mut xp = *x;
        shape_set(&mut xp, v, x0 + step);
        let fp = match c.forces(&frame.state(&xp), Start::Warm) {
            Ok(i) => tilt_residual(&i, frame, load),
            Err(SolverError::FilmClosed { .. }) => None,
            Err(e) => return Err(e),
        };
        let Some(fp) = fp else {
            return Ok(None);
        };
        for (row, &w) in vars.iter().enumerate() {
            jac[row][col] = (fp[w] - f[w]) / step;
        }
    }
    Ok(Some(jac))
}

/// Sets the roll shape `g` so that the roll moment vanishes at the current pitch (secant, to
/// the accuracy a scan needs). Returns the residual vector there.
fn balance_roll<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    x: &mut Shape,
    load: f64,
) -> Result<Option<[f64; 3]>, SolverError> {
    let eval = |c: &mut Counted<R>, s: &Shape| -> Result<Option<[f64; 3]>, SolverError> {
        let st = frame.state(s);
        if c.r.min_film(&st) < FILM_RATIO_MIN * st.reference {
            return Ok(None);
        }
        match c.forces(&st, Start::Warm) {
            Ok(i) => Ok(tilt_residual(&i, frame, load)),
            Err(SolverError::FilmClosed { .. }) => Ok(None),
            Err(e) => Err(e),
        }
    };
    let Some(mut f) = eval(c, x)? else {
        return Ok(None);
    };
    if frame.line {
        return Ok(Some(f));
    }
    let (mut g0, mut f0) = (x.g, f[2]);
    let mut g1 = x.g + if f0 > 0.0 { 0.05 } else { -0.05 };
    for _ in 0..10 {
        let mut xt = *x;
        xt.g = g1;
        let Some(f1) = eval(c, &xt)? else {
            g1 = 0.5 * (g0 + g1);
            continue;
        };
        *x = xt;
        f = f1;
        if f1[2].abs() < 1e-4 || f1[2] == f0 {
            break;
        }
        let g2 = g1 - f1[2] * (g1 - g0) / (f1[2] - f0);
        (g0, f0, g1) = (g1, f1[2], g2.clamp(g1 - 0.5, g1 + 0.5));
    }
    Ok(Some(f))
}

/// Scans the pitch shape over a wide range, with the roll balanced at each value, for a sign
/// change of the pitch moment. Returns a start for Newton near the bracketed root, or the
/// reason why no equilibrium exists.
fn scan_pitch<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    x0: Shape,
    load: f64,
) -> Result<Shape, SolverError> {
    let no_eq = |reason: String| SolverError::NoEquilibrium {
        offset_along: frame.pivot.0,
        offset_across: frame.pivot.1,
        reason,
        short_of_pivot: None,
    };
    let grid = [0.005, 0.015, 0.04, 0.1, 0.25, 0.6, 1.5, 4.0, 10.0, 25.0];
    let mut prev: Option<(Shape, f64)> = None;
    let mut signs = Vec::new();
    for &a in &grid {
        let mut x = Shape { a, g: 0.0, ..x0 };
        if let Some((px, _)) = prev {
            x.g = px.g * a / px.a;
        }
        let Some(f) = balance_roll(c, frame, &mut x, load)? else {
            break;
        };
        signs.push(f[1]);
        if let Some((px, pf)) = prev
            && pf > 0.0
            && f[1] <= 0.0
        {
            // Bracketed: refine by regula falsi on the pitch residual.
            let (mut lo, mut flo, mut hi, mut fhi) = (px, pf, x, f[1]);
            for _ in 0..12 {
                let t = flo / (flo - fhi);
                let mut xm = Shape {
                    a: lo.a + t * (hi.a - lo.a),
                    g: lo.g + t * (hi.g - lo.g),
                    ..lo
                };
                let Some(fm) = balance_roll(c, frame, &mut xm, load)? else {
                    break;
                };
                if fm[1].abs() < 1e-4 {
                    return Ok(xm);
                }
                if fm[1] > 0.0 {
                    (lo, flo) = (xm, fm[1]);
                } else {
                    (hi, fhi) = (xm, fm[1]);
                }
            }
            return Ok(if flo.abs() < fhi.abs() { lo } else { hi });
        }
        prev = Some((x, f[1]));
    }
    if signs.iter().all(|&f| f <= 0.0) {
        // The pitch moment is the centre of pressure's distance ahead of the pivot over the
        // pad length: its largest value is how far forward the centre of pressure can come.
        let best = signs.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        if best.is_finite() && best < -0.005 {
            Err(SolverError::NoEquilibrium {
                offset_along: frame.pivot.0,
                offset_across: frame.pivot.1,
                reason: format!(
                    "the centre of pressure cannot come as far forward as the pivot for any \
                     tilt; at best it lies at about {:.0} % of the arc (move the pivot aft of \
                     that, or give the pad face a crown)",
                    100.0 * (frame.pivot.0 - best)
                ),
                short_of_pivot: Some(-best),
            })
        } else {
            Err(no_eq(flat_reason()))
        }
    } else if signs.iter().all(|&f| f > 0.0) {
        Err(no_eq(aft_reason()))
    } else {
        Err(no_eq(fold_reason()))
    }
}
const FILM_RATIO_MIN: f64 = 0.01;

/// A Jacobian of the tilting residual on the active shape variables (the leading `n × n`
/// block of the array), with `n`.
type SizedJacobian = ([[f64; 3]; 3], usize);

/// A Jacobian kept between Newton iterations and between the rounds of a coupled
/// equilibrium (the chord method): recomputed only when it stops giving fast progress.
#[derive(Clone, Copy, Debug, Default)]
struct JacobianCache {
    jac: Option<SizedJacobian>,
}

#[allow(clippy::too_many_arguments)]
fn newton_tilt<R: FilmResponse>(
    c: &mut Counted<R>,
    frame: &TiltFrame,
    mut x: Shape,
    load: f64,
    scaling: bool,
    settings: &EquilibriumSettings,
    iterations: &mut usize,
    cache: &mut JacobianCache,
    give_up_when_stalled: bool,
) -> Result<Shape, SolverError> {
    // Active variables: 0 = ln h (unless scaling), 1 = a, 2 = g (unless line pivot).
    let mut vars: Vec<usize> = Vec::with_capacity(3);
    if !scaling {
        vars.push(0);
    }
    vars.push(1);
    if !frame.line {
        vars.push(2);
    }
    let n = vars.len();
    let no_eq = |reason: String| SolverError::NoEquilibrium {
        offset_along: frame.pivot.0,
        offset_across: frame.pivot.1,
        reason,
        short_of_pivot: None,
    };
    let feasible = |c: &Counted<R>, s: &Shape| {
        let st = frame.state(s);
        s.a >= A_MIN * 0.999 && c.r.min_film(&st) >= FILM_RATIO_MIN * st.reference
    };
    let norm = |f: &[f64; 3]| vars.iter().map(|&v| f[v] * f[v]).sum::<f64>().sqrt();
    let converged = |f: &[f64; 3]| vars.iter().all(|&v| f[v].abs() <= settings.tolerance);
    let get = shape_get;
    let set = shape_set;
    let eval = |c: &mut Counted<R>, s: &Shape| -> Result<Option<[f64; 3]>, SolverError> {
        match c.forces(&frame.state(s), Start::Warm) {
            Ok(i) => Ok(tilt_residual(&i, frame, load)),
            Err(SolverError::FilmClosed { .. }) => Ok(None),
            Err(e) => Err(e),
        }
    };
    if !feasible(c, &x) {
        x.g = 0.0;
        x.a = x.a.max(A_MIN);
    }
    // The starting residual is compared with the tolerance: a thousandth of it is accuracy
    // enough (the full pressure tolerance when the tolerance is the final one).
    c.relax(PRESSURE_TOL_PER_RESIDUAL * settings.tolerance);
    let mut f = eval(c, &x)?.ok_or_else(|| no_eq("the pad builds no pressure".into()))?;
    let mut at_flat_bound = 0;
    // A cached Jacobian is tried first; a fresh one is computed when it fails to make fast
    // progress.
    let mut want_fresh = !matches!(cache.jac, Some((_, m)) if m == n);
    let mut slow_before = false;
    // Consecutive steps along a fresh Jacobian that had to be cut below a tenth and still
    // reduced the residual by less than 2 %.
    let mut stalled = 0;
    for it in 0..settings.max_iterations {
        *iterations += 1;
        if converged(&f) {
            if x.a <= 2.0 * A_MIN {
                return Err(no_eq(flat_reason()));
            }
            return Ok(x);
        }
        let fresh = want_fresh;
        let jac = if fresh {
            // The differences over steps of 1e-5 are known to 1 % with pressures solved to
            // 1e-7: enough for Newton steps, which only need the Jacobian approximately.
            // The base point at the same accuracy as the perturbed ones (it may come from a
            // looser trial solve; asking again re-solves it only then).
            c.relax(NEWTON_JACOBIAN_PRESSURE_TOL);
            if let Some(fb) = eval(c, &x)? {
                f = fb;
            }
            let jac = fd_jacobian(c, frame, &vars, &x, &f, load)?
                .ok_or_else(|| no_eq("the film closes while tilting".into()))?;
            cache.jac = Some((jac, n));
            jac
        } else {
            cache.jac.map(|(j, _)| j).unwrap_or_default()
        };
        let rhs: Vec<f64> = vars.iter().map(|&v| -f[v]).collect();
        let Some(dx) = solve_small(&jac, &rhs, n) else {
            if !fresh {
                want_fresh = true;
                continue;
            }
            return Err(no_eq(fold_reason()));
        };
        // Limit the step: ln h by 1, a by a factor of two either way, g by 0.5 + |g|.
        let mut lam: f64 = 1.0;
        for (col, &v) in vars.iter().enumerate() {
            let lim = match v {
                0 => 1.0,
                1 => 0.5 * x.a.max(A_MIN),
                _ => 0.5 + x.g.abs(),
            };
            if dx[col].abs() > lim {
                lam = lam.min(lim / dx[col].abs());
            }
        }
        // Projection on the flat bound a ≥ A_MIN.
        let a_col = vars.iter().position(|&v| v == 1).unwrap();
        if x.a + lam * dx[a_col] < A_MIN {
            if x.a <= A_MIN * 1.0001 {
                at_flat_bound += 1;
                if at_flat_bound >= 2 {
                    return Err(no_eq(flat_reason()));
                }
            }
            lam = lam.min((x.a - A_MIN) / -dx[a_col]).max(0.0);
            if lam == 0.0 {
                return Err(no_eq(flat_reason()));
            }
        }
        let f0 = norm(&f);
        let f_before = f;
        // A trial point only has to show whether the residual fell: solve its pressure to a
        // fraction of the present residual (full accuracy again near the answer).
        c.relax((PRESSURE_TOL_PER_RESIDUAL * f0).min(MAX_RELAXED_PRESSURE_TOL));
        let mut accepted = false;
        for _ in 0..12 {
            let mut xn = x;
            for (col, &v) in vars.iter().enumerate() {
                set(&mut xn, v, get(&x, v) + lam * dx[col]);
            }
            if feasible(c, &xn)
                && let Some(fn_) = eval(c, &xn)?
                && norm(&fn_) <= (1.0 - 1e-4 * lam) * f0
            {
                x = xn;
                f = fn_;
                accepted = true;
                break;
            }
            if !fresh {
                // A stale Jacobian gets one full step only.
                break;
            }
            lam *= 0.5;
        }
        if accepted && fresh && lam < STALL_STEP && norm(&f) > (1.0 - STALL_GAIN) * f0 {
            stalled += 1;
            if give_up_when_stalled && stalled >= STALL_STEPS {
                // Newton's direction descends on |f|² but ever shorter steps gain ever less:
                // a minimum of |f| that is not a root (no equilibrium near this start, e.g.
                // the centre of pressure cannot reach the pivot). The pitch scan decides.
                return Err(SolverError::NotConverged {
                    what: "tilting-pad equilibrium",
                    iterations: it + 1,
                    residual: norm(&f),
                });
            }
        } else {
            stalled = 0;
        }
        if accepted {
            // Broyden's rank-one update makes the Jacobian reproduce the step just taken
            // (J ← J + (Δf − J Δx) Δxᵀ / |Δx|²), at no cost in solves.
            let step: Vec<f64> = (0..n).map(|col| lam * dx[col]).collect();
            let ss: f64 = step.iter().map(|v| v * v).sum();
            let mut updated = jac;
            if ss > 0.0 {
                for (row, &w) in vars.iter().enumerate() {
                    let js: f64 = (0..n).map(|col| jac[row][col] * step[col]).sum();
                    let d = (f[w] - f_before[w] - js) / ss;
                    for col in 0..n {
                        updated[row][col] += d * step[col];
                    }
                }
                cache.jac = Some((updated, n));
            }
            // Keep the (updated) Jacobian while it reduces the residual at least threefold per
            // step; after two slow steps in a row, difference it afresh.
            let slow = norm(&f) > f0 / 3.0;
            want_fresh = slow && slow_before;
            slow_before = slow;
            continue;
        }
        if !fresh {
            want_fresh = true;
            continue;
        }
        {
            // Cannot reduce the residual: diagnose.
            if x.a <= 3.0 * A_MIN {
                return Err(no_eq(flat_reason()));
            }
            let st = frame.state(&x);
            if c.r.min_film(&st) <= 1.5 * FILM_RATIO_MIN * st.reference {
                return Err(no_eq(aft_reason()));
            }
            let det = det_small(&jac, n);
            let scale: f64 = (0..n)
                .map(|r| (0..n).map(|k| jac[r][k].abs()).fold(0.0, f64::max))
                .product();
            if det.abs() <= 1e-3 * scale {
                return Err(no_eq(fold_reason()));
            }
            return Err(SolverError::NotConverged {
                what: "tilting-pad equilibrium",
                iterations: it + 1,
                residual: f0,
            });
        }
    }
    Err(SolverError::NotConverged {
        what: "tilting-pad equilibrium",
        iterations: settings.max_iterations,
        residual: norm(&f),
    })
}

fn flat_reason() -> String {
    "the centre of pressure cannot reach the pivot: as the tilt shrinks the film tends to a \
     parallel film that carries no load (move the pivot towards the trailing edge, or give \
     the pad face a crown)"
        .into()
}

fn aft_reason() -> String {
    "the centre of pressure cannot move that far towards the trailing edge even at extreme tilt \
     (move the pivot towards the middle of the pad)"
        .into()
}

fn fold_reason() -> String {
    "the moment balance folds here: no tilt balances the moments about this pivot".into()
}

/// Solves the `n × n` (n ≤ 3) system by Gaussian elimination with partial pivoting.
fn solve_small(a: &[[f64; 3]; 3], b: &[f64], n: usize) -> Option<Vec<f64>> {
    let mut m = *a;
    let mut x = b.to_vec();
    for col in 0..n {
        let piv = (col..n).max_by(|&i, &j| m[i][col].abs().total_cmp(&m[j][col].abs()))?;
        if m[piv][col].abs() < 1e-300 || !m[piv][col].is_finite() {
            return None;
        }
        m.swap(col, piv);
        x.swap(col, piv);
        for row in col + 1..n {
            let f = m[row][col] / m[col][col];
            let pivot_row = m[col];
            for (k, v) in m[row].iter_mut().enumerate().take(n).skip(col) {
                *v -= f * pivot_row[k];
            }
            x[row] -= f * x[col];
        }
    }
    for col in (0..n).rev() {
        let mut s = x[col];
        for k in col + 1..n {
            s -= m[col][k] * x[k];
        }
        x[col] = s / m[col][col];
    }
    x.iter().all(|v| v.is_finite()).then_some(x)
}

fn det_small(a: &[[f64; 3]; 3], n: usize) -> f64 {
    match n {
        1 => a[0][0],
        2 => a[0][0] * a[1][1] - a[0][1] * a[1][0],
        _ => {
            a[0][0] * (a[1][1] * a[2][2] - a[1][2] * a[2][1])
                - a[0][1] * (a[1][0] * a[2][2] - a[1][2] * a[2][0])
                + a[0][2] * (a[1][0] * a[2][1] - a[1][1] * a[2][0])
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn small_solver_matches_hand_solution() {
        let a = [[2.0, 1.0, 0.0], [1.0, 3.0, 1.0], [0.0, 1.0, 4.0]];
        let x = solve_small(&a, &[3.0, 5.0, 5.0], 3).unwrap();
        for (xi, e) in x.iter().zip([1.0, 1.0, 1.0]) {
            assert_relative_eq!(*xi, e, epsilon = 1e-12);
        }
        assert_relative_eq!(det_small(&a, 3), 18.0, epsilon = 1e-12);
    }

    /// The shape variables and the film state convert both ways.
    #[test]
    fn shape_and_state_are_inverse() {
        for line in [false, true] {
            let frame = TiltFrame {
                len: 0.06,
                width: 0.05,
                crown: 3e-6,
                line,
                pivot: (0.6, 0.5),
            };
            let x = Shape {
                ln_h: (42e-6f64).ln(),
                a: 0.8,
                g: if line { 0.0 } else { -0.15 },
            };
            let y = frame.shape(&frame.state(&x));
            assert_relative_eq!(y.ln_h, x.ln_h, max_relative = 1e-14);
            assert_relative_eq!(y.a, x.a, max_relative = 1e-14);
            assert_relative_eq!(y.g, x.g, epsilon = 1e-14);
        }
    }

    /// A start from the same pad's solution on the grid with every other node reaches the
    /// equilibrium a fresh search finds (to the equilibrium tolerance, which moves the pivot
    /// film by about half its value relatively, W ∝ h⁻²) with fewer pressure solves: the
    /// coarse Jacobian spares the finite differences. A crowned pad, so that the search is
    /// over all three shape variables.
    #[test]
    fn coarse_solution_starts_the_fine_search() {
        use crate::bearing::{BearingDesign, Duty, FilmTemperature, IsothermalPad, Numerics};
        use crate::bearing::{pad_solver, solve_pad};
        use crate::geometry::{PadOutline, RunnerSpeed};
        use crate::lubricant::{IsoVg, Lubricant};
        let design = |n: usize| BearingDesign {
            pad_count: 6,
            outline: PadOutline::Sector {
                inner_radius: 0.05,
                outer_radius: 0.10,
                arc: 50f64.to_radians(),
            },
            support: Support::TiltingPoint {
                offset_along: 0.55,
                offset_across: 0.5,
            },
            crown: 8e-6,
            speed: RunnerSpeed::Angular(300.0),
            duty: Duty::Load(20e3),
            lubricant: Lubricant::from_iso_vg(IsoVg::Vg46, 100.0).unwrap(),
            temperature: FilmTemperature::Effective {
                temperature: 333.15,
            },
            numerics: Numerics {
                nodes_along: n,
                nodes_across: n,
                ..Numerics::default()
            },
        };
        let mu = 0.02;
        let (coarse, fine) = (design(33), design(65));
        let mut pad = IsothermalPad::new(pad_solver(&coarse).unwrap(), mu);
        let start = solve_pad(&mut pad, &coarse).unwrap().restart();
        assert!(start.jacobian.is_some());
        let mut pad = IsothermalPad::new(pad_solver(&fine).unwrap(), mu);
        let fresh = solve_pad(&mut pad, &fine).unwrap();
        let mut pad = IsothermalPad::new(pad_solver(&fine).unwrap(), mu);
        let settings = fine.numerics.equilibrium;
        let started = tilting_pad_from(&mut pad, 20e3 / 6.0, 8e-6, &settings, Some(start)).unwrap();
        let tol = settings.tolerance;
        eprintln!(
            "pivot film {:.6e} / {:.6e} m, pitch {:.6e} / {:.6e}, solves {} / {} (started / fresh)",
            started.state.reference,
            fresh.state.reference,
            started.state.pitch,
            fresh.state.pitch,
            started.pressure_solves,
            fresh.pressure_solves
        );
        assert_relative_eq!(
            started.state.reference,
            fresh.state.reference,
            max_relative = tol
        );
        assert_relative_eq!(
            started.state.pitch,
            fresh.state.pitch,
            max_relative = 10.0 * tol
        );
        assert_relative_eq!(
            started.state.roll,
            fresh.state.roll,
            max_relative = 10.0 * tol
        );
        assert!(started.load_error <= tol && started.moment_error <= tol);
        assert!(
            started.pressure_solves < fresh.pressure_solves,
            "{} vs {}",
            started.pressure_solves,
            fresh.pressure_solves
        );
    }

    /// A response that counts its pressure solves, and those solved to the full tolerance.
    struct CountingPad {
        pad: crate::bearing::IsothermalPad,
        solves: usize,
        full: usize,
        relaxed: bool,
    }

    impl CountingPad {
        fn new(pad: crate::bearing::IsothermalPad) -> Self {
            CountingPad {
                pad,
                solves: 0,
                full: 0,
                relaxed: false,
            }
        }

        fn count(&mut self) {
            self.solves += 1;
            if !self.relaxed {
                self.full += 1;
            }
        }
    }

    impl FilmResponse for CountingPad {
        fn respond(&mut self, s: &FilmState, start: Start) -> Result<PadIntegrals, SolverError> {
            self.count();
            self.pad.respond(s, start)
        }
        fn respond_forces(&mut self, s: &FilmState, start: Start) -> Result<Forces, SolverError> {
            self.count();
            self.pad.respond_forces(s, start)
        }
        fn complete(&mut self) -> Option<PadIntegrals> {
            self.pad.complete()
        }
        fn relax_pressure_tolerance(&mut self, tol: Option<f64>) {
            self.relaxed = tol.is_some();
            self.pad.relax_pressure_tolerance(tol)
        }
        fn full_pressure_tolerance(&self) -> f64 {
            self.pad.full_pressure_tolerance()
        }
        fn scales_inverse_square(&self) -> bool {
            self.pad.scales_inverse_square()
        }
        fn film_model(&self) -> &FilmModel {
            self.pad.film_model()
        }
        fn min_film(&self, state: &FilmState) -> f64 {
            self.pad.min_film(state)
        }
    }

    /// A rigid, isoviscous pad pivoted at mid-arc has no equilibrium: its centre of pressure
    /// lies aft of mid-arc for any tilt (Raimondi & Boyd, Trans. ASME 1955; Cameron, Basic
    /// Lubrication Theory). On the point pivot Newton's search stalls at a minimum of the
    /// residual; it is ended after three stalled steps and the pitch scan gives the diagnosis
    /// (65 solves), instead of sixty damped iterations of some ten solves each (714 solves
    /// without the stall test). The line pivot's search ends at the flat bound either way.
    #[test]
    fn a_pad_without_equilibrium_is_diagnosed_without_a_long_search() {
        use crate::bearing::{BearingDesign, Duty, FilmTemperature, Numerics};
        use crate::bearing::{IsothermalPad, pad_solver};
        use crate::geometry::{PadOutline, RunnerSpeed};
        use crate::lubricant::{IsoVg, Lubricant};
        for support in [
            Support::TiltingPoint {
                offset_along: 0.5,
                offset_across: 0.5,
            },
            Support::TiltingLine { offset_along: 0.5 },
        ] {
            let d = BearingDesign {
                pad_count: 8,
                outline: PadOutline::Sector {
                    inner_radius: 0.06,
                    outer_radius: 0.12,
                    arc: 36f64.to_radians(),
                },
                support,
                crown: 0.0,
                speed: RunnerSpeed::Angular(377.0),
                duty: Duty::Load(30e3),
                lubricant: Lubricant::from_iso_vg(IsoVg::Vg32, 100.0).unwrap(),
                temperature: FilmTemperature::Effective {
                    temperature: 333.15,
                },
                numerics: Numerics::default(),
            };
            let mut pad = CountingPad::new(IsothermalPad::new(pad_solver(&d).unwrap(), 0.02));
            let settings = EquilibriumSettings::default();
            let err = tilting_pad(&mut pad, 30e3 / 8.0, 0.0, &settings).unwrap_err();
            eprintln!("{support:?}: {} solves: {err}", pad.solves);
            assert!(matches!(&err, SolverError::NoEquilibrium { .. }), "{err}");
            assert!(pad.solves <= 150, "{} solves", pad.solves);
        }
    }

    /// The fixed-pad search at a load and the analysis at a film are inverse to each other:
    /// the film found for a load carries that load when imposed (to the equilibrium tolerance;
    /// both ends solved in full), for tapered lands from a shallow to a deep taper and loads
    /// from light to near the capacity at the smallest film. The search brackets by secant steps
    /// from the smallest allowed film and refines on loosened solves: at most 12 pressure
    /// solves here, stiffness included, of them at most 5 in full (a search by doubling steps
    /// with every solve in full took 12–15).
    #[test]
    fn fixed_pad_search_inverts_the_analysis_at_a_film() {
        use crate::bearing::{BearingDesign, Duty, FilmTemperature, Numerics};
        use crate::bearing::{IsothermalPad, pad_solver};
        use crate::geometry::{PadOutline, RunnerSpeed};
        use crate::lubricant::{IsoVg, Lubricant};
        for (depth, load) in [(10e-6, 2e3), (30e-6, 20e3), (80e-6, 20e3), (30e-6, 400e3)] {
            let d = BearingDesign {
                pad_count: 6,
                outline: PadOutline::Sector {
                    inner_radius: 0.05,
                    outer_radius: 0.10,
                    arc: 50f64.to_radians(),
                },
                support: Support::TaperedLand {
                    taper_fraction: 0.7,
                    taper_depth: depth,
                },
                crown: 0.0,
                speed: RunnerSpeed::Angular(314.0),
                duty: Duty::Load(load),
                lubricant: Lubricant::from_iso_vg(IsoVg::Vg46, 100.0).unwrap(),
                temperature: FilmTemperature::Effective {
                    temperature: 333.15,
                },
                numerics: Numerics::default(),
            };
            let settings = EquilibriumSettings::default();
            let mut pad = CountingPad::new(IsothermalPad::new(pad_solver(&d).unwrap(), 0.02));
            let per_pad = load / 6.0;
            let eq = fixed_pad_at_load(&mut pad, per_pad, 0.0, &settings).unwrap();
            let h = pad.min_film(&eq.state);
            let mut check = IsothermalPad::new(pad_solver(&d).unwrap(), 0.02);
            let at_film = fixed_pad_at_film(&mut check, h, 0.0).unwrap();
            eprintln!(
                "depth {depth:e} m, {load} N: film {:.4} µm, {} solves ({} in full), load at \
                 that film {:.6} of the target",
                h * 1e6,
                pad.solves,
                pad.full,
                at_film.integrals.load / per_pad
            );
            assert_relative_eq!(
                at_film.integrals.load,
                per_pad,
                max_relative = settings.tolerance
            );
            assert_relative_eq!(eq.stiffness, at_film.stiffness, max_relative = 1e-9);
            assert!(pad.solves <= 12, "{} solves", pad.solves);
            assert!(pad.full <= 5, "{} solves in full", pad.full);
        }
    }

    /// The wide-slider start for a pivot at 0.5774 of the length is the optimum film ratio
    /// K = 1.1887 (Reynolds 1886; Cameron, Basic Lubrication Theory).
    #[test]
    fn slider_start_recovers_optimum_ratio() {
        let xp = 0.5774;
        let a = slider_start(xp);
        // (1 + a xp)/(1 − a(1−xp)) − 1 = K
        let k = (1.0 + a * xp) / (1.0 - a * (1.0 - xp)) - 1.0;
        assert_relative_eq!(k, 1.1887, epsilon = 5e-3);
    }
}
