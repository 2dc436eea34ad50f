//! The compensating part must stay near the ambient it stands for.
//!
//! - `twin-self-heating`: the unheated twin of a bridge. Its own
//!   dissipation warms it, and a warm twin reads as a warmer room: the trip
//!   point moves with an airflow-dependent self-heating the compensation
//!   cannot cancel. Limit: a share of the sensing element's overheat at the
//!   trip airflow (`twin_max_rise`, 2 % unless the file says otherwise).
//! - `thermistor-self-heating`: the NTC of a compensated reference. A
//!   thermistor warmed above the air reads a warmer room. Limit:
//!   [`THERMISTOR_MAX_RISE_K`].
//!
//! Both are judged at every build and site in still air (where a twin runs
//! warmest), with each unit's own regulated rail.

use super::super::compensation::Compensator;
use super::super::corners::{parts, unit_rail_v, Grid};
use super::super::size::SizedCore;
use crate::design::Design;
use crate::element::Environment;
use crate::report::Check;

/// Largest self-heating rise of a compensating thermistor, K: half a
/// kelvin of error in the ambient it reads (draftwire's limit, no source;
/// a tenth of the typical ±5 K of an ambient range's half-width).
pub const THERMISTOR_MAX_RISE_K: f64 = 0.5;

/// The compensating part's self-heating check, when the design has one.
pub fn checks(design: &Design, core: &SizedCore, grid: &Grid) -> Vec<Check> {
    let overheat = core.at_trip.temperature_k - core.env.ambient_k;
    let (id, name, limit, what) = match &core.compensation {
        Compensator::None => return Vec::new(),
        Compensator::Twin(_) => {
            let share = design.compensation.twin.max_rise_share;
            (
                "twin-self-heating",
                "the ambient twin stays near the ambient",
                share * overheat,
                format!(
                    "{} % of the sensing element's {overheat:.1} K overheat at the trip airflow",
                    crate::quantity::format_sig(100.0 * share, 3)
                ),
            )
        }
        Compensator::Thermistor(_) => (
            "thermistor-self-heating",
            "the compensating thermistor stays near the ambient",
            THERMISTOR_MAX_RISE_K,
            "draftwire's limit for an ambient sensor".to_string(),
        ),
    };
    let mut worst: Option<(f64, usize, usize)> = None;
    for (bi, b) in grid.builds.iter().enumerate() {
        let p = parts(core, b);
        for (si, site) in grid.sites.iter().enumerate() {
            let env = Environment {
                ambient_k: site.ambient_k,
                ..core.env
            };
            let rail = unit_rail_v(
                design,
                b,
                Some(design.detector.reference_rail),
                site.reference_rail_v,
            );
            let Some(st) = p.comp.state(&p.divider, rail, &env, 0.0) else {
                continue;
            };
            // No steady state (infinite rise) is the worst of all.
            let rise = st.temperature_k - site.ambient_k;
            let rise = if rise.is_finite() { rise } else { f64::MAX };
            if worst.is_none_or(|(w, _, _)| rise > w) {
                worst = Some((rise, bi, si));
            }
        }
    }
    let Some((rise, bi, si)) = worst else {
        return Vec::new();
    };
    let condition = format!(
        "still air; {}; {}",
        grid.sites[si].label, grid.builds[bi].label
    );
    if rise == f64::MAX {
        return vec![Check::judged(id, name, false)
            .at(condition)
            .detail("it has no steady state: its own current drives it into runaway")];
    }
    vec![Check::at_most(id, name, rise, limit, "K")
        .at(condition)
        .detail(format!(
            "self-heating rise {rise:.3} K against {what} ({limit:.3} K); a larger part resistance or a higher divider resistance runs it cooler"
        ))]
}
