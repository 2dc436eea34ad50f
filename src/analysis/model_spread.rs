//! The convection model's own spread on the trip point (issue 11): the
//! built circuit's nominal trip airflow under every rule for combining
//! forced and natural convection from a fine wire, where the published
//! rules disagree most. A spread wider than the trip band means the trip
//! point cannot be trusted before a bench calibration (`draftwire fit`).

use crate::analysis::size::SizedCore;
use crate::design::Design;
use crate::physics::convection::{FlowDirection, MixingRule};
use crate::report::{ModelSpread, TripSummary};
use crate::solve::airflow_for_sense;

/// The rules compared: every rule draftwire offers and the design's own
/// (when it is Churchill–Usagi at another exponent).
fn rules(chosen: MixingRule) -> Vec<MixingRule> {
    let mut r = MixingRule::ALL.to_vec();
    if !r.contains(&chosen) {
        r.push(chosen);
    }
    r
}

fn key(rule: MixingRule) -> String {
    match rule {
        MixingRule::ChurchillUsagi { exponent } => format!(
            "churchill-usagi (m = {})",
            crate::quantity::format_sig(exponent, 3)
        ),
        MixingRule::EffectiveVelocity {
            flow: FlowDirection::Assisting,
        } => "effective-velocity (assisting)".to_string(),
        r => r.name().to_string(),
    }
}

/// The spread, and a warning when it is wider than the trip band; `None`
/// for cooling laws without a mixing rule, or where a twin in the air
/// stream would need its own model per rule (said in the warning).
pub fn model_spread(
    design: &Design,
    core: &SizedCore,
    trip: &TripSummary,
) -> (Option<ModelSpread>, Option<String>) {
    let cooling = core.element.cooling_law();
    let Some(chosen) = cooling.mixing() else {
        return (None, None);
    };
    if core.compensation.in_air_stream() {
        return (
            None,
            Some("the trip airflow's spread over the convection model's mixing rules is not computed with a twin in the air stream (the twin's cooling would change with the rule too): calibrate on the bench with `draftwire fit`".into()),
        );
    }
    let target = design.detector.trip_airflow_m_per_s;
    let mut by_rule = std::collections::BTreeMap::new();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for rule in rules(chosen) {
        let Some(law) = cooling.with_mixing(rule) else {
            continue;
        };
        let element = core.element.with_cooling_law(law);
        let u = airflow_for_sense(
            &element,
            &core.drive,
            &core.env,
            trip.sense_voltage_v,
            target,
        )
        .ok()
        .filter(|u| u.is_finite());
        if let Some(u) = u {
            lo = lo.min(u);
            hi = hi.max(u);
        }
        by_rule.insert(key(rule), u);
    }
    if !lo.is_finite() {
        return (None, None);
    }
    let band = trip.band_m_per_s[1] - trip.band_m_per_s[0];
    let never: Vec<&str> = by_rule
        .iter()
        .filter(|(_, u)| u.is_none())
        .map(|(k, _)| k.as_str())
        .collect();
    let warning = if !never.is_empty() {
        Some(format!(
            "under the convection model's {} rule{} the built circuit never switches between still air and 100 m/s at its trip level: the trip point rests on the mixing rule; calibrate on the bench with `draftwire fit`",
            never.join(", "),
            if never.len() > 1 { "s" } else { "" }
        ))
    } else {
        (hi - lo > band).then(|| {
            format!(
                "the convection model's mixing rules put the nominal trip airflow anywhere from {} to {} m/s, wider than the trip band ({} m/s wide): the trip point cannot be trusted until a bench calibration (`draftwire fit`) fixes the cooling law",
                crate::quantity::format_sig(lo, 3),
                crate::quantity::format_sig(hi, 3),
                crate::quantity::format_sig(band, 3)
            )
        })
    };
    (
        Some(ModelSpread {
            min: lo,
            max: hi,
            chosen: key(chosen),
            by_rule,
        }),
        warning,
    )
}
