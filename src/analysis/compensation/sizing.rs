//! Sizing the compensated reference divider: the network's slope fixes
//! the divider's total resistance, the trip point fixes its ratio, and the
//! trimmer covers the builds.
//!
//! The divider ratio at the wiper is `k = (B + x·P)/Σ` with `Σ` the total
//! resistance, `B` the bottom leg and `P` the trimmer (voltage-divider
//! rule). A network of resistance `R_c(T)` in the bottom leg moves it by
//! `dk/dT = R_c'·(1 − k)/Σ`; in the top leg by `dk/dT = −k·R_c'/Σ`
//! (differentiating `k`). The trip airflow holds still with ambient to
//! first order when the switching level moves as the sense voltage does at
//! the trip airflow, `V_ref·dk/dT = ∂V_sense/∂T_a` at fixed airflow; so
//! `Σ = R_c'·(1 − k)/s` (bottom) or `Σ = −k·R_c'/s` (top), with
//! `s = (∂V_sense/∂T_a)/V_ref`. For a twin in a Wheatstone bridge with a
//! linear-TCR element this is the balance `R_e/R_s = R_tw/R_top` held at a
//! fixed overheat ratio (docs/model.md §8.11 derives it); the rule here is
//! its general form, which also covers the fluid's property changes and any
//! resistance law.
//!
//! The estimate is then refined on the full model — the network's own
//! self-heating at the trip airflow and the exact ambient slope of the
//! ratio by central differences — before the fixed parts are snapped to
//! preferred values, choosing among neighbours the pair that keeps both
//! the slope and the mid-travel setting closest.

use super::{Compensator, Leg, ThermistorNetwork, Twin};
use crate::circuit::divider::{neighbours, Divider, STANDARD_TRIMMER_OHM, TRIMMER_SPAN_MARGIN};
use crate::circuit::frontend::{Arrangement, FrontEnd};
use crate::design::model::{CompensationKind, Design, Sizable};
use crate::drive::Drive;
use crate::element::{Element, Environment};
use crate::eseries::ESeries;
use crate::physics::thermistor::BetaThermistor;
use crate::solve::operating_point;

use super::super::size::SizeError;

/// Reference temperature of a thermistor's R25, K (25 °C).
pub const T25_K: f64 = 298.15;

/// Step of the central differences in ambient, K.
const AMBIENT_STEP_K: f64 = 0.5;

/// Refinement passes of the divider total on the full model.
const REFINE_PASSES: usize = 4;

/// Share of the twin's self-heating limit the sizing aims at, leaving the
/// rest as margin for tolerances and the highest rail (draftwire's choice,
/// no source).
pub const TWIN_RISE_DESIGN_SHARE: f64 = 0.5;

/// Thermistor R25 aimed at before scaling: 10 kΩ, the most common value
/// (common practice, no source).
const THERMISTOR_START_OHM: f64 = 10e3;

/// What the compensated divider must do.
#[derive(Debug, Clone, Copy)]
pub struct Target<'a> {
    /// The design.
    pub design: &'a Design,
    /// The sensing element (nominal).
    pub element: &'a Element,
    /// Its drive (nominal).
    pub drive: &'a Drive,
    /// Nominal air.
    pub env: &'a Environment,
    /// Target trip airflow, m/s.
    pub trip_airflow_m_per_s: f64,
    /// Wanted wiper ratio at the trip point (nominal parts).
    pub ratio: f64,
    /// Lowest and highest ratio the builds need at the bench.
    pub span: (f64, f64),
    /// Reference rail, V.
    pub rail_v: f64,
    /// The sensing element's rise over ambient at the trip airflow, K.
    pub overheat_k: f64,
}

/// A sized compensated divider.
#[derive(Debug, Clone)]
pub struct Sized {
    /// The divider's fixed parts (the network's leg holds only its fixed
    /// resistor; 0 Ω where none is fitted).
    pub divider: Divider,
    /// Exact values before snapping: (top, trimmer, bottom), ohm.
    pub exact: (f64, f64, f64),
    /// The compensating part.
    pub comp: Compensator,
    /// Notes for the report.
    pub notes: Vec<String>,
}

fn fail(msg: String) -> SizeError {
    SizeError::Compensation(msg)
}

