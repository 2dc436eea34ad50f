//! The worst combined condition: every build a batch of parts can give
//! (tolerance vertices), each trimmed on the bench at nominal ambient and
//! supply, then taken to every ambient end × supply end with the
//! comparator's offset drift at its worst sign.
//!
//! Vertices: all 2^k corners of the tolerance box of the parts that move
//! the trip point — the element's R0, the drive (series resistor or current
//! source), the divider's top, trimmer track and bottom, the compensating
//! part (a twin's resistance, or a thermistor's R25, beta and linearising
//! resistor) and where the unit's regulator sits — with k ≤ 9, so at most
//! 512 builds besides the nominal one, evaluated in parallel. A dimension with no tolerance
//! (or a pinned trimmer, which analyses the nominal parts only) adds no
//! vertices. The feedback and input resistors' tolerances move the
//! hysteresis band, not the trimmed trip point, and are left out.
//!
//! The comparator's input offset is trimmed out on the bench together with
//! everything else; away from the bench ambient it may drift by up to the
//! applicable offset limit (25 °C or full range), taken at both signs and
//! referred to the sense node.

use super::compensation::{Compensator, Reference, Sensing};
use super::size::{drive_with, element_rail, trimmer_position, SizedCore};
pub use super::switching::{switching_at, Switching};
use crate::circuit::divider::Divider;
use crate::circuit::frontend::FrontEnd;
use crate::design::model::{CompensationKind, Design, Rail, TripDirection};
use crate::drive::Drive;
use crate::element::{Element, Environment};
use crate::solve::operating_point;
use rayon::prelude::*;

/// One build: each part's value as a factor of its nominal value.
#[derive(Debug, Clone, PartialEq)]
pub struct Build {
    /// In words, e.g. "element −5 %, drive +5 %, top −5 %, trimmer +20 %, bottom −5 %".
    pub label: String,
    /// Element R0 factor.
    pub element: f64,
    /// Drive value factor.
    pub drive: f64,
    /// Divider top factor.
    pub top: f64,
    /// Trimmer track factor.
    pub trimmer: f64,
    /// Divider bottom factor.
    pub bottom: f64,
    /// Compensating part factors: the twin's resistance or the
    /// thermistor's R25; the thermistor's beta; its linearising resistor.
    pub comp: [f64; 3],
    /// The regulator's output as a factor of nominal: where this unit's
    /// own output sits (trimmed out on the bench; it moves by the
    /// regulation band around it in service).
    pub regulator: f64,
}

impl Build {
    fn nominal() -> Self {
        Self {
            label: "nominal parts".into(),
            element: 1.0,
            drive: 1.0,
            top: 1.0,
            trimmer: 1.0,
            bottom: 1.0,
            comp: [1.0; 3],
            regulator: 1.0,
        }
    }
}

/// One operating site: ambient and rail voltages.
#[derive(Debug, Clone, PartialEq)]
pub struct Site {
    /// In words, e.g. "5.0 °C, element rail 4.75 V, reference rail 4.75 V".
    pub label: String,
    /// Ambient, K.
    pub ambient_k: f64,
    /// Element rail, V (0 for a current drive).
    pub element_rail_v: f64,
    /// Reference rail, V.
    pub reference_rail_v: f64,
    /// Comparator rail, V.
    pub comparator_rail_v: f64,
    /// The input voltage, V.
    pub input_v: f64,
    /// The regulated rail's voltage as a factor of its nominal output (1
    /// without a regulator).
    pub regulated_factor: f64,
    /// The bench: nominal ambient and supply, where each build is trimmed.
    pub bench: bool,
}

/// A second, hotter stable state of the element.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HotState {
    /// Airflow, m/s.
    pub airflow_m_per_s: f64,
    /// Temperature of the hottest stable state, K.
    pub temperature_k: f64,
    /// Element current there, A.
    pub current_a: f64,
    /// Element resistance there, ohm.
    pub resistance_ohm: f64,
}

/// One build at one site with one offset sign.
#[derive(Debug, Clone, PartialEq)]
pub struct Outcome {
    /// Index into [`Grid::builds`].
    pub build: usize,
    /// Index into [`Grid::sites`].
    pub site: usize,
    /// Offset drift referred to the sense node, V.
    pub offset_v: f64,
    /// Trip (idle → tripped).
    pub trip: Switching,
    /// Release (tripped → idle).
    pub release: Switching,
}

