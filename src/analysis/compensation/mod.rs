//! Ambient compensation of the reference: a part in one leg of the
//! reference divider whose resistance follows the ambient, so that the
//! switching level follows the sense voltage the element gives at the trip
//! airflow as the room warms or cools.
//!
//! - **Twin** (a Wheatstone bridge): an unheated twin of the sensing element
//!   (the same resistance law, its own resistance) at the bottom of the
//!   reference divider, below the fixed bottom resistor (the "pad"), so the
//!   reference arm is rail → top → trimmer → pad → twin → ground beside the
//!   sensing arm rail → series resistor → element → ground. The twin sits in
//!   the same air as the element and is solved as an element of its own,
//!   driven from the rail through the rest of its arm, so its small
//!   self-heating at every airflow and condition is included.
//! - **Thermistor**: an NTC (beta law, `physics::thermistor`) with a
//!   linearising resistor across it, in the leg whose change moves the
//!   reference the right way (top for a metal element, whose sense voltage
//!   rises with ambient). It sits on the board at the ambient, warmed by its
//!   own dissipation through its dissipation constant (MIL-PRF-23648
//!   definition: power over body-temperature rise).
//!
//! The divider's other parts keep their meaning; a [`Compensator`] turns
//! the divider's fixed values into the divider at a condition
//! ([`Compensator::front_at`]), and every analysis takes its switching
//! levels through [`Reference`].

pub mod sizing;

use crate::circuit::divider::Divider;
use crate::circuit::frontend::{FrontEnd, OutputState};
use crate::drive::Drive;
use crate::element::{Element, Environment};
use crate::physics::thermistor::BetaThermistor;
use crate::solve::operating_point;

use super::switching::{switching_at, Switching};

/// Which leg of the reference divider holds the compensating network.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Leg {
    /// Between the rail and the trimmer.
    Top,
    /// Between the trimmer and ground.
    Bottom,
}

impl Leg {
    /// In words.
    pub fn name(self) -> &'static str {
        match self {
            Leg::Top => "top (rail side)",
            Leg::Bottom => "bottom (ground side)",
        }
    }
}

/// The unheated twin element.
#[derive(Debug, Clone)]
pub struct Twin {
    /// The twin: the sensing element's laws with its own resistance.
    pub element: Element,
    /// Which leg it sits in (the bottom for a twin of the same law, whose
    /// resistance moves the same way as the element's).
    pub leg: Leg,
}

/// The NTC thermistor with its linearising resistor across it.
#[derive(Debug, Clone, Copy)]
pub struct ThermistorNetwork {
    /// The thermistor (beta law, R at 25 °C).
    pub law: BetaThermistor,
    /// The linearising resistor in parallel, ohm.
    pub parallel_ohm: f64,
    /// Its dissipation constant, W/K.
    pub dissipation_w_per_k: f64,
    /// Which leg it sits in.
    pub leg: Leg,
}

impl ThermistorNetwork {
    /// Resistance of the pair at thermistor temperature `t_k`:
    /// `R_T·R_p/(R_T + R_p)` (parallel resistors).
    pub fn resistance_ohm(&self, t_k: f64) -> f64 {
        let rt = self.law.resistance_ohm(t_k);
        rt * self.parallel_ohm / (rt + self.parallel_ohm)
    }

    /// d/dT of the pair: `R_p²/(R_T + R_p)²·dR_T/dT` (differentiating the
    /// parallel combination).
    pub fn derivative_ohm_per_k(&self, t_k: f64) -> f64 {
        let rt = self.law.resistance_ohm(t_k);
        let s = self.parallel_ohm / (rt + self.parallel_ohm);
        s * s * self.law.derivative_ohm_per_k(t_k)
    }
}

/// The compensating part of one build.
#[derive(Debug, Clone, Default)]
// One compensator per design or tolerance build, moved rarely: the twin's
// element inline is simpler than a box (clippy's size lint).
#[allow(clippy::large_enum_variant)]
pub enum Compensator {
    /// A fixed-ratio divider.
    #[default]
    None,
    /// An unheated twin element.
    Twin(Twin),
    /// An NTC with a linearising resistor.
    Thermistor(ThermistorNetwork),
}