/// `∂V_sense/∂T_a` at the trip airflow by central differences, V/K.
pub fn sense_slope_v_per_k(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    airflow: f64,
) -> Result<f64, SizeError> {
    let at = |dt: f64| {
        let e = Environment {
            ambient_k: env.ambient_k + dt,
            ..*env
        };
        operating_point(element, drive, &e, airflow)
            .map(|p| p.sense_v)
            .map_err(|e| fail(format!("the sense voltage's ambient slope: {e}")))
    };
    Ok((at(AMBIENT_STEP_K)? - at(-AMBIENT_STEP_K)?) / (2.0 * AMBIENT_STEP_K))
}

/// The network of the kind at its provisional values.
fn network(
    kind: CompensationKind,
    t: &Target<'_>,
    scale: f64,
    parallel: Option<f64>,
) -> Compensator {
    match kind {
        CompensationKind::Twin => Compensator::Twin(Twin {
            element: t.element.scaled_in_length(scale),
            leg: Leg::Bottom,
        }),
        _ => {
            let spec = t.design.compensation.thermistor;
            let law = BetaThermistor::new(scale, T25_K, spec.beta_k)
                .expect("a positive R25 and beta from the reader");
            let rp = parallel.unwrap_or_else(|| inflection_parallel_ohm(&law, t.env.ambient_k));
            Compensator::Thermistor(ThermistorNetwork {
                law,
                parallel_ohm: rp,
                dissipation_w_per_k: spec.dissipation_w_per_k,
                leg: Leg::Top,
            })
        }
    }
}

/// The parallel resistor that puts the inflection point of the pair's
/// resistance–temperature curve at `t_k`: `R_p = R_T·(B − 2T)/(B + 2T)`
/// (R. Pallàs-Areny & J. G. Webster, *Sensors and Signal Conditioning*,
/// 2nd ed., Wiley 2001, ch. 2, thermistor linearisation).
pub fn inflection_parallel_ohm(law: &BetaThermistor, t_k: f64) -> f64 {
    let b = law.beta_k();
    law.resistance_ohm(t_k) * (b - 2.0 * t_k) / (b + 2.0 * t_k)
}

/// The network's resistance and slope at ambient, unheated.
fn value_and_slope(c: &Compensator, t_k: f64) -> (f64, f64) {
    match c {
        Compensator::Twin(tw) => {
            let law = tw.element.resistance_law();
            (law.resistance_ohm(t_k), law.derivative_ohm_per_k(t_k))
        }
        Compensator::Thermistor(n) => (n.resistance_ohm(t_k), n.derivative_ohm_per_k(t_k)),
        Compensator::None => (0.0, 0.0),
    }
}

fn with_leg(c: Compensator, leg: Leg) -> Compensator {
    match c {
        Compensator::Twin(t) => Compensator::Twin(Twin { leg, ..t }),
        Compensator::Thermistor(n) => Compensator::Thermistor(ThermistorNetwork { leg, ..n }),
        Compensator::None => Compensator::None,
    }
}

/// The divider total from the slope rule (see the module text).
fn total_for_slope(leg: Leg, k: f64, slope_ohm_per_k: f64, s: f64) -> f64 {
    match leg {
        Leg::Bottom => slope_ohm_per_k * (1.0 - k) / s,
        Leg::Top => -k * slope_ohm_per_k / s,
    }
}

/// Fixed legs for a total, a trimmer set at `x` and the network's
/// resistance at the bench: (top, bottom), the network's leg holding its
/// fixed part only.
fn legs(leg: Leg, k: f64, total: f64, trimmer: f64, x: f64, network_ohm: f64) -> (f64, f64) {
    let bottom = k * total - x * trimmer;
    let top = (1.0 - k) * total - (1.0 - x) * trimmer;
    match leg {
        Leg::Bottom => (top, bottom - network_ohm),
        Leg::Top => (top - network_ohm, bottom),
    }
}

/// The wiper ratio's slope in ambient at mid-travel on the full model,
/// per K, and the network's resistance at the bench.
fn model_slope(t: &Target<'_>, comp: &Compensator, d: Divider, x: f64) -> (f64, f64) {
    let front = FrontEnd {
        arrangement: Arrangement::ReferenceOnNonInverting,
        divider: d,
        reference_rail_v: t.rail_v,
        feedback_ohm: None,
        input_ohm: 0.0,
        output_high: (t.rail_v, 1.0),
        output_low_v: 0.0,
    };
    let at = |dt: f64| {
        let e = Environment {
            ambient_k: t.env.ambient_k + dt,
            ..*t.env
        };
        comp.front_at(&front, &e, t.trip_airflow_m_per_s)
            .divider
            .ratio_at(x)
    };
    let r = comp
        .state(&d, t.rail_v, t.env, t.trip_airflow_m_per_s)
        .map_or(0.0, |s| s.resistance_ohm);
    (
        (at(AMBIENT_STEP_K) - at(-AMBIENT_STEP_K)) / (2.0 * AMBIENT_STEP_K),
        r,
    )
}

