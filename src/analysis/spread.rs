//! `spread`: how part tolerances, the comparator's offset, a model
//! tolerance on the cooling, and the ambient and supply ranges spread the
//! trip point across a batch of builds — the worst-case corners and a
//! seeded Monte Carlo.
//!
//! Each trial draws every tolerance (uniform over ± the tolerance, or a
//! normal with the tolerance as 3σ truncated at ± it), an ambient and an
//! input voltage uniformly over their ranges, and then:
//! - with the trimmer at its printed setting, the trip airflow at the drawn
//!   condition (for the quantiles and the parameters' shares);
//! - at the bench (nominal ambient and input, the build's own regulator
//!   output), whether the trimmer can bring the build to target;
//! - trimmed there, whether it trips at the quiet airflow or outside its
//!   band at any ambient end × input end, with the drawn offset drift away
//!   from the bench ambient.
//!
//! Reproducible for any thread count: trials run in fixed chunks of
//! [`CHUNK_TRIALS`], chunk `c` draws from its own ChaCha8 stream keyed by
//! (seed, c), and chunk results are merged in chunk order. Memory stays
//! flat in the trial count: quantiles come from a fixed log-spaced
//! histogram (resolution [`HISTOGRAM_RESOLUTION`]) and the parameters'
//! shares from running sums.

use super::compensation::{Compensator, Reference, Sensing};
use super::corners::{self, tripped_sign, Switching};
use super::size::{drive_with, element_rail, trimmer_position, SizedCore};
use crate::circuit::divider::Divider;
use crate::circuit::frontend::{Arrangement, FrontEnd};
use crate::design::model::CompensationKind;
use crate::design::model::{Design, Rail, SpreadDistribution, TripDirection};
use crate::element::{Element, Environment};
use crate::solve::operating_point;
use rand::rngs::ChaCha8Rng;
use rand::{RngExt, SeedableRng};
use rand_distr::StandardNormal;
use rayon::prelude::*;
use serde::Serialize;

/// Trials per chunk (one random stream each).
pub const CHUNK_TRIALS: u64 = 1024;

/// Chunks run in parallel between two merges (bounds memory and paces the
/// progress report).
pub const BATCH_CHUNKS: u64 = 64;

/// Lowest and highest airflow the quantile histogram resolves, m/s.
pub const HISTOGRAM_RANGE_M_PER_S: (f64, f64) = (1e-4, 1e3);

/// Histogram bins per decade.
pub const BINS_PER_DECADE: usize = 1000;

/// Relative width of one histogram bin (10^(1/1000) − 1 ≈ 0.23 %): the
/// resolution of the reported quantiles.
pub const HISTOGRAM_RESOLUTION: f64 = 0.002_305_238_0;

/// Default number of trials.
pub const DEFAULT_TRIALS: u64 = 10_000;

/// Default seed (always echoed in the report).
pub const DEFAULT_SEED: u64 = 20_261_202;

/// The varied parameters, in report order.
pub const PARAMETERS: [&str; 13] = [
    "element R0",
    "drive",
    "divider top",
    "trimmer track",
    "divider bottom",
    "comparator offset",
    "cooling airflow term",
    "ambient",
    "input voltage",
    "regulator output",
    "twin resistance or NTC R25",
    "thermistor beta",
    "linearising resistor",
];

const N: usize = PARAMETERS.len();

/// How a run is asked for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct SpreadOptions {
    /// Number of Monte Carlo trials.
    pub trials: u64,
    /// Seed of the random streams.
    pub seed: u64,
}

/// One trial, for `--trials-csv`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TrialRow {
    /// Trial number from 0.
    pub trial: u64,
    /// Each parameter's draw in units of its tolerance (−1 … 1), in the
    /// order of [`PARAMETERS`].
    pub draws: [f64; N],
    /// Ambient drawn, °C.
    pub ambient_c: f64,
    /// Trip airflow with the trimmer at its printed setting, m/s (`None`
    /// when it never switches there).
    pub trip_airflow_m_per_s: Option<f64>,
    /// Whether, at the printed setting, it is tripped at every airflow.
    pub tripped_throughout: bool,
    /// Whether the trimmer can bring this build to target at the bench.
    pub trimmable: bool,
    /// Whether, trimmed, it trips at the quiet airflow at some end.
    pub false_trip: bool,
    /// Whether, trimmed, it trips outside its band at some end.
    pub out_of_band: bool,
}

/// Trip-airflow quantiles, m/s (`None` where the quantile falls among
/// trials that never switch).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Default)]
pub struct Quantiles {
    /// 1 %.
    pub p01: Option<f64>,
    /// 5 %.
    pub p05: Option<f64>,
    /// 50 %.
    pub p50: Option<f64>,
    /// 95 %.
    pub p95: Option<f64>,
    /// 99 %.
    pub p99: Option<f64>,
}