/// The state of the compensating part at one condition.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PartState {
    /// Its temperature, K.
    pub temperature_k: f64,
    /// Its resistance (for the thermistor: the pair's), ohm.
    pub resistance_ohm: f64,
    /// Power it dissipates, W.
    pub power_w: f64,
}

/// A thermistor whose self-heating balance has no root within this rise
/// over ambient runs away, K.
const THERMISTOR_RUNAWAY_K: f64 = 1000.0;

impl Compensator {
    /// The part at tolerance factors `[a, b, c]`: the twin's resistance or
    /// the thermistor's R25 (a), the thermistor's beta (b), its linearising
    /// resistor (c).
    pub fn with_factors(&self, f: [f64; 3]) -> Self {
        match self {
            Compensator::None => Compensator::None,
            Compensator::Twin(t) => Compensator::Twin(Twin {
                element: t
                    .element
                    .with_resistance_law(t.element.resistance_law().scaled(f[0])),
                leg: t.leg,
            }),
            Compensator::Thermistor(n) => Compensator::Thermistor(ThermistorNetwork {
                law: BetaThermistor::new(
                    n.law.r0_ohm() * f[0],
                    n.law.t0_k(),
                    n.law.beta_k() * f[1],
                )
                .unwrap_or(n.law),
                parallel_ohm: n.parallel_ohm * f[2],
                ..*n
            }),
        }
    }

    /// Whether there is a compensating part.
    pub fn is_some(&self) -> bool {
        !matches!(self, Compensator::None)
    }

    /// The leg it sits in.
    pub fn leg(&self) -> Option<Leg> {
        match self {
            Compensator::None => None,
            Compensator::Twin(t) => Some(t.leg),
            Compensator::Thermistor(n) => Some(n.leg),
        }
    }

    /// Whether its resistance depends on the airflow (the twin sits in the
    /// air stream; the thermistor on the board).
    pub fn in_air_stream(&self) -> bool {
        matches!(self, Compensator::Twin(_))
    }

    /// The part's state in the divider `d` (fixed parts only) on a
    /// reference rail of `rail_v`, at ambient and airflow. The wiper's and
    /// the feedback's currents are small against the divider's and are
    /// left out of its heating.
    pub fn state(
        &self,
        d: &Divider,
        rail_v: f64,
        env: &Environment,
        airflow_m_per_s: f64,
    ) -> Option<PartState> {
        match self {
            Compensator::None => None,
            Compensator::Twin(t) => {
                // The twin is driven from the rail through the rest of its
                // arm: a series-resistor drive of its own.
                let drive = Drive::SeriesResistor {
                    rail_v,
                    series_ohm: d.total_ohm(),
                };
                let law = t.element.resistance_law();
                Some(
                    match operating_point(&t.element, &drive, env, airflow_m_per_s) {
                        Ok(p) => PartState {
                            temperature_k: p.temperature_k,
                            resistance_ohm: p.resistance_ohm,
                            power_w: p.power_w,
                        },
                        // No steady state (impossible for a sensibly sized
                        // twin): taken at ambient; the self-heating check
                        // reports the twin as running away.
                        Err(_) => PartState {
                            temperature_k: f64::INFINITY,
                            resistance_ohm: law.resistance_ohm(env.ambient_k),
                            power_w: drive.power_w(law.resistance_ohm(env.ambient_k)),
                        },
                    },
                )
            }
            Compensator::Thermistor(n) => {
                // Its temperature: T = T_a + P(T)/δ (the dissipation
                // constant's definition), P = V_pair²/R_T, solved by Brent's
                // method on [T_a, T_a + 1000 K]; beyond that it runs away.
                let at = |t: f64| {
                    let r = n.resistance_ohm(t);
                    let i = rail_v / (d.total_ohm() + r);
                    let v = i * r;
                    (r, v * v / n.law.resistance_ohm(t))
                };
                let f = |t: f64| t - env.ambient_k - at(t).1 / n.dissipation_w_per_k;
                let hi = env.ambient_k + THERMISTOR_RUNAWAY_K;
                let t = if f(hi) > 0.0 {
                    crate::roots::brent(f, env.ambient_k, hi).map_or(f64::INFINITY, |r| r.x)
                } else {
                    f64::INFINITY
                };
                let (r, p) = if t.is_finite() {
                    at(t)
                } else {
                    at(env.ambient_k)
                };
                Some(PartState {
                    temperature_k: t,
                    resistance_ohm: r,
                    power_w: p,
                })
            }
        }
    }

