//! Steady operating point of the self-heated element, its time constant,
//! and the airflow at which the sense voltage reaches a given level.
//!
//! Energy balance at steady state (first law of thermodynamics for the
//! element as a lumped body): `P_elec(T) = P_loss(T, U)`. The residual
//! `f(T) = P_loss(T, U) − P_elec(T)` is scanned on a physical bracket from
//! ambient up to the highest temperature the resistance law allows, every
//! sign change is refined with Brent's method, and each root is classified
//! by the sign of `df/dT` (stable when `df/dT > 0`: a small rise in T loses
//! more heat than it gains). Lumped time constant `τ = C/(df/dT)` follows
//! from linearising `C·dT/dt = −f(T)` about the root (e.g. Incropera et al.,
//! *Fundamentals of Heat and Mass Transfer*, 6th ed., §5.2, lumped
//! capacitance). The solve path does not allocate.

use crate::drive::Drive;
use crate::element::{CoolingLaw, Element, Environment};
use crate::precision::{ENERGY_BALANCE_REL_TOL, ROOT_ABS_TOL, ROOT_REL_TOL, SCAN_INTERVALS};
use crate::roots::{brent_fallible, brent_known_ends, RootError};

/// Most roots a solve records (a physical element has at most three).
pub const MAX_ROOTS: usize = 4;

/// Smallest temperature rise (K) at which the logarithmic scan starts;
/// the interval `[T_amb, T_amb + SCAN_MIN_RISE_K]` is scanned as well.
pub const SCAN_MIN_RISE_K: f64 = 1e-4;

/// Halvings of the starting airflow the trip-airflow search tries before it
/// evaluates still air itself.
pub const SEARCH_HALVINGS: usize = 12;

/// Bisections that locate the lowest airflow with a steady state when the
/// search's downward walk meets a runaway (2^-40 of the step: far below
/// any airflow resolution that matters).
pub const RUNAWAY_EDGE_BISECTIONS: usize = 40;

/// Highest airflow (m/s) the trip-airflow search will consider.
pub const MAX_AIRFLOW_M_PER_S: f64 = 100.0;

/// Why no operating point could be given.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum SolveError {
    /// Electrical power exceeds the losses all the way up to the highest
    /// temperature the element's law allows: thermal runaway.
    #[error(
        "thermal runaway: at {upper_k:.1} K (the top of the element's valid range) the element still takes \
         {power_w:.4} W but loses only {loss_w:.4} W, so it has no steady temperature; add series \
         resistance, use a current drive, or ask for less overheat"
    )]
    Runaway {
        /// Top of the scanned range, K.
        upper_k: f64,
        /// Electrical power there, W.
        power_w: f64,
        /// Heat loss there, W.
        loss_w: f64,
    },
    /// Ambient lies outside the resistance law's valid range.
    #[error("ambient {ambient_k:.2} K is outside the resistance law's valid range {lo_k:.2}–{hi_k:.2} K")]
    AmbientOutOfRange {
        /// Ambient, K.
        ambient_k: f64,
        /// Low end of the law's range, K.
        lo_k: f64,
        /// High end of the law's range, K.
        hi_k: f64,
    },
    /// A model value was not finite inside the bracket.
    #[error("numerical failure: {0}")]
    Numerical(RootError),
    /// The sense voltage never reaches the wanted level between still air
    /// and the highest airflow considered.
    #[error(
        "the sense voltage never reaches {target_v:.4} V: it runs from {at_zero_v:.4} V at the lowest airflow \
         with a steady state to {at_max_v:.4} V at {max_airflow_m_per_s} m/s"
    )]
    LevelNotReached {
        /// The wanted level, V.
        target_v: f64,
        /// Sense voltage at the lowest airflow tried with a steady state, V.
        at_zero_v: f64,
        /// Sense voltage at the highest airflow considered, V.
        at_max_v: f64,
        /// That highest airflow, m/s.
        max_airflow_m_per_s: f64,
    },
}

/// Every root of the energy balance found on the bracket, in rising
/// temperature, with each one's stability.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RootSet {
    temperatures_k: [f64; MAX_ROOTS],
    stable: [bool; MAX_ROOTS],
    count: usize,
    found: usize,
}