/// The extremes over the vertices of the tolerance box, with the trimmer at
/// its printed setting, at every ambient end × supply end × offset sign.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Default)]
pub struct WorstCase {
    /// Lowest trip airflow, m/s (`None`: some vertex is always tripped).
    pub trip_airflow_min_m_per_s: Option<f64>,
    /// Highest trip airflow, m/s (`None`: some vertex never trips).
    pub trip_airflow_max_m_per_s: Option<f64>,
    /// Lowest release airflow, m/s.
    pub release_airflow_min_m_per_s: Option<f64>,
    /// Highest release airflow, m/s.
    pub release_airflow_max_m_per_s: Option<f64>,
    /// Whether every vertex can be re-trimmed to target within the travel.
    pub retrimmable: bool,
    /// Vertices evaluated (builds × sites × offset signs).
    pub conditions: usize,
}

/// One bar of the trip-airflow histogram.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct HistogramBin {
    /// Lower edge, m/s.
    pub from_m_per_s: f64,
    /// Upper edge, m/s.
    pub to_m_per_s: f64,
    /// Trials with their trip airflow in [from, to).
    pub trials: u64,
}

/// Bars the report's histogram has at most.
pub const DISPLAY_BINS: usize = 60;

/// A parameter's share of the trip airflow's variance.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Contribution {
    /// Which parameter.
    pub parameter: String,
    /// Its first-order (linear) share, 0 … 1.
    pub share: f64,
}

/// A parameter's tolerance as drawn.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ToleranceRow {
    /// Which parameter.
    pub parameter: String,
    /// ± this much, in `unit`.
    pub plus_minus: f64,
    /// "%", "V" or "°C".
    pub unit: String,
}

/// The spread report.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SpreadReport {
    /// Layout version.
    pub schema_version: u32,
    /// draftwire's version.
    pub tool_version: String,
    /// The design file.
    pub design_file: String,
    /// Design title.
    pub title: String,
    /// Trials run.
    pub trials: u64,
    /// Seed used.
    pub seed: u64,
    /// "uniform" or "normal".
    pub distribution: String,
    /// What was varied and by how much (the ambient and the input as half
    /// their ranges; see the ranges below).
    pub tolerances: Vec<ToleranceRow>,
    /// The ambient range drawn over, °C.
    pub ambient_range_c: [f64; 2],
    /// The input-voltage range drawn over, V.
    pub input_range_v: [f64; 2],
    /// Target trip airflow, m/s.
    pub target_airflow_m_per_s: f64,
    /// The band, m/s.
    pub band_m_per_s: [f64; 2],
    /// The printed trimmer setting the quantiles use, % of travel.
    pub trimmer_position_percent: f64,
    /// Trip-airflow quantiles with the trimmer at its printed setting.
    pub trip_airflow_quantiles_m_per_s: Quantiles,
    /// The same quantiles in words (1, 5, 50, 95, 99 %): an airflow, or
    /// what the trials there do instead ("always tripped", "never trips").
    pub trip_airflow_quantiles_text: [String; 5],
    /// Relative resolution of the quantiles (histogram bin width).
    pub quantile_resolution: f64,
    /// The trip airflows (trimmer at its printed setting) in at most
    /// [`DISPLAY_BINS`] bars over the range they occupy.
    pub trip_airflow_histogram: Vec<HistogramBin>,
    /// Share of trials that never switch at the printed setting.
    pub never_switches_share: f64,
    /// Worst case over the tolerance box.
    pub worst_case: WorstCase,
    /// Share of builds the trimmer can bring to target at the bench.
    pub trimmable_share: f64,
    /// Share of trimmed builds that trip at the quiet airflow at some end.
    pub false_trip_share: f64,
    /// Share of trimmed builds that trip outside the band at some end.
    pub out_of_band_share: f64,
    /// Parameters ranked by their share of the trip airflow's variance.
    pub contributions: Vec<Contribution>,
    /// Least trimmable share asked for.
    pub min_trimmable: f64,
    /// Largest false-trip share allowed.
    pub max_false_trip: f64,
    /// Whether both limits hold.
    pub passed: bool,
}