/// A build's bench setting.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Trim {
    /// Trimmer position that puts this build on target (may lie outside
    /// 0 … 1 when the trimmer cannot reach; `None` when the target has no
    /// steady state).
    pub needed: Option<f64>,
    /// The setting used: `needed` clamped to the travel, or the pinned one.
    pub used: f64,
}

/// Every build, site and outcome.
#[derive(Debug, Clone, PartialEq)]
pub struct Grid {
    /// Builds; the first is the nominal one.
    pub builds: Vec<Build>,
    /// Bench settings, one per build.
    pub trims: Vec<Trim>,
    /// Sites; the first is the bench.
    pub sites: Vec<Site>,
    /// Outcomes, build-major.
    pub outcomes: Vec<Outcome>,
    /// Hot stable states found, with their build and site.
    pub hot_states: Vec<(usize, usize, HotState)>,
}

impl Grid {
    /// The condition of an outcome in words.
    pub fn condition(&self, o: &Outcome) -> String {
        let mut s = format!(
            "{}; {}",
            self.sites[o.site].label, self.builds[o.build].label
        );
        if o.offset_v != 0.0 {
            s.push_str(&format!("; offset drift {} mV", signed_mv(o.offset_v)));
        }
        s
    }
}

/// An offset in mV with a typographic minus, one decimal.
pub fn signed_mv(v: f64) -> String {
    format!("{}{:.1}", crate::quantity::sign_of(v), 1e3 * v.abs())
}

fn percent(f: f64) -> String {
    crate::quantity::format_signed(100.0 * (f - 1.0), 3)
}

/// Every build: the nominal one, then all vertices of the tolerance box.
pub fn builds(design: &Design) -> Vec<Build> {
    let mut out = vec![Build::nominal()];
    if design.detector.trimmer_position.is_some() {
        return out;
    }
    let t = design.detector.divider_tolerances;
    let c = &design.compensation;
    let (twin, ntc) = match c.kind {
        CompensationKind::Twin => (c.twin.tolerance, (0.0, 0.0, 0.0)),
        CompensationKind::Thermistor => (
            0.0,
            (
                c.thermistor.r25_tolerance,
                c.thermistor.beta_tolerance,
                t.top,
            ),
        ),
        _ => (0.0, (0.0, 0.0, 0.0)),
    };
    let dims: [(&str, f64); 9] = [
        ("element", design.element_tolerance),
        ("drive", design.drive_tolerance),
        ("top", t.top),
        ("trimmer", t.trimmer),
        ("bottom", t.bottom),
        (
            if twin > 0.0 { "twin" } else { "thermistor R25" },
            twin.max(ntc.0),
        ),
        ("thermistor beta", ntc.1),
        ("linearising", ntc.2),
        ("regulator", design.supply.regulator_offset_tolerance()),
    ];
    let active: Vec<usize> = (0..dims.len()).filter(|&i| dims[i].1 > 0.0).collect();
    for mask in 0..(1u32 << active.len()) {
        let mut f = [1.0; 9];
        let mut words = Vec::new();
        for (bit, &i) in active.iter().enumerate() {
            let sign = if mask & (1 << bit) != 0 { 1.0 } else { -1.0 };
            f[i] = 1.0 + sign * dims[i].1;
            words.push(format!("{} {} %", dims[i].0, percent(f[i])));
        }
        out.push(Build {
            label: words.join(", "),
            element: f[0],
            drive: f[1],
            top: f[2],
            trimmer: f[3],
            bottom: f[4],
            comp: [f[5], f[6], f[7]],
            regulator: f[8],
        });
    }
    out
}

