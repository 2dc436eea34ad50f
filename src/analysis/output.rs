//! The output stage, the supply and the ratings of every part: the circuit
//! a builder solders around the sized core.
//!
//! The formulas live in `crate::circuit::{comparator, ratings, regulator,
//! switch}`; this module chooses the values, walks the operating conditions
//! and turns the results into bill rows, checks and cautions.

use super::corners::Grid;
use super::size::{drive_with, element_rail, SizedCore, DEFAULT_PULLUP_OHM};
use crate::circuit::comparator::ComparatorParams;
use crate::circuit::frontend::{millman, FrontEnd, OutputState};
use crate::circuit::ratings::{
    capacitor_rating_for, resistor_margin, resistor_rating_for, trimmer_margin,
    DEFAULT_CAPACITOR_VOLTAGE_MARGIN,
};
use crate::circuit::regulator::LinearRegulator;
use crate::circuit::switch::{
    check_flyback_diode, check_switch, design_base_drive, flyback_peak_vce_v, forced_gain_with,
    DiodeRatings, LedLoad, RelayCoil, SwitchError, TransistorRatings,
    DEFAULT_FLYBACK_VOLTAGE_MARGIN,
};
use crate::design::model::{Design, DriveSpec, Load, Rail, Sizable, StageKind};
use crate::drive::Drive;
use crate::element::Environment;
use crate::eseries::format_rkm;
use crate::quantity::format_engineering;
use crate::report::{Check, SupplyBudget, ValueRow};
use crate::solve::operating_point;

/// What the comparator's output node looks like to the feedback network,
/// with the output stage planned once for both the node and the report.
#[derive(Debug, Clone, Copy)]
pub struct OutputNode {
    /// Pull-up resistor from the comparator rail to the output, ohm.
    pub pullup_ohm: f64,
    /// The exact pull-up value before snapping, when it was sized.
    pub pullup_exact: Option<f64>,
    /// Thevenin source of the output node when the output is high (V, ohm),
    /// including whatever the output stage loads it with.
    pub high_source: (f64, f64),
    /// The planned stage, reused by [`circuit_section`].
    plan: Plan,
}

/// Decoupling capacitance used when the file leaves it `auto`: 100 nF
/// ceramic at each rail (common practice, no source).
pub const DEFAULT_DECOUPLING_F: f64 = 100e-9;

/// Relay coil voltage window as a share of the rated coil voltage: at
/// least 80 % at the lowest rail (must-operate voltages of general-purpose
/// relays sit at about 70–80 %), at most 110 % at the highest (common
/// practice, no source; the relay's data sheet rules).
pub const RELAY_COIL_WINDOW: (f64, f64) = (0.8, 1.1);

/// Share of the comparator's sink limit a design may use: 80 %, a stated
/// design margin of 20 % (draftwire's choice, no source).
pub const SINK_DESIGN_SHARE: f64 = 0.8;

/// Share of the hold-off limit the sized R_B–R_BE divider aims at (a tenth
/// to spare; draftwire's choice, no source).
const HOLD_OFF_SPARE: f64 = 0.9;

/// Rounds of re-sizing R_BE and R_B for the hold-off limit.
const HOLD_OFF_ITERATIONS: usize = 6;

/// Largest base–emitter voltage a switch may see while it must stay off:
/// 0.6 × V_BE(on), about 0.42 V for silicon, where collector current is
/// still negligible (common practice, no source).
const HOLD_OFF_SHARE: f64 = 0.6;

/// Millman's theorem for two sources, returned as a Thevenin pair
/// (`crate::circuit::frontend::millman`; R = R1 ∥ R2).
fn thevenin2(v1: f64, r1: f64, v2: f64, r2: f64) -> (f64, f64) {
    (millman(v1, r1, v2, r2), r1 * r2 / (r1 + r2))
}

/// The output stage with its chosen values (private working set, planned
/// once by [`output_node`] and kept in the sized core).
#[derive(Debug, Clone, Copy)]
struct Plan {
    /// Comparator rail: nominal, lowest, highest, V.
    vcc: (f64, f64, f64),
    /// Load rail: nominal, lowest, highest, V (the input when no output).
    vload: (f64, f64, f64),
    /// Voltage across the switch when on (V_OL or V_CE(sat)), V.
    switch_drop_v: f64,
    pullup_ohm: f64,
    pullup_exact: Option<f64>,
    /// LED series resistor (chosen, exact), or why it cannot be sized.
    led: Option<Result<(f64, f64), SwitchError>>,
    /// Base resistor (chosen, exact), hold-off resistor (chosen, exact).
    base: Option<((f64, f64), (f64, f64))>,
    high_source: (f64, f64),
}

fn transistor(design: &Design) -> TransistorRatings {
    let t = design.output.as_ref().map(|o| o.transistor).unwrap_or({
        let p = TransistorRatings::typical_small_signal();
        crate::design::model::TransistorSpec {
            vce_max_v: p.vce_max_v,
            ic_max_a: p.ic_max_a,
            power_max_w: p.p_max_w,
            hfe_min: p.hfe_min,
            vce_sat_v: p.vce_sat_v,
            vbe_on_v: p.vbe_on_v,
            max_junction_k: crate::design::build::DEFAULT_TRANSISTOR_MAX_JUNCTION_K,
        }
    });
    TransistorRatings {
        vce_max_v: t.vce_max_v,
        ic_max_a: t.ic_max_a,
        p_max_w: t.power_max_w,
        hfe_min: t.hfe_min,
        vce_sat_v: t.vce_sat_v,
        vbe_on_v: t.vbe_on_v,
    }
}

fn comparator_params(design: &Design) -> ComparatorParams {
    let c = &design.comparator;
    ComparatorParams {
        input_offset_v: c.offset_v,
        input_bias_a: c.bias_a,
        common_mode_low_v: c.common_mode_low_v,
        common_mode_high_below_supply_v: c.common_mode_headroom_v,
        output_sink_max_a: c.sink_max_a,
        output_low_v: c.output_low_v,
        supply_min_v: c.supply_min_v,
        supply_max_v: c.supply_max_v,
    }
}

fn rail3(design: &Design, rail: Rail) -> (f64, f64, f64) {
    let (lo, hi) = design.supply.rail_range_v(rail);
    (design.supply.rail_v(rail), lo, hi)
}

/// Load current with `rail_v` on the load rail, A: LED (V − V_F − V_sw)/R_L,
/// relay (V − V_sw)/R_coil (Ohm's law), buzzer as given (its built-in driver
/// draws about its rated current).
fn load_current_a(design: &Design, plan: &Plan, rail_v: f64) -> f64 {
    let Some(out) = &design.output else {
        return 0.0;
    };
    match out.load {
        Load::Led {
            forward_v,
            current_a,
        } => match plan.led {
            Some(Ok((rl, _))) => LedLoad {
                forward_v,
                current_a,
            }
            .current_with(rl, rail_v, plan.switch_drop_v)
            .unwrap_or(0.0),
            _ => 0.0,
        },
        Load::Buzzer { current_a } => current_a,
        Load::Relay {
            coil_v, coil_ohm, ..
        } => RelayCoil { coil_v, coil_ohm }
            .current_at(rail_v - plan.switch_drop_v)
            .max(0.0),
    }
}

