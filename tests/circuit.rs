//! The sized bill of values: output stage, ratings, comparator limits and
//! supply, through the library API.

use approx::assert_relative_eq;
use draftwire::analysis::size;
use draftwire::design::parse_design;
use draftwire::report::Report;

const WORKSHOP: &str = include_str!("../examples/workshop-door-draught.toml");
const GREENHOUSE: &str = include_str!("../examples/greenhouse-fan-alarm.toml");

fn run(name: &str, text: &str) -> Report {
    let design = parse_design(name, text).unwrap_or_else(|d| panic!("{name}: {d:?}"));
    size(&design).unwrap_or_else(|e| panic!("{name}: {e}"))
}

fn check<'a>(r: &'a Report, name: &str) -> &'a draftwire::report::Check {
    r.checks
        .iter()
        .find(|c| c.name == name)
        .unwrap_or_else(|| panic!("no check named {name:?}"))
}

fn value(r: &Report, role: &str) -> f64 {
    r.values
        .iter()
        .find(|v| v.function == role_function(role))
        .and_then(|v| v.value_ohm)
        .unwrap_or_else(|| panic!("no resistor {role}"))
}

/// The bill row of a part by its role (found by the bill's function
/// column; designators depend on which parts a design has).
fn role_function(internal: &str) -> &'static str {
    draftwire::analysis::wiring::Role::from_internal(internal)
        .unwrap_or_else(|| panic!("no role {internal}"))
        .function()
}

/// A design whose every current on the regulated rail is known exactly:
/// a 50 mA constant-current drive, a fixed 20k + 5k + 25k divider, a
/// comparator drawing 1 mA, a direct LED on the input rail, no hysteresis
/// (so no pull-up).
const REGULATED: &str = r#"
[design]
title = "regulator hand check"
[ambient]
nominal = "22 degC"
min = "5 degC"
max = "40 degC"
[supply]
input = "12 V"
input_min = "10 V"
input_max = "14 V"
[supply.regulator]
output = "5 V"
tolerance = "4 %"
dropout = "2 V"
quiescent = "5 mA"
theta_ja = "65 K/W"
max_junction = "125 degC"
[element]
heat_capacity = "30 mJ/K"
[element.resistance]
law = "linear"
r0 = "8 ohm"
t0 = "20 degC"
tcr = "6000 ppm/K"
[element.cooling]
law = "king"
a = "1.2 mW/K"
b = "2.4 mW/K"
n = 0.45
[drive]
kind = "constant-current"
current = "50 mA"
[detector]
trip_airflow = "0.5 m/s"
trip_on = "falling"
reference_rail = "regulated"
top = "20 kohm"
trimmer = "5 kohm"
bottom = "25 kohm"
[comparator]
rail = "regulated"
supply_current = "1 mA"
[output]
stage = "direct"
load = "led"
rail = "input"
led_forward = "2 V"
led_current = "2 mA"
"#;

/// Regulator dissipation against the data-sheet formula
/// P_D = (V_IN − V_OUT)·I_OUT + V_IN·I_Q and T_J = T_A + P_D·θ_JA (linear
/// regulator data sheets, "Power Dissipation" and "Estimating Junction
/// Temperature"; cited in src/circuit/regulator.rs). Hand calculation:
/// worst-case regulated-rail load I_OUT = 50 mA (element, constant) +
/// 5.2 V/50 kΩ = 0.104 mA (divider at the highest regulated rail,
/// 5 V·1.04) + 1 mA (comparator) = 51.104 mA;
/// the output at the low end of its ±4 % tolerance, 4.8 V, dissipates most:
/// P = (14 − 4.8)·0.051104 + 14·0.005 = 0.4701568 + 0.07 = 0.5401568 W;
/// T_J = 40 + 0.5401568·65 = 40 + 35.110192 = 75.110192 °C.
#[test]
fn regulator_dissipation_matches_the_data_sheet_formula() {
    let r = run("regulated.toml", REGULATED);
    assert_relative_eq!(
        r.supply.regulator_dissipation_w.unwrap(),
        0.5401568,
        max_relative = 1e-9
    );
    assert_relative_eq!(
        r.supply.regulator_junction_c.unwrap(),
        75.110192,
        max_relative = 1e-9
    );
    assert!(check(&r, "regulator junction temperature within its limit").passed);
    // Headroom at 10 V with the output at its high end, 5 V + 4 % = 5.2 V:
    // 10 − 5.2 − 2 = 2.8 V (hand).
    let c = check(&r, "regulator stays above dropout");
    assert_eq!(c.id, "regulator-dropout");
    assert_relative_eq!(c.value.unwrap(), 2.8, max_relative = 1e-12);
    assert!(
        c.passed && c.detail.contains("headroom 2.80 V"),
        "{}",
        c.detail
    );
}

