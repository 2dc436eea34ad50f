//! `spread`: the Monte Carlo against the deterministic map it samples, its
//! extremes against the worst case, reproducibility across thread counts,
//! and every example as a process.

use assert_cmd::Command;
use draftwire::analysis::size::{drive_with, element_rail, size_core};
use draftwire::analysis::spread::{spread, SpreadOptions, TrialRow};
use draftwire::design::parse_design;
use draftwire::solve::airflow_for_sense;
use std::path::Path;

fn example(name: &str) -> String {
    std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR"))
            .join("examples")
            .join(name),
    )
    .unwrap()
}

fn draftwire() -> Command {
    let mut c = Command::cargo_bin("draftwire").unwrap();
    c.env_remove("RUST_BACKTRACE");
    c
}

/// The server example with every tolerance and range at zero except the
/// element's ±5 %: the trip airflow (trimmer at its printed setting) is then
/// a monotone map of the element's draw alone.
fn only_element_varies() -> String {
    example("server-cabinet-airflow.toml")
        .replace("min = \"20 degC\"", "min = \"25 degC\"")
        .replace("max = \"30 degC\"", "max = \"25 degC\"")
        .replace("input_min = \"11.4 V\"", "input_min = \"12 V\"")
        .replace("input_max = \"12.6 V\"", "input_max = \"12 V\"")
        .replace("tolerance = \"2 %\"\ndropout", "tolerance = \"0 %\"\ndropout")
        .replace("\ntolerance = \"2 %\"\n\n[element.resistance]", "\ntolerance = \"5 %\"\n\n[element.resistance]")
        .replace(
            "overheat_rise = \"180 K\"",
            "overheat_rise = \"180 K\"\ntolerance = \"0 %\"",
        )
        .replace(
            "hysteresis = \"0.1 m/s\"",
            "hysteresis = \"0.1 m/s\"\ntop_tolerance = \"0 %\"\ntrimmer_tolerance = \"0 %\"\nbottom_tolerance = \"0 %\"",
        )
        .replace("[output]", "[comparator]\noffset = \"0 mV\"\noffset_full_range = \"0 mV\"\n\n[output]")
}

/// With one tolerance varied (uniform over ±5 %) the Monte Carlo's q-quantile
/// is the deterministic trip airflow at that tolerance's q-quantile, −1 +
/// 2q in units of the tolerance (a monotone map), within the Monte Carlo's
/// statistical error (about √(q(1 − q)/N) in probability, here widened to
/// ±0.02) and the histogram's resolution (0.23 %).
#[test]
fn single_tolerance_quantiles_follow_the_deterministic_map() {
    let d = parse_design("one.toml", &only_element_varies()).unwrap();
    let core = size_core(&d).unwrap();
    let r = spread(
        &d,
        &core,
        SpreadOptions {
            trials: 20_000,
            seed: 7,
        },
        &|_| {},
        None,
    );
    // Everything else at zero.
    for t in &r.tolerances {
        if t.parameter != "element R0" {
            assert_eq!(t.plus_minus, 0.0, "{}", t.parameter);
        }
    }
    let trip_at = |z: f64| {
        let el = core
            .element
            .with_resistance_law(core.element.resistance_law().scaled(1.0 + 0.05 * z));
        let rail = element_rail(&d).map_or(0.0, |r| d.supply.rail_v(r));
        let value = match core.drive {
            draftwire::drive::Drive::SeriesResistor { series_ohm, .. } => series_ohm,
            draftwire::drive::Drive::ConstantCurrent { current_a } => current_a,
        };
        let drive = drive_with(&d.drive, value, rail);
        let src = drive.sense_source_ohm(core.at_trip.resistance_ohm);
        let level = core
            .front
            .switching_sense_v(core.trimmer_x, core.idle_state, src);
        airflow_for_sense(&el, &drive, &core.env, level, 1.0).unwrap()
    };
    let q = r.trip_airflow_quantiles_m_per_s;
    for (p, got) in [(0.05, q.p05), (0.5, q.p50), (0.95, q.p95)] {
        let got = got.unwrap();
        let (a, b) = (
            trip_at(2.0 * (p - 0.02) - 1.0),
            trip_at(2.0 * (p + 0.02) - 1.0),
        );
        let (lo, hi) = (a.min(b) * (1.0 - 0.0025), a.max(b) * (1.0 + 0.0025));
        assert!(
            lo <= got && got <= hi,
            "q = {p}: Monte Carlo {got}, map {lo}–{hi}"
        );
    }
    // All of the variance is the element's.
    assert_eq!(r.contributions.len(), 1);
    assert_eq!(r.contributions[0].parameter, "element R0");
}