fn plan(design: &Design, stage: StageKind) -> Plan {
    let c = &design.comparator;
    let vcc = rail3(design, c.rail);
    let out = design.output.as_ref();
    let vload = rail3(design, out.map_or(Rail::Input, |o| o.rail));
    let t = transistor(design);
    let switch_drop_v = if stage == StageKind::Direct {
        c.output_low_v
    } else {
        t.vce_sat_v
    };
    let led = out.and_then(|o| match o.load {
        Load::Led {
            forward_v,
            current_a,
        } => Some(
            LedLoad::new(forward_v, current_a)
                .and_then(|l| l.series_resistor_ohm(vload.0, switch_drop_v))
                .map(|exact| (design.e_series.at_or_above(exact), exact)),
        ),
        _ => None,
    });
    let (given_pullup, default_pullup) = match c.pullup_ohm {
        Sizable::Fixed(r) => (Some(r), r),
        Sizable::Auto => (None, DEFAULT_PULLUP_OHM),
    };
    let mut p = Plan {
        vcc,
        vload,
        switch_drop_v,
        pullup_ohm: default_pullup,
        pullup_exact: None,
        led,
        base: None,
        high_source: (vcc.0, default_pullup),
    };
    let forced_gain = out.map_or(10.0, |o| o.forced_gain);
    // The switch is sized for the largest load current (highest load rail)
    // and the weakest drive (lowest rail).
    let ic = load_current_a(design, &p, vload.2);
    match stage {
        StageKind::NpnLowSide => {
            // The pull-up and the base resistor are in series while the
            // output is high (see `SwitchPolarity::drive_span_v`): size their
            // sum for the forced gain at the lowest comparator rail.
            let total = design_base_drive(ic.max(1e-9), forced_gain, vcc.1, &t, 0.0);
            let mut rbe_exact = match total {
                Ok(b) => b.hold_off_ohm,
                // No headroom: keep the ratio so the checks can report it.
                Err(_) => 1e4,
            };
            let mut rbe = design.e_series.at_or_above(rbe_exact);
            // Pull-up: the comparator sinks (V_CC,max − V_OL)/R_P when low,
            // so R_P ≥ that over the sink limit less the design margin; aim
            // at half the series sum (node swings about half-way) but not
            // above the default.
            let rp_min =
                (vcc.2 - c.output_low_v).max(0.0) / (SINK_DESIGN_SHARE * c.sink_max_a).max(1e-12);
            let ib = ic.max(1e-9) / forced_gain;
            // With the output low, R_B and R_BE divide V_OL: keep the base
            // below the hold-off limit with a tenth to spare, lowering R_BE
            // (which in turn lowers R_B) until it holds.
            let k = HOLD_OFF_SPARE * HOLD_OFF_SHARE * t.vbe_on_v / c.output_low_v.max(1e-12);
            let (mut rp, mut rp_exact, mut rb, mut rb_exact) = (0.0, 0.0, 0.0, 0.0);
            for _ in 0..HOLD_OFF_ITERATIONS {
                // KCL at the base with the chosen R_BE: R_P + R_B =
                // (V_CC − V_BE)/(I_B + V_BE/R_BE).
                let r_sum = ((vcc.1 - t.vbe_on_v) / (ib + t.vbe_on_v / rbe)).max(0.0);
                rp_exact = rp_min.max((0.5 * r_sum).min(DEFAULT_PULLUP_OHM));
                rp = given_pullup.unwrap_or_else(|| design.e_series.at_or_above(rp_exact));
                // What is left for R_B; when nothing is left the forced gain
                // cannot be met: a token 10 % keeps the network defined and
                // the checks say why.
                rb_exact = r_sum - rp;
                rb = design
                    .e_series
                    .at_or_below(rb_exact.max(0.1 * r_sum).max(1.0));
                // Lowering R_BE for the hold-off must not starve the base:
                // stop while R_B keeps its share of the series sum; past
                // that the check reports the conflict.
                let rbe_next = k * rb / (1.0 - k);
                if k >= 1.0 || rbe / (rb + rbe) <= k || rb_exact < 0.5 * r_sum {
                    break;
                }
                rbe_exact = rbe_next;
                rbe = design.e_series.at_or_below(rbe_exact.max(1.0));
            }
            p.pullup_ohm = rp;
            p.pullup_exact = given_pullup.is_none().then_some(rp_exact);
            p.base = Some(((rb, rb_exact), (rbe, rbe_exact)));
            // Output high: the pull-up against V_BE behind R_B.
            p.high_source = thevenin2(vcc.0, rp, t.vbe_on_v, rb);
        }
        StageKind::PnpHighSide => {
            let span = vload.1 - c.output_low_v;
            let (rb_exact, rbe_exact) =
                match design_base_drive(ic.max(1e-9), forced_gain, span, &t, 0.0) {
                    Ok(b) => (b.base_ohm, b.hold_off_ohm),
                    Err(_) => (1e3, 1e4),
                };
            let rb = design.e_series.at_or_below(rb_exact.max(1.0));
            let rbe = design.e_series.at_or_above(rbe_exact);
            p.base = Some(((rb, rb_exact), (rbe, rbe_exact)));
            // Output high: the pull-up against the load rail through R_B +
            // R_BE (the switch off).
            p.high_source = thevenin2(vcc.0, p.pullup_ohm, vload.0, rb + rbe);
        }
        _ => {
            // Direct: a load path from a rail above the pull-up's level
            // conducts and lifts the node; an LED path below its forward
            // voltage conducts only leakage, neglected.
            if let Some(o) = out {
                let path = match (o.load.clone(), p.led) {
                    (Load::Led { forward_v, .. }, Some(Ok((rl, _)))) => {
                        Some((vload.0 - forward_v, rl))
                    }
                    (Load::Relay { coil_ohm, .. }, _) => Some((vload.0, coil_ohm)),
                    _ => None,
                };
                if let Some((v, r)) = path.filter(|(v, _)| *v > vcc.0) {
                    p.high_source = thevenin2(vcc.0, p.pullup_ohm, v, r);
                }
            }
        }
    }
    p
}

