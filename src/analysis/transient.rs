//! Scenarios in time on the sized design (`crate::transient` integrates):
//! power-on from a cold element, a step of airflow and back, a puff, and
//! a recorded airflow history; and the hold-off capacitor that keeps a
//! power-on from raising a false alarm.

use super::size::SizedCore;
use crate::design::model::{Design, HoldOffSpec, TripDirection};
use crate::eseries::ESeries;
use crate::transient::{Airflow, Circuit, Event, EventKind, HoldOff, Run};

/// Margin on the hold-off capacitor over the smallest one that removes the
/// false alarm: twice (draftwire's choice, no source), then the next E6
/// value up.
pub const HOLD_OFF_MARGIN: f64 = 2.0;

/// Range the hold-off search covers, F.
const HOLD_OFF_RANGE_F: (f64, f64) = (1e-9, 1e-2);

/// The airflow at which the output must stay idle: the background airflow
/// for a rising trip, the normal airflow for a falling one.
pub fn quiet_airflow(design: &Design) -> f64 {
    match design.detector.trip_on {
        TripDirection::Rising => design.detector.background_airflow_m_per_s,
        TripDirection::Falling => design.detector.normal_airflow_m_per_s,
    }
}

/// The sized circuit at ambient `ambient_k`, nominal rails.
pub fn circuit(core: &SizedCore, ambient_k: f64, hold_off: Option<HoldOff>) -> Circuit<'_> {
    Circuit {
        element: &core.element,
        drive: core.drive,
        env: crate::element::Environment {
            ambient_k,
            ..core.env
        },
        front: core.front,
        comp: &core.compensation,
        x: core.trimmer_x,
        active: super::size::active_state(core.stage),
        hold_off,
    }
}

/// Time horizon and largest step of a run: long enough for the slowest
/// warm-up (60 lumped time constants, at least 5 s, at most an hour),
/// steps of at most a tenth of a time constant so the samples draw the
/// curve.
pub fn horizon(core: &SizedCore) -> (f64, f64) {
    let tau = core.still_air.time_constant_s.max(1e-4);
    ((60.0 * tau).clamp(5.0, 3600.0), 0.1 * tau)
}

/// A power-on run and what it means.
#[derive(Debug, Clone, PartialEq)]
pub struct PowerOn {
    /// Ambient, K.
    pub ambient_k: f64,
    /// Airflow held during the run, m/s.
    pub airflow_m_per_s: f64,
    /// The run.
    pub run: Run,
    /// Time the output is falsely active, s.
    pub false_alarm_s: f64,
    /// Time until the sense voltage stays within half the hysteresis band
    /// of its settled value, s.
    pub settle_s: f64,
    /// Settled sense voltage, V.
    pub settled_sense_v: f64,
    /// Half the hysteresis band in volts (the settling window), V.
    pub window_v: f64,
}

/// Power on with a cold element at `ambient_k`, at the quiet airflow.
pub fn power_on(
    design: &Design,
    core: &SizedCore,
    ambient_k: f64,
    hold_off: Option<HoldOff>,
) -> PowerOn {
    let c = circuit(core, ambient_k, hold_off);
    let u = quiet_airflow(design);
    let (t_end, h_max) = horizon(core);
    let run = c.run(
        &Airflow::Constant(u),
        c.power_on_state(ambient_k),
        t_end,
        h_max,
    );
    let settled = c
        .steady_state(u)
        .map(|y| c.element.resistance_law().resistance_ohm(y[0]))
        .map_or(core.still_air.sense_v, |r| c.drive.sense_v(r));
    let src = core.sense_source_ohm();
    let fe =
        core.compensation
            .front_at(&core.front, &core.env, design.detector.trip_airflow_m_per_s);
    let band = (fe.switching_sense_v(core.trimmer_x, core.idle_state, src)
        - fe.switching_sense_v(core.trimmer_x, core.idle_state.other(), src))
    .abs();
    // Without hysteresis, 1 % of the settled value (draftwire's choice).
    let window = if band > 0.0 {
        0.5 * band
    } else {
        0.01 * settled.abs()
    };
    PowerOn {
        ambient_k,
        airflow_m_per_s: u,
        false_alarm_s: run.active_s(),
        settle_s: run.settle_time_s(settled, window),
        settled_sense_v: settled,
        window_v: window,
        run,
    }
}

