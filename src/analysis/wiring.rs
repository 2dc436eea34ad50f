//! What to solder: trade designators in signal-path order, each part's
//! function, and the connection list (which pin of which part goes to which
//! node).
//!
//! Designators use the class letters of ASME Y14.44 / IEEE 315 practice
//! (R resistor, RV variable resistor (trimmer), RT temperature-sensitive
//! resistor, C capacitor, D diode, LED light-emitting diode, Q transistor,
//! K relay, BZ buzzer, U integrated circuit or circuit block), numbered in
//! order along the signal path (common practice for schematics, no
//! source). The sizing code names parts by role (`RS1`, `RR1`, …, its own
//! internal ids); [`Renaming`] maps those to the trade designators for
//! every output, text included.

use crate::analysis::compensation::{Compensator, Leg};
use crate::analysis::size::SizedCore;
use crate::circuit::frontend::Arrangement;
use crate::design::model::StageKind;
use crate::design::model::{DriveSpec, Load, Rail};
use crate::design::Design;
use crate::report::{Connection, NodeRow, Report};

/// A part's role in the circuit draftwire sizes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum Role {
    /// The self-heated sensing element.
    Element,
    /// The element's series resistor.
    SeriesResistor,
    /// The element's constant-current source.
    CurrentSource,
    /// Reference divider, top.
    DividerTop,
    /// The trimmer.
    Trimmer,
    /// Reference divider, bottom.
    DividerBottom,
    /// The unheated twin of the element (bridge compensation).
    Twin,
    /// The compensating NTC thermistor.
    Thermistor,
    /// The resistor across the NTC.
    Linearising,
    /// The power-on hold-off capacitor on the reference node.
    HoldOff,
    /// Series resistor in front of the non-inverting input.
    InputResistor,
    /// Positive-feedback resistor.
    Feedback,
    /// The comparator.
    Comparator,
    /// The comparator output's pull-up.
    PullUp,
    /// The transistor's base resistor.
    BaseResistor,
    /// The transistor's base–emitter resistor.
    BaseEmitter,
    /// The switching transistor.
    Transistor,
    /// The LED's series resistor.
    LedResistor,
    /// The indicator LED.
    Led,
    /// The buzzer.
    Buzzer,
    /// The relay coil.
    Relay,
    /// The relay's flyback diode.
    Flyback,
    /// The linear regulator.
    Regulator,
    /// Decoupling on the input rail.
    DecouplingInput,
    /// Decoupling on the regulated rail.
    DecouplingRegulated,
}

/// Every role in signal-path order (the order designators are numbered in).
const ORDER: [Role; 25] = [
    Role::Element,
    Role::SeriesResistor,
    Role::CurrentSource,
    Role::DividerTop,
    Role::Trimmer,
    Role::DividerBottom,
    Role::Twin,
    Role::Thermistor,
    Role::Linearising,
    Role::HoldOff,
    Role::InputResistor,
    Role::Feedback,
    Role::Comparator,
    Role::PullUp,
    Role::BaseResistor,
    Role::BaseEmitter,
    Role::Transistor,
    Role::LedResistor,
    Role::Led,
    Role::Buzzer,
    Role::Relay,
    Role::Flyback,
    Role::Regulator,
    Role::DecouplingInput,
    Role::DecouplingRegulated,
];

