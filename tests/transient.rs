//! Time: the integrator against closed forms and an independent RK4, event
//! location, the power-on false alarm, and the fit of bench readings; each
//! reference value with its source beside it.

use draftwire::analysis::compensation::Compensator;
use draftwire::analysis::transient::{power_on, quiet_airflow};
use draftwire::circuit::divider::Divider;
use draftwire::circuit::frontend::{Arrangement, FrontEnd, OutputState};
use draftwire::design::parse_design;
use draftwire::drive::Drive;
use draftwire::element::{CoolingLaw, Element, Environment, KingsLaw, LinearTcr, ResistanceLaw};
use draftwire::fit::{fit_king, student_t_quantile};
use draftwire::solve::operating_point;
use draftwire::transient::{Airflow, Circuit, EventKind};
use rand::{RngExt, SeedableRng};
use std::path::Path;

fn example(name: &str) -> String {
    std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR"))
            .join("examples")
            .join(name),
    )
    .unwrap()
}

/// Nickel-like element, invented values: 6 Ω at 20 °C, 6000 ppm/K, King
/// A = 1 mW/K, B = 2 mW/K, n = 0.45, C = 0.15 mJ/K.
fn element() -> Element {
    let law = ResistanceLaw::Linear(LinearTcr::new(6.0, 293.15, 6000e-6).unwrap());
    let king = CoolingLaw::King(KingsLaw::new(1e-3, 2e-3, 0.45).unwrap());
    Element::new(law, king, 0.15e-3, None).unwrap()
}

fn air() -> Environment {
    Environment {
        ambient_k: 293.15,
        pressure_pa: 101_325.0,
    }
}

/// A front end that never switches within these runs (reference at 0 V):
/// the runs here test the thermal integration.
fn quiet_front() -> FrontEnd {
    FrontEnd {
        arrangement: Arrangement::ReferenceOnNonInverting,
        divider: Divider {
            top_ohm: 1e6,
            trimmer_ohm: 1.0,
            bottom_ohm: 1e-3,
        },
        reference_rail_v: 5.0,
        feedback_ohm: None,
        input_ohm: 0.0,
        output_high: (5.0, 10e3),
        output_low_v: 0.2,
    }
}

/// A small airflow step on a current-driven linear-TCR element with King's
/// law is a first-order response with the lumped time constant the report
/// gives, τ = C/(dP_loss/dT − dP_elec/dT) at the final point (lumped
/// capacitance, Incropera 6th ed. §5.2): T(τ) − T0 = (1 − e⁻¹)·ΔT and
/// T(3τ) − T0 = (1 − e⁻³)·ΔT, to within the step's nonlinearity (here
/// 0.5 % of ΔT for a 0.01 m/s step at 0.3 m/s).
#[test]
fn small_step_is_first_order_with_the_reported_time_constant() {
    let el = element();
    let drive = Drive::ConstantCurrent { current_a: 0.08 };
    let env = air();
    let comp = Compensator::None;
    let c = Circuit {
        element: &el,
        drive,
        env,
        front: quiet_front(),
        comp: &comp,
        x: 0.5,
        active: OutputState::Low,
        hold_off: None,
    };
    let (u0, u1) = (0.30, 0.31);
    let p0 = operating_point(&el, &drive, &env, u0).unwrap();
    let p1 = operating_point(&el, &drive, &env, u1).unwrap();
    let tau = p1.time_constant_s;
    let y0 = c.steady_state(u0).unwrap();
    let step = Airflow::Step {
        from: u0,
        to: u1,
        back_at_s: 1e6,
    };
    let dt = p1.temperature_k - p0.temperature_k;
    for (k, share) in [(1.0, 1.0 - (-1.0f64).exp()), (3.0, 1.0 - (-3.0f64).exp())] {
        let run = c.run(&step, y0, k * tau, tau / 50.0);
        let t_end = run.samples.last().unwrap();
        assert!((t_end.time_s - k * tau).abs() < 1e-12);
        let got = (t_end.element_k - p0.temperature_k) / dt;
        assert!((got - share).abs() < 5e-3, "at {k}τ: {got} against {share}");
    }
}

