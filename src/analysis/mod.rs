//! Analyses built on the solvers: sizing, drift, checks, the report.

pub mod assemble;
pub mod checks;
pub mod choice;
pub mod compare;
pub mod compensation;
pub mod corners;
pub mod drift;
pub mod model_spread;
pub mod netlist_model;
pub mod output;
pub mod plot;
pub mod size;
pub mod spread;
pub mod stage;
pub mod sweep;
pub mod switching;
pub mod transient;
pub mod wiring;

use crate::design::Design;
use crate::report::{Check, Report};
pub use size::SizeError;

/// Size and check a design: the whole `size` job.
pub fn size(design: &Design) -> Result<Report, SizeError> {
    size_full(design).map(|s| s.report)
}

/// A sized design with everything later jobs (the netlist, the schematic)
/// need beside its report: the design with its compensation resolved and
/// the sized core.
pub struct Sized {
    /// The design as sized (`auto` compensation resolved).
    pub design: Design,
    /// The sized core (element, drive, front end, trimmer setting, …).
    pub core: size::SizedCore,
    /// The report.
    pub report: Report,
}

/// [`size()`], keeping the sized core.
pub fn size_full(design: &Design) -> Result<Sized, SizeError> {
    let choice = choice::resolve(design);
    let design = &choice.design;
    let core = size::size_core(design)?;
    let grid = corners::evaluate(design, &core);
    let mut values = assemble::core_values(design, &core);
    let mut checks = checks::trip::checks(design, &grid);
    checks.extend(checks::trimmer::checks(design, &grid));
    checks.extend(checks::element::checks(design, &core, &grid));
    checks.extend(checks::compensation::checks(design, &core, &grid));
    let hold = transient::choose_hold_off(design, &core);
    checks.push(checks::power_on::check(design, &core, &hold));
    let hold_off_to_rail = match &hold {
        transient::HoldOffChoice::Fitted(h) => Some(h.to_rail),
        _ => None,
    };
    if let transient::HoldOffChoice::Fitted(h) = hold {
        values.push(assemble::hold_off_row(design, &core, &h));
    }
    checks.extend(steady_state_check(&core));
    let (compensation, uncompensated) = compensation_section(&choice, &core, &grid, &values);
    let drift = drift::drift(design, &core, &grid, uncompensated.as_deref());
    let section = output::circuit_section(design, &core, &grid, &mut values);
    let view = stage::StageView::new(design, &core.output, core.front.feedback_ohm.is_some());
    checks.extend(checks::stage::checks(&view));
    checks.extend(checks::comparator::checks(&view, &core));
    checks.extend(checks::ratings::checks(design, &section.rated));
    checks.extend(checks::supply::checks(design, &section.supply));
    values.extend(section.values);
    let values: Vec<_> = values.into_iter().map(|v| v.cleaned()).collect();
    let mut cautions = assemble::cautions(design, &core);
    cautions.extend(section.cautions);
    let element = format!(
        "{}, {}",
        design.element.resistance_law().name(),
        design.element.cooling_law().summary()
    );
    let mut warnings: Vec<String> = design.element.plausibility_warnings().to_vec();
    warnings.extend(divider_current_warning(design, &core));
    for (label, p) in &core.table {
        for w in design
            .element
            .range_warnings(p.temperature_k, p.airflow_m_per_s, &core.env)
        {
            let line = if label == "trip" {
                format!("{label}: {w} — the trip point itself rests on this extrapolation: treat it as uncertain and calibrate it on the bench")
            } else {
                format!("{label}: {w}")
            };
            if !warnings.contains(&line) {
                warnings.push(line);
            }
        }
    }
    let equivalent_kings_law = match design.element.cooling_law() {
        crate::element::CoolingLaw::King(_) => None,
        law => law
            .equivalent_kings_law(
                core.at_trip.temperature_k,
                design.detector.trip_airflow_m_per_s,
                &core.env,
            )
            .ok()
            .map(|k| crate::report::EquivalentKing {
                a_w_per_k: k.a_w_per_k(),
                b_w_per_k: k.b_w_per_k(),
                n: k.n(),
                at_temperature_c: assemble::to_c(core.at_trip.temperature_k),
            }),
    };
    let mut report = Report {
        schema_version: crate::report::SCHEMA_VERSION,
        tool_version: env!("CARGO_PKG_VERSION").to_string(),
        design_file: design.design_file.clone(),
        passed: false,
        comparator_limits: design.comparator.basis.describe().to_string(),
        diagnostics: checks::diagnostics(design, &core),
        title: design.title.clone(),
        element,
        drive: core.drive.name().to_string(),
        ambient_c: assemble::to_c(design.ambient.nominal_k),
        pressure_pa: design.ambient.pressure_pa,
        equivalent_kings_law,
        operating_points: core
            .table
            .iter()
            .map(|(l, p)| assemble::row(l, p))
            .collect(),
        trip: assemble::trip_summary(design, &core),
        values,
        drift,
        compensation,
        supply: section.supply,
        checks,
        warnings,
        cautions,
        assumptions: design.assumptions.clone(),
        nodes: Vec::new(),
        connections: Vec::new(),
    };
    // Drift rows whose trip lies outside the cooling law's calibrated range
    // (each site once, with how far it extrapolates).
    for row in &report.drift {
        let Some(u) = row.trip_airflow_m_per_s else {
            continue;
        };
        if let Some(w) = design.element.calibration_warning(u) {
            let line = format!("trip at {}: {w}", row.condition);
            if !report.warnings.contains(&line) {
                report.warnings.push(line);
            }
        }
    }
    let s = core.sensitivity_v_per_m_per_s;
    if s.is_nan() || s == 0.0 {
        report.warnings.push("the sense voltage does not move with airflow at the trip point: the cooling law is flat there (with `mixing = \"larger\"`, the target lies in its dead band, where forced convection is still below natural convection), so the detector cannot resolve its own trip point".into());
    }
    let (spread, spread_warning) = model_spread::model_spread(design, &core, &report.trip);
    report.trip.model_spread_m_per_s = spread;
    report.trip.support_loss = support_loss(design, &core);
    report.warnings.extend(spread_warning);
    wiring::apply(&mut report, design, &core, hold_off_to_rail);
    Ok(Sized {
        design: design.clone(),
        core,
        report: report.guarded().with_verdict(),
    })
}

