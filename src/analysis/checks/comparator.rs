//! The comparator against its data-sheet limits (25 °C or full range, as
//! the design applies them): supply range, both inputs inside the
//! common-mode range at every condition, output sink current with a stated
//! design margin, and the input bias-current error.

use crate::analysis::size::{drive_with, element_rail, SizedCore};
use crate::analysis::stage::{rail3, StageView, SINK_DESIGN_SHARE};
use crate::circuit::comparator::ComparatorParams;
use crate::circuit::frontend::{FrontEnd, OutputState};
use crate::design::model::{Design, LimitsBasis, Rail, StageKind};
use crate::drive::Drive;
use crate::element::Environment;
use crate::quantity::format_engineering;
use crate::report::Check;
use crate::solve::operating_point;

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

fn basis(design: &Design) -> &'static str {
    if design.comparator.basis == LimitsBasis::FullRange {
        "full-temperature-range"
    } else {
        "25 °C"
    }
}

/// Every comparator check.
pub(crate) fn checks(v: &StageView, core: &SizedCore) -> Vec<Check> {
    vec![
        supply(v),
        common_mode(v.design, core, &v.comparator),
        sink(v, core),
        input_error(v, core),
    ]
}

/// `comparator-supply`: the comparator's rail inside its supply range.
fn supply(v: &StageView) -> Check {
    let (cmp, design) = (&v.comparator, v.design);
    let (vcc_lo, vcc_hi) = (v.vcc_lo, v.vcc_hi);
    let (ok_lo, m_lo) = cmp.supply_ok(vcc_lo);
    let (ok_hi, m_hi) = cmp.supply_ok(vcc_hi);
    let name = "comparator supply within its range";
    let c = if m_lo < m_hi {
        Check::at_least("comparator-supply", name, vcc_lo, cmp.supply_min_v, "V")
            .at(format!("lowest {} rail", design.comparator.rail.name()))
    } else {
        Check::at_most("comparator-supply", name, vcc_hi, cmp.supply_max_v, "V")
            .at(format!("highest {} rail", design.comparator.rail.name()))
    };
    c.passed_if(ok_lo && ok_hi).detail(format!(
        "the {} rail spans {vcc_lo:.2}–{vcc_hi:.2} V against {:.1}–{:.1} V (margin {:.2} V)",
        design.comparator.rail.name(),
        cmp.supply_min_v,
        cmp.supply_max_v,
        m_lo.min(m_hi)
    ))
}

/// `comparator-sink`: with the output low it sinks the pull-up current,
/// the load or the PNP's base drive, and the hysteresis feedback current;
/// all of it within [`SINK_DESIGN_SHARE`] of the limit.
fn sink(v: &StageView, core: &SizedCore) -> Check {
    let (cmp, design) = (&v.comparator, v.design);
    let (vcc_hi, vol) = (v.vcc_hi, v.vol);
    let pullup_sink = if v.pullup_fitted {
        (vcc_hi - vol).max(0.0) / v.rp
    } else {
        0.0
    };
    let (stage_sink, what) = match (v.stage, v.plan.base) {
        (StageKind::Direct, _) => (v.ic_max, "the load"),
        (StageKind::PnpHighSide, Some(((rb, _), _))) => {
            (((v.vl_hi - v.vbe - vol) / rb).max(0.0), "Q1's base drive")
        }
        _ => (0.0, "nothing else (Q1 is off)"),
    };
    // The hysteresis feedback also returns into the low output: at most the
    // highest node voltage less V_OL across R_F (+ R_I).
    let (_, _, vref_top) = rail3(design, design.detector.reference_rail);
    let feedback_sink = core.front.feedback_ohm.map_or(0.0, |rf| {
        (vcc_hi.max(vref_top) - vol).max(0.0) / (rf + core.front.input_ohm)
    });
    let total = pullup_sink + stage_sink + feedback_sink;
    let limit = SINK_DESIGN_SHARE * cmp.output_sink_max_a;
    let c = Check::at_most(
        "comparator-sink",
        "comparator output sink current within its limit",
        total,
        limit,
        "A",
    )
    .at(format!(
        "output low, highest comparator rail {vcc_hi:.2} V, highest load rail {:.2} V",
        v.vl_hi
    ));
    let hint = if c.passed {
        ""
    } else {
        " — use a transistor stage (output.stage = \"npn-low-side\"), a larger pull-up or a smaller load current"
    };
    let d = format!(
        "output low sinks {} ({} through the pull-up, {} from {what}, {} of feedback current) against {} — {:.0} % of the {} limit, a stated design margin{hint}",
        eng(total, "A"),
        eng(pullup_sink, "A"),
        eng(stage_sink, "A"),
        eng(feedback_sink, "A"),
        eng(limit, "A"),
        100.0 * SINK_DESIGN_SHARE,
        eng(cmp.output_sink_max_a, "A"),
    );
    c.detail(d)
}