/// The worst power-on false alarm over the nominal and the coldest
/// ambient, s.
fn worst_false_alarm(design: &Design, core: &SizedCore, hold_off: Option<HoldOff>) -> f64 {
    [design.ambient.nominal_k, design.ambient.min_k]
        .iter()
        .map(|&t| power_on(design, core, t, hold_off).false_alarm_s)
        .fold(0.0, f64::max)
}

/// Why no hold-off was sized.
#[derive(Debug, Clone, PartialEq)]
pub enum HoldOffChoice {
    /// None needed: no false alarm beyond the grace.
    NotNeeded,
    /// Given or sized.
    Fitted(HoldOff),
    /// The file asks for none.
    NotWanted,
    /// Even the largest capacitor tried does not remove it.
    Impossible,
}

/// The hold-off the design gets: none when no false alarm exceeds the
/// grace; the file's; or the smallest capacitor (either end, rail or
/// ground) that removes it, times the margin, up to the next E6 value.
pub fn choose_hold_off(design: &Design, core: &SizedCore) -> HoldOffChoice {
    let grace = design.detector.power_on_grace_s;
    match design.detector.power_on_hold_off {
        HoldOffSpec::None => return HoldOffChoice::NotWanted,
        HoldOffSpec::Fixed(c) => {
            // The given capacitance at whichever end holds the output idle
            // the longer.
            let at = |to_rail| HoldOff {
                capacitance_f: c,
                to_rail,
            };
            let rail = worst_false_alarm(design, core, Some(at(true)));
            let ground = worst_false_alarm(design, core, Some(at(false)));
            return HoldOffChoice::Fitted(at(rail <= ground));
        }
        HoldOffSpec::Auto => {}
    }
    if worst_false_alarm(design, core, None) <= grace {
        return HoldOffChoice::NotNeeded;
    }
    // The answer is the smallest E6 value v ≥ margin·c*, c* the smallest
    // capacitor that removes the false alarm (a larger one holds the output
    // idle longer). Since v ≥ margin·c* exactly when a capacitor of
    // v/margin removes it, a binary search over the E6 ladder finds v in
    // about six power-on pairs a side, where bisecting c* itself took 30.
    let (lo, hi) = HOLD_OFF_RANGE_F;
    let ladder: Vec<f64> = ESeries::E6
        .values_between(
            HOLD_OFF_MARGIN * lo,
            ESeries::E6.at_or_above(HOLD_OFF_MARGIN * hi),
        )
        .collect();
    let removes = |c: f64, to_rail: bool| {
        worst_false_alarm(
            design,
            core,
            Some(HoldOff {
                capacitance_f: c,
                to_rail,
            }),
        ) <= grace
    };
    // Per side (rail first): the ladder index of its value, or none when
    // even the top of the range does not remove the false alarm.
    let pick = |to_rail: bool| -> Option<usize> {
        if !removes(hi, to_rail) {
            return None;
        }
        // The top rung removes it (it is above `hi`); find the first that
        // does. Rungs below `a` are not known to fail: `a` starts one below
        // the ladder, so the bottom rung (a tiny capacitor, a stiff run) is
        // tried only when the search narrows to it.
        let (mut a, mut b) = (-1_isize, ladder.len() as isize - 1);
        while b - a > 1 {
            let m = (a + b) / 2;
            if removes(ladder[m as usize] / HOLD_OFF_MARGIN, to_rail) {
                b = m;
            } else {
                a = m;
            }
        }
        Some(b as usize)
    };
    let (rail, ground) = (pick(true), pick(false));
    let to_rail = match (rail, ground) {
        (None, None) => return HoldOffChoice::Impossible,
        (Some(_), None) => true,
        (None, Some(_)) => false,
        (Some(r), Some(g)) if r != g => r < g,
        // The same value either side: the side whose own smallest capacitor
        // is smaller, i.e. the one with the more margin (rail on a tie).
        (Some(i), Some(_)) => {
            let floor = if i == 0 {
                lo
            } else {
                ladder[i - 1] / HOLD_OFF_MARGIN
            };
            rail_needs_no_more(floor, ladder[i] / HOLD_OFF_MARGIN, |c, side| {
                removes(c, side)
            })
        }
    };
    let index = if to_rail { rail } else { ground };
    match index {
        None => HoldOffChoice::Impossible,
        Some(i) => HoldOffChoice::Fitted(HoldOff {
            capacitance_f: ladder[i],
            to_rail,
        }),
    }
}

/// Relative width at which two sides' smallest hold-off capacitors count as
/// equal (the search stops; draftwire's choice, no source).
const HOLD_OFF_TIE_REL: f64 = 1e-6;