/// A network fitted into the divider: its total, trimmer and bench
/// setting, and the network's resistance at the bench.
#[derive(Debug, Clone, Copy)]
struct Fit {
    total: f64,
    trimmer: f64,
    x_t: f64,
    network_ohm: f64,
}

/// Fit a network into the divider: the total from the slope rule, the
/// trimmer from the span, then the total refined on the full model.
fn fit(t: &Target<'_>, comp: &Compensator, leg: Leg, s: f64) -> Result<Fit, SizeError> {
    let design = t.design;
    let k = t.ratio;
    let ta = t.env.ambient_k;
    let (r_c, slope) = value_and_slope(comp, ta);
    let mut total = total_for_slope(leg, k, slope, s);
    // The trimmer: the builds' span, the network's own tolerance and the
    // fixed parts' tolerances, with the divider's span margin.
    let tol = design.detector.divider_tolerances;
    let leg_share = match leg {
        Leg::Bottom => 1.0 - k,
        Leg::Top => k,
    };
    let comp_tol = network_tolerance(design, comp, ta);
    let (k_lo, k_hi) = t.span;
    // A short trimmer track (its tolerance) covers less span.
    let half = ((k - k_lo).max(k_hi - k).max(0.01 * k)
        + leg_share * comp_tol * r_c / total
        + k * (1.0 - k) * (tol.top + tol.bottom))
        * TRIMMER_SPAN_MARGIN
        / (1.0 - tol.trimmer).max(0.5);
    let trimmer = match design.detector.trimmer_ohm {
        Sizable::Fixed(p) => p,
        Sizable::Auto => *STANDARD_TRIMMER_OHM
            .iter()
            .find(|&&p| p >= 2.0 * half * total)
            .ok_or(fail(format!(
                "the compensated divider wants a trimmer of {:.0} ohm, above the largest standard one",
                2.0 * half * total
            )))?,
    };
    // The setting at the bench: mid-travel, or nearer the network's end
    // when the trimmer is larger than the span needs, so that less of its
    // track dilutes the network's leg (never outside the mid-travel
    // window of `checks::trimmer`).
    let reach = (2.0 * half * total / trimmer).clamp(0.35, 0.5);
    let x_t = match leg {
        Leg::Bottom => reach,
        Leg::Top => 1.0 - reach,
    };
    // Refine the total on the full model.
    let mut network_ohm = r_c;
    for _ in 0..REFINE_PASSES {
        let (top, bottom) = legs(leg, k, total, trimmer, x_t, network_ohm);
        let d = Divider {
            top_ohm: top.max(0.0),
            trimmer_ohm: trimmer,
            bottom_ohm: bottom.max(0.0),
        };
        let (slope_model, r) = model_slope(t, comp, d, x_t);
        network_ohm = r;
        if slope_model.is_finite() && slope_model * s > 0.0 {
            total *= slope_model / s;
        }
    }
    Ok(Fit {
        total,
        trimmer,
        x_t,
        network_ohm,
    })
}

/// Ambients the residual drift is judged at: the ends and the quarter
/// points of the range.
fn ambients(design: &Design) -> [f64; 4] {
    let (lo, nom, hi) = (
        design.ambient.min_k,
        design.ambient.nominal_k,
        design.ambient.max_k,
    );
    [lo, 0.5 * (lo + nom), 0.5 * (nom + hi), hi]
}

