//! Analyses built on the solvers: sizing, drift, checks, the report.

pub mod assemble;
pub mod compare;
pub mod drift;
pub mod output;
pub mod size;

use crate::design::Design;
use crate::report::Report;
pub use size::SizeError;

/// Size and check a design: the whole `size` job.
pub fn size(design: &Design) -> Result<Report, SizeError> {
    let core = size::size_core(design)?;
    let mut values = assemble::core_values(design, &core);
    let mut checks = assemble::core_checks(design, &core);
    let drift = drift::drift(design, &core);
    checks.extend(drift::drift_checks(design, &drift));
    let section = output::circuit_section(design, &core, &mut values);
    values.extend(section.values);
    checks.extend(section.checks);
    let mut cautions = assemble::cautions(design, &core);
    cautions.extend(section.cautions);
    let element = format!(
        "{}, {}",
        design.element.resistance_law().name(),
        design.element.cooling_law().name()
    );
    let mut warnings: Vec<String> = Vec::new();
    for (label, p) in &core.table {
        for w in design
            .element
            .range_warnings(p.temperature_k, p.airflow_m_per_s, &core.env)
        {
            let line = format!("{label}: {w}");
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
    Ok(Report {
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
        supply: section.supply,
        checks,
        warnings,
        cautions,
        assumptions: design.assumptions.clone(),
    })
}
