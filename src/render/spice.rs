//! The sized circuit as a SPICE netlist in the dialect ngspice reads, so an
//! engineer can take a second opinion from a general-purpose circuit
//! simulator (docs/cli.md, `netlist`).
//!
//! Every part of the bill is a card on the nodes of the connection list
//! (`gnd` is SPICE's node 0). The self-heated element is a behavioural
//! resistor R(T) whose temperature is a thermal node: its heat capacity is
//! a capacitor, the electrical power a current into the node and the
//! cooling law's loss G(U, T)·(T − Ta) a current out of it, with the
//! airflow U the DC value of the voltage source `VAIRFLOW` (lumped-element
//! thermal–electrical analogy: W ↔ A, K ↔ V, J/K ↔ F; e.g. Incropera et
//! al., *Fundamentals of Heat and Mass Transfer*, 6th ed., §3.1.3, thermal
//! circuits). The comparator is a behavioural open-collector output.

use crate::analysis::netlist_model::{king_for, Expected};
use crate::analysis::wiring::Role;
use crate::analysis::Sized;
use crate::element::{KingsLaw, ResistanceLaw};

/// Thermal time constant assumed for a compensating NTC, whose heat
/// capacity the design file does not give: only a `.tran` sees it
/// (generic small bead NTCs: a few seconds to tens of seconds; draftwire's
/// choice, no source).
pub const NTC_ASSUMED_TIME_CONSTANT_S: f64 = 10.0;

/// Comparator model: on-resistance of the output switch to its low level,
/// ohm, so that the low level is the data sheet's `output_low` within
/// tens of microvolts at milliamperes (draftwire's choice, no source). The
/// switch is ngspice's voltage-controlled switch with no hysteresis of its
/// own: a smooth high-gain function instead stalled ngspice's DC sweeps at
/// the fold that positive feedback makes.
pub const COMPARATOR_ON_OHM: f64 = 0.01;

/// Thermal voltage kT/q at ngspice's default 27 °C, V (CODATA 2018 k and q).
const VT_27C: f64 = 1.380_649e-23 * 300.15 / 1.602_176_634e-19;

/// Options of the netlist.
#[derive(Debug, Clone, Copy, Default)]
pub struct NetlistOptions {
    /// DC value of `VAIRFLOW`, m/s (default: the target trip airflow).
    pub airflow_m_per_s: Option<f64>,
    /// Add a `.control` block that runs the analyses.
    pub analyses: bool,
}

/// SPICE node of a connection-list node.
fn spice_node(n: &str) -> &str {
    if n == "gnd" {
        "0"
    } else {
        n
    }
}

/// A number for a SPICE card: full precision, no unit suffix (SPICE reads
/// `m` as milli and `M` as milli too, so suffixes are avoided).
fn num(x: f64) -> String {
    format!("{x:e}")
}

/// R(T) of a resistance law as a SPICE expression in `t`, the temperature
/// in °C: closed form for the linear, Callendar–Van Dusen and beta laws
/// (the model.md §2 equations), a `pwl()` table sampled every `step` K
/// over `[lo, hi]` K for the others.
fn resistance_expr(law: &ResistanceLaw, t: &str, lo_k: f64, hi_k: f64) -> String {
    match law {
        ResistanceLaw::Linear(l) => format!(
            "{}*(1+{}*({t}-{}))",
            num(l.r0_ohm()),
            num(l.alpha_per_k()),
            num(l.t0_k() - 273.15)
        ),
        ResistanceLaw::Platinum(p) => {
            let (a, b, c) = p.coefficients();
            format!(
                "{}*(1+{}*{t}+{}*{t}*{t}+({t}<0 ? {}*({t}-100)*{t}*{t}*{t} : 0))",
                num(p.r0_ohm()),
                num(a),
                num(b),
                num(c)
            )
        }
        ResistanceLaw::Beta(b) => format!(
            "{}*exp({}*(1/({t}+273.15)-{}))",
            num(b.r0_ohm()),
            num(b.beta_k()),
            num(1.0 / b.t0_k())
        ),
        _ => {
            let (law_lo, law_hi) = law.valid_range_k();
            let (lo, hi) = (lo_k.max(law_lo), hi_k.min(law_hi));
            let n = (((hi - lo) / 2.0).ceil() as usize).clamp(16, 2000);
            let mut s = format!("pwl({t}");
            for i in 0..=n {
                let tk = lo + (hi - lo) * i as f64 / n as f64;
                s.push_str(&format!(
                    ", {}, {}",
                    num(tk - 273.15),
                    num(law.resistance_ohm(tk))
                ));
            }
            s.push(')');
            s
        }
    }
}