/// Tolerances (as fractions, or V for the offset, K for the ambient
/// half-range, V for the input half-range) in [`PARAMETERS`] order.
fn tolerances(design: &Design) -> [f64; N] {
    let t = design.detector.divider_tolerances;
    // Where a unit's regulator sits (trimmed out on the bench); it moves by
    // the regulation band around that in service (`regulation_ends`).
    let reg = design.supply.regulator_offset_tolerance();
    let c = &design.compensation;
    let comp = match c.kind {
        CompensationKind::Twin => [c.twin.tolerance, 0.0, 0.0],
        CompensationKind::Thermistor => [
            c.thermistor.r25_tolerance,
            c.thermistor.beta_tolerance,
            t.top,
        ],
        _ => [0.0; 3],
    };
    [
        design.element_tolerance,
        design.drive_tolerance,
        t.top,
        t.trimmer,
        t.bottom,
        design.comparator.offset_v,
        design.spread.cooling_tolerance,
        0.5 * (design.ambient.max_k - design.ambient.min_k),
        0.5 * (design.supply.input_max_v - design.supply.input_min_v),
        reg,
        comp[0],
        comp[1],
        comp[2],
    ]
}

/// Fixed inputs of every trial.
struct Context<'a> {
    design: &'a Design,
    core: &'a SizedCore,
    tol: [f64; N],
    sigma: f64,
    ambient_mid_k: f64,
    input_mid_v: f64,
    ambient_ends: Vec<f64>,
    /// The (input voltage, regulation factor) ends a trimmed build is
    /// judged at: the input ends × the regulated rail's in-service ends
    /// (1 ± regulation, as factors of where the build's regulator sits),
    /// keeping only the ends some rail of the switching path follows.
    supply_ends: Vec<(f64, f64)>,
    /// The bench's supply condition: nominal input, regulator where it sits.
    bench_supply: (f64, f64),
    /// Whether a build trimmed at the bench is sure to trip on target there
    /// and the target is safe ([`bench_trip_is_target`]), so that the bench
    /// condition needs no solve.
    bench_trip_is_target: bool,
}

/// The supply ends a build's switching can depend on. The switching path
/// sees the input only through the element's and the reference's rails: an
/// end that neither rail follows gives the same trip as its neighbour and
/// is solved once (an exact saving, not an approximation). The comparator's
/// output-high level is held at its nominal value here, as in the verdict's
/// sites; a comparator on a rail the others do not share would move the
/// released level with the input, which neither models.
fn supply_ends(design: &Design, input_ends: &[f64], regulation_ends: &[f64]) -> Vec<(f64, f64)> {
    let has_regulator = design.supply.regulator.is_some();
    let rails = [element_rail(design), Some(design.detector.reference_rail)];
    let follows = |which: Rail| {
        rails
            .iter()
            .flatten()
            .any(|&r| (r == Rail::Regulated && has_regulator) == (which == Rail::Regulated))
    };
    let inputs: &[f64] = if follows(Rail::Input) {
        input_ends
    } else {
        &[design.supply.input_v]
    };
    let regulations: &[f64] = if follows(Rail::Regulated) {
        regulation_ends
    } else {
        &[1.0]
    };
    inputs
        .iter()
        .flat_map(|&v| regulations.iter().map(move |&r| (v, r)))
        .collect()
}

/// One draw in units of the tolerance, −1 … 1.
fn draw(rng: &mut ChaCha8Rng, dist: SpreadDistribution) -> f64 {
    match dist {
        SpreadDistribution::Uniform => 2.0 * rng.random::<f64>() - 1.0,
        // Tolerance = 3σ, truncated at ± the tolerance by rejection.
        SpreadDistribution::Normal => loop {
            let z: f64 = rng.sample::<f64, _>(StandardNormal) / 3.0;
            if z.abs() <= 1.0 {
                break z;
            }
        },
    }
}

/// The rails for an input voltage and a regulator output.
fn rail_v(design: &Design, rail: Rail, input_v: f64, regulated_v: f64) -> f64 {
    match (rail, design.supply.regulator) {
        (Rail::Regulated, Some(_)) => regulated_v,
        _ => input_v,
    }
}

/// A build's parts from its draws.
struct Build {
    element: Element,
    drive_value: f64,
    divider: Divider,
    comp: Compensator,
    offset_v: f64,
    regulated_v: f64,
}

fn build_of(cx: &Context, z: &[f64; N]) -> Build {
    let core = cx.core;
    let f = |i: usize| 1.0 + cx.tol[i] * z[i];
    let mut element = core
        .element
        .with_resistance_law(core.element.resistance_law().scaled(f(0)));
    if cx.tol[6] > 0.0 {
        element = element.with_cooling_law(element.cooling_law().with_airflow_term_scaled(f(6)));
    }
    let d = core.front.divider;
    Build {
        element,
        drive_value: corners::drive_value(core) * f(1),
        divider: Divider {
            top_ohm: d.top_ohm * f(2),
            trimmer_ohm: d.trimmer_ohm * f(3),
            bottom_ohm: d.bottom_ohm * f(4),
        },
        comp: core.compensation.with_factors([f(10), f(11), f(12)]),
        offset_v: cx.tol[5] * z[5],
        regulated_v: cx
            .design
            .supply
            .regulator
            .map_or(0.0, |r| r.output_v * f(9)),
    }
}