/// Whether the rail side's smallest capacitor that removes the false alarm
/// is no larger than the ground side's, both known to lie in (`lo`, `hi`]:
/// both thresholds are bisected together (log scale) until their brackets
/// part, or are narrower than [`HOLD_OFF_TIE_REL`] (a tie: rail).
fn rail_needs_no_more(lo: f64, hi: f64, removes: impl Fn(f64, bool) -> bool) -> bool {
    let mut rail = (lo.ln(), hi.ln());
    let mut ground = rail;
    while rail.1 - rail.0 > HOLD_OFF_TIE_REL || ground.1 - ground.0 > HOLD_OFF_TIE_REL {
        if rail.1 <= ground.0 {
            return true;
        }
        if ground.1 <= rail.0 {
            return false;
        }
        for (bracket, to_rail) in [(&mut rail, true), (&mut ground, false)] {
            let m = 0.5 * (bracket.0 + bracket.1);
            if removes(m.exp(), to_rail) {
                bracket.1 = m;
            } else {
                bracket.0 = m;
            }
        }
    }
    rail.1 <= ground.1
}

/// The event table's times for a step from the quiet airflow to `to` and
/// back: (time to trip from the step, time to release from the fall back,
/// the run).
pub fn step(
    design: &Design,
    core: &SizedCore,
    to: f64,
    hold_off: Option<HoldOff>,
) -> (Option<f64>, Option<f64>, Run, f64) {
    let c = circuit(core, design.ambient.nominal_k, hold_off);
    let u0 = quiet_airflow(design);
    let (t_end, h_max) = horizon(core);
    // Held long enough to settle (half the horizon), then back.
    let back = 0.5 * t_end;
    let Some(y0) = c.steady_state(u0) else {
        return (None, None, Run::default(), back);
    };
    let run = c.run(
        &Airflow::Step {
            from: u0,
            to,
            back_at_s: back,
        },
        y0,
        t_end,
        h_max,
    );
    let trip = run
        .events
        .iter()
        .find(|e| e.kind == EventKind::Trips && e.time_s < back)
        .map(|e| e.time_s);
    let release = run
        .events
        .iter()
        .find(|e| e.kind == EventKind::Releases && e.time_s >= back)
        .map(|e| e.time_s - back);
    (trip, release, run, back)
}

/// A puff: the run and when it trips.
pub fn puff(
    design: &Design,
    core: &SizedCore,
    (peak, duration_s, half_sine): (f64, f64, bool),
    hold_off: Option<HoldOff>,
) -> (Option<f64>, Run) {
    let c = circuit(core, design.ambient.nominal_k, hold_off);
    let u0 = quiet_airflow(design);
    let (t_end, h_max) = horizon(core);
    let Some(y0) = c.steady_state(u0) else {
        return (None, Run::default());
    };
    let run = c.run(
        &Airflow::Puff {
            base: u0,
            peak,
            duration_s,
            half_sine,
        },
        y0,
        (duration_s * 4.0).max(0.25 * t_end).min(t_end),
        h_max,
    );
    let trip = run
        .events
        .iter()
        .find(|e| e.kind == EventKind::Trips)
        .map(|e| e.time_s);
    (trip, run)
}

/// Where the threshold search stops: 100× the trip airflow, at most
/// 100 m/s (rising), or still air (falling), m/s.
pub fn threshold_limit(design: &Design) -> f64 {
    match design.detector.trip_on {
        TripDirection::Rising => (100.0 * design.detector.trip_airflow_m_per_s).min(100.0),
        TripDirection::Falling => 0.0,
    }
}

/// The puff peak (a rise for a rising trip, a dip for a falling one) that
/// just trips a puff of this duration, by bisection between the quiet
/// airflow and [`threshold_limit`]; `None` when none does.
pub fn threshold_peak(
    design: &Design,
    core: &SizedCore,
    (duration_s, half_sine): (f64, bool),
    hold_off: Option<HoldOff>,
) -> Option<f64> {
    let u0 = quiet_airflow(design);
    let far = threshold_limit(design);
    let trips = |p: f64| {
        puff(design, core, (p, duration_s, half_sine), hold_off)
            .0
            .is_some()
    };
    if !trips(far) {
        return None;
    }
    let (mut quiet, mut tripping) = (u0, far);
    for _ in 0..40 {
        let mid = 0.5 * (quiet + tripping);
        if trips(mid) {
            tripping = mid;
        } else {
            quiet = mid;
        }
        if (tripping - quiet).abs() < 1e-4 * (1.0 + tripping.abs()) {
            break;
        }
    }
    Some(tripping)
}

