//! Turning a sized core into the report: rows, values, checks, cautions.

use super::compensation::{Compensator, Leg};
use super::size::SizedCore;
use crate::circuit::frontend::Arrangement;
use crate::design::model::{Design, DriveSpec, HysteresisSpec, Load, Sizable, StageKind};
use crate::drive::Drive;
use crate::eseries::format_rkm;
use crate::quantity::format_engineering;
use crate::report::{OperatingPointRow, TripSummary, ValueRow};
use crate::solve::{airflow_for_sense, OperatingPoint};

/// Celsius from kelvin (ITS-90: t/°C = T/K − 273.15).
pub fn to_c(t_k: f64) -> f64 {
    t_k - 273.15
}

/// A report row from a solved point.
pub fn row(label: &str, p: &OperatingPoint) -> OperatingPointRow {
    OperatingPointRow {
        label: label.to_string(),
        airflow_m_per_s: p.airflow_m_per_s,
        ambient_c: to_c(p.ambient_k),
        element_temperature_c: to_c(p.temperature_k),
        element_resistance_ohm: p.resistance_ohm,
        element_current_a: p.current_a,
        element_power_w: p.power_w,
        sense_voltage_v: p.sense_v,
        overheat_ratio: p.overheat_ratio(),
        time_constant_s: p.time_constant_s,
    }
}

/// Human name of an input arrangement's signals: (non-inverting, inverting).
pub fn input_names(a: Arrangement, has_input_resistor: bool) -> (String, String) {
    match a {
        Arrangement::ReferenceOnNonInverting => (
            "reference (trimmer wiper)".into(),
            "sense node (element)".into(),
        ),
        Arrangement::SenseOnNonInverting => (
            if has_input_resistor {
                "sense node (element) through the series input resistor".into()
            } else {
                "sense node (element)".into()
            },
            "reference (trimmer wiper)".into(),
        ),
    }
}

/// The trip summary.
pub fn trip_summary(design: &Design, core: &SizedCore) -> TripSummary {
    let u_t = design.detector.trip_airflow_m_per_s;
    // The front end at the bench, with any compensating part at its
    // nominal-ambient state at the trip airflow.
    let fe = &core.compensation.front_at(&core.front, &core.env, u_t);
    let src = core.drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let at = |x: f64| {
        let level = fe.switching_sense_v(x, core.idle_state, src);
        airflow_for_sense(&core.element, &core.drive, &core.env, level, u_t).ok()
    };
    let x = core.trimmer_x;
    let step = 0.01;
    let per_percent = match (
        at((x - step).clamp(0.0, 1.0)),
        at((x + step).clamp(0.0, 1.0)),
    ) {
        (Some(a), Some(b)) => {
            ((b - a) / (((x + step).clamp(0.0, 1.0) - (x - step).clamp(0.0, 1.0)) * 100.0)).abs()
        }
        _ => 0.0,
    };
    let (plus, minus) = input_names(
        fe.arrangement,
        fe.input_ohm > 0.0 && fe.feedback_ohm.is_some(),
    );
    let hysteresis_note = if fe.feedback_ohm.is_some() {
        core.notes.first().cloned().unwrap_or_default()
    } else {
        "no hysteresis network: the output may chatter while the airflow hovers at the trip point"
            .into()
    };
    let sens = core.sensitivity_v_per_m_per_s;
    TripSummary {
        direction: design.detector.trip_on.name().into(),
        target_airflow_m_per_s: u_t,
        band_m_per_s: [
            design.detector.trip_band_m_per_s.0,
            design.detector.trip_band_m_per_s.1,
        ],
        background_airflow_m_per_s: design.detector.background_airflow_m_per_s,
        normal_airflow_m_per_s: design.detector.normal_airflow_m_per_s,
        airflow_m_per_s: core.trip_airflow_m_per_s,
        release_airflow_m_per_s: core.release_airflow_m_per_s,
        reference_voltage_v: {
            // What a meter on the reference input reads with the output idle
            // and the airflow at the trip point.
            let (vp, vn) = fe.input_voltages(core.at_trip.sense_v, x, core.idle_state, src);
            match fe.arrangement {
                Arrangement::ReferenceOnNonInverting => vp,
                Arrangement::SenseOnNonInverting => vn,
            }
        },
        sense_voltage_v: core.at_trip.sense_v,
        release_sense_voltage_v: fe.switching_sense_v(x, core.idle_state.other(), src),
        sensitivity_v_per_m_per_s: sens,
        trimmer_position_percent: 100.0 * x,
        airflow_at_trimmer_bottom_m_per_s: at(0.0),
        airflow_at_trimmer_top_m_per_s: at(1.0),
        trimmer_bottom_state: end_state(design, core, at(0.0), 0.0),
        trimmer_top_state: end_state(design, core, at(1.0), 1.0),
        airflow_per_percent_travel_m_per_s: per_percent,
        offset_uncertainty_m_per_s: (sens != 0.0 && sens.is_finite())
            .then(|| design.comparator.offset_v / sens.abs()),
        non_inverting_input: plus,
        inverting_input: minus,
        hysteresis_note,
        model_spread_m_per_s: None,
        support_loss: None,
    }
}

