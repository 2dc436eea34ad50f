//! `twin-self-heating`: the unheated twin of a bridge must stay near the
//! ambient. Its own dissipation warms it, and a warm twin reads as a warmer
//! room: the trip point moves with the airflow-dependent self-heating the
//! compensation cannot cancel. Judged at every build and condition in
//! still air, where the twin runs warmest, against a share of the sensing
//! element's overheat at the trip airflow (2 % unless the file says
//! otherwise).

use super::super::compensation::Compensator;
use super::super::corners::{parts, Grid};
use super::super::size::SizedCore;
use crate::design::Design;
use crate::element::Environment;
use crate::report::Check;

/// The twin's self-heating check, when the design has a twin.
pub fn checks(design: &Design, core: &SizedCore, grid: &Grid) -> Vec<Check> {
    if !matches!(core.compensation, Compensator::Twin(_)) {
        return Vec::new();
    }
    let share = design.compensation.twin.max_rise_share;
    let overheat = core.at_trip.temperature_k - core.env.ambient_k;
    let limit = share * overheat;
    let mut worst: Option<(f64, usize, usize)> = None;
    for (bi, b) in grid.builds.iter().enumerate() {
        let p = parts(core, b);
        for (si, site) in grid.sites.iter().enumerate() {
            let env = Environment {
                ambient_k: site.ambient_k,
                ..core.env
            };
            let Some(st) = p.comp.state(&p.divider, site.reference_rail_v, &env, 0.0) else {
                continue;
            };
            let rise = st.temperature_k - site.ambient_k;
            // A twin with no steady state (infinite rise) is the worst of all.
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
        return vec![Check::judged(
            "twin-self-heating",
            "the ambient twin stays near the ambient",
            false,
        )
        .at(condition)
        .detail("the twin has no steady state: its arm drives it into runaway")];
    }
    vec![Check::at_most(
        "twin-self-heating",
        "the ambient twin stays near the ambient",
        rise,
        limit,
        "K",
    )
    .at(condition)
    .detail(format!(
        "the twin's self-heating rise {rise:.3} K against {} % of the sensing element's {overheat:.1} K overheat at the trip airflow ({limit:.3} K); a larger twin resistance (or a higher divider resistance) runs it cooler",
        crate::quantity::format_sig(100.0 * share, 3)
    ))]
}