impl RootSet {
    fn empty() -> Self {
        Self {
            temperatures_k: [0.0; MAX_ROOTS],
            stable: [false; MAX_ROOTS],
            count: 0,
            found: 0,
        }
    }
    fn push(&mut self, t_k: f64, stable: bool) {
        if self.count < MAX_ROOTS {
            self.temperatures_k[self.count] = t_k;
            self.stable[self.count] = stable;
            self.count += 1;
        }
        self.found += 1;
    }
    /// Number of roots found (may exceed the number recorded).
    pub fn found(&self) -> usize {
        self.found
    }
    /// The recorded roots as (temperature K, stable).
    pub fn iter(&self) -> impl Iterator<Item = (f64, bool)> + '_ {
        (0..self.count).map(|i| (self.temperatures_k[i], self.stable[i]))
    }
}

/// A solved steady operating point.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OperatingPoint {
    /// Airflow, m/s.
    pub airflow_m_per_s: f64,
    /// Ambient air temperature, K.
    pub ambient_k: f64,
    /// Element temperature, K.
    pub temperature_k: f64,
    /// Element resistance, ohm.
    pub resistance_ohm: f64,
    /// Element resistance at ambient (unheated), ohm.
    pub ambient_resistance_ohm: f64,
    /// Element current, A.
    pub current_a: f64,
    /// Electrical power in the element, W.
    pub power_w: f64,
    /// Heat lost at the solved temperature, W (equals `power_w` to the
    /// precision policy).
    pub heat_loss_w: f64,
    /// Voltage across the element, V.
    pub sense_v: f64,
    /// `df/dT = dP_loss/dT − dP_elec/dT` at the root, W/K (> 0: stable).
    pub stability_w_per_k: f64,
    /// Lumped time constant `C/(df/dT)`, s.
    pub time_constant_s: f64,
    /// All roots found on the bracket.
    pub roots: RootSet,
}

impl OperatingPoint {
    /// Temperature rise over ambient, K.
    pub fn rise_k(&self) -> f64 {
        self.temperature_k - self.ambient_k
    }
    /// Overheat ratio `(R_hot − R_amb)/R_amb`, the usual hot-wire
    /// definition (H. H. Bruun, *Hot-Wire Anemometry*, Oxford University Press 1995; section from memory).
    pub fn overheat_ratio(&self) -> f64 {
        (self.resistance_ohm - self.ambient_resistance_ohm) / self.ambient_resistance_ohm
    }
    /// Relative closure of the energy balance, `|P_loss − P_elec| / P_elec`.
    pub fn balance_residual(&self) -> f64 {
        if self.power_w == 0.0 {
            (self.heat_loss_w - self.power_w).abs()
        } else {
            ((self.heat_loss_w - self.power_w) / self.power_w).abs()
        }
    }
}

/// Residual `f(T) = P_loss − P_elec` and its derivative in T.
fn residual(element: &Element, drive: &Drive, env: &Environment, u: f64, t_k: f64) -> f64 {
    let r = element.resistance_law().resistance_ohm(t_k);
    element.cooling_law().heat_loss_w(t_k, u, env) - drive.power_w(r)
}

fn residual_slope(element: &Element, drive: &Drive, env: &Environment, u: f64, t_k: f64) -> f64 {
    let law = element.resistance_law();
    let r = law.resistance_ohm(t_k);
    element.cooling_law().d_heat_loss_dt(t_k, u, env)
        - drive.dpower_dr(r) * law.derivative_ohm_per_k(t_k)
}

/// Most Newton steps the single-root fast path takes before it hands the
/// solve to the full scan (each step at least bisects the bracket when
/// Newton would leave it, so 200 reach f64 resolution on any range).
pub const NEWTON_MAX_STEPS: usize = 200;

/// Share of the energy-balance tolerance a Newton root must close to.
pub const NEWTON_CLOSURE: f64 = 1e-3;

/// Whether the balance provably has at most one root on the law's range, so
/// that a safeguarded Newton solve replaces the scan: a temperature-
/// independent conductance G (King's law, the data-sheet form) and a
/// rising, linear-or-concave R(T). Then with h(R) the drive's power
/// (`V²R/(Rs + R)²` or `I²R`), `f(T) = G·(T − Ta) − h(R(T))` has
/// `f' = G − h'(R)·R' > 0` wherever `h' ≤ 0`, and `f'' = −(h''·R'² +
/// h'·R'') ≥ 0` wherever `h' > 0` (there `h'' < 0`, since `R < Rs < 2Rs`,
/// and `R'' ≤ 0`); a function that starts below zero at ambient, is convex
/// where it may fall and rises elsewhere crosses zero at most once.
pub fn single_root_provable(element: &Element) -> bool {
    element.cooling_law().kings_form().is_some() && element.resistance_law().is_increasing_concave()
}

