//! The element itself: it stays below its temperature limit in the hottest
//! combined condition, and it has no second, hot stable state it can latch
//! into.

use crate::analysis::corners::{drive_value, Grid};
use crate::analysis::size::{drive_with, element_rail, SizedCore};
use crate::design::Design;
use crate::element::Environment;
use crate::report::Check;
use crate::solve::operating_point;

/// Element checks.
pub fn checks(design: &Design, core: &SizedCore, grid: &Grid) -> Vec<Check> {
    let mut out = Vec::new();
    if let Some(c) = limit(design, core) {
        out.push(c);
    }
    out.push(hot_latch(grid));
    out
}

/// The hottest still-air temperature over the highest ambient, the
/// highest element rail and the tolerance ends of the element and the
/// drive, with the condition in words.
pub fn hottest_still_air(design: &Design, core: &SizedCore) -> (f64, String) {
    let rail_hi = element_rail(design).map_or(0.0, |r| design.supply.rail_range_v(r).1);
    let env = Environment {
        ambient_k: design.ambient.max_k,
        ..core.env
    };
    let mut best = (
        core.still_air.temperature_k,
        "nominal ambient and supply".to_string(),
    );
    let (te, td) = (design.element_tolerance, design.drive_tolerance);
    for fe in [1.0 - te, 1.0 + te] {
        let element = core
            .element
            .with_resistance_law(core.element.resistance_law().scaled(fe));
        for fd in [1.0 - td, 1.0 + td] {
            let drive = drive_with(&design.drive, drive_value(core) * fd, rail_hi);
            if let Ok(p) = operating_point(&element, &drive, &env, 0.0) {
                if p.temperature_k > best.0 {
                    best = (
                        p.temperature_k,
                        format!(
                            "still air, {:.1} °C, highest rail, element {} %, drive {} %",
                            env.ambient_k - 273.15,
                            crate::quantity::format_signed(100.0 * (fe - 1.0), 3),
                            crate::quantity::format_signed(100.0 * (fd - 1.0), 3)
                        ),
                    );
                }
            }
        }
    }
    best
}

/// `element-limit`.
fn limit(design: &Design, core: &SizedCore) -> Option<Check> {
    let t_max = core.element.max_temperature_k()?;
    let (t, how) = hottest_still_air(design, core);
    let c = Check::at_most(
        "element-limit",
        "element temperature within its limit",
        t - 273.15,
        t_max - 273.15,
        "°C",
    )
    .at(how);
    let d = format!(
        "{:.1} °C against a limit of {:.1} °C in air (margin {:.1} K){}",
        t - 273.15,
        t_max - 273.15,
        t_max - t,
        if c.passed {
            ""
        } else {
            " — ask for less overheat or choose an element rated hotter"
        }
    );
    Some(c.detail(d))
}

/// `no-hot-latch`: no condition gives the element a second stable state.
fn hot_latch(grid: &Grid) -> Check {
    let name = "cannot latch hot (one stable state at every condition)";
    let worst = grid
        .hot_states
        .iter()
        .max_by(|a, b| a.2.temperature_k.total_cmp(&b.2.temperature_k));
    match worst {
        None => Check::judged("no-hot-latch", name, true)
            .at("every build, ambient and supply end")
            .detail("one stable steady state at still air, the quiet airflow and the trip airflow in every condition"),
        Some(&(b, s, h)) => Check::judged("no-hot-latch", name, false)
            .numbers(Some(h.temperature_k - 273.15), None, "°C")
            .at(format!(
                "{} m/s, {}; {}",
                crate::quantity::format_sig(h.airflow_m_per_s, 3),
                grid.sites[s].label,
                grid.builds[b].label
            ))
            .detail(format!(
                "the element can also rest at {:.1} °C ({} through it) — a disturbance can latch it there, hot and with the detector blind; add series resistance, use a current drive or ask for less overheat ({} condition(s) affected)",
                h.temperature_k - 273.15,
                crate::quantity::format_engineering(h.current_a, "A", 3),
                grid.hot_states.len()
            )),
    }
}
