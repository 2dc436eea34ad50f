//! `compare`: several candidate elements side by side in one design's drive
//! and detector.
//!
//! Each candidate replaces the design's element (and its tolerance); a drive
//! left `auto` is sized again for it, so every candidate runs at the
//! design's wanted overheat. For each the table gives the still-air
//! operating point, the sense-voltage change from still air to the trip
//! airflow, the sensitivity dV/dU at the trip airflow, the trip-point drift
//! per kelvin of ambient, the time constant at the trip airflow, and
//! whether the element stays below its maximum temperature in still air at
//! the hottest ambient.

use super::size::size_core;
use crate::design::element::Candidate;
use crate::design::model::Design;
use crate::element::{Element, Environment};
use crate::solve::operating_point;
use serde::Serialize;

/// Why no comparison could be made.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum CompareError {
    /// The candidate list was empty.
    #[error("no candidate elements to compare: give at least one")]
    NoCandidates,
}

/// One candidate's figures. Units are in the field names; `None` where a
/// figure could not be computed (`error` then says why).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CompareRow {
    /// The candidate's label.
    pub label: String,
    /// Resistance and cooling law names.
    pub element: String,
    /// Resistance tolerance, %.
    pub tolerance_percent: f64,
    /// The drive as used: "series 75 ohm" or "current 0.12 A".
    pub drive: String,
    /// Element temperature in still air at nominal ambient, °C.
    pub still_air_temperature_c: Option<f64>,
    /// Temperature rise over ambient in still air, K.
    pub still_air_rise_k: Option<f64>,
    /// Overheat ratio (R_hot − R_amb)/R_amb in still air.
    pub still_air_overheat_ratio: Option<f64>,
    /// Electrical power in still air, W.
    pub still_air_power_w: Option<f64>,
    /// Sense voltage at the trip airflow minus in still air, V.
    pub sense_change_v: Option<f64>,
    /// Trip airflow with the sized trimmer setting, m/s.
    pub trip_airflow_m_per_s: Option<f64>,
    /// dV/dU at the trip airflow, V per m/s.
    pub sensitivity_v_per_m_per_s: Option<f64>,
    /// Trip-point drift with ambient, m/s per K: (U(T+1 K) − U(T−1 K))/2 at
    /// the comparator's switching level held fixed.
    pub trip_drift_m_per_s_per_k: Option<f64>,
    /// Lumped time constant at the trip airflow, s.
    pub time_constant_s: Option<f64>,
    /// Still-air element temperature at the hottest ambient, °C.
    pub hottest_temperature_c: Option<f64>,
    /// The element's maximum temperature, °C, when known.
    pub max_temperature_c: Option<f64>,
    /// Whether the hottest temperature stays at or below the maximum
    /// (`None` when no maximum is known or no point was found).
    pub safe_in_air: Option<bool>,
    /// Correlations used outside their range at the still-air and trip
    /// points.
    pub warnings: Vec<String>,
    /// Why the candidate could not be sized or solved, if so.
    pub error: Option<String>,
    /// Design checks that pass for this candidate (the same checks as `size`).
    pub checks_passed: usize,
    /// Design checks judged for this candidate.
    pub checks_total: usize,
    /// Ids of the checks that fail.
    pub failed_checks: Vec<String>,
    /// Whether every design check passes for this candidate.
    pub passed: bool,
}

/// The comparison table.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Comparison {
    /// Layout version.
    pub schema_version: u32,
    /// draftwire's version.
    pub tool_version: String,
    /// The design file.
    pub design_file: String,
    /// Whether every candidate passes every design check.
    pub passed: bool,
    /// The design's title.
    pub title: String,
    /// Target trip airflow of the design, m/s.
    pub target_trip_airflow_m_per_s: f64,
    /// Nominal ambient, °C.
    pub ambient_c: f64,
    /// One row per candidate, in the order given.
    pub rows: Vec<CompareRow>,
}

const C0: f64 = 273.15;

/// Compare `candidates` (label, element, resistance tolerance as a
/// fraction) in `design`'s drive and detector. A candidate that cannot be
/// sized or solved gets a row with `error` set; only an empty list fails.
pub fn compare(design: &Design, candidates: &[Candidate]) -> Result<Comparison, CompareError> {
    if candidates.is_empty() {
        return Err(CompareError::NoCandidates);
    }
    let rows = candidates.iter().map(|c| row(design, c)).collect();
    let rows: Vec<CompareRow> = rows;
    Ok(Comparison {
        schema_version: crate::report::SCHEMA_VERSION,
        tool_version: env!("CARGO_PKG_VERSION").to_string(),
        design_file: design.design_file.clone(),
        passed: rows.iter().all(|r| r.passed && r.error.is_none()),
        title: design.title.clone(),
        target_trip_airflow_m_per_s: design.detector.trip_airflow_m_per_s,
        ambient_c: design.ambient.nominal_k - C0,
        rows,
    })
}

fn empty_row(label: &str, element: &Element, tol: f64) -> CompareRow {
    CompareRow {
        label: label.to_string(),
        element: format!(
            "{}, {}",
            element.resistance_law().name(),
            element.cooling_law().summary()
        ),
        tolerance_percent: tol * 100.0,
        drive: String::new(),
        still_air_temperature_c: None,
        still_air_rise_k: None,
        still_air_overheat_ratio: None,
        still_air_power_w: None,
        sense_change_v: None,
        trip_airflow_m_per_s: None,
        sensitivity_v_per_m_per_s: None,
        trip_drift_m_per_s_per_k: None,
        time_constant_s: None,
        hottest_temperature_c: None,
        max_temperature_c: element.max_temperature_k().map(|t| t - C0),
        safe_in_air: None,
        warnings: Vec::new(),
        error: None,
        checks_passed: 0,
        checks_total: 0,
        failed_checks: Vec::new(),
        passed: false,
    }
}

