//! Every design check, one small function per family, each returning
//! structured [`Check`]s that the renderers turn into text. A check is
//! judged at its worst combined condition (see [`super::corners`]) and
//! names that condition; solver self-checks are [`diagnostics`] and do not
//! count toward the verdict.
//!
//! Where to find a check by its id (docs/cli.md lists them all):
//! - `trip-band`, `no-false-trip`, `releases-when-quiet`: [`trip`]
//! - `trimmer-reaches-target`, `trimmer-mid-travel`, `trimmer-coverage`: [`trimmer`]
//! - `element-limit`, `no-hot-latch`: [`element`]
//! - `twin-self-heating`, `thermistor-self-heating`: [`compensation`]
//! - `power-on-false-alarm`: [`power_on`]
//! - `comparator-supply`, `comparator-common-mode`, `comparator-sink`,
//!   `comparator-input-error`: [`comparator`]
//! - `led-headroom`, `k1-coil-voltage`, `d1-ratings`, `q1-saturation`,
//!   `q1-ratings`, `q1-hold-off`: [`stage`]
//! - `regulator-dropout`, `regulator-junction`: [`supply`]
//! - `power-rating-<designator>`: [`ratings`]
//! - `element-steady-state`, `design-sizable`: [`super`] (`analysis/mod.rs`)

pub mod comparator;
pub mod compensation;
pub mod element;
pub mod power_on;
pub mod ratings;
pub mod stage;
pub mod supply;
pub mod trimmer;
pub mod trip;

use super::size::SizedCore;
use crate::design::Design;
use crate::precision::ENERGY_BALANCE_REL_TOL;
use crate::report::Check;

/// Every check id draftwire can emit, with its name; `power-rating-` is
/// followed by a designator in lower case.
pub const CHECK_IDS: &[&str] = &[
    "trip-band",
    "no-false-trip",
    "releases-when-quiet",
    "trimmer-reaches-target",
    "trimmer-mid-travel",
    "trimmer-coverage",
    "element-limit",
    "no-hot-latch",
    "twin-self-heating",
    "thermistor-self-heating",
    "power-on-false-alarm",
    "element-steady-state",
    "comparator-supply",
    "comparator-common-mode",
    "comparator-sink",
    "comparator-input-error",
    "led-headroom",
    "k1-coil-voltage",
    "d1-ratings",
    "q1-saturation",
    "q1-ratings",
    "q1-hold-off",
    "regulator-dropout",
    "regulator-junction",
    "design-sizable",
    "internal-non-finite",
    "power-rating-",
];

/// Energy-balance residuals below this are rounding noise.
const RESIDUAL_NOISE: f64 = 1e-12;

/// Solver self-checks: the energy balance closes at every solved point, and
/// the reported trimmer setting reproduces the target.
pub fn diagnostics(design: &Design, core: &SizedCore) -> Vec<Check> {
    let worst = core
        .table
        .iter()
        .map(|(_, p)| p.balance_residual())
        .fold(0.0, f64::max);
    let mut out = vec![Check::at_most(
        "energy-balance",
        "energy balance closes",
        worst,
        ENERGY_BALANCE_REL_TOL,
        "1",
    )
    .at("every operating point of the table")
    .detail(format!(
        "largest relative residual {} (limit {ENERGY_BALANCE_REL_TOL:.0e})",
        // Below 1e-12 the figure is rounding noise that changes with any
        // solver detail: say so rather than print it.
        if worst < RESIDUAL_NOISE {
            format!("below {RESIDUAL_NOISE:.0e}")
        } else {
            format!("{worst:.1e}")
        }
    ))];
    if design.detector.trimmer_position.is_none() {
        let u_t = design.detector.trip_airflow_m_per_s;
        if let Some(u) = core.trip_airflow_m_per_s {
            let err = (u - u_t).abs();
            out.push(
                Check::at_most(
                    "trip-on-target",
                    "sized trimmer setting reproduces the target",
                    err,
                    1e-6 * u_t.max(1.0),
                    "m/s",
                )
                .at("nominal parts, nominal ambient and supply")
                .detail(format!(
                    "{u:.6} m/s at the reported setting, target {u_t} m/s"
                )),
            );
        }
    }
    out
}
