//! The output stage as planned before the hysteresis is sized: the
//! comparator's pull-up, the LED resistor, the transistor's base network,
//! and the output node the feedback sees. Shared by sizing
//! (`size::size_core`), the bill (`output`) and the stage checks
//! (`checks::stage`).

use crate::circuit::comparator::ComparatorParams;
use crate::circuit::frontend::millman;
use crate::circuit::switch::{
    design_base_drive, LedLoad, RelayCoil, SwitchError, TransistorRatings,
};
use crate::design::model::{Design, Load, Rail, Sizable, StageKind};

/// The regulator's data-sheet figures as the circuit formulas take them.
pub(crate) fn regulator(
    g: &crate::design::model::RegulatorSpec,
) -> crate::circuit::regulator::LinearRegulator {
    crate::circuit::regulator::LinearRegulator {
        output_v: g.output_v,
        output_tolerance: g.tolerance,
        dropout_v: g.dropout_v,
        quiescent_a: g.quiescent_a,
        theta_ja_k_per_w: g.theta_ja_k_per_w,
        max_junction_k: g.max_junction_k,
    }
}

/// Pull-up on the comparator output when the file leaves it open (common
/// practice for open-collector outputs, no source).
pub const DEFAULT_PULLUP_OHM: f64 = 10e3;

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
    /// The planned stage, reused by the circuit section and its checks.
    pub(crate) plan: Plan,
}

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
pub const HOLD_OFF_SPARE: f64 = 0.9;

/// Rounds of re-sizing R_BE and R_B for the hold-off limit.
pub const HOLD_OFF_ITERATIONS: usize = 6;

/// Largest base–emitter voltage a switch may see while it must stay off:
/// 0.6 × V_BE(on), about 0.42 V for silicon, where collector current is
/// still negligible (common practice, no source).
pub const HOLD_OFF_SHARE: f64 = 0.6;

/// Millman's theorem for two sources, returned as a Thevenin pair
/// (`crate::circuit::frontend::millman`; R = R1 ∥ R2).
pub(crate) fn thevenin2(v1: f64, r1: f64, v2: f64, r2: f64) -> (f64, f64) {
    (millman(v1, r1, v2, r2), r1 * r2 / (r1 + r2))
}

/// The output stage with its chosen values (private working set, planned
/// once by [`output_node`] and kept in the sized core).
#[derive(Debug, Clone, Copy)]
pub(crate) struct Plan {
    /// The stage this plan is for.
    pub(crate) stage: StageKind,
    /// Comparator rail: nominal, lowest, highest, V.
    pub(crate) vcc: (f64, f64, f64),
    /// Load rail: nominal, lowest, highest, V (the input when no output).
    pub(crate) vload: (f64, f64, f64),
    /// Voltage across the switch when on (V_OL or V_CE(sat)), V.
    pub(crate) switch_drop_v: f64,
    pub(crate) pullup_ohm: f64,
    pub(crate) pullup_exact: Option<f64>,
    /// LED series resistor (chosen, exact), or why it cannot be sized.
    pub(crate) led: Option<Result<(f64, f64), SwitchError>>,
    /// Base resistor (chosen, exact), hold-off resistor (chosen, exact).
    pub(crate) base: Option<((f64, f64), (f64, f64))>,
    pub(crate) high_source: (f64, f64),
}

