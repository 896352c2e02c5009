//! Geometric multigrid for the Reynolds system, with Reynolds (Swift–Stieber) cavitation.
//!
//! * Levels are nested vertex grids (every other node), each with its operator re-discretised
//!   from the analytic film at its own faces ([`super::stencil`]); viscosity is injected.
//! * Transfers: bilinear prolongation `P` (on the possibly non-uniform node positions) and
//!   restriction `R = Pᵀ`, which for the integrated finite-volume equations is the right
//!   scaling (a coarse control volume sums the fine ones).
//! * Smoother: red–black Gauss–Seidel with over-relaxation (ω = 1.15 by default), projected onto
//!   `p ≥ p_cav` on the level that carries the full solution.
//! * Cycle: V(1,1) by default. The residual computed after the pre-smoothing is that of a valid
//!   iterate, so it serves as the convergence check at no extra cost. With ω = 1 the residual of
//!   the black nodes after a red–black sweep is exactly zero and only the red residual is
//!   computed. On the coarse levels the correction starts from zero, so their first residual is
//!   their right-hand side.
//! * Memory: every level stores its node arrays in an even/odd-column split layout (each row
//!   holds its even columns, then its odd columns). A colour of a red–black sweep is then a
//!   unit-stride loop over one half-row, which the compiler vectorises.
//! * Cavitation: the complementarity problem `p ≥ p_cav`, `A p − b ≥ 0`,
//!   `(p − p_cav)(A p − b) = 0` is solved by projected multigrid in the manner of Brandt & Cryer
//!   (SIAM J. Sci. Stat. Comput. 4, 1983): projected smoothing on the fine level; the coarse
//!   correction sees the cavitated nodes as fixed (zero correction) and is not applied to them.
//!   A coarse grid cannot place that fixed boundary where the fine grid has it, which left alone
//!   slows convergence along the cavitation boundary as the grid is refined. Each coarse node
//!   next to an excluded node therefore carries the distance to the fine boundary as a fraction
//!   `θ` of its spacing, and its link to the boundary is given the conductance `G/θ` (the
//!   Shortley–Weller treatment of a Dirichlet boundary between nodes).
//! * Coarsest level: coarsening stops at eight intervals per direction (or where the node count
//!   is odd); that level is solved exactly by banded Cholesky.
//! * Cold starts use full multigrid: nested iteration from the coarsest level with cubic
//!   interpolation of each coarse solution.

use super::banded::BandedCholesky;
use super::stencil::Level;

/// Smallest number of intervals per direction of a coarse level.
const MIN_COARSE_INTERVALS: usize = 8;

/// Even/odd-column split layout of the nodes of one level.
#[derive(Clone, Copy, Debug)]
struct Layout {
    nx: usize,
    ny: usize,
    /// Nodes per row.
    w: usize,
    /// Even columns per row.
    he: usize,
}

impl Layout {
    fn new(nx: usize, ny: usize) -> Self {
        Layout {
            nx,
            ny,
            w: nx + 1,
            he: nx / 2 + 1,
        }
    }

    /// Position of node `(i, j)`.
    #[inline(always)]
    fn pos(&self, i: usize, j: usize) -> usize {
        j * self.w
            + if i.is_multiple_of(2) {
                i / 2
            } else {
                self.he + i / 2
            }
    }

    fn len(&self) -> usize {
        self.w * (self.ny + 1)
    }

    fn to_split(self, natural: &[f64], split: &mut [f64]) {
        for j in 0..=self.ny {
            for i in 0..=self.nx {
                split[self.pos(i, j)] = natural[j * self.w + i];
            }
        }
    }

    fn to_natural(self, split: &[f64], natural: &mut [f64]) {
        for j in 0..=self.ny {
            for i in 0..=self.nx {
                natural[j * self.w + i] = split[self.pos(i, j)];
            }
        }
    }
}

/// Nodes of one level excluded from the coarse correction, with the distance fractions to the
/// excluded region of the free nodes next to it (east, west, north, south). Split layout.
#[derive(Clone, Debug, Default)]
struct Exclusion {
    active: bool,
    mask: Vec<bool>,
    theta: [Vec<f64>; 4],
    inv_diag: Vec<f64>,
    diag: Vec<f64>,
}

impl Exclusion {
    fn new(n: usize) -> Self {
        Exclusion {
            active: false,
            mask: vec![false; n],
            theta: std::array::from_fn(|_| vec![1.0; n]),
            inv_diag: vec![0.0; n],
            diag: vec![0.0; n],
        }
    }
}

/// The operator and vectors of one level in split layout, plus the interpolation weights to
/// the next coarser level.
#[derive(Clone, Debug)]
struct Ops {
    lay: Layout,
    ce: Vec<f64>,
    cn: Vec<f64>,
    id: Vec<f64>,
    d: Vec<f64>,
    u: Vec<f64>,
    f: Vec<f64>,
    r: Vec<f64>,
    excl: Exclusion,
    /// For odd column `i = 2m + 1`: weight of coarse node `m` (left) and `m + 1` (right).
    wl: Vec<f64>,
    wr: Vec<f64>,
    /// For odd row `j`: weight of coarse row `(j − 1)/2` (below) and `(j + 1)/2` (above).
    wyl: Vec<f64>,
    wyr: Vec<f64>,
    /// True when the black nodes' residual is known to be zero (after an unconstrained,
    /// unrelaxed red–black sweep), so that only the red residual needs computing.
    black_clean: bool,
}

