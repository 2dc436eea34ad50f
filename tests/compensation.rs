//! Ambient compensation: the twin bridge and the thermistor reference,
//! each reference value with its source beside it.

use draftwire::analysis::compensation::{Compensator, Leg, Reference, Sensing, Twin};
use draftwire::analysis::{choice, size};
use draftwire::circuit::divider::Divider;
use draftwire::circuit::frontend::{Arrangement, FrontEnd, OutputState};
use draftwire::design::parse_design;
use draftwire::drive::Drive;
use draftwire::element::{CoolingLaw, Element, Environment, KingsLaw, ResistanceLaw};
use draftwire::report::Report;
use draftwire::solve::operating_point;
use std::path::Path;

fn example(name: &str) -> String {
    std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR"))
            .join("examples")
            .join(name),
    )
    .unwrap()
}

fn report(name: &str, text: &str) -> Report {
    size(&parse_design(name, text).unwrap()).unwrap()
}

/// A linear-TCR element with King's law (invented values): 6 Ω at 20 °C,
/// 6000 ppm/K, A = 1 mW/K, B = 2 mW/K, n = 0.45.
fn nickel(r0: f64) -> Element {
    let law =
        ResistanceLaw::Linear(draftwire::element::LinearTcr::new(r0, 293.15, 6000e-6).unwrap());
    let king = CoolingLaw::King(KingsLaw::new(1e-3, 2e-3, 0.45).unwrap());
    Element::new(law, king, 1e-4, None).unwrap()
}

fn front(d: Divider, rail_v: f64) -> FrontEnd {
    FrontEnd {
        arrangement: Arrangement::ReferenceOnNonInverting,
        divider: d,
        reference_rail_v: rail_v,
        feedback_ohm: None,
        input_ohm: 0.0,
        output_high: (rail_v, 10e3),
        output_low_v: 0.2,
    }
}

fn air(t_c: f64) -> Environment {
    Environment {
        ambient_k: 273.15 + t_c,
        pressure_pa: 101_325.0,
    }
}

/// The bridge balance against the textbook Wheatstone condition
/// R1/R2 = R3/R4 (C. Wheatstone, Phil. Trans. R. Soc. 133 (1843) 303;
/// any circuits text): with the sensing arm Rs over R_e and the reference
/// arm R_top over (pad + twin), the two mid-points are at the same voltage
/// exactly when R_e/Rs = (pad + R_tw)/R_top. The twin's resistance is worked
/// here independently of the code: R = R0(1 + α(T − T0)) with its own
/// self-heating T = T_a + I²R/A, I = V/(R_top + pad + R), by fixed-point
/// iteration (King's A in still air; invented values).
#[test]
fn twin_bridge_balances_where_wheatstone_says() {
    let v = 5.0;
    let rs = 50.0;
    let twin = Compensator::Twin(Twin {
        element: nickel(6000.0),
        leg: Leg::Bottom,
    });
    let env = air(25.0);
    let d = Divider {
        top_ohm: 40e3,
        trimmer_ohm: 0.0,
        bottom_ohm: 2e3,
    };
    // By hand: the twin's resistance with its own small self-heating.
    let (r0, alpha, t0, a) = (6000.0, 6000e-6, 293.15, 1e-3);
    let mut t = env.ambient_k;
    for _ in 0..50 {
        let r = r0 * (1.0 + alpha * (t - t0));
        let i = v / (d.top_ohm + d.bottom_ohm + r);
        t = env.ambient_k + i * i * r / a;
    }
    let r_tw = r0 * (1.0 + alpha * (t - t0));
    // Wheatstone: balanced when R_e = Rs·(pad + R_tw)/R_top.
    let r_e = rs * (d.bottom_ohm + r_tw) / d.top_ohm;
    let drive = Drive::SeriesResistor {
        rail_v: v,
        series_ohm: rs,
    };
    // The code's reference node in still air.
    let fe = twin.front_at(&front(d, v), &env, 0.0);
    let (v_ref, _) = fe.divider.thevenin(v, 0.0);
    assert!(
        (drive.sense_v(r_e) - v_ref).abs() < 1e-9 * v,
        "{} vs {v_ref}",
        drive.sense_v(r_e)
    );
    // Off balance by 1 % on the element side, the bridge is off balance.
    assert!((drive.sense_v(1.01 * r_e) - v_ref).abs() > 1e-4);
}

