//! Drift of the trip point with ambient temperature and supply, and what a
//! ratiometric reference cancels.

use super::assemble::to_c;
use super::size::{drive_with, element_rail, SizedCore};
use crate::circuit::frontend::FrontEnd;
use crate::design::model::{Design, Rail, TripDirection};
use crate::element::Environment;
use crate::report::{Check, DriftRow};
use crate::solve::{airflow_for_sense, operating_point};

/// One drift condition: ambient and the two rails.
#[derive(Debug, Clone, Copy)]
struct Condition {
    ambient_k: f64,
    element_rail_v: f64,
    reference_rail_v: f64,
}

/// Trip airflow under a condition, and whether the output is tripped in
/// still air. `None` when the sense voltage never crosses the switching
/// level between still air and the highest airflow considered.
fn evaluate(design: &Design, core: &SizedCore, c: Condition) -> (Option<f64>, bool) {
    let env = Environment {
        ambient_k: c.ambient_k,
        ..core.env
    };
    let value = match core.drive {
        crate::drive::Drive::SeriesResistor { series_ohm, .. } => series_ohm,
        crate::drive::Drive::ConstantCurrent { current_a } => current_a,
    };
    let drive = drive_with(&design.drive, value, c.element_rail_v);
    let front = FrontEnd {
        reference_rail_v: c.reference_rail_v,
        ..core.front
    };
    let src = drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let level = front.switching_sense_v(core.trimmer_x, core.idle_state, src);
    let u = airflow_for_sense(
        &core.element,
        &drive,
        &env,
        level,
        design.detector.trip_airflow_m_per_s,
    )
    .ok();
    // Tripped in still air when still air lies on the tripped side of the
    // trip airflow (or the sense voltage never crosses the level and still
    // air is on the tripped side of it).
    let still = operating_point(&core.element, &drive, &env, 0.0)
        .map(|p| p.sense_v)
        .ok();
    let tripped = match (u, still) {
        (Some(u), _) => match design.detector.trip_on {
            TripDirection::Rising => u <= 0.0,
            TripDirection::Falling => u > 0.0,
        },
        (None, Some(v0)) => {
            // Sign of (V0 − level) relative to the sense slope tells which side still air sits.
            let s = core.sensitivity_v_per_m_per_s.signum();
            let above = (v0 - level) * s > 0.0; // still air behaves like high airflow
            match design.detector.trip_on {
                TripDirection::Rising => above,
                TripDirection::Falling => !above,
            }
        }
        (None, None) => false,
    };
    (u, tripped)
}

fn note(design: &Design, u: Option<f64>, tripped: bool, nominal: f64) -> String {
    match (design.detector.trip_on, u, tripped) {
        (TripDirection::Rising, _, true) => "FALSE TRIP: tripped in still air".into(),
        (TripDirection::Falling, None, _) => "never trips within 0–100 m/s".into(),
        (_, Some(u), _) => {
            let shift = u - nominal;
            if shift.abs() < 1e-4 {
                "on target".into()
            } else {
                format!(
                    "trip point {} by {:.3} m/s",
                    if shift > 0.0 { "rises" } else { "falls" },
                    shift.abs()
                )
            }
        }
        (TripDirection::Rising, None, false) => "never trips within 0–100 m/s".into(),
    }
}

