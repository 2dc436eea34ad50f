//! The sized circuit as an SVG schematic, drawn by draftwire's own layout
//! code: every part of the bill as its symbol (IEC 60617 style: resistors
//! as rectangles, a temperature-dependent resistor with its slant, the
//! trimmer with its wiper arrow), grouped along the signal path, with its
//! designator and value, and each pin ending in a label of the net it
//! joins (the net-label style of schematics: pins with the same label are
//! connected; the connection list has the same names). 800 px wide.

use crate::analysis::wiring::Role;
use crate::report::{Report, ValueRow};
use std::fmt::Write;

/// Width of the drawing, px.
pub const WIDTH: f64 = 800.0;
const COLUMNS: usize = 4;
const CELL_W: f64 = WIDTH / COLUMNS as f64;
const CELL_H: f64 = 170.0;
const HEADING_H: f64 = 30.0;
const STUB: f64 = 18.0;
const INK: &str = "#1a1a1a";
const NET: &str = "#1f5fa8";

/// The signal-path groups of the drawing.
const GROUPS: [(&str, &[Role]); 5] = [
    (
        "Element and drive",
        &[Role::Element, Role::SeriesResistor, Role::CurrentSource],
    ),
    (
        "Reference and compensation",
        &[
            Role::DividerTop,
            Role::Trimmer,
            Role::DividerBottom,
            Role::Twin,
            Role::Thermistor,
            Role::Linearising,
            Role::HoldOff,
        ],
    ),
    (
        "Comparator and hysteresis",
        &[
            Role::InputResistor,
            Role::Feedback,
            Role::Comparator,
            Role::PullUp,
        ],
    ),
    (
        "Output",
        &[
            Role::BaseResistor,
            Role::BaseEmitter,
            Role::Transistor,
            Role::LedResistor,
            Role::Led,
            Role::Buzzer,
            Role::Relay,
            Role::Flyback,
        ],
    ),
    (
        "Supply",
        &[
            Role::Regulator,
            Role::DecouplingInput,
            Role::DecouplingRegulated,
        ],
    ),
];

/// Where a pin leaves its symbol: the stub's end relative to the symbol's
/// centre, and which side (for the label's anchor).
#[derive(Clone, Copy)]
enum Side {
    Top,
    Bottom,
    Left,
    Right,
}

fn xml(s: &str) -> String {
    s.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
}

/// The pins of a part's symbol: (pin name, side, offset from the centre to
/// the symbol's edge along that side's axis).
fn pin_layout(role: Role) -> Vec<(&'static str, Side, f64, f64)> {
    // (pin, side, x, y) of the symbol edge where the stub starts.
    match role {
        Role::Trimmer => vec![
            ("2", Side::Top, 0.0, -25.0),
            ("1", Side::Bottom, 0.0, 25.0),
            ("wiper", Side::Right, 22.0, 0.0),
        ],
        Role::Comparator => vec![
            ("in+", Side::Left, -25.0, -12.0),
            ("in−", Side::Left, -25.0, 12.0),
            ("out", Side::Right, 25.0, 0.0),
            ("V+", Side::Top, 0.0, -13.0),
            ("gnd", Side::Bottom, 0.0, 13.0),
        ],
        Role::Transistor => vec![
            ("collector", Side::Top, 8.0, -20.0),
            ("emitter", Side::Bottom, 8.0, 20.0),
            ("base", Side::Left, -18.0, 0.0),
        ],
        Role::Regulator => vec![
            ("in", Side::Left, -25.0, 0.0),
            ("out", Side::Right, 25.0, 0.0),
            ("gnd", Side::Bottom, 0.0, 15.0),
        ],
        Role::CurrentSource => vec![
            ("in", Side::Top, 0.0, -16.0),
            ("out", Side::Bottom, 0.0, 16.0),
            ("gnd", Side::Right, 16.0, 0.0),
        ],
        Role::HoldOff => vec![("+", Side::Top, 0.0, -5.0), ("−", Side::Bottom, 0.0, 5.0)],
        Role::DecouplingInput | Role::DecouplingRegulated => {
            vec![("1", Side::Top, 0.0, -5.0), ("2", Side::Bottom, 0.0, 5.0)]
        }
        Role::Led | Role::Flyback => vec![
            ("anode", Side::Top, 0.0, -12.0),
            ("cathode", Side::Bottom, 0.0, 12.0),
        ],
        Role::Buzzer => vec![("+", Side::Top, 0.0, -12.0), ("−", Side::Bottom, 0.0, 12.0)],
        Role::Relay => vec![
            ("coil 1", Side::Top, 0.0, -12.0),
            ("coil 2", Side::Bottom, 0.0, 12.0),
        ],
        _ => vec![("1", Side::Top, 0.0, -22.0), ("2", Side::Bottom, 0.0, 22.0)],
    }
}