/// The cards of one self-heated resistor between `n1` and `n2` with its
/// thermal node `node`: R(T), heat capacity, Joule heating, cooling.
fn heated_resistor(
    name: &str,
    n1: &str,
    n2: &str,
    node: &str,
    r_expr: &str,
    heat_capacity: f64,
    conductance_expr: &str,
) -> String {
    let v = format!("V({n1},{n2})");
    format!(
        "B{name} {n1} {n2} I = {v}/({r_expr})\n\
         C{name}_HEAT {node} 0 {c} IC={{ta}}\n\
         B{name}_JOULE 0 {node} I = {v}*{v}/({r_expr})\n\
         B{name}_LOSS {node} 0 I = ({conductance_expr})*(V({node})-{{ta}})\n",
        c = num(heat_capacity)
    )
}

fn king_expr(k: &KingsLaw) -> String {
    let uf = k.still_air_floor_m_per_s();
    if uf > 0.0 {
        // With a still-air floor: A + B·(U² + U_N²)^(n/2).
        return format!(
            "{}+{}*pow(V(airflow)*V(airflow)+{},{})",
            num(k.a_w_per_k()),
            num(k.b_w_per_k()),
            num(uf * uf),
            num(0.5 * k.n())
        );
    }
    format!(
        "{}+{}*pow(max(V(airflow),1e-12),{})",
        num(k.a_w_per_k()),
        num(k.b_w_per_k()),
        num(k.n())
    )
}

