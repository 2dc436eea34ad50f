//! The verdict: checks at their worst combined condition, always a report,
//! and `compare` judged like `size`.

use assert_cmd::Command;
use draftwire::analysis::size;
use draftwire::circuit::divider::Divider;
use draftwire::design::parse_design;
use draftwire::report::Report;
use std::path::{Path, PathBuf};

fn example_path(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("examples")
        .join(name)
}

fn example(name: &str) -> String {
    std::fs::read_to_string(example_path(name)).unwrap()
}

fn report(name: &str, text: &str) -> Report {
    size(&parse_design(name, text).unwrap()).unwrap()
}

fn draftwire() -> Command {
    let mut c = Command::cargo_bin("draftwire").unwrap();
    c.env_remove("RUST_BACKTRACE");
    c
}

fn json_of(out: &std::process::Output) -> serde_json::Value {
    serde_json::from_slice(&out.stdout).expect("stdout is a JSON report")
}

/// Trimmer reach at the tolerance corners, hand calculation (voltage-divider
/// rule): Rt = 10 kΩ, Rp = 2 kΩ, Rb = 3 kΩ with ±5 %, ±20 %, ±5 %.
/// Grounded end, highest: 3150/(9500 + 1600 + 3150) = 3150/14250 =
/// 0.2210526…; top end, lowest: 1 − 10500/(10500 + 1600 + 2850) =
/// 1 − 10500/14950 = 0.2976588…
#[test]
fn trimmer_reach_at_tolerance_corners_matches_hand_calculation() {
    let d = Divider {
        top_ohm: 10e3,
        trimmer_ohm: 2e3,
        bottom_ohm: 3e3,
    };
    let (k0, k1) = d.reach_at_tolerances(0.05, 0.2, 0.05);
    assert!((k0 - 3150.0 / 14250.0).abs() < 1e-15, "{k0}");
    assert!((k1 - (1.0 - 10500.0 / 14950.0)).abs() < 1e-15, "{k1}");
    // Nominal reach is wider on both sides: 3/15 = 0.2 and 5/15 = 0.333….
    assert!(d.ratio_at(0.0) < k0 && d.ratio_at(1.0) > k1);
}

/// The passing example passes every check, and its trimmer coverage is
/// judged over every tolerance corner (1 nominal + 2^5 vertices).
#[test]
fn the_passing_example_passes_at_every_condition() {
    let r = report("server.toml", &example("server-cabinet-airflow.toml"));
    assert!(
        r.passed,
        "{:#?}",
        r.checks.iter().filter(|c| !c.passed).collect::<Vec<_>>()
    );
    let cov = r
        .checks
        .iter()
        .find(|c| c.id == "trimmer-coverage")
        .unwrap();
    assert!(cov.detail.contains("33 builds"), "{}", cov.detail);
    let band = r.checks.iter().find(|c| c.id == "trip-band").unwrap();
    let (v, l) = (band.value.unwrap(), band.limit.unwrap());
    assert!(
        band.margin.unwrap() >= 0.0 && (0.4..=1.8).contains(&v),
        "{v} {l}"
    );
}

/// A trimmer pinned at the setting the report prints (to 0.1 %) is judged
/// against the band, not against exact equality with the target.
#[test]
fn a_pinned_trimmer_at_the_printed_setting_passes_when_the_band_holds() {
    let text = example("server-cabinet-airflow.toml");
    let first = report("server.toml", &text);
    let pct = format!("{:.1} %", first.trip.trimmer_position_percent);
    let pinned = text.replace(
        "hysteresis = \"0.1 m/s\"",
        &format!("hysteresis = \"0.1 m/s\"\ntrimmer_position = \"{pct}\""),
    );
    let r = report("pinned.toml", &pinned);
    assert!(
        r.passed,
        "{:#?}",
        r.checks.iter().filter(|c| !c.passed).collect::<Vec<_>>()
    );
    let u = r.trip.airflow_m_per_s.unwrap();
    assert!((u - 1.0).abs() < 0.01 && u != 1.0, "{u}");
    assert!(r.checks.iter().all(|c| c.id != "trip-on-target"));
}