/// Where one build switches at one condition with the trimmer at `x`:
/// (trip, release), the release only when asked for.
fn switching(
    cx: &Context,
    b: &Build,
    ambient_k: f64,
    (input_v, regulated_factor): (f64, f64),
    x: f64,
    dv: f64,
    with_release: bool,
) -> (Switching, Option<Switching>) {
    let design = cx.design;
    let core = cx.core;
    let regulated_v = b.regulated_v * regulated_factor;
    let env = Environment {
        ambient_k,
        ..core.env
    };
    let el_v = element_rail(design).map_or(0.0, |r| rail_v(design, r, input_v, regulated_v));
    let drive = drive_with(&design.drive, b.drive_value, el_v);
    let reference = Reference {
        front: FrontEnd {
            divider: b.divider,
            reference_rail_v: rail_v(design, design.detector.reference_rail, input_v, regulated_v),
            ..core.front
        },
        comp: &b.comp,
        x,
        sense_source_ohm: drive.sense_source_ohm(core.at_trip.resistance_ohm),
    };
    let sensing = Sensing {
        element: &b.element,
        drive: &drive,
        env: &env,
    };
    let u_t = design.detector.trip_airflow_m_per_s;
    (
        reference.switching(&sensing, core.idle_state, dv, u_t, cx.sigma),
        with_release
            .then(|| reference.switching(&sensing, core.idle_state.other(), dv, u_t, cx.sigma)),
    )
}

/// The bench trimmer position that puts a build on target, or `None`
/// when the target has no steady state.
fn bench_position(cx: &Context, b: &Build) -> Option<f64> {
    let design = cx.design;
    let core = cx.core;
    let input_v = design.supply.input_v;
    let el_v = element_rail(design).map_or(0.0, |r| rail_v(design, r, input_v, b.regulated_v));
    let drive = drive_with(&design.drive, b.drive_value, el_v);
    let env = Environment {
        ambient_k: design.ambient.nominal_k,
        ..core.env
    };
    let p = operating_point(
        &b.element,
        &drive,
        &env,
        design.detector.trip_airflow_m_per_s,
    )
    .ok()?;
    let front = FrontEnd {
        divider: b.divider,
        reference_rail_v: rail_v(
            design,
            design.detector.reference_rail,
            input_v,
            b.regulated_v,
        ),
        ..core.front
    };
    let front = b
        .comp
        .front_at(&front, &env, design.detector.trip_airflow_m_per_s);
    Some(trimmer_position(
        &front,
        core.idle_state,
        p.sense_v,
        drive.sense_source_ohm(p.resistance_ohm),
    ))
}

/// Whether the target trip airflow lies inside the band and on the right
/// side of the quiet airflow by a margin far above the solver's relative
/// tolerance (1e-6 here against about 1e-12), so that a build trimmed onto
/// it is judged there without a solve.
fn target_is_safe(design: &Design) -> bool {
    let u = design.detector.trip_airflow_m_per_s;
    let on_target = Switching::At(u);
    let margin = 1e-6 * u;
    let nudged = |du: f64| Switching::At(u + du);
    [-margin, margin]
        .iter()
        .all(|&du| in_band(design, &nudged(du)) && !trips_when_quiet(design, &nudged(du)))
        && in_band(design, &on_target)
}

/// Whether a build trimmed at the bench trips exactly on target at the bench
/// condition, so the solve there can be skipped: the switching level must
/// not depend on the sense node's source resistance (the bench trims with
/// the build's own, the condition solves with the nominal one): the
/// reference on the non-inverting input, or no feedback; the compensating
/// part must not sit in the air stream (its level would follow the
/// airflow); and the sense voltage must be strictly monotone in airflow
/// (King's law or the data-sheet form, B > 0; a geometry law can have a
/// dead band under `mixing = "larger"`).
fn bench_trip_is_target(core: &SizedCore) -> bool {
    let level_ignores_source = core.front.feedback_ohm.is_none()
        || core.front.arrangement == Arrangement::ReferenceOnNonInverting;
    level_ignores_source
        && !core.compensation.in_air_stream()
        && core.element.cooling_law().kings_form().is_some()
}