/// The output node for a resolved stage; called by `size_core` before the
/// hysteresis network is sized.
///
/// Direct: the pull-up only serves the hysteresis (given, or 10 kΩ). NPN
/// low-side: the pull-up feeds the base through R_B, sized with it for the
/// forced gain and kept large enough for the comparator's sink limit; the
/// high level is clamped at V_BE + I_B·R_B, Thevenin `Millman(V_CC, R_P;
/// V_BE, R_B)`. PNP high-side: the pull-up as for direct, with the base
/// path to the load rail in parallel.
pub fn output_node(design: &Design, stage: StageKind) -> OutputNode {
    let p = plan(design, stage);
    OutputNode {
        pullup_ohm: p.pullup_ohm,
        pullup_exact: p.pullup_exact,
        high_source: p.high_source,
        plan: p,
    }
}

/// The circuit section of the report.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct CircuitSection {
    /// Values to append to the bill.
    pub values: Vec<ValueRow>,
    /// Checks to append.
    pub checks: Vec<Check>,
    /// The supply budget.
    pub supply: SupplyBudget,
    /// Cautions to append.
    pub cautions: Vec<String>,
}

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

fn row(designator: &str, part: &str, text: String, rating: String, reason: String) -> ValueRow {
    ValueRow {
        designator: designator.into(),
        part: part.into(),
        text,
        rating,
        reason,
        ..ValueRow::default()
    }
}

/// Worst-case dissipation of one resistor and where it occurs.
struct Dissipation {
    designator: &'static str,
    watts: f64,
    case: String,
}

/// Which rail end a budget is taken at.
#[derive(Clone, Copy, PartialEq)]
enum End {
    Nominal,
    Max,
}

