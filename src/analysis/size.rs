//! `size`: from a validated design to the sized core of the circuit — the
//! drive, the operating points, the reference divider and trimmer, the
//! hysteresis network — and the trip point they give.

use super::compensation::{sizing as comp_sizing, Compensator, Reference, Sensing};
use crate::circuit::divider::{Divider, DividerError};
use crate::circuit::frontend::{Arrangement, FrontEnd, OutputState};
use crate::circuit::hysteresis::{DEFAULT_SERIES_INPUT_OHM, MIN_FEEDBACK_TO_PULLUP_RATIO};
use crate::design::model::{
    CompensationKind, Design, DriveSpec, HysteresisSpec, OverheatTarget, Rail, Sizable, StageKind,
    TripDirection,
};
use crate::drive::Drive;
use crate::element::{Element, Environment};
use crate::eseries::format_rkm;
use crate::roots::{brent, brent_fallible};
use crate::solve::{
    airflow_for_sense, operating_point, sensitivity_v_per_m_per_s, OperatingPoint, SolveError,
};

/// Divider current aimed at when the file does not give one: large against
/// a comparator's input bias current (≥ 100×; common practice, no source)
/// and small against the element's current.
pub const DEFAULT_DIVIDER_CURRENT_A: f64 = 200e-6;

/// Why a design could not be sized: each is a failure of the design, not of
/// the input file.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SizeError {
    /// A solve failed.
    #[error("{context}: {source}")]
    Solve {
        /// Where.
        context: String,
        /// Why.
        source: SolveError,
    },
    /// The rail cannot push enough current for the wanted overheat.
    #[error(
        "the {rail} rail ({rail_v:.3} V) cannot drive the element to the wanted overheat: that needs {needed_v:.3} V \
         across the element alone ({current_a:.4} A at {resistance_ohm:.3} ohm); use a higher rail or ask for less overheat"
    )]
    RailTooLow {
        /// Rail name.
        rail: &'static str,
        /// Rail voltage.
        rail_v: f64,
        /// Voltage needed across the element.
        needed_v: f64,
        /// Current needed.
        current_a: f64,
        /// Element resistance at the wanted temperature.
        resistance_ohm: f64,
    },
    /// The wanted overheat lies outside the element law's range.
    #[error(
        "the wanted overheat puts the element at {resistance_ohm:.4} ohm, which its resistance law does not reach \
         above ambient and inside its valid range; ask for less overheat"
    )]
    OverheatUnreachable {
        /// Resistance asked for.
        resistance_ohm: f64,
    },
    /// The drive is `auto` but no overheat was asked for (the design-file
    /// validation normally catches this first).
    #[error("the drive is \"auto\" but the design gives no overheat_rise or overheat_ratio to size it for")]
    OverheatMissing,
    /// The reference divider cannot be sized.
    #[error("reference divider: {0}")]
    Divider(#[from] DividerError),
    /// Hysteresis cannot be sized.
    #[error("hysteresis: {0}")]
    Hysteresis(String),
    /// The ambient compensation cannot be sized.
    #[error("ambient compensation: {0}")]
    Compensation(String),
    /// The element loses no heat in still air, so no drive gives a
    /// still-air overheat.
    #[error(
        "the element loses no heat in still air (King's A = 0): any current heats it without bound there, so no drive can be sized for a still-air overheat; give A > 0 (a real wire always loses some heat by conduction, free convection and radiation) or a fixed drive"
    )]
    NoStillAirLoss,
}

fn solve_ctx(context: &str) -> impl Fn(SolveError) -> SizeError + '_ {
    move |source| SizeError::Solve {
        context: context.to_string(),
        source,
    }
}