impl Ops {
    fn new(level: &Level) -> Self {
        let lay = Layout::new(level.grid.nx, level.grid.ny);
        let n = lay.len();
        let weights = |x: &[f64]| {
            let nn = x.len() - 1;
            let mut l = vec![0.0; nn + 1];
            let mut r = vec![0.0; nn + 1];
            for i in (1..nn).step_by(2) {
                let d = x[i + 1] - x[i - 1];
                l[i] = (x[i + 1] - x[i]) / d;
                r[i] = (x[i] - x[i - 1]) / d;
            }
            (l, r)
        };
        let (xl, xr) = weights(&level.grid.xi);
        let (wyl, wyr) = weights(&level.grid.eta);
        let ho = lay.w - lay.he;
        let wl = (0..ho).map(|m| xl[2 * m + 1]).collect();
        let wr = (0..ho).map(|m| xr[2 * m + 1]).collect();
        Ops {
            lay,
            ce: vec![0.0; n],
            cn: vec![0.0; n],
            id: vec![0.0; n],
            d: vec![0.0; n],
            u: vec![0.0; n],
            f: vec![0.0; n],
            r: vec![0.0; n],
            excl: Exclusion::new(n),
            wl,
            wr,
            wyl,
            wyr,
            black_clean: false,
        }
    }

    fn load(&mut self, level: &Level) {
        self.lay.to_split(&level.ce, &mut self.ce);
        self.lay.to_split(&level.cn, &mut self.cn);
        self.lay.to_split(&level.inv_diag, &mut self.id);
        self.lay.to_split(&level.diag, &mut self.d);
    }
}

/// Cycle parameters.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CycleSettings {
    /// Smoothing sweeps before the coarse correction (0: sawtooth cycle).
    pub pre_sweeps: usize,
    /// Smoothing sweeps after the coarse correction.
    pub post_sweeps: usize,
    /// Relaxation factor of the Gauss–Seidel smoother.
    pub omega: f64,
    /// Number of coarse-grid visits per level (1: V-cycle, 2: W-cycle).
    pub gamma: usize,
}

impl Default for CycleSettings {
    /// V(1,1) with over-relaxed red–black Gauss–Seidel, ω = 1.15: the fastest of the
    /// settings measured on the benchmark pads (see the README's performance section).
    fn default() -> Self {
        CycleSettings {
            pre_sweeps: 1,
            post_sweeps: 1,
            omega: 1.15,
            gamma: 1,
        }
    }
}

/// How a solve ended.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Outcome {
    /// Cycles after the start.
    pub cycles: usize,
    /// Final residual norm over source norm.
    pub relative_residual: f64,
    /// Whether the tolerance was reached.
    pub converged: bool,
}

/// The multigrid workspace: levels, their vectors and transfer weights. Reused between solves.
#[derive(Clone, Debug)]
pub struct Multigrid {
    /// Grid levels, finest first (natural layout, used for assembly).
    pub levels: Vec<Level>,
    ops: Vec<Ops>,
    tmp: Vec<f64>,
    row: Vec<f64>,
    coarse: BandedCholesky,
    coarse_masked: BandedCholesky,
    nat_a: Vec<f64>,
    nat_b: Vec<f64>,
    /// Fine right-hand side in natural layout, m³/s.
    rhs: Vec<f64>,
    /// Fine solution in natural layout, Pa.
    solution: Vec<f64>,
    /// Cycle parameters.
    pub cycle: CycleSettings,
}

impl Multigrid {
    /// Builds the workspace from the finest level; coarser levels are generated by
    /// `make_level` for each coarsened grid.
    pub fn new(finest: Level, make_level: impl Fn(crate::grid::Grid) -> Level) -> Self {
        let mut levels = vec![finest];
        // Stop at a coarsest level of at least MIN_COARSE_INTERVALS per direction: tinier
        // levels cost more in loop overhead than a direct solve of this size.
        while let Some(g) = levels
            .last()
            .unwrap()
            .grid
            .coarsen()
            .filter(|g| g.nx.min(g.ny) >= MIN_COARSE_INTERVALS)
        {
            levels.push(make_level(g));
        }
        let ops: Vec<Ops> = levels.iter().map(Ops::new).collect();
        let n = levels[0].grid.len();
        let coarsest = levels.last().unwrap().grid.len();
        Multigrid {
            ops,
            tmp: vec![0.0; n],
            row: vec![0.0; n],
            coarse: BandedCholesky::default(),
            coarse_masked: BandedCholesky::default(),
            nat_a: vec![0.0; coarsest],
            nat_b: vec![0.0; coarsest],
            rhs: vec![0.0; n],
            solution: vec![0.0; n],
            cycle: CycleSettings::default(),
            levels,
        }
    }

    /// Number of levels.
    pub fn depth(&self) -> usize {
        self.levels.len()
    }