/// The same nonlinear power-on (a tungsten filament on a series resistor,
/// the lamp example's element) integrated by an independent fixed-step
/// classical RK4 at a tiny step (written here): the temperatures agree.
#[test]
fn power_on_matches_an_independent_rk4() {
    let d = parse_design("lamp.toml", &example("cabinet-lamp-filament.toml")).unwrap();
    let core = draftwire::analysis::size::size_core(&d).unwrap();
    let el = &core.element;
    let drive = core.drive;
    let env = core.env;
    let u = 2.0;
    let f = |t: f64| {
        let r = el.resistance_law().resistance_ohm(t);
        (drive.power_w(r) - el.cooling_law().heat_loss_w(t, u, &env)) / el.heat_capacity_j_per_k()
    };
    let t_end: f64 = 0.2;
    let h: f64 = 1e-5;
    let mut t = env.ambient_k;
    let steps = (t_end / h).round() as usize;
    for _ in 0..steps {
        let k1 = f(t);
        let k2 = f(t + 0.5 * h * k1);
        let k3 = f(t + 0.5 * h * k2);
        let k4 = f(t + h * k3);
        t += h / 6.0 * (k1 + 2.0 * k2 + 2.0 * k3 + k4);
    }
    let comp = Compensator::None;
    let c = Circuit {
        element: el,
        drive,
        env,
        front: quiet_front(),
        comp: &comp,
        x: 0.5,
        active: OutputState::Low,
        hold_off: None,
    };
    let run = c.run(
        &Airflow::Constant(u),
        c.power_on_state(env.ambient_k),
        t_end,
        0.01,
    );
    let got = run.samples.last().unwrap().element_k;
    assert!(
        (got - t).abs() < 1e-5 * (t - env.ambient_k),
        "{got} K against RK4 {t} K"
    );
}

/// Event location: the time the sense voltage of a warming element crosses
/// a fixed reference, against bisection on an independent RK4 solution
/// (step 1e-5 s, linear between steps), to better than 1 ms (the issue's
/// figure; here far better).
#[test]
fn switching_time_is_located_to_better_than_a_millisecond() {
    let el = element();
    let drive = Drive::SeriesResistor {
        rail_v: 5.0,
        series_ohm: 50.0,
    };
    let env = air();
    // Reference divider without trimmer share: 0.56 V on a 5 V rail.
    let front = FrontEnd {
        arrangement: Arrangement::ReferenceOnNonInverting,
        divider: Divider {
            top_ohm: 44e3,
            trimmer_ohm: 0.0,
            bottom_ohm: 5.6e3,
        },
        reference_rail_v: 5.0,
        feedback_ohm: None,
        input_ohm: 0.0,
        output_high: (5.0, 10e3),
        output_low_v: 0.2,
    };
    let level = 5.0 * 5.6e3 / 49.6e3;
    let comp = Compensator::None;
    let c = Circuit {
        element: &el,
        drive,
        env,
        front,
        comp: &comp,
        x: 0.0,
        active: OutputState::High,
        hold_off: None,
    };
    let u = 0.2;
    let run = c.run(
        &Airflow::Constant(u),
        c.power_on_state(env.ambient_k),
        2.0,
        0.01,
    );
    let edge = run
        .events
        .iter()
        .find(|e| e.kind != EventKind::ActiveAtStart)
        .expect("the output switches once the element warms")
        .time_s;
    // Independent RK4 of the sense voltage.
    let f = |t: f64| {
        let r = el.resistance_law().resistance_ohm(t);
        (drive.power_w(r) - el.cooling_law().heat_loss_w(t, u, &env)) / el.heat_capacity_j_per_k()
    };
    let sense = |t: f64| drive.sense_v(el.resistance_law().resistance_ohm(t));
    let h = 1e-5;
    let (mut t, mut temp) = (0.0, env.ambient_k);
    let mut crossing = None;
    while t < 2.0 {
        let k1 = f(temp);
        let k2 = f(temp + 0.5 * h * k1);
        let k3 = f(temp + 0.5 * h * k2);
        let k4 = f(temp + h * k3);
        let next = temp + h / 6.0 * (k1 + 2.0 * k2 + 2.0 * k3 + k4);
        let (a, b) = (sense(temp) - level, sense(next) - level);
        if a < 0.0 && b >= 0.0 {
            crossing = Some(t + h * a / (a - b));
            break;
        }
        temp = next;
        t += h;
    }
    let crossing = crossing.expect("RK4 sees the crossing");
    assert!(
        (edge - crossing).abs() < 1e-3,
        "{edge} s against {crossing} s"
    );
    assert!(
        (edge - crossing).abs() < 1e-6,
        "{edge} s against {crossing} s"
    );
}