/// The sized core: everything later analyses and renderers need.
#[derive(Debug, Clone)]
pub struct SizedCore {
    /// Air at nominal ambient.
    pub env: Environment,
    /// The element at nominal values.
    pub element: Element,
    /// The drive with its chosen values.
    pub drive: Drive,
    /// Exact drive value before snapping (ohm or A), when it was sized.
    pub drive_exact: Option<f64>,
    /// Operating point in still air at nominal ambient.
    pub still_air: OperatingPoint,
    /// Operating point at the target trip airflow.
    pub at_trip: OperatingPoint,
    /// Operating points for the table (0, ½, 1, 2 × trip).
    pub table: Vec<(String, OperatingPoint)>,
    /// Sensitivity dV/dU at the trip airflow, V per m/s.
    pub sensitivity_v_per_m_per_s: f64,
    /// The comparator front end as sized.
    pub front: FrontEnd,
    /// Exact ideal values before snapping: (top, trimmer, bottom) in ohm.
    pub divider_exact: Option<(f64, f64, f64)>,
    /// Exact feedback value before snapping.
    pub feedback_exact: Option<f64>,
    /// The comparator output node and the planned output stage (pull-up,
    /// its exact value, the output-high source).
    pub output: super::stage::OutputNode,
    /// Trimmer setting that puts the trip point on target (0 … 1, may lie
    /// outside when the trimmer cannot reach).
    pub trimmer_x: f64,
    /// Output state when not tripped.
    pub idle_state: OutputState,
    /// The resolved output stage.
    pub stage: StageKind,
    /// Trip airflow with the chosen trimmer setting, m/s (`None` when the
    /// output never switches at nominal conditions).
    pub trip_airflow_m_per_s: Option<f64>,
    /// Release airflow, m/s.
    pub release_airflow_m_per_s: Option<f64>,
    /// Trip at nominal conditions, with what happens when it never switches.
    pub trip: super::switching::Switching,
    /// Release at nominal conditions.
    pub release: super::switching::Switching,
    /// Airflows of the table at which the element has no steady state, with
    /// the reason.
    pub unsolved: Vec<(String, f64, String)>,
    /// Lowest and highest wiper ratio the tolerance and ambient corners need.
    pub needed_ratio: (f64, f64),
    /// Notes for the report (why the feedback sits where it does, …).
    pub notes: Vec<String>,
    /// The ambient compensation part (nominal values); the divider's fixed
    /// parts are in `front.divider`.
    pub compensation: Compensator,
    /// How the compensation was sized, in words.
    pub compensation_notes: Vec<String>,
}

impl SizedCore {
    /// The sense node's source resistance at the trip point, ohm.
    pub fn sense_source_ohm(&self) -> f64 {
        self.drive.sense_source_ohm(self.at_trip.resistance_ohm)
    }

    /// The nominal build's reference side, with its trimmer setting and the
    /// reference rail at `rail_v`.
    pub fn reference(&self, rail_v: f64) -> Reference<'_> {
        Reference {
            front: FrontEnd {
                reference_rail_v: rail_v,
                ..self.front
            },
            comp: &self.compensation,
            x: self.trimmer_x,
            sense_source_ohm: self.sense_source_ohm(),
        }
    }
}

/// Build the drive at given rail voltage from the design's drive kind and
/// its chosen value.
pub fn drive_with(spec: &DriveSpec, value: f64, rail_v: f64) -> Drive {
    match spec {
        DriveSpec::SeriesResistor { .. } => Drive::SeriesResistor {
            rail_v,
            series_ohm: value,
        },
        DriveSpec::ConstantCurrent { .. } => Drive::ConstantCurrent { current_a: value },
    }
}

/// The rail feeding the element, if any.
pub fn element_rail(design: &Design) -> Option<Rail> {
    match design.drive {
        DriveSpec::SeriesResistor { rail, .. } => Some(rail),
        DriveSpec::ConstantCurrent { .. } => None,
    }
}

