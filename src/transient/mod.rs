//! Time: the element's lumped thermal model with the drive and the
//! comparator, integrated in time.
//!
//! The sensing element is one temperature with one heat capacity (lumped
//! capacitance, Incropera 6th ed. §5.2):
//!
//! ```text
//! C·dT/dt = P_elec(T) − P_loss(T, U(t))
//! ```
//!
//! with P_elec from the drive (Joule's law) and P_loss from the element's
//! cooling law at the airflow of the moment (quasi-steady convection: the
//! boundary layer of a fine wire settles in milliseconds, far faster than
//! the wire). A twin in the reference divider has the same equation with
//! its own drive (the rest of its arm). A hold-off capacitor on the
//! reference node adds that node's voltage as a state:
//! C_h·dv/dt = (v_th − v)/r_th + (v_o − v)/R_o (Kirchhoff's current law;
//! the second term only where the feedback enters that node).
//!
//! The comparator is ideal and instantaneous: its output sinks when
//! V+ < V−. Each switching time is located by bisection on the integrator's
//! own step from the last accepted point (to 1e-10 s), so the output edges
//! are as exact as the solution.

pub mod dopri;

use crate::analysis::compensation::Compensator;
use crate::circuit::frontend::{millman, Arrangement, FrontEnd, OutputState};
use crate::drive::Drive;
use crate::element::{Element, Environment};
use dopri::{State, Tolerances, MAX_STATE};

/// How the airflow goes with time.
#[derive(Debug, Clone, PartialEq)]
pub enum Airflow {
    /// Constant, m/s.
    Constant(f64),
    /// `from` until 0, then `to` until `back_at_s`, then `from` again.
    Step {
        /// Before and after, m/s.
        from: f64,
        /// During, m/s.
        to: f64,
        /// When it falls back, s.
        back_at_s: f64,
    },
    /// A puff from `base` to `peak` lasting `duration_s` from t = 0.
    Puff {
        /// Before and after, m/s.
        base: f64,
        /// Peak, m/s.
        peak: f64,
        /// Duration, s.
        duration_s: f64,
        /// Half-sine (true) or rectangular.
        half_sine: bool,
    },
    /// A table of (time s, airflow m/s), linear between rows, held at the
    /// ends.
    Table(Vec<(f64, f64)>),
}

impl Airflow {
    /// The airflow at time `t`, m/s.
    pub fn at(&self, t: f64) -> f64 {
        match self {
            Airflow::Constant(u) => *u,
            Airflow::Step {
                from,
                to,
                back_at_s,
            } => {
                if (0.0..*back_at_s).contains(&t) {
                    *to
                } else {
                    *from
                }
            }
            Airflow::Puff {
                base,
                peak,
                duration_s,
                half_sine,
            } => {
                if !(0.0..*duration_s).contains(&t) {
                    *base
                } else if *half_sine {
                    base + (peak - base) * (std::f64::consts::PI * t / duration_s).sin()
                } else {
                    *peak
                }
            }
            Airflow::Table(rows) => {
                let i = rows.partition_point(|r| r.0 <= t);
                match (i, rows.len()) {
                    (_, 0) => 0.0,
                    (0, _) => rows[0].1,
                    (i, n) if i >= n => rows[n - 1].1,
                    (i, _) => {
                        let (t0, u0) = rows[i - 1];
                        let (t1, u1) = rows[i];
                        u0 + (u1 - u0) * (t - t0) / (t1 - t0)
                    }
                }
            }
        }
    }

    /// Times where the airflow jumps (the integrator stops there so no step
    /// straddles a discontinuity).
    fn breaks(&self) -> Vec<f64> {
        match self {
            Airflow::Constant(_) => Vec::new(),
            Airflow::Step { back_at_s, .. } => vec![*back_at_s],
            Airflow::Puff { duration_s, .. } => vec![*duration_s],
            Airflow::Table(rows) => rows.iter().map(|r| r.0).collect(),
        }
    }
}

/// A hold-off capacitor on the reference node.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HoldOff {
    /// Capacitance, F.
    pub capacitance_f: f64,
    /// Whether its other end goes to the reference rail (else to ground):
    /// at power-on it holds the node there.
    pub to_rail: bool,
}