    /// Copies the fine viscosity field (Pa·s) into every level by injection.
    pub fn set_viscosity(&mut self, mu: &[f64]) {
        self.levels[0].mu.copy_from_slice(mu);
        for l in 1..self.levels.len() {
            let (f, c) = self.levels.split_at_mut(l);
            let fine = &f[l - 1];
            let coarse = &mut c[0];
            let wf = fine.grid.nx + 1;
            let wc = coarse.grid.nx + 1;
            for jc in 0..=coarse.grid.ny {
                for ic in 0..=coarse.grid.nx {
                    coarse.mu[jc * wc + ic] = fine.mu[2 * jc * wf + 2 * ic];
                }
            }
        }
    }

    /// Assembles all levels for `state` (viscosity must be set) and factorises the coarsest.
    /// Returns the smallest face film on the finest level, m.
    pub fn assemble(&mut self, state: &crate::film::FilmState) -> f64 {
        let mut hmin = f64::INFINITY;
        for (i, (l, o)) in self.levels.iter_mut().zip(&mut self.ops).enumerate() {
            let h = l.assemble(state);
            o.load(l);
            if i == 0 {
                hmin = h;
            }
        }
        self.coarse.factor(self.levels.last().unwrap());
        hmin
    }

    /// The right-hand side of the finest level (natural layout, m³/s), to be filled by the
    /// caller before [`Multigrid::solve`].
    pub fn rhs_mut(&mut self) -> &mut [f64] {
        &mut self.rhs
    }

    /// The right-hand side of the finest level, m³/s.
    pub fn rhs(&self) -> &[f64] {
        &self.rhs
    }

    /// Fills the finest right-hand side from the assembled film (Couette source).
    pub fn set_source(&mut self) {
        self.levels[0].source(&mut self.rhs);
    }

    /// The finest-level solution (pressure, Pa, natural layout) of the last solve.
    pub fn solution(&self) -> &[f64] {
        &self.solution
    }

    /// Sets the finest-level solution (natural layout) as the start of the next solve.
    pub fn set_solution(&mut self, p: &[f64]) {
        self.solution.copy_from_slice(p);
        let o = &mut self.ops[0];
        o.lay.to_split(p, &mut o.u);
        o.black_clean = false;
    }

    /// Euclidean norm of the finest right-hand side.
    pub fn rhs_norm(&self) -> f64 {
        self.rhs.iter().map(|x| x * x).sum::<f64>().sqrt()
    }

    /// Solves to `tolerance` (relative residual) within `max_cycles`, from zero by full
    /// multigrid (`cold`) or from the current solution. With a floor, the solution satisfies
    /// the cavitation condition `p ≥ floor`.
    pub fn solve(
        &mut self,
        floor: Option<f64>,
        tolerance: f64,
        max_cycles: usize,
        cold: bool,
    ) -> Outcome {
        let bnorm = self.rhs_norm();
        {
            let o = &mut self.ops[0];
            o.lay.to_split(&self.rhs, &mut o.f);
        }
        if cold {
            self.ops[0].u.fill(0.0);
            self.full_multigrid(floor);
        } else {
            self.scale_start(floor);
        }
        let mut cycles = 0;
        let outcome = loop {
            // Pre-smoothing belongs to the cycle, but the residual after it is that of a valid
            // iterate: check convergence there, at no extra cost.
            if cycles > 0 || !cold {
                self.pre_smooth_top(0, floor);
            }
            let rel = self.top_residual(0, floor) / bnorm;
            if rel <= tolerance || cycles >= max_cycles || !rel.is_finite() {
                break Outcome {
                    cycles,
                    relative_residual: rel,
                    converged: rel <= tolerance,
                };
            }
            self.cycle_from_residual(0, floor);
            cycles += 1;
        };
        let o = &self.ops[0];
        o.lay.to_natural(&o.u, &mut self.solution);
        outcome
    }

    /// Scales a warm start by the factor that minimises its residual, `α = b·Au / |Au|²`: the
    /// pressure of a nearby film differs mostly by a factor (it scales as `1/h²`), which this
    /// removes for the cost of one residual evaluation.
    fn scale_start(&mut self, floor: Option<f64>) {
        let o = &mut self.ops[0];
        o.black_clean = false;
        residual(o, false, false);
        let (mut fa, mut aa) = (0.0, 0.0);
        for (f, r) in o.f.iter().zip(&o.r) {
            let au = f - r;
            fa += f * au;
            aa += au * au;
        }
        if aa > 0.0 && fa > 0.0 {
            let alpha = fa / aa;
            o.u.iter_mut().for_each(|x| *x *= alpha);
        }
        if let Some(fl) = floor {
            o.u.iter_mut().for_each(|x| *x = x.max(fl));
        }
    }