/// A twin bridge with a linear-TCR element trips at a constant overheat
/// ratio. Worked here: balance R_e·R_top = Rs·R_tw with R(T) = R0(1 + α(T −
/// T0)) for both (the twin m times the element) gives
/// R_e/R_e(T_a) = Rs·m/R_top, the same at every ambient. With Rs = 50 Ω,
/// m = 1000 and R_top = 50·1000/1.3 Ω the trip is at overheat ratio 0.3.
#[test]
fn twin_bridge_trips_at_a_constant_overheat_ratio() {
    let v = 5.0;
    let rs = 50.0;
    let m = 1000.0;
    let element = nickel(6.0);
    let twin = Compensator::Twin(Twin {
        element: nickel(6.0 * m),
        leg: Leg::Bottom,
    });
    let d = Divider {
        top_ohm: rs * m / 1.3,
        trimmer_ohm: 0.0,
        bottom_ohm: 0.0,
    };
    let drive = Drive::SeriesResistor {
        rail_v: v,
        series_ohm: rs,
    };
    let reference = Reference {
        front: front(d, v),
        comp: &twin,
        x: 0.0,
        sense_source_ohm: drive.sense_source_ohm(6.0),
    };
    let mut ratios = Vec::new();
    for t_c in [5.0, 20.0, 35.0] {
        let env = air(t_c);
        let s = Sensing {
            element: &element,
            drive: &drive,
            env: &env,
        };
        // Rising sense voltage with cooling → σ for a metal element.
        let u = reference
            .switching(&s, OutputState::High, 0.0, 0.5, -1.0)
            .airflow()
            .expect("the bridge switches at some airflow");
        let p = operating_point(&element, &drive, &env, u).unwrap();
        let law = element.resistance_law();
        let ratio = p.resistance_ohm / law.resistance_ohm(env.ambient_k) - 1.0;
        // The twin's own rise (≈ 0.01 K at 0.1 mA) shifts it by α·ΔT ≈ 1e-4.
        assert!(
            (ratio - 0.3).abs() < 1e-3,
            "{t_c} °C: overheat ratio {ratio}"
        );
        ratios.push(ratio);
    }
    assert!((ratios[0] - ratios[2]).abs() < 1e-3, "{ratios:?}");
}

/// First-order cancellation: the trip airflow's slope in ambient at the
/// nominal point (central difference, ±1 K) is below 1 % of the same
/// design's uncompensated slope (the target), for the twin and for
/// the thermistor, on E192 parts so that snapping leaves the slope match
/// intact.
#[test]
fn compensation_cancels_the_ambient_slope_to_first_order() {
    for (file, kind) in [
        ("workshop-door-draught.toml", "twin"),
        ("greenhouse-fan-alarm.toml", "thermistor"),
    ] {
        let text = example(file)
            .replace("e_series = \"E96\"", "e_series = \"E192\"")
            .replace("kind = \"twin\"", &format!("kind = \"{kind}\""))
            .replace("kind = \"thermistor\"", &format!("kind = \"{kind}\""));
        let r = report(file, &text);
        let c = &r.compensation;
        assert_eq!(c.kind, kind);
        let own = c.ambient_slope_m_per_s_per_k.unwrap();
        let plain = c.uncompensated_ambient_slope_m_per_s_per_k.unwrap();
        assert!(
            own.abs() < 0.01 * plain.abs(),
            "{file}: slope {own} m/s/K against {plain} uncompensated"
        );
    }
}

/// The thermistor network's value and slope at the nominal ambient match the
/// sense voltage at the trip airflow, by hand from the bill: the top leg is
/// RR1 + RT1 ∥ RR3 with R_T = R25·exp(B(1/T − 1/298.15 K)) (beta law,
/// Steinhart & Hart 1968 two-term form), the wiper ratio
/// k = (RR2 + x·RV1)/(RR1 + R_T∥RR3 + RV1 + RR2) (voltage-divider rule). The
/// slope of V·k in ambient (central difference ±0.5 K, computed here) must
/// match the sense voltage's (from the element's operating points) within
/// 3 % (E96 snapping of the divider's total), and V·k at the bench setting
/// equal the sense voltage at the trip airflow.
#[test]
fn thermistor_network_matches_value_and_slope_by_hand() {
    let text = example("greenhouse-fan-alarm.toml");
    let design = parse_design("g.toml", &text).unwrap();
    let r = size(&design).unwrap();
    let value = |d: &str| {
        r.values
            .iter()
            .find(|v| v.function == role_function(d))
            .and_then(|v| v.value_ohm)
            .unwrap_or_else(|| panic!("{d} in the bill"))
    };
    let (rr1, rv1, rr2, rt1, rr3) = (
        value("RR1"),
        value("RV1"),
        value("RR2"),
        value("RT1"),
        value("RR3"),
    );
    let beta = 3950.0; // the file's default, docs/design-file.md
    let x = r.trip.trimmer_position_percent / 100.0;
    let v = 5.0;
    let k_at = |t_k: f64| {
        let rt = rt1 * (beta * (1.0 / t_k - 1.0 / 298.15)).exp();
        let pair = rt * rr3 / (rt + rr3);
        (rr2 + x * rv1) / (rr1 + pair + rv1 + rr2)
    };
    let ta = design.ambient.nominal_k;
    let core = draftwire::analysis::size::size_core(&design).unwrap();
    let sense_at = |t_k: f64| {
        let env = Environment {
            ambient_k: t_k,
            ..core.env
        };
        operating_point(&core.element, &core.drive, &env, 0.5)
            .unwrap()
            .sense_v
    };
    // Value: the bench setting puts the reference on the sense voltage at
    // the trip airflow (the thermistor's self-heating, about 0.05 K, and the
    // feedback's pull on the wiper are within 0.5 %).
    let level = v * k_at(ta);
    assert!(
        (level / sense_at(ta) - 1.0).abs() < 5e-3,
        "{level} V against {} V",
        sense_at(ta)
    );
    // Slope.
    let h = 0.5;
    let ref_slope = v * (k_at(ta + h) - k_at(ta - h)) / (2.0 * h);
    let sense_slope = (sense_at(ta + h) - sense_at(ta - h)) / (2.0 * h);
    assert!(
        (ref_slope / sense_slope - 1.0).abs() < 0.03,
        "reference {ref_slope} V/K against sense {sense_slope} V/K"
    );
}