/// The drive's chosen value (ohm or A) as in the design, sized if `auto`.
fn size_drive(design: &Design, env: &Environment) -> Result<(f64, Option<f64>), SizeError> {
    let element = &design.element;
    let law = element.resistance_law();
    let target = |overheat: &OverheatTarget| -> Result<f64, SizeError> {
        match *overheat {
            OverheatTarget::Rise(rise) => Ok(env.ambient_k + rise),
            OverheatTarget::Ratio(a) => {
                // The overheat ratio is the fractional change of resistance
                // from ambient: R_hot = R_amb·(1 + a) for a metal, and
                // R_hot = R_amb·(1 − a) for an NTC, whose resistance falls.
                let factor = if law.is_increasing() {
                    1.0 + a
                } else {
                    1.0 - a
                };
                let r = law.resistance_ohm(env.ambient_k) * factor;
                if factor <= 0.0 {
                    return Err(SizeError::OverheatUnreachable { resistance_ohm: r });
                }
                law.temperature_for_resistance(r)
                    .ok_or(SizeError::OverheatUnreachable { resistance_ohm: r })
            }
        }
        .and_then(|t| {
            let (_, hi) = law.valid_range_k();
            if t > env.ambient_k && t <= hi {
                Ok(t)
            } else {
                Err(SizeError::OverheatUnreachable {
                    resistance_ohm: law.resistance_ohm(t.min(hi)),
                })
            }
        })
    };
    let needed = |t: f64| {
        // Still-air heat loss at T fixes the power, hence the current: I = √(P/R).
        let r = law.resistance_ohm(t);
        let p = element.cooling_law().heat_loss_w(t, 0.0, env);
        ((p / r).sqrt(), r)
    };
    // An element that loses no heat in still air (King's A = 0 and nothing
    // else) runs away on any current there: no drive gives it a still-air
    // overheat.
    let still_loss = |t: f64| element.cooling_law().heat_loss_w(t, 0.0, env);
    match design.drive {
        DriveSpec::SeriesResistor {
            series_ohm: Sizable::Fixed(r),
            ..
        } => Ok((r, None)),
        DriveSpec::ConstantCurrent {
            current_a: Sizable::Fixed(i),
        } => Ok((i, None)),
        DriveSpec::SeriesResistor {
            series_ohm: Sizable::Auto,
            rail,
        } => {
            let t = target(design.overheat.as_ref().ok_or(SizeError::OverheatMissing)?)?;
            if still_loss(t).is_nan() || still_loss(t) <= 0.0 {
                return Err(SizeError::NoStillAirLoss);
            }
            let (i, r) = needed(t);
            let rail_v = design.supply.rail_v(rail);
            let rs = rail_v / i - r;
            if rs <= 0.0 {
                return Err(SizeError::RailTooLow {
                    rail: rail.name(),
                    rail_v,
                    needed_v: i * r,
                    current_a: i,
                    resistance_ohm: r,
                });
            }
            Ok((design.e_series.nearest(rs), Some(rs)))
        }
        DriveSpec::ConstantCurrent {
            current_a: Sizable::Auto,
        } => {
            let t = target(design.overheat.as_ref().ok_or(SizeError::OverheatMissing)?)?;
            if still_loss(t).is_nan() || still_loss(t) <= 0.0 {
                return Err(SizeError::NoStillAirLoss);
            }
            let (i, _) = needed(t);
            // A current source is set, not picked from a series: keep three
            // significant figures.
            let rounded = round_sig(i, 3);
            Ok((rounded, Some(i)))
        }
    }
}

/// Round to `digits` significant figures.
pub fn round_sig(x: f64, digits: usize) -> f64 {
    if x == 0.0 || !x.is_finite() {
        return x;
    }
    // Format then parse once, so the result is the decimal value exactly.
    format!("{:.*e}", digits.saturating_sub(1), x)
        .parse()
        .unwrap_or(x)
}

/// The output stage used (`auto` was resolved while reading the file); a
/// design without an `[output]` leaves the comparator output on its own.
pub fn resolve_stage(design: &Design) -> StageKind {
    design
        .output
        .as_ref()
        .map_or(StageKind::Direct, |o| o.stage)
}

/// Output state that makes the load active: the comparator sinks (low) for
/// a direct load or a PNP high-side switch; it releases (high) to turn on an
/// NPN low-side switch.
pub fn active_state(stage: StageKind) -> OutputState {
    match stage {
        StageKind::NpnLowSide => OutputState::High,
        _ => OutputState::Low,
    }
}

/// Which input gets which signal. Tripped means `σ·(V_sense − V_ref) > 0`,
/// with σ the sign of dV/dU for a rising trip (its negative for a falling
/// one). An open-collector comparator's output is low when V+ < V−.
pub fn arrangement_for(
    sensitivity: f64,
    direction: TripDirection,
    active: OutputState,
) -> Arrangement {
    let sigma = sensitivity.signum()
        * if direction == TripDirection::Rising {
            1.0
        } else {
            -1.0
        };
    // σ > 0: tripped when sense > ref. Output low when V+ < V−, so a low
    // active level wants sense on V− and the reference on V+.
    let sense_high_trips = sigma > 0.0;
    let active_low = active == OutputState::Low;
    if sense_high_trips == active_low {
        Arrangement::ReferenceOnNonInverting
    } else {
        Arrangement::SenseOnNonInverting
    }
}