    /// Residual of the top level `l` into its `r` (with the exclusion of cavitated nodes if
    /// projected); returns the norm of the (projected) residual.
    fn top_residual(&mut self, l: usize, floor: Option<f64>) -> f64 {
        let o = &mut self.ops[l];
        let red_only = o.black_clean && floor.is_none();
        let sum = residual(o, red_only, false);
        match floor {
            None => sum.sqrt(),
            Some(fl) => {
                // Only interior nodes can cavitate; the edges hold the ambient pressure.
                let lay = o.lay;
                let mut s = 0.0;
                let mut any = false;
                o.excl.mask.fill(false);
                for j in 1..lay.ny {
                    for (part_even, off) in [(true, 0), (false, lay.he)] {
                        let (m0, m1, _, _) = half_row(&lay, part_even);
                        let range = j * lay.w + off + m0..j * lay.w + off + m1.max(m0);
                        let (u, r) = (&o.u[range.clone()], &o.r[range.clone()]);
                        let mask = &mut o.excl.mask[range];
                        for k in 0..u.len() {
                            let at_floor = u[k] <= fl;
                            let v = if at_floor { r[k].max(0.0) } else { r[k] };
                            s += v * v;
                            // Cavitated nodes that stay cavitated take no coarse correction.
                            let a = at_floor && r[k] <= 0.0;
                            mask[k] = a;
                            any |= a;
                        }
                    }
                }
                o.excl.active = any;
                s.sqrt()
            }
        }
    }

    /// Full multigrid from a zero start: restricts the right-hand side to all levels, solves
    /// the coarsest and works up with one cycle per level.
    fn full_multigrid(&mut self, floor: Option<f64>) {
        let last = self.levels.len() - 1;
        for l in 0..last {
            let (fo, co) = self.ops.split_at_mut(l + 1);
            restrict(&fo[l], &fo[l].f, &mut co[0], &mut self.tmp);
        }
        for o in &mut self.ops {
            o.excl.active = false;
        }
        self.ops[last].u.fill(0.0);
        self.solve_coarsest(floor, true);
        for l in (0..last).rev() {
            {
                let (fo, co) = self.ops.split_at_mut(l + 1);
                let (xi, eta) = (&self.levels[l].grid.xi, &self.levels[l].grid.eta);
                interpolate_cubic(&mut fo[l], xi, eta, &co[0].u, &mut self.row);
                fo[l].black_clean = false;
            }
            if let Some(fl) = floor {
                self.ops[l].u.iter_mut().for_each(|x| *x = x.max(fl));
            }
            self.pre_smooth_top(l, floor);
            self.top_residual(l, floor);
            self.cycle_from_residual(l, floor);
        }
    }

    /// Pre-smoothing of the top level (projected if `floor`).
    fn pre_smooth_top(&mut self, l: usize, floor: Option<f64>) {
        let c = self.cycle;
        if c.pre_sweeps == 0 {
            return;
        }
        let o = &mut self.ops[l];
        smooth(o, c.pre_sweeps, floor, c.omega, false);
        o.black_clean = floor.is_none() && c.omega == 1.0;
    }

    /// Completes a cycle on top level `top` whose residual (and, if projected, exclusion) has
    /// just been computed by [`Multigrid::top_residual`].
    fn cycle_from_residual(&mut self, top: usize, floor: Option<f64>) {
        for o in &mut self.ops[top + 1..] {
            o.excl.active = false;
        }
        if top == self.levels.len() - 1 {
            self.solve_coarsest(floor, true);
            return;
        }
        self.correct(top, top, floor);
    }

    /// Restricts the residual of `l` (already computed), corrects from the coarser levels and
    /// post-smooths.
    fn correct(&mut self, l: usize, top: usize, floor: Option<f64>) {
        let c = self.cycle;
        let fl = if l == top { floor } else { None };
        let last = self.levels.len() - 1;
        {
            let o = &mut self.ops[l];
            if o.excl.active {
                for (r, &m) in o.r.iter_mut().zip(&o.excl.mask) {
                    if m {
                        *r = 0.0;
                    }
                }
            }
        }
        {
            let (fo, co) = self.ops.split_at_mut(l + 1);
            let (fine, coarse) = (&fo[l], &mut co[0]);
            if fine.excl.active {
                coarsen_exclusion(fine, l == top, &self.levels[l + 1], coarse);
            } else {
                coarse.excl.active = false;
            }
            restrict(fine, &fine.r, coarse, &mut self.tmp);
            if coarse.excl.active {
                for (f, &m) in coarse.f.iter_mut().zip(&coarse.excl.mask) {
                    if m {
                        *f = 0.0;
                    }
                }
            }
            coarse.u.fill(0.0);
            coarse.black_clean = false;
        }
        for visit in 0..c.gamma.max(1) {
            if l + 1 == last {
                self.solve_coarsest(None, false);
            } else {
                if visit == 0 {
                    // Zero start: the residual is the right-hand side.
                    let o = &mut self.ops[l + 1];
                    o.r.copy_from_slice(&o.f);
                } else {
                    let o = &mut self.ops[l + 1];
                    let corrected = o.excl.active;
                    residual(o, o.black_clean && !corrected, corrected);
                }
                self.pre_smooth(l + 1);
                self.correct(l + 1, top, floor);
            }
        }
        {
            let (fo, co) = self.ops.split_at_mut(l + 1);
            let fine = &mut fo[l];
            let use_mask = fine.excl.active;
            prolong_add(fine, &co[0].u, use_mask, &mut self.row);
        }
        let o = &mut self.ops[l];
        if let Some(flv) = fl {
            o.u.iter_mut().for_each(|x| *x = x.max(flv));
        }
        let corrected = l != top && o.excl.active;
        smooth(o, c.post_sweeps, fl, c.omega, corrected);
        o.black_clean = c.post_sweeps > 0 && fl.is_none() && !corrected && c.omega == 1.0;
    }

