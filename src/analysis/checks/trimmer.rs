//! The trimmer: it reaches the target for the nominal build near
//! mid-travel, and every build a batch of parts can give can be trimmed
//! onto the target at the bench.

use crate::analysis::corners::Grid;
use crate::design::Design;
use crate::report::Check;

/// Window for "near mid-travel": a quarter of the travel either side leaves
/// room to trim both ways (draftwire's choice, no source).
pub const MID_TRAVEL_WINDOW: (f64, f64) = (0.25, 0.75);

/// Trimmer positions closer than this are float noise between builds.
const TIE: f64 = 1e-12;

/// The trimmer checks (none for a pinned trimmer: the trip band judges it).
pub fn checks(design: &Design, grid: &Grid) -> Vec<Check> {
    if design.detector.trimmer_position.is_some() {
        return Vec::new();
    }
    vec![reaches(design, grid), mid_travel(grid), coverage(grid)]
}

/// What to change when the trimmer cannot reach: the fixed values the file
/// gives, or — when the divider was sized — the sizing's inputs.
fn reach_advice(design: &Design) -> &'static str {
    use crate::design::model::Sizable::Fixed;
    let d = &design.detector;
    let any_fixed = [d.top_ohm, d.trimmer_ohm, d.bottom_ohm]
        .iter()
        .any(|s| matches!(s, Fixed(_)));
    if any_fixed {
        "change the divider values the file fixes (or leave them \"auto\" to be sized)"
    } else {
        "the divider was sized for this target, so the element, drive or reference rail cannot give a switching level inside the rail: check the overheat, the drive and the reference rail"
    }
}

fn reaches(design: &Design, grid: &Grid) -> Check {
    let name = "trimmer reaches the target";
    let at = "nominal parts at the bench (nominal ambient and supply)";
    match grid.trims[0].needed {
        Some(x) => {
            let pct = 100.0 * x;
            let check = if x < 0.5 {
                Check::at_least("trimmer-reaches-target", name, pct, 0.0, "%")
            } else {
                Check::at_most("trimmer-reaches-target", name, pct, 100.0, "%")
            };
            let ok = check.passed;
            check.at(at).detail(if ok {
                format!("target at {pct:.1} % of travel")
            } else {
                format!(
                    "target needs {pct:.1} % of travel, outside 0–100 %: {}",
                    reach_advice(design)
                )
            })
        }
        None => Check::judged("trimmer-reaches-target", name, false)
            .at(at)
            .detail("the element has no steady state at the target airflow"),
    }
}

fn mid_travel(grid: &Grid) -> Check {
    let (lo, hi) = MID_TRAVEL_WINDOW;
    let name = "trimmer near mid-travel";
    let Some(x) = grid.trims[0].needed else {
        return Check::judged("trimmer-mid-travel", name, false)
            .detail("the element has no steady state at the target airflow");
    };
    let c = if x < 0.5 {
        Check::at_least("trimmer-mid-travel", name, 100.0 * x, 100.0 * lo, "%")
    } else {
        Check::at_most("trimmer-mid-travel", name, 100.0 * x, 100.0 * hi, "%")
    };
    c.at("nominal parts at the bench").detail(format!(
        "{:.1} % of travel (wanted {:.0}–{:.0} %)",
        100.0 * x,
        100.0 * lo,
        100.0 * hi
    ))
}

/// `trimmer-coverage`: every tolerance vertex can be trimmed onto the
/// target at the bench, with the fixed resistors and the trimmer track at
/// their tolerance ends.
fn coverage(grid: &Grid) -> Check {
    let name = "trimmer covers every build's part tolerances";
    let mut lo: Option<(usize, f64)> = None;
    let mut hi: Option<(usize, f64)> = None;
    let mut unsolved = Vec::new();
    for (i, t) in grid.trims.iter().enumerate() {
        match t.needed {
            Some(x) => {
                if lo.is_none_or(|(_, v)| x < v - TIE) {
                    lo = Some((i, x));
                }
                if hi.is_none_or(|(_, v)| x > v + TIE) {
                    hi = Some((i, x));
                }
            }
            None => unsolved.push(grid.builds[i].label.clone()),
        }
    }
    let (Some((il, xl)), Some((ih, xh))) = (lo, hi) else {
        return Check::judged("trimmer-coverage", name, false)
            .detail("no build has a steady state at the target airflow");
    };
    // The end with less room is the worst.
    let (check, worst) = if xl < 1.0 - xh {
        (
            Check::at_least("trimmer-coverage", name, 100.0 * xl, 0.0, "%"),
            il,
        )
    } else {
        (
            Check::at_most("trimmer-coverage", name, 100.0 * xh, 100.0, "%"),
            ih,
        )
    };
    let passed = check.passed && unsolved.is_empty();
    let check = check.passed_if(passed).at(format!(
        "{} (trimmed at the bench)",
        grid.builds[worst].label
    ));
    let mut detail = format!(
        "the {} builds at the tolerance corners need {:.1}–{:.1} % of travel",
        grid.builds.len(),
        100.0 * xl,
        100.0 * xh
    );
    if !unsolved.is_empty() {
        detail.push_str(&format!(
            "; no steady state at the target for: {}",
            unsolved.join("; ")
        ));
    }
    if !passed {
        detail.push_str(" — some builds cannot be trimmed onto the target: a larger trimmer, tighter fixed resistors or a tighter element tolerance would help");
    }
    check.detail(detail)
}

#[cfg(test)]
mod tests {
    use super::*;

    const SERVER: &str = include_str!("../../../examples/server-cabinet-airflow.toml");

    /// With every divider part `auto`, a trimmer that cannot reach is a
    /// sizing limit, not a fixed value to change (issue 14); with a fixed
    /// part, the advice names the fixed values.
    #[test]
    fn reach_advice_names_what_the_file_fixes() {
        let sized = crate::design::parse_design("s.toml", SERVER).unwrap();
        let advice = reach_advice(&sized);
        assert!(advice.contains("sized"), "{advice}");
        assert!(!advice.contains("fixes"), "{advice}");
        let fixed = SERVER.replace("top = \"auto\"", "top = \"10 kohm\"");
        let fixed = crate::design::parse_design("s.toml", &fixed).unwrap();
        assert!(reach_advice(&fixed).contains("the file fixes"));
    }
}