/// A recorded airflow history: the run from the steady state at its first
/// airflow.
pub fn history(
    design: &Design,
    core: &SizedCore,
    rows: Vec<(f64, f64)>,
    hold_off: Option<HoldOff>,
) -> Run {
    let c = circuit(core, design.ambient.nominal_k, hold_off);
    let (_, h_max) = horizon(core);
    let t0 = rows.first().map_or(0.0, |r| r.0);
    let t_end = rows.last().map_or(0.0, |r| r.0) - t0;
    let shifted: Vec<(f64, f64)> = rows.iter().map(|&(t, u)| (t - t0, u)).collect();
    let u0 = shifted.first().map_or(0.0, |r| r.1);
    let Some(y0) = c.steady_state(u0) else {
        return Run::default();
    };
    let mut run = c.run(&Airflow::Table(shifted), y0, t_end.max(0.0), h_max);
    for e in &mut run.events {
        e.time_s += t0;
    }
    for s in &mut run.samples {
        s.time_s += t0;
    }
    run
}

/// Events as (time, kind name).
pub fn event_rows(events: &[Event]) -> Vec<(f64, &'static str)> {
    events.iter().map(|e| (e.time_s, e.kind.name())).collect()
}

/// Which scenario to run.
#[derive(Debug, Clone, PartialEq)]
pub enum Scenario {
    /// From a cold element, at the nominal and the coldest ambient.
    PowerOn,
    /// From the quiet airflow to this one and back, m/s.
    Step(f64),
    /// A puff to this peak (m/s) for this long (s), half-sine or
    /// rectangular.
    Puff {
        /// Peak, m/s.
        peak: f64,
        /// Duration, s.
        duration_s: f64,
        /// Half-sine (else rectangular).
        half_sine: bool,
    },
    /// An airflow history (time s, airflow m/s).
    History(Vec<(f64, f64)>),
}

/// An event row of the report.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct EventRow {
    /// Time, s.
    pub time_s: f64,
    /// "active at start", "trips" or "releases".
    pub kind: String,
    /// The ambient of the run, °C.
    pub ambient_c: f64,
}

/// The recommended power-on hold-off.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct HoldOffRow {
    /// Capacitance, F.
    pub capacitance_f: f64,
    /// Where it goes, in words.
    pub placement: String,
    /// Its time constant with the divider's source resistance, s.
    pub time_constant_s: f64,
    /// The false alarm with it fitted, worst of the nominal and coldest
    /// ambient, s.
    pub false_alarm_with_it_s: f64,
}

/// The `transient` report.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct TransientReport {
    /// Layout version.
    pub schema_version: u32,
    /// draftwire's version.
    pub tool_version: String,
    /// The design file.
    pub design_file: String,
    /// Title.
    pub title: String,
    /// `power-on`, `step`, `puff` or `airflow-file`.
    pub scenario: String,
    /// Whether the scenario's check passes (power-on: no false alarm beyond
    /// the grace with the design's hold-off; other scenarios: true).
    pub passed: bool,
    /// Switching times (power-on: without a hold-off capacitor).
    pub events: Vec<EventRow>,
    /// Power-on with the hold-off capacitor, nominal ambient (empty
    /// without one).
    pub events_with_hold_off: Vec<EventRow>,
    /// Power-on at the nominal ambient and the quiet airflow, without a
    /// hold-off: how long the output is falsely active, s (0 when never).
    pub false_alarm_s: Option<f64>,
    /// The same at the coldest ambient, s.
    pub false_alarm_coldest_s: Option<f64>,
    /// Power-on: time until the sense voltage stays within half the
    /// hysteresis band of its settled value, nominal ambient, s.
    pub settle_s: Option<f64>,
    /// The same at the coldest ambient, s.
    pub settle_coldest_s: Option<f64>,
    /// The settled sense voltage at the nominal ambient, V.
    pub settled_sense_v: Option<f64>,
    /// The accepted false-alarm time, s.
    pub power_on_grace_s: f64,
    /// The hold-off the design gets (sized, given) or `null`.
    pub hold_off: Option<HoldOffRow>,
    /// Step: time from the step to the trip, s.
    pub time_to_trip_s: Option<f64>,
    /// Step: time from the fall back to the release, s.
    pub time_to_release_s: Option<f64>,
    /// Puff: the smallest peak (toward tripping) that trips a puff of this
    /// duration, m/s.
    pub threshold_peak_m_per_s: Option<f64>,
    /// What to do, in words.
    pub recommendations: Vec<String>,
    /// How the runs were set up, in words.
    pub notes: Vec<String>,
}