/// The workshop example's power-on false alarm (without its hold-off):
/// an independent RK4 of the element from cold at 18 °C on its series
/// resistor, until its sense voltage reaches the level at which the output
/// releases (the report's release sense voltage); the durations agree
/// within 10 % (the figure). With its hold-off capacitor the size
/// report's check passes.
#[test]
fn workshop_power_on_false_alarm_matches_an_independent_integration() {
    let d = parse_design("w.toml", &example("workshop-door-draught.toml")).unwrap();
    let core = draftwire::analysis::size::size_core(&d).unwrap();
    let p = power_on(&d, &core, d.ambient.nominal_k, None);
    assert!(
        p.false_alarm_s > 0.0,
        "a rising-trip detector reads tripped when cold"
    );
    let report = draftwire::analysis::size(&d).unwrap();
    let release = report.trip.release_sense_voltage_v;
    let el = &core.element;
    let drive = core.drive;
    let env = core.env;
    let u = quiet_airflow(&d);
    let f = |t: f64| {
        let r = el.resistance_law().resistance_ohm(t);
        (drive.power_w(r) - el.cooling_law().heat_loss_w(t, u, &env)) / el.heat_capacity_j_per_k()
    };
    let sense = |t: f64| drive.sense_v(el.resistance_law().resistance_ohm(t));
    let h = 1e-5;
    let (mut t, mut temp) = (0.0, env.ambient_k);
    while sense(temp) < release && t < 60.0 {
        let k1 = f(temp);
        let k2 = f(temp + 0.5 * h * k1);
        let k3 = f(temp + 0.5 * h * k2);
        let k4 = f(temp + h * k3);
        temp += h / 6.0 * (k1 + 2.0 * k2 + 2.0 * k3 + k4);
        t += h;
    }
    assert!(
        (p.false_alarm_s / t - 1.0).abs() < 1e-3,
        "{} s against {t} s",
        p.false_alarm_s
    );
    let c = report
        .checks
        .iter()
        .find(|c| c.id == "power-on-false-alarm")
        .unwrap();
    assert!(c.passed, "{c:?}");
    assert!(report
        .values
        .iter()
        .any(|v| v.function == role_function("CH1")));
    // Told to fit none, the check fails.
    let none = example("workshop-door-draught.toml").replace(
        "hysteresis = \"0.05 m/s\"",
        "hysteresis = \"0.05 m/s\"\npower_on_hold_off = \"none\"",
    );
    let r = draftwire::analysis::size(&parse_design("w.toml", &none).unwrap()).unwrap();
    let c = r
        .checks
        .iter()
        .find(|c| c.id == "power-on-false-alarm")
        .unwrap();
    assert!(!c.passed, "{c:?}");
}