/// The supports' share of the loss in still air and at the trip airflow,
/// for a wire whose supports follow the fin model.
fn support_loss(design: &Design, core: &size::SizedCore) -> Option<crate::report::SupportLoss> {
    let crate::element::CoolingLaw::Geometry(g) = design.element.cooling_law() else {
        return None;
    };
    let (still, lc_still) = g.support_share(core.still_air.temperature_k, 0.0, &core.env)?;
    let (trip, lc_trip) = g.support_share(
        core.at_trip.temperature_k,
        design.detector.trip_airflow_m_per_s,
        &core.env,
    )?;
    Some(crate::report::SupportLoss {
        share_still_air: still,
        share_at_trip: trip,
        cold_length_still_air_mm: lc_still * 1e3,
        cold_length_at_trip_mm: lc_trip * 1e3,
    })
}

/// A warning when the sized divider draws far from the current the file
/// asks for (more than twice or less than half): the file's wish could not
/// be honoured, and the report says why rather than staying silent.
fn divider_current_warning(design: &Design, core: &size::SizedCore) -> Option<String> {
    let wanted = design.detector.divider_current_a?;
    let fe =
        core.compensation
            .front_at(&core.front, &core.env, design.detector.trip_airflow_m_per_s);
    let drawn = fe.reference_rail_v / fe.divider.total_ohm();
    if drawn <= 2.0 * wanted && drawn >= 0.5 * wanted {
        return None;
    }
    let why = if core.compensation.is_some() {
        "the compensation's slope fixes the divider's total resistance"
    } else {
        "the divider's parts (a given value, or the smallest standard trimmer that covers the span) fix its total resistance"
    };
    Some(format!(
        "detector.divider_current asks for {}, but the sized divider draws {}: {why}",
        crate::quantity::format_engineering(wanted, "A", 3),
        crate::quantity::format_engineering(drawn, "A", 3)
    ))
}