    fn pre_smooth(&mut self, l: usize) {
        let c = self.cycle;
        if c.pre_sweeps == 0 {
            return;
        }
        let o = &mut self.ops[l];
        let corrected = o.excl.active;
        smooth(o, c.pre_sweeps, None, c.omega, corrected);
        let red_only = c.omega == 1.0 && !corrected;
        residual(o, red_only, corrected);
    }

    fn solve_coarsest(&mut self, floor: Option<f64>, is_top: bool) {
        let last = self.levels.len() - 1;
        let lvl = &self.levels[last];
        let o = &mut self.ops[last];
        let lay = o.lay;
        lay.to_natural(&o.f, &mut self.nat_b);
        match floor {
            Some(fl) if is_top => {
                // Full solution with the cavitation constraint: exact linear solve, clamp,
                // then projected sweeps (the coarsest level is small).
                if o.u.iter().all(|&x| x == 0.0) {
                    self.coarse.solve(lvl, &self.nat_b, &mut self.nat_a);
                    lay.to_split(&self.nat_a, &mut o.u);
                    o.u.iter_mut().for_each(|x| *x = x.max(fl));
                }
                let sweeps = 4 * (lay.nx + lay.ny);
                smooth(o, sweeps, Some(fl), 1.0, false);
                o.black_clean = false;
            }
            _ if o.excl.active => {
                // Masked solve: rows of excluded nodes become identities.
                let mut mask = vec![false; lay.len()];
                let mut idn = vec![0.0; lay.len()];
                for j in 0..=lay.ny {
                    for i in 0..=lay.nx {
                        let k = lay.pos(i, j);
                        mask[j * lay.w + i] = o.excl.mask[k];
                        idn[j * lay.w + i] = o.excl.inv_diag[k];
                    }
                }
                self.coarse_masked.factor_masked(lvl, Some(&mask), &idn);
                self.coarse_masked.solve(lvl, &self.nat_b, &mut self.nat_a);
                lay.to_split(&self.nat_a, &mut o.u);
            }
            _ => {
                self.coarse.solve(lvl, &self.nat_b, &mut self.nat_a);
                lay.to_split(&self.nat_a, &mut o.u);
            }
        }
    }
}

/// Builds the exclusion of a coarse level from that of its fine level: a coarse node is
/// excluded if its fine node is; a free coarse node next to the excluded region gets the
/// distance fraction `θ` to the fine boundary and the conductance of that link scaled by `1/θ`
/// in its diagonal. `fine_is_top`: the fine level's excluded nodes are exactly one spacing
/// from their free neighbours (`θ = 1` there).
fn coarsen_exclusion(fine: &Ops, fine_is_top: bool, coarse_level: &Level, coarse: &mut Ops) {
    let (fl, cl) = (fine.lay, coarse.lay);
    let ef = &fine.excl;
    let th = |d: usize, k: usize| if fine_is_top { 1.0 } else { ef.theta[d][k] };
    let ec = &mut coarse.excl;
    ec.mask.fill(false);
    let mut any = false;
    for jc in 1..cl.ny {
        for ic in 1..cl.nx {
            let m = ef.mask[fl.pos(2 * ic, 2 * jc)];
            ec.mask[cl.pos(ic, jc)] = m;
            any |= m;
        }
    }
    ec.active = any;
    ec.inv_diag.copy_from_slice(&coarse.id);
    ec.diag.copy_from_slice(&coarse.d);
    if !any {
        return;
    }
    let wc = cl.w;
    // Directions: 0 east (+i), 1 west (−i), 2 north (+j), 3 south (−j).
    for jc in 1..cl.ny {
        for ic in 1..cl.nx {
            let kc = cl.pos(ic, jc);
            if ec.mask[kc] {
                continue;
            }
            let (i, j) = (2 * ic, 2 * jc);
            let kf = fl.pos(i, j);
            let mut diag = 1.0 / coarse.id[kc];
            let mut touched = false;
            for d in 0..4 {
                let (di, dj): (isize, isize) = match d {
                    0 => (1, 0),
                    1 => (-1, 0),
                    2 => (0, 1),
                    _ => (0, -1),
                };
                let at = |s: isize| {
                    fl.pos(
                        (i as isize + s * di) as usize,
                        (j as isize + s * dj) as usize,
                    )
                };
                let (f1, f2) = (at(1), at(2));
                let c1 = cl.pos((ic as isize + di) as usize, (jc as isize + dj) as usize);
                let theta = if ef.mask[f1] {
                    0.5 * th(d, kf)
                } else if ef.mask[f2] {
                    0.5 * (1.0 + th(d, f1))
                } else {
                    continue;
                };
                if !ec.mask[c1] {
                    // A thin excluded strip between two free coarse nodes: leave the link.
                    continue;
                }
                ec.theta[d][kc] = theta;
                // The conductance of the link in natural coarse indexing.
                let kn = jc * wc + ic;
                let g = match d {
                    0 => coarse_level.ce[kn],
                    1 => coarse_level.ce[kn - 1],
                    2 => coarse_level.cn[kn],
                    _ => coarse_level.cn[kn - wc],
                };
                diag += g * (1.0 / theta - 1.0);
                touched = true;
            }
            if touched {
                ec.inv_diag[kc] = 1.0 / diag;
                ec.diag[kc] = diag;
            }
        }
    }
}