/// The symbol's body, drawn about (0, 0); `pnp` turns the transistor's
/// emitter arrow inward.
fn body(role: Role, pnp: bool) -> String {
    let line = |x1: f64, y1: f64, x2: f64, y2: f64| {
        format!("<line x1=\"{x1}\" y1=\"{y1}\" x2=\"{x2}\" y2=\"{y2}\"/>")
    };
    let resistor = "<rect x=\"-7\" y=\"-22\" width=\"14\" height=\"44\"/>".to_string();
    match role {
        Role::Element | Role::Twin | Role::Thermistor => {
            // IEC 60617: a resistor with a slant and its kink, "θ" for a
            // temperature dependence.
            format!(
                "{resistor}{}{}<text x=\"14\" y=\"-14\" class=\"small\">θ</text>",
                line(-14.0, 16.0, 12.0, -16.0),
                line(-14.0, 16.0, -20.0, 16.0)
            )
        }
        Role::Trimmer => format!(
            "<rect x=\"-7\" y=\"-25\" width=\"14\" height=\"50\"/>{}<path d=\"M 7 0 l 6 -4 l 0 8 z\" fill=\"{INK}\"/>",
            line(7.0, 0.0, 22.0, 0.0)
        ),
        Role::Comparator => format!(
            "<path d=\"M -25 -25 L 25 0 L -25 25 Z\"/><text x=\"-21\" y=\"-8\" class=\"small\">+</text><text x=\"-21\" y=\"16\" class=\"small\">−</text>{}{}",
            line(0.0, -13.0, 0.0, -12.5),
            line(0.0, 12.5, 0.0, 13.0)
        ),
        Role::Transistor => {
            // The emitter's arrow: outward (toward the emitter lead) for an
            // NPN, inward for a PNP (IEC 60617).
            let arrow = if pnp {
                format!("<path d=\"M -2 8 l 7 1 l -4 5 z\" fill=\"{INK}\"/>")
            } else {
                format!("<path d=\"M 6 18 l -7 -1 l 4 -5 z\" fill=\"{INK}\"/>")
            };
            format!(
                "<circle cx=\"0\" cy=\"0\" r=\"18\"/>{}{}{}{}{arrow}",
                line(-18.0, 0.0, -6.0, 0.0),
                line(-6.0, -10.0, -6.0, 10.0),
                line(-6.0, -5.0, 8.0, -20.0),
                line(-6.0, 5.0, 8.0, 20.0)
            )
        }
        Role::Regulator => {
            "<rect x=\"-25\" y=\"-15\" width=\"50\" height=\"30\"/><text x=\"0\" y=\"4\" class=\"small\" text-anchor=\"middle\">REG</text>".to_string()
        }
        Role::CurrentSource => format!(
            "<circle cx=\"0\" cy=\"0\" r=\"16\"/>{}<path d=\"M 0 9 l -4 -6 l 8 0 z\" fill=\"{INK}\"/>",
            line(0.0, -9.0, 0.0, 5.0)
        ),
        Role::HoldOff | Role::DecouplingInput | Role::DecouplingRegulated => {
            let plus = if role == Role::HoldOff {
                "<text x=\"8\" y=\"-8\" class=\"small\">+</text>"
            } else {
                ""
            };
            format!(
                "{}{}{plus}",
                line(-14.0, -5.0, 14.0, -5.0),
                line(-14.0, 5.0, 14.0, 5.0)
            )
        }
        Role::Led | Role::Flyback => {
            let arrows = if role == Role::Led {
                format!(
                    "{}{}",
                    line(10.0, -4.0, 20.0, -12.0),
                    line(10.0, 4.0, 20.0, -4.0)
                )
            } else {
                String::new()
            };
            format!(
                "<path d=\"M -10 -12 L 10 -12 L 0 8 Z\"/>{}{arrows}",
                line(-10.0, 8.0, 10.0, 8.0)
            )
        }
        Role::Relay => {
            "<rect x=\"-16\" y=\"-12\" width=\"32\" height=\"24\"/><line x1=\"-16\" y1=\"12\" x2=\"16\" y2=\"-12\"/>".to_string()
        }
        Role::Buzzer => {
            "<rect x=\"-12\" y=\"-12\" width=\"24\" height=\"24\"/><path d=\"M -6 -6 L 6 -6 L 6 6\"/>".to_string()
        }
        _ => resistor,
    }
}