/// Every site: the bench first, then each ambient (min, nominal, max) with
/// each pairing of rail ends (rails that are one rail move together).
pub fn sites(design: &Design) -> Vec<Site> {
    let s = &design.supply;
    let el = element_rail(design);
    let rr = design.detector.reference_rail;
    let cr = design.comparator.rail;
    let pick = |rail: Rail, end: Option<bool>| {
        let (lo, hi) = s.rail_in_service_v(rail);
        match end {
            None => s.rail_v(rail),
            Some(false) => lo,
            Some(true) => hi,
        }
    };
    // Independent rail groups: the input and the regulated rail.
    let uses_reg =
        s.regulator.is_some() && [el, Some(rr), Some(cr)].contains(&Some(Rail::Regulated));
    let uses_input = [el, Some(rr), Some(cr)].contains(&Some(Rail::Input)) || !uses_reg;
    let ends: &[Option<bool>] = &[None, Some(false), Some(true)];
    let mut out = Vec::new();
    let ambients = [
        design.ambient.nominal_k,
        design.ambient.min_k,
        design.ambient.max_k,
    ];
    for (ai, &ambient_k) in ambients.iter().enumerate() {
        if ai > 0 && ambient_k == design.ambient.nominal_k {
            continue;
        }
        for &ein in ends {
            for &ereg in ends {
                if (!uses_input && ein.is_some()) || (!uses_reg && ereg.is_some()) {
                    continue;
                }
                let end_of = |rail: Rail| match rail {
                    Rail::Input => ein,
                    Rail::Regulated if s.regulator.is_some() => ereg,
                    Rail::Regulated => ein,
                };
                let element_rail_v = el.map_or(0.0, |r| pick(r, end_of(r)));
                let reference_rail_v = pick(rr, end_of(rr));
                let comparator_rail_v = pick(cr, end_of(cr));
                let word = |e: Option<bool>| match e {
                    None => "nominal",
                    Some(false) => "low",
                    Some(true) => "high",
                };
                let mut label = format!("{:.1} °C", ambient_k - 273.15);
                if uses_input {
                    label.push_str(&format!(", input {}", word(ein)));
                }
                if uses_reg {
                    label.push_str(&format!(", regulated rail {}", word(ereg)));
                }
                out.push(Site {
                    label,
                    ambient_k,
                    element_rail_v,
                    reference_rail_v,
                    comparator_rail_v,
                    input_v: pick(Rail::Input, ein),
                    regulated_factor: s.regulator.map_or(1.0, |r| {
                        pick(Rail::Regulated, end_of(Rail::Regulated)) / r.output_v
                    }),
                    bench: ai == 0 && ein.is_none() && ereg.is_none(),
                });
            }
        }
    }
    // Drop repeated sites (a rail whose range is a point).
    let mut unique: Vec<Site> = Vec::new();
    for site in out {
        if !unique.iter().any(|u| {
            u.ambient_k == site.ambient_k
                && u.element_rail_v == site.element_rail_v
                && u.reference_rail_v == site.reference_rail_v
                && u.comparator_rail_v == site.comparator_rail_v
        }) {
            unique.push(site);
        }
    }
    unique
}

/// The parts of one build, ready to solve.
pub struct BuiltParts {
    /// The element with its R0 at the build's factor.
    pub element: Element,
    /// The drive value (ohm or A) at the build's factor.
    pub drive_value: f64,
    /// The divider at the build's factors.
    pub divider: Divider,
    /// The compensating part at the build's factors.
    pub comp: Compensator,
}

/// The parts of a build.
pub fn parts(core: &SizedCore, b: &Build) -> BuiltParts {
    let element = core
        .element
        .with_resistance_law(core.element.resistance_law().scaled(b.element));
    let d = core.front.divider;
    BuiltParts {
        element,
        drive_value: drive_value(core) * b.drive,
        divider: Divider {
            top_ohm: d.top_ohm * b.top,
            trimmer_ohm: d.trimmer_ohm * b.trimmer,
            bottom_ohm: d.bottom_ohm * b.bottom,
        },
        comp: core.compensation.with_factors(b.comp),
    }
}

/// The drive's chosen value (ohm or A).
pub fn drive_value(core: &SizedCore) -> f64 {
    match core.drive {
        Drive::SeriesResistor { series_ohm, .. } => series_ohm,
        Drive::ConstantCurrent { current_a } => current_a,
    }
}

/// Sign σ with tripped ⇔ σ·(V_sense − level) > 0 (see
/// `size::arrangement_for`).
pub fn tripped_sign(design: &Design, core: &SizedCore) -> f64 {
    core.sensitivity_v_per_m_per_s.signum()
        * if design.detector.trip_on == TripDirection::Rising {
            1.0
        } else {
            -1.0
        }
}