/// Safeguarded Newton on the balance `f(T) = P_loss − P_elec` inside the
/// bracket `[T_amb, T_max]` (Newton steps that would leave the bracket are
/// replaced by bisection), for designs with at most one root. `None` when
/// there is no sign change (runaway or no power) or it does not converge:
/// the full scan then decides and explains.
fn newton_single_root(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
) -> Option<OperatingPoint> {
    let (lo_k, hi_k) = element.resistance_law().valid_range_k();
    let ta = env.ambient_k;
    if !(ta >= lo_k && ta < hi_k) {
        return None;
    }
    // The conductance does not depend on T here: evaluate it once.
    let g = element.cooling_law().kings_form()?.conductance_w_per_k(u);
    let law = element.resistance_law();
    let f = |t: f64| g * (t - ta) - drive.power_w(law.resistance_ohm(t));
    let slope = |t: f64| g - drive.dpower_dr(law.resistance_ohm(t)) * law.derivative_ohm_per_k(t);
    let (mut lo, mut hi) = (ta, hi_k);
    // f(T_a) = −P < 0 for any drive that heats. The top of the range is not
    // evaluated up front: where it holds no root, the steps run up to it
    // and the closure test below refuses the end point (the census then
    // reports the runaway).
    let f_lo = f(lo);
    if f_lo.is_nan() || f_lo >= 0.0 {
        return None;
    }
    // First guess: one Newton step from ambient.
    let d0 = slope(ta);
    let mut t = if d0 > 0.0 {
        ta - f_lo / d0
    } else {
        0.5 * (lo + hi)
    };
    if !(t > lo && t < hi) {
        t = 0.5 * (lo + hi);
    }
    for _ in 0..NEWTON_MAX_STEPS {
        let ft = f(t);
        if !ft.is_finite() {
            return None;
        }
        if ft == 0.0 {
            break;
        }
        if ft < 0.0 {
            lo = t;
        } else {
            hi = t;
        }
        let d = slope(t);
        let step = ft / d;
        let newton = t - step;
        // A Newton step that stays in the closed bracket is taken (near the
        // root it may land on a bracket end by rounding); otherwise bisect.
        let newton_ok = d > 0.0 && newton >= lo && newton <= hi;
        let next = if newton_ok { newton } else { 0.5 * (lo + hi) };
        let tol = ROOT_REL_TOL * next.abs() + ROOT_ABS_TOL;
        let done = (newton_ok && step.abs() <= tol) || hi - lo <= tol;
        t = next;
        if done {
            break;
        }
    }
    // Accept only a balance closed well inside the policy; otherwise the
    // scan decides.
    let power = drive.power_w(law.resistance_ohm(t));
    let closed = f(t).abs() <= NEWTON_CLOSURE * ENERGY_BALANCE_REL_TOL * power.abs();
    if !closed {
        return None;
    }
    // The conductance is known: the loss and the slope at the root need no
    // further evaluation of the cooling law.
    let s = slope(t);
    let mut roots = RootSet::empty();
    roots.push(t, s > 0.0);
    Some(point_from(
        element,
        drive,
        env,
        u,
        t,
        roots,
        s,
        g * (t - ta),
    ))
}

/// Solve the steady energy balance at airflow `airflow_m_per_s`.
///
/// Returns the first root above ambient — the one an element warming from
/// cold settles at, which is stable because `f(T_amb) ≤ 0` makes the
/// residual cross upward there (only a tangential double root, which the
/// scan cannot resolve, would be marginal) — with
/// every root found recorded in [`OperatingPoint::roots`].
pub fn operating_point(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    airflow_m_per_s: f64,
) -> Result<OperatingPoint, SolveError> {
    if single_root_provable(element) {
        if let Some(p) = newton_single_root(element, drive, env, airflow_m_per_s) {
            return Ok(p);
        }
    }
    if let Some(p) = operating_point_bounded(element, drive, env, airflow_m_per_s) {
        return p;
    }
    operating_point_census(element, drive, env, airflow_m_per_s)
}