/// Whether a switching outcome trips at the quiet airflow.
fn trips_when_quiet(design: &Design, s: &Switching) -> bool {
    match (design.detector.trip_on, s) {
        (_, Switching::AlwaysTripped) => true,
        (TripDirection::Rising, Switching::At(u)) => {
            *u <= design.detector.background_airflow_m_per_s
        }
        (TripDirection::Falling, Switching::At(u)) => *u >= design.detector.normal_airflow_m_per_s,
        (_, Switching::Unsolved(_)) => true,
        (_, Switching::NeverTrips) => false,
    }
}

/// Whether it trips inside the band.
fn in_band(design: &Design, s: &Switching) -> bool {
    let (lo, hi) = design.detector.trip_band_m_per_s;
    matches!(s, Switching::At(u) if *u >= lo && *u <= hi)
}

/// One trial from its draws.
fn trial(cx: &Context, index: u64, z: &[f64; N]) -> TrialRow {
    let design = cx.design;
    let b = build_of(cx, z);
    let ambient_k = cx.ambient_mid_k + cx.tol[7] * z[7];
    let input_v = cx.input_mid_v + cx.tol[8] * z[8];
    // Printed setting, drawn condition (offset drift only off the bench
    // ambient, as in the verdict).
    let (printed, _) = switching(
        cx,
        &b,
        ambient_k,
        (input_v, 1.0),
        cx.core.trimmer_x,
        b.offset_v,
        false,
    );
    let needed = bench_position(cx, &b);
    let trimmable = needed.is_some_and(|x| (0.0..=1.0).contains(&x));
    let x = needed.map_or(cx.core.trimmer_x, |x| x.clamp(0.0, 1.0));
    let (mut false_trip, mut out_of_band) = (false, false);
    for &t in &cx.ambient_ends {
        let at_bench_ambient = t == design.ambient.nominal_k;
        let dv = if at_bench_ambient { 0.0 } else { b.offset_v };
        for &(v, r) in &cx.supply_ends {
            // The bench condition itself: a build trimmed there trips on
            // target (see `bench_trip_is_target`).
            if trimmable && cx.bench_trip_is_target && at_bench_ambient && (v, r) == cx.bench_supply
            {
                continue;
            }
            let (trip, _) = switching(cx, &b, t, (v, r), x, dv, false);
            false_trip |= trips_when_quiet(design, &trip);
            out_of_band |= !in_band(design, &trip);
        }
    }
    TrialRow {
        trial: index,
        draws: *z,
        ambient_c: ambient_k - 273.15,
        trip_airflow_m_per_s: printed.airflow(),
        tripped_throughout: printed == Switching::AlwaysTripped,
        trimmable,
        false_trip,
        out_of_band,
    }
}

/// Running statistics of a set of trials (mergeable in a fixed order).
#[derive(Debug, Clone)]
struct Stats {
    n: u64,
    histogram: Vec<u32>,
    low: u64,
    high: u64,
    trimmable: u64,
    false_trip: u64,
    out_of_band: u64,
    // Sums for the linear shares, over trials that switch.
    m: u64,
    sz: [f64; N],
    szz: [f64; N],
    szu: [f64; N],
    su: f64,
    suu: f64,
}

fn bins() -> usize {
    let (lo, hi) = HISTOGRAM_RANGE_M_PER_S;
    ((hi / lo).log10() * BINS_PER_DECADE as f64).round() as usize
}

impl Stats {
    fn new() -> Self {
        Self {
            n: 0,
            histogram: vec![0; bins()],
            low: 0,
            high: 0,
            trimmable: 0,
            false_trip: 0,
            out_of_band: 0,
            m: 0,
            sz: [0.0; N],
            szz: [0.0; N],
            szu: [0.0; N],
            su: 0.0,
            suu: 0.0,
        }
    }

    fn add(&mut self, row: &TrialRow, rising: bool) {
        self.n += 1;
        self.trimmable += u64::from(row.trimmable);
        self.false_trip += u64::from(row.false_trip);
        self.out_of_band += u64::from(row.out_of_band);
        let (lo, _) = HISTOGRAM_RANGE_M_PER_S;
        match row.trip_airflow_m_per_s {
            Some(u) => {
                let k = ((u / lo).log10() * BINS_PER_DECADE as f64).floor();
                if k < 0.0 {
                    self.low += 1;
                } else if k as usize >= self.histogram.len() {
                    self.high += 1;
                } else {
                    self.histogram[k as usize] += 1;
                }
                self.m += 1;
                self.su += u;
                self.suu += u * u;
                for i in 0..N {
                    let z = row.draws[i];
                    self.sz[i] += z;
                    self.szz[i] += z * z;
                    self.szu[i] += z * u;
                }
            }
            // Never switching ranks below every airflow when it is tripped
            // throughout on a rising trip, above otherwise.
            None => {
                if rising == row.tripped_throughout {
                    self.low += 1
                } else {
                    self.high += 1
                }
            }
        }
    }