/// Size the output stage and supply, rate every part (annotating the core
/// values in `values` with their ratings), and check the comparator limits.
pub fn circuit_section(
    design: &Design,
    core: &SizedCore,
    grid: &Grid,
    values: &mut [ValueRow],
) -> CircuitSection {
    let mut s = CircuitSection::default();
    let stage = core.stage;
    let plan = core.output.plan;
    let t = transistor(design);
    let cmp = comparator_params(design);
    let es = design.e_series.name();
    let ambient_max = design.ambient.max_k;
    let out = design.output.as_ref();
    let pullup_fitted = core.front.feedback_ohm.is_some() || stage != StageKind::Direct;
    let rp = core.output.pullup_ohm;
    let (_, vcc_lo, vcc_hi) = plan.vcc;
    let (vl, vl_lo, vl_hi) = plan.vload;
    let vol = design.comparator.output_low_v;
    let vbe = t.vbe_on_v;
    let mut loads: Vec<Dissipation> = Vec::new();

    // ---- output stage parts ------------------------------------------
    let ic_max = load_current_a(design, &plan, vl_hi);
    let ic_nom = load_current_a(design, &plan, vl);
    if let Some(o) = out {
        match (&o.load, plan.led) {
            (
                Load::Led {
                    forward_v,
                    current_a,
                },
                Some(led),
            ) => match led {
                Ok((rl, exact)) => {
                    let i_nom = ic_nom;
                    let mut r = super::assemble::resistor(
                        "RL1",
                        rl,
                        Some(exact),
                        es,
                        format!(
                            "LED series resistor from the {} rail: ({:.2} V − {:.2} V LED − {:.2} V switch)/{} gives {} (at or above the exact value, so at most the wanted current)",
                            o.rail.name(), vl, forward_v, plan.switch_drop_v, eng(*current_a, "A"), eng(i_nom, "A")
                        ),
                    );
                    r.part = "fixed resistor".into();
                    s.values.push(r);
                    loads.push(Dissipation {
                        designator: "RL1",
                        watts: ic_max * ic_max * rl,
                        case: format!("{} at the highest load rail ({vl_hi:.2} V)", eng(ic_max, "A")),
                    });
                    s.values.push(row(
                        "LED1",
                        "indicator LED",
                        format!("{} at {}", eng(*forward_v, "V"), eng(*current_a, "A")),
                        format!("I_F ≥ {}", eng(ic_max, "A")),
                        if stage == StageKind::Direct {
                            "alarm indicator, sunk by the comparator output; off, its path is held below the forward voltage and its leakage is neglected".into()
                        } else {
                            "alarm indicator".into()
                        },
                    ));
                }
                Err(e) => s.checks.push(
                    Check::judged("led-headroom", "LED has voltage to run", false)
                        .at(format!("nominal {} rail", o.rail.name()))
                        .detail(format!(
                            "the {} rail cannot drive the LED through its switch: {e}",
                            o.rail.name()
                        )),
                ),
            },
            (Load::Buzzer { current_a }, _) => s.values.push(row(
                "BZ1",
                "buzzer (DC, built-in driver)",
                eng(*current_a, "A"),
                format!("rated for the {} rail ({vl_lo:.2}–{vl_hi:.2} V)", o.rail.name()),
                "audible alarm; its built-in driver is taken to draw the given current over the rail range".into(),
            )),
            (
                Load::Relay {
                    coil_v, coil_ohm, ..
                },
                _,
            ) => {
                let coil = RelayCoil {
                    coil_v: *coil_v,
                    coil_ohm: *coil_ohm,
                };
                let f_lo = coil.applied_fraction(vl_lo - plan.switch_drop_v);
                let f_hi = coil.applied_fraction(vl_hi);
                let (w_lo, w_hi) = RELAY_COIL_WINDOW;
                let mut k = row(
                    "K1",
                    "relay coil",
                    format_rkm(*coil_ohm),
                    format!("coil {} rated, sees {:.0}–{:.0} %", eng(*coil_v, "V"), 100.0 * f_lo, 100.0 * f_hi),
                    format!("alarm relay, {} at the nominal rail", eng(ic_nom, "A")),
                );
                k.value_ohm = Some(*coil_ohm);
                k.e_series = "given".into();
                s.values.push(k);
                let name = "K1 coil voltage within its operating range";
                let c = if f_lo - w_lo < w_hi - f_hi {
                    Check::at_least("k1-coil-voltage", name, 100.0 * f_lo, 100.0 * w_lo, "%")
                        .at(format!("lowest load rail {vl_lo:.2} V"))
                } else {
                    Check::at_most("k1-coil-voltage", name, 100.0 * f_hi, 100.0 * w_hi, "%")
                        .at(format!("highest load rail {vl_hi:.2} V"))
                };
                s.checks.push(c.detail(format!(
                        "the coil sees {:.2}–{:.2} V ({:.0}–{:.0} % of its {:.1} V rating) over the rail range; wanted {:.0}–{:.0} % (common practice — the relay's must-operate and maximum voltages rule)",
                        vl_lo - plan.switch_drop_v, vl_hi, 100.0 * f_lo, 100.0 * f_hi, coil_v, 100.0 * w_lo, 100.0 * w_hi
                    )));
                // Flyback diode across every coil.
                let typical = DiodeRatings::typical_rectifier();
                let d = DiodeRatings {
                    vrrm_v: o.diode.reverse_max_v,
                    if_avg_a: o.diode.forward_max_a,
                    forward_v: typical.forward_v,
                };
                let need_v = DEFAULT_FLYBACK_VOLTAGE_MARGIN * vl_hi;
                let mut dr = row(
                    "D1",
                    "rectifier diode",
                    format!("{} / {}", eng(d.vrrm_v, "V"), eng(d.if_avg_a, "A")),
                    format!("reverse ≥ {}, forward ≥ {}", eng(need_v, "V"), eng(ic_max, "A")),
                    "flyback diode across K1 (cathode to the rail side): clamps the coil's turn-off spike".into(),
                );
                dr.value_v = Some(d.vrrm_v);
                dr.value_a = Some(d.if_avg_a);
                s.values.push(dr);
                if let Ok(f) = check_flyback_diode(&d, vl_hi, ic_max, DEFAULT_FLYBACK_VOLTAGE_MARGIN) {
                    s.checks.push(Check::at_least("d1-ratings", "D1 within its ratings", d.vrrm_v, need_v, "V")
                        .passed_if(f.ok)
                        .at(format!("coil current {} at the highest load rail {vl_hi:.2} V", eng(ic_max, "A")))
                        .detail(format!(
                            "reverse {} against {} needed (2 × {vl_hi:.2} V, margin {}); forward {} against the coil's {} (margin {})",
                            eng(d.vrrm_v, "V"), eng(need_v, "V"), eng(f.reverse_margin_v, "V"),
                            eng(d.if_avg_a, "A"), eng(ic_max, "A"), eng(f.current_margin_a, "A")
                        )));
                }
            }
            _ => {}
        }

        // The transistor switch.
        if let (Some(((rb, rb_exact), (rbe, rbe_exact))), true) =
            (plan.base, stage != StageKind::Direct)
        {
            let npn = stage == StageKind::NpnLowSide;
            let (span_lo, span_hi, series) = if npn {
                (vcc_lo, vcc_hi, rb + rp)
            } else {
                (vl_lo - vol, vl_hi - vol, rb)
            };
            let mut b = super::assemble::resistor(
                "RB1",
                rb,
                (rb_exact > 0.0).then_some(rb_exact),
                es,
                if npn {
                    format!("base resistor: with the pull-up RP1 in series it sets the base current for a forced gain of {} (at or below the exact value)", o.forced_gain)
                } else {
                    format!("base resistor: the comparator sinks the base current through it for a forced gain of {} (at or below the exact value)", o.forced_gain)
                },
            );
            b.part = "fixed resistor".into();
            s.values.push(b);
            s.values.push(super::assemble::resistor(
                "RBE1",
                rbe,
                Some(rbe_exact),
                es,
                "base–emitter hold-off: keeps Q1 off against leakage and a floating drive".into(),
            ));
            let i_drive_hi = ((span_hi - vbe) / series).max(0.0);
            loads.push(Dissipation {
                designator: "RB1",
                watts: i_drive_hi * i_drive_hi * rb,
                case: format!("{} of base drive at the highest rail", eng(i_drive_hi, "A")),
            });
            loads.push(Dissipation {
                designator: "RBE1",
                watts: vbe * vbe / rbe,
                case: format!("V_BE = {vbe:.2} V across it"),
            });
            let gain = forced_gain_with(ic_max.max(1e-12), span_lo, series, rbe, vbe);
            let off_vce = if matches!(o.load, Load::Relay { .. }) {
                flyback_peak_vce_v(vl_hi, DiodeRatings::typical_rectifier().forward_v)
            } else {
                vl_hi
            };
            let kind = if npn { "NPN" } else { "PNP" };
            s.values.push(row(
                "Q1",
                &format!("{kind} small-signal transistor"),
                format!("β_F {}", o.forced_gain),
                format!("Vce ≥ {}, Ic ≥ {}", eng(off_vce, "V"), eng(ic_max, "A")),
                if npn {
                    "low-side switch: on while the comparator output is released (high)".into()
                } else {
                    "high-side switch: on while the comparator output sinks (low)".into()
                },
            ));
            match gain {
                Ok((ib, beta)) => {
                    let passed = beta <= o.forced_gain * (1.0 + 1e-9) && beta <= t.hfe_min;
                    let hint = match (passed, npn) {
                        (true, _) => String::new(),
                        (false, true) => format!(
                            " — the pull-up must be at least {} for the comparator to sink it, which leaves too little base current: allow a higher output.forced_gain (h_FE(min) is {}), use a comparator that sinks more, or a lower-current load",
                            format_rkm((vcc_hi - vol).max(0.0) / cmp.output_sink_max_a.max(1e-12)), t.hfe_min
                        ),
                        (false, false) => " — lower RB1 or allow a higher output.forced_gain".into(),
                    };
                    s.checks.push(
                        Check::at_most("q1-saturation", "Q1 saturates at the wanted forced gain", beta, o.forced_gain.min(t.hfe_min), "1")
                            .passed_if(passed)
                            .at(format!("lowest drive rail {span_lo:.2} V, highest load rail {vl_hi:.2} V"))
                            .detail(format!(
                                "base current {} at the lowest drive ({span_lo:.2} V) for {} collector current: forced gain {:.1} (wanted ≤ {}, h_FE(min) {}){hint}",
                                eng(ib, "A"), eng(ic_max, "A"), beta, o.forced_gain, t.hfe_min
                            )),
                    );
                    // The power rating derates linearly above 25 °C (data
                    // sheets of the class give mW/°C above 25 °C).
                    let p_allowed = o.transistor.allowed_power_w(ambient_max);
                    let t_hot = TransistorRatings {
                        p_max_w: p_allowed,
                        ..t
                    };
                    if let Ok(q) = check_switch(&t_hot, off_vce, ic_max.max(1e-12), ib) {
                        s.checks.push(
                            Check::at_most("q1-ratings", "Q1 within its ratings", q.power_w, p_allowed, "W")
                                .passed_if(q.vce_margin_v >= 0.0 && q.ic_margin_a >= 0.0)
                                .at(format!("on at the highest load rail {vl_hi:.2} V, {:.1} °C ambient", ambient_max - 273.15))
                                .detail(format!(
                                    "off-state V_CE {} against {} (margin {}); I_C {} against {} (margin {}); dissipation {} against {} ({} at 25 °C derated to {:.1} °C, junction limit {:.0} °C; margin {})",
                                    eng(off_vce, "V"), eng(t.vce_max_v, "V"), eng(q.vce_margin_v, "V"),
                                    eng(ic_max, "A"), eng(t.ic_max_a, "A"), eng(q.ic_margin_a, "A"),
                                    eng(q.power_w, "W"), eng(p_allowed, "W"), eng(t.p_max_w, "W"),
                                    ambient_max - 273.15, o.transistor.max_junction_k - 273.15,
                                    eng(q.power_margin_w, "W")
                                )),
                        );
                    }
                }
                Err(e) => s.checks.push(
                    Check::judged(
                        "q1-saturation",
                        "Q1 saturates at the wanted forced gain",
                        false,
                    )
                    .at(format!("lowest drive rail {span_lo:.2} V"))
                    .detail(format!("the drive cannot turn Q1 on: {e}")),
                ),
            }
            // Held off in the idle state.
            let (v_be_off, how) = if npn {
                // Output low: V_OL divided by R_B and R_BE.
                (
                    vol * rbe / (rb + rbe),
                    format!("the output low level ({vol:.2} V) divided by RB1 and RBE1"),
                )
            } else {
                // Output high: node at the pull-up's level; the rest of the
                // load rail falls across R_B + R_BE.
                let node = if pullup_fitted {
                    millman(vcc_lo, rp, vl_hi, rb + rbe)
                } else {
                    vl_hi
                };
                (
                    ((vl_hi - node) * rbe / (rb + rbe)).max(0.0),
                    format!(
                        "the load rail ({vl_hi:.2} V) less the released output node ({node:.2} V), divided by RB1 and RBE1"
                    ),
                )
            };
            let limit = HOLD_OFF_SHARE * vbe;
            s.checks.push(Check::at_most("q1-hold-off", "Q1 held off when idle", v_be_off, limit, "V")
                .at(if npn {
                    format!("output low at its {} limit ({vol:.2} V)", if design.comparator.basis == crate::design::model::LimitsBasis::FullRange { "full-temperature-range" } else { "25 °C" })
                } else {
                    format!("lowest comparator rail {vcc_lo:.2} V, highest load rail {vl_hi:.2} V")
                })
                .detail(format!(
                    "{:.3} V across base–emitter from {how}; limit {limit:.2} V (0.6 × V_BE(on), common practice){}",
                    v_be_off,
                    if !npn && v_be_off > limit {
                        " — the pull-up goes to a lower rail than the PNP's emitter: pull RP1 up to the load rail or feed the load from the comparator's rail"
                    } else if npn && v_be_off > limit {
                        " — at this output-low level the RB1–RBE1 divider cannot hold Q1 off without starving its base: add a silicon diode in series with the base, use a PNP high-side stage, or a comparator with a lower guaranteed output-low level"
                    } else {
                        ""
                    }
                ),
            ));
        }
    }

    // ---- comparator --------------------------------------------------
    let cm_text = format!(
        "common mode {:.1} V to V+ − {:.1} V",
        cmp.common_mode_low_v, cmp.common_mode_high_below_supply_v
    );
    s.values.push(row(
        "U1",
        "open-collector comparator",
        String::new(),
        format!(
            "sink ≤ {} at {}, supply {:.1}–{:.1} V, {cm_text}",
            eng(cmp.output_sink_max_a, "A"),
            eng(cmp.output_low_v, "V"),
            cmp.supply_min_v,
            cmp.supply_max_v
        ),
        format!(
            "compares the sense node with the reference, fed from the {} rail",
            design.comparator.rail.name()
        ),
    ));
    let (ok_lo, m_lo) = cmp.supply_ok(vcc_lo);
    let (ok_hi, m_hi) = cmp.supply_ok(vcc_hi);
    let supply_check = if m_lo < m_hi {
        Check::at_least(
            "comparator-supply",
            "comparator supply within its range",
            vcc_lo,
            cmp.supply_min_v,
            "V",
        )
        .at(format!("lowest {} rail", design.comparator.rail.name()))
    } else {
        Check::at_most(
            "comparator-supply",
            "comparator supply within its range",
            vcc_hi,
            cmp.supply_max_v,
            "V",
        )
        .at(format!("highest {} rail", design.comparator.rail.name()))
    };
    s.checks
        .push(supply_check.passed_if(ok_lo && ok_hi).detail(format!(
            "the {} rail spans {vcc_lo:.2}–{vcc_hi:.2} V against {:.1}–{:.1} V (margin {:.2} V)",
            design.comparator.rail.name(),
            cmp.supply_min_v,
            cmp.supply_max_v,
            m_lo.min(m_hi)
        )));
    s.checks.push(common_mode_check(design, core, &cmp));

    // Sink current with the output low.
    let pullup_sink = if pullup_fitted {
        (vcc_hi - vol).max(0.0) / rp
    } else {
        0.0
    };
    let (stage_sink, what) = match (stage, plan.base) {
        (StageKind::Direct, _) => (ic_max, "the load"),
        (StageKind::PnpHighSide, Some(((rb, _), _))) => {
            (((vl_hi - vbe - vol) / rb).max(0.0), "Q1's base drive")
        }
        _ => (0.0, "nothing else (Q1 is off)"),
    };
    // The hysteresis feedback also returns into the low output: at most the
    // highest node voltage less V_OL across R_F (+ R_I).
    let (_, _, vref_top) = rail3(design, design.detector.reference_rail);
    let feedback_sink = core.front.feedback_ohm.map_or(0.0, |rf| {
        (vcc_hi.max(vref_top) - vol).max(0.0) / (rf + core.front.input_ohm)
    });
    let sink = pullup_sink + stage_sink + feedback_sink;
    let sink_limit = SINK_DESIGN_SHARE * cmp.output_sink_max_a;
    let sink_check = Check::at_most(
        "comparator-sink",
        "comparator output sink current within its limit",
        sink,
        sink_limit,
        "A",
    )
    .at(format!(
        "output low, highest comparator rail {vcc_hi:.2} V, highest load rail {vl_hi:.2} V"
    ));
    let sink_ok = sink_check.passed;
    s.checks.push(sink_check.detail(format!(
        "output low sinks {} ({} through the pull-up, {} from {what}, {} of feedback current) against {} — {:.0} % of the {} limit, a stated design margin{}",
        eng(sink, "A"),
        eng(pullup_sink, "A"),
        eng(stage_sink, "A"),
        eng(feedback_sink, "A"),
        eng(sink_limit, "A"),
        100.0 * SINK_DESIGN_SHARE,
        eng(cmp.output_sink_max_a, "A"),
        if sink_ok { "" } else { " — use a transistor stage (output.stage = \"npn-low-side\"), a larger pull-up or a smaller load current" }
    )));

    // Input bias current error.
    let src = core.drive.sense_source_ohm(core.at_trip.resistance_ohm);
    let (r_plus, r_minus) = core.front.input_source_ohm(core.trimmer_x, src);
    let (e_plus, e_minus) = (cmp.bias_error_v(r_plus), cmp.bias_error_v(r_minus));
    let net = cmp.input_error_v(r_plus, r_minus) - cmp.input_offset_v;
    let sens = core.sensitivity_v_per_m_per_s.abs().max(1e-300);
    s.checks.push(Check::at_most("comparator-input-error", "input bias-current error below the offset", net, cmp.input_offset_v, "V")
        .at(format!("trimmer at {:.1} % of travel, bias and offset at their {} limits", 100.0 * core.trimmer_x, if design.comparator.basis == crate::design::model::LimitsBasis::FullRange { "full-temperature-range" } else { "25 °C" }))
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
        )));

    // ---- core resistor dissipations ----------------------------------
    if let (Drive::SeriesResistor { series_ohm, .. }, DriveSpec::SeriesResistor { rail, .. }) =
        (core.drive, design.drive)
    {
        let (_, _, v_hi) = rail3(design, rail);
        // Largest current: the element at its lowest resistance — cold, at
        // power-on, at the lowest ambient (or hot, for a falling law) and
        // the low end of its tolerance.
        let law = core.element.resistance_law();
        let r_min = law
            .resistance_ohm(design.ambient.min_k)
            .min(law.resistance_ohm(
                core.still_air.temperature_k + design.ambient.max_k - design.ambient.nominal_k,
            ))
            * (1.0 - design.element_tolerance);
        let tol = design.drive_tolerance;
        let p = [1.0 - tol, 1.0 + tol]
            .iter()
            .map(|f| {
                let rs = series_ohm * f;
                let i = v_hi / (rs + r_min);
                i * i * rs
            })
            .fold(0.0, f64::max);
        let cold = Dissipation {
            designator: "RS1",
            watts: p,
            case: format!(
                "element cold at power-on ({} at {:.1} °C), rail at {v_hi:.2} V",
                eng(r_min, "Ω"),
                design.ambient.min_k - 273.15
            ),
        };
        // A hot stable state (where the element can latch) may draw more.
        let hot = grid
            .hot_states
            .iter()
            .map(|(b, si, h)| {
                let rs = series_ohm * grid.builds[*b].drive;
                (h.current_a * h.current_a * rs, si, h)
            })
            .max_by(|a, b| a.0.total_cmp(&b.0));
        loads.push(match hot {
            Some((w, si, h)) if w > cold.watts => Dissipation {
                designator: "RS1",
                watts: w,
                case: format!(
                    "element latched in its hot state ({:.1} °C, {}) at {}",
                    h.temperature_k - 273.15,
                    eng(h.current_a, "A"),
                    grid.sites[*si].label
                ),
            },
            _ => cold,
        });
    }
    let (_, _, vref_hi) = rail3(design, design.detector.reference_rail);
    let (p_top, p_trim, p_bot) = core.front.divider.dissipations_w(vref_hi);
    let case = format!("divider current at the highest reference rail ({vref_hi:.2} V)");
    loads.push(Dissipation {
        designator: "RR1",
        watts: p_top,
        case: case.clone(),
    });
    loads.push(Dissipation {
        designator: "RV1",
        watts: p_trim,
        case: case.clone(),
    });
    loads.push(Dissipation {
        designator: "RR2",
        watts: p_bot,
        case,
    });
    if let Some(rf) = core.front.feedback_ohm {
        // Both ends of the feedback path lie between ground and the highest
        // rail, so its current is at most V_max/(R_F + R_I).
        // (A direct load from a higher rail can lift the output node to it.)
        let v = if stage == StageKind::Direct {
            vcc_hi.max(vref_hi).max(vl_hi)
        } else {
            vcc_hi.max(vref_hi)
        };
        let ri = core.front.input_ohm;
        let i = v / (rf + ri);
        loads.push(Dissipation {
            designator: "RF1",
            watts: i * i * rf,
            case: format!("at most {v:.2} V across the feedback path"),
        });
        if ri > 0.0 {
            loads.push(Dissipation {
                designator: "RI1",
                watts: i * i * ri,
                case: "the feedback current flows through it".into(),
            });
        }
    }
    if pullup_fitted {
        loads.push(Dissipation {
            designator: "RP1",
            watts: (vcc_hi - vol).powi(2) / rp,
            case: format!("output low at the highest comparator rail ({vcc_hi:.2} V)"),
        });
    }
    // Core parts first, in bill order; the stage's parts after them.
    loads.sort_by_key(|l| {
        values
            .iter()
            .position(|v| v.designator == l.designator)
            .unwrap_or(usize::MAX)
    });
    rate_resistors(design, &loads, values, &mut s, ambient_max);

    // ---- supply -------------------------------------------------------
    // The element's current in a hot stable state, where it has one.
    let hot_a = grid
        .hot_states
        .iter()
        .map(|(_, _, h)| h.current_a)
        .fold(0.0, f64::max);
    let currents = |state: OutputState, end: End| -> (f64, f64) {
        rail_currents(design, core, &plan, state, end, pullup_fitted, hot_a)
    };
    let tripped = core.idle_state.other();
    let (idle_in, idle_reg) = currents(core.idle_state, End::Nominal);
    let (trip_in, trip_reg) = currents(tripped, End::Nominal);
    let mut budget = SupplyBudget {
        idle_a: idle_in + idle_reg,
        tripped_a: trip_in + trip_reg,
        ..SupplyBudget::default()
    };
    if let Some(g) = design.supply.regulator {
        let reg = LinearRegulator {
            output_v: g.output_v,
            output_tolerance: g.tolerance,
            dropout_v: g.dropout_v,
            quiescent_a: g.quiescent_a,
            theta_ja_k_per_w: g.theta_ja_k_per_w,
            max_junction_k: g.max_junction_k,
        };
        budget.idle_a += g.quiescent_a;
        budget.tripped_a += g.quiescent_a;
        let i_out = currents(core.idle_state, End::Max)
            .1
            .max(currents(tripped, End::Max).1);
        let (vin_lo, vin_hi) = (design.supply.input_min_v, design.supply.input_max_v);
        s.values.push({
            let mut u = row(
                "U2",
                "fixed linear regulator",
                eng(g.output_v, "V"),
                format!(
                    "dropout {}, θJA {:.0} K/W, T_J ≤ {:.0} °C",
                    eng(g.dropout_v, "V"),
                    g.theta_ja_k_per_w,
                    g.max_junction_k - 273.15
                ),
                format!("regulated rail, {} worst-case load", eng(i_out, "A")),
            );
            u.value_v = Some(g.output_v);
            u
        });
        // Dropout with the output at its highest, dissipation with it at its
        // lowest: each at the end of the output tolerance that is worse.
        let v_out_hi = g.output_v * (1.0 + g.tolerance);
        let v_out_lo = g.output_v * (1.0 - g.tolerance);
        let headroom = LinearRegulator {
            output_v: v_out_hi,
            ..reg
        }
        .headroom_v(vin_lo);
        s.checks.push(
            Check::at_least("regulator-dropout", "regulator stays above dropout", headroom, 0.0, "V")
                .at(format!("lowest input {vin_lo:.2} V, output at its highest {v_out_hi:.2} V"))
                .detail(format!(
                    "lowest input {vin_lo:.2} V against {v_out_hi:.2} V output (nominal {:.2} V + {:.0} %) + {:.2} V dropout: headroom {headroom:.2} V",
                    g.output_v, 100.0 * g.tolerance, g.dropout_v
                )),
        );
        let reg_low = LinearRegulator {
            output_v: v_out_lo,
            ..reg
        };
        match reg_low.dissipation_w(vin_hi, i_out) {
            Ok(p) => {
                let tj = reg.junction_k(ambient_max, p);
                budget.regulator_dissipation_w = p;
                budget.regulator_junction_c = Some(tj - 273.15);
                s.checks.push(Check::at_most("regulator-junction", "regulator junction temperature within its limit", tj - 273.15, g.max_junction_k - 273.15, "°C")
                    .at(format!("highest input {vin_hi:.2} V, output at its lowest {v_out_lo:.2} V, {:.1} °C ambient, worst load", ambient_max - 273.15))
                    .detail(format!(
                        "P = ({vin_hi:.2} V − {:.2} V)·{} + {vin_hi:.2} V·{} = {}; T_J = {:.1} °C + P·{:.0} K/W = {:.1} °C against {:.1} °C (margin {:.1} K)",
                        v_out_lo,
                        eng(i_out, "A"),
                        eng(g.quiescent_a, "A"),
                        eng(p, "W"),
                        ambient_max - 273.15,
                        g.theta_ja_k_per_w,
                        tj - 273.15,
                        g.max_junction_k - 273.15,
                        g.max_junction_k - tj
                    )));
            }
            Err(e) => s.checks.push(
                Check::judged(
                    "regulator-junction",
                    "regulator junction temperature within its limit",
                    false,
                )
                .detail(format!("dissipation undefined: {e}")),
            ),
        }
    }
    s.supply = budget;

    // Decoupling, one capacitor per rail used.
    let mut rails = vec![Rail::Input];
    if design.supply.regulator.is_some() {
        rails.push(Rail::Regulated);
    }
    let c_f = match design.supply.decoupling_f {
        Sizable::Fixed(c) => c,
        Sizable::Auto => DEFAULT_DECOUPLING_F,
    };
    for (i, rail) in rails.into_iter().enumerate() {
        let (_, _, v_hi) = rail3(design, rail);
        let rating = capacitor_rating_for(v_hi, DEFAULT_CAPACITOR_VOLTAGE_MARGIN);
        let mut c = row(
            &format!("C{}", i + 1),
            "ceramic capacitor",
            eng(c_f, "F"),
            match rating {
                Ok(v) => format!(
                    "≥ {} (≥ {DEFAULT_CAPACITOR_VOLTAGE_MARGIN}× {v_hi:.2} V)",
                    eng(v, "V")
                ),
                Err(_) => format!(
                    "≥ {} (no standard rating listed)",
                    eng(DEFAULT_CAPACITOR_VOLTAGE_MARGIN * v_hi, "V")
                ),
            },
            format!(
                "decoupling on the {} rail, close to {}",
                rail.name(),
                if rail == Rail::Input && design.supply.regulator.is_some() {
                    "U2's input (its data sheet may ask for more)"
                } else {
                    "U1's supply pin"
                }
            ),
        );
        c.value_f = Some(c_f);
        c.value_v = rating.ok();
        c.e_series = if design.supply.decoupling_f == Sizable::Auto {
            "common practice".into()
        } else {
            "given".into()
        };
        s.values.push(c);
    }

    // ---- cautions -----------------------------------------------------
    s.cautions.extend(hot_part_caution(
        design,
        core,
        values,
        &s.values,
        s.supply.regulator_dissipation_w,
    ));
    if let Some(o) = out {
        if stage == StageKind::Direct && vl_hi > cmp.supply_max_v {
            s.cautions.push(format!(
                "The comparator output drives the load directly from the {} rail (up to {vl_hi:.1} V), above the comparator's {:.0} V supply maximum: check the output's own voltage rating or use a transistor stage.",
                o.rail.name(), cmp.supply_max_v
            ));
        }
        if stage == StageKind::Direct && pullup_fitted {
            if let (Load::Led { forward_v, .. }, Some(Ok((rl, _)))) = (&o.load, plan.led) {
                let node = millman(vcc_lo, rp, vl_hi - forward_v, rl);
                let glow = (vl_hi - forward_v - node) / rl;
                if glow > 0.0 {
                    s.cautions.push(format!(
                        "LED1 glows faintly when the output is off: its rail ({vl_hi:.1} V) less its forward voltage lies above the pull-up's {vcc_lo:.1} V, so about {} flows through it into the pull-up rail. Feed the LED from the comparator's rail or use a transistor stage.",
                        eng(glow, "A")
                    ));
                }
            }
        }
    }
    s
}