/// The scan's rise above ambient at grid index `k` (0 … `SCAN_INTERVALS`):
/// logarithmic from `min_rise` to exactly `max_rise` (§5.2 of model.md).
/// One function for the full scan and the bounded census, so both see the
/// same grid to the last bit.
#[inline]
fn scan_rise(min_rise: f64, max_rise: f64, ratio: f64, k: usize) -> f64 {
    if k == SCAN_INTERVALS {
        max_rise
    } else {
        min_rise * (ratio * k as f64 / SCAN_INTERVALS as f64).exp()
    }
}

/// One evaluated grid point of the bounded census: loss, electrical power,
/// resistance and the residual `f = loss − power`, as the full scan
/// computes it.
#[derive(Clone, Copy)]
struct GridPoint {
    t: f64,
    loss: f64,
    power: f64,
    r: f64,
    f: f64,
}

/// The full scan's root set, found by visiting only the grid intervals
/// that can hold a sign change (model.md §5.2b).
///
/// On a grid interval `[a, b]` the loss rises with T (checked at every
/// pair of points visited) and the electrical power `h(R(T))` is monotone
/// or single-peaked (R(T) is monotone for every law; `h` peaks at R = Rs
/// for the series drive, `V²/(4Rs)`, and rises for a current). So
/// `loss(a) − max P ≤ f ≤ loss(b) − min P` on `[a, b]`: where that band
/// excludes zero, no grid point inside can show a sign change and the
/// interval is skipped; otherwise it is halved down to single grid
/// intervals, where the full scan's own test and Brent refinement apply.
/// The roots are therefore the full scan's roots, bit for bit, at a
/// fraction of its evaluations, and a runaway is the scan's runaway.
/// `None` hands the solve back to the scan.
pub fn operating_point_bounded(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
) -> Option<Result<OperatingPoint, SolveError>> {
    let Census {
        roots, known_slope, ..
    } = match bounded_census(element, drive, env, u, false)? {
        Ok(found) => found,
        Err(e) => return Some(Err(e)),
    };
    let (t, _) = roots.iter().next()?;
    // The first root's slope was taken when it was classified (a root at
    // ambient itself was not: take it here).
    let slope = known_slope.unwrap_or_else(|| residual_slope(element, drive, env, u, t));
    Some(Ok(point_with_slope(
        element, drive, env, u, t, roots, slope,
    )))
}

/// The grid interval `[a, b]` (K) that holds the lowest root of the
/// balance above ambient — where an element warming from cold settles — by
/// the bounded census stopped at the first sign change, without refining
/// it (the walk goes left to right, so the first interval it finds is the
/// lowest; a root at ambient itself gives `[T_a, T_a]`). `Some(None)`: no
/// root on the range (runaway); `None`: the census hands back (the caller
/// solves in full).
pub fn first_root_bracket(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
) -> Option<Option<(f64, f64)>> {
    match bounded_census(element, drive, env, u, true)? {
        Ok(c) => Some(
            c.first_bracket
                .or_else(|| c.roots.iter().next().map(|(t, _)| (t, t))),
        ),
        Err(SolveError::Runaway { .. }) => Some(None),
        Err(_) => None,
    }
}

/// What the bounded census found.
struct Census {
    /// The roots refined (none when stopped at a first bracket).
    roots: RootSet,
    /// The first root's slope, where it was taken on the way.
    known_slope: Option<f64>,
    /// With `first_only`: the first grid interval with a sign change.
    first_bracket: Option<(f64, f64)>,
}