/// The fit recovers King's constants from noisy synthetic readings, and its
/// 95 % intervals (estimate ± t·SE, Student's t with m − 3 degrees of
/// freedom; Draper & Smith, *Applied Regression Analysis*, 3rd ed., ch. 24)
/// cover the true values in 90–99 % of 200 seeded repeats (the issue's
/// band around the nominal 95 %). Noise: 1 % of G, Gaussian.
#[test]
fn king_fit_intervals_cover_the_true_values() {
    let (a, b, n) = (1e-3, 2e-3, 0.45);
    let us = [0.0, 0.1, 0.2, 0.3, 0.5, 0.8, 1.2, 2.0, 3.0, 4.0];
    let mut covered = [0usize; 3];
    let runs = 200;
    for seed in 0..runs {
        let mut rng = rand::rngs::ChaCha8Rng::seed_from_u64(seed);
        let pts: Vec<(f64, f64)> = us
            .iter()
            .map(|&u: &f64| {
                let g = a + b * u.powf(n);
                // Box–Muller from two uniforms.
                let (u1, u2): (f64, f64) = (rng.random(), rng.random());
                let z = (-2.0 * (1.0 - u1).ln()).sqrt() * (2.0 * std::f64::consts::PI * u2).cos();
                (u, g * (1.0 + 0.01 * z))
            })
            .collect();
        let f = fit_king(&pts).unwrap();
        let t = f.t95;
        covered[0] += usize::from((f.a_w_per_k - a).abs() <= t * f.a_stderr_w_per_k);
        covered[1] += usize::from((f.b_w_per_k - b).abs() <= t * f.b_stderr_w_per_k);
        covered[2] += usize::from((f.n - n).abs() <= t * f.n_stderr);
    }
    for (i, c) in covered.iter().enumerate() {
        let share = *c as f64 / runs as f64;
        assert!((0.90..=0.99).contains(&share), "parameter {i}: {share}");
    }
    // The t quantile used: 7 degrees of freedom → 2.365 (NIST/SEMATECH
    // e-Handbook Table 1.3.6.7.2).
    assert!((student_t_quantile(0.975, 7.0) - 2.365).abs() < 1.5e-3);
}

/// Still-air readings of a linear-TCR element (invented: 60 Ω at 20 °C,
/// 6000 ppm/K, A = 1 mW/K) at four currents, worked here by fixed-point
/// iteration of I²R(T) = A(T − T_a): the fit returns R0 and A.
#[test]
fn still_air_fit_recovers_r0_and_the_dissipation_constant() {
    use draftwire::fit::{fit_still_air, StillAirReading};
    let (r0, t0, alpha, a, ta) = (60.0, 293.15, 6000e-6, 1e-3, 291.15);
    let law = ResistanceLaw::Linear(LinearTcr::new(r0, t0, alpha).unwrap());
    let readings: Vec<StillAirReading> = [0.005, 0.015, 0.025, 0.035]
        .iter()
        .map(|&i: &f64| {
            let mut t = ta;
            for _ in 0..500 {
                t = ta + i * i * r0 * (1.0 + alpha * (t - t0)) / a;
            }
            StillAirReading {
                current_a: i,
                voltage_v: i * r0 * (1.0 + alpha * (t - t0)),
                ambient_k: ta,
            }
        })
        .collect();
    let f = fit_still_air(&law, &readings).unwrap();
    assert!((f.r0_ohm - r0).abs() < 1e-6 * r0, "{f:?}");
    assert!((f.a_w_per_k - a).abs() < 1e-6 * a, "{f:?}");
}

fn cli() -> assert_cmd::Command {
    let mut c = assert_cmd::Command::cargo_bin("draftwire").unwrap();
    c.env_remove("RUST_BACKTRACE");
    c
}