/// Continuous dissipation from which a part gets a hot-part caution: 0.5 W
/// (a through-hole part at that power runs hot enough to burn a finger and
/// brown a board; common practice, no source).
pub const HOT_PART_W: f64 = 0.5;

/// The parts that dissipate [`HOT_PART_W`] or more continuously (in
/// operation at the highest rail, not the power-on surge): the element
/// series resistor and the element itself, solved again at every airflow
/// of the table; the regulator; every other rated part at its worst
/// steady dissipation.
fn hot_part_caution(
    design: &Design,
    core: &SizedCore,
    core_values: &[ValueRow],
    stage_values: &[ValueRow],
    regulator_w: f64,
) -> Option<String> {
    let mut hot: Vec<(String, f64)> = Vec::new();
    if let (Some(rail), Drive::SeriesResistor { series_ohm, .. }) =
        (element_rail(design), core.drive)
    {
        let v = design.supply.rail_range_v(rail).1;
        let drive = drive_with(&design.drive, series_ohm, v);
        let (mut p_rs, mut p_el) = (0.0_f64, 0.0_f64);
        for (_, p) in &core.table {
            if let Ok(q) = operating_point(&core.element, &drive, &core.env, p.airflow_m_per_s) {
                p_rs = p_rs.max(q.current_a * q.current_a * series_ohm);
                p_el = p_el.max(q.power_w);
            }
        }
        hot.push(("RS1".into(), p_rs));
        hot.push(("the element".into(), p_el));
    } else {
        hot.push(("the element".into(), core.still_air.power_w));
    }
    hot.push(("U2".into(), regulator_w));
    for v in core_values.iter().chain(stage_values) {
        if v.designator != "RS1" {
            if let Some(w) = v.dissipation_w {
                hot.push((v.designator.clone(), w));
            }
        }
    }
    let list: Vec<String> = hot
        .iter()
        .filter(|(_, w)| *w >= HOT_PART_W)
        .map(|(d, w)| format!("{d} {}", eng(*w, "W")))
        .collect();
    let rs_hot = list.iter().any(|l| l.starts_with("RS1 "));
    (!list.is_empty()).then(|| {
        format!(
            "Hot parts: {} dissipated continuously. Mount them with air around them (a heat sink for a regulator), clear of wiring and plastics, and do not touch them while powered.{}",
            list.join(", "),
            if rs_hot {
                " RS1 burns the rail's excess over the element: a lower element rail would run it cooler."
            } else {
                ""
            }
        )
    })
}