/// The interior nodes `m0..m1` of the even or odd half of a row, and where their west and east
/// neighbours start in the other half: for the even half (`i = 2m`) the west neighbour
/// `i − 1 = 2(m − 1) + 1` is odd-half entry `m − 1` and the east neighbour entry `m`; for the odd
/// half (`i = 2m + 1`) they are even-half entries `m` and `m + 1`.
#[inline(always)]
fn half_row(lay: &Layout, part_even: bool) -> (usize, usize, usize, usize) {
    let nx = lay.nx;
    if part_even {
        // m from 1: west of m0 = 1 is odd entry 0, east is odd entry 1.
        (1, (nx - 1) / 2 + 1, 0, 1)
    } else {
        // m from 0: west of m0 = 0 is even entry 0, east is even entry 1.
        (0, (nx - 2) / 2 + 1, 0, 1)
    }
}

/// Red–black Gauss–Seidel sweeps of the five-point system on the interior nodes (red:
/// `i + j` even, first), projected on `u ≥ floor` if a floor is given; with `corrected`, the
/// excluded nodes of the level are held fixed and the boundary-corrected diagonal is used.
fn smooth(o: &mut Ops, sweeps: usize, floor: Option<f64>, omega: f64, corrected: bool) {
    let Ops {
        lay,
        ce,
        cn,
        id,
        d,
        u,
        f,
        excl,
        ..
    } = o;
    let (id, d, mask): (&[f64], &[f64], &[bool]) = if corrected {
        (&excl.inv_diag, &excl.diag, &excl.mask)
    } else {
        (id, d, &[])
    };
    let k = Kernel {
        lay: *lay,
        ce,
        cn,
        id,
        d,
        f,
        mask,
    };
    for _ in 0..sweeps {
        for colour in 0..2 {
            match (floor, corrected) {
                (None, false) => k.colour::<false, false>(u, colour, omega, 0.0),
                (Some(fl), false) => k.colour::<true, false>(u, colour, omega, fl),
                (None, true) => k.colour::<false, true>(u, colour, omega, 0.0),
                (Some(fl), true) => k.colour::<true, true>(u, colour, omega, fl),
            }
        }
    }
}

/// The read-only data of a sweep or residual over one level.
struct Kernel<'a> {
    lay: Layout,
    ce: &'a [f64],
    cn: &'a [f64],
    id: &'a [f64],
    d: &'a [f64],
    f: &'a [f64],
    mask: &'a [bool],
}

impl Kernel<'_> {
    /// One colour of a red–black sweep over unit-stride half-rows.
    #[inline(always)]
    fn colour<const FLOOR: bool, const MASK: bool>(
        &self,
        u: &mut [f64],
        colour: usize,
        omega: f64,
        floor: f64,
    ) {
        let lay = self.lay;
        let (w, he) = (lay.w, lay.he);
        for j in 1..lay.ny {
            let part_even = (j + colour).is_multiple_of(2);
            let (m0, m1, ws, es) = half_row(&lay, part_even);
            if m1 <= m0 {
                continue;
            }
            let n = m1 - m0;
            let row = j * w;
            let (self_off, side_off) = if part_even { (0, he) } else { (he, 0) };
            let (lo, rest) = u.split_at_mut(row);
            let (cur, hi) = rest.split_at_mut(w);
            let (cur_e, cur_o) = cur.split_at_mut(he);
            let (me, side): (&mut [f64], &[f64]) = if part_even {
                (cur_e, cur_o)
            } else {
                (cur_o, cur_e)
            };
            let me = &mut me[m0..m1];
            let west = &side[ws..ws + n];
            let east = &side[es..es + n];
            let s = self_off + m0;
            let below = &lo[row - w + s..row - w + s + n];
            let above = &hi[s..s + n];
            let ce_e = &self.ce[row + s..row + s + n];
            let ce_w = &self.ce[row + side_off + ws..row + side_off + ws + n];
            let cn_n = &self.cn[row + s..row + s + n];
            let cn_s = &self.cn[row - w + s..row - w + s + n];
            let idr = &self.id[row + s..row + s + n];
            let fr = &self.f[row + s..row + s + n];
            let mk: &[bool] = if MASK {
                &self.mask[row + s..row + s + n]
            } else {
                &[]
            };
            for k in 0..n {
                let sum = fr[k]
                    + ce_e[k] * east[k]
                    + ce_w[k] * west[k]
                    + cn_n[k] * above[k]
                    + cn_s[k] * below[k];
                let gs = sum * idr[k];
                let mut v = me[k] + omega * (gs - me[k]);
                if FLOOR {
                    v = if v < floor { floor } else { v };
                }
                if MASK && mk[k] {
                    v = me[k];
                }
                me[k] = v;
            }
        }
    }

    /// Residual `r = f − A u` of the interior nodes (boundary entries zero); with
    /// `red_only`, the black entries are set to zero without computing them. Returns `Σ r²`.
    fn residual(&self, u: &[f64], r: &mut [f64], red_only: bool) -> f64 {
        let mut sum = 0.0;
        let lay = self.lay;
        let (w, he) = (lay.w, lay.he);
        r[..w].fill(0.0);
        r[lay.ny * w..].fill(0.0);
        for j in 1..lay.ny {
            let row = j * w;
            let rrow = &mut r[row..row + w];
            rrow.fill(0.0);
            for part_even in [true, false] {
                // Red nodes: (i + j) even, i.e. the even half on even rows.
                if red_only && part_even != (j % 2 == 0) {
                    continue;
                }
                let (m0, m1, ws, es) = half_row(&lay, part_even);
                if m1 <= m0 {
                    continue;
                }
                let n = m1 - m0;
                let (self_off, side_off) = if part_even { (0, he) } else { (he, 0) };
                let s = self_off + m0;
                let me = &u[row + s..row + s + n];
                let west = &u[row + side_off + ws..row + side_off + ws + n];
                let east = &u[row + side_off + es..row + side_off + es + n];
                let below = &u[row - w + s..row - w + s + n];
                let above = &u[row + w + s..row + w + s + n];
                let ce_e = &self.ce[row + s..row + s + n];
                let ce_w = &self.ce[row + side_off + ws..row + side_off + ws + n];
                let cn_n = &self.cn[row + s..row + s + n];
                let cn_s = &self.cn[row - w + s..row - w + s + n];
                let dr = &self.d[row + s..row + s + n];
                let fr = &self.f[row + s..row + s + n];
                let out = &mut rrow[s..s + n];
                for k in 0..n {
                    let au = dr[k] * me[k]
                        - ce_e[k] * east[k]
                        - ce_w[k] * west[k]
                        - cn_n[k] * above[k]
                        - cn_s[k] * below[k];
                    let rk = fr[k] - au;
                    out[k] = rk;
                    sum += rk * rk;
                }
            }
        }
        sum
    }
}