fn row_label(k: f64) -> String {
    if k == 0.0 {
        "still air".into()
    } else if k == 1.0 {
        "trip".into()
    } else {
        format!("{k}×trip")
    }
}

/// Most times the divider's span is widened to cover its own parts'
/// tolerances.
const DIVIDER_WIDENINGS: usize = 8;

/// Wiper ratio needed for the trip sense level at the bench (nominal
/// ambient), across the element R0 (±tol), the drive (±tol) and the rails
/// (min, max; the same draw when the element and reference share a rail).
/// Corners without a steady state are left to the checks.
fn needed_ratio_span(
    design: &Design,
    drive_value: f64,
    env: &Environment,
) -> Result<(f64, f64), SizeError> {
    let u = design.detector.trip_airflow_m_per_s;
    let ref_rail = design.detector.reference_rail;
    let el_rail = element_rail(design);
    let (rlo, rhi) = design.supply.rail_range_v(ref_rail);
    let (elo, ehi) = match el_rail {
        Some(r) => design.supply.rail_range_v(r),
        None => (0.0, 0.0),
    };
    let shared = el_rail == Some(ref_rail);
    let mut k_min = f64::INFINITY;
    let mut k_max = f64::NEG_INFINITY;
    let te = design.element_tolerance;
    let td = design.drive_tolerance;
    {
        let ambient_k = design.ambient.nominal_k;
        let env_c = Environment { ambient_k, ..*env };
        for fe in [1.0 - te, 1.0 + te] {
            let element = design
                .element
                .with_resistance_law(design.element.resistance_law().scaled(fe));
            for fd in [1.0 - td, 1.0 + td] {
                for (i, rv) in [rlo, rhi].into_iter().enumerate() {
                    let evs: &[f64] = if shared {
                        &[[elo, ehi][i]]
                    } else {
                        &[elo, ehi]
                    };
                    for &ev in evs {
                        let drive = drive_with(&design.drive, drive_value * fd, ev);
                        let Ok(p) = operating_point(&element, &drive, &env_c, u) else {
                            continue;
                        };
                        let k = p.sense_v / rv;
                        k_min = k_min.min(k);
                        k_max = k_max.max(k);
                    }
                }
            }
        }
    }
    Ok((k_min, k_max))
}

