//! Hostile input: our own corpus of malformed and extreme design files and
//! overrides, each with the exit status and a fragment of the message it
//! must give; and random designs drawn from the documented ranges. Never a
//! panic, never a non-finite number in any output, never an unclear
//! message (common practice for robust command-line tools, no source).

use assert_cmd::Command;
use proptest::prelude::*;
use std::path::{Path, PathBuf};

fn example_path(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("examples")
        .join(name)
}

fn draftwire() -> Command {
    let mut c = Command::cargo_bin("draftwire").unwrap();
    c.env_remove("RUST_BACKTRACE");
    c
}

/// No report may carry a non-finite number, and nothing may panic (the
/// error messages may echo what the user wrote, "nan" included).
fn assert_clean(what: &str, out: &std::process::Output) {
    let stdout = String::from_utf8_lossy(&out.stdout);
    let stderr = String::from_utf8_lossy(&out.stderr);
    for bad in ["NaN", "inf ", "∞", "undefined", "panicked"] {
        assert!(
            !stdout.contains(bad),
            "{what}: the report contains {bad:?}\n{stdout}"
        );
    }
    assert!(!stderr.contains("panicked"), "{what}: {stderr}");
    let code = out.status.code();
    assert!(
        matches!(code, Some(0..=2)),
        "{what}: exit {code:?}\n{stderr}"
    );
}

/// Keys of the workshop example with their units, each overridden with
/// values no design can hold.
const KEYS: &[(&str, &str)] = &[
    ("ambient.nominal", "degC"),
    ("ambient.min", "degC"),
    ("ambient.max", "degC"),
    ("supply.input", "V"),
    ("supply.input_min", "V"),
    ("supply.input_max", "V"),
    ("supply.regulator.output", "V"),
    ("supply.regulator.tolerance", "%"),
    ("supply.regulator.regulation", "%"),
    ("supply.regulator.dropout", "V"),
    ("supply.regulator.quiescent", "mA"),
    ("element.heat_capacity", "mJ/K"),
    ("element.max_temperature", "degC"),
    ("element.tolerance", "%"),
    ("element.resistance.r0", "ohm"),
    ("element.resistance.t0", "degC"),
    ("element.resistance.tcr", "ppm/K"),
    ("element.cooling.a", "mW/K"),
    ("element.cooling.b", "mW/K"),
    ("drive.overheat_rise", "K"),
    ("detector.trip_airflow", "m/s"),
    ("detector.hysteresis", "m/s"),
    ("detector.power_on_grace", "s"),
    ("comparator.offset", "mV"),
    ("comparator.offset_full_range", "mV"),
    ("comparator.bias_current", "nA"),
    ("comparator.bias_current_full_range", "nA"),
    ("output.led_forward", "V"),
    ("output.led_current", "mA"),
    ("compensation.twin_tolerance", "%"),
    ("compensation.twin_max_rise", "%"),
];

/// Values no design can hold, whatever the key: not a number, infinite,
/// beyond f64's useful range, a wrong unit, text.
fn hostile_values(unit: &str) -> Vec<String> {
    vec![
        format!("nan {unit}"),
        format!("inf {unit}"),
        format!("-inf {unit}"),
        format!("1e308 {unit}"),
        format!("-1e308 {unit}"),
        "12 furlongs".to_string(),
    ]
}

/// Every key × every hostile value: exit 2, the key named, nothing
/// non-finite printed. 31 keys × 6 values = 186 entries.
#[test]
fn hostile_overrides_are_refused_at_the_key() {
    let design = example_path("workshop-door-draught.toml");
    let mut n = 0;
    for (key, unit) in KEYS {
        for v in hostile_values(unit) {
            let out = draftwire()
                .arg("size")
                .arg(&design)
                .arg("--set")
                .arg(format!("{key}={v}"))
                .output()
                .unwrap();
            let what = format!("{key}={v}");
            assert_clean(&what, &out);
            assert_eq!(out.status.code(), Some(2), "{what}");
            let stderr = String::from_utf8_lossy(&out.stderr);
            let last = key.rsplit('.').next().unwrap();
            assert!(stderr.contains(last), "{what}: {stderr}");
            n += 1;
        }
    }
    assert!(n >= 150, "{n} entries");
}