impl Role {
    /// The sizing code's internal id for this role.
    pub fn internal_id(self) -> &'static str {
        match self {
            Role::Element => "ELEMENT",
            Role::SeriesResistor => "RS1",
            Role::CurrentSource => "IS1",
            Role::DividerTop => "RR1",
            Role::Trimmer => "RV1",
            Role::DividerBottom => "RR2",
            Role::Twin => "RC1",
            Role::Thermistor => "RT1",
            Role::Linearising => "RR3",
            Role::HoldOff => "CH1",
            Role::InputResistor => "RI1",
            Role::Feedback => "RF1",
            Role::Comparator => "U1",
            Role::PullUp => "RP1",
            Role::BaseResistor => "RB1",
            Role::BaseEmitter => "RBE1",
            Role::Transistor => "Q1",
            Role::LedResistor => "RL1",
            Role::Led => "LED1",
            Role::Buzzer => "BZ1",
            Role::Relay => "K1",
            Role::Flyback => "D1",
            Role::Regulator => "U2",
            Role::DecouplingInput => "C1",
            Role::DecouplingRegulated => "C2",
        }
    }

    /// The role of an internal id.
    pub fn from_internal(id: &str) -> Option<Role> {
        ORDER.iter().copied().find(|r| r.internal_id() == id)
    }

    /// The role whose [`Role::function`] is `function` (how later jobs find
    /// a part of the bill, whatever its number).
    pub fn from_function(function: &str) -> Option<Role> {
        ORDER.iter().copied().find(|r| r.function() == function)
    }

    /// The trade class letter(s).
    pub fn class(self) -> &'static str {
        match self {
            Role::Element | Role::Twin | Role::Thermistor => "RT",
            Role::Trimmer => "RV",
            Role::HoldOff | Role::DecouplingInput | Role::DecouplingRegulated => "C",
            Role::Transistor => "Q",
            Role::Led => "LED",
            Role::Buzzer => "BZ",
            Role::Relay => "K",
            Role::Flyback => "D",
            Role::Comparator | Role::Regulator | Role::CurrentSource => "U",
            _ => "R",
        }
    }

    /// What the part does, in a few words (the bill's function column).
    pub fn function(self) -> &'static str {
        match self {
            Role::Element => "sensing element (self-heated)",
            Role::SeriesResistor => "element series resistor",
            Role::CurrentSource => "element current source",
            Role::DividerTop => "reference divider, top",
            Role::Trimmer => "trip-point trimmer",
            Role::DividerBottom => "reference divider, bottom",
            Role::Twin => "ambient twin (bridge compensation)",
            Role::Thermistor => "ambient compensation thermistor",
            Role::Linearising => "linearising resistor across the thermistor",
            Role::HoldOff => "power-on hold-off",
            Role::InputResistor => "comparator input resistor",
            Role::Feedback => "hysteresis feedback",
            Role::Comparator => "comparator",
            Role::PullUp => "comparator output pull-up",
            Role::BaseResistor => "transistor base resistor",
            Role::BaseEmitter => "base–emitter hold-off",
            Role::Transistor => "output switch",
            Role::LedResistor => "LED series resistor",
            Role::Led => "alarm indicator",
            Role::Buzzer => "audible alarm",
            Role::Relay => "alarm relay coil",
            Role::Flyback => "relay flyback diode",
            Role::Regulator => "voltage regulator",
            Role::DecouplingInput => "input rail decoupling",
            Role::DecouplingRegulated => "regulated rail decoupling",
        }
    }
}

/// Internal id → trade designator, for the parts of one design.
#[derive(Debug, Clone, Default)]
pub struct Renaming {
    map: Vec<(String, String)>,
}

impl Renaming {
    /// Number the parts present (by internal id) in signal-path order,
    /// class by class.
    pub fn new<'a>(present: impl IntoIterator<Item = &'a str>) -> Self {
        let mut roles: Vec<Role> = present
            .into_iter()
            .filter_map(Role::from_internal)
            .collect();
        roles.sort();
        roles.dedup();
        let mut counts: Vec<(&str, usize)> = Vec::new();
        let map = roles
            .into_iter()
            .map(|role| {
                let class = role.class();
                let n = match counts.iter_mut().find(|(c, _)| *c == class) {
                    Some((_, n)) => {
                        *n += 1;
                        *n
                    }
                    None => {
                        counts.push((class, 1));
                        1
                    }
                };
                (role.internal_id().to_string(), format!("{class}{n}"))
            })
            .collect();
        Self { map }
    }

    /// The trade designator of an internal id (the id itself when unknown).
    pub fn designator(&self, internal: &str) -> String {
        self.map
            .iter()
            .find(|(i, _)| i == internal)
            .map_or_else(|| internal.to_string(), |(_, d)| d.clone())
    }

    /// `text` with every internal id written as a whole word replaced by
    /// its designator, all at once (so `C1` → `C2` and `CH1` → `C1`
    /// cannot chain).
    pub fn text(&self, text: &str) -> String {
        let mut out = String::with_capacity(text.len());
        let mut word = String::new();
        let flush = |word: &mut String, out: &mut String| {
            match self.map.iter().find(|(i, _)| i == word) {
                Some((_, d)) => out.push_str(d),
                None => out.push_str(word),
            }
            word.clear();
        };
        // Whole words only: a run of ASCII letters and digits is replaced
        // when it is exactly an id (`RP1x` and `aRP1` are not).
        for ch in text.chars() {
            if ch.is_ascii_alphanumeric() {
                word.push(ch);
            } else {
                flush(&mut word, &mut out);
                out.push(ch);
            }
        }
        flush(&mut word, &mut out);
        out
    }

    /// A check id `power-rating-<internal id>` with the trade designator.
    pub fn check_id(&self, id: &str) -> String {
        match id.strip_prefix("power-rating-") {
            Some(d) => format!(
                "power-rating-{}",
                self.designator(&d.to_ascii_uppercase()).to_lowercase()
            ),
            None => id.to_string(),
        }
    }
}