/// Size the core of the design.
pub fn size_core(design: &Design) -> Result<SizedCore, SizeError> {
    let env = Environment {
        ambient_k: design.ambient.nominal_k,
        pressure_pa: design.ambient.pressure_pa,
    };
    let element = design.element.clone();
    let (drive_value, drive_exact) = size_drive(design, &env)?;
    let el_rail_v = element_rail(design).map_or(0.0, |r| design.supply.rail_v(r));
    let drive = drive_with(&design.drive, drive_value, el_rail_v);
    let u_t = design.detector.trip_airflow_m_per_s;

    let mut table = Vec::new();
    let mut unsolved = Vec::new();
    for k in [0.0, 0.5, 1.0, 2.0] {
        match operating_point(&element, &drive, &env, k * u_t) {
            Ok(p) => table.push((row_label(k), p)),
            // The trip airflow itself must have a steady state to size
            // anything; other rows are reported as having none.
            Err(e) if k != 1.0 => unsolved.push((row_label(k), k * u_t, e.to_string())),
            Err(e) => return Err(solve_ctx("operating point at the trip airflow")(e)),
        }
    }
    let at_trip = table
        .iter()
        .find(|(l, _)| l == "trip")
        .map(|(_, p)| *p)
        .ok_or(SizeError::Hysteresis("no trip point".into()))?;
    // Still air, or the lowest airflow with a steady state when still air
    // runs away.
    let still_air = match table.first() {
        Some((l, p)) if l == "still air" => *p,
        _ => lowest_steady(&element, &drive, &env, u_t).unwrap_or(at_trip),
    };
    let sens = sensitivity_v_per_m_per_s(&element, &drive, &env, &at_trip);
    let v_t = at_trip.sense_v;

    let stage = resolve_stage(design);
    let active = active_state(stage);
    let idle_state = active.other();
    let arrangement = arrangement_for(sens, design.detector.trip_on, active);

    // Reference divider.
    let ref_rail_v = design.supply.rail_v(design.detector.reference_rail);
    let k_t = v_t / ref_rail_v;
    let (k_lo, k_hi) = needed_ratio_span(design, drive_value, &env)?;
    let current = design
        .detector
        .divider_current_a
        .unwrap_or(DEFAULT_DIVIDER_CURRENT_A);
    let det = &design.detector;
    let mut compensation = Compensator::None;
    let mut comp_notes = Vec::new();
    let kind = design.compensation.kind;
    let (divider, divider_exact) =
        if matches!(kind, CompensationKind::Twin | CompensationKind::Thermistor) {
            let sized = comp_sizing::size(
                kind,
                &comp_sizing::Target {
                    design,
                    element: &element,
                    drive: &drive,
                    env: &env,
                    trip_airflow_m_per_s: u_t,
                    ratio: k_t,
                    span: (k_lo, k_hi),
                    rail_v: ref_rail_v,
                    overheat_k: at_trip.temperature_k - env.ambient_k,
                },
            )?;
            compensation = sized.comp;
            comp_notes = sized.notes;
            (sized.divider, Some(sized.exact))
        } else {
            match (det.top_ohm, det.trimmer_ohm, det.bottom_ohm) {
                (Sizable::Fixed(t), Sizable::Fixed(p), Sizable::Fixed(b)) => (
                    Divider {
                        top_ohm: t,
                        trimmer_ohm: p,
                        bottom_ohm: b,
                    },
                    None,
                ),
                (top, trim, bottom) => {
                    // Widen the asked-for span until the divider, with its parts at
                    // their tolerance ends, still reaches every build's need.
                    let tol = det.divider_tolerances;
                    let (need_lo, need_hi) = (k_lo.min(k_t), k_hi.max(k_t));
                    let mut widen = 1.0;
                    let mut best = None;
                    for _ in 0..DIVIDER_WIDENINGS {
                        let lo = k_t - widen * (k_t - need_lo);
                        let hi = k_t + widen * (need_hi - k_t);
                        let Ok((d, exact)) = Divider::size_with(
                            ref_rail_v,
                            k_t,
                            lo,
                            hi,
                            current,
                            design.e_series,
                            fixed(top),
                            fixed(trim),
                            fixed(bottom),
                        ) else {
                            break;
                        };
                        best = Some((d, exact));
                        let (k0, k1) = d.reach_at_tolerances(tol.top, tol.trimmer, tol.bottom);
                        if k0 <= need_lo && k1 >= need_hi {
                            break;
                        }
                        widen *= 1.25;
                    }
                    let (d, (exact_top, exact_bottom)) = match best {
                        Some(b) => b,
                        None => Divider::size_with(
                            ref_rail_v,
                            k_t,
                            need_lo,
                            need_hi,
                            current,
                            design.e_series,
                            fixed(top),
                            fixed(trim),
                            fixed(bottom),
                        )?,
                    };
                    (d, Some((exact_top, d.trimmer_ohm, exact_bottom)))
                }
            }
        };

    let node = super::stage::output_node(design, stage);
    let mut notes = Vec::new();
    let sense_src = drive.sense_source_ohm(at_trip.resistance_ohm);
    // A series input resistor is only fitted where feedback acts on the
    // sense side.
    let wants_feedback = !matches!(det.hysteresis, HysteresisSpec::None)
        || matches!(det.feedback_ohm, Sizable::Fixed(_));
    let input_ohm = match arrangement {
        _ if !wants_feedback => 0.0,
        Arrangement::ReferenceOnNonInverting => 0.0,
        Arrangement::SenseOnNonInverting => match det.input_resistor_ohm {
            Sizable::Fixed(r) => r,
            Sizable::Auto => {
                // The same rule as circuit::hysteresis::series_input_for_feedback:
                // aim for DEFAULT_SERIES_INPUT_OHM (10 kΩ, common practice),
                // lowered so the bias-current error I_b·R_in stays below half
                // the input offset (draftwire's own budget, no source), and
                // not below 1 kΩ.
                let budget = 0.5 * design.comparator.offset_v / design.comparator.bias_a.max(1e-12);
                let r = budget.clamp(1e3, DEFAULT_SERIES_INPUT_OHM);
                design.e_series.at_or_below(r)
            }
        },
    };
    let mut front = FrontEnd {
        arrangement,
        divider,
        reference_rail_v: ref_rail_v,
        feedback_ohm: None,
        input_ohm,
        output_high: node.high_source,
        output_low_v: design.comparator.output_low_v,
    };

    // Hysteresis.
    let mut feedback_exact = None;
    let wanted = det.hysteresis;
    match (wanted, det.feedback_ohm) {
        (HysteresisSpec::None, Sizable::Fixed(rf)) | (_, Sizable::Fixed(rf)) => {
            front.feedback_ohm = Some(rf);
        }
        (HysteresisSpec::None, Sizable::Auto) => {}
        (want, Sizable::Auto) => {
            let bench_front = compensation.front_at(&front, &env, u_t);
            let rf = size_feedback(
                &element,
                &drive,
                &env,
                &bench_front,
                idle_state,
                v_t,
                u_t,
                sense_src,
                want,
            )?;
            feedback_exact = Some(rf);
            front.feedback_ohm = Some(design.e_series.nearest(rf));
        }
    }
    if front.feedback_ohm.is_some() {
        let with_part = compensation.front_at(&front, &env, u_t).divider;
        notes.push(match arrangement {
            Arrangement::ReferenceOnNonInverting => format!(
                "feedback goes into the reference node: its source resistance ({:.0} Ω at mid-travel) lets the output move it, while the sense node ({:.1} Ω) is too stiff to move",
                with_part.thevenin(ref_rail_v, 0.5).1, sense_src
            ),
            Arrangement::SenseOnNonInverting => format!(
                "the sense node ({:.1} Ω) is too stiff for feedback, so it reaches the non-inverting input through a {} series resistor, and the feedback acts on that side",
                sense_src, format_rkm(input_ohm)
            ),
        });
    }

    // Trimmer position that puts the trip point on target.
    // A setting given in the file is analysed as it is; otherwise the one
    // that puts the trip point on target.
    let x = det.trimmer_position.unwrap_or_else(|| {
        trimmer_position(
            &compensation.front_at(&front, &env, u_t),
            idle_state,
            v_t,
            sense_src,
        )
    });
    let sigma = sens.signum()
        * if design.detector.trip_on == TripDirection::Rising {
            1.0
        } else {
            -1.0
        };
    let reference = Reference {
        front,
        comp: &compensation,
        x,
        sense_source_ohm: sense_src,
    };
    let sensing = Sensing {
        element: &element,
        drive: &drive,
        env: &env,
    };
    let trip = reference.switching(&sensing, idle_state, 0.0, u_t, sigma);
    let release = reference.switching(&sensing, idle_state.other(), 0.0, u_t, sigma);

    Ok(SizedCore {
        env,
        element,
        drive,
        drive_exact,
        still_air,
        at_trip,
        table,
        sensitivity_v_per_m_per_s: sens,
        front,
        divider_exact,
        feedback_exact,
        output: node,
        trimmer_x: x,
        idle_state,
        stage,
        trip_airflow_m_per_s: trip.airflow(),
        release_airflow_m_per_s: release.airflow(),
        trip,
        release,
        unsolved,
        needed_ratio: (k_lo, k_hi),
        notes,
        compensation,
        compensation_notes: comp_notes,
    })
}