/// The core values: drive, divider, trimmer, feedback, input resistor, pull-up.
pub fn core_values(design: &Design, core: &SizedCore) -> Vec<ValueRow> {
    let es = design.e_series.name();
    let mut v = vec![element_row(design, core)];
    match (core.drive, design.drive) {
        (Drive::SeriesResistor { series_ohm, rail_v }, DriveSpec::SeriesResistor { rail, .. }) => v
            .push(ValueRow::resistor(
                "RS1",
                series_ohm,
                core.drive_exact,
                if core.drive_exact.is_some() {
                    es
                } else {
                    "given"
                },
                format!(
                    "element series resistor from the {} rail ({rail_v:.2} V); sets the overheat",
                    rail.name()
                ),
            )),
        (Drive::ConstantCurrent { current_a }, _) => v.push(ValueRow {
            designator: "IS1".into(),
            part: "constant-current source".into(),
            value_a: Some(current_a),
            exact: core.drive_exact,
            e_series: if core.drive_exact.is_some() {
                "3 significant figures".into()
            } else {
                "given".into()
            },
            text: format_engineering(current_a, "A", 3),
            rating: "compliance at least the element's hot voltage".into(),
            reason: "element drive current; sets the overheat".into(),
            ..ValueRow::default()
        }),
        _ => {}
    }
    let d = core.front.divider;
    let (et, ep, eb) = match core.divider_exact {
        Some((t, p, b)) => (Some(t), Some(p), Some(b)),
        None => (None, None, None),
    };
    let src = |given: bool| {
        if given {
            "given".to_string()
        } else {
            es.to_string()
        }
    };
    let det = &design.detector;
    use crate::design::model::Sizable::Fixed;
    let comp_leg = core.compensation.leg();
    if d.top_ohm > 0.0 {
        v.push(ValueRow::resistor(
            "RR1",
            d.top_ohm,
            et.filter(|_| !matches!(det.top_ohm, Fixed(_))),
            &src(matches!(det.top_ohm, Fixed(_))),
            match comp_leg {
                Some(Leg::Top) => {
                    "reference divider, top (rail side), in series with the compensating network"
                        .into()
                }
                _ => "reference divider, top (rail side)".into(),
            },
        ));
    }
    v.push(ValueRow {
        designator: "RV1".into(),
        part: "trimmer".into(),
        value_ohm: Some(d.trimmer_ohm),
        exact: ep.filter(|_| !matches!(det.trimmer_ohm, Fixed(_))),
        e_series: if matches!(det.trimmer_ohm, Fixed(_)) {
            "given".into()
        } else {
            "1-2-5 trimmer values".into()
        },
        text: format_rkm(d.trimmer_ohm),
        reason: format!(
            "sets the trip point; set to {:.0} % of travel from the grounded end",
            100.0 * core.trimmer_x
        ),
        ..ValueRow::default()
    });
    if d.bottom_ohm > 0.0 {
        v.push(ValueRow::resistor(
            "RR2",
            d.bottom_ohm,
            eb.filter(|_| !matches!(det.bottom_ohm, Fixed(_))),
            &src(matches!(det.bottom_ohm, Fixed(_))),
            match comp_leg {
                Some(Leg::Bottom) => {
                    "reference divider, bottom, in series above the compensating part".into()
                }
                _ => "reference divider, bottom (ground side)".into(),
            },
        ));
    }
    v.extend(compensation_values(design, core));
    if let Some(rf) = core.front.feedback_ohm {
        v.push(ValueRow::resistor(
            "RF1",
            rf,
            core.feedback_exact,
            &src(core.feedback_exact.is_none()),
            match det.hysteresis {
                HysteresisSpec::Airflow(u) => {
                    format!("positive feedback for {u} m/s of hysteresis")
                }
                HysteresisSpec::Volts(x) => format!(
                    "positive feedback for {} of hysteresis",
                    format_engineering(x, "V", 3)
                ),
                HysteresisSpec::None => "positive feedback (given)".into(),
            },
        ));
        if core.front.arrangement == Arrangement::SenseOnNonInverting && core.front.input_ohm > 0.0
        {
            v.push(ValueRow::resistor(
                "RI1",
                core.front.input_ohm,
                None,
                &src(matches!(det.input_resistor_ohm, Fixed(_))),
                "series input resistor: gives the stiff sense node a source resistance the feedback can work against".into(),
            ));
        }
    }
    let needs_pullup = core.front.feedback_ohm.is_some() || core.stage != StageKind::Direct;
    if needs_pullup {
        v.push(ValueRow::resistor(
            "RP1",
            core.output.pullup_ohm,
            None,
            &src(matches!(design.comparator.pullup_ohm, Fixed(_))),
            "comparator output pull-up".into(),
        ));
    }
    v
}