/// With the trimmer at its top end the workshop detector is tripped at
/// every airflow: a full JSON report, `null` trip airflow, exit 1.
#[test]
fn an_always_tripped_design_gives_a_full_json_report() {
    let text = example("workshop-door-draught.toml").replace(
        "hysteresis = \"0.05 m/s\"",
        "hysteresis = \"0.05 m/s\"\ntrimmer_position = \"100 %\"",
    );
    let dir = std::env::temp_dir().join("draftwire-verdict-always");
    std::fs::create_dir_all(&dir).unwrap();
    let f = dir.join("always.toml");
    std::fs::write(&f, text).unwrap();
    let out = draftwire()
        .args(["size", "--format", "json"])
        .arg(&f)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(1));
    let v = json_of(&out);
    assert!(v["trip"]["airflow_m_per_s"].is_null());
    assert!(!v["operating_points"].as_array().unwrap().is_empty());
    assert_eq!(v["passed"], false);
    let band = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["id"] == "trip-band")
        .unwrap();
    assert_eq!(band["passed"], false);
    assert!(band["value"].is_null());
}

fn ntc_design(series: &str, volts: &str) -> String {
    format!(
        r#"[ambient]
nominal = "25 degC"
[supply]
input = "{volts}"
[drive]
kind = "series-resistor"
rail = "input"
series = "{series}"
[detector]
trip_airflow = "0.5 m/s"
trip_on = "rising"
hysteresis = "0.05 m/s"
[element]
[element.resistance]
law = "beta"
r0 = "10 kohm"
beta = "3950 K"
[element.cooling]
law = "datasheet"
dissipation = "1.5 mW/K"
dissipation_moving = "3 mW/K"
moving_airflow = "1 m/s"
time_constant = "10 s"
"#
    )
}

fn run_json(name: &str, text: &str) -> (Option<i32>, serde_json::Value) {
    let dir = std::env::temp_dir().join(format!("draftwire-verdict-{name}"));
    std::fs::create_dir_all(&dir).unwrap();
    let f = dir.join(format!("{name}.toml"));
    std::fs::write(&f, text).unwrap();
    let out = draftwire()
        .args(["size", "--format", "json"])
        .arg(&f)
        .output()
        .unwrap();
    (out.status.code(), json_of(&out))
}

/// An NTC through 300 Ω from 20 V runs away in still air: 20²/(4·300) =
/// 0.33 W can reach the element near R = 300 Ω (about 110 °C by the beta
/// law), while 1.5 mW/K × 85 K = 0.13 W is all still air takes away (hand
/// estimate). The report still comes, with the airflows that have a steady
/// state, and fails `element-steady-state`.
#[test]
fn still_air_runaway_gives_a_full_json_report() {
    let (code, v) = run_json("runaway", &ntc_design("300 ohm", "20 V"));
    assert_eq!(code, Some(1));
    let c = v["checks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["id"] == "element-steady-state")
        .expect("a steady-state check");
    assert_eq!(c["passed"], false);
    assert!(c["detail"].as_str().unwrap().contains("still air"));
    let labels: Vec<&str> = v["operating_points"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["label"].as_str().unwrap())
        .collect();
    assert!(
        labels.contains(&"trip") && !labels.contains(&"still air"),
        "{labels:?}"
    );
}

/// A design with no steady state even at the trip airflow cannot be sized;
/// it still prints a JSON report whose one failing check says why.
#[test]
fn an_unsizable_design_still_gives_a_json_report() {
    let (code, v) = run_json("unsizable", &ntc_design("3000 ohm", "19 V"));
    assert_eq!(code, Some(1));
    let checks = v["checks"].as_array().unwrap();
    assert_eq!(checks.len(), 1);
    assert_eq!(checks[0]["id"], "design-sizable");
    assert_eq!(checks[0]["passed"], false);
    assert!(!v["cautions"].as_array().unwrap().is_empty());
}

/// `compare` exits 1 when a candidate fails a design check that `size`
/// fails: the workshop design fails its band with its own element.
#[test]
fn compare_exits_1_when_a_candidate_fails_a_size_check() {
    let out = draftwire()
        .args([
            "compare",
            "--format",
            "json",
            "--set",
            "compensation.kind=none",
        ])
        .arg(example_path("workshop-door-draught.toml"))
        .arg("--candidates")
        .arg(example_path("candidates/element-candidates.toml"))
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(1));
    let v = json_of(&out);
    let own = &v["rows"][0];
    assert_eq!(own["passed"], false);
    assert!(own["failed_checks"]
        .as_array()
        .unwrap()
        .iter()
        .any(|id| id == "trip-band"));
}