/// Whole files of other hostile classes, each with its exit status and a
/// message fragment.
#[test]
fn hostile_files_give_clear_messages() {
    let dir = std::env::temp_dir().join(format!("draftwire-hostile-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let good = std::fs::read_to_string(example_path("workshop-door-draught.toml")).unwrap();
    let cases: Vec<(&str, Vec<u8>, i32, &str)> = vec![
        ("empty file", Vec::new(), 2, "missing required"),
        (
            "broken TOML",
            b"[ambient\nnominal = ".to_vec(),
            2,
            "b.toml:1",
        ),
        ("binary garbage", (0u8..=255).collect(), 2, "not UTF-8"),
        (
            "non-UTF-8 in a string",
            [good.as_bytes(), b"\n# \xff\xfe\n"].concat(),
            2,
            "byte offset",
        ),
        (
            "duplicate table",
            format!("{good}\n[ambient]\nnominal = \"20 degC\"\n").into_bytes(),
            2,
            "first given on line",
        ),
        (
            "deep nesting",
            format!("a = {}{}", "[".repeat(50_000), "]".repeat(50_000)).into_bytes(),
            2,
            "nesting too deep",
        ),
        (
            "integer overflow",
            good.replace(
                "heat_capacity = \"0.3 mJ/K\"",
                "heat_capacity = 99999999999999999999999",
            )
            .into_bytes(),
            2,
            "too large",
        ),
        (
            "a 10 MB string",
            good.replace(
                "title = \"Workshop-door draught detector\"",
                &format!("title = \"{}\"", "x".repeat(10_000_000)),
            )
            .into_bytes(),
            2,
            "far larger than a design file",
        ),
        (
            "a long title",
            good.replace(
                "title = \"Workshop-door draught detector\"",
                &format!("title = \"{}\"", "x".repeat(100_000)),
            )
            .into_bytes(),
            0,
            "",
        ),
        (
            "unknown key",
            good.replace("[ambient]", "[ambient]\ncolour = \"blue\"")
                .into_bytes(),
            2,
            "colour",
        ),
        (
            "a missing required table",
            good.replace("[drive]", "[drivel]").into_bytes(),
            2,
            "drive",
        ),
        (
            "bare number for a quantity",
            good.replace("trip_airflow = \"0.3 m/s\"", "trip_airflow = 0.3")
                .into_bytes(),
            2,
            "missing unit",
        ),
        (
            "material contradicting the law",
            good.replace("law = \"linear\"", "law = \"platinum\"")
                .into_bytes(),
            2,
            "",
        ),
        (
            "regulation above tolerance",
            good.replace("regulation = \"1 %\"", "regulation = \"9 %\"")
                .into_bytes(),
            2,
            "at most the tolerance",
        ),
        (
            "a beta below twice the ambient",
            format!("{good}\n")
                .replace(
                    "kind = \"twin\"",
                    "kind = \"thermistor\"\nthermistor_beta = \"500 K\"",
                )
                .into_bytes(),
            2,
            "thermistor_beta",
        ),
    ];
    assert!(cases.len() >= 14);
    for (what, bytes, code, fragment) in cases {
        let f = dir.join("b.toml");
        std::fs::write(&f, &bytes).unwrap();
        let out = draftwire().arg("size").arg(&f).output().unwrap();
        assert_clean(what, &out);
        let stderr = String::from_utf8_lossy(&out.stderr);
        if code == 0 {
            assert!(
                matches!(out.status.code(), Some(0) | Some(1)),
                "{what}: {stderr}"
            );
        } else {
            assert_eq!(out.status.code(), Some(code), "{what}: {stderr}");
            assert!(stderr.contains(fragment), "{what}: {stderr}");
            // Never an echo of a huge line.
            assert!(
                stderr.lines().all(|l| l.chars().count() < 400),
                "{what}: a long line echoed"
            );
        }
    }
    // An unreadable path and a directory.
    let out = draftwire()
        .arg("size")
        .arg(dir.join("none.toml"))
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("cannot read"));
    let out = draftwire().arg("size").arg(&dir).output().unwrap();
    assert_eq!(out.status.code(), Some(2));
    std::fs::remove_dir_all(&dir).ok();
}

#[allow(clippy::too_many_arguments)]
fn random_design(
    nominal_c: f64,
    span_c: f64,
    r0: f64,
    tcr_ppm: f64,
    a_mw: f64,
    b_mw: f64,
    n: f64,
    rise: f64,
    trip: f64,
) -> String {
    let good = std::fs::read_to_string(example_path("workshop-door-draught.toml")).unwrap();
    good.replace(
        "nominal = \"18 degC\"\nmin = \"5 degC\"\nmax = \"30 degC\"",
        &format!(
            "nominal = \"{nominal_c} degC\"\nmin = \"{} degC\"\nmax = \"{} degC\"",
            nominal_c - span_c,
            nominal_c + span_c
        ),
    )
    .replace("r0 = \"60 ohm\"", &format!("r0 = \"{r0} ohm\""))
    .replace(
        "tcr = \"6000 ppm/K\"",
        &format!("tcr = \"{tcr_ppm} ppm/K\""),
    )
    .replace("a = \"1.0 mW/K\"", &format!("a = \"{a_mw} mW/K\""))
    .replace("b = \"2.0 mW/K\"", &format!("b = \"{b_mw} mW/K\""))
    .replace("n = 0.45", &format!("n = {n}"))
    .replace(
        "overheat_rise = \"100 K\"",
        &format!("overheat_rise = \"{rise} K\""),
    )
    .replace(
        "trip_airflow = \"0.3 m/s\"",
        &format!("trip_airflow = \"{trip} m/s\""),
    )
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(24))]
    /// Random designs inside the documented ranges: a report or a clear
    /// refusal, no non-finite figure in text or JSON, and the same bytes on
    /// a rerun.
    #[test]
    fn random_designs_give_clean_reports(
        nominal_c in -10.0f64..40.0,
        span_c in 0.0f64..15.0,
        r0 in 0.5f64..500.0,
        tcr_ppm in 1000.0f64..7000.0,
        a_mw in 0.05f64..10.0,
        b_mw in 0.05f64..20.0,
        n in 0.2f64..1.0,
        rise in 5.0f64..200.0,
        trip in 0.1f64..5.0,
    ) {
        let text = random_design(nominal_c, span_c, r0, tcr_ppm, a_mw, b_mw, n, rise, trip);
        let run = |fmt: &str| {
            draftwire()
                .args(["size", "-", "--format", fmt])
                .write_stdin(text.clone())
                .output()
                .unwrap()
        };
        let first = run("json");
        assert_clean("random design (json)", &first);
        let again = run("json");
        prop_assert_eq!(&first.stdout, &again.stdout);
        if first.status.code() != Some(2) {
            let v: serde_json::Value = serde_json::from_slice(&first.stdout).unwrap();
            let guard = v["checks"]
                .as_array()
                .unwrap()
                .iter()
                .any(|c| c["id"] == "internal-non-finite");
            prop_assert!(!guard, "a non-finite figure: {}", v);
        }
        assert_clean("random design (text)", &run("text"));
    }
}