/// A ground symbol at (x, y) (IEC 60617: three shortening bars).
fn ground(x: f64, y: f64) -> String {
    format!(
        "<path d=\"M {a} {y} L {b} {y} M {c} {y2} L {d} {y2} M {e} {y3} L {f} {y3}\"/>",
        a = x - 9.0,
        b = x + 9.0,
        c = x - 6.0,
        d = x + 6.0,
        y2 = y + 4.0,
        e = x - 3.0,
        f = x + 3.0,
        y3 = y + 8.0
    )
}

/// One part: symbol, pin stubs, net labels, designator and value.
fn part(out: &mut String, v: &ValueRow, role: Role, nets: &[(String, String)], cx: f64, cy: f64) {
    let _ = write!(
        out,
        "<g transform=\"translate({cx} {cy})\" stroke=\"{INK}\" fill=\"none\" stroke-width=\"1.6\">{}</g>",
        body(role, v.part.contains("PNP"))
    );
    for (pin, side, x, y) in pin_layout(role) {
        let (sx, sy) = (cx + x, cy + y);
        let (ex, ey) = match side {
            Side::Top => (sx, sy - STUB),
            Side::Bottom => (sx, sy + STUB),
            Side::Left => (sx - STUB, sy),
            Side::Right => (sx + STUB, sy),
        };
        let _ = write!(
            out,
            "<line x1=\"{sx}\" y1=\"{sy}\" x2=\"{ex}\" y2=\"{ey}\" stroke=\"{INK}\" stroke-width=\"1.6\"/><circle cx=\"{ex}\" cy=\"{ey}\" r=\"2.2\" fill=\"{NET}\"/>"
        );
        let Some((_, net)) = nets.iter().find(|(p, _)| p == pin) else {
            continue;
        };
        if net == "gnd" {
            let _ = write!(
                out,
                "<g stroke=\"{INK}\" stroke-width=\"1.6\">{}</g>",
                match side {
                    Side::Bottom => ground(ex, ey),
                    _ => ground(ex, ey + 2.0),
                }
            );
            continue;
        }
        let (tx, ty, anchor) = match side {
            Side::Top => (ex, ey - 5.0, "middle"),
            Side::Bottom => (ex, ey + 13.0, "middle"),
            Side::Left => (ex - 4.0, ey + 4.0, "end"),
            Side::Right => (ex + 4.0, ey + 4.0, "start"),
        };
        let _ = write!(
            out,
            "<text x=\"{tx}\" y=\"{ty}\" class=\"net\" text-anchor=\"{anchor}\">{}</text>",
            xml(net)
        );
    }
    // Designator and value beside the symbol, on a side no pin uses: the
    // left for two-terminal parts, below on the right for parts with pins
    // on the left.
    let left_pins = pin_layout(role)
        .iter()
        .any(|(_, side, _, _)| matches!(side, Side::Left));
    let (tx, ty, anchor) = if left_pins {
        (cx + 32.0, cy + 30.0, "start")
    } else {
        (cx - 30.0, cy - 4.0, "end")
    };
    let _ = write!(
        out,
        "<text x=\"{tx}\" y=\"{ty}\" class=\"ref\" text-anchor=\"{anchor}\">{}</text>",
        xml(&v.designator)
    );
    let value = short_value(v);
    if !value.is_empty() {
        let _ = write!(
            out,
            "<text x=\"{tx}\" y=\"{}\" class=\"value\" text-anchor=\"{anchor}\">{}</text>",
            ty + 15.0,
            xml(&value)
        );
    }
}