/// Residual of a level into its `r`; `corrected` uses the boundary-corrected diagonal of a
/// coarse level with excluded nodes (whose entries are then zeroed). Returns `Σ r²` (before
/// the zeroing).
fn residual(o: &mut Ops, red_only: bool, corrected: bool) -> f64 {
    let Ops {
        lay,
        ce,
        cn,
        id,
        d,
        u,
        f,
        r,
        excl,
        ..
    } = o;
    let (id, d): (&[f64], &[f64]) = if corrected {
        (&excl.inv_diag, &excl.diag)
    } else {
        (id, d)
    };
    let sum = Kernel {
        lay: *lay,
        ce,
        cn,
        id,
        d,
        f,
        mask: &[],
    }
    .residual(u, r, red_only);
    if corrected {
        for (r, &m) in r.iter_mut().zip(&excl.mask) {
            if m {
                *r = 0.0;
            }
        }
    }
    sum
}

/// Restriction `R = Pᵀ` of the fine residual (or right-hand side) `r` onto the coarse
/// right-hand side (interior coarse nodes; boundary entries zero).
fn restrict(fine: &Ops, r: &[f64], coarse: &mut Ops, tmp: &mut [f64]) {
    let (fl, cl) = (fine.lay, coarse.lay);
    let (w, he) = (fl.w, fl.he);
    let wc = cl.w;
    // Along the motion, fine row j → tmp(I, j) in natural coarse-column order:
    // tmp(I) = r(2I) + wr(2I−1) r(2I−1) + wl(2I+1) r(2I+1).
    for j in 1..fl.ny {
        let row = j * w;
        let re = &r[row..row + he];
        let ro = &r[row + he..row + w];
        let t = &mut tmp[j * wc..(j + 1) * wc];
        for ic in 1..cl.nx {
            t[ic] = re[ic] + fine.wr[ic - 1] * ro[ic - 1] + fine.wl[ic] * ro[ic];
        }
    }
    coarse.f.fill(0.0);
    for jc in 1..cl.ny {
        let j = 2 * jc;
        let (a, b) = (fine.wyr[j - 1], fine.wyl[j + 1]);
        for ic in 1..cl.nx {
            coarse.f[cl.pos(ic, jc)] =
                tmp[j * wc + ic] + a * tmp[(j - 1) * wc + ic] + b * tmp[(j + 1) * wc + ic];
        }
    }
}