/// The lowest airflow (to 0.1 % of the trip airflow) at which the element
/// has a steady state, by bisection between still air and the trip airflow.
fn lowest_steady(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    u_t: f64,
) -> Option<OperatingPoint> {
    let (mut lo, mut hi) = (0.0, u_t);
    let mut best = operating_point(element, drive, env, hi).ok()?;
    while hi - lo > 1e-3 * u_t {
        let mid = 0.5 * (lo + hi);
        match operating_point(element, drive, env, mid) {
            Ok(p) => {
                best = p;
                hi = mid;
            }
            Err(_) => lo = mid,
        }
    }
    Some(best)
}

fn fixed(s: Sizable) -> Option<f64> {
    match s {
        Sizable::Fixed(v) => Some(v),
        Sizable::Auto => None,
    }
}

/// The trimmer position at which the comparator switches out of the idle
/// state at sense level `v_t`: in closed form
/// ([`FrontEnd::position_for_switching_sense`]), else by Brent's method
/// on −1 … 2, else by one secant through the ends.
pub fn trimmer_position(front: &FrontEnd, idle: OutputState, v_t: f64, sense_src: f64) -> f64 {
    if let Some(x) = front.position_for_switching_sense(v_t, idle, sense_src) {
        return x;
    }
    let g = |x: f64| front.switching_sense_v(x, idle, sense_src) - v_t;
    match brent(g, -1.0, 2.0) {
        Ok(r) => r.x,
        Err(_) => {
            let (g0, g1) = (g(0.0), g(1.0));
            -g0 / (g1 - g0)
        }
    }
}