    /// The front end with the compensating part in its leg at a condition.
    pub fn front_at(&self, front: &FrontEnd, env: &Environment, airflow_m_per_s: f64) -> FrontEnd {
        let Some(s) = self.state(&front.divider, front.reference_rail_v, env, airflow_m_per_s)
        else {
            return *front;
        };
        let mut d = front.divider;
        match self.leg() {
            Some(Leg::Top) => d.top_ohm += s.resistance_ohm,
            _ => d.bottom_ohm += s.resistance_ohm,
        }
        FrontEnd {
            divider: d,
            ..*front
        }
    }
}

/// The sensing side at one condition: the element, its drive, the air.
#[derive(Debug, Clone, Copy)]
pub struct Sensing<'a> {
    /// The element of this build.
    pub element: &'a Element,
    /// Its drive at this condition's rail.
    pub drive: &'a Drive,
    /// The air.
    pub env: &'a Environment,
}

/// The reference side of one build: the front end with its fixed parts at
/// this condition's rail, the compensating part, the trimmer setting and
/// the sense node's source resistance.
#[derive(Debug, Clone, Copy)]
pub struct Reference<'a> {
    /// The front end (fixed parts, rail of this condition).
    pub front: FrontEnd,
    /// The compensating part of this build.
    pub comp: &'a Compensator,
    /// Trimmer setting, 0 … 1.
    pub x: f64,
    /// The sense node's source resistance, ohm.
    pub sense_source_ohm: f64,
}

/// Fixed-point steps on the airflow for a twin in the air stream: the
/// level moves with the airflow only through the twin's self-heating (a few
/// percent of a few percent), so each step shrinks the error by two orders
/// of magnitude or more.
const TWIN_AIRFLOW_STEPS: usize = 12;

impl Reference<'_> {
    /// The sense voltage at which the comparator switches out of `state`
    /// at ambient `env` and airflow `airflow_m_per_s`.
    pub fn level(&self, env: &Environment, airflow_m_per_s: f64, state: OutputState) -> f64 {
        self.comp
            .front_at(&self.front, env, airflow_m_per_s)
            .switching_sense_v(self.x, state, self.sense_source_ohm)
    }

    /// Where the output switches out of `state`, with an offset `offset_v`
    /// referred to the sense node; `hint` is an airflow near the answer.
    /// With a twin in the air stream the level depends on the airflow
    /// through the twin's self-heating: solved by fixed-point steps on the
    /// airflow; where the level is never crossed, the twin is taken in
    /// still air, where it runs warmest.
    pub fn switching(
        &self,
        s: &Sensing<'_>,
        state: OutputState,
        offset_v: f64,
        hint: f64,
        sigma: f64,
    ) -> Switching {
        let at = |u: f64| {
            let level = self.level(s.env, u, state) + offset_v;
            switching_at(s.element, s.drive, s.env, level, u.max(hint * 1e-3), sigma)
        };
        if !self.comp.in_air_stream() {
            return at(hint);
        }
        let mut u = hint;
        let mut last = at(u);
        for _ in 0..TWIN_AIRFLOW_STEPS {
            match last.airflow() {
                Some(next) if (next - u).abs() <= 1e-12 * (1.0 + u.abs()) => return last,
                Some(next) => {
                    u = next.max(0.0);
                    last = at(u);
                }
                None => return at(0.0),
            }
        }
        last
    }
}