    fn merge(&mut self, o: &Stats) {
        self.n += o.n;
        for (a, b) in self.histogram.iter_mut().zip(&o.histogram) {
            *a += b;
        }
        self.low += o.low;
        self.high += o.high;
        self.trimmable += o.trimmable;
        self.false_trip += o.false_trip;
        self.out_of_band += o.out_of_band;
        self.m += o.m;
        for i in 0..N {
            self.sz[i] += o.sz[i];
            self.szz[i] += o.szz[i];
            self.szu[i] += o.szu[i];
        }
        self.su += o.su;
        self.suu += o.suu;
    }

    /// The q-quantile from the histogram (bin's geometric middle), `None`
    /// where it falls among trials that never switch.
    fn quantile(&self, q: f64) -> Option<f64> {
        let target = (q * self.n as f64).ceil().max(1.0) as u64;
        let mut seen = self.low;
        if seen >= target {
            return None;
        }
        let (lo, _) = HISTOGRAM_RANGE_M_PER_S;
        for (k, &c) in self.histogram.iter().enumerate() {
            seen += u64::from(c);
            if seen >= target {
                let mid = (k as f64 + 0.5) / BINS_PER_DECADE as f64;
                return Some(lo * 10f64.powf(mid));
            }
        }
        None
    }

    /// The q-quantile in words: the airflow, or what the never-switching
    /// trials at that rank do.
    fn quantile_text(&self, q: f64, low_tail: &str, high_tail: &str) -> String {
        match self.quantile(q) {
            Some(u) => format!("{u:.3} m/s"),
            None => {
                let target = (q * self.n as f64).ceil().max(1.0) as u64;
                if target <= self.low {
                    low_tail.into()
                } else {
                    high_tail.into()
                }
            }
        }
    }

    /// The fine histogram merged into at most [`DISPLAY_BINS`] bars over
    /// the bins that hold trials.
    fn display_bins(&self) -> Vec<HistogramBin> {
        let Some(first) = self.histogram.iter().position(|&c| c > 0) else {
            return Vec::new();
        };
        let last = self.histogram.iter().rposition(|&c| c > 0).unwrap_or(first);
        let span = last - first + 1;
        let per = span.div_ceil(DISPLAY_BINS);
        let (lo, _) = HISTOGRAM_RANGE_M_PER_S;
        let edge = |k: usize| lo * 10f64.powf(k as f64 / BINS_PER_DECADE as f64);
        (first..=last)
            .step_by(per)
            .map(|k| {
                let end = (k + per).min(last + 1);
                HistogramBin {
                    from_m_per_s: edge(k),
                    to_m_per_s: edge(end),
                    trials: self.histogram[k..end].iter().map(|&c| u64::from(c)).sum(),
                }
            })
            .collect()
    }

    fn shares(&self) -> Vec<Contribution> {
        let m = self.m as f64;
        if self.m < 2 {
            return Vec::new();
        }
        let var_u = self.suu / m - (self.su / m).powi(2);
        let r2: [f64; N] = std::array::from_fn(|i| {
            let var_z = self.szz[i] / m - (self.sz[i] / m).powi(2);
            let cov = self.szu[i] / m - (self.sz[i] / m) * (self.su / m);
            if var_z > 0.0 && var_u > 0.0 {
                cov * cov / (var_z * var_u)
            } else {
                0.0
            }
        });
        let total: f64 = r2.iter().sum();
        let mut out: Vec<Contribution> = (0..N)
            .filter(|&i| r2[i] > 0.0 && total > 0.0)
            .map(|i| Contribution {
                parameter: PARAMETERS[i].into(),
                share: r2[i] / total,
            })
            .collect();
        out.sort_by(|a, b| b.share.total_cmp(&a.share));
        out
    }
}

/// The draws of chunk `c`: its own ChaCha8 stream keyed by (seed, c).
fn chunk_rows(cx: &Context, opts: &SpreadOptions, c: u64, keep: bool) -> (Stats, Vec<TrialRow>) {
    let mut key = [0u8; 32];
    key[..8].copy_from_slice(&opts.seed.to_le_bytes());
    key[8..16].copy_from_slice(&c.to_le_bytes());
    let mut rng = ChaCha8Rng::from_seed(key);
    let first = c * CHUNK_TRIALS;
    let last = (first + CHUNK_TRIALS).min(opts.trials);
    let rising = cx.design.detector.trip_on == TripDirection::Rising;
    let mut stats = Stats::new();
    let mut rows = Vec::new();
    for i in first..last {
        let mut z = [0.0; N];
        for (k, zk) in z.iter_mut().enumerate() {
            // Ambient and supply over their ranges: always uniform.
            let dist = if (7..=8).contains(&k) {
                SpreadDistribution::Uniform
            } else {
                cx.design.spread.distribution
            };
            *zk = draw(&mut rng, dist);
            if cx.tol[k] == 0.0 {
                *zk = 0.0;
            }
        }
        let row = trial(cx, i, &z);
        stats.add(&row, rising);
        if keep {
            rows.push(row);
        }
    }
    (stats, rows)
}