/// Drift rows: nominal, ambient ends, supply ends, and the ratiometric
/// comparison.
pub fn drift(design: &Design, core: &SizedCore) -> Vec<DriftRow> {
    let el_rail = element_rail(design);
    let ref_rail = design.detector.reference_rail;
    let s = &design.supply;
    let nominal = Condition {
        ambient_k: design.ambient.nominal_k,
        element_rail_v: el_rail.map_or(0.0, |r| s.rail_v(r)),
        reference_rail_v: s.rail_v(ref_rail),
    };
    let u_nom = core.trip_airflow_m_per_s;
    let mut rows = Vec::new();
    let mut push = |label: String, c: Condition, comparison_only: bool| {
        let (u, tripped) = evaluate(design, core, c);
        rows.push(DriftRow {
            condition: label,
            ambient_c: to_c(c.ambient_k),
            element_rail_v: c.element_rail_v,
            reference_rail_v: c.reference_rail_v,
            trip_airflow_m_per_s: u,
            shift_m_per_s: u.map(|u| u - u_nom),
            tripped_in_still_air: tripped,
            note: note(design, u, tripped, u_nom),
            comparison_only,
        });
    };
    push("nominal".into(), nominal, false);
    for (label, t) in [
        ("ambient min", design.ambient.min_k),
        ("ambient max", design.ambient.max_k),
    ] {
        if t != design.ambient.nominal_k {
            push(
                format!("{label} {:.1} °C", to_c(t)),
                Condition {
                    ambient_k: t,
                    ..nominal
                },
                false,
            );
        }
    }
    // Supply: each rail moves over its own range; rails that are the same
    // rail move together.
    let rail_v = |rail: Rail, hi: bool| {
        let (lo, h) = s.rail_range_v(rail);
        if hi {
            h
        } else {
            lo
        }
    };
    // Supply: each rail moves over its own range. The same rail moves as
    // one; two different rails (input and regulated) move independently,
    // so all four pairings of their ends are tried.
    let shared = el_rail == Some(ref_rail) || el_rail.is_none();
    let pairs: &[(bool, bool)] = if shared {
        &[(false, false), (true, true)]
    } else {
        &[(false, false), (false, true), (true, false), (true, true)]
    };
    let end = |hi: bool| if hi { "high" } else { "low" };
    for &(el_hi, ref_hi) in pairs {
        let c = Condition {
            element_rail_v: el_rail.map_or(0.0, |r| rail_v(r, el_hi)),
            reference_rail_v: rail_v(ref_rail, ref_hi),
            ..nominal
        };
        if c.element_rail_v != nominal.element_rail_v
            || c.reference_rail_v != nominal.reference_rail_v
        {
            let label = if shared {
                format!("supply {}", end(ref_hi))
            } else {
                format!(
                    "element rail {}, reference rail {}",
                    end(el_hi),
                    end(ref_hi)
                )
            };
            push(label, c, false);
        }
    }
    // Ratiometric comparison: the element rail at its low end with the
    // reference (a) on the same rail, (b) held at its nominal voltage.
    if let Some(er) = el_rail {
        let (lo, _) = s.rail_range_v(er);
        if lo != s.rail_v(er) {
            let same = Condition {
                element_rail_v: lo,
                reference_rail_v: if er == ref_rail {
                    lo
                } else {
                    nominal.reference_rail_v * lo / s.rail_v(er)
                },
                ..nominal
            };
            push(
                "element rail low, reference tracking it (ratiometric)".to_string(),
                same,
                er != ref_rail,
            );
            push(
                "element rail low, reference held (not ratiometric)".to_string(),
                Condition {
                    element_rail_v: lo,
                    ..nominal
                },
                er == ref_rail,
            );
        }
    }
    rows
}

/// Whether the output is idle at the normal airflow under a drift row's
/// condition, and whether the detector still trips at all there.
fn row_verdict(design: &Design, row: &DriftRow) -> (bool, bool) {
    let normal = design.detector.normal_airflow_m_per_s;
    match (design.detector.trip_on, row.trip_airflow_m_per_s) {
        // Rising: tripped above the trip airflow.
        (TripDirection::Rising, Some(u)) => (u > normal, true),
        (TripDirection::Rising, None) => (!row.tripped_in_still_air, row.tripped_in_still_air),
        // Falling: tripped below the trip airflow.
        (TripDirection::Falling, Some(u)) => (u < normal, u > 0.0),
        (TripDirection::Falling, None) => (!row.tripped_in_still_air, row.tripped_in_still_air),
    }
}

/// Checks across the drift conditions: no false trip at the normal
/// airflow, and the detector still trips.
pub fn drift_checks(design: &Design, rows: &[DriftRow]) -> Vec<Check> {
    let normal = design.detector.normal_airflow_m_per_s;
    let mut false_trips = Vec::new();
    let mut dead = Vec::new();
    for r in rows.iter().filter(|r| !r.comparison_only) {
        let (idle_ok, trips) = row_verdict(design, r);
        if !idle_ok {
            false_trips.push(r.condition.clone());
        }
        if !trips {
            dead.push(r.condition.clone());
        }
    }
    let normal_text = if normal == 0.0 {
        "in still air".to_string()
    } else {
        format!("at the normal airflow ({normal} m/s)")
    };
    vec![
        Check {
            name: "no false trip at the normal airflow".into(),
            passed: false_trips.is_empty(),
            detail: if false_trips.is_empty() {
                format!("the output stays idle {normal_text} at every ambient and supply end")
            } else {
                format!(
                    "tripped {normal_text} at: {} — the trip point drifts past the normal airflow; more overheat, a narrower ambient range or ambient compensation would help",
                    false_trips.join(", ")
                )
            },
        },
        Check {
            name: "still trips at every ambient and supply end".into(),
            passed: dead.is_empty(),
            detail: if dead.is_empty() {
                "a trip point exists in every condition".into()
            } else {
                format!("never trips at: {}", dead.join(", "))
            },
        },
    ]
}