/// Node names (stable: the SPICE netlist uses the same ones).
pub mod node {
    /// Ground.
    pub const GND: &str = "gnd";
    /// The unregulated input rail.
    pub const RAIL_IN: &str = "rail_in";
    /// The regulated rail.
    pub const RAIL_REG: &str = "rail_reg";
    /// The element's top: the sense node.
    pub const SENSE: &str = "sense";
    /// The trimmer's wiper: the reference.
    pub const REF: &str = "ref";
    /// The trimmer's rail-side end.
    pub const REF_HIGH: &str = "ref_high";
    /// The trimmer's grounded-side end.
    pub const REF_LOW: &str = "ref_low";
    /// Between the compensating network and its leg's fixed resistor.
    pub const COMP: &str = "comp";
    /// The non-inverting input behind the input resistor.
    pub const IN_PLUS: &str = "in_plus";
    /// The comparator's output.
    pub const OUT: &str = "cmp_out";
    /// The transistor's base.
    pub const BASE: &str = "q_base";
    /// The switched side of the load (the transistor's collector).
    pub const SWITCH: &str = "switch";
    /// Between the LED and its series resistor.
    pub const LED: &str = "led";
}

fn rail_node(r: Rail) -> &'static str {
    match r {
        Rail::Input => node::RAIL_IN,
        Rail::Regulated => node::RAIL_REG,
    }
}

/// What a node is, in words.
fn node_what(name: &str) -> &'static str {
    match name {
        node::GND => "ground (0 V)",
        node::RAIL_IN => "the input rail",
        node::RAIL_REG => "the regulated rail",
        node::SENSE => "the sense node: the element's top",
        node::REF => "the reference: the trimmer's wiper",
        node::REF_HIGH => "the trimmer's rail-side end",
        node::REF_LOW => "the trimmer's grounded end",
        node::COMP => "between the compensating part and its leg's fixed resistor",
        node::IN_PLUS => "the comparator's non-inverting input, behind the input resistor",
        node::OUT => "the comparator's output",
        node::BASE => "the transistor's base",
        node::SWITCH => "the switched side of the load",
        node::LED => "between the LED and its series resistor",
        _ => "",
    }
}