/// The worst case over the vertices of the tolerance box (and the cooling
/// tolerance's ends), with the trimmer at its printed setting.
fn worst_case(design: &Design, core: &SizedCore, cx: &Context) -> WorstCase {
    let grid = corners::evaluate(design, core);
    let retrimmable = grid
        .trims
        .iter()
        .all(|t| t.needed.is_some_and(|x| (0.0..=1.0).contains(&x)));
    let sites = corners::sites(design);
    let mut w = WorstCase {
        retrimmable,
        ..WorstCase::default()
    };
    let (mut t_lo, mut t_hi, mut r_lo, mut r_hi) = (
        Some(f64::INFINITY),
        Some(f64::NEG_INFINITY),
        Some(f64::INFINITY),
        Some(f64::NEG_INFINITY),
    );
    let rising = design.detector.trip_on == TripDirection::Rising;
    let cooling: &[f64] = if cx.tol[6] > 0.0 {
        &[-1.0, 1.0]
    } else {
        &[0.0]
    };
    let regs: &[f64] = if cx.tol[9] > 0.0 {
        &[-1.0, 1.0]
    } else {
        &[0.0]
    };
    let fold = |lo: &mut Option<f64>, hi: &mut Option<f64>, s: &Switching| match s {
        Switching::At(u) => {
            if let Some(l) = lo.as_mut() {
                *l = l.min(*u);
            }
            if let Some(h) = hi.as_mut() {
                *h = h.max(*u);
            }
        }
        // Tripped throughout lies below every airflow on a rising trip.
        Switching::AlwaysTripped if rising => *lo = None,
        Switching::AlwaysTripped => *hi = None,
        Switching::NeverTrips if rising => *hi = None,
        Switching::NeverTrips => *lo = None,
        Switching::Unsolved(_) => {
            *lo = None;
            *hi = None;
        }
    };
    for b in &grid.builds {
        for &zc in cooling {
            for &zr in regs {
                let mut z = [0.0; N];
                z[0] = (b.element - 1.0) / cx.tol[0].max(f64::MIN_POSITIVE);
                z[1] = (b.drive - 1.0) / cx.tol[1].max(f64::MIN_POSITIVE);
                z[2] = (b.top - 1.0) / cx.tol[2].max(f64::MIN_POSITIVE);
                z[3] = (b.trimmer - 1.0) / cx.tol[3].max(f64::MIN_POSITIVE);
                z[4] = (b.bottom - 1.0) / cx.tol[4].max(f64::MIN_POSITIVE);
                for k in 0..3 {
                    z[10 + k] = (b.comp[k] - 1.0) / cx.tol[10 + k].max(f64::MIN_POSITIVE);
                }
                z[6] = zc;
                z[9] = zr;
                let build = build_of(cx, &z);
                for site in &sites {
                    let offsets: &[f64] =
                        if site.ambient_k == design.ambient.nominal_k || cx.tol[5] == 0.0 {
                            &[0.0]
                        } else {
                            &[-1.0, 1.0]
                        };
                    for &zo in offsets {
                        let (trip, release) = switching(
                            cx,
                            &build,
                            site.ambient_k,
                            (site.input_v, site.regulated_factor),
                            core.trimmer_x,
                            zo * cx.tol[5],
                            true,
                        );
                        fold(&mut t_lo, &mut t_hi, &trip);
                        if let Some(release) = release {
                            fold(&mut r_lo, &mut r_hi, &release);
                        }
                        w.conditions += 1;
                    }
                }
            }
        }
    }
    let finite = |x: Option<f64>| x.filter(|v| v.is_finite());
    w.trip_airflow_min_m_per_s = finite(t_lo);
    w.trip_airflow_max_m_per_s = finite(t_hi);
    w.release_airflow_min_m_per_s = finite(r_lo);
    w.release_airflow_max_m_per_s = finite(r_hi);
    w
}