/// Hold-off with the full-range output-low level: the duct design's NPN
/// base sees V_OL·R_BE/(R_B + R_BE) with V_OL = 0.7 V (class data sheets,
/// full temperature range, at 4 mA), computed here from its own bill.
#[test]
fn hold_off_uses_the_full_range_output_low_level() {
    let r = report("duct.toml", &example("duct-platinum-wire.toml"));
    let ohm = |d: &str| {
        r.values
            .iter()
            .find(|v| v.function == role_function(d))
            .unwrap()
            .value_ohm
            .unwrap()
    };
    let (rb, rbe) = (ohm("RB1"), ohm("RBE1"));
    let c = r.checks.iter().find(|c| c.id == "q1-hold-off").unwrap();
    let hand = 0.7 * rbe / (rb + rbe);
    assert!(
        (c.value.unwrap() - hand).abs() < 1e-12,
        "{} vs {hand}",
        c.value.unwrap()
    );
    // Limit 0.6 × V_BE(on) = 0.42 V (common practice, no source).
    assert!((c.limit.unwrap() - 0.42).abs() < 1e-12);
    assert_eq!(c.passed, hand <= 0.42);
}

/// Sink current includes the hysteresis feedback current and is held to
/// 80 % of the limit: the workshop's direct LED, from its own bill, by
/// hand: (10 − 0.7)/R_P + LED + (10 − 0.7)/(R_F + R_I).
#[test]
fn sink_check_includes_feedback_current_and_margin() {
    let r = report("workshop.toml", &example("workshop-door-draught.toml"));
    let ohm = |d: &str| {
        r.values
            .iter()
            .find(|v| v.function == role_function(d))
            .unwrap()
            .value_ohm
            .unwrap()
    };
    // The comparator and its pull-up on the input rail (10 V at most), the
    // LED on the regulated rail (5 V + 4 %), the feedback path across at
    // most the highest rail.
    let ri = r
        .values
        .iter()
        .find(|v| v.function == role_function("RI1"))
        .and_then(|v| v.value_ohm)
        .unwrap_or(0.0);
    let led = (5.2 - 1.8 - 0.7) / ohm("RL1");
    let hand = (10.0 - 0.7) / ohm("RP1") + led + (10.0 - 0.7) / (ohm("RF1") + ri);
    let c = r.checks.iter().find(|c| c.id == "comparator-sink").unwrap();
    assert!(
        (c.value.unwrap() - hand).abs() < 1e-9,
        "{} vs {hand}",
        c.value.unwrap()
    );
    // 80 % of the class's 4 mA (a stated 20 % design margin).
    assert!((c.limit.unwrap() - 3.2e-3).abs() < 1e-15);
}

/// A lamp whose measured cold resistance disagrees with its rating: the
/// mismatch is a warning that speaks of the trip point, not an assumption.
/// 12 V, 1.2 W gives R_hot = V²/P = 120 Ω (Ohm's law). Running at
/// 2200–3000 K, tungsten's resistivity ratio to 22 °C is about 11.5–16.7
/// (Forsythe & Worthing, Astrophys. J. 61 (1925): 92.04 µΩ·cm at 3000 K,
/// about 63.5 interpolated at 2200 K, against about 5.5 near 295 K), so
/// 7.2–10.4 Ω is expected cold (hand); 12 Ω lies about 15 % outside.
#[test]
fn a_lamp_mismatch_is_a_warning_about_the_trip_point() {
    let text = example("cabinet-lamp-filament.toml").replace(
        "cold_resistance = \"9.6 ohm\"",
        "cold_resistance = \"12 ohm\"",
    );
    let d = parse_design("lamp.toml", &text).unwrap();
    assert!(d.assumptions.iter().all(|a| !a.contains("% outside")));
    let r = size(&d).unwrap();
    assert!(
        r.warnings
            .iter()
            .any(|w| w.contains("% outside") && w.contains("trip point")),
        "{:#?}",
        r.warnings
    );
    // The example as given agrees with its rating: no such warning.
    let ok = report("lamp.toml", &example("cabinet-lamp-filament.toml"));
    assert!(ok.warnings.iter().all(|w| !w.contains("% outside")));
}