/// The sensing element's row: given by the file, not sized; its
/// resistance at the nominal ambient and its laws.
fn element_row(design: &Design, core: &SizedCore) -> ValueRow {
    let law = core.element.resistance_law();
    let ta = design.ambient.nominal_k;
    let tol = design.element_tolerance;
    ValueRow {
        designator: "ELEMENT".into(),
        part: "self-heated element".into(),
        value_ohm: Some(law.resistance_ohm(ta)),
        e_series: "given".into(),
        text: format!(
            "{} at {:.1} °C{}",
            format_engineering(law.resistance_ohm(ta), "Ω", 3),
            to_c(ta),
            if tol > 0.0 {
                format!(" (±{} %)", crate::quantity::format_sig(100.0 * tol, 3))
            } else {
                String::new()
            }
        ),
        rating: format!(
            "{:.0} °C in still air at the nominal ambient",
            to_c(core.still_air.temperature_k)
        ),
        reason: format!(
            "{}; cooled as {}; mount it in the airflow to be watched",
            law.name(),
            core.element.cooling_law().name()
        ),
        ..ValueRow::default()
    }
}

/// The compensating parts' rows: the twin, or the thermistor and its
/// linearising resistor.
pub fn compensation_values(design: &Design, core: &SizedCore) -> Vec<ValueRow> {
    let ta = design.ambient.nominal_k;
    let spec = &design.compensation;
    match &core.compensation {
        Compensator::None => Vec::new(),
        Compensator::Twin(t) => {
            let r = t.element.resistance_law().resistance_ohm(ta);
            vec![ValueRow {
                designator: "RC1".into(),
                part: "ambient twin element".into(),
                value_ohm: Some(r),
                e_series: match spec.twin.resistance_ohm {
                    Sizable::Fixed(_) => "given".into(),
                    Sizable::Auto => "2 significant figures".into(),
                },
                text: format!(
                    "{} at {:.1} °C (±{} %)",
                    format_engineering(r, "Ω", 3),
                    to_c(ta),
                    crate::quantity::format_sig(100.0 * spec.twin.tolerance, 3)
                ),
                reason: format!(
                    "unheated twin of the sensing element (the same resistance law) at the bottom of the reference divider: a Wheatstone bridge that moves the reference with the ambient; mount it beside the element in the same air, kept below {} % of the element's overheat by its small current",
                    crate::quantity::format_sig(100.0 * spec.twin.max_rise_share, 3)
                ),
                ..ValueRow::default()
            }]
        }
        Compensator::Thermistor(n) => {
            let th = spec.thermistor;
            let leg = n.leg.name();
            vec![
                ValueRow {
                    designator: "RT1".into(),
                    part: "NTC thermistor".into(),
                    value_ohm: Some(n.law.r0_ohm()),
                    e_series: match th.r25_ohm {
                        Sizable::Fixed(_) => "given".into(),
                        Sizable::Auto => "E6".into(),
                    },
                    text: format!(
                        "{} at 25 °C (±{} %), B {:.0} K (±{} %)",
                        format_rkm(n.law.r0_ohm()),
                        crate::quantity::format_sig(100.0 * th.r25_tolerance, 3),
                        n.law.beta_k(),
                        crate::quantity::format_sig(100.0 * th.beta_tolerance, 3)
                    ),
                    reason: format!(
                        "ambient compensation in the reference divider's {leg} leg: moves the reference with the sense voltage as the room warms or cools; mount it on the board in the same ambient as the element, away from warm parts"
                    ),
                    ..ValueRow::default()
                },
                ValueRow::resistor(
                    "RR3",
                    n.parallel_ohm,
                    None,
                    match th.linearising_ohm {
                        Sizable::Fixed(_) => "given",
                        Sizable::Auto => design.e_series.name(),
                    },
                    "linearising resistor across RT1: straightens its curve around the nominal ambient".into(),
                ),
            ]
        }
    }
}