fn row(design: &Design, c: &Candidate) -> CompareRow {
    let element = &c.element;
    let mut out = empty_row(&c.label, element, c.tolerance);
    let mut d = design.clone();
    d.element = element.clone();
    d.element_tolerance = c.tolerance;
    if let Some(own) = c.drive {
        d.drive = own.drive;
        d.overheat = own.overheat;
        d.drive_tolerance = own.tolerance;
    }
    // `auto` compensation is chosen for this candidate.
    let d = super::choice::resolve(&d).design;
    let core = match size_core(&d) {
        Ok(c) => c,
        // The element's own figures still come from the plain divider; the
        // checks below report that the design cannot be sized as asked.
        Err(super::size::SizeError::Compensation(_)) => {
            let plain = super::choice::with_kind(&d, crate::design::model::CompensationKind::None);
            match size_core(&plain) {
                Ok(c) => c,
                Err(e) => {
                    out.error = Some(e.to_string());
                    out.checks_total = 1;
                    out.failed_checks = vec!["design-sizable".into()];
                    return out;
                }
            }
        }
        Err(e) => {
            out.error = Some(e.to_string());
            out.checks_total = 1;
            out.failed_checks = vec!["design-sizable".into()];
            return out;
        }
    };
    out.drive = match core.drive {
        crate::drive::Drive::SeriesResistor { series_ohm, .. } => {
            format!("series {series_ohm} ohm")
        }
        crate::drive::Drive::ConstantCurrent { current_a } => format!("current {current_a} A"),
    };
    if c.drive.is_some() {
        out.drive.push_str(" (its own)");
    }
    let s = &core.still_air;
    out.still_air_temperature_c = Some(s.temperature_k - C0);
    out.still_air_rise_k = Some(s.rise_k());
    out.still_air_overheat_ratio = Some(s.overheat_ratio());
    out.still_air_power_w = Some(s.power_w);
    out.sense_change_v = Some(core.at_trip.sense_v - s.sense_v);
    out.trip_airflow_m_per_s = core.trip_airflow_m_per_s;
    // The same design checks as `size`, for this candidate.
    match super::size(&d) {
        Ok(report) => {
            out.checks_total = report.checks.len();
            out.checks_passed = report.checks.iter().filter(|c| c.passed).count();
            out.failed_checks = report
                .checks
                .iter()
                .filter(|c| !c.passed)
                .map(|c| c.id.clone())
                .collect();
        }
        Err(e) => {
            out.checks_total = 1;
            out.failed_checks = vec!["design-sizable".into()];
            out.error = Some(e.to_string());
        }
    }
    out.passed = out.checks_total > 0 && out.failed_checks.is_empty();
    out.sensitivity_v_per_m_per_s = Some(core.sensitivity_v_per_m_per_s);
    out.time_constant_s = Some(core.at_trip.time_constant_s);
    out.trip_drift_m_per_s_per_k = super::drift::ambient_slope(&d, &core);
    let mut warnings = element.plausibility_warnings().to_vec();
    warnings.extend(element.range_warnings(s.temperature_k, 0.0, &core.env));
    for w in element.range_warnings(
        core.at_trip.temperature_k,
        core.at_trip.airflow_m_per_s,
        &core.env,
    ) {
        if !warnings.contains(&w) {
            warnings.push(w);
        }
    }
    out.warnings = warnings;
    let hot_env = Environment {
        ambient_k: d.ambient.max_k,
        ..core.env
    };
    match operating_point(&core.element, &core.drive, &hot_env, 0.0) {
        Ok(p) => {
            out.hottest_temperature_c = Some(p.temperature_k - C0);
            out.safe_in_air = element.max_temperature_k().map(|m| p.temperature_k <= m);
        }
        Err(e) => {
            out.safe_in_air = Some(false);
            out.error = Some(format!("still air at the hottest ambient: {e}"));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::parse_design;

    const DESIGN: &str = include_str!("../../examples/greenhouse-fan-alarm.toml");

    #[test]
    fn design_element_compares_to_its_own_size_run() {
        let d = parse_design("g.toml", DESIGN).unwrap();
        let cmp = compare(
            &d,
            &[Candidate {
                label: "own".into(),
                element: d.element.clone(),
                tolerance: d.element_tolerance,
                drive: None,
                assumptions: Vec::new(),
            }],
        )
        .unwrap();
        let core = size_core(&d).unwrap();
        let r = &cmp.rows[0];
        assert!(r.error.is_none(), "{:?}", r.error);
        // Same element and drive: the same still-air point as `size`.
        assert_eq!(
            r.still_air_temperature_c,
            Some(core.still_air.temperature_k - C0)
        );
        // Nickel-like TCR > 0: a warmer ambient warms the element, which
        // looks like less airflow, so for a fixed level the trip point moves:
        // the drift must at least be finite and non-zero.
        let drift = r.trip_drift_m_per_s_per_k.unwrap();
        assert!(drift.is_finite() && drift != 0.0);
        assert!(compare(&d, &[]).is_err());
    }
}