/// The commands as a script sees them: JSON keys the issue names, exit
/// statuses, and clear errors for bad input.
#[test]
fn transient_and_fit_commands() {
    let ex = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let out = cli()
        .args(["transient", "--format", "json"])
        .arg(ex.join("workshop-door-draught.toml"))
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(0));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(v["false_alarm_s"].as_f64().unwrap() > 0.0);
    assert!(v["false_alarm_coldest_s"].as_f64().is_some());
    assert!(v["events"][0]["time_s"].is_number());
    assert!(v["hold_off"]["capacitance_f"].as_f64().unwrap() > 0.0);
    // A step: it trips, then releases after the fall back.
    let out = cli()
        .args([
            "transient",
            "--scenario",
            "step",
            "--to",
            "0.6 m/s",
            "--format",
            "json",
        ])
        .arg(ex.join("workshop-door-draught.toml"))
        .output()
        .unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(v["time_to_trip_s"].as_f64().unwrap() > 0.0, "{v}");
    assert!(v["time_to_release_s"].as_f64().unwrap() > 0.0, "{v}");
    // A puff needs its duration.
    let out = cli()
        .args(["transient", "--scenario", "puff", "--peak", "1 m/s"])
        .arg(ex.join("workshop-door-draught.toml"))
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("--duration"));
    // A history file with a bad row names its line.
    let dir = std::env::temp_dir().join(format!("draftwire-transient-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let hist = dir.join("h.csv");
    std::fs::write(&hist, "time_s,airflow_m_per_s\n0,0.05\n1,abc\n").unwrap();
    let out = cli()
        .arg("transient")
        .arg(ex.join("workshop-door-draught.toml"))
        .arg("--airflow-file")
        .arg(&hist)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("h.csv:3"));
    // Fit: too few readings is a clear error (exit 1), JSON keys present.
    let rd = dir.join("r.csv");
    std::fs::write(
        &rd,
        "airflow_m_per_s,element_voltage_v,element_current_a\n0,3,0.03\n1,2.6,0.03\n",
    )
    .unwrap();
    let out = cli()
        .args(["fit", "--design"])
        .arg(ex.join("workshop-door-draught.toml"))
        .arg(&rd)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("at least 4"));
    let mut rows = String::from("airflow_m_per_s,element_voltage_v,element_current_a,ambient_c\n");
    for u in [0.0f64, 0.1, 0.3, 0.6, 1.0, 2.0] {
        // 60 Ω nickel at 30 mA with A = 1 mW/K, B = 2 mW/K, n = 0.45.
        let g = 1e-3 + 2e-3 * u.powf(0.45);
        let mut t = 291.15;
        for _ in 0..500 {
            t = 291.15 + 0.03f64.powi(2) * 60.0 * (1.0 + 6e-3 * (t - 293.15)) / g;
        }
        let v = 0.03 * 60.0 * (1.0 + 6e-3 * (t - 293.15));
        rows.push_str(&format!("{u},{v},0.03,18\n"));
    }
    std::fs::write(&rd, rows).unwrap();
    let out = cli()
        .args(["fit", "--format", "json", "--design"])
        .arg(ex.join("workshop-door-draught.toml"))
        .arg(&rd)
        .output()
        .unwrap();
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    for k in [
        "a_w_per_k",
        "a_stderr_w_per_k",
        "b_w_per_k",
        "b_stderr_w_per_k",
        "n",
        "n_stderr",
        "covariance",
        "residuals",
        "airflow_range_m_per_s",
    ] {
        assert!(!v[k].is_null(), "{k} missing");
    }
    // The element in the workshop file is the one read: 60 Ω at 20 °C,
    // and the readings above follow A = 1 mW/K exactly.
    assert!(
        (v["a_w_per_k"].as_f64().unwrap() - 1e-3).abs() < 1e-8,
        "{v}"
    );
    let section = v["section"].as_str().unwrap();
    assert!(section.contains("calibrated_range"));
    // The section pastes into the design in place of its own cooling and
    // spread tables, and the design reads.
    let design = example("workshop-door-draught.toml");
    let start = design.find("[element.cooling]").unwrap();
    let end = start + design[start..].find("\n[drive]").unwrap();
    let pasted = format!("{}{}{}", &design[..start], section, &design[end..]);
    parse_design("pasted.toml", &pasted).unwrap_or_else(|e| panic!("{e}\n{pasted}"));
    std::fs::remove_dir_all(&dir).ok();
}

/// The hold-off node alone charges as an RC: with the reference on the
/// inverting input and no feedback into it, v(t) = v_th·(1 − e^(−t/(r_th·C)))
/// from a discharged capacitor to ground (closed form of a first-order RC,
/// any circuits text); checked at t = r_th·C.
#[test]
fn hold_off_node_charges_as_an_rc() {
    use draftwire::transient::HoldOff;
    let el = element();
    let env = air();
    let comp = Compensator::None;
    let d = Divider {
        top_ohm: 10e3,
        trimmer_ohm: 0.0,
        bottom_ohm: 10e3,
    };
    let front = FrontEnd {
        arrangement: Arrangement::SenseOnNonInverting,
        feedback_ohm: None,
        divider: d,
        ..quiet_front()
    };
    let (v_th, r_th) = d.thevenin(5.0, 0.0);
    let cap = 100e-6;
    let tau = r_th * cap;
    let c = Circuit {
        element: &el,
        drive: Drive::ConstantCurrent { current_a: 0.05 },
        env,
        front,
        comp: &comp,
        x: 0.0,
        active: OutputState::Low,
        hold_off: Some(HoldOff {
            capacitance_f: cap,
            to_rail: false,
        }),
    };
    let run = c.run(
        &Airflow::Constant(1.0),
        c.power_on_state(env.ambient_k),
        tau,
        tau / 50.0,
    );
    let v = run.samples.last().unwrap().reference_v;
    let want = v_th * (1.0 - (-1.0f64).exp());
    assert!((v - want).abs() < 1e-6 * v_th, "{v} V against {want} V");
}