/// The full key of a per-key range row (rows name a key by its last
/// segments).
fn full_key(key: &str) -> String {
    let head = key.split('.').next().unwrap_or("");
    match head {
        "regulator" => format!("supply.{key}"),
        "transistor" | "diode" => format!("output.{key}"),
        "cooling" | "resistance" | "lamp" | "heat_capacity" => format!("element.{key}"),
        "overheat_rise" => format!("drive.{key}"),
        _ => key.to_string(),
    }
}

/// Overrides that put an example into the state where a row's key is
/// read (another drive, load, law or table), applied before the row's own.
fn context(key: &str) -> &'static [&'static str] {
    match key {
        "drive.current" => &[
            "drive.kind=constant-current",
            "drive.series=",
            "drive.rail=",
        ],
        "output.buzzer_current" => &[
            "output.load=buzzer",
            "output.stage=auto",
            "output.led_forward=",
            "output.led_current=",
            "output.coil_voltage=",
            "output.coil_resistance=",
            "output.buzzer_current=20 mA",
        ],
        k if k.starts_with("transistor.") => &[
            "output.transistor.vce_max=40 V",
            "output.transistor.ic_max=200 mA",
            "output.transistor.power_max=500 mW",
            "output.transistor.hfe_min=100",
            "output.transistor.vce_sat=0.3 V",
            "output.transistor.vbe_on=0.7 V",
        ],
        k if k.starts_with("diode.") => &[
            "output.diode.reverse_max=400 V",
            "output.diode.forward_max=1 A",
        ],
        "resistance.beta" => &[
            "element.resistance.law=beta",
            "element.resistance.tcr=",
            "element.resistance.t0=",
            "element.resistance.beta=3950 K",
            "element.material=",
        ],
        k if k.starts_with("cooling.dissipation") || k == "cooling.time_constant" => &[
            "element.cooling.law=datasheet",
            "element.cooling.a=",
            "element.cooling.b=",
            "element.cooling.n=",
            "element.cooling.dissipation=2 mW/K",
            "element.cooling.dissipation_moving=4 mW/K",
            "element.cooling.moving_airflow=1 m/s",
        ],
        k if k.starts_with("cooling.wire_") => &[
            "element.cooling.law=coil",
            "element.cooling.diameter=1 mm",
            "element.cooling.wire_diameter=25 um",
            "element.cooling.wire_length=60 mm",
        ],
        _ => &[],
    }
}