/// `comparator-input-error`: the bias current through unequal source
/// resistances adds no more error than the offset itself.
fn input_error(v: &StageView, core: &SizedCore) -> Check {
    let cmp = &v.comparator;
    let src = core.drive.sense_source_ohm(core.at_trip.resistance_ohm);
    // The divider with any compensating part in it, at the bench.
    let front = core
        .compensation
        .front_at(&core.front, &core.env, core.at_trip.airflow_m_per_s);
    let (r_plus, r_minus) = front.input_source_ohm(core.trimmer_x, src);
    let (e_plus, e_minus) = (cmp.bias_error_v(r_plus), cmp.bias_error_v(r_minus));
    let net = cmp.input_error_v(r_plus, r_minus) - cmp.input_offset_v;
    let sens = core.sensitivity_v_per_m_per_s.abs().max(1e-300);
    Check::at_most(
        "comparator-input-error",
        "input bias-current error below the offset",
        net,
        cmp.input_offset_v,
        "V",
    )
    .at(format!(
        "trimmer at {:.1} % of travel, bias and offset at their {} limits",
        100.0 * core.trimmer_x,
        basis(v.design)
    ))
    .detail(format!(
        "{} through {} at (+) is {} ({:.4} m/s), through {} at (−) is {} ({:.4} m/s); the difference, {} ({:.4} m/s), stays within the {} offset when ≤ it",
        eng(cmp.input_bias_a, "A"),
        eng(r_plus, "Ω"),
        eng(e_plus, "V"),
        e_plus / sens,
        eng(r_minus, "Ω"),
        eng(e_minus, "V"),
        e_minus / sens,
        eng(net, "V"),
        net / sens,
        eng(cmp.input_offset_v, "V")
    ))
}

/// Both comparator inputs inside the common-mode range in every operating
/// condition: still air and twice the trip airflow, at the lowest and
/// highest ambient, with every rail at its low and at its high end, in both
/// output states.
fn common_mode(design: &Design, core: &SizedCore, cmp: &ComparatorParams) -> Check {
    let value = match core.drive {
        Drive::SeriesResistor { series_ohm, .. } => series_ohm,
        Drive::ConstantCurrent { current_a } => current_a,
    };
    let u_t = design.detector.trip_airflow_m_per_s;
    let mut worst = (f64::INFINITY, String::new());
    let mut unsolved = Vec::new();
    for ambient_k in [design.ambient.min_k, design.ambient.max_k] {
        let env = Environment {
            ambient_k,
            ..core.env
        };
        for u in [0.0, 2.0 * u_t] {
            for high in [false, true] {
                let pick = |rail: Rail| {
                    let (lo, hi) = design.supply.rail_range_v(rail);
                    if high {
                        hi
                    } else {
                        lo
                    }
                };
                let el_v = element_rail(design).map_or(0.0, pick);
                let drive = drive_with(&design.drive, value, el_v);
                let vcc = pick(design.comparator.rail);
                let label = format!(
                    "{:.1} °C, {u:.2} m/s, rails {}",
                    ambient_k - 273.15,
                    if high { "high" } else { "low" }
                );
                let p = match operating_point(&core.element, &drive, &env, u) {
                    Ok(p) => p,
                    Err(e) => {
                        unsolved.push(format!("{label}: {e}"));
                        continue;
                    }
                };
                let front = core.compensation.front_at(
                    &FrontEnd {
                        reference_rail_v: pick(design.detector.reference_rail),
                        ..core.front
                    },
                    &env,
                    u,
                );
                let src = drive.sense_source_ohm(p.resistance_ohm);
                for state in [OutputState::High, OutputState::Low] {
                    let (vp, vn) = front.input_voltages(p.sense_v, core.trimmer_x, state, src);
                    for (v, which) in [(vp, "+"), (vn, "−")] {
                        let (_, m) = cmp.common_mode_ok(v, vcc);
                        if m < worst.0 {
                            worst = (
                                m,
                                format!("({which}) at {v:.3} V with V+ = {vcc:.2} V ({label})"),
                            );
                        }
                    }
                }
            }
        }
    }
    Check::at_least(
        "comparator-common-mode",
        "comparator inputs within the common-mode range",
        worst.0,
        0.0,
        "V",
    )
    .passed_if(unsolved.is_empty())
    .at(worst.1.clone())
    .detail(if worst.0.is_finite() {
        format!(
            "closest approach {} to the range {:.1} V … V+ − {:.1} V: margin {:.3} V{}",
            worst.1,
            cmp.common_mode_low_v,
            cmp.common_mode_high_below_supply_v,
            worst.0,
            if unsolved.is_empty() {
                String::new()
            } else {
                format!("; not solved: {}", unsolved.join("; "))
            }
        )
    } else {
        format!("no condition could be solved: {}", unsolved.join("; "))
    })
}