/// The compensation section, and the uncompensated design's trip at every
/// site (only when there is compensation to compare with).
fn compensation_section(
    choice: &choice::Choice,
    core: &size::SizedCore,
    grid: &corners::Grid,
    values: &[crate::report::ValueRow],
) -> (
    crate::report::CompensationSection,
    Option<Vec<switching::Switching>>,
) {
    let design = &choice.design;
    let own = drift::grid_nominal(grid);
    let slope = drift::ambient_slope(design, core);
    let (plain, plain_slope) = if core.compensation.is_some() {
        let d = choice::with_kind(design, crate::design::model::CompensationKind::None);
        match size::size_core(&d) {
            Ok(plain) => (
                Some(drift::nominal_at_sites(&d, &plain, &grid.sites)),
                drift::ambient_slope(&d, &plain),
            ),
            Err(_) => (None, None),
        }
    } else {
        (Some(own.clone()), slope)
    };
    let section = crate::report::CompensationSection {
        kind: design.compensation.kind.name().into(),
        why: choice.why.clone(),
        drift_span_m_per_s: drift::span(&own),
        uncompensated_drift_span_m_per_s: plain.as_deref().and_then(drift::span),
        ambient_slope_m_per_s_per_k: slope,
        uncompensated_ambient_slope_m_per_s_per_k: plain_slope,
        parts: values
            .iter()
            .filter(|v| ["RC1", "RT1", "RR3"].contains(&v.designator.as_str()))
            .map(|v| v.designator.clone())
            .collect(),
        notes: core.compensation_notes.clone(),
    };
    let uncompensated = if core.compensation.is_some() {
        plain
    } else {
        None
    };
    (section, uncompensated)
}

/// `element-steady-state`: a steady state at every airflow of the table
/// (still-air runaway fails here, and the report still gives the airflows
/// that have one).
fn steady_state_check(core: &size::SizedCore) -> Option<Check> {
    let name = "element has a steady state at every airflow of the table";
    if core.unsolved.is_empty() {
        return None;
    }
    let list: Vec<String> = core
        .unsolved
        .iter()
        .map(|(l, u, e)| format!("{l} ({u:.3} m/s): {e}"))
        .collect();
    Some(
        Check::judged("element-steady-state", name, false)
            .at(format!(
                "nominal ambient and supply; {}",
                core.unsolved[0].0
            ))
            .detail(format!(
                "no steady state at: {}; the lowest airflow with one is {:.3} m/s",
                list.join("; "),
                core.still_air.airflow_m_per_s
            )),
    )
}

/// A report for a design that could not be sized at all: every value is
/// absent, and the one failing check says why.
pub fn unsized_report(design: &Design, error: &SizeError) -> Report {
    Report {
        schema_version: crate::report::SCHEMA_VERSION,
        tool_version: env!("CARGO_PKG_VERSION").to_string(),
        design_file: design.design_file.clone(),
        passed: false,
        comparator_limits: design.comparator.basis.describe().to_string(),
        title: design.title.clone(),
        element: format!(
            "{}, {}",
            design.element.resistance_law().name(),
            design.element.cooling_law().summary()
        ),
        drive: match design.drive {
            crate::design::model::DriveSpec::SeriesResistor { .. } => {
                "rail through a series resistor"
            }
            crate::design::model::DriveSpec::ConstantCurrent { .. } => "constant current",
        }
        .to_string(),
        ambient_c: assemble::to_c(design.ambient.nominal_k),
        pressure_pa: design.ambient.pressure_pa,
        equivalent_kings_law: None,
        operating_points: Vec::new(),
        trip: crate::report::TripSummary {
            direction: design.detector.trip_on.name().into(),
            target_airflow_m_per_s: design.detector.trip_airflow_m_per_s,
            band_m_per_s: [
                design.detector.trip_band_m_per_s.0,
                design.detector.trip_band_m_per_s.1,
            ],
            background_airflow_m_per_s: design.detector.background_airflow_m_per_s,
            normal_airflow_m_per_s: design.detector.normal_airflow_m_per_s,
            ..crate::report::TripSummary::default()
        },
        values: Vec::new(),
        drift: Vec::new(),
        compensation: crate::report::CompensationSection {
            kind: design.compensation.kind.name().into(),
            ..Default::default()
        },
        supply: crate::report::SupplyBudget::default(),
        checks: vec![
            Check::judged("design-sizable", "the design can be sized", false)
                .at("nominal parts, nominal ambient and supply")
                .detail(error.to_string()),
        ],
        diagnostics: Vec::new(),
        warnings: Vec::new(),
        cautions: assemble::standing_cautions(),
        assumptions: design.assumptions.clone(),
        nodes: Vec::new(),
        connections: Vec::new(),
    }
}