/// Adds the bilinear interpolation of the coarse correction `uc` to the fine `u` on interior
/// nodes, skipping the fine level's excluded nodes if `use_mask`.
fn prolong_add(fine: &mut Ops, uc: &[f64], use_mask: bool, row_buf: &mut [f64]) {
    let Ops {
        lay: fl,
        u,
        excl,
        wl,
        wr,
        wyl,
        wyr,
        ..
    } = fine;
    let fl = *fl;
    let mask = use_mask.then_some(&excl.mask[..]);
    let (cnx, cny) = (fl.nx / 2, fl.ny / 2);
    let cl = Layout::new(cnx, cny);
    let (w, he) = (fl.w, fl.he);
    let ho = w - he;
    // Coarse rows in natural column order: crow(J)[I], width cnx + 1.
    let cw = cnx + 1;
    for jc in 0..=cny {
        let out = &mut row_buf[jc * cw..(jc + 1) * cw];
        for (ic, v) in out.iter_mut().enumerate() {
            *v = uc[cl.pos(ic, jc)];
        }
    }
    for j in 1..fl.ny {
        let row = j * w;
        // Interpolate the coarse row(s) onto this fine row: even and odd fine columns.
        let (ja, jb, a, b) = if j % 2 == 0 {
            (j / 2, j / 2, 1.0, 0.0)
        } else {
            ((j - 1) / 2, j.div_ceil(2), wyl[j], wyr[j])
        };
        let ca = &row_buf[ja * cw..(ja + 1) * cw];
        let cb = &row_buf[jb * cw..(jb + 1) * cw];
        let (ue, uo) = u[row..row + w].split_at_mut(he);
        match mask {
            None => {
                // Even columns i = 2I (interior I = 1..cnx−1).
                for ic in 1..cnx {
                    ue[ic] += a * ca[ic] + b * cb[ic];
                }
                // Odd columns i = 2m + 1 (m = 0..cnx−1) between coarse m and m + 1.
                for m in 0..ho.min(cnx) {
                    let left = a * ca[m] + b * cb[m];
                    let right = a * ca[m + 1] + b * cb[m + 1];
                    uo[m] += wl[m] * left + wr[m] * right;
                }
            }
            Some(mk) => {
                let (me, mo) = mk[row..row + w].split_at(he);
                for ic in 1..cnx {
                    if !me[ic] {
                        ue[ic] += a * ca[ic] + b * cb[ic];
                    }
                }
                for m in 0..ho.min(cnx) {
                    if !mo[m] {
                        let left = a * ca[m] + b * cb[m];
                        let right = a * ca[m + 1] + b * cb[m + 1];
                        uo[m] += wl[m] * left + wr[m] * right;
                    }
                }
            }
        }
    }
}

/// Lagrange weights of the nodes `x[i0..i0 + 4]` for interpolation at `t`.
fn lagrange4(x: &[f64], i0: usize, t: f64) -> [f64; 4] {
    let mut w = [1.0; 4];
    for (a, wa) in w.iter_mut().enumerate() {
        for b in 0..4 {
            if a != b {
                *wa *= (t - x[i0 + b]) / (x[i0 + a] - x[i0 + b]);
            }
        }
    }
    w
}

/// First of the four coarse nodes used for the fine node between coarse `m` and `m + 1`
/// (centred where possible, one-sided at the edges).
fn stencil_start(m: usize, n_coarse: usize) -> usize {
    m.saturating_sub(1).min(n_coarse - 4)
}

/// Full-multigrid interpolation of a coarse *solution* `uc` (split layout of the coarse level)
/// onto the fine level's `u`, cubic (four-point Lagrange on the node positions) in each
/// direction; linear where the coarse level has fewer than four nodes across. Cubic
/// interpolation of the solution keeps the fine residual of a full-multigrid start small, as
/// the solution is smooth (linear interpolation is enough for corrections).
#[allow(clippy::needless_range_loop)]
fn interpolate_cubic(fine: &mut Ops, xi: &[f64], eta: &[f64], uc: &[f64], buf: &mut [f64]) {
    let fl = fine.lay;
    let (cnx, cny) = (fl.nx / 2, fl.ny / 2);
    if cnx < 3 || cny < 3 {
        fine.u.fill(0.0);
        prolong_add(fine, uc, false, buf);
        return;
    }
    let cl = Layout::new(cnx, cny);
    let xc: Vec<f64> = (0..=cnx).map(|i| xi[2 * i]).collect();
    let yc: Vec<f64> = (0..=cny).map(|j| eta[2 * j]).collect();
    // Coarse rows interpolated to every fine column: buf(J, i), width nx + 1.
    let w = fl.w;
    let wx: Vec<(usize, [f64; 4])> = (0..cnx)
        .map(|m| {
            let s0 = stencil_start(m, cnx + 1);
            (s0, lagrange4(&xc, s0, xi[2 * m + 1]))
        })
        .collect();
    for jc in 0..=cny {
        let row = &mut buf[jc * w..(jc + 1) * w];
        for ic in 0..=cnx {
            row[2 * ic] = uc[cl.pos(ic, jc)];
        }
        for (m, &(s0, wt)) in wx.iter().enumerate() {
            row[2 * m + 1] = (0..4).map(|q| wt[q] * uc[cl.pos(s0 + q, jc)]).sum();
        }
    }
    fine.u.fill(0.0);
    for (j, &eta_j) in eta.iter().enumerate().take(fl.ny).skip(1) {
        let (s0, wt) = if j % 2 == 0 {
            (j / 2, [1.0, 0.0, 0.0, 0.0])
        } else {
            let s0 = stencil_start((j - 1) / 2, cny + 1);
            (s0, lagrange4(&yc, s0, eta_j))
        };
        let rows: [&[f64]; 4] =
            std::array::from_fn(|q| &buf[(s0 + q).min(cny) * w..((s0 + q).min(cny) + 1) * w]);
        for i in 1..fl.nx {
            let v = (0..4).map(|q| wt[q] * rows[q][i]).sum();
            fine.u[fl.pos(i, j)] = v;
        }
    }
}