/// A twin run at too high a current fails `twin-self-heating`: the divider
/// scales with the twin, so its power goes as 1/R_tw, and a twin cut from
/// the same wire loses heat in proportion to its length, so its rise goes as
/// 1/R_tw² (docs/model.md §8.11). The sized twin aims at half its limit; one
/// a quarter its size runs at about eight times the limit.
#[test]
fn a_twin_with_too_much_current_fails_its_self_heating_check() {
    let sized = report("w.toml", &example("workshop-door-draught.toml"));
    let r_tw = sized
        .values
        .iter()
        .find(|v| v.function == role_function("RC1"))
        .and_then(|v| v.value_ohm)
        .unwrap();
    let text = example("workshop-door-draught.toml").replace(
        "kind = \"twin\"",
        &format!(
            "kind = \"twin\"\ntwin_resistance = \"{:.0} ohm\"",
            r_tw / 4.0
        ),
    );
    let r = report("w.toml", &text);
    let c = r
        .checks
        .iter()
        .find(|c| c.id == "twin-self-heating")
        .expect("a twin design carries the check");
    assert!(!c.passed, "{c:?}");
    assert!(c.value.unwrap() > c.limit.unwrap());
    // The sized twin passes it, with its rise at most the stated 2 % of
    // the overheat (docs/design-file.md).
    let c = sized
        .checks
        .iter()
        .find(|c| c.id == "twin-self-heating")
        .unwrap();
    assert!(c.passed, "{c:?}");
}

/// Every example passes every check, and every compensated example narrows
/// its drift span at least fivefold (the target), with each variant
/// used by one example at least.
#[test]
fn compensated_examples_pass_and_narrow_their_drift_five_fold() {
    let mut kinds = Vec::new();
    for file in [
        "workshop-door-draught.toml",
        "greenhouse-fan-alarm.toml",
        "duct-platinum-wire.toml",
        "cabinet-lamp-filament.toml",
        "server-cabinet-airflow.toml",
    ] {
        let r = report(file, &example(file));
        let failing: Vec<_> = r
            .checks
            .iter()
            .filter(|c| !c.passed)
            .map(|c| &c.id)
            .collect();
        assert!(failing.is_empty(), "{file}: {failing:?}");
        let c = &r.compensation;
        kinds.push(c.kind.clone());
        if c.kind != "none" {
            let own = c.drift_span_m_per_s.unwrap();
            let plain = c.uncompensated_drift_span_m_per_s.unwrap();
            assert!(plain >= 5.0 * own, "{file}: {own} against {plain}");
            // The site rows carry the uncompensated trip beside their own.
            assert!(r
                .drift
                .iter()
                .filter(|d| d.corner == "nominal parts" && !d.comparison_only)
                .take(3)
                .all(|d| d.uncompensated_trip_airflow_m_per_s.is_some()));
        }
    }
    for k in ["twin", "thermistor"] {
        assert!(kinds.iter().any(|x| x == k), "{kinds:?}");
    }
}

/// `auto` takes the variant with the fewest parts that holds the band: the
/// server cabinet's plain divider holds it, so no part is added.
#[test]
fn auto_keeps_the_plain_divider_when_it_holds() {
    let d = parse_design("s.toml", &example("server-cabinet-airflow.toml")).unwrap();
    let c = choice::resolve(&d);
    assert_eq!(c.design.compensation.kind.name(), "none");
    assert!(c.why.contains("fewest"), "{}", c.why);
    // On the workshop (5–30 °C) the plain divider fails and a variant is
    // taken instead.
    let text = example("workshop-door-draught.toml").replace("kind = \"twin\"", "kind = \"auto\"");
    let c = choice::resolve(&parse_design("w.toml", &text).unwrap());
    assert_ne!(c.design.compensation.kind.name(), "none", "{}", c.why);
}

/// The regulation band cannot exceed the regulator's tolerance: a clear
/// error at the value.
#[test]
fn regulation_above_tolerance_is_refused() {
    let text = example("workshop-door-draught.toml")
        .replace("regulation = \"1 %\"", "regulation = \"6 %\"");
    let e = parse_design("w.toml", &text).unwrap_err().to_string();
    assert!(
        e.contains("supply.regulator.regulation") && e.contains("at most the tolerance"),
        "{e}"
    );
}

/// The bill row's function for a sizing role (designators depend on which
/// parts a design has; the function column does not).
fn role_function(internal: &str) -> &'static str {
    draftwire::analysis::wiring::Role::from_internal(internal)
        .unwrap_or_else(|| panic!("no role {internal}"))
        .function()
}