/// The bounded census's roots (at least one), or with `first_only` the
/// first sign change's grid interval unrefined; or the runaway.
fn bounded_census(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
    first_only: bool,
) -> Option<Result<Census, SolveError>> {
    let law = element.resistance_law();
    let (lo, hi) = law.valid_range_k();
    let ta = env.ambient_k;
    if !(ta >= lo && ta < hi) {
        return None;
    }
    let max_rise = hi - ta;
    let min_rise = SCAN_MIN_RISE_K.min(0.5 * max_rise);
    let ratio = (max_rise / min_rise).ln();
    let cooling = element.cooling_law();
    // Grid index 0 is ambient itself; index j ≥ 1 is the scan's point j − 1.
    let eval = |j: usize| -> Option<GridPoint> {
        let t = if j == 0 {
            ta
        } else {
            ta + scan_rise(min_rise, max_rise, ratio, j - 1)
        };
        let r = law.resistance_ohm(t);
        let loss = cooling.heat_loss_w(t, u, env);
        let power = drive.power_w(r);
        let f = loss - power;
        f.is_finite().then_some(GridPoint {
            t,
            loss,
            power,
            r,
            f,
        })
    };
    let peak = match *drive {
        Drive::SeriesResistor { rail_v, series_ohm } => {
            Some((series_ohm, rail_v * rail_v / (4.0 * series_ohm)))
        }
        Drive::ConstantCurrent { .. } => None,
    };
    let first = eval(0)?;
    let last = eval(SCAN_INTERVALS + 1)?;
    let mut roots = RootSet::empty();
    if first.f == 0.0 {
        roots.push(ta, true);
    }
    let f = |t: f64| residual(element, drive, env, u, t);
    let mut visit = Visit {
        eval: &eval,
        f: &f,
        peak,
        roots: &mut roots,
        slope: &|t| residual_slope(element, drive, env, u, t),
        first_slope: None,
        first_only,
        first_bracket: None,
    };
    // `None`: a non-finite value or a loss that fell with temperature; the
    // full scan decides (and reports).
    visit.interval(0, SCAN_INTERVALS + 1, first, last)?;
    let visit_first_slope = visit.first_slope;
    let first_bracket = visit.first_bracket;
    if roots.found() == 0 && first_bracket.is_none() {
        // The full scan's figures, taken at the top of the range itself.
        return Some(Err(SolveError::Runaway {
            upper_k: hi,
            power_w: drive.power_w(law.resistance_ohm(hi)),
            loss_w: cooling.heat_loss_w(hi, u, env),
        }));
    }
    let known_slope = visit_first_slope.filter(|_| first.f != 0.0);
    Some(Ok(Census {
        roots,
        known_slope,
        first_bracket,
    }))
}

/// The bounded census's walk over grid intervals, left to right so that
/// roots are recorded in rising temperature as the full scan records them.
struct Visit<'a, E, F, S> {
    eval: &'a E,
    f: &'a F,
    peak: Option<(f64, f64)>,
    roots: &'a mut RootSet,
    slope: &'a S,
    /// The residual's slope at the first root refined (kept for the
    /// operating point, so it is not computed twice).
    first_slope: Option<f64>,
    /// Stop at the first sign change, unrefined.
    first_only: bool,
    /// The first sign change's grid interval (with `first_only`).
    first_bracket: Option<(f64, f64)>,
}

impl<E, F, S> Visit<'_, E, F, S>
where
    E: Fn(usize) -> Option<GridPoint>,
    F: Fn(f64) -> f64,
    S: Fn(f64) -> f64,
{
    fn interval(&mut self, i: usize, j: usize, a: GridPoint, b: GridPoint) -> Option<()> {
        if self.first_only && (self.roots.found() > 0 || self.first_bracket.is_some()) {
            return Some(());
        }
        if b.loss < a.loss {
            return None;
        }
        if j == i + 1 {
            // The full scan's test and refinement on one grid interval.
            if a.f != 0.0 && (b.f == 0.0 || b.f.signum() != a.f.signum()) {
                if self.first_only {
                    self.first_bracket = Some((a.t, b.t));
                    return Some(());
                }
                let root = brent_known_ends(self.f, (a.t, a.f), (b.t, b.f)).ok()?;
                let slope = (self.slope)(root.x);
                self.first_slope.get_or_insert(slope);
                self.roots.push(root.x, slope > 0.0);
            }
            return Some(());
        }
        let p_min = a.power.min(b.power);
        let p_max = match self.peak {
            Some((rs, p_peak)) if (a.r - rs) * (b.r - rs) <= 0.0 => p_peak,
            _ => a.power.max(b.power),
        };
        // A margin far above rounding keeps the bound honest in floating
        // point (the skipped points' computed f keeps its sign).
        let margin = 1e-10 * (b.loss.abs() + p_max.abs());
        if a.loss - p_max > margin || b.loss - p_min < -margin {
            return Some(());
        }
        let m = (i + j) / 2;
        let mid = (self.eval)(m)?;
        self.interval(i, m, a, mid)?;
        self.interval(m, j, mid, b)
    }
}