/// A 2 Ω series resistor on a 14 V rail into an 8 Ω element, and a 400 Ω
/// divider on the same rail. Hand calculation: the element cold at 5 °C is
/// 8·(1 + 0.006·(5 − 20)) = 7.28 Ω, so RS1 carries 14/(2 + 7.28) = 1.509 A
/// and dissipates 1.509²·2 = 4.55 W (4.4–4.7 W over the ±5 % drive
/// tolerance), which at 50 % derating needs a part of about 9 W — above the largest standard rating (5 W, src/circuit/ratings.rs).
/// The divider draws 14/400 = 35 mA, so the 200 Ω trimmer takes
/// 0.035²·200 = 0.245 W against the 0.1 W given × 50 % = 0.05 W.
#[test]
fn an_overloaded_resistor_fails_its_named_check() {
    let text = REGULATED
        .replace(
            "kind = \"constant-current\"\ncurrent = \"50 mA\"",
            "kind = \"series-resistor\"\nrail = \"input\"\nseries = \"2 ohm\"",
        )
        .replace("a = \"1.2 mW/K\"", "a = \"100 mW/K\"")
        .replace("b = \"2.4 mW/K\"", "b = \"100 mW/K\"")
        .replace(
            "reference_rail = \"regulated\"",
            "reference_rail = \"input\"",
        )
        .replace("top = \"20 kohm\"", "top = \"100 ohm\"")
        .replace("trimmer = \"5 kohm\"", "trimmer = \"200 ohm\"")
        .replace("bottom = \"25 kohm\"", "bottom = \"100 ohm\"");
    let r = run("overload.toml", &text);
    // The series resistor is R1: the first resistor along the signal path.
    let rs = check(&r, "R1 within its power rating");
    assert!(!rs.passed);
    assert!(
        rs.detail.contains("no standard power rating"),
        "{}",
        rs.detail
    );
    let rv = check(&r, "RV1 within its power rating");
    assert!(!rv.passed, "{}", rv.detail);
    let rv1 = r.values.iter().find(|v| v.designator == "RV1").unwrap();
    assert_eq!(rv1.function, role_function("RV1"));
    assert_relative_eq!(rv1.dissipation_w.unwrap(), 0.245, max_relative = 1e-9);
    assert!(!r.passed());
}

/// A direct LED at 20 mA: the typical open-collector comparator class
/// holds its low level only up to 4 mA (class data sheets, electrical
/// characteristics: 0.4 V at 25 °C, 0.7 V over the full temperature range),
/// so the sink check must fail. The workshop's 5–30 °C range leaves
/// 20–30 °C, so the full-range 0.7 V applies. Hand: (5 − 1.8 − 0.7)/20 mA
/// = 125 Ω → 127 Ω (E96, at or above).
#[test]
fn a_direct_led_beyond_the_sink_limit_fails() {
    let text = WORKSHOP.replace("led_current = \"2 mA\"", "led_current = \"20 mA\"");
    let r = run("sink.toml", &text);
    assert_eq!(value(&r, "RL1"), 127.0);
    let c = check(&r, "comparator output sink current within its limit");
    assert!(!c.passed, "{}", c.detail);
    assert!(!r.passed());
}