/// Parts at 0.5 W or more continuously get a hot-part caution that names
/// them with their dissipation: the duct example's regulator drops 12 V to
/// 5 V for the element, so U2 is listed at the budget's own worst figure.
#[test]
fn hot_parts_get_a_caution_with_their_dissipation() {
    let r = report("duct.toml", &example("duct-platinum-wire.toml"));
    let c = r
        .cautions
        .iter()
        .find(|c| c.starts_with("Hot parts"))
        .expect("a hot-part caution");
    let p_u2 = r.supply.regulator_dissipation_w.unwrap();
    let u2 = draftwire::quantity::format_engineering(p_u2, "W", 3);
    assert!(p_u2 >= 0.5);
    assert!(c.contains(&format!("U2 {u2}")), "{c}");
    // The workshop detector has no part at 0.5 W continuously (RS1 sees
    // 430 mW only in the power-on surge): no such caution.
    let w = report("workshop.toml", &example("workshop-door-draught.toml"));
    assert!(
        w.cautions.iter().all(|c| !c.starts_with("Hot parts")),
        "{:#?}",
        w.cautions
    );
}

/// A bistable NTC: 47 kΩ at 25 °C, β = 4500 K, through a 1 kΩ (±5 %)
/// series resistor from 24 V, 1.5 mW/K still-air dissipation constant. The
/// balance G·(T − Ta) = V²·R/(Rs + R)² (beta model, Steinhart & Hart 1968
/// form; thermistor data-sheet dissipation constant, MIL-PRF-23648) has a
/// cold stable root near 41 °C, an unstable one near 72 °C and a hot stable
/// one near 120 °C (found here by an independent scan). The design fails
/// `no-hot-latch`, and RS1 is rated in the hot state: P = I²·Rs at the hot
/// root, the largest over the drive's tolerance ends.
#[test]
fn a_bistable_ntc_can_latch_hot_and_rs1_is_rated_hot() {
    let text = r#"[ambient]
nominal = "25 degC"
[supply]
input = "24 V"
[drive]
kind = "series-resistor"
rail = "input"
series = "1 kohm"
[detector]
trip_airflow = "0.5 m/s"
trip_on = "rising"
hysteresis = "0.05 m/s"
[element]
[element.resistance]
law = "beta"
r0 = "47 kohm"
beta = "4500 K"
[element.cooling]
law = "datasheet"
dissipation = "1.5 mW/K"
dissipation_moving = "3 mW/K"
moving_airflow = "1 m/s"
time_constant = "10 s"
"#;
    let r = report("bistable.toml", text);
    let latch = r.checks.iter().find(|c| c.id == "no-hot-latch").unwrap();
    assert!(!latch.passed, "{}", latch.detail);
    // Independent: the hot root of the still-air balance by bisection.
    let ta = 298.15;
    let r_of = |t: f64| 47e3 * (4500.0 * (1.0 / t - 1.0 / ta)).exp();
    let hot_power = |rs: f64| {
        let f = |t: f64| {
            let rt = r_of(t);
            1.5e-3 * (t - ta) - 24.0 * 24.0 * rt / ((rs + rt) * (rs + rt))
        };
        // Hot stable root: f crosses from − to + between 100 and 150 °C.
        let (mut lo, mut hi) = (373.15, 423.15);
        assert!(f(lo) < 0.0 && f(hi) > 0.0);
        for _ in 0..200 {
            let mid = 0.5 * (lo + hi);
            if f(mid) < 0.0 {
                lo = mid
            } else {
                hi = mid
            }
        }
        let i = 24.0 / (rs + r_of(lo));
        i * i * rs
    };
    let want = [950.0, 1000.0, 1050.0]
        .map(hot_power)
        .into_iter()
        .fold(0.0, f64::max);
    let rs1 = r
        .checks
        .iter()
        // The series resistor is R1, the first resistor along the signal path.
        .find(|c| c.id == "power-rating-r1")
        .unwrap();
    assert!(rs1.condition.contains("hot state"), "{}", rs1.condition);
    let got = rs1.value.unwrap();
    assert!((got - want).abs() / want < 1e-6, "{got} vs {want}");
}