/// Evaluate every build at every site.
pub fn evaluate(design: &Design, core: &SizedCore) -> Grid {
    let builds = builds(design);
    let sites = sites(design);
    let u_t = design.detector.trip_airflow_m_per_s;
    let sigma = tripped_sign(design, core);
    let idle = core.idle_state;
    let offset = design.comparator.offset_v;
    let bench = sites
        .iter()
        .find(|s| s.bench)
        .cloned()
        .unwrap_or(sites[0].clone());
    // Builds are independent: each is trimmed and taken to every site on
    // its own, in parallel, and gathered back in build order.
    let one = |(bi, b): (usize, &Build)| {
        let mut outcomes = Vec::new();
        let mut hot_states = Vec::new();
        let p = parts(core, b);
        let front_at = |site: &Site| FrontEnd {
            divider: p.divider,
            reference_rail_v: unit_rail_v(
                design,
                b,
                Some(design.detector.reference_rail),
                site.reference_rail_v,
            ),
            ..core.front
        };
        let element_v =
            |site: &Site| unit_rail_v(design, b, element_rail(design), site.element_rail_v);
        // Bench: trim this build onto the target.
        let bench_env = Environment {
            ambient_k: bench.ambient_k,
            ..core.env
        };
        let bench_drive = drive_with(&design.drive, p.drive_value, element_v(&bench));
        let at_target = operating_point(&p.element, &bench_drive, &bench_env, u_t).ok();
        let src = at_target.map_or(0.0, |q| bench_drive.sense_source_ohm(q.resistance_ohm));
        let bench_front = p.comp.front_at(&front_at(&bench), &bench_env, u_t);
        let trim = match design.detector.trimmer_position {
            Some(x) => Trim {
                needed: at_target.map(|q| trimmer_position(&bench_front, idle, q.sense_v, src)),
                used: x,
            },
            None => {
                let needed =
                    at_target.map(|q| trimmer_position(&bench_front, idle, q.sense_v, src));
                Trim {
                    needed,
                    used: needed.map_or(0.5, |x| x.clamp(0.0, 1.0)),
                }
            }
        };
        for (si, site) in sites.iter().enumerate() {
            let env = Environment {
                ambient_k: site.ambient_k,
                ..core.env
            };
            let drive = drive_with(&design.drive, p.drive_value, element_v(site));
            let reference = Reference {
                front: front_at(site),
                comp: &p.comp,
                x: trim.used,
                sense_source_ohm: src,
            };
            let sensing = Sensing {
                element: &p.element,
                drive: &drive,
                env: &env,
            };
            // The nominal build is also shown without offset drift at every
            // site (the drift table's plain rows).
            let offsets: &[f64] = if site.ambient_k == bench.ambient_k || offset == 0.0 {
                &[0.0]
            } else if bi == 0 {
                &[0.0, -1.0, 1.0]
            } else {
                &[-1.0, 1.0]
            };
            for &sign in offsets {
                let dv = sign * offset;
                outcomes.push(Outcome {
                    build: bi,
                    site: si,
                    offset_v: dv,
                    trip: reference.switching(&sensing, idle, dv, u_t, sigma),
                    release: reference.switching(&sensing, idle.other(), dv, u_t, sigma),
                });
            }
            // A second stable state at the airflows the detector lives at.
            for u in [0.0, design.detector.normal_airflow_m_per_s, u_t] {
                if let Ok(q) = operating_point(&p.element, &drive, &env, u) {
                    if let Some(h) = hottest_other_stable(&p.element, &drive, &q) {
                        hot_states.push((
                            bi,
                            si,
                            HotState {
                                airflow_m_per_s: u,
                                ..h
                            },
                        ));
                    }
                }
            }
        }
        (trim, outcomes, hot_states)
    };
    let per_build: Vec<_> = builds.par_iter().enumerate().map(one).collect();
    let mut trims = Vec::with_capacity(builds.len());
    let mut outcomes = Vec::new();
    let mut hot_states = Vec::new();
    for (t, o, h) in per_build {
        trims.push(t);
        outcomes.extend(o);
        hot_states.extend(h);
    }
    Grid {
        builds,
        trims,
        sites,
        outcomes,
        hot_states,
    }
}

/// A rail's voltage for one unit: a regulated rail scaled by where this
/// unit's regulator sits; others as the site gives them.
pub fn unit_rail_v(design: &Design, b: &Build, rail: Option<Rail>, site_v: f64) -> f64 {
    if rail == Some(Rail::Regulated) && design.supply.regulator.is_some() {
        site_v * b.regulator
    } else {
        site_v
    }
}

/// The hottest stable root other than the cold-start one, if any.
fn hottest_other_stable(
    element: &Element,
    drive: &Drive,
    q: &crate::solve::OperatingPoint,
) -> Option<HotState> {
    let law = element.resistance_law();
    q.roots
        .iter()
        .filter(|&(t, stable)| stable && t > q.temperature_k + 1e-6)
        .map(|(t, _)| t)
        .fold(None, |best: Option<f64>, t| {
            Some(best.map_or(t, |b| b.max(t)))
        })
        .map(|t| {
            let r = law.resistance_ohm(t);
            HotState {
                airflow_m_per_s: q.airflow_m_per_s,
                temperature_k: t,
                current_a: drive.current_a(r),
                resistance_ohm: r,
            }
        })
}
