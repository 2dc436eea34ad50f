//! The bill of the circuit a builder solders around the sized core: the
//! output stage's parts, the comparator, the decoupling, every resistor's
//! worst dissipation and power rating, the supply budget, and the
//! stage's cautions.
//!
//! The formulas live in `crate::circuit::{comparator, ratings, regulator,
//! switch}`; the stage is planned in `super::stage`; the checks on all of
//! this are in `super::checks`.

use super::corners::Grid;
use super::size::{drive_with, element_rail, SizedCore};
use super::stage::{load_current_a, rail3, transistor, Plan, StageView};
use crate::circuit::frontend::{millman, OutputState};
use crate::circuit::ratings::{
    capacitor_rating_for, resistor_margin, resistor_rating_for, trimmer_margin, ResistorMargin,
    DEFAULT_CAPACITOR_VOLTAGE_MARGIN,
};
use crate::circuit::regulator::LinearRegulator;
use crate::circuit::switch::{DiodeRatings, RelayCoil, DEFAULT_FLYBACK_VOLTAGE_MARGIN};
use crate::design::model::{Design, DriveSpec, Load, Rail, Sizable, StageKind};
use crate::drive::Drive;
use crate::eseries::format_rkm;
use crate::quantity::format_engineering;
use crate::report::{SupplyBudget, ValueRow};
use crate::solve::operating_point;

/// Decoupling capacitance used when the file leaves it `auto`: 100 nF
/// ceramic at each rail (common practice, no source).
pub const DEFAULT_DECOUPLING_F: f64 = 100e-9;

/// The circuit section of the report.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct CircuitSection {
    /// Values to append to the bill.
    pub values: Vec<ValueRow>,
    /// Every resistor's power rating, for `checks::ratings`.
    pub rated: Vec<RatedPart>,
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

/// Size the output stage and supply and rate every part (annotating the
/// core values in `values` with their ratings). The checks on all of it
/// live in `checks::{stage, comparator, supply, ratings}`.
pub fn circuit_section(
    design: &Design,
    core: &SizedCore,
    grid: &Grid,
    values: &mut [ValueRow],
) -> CircuitSection {
    let mut s = CircuitSection::default();
    let view = StageView::new(design, &core.output, core.front.feedback_ohm.is_some());
    let mut loads = Vec::new();
    load_parts(&view, &mut s.values, &mut loads);
    switch_parts(&view, &mut s.values, &mut loads);
    s.values.push(comparator_row(&view));
    loads.extend(core_dissipations(design, core, grid, &view));
    // Core parts first, in bill order; the stage's parts after them.
    loads.sort_by_key(|l| {
        values
            .iter()
            .position(|v| v.designator == l.designator)
            .unwrap_or(usize::MAX)
    });
    s.rated = rate_resistors(design, &loads, values, &mut s.values, design.ambient.max_k);
    rate_compensating_part(design, core, values);
    s.supply = supply_budget(design, core, grid, &view, &mut s.values);
    s.values.extend(decoupling_rows(design));
    s.cautions.extend(hot_part_caution(
        design,
        core,
        values,
        &s.values,
        s.supply.regulator_dissipation_w.unwrap_or(0.0),
    ));
    s.cautions.extend(stage_cautions(&view));
    s
}

