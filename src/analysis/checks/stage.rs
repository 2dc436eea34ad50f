//! The output stage: the LED has voltage to run, the relay coil sees a
//! voltage it operates on, the flyback diode and the transistor stay inside
//! their ratings, the transistor saturates at the wanted forced gain and is
//! held off while idle.

use crate::analysis::stage::{StageView, HOLD_OFF_SHARE, RELAY_COIL_WINDOW};
use crate::circuit::frontend::millman;
use crate::circuit::switch::{
    check_flyback_diode, check_switch, forced_gain_with, DiodeRatings, RelayCoil,
    TransistorRatings, DEFAULT_FLYBACK_VOLTAGE_MARGIN,
};
use crate::design::model::{LimitsBasis, Load, StageKind};
use crate::eseries::format_rkm;
use crate::quantity::format_engineering;
use crate::report::Check;

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

/// Every stage check that applies.
pub(crate) fn checks(v: &StageView) -> Vec<Check> {
    let mut out = Vec::new();
    out.extend(led_headroom(v));
    out.extend(relay_coil(v));
    out.extend(flyback_diode(v));
    out.extend(switch(v));
    out
}

/// `led-headroom`: the LED rail can drive the LED through its switch (only
/// reported when it cannot; the LED resistor is sized otherwise).
fn led_headroom(v: &StageView) -> Option<Check> {
    let o = v.design.output.as_ref()?;
    match v.plan.led {
        Some(Err(e)) => Some(
            Check::judged("led-headroom", "LED has voltage to run", false)
                .at(format!("nominal {} rail", o.rail.name()))
                .detail(format!(
                    "the {} rail cannot drive the LED through its switch: {e}",
                    o.rail.name()
                )),
        ),
        _ => None,
    }
}

/// `k1-coil-voltage`: the coil sees its operating window over the rail range.
fn relay_coil(v: &StageView) -> Option<Check> {
    let Load::Relay {
        coil_v, coil_ohm, ..
    } = v.design.output.as_ref()?.load
    else {
        return None;
    };
    let coil = RelayCoil { coil_v, coil_ohm };
    let drop = v.plan.switch_drop_v;
    let f_lo = coil.applied_fraction(v.vl_lo - drop);
    let f_hi = coil.applied_fraction(v.vl_hi);
    let (w_lo, w_hi) = RELAY_COIL_WINDOW;
    let name = "K1 coil voltage within its operating range";
    let c = if f_lo - w_lo < w_hi - f_hi {
        Check::at_least("k1-coil-voltage", name, 100.0 * f_lo, 100.0 * w_lo, "%")
            .at(format!("lowest load rail {:.2} V", v.vl_lo))
    } else {
        Check::at_most("k1-coil-voltage", name, 100.0 * f_hi, 100.0 * w_hi, "%")
            .at(format!("highest load rail {:.2} V", v.vl_hi))
    };
    Some(c.detail(format!(
        "the coil sees {:.2}–{:.2} V ({:.0}–{:.0} % of its {:.1} V rating) over the rail range; wanted {:.0}–{:.0} % (common practice — the relay's must-operate and maximum voltages rule)",
        v.vl_lo - drop, v.vl_hi, 100.0 * f_lo, 100.0 * f_hi, coil_v, 100.0 * w_lo, 100.0 * w_hi
    )))
}

/// The flyback diode as rated: reverse voltage from the design, forward
/// voltage of the rectifier class.
pub(crate) fn flyback_ratings(v: &StageView) -> Option<DiodeRatings> {
    let o = v.design.output.as_ref()?;
    matches!(o.load, Load::Relay { .. }).then(|| DiodeRatings {
        vrrm_v: o.diode.reverse_max_v,
        if_avg_a: o.diode.forward_max_a,
        forward_v: DiodeRatings::typical_rectifier().forward_v,
    })
}

/// `d1-ratings`: reverse voltage with margin over the highest load rail,
/// forward current at least the coil's.
fn flyback_diode(v: &StageView) -> Option<Check> {
    let d = flyback_ratings(v)?;
    let need_v = DEFAULT_FLYBACK_VOLTAGE_MARGIN * v.vl_hi;
    let f = check_flyback_diode(&d, v.vl_hi, v.ic_max, DEFAULT_FLYBACK_VOLTAGE_MARGIN).ok()?;
    Some(
        Check::at_least("d1-ratings", "D1 within its ratings", d.vrrm_v, need_v, "V")
            .passed_if(f.ok)
            .at(format!(
                "coil current {} at the highest load rail {:.2} V",
                eng(v.ic_max, "A"),
                v.vl_hi
            ))
            .detail(format!(
                "reverse {} against {} needed (2 × {:.2} V, margin {}); forward {} against the coil's {} (margin {})",
                eng(d.vrrm_v, "V"), eng(need_v, "V"), v.vl_hi, eng(f.reverse_margin_v, "V"),
                eng(d.if_avg_a, "A"), eng(v.ic_max, "A"), eng(f.current_margin_a, "A")
            )),
    )
}

