//! Analyses built on the solvers: sizing, drift, checks, the report.

pub mod assemble;
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
    if design.detector.trip_on == crate::design::model::TripDirection::Rising {
        let false_trips: Vec<&str> = drift
            .iter()
            .filter(|r| r.tripped_in_still_air)
            .map(|r| r.condition.as_str())
            .collect();
        checks.push(crate::report::Check {
            name: "no false trip in still air".into(),
            passed: false_trips.is_empty(),
            detail: if false_trips.is_empty() {
                "still air leaves the output idle at every ambient and supply end".into()
            } else {
                format!("tripped in still air at: {}", false_trips.join(", "))
            },
        });
    }
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
    Ok(Report {
        title: design.title.clone(),
        element,
        drive: core.drive.name().to_string(),
        ambient_c: assemble::to_c(design.ambient.nominal_k),
        pressure_pa: design.ambient.pressure_pa,
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
        cautions,
        assumptions: design.assumptions.clone(),
    })
}