/// The largest relative trip-airflow error of the fitted network over the
/// ambient range (exact values, nominal rails, no hysteresis load).
fn residual(t: &Target<'_>, comp: &Compensator, leg: Leg, f: &Fit) -> f64 {
    let (top, bottom) = legs(leg, t.ratio, f.total, f.trimmer, f.x_t, f.network_ohm);
    let front = FrontEnd {
        arrangement: Arrangement::ReferenceOnNonInverting,
        divider: Divider {
            top_ohm: top.max(0.0),
            trimmer_ohm: f.trimmer,
            bottom_ohm: bottom.max(0.0),
        },
        reference_rail_v: t.rail_v,
        feedback_ohm: None,
        input_ohm: 0.0,
        output_high: (t.rail_v, 1.0),
        output_low_v: 0.0,
    };
    let u_t = t.trip_airflow_m_per_s;
    ambients(t.design)
        .iter()
        .map(|&ta| {
            let env = Environment {
                ambient_k: ta,
                ..*t.env
            };
            let level = comp.front_at(&front, &env, u_t).divider.ratio_at(f.x_t) * t.rail_v;
            crate::solve::airflow_for_sense(t.element, t.drive, &env, level, u_t)
                .map_or(f64::INFINITY, |u| (u / u_t - 1.0).abs())
        })
        .fold(0.0, f64::max)
}

/// Linearising resistors tried around the inflection-point value, as
/// factors: 10^(i/8) for i = −8 … 8.
const PARALLEL_TRIES: i32 = 8;