/// Rate each resistor: choose a standard power rating (or judge the given
/// one for the trimmer) with the design's derating and the film-resistor
/// temperature derating at the highest ambient (`circuit::ratings`), write
/// it on its row and add a check.
fn rate_resistors(
    design: &Design,
    loads: &[Dissipation],
    values: &mut [ValueRow],
    s: &mut CircuitSection,
    ambient_max: f64,
) {
    let derating = design.ratings.resistor_derating;
    for l in loads {
        let trimmer = l.designator == "RV1";
        let chosen = if trimmer {
            Ok(design.ratings.trimmer_power_w)
        } else {
            resistor_rating_for(l.watts, ambient_max, derating)
        };
        let row = values
            .iter_mut()
            .chain(s.values.iter_mut())
            .find(|v| v.designator == l.designator);
        let name = format!("{} within its power rating", l.designator);
        let id = format!("power-rating-{}", l.designator.to_lowercase());
        let margin = |r: f64| {
            if trimmer {
                trimmer_margin(l.watts, r, ambient_max, derating)
            } else {
                resistor_margin(l.watts, r, ambient_max, derating)
            }
        };
        let at = format!("{}, {:.1} °C ambient", l.case, ambient_max - 273.15);
        let check = match chosen.and_then(|r| margin(r).map(|m| (r, m))) {
            Ok((r, m)) => {
                if let Some(v) = row {
                    v.rating_w = Some(r);
                    v.dissipation_w = Some(l.watts);
                    v.rating = format!("worst {}", eng(l.watts, "W"));
                }
                Check::at_most(&id, &name, l.watts, m.allowed_w, "W").at(at).detail(format!(
                    "{} worst case; {} {} rating allows {} at {:.0} % derating and {:.1} °C ambient on the {} derating curve (margin {}, {:.0} % of the temperature-derated rating)",
                    eng(l.watts, "W"),
                    if trimmer { "the given" } else { "a standard" },
                    eng(r, "W"),
                    eng(m.allowed_w, "W"),
                    100.0 * derating,
                    ambient_max - 273.15,
                    if trimmer { "cermet trimmer (70 → 125 °C)" } else { "film resistor (70 → 155 °C)" },
                    eng(m.margin_w, "W"),
                    100.0 * m.load_fraction
                ))
            }
            Err(e) => {
                if let Some(v) = row {
                    v.dissipation_w = Some(l.watts);
                    v.rating = format!("worst {}: no standard rating suffices", eng(l.watts, "W"));
                }
                Check::judged(&id, &name, false)
                    .numbers(Some(l.watts), None, "W")
                    .at(at)
                    .detail(format!(
                        "{} worst case: no standard power rating carries it at {:.0} % derating and {:.1} °C ambient ({e}); raise the resistance or split the power",
                        eng(l.watts, "W"),
                        100.0 * derating,
                        ambient_max - 273.15
                    ))
            }
        };
        s.checks.push(check);
    }
}

