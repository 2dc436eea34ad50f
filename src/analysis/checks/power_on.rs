//! `power-on-false-alarm`: after every power-on the element starts cold;
//! a rising-trip detector then reads as tripped until it warms up. The
//! design, with its hold-off capacitor if it has one, must not be falsely
//! active for longer than `[detector] power_on_grace` (0 s unless the file
//! accepts some), at the nominal and the coldest ambient, at the quiet
//! airflow (`analysis::transient`).

use super::super::size::SizedCore;
use super::super::transient::{power_on, HoldOffChoice};
use crate::design::Design;
use crate::report::Check;

/// The power-on check for the design with its hold-off choice.
pub fn check(design: &Design, core: &SizedCore, hold: &HoldOffChoice) -> Check {
    let grace = design.detector.power_on_grace_s;
    let fitted = match hold {
        HoldOffChoice::Fitted(h) => Some(*h),
        _ => None,
    };
    let runs = [design.ambient.nominal_k, design.ambient.min_k]
        .map(|t| (t, power_on(design, core, t, fitted).false_alarm_s));
    let (worst_t, worst) = runs
        .iter()
        .copied()
        .fold((runs[0].0, f64::NEG_INFINITY), |a, b| {
            if b.1 > a.1 {
                b
            } else {
                a
            }
        });
    let without = match hold {
        HoldOffChoice::Fitted(_) => [design.ambient.nominal_k, design.ambient.min_k]
            .iter()
            .map(|&t| power_on(design, core, t, None).false_alarm_s)
            .fold(0.0, f64::max),
        _ => worst,
    };
    let what = match hold {
        HoldOffChoice::Fitted(h) => format!(
            "with the {} hold-off capacitor CH1 (without it: {without:.3} s)",
            crate::quantity::format_engineering(h.capacitance_f, "F", 2)
        ),
        HoldOffChoice::NotWanted => "no hold-off (the file asks for none)".into(),
        HoldOffChoice::Impossible => {
            "no hold-off capacitor up to 10 mF removes it: delay the load's supply instead, or accept it with power_on_grace".into()
        }
        HoldOffChoice::NotNeeded => "no hold-off needed".into(),
    };
    Check::at_most(
        "power-on-false-alarm",
        "no false alarm after power-on",
        worst,
        grace,
        "s",
    )
    .at(format!(
        "power-on from a cold element at {:.1} °C, quiet airflow {} m/s",
        worst_t - 273.15,
        super::super::transient::quiet_airflow(design)
    ))
    .detail(format!(
        "falsely active for {worst:.3} s while the element warms up, {what}; accepted: {grace} s (power_on_grace)"
    ))
}