/// Largest feedback resistor the hysteresis search considers, ohm.
pub const MAX_FEEDBACK_OHM: f64 = 100e6;

/// Band reported for a feedback so strong that the release level lies
/// beyond any airflow (keeps the band function finite and monotone), m/s.
const BAND_BEYOND_RANGE: f64 = 1e3;

/// Size the feedback resistor for the wanted band (airflow or volts):
/// a Brent search on ln Rf, re-trimming to target at each trial so that the
/// trip point stays on target while the release point moves.
#[allow(clippy::too_many_arguments)]
fn size_feedback(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    front: &FrontEnd,
    idle: OutputState,
    v_t: f64,
    u_t: f64,
    sense_src: f64,
    want: HysteresisSpec,
) -> Result<f64, SizeError> {
    let band = |ln_rf: f64| -> Result<f64, SizeError> {
        let fe = FrontEnd {
            feedback_ohm: Some(ln_rf.exp()),
            ..*front
        };
        let x = trimmer_position(&fe, idle, v_t, sense_src);
        let release = fe.switching_sense_v(x, idle.other(), sense_src);
        match want {
            HysteresisSpec::Volts(_) => Ok((release - v_t).abs()),
            _ => match airflow_for_sense(element, drive, env, release, u_t) {
                Ok(u) => Ok((u - u_t).abs()),
                // The release level lies beyond anything airflow can reach:
                // the band is wider than the whole airflow range.
                Err(SolveError::LevelNotReached { .. }) => Ok(BAND_BEYOND_RANGE),
                Err(e) => Err(solve_ctx("hysteresis band")(e)),
            },
        }
    };
    let target = match want {
        HysteresisSpec::Volts(v) => v,
        HysteresisSpec::Airflow(u) => u,
        HysteresisSpec::None => return Err(SizeError::Hysteresis("no band wanted".into())),
    };
    // Feedback at least 10× the pull-up keeps the output-high level set by
    // the pull-up rather than by the feedback path (TI comparator data
    // sheet SNOSDA4D, hysteresis section: "RPU should be at least 10x less
    // than R2").
    let rf_min = MIN_FEEDBACK_TO_PULLUP_RATIO * front.output_high.1;
    // Above about 100 MΩ board leakage competes with the feedback current
    // (common practice, no source): the search stops there.
    let (lo, hi) = (rf_min.ln(), MAX_FEEDBACK_OHM.ln());
    let b_lo = band(lo)?;
    let b_hi = band(hi)?;
    let unit = if matches!(want, HysteresisSpec::Volts(_)) {
        "V"
    } else {
        "m/s"
    };
    if target > b_lo {
        return Err(SizeError::Hysteresis(format!(
            "{target} {unit} was asked for, but the widest band this output can give is {:.4} {unit} \
             (feedback {rf_min:.0} ohm, ten times the pull-up); ask for less hysteresis",
            b_lo.min(BAND_BEYOND_RANGE)
        )));
    }
    if target < b_hi {
        return Ok(MAX_FEEDBACK_OHM);
    }
    brent_fallible(|l| band(l).map(|b| b - target), lo, hi)?
        .map(|r| r.x.exp())
        .map_err(|e| SizeError::Hysteresis(e.to_string()))
}