/// The circuit as the simulation sees it.
#[derive(Debug, Clone)]
pub struct Circuit<'a> {
    /// The sensing element.
    pub element: &'a Element,
    /// Its drive.
    pub drive: Drive,
    /// Ambient air.
    pub env: Environment,
    /// The front end (fixed divider parts, this rail).
    pub front: FrontEnd,
    /// The compensating part.
    pub comp: &'a Compensator,
    /// Trimmer setting.
    pub x: f64,
    /// The output state that means "tripped".
    pub active: OutputState,
    /// A hold-off capacitor, if any.
    pub hold_off: Option<HoldOff>,
}

/// What happened at a switching time.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum EventKind {
    /// The output is active from the start.
    ActiveAtStart,
    /// The output became active.
    Trips,
    /// The output returned to idle.
    Releases,
}

impl EventKind {
    /// In words (also the JSON value).
    pub fn name(self) -> &'static str {
        match self {
            EventKind::ActiveAtStart => "active at start",
            EventKind::Trips => "trips",
            EventKind::Releases => "releases",
        }
    }
}

/// A switching time.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Event {
    /// Time, s.
    pub time_s: f64,
    /// What happened.
    pub kind: EventKind,
}

/// One point of the time series.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sample {
    /// Time, s.
    pub time_s: f64,
    /// Airflow, m/s.
    pub airflow_m_per_s: f64,
    /// Element temperature, K.
    pub element_k: f64,
    /// Sense voltage, V.
    pub sense_v: f64,
    /// The reference input's voltage, V.
    pub reference_v: f64,
    /// Whether the output is active.
    pub active: bool,
}

/// A whole run.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Run {
    /// Where the integration had to stop before the end (its step fell
    /// below 1e-12 s), s; `None` when it reached the end.
    pub stopped_at_s: Option<f64>,
    /// Switching times.
    pub events: Vec<Event>,
    /// The time series at every accepted step and every event.
    pub samples: Vec<Sample>,
}

impl Run {
    /// Total time the output was active, s.
    pub fn active_s(&self) -> f64 {
        let mut total = 0.0;
        let mut since = None;
        for e in &self.events {
            match e.kind {
                EventKind::ActiveAtStart | EventKind::Trips => since = Some(e.time_s),
                EventKind::Releases => {
                    if let Some(s) = since.take() {
                        total += e.time_s - s;
                    }
                }
            }
        }
        if let (Some(s), Some(last)) = (since, self.samples.last()) {
            total += last.time_s - s;
        }
        total
    }

    /// The last time the sense voltage lies farther than `band_v` from
    /// `settled_v`, interpolated between samples (0 when it never does).
    pub fn settle_time_s(&self, settled_v: f64, band_v: f64) -> f64 {
        let out = |s: &Sample| (s.sense_v - settled_v).abs() > band_v;
        match self.samples.iter().rposition(out) {
            None => 0.0,
            Some(i) if i + 1 >= self.samples.len() => self.samples[i].time_s,
            Some(i) => {
                let (a, b) = (&self.samples[i], &self.samples[i + 1]);
                let da = (a.sense_v - settled_v).abs() - band_v;
                let db = (b.sense_v - settled_v).abs() - band_v;
                if da == db {
                    b.time_s
                } else {
                    a.time_s + (b.time_s - a.time_s) * da / (da - db)
                }
            }
        }
    }
}

/// No compensating part: what a circuit with its thermistor folded into the
/// divider carries.
static NO_PART: Compensator = Compensator::None;

/// Steps of the bisection that locates a switching time.
const EVENT_BISECTIONS: usize = 60;