pub(crate) fn transistor(design: &Design) -> TransistorRatings {
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

pub(crate) fn comparator_params(design: &Design) -> ComparatorParams {
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

pub(crate) fn rail3(design: &Design, rail: Rail) -> (f64, f64, f64) {
    let (lo, hi) = design.supply.rail_range_v(rail);
    (design.supply.rail_v(rail), lo, hi)
}

/// Load current with `rail_v` on the load rail, A: LED (V − V_F − V_sw)/R_L,
/// relay (V − V_sw)/R_coil (Ohm's law), buzzer as given (its built-in driver
/// draws about its rated current).
pub(crate) fn load_current_a(design: &Design, plan: &Plan, rail_v: f64) -> f64 {
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

pub(crate) fn plan(design: &Design, stage: StageKind) -> Plan {
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
        stage,
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
                // stop once R_B is squeezed to the token share the pull-up
                // leaves it; past that the check reports the conflict.
                let rbe_next = k * rb / (1.0 - k);
                if k >= 1.0 || rbe / (rb + rbe) <= k || rb_exact < 0.1 * r_sum {
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
            // conducts and lifts the node (a relay coil, a buzzer, an LED
            // above its forward voltage); an LED path below its forward
            // voltage conducts only leakage, neglected.
            if let Some(o) = out {
                let path = match (o.load.clone(), p.led) {
                    (Load::Led { forward_v, .. }, Some(Ok((rl, _)))) => {
                        Some((vload.0 - forward_v, rl))
                    }
                    (Load::Relay { coil_ohm, .. }, _) => Some((vload.0, coil_ohm)),
                    // A buzzer as the resistance that draws its rated
                    // current at the nominal load rail (as the netlist
                    // models it): it lifts the node as a relay coil does.
                    (Load::Buzzer { current_a }, _) if current_a > 0.0 => {
                        Some((vload.0, vload.0 / current_a))
                    }
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

/// The output stage's working figures, computed once from the design and
/// the sized core: shared by the bill (`output`) and the stage, comparator
/// and supply checks.
#[derive(Debug, Clone, Copy)]
pub(crate) struct StageView<'a> {
    pub(crate) design: &'a Design,
    pub(crate) stage: StageKind,
    pub(crate) plan: Plan,
    pub(crate) transistor: TransistorRatings,
    pub(crate) comparator: ComparatorParams,
    /// Comparator rail: lowest, highest, V.
    pub(crate) vcc_lo: f64,
    pub(crate) vcc_hi: f64,
    /// Load rail: nominal, lowest, highest, V.
    pub(crate) vl: f64,
    pub(crate) vl_lo: f64,
    pub(crate) vl_hi: f64,
    /// Output low level (at the applicable limit), V.
    pub(crate) vol: f64,
    /// V_BE(on), V.
    pub(crate) vbe: f64,
    /// Pull-up, ohm, and whether it is fitted.
    pub(crate) rp: f64,
    pub(crate) pullup_fitted: bool,
    /// Load current at the highest and the nominal load rail, A.
    pub(crate) ic_max: f64,
    pub(crate) ic_nom: f64,
    /// Highest ambient, K.
    pub(crate) ambient_max_k: f64,
}

impl<'a> StageView<'a> {
    /// The figures for a design with its planned output node and whether a
    /// hysteresis feedback resistor is fitted.
    pub(crate) fn new(design: &'a Design, node: &OutputNode, feedback_fitted: bool) -> Self {
        let plan = node.plan;
        let stage = plan.stage;
        let (_, vcc_lo, vcc_hi) = plan.vcc;
        let (vl, vl_lo, vl_hi) = plan.vload;
        let transistor = transistor(design);
        Self {
            design,
            stage,
            plan,
            transistor,
            comparator: comparator_params(design),
            vcc_lo,
            vcc_hi,
            vl,
            vl_lo,
            vl_hi,
            vol: design.comparator.output_low_v,
            vbe: transistor.vbe_on_v,
            rp: node.pullup_ohm,
            pullup_fitted: feedback_fitted || stage != StageKind::Direct,
            ic_max: load_current_a(design, &plan, vl_hi),
            ic_nom: load_current_a(design, &plan, vl),
            ambient_max_k: design.ambient.max_k,
        }
    }
    /// The transistor's base drive: (lowest span, highest span, series
    /// resistance) — the comparator rail through R_P + R_B for an NPN, the
    /// load rail less V_OL through R_B for a PNP.
    pub(crate) fn base_drive(&self, rb: f64) -> (f64, f64, f64) {
        if self.stage == StageKind::NpnLowSide {
            (self.vcc_lo, self.vcc_hi, rb + self.rp)
        } else {
            (self.vl_lo - self.vol, self.vl_hi - self.vol, rb)
        }
    }
    /// Peak off-state V_CE: the flyback spike over the rail for a relay,
    /// the load rail otherwise.
    pub(crate) fn off_vce(&self) -> f64 {
        match self.design.output.as_ref().map(|o| &o.load) {
            Some(Load::Relay { .. }) => crate::circuit::switch::flyback_peak_vce_v(
                self.vl_hi,
                crate::circuit::switch::DiodeRatings::typical_rectifier().forward_v,
            ),
            _ => self.vl_hi,
        }
    }
}