/// The connection list of a sized design, in internal ids, for the parts
/// in `present` (the bill's rows): every pin of every part.
pub fn connections(
    design: &Design,
    core: &SizedCore,
    hold_off_to_rail: Option<bool>,
    present: &dyn Fn(&str) -> bool,
) -> Vec<(String, &'static str, String)> {
    let mut c: Vec<(String, &'static str, String)> = Vec::new();
    let mut wire = |id: &str, pin: &'static str, n: &str| {
        if present(id) {
            c.push((id.to_string(), pin, n.to_string()));
        }
    };
    // Element and its drive.
    wire("ELEMENT", "1", node::SENSE);
    wire("ELEMENT", "2", node::GND);
    match design.drive {
        DriveSpec::SeriesResistor { rail, .. } => {
            wire("RS1", "1", rail_node(rail));
            wire("RS1", "2", node::SENSE);
        }
        DriveSpec::ConstantCurrent { .. } => {
            let rail = if design.supply.regulator.is_some() {
                Rail::Regulated
            } else {
                Rail::Input
            };
            wire("IS1", "in", rail_node(rail));
            wire("IS1", "out", node::SENSE);
            wire("IS1", "gnd", node::GND);
        }
    }
    // Reference divider: rail → [top leg] → ref_high → RV1 → ref_low →
    // [bottom leg] → ground; a compensating network sits at its leg's
    // outer end (rail side of the top leg, ground side of the bottom).
    let rail_ref = rail_node(design.detector.reference_rail);
    let d = core.front.divider;
    let (top, bottom) = (d.top_ohm > 0.0, d.bottom_ohm > 0.0);
    let leg = core.compensation.leg();
    let high = if top { node::REF_HIGH } else { rail_ref };
    let low = if bottom { node::REF_LOW } else { node::GND };
    // The compensating network's two ends.
    let comp_ends: Option<(&str, &str)> = match leg {
        Some(Leg::Top) => Some((rail_ref, if top { node::COMP } else { node::REF_HIGH })),
        Some(Leg::Bottom) => Some((if bottom { node::COMP } else { node::REF_LOW }, node::GND)),
        None => None,
    };
    let high = if leg == Some(Leg::Top) && !top {
        node::REF_HIGH
    } else {
        high
    };
    let low = if leg == Some(Leg::Bottom) && !bottom {
        node::REF_LOW
    } else {
        low
    };
    if top {
        let outer = if leg == Some(Leg::Top) {
            node::COMP
        } else {
            rail_ref
        };
        wire("RR1", "1", outer);
        wire("RR1", "2", node::REF_HIGH);
    }
    wire("RV1", "1", low);
    wire("RV1", "2", high);
    wire("RV1", "wiper", node::REF);
    if bottom {
        let outer = if leg == Some(Leg::Bottom) {
            node::COMP
        } else {
            node::GND
        };
        wire("RR2", "1", node::REF_LOW);
        wire("RR2", "2", outer);
    }
    if let Some((a, b)) = comp_ends {
        match &core.compensation {
            Compensator::Twin(_) => {
                wire("RC1", "1", a);
                wire("RC1", "2", b);
            }
            Compensator::Thermistor(_) => {
                wire("RT1", "1", a);
                wire("RT1", "2", b);
                wire("RR3", "1", a);
                wire("RR3", "2", b);
            }
            Compensator::None => {}
        }
    }
    if let Some(to_rail) = hold_off_to_rail {
        // An electrolytic's + goes to the more positive node.
        if to_rail {
            wire("CH1", "+", rail_ref);
            wire("CH1", "−", node::REF);
        } else {
            wire("CH1", "+", node::REF);
            wire("CH1", "−", node::GND);
        }
    }
    // The comparator's inputs, feedback and output.
    let (plus, minus) = match core.front.arrangement {
        Arrangement::ReferenceOnNonInverting => (node::REF, node::SENSE),
        Arrangement::SenseOnNonInverting => {
            if present("RI1") {
                wire("RI1", "1", node::SENSE);
                wire("RI1", "2", node::IN_PLUS);
                (node::IN_PLUS, node::REF)
            } else {
                (node::SENSE, node::REF)
            }
        }
    };
    wire("RF1", "1", node::OUT);
    wire("RF1", "2", plus);
    let cmp_rail = rail_node(design.comparator.rail);
    wire("U1", "in+", plus);
    wire("U1", "in−", minus);
    wire("U1", "out", node::OUT);
    wire("U1", "V+", cmp_rail);
    wire("U1", "gnd", node::GND);
    wire("RP1", "1", cmp_rail);
    wire("RP1", "2", node::OUT);
    // The output stage and its load.
    if let Some(o) = design.output.as_ref() {
        let load_rail = rail_node(o.rail);
        // The load's two ends: (high side, low side).
        let (hi, lo) = match core.stage {
            StageKind::Direct => (load_rail, node::OUT),
            StageKind::NpnLowSide => {
                wire("RB1", "1", node::OUT);
                wire("RB1", "2", node::BASE);
                wire("RBE1", "1", node::BASE);
                wire("RBE1", "2", node::GND);
                wire("Q1", "base", node::BASE);
                wire("Q1", "collector", node::SWITCH);
                wire("Q1", "emitter", node::GND);
                (load_rail, node::SWITCH)
            }
            StageKind::PnpHighSide => {
                wire("RB1", "1", node::OUT);
                wire("RB1", "2", node::BASE);
                wire("RBE1", "1", node::BASE);
                wire("RBE1", "2", load_rail);
                wire("Q1", "base", node::BASE);
                wire("Q1", "collector", node::SWITCH);
                wire("Q1", "emitter", load_rail);
                (node::SWITCH, node::GND)
            }
        };
        match o.load {
            Load::Led { .. } => {
                if present("RL1") {
                    wire("RL1", "1", hi);
                    wire("RL1", "2", node::LED);
                    wire("LED1", "anode", node::LED);
                } else {
                    wire("LED1", "anode", hi);
                }
                wire("LED1", "cathode", lo);
            }
            Load::Buzzer { .. } => {
                wire("BZ1", "+", hi);
                wire("BZ1", "−", lo);
            }
            Load::Relay { .. } => {
                wire("K1", "coil 1", hi);
                wire("K1", "coil 2", lo);
                // Cathode to the rail side.
                wire("D1", "cathode", hi);
                wire("D1", "anode", lo);
            }
        }
    }
    // Supply.
    if design.supply.regulator.is_some() {
        wire("U2", "in", node::RAIL_IN);
        wire("U2", "out", node::RAIL_REG);
        wire("U2", "gnd", node::GND);
    }
    wire("C1", "1", node::RAIL_IN);
    wire("C1", "2", node::GND);
    wire("C2", "1", node::RAIL_REG);
    wire("C2", "2", node::GND);
    c
}