/// Run the worst case and the Monte Carlo. `progress` is called with the
/// trials done after each batch; `rows` receives every trial in order
/// when given (for `--trials-csv`).
pub fn spread(
    design: &Design,
    core: &SizedCore,
    opts: SpreadOptions,
    progress: &(dyn Fn(u64) + Sync),
    mut rows: Option<&mut dyn FnMut(&TrialRow)>,
) -> SpreadReport {
    let tol = tolerances(design);
    let mut ambient_ends = vec![
        design.ambient.min_k,
        design.ambient.nominal_k,
        design.ambient.max_k,
    ];
    ambient_ends.dedup();
    let mut input_ends = vec![
        design.supply.input_min_v,
        design.supply.input_v,
        design.supply.input_max_v,
    ];
    input_ends.dedup();
    let regulation_ends = match design.supply.regulator {
        Some(r) if r.regulation > 0.0 => vec![1.0 - r.regulation, 1.0, 1.0 + r.regulation],
        _ => vec![1.0],
    };
    let cx = Context {
        design,
        core,
        tol,
        sigma: tripped_sign(design, core),
        ambient_mid_k: 0.5 * (design.ambient.min_k + design.ambient.max_k),
        input_mid_v: 0.5 * (design.supply.input_min_v + design.supply.input_max_v),
        ambient_ends,
        supply_ends: supply_ends(design, &input_ends, &regulation_ends),
        bench_supply: (design.supply.input_v, 1.0),
        bench_trip_is_target: target_is_safe(design) && bench_trip_is_target(core),
    };
    let chunks = opts.trials.div_ceil(CHUNK_TRIALS);
    let keep = rows.is_some();
    let mut total = Stats::new();
    let mut start = 0;
    while start < chunks {
        let end = (start + BATCH_CHUNKS).min(chunks);
        let batch: Vec<(Stats, Vec<TrialRow>)> = (start..end)
            .into_par_iter()
            .map(|c| chunk_rows(&cx, &opts, c, keep))
            .collect();
        for (stats, chunk) in &batch {
            total.merge(stats);
            if let Some(sink) = rows.as_mut() {
                for r in chunk {
                    sink(r);
                }
            }
        }
        progress(total.n);
        start = end;
    }
    let n = total.n.max(1) as f64;
    let worst = worst_case(design, core, &cx);
    let trimmable_share = total.trimmable as f64 / n;
    let false_trip_share = total.false_trip as f64 / n;
    let s = design.spread;
    let units = [
        "%", "%", "%", "%", "%", "V", "%", "°C", "V", "%", "%", "%", "%",
    ];
    let tolerances = (0..N)
        .map(|i| ToleranceRow {
            parameter: PARAMETERS[i].into(),
            plus_minus: if units[i] == "%" {
                100.0 * tol[i]
            } else {
                tol[i]
            },
            unit: units[i].into(),
        })
        .collect();
    SpreadReport {
        schema_version: crate::report::SCHEMA_VERSION,
        tool_version: env!("CARGO_PKG_VERSION").to_string(),
        design_file: design.design_file.clone(),
        title: design.title.clone(),
        trials: total.n,
        seed: opts.seed,
        distribution: s.distribution.name().into(),
        tolerances,
        ambient_range_c: [design.ambient.min_k - 273.15, design.ambient.max_k - 273.15],
        input_range_v: [design.supply.input_min_v, design.supply.input_max_v],
        target_airflow_m_per_s: design.detector.trip_airflow_m_per_s,
        band_m_per_s: [
            design.detector.trip_band_m_per_s.0,
            design.detector.trip_band_m_per_s.1,
        ],
        trimmer_position_percent: 100.0 * core.trimmer_x,
        trip_airflow_quantiles_m_per_s: Quantiles {
            p01: total.quantile(0.01),
            p05: total.quantile(0.05),
            p50: total.quantile(0.50),
            p95: total.quantile(0.95),
            p99: total.quantile(0.99),
        },
        trip_airflow_quantiles_text: {
            let (low, high) = if design.detector.trip_on == TripDirection::Rising {
                ("always tripped", "never trips")
            } else {
                ("never trips", "always tripped")
            };
            [0.01, 0.05, 0.5, 0.95, 0.99].map(|q| total.quantile_text(q, low, high))
        },
        quantile_resolution: HISTOGRAM_RESOLUTION,
        trip_airflow_histogram: total.display_bins(),
        never_switches_share: (total.n - total.m) as f64 / n,
        worst_case: worst,
        trimmable_share,
        false_trip_share,
        out_of_band_share: total.out_of_band as f64 / n,
        contributions: total.shares(),
        min_trimmable: s.min_trimmable,
        max_false_trip: s.max_false_trip,
        passed: trimmable_share >= s.min_trimmable && false_trip_share <= s.max_false_trip,
    }
}