/// Currents drawn from (input, regulated) rails in an output state, at the
/// nominal rails or at each rail's highest voltage. Element current: the
/// largest over the operating-point table's airflows, solved again at the
/// rail voltage in question.
fn rail_currents(
    design: &Design,
    core: &SizedCore,
    plan: &Plan,
    state: OutputState,
    end: End,
    pullup_fitted: bool,
    hot_a: f64,
) -> (f64, f64) {
    let has_reg = design.supply.regulator.is_some();
    let v_of = |rail: Rail| {
        let (n, _, h) = rail3(design, rail);
        if end == End::Max {
            h
        } else {
            n
        }
    };
    let mut input = 0.0;
    let mut regulated = 0.0;
    let mut add = |rail: Rail, a: f64| {
        if rail == Rail::Regulated && has_reg {
            regulated += a;
        } else {
            input += a;
        }
    };
    // Element.
    match (element_rail(design), core.drive) {
        (Some(rail), Drive::SeriesResistor { series_ohm, .. }) => {
            // Solve the element again at this rail voltage at every airflow
            // of the table and take the largest current; if a solve fails,
            // the series resistor alone bounds it (element shorted).
            let v = v_of(rail);
            let drive = Drive::SeriesResistor {
                rail_v: v,
                series_ohm,
            };
            let i = core
                .table
                .iter()
                .map(|(_, p)| {
                    crate::solve::operating_point(
                        &core.element,
                        &drive,
                        &core.env,
                        p.airflow_m_per_s,
                    )
                    .map_or(v / series_ohm, |q| q.current_a)
                })
                .fold(hot_a, f64::max);
            add(rail, i)
        }
        (_, Drive::ConstantCurrent { current_a }) => add(
            if has_reg {
                Rail::Regulated
            } else {
                Rail::Input
            },
            current_a,
        ),
        _ => {}
    }
    // Divider and comparator.
    let rr = design.detector.reference_rail;
    add(rr, v_of(rr) / core.front.divider.total_ohm());
    let cr = design.comparator.rail;
    add(cr, design.comparator.supply_current_a);
    let vcc = v_of(cr);
    let vol = design.comparator.output_low_v;
    let vbe = transistor(design).vbe_on_v;
    let rp = core.output.pullup_ohm;
    if state == OutputState::Low && pullup_fitted {
        add(cr, (vcc - vol).max(0.0) / rp);
    }
    let Some(out) = &design.output else {
        return (input, regulated);
    };
    let lr = out.rail;
    let vl = v_of(lr);
    let on = state == super::size::active_state(core.stage);
    match (core.stage, plan.base) {
        (StageKind::NpnLowSide, Some(((rb, _), _))) if on => {
            add(cr, ((vcc - vbe) / (rp + rb)).max(0.0));
        }
        (StageKind::PnpHighSide, Some(((rb, _), _))) if on => {
            add(lr, ((vl - vbe - vol) / rb).max(0.0));
        }
        _ => {}
    }
    if on {
        add(lr, load_current_a(design, plan, vl));
    }
    (input, regulated)
}

/// Both comparator inputs inside the common-mode range in every operating
/// condition: still air and twice the trip airflow, at the lowest and
/// highest ambient, with every rail at its low and at its high end, in both
/// output states.
fn common_mode_check(design: &Design, core: &SizedCore, cmp: &ComparatorParams) -> Check {
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
                let front = FrontEnd {
                    reference_rail_v: pick(design.detector.reference_rail),
                    ..core.front
                };
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