/// The value as printed in the bill, cut to fit a cell.
fn short_value(v: &ValueRow) -> String {
    let t = v.text.split(" (").next().unwrap_or("").trim();
    let t = t.split(" at ").next().unwrap_or(t);
    let mut s: String = t.chars().take(14).collect();
    if t.chars().count() > 14 {
        s.push('…');
    }
    s
}

/// The schematic of a sized design's report.
pub fn svg(r: &Report) -> String {
    let mut body = String::new();
    let mut y = 58.0;
    for (heading, roles) in GROUPS {
        let rows: Vec<(&ValueRow, Role)> = r
            .values
            .iter()
            .filter_map(|v| Role::from_function(&v.function).map(|role| (v, role)))
            .filter(|(_, role)| roles.contains(role))
            .collect();
        if rows.is_empty() {
            continue;
        }
        let _ = write!(
            body,
            "<text x=\"12\" y=\"{}\" class=\"head\">{}</text><line x1=\"12\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#bbbbbb\"/>",
            y + 18.0,
            xml(heading),
            y + 24.0,
            WIDTH - 12.0,
            y + 24.0
        );
        y += HEADING_H;
        for (i, (v, role)) in rows.iter().enumerate() {
            let (col, row) = (i % COLUMNS, i / COLUMNS);
            let cx = CELL_W * col as f64 + CELL_W * 0.6;
            let cy = y + CELL_H * row as f64 + CELL_H * 0.5;
            let nets: Vec<(String, String)> = r
                .connections
                .iter()
                .filter(|c| c.designator == v.designator)
                .map(|c| (c.pin.clone(), c.node.clone()))
                .collect();
            part(&mut body, v, *role, &nets, cx, cy);
        }
        y += CELL_H * rows.len().div_ceil(COLUMNS) as f64;
    }
    let height = y + 40.0;
    let mut out = String::new();
    let _ = write!(
        out,
        "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{WIDTH}\" height=\"{height}\" viewBox=\"0 0 {WIDTH} {height}\">\n\
         <style>text{{font-family:sans-serif;fill:{INK};stroke:none}} .title{{font-size:17px;font-weight:bold}} .head{{font-size:14px;font-weight:bold}} \
         .ref{{font-size:14px;font-weight:bold}} .value{{font-size:12px}} .net{{font-size:11px;fill:{NET}}} .small{{font-size:11px}} .note{{font-size:11px}}</style>\n\
         <rect x=\"0\" y=\"0\" width=\"{WIDTH}\" height=\"{height}\" fill=\"white\"/>\n\
         <text x=\"12\" y=\"24\" class=\"title\">{}</text>\n\
         <text x=\"12\" y=\"42\" class=\"note\">Pins with the same net label are connected; gnd is the ground symbol. `draftwire size` lists the same nets.</text>\n",
        xml(&r.title)
    );
    out.push_str(&body);
    let _ = write!(
        out,
        "<text x=\"12\" y=\"{}\" class=\"note\">Values as sized ({}); the trimmer set to {:.0} % of travel from its grounded end (pin 1).</text>\n</svg>\n",
        height - 14.0,
        xml(&r.design_file),
        r.trip.trimmer_position_percent
    );
    out
}