/// Every trial's trip airflow lies within the worst case over the vertices
/// of the tolerance box (the map is monotone in each part).
#[test]
fn monte_carlo_extremes_lie_within_the_worst_case() {
    let d = parse_design("s.toml", &example("server-cabinet-airflow.toml")).unwrap();
    let core = size_core(&d).unwrap();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    let mut sink = |row: &TrialRow| {
        let u = row.trip_airflow_m_per_s.unwrap();
        lo = lo.min(u);
        hi = hi.max(u);
    };
    let r = spread(
        &d,
        &core,
        SpreadOptions {
            trials: 5_000,
            seed: 11,
        },
        &|_| {},
        Some(&mut sink),
    );
    let w = r.worst_case;
    let (wl, wh) = (
        w.trip_airflow_min_m_per_s.unwrap(),
        w.trip_airflow_max_m_per_s.unwrap(),
    );
    assert!(
        wl * (1.0 - 1e-9) <= lo && hi <= wh * (1.0 + 1e-9),
        "trials {lo}–{hi}, worst case {wl}–{wh}"
    );
    assert!(w.retrimmable);
    assert!(r.passed);
}

/// The same seed gives byte-identical output with one thread and with two.
#[test]
fn same_seed_same_output_for_any_thread_count() {
    let ex = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/workshop-door-draught.toml");
    let run = |threads: &str| {
        draftwire()
            .env("RAYON_NUM_THREADS", threads)
            .args([
                "spread", "--format", "json", "--trials", "5000", "--seed", "3",
            ])
            .arg(&ex)
            .output()
            .unwrap()
            .stdout
    };
    let (one, two) = (run("1"), run("2"));
    assert!(!one.is_empty());
    assert_eq!(one, two);
}

/// `spread` on every example: exit 0 or 1 as the limits say, a JSON report
/// with the documented keys, and the per-trial CSV when asked.
#[test]
fn spread_runs_on_every_example() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let tmp = std::env::temp_dir().join("draftwire-spread-test");
    std::fs::create_dir_all(&tmp).unwrap();
    for e in std::fs::read_dir(&dir).unwrap() {
        let p = e.unwrap().path();
        if p.extension().is_none_or(|x| x != "toml") {
            continue;
        }
        let csv = tmp.join(format!("{}.csv", p.file_stem().unwrap().to_string_lossy()));
        let out = draftwire()
            .args(["spread", "--format", "json", "--trials", "300"])
            .arg("--trials-csv")
            .arg(&csv)
            .arg(&p)
            .output()
            .unwrap();
        let code = out.status.code().unwrap();
        assert!(code == 0 || code == 1, "{}: exit {code}", p.display());
        let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        for key in [
            "schema_version",
            "trials",
            "seed",
            "distribution",
            "trip_airflow_quantiles_m_per_s",
            "worst_case",
            "trimmable_share",
            "false_trip_share",
            "out_of_band_share",
            "contributions",
            "passed",
        ] {
            assert!(v.get(key).is_some(), "{}: no {key}", p.display());
        }
        for key in ["p01", "p05", "p50", "p95", "p99"] {
            assert!(v["trip_airflow_quantiles_m_per_s"].get(key).is_some());
        }
        assert_eq!(v["trials"], 300);
        assert_eq!(code == 0, v["passed"].as_bool().unwrap());
        let rows = std::fs::read_to_string(&csv).unwrap();
        assert_eq!(
            rows.lines().count(),
            301,
            "{}: header + one line a trial",
            p.display()
        );
    }
}

/// A model tolerance on a geometry-cooled wire (issue 11: the tolerance
/// spread can include the model): `[spread] cooling` scales the forced
/// correlation, widens the trip airflow's spread, and shows up among the
/// ranked contributions.
#[test]
fn geometry_cooling_takes_a_model_tolerance() {
    let base = example("duct-platinum-wire.toml");
    let with_model = format!("{base}\n[spread]\ncooling = \"10 %\"\n");
    let run = |text: &str| {
        let d = parse_design("d.toml", text).unwrap();
        let d = draftwire::analysis::choice::resolve(&d).design;
        let core = size_core(&d).unwrap();
        spread(
            &d,
            &core,
            SpreadOptions {
                trials: 2000,
                seed: 7,
            },
            &|_| {},
            None,
        )
    };
    let plain = run(&base);
    let model = run(&with_model);
    let width = |r: &draftwire::analysis::spread::SpreadReport| {
        let q = &r.trip_airflow_quantiles_m_per_s;
        q.p95.unwrap() - q.p05.unwrap()
    };
    assert!(
        width(&model) > width(&plain),
        "{} vs {}",
        width(&model),
        width(&plain)
    );
    assert!(
        model
            .contributions
            .iter()
            .any(|c| c.parameter.contains("cooling") && c.share > 0.0),
        "{:?}",
        model.contributions
    );
}