/// A value of the row's dimension, written with a unit the reader takes.
fn literal(dim: draftwire::quantity::Dimension, si: f64) -> String {
    use draftwire::quantity::Dimension as D;
    let unit = match dim {
        D::Temperature => return format!("{} degC", si - 273.15),
        D::Resistance => "ohm",
        D::TemperatureDifference => "K",
        D::Velocity => "m/s",
        D::ThermalConductance => "W/K",
        D::ThermalResistance => "K/W",
        D::HeatCapacity => "J/K",
        D::Capacitance => "F",
        D::Length => "m",
        D::Time => "s",
        D::Pressure => "Pa",
        _ => dim.si_unit(),
    };
    format!("{si:e} {unit}")
}

/// Every per-key range is enforced at the door: a value just beyond either
/// end is refused with the key named (tried on each example until one
/// reaches the key), a value inside is not refused for its range; and
/// every row is listed in docs/design-file.md. The ranges are draftwire's
/// own (no source); this checks that they are applied and documented.
#[test]
fn per_key_ranges_are_enforced_and_documented() {
    use draftwire::design::overrides::Override;
    use draftwire::design::ranges::KEY_RANGES;
    let docs =
        std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("docs/design-file.md"))
            .unwrap();
    let examples: Vec<String> =
        std::fs::read_dir(Path::new(env!("CARGO_MANIFEST_DIR")).join("examples"))
            .unwrap()
            .map(|e| e.unwrap().path())
            .filter(|p| p.extension().is_some_and(|x| x == "toml"))
            .map(|p| std::fs::read_to_string(p).unwrap())
            .collect();
    let mut unreached = Vec::new();
    for row in KEY_RANGES {
        assert!(
            docs.contains(&format!("| `{}` |", row.key)),
            "{} is not in docs/design-file.md, Per-key ranges",
            row.key
        );
        let key = full_key(row.key);
        let beyond = if row.dim == draftwire::quantity::Dimension::Temperature {
            vec![row.hi + 10.0, row.lo - 10.0]
        } else if row.lo > 0.0 {
            vec![row.hi * 1.5, row.lo / 1.5]
        } else {
            vec![row.hi * 1.5]
        };
        let inside = 0.5 * (row.lo + row.hi);
        let last = row.key.rsplit('.').next().unwrap();
        let mut reached = false;
        let ctx: Vec<Override> = context(row.key)
            .iter()
            .map(|c| Override::parse(c).unwrap())
            .collect();
        for source in &examples {
            let mut refused_all = true;
            for x in &beyond {
                let o = Override::parse(&format!("{key}={}", literal(row.dim, *x))).unwrap();
                let mut all = ctx.clone();
                all.push(o);
                match draftwire::design::parse_design_with("t.toml", source, &all) {
                    Err(d) => {
                        // Refused at the key, by its own range or (where
                        // the two meet) by its dimension's.
                        let m = d.to_string();
                        refused_all &= m.contains(&format!("{key}:"))
                            && (m.contains("Per-key ranges") || m.contains("Units"));
                    }
                    Ok(_) => refused_all = false,
                }
            }
            if refused_all {
                reached = true;
                let o = Override::parse(&format!("{key}={}", literal(row.dim, inside))).unwrap();
                let mut all = ctx.clone();
                all.push(o);
                if let Err(d) = draftwire::design::parse_design_with("t.toml", source, &all) {
                    let m = d.to_string();
                    assert!(
                        !(m.contains("Per-key ranges") && m.contains(last)),
                        "{key} inside its range refused: {m}"
                    );
                }
                break;
            }
        }
        if !reached {
            unreached.push(key);
        }
    }
    assert!(
        unreached.is_empty(),
        "rows no example reaches: {unreached:?}"
    );
}