/// The power-on hold-off capacitor's row.
pub fn hold_off_row(design: &Design, core: &SizedCore, h: &crate::transient::HoldOff) -> ValueRow {
    let rail = design.supply.rail_range_v(design.detector.reference_rail).1;
    ValueRow {
        designator: "CH1".into(),
        part: "capacitor".into(),
        value_f: Some(h.capacitance_f),
        e_series: match design.detector.power_on_hold_off {
            crate::design::model::HoldOffSpec::Fixed(_) => "given".into(),
            _ => "E6".into(),
        },
        text: format_engineering(h.capacitance_f, "F", 2),
        rating: format!(
            "≥ {} (≥ 1.5× {rail:.2} V); low leakage against the divider's current",
            format_engineering(1.5 * rail, "V", 3)
        ),
        reason: format!(
            "power-on hold-off {}; τ ≈ {} with the divider, so the detector cannot trip for about 5τ after power-on; a low-leakage part (an electrolytic's leakage, up to about 0.01·C·V by IEC 60384-4, flows into the divider)",
            super::transient::placement(h),
            format_engineering(super::transient::hold_off_tau(core, h), "s", 3)
        ),
        ..ValueRow::default()
    }
}

/// The cautions that apply, in words; each defers to local codes.
pub fn cautions(design: &Design, core: &SizedCore) -> Vec<String> {
    let mut v = Vec::new();
    let t_c = to_c(core.still_air.temperature_k);
    // Contact-burn threshold: ISO 13732-1 gives about 51 °C for 1 min contact
    // with bare metal (memory); draftwire warns from 50 °C.
    if t_c >= 50.0 {
        v.push(format!(
            "Hot surface: the element runs at about {t_c:.0} °C in still air. Do not touch it while powered; mount it where fingers and loose material cannot reach it."
        ));
    }
    if let Some(t_max) = core.element.max_temperature_k() {
        let (t_hot, how) = super::checks::element::hottest_still_air(design, core);
        if t_hot > t_max {
            v.push(format!(
                "The element would reach {:.0} °C in still air ({how}), above its safe limit of {:.0} °C in air: it can oxidise, drift or burn out, and it is a stronger ignition source. Ask for less overheat or choose an element rated hotter.",
                to_c(t_hot),
                to_c(t_max)
            ));
        }
    }
    let tungsten = matches!(
        design.element.resistance_law(),
        crate::element::ResistanceLaw::Tungsten(_)
    );
    if tungsten {
        v.push(
            "A filament taken from a lamp is fragile and its glass can shatter: wear eye protection when opening the envelope, and keep the bare filament in a guard."
                .into(),
        );
    }
    // Keep a bare element to a few hundred °C in air (common practice, no
    // source; bare tungsten oxidises quickly above roughly 400 °C): warn
    // from 300 °C for any metal, and always for tungsten.
    if t_c >= 300.0 || tungsten {
        v.push(
            "A bare metal filament (tungsten above all) oxidises quickly in air above a few hundred °C and is fragile: run it cooler or keep it sealed, and expect drift and failure."
                .into(),
        );
    }
    v.push(standing_cautions().remove(0));
    if let Some(out) = &design.output {
        if let Load::Relay {
            switches_mains: true,
            contact_rating,
            ..
        } = &out.load
        {
            v.push(format!(
                "The relay switches mains: use it only within its contact rating ({}), with creepage and clearance for mains, in an enclosure, wired by a person qualified under local codes.",
                contact_rating.as_deref().unwrap_or("not given in the design file — find it before wiring")
            ));
        }
    }
    v.extend(standing_cautions().into_iter().skip(1));
    v
}

/// The cautions every report carries, whatever the design: the ignition
/// source first, then the medical and bench notes.
pub fn standing_cautions() -> Vec<String> {
    vec![
        "A heated element is an ignition source: never use this detector near flammable gas, vapour or dust.".into(),
        "Not a medical or life-safety device: breath, sleep or patient monitoring needs certified equipment.".into(),
        "These figures are design estimates: follow local codes and licensed practice, and verify the build on the bench.".into(),
    ]
}

/// In words, what the detector does with the trimmer at position `x` when
/// the switching level is reached at airflow `u` (or never reached).
fn end_state(design: &Design, core: &SizedCore, u: Option<f64>, x: f64) -> String {
    if let Some(u) = u {
        return format!("trips at {u:.3} m/s");
    }
    // Unreached: still air lies on one side of the level for every airflow.
    // Tripped when σ·(V_sense − level) > 0 (see size::arrangement_for).
    let src = core.drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let level = core
        .compensation
        .front_at(&core.front, &core.env, design.detector.trip_airflow_m_per_s)
        .switching_sense_v(x, core.idle_state, src);
    let sigma = super::corners::tripped_sign(design, core);
    if sigma * (core.still_air.sense_v - level) > 0.0 {
        "always tripped".into()
    } else {
        "never trips".into()
    }
}