/// A `[[candidate]]` may carry its own overheat (for the design's `auto`
/// drive) or a whole drive table; the comparison runs it there and says so.
#[test]
fn a_candidate_may_carry_its_own_drive_or_overheat() {
    use draftwire::analysis::compare::compare;
    use draftwire::design::element::parse_candidates;
    let design = parse_design("g.toml", &example("greenhouse-fan-alarm.toml")).unwrap();
    let text = example("candidates/element-candidates.toml");
    let cands = parse_candidates("c.toml", &text, &design).unwrap();
    let cmp = compare(&design, &cands).unwrap();
    let row = |label: &str| cmp.rows.iter().find(|r| r.label == label).unwrap();
    // The NTC bead runs at its own 30 K rise (within the series resistor's
    // E24 snapping), not the design's 150 K.
    let ntc = row("NTC bead 1k");
    assert!(ntc.drive.ends_with("(its own)"), "{}", ntc.drive);
    let rise = ntc.still_air_rise_k.unwrap();
    assert!((rise - 30.0).abs() < 5.0, "{rise}");
    // The Pt100 chip brings a constant-current drive of its own.
    assert!(row("Pt100 chip").drive.starts_with("current"));
    // A candidate without its own keeps the design's drive.
    assert!(!row("nickel wire 25 um").drive.contains("its own"));
    // An overheat of its own needs the design's drive to be "auto".
    let fixed = example("workshop-door-draught.toml")
        .replace("series = \"auto\"", "series = \"56 ohm\"")
        .replace("overheat_rise = \"100 K\"\n", "");
    let fixed = parse_design("w.toml", &fixed).unwrap();
    let err = parse_candidates("c.toml", &text, &fixed)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("candidate[1]") && err.contains("\"auto\""),
        "{err}"
    );
}

/// A design's own `[element]` takes no drive or overheat: that belongs in
/// `[drive]`; the error names the key's place.
#[test]
fn a_design_element_rejects_a_drive_of_its_own() {
    let text = example("workshop-door-draught.toml").replace(
        "tolerance = \"5 %\"\n\n[element.resistance]",
        "tolerance = \"5 %\"\noverheat_rise = \"40 K\"\n\n[element.resistance]",
    );
    let err = parse_design("w.toml", &text).unwrap_err().to_string();
    assert!(err.contains("belongs in [drive]"), "{err}");
    assert!(err.contains("w.toml:"), "{err}");
}

/// A material that contradicts the resistance law is rejected at the
/// material, and an empty candidate list is an error, not an empty table.
#[test]
fn mismatched_material_and_empty_candidates_are_rejected() {
    let text = example("duct-platinum-wire.toml")
        .replace("material = \"platinum\"", "material = \"nickel\"");
    let err = parse_design("duct.toml", &text).unwrap_err().to_string();
    assert!(
        err.contains("element.material") && err.contains("platinum"),
        "{err}"
    );
    let design = parse_design("w.toml", &example("workshop-door-draught.toml")).unwrap();
    let err = draftwire::design::element::parse_candidates("c.toml", "candidate = []\n", &design)
        .unwrap_err()
        .to_string();
    assert!(err.contains("at least one [[candidate]]"), "{err}");
}

/// The bill row's function for a sizing role (designators depend on which
/// parts a design has; the function column does not).
fn role_function(internal: &str) -> &'static str {
    draftwire::analysis::wiring::Role::from_internal(internal)
        .unwrap_or_else(|| panic!("no role {internal}"))
        .function()
}

/// `still_air_floor = "natural"` is worked out from the design's drive for
/// `[element]` only: a candidate's is refused with its field named, and a
/// candidate's floor given as a velocity is taken.
#[test]
fn a_candidate_floor_must_be_a_velocity() {
    use draftwire::design::element::parse_candidates;
    let design = parse_design("g.toml", &example("greenhouse-fan-alarm.toml")).unwrap();
    let text = example("candidates/element-candidates.toml");
    let natural = text.replacen("n = 0.45\n", "n = 0.45\nstill_air_floor = \"natural\"\n", 1);
    assert_ne!(
        natural, text,
        "the candidates file has a King's-law candidate"
    );
    let err = parse_candidates("c.toml", &natural, &design)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("cooling.still_air_floor") && err.contains("[element] only"),
        "{err}"
    );
    let given = text.replacen("n = 0.45\n", "n = 0.45\nstill_air_floor = \"4 cm/s\"\n", 1);
    assert!(parse_candidates("c.toml", &given, &design).is_ok());
}