impl Circuit<'_> {
    fn n(&self) -> usize {
        2 + usize::from(self.hold_off.is_some())
    }

    /// The circuit with a thermistor folded into the divider's fixed
    /// values. It sits on the board, not in the air stream, so at a run's
    /// fixed ambient its (self-heated) resistance is constant: solved once
    /// here rather than at every step.
    fn folded(&self) -> Circuit<'_> {
        if !matches!(self.comp, Compensator::Thermistor(_)) {
            return self.clone();
        }
        Circuit {
            front: self.comp.front_at(&self.front, &self.env, 0.0),
            comp: &NO_PART,
            ..self.clone()
        }
    }

    /// The reference node's Thevenin source with any twin at `t_twin`.
    fn reference_source(&self, t_twin: f64) -> (f64, f64) {
        let mut d = self.front.divider;
        if let Compensator::Twin(t) = self.comp {
            d.bottom_ohm += t.element.resistance_law().resistance_ohm(t_twin);
        }
        d.thevenin(self.front.reference_rail_v, self.x)
    }

    /// The comparator's inputs (V+, V−) and the sense voltage.
    fn inputs(&self, y: &State, state: OutputState) -> (f64, f64, f64) {
        let law = self.element.resistance_law();
        let r = law.resistance_ohm(y[0]);
        let sense = self.drive.sense_v(r);
        let src = self.drive.sense_source_ohm(r);
        let (v_th, r_th) = self.reference_source(y[1]);
        let fe = &self.front;
        let reference = match self.hold_off {
            Some(_) => y[2],
            None => match (fe.arrangement, fe.feedback_ohm) {
                (Arrangement::ReferenceOnNonInverting, Some(rf)) => {
                    let (vo, ro) = fe.output_source(state, rf);
                    millman(v_th, r_th, vo, ro)
                }
                _ => v_th,
            },
        };
        match fe.arrangement {
            Arrangement::ReferenceOnNonInverting => (reference, sense, sense),
            Arrangement::SenseOnNonInverting => {
                let vp = match fe.feedback_ohm {
                    Some(rf) => {
                        let (vo, ro) = fe.output_source(state, rf);
                        millman(sense, src + fe.input_ohm, vo, ro)
                    }
                    None => sense,
                };
                (vp, reference, sense)
            }
        }
    }

    /// The state the comparator's inputs call for, given the present one
    /// (its output sinks when V+ < V−).
    fn called_for(&self, y: &State, state: OutputState) -> OutputState {
        let (vp, vn, _) = self.inputs(y, state);
        if vp < vn {
            OutputState::Low
        } else {
            OutputState::High
        }
    }

    fn rhs(&self, airflow: &Airflow, t: f64, y: &State, state: OutputState) -> State {
        let mut d = [0.0; MAX_STATE];
        let c = self.element.heat_capacity_j_per_k();
        let u = airflow.at(t).max(0.0);
        let law = self.element.resistance_law();
        let cooling = self.element.cooling_law();
        let r = law.resistance_ohm(y[0]);
        d[0] = (self.drive.power_w(r) - cooling.heat_loss_w(y[0], u, &self.env)) / c;
        if let Compensator::Twin(tw) = self.comp {
            let rt = tw.element.resistance_law().resistance_ohm(y[1]);
            let i = self.front.reference_rail_v / (self.front.divider.total_ohm() + rt);
            d[1] = (i * i * rt - tw.element.cooling_law().heat_loss_w(y[1], u, &self.env))
                / tw.element.heat_capacity_j_per_k();
        }
        if let Some(h) = self.hold_off {
            let (v_th, r_th) = self.reference_source(y[1]);
            let mut i = (v_th - y[2]) / r_th;
            if let (Arrangement::ReferenceOnNonInverting, Some(rf)) =
                (self.front.arrangement, self.front.feedback_ohm)
            {
                let (vo, ro) = self.front.output_source(state, rf);
                i += (vo - y[2]) / ro;
            }
            d[2] = i / h.capacitance_f;
        }
        d
    }

    /// The initial state: element (and twin) at `t0_k`, a hold-off node
    /// at the rail or ground (a discharged capacitor at power-on).
    pub fn power_on_state(&self, t0_k: f64) -> State {
        let mut y = [t0_k, t0_k, 0.0, 0.0];
        if let Some(h) = self.hold_off {
            y[2] = if h.to_rail {
                self.front.reference_rail_v
            } else {
                0.0
            };
        }
        y
    }

    /// The steady state at airflow `u` (element and twin solved, the
    /// hold-off node at its steady level).
    pub fn steady_state(&self, u: f64) -> Option<State> {
        self.folded().steady_state_folded(u)
    }

    fn steady_state_folded(&self, u: f64) -> Option<State> {
        let p = crate::solve::operating_point(self.element, &self.drive, &self.env, u).ok()?;
        let mut y = [p.temperature_k, self.env.ambient_k, 0.0, 0.0];
        if let Some(s) = self.comp.state(
            &self.front.divider,
            self.front.reference_rail_v,
            &self.env,
            u,
        ) {
            if matches!(self.comp, Compensator::Twin(_)) {
                y[1] = s.temperature_k;
            }
        }
        if self.hold_off.is_some() {
            // Idle output: the node where the divider and the feedback meet.
            let (v_th, r_th) = self.reference_source(y[1]);
            y[2] = match (self.front.arrangement, self.front.feedback_ohm) {
                (Arrangement::ReferenceOnNonInverting, Some(rf)) => {
                    let (vo, ro) = self.front.output_source(self.active.other(), rf);
                    millman(v_th, r_th, vo, ro)
                }
                _ => v_th,
            };
        }
        Some(y)
    }

    /// Integrate from `y0` at t = 0 to `t_end`, starting idle (or wherever
    /// the inputs put the output at t = 0), recording every switching time.
    pub fn run(&self, airflow: &Airflow, y0: State, t_end: f64, h_max: f64) -> Run {
        self.folded().run_folded(airflow, y0, t_end, h_max)
    }

    fn run_folded(&self, airflow: &Airflow, y0: State, t_end: f64, h_max: f64) -> Run {
        let n = self.n();
        let tol = Tolerances {
            rtol: 1e-9,
            atol: [1e-7, 1e-7, 1e-10, 1e-10],
            h_max,
        };
        let idle = self.active.other();
        let st = std::cell::Cell::new(idle);
        let mut events = Vec::new();
        let mut samples = Vec::new();
        let mut y = y0;
        if self.called_for(&y, st.get()) != st.get() {
            st.set(st.get().other());
            events.push(Event {
                time_s: 0.0,
                kind: EventKind::ActiveAtStart,
            });
        }
        let sample = |t: f64, y: &State, state: OutputState| {
            let (vp, vn, sense) = self.inputs(y, state);
            let reference = match self.front.arrangement {
                Arrangement::ReferenceOnNonInverting => vp,
                Arrangement::SenseOnNonInverting => vn,
            };
            Sample {
                time_s: t,
                airflow_m_per_s: airflow.at(t),
                element_k: y[0],
                sense_v: sense,
                reference_v: reference,
                active: state == self.active,
            }
        };
        samples.push(sample(0.0, &y, st.get()));
        let mut breaks = airflow.breaks();
        breaks.retain(|&b| b > 0.0 && b < t_end);
        breaks.push(t_end);
        breaks.sort_by(f64::total_cmp);
        let mut t = 0.0;
        let mut h = (h_max * 1e-3).max(1e-6);
        let mut f = |tt: f64, yy: &State| self.rhs(airflow, tt, yy, st.get());
        let mut tol = tol;
        for &stop in &breaks {
            let mut k = f(t, &y);
            // A short segment (a brief puff) gets steps a twentieth of its
            // length; longer ones keep the run's largest step.
            tol.h_max = h_max.min((stop - t) / 20.0).max(1e-9);
            h = h.min(tol.h_max);
            while t < stop - 1e-12 {
                let hh = h.min(stop - t);
                let (y1, k1, err) = dopri::step(&mut f, n, t, &y, &k, hh, &tol);
                if !(err.is_finite()) || err > 1.0 {
                    h = dopri::next_h(hh, if err.is_finite() { err } else { 1e6 }, &tol);
                    if h < 1e-12 {
                        // Cannot proceed: stop the run where it is.
                        return Run {
                            stopped_at_s: Some(t),
                            events,
                            samples,
                        };
                    }
                    continue;
                }
                let state = st.get();
                if self.called_for(&y1, state) != state {
                    // A switching time inside this step: bisect on the
                    // integrator's own step from the last accepted point.
                    let (mut lo, mut hi) = (0.0, hh);
                    for _ in 0..EVENT_BISECTIONS {
                        let mid = 0.5 * (lo + hi);
                        let (ym, _, _) = dopri::step(&mut f, n, t, &y, &k, mid, &tol);
                        if self.called_for(&ym, state) != state {
                            hi = mid;
                        } else {
                            lo = mid;
                        }
                        if hi - lo < 1e-10 {
                            break;
                        }
                    }
                    let (ye, _, _) = dopri::step(&mut f, n, t, &y, &k, hi, &tol);
                    t += hi;
                    y = ye;
                    let now = state.other();
                    st.set(now);
                    events.push(Event {
                        time_s: t,
                        kind: if now == self.active {
                            EventKind::Trips
                        } else {
                            EventKind::Releases
                        },
                    });
                    samples.push(sample(t, &y, now));
                    k = f(t, &y);
                    continue;
                }
                t += hh;
                y = y1;
                k = k1;
                samples.push(sample(t, &y, state));
                h = dopri::next_h(hh, err, &tol);
            }
            t = stop;
        }
        Run {
            stopped_at_s: None,
            events,
            samples,
        }
    }
}
