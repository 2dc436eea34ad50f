//! What to solder: trade designators and the connection list, on every
//! bundled example. The rules checked are the trade's (class letters
//! numbered from 1 along the signal path, ASME Y14.44 / IEEE 315 usage) and
//! circuit common sense (every pin on a node, no node with a single pin):
//! common practice, no source.

use draftwire::analysis::size;
use draftwire::design::parse_design;
use draftwire::report::Report;
use std::collections::{BTreeMap, BTreeSet};
use std::path::Path;

fn examples() -> Vec<(String, Report)> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let mut out = Vec::new();
    for e in std::fs::read_dir(dir).unwrap() {
        let p = e.unwrap().path();
        if p.extension().is_some_and(|x| x == "toml") {
            let text = std::fs::read_to_string(&p).unwrap();
            let name = p.file_name().unwrap().to_string_lossy().to_string();
            let d = parse_design(&name, &text).unwrap();
            out.push((name, size(&d).unwrap()));
        }
    }
    assert_eq!(out.len(), 5);
    out
}

/// Class letters and number of a designator: `RV12` → ("RV", 12).
fn split(d: &str) -> (&str, u32) {
    let i = d.find(|c: char| c.is_ascii_digit()).expect("a number");
    (&d[..i], d[i..].parse().expect("digits"))
}

#[test]
fn designators_are_unique_and_numbered_in_bill_order() {
    for (name, r) in examples() {
        let mut seen = BTreeSet::new();
        let mut last: BTreeMap<&str, u32> = BTreeMap::new();
        for v in &r.values {
            assert!(
                seen.insert(v.designator.clone()),
                "{name}: {} twice",
                v.designator
            );
            let (class, n) = split(&v.designator);
            assert!(
                ["R", "RV", "RT", "C", "D", "LED", "Q", "K", "U", "BZ"].contains(&class),
                "{name}: class {class}"
            );
            // Each class counts 1, 2, 3 … down the bill.
            let prev = last.insert(class, n).unwrap_or(0);
            assert_eq!(n, prev + 1, "{name}: {} after {class}{prev}", v.designator);
            assert!(
                !v.function.is_empty(),
                "{name}: {} has no function",
                v.designator
            );
        }
        // The element comes first: the signal path starts at it.
        assert_eq!(r.values[0].designator, "RT1", "{name}");
    }
}

/// The examples, and variants of them for the topologies no example has:
/// a current-source drive, a PNP high-side stage, a buzzer,
/// a thermistor in place of the twin, no hysteresis.
fn examples_and_variants() -> Vec<(String, Report)> {
    use draftwire::design::overrides::Override;
    let mut out = examples();
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let variants: &[(&str, &[&str])] = &[
        (
            "greenhouse-fan-alarm.toml",
            &[
                "drive.kind=constant-current",
                "drive.series=",
                "drive.rail=",
                "drive.current=auto",
            ],
        ),
        ("greenhouse-fan-alarm.toml", &["output.stage=pnp-high-side"]),
        (
            "server-cabinet-airflow.toml",
            &[
                "output.load=buzzer",
                "output.led_forward=",
                "output.led_current=",
                "output.buzzer_current=20 mA",
            ],
        ),
        ("server-cabinet-airflow.toml", &["detector.hysteresis=none"]),
        (
            "workshop-door-draught.toml",
            &["compensation.kind=thermistor"],
        ),
    ];
    for (file, sets) in variants {
        let text = std::fs::read_to_string(dir.join(file)).unwrap();
        let o: Vec<Override> = sets.iter().map(|s| Override::parse(s).unwrap()).collect();
        let d = draftwire::design::parse_design_with(file, &text, &o)
            .unwrap_or_else(|e| panic!("{file} {sets:?}: {e}"));
        out.push((format!("{file} {sets:?}"), size(&d).unwrap()));
    }
    out
}

#[test]
fn every_part_is_wired_and_every_node_joins_two_pins() {
    for (name, r) in examples_and_variants() {
        let bill: BTreeSet<&str> = r.values.iter().map(|v| v.designator.as_str()).collect();
        let mut pins: BTreeMap<&str, Vec<&str>> = BTreeMap::new();
        for c in &r.connections {
            assert!(
                bill.contains(c.designator.as_str()),
                "{name}: {} not in the bill",
                c.designator
            );
            pins.entry(&c.designator).or_default().push(&c.pin);
        }
        for d in &bill {
            let p = pins
                .get(d)
                .unwrap_or_else(|| panic!("{name}: {d} not wired"));
            let unique: BTreeSet<_> = p.iter().collect();
            assert_eq!(unique.len(), p.len(), "{name}: {d} has a pin twice");
            let (class, _) = split(d);
            let function = &r
                .values
                .iter()
                .find(|v| v.designator == *d)
                .unwrap()
                .function;
            let want = match class {
                "RV" | "Q" => 3,
                "U" if function == "comparator" => 5,
                "U" => 3,
                _ => 2,
            };
            assert_eq!(p.len(), want, "{name}: {d} has pins {p:?}");
        }
        for n in &r.nodes {
            assert!(
                n.parts.len() >= 2,
                "{name}: node {} has {:?}",
                n.name,
                n.parts
            );
            assert!(!n.what.is_empty(), "{name}: node {} unexplained", n.name);
        }
        // No two-pin part with both ends on one node.
        for d in &bill {
            let on: Vec<&str> = r
                .connections
                .iter()
                .filter(|c| c.designator == *d)
                .map(|c| c.node.as_str())
                .collect();
            if on.len() == 2 {
                assert_ne!(on[0], on[1], "{name}: {d} shorted on {}", on[0]);
            }
        }
    }
}