/// The netlist; `figures` are draftwire's own for its model
/// ([`crate::analysis::netlist_model::expected`]), printed as comments.
pub fn netlist(s: &Sized, opt: &NetlistOptions, figures: Option<&Expected>) -> String {
    let (design, core, report) = (&s.design, &s.core, &s.report);
    let airflow = opt
        .airflow_m_per_s
        .unwrap_or(design.detector.trip_airflow_m_per_s);
    let pin = |d: &str, p: &str| -> String {
        report
            .connections
            .iter()
            .find(|c| c.designator == d && c.pin == p)
            .map_or_else(|| "0".to_string(), |c| spice_node(&c.node).to_string())
    };
    let ta_c = core.env.ambient_k - 273.15;
    let mut out = String::new();
    out.push_str(&format!(
        "* {} — sized by draftwire {} from {}\n",
        report.title, report.tool_version, report.design_file
    ));
    out.push_str(
        "* A netlist for ngspice. Node names as in draftwire's connection list (gnd is 0);\n",
    );
    out.push_str(
        "* element_temp carries the element's temperature in °C as a voltage; VAIRFLOW's DC\n",
    );
    out.push_str("* value is the airflow in m/s. Thermal analogy: W ↔ A, K ↔ V, J/K ↔ F.\n");
    out.push_str(&format!(
        "* The output trips on {} airflow (nominal target {} m/s).\n",
        report.trip.direction,
        crate::quantity::format_sig(design.detector.trip_airflow_m_per_s, 6)
    ));
    out.push_str(&format!(".param ta={}\n", num(ta_c)));
    out.push_str(&format!(
        ".param vos=0\n* vos: the comparator's input offset; the design allows ±{} (move it to see the drift)\n",
        crate::quantity::format_engineering(design.comparator.offset_v, "V", 3)
    ));
    out.push_str(&format!("VAIRFLOW airflow 0 DC {}\n", num(airflow)));
    out.push_str(&format!(
        "VIN rail_in 0 DC {}\n* the input supply at its nominal value ({}–{} V)\n",
        num(design.supply.input_v),
        design.supply.input_min_v,
        design.supply.input_max_v
    ));
    let t_trip = core.at_trip.temperature_k;
    let target = design.detector.trip_airflow_m_per_s;
    let span_hi = core.still_air.temperature_k.max(t_trip) + 300.0;
    let span_lo = design.ambient.min_k - 60.0;
    let mut models = Vec::new();
    for v in &report.values {
        let d = v.designator.as_str();
        let role = Role::from_function(&v.function);
        if v.text.is_empty() {
            out.push_str(&format!("* {d}: {}\n", v.function));
        } else {
            out.push_str(&format!("* {d}: {} — {}\n", v.function, v.text));
        }
        match role {
            Some(Role::Element) => {
                let (n1, n2) = (pin(d, "1"), pin(d, "2"));
                let Some((king, equivalent)) = king_for(&core.element, t_trip, target, &core.env)
                else {
                    out.push_str("* (no King's-law form of this cooling law: element omitted)\n");
                    continue;
                };
                if equivalent {
                    out.push_str(&format!(
                        "* cooling: the geometry model's equivalent King's law around the trip point ({} °C, {} m/s): A = {} W/K, B = {} W/K, n = {}\n",
                        crate::quantity::format_sig(t_trip - 273.15, 4),
                        crate::quantity::format_sig(target, 4),
                        num(king.a_w_per_k()),
                        num(king.b_w_per_k()),
                        crate::quantity::format_sig(king.n(), 4)
                    ));
                }
                let r = resistance_expr(
                    core.element.resistance_law(),
                    "V(element_temp)",
                    span_lo,
                    span_hi,
                );
                out.push_str(&heated_resistor(
                    d,
                    &n1,
                    &n2,
                    "element_temp",
                    &r,
                    core.element.heat_capacity_j_per_k(),
                    &king_expr(&king),
                ));
            }
            Some(Role::Twin) => {
                if let crate::analysis::compensation::Compensator::Twin(tw) = &core.compensation {
                    let (n1, n2) = (pin(d, "1"), pin(d, "2"));
                    let Some((king, _)) = king_for(&tw.element, t_trip, target, &core.env) else {
                        out.push_str("* (no King's-law form of the twin's cooling: the twin is omitted and its leg is open)\n");
                        continue;
                    };
                    let r = resistance_expr(
                        tw.element.resistance_law(),
                        "V(twin_temp)",
                        span_lo,
                        span_hi,
                    );
                    out.push_str(&heated_resistor(
                        d,
                        &n1,
                        &n2,
                        "twin_temp",
                        &r,
                        tw.element.heat_capacity_j_per_k(),
                        &king_expr(&king),
                    ));
                }
            }
            Some(Role::Thermistor) => {
                if let crate::analysis::compensation::Compensator::Thermistor(n) =
                    &core.compensation
                {
                    let (n1, n2) = (pin(d, "1"), pin(d, "2"));
                    let law = ResistanceLaw::Beta(n.law);
                    let r = resistance_expr(&law, "V(ntc_temp)", span_lo, span_hi);
                    out.push_str(&format!(
                        "* its heat capacity assumes a {} s time constant (not given; only .tran sees it)\n",
                        NTC_ASSUMED_TIME_CONSTANT_S
                    ));
                    out.push_str(&heated_resistor(
                        d,
                        &n1,
                        &n2,
                        "ntc_temp",
                        &r,
                        n.dissipation_w_per_k * NTC_ASSUMED_TIME_CONSTANT_S,
                        &num(n.dissipation_w_per_k),
                    ));
                }
            }
            Some(Role::Trimmer) => {
                let r = v.value_ohm.unwrap_or(0.0);
                let x = (report.trip.trimmer_position_percent / 100.0).clamp(0.0, 1.0);
                let floor = 1e-6 * r;
                out.push_str(&format!(
                    "* set to {} % of travel from the grounded end (pin 1)\n",
                    crate::quantity::format_sig(100.0 * x, 6)
                ));
                out.push_str(&format!(
                    "R{d}_LOW {} {} {}\nR{d}_HIGH {} {} {}\n",
                    pin(d, "1"),
                    pin(d, "wiper"),
                    num((x * r).max(floor)),
                    pin(d, "wiper"),
                    pin(d, "2"),
                    num(((1.0 - x) * r).max(floor))
                ));
            }
            Some(Role::CurrentSource) => {
                out.push_str(&format!(
                    "I{d} {} {} DC {}\n",
                    pin(d, "in"),
                    pin(d, "out"),
                    num(v.value_a.unwrap_or(0.0))
                ));
            }
            Some(Role::Comparator) => {
                let (p, m, o) = (pin(d, "in+"), pin(d, "in−"), pin(d, "out"));
                out.push_str(&format!(
                    "* open collector: a switch to {} V (output_low) that closes when V(in−) > V(in+) + vos; its supply pins carry no model\n",
                    num(design.comparator.output_low_v)
                ));
                out.push_str(&format!(
                    "B{d}_SENSE {d}_ctrl 0 V = V({m})-V({p})-{{vos}}\nV{d}_LOW {d}_low 0 DC {}\nS{d} {o} {d}_low {d}_ctrl 0 SCMP\n",
                    num(design.comparator.output_low_v)
                ));
                models.push(format!(
                    ".model SCMP SW(VT=0 VH=0 RON={} ROFF=1e12)\n",
                    num(COMPARATOR_ON_OHM)
                ));
            }
            Some(Role::Regulator) => {
                if let Some(reg) = &design.supply.regulator {
                    out.push_str(&format!(
                        "* an ideal source at the nominal output; tolerance ±{} %, in service ±{} %\n",
                        crate::quantity::format_sig(100.0 * reg.tolerance, 3),
                        crate::quantity::format_sig(100.0 * reg.regulation, 3)
                    ));
                    out.push_str(&format!(
                        "V{d} {} {} DC {}\n",
                        pin(d, "out"),
                        pin(d, "gnd"),
                        num(reg.output_v)
                    ));
                }
            }
            Some(Role::Transistor) => {
                if let Some(o) = &design.output {
                    let npn = matches!(o.stage, crate::design::model::StageKind::NpnLowSide);
                    let t = &o.transistor;
                    // I_S such that V_BE = V_BE(on) at the sized base
                    // current, I_B = (I_S/β)·e^(V_BE/V_T) (Ebers–Moll,
                    // forward active; common practice): the level draftwire
                    // itself assumes for the base network.
                    let ohm = |r: Role| {
                        report
                            .values
                            .iter()
                            .find(|v| v.function == r.function())
                            .and_then(|v| v.value_ohm)
                            .unwrap_or(f64::INFINITY)
                    };
                    let vcc = design.supply.rail_v(design.comparator.rail);
                    let (rp, rb, rbe) = (
                        ohm(Role::PullUp),
                        ohm(Role::BaseResistor),
                        ohm(Role::BaseEmitter),
                    );
                    let ib = if npn {
                        ((vcc - t.vbe_on_v) / (rp + rb) - t.vbe_on_v / rbe).max(1e-6)
                    } else {
                        // The comparator sinks the base current through R_B.
                        let vl = design.supply.rail_v(o.rail);
                        ((vl - t.vbe_on_v - design.comparator.output_low_v) / rb - t.vbe_on_v / rbe)
                            .max(1e-6)
                    };
                    let is = t.hfe_min * ib * (-t.vbe_on_v / VT_27C).exp();
                    out.push_str(&format!(
                        "Q{d} {} {} {} QSW\n",
                        pin(d, "collector"),
                        pin(d, "base"),
                        pin(d, "emitter")
                    ));
                    models.push(format!(
                        ".model QSW {}(BF={} IS={} VAF=100)\n* QSW: β = hFE(min) {}, V_BE ≈ {} V near {} base current\n",
                        if npn { "NPN" } else { "PNP" },
                        num(t.hfe_min),
                        num(is),
                        t.hfe_min,
                        t.vbe_on_v,
                        crate::quantity::format_engineering(ib, "A", 3)
                    ));
                }
            }
            Some(Role::Led) => {
                if let Some(crate::design::model::Load::Led {
                    forward_v,
                    current_a,
                }) = design.output.as_ref().map(|o| &o.load)
                {
                    // I = I_S·e^(V/(N·V_T)) through (V_F, I_F), N = 2.
                    let is = current_a * (-forward_v / (2.0 * VT_27C)).exp();
                    out.push_str(&format!(
                        "D{d} {} {} DLED\n",
                        pin(d, "anode"),
                        pin(d, "cathode")
                    ));
                    models.push(format!(
                        ".model DLED D(IS={} N=2)\n* DLED: {} V at {}\n",
                        num(is),
                        forward_v,
                        crate::quantity::format_engineering(*current_a, "A", 3)
                    ));
                }
            }
            Some(Role::Flyback) => {
                out.push_str(&format!(
                    "D{d} {} {} DFLY\n",
                    pin(d, "anode"),
                    pin(d, "cathode")
                ));
                models.push(
                    ".model DFLY D(IS=1e-14 N=1)\n* DFLY: a generic silicon rectifier\n".into(),
                );
            }
            Some(Role::Relay) => {
                out.push_str(
                    "* the coil as its resistance (no inductance given); contacts not modelled\n",
                );
                out.push_str(&format!(
                    "R{d} {} {} {}\n",
                    pin(d, "coil 1"),
                    pin(d, "coil 2"),
                    num(v.value_ohm.unwrap_or(1.0))
                ));
            }
            Some(Role::Buzzer) => {
                if let Some(o) = &design.output {
                    if let crate::design::model::Load::Buzzer { current_a } = o.load {
                        let vl = design.supply.rail_v(o.rail);
                        out.push_str("* the buzzer as the resistance that draws its current at the nominal load rail\n");
                        out.push_str(&format!(
                            "R{d} {} {} {}\n",
                            pin(d, "+"),
                            pin(d, "−"),
                            num(vl / current_a)
                        ));
                    }
                }
            }
            Some(Role::HoldOff) => {
                out.push_str(&format!(
                    "C{d} {} {} {}\n",
                    pin(d, "+"),
                    pin(d, "−"),
                    num(v.value_f.unwrap_or(0.0))
                ));
            }
            Some(Role::DecouplingInput) | Some(Role::DecouplingRegulated) => {
                out.push_str(&format!(
                    "C{d} {} {} {}\n",
                    pin(d, "1"),
                    pin(d, "2"),
                    num(v.value_f.unwrap_or(0.0))
                ));
            }
            Some(_) => {
                out.push_str(&format!(
                    "R{d} {} {} {}\n",
                    pin(d, "1"),
                    pin(d, "2"),
                    num(v.value_ohm.unwrap_or(0.0))
                ));
            }
            None => out.push_str("* (no model)\n"),
        }
    }
    let on_output = report
        .connections
        .iter()
        .filter(|c| c.node == "cmp_out")
        .count();
    if on_output == 1 {
        out.push_str("* cmp_out carries only the comparator (no [output] and no hysteresis): add a pull-up to watch it switch\n");
    }
    models.dedup();
    for m in models {
        out.push_str(&m);
    }
    out.push_str(&format!(".nodeset v(element_temp)={}\n", num(ta_c)));
    if let Some(e) = figures {
        out.push_str(
            "* draftwire's figures for this netlist's model (nominal parts and conditions):\n",
        );
        out.push_str(&format!(
            "*   draftwire.airflow_m_per_s = {}\n",
            num(e.airflow_m_per_s)
        ));
        out.push_str(&format!(
            "*   draftwire.element_temp_c = {}\n",
            num(e.element_temp_c)
        ));
        out.push_str(&format!("*   draftwire.sense_v = {}\n", num(e.sense_v)));
        if let Some(u) = e.trip_airflow_m_per_s {
            out.push_str(&format!(
                "*   draftwire.trip_airflow_m_per_s = {}\n",
                num(u)
            ));
        }
        if let Some(u) = e.release_airflow_m_per_s {
            out.push_str(&format!(
                "*   draftwire.release_airflow_m_per_s = {}\n",
                num(u)
            ));
        }
        if e.equivalent_king {
            out.push_str(
                "*   (computed with the equivalent King's law above, as the netlist models it)\n",
            );
        }
    }
    let (lo, hi) = sweep_range(s);
    let step = (hi - lo) / 2000.0;
    let mid = 0.5 * (core.output.high_source.0 + design.comparator.output_low_v);
    let tran_stop = 20.0 * core.still_air.time_constant_s.max(1e-3);
    let analyses = [
        "op".to_string(),
        "print v(element_temp) v(sense) v(ref) v(cmp_out)".to_string(),
        format!("dc VAIRFLOW {} {} {}", num(lo), num(hi), num(step)),
        format!("meas dc airflow_up when v(cmp_out)={} cross=1", num(mid)),
        format!("dc VAIRFLOW {} {} {}", num(hi), num(lo), num(-step)),
        format!("meas dc airflow_down when v(cmp_out)={} cross=1", num(mid)),
        format!("tran {} {} uic", num(tran_stop / 2000.0), num(tran_stop)),
    ];
    if opt.analyses {
        out.push_str(".control\n");
        for a in &analyses {
            out.push_str(a);
            out.push('\n');
        }
        // `quit 0`: ngspice's batch mode otherwise exits 1 ("no
        // simulations run" refers to dot-analyses, not the block's).
        out.push_str("quit 0\n.endc\n");
    } else {
        out.push_str(
            "* Ready-made analyses (add them in a .control block, or run netlist --analyses):\n",
        );
        for a in &analyses {
            out.push_str(&format!("*   {a}\n"));
        }
    }
    out.push_str(".end\n");
    out
}

/// An airflow range that holds the trip and release points with room.
pub fn sweep_range(s: &Sized) -> (f64, f64) {
    let t = &s.report.trip;
    let target = s.design.detector.trip_airflow_m_per_s;
    let pts = [
        t.airflow_m_per_s.unwrap_or(target),
        t.release_airflow_m_per_s.unwrap_or(target),
        target,
    ];
    let lo = pts.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = pts.iter().copied().fold(0.0, f64::max);
    (0.5 * lo, 1.5 * hi)
}