/// Give the report its trade designators, functions, signal-path order and
/// connection list. `hold_off_to_rail` says where a fitted hold-off
/// capacitor goes.
pub fn apply(
    report: &mut Report,
    design: &Design,
    core: &SizedCore,
    hold_off_to_rail: Option<bool>,
) {
    let ids: Vec<String> = report.values.iter().map(|v| v.designator.clone()).collect();
    let present = |id: &str| ids.iter().any(|i| i == id);
    let raw = connections(design, core, hold_off_to_rail, &present);
    let names = Renaming::new(ids.iter().map(String::as_str));
    // The bill in signal-path order, each row with its function.
    report
        .values
        .sort_by_key(|v| Role::from_internal(&v.designator));
    for v in &mut report.values {
        if let Some(role) = Role::from_internal(&v.designator) {
            v.function = role.function().to_string();
        }
        v.designator = names.designator(&v.designator);
        v.reason = names.text(&v.reason);
        v.rating = names.text(&v.rating);
    }
    for c in report
        .checks
        .iter_mut()
        .chain(report.diagnostics.iter_mut())
    {
        c.id = names.check_id(&c.id);
        c.name = names.text(&c.name);
        c.detail = names.text(&c.detail);
        c.condition = names.text(&c.condition);
    }
    for s in report
        .cautions
        .iter_mut()
        .chain(report.warnings.iter_mut())
        .chain(report.compensation.parts.iter_mut())
        .chain(report.compensation.notes.iter_mut())
    {
        *s = names.text(s);
    }
    report.compensation.why = names.text(&report.compensation.why);
    report.connections = raw
        .iter()
        .map(|(id, pin, n)| Connection {
            designator: names.designator(id),
            pin: (*pin).to_string(),
            node: n.clone(),
        })
        .collect();
    let mut nodes: Vec<String> = Vec::new();
    for c in &report.connections {
        if !nodes.contains(&c.node) {
            nodes.push(c.node.clone());
        }
    }
    report.nodes = nodes
        .into_iter()
        .map(|name| NodeRow {
            what: match report.connections.iter().filter(|c| c.node == name).count() {
                // Only the comparator's open output, with nothing to drive
                // and no feedback: a test point.
                1 => format!("{} (nothing else on it: a test point)", node_what(&name)),
                _ => node_what(&name).to_string(),
            },
            parts: report
                .connections
                .iter()
                .filter(|c| c.node == name)
                .map(|c| format!("{}.{}", c.designator, c.pin))
                .collect(),
            name,
        })
        .collect();
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbering_follows_the_signal_path_class_by_class() {
        // The duct example's parts: element, series resistor, divider with
        // a thermistor network, feedback, pull-up, relay stage, regulator,
        // two decoupling capacitors and a hold-off capacitor.
        let ids = [
            "RS1", "RR1", "RV1", "RR2", "RT1", "RR3", "RF1", "RP1", "CH1", "K1", "D1", "RB1",
            "RBE1", "Q1", "U1", "U2", "C1", "C2", "ELEMENT",
        ];
        let n = Renaming::new(ids);
        let got: Vec<String> = ids.iter().map(|i| n.designator(i)).collect();
        assert_eq!(
            got,
            [
                "R1", "R2", "RV1", "R3", "RT2", "R4", "R5", "R6", "C1", "K1", "D1", "R7", "R8",
                "Q1", "U1", "U2", "C2", "C3", "RT1"
            ]
        );
    }

    #[test]
    fn text_renaming_is_simultaneous_and_whole_word() {
        let n = Renaming::new(["CH1", "C1", "C2", "RP1", "RB1", "U1"]);
        assert_eq!(
            n.text("CH1 and C1, C2; with the pull-up RP1 in series (RP1x, aRP1) at 25 °C, E96"),
            "C1 and C2, C3; with the pull-up R1 in series (RP1x, aRP1) at 25 °C, E96"
        );
        assert_eq!(n.check_id("power-rating-rp1"), "power-rating-r1");
        assert_eq!(n.check_id("q1-ratings"), "q1-ratings");
    }
}
