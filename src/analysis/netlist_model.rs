//! What draftwire itself computes for the SPICE netlist's model
//! (`render/spice.rs`): the cooling law as King's law, and the operating
//! point and switching airflows of that model, which the netlist prints as
//! comments so a cross-check can compare the simulator with them.

use crate::analysis::Sized;
use crate::element::{CoolingLaw, Element, Environment, KingsLaw};
use crate::solve::{airflow_for_sense, operating_point};

/// What draftwire computes for the netlist's own model: the figures a
/// cross-check compares the simulator with.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Expected {
    /// Airflow of the operating point, m/s.
    pub airflow_m_per_s: f64,
    /// Element temperature there, °C.
    pub element_temp_c: f64,
    /// Sense voltage there, V.
    pub sense_v: f64,
    /// Airflow at which the output trips, m/s (nominal parts and
    /// conditions).
    pub trip_airflow_m_per_s: Option<f64>,
    /// Airflow at which it releases, m/s.
    pub release_airflow_m_per_s: Option<f64>,
    /// Whether the netlist models the cooling by an equivalent King's law
    /// (geometry cooling) rather than the design's own law.
    pub equivalent_king: bool,
}

/// The cooling law as King's law for the netlist: the law itself, the
/// data-sheet form's King form, or for geometry cooling the equivalent
/// King's law fitted around the trip point at the element's trip
/// temperature (`CoolingLaw::equivalent_kings_law`).
pub fn king_for(
    element: &Element,
    t_k: f64,
    airflow: f64,
    env: &Environment,
) -> Option<(KingsLaw, bool)> {
    match element.cooling_law() {
        CoolingLaw::King(k) => Some((*k, false)),
        CoolingLaw::Datasheet(d) => Some((d.as_kings_law(), false)),
        law => law
            .equivalent_kings_law(t_k, airflow, env)
            .ok()
            .map(|k| (k, true)),
    }
}

/// Draftwire's own figures for the netlist's model at `airflow`.
pub fn expected(s: &Sized, airflow: f64) -> Option<Expected> {
    let core = &s.core;
    let t_trip = core.at_trip.temperature_k;
    let target = s.design.detector.trip_airflow_m_per_s;
    let (king, equivalent) = king_for(&core.element, t_trip, target, &core.env)?;
    let model = if equivalent {
        core.element.with_cooling_law(CoolingLaw::King(king))
    } else {
        core.element.clone()
    };
    let p = operating_point(&model, &core.drive, &core.env, airflow).ok()?;
    let t = &s.report.trip;
    let (trip, release) = if equivalent {
        // The switching levels do not move with airflow unless a twin sits
        // in the air; then only the design's own law gives them.
        if core.compensation.in_air_stream() {
            (None, None)
        } else {
            let at =
                |level: f64| airflow_for_sense(&model, &core.drive, &core.env, level, target).ok();
            (at(t.sense_voltage_v), at(t.release_sense_voltage_v))
        }
    } else {
        (t.airflow_m_per_s, t.release_airflow_m_per_s)
    };
    Some(Expected {
        airflow_m_per_s: airflow,
        element_temp_c: p.temperature_k - 273.15,
        sense_v: p.sense_v,
        trip_airflow_m_per_s: trip,
        release_airflow_m_per_s: release,
        equivalent_king: equivalent,
    })
}