fn rows(events: &[Event], ambient_k: f64) -> Vec<EventRow> {
    events
        .iter()
        .map(|e| EventRow {
            time_s: e.time_s,
            kind: e.kind.name().into(),
            ambient_c: ambient_k - 273.15,
        })
        .collect()
}

/// Where a hold-off capacitor goes, in words.
pub fn placement(h: &HoldOff) -> String {
    format!(
        "from the reference node (the trimmer's wiper) to {}: at power-on it holds the reference on the idle side while the element warms up",
        if h.to_rail {
            "the reference rail"
        } else {
            "ground"
        }
    )
}

/// The hold-off's time constant with the divider's source resistance at
/// the wiper, s.
pub fn hold_off_tau(core: &SizedCore, h: &HoldOff) -> f64 {
    let (_, r_th) = core
        .compensation
        .front_at(&core.front, &core.env, 0.0)
        .divider
        .thevenin(core.front.reference_rail_v, core.trimmer_x);
    r_th * h.capacitance_f
}

/// Run a scenario; also the runs themselves (for `--samples`).
pub fn report(
    design: &Design,
    core: &SizedCore,
    scenario: &Scenario,
) -> (TransientReport, Vec<Run>) {
    let mut r = TransientReport {
        schema_version: crate::report::SCHEMA_VERSION,
        tool_version: env!("CARGO_PKG_VERSION").to_string(),
        design_file: design.design_file.clone(),
        title: design.title.clone(),
        scenario: String::new(),
        passed: true,
        events: Vec::new(),
        events_with_hold_off: Vec::new(),
        false_alarm_s: None,
        false_alarm_coldest_s: None,
        settle_s: None,
        settle_coldest_s: None,
        settled_sense_v: None,
        power_on_grace_s: design.detector.power_on_grace_s,
        hold_off: None,
        time_to_trip_s: None,
        time_to_release_s: None,
        threshold_peak_m_per_s: None,
        recommendations: Vec::new(),
        notes: Vec::new(),
    };
    let u_q = quiet_airflow(design);
    let mut runs = Vec::new();
    let hold = choose_hold_off(design, core);
    let fitted = match hold {
        HoldOffChoice::Fitted(h) => Some(h),
        _ => None,
    };
    let with_cap = if fitted.is_some() {
        "; with the design's hold-off capacitor C1 in place"
    } else {
        ""
    };
    match scenario {
        Scenario::PowerOn => {
            r.scenario = "power-on".into();
            let nominal = power_on(design, core, design.ambient.nominal_k, None);
            let coldest = power_on(design, core, design.ambient.min_k, None);
            r.events = rows(&nominal.run.events, nominal.ambient_k);
            if design.ambient.min_k < design.ambient.nominal_k {
                r.events
                    .extend(rows(&coldest.run.events, coldest.ambient_k));
            }
            r.false_alarm_s = Some(nominal.false_alarm_s);
            r.false_alarm_coldest_s = Some(coldest.false_alarm_s);
            r.settle_s = Some(nominal.settle_s);
            r.settle_coldest_s = Some(coldest.settle_s);
            r.settled_sense_v = Some(nominal.settled_sense_v);
            r.notes.push(format!(
                "element and any twin start at the ambient, rails at nominal, nominal parts; airflow held at {u_q} m/s (the quiet airflow, where the output must stay idle); settled means within ±{:.2} mV (half the hysteresis band) of {:.4} V; the false alarms, settling times and edges above are without a hold-off capacitor",
                1e3 * nominal.window_v,
                nominal.settled_sense_v
            ));
            let worst = nominal.false_alarm_s.max(coldest.false_alarm_s);
            let grace = design.detector.power_on_grace_s;
            match hold {
                HoldOffChoice::NotNeeded => {
                    r.recommendations.push(if worst > 0.0 {
                        format!("the false alarm ({worst:.2} s) is within the accepted power_on_grace ({grace} s): no hold-off")
                    } else {
                        "no false alarm at power-on: no hold-off needed".into()
                    });
                }
                HoldOffChoice::NotWanted => {
                    r.passed = worst <= grace;
                    r.recommendations.push(format!(
                        "the design file asks for no hold-off (power_on_hold_off = \"none\"): the output is falsely active for up to {worst:.2} s after every power-on"
                    ));
                }
                HoldOffChoice::Impossible => {
                    r.passed = false;
                    r.recommendations.push(format!(
                        "no hold-off capacitor up to {} removes the {worst:.2} s false alarm: delay the load's supply instead, or accept it with power_on_grace",
                        crate::quantity::format_engineering(HOLD_OFF_RANGE_F.1, "F", 2)
                    ));
                }
                HoldOffChoice::Fitted(h) => {
                    let with = worst_false_alarm(design, core, Some(h));
                    r.passed = with <= grace;
                    let tau = hold_off_tau(core, &h);
                    let given = matches!(
                        design.detector.power_on_hold_off,
                        crate::design::model::HoldOffSpec::Fixed(_)
                    );
                    let how = if given {
                        "as the design file gives it".to_string()
                    } else {
                        format!("{HOLD_OFF_MARGIN}× the smallest that removes the false alarm, next E6 value up")
                    };
                    r.recommendations.push(format!(
                        "{} a {} capacitor {} (τ ≈ {} with the divider; {how}); with it the false alarm is {with:.3} s. The detector cannot trip for about 5τ after each power-on. An electrolytic's leakage (up to about 0.01·C·V, IEC 60384-4) flows into the divider and shifts the reference: choose a low-leakage part",
                        if given { "with" } else { "fit" },
                        crate::quantity::format_engineering(h.capacitance_f, "F", 2),
                        placement(&h),
                        crate::quantity::format_engineering(tau, "s", 3)
                    ));
                    if with > grace && given {
                        r.recommendations.push("the given capacitor does not remove the false alarm: leave power_on_hold_off as \"auto\" to have one sized".into());
                    }
                    r.hold_off = Some(HoldOffRow {
                        capacitance_f: h.capacitance_f,
                        placement: placement(&h),
                        time_constant_s: tau,
                        false_alarm_with_it_s: with,
                    });
                    let run = power_on(design, core, design.ambient.nominal_k, Some(h)).run;
                    r.events_with_hold_off = rows(&run.events, design.ambient.nominal_k);
                    runs.push(run);
                }
            }
            runs.insert(0, coldest.run);
            runs.insert(0, nominal.run);
        }
        Scenario::Step(to) => {
            r.scenario = "step".into();
            let (trip, release, run, back) = step(design, core, *to, fitted);
            r.events = rows(&run.events, design.ambient.nominal_k);
            r.time_to_trip_s = trip;
            r.time_to_release_s = release;
            r.notes.push(format!(
                "from the steady state at {u_q} m/s to {to} m/s at t = 0, back to {u_q} m/s at t = {back:.2} s; nominal ambient and rails{with_cap}"
            ));
            if trip.is_none() {
                r.notes.push(format!(
                    "it does not trip: {to} m/s lies on the idle side of the trip point"
                ));
            }
            runs.push(run);
        }
        Scenario::Puff {
            peak,
            duration_s,
            half_sine,
        } => {
            r.scenario = "puff".into();
            let (trip, run) = puff(design, core, (*peak, *duration_s, *half_sine), fitted);
            r.events = rows(&run.events, design.ambient.nominal_k);
            r.time_to_trip_s = trip;
            r.threshold_peak_m_per_s =
                threshold_peak(design, core, (*duration_s, *half_sine), fitted);
            let (what, which) = match design.detector.trip_on {
                TripDirection::Rising => ("puff", "the smallest peak"),
                TripDirection::Falling => ("dip", "the highest dip"),
            };
            r.notes.push(format!(
                "a {} {what} from {u_q} m/s to {peak} m/s lasting {duration_s} s from t = 0; the threshold is {which} that just trips a {what} of this shape and duration, searched {} {} m/s{with_cap}",
                if *half_sine { "half-sine" } else { "rectangular" },
                if design.detector.trip_on == TripDirection::Rising {
                    "up to"
                } else {
                    "down to"
                },
                threshold_limit(design)
            ));
            runs.push(run);
        }
        Scenario::History(rows_in) => {
            r.scenario = "airflow-file".into();
            let run = history(design, core, rows_in.clone(), fitted);
            r.events = rows(&run.events, design.ambient.nominal_k);
            r.notes.push(format!("from the steady state at the history's first airflow; linear between rows; nominal ambient and rails{with_cap}"));
            runs.push(run);
        }
    }
    if let Some(t) = runs.iter().find_map(|run| run.stopped_at_s) {
        r.passed = false;
        r.notes.push(format!(
            "the integration had to stop at t = {t:.6} s (its step fell below 1e-12 s): the figures after that are missing"
        ));
    }
    (r, runs)
}