/// Size the compensated divider for `kind` (twin or thermistor).
pub fn size(kind: CompensationKind, t: &Target<'_>) -> Result<Sized, SizeError> {
    let design = t.design;
    let k = t.ratio;
    let s = sense_slope_v_per_k(t.element, t.drive, t.env, t.trip_airflow_m_per_s)? / t.rail_v;
    if !(s.is_finite() && s != 0.0) {
        return Err(fail(
            "the sense voltage does not move with ambient at the trip airflow: there is nothing to compensate".into(),
        ));
    }
    let ta = t.env.ambient_k;
    let mut notes = Vec::new();
    // The network at its provisional scale, in the leg that moves the
    // reference the right way.
    let (mut scale, parallel) = match kind {
        CompensationKind::Twin => (
            match design.compensation.twin.resistance_ohm {
                Sizable::Fixed(r) => r / t.element.resistance_law().resistance_ohm(ta),
                Sizable::Auto => 1.0,
            },
            None,
        ),
        _ => {
            let spec = design.compensation.thermistor;
            (
                match spec.r25_ohm {
                    Sizable::Fixed(r) => r,
                    Sizable::Auto => THERMISTOR_START_OHM,
                },
                match spec.linearising_ohm {
                    Sizable::Fixed(r) => Some(r),
                    Sizable::Auto => None,
                },
            )
        }
    };
    let mut comp = network(kind, t, scale, parallel);
    let (_, slope) = value_and_slope(&comp, ta);
    let leg = if slope * s > 0.0 {
        Leg::Bottom
    } else {
        Leg::Top
    };
    comp = with_leg(comp, leg);
    let total0 = total_for_slope(leg, k, slope, s);
    // Scale the network: a twin large enough that its self-heating stays
    // within its design share; a thermistor whose divider draws about the
    // wanted divider current.
    match kind {
        CompensationKind::Twin => {
            if design.compensation.twin.resistance_ohm == Sizable::Auto {
                // A twin m times the element's length carries m times the
                // divider's resistance (so 1/m its current) and loses m
                // times the heat per kelvin: its rise goes as 1/m².
                let (r_c, _) = value_and_slope(&comp, ta);
                let i = t.rail_v / total0;
                let g = t.element.cooling_law().heat_loss_w(ta + 1.0, 0.0, t.env);
                let rise = i * i * r_c / g;
                let limit = design.compensation.twin.max_rise_share * t.overheat_k;
                let m = (rise / (TWIN_RISE_DESIGN_SHARE * limit)).sqrt().max(1.0);
                // The twin's resistance at the nominal ambient, rounded up
                // to two significant figures (a length of wire is cut to
                // it; draftwire's choice).
                let r_el = t.element.resistance_law().resistance_ohm(ta);
                scale = ceil_sig(r_el * m, 2) / r_el;
                comp = with_leg(network(kind, t, scale, None), leg);
            }
        }
        _ => {
            let spec = design.compensation.thermistor;
            let current = design
                .detector
                .divider_current_a
                .unwrap_or(super::super::size::DEFAULT_DIVIDER_CURRENT_A);
            if spec.r25_ohm == Sizable::Auto {
                let wanted = t.rail_v / current;
                scale = ESeries::E6.nearest(THERMISTOR_START_OHM * wanted / total0);
                notes.push("thermistor R25 taken from the E6 values common for NTCs, scaled so the divider draws about the wanted current".into());
            }
            let rp = match spec.linearising_ohm {
                Sizable::Fixed(r) => r,
                Sizable::Auto => {
                    // The inflection-point value R_T(B − 2T)/(B + 2T) exists
                    // only for B > 2T.
                    let t_max = design.ambient.max_k;
                    if spec.beta_k <= 2.0 * t_max {
                        return Err(fail(format!(
                            "the thermistor's beta ({:.0} K) must exceed twice the warmest ambient in kelvin ({:.0} K) for a linearising resistor to straighten its curve: give a larger thermistor_beta or a fixed linearising resistor",
                            spec.beta_k,
                            2.0 * t_max
                        )));
                    }
                    // Start from the inflection-point value, then take the
                    // value that holds the trip airflow best over the
                    // whole ambient range (the sense voltage's own
                    // curvature in ambient is matched as well as the
                    // slope), snapped to the E-series.
                    let law = BetaThermistor::new(scale, T25_K, spec.beta_k)
                        .expect("positive R25 and beta");
                    let r0 = inflection_parallel_ohm(&law, ta);
                    let score = |rp: f64| {
                        let c = with_leg(network(kind, t, scale, Some(rp)), leg);
                        fit(t, &c, leg, s).map_or(f64::INFINITY, |f| residual(t, &c, leg, &f))
                    };
                    let best = (-PARALLEL_TRIES..=PARALLEL_TRIES)
                        .map(|i| r0 * 10f64.powf(f64::from(i) / f64::from(PARALLEL_TRIES)))
                        .map(|rp| (score(rp), rp))
                        .fold((f64::INFINITY, r0), |a, b| if b.0 < a.0 { b } else { a })
                        .1;
                    let below = design.e_series.at_or_below(best);
                    let above = design.e_series.at_or_above(best);
                    if score(below) <= score(above) {
                        below
                    } else {
                        above
                    }
                }
            };
            comp = with_leg(network(kind, t, scale, Some(rp)), leg);
        }
    }
    let fitted = fit(t, &comp, leg, s)?;
    let Fit {
        total,
        trimmer,
        x_t,
        network_ohm,
    } = fitted;
    let (top_exact, bottom_exact) = legs(leg, k, total, trimmer, x_t, network_ohm);
    let min_part = design.e_series.at_or_above(1.0);
    let eng = |x: f64| crate::quantity::format_engineering(x, "Ω", 3);
    if !(total.is_finite() && total > 0.0 && trimmer.is_finite()) {
        return Err(fail(format!(
            "no divider matches the sense voltage's ambient slope ({:.3} mV/K) with this part",
            1e3 * s * t.rail_v
        )));
    }
    if top_exact < -0.5 * min_part || bottom_exact < -0.5 * min_part {
        let (what, advice) = match kind {
            CompensationKind::Twin => (
                "the twin",
                "an unheated twin can only follow a sense voltage that moves, in relative terms, no faster than its own resistance; with a series resistor far above the element's resistance the element runs on a near-constant current and its temperature outruns the ambient. A series resistor nearer the element's own resistance (a lower element rail), less overheat, or a thermistor reference would do",
            ),
            _ => (
                "the thermistor network",
                "give a fixed linearising resistor larger than the one sized, or a thermistor of larger beta",
            ),
        };
        return Err(fail(format!(
            "{what} cannot follow the sense voltage here: matching its ambient slope ({:.3} mV/K) needs a divider of {} in all, with {} of trimmer, and {what} alone ({}) is more than its {} leg can hold; {advice}",
            1e3 * s * t.rail_v,
            eng(total),
            eng(trimmer),
            eng(network_ohm),
            leg.name()
        )));
    }
    let det = &design.detector;
    let pick = |fixed: Sizable, exact: f64| -> Vec<f64> {
        match fixed {
            Sizable::Fixed(v) => vec![v],
            // A leg that needs less than half the smallest preferred value
            // gets no resistor.
            Sizable::Auto if exact < 0.5 * min_part => vec![0.0],
            Sizable::Auto => neighbours(design.e_series, exact).to_vec(),
        }
    };
    let mut best: Option<(f64, Divider)> = None;
    for &top in &pick(det.top_ohm, top_exact) {
        for &bottom in &pick(det.bottom_ohm, bottom_exact) {
            let d = Divider {
                top_ohm: top,
                trimmer_ohm: trimmer,
                bottom_ohm: bottom,
            };
            let sum = d.total_ohm() + network_ohm;
            let lower = match leg {
                Leg::Bottom => bottom + network_ohm,
                Leg::Top => bottom,
            };
            let x = (k * sum - lower) / trimmer;
            let score = (sum / total - 1.0).abs()
                + 0.2 * (x - x_t).abs()
                + if (0.25..=0.75).contains(&x) {
                    0.0
                } else {
                    10.0
                };
            if best.is_none_or(|(b, _)| score < b) {
                best = Some((score, d));
            }
        }
    }
    let (_, divider) = best.ok_or(fail("no divider values".into()))?;
    if let Compensator::Twin(tw) = &comp {
        let r = tw.element.resistance_law().resistance_ohm(ta);
        notes.push(format!(
            "the twin is {} at the nominal ambient: the same wire about {:.1} times the sensing element's length, mounted beside it in the same air, carrying only the divider's current",
            crate::quantity::format_engineering(r, "Ω", 3),
            r / t.element.resistance_law().resistance_ohm(ta)
        ));
    }
    Ok(Sized {
        divider,
        exact: (top_exact.max(0.0), trimmer, bottom_exact.max(0.0)),
        comp,
        notes,
    })
}