/// [`operating_point`] by the full scan: every root on the range found and
/// classified (the general path, and the reference the fast path is
/// tested against).
pub fn operating_point_census(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    airflow_m_per_s: f64,
) -> Result<OperatingPoint, SolveError> {
    let u = airflow_m_per_s;
    let law = element.resistance_law();
    let (lo, hi) = law.valid_range_k();
    let ta = env.ambient_k;
    if !(ta >= lo && ta < hi) {
        return Err(SolveError::AmbientOutOfRange {
            ambient_k: ta,
            lo_k: lo,
            hi_k: hi,
        });
    }
    let f = |t: f64| residual(element, drive, env, u, t);
    let mut roots = RootSet::empty();
    let mut first: Option<f64> = None;

    let f_amb = f(ta);
    if !f_amb.is_finite() {
        return Err(SolveError::Numerical(RootError::NotFinite { x: ta }));
    }
    if f_amb == 0.0 {
        // No power at all: the element sits at ambient.
        roots.push(ta, true);
        first = Some(ta);
    }
    // Logarithmic scan of the rise from SCAN_MIN_RISE_K to the top of range,
    // so that small overheats are resolved as finely as large ones.
    let max_rise = hi - ta;
    let min_rise = SCAN_MIN_RISE_K.min(0.5 * max_rise);
    let ratio = (max_rise / min_rise).ln();
    let (mut t_prev, mut f_prev) = (ta, f_amb);
    for k in 0..=SCAN_INTERVALS {
        let t = ta + scan_rise(min_rise, max_rise, ratio, k);
        let ft = f(t);
        if !ft.is_finite() {
            return Err(SolveError::Numerical(RootError::NotFinite { x: t }));
        }
        if f_prev != 0.0 && (ft == 0.0 || ft.signum() != f_prev.signum()) {
            let root =
                brent_known_ends(f, (t_prev, f_prev), (t, ft)).map_err(SolveError::Numerical)?;
            let stable = residual_slope(element, drive, env, u, root.x) > 0.0;
            roots.push(root.x, stable);
            if first.is_none() {
                first = Some(root.x);
            }
        }
        t_prev = t;
        f_prev = ft;
    }
    let Some(t) = first else {
        let r = law.resistance_ohm(hi);
        return Err(SolveError::Runaway {
            upper_k: hi,
            power_w: drive.power_w(r),
            loss_w: element.cooling_law().heat_loss_w(hi, u, env),
        });
    };
    Ok(point_at(element, drive, env, u, t, roots))
}

fn point_at(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
    t: f64,
    roots: RootSet,
) -> OperatingPoint {
    let slope = residual_slope(element, drive, env, u, t);
    point_with_slope(element, drive, env, u, t, roots, slope)
}

/// [`point_at`] with the residual's slope at `t` already known.
fn point_with_slope(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
    t: f64,
    roots: RootSet,
    slope: f64,
) -> OperatingPoint {
    let loss = element.cooling_law().heat_loss_w(t, u, env);
    point_from(element, drive, env, u, t, roots, slope, loss)
}

/// [`point_with_slope`] with the heat loss at `t` already known as well.
#[allow(clippy::too_many_arguments)]
fn point_from(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
    t: f64,
    roots: RootSet,
    slope: f64,
    heat_loss_w: f64,
) -> OperatingPoint {
    let law = element.resistance_law();
    let r = law.resistance_ohm(t);
    OperatingPoint {
        airflow_m_per_s: u,
        ambient_k: env.ambient_k,
        temperature_k: t,
        resistance_ohm: r,
        ambient_resistance_ohm: law.resistance_ohm(env.ambient_k),
        current_a: drive.current_a(r),
        power_w: drive.power_w(r),
        heat_loss_w,
        sense_v: drive.sense_v(r),
        stability_w_per_k: slope,
        time_constant_s: if slope > 0.0 {
            element.heat_capacity_j_per_k() / slope
        } else {
            f64::INFINITY
        },
        roots,
    }
}