/// A still-air fit with a platinum law returns R0 at 0 °C (IEC 60751's R0):
/// readings of a Pt100 worked here from the Callendar–Van Dusen equation
/// (A = 3.9083e-3, B = −5.775e-7, IEC 60751) with A_still = 2 mW/K.
#[test]
fn still_air_fit_gives_platinum_r0_at_zero_celsius() {
    use draftwire::fit::{fit_still_air, StillAirReading};
    use draftwire::physics::platinum::CallendarVanDusen;
    let law = ResistanceLaw::Platinum(
        CallendarVanDusen::new(100.0, 3.9083e-3, -5.775e-7, -4.183e-12).unwrap(),
    );
    let cvd = |t_c: f64| 100.0 * (1.0 + 3.9083e-3 * t_c - 5.775e-7 * t_c * t_c);
    let (ta_c, a) = (25.0, 2e-3);
    let readings: Vec<StillAirReading> = [0.002, 0.006, 0.01, 0.014]
        .iter()
        .map(|&i: &f64| {
            let mut t = ta_c;
            for _ in 0..500 {
                t = ta_c + i * i * cvd(t) / a;
            }
            StillAirReading {
                current_a: i,
                voltage_v: i * cvd(t),
                ambient_k: ta_c + 273.15,
            }
        })
        .collect();
    let f = fit_still_air(&law, &readings).unwrap();
    assert!((f.r0_ohm - 100.0).abs() < 1e-4, "{f:?}");
    assert!((f.a_w_per_k - a).abs() < 1e-8, "{f:?}");
}

/// The bill row's function for a sizing role (designators depend on which
/// parts a design has; the function column does not).
fn role_function(internal: &str) -> &'static str {
    draftwire::analysis::wiring::Role::from_internal(internal)
        .unwrap_or_else(|| panic!("no role {internal}"))
        .function()
}

/// The hold-off rule as documented (CLI reference: twice the smallest
/// capacitor that removes the false alarm, then the next E6 value up),
/// checked by its definition rather than by the search: on the workshop
/// example the chosen value C removes the power-on false alarm at C/2 at
/// both the nominal and the coldest ambient, on its chosen side, and the
/// E6 value below C does not (at C_below/2 one of them still alarms beyond
/// the grace). Values are the tool's own rule; no external source.
#[test]
fn hold_off_is_the_smallest_e6_value_twice_the_threshold() {
    use draftwire::analysis::transient::{choose_hold_off, HoldOffChoice, HOLD_OFF_MARGIN};
    use draftwire::eseries::ESeries;
    use draftwire::transient::HoldOff;
    let d = parse_design("w.toml", &example("workshop-door-draught.toml")).unwrap();
    let core = draftwire::analysis::size::size_core(&d).unwrap();
    let HoldOffChoice::Fitted(h) = choose_hold_off(&d, &core) else {
        panic!("the workshop example needs a hold-off");
    };
    let grace = d.detector.power_on_grace_s;
    let worst = |c: f64| {
        let at = Some(HoldOff {
            capacitance_f: c,
            to_rail: h.to_rail,
        });
        [d.ambient.nominal_k, d.ambient.min_k]
            .iter()
            .map(|&t| power_on(&d, &core, t, at).false_alarm_s)
            .fold(0.0, f64::max)
    };
    let c = h.capacitance_f;
    assert_eq!(ESeries::E6.at_or_above(c), c, "{c} F is an E6 value");
    assert!(
        worst(c / HOLD_OFF_MARGIN) <= grace,
        "{c} F / 2 must remove it"
    );
    let below = ESeries::E6.at_or_below(c * (1.0 - 1e-9));
    assert!(
        worst(below / HOLD_OFF_MARGIN) > grace,
        "{below} F / 2 still removes it: {c} F is not the smallest"
    );
}