/// The network's resistance tolerance at ambient `t_k` (fraction): the
/// twin's own; for the thermistor the R25 and beta tolerances
/// (`ΔR/R = ΔR25/R25 + |ΔB·(1/T − 1/T25)|` from the beta law) through the
/// parallel pair, plus the linearising resistor's.
fn network_tolerance(design: &Design, c: &Compensator, t_k: f64) -> f64 {
    match c {
        Compensator::Twin(_) => design.compensation.twin.tolerance,
        Compensator::Thermistor(n) => {
            let spec = design.compensation.thermistor;
            let rt = n.law.resistance_ohm(t_k);
            let rp = n.parallel_ohm;
            let d_ln_rt = spec.r25_tolerance
                + (spec.beta_tolerance * n.law.beta_k() * (1.0 / t_k - 1.0 / T25_K)).abs();
            let tol_r = design.detector.divider_tolerances.top;
            d_ln_rt * rp / (rt + rp) + tol_r * rt / (rt + rp)
        }
        Compensator::None => 0.0,
    }
}

/// `x` rounded up to `digits` significant figures.
pub fn ceil_sig(x: f64, digits: i32) -> f64 {
    if !(x > 0.0 && x.is_finite()) {
        return x;
    }
    let p = 10f64.powi(x.log10().floor() as i32 - digits + 1);
    let v = (x / p * (1.0 - 1e-12)).ceil() * p;
    crate::analysis::size::round_sig(v, digits as usize)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn inflection_resistor_matches_the_worked_value() {
        // Pallàs-Areny & Webster (Sensors and Signal Conditioning, 2nd ed.,
        // ch. 2), linearisation example as reproduced in a stored copy:
        // R25 = 25 kΩ, B = 4000 K, centre 25 °C → R ≈ 18.5 kΩ; by hand
        // 25000·(4000 − 596.3)/(4000 + 596.3) = 18 513 Ω.
        let law = BetaThermistor::new(25e3, T25_K, 4000.0).unwrap();
        let r = inflection_parallel_ohm(&law, T25_K);
        assert!((r - 18_513.0).abs() < 1.0, "{r}");
        // The pair's curve has no curvature at the centre: its second
        // difference there is far below the thermistor's own.
        let n = ThermistorNetwork {
            law,
            parallel_ohm: r,
            dissipation_w_per_k: 1e-3,
            leg: Leg::Top,
        };
        let h = 1.0;
        let d2 = |f: &dyn Fn(f64) -> f64| f(T25_K + h) - 2.0 * f(T25_K) + f(T25_K - h);
        let pair = d2(&|t| n.resistance_ohm(t)).abs();
        let bare = d2(&|t| law.resistance_ohm(t)).abs();
        assert!(pair < 1e-3 * bare, "pair {pair}, bare {bare}");
    }

    #[test]
    fn ceil_to_two_figures() {
        // Hand values.
        assert_eq!(ceil_sig(6.01, 2), 6.1);
        assert_eq!(ceil_sig(6.0, 2), 6.0);
        assert_eq!(ceil_sig(123.0, 2), 130.0);
    }
}
