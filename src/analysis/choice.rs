//! Choosing the ambient compensation when the file says `kind = "auto"`:
//! each variant is sized and judged at every condition; the first, in
//! order of parts added (none, a twin, a thermistor and its linearising
//! resistor), whose trip checks all pass is taken. When none holds, the one
//! with the narrowest worst-case trip range is taken and the report says
//! that none holds.

use super::checks;
use super::corners::{self, Grid};
use super::size::{size_core, SizeError, SizedCore};
use crate::design::model::CompensationKind;
use crate::design::Design;

/// The design with its compensation resolved, and why.
#[derive(Debug, Clone)]
pub struct Choice {
    /// The design with a concrete compensation kind.
    pub design: Design,
    /// Why this kind, in words.
    pub why: String,
}

/// Parts each variant adds to a plain divider.
fn parts_added(kind: CompensationKind) -> usize {
    match kind {
        CompensationKind::Twin => 1,
        CompensationKind::Thermistor => 2,
        _ => 0,
    }
}

/// The worst-case trip range over every build and condition, m/s
/// (`None` when some condition never switches).
pub fn trip_range(grid: &Grid) -> Option<(f64, f64)> {
    let mut lo = f64::INFINITY;
    let mut hi = f64::NEG_INFINITY;
    for o in &grid.outcomes {
        let u = o.trip.airflow()?;
        lo = lo.min(u);
        hi = hi.max(u);
    }
    (lo <= hi).then_some((lo, hi))
}

/// The design with `kind` in place of its own.
pub fn with_kind(design: &Design, kind: CompensationKind) -> Design {
    let mut d = design.clone();
    d.compensation.kind = kind;
    d
}

/// Resolve `auto`; any other kind is taken as the file gives it.
pub fn resolve(design: &Design) -> Choice {
    let kind = design.compensation.kind;
    if kind != CompensationKind::Auto {
        return Choice {
            design: design.clone(),
            why: match kind {
                CompensationKind::None => {
                    "no compensation: a fixed-ratio reference (the design file asks for none)"
                        .into()
                }
                k => format!("{} compensation, as the design file asks", k.name()),
            },
        };
    }
    let mut tried = Vec::new();
    let mut best: Option<(f64, CompensationKind, String)> = None;
    for k in [
        CompensationKind::None,
        CompensationKind::Twin,
        CompensationKind::Thermistor,
    ] {
        let d = with_kind(design, k);
        let (core, grid) = match size_core(&d) {
            Ok(core) => {
                let grid = corners::evaluate(&d, &core);
                (core, grid)
            }
            Err(e) => {
                tried.push(format!("{}: cannot be sized ({e})", k.name()));
                continue;
            }
        };
        let failing = failing_trip_checks(&d, &core, &grid);
        let range = trip_range(&grid);
        let range_text = range.map_or("some condition never switches".to_string(), |(a, b)| {
            format!("trips at {a:.3}–{b:.3} m/s")
        });
        if failing.is_empty() {
            let others = if tried.is_empty() {
                String::new()
            } else {
                format!(" ({})", tried.join("; "))
            };
            return Choice {
                design: d,
                why: format!(
                    "auto: {} holds the trip band at every condition ({range_text}) with the fewest added parts ({}){others}",
                    describe(k),
                    parts_added(k)
                ),
            };
        }
        tried.push(format!(
            "{}: {range_text}, fails {}",
            k.name(),
            failing.join(", ")
        ));
        let width = range.map_or(f64::INFINITY, |(a, b)| b - a);
        if best.as_ref().is_none_or(|(w, _, _)| width < *w) {
            best = Some((width, k, range_text));
        }
    }
    let why = match &best {
        Some((w, k, text)) if w.is_finite() => format!(
            "auto: no variant holds the trip band at every condition ({}); {} gives the narrowest trip range ({text})",
            tried.join("; "),
            describe(*k)
        ),
        Some((_, k, _)) => format!(
            "auto: no variant switches at every condition ({}); {} is kept",
            tried.join("; "),
            describe(*k)
        ),
        None => format!(
            "auto: no variant could be sized ({}); the plain divider is kept",
            tried.join("; ")
        ),
    };
    let k = best.map_or(CompensationKind::None, |(_, k, _)| k);
    Choice {
        design: with_kind(design, k),
        why,
    }
}

fn describe(k: CompensationKind) -> &'static str {
    match k {
        CompensationKind::None => "a fixed-ratio reference (no compensation)",
        CompensationKind::Twin => "a twin-element bridge",
        CompensationKind::Thermistor => "a thermistor-compensated reference",
        CompensationKind::Auto => "auto",
    }
}

/// Ids of the trip checks (and the twin's self-heating) that fail.
fn failing_trip_checks(design: &Design, core: &SizedCore, grid: &Grid) -> Vec<String> {
    checks::trip::checks(design, grid)
        .into_iter()
        .chain(checks::compensation::checks(design, core, grid))
        .filter(|c| !c.passed)
        .map(|c| c.id)
        .collect()
}

/// Size a design after resolving its compensation.
pub fn size_resolved(design: &Design) -> Result<(Choice, SizedCore), SizeError> {
    let choice = resolve(design);
    let core = size_core(&choice.design)?;
    Ok((choice, core))
}