/// Sensitivity of the sense voltage to airflow at a solved point, V per m/s,
/// by implicit differentiation of `f(T, U) = 0`:
/// `dT/dU = −(∂P_loss/∂U)/(∂f/∂T)`, `dV/dU = dV/dR · dR/dT · dT/dU`.
pub fn sensitivity_v_per_m_per_s(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    point: &OperatingPoint,
) -> f64 {
    let law = element.resistance_law();
    let t = point.temperature_k;
    let dloss_du = element
        .cooling_law()
        .d_heat_loss_du(t, point.airflow_m_per_s, env);
    let dt_du = -dloss_du / point.stability_w_per_k;
    drive.dsense_dr(point.resistance_ohm) * law.derivative_ohm_per_k(t) * dt_du
}

/// Sense voltage at airflow `u`.
pub fn sense_at(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u: f64,
) -> Result<f64, SolveError> {
    operating_point(element, drive, env, u).map(|p| p.sense_v)
}

/// Relative agreement the inversion's answer must show with a full solve
/// at the airflow it found before it is trusted (else the search decides).
pub const INVERSION_CHECK_REL: f64 = 1e-9;

/// The airflow at which the sense voltage equals `level_v`, by inverting
/// the chain instead of searching: the drive gives the element's
/// resistance, the resistance law its temperature, so the electrical power
/// is known, and the cooling law gives the airflow that carries that power
/// away at that temperature — in closed form for a King's-law form (King's
/// law, the data-sheet form: `G = P/(T − T_amb)`, `U = ((G − A)/B)^(1/n)`),
/// and for geometry cooling by inverting the Nusselt relation at that
/// temperature (`GeometryCooling::airflow_for_loss`).
///
/// Returns `None` when the inversion does not apply or its answer is not
/// the cold-start operating point (a fold or a bistable element): the
/// caller then searches. When the level lies beyond still air or beyond
/// the highest airflow, the answer is `LevelNotReached`, confirmed by the
/// operating points at both ends.
pub fn airflow_by_inversion(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    level_v: f64,
) -> Option<Result<f64, SolveError>> {
    let cooling = element.cooling_law();
    let law = element.resistance_law();
    let r = drive.resistance_for_sense(level_v)?;
    let t = law.temperature_for_resistance(r)?;
    let rise = t - env.ambient_k;
    let power = drive.power_w(r);
    let u = if rise.is_nan() || rise <= 0.0 {
        None
    } else if let Some(king) = cooling.kings_form() {
        king.airflow_for_conductance(power / rise)
    } else if let CoolingLaw::Geometry(g) = cooling {
        // Geometry: the Nusselt relation inverted at this temperature
        // (radiation and supports off, the mixing rule and the forced
        // correlation solved for Re, U = Re·ν/d).
        g.airflow_for_loss(t, power, env)
    } else {
        None
    };
    match u {
        Some(u) if u <= MAX_AIRFLOW_M_PER_S => {
            // Where the balance has at most one root (`single_root_provable`)
            // the temperature found is that root: nothing to check.
            if single_root_provable(element) {
                return Some(Ok(u));
            }
            // Otherwise trust it only if it is the operating point an
            // element warming from cold settles at, the balance's lowest
            // root: when the first grid interval with a sign change holds
            // the temperature found (the full scan would refine its root
            // there; the bounded census stops at that interval), else when
            // the full solve's root reproduces the level.
            match first_root_bracket(element, drive, env, u) {
                Some(Some((a, b))) => {
                    let slack = 1e-12 * b.abs();
                    (t >= a - slack && t <= b + slack).then_some(Ok(u))
                }
                Some(None) => None,
                None => {
                    let p = operating_point(element, drive, env, u).ok()?;
                    let tol = INVERSION_CHECK_REL * level_v.abs().max(f64::MIN_POSITIVE);
                    ((p.sense_v - level_v).abs() <= tol).then_some(Ok(u))
                }
            }
        }
        _ => {
            // Beyond one end: confirm with both ends that the level is not
            // crossed on the way.
            let v0 = lowest_steady_sense(element, drive, env)?;
            let vmax = operating_point(element, drive, env, MAX_AIRFLOW_M_PER_S)
                .ok()?
                .sense_v;
            let between = (level_v - v0) * (level_v - vmax) <= 0.0;
            (!between).then_some(Err(SolveError::LevelNotReached {
                target_v: level_v,
                at_zero_v: v0,
                at_max_v: vmax,
                max_airflow_m_per_s: MAX_AIRFLOW_M_PER_S,
            }))
        }
    }
}