/// `q1-saturation`, `q1-ratings`, `q1-hold-off`.
fn switch(v: &StageView) -> Vec<Check> {
    let Some(o) = v.design.output.as_ref() else {
        return Vec::new();
    };
    let Some(((rb, _), (rbe, _))) = v.plan.base.filter(|_| v.stage != StageKind::Direct) else {
        return Vec::new();
    };
    let t = v.transistor;
    let npn = v.stage == StageKind::NpnLowSide;
    let (span_lo, _, series) = v.base_drive(rb);
    let off_vce = v.off_vce();
    let mut out = Vec::new();
    let sat = "Q1 saturates at the wanted forced gain";
    match forced_gain_with(v.ic_max.max(1e-12), span_lo, series, rbe, v.vbe) {
        Ok((ib, beta)) => {
            let passed = beta <= o.forced_gain * (1.0 + 1e-9) && beta <= t.hfe_min;
            let hint = match (passed, npn) {
                (true, _) => String::new(),
                (false, true) => format!(
                    " — the pull-up must be at least {} for the comparator to sink it, which leaves too little base current: allow a higher output.forced_gain (h_FE(min) is {}), use a comparator that sinks more, or a lower-current load",
                    format_rkm((v.vcc_hi - v.vol).max(0.0) / v.comparator.output_sink_max_a.max(1e-12)), t.hfe_min
                ),
                (false, false) => " — lower RB1 or allow a higher output.forced_gain".into(),
            };
            out.push(
                Check::at_most("q1-saturation", sat, beta, o.forced_gain.min(t.hfe_min), "1")
                    .passed_if(passed)
                    .at(format!("lowest drive rail {span_lo:.2} V, highest load rail {:.2} V", v.vl_hi))
                    .detail(format!(
                        "base current {} at the lowest drive ({span_lo:.2} V) for {} collector current: forced gain {:.1} (wanted ≤ {}, h_FE(min) {}){hint}",
                        eng(ib, "A"), eng(v.ic_max, "A"), beta, o.forced_gain, t.hfe_min
                    )),
            );
            // The power rating derates linearly above 25 °C (data sheets of
            // the class give mW/°C above 25 °C).
            let p_allowed = o.transistor.allowed_power_w(v.ambient_max_k);
            let t_hot = TransistorRatings {
                p_max_w: p_allowed,
                ..t
            };
            if let Ok(q) = check_switch(&t_hot, off_vce, v.ic_max.max(1e-12), ib) {
                out.push(
                    Check::at_most("q1-ratings", "Q1 within its ratings", q.power_w, p_allowed, "W")
                        .passed_if(q.vce_margin_v >= 0.0 && q.ic_margin_a >= 0.0)
                        .at(format!(
                            "on at the highest load rail {:.2} V, {:.1} °C ambient",
                            v.vl_hi,
                            v.ambient_max_k - 273.15
                        ))
                        .detail(format!(
                            "off-state V_CE {} against {} (margin {}); I_C {} against {} (margin {}); dissipation {} against {} ({} at 25 °C derated to {:.1} °C, junction limit {:.0} °C; margin {})",
                            eng(off_vce, "V"), eng(t.vce_max_v, "V"), eng(q.vce_margin_v, "V"),
                            eng(v.ic_max, "A"), eng(t.ic_max_a, "A"), eng(q.ic_margin_a, "A"),
                            eng(q.power_w, "W"), eng(p_allowed, "W"), eng(t.p_max_w, "W"),
                            v.ambient_max_k - 273.15, o.transistor.max_junction_k - 273.15,
                            eng(q.power_margin_w, "W")
                        )),
                );
            }
        }
        Err(e) => out.push(
            Check::judged("q1-saturation", sat, false)
                .at(format!("lowest drive rail {span_lo:.2} V"))
                .detail(format!("the drive cannot turn Q1 on: {e}")),
        ),
    }
    out.push(hold_off(v, rb, rbe));
    out
}

/// `q1-hold-off`: the base–emitter voltage while idle stays below
/// 0.6 × V_BE(on) (common practice, no source).
fn hold_off(v: &StageView, rb: f64, rbe: f64) -> Check {
    let npn = v.stage == StageKind::NpnLowSide;
    let vol = v.vol;
    let (v_be_off, how) = if npn {
        // Output low: V_OL divided by R_B and R_BE.
        (
            vol * rbe / (rb + rbe),
            format!("the output low level ({vol:.2} V) divided by RB1 and RBE1"),
        )
    } else {
        // Output high: node at the pull-up's level; the rest of the load
        // rail falls across R_B + R_BE.
        let node = if v.pullup_fitted {
            millman(v.vcc_lo, v.rp, v.vl_hi, rb + rbe)
        } else {
            v.vl_hi
        };
        (
            ((v.vl_hi - node) * rbe / (rb + rbe)).max(0.0),
            format!(
                "the load rail ({:.2} V) less the released output node ({node:.2} V), divided by RB1 and RBE1",
                v.vl_hi
            ),
        )
    };
    let limit = HOLD_OFF_SHARE * v.vbe;
    let basis = if v.design.comparator.basis == LimitsBasis::FullRange {
        "full-temperature-range"
    } else {
        "25 °C"
    };
    let hint = match (npn, v_be_off > limit) {
        (false, true) => " — the pull-up goes to a lower rail than the PNP's emitter: pull RP1 up to the load rail or feed the load from the comparator's rail",
        (true, true) => " — at this output-low level the RB1–RBE1 divider cannot hold Q1 off without starving its base: add a silicon diode in series with the base, use a PNP high-side stage, or a comparator with a lower guaranteed output-low level",
        _ => "",
    };
    Check::at_most("q1-hold-off", "Q1 held off when idle", v_be_off, limit, "V")
        .at(if npn {
            format!("output low at its {basis} limit ({vol:.2} V)")
        } else {
            format!(
                "lowest comparator rail {:.2} V, highest load rail {:.2} V",
                v.vcc_lo, v.vl_hi
            )
        })
        .detail(format!(
            "{v_be_off:.3} V across base–emitter from {how}; limit {limit:.2} V (0.6 × V_BE(on), common practice){hint}"
        ))
}