/// The workshop example without its twin: a fixed-ratio reference cannot
/// hold a 0.3 m/s trip point from 5 to 30 °C, so the band and background
/// checks fail, at the warm and the cold end. Its LED resistor from Ohm's law with
/// the full-range 0.7 V low level: (5 − 1.8 − 0.7)/2 mA = 1.25 kΩ → 1.27 kΩ
/// (E96, at or above).
#[test]
fn the_workshop_example_without_compensation_fails_its_band_in_the_cold() {
    let text = WORKSHOP.replace("kind = \"twin\"", "kind = \"none\"");
    let r = run("workshop.toml", &text);
    assert_eq!(value(&r, "RL1"), 1270.0);
    assert!(!r.passed());
    // Deaf on the warm day (worst band miss at 30 °C), far too eager on
    // the cold one (the nominal unit at 5 °C trips below the band).
    let c = r.checks.iter().find(|c| c.id == "trip-band").unwrap();
    assert!(!c.passed, "{}", c.detail);
    assert!(c.condition.starts_with("30.0 °C"), "{}", c.condition);
    let cold = r
        .drift
        .iter()
        .find(|d| d.corner == "nominal parts" && d.ambient_c == 5.0)
        .unwrap();
    assert!(cold.trip_airflow_m_per_s.unwrap() < 0.21, "{cold:?}");
    // With its twin it passes (the example as shipped).
    assert!(run("workshop.toml", WORKSHOP).passed());
}

/// Every relay coil gets a flyback diode and the NPN stage its transistor,
/// base and hold-off resistors.
#[test]
fn relay_stage_has_its_parts() {
    let r = run("greenhouse.toml", GREENHOUSE);
    for d in [
        "K1", "D1", "Q1", "RB1", "RBE1", "RP1", "U1", "U2", "C1", "C2",
    ] {
        assert!(
            r.values.iter().any(|v| v.function == role_function(d)),
            "missing {d}"
        );
    }
    let d1 = r.values.iter().find(|v| v.designator == "D1").unwrap();
    assert_eq!(d1.part, "rectifier diode");
}

/// Divider round trip: the sized values, fed back as fixed values with the
/// reported trimmer position, give the target trip airflow (0.3 m/s, from
/// the example file) again.
#[test]
fn sized_values_fed_back_hit_the_target() {
    let first = run("workshop.toml", WORKSHOP);
    let x = first.trip.trimmer_position_percent / 100.0;
    let ohm = |d: &str| format!("\"{} ohm\"", value(&first, d));
    let text = WORKSHOP
        .replace("series = \"auto\"", &format!("series = {}", ohm("RS1")))
        .replace("overheat_rise = \"100 K\"\n", "")
        .replace("top = \"auto\"", &format!("top = {}", ohm("RR1")))
        .replace("trimmer = \"auto\"", &format!("trimmer = {}", ohm("RV1")))
        .replace(
            "bottom = \"auto\"",
            &format!(
                "bottom = {}\nfeedback = {}\ninput_resistor = {}\ntrimmer_position = {x}",
                ohm("RR2"),
                ohm("RF1"),
                ohm("RI1")
            ),
        )
        .replace(
            "[comparator]\n",
            &format!("[comparator]\npullup = {}\n", ohm("RP1")),
        )
        .replace(
            "kind = \"twin\"",
            &format!("kind = \"twin\"\ntwin_resistance = {}", ohm("RC1")),
        );
    let second = run("fixed.toml", &text);
    assert_relative_eq!(
        second.trip.airflow_m_per_s.unwrap(),
        0.3,
        max_relative = 1e-6
    );
    assert_relative_eq!(
        second.trip.trimmer_position_percent,
        first.trip.trimmer_position_percent,
        max_relative = 1e-6
    );
    assert_relative_eq!(
        second.trip.release_airflow_m_per_s.unwrap(),
        first.trip.release_airflow_m_per_s.unwrap(),
        max_relative = 1e-6
    );
}