/// The load's parts: the LED and its resistor, a buzzer, or the relay coil
/// and its flyback diode; dissipations go to `loads`.
fn load_parts(v: &StageView, values: &mut Vec<ValueRow>, loads: &mut Vec<Dissipation>) {
    let Some(o) = v.design.output.as_ref() else {
        return;
    };
    let (stage, plan, es) = (v.stage, v.plan, v.design.e_series.name());
    let (vl, vl_lo, vl_hi) = (v.vl, v.vl_lo, v.vl_hi);
    let (ic_max, ic_nom) = (v.ic_max, v.ic_nom);
    match (&o.load, plan.led) {
            (
                Load::Led {
                    forward_v,
                    current_a,
                },
                // No headroom (`Err`): no resistor; `checks::stage` reports it.
                Some(Ok((rl, exact))),
            ) => {
                let i_nom = ic_nom;
                let mut r = ValueRow::resistor(
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
                values.push(r);
                loads.push(Dissipation {
                    designator: "RL1",
                    watts: ic_max * ic_max * rl,
                    case: format!("{} at the highest load rail ({vl_hi:.2} V)", eng(ic_max, "A")),
                });
                values.push(row(
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
            (Load::Buzzer { current_a }, _) => values.push(row(
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
                let mut k = row(
                    "K1",
                    "relay coil",
                    format_rkm(*coil_ohm),
                    format!("coil {} rated, sees {:.0}–{:.0} %", eng(*coil_v, "V"), 100.0 * f_lo, 100.0 * f_hi),
                    format!("alarm relay, {} at the nominal rail", eng(ic_nom, "A")),
                );
                k.value_ohm = Some(*coil_ohm);
                k.e_series = "given".into();
                values.push(k);
                // Flyback diode across every coil.
                let d = DiodeRatings {
                    vrrm_v: o.diode.reverse_max_v,
                    if_avg_a: o.diode.forward_max_a,
                    forward_v: DiodeRatings::typical_rectifier().forward_v,
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
                values.push(dr);
            }
            _ => {}
        }
}

/// The transistor switch: its base and hold-off resistors and the
/// transistor itself; dissipations go to `loads`.
fn switch_parts(v: &StageView, values: &mut Vec<ValueRow>, loads: &mut Vec<Dissipation>) {
    let Some(o) = v.design.output.as_ref() else {
        return;
    };
    let (stage, plan, es) = (v.stage, v.plan, v.design.e_series.name());
    let (vbe, ic_max) = (v.vbe, v.ic_max);
    if let (Some(((rb, rb_exact), (rbe, rbe_exact))), true) =
        (plan.base, stage != StageKind::Direct)
    {
        let npn = stage == StageKind::NpnLowSide;
        let (_, span_hi, series) = v.base_drive(rb);
        let mut b = ValueRow::resistor(
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
        values.push(b);
        values.push(ValueRow::resistor(
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
        let off_vce = v.off_vce();
        let kind = if npn { "NPN" } else { "PNP" };
        values.push(row(
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
    }
}

/// The comparator's line of the bill, with the limits it is judged by.
fn comparator_row(v: &StageView) -> ValueRow {
    let cmp = v.comparator;
    let cm_text = format!(
        "common mode {:.1} V to V+ − {:.1} V",
        cmp.common_mode_low_v, cmp.common_mode_high_below_supply_v
    );
    row(
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
            v.design.comparator.rail.name()
        ),
    )
}

/// The core's dissipations: the element series resistor (cold at power-on,
/// or latched hot), the divider and trimmer, the feedback and input
/// resistors, the pull-up.
fn core_dissipations(
    design: &Design,
    core: &SizedCore,
    grid: &Grid,
    v: &StageView,
) -> Vec<Dissipation> {
    let mut loads = Vec::new();
    let (stage, pullup_fitted, rp) = (v.stage, v.pullup_fitted, v.rp);
    let (vcc_hi, vl_hi, vol) = (v.vcc_hi, v.vl_hi, v.vol);
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
    let d = core.front.divider;
    let arm = compensation_arm(design, core, vref_hi);
    let i = vref_hi / (d.total_ohm() + arm.lowest_ohm);
    let case = format!("divider current at the highest reference rail ({vref_hi:.2} V)");
    for (designator, ohm) in [
        ("RR1", d.top_ohm),
        ("RV1", d.trimmer_ohm),
        ("RR2", d.bottom_ohm),
    ] {
        if ohm > 0.0 {
            loads.push(Dissipation {
                designator,
                watts: i * i * ohm,
                case: case.clone(),
            });
        }
    }
    if let Some(w) = arm.parallel_w {
        loads.push(Dissipation {
            designator: "RR3",
            watts: w,
            case: format!("the thermistor network at its highest voltage ({vref_hi:.2} V rail)"),
        });
    }
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
    loads
}

/// The compensating part's figures that the bill and the budget need.
struct CompensationArm {
    /// The network's lowest resistance over the ambient range (0 without
    /// one), ohm: the divider's largest current.
    lowest_ohm: f64,
    /// The compensating part's largest dissipation, W.
    part_w: Option<f64>,
    /// The linearising resistor's largest dissipation, W.
    parallel_w: Option<f64>,
}

/// The compensating part at both ambient ends, in still air (where a twin
/// runs warmest), on a reference rail of `rail_v`.
fn compensation_arm(design: &Design, core: &SizedCore, rail_v: f64) -> CompensationArm {
    let mut arm = CompensationArm {
        lowest_ohm: f64::INFINITY,
        part_w: None,
        parallel_w: None,
    };
    for t in [design.ambient.min_k, design.ambient.max_k] {
        let env = crate::element::Environment {
            ambient_k: t,
            ..core.env
        };
        let Some(st) = core
            .compensation
            .state(&core.front.divider, rail_v, &env, 0.0)
        else {
            return CompensationArm {
                lowest_ohm: 0.0,
                ..arm
            };
        };
        arm.lowest_ohm = arm.lowest_ohm.min(st.resistance_ohm);
        arm.part_w = Some(arm.part_w.unwrap_or(0.0).max(st.power_w));
        if let super::compensation::Compensator::Thermistor(n) = &core.compensation {
            let v =
                rail_v * st.resistance_ohm / (core.front.divider.total_ohm() + st.resistance_ohm);
            arm.parallel_w = Some(arm.parallel_w.unwrap_or(0.0).max(v * v / n.parallel_ohm));
        }
    }
    arm
}

/// Write the compensating part's dissipation on its bill row (it is not a
/// resistor with a standard power rating).
fn rate_compensating_part(design: &Design, core: &SizedCore, values: &mut [ValueRow]) {
    let (_, _, vref_hi) = rail3(design, design.detector.reference_rail);
    let arm = compensation_arm(design, core, vref_hi);
    let Some(w) = arm.part_w else {
        return;
    };
    if let Some(v) = values
        .iter_mut()
        .find(|v| v.designator == "RC1" || v.designator == "RT1")
    {
        v.dissipation_w = Some(w);
        v.rating = format!(
            "dissipates at most {} (its self-heating is in the model)",
            eng(w, "W")
        );
    }
}

/// The supply budget (currents idle and tripped, the regulator's load,
/// dissipation and junction) and the regulator's line of the bill.
fn supply_budget(
    design: &Design,
    core: &SizedCore,
    grid: &Grid,
    v: &StageView,
    values: &mut Vec<ValueRow>,
) -> SupplyBudget {
    let (plan, pullup_fitted) = (v.plan, v.pullup_fitted);
    let ambient_max = design.ambient.max_k;
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
        let reg = super::stage::regulator(&g);
        budget.idle_a += g.quiescent_a;
        budget.tripped_a += g.quiescent_a;
        let i_out = currents(core.idle_state, End::Max)
            .1
            .max(currents(tripped, End::Max).1);
        values.push({
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
        // Dissipation with the output at the low end of its tolerance,
        // where it is largest (the checks in `checks::supply` judge it).
        let reg_low = LinearRegulator {
            output_v: g.output_v * (1.0 - g.tolerance),
            ..reg
        };
        budget.regulator_load_a = Some(i_out);
        if let Ok(p) = reg_low.dissipation_w(design.supply.input_max_v, i_out) {
            budget.regulator_dissipation_w = Some(p);
            budget.regulator_junction_c = Some(reg.junction_k(ambient_max, p) - 273.15);
        }
    }
    budget
}

/// Decoupling: one capacitor per rail used.
fn decoupling_rows(design: &Design) -> Vec<ValueRow> {
    let mut out = Vec::new();
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
                } else if rail == design.comparator.rail {
                    "U1's supply pin"
                } else {
                    "the parts it feeds"
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
        out.push(c);
    }

    out
}

/// Cautions about the output stage: a direct load above the comparator's
/// supply rating, an LED that glows when it should be off.
fn stage_cautions(v: &StageView) -> Vec<String> {
    let mut out = Vec::new();
    let Some(o) = v.design.output.as_ref() else {
        return out;
    };
    let (stage, plan, cmp) = (v.stage, v.plan, v.comparator);
    let (pullup_fitted, rp, vcc_lo, vl_hi) = (v.pullup_fitted, v.rp, v.vcc_lo, v.vl_hi);
    if stage == StageKind::Direct && vl_hi > cmp.supply_max_v {
        out.push(format!(
                "The comparator output drives the load directly from the {} rail (up to {vl_hi:.1} V), above the comparator's {:.0} V supply maximum: check the output's own voltage rating or use a transistor stage.",
                o.rail.name(), cmp.supply_max_v
            ));
    }
    if stage == StageKind::Direct && pullup_fitted {
        if let (Load::Led { forward_v, .. }, Some(Ok((rl, _)))) = (&o.load, plan.led) {
            let node = millman(vcc_lo, rp, vl_hi - forward_v, rl);
            let glow = (vl_hi - forward_v - node) / rl;
            if glow > 0.0 {
                out.push(format!(
                        "LED1 glows faintly when the output is off: its rail ({vl_hi:.1} V) less its forward voltage lies above the pull-up's {vcc_lo:.1} V, so about {} flows through it into the pull-up rail. Feed the LED from the comparator's rail or use a transistor stage.",
                        eng(glow, "A")
                    ));
            }
        }
    }
    out
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

/// A part's power rating as chosen: the standard rating (or the given one
/// for the trimmer) and its margin at the highest ambient, or why none
/// carries it. Judged by `checks::ratings`.
#[derive(Debug, Clone, PartialEq)]
pub struct RatedPart {
    /// Designator.
    pub designator: &'static str,
    /// Worst dissipation, W.
    pub watts: f64,
    /// Where the worst dissipation occurs, in words.
    pub case: String,
    /// Whether it is the trimmer (its own derating curve).
    pub trimmer: bool,
    /// The rating and its margin, or why no standard rating suffices.
    pub rating: Result<(f64, ResistorMargin), String>,
}

/// Rate each resistor: choose a standard power rating (or take the given
/// one for the trimmer) with the design's derating and the temperature
/// derating at the highest ambient (`circuit::ratings`), and write it on
/// its bill row.
fn rate_resistors(
    design: &Design,
    loads: &[Dissipation],
    values: &mut [ValueRow],
    stage_values: &mut [ValueRow],
    ambient_max: f64,
) -> Vec<RatedPart> {
    let derating = design.ratings.resistor_derating;
    let mut out = Vec::new();
    for l in loads {
        let trimmer = l.designator == "RV1";
        let chosen = if trimmer {
            Ok(design.ratings.trimmer_power_w)
        } else {
            // At least the builder's smallest rating (`ratings.resistor_min`).
            let floor = design.ratings.resistor_min_w.unwrap_or(0.0);
            resistor_rating_for(l.watts, ambient_max, derating).map(|r| {
                if r < floor {
                    floor
                } else {
                    r
                }
            })
        };
        let margin = |r: f64| {
            if trimmer {
                trimmer_margin(l.watts, r, ambient_max, derating)
            } else {
                resistor_margin(l.watts, r, ambient_max, derating)
            }
        };
        let rating = chosen
            .and_then(|r| margin(r).map(|m| (r, m)))
            .map_err(|e| e.to_string());
        if let Some(v) = values
            .iter_mut()
            .chain(stage_values.iter_mut())
            .find(|v| v.designator == l.designator)
        {
            v.dissipation_w = Some(l.watts);
            match &rating {
                Ok((r, _)) => {
                    v.rating_w = Some(*r);
                    v.rating = format!("worst {}", eng(l.watts, "W"));
                }
                Err(_) => {
                    v.rating = format!("worst {}: no standard rating suffices", eng(l.watts, "W"))
                }
            }
        }
        out.push(RatedPart {
            designator: l.designator,
            watts: l.watts,
            case: l.case.clone(),
            trimmer,
            rating,
        });
    }
    out
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
    let arm = compensation_arm(design, core, v_of(rr));
    add(
        rr,
        v_of(rr) / (core.front.divider.total_ohm() + arm.lowest_ohm),
    );
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