/// Sense voltage in still air, or `None` when still air has no steady
/// state (the search handles that case).
fn lowest_steady_sense(element: &Element, drive: &Drive, env: &Environment) -> Option<f64> {
    operating_point(element, drive, env, 0.0)
        .ok()
        .map(|p| p.sense_v)
}

/// The airflow (m/s) at which the sense voltage equals `level_v`.
///
/// The sense voltage is monotone in airflow for every element draftwire
/// models. The search starts at `hint_m_per_s`, walks down by halving
/// (ending at still air) or up by doubling (ending at
/// [`MAX_AIRFLOW_M_PER_S`]) until the level is bracketed, then refines the
/// root with Brent's method. Airflows at which the element has no steady
/// state (runaway in near-still air) end the downward walk.
pub fn airflow_for_sense(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    level_v: f64,
    hint_m_per_s: f64,
) -> Result<f64, SolveError> {
    if let Some(answer) = airflow_by_inversion(element, drive, env, level_v) {
        return answer;
    }
    airflow_by_search(element, drive, env, level_v, hint_m_per_s)
}

/// [`airflow_for_sense`] by search alone: bracket, then Brent (the general
/// path, and the reference the inversion is tested against).
pub fn airflow_by_search(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    level_v: f64,
    hint_m_per_s: f64,
) -> Result<f64, SolveError> {
    let g = |u: f64| sense_at(element, drive, env, u).map(|v| v - level_v);
    let start = if hint_m_per_s.is_finite() && hint_m_per_s > 0.0 {
        hint_m_per_s.min(MAX_AIRFLOW_M_PER_S)
    } else {
        1.0
    };
    let g_start = g(start)?;
    if g_start == 0.0 {
        return Ok(start);
    }
    let (mut lowest, mut g_lowest) = (start, g_start);
    let (mut highest, mut g_highest) = (start, g_start);
    let mut bracket: Option<(f64, f64)> = None;
    // Walk down.
    for k in 1..=SEARCH_HALVINGS + 1 {
        let u = if k > SEARCH_HALVINGS {
            0.0
        } else {
            start / f64::powi(2.0, k as i32)
        };
        match g(u) {
            Ok(v) => {
                if v == 0.0 {
                    return Ok(u);
                }
                if v.signum() != g_lowest.signum() {
                    bracket = Some((u, lowest));
                    break;
                }
                lowest = u;
                g_lowest = v;
            }
            Err(SolveError::Runaway { .. }) => {
                // Below `lowest` the element runs away somewhere above `u`:
                // close in on the lowest airflow with a steady state and
                // try the level there too.
                let (mut dead, mut live) = (u, lowest);
                for _ in 0..RUNAWAY_EDGE_BISECTIONS {
                    let mid = 0.5 * (dead + live);
                    if operating_point(element, drive, env, mid).is_ok() {
                        live = mid;
                    } else {
                        dead = mid;
                    }
                }
                if live < lowest {
                    if let Ok(v) = g(live) {
                        if v == 0.0 {
                            return Ok(live);
                        }
                        if v.signum() != g_lowest.signum() {
                            bracket = Some((live, lowest));
                        } else {
                            // Still one side: the lowest steady point is
                            // what "not reached" reports.
                            g_lowest = v;
                        }
                    }
                }
                break;
            }
            Err(e) => return Err(e),
        }
    }
    // Walk up.
    while bracket.is_none() && highest < MAX_AIRFLOW_M_PER_S {
        let u = (2.0 * highest).min(MAX_AIRFLOW_M_PER_S);
        let v = g(u)?;
        if v == 0.0 {
            return Ok(u);
        }
        if v.signum() != g_highest.signum() {
            bracket = Some((highest, u));
        }
        highest = u;
        g_highest = v;
    }
    let Some((lo, hi)) = bracket else {
        return Err(SolveError::LevelNotReached {
            target_v: level_v,
            at_zero_v: g_lowest + level_v,
            at_max_v: g_highest + level_v,
            max_airflow_m_per_s: MAX_AIRFLOW_M_PER_S,
        });
    };
    brent_fallible(g, lo, hi)?
        .map(|r| r.x)
        .map_err(SolveError::Numerical)
}