/// The variants' topologies, pin by pin, from the stage and drive each
/// asks for: a PNP high-side switch has its emitter and base–emitter
/// resistor on the load rail and the load from its collector to ground; a
/// current source feeds the sense node from the regulated rail; a direct
/// buzzer hangs from its rail into the comparator output; a thermistor in
/// the workshop's place of the twin sits in a divider leg in parallel with
/// its linearising resistor.
#[test]
fn the_variants_are_wired_as_their_stages_draw_them() {
    let all = examples_and_variants();
    let get = |key: &str| &all.iter().find(|(n, _)| n.contains(key)).unwrap().1;
    let node = |r: &Report, function: &str, pin: &str| -> String {
        let d = &r
            .values
            .iter()
            .find(|v| v.function == function)
            .unwrap_or_else(|| panic!("no {function}"))
            .designator;
        r.connections
            .iter()
            .find(|c| &c.designator == d && c.pin == pin)
            .unwrap_or_else(|| panic!("{d}.{pin}"))
            .node
            .clone()
    };
    let pnp = get("pnp-high-side");
    let load_rail = node(pnp, "output switch", "emitter");
    assert!(load_rail.starts_with("rail_"), "{load_rail}");
    assert_eq!(node(pnp, "base–emitter hold-off", "2"), load_rail);
    assert_eq!(node(pnp, "alarm relay coil", "coil 1"), "switch");
    assert_eq!(node(pnp, "alarm relay coil", "coil 2"), "gnd");
    assert_eq!(node(pnp, "relay flyback diode", "cathode"), "switch");
    let cc = get("constant-current");
    assert_eq!(node(cc, "element current source", "out"), "sense");
    assert_eq!(node(cc, "element current source", "in"), "rail_reg");
    let bz = get("buzzer");
    assert_eq!(node(bz, "audible alarm", "−"), "cmp_out");
    assert!(node(bz, "audible alarm", "+").starts_with("rail_"));
    let th = get("thermistor");
    let a = node(th, "ambient compensation thermistor", "1");
    let b = node(th, "ambient compensation thermistor", "2");
    assert_eq!(
        node(th, "linearising resistor across the thermistor", "1"),
        a
    );
    assert_eq!(
        node(th, "linearising resistor across the thermistor", "2"),
        b
    );
}

/// The check ids and every text of the report name parts by the bill's
/// designators: no internal id (unique to the sizing code) survives in a
/// check, caution, warning, bill reason or compensation note.
#[test]
fn checks_name_the_bills_designators() {
    let internal = [
        "RS1", "IS1", "RR1", "RR2", "RR3", "RC1", "RF1", "RI1", "RP1", "RBE1", "RB1", "RL1", "CH1",
        "ELEMENT",
    ];
    for (name, r) in examples_and_variants() {
        let bill: BTreeSet<String> = r
            .values
            .iter()
            .map(|v| v.designator.to_lowercase())
            .collect();
        let mut texts: Vec<&str> = Vec::new();
        for c in &r.checks {
            if let Some(d) = c.id.strip_prefix("power-rating-") {
                assert!(bill.contains(d), "{name}: {} names no part", c.id);
            }
            texts.extend([c.name.as_str(), c.detail.as_str(), c.condition.as_str()]);
        }
        texts.extend(r.cautions.iter().map(String::as_str));
        texts.extend(r.warnings.iter().map(String::as_str));
        texts.extend(
            r.values
                .iter()
                .flat_map(|v| [v.reason.as_str(), v.rating.as_str()]),
        );
        texts.extend(r.compensation.parts.iter().map(String::as_str));
        texts.extend(r.compensation.notes.iter().map(String::as_str));
        for t in texts {
            for word in t.split(|c: char| !c.is_ascii_alphanumeric()) {
                assert!(!internal.contains(&word), "{name}: {word} left in {t:?}");
            }
        }
    }
}

/// The workshop's bridge by hand from its header comment: the element
/// between the sense node and ground, fed through R1 from the regulated
/// rail; the divider rail → R2 → RV1 → R3 → twin RT2 → ground with the
/// wiper on the comparator's inverting input; the sense node through the
/// input resistor R4 to the non-inverting input, where the feedback R5
/// from the output lands; the LED from the regulated rail through R7 into
/// the open-collector output.
#[test]
fn the_workshop_bridge_is_wired_as_drawn() {
    let r = examples()
        .into_iter()
        .find(|(n, _)| n == "workshop-door-draught.toml")
        .unwrap()
        .1;
    let node = |d: &str, pin: &str| -> String {
        r.connections
            .iter()
            .find(|c| c.designator == d && c.pin == pin)
            .unwrap_or_else(|| panic!("{d}.{pin}"))
            .node
            .clone()
    };
    assert_eq!(node("RT1", "1"), "sense");
    assert_eq!(node("RT1", "2"), "gnd");
    assert_eq!(node("R1", "1"), "rail_reg");
    assert_eq!(node("R1", "2"), "sense");
    assert_eq!(node("R2", "1"), "rail_reg");
    assert_eq!(node("R2", "2"), node("RV1", "2"));
    assert_eq!(node("RV1", "1"), node("R3", "1"));
    assert_eq!(node("R3", "2"), node("RT2", "1"));
    assert_eq!(node("RT2", "2"), "gnd");
    assert_eq!(node("RV1", "wiper"), "ref");
    assert_eq!(node("U1", "in−"), "ref");
    assert_eq!(node("R4", "1"), "sense");
    assert_eq!(node("R4", "2"), node("U1", "in+"));
    assert_eq!(node("R5", "2"), node("U1", "in+"));
    assert_eq!(node("R5", "1"), "cmp_out");
    assert_eq!(node("LED1", "cathode"), "cmp_out");
    assert_eq!(node("R7", "1"), "rail_reg");
    assert_eq!(node("R7", "2"), node("LED1", "anode"));
}
