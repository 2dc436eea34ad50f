//! Stage two of reading a design file: from the raw TOML mirror to the
//! validated [`Design`], table by table (the `[element]` section lives in
//! `element.rs`).

use super::diagnostic::Diagnostic;
use super::model::*;
use super::raw::{self, Scalar, Value};
use super::reader::{toml_error, Reader, R};
use crate::element::Element;
use crate::eseries::ESeries;
use crate::quantity::{parse_quantity, Dimension};

/// Parse and validate a design file's text. `file` names it in messages.
pub fn parse_design(file: &str, source: &str) -> Result<Design, Box<Diagnostic>> {
    let raw: raw::RawDesign =
        toml::from_str(source).map_err(|e| Box::new(toml_error(file, source, &e)))?;
    let mut rd = Reader {
        file,
        source,
        assumptions: Vec::new(),
    };
    build(&mut rd, &raw)
}

fn build(rd: &mut Reader<'_>, raw: &raw::RawDesign) -> R<Design> {
    let title = raw
        .design
        .as_ref()
        .and_then(|m| m.title.as_ref())
        .map(|t| t.get_ref().clone())
        .unwrap_or_else(|| "untitled design".to_string());
    let e_series = match raw.design.as_ref().and_then(|m| m.e_series.as_ref()) {
        Some(w) => ESeries::parse(w.get_ref().trim()).ok_or_else(|| {
            Box::new(
                Diagnostic::at(
                    rd.file,
                    rd.source,
                    Some(w.span()),
                    Some("design.e_series"),
                    format!("expected one of \"E6\", \"E12\", \"E24\", \"E48\", \"E96\", \"E192\", found \"{}\"", w.get_ref()),
                )
                .with_help(None),
            )
        })?,
        None => {
            rd.assumptions.push("design.e_series not given: sized resistors use E24".into());
            ESeries::E24
        }
    };

    let ambient = build_ambient(rd, &raw.ambient)?;

    let supply = build_supply(rd, &raw.supply)?;
    let has_reg = supply.regulator.is_some();

    // Element.
    let (element, element_tolerance, natural_floor) =
        super::element::build_element(rd, &raw.element)?;

    // Drive.
    let DriveChoice {
        drive,
        overheat,
        tolerance: drive_tolerance,
    } = build_drive(rd, &raw.drive, "drive", has_reg, e_series)?;

    let element = if natural_floor {
        natural_still_air_floor(rd, &raw.element, element, overheat, &ambient)?
    } else {
        element
    };

    let detector = build_detector(rd, &raw.detector, drive, has_reg, e_series)?;
    let reference_rail = detector.reference_rail;

    let comparator = build_comparator(
        rd,
        raw.comparator.as_ref(),
        reference_rail,
        has_reg,
        &ambient,
    )?;
    let output = match &raw.output {
        Some(o) => Some(build_output(rd, o, has_reg, &comparator, &supply)?),
        None => None,
    };
    let ratings = build_ratings(rd, raw.ratings.as_ref())?;
    let spread = build_spread(rd, raw.spread.as_ref())?;
    let compensation =
        super::compensation::build_compensation(rd, raw.compensation.as_ref(), element_tolerance)?;

    Ok(Design {
        title,
        design_file: rd.file.to_string(),
        element_name: raw.element.name.as_ref().map(|n| n.get_ref().clone()),
        e_series,
        ambient,
        supply,
        element,
        element_tolerance,
        drive,
        drive_tolerance,
        overheat,
        detector,
        comparator,
        output,
        ratings,
        spread,
        compensation,
        assumptions: std::mem::take(&mut rd.assumptions),
    })
}

/// `still_air_floor = "natural"`: the free-convection velocity
/// (`physics::convection::free_convection_velocity_m_per_s`) at the drive's
/// still-air overheat and the nominal ambient, put on the element's King's
/// law. It needs the overheat target, which only a sized drive states.
fn natural_still_air_floor(
    rd: &mut Reader<'_>,
    e: &raw::RawElement,
    element: Element,
    overheat: Option<OverheatTarget>,
    ambient: &Ambient,
) -> R<Element> {
    let span = e
        .cooling
        .as_ref()
        .and_then(|c| c.still_air_floor.as_ref())
        .map(|v| v.span());
    let field = "element.cooling.still_air_floor";
    let ta = ambient.nominal_k;
    let law = element.resistance_law();
    let rise = match overheat {
        Some(OverheatTarget::Rise(r)) => Some(r),
        // R_hot = R_amb·(1 + x) for a metal, (1 − x) for an NTC, as the
        // drive is sized (`analysis::size`).
        Some(OverheatTarget::Ratio(x)) => {
            let factor = if law.is_increasing() {
                1.0 + x
            } else {
                1.0 - x
            };
            law.temperature_for_resistance(law.resistance_ohm(ta) * factor)
                .map(|t| t - ta)
        }
        None => None,
    };
    let Some(rise) = rise.filter(|r| r.is_finite() && *r > 0.0) else {
        return Err(rd.err(
            span,
            field,
            "\"natural\" needs the drive's still-air overheat (drive.overheat_rise or overheat_ratio with an \"auto\" drive); give the floor as a velocity instead, e.g. still_air_floor = \"4 cm/s\"".into(),
        ));
    };
    let u =
        crate::physics::convection::free_convection_velocity_m_per_s(rise, ta, ambient.pressure_pa)
            .map_err(|er| rd.err(span.clone(), field, er.to_string()))?;
    let Some(cooling) = element.cooling_law().with_still_air_floor(u) else {
        return Err(rd.err(
            span,
            field,
            "only King's law and the data-sheet form take a still-air floor; geometry cooling has its own natural-convection term".into(),
        ));
    };
    rd.assumptions.push(format!(
        "{field} = \"natural\": U_N = {:.1} mm/s, the free-convection velocity (g·ΔT·ν/T_f)^(1/3) at the drive's still-air rise of {:.0} K and {:.1} °C (Collis & Williams' Re < Gr^(1/3), written for the airflow)",
        u * 1e3,
        rise,
        ta - 273.15
    ));
    Ok(element.with_cooling_law(cooling))
}

/// `[ambient]`: nominal, lowest and highest ambient and the air pressure.
fn build_ambient(rd: &mut Reader<'_>, a: &raw::RawAmbient) -> R<Ambient> {
    let nominal_k = rd.quantity(&a.nominal, "ambient.nominal", Dimension::Temperature)?;
    let min_k = rd.or_default(
        &a.min,
        nominal_k,
        "ambient.min not given: taken as the nominal ambient",
        |r, v| r.quantity(v, "ambient.min", Dimension::Temperature),
    )?;
    let max_k = rd.or_default(
        &a.max,
        nominal_k,
        "ambient.max not given: taken as the nominal ambient",
        |r, v| r.quantity(v, "ambient.max", Dimension::Temperature),
    )?;
    if !(min_k <= nominal_k && nominal_k <= max_k) {
        return Err(rd.err(
            a.min.as_ref().or(a.max.as_ref()).map(|v| v.span()),
            "ambient",
            format!(
                "expected min ≤ nominal ≤ max, found {:.2} °C, {:.2} °C, {:.2} °C",
                min_k - 273.15,
                nominal_k - 273.15,
                max_k - 273.15
            ),
        ));
    }
    let pressure_pa = match (&a.pressure, &a.altitude) {
        (Some(p), None) => rd.positive(p, "ambient.pressure", Dimension::Pressure)?,
        (None, Some(h)) => {
            let h_m = rd.quantity(h, "ambient.altitude", Dimension::Length)?;
            crate::physics::air::pressure_at_altitude_pa(h_m)
                .map_err(|e| rd.err(Some(h.span()), "ambient.altitude", e.to_string()))?
        }
        (Some(_), Some(h)) => {
            return Err(rd.err(
                Some(h.span()),
                "ambient.altitude",
                "give either pressure or altitude, not both".into(),
            ))
        }
        (None, None) => {
            rd.assumptions.push(
                "ambient.pressure and ambient.altitude not given: standard atmospheric pressure, 101.325 kPa".into(),
            );
            crate::element::STANDARD_PRESSURE_PA
        }
    };
    Ok(Ambient {
        nominal_k,
        min_k,
        max_k,
        pressure_pa,
    })
}

/// `[supply]`: the input range, the optional regulator, decoupling.
fn build_supply(rd: &mut Reader<'_>, s: &raw::RawSupply) -> R<Supply> {
    let input_v = rd.positive(&s.input, "supply.input", Dimension::Voltage)?;
    let input_min_v = rd.or_default(
        &s.input_min,
        input_v,
        "supply.input_min not given: taken as the nominal input",
        |r, v| r.positive(v, "supply.input_min", Dimension::Voltage),
    )?;
    let input_max_v = rd.or_default(
        &s.input_max,
        input_v,
        "supply.input_max not given: taken as the nominal input",
        |r, v| r.positive(v, "supply.input_max", Dimension::Voltage),
    )?;
    if !(input_min_v <= input_v && input_v <= input_max_v) {
        return Err(rd.err(
            Some(s.input.span()),
            "supply",
            format!("expected input_min ≤ input ≤ input_max, found {input_min_v} V, {input_v} V, {input_max_v} V"),
        ));
    }
    let regulator = match &s.regulator {
        None => None,
        Some(g) => {
            let output_v = rd.positive(&g.output, "supply.regulator.output", Dimension::Voltage)?;
            let dropout_v = rd.non_negative(
                rd.required(
                    &g.dropout,
                    "supply.regulator.dropout",
                    Some(g.output.span()),
                    "the regulator's dropout voltage, e.g. dropout = \"2 V\"",
                )?,
                "supply.regulator.dropout",
                Dimension::Voltage,
            )?;
            let quiescent_a = rd.non_negative(
                rd.required(
                    &g.quiescent,
                    "supply.regulator.quiescent",
                    Some(g.output.span()),
                    "the regulator's quiescent current, e.g. quiescent = \"5 mA\"",
                )?,
                "supply.regulator.quiescent",
                Dimension::Current,
            )?;
            let tolerance = rd.or_default(&g.tolerance, crate::circuit::regulator::LinearRegulator::typical_fixed_5v().output_tolerance, "supply.regulator.tolerance not given: ±4 % assumed (typical of the fixed linear regulator class)", |r, v| {
                r.fraction_in(v, "supply.regulator.tolerance", 0.0, 0.5)
            })?;
            let regulation = match &g.regulation {
                None => {
                    rd.assumptions.push("supply.regulator.regulation not given: a unit's output may move by its whole tolerance in service (the safe side)".into());
                    tolerance
                }
                Some(v) => {
                    let x = rd.fraction_in(v, "supply.regulator.regulation", 0.0, 0.5)?;
                    if x > tolerance {
                        return Err(rd.err(
                            Some(v.span()),
                            "supply.regulator.regulation",
                            format!(
                                "expected at most the tolerance ({} %): the regulation band is the part of the tolerance one unit moves by in service; found {} %",
                                crate::quantity::format_sig(100.0 * tolerance, 3),
                                crate::quantity::format_sig(100.0 * x, 3)
                            ),
                        ));
                    }
                    x
                }
            };
            let theta_ja_k_per_w = rd.or_default(
                &g.theta_ja,
                65.0,
                "supply.regulator.theta_ja not given: 65 K/W assumed (typical of a TO-220 package with no heat sink)",
                |r, v| r.positive(v, "supply.regulator.theta_ja", Dimension::ThermalResistance),
            )?;
            let max_junction_k = rd.or_default(
                &g.max_junction,
                398.15,
                "supply.regulator.max_junction not given: 125 °C assumed (typical)",
                |r, v| r.quantity(v, "supply.regulator.max_junction", Dimension::Temperature),
            )?;
            Some(RegulatorSpec {
                output_v,
                tolerance,
                regulation,
                dropout_v,
                quiescent_a,
                theta_ja_k_per_w,
                max_junction_k,
            })
        }
    };
    let decoupling_f = match &s.decoupling {
        Some(v) => rd.sizable(v, "supply.decoupling", Dimension::Capacitance)?,
        None => Sizable::Auto,
    };
    Ok(Supply {
        input_v,
        input_min_v,
        input_max_v,
        regulator,
        decoupling_f,
    })
}

/// `[detector]`: the trip point, its band and the quiet airflow, the
/// divider, trimmer and hysteresis.
fn build_detector(
    rd: &mut Reader<'_>,
    t: &raw::RawDetector,
    drive: DriveSpec,
    has_reg: bool,
    e_series: ESeries,
) -> R<Detector> {
    let trip_airflow_m_per_s = rd.positive(
        &t.trip_airflow,
        "detector.trip_airflow",
        Dimension::Velocity,
    )?;
    if trip_airflow_m_per_s > crate::solve::MAX_AIRFLOW_M_PER_S / 2.0 {
        return Err(rd.err(
            Some(t.trip_airflow.span()),
            "detector.trip_airflow",
            format!(
                "expected at most {} m/s, found {trip_airflow_m_per_s} m/s",
                crate::solve::MAX_AIRFLOW_M_PER_S / 2.0
            ),
        ));
    }
    let trip_on = match rd.word(&t.trip_on, "detector.trip_on", &["rising", "falling"])? {
        "rising" => TripDirection::Rising,
        _ => TripDirection::Falling,
    };
    let drive_rail = match drive {
        DriveSpec::SeriesResistor { rail, .. } => rail,
        DriveSpec::ConstantCurrent { .. } => {
            if has_reg {
                Rail::Regulated
            } else {
                Rail::Input
            }
        }
    };
    let reference_rail = match &t.reference_rail {
        Some(w) => rd.rail(w, "detector.reference_rail", has_reg)?,
        None => {
            rd.assumptions.push(format!(
                "detector.reference_rail not given: the divider hangs from the {} rail",
                drive_rail.name()
            ));
            drive_rail
        }
    };
    let sz = |rd: &Reader, v: &Option<Value>, f: &str| -> R<Sizable> {
        match v {
            Some(v) => rd.sizable(v, f, Dimension::Resistance),
            None => Ok(Sizable::Auto),
        }
    };
    let top_ohm = sz(rd, &t.top, "detector.top")?;
    let trimmer_ohm = sz(rd, &t.trimmer, "detector.trimmer")?;
    let bottom_ohm = sz(rd, &t.bottom, "detector.bottom")?;
    let trimmer_position = rd.opt(&t.trimmer_position, |r, v| {
        r.fraction_in(v, "detector.trimmer_position", 0.0, 1.0)
    })?;
    let divider_current_a = rd.opt(&t.divider_current, |r, v| {
        r.positive(v, "detector.divider_current", Dimension::Current)
    })?;
    let omitted: Vec<&str> = [
        ("top", t.top.is_none()),
        ("trimmer", t.trimmer.is_none()),
        ("bottom", t.bottom.is_none()),
    ]
    .iter()
    .filter(|(_, absent)| *absent)
    .map(|(k, _)| *k)
    .collect();
    if !omitted.is_empty() {
        rd.assumptions.push(format!(
            "detector keys not given, so sized (\"auto\"): {}",
            omitted.join(", ")
        ));
    }
    let sizes_divider = [&t.top, &t.trimmer, &t.bottom].iter().any(|v| {
        v.as_ref().is_none_or(
            |v| matches!(v.get_ref(), Scalar::Text(s) if s.trim().eq_ignore_ascii_case("auto")),
        )
    });
    if divider_current_a.is_none() && sizes_divider {
        rd.assumptions.push(
            "detector.divider_current not given: the divider is sized for about 200 µA (≥ 100× a comparator's bias current; common practice)".into(),
        );
    }
    let hysteresis = match &t.hysteresis {
        None => {
            rd.assumptions.push("detector.hysteresis not given: no hysteresis network".into());
            HysteresisSpec::None
        }
        Some(v) => match v.get_ref() {
            Scalar::Text(s) if s.trim().eq_ignore_ascii_case("none") => HysteresisSpec::None,
            Scalar::Text(s) => {
                if parse_quantity(s, Dimension::Velocity).is_ok() {
                    // Through the reader, so the plausible range applies.
                    let u = rd.quantity(v, "detector.hysteresis", Dimension::Velocity)?;
                    if u <= 0.0 || u >= 10.0 * trip_airflow_m_per_s {
                        return Err(rd.err(Some(v.span()), "detector.hysteresis", format!("expected a band above 0 m/s and below ten times the trip airflow, found {u} m/s")));
                    }
                    HysteresisSpec::Airflow(u)
                } else {
                    match parse_quantity(s, Dimension::Voltage) {
                        Ok(_) => {
                            let x = rd.quantity(v, "detector.hysteresis", Dimension::Voltage)?;
                            if x <= 0.0 {
                                return Err(rd.err(Some(v.span()), "detector.hysteresis", format!("expected a band above 0 V, found {x} V")));
                            }
                            HysteresisSpec::Volts(x)
                        }
                        _ => {
                            return Err(rd.err(
                                Some(v.span()),
                                "detector.hysteresis",
                                format!("expected an airflow band such as \"0.05 m/s\", a voltage band such as \"20 mV\", or \"none\"; found \"{s}\""),
                            ))
                        }
                    }
                }
            }
            Scalar::Number(n) => {
                return Err(rd.err(
                    Some(v.span()),
                    "detector.hysteresis",
                    format!("missing unit: expected an airflow band such as \"0.05 m/s\" or a voltage band such as \"20 mV\", found the bare number {n}"),
                ))
            }
        },
    };
    let feedback_ohm = sz(rd, &t.feedback, "detector.feedback")?;
    let input_resistor_ohm = sz(rd, &t.input_resistor, "detector.input_resistor")?;
    let (normal_airflow_m_per_s, background_airflow_m_per_s) =
        quiet_airflows(rd, t, trip_on, trip_airflow_m_per_s)?;
    let trip_band_m_per_s = trip_band(rd, t, trip_airflow_m_per_s)?;
    check_quiet_outside_band(rd, t, trip_on, trip_band_m_per_s, normal_airflow_m_per_s)?;
    let divider_tolerances = divider_tolerances(rd, t, e_series)?;
    let power_on_grace_s = match &t.power_on_grace {
        None => 0.0,
        Some(v) => {
            let x = rd.non_negative(v, "detector.power_on_grace", Dimension::Time)?;
            if x > 3600.0 {
                return Err(rd.err(
                    Some(v.span()),
                    "detector.power_on_grace",
                    format!("expected a time of 0 s to 1 h, found {x} s"),
                ));
            }
            x
        }
    };
    let power_on_hold_off = match &t.power_on_hold_off {
        None => HoldOffSpec::Auto,
        Some(v) => match v.get_ref() {
            raw::Scalar::Text(w) if w.trim().eq_ignore_ascii_case("none") => HoldOffSpec::None,
            _ => match rd.sizable(v, "detector.power_on_hold_off", Dimension::Capacitance)? {
                Sizable::Auto => HoldOffSpec::Auto,
                Sizable::Fixed(c) if (1e-9..=1e-2).contains(&c) => HoldOffSpec::Fixed(c),
                Sizable::Fixed(c) => {
                    return Err(rd.err(
                        Some(v.span()),
                        "detector.power_on_hold_off",
                        format!(
                        "expected \"auto\", \"none\" or a capacitance of 1 nF to 10 mF, found {}",
                        crate::quantity::format_engineering(c, "F", 4)
                    ),
                    ))
                }
            },
        },
    };
    Ok(Detector {
        trip_airflow_m_per_s,
        normal_airflow_m_per_s,
        trip_band_m_per_s,
        background_airflow_m_per_s,
        divider_tolerances,
        trip_on,
        reference_rail,
        top_ohm,
        trimmer_ohm,
        bottom_ohm,
        trimmer_position,
        divider_current_a,
        power_on_grace_s,
        power_on_hold_off,
        hysteresis,
        feedback_ohm,
        input_resistor_ohm,
    })
}

/// `[spread]`: the tolerance run's settings; absent keys take
/// [`SPREAD_DEFAULTS`] (the `spread` report echoes every setting).
fn build_spread(rd: &mut Reader<'_>, g: Option<&raw::RawSpread>) -> R<SpreadSpec> {
    let Some(g) = g else {
        return Ok(SPREAD_DEFAULTS);
    };
    let cooling_tolerance = match &g.cooling {
        None => 0.0,
        Some(v) => rd.fraction_in(v, "spread.cooling", 0.0, 0.5)?,
    };
    let distribution = match &g.distribution {
        None => SPREAD_DEFAULTS.distribution,
        Some(w) => match rd.word(w, "spread.distribution", &["uniform", "normal"])? {
            "normal" => SpreadDistribution::Normal,
            _ => SpreadDistribution::Uniform,
        },
    };
    let min_trimmable = rd.opt(&g.min_trimmable, |r, v| {
        r.fraction_in(v, "spread.min_trimmable", 0.0, 1.0)
    })?;
    let max_false_trip = rd.opt(&g.max_false_trip, |r, v| {
        r.fraction_in(v, "spread.max_false_trip", 0.0, 1.0)
    })?;
    Ok(SpreadSpec {
        cooling_tolerance,
        distribution,
        min_trimmable: min_trimmable.unwrap_or(SPREAD_DEFAULTS.min_trimmable),
        max_false_trip: max_false_trip.unwrap_or(SPREAD_DEFAULTS.max_false_trip),
    })
}

/// `[ratings]`: the derating policy.
fn build_ratings(rd: &mut Reader<'_>, g: Option<&raw::RawRatings>) -> R<RatingsSpec> {
    Ok(match g {
        None => {
            rd.assumptions.push("ratings not given: resistors run at no more than 50 % of rated power (common practice); trimmer rated 0.1 W (typical)".into());
            RatingsSpec {
                resistor_derating: 0.5,
                trimmer_power_w: 0.1,
                resistor_min_w: None,
            }
        }
        Some(g) => RatingsSpec {
            resistor_derating: rd.or_default(
                &g.resistor_derating,
                0.5,
                "ratings.resistor_derating not given: 50 % (common practice)",
                |r, v| r.fraction_in(v, "ratings.resistor_derating", 0.05, 1.0),
            )?,
            trimmer_power_w: rd.or_default(
                &g.trimmer_power,
                0.1,
                "ratings.trimmer_power not given: 0.1 W (typical)",
                |r, v| r.positive(v, "ratings.trimmer_power", Dimension::Power),
            )?,
            resistor_min_w: rd.opt(&g.resistor_min, |r, v| {
                r.positive(v, "ratings.resistor_min", Dimension::Power)
            })?,
        },
    })
}

/// The wanted still-air overheat: `overheat_rise` or `overheat_ratio`
/// (one of them at most), with field names under `p`.
pub(crate) fn read_overheat(
    rd: &Reader<'_>,
    rise: &Option<Value>,
    ratio: &Option<Value>,
    p: &str,
) -> R<Option<OverheatTarget>> {
    Ok(match (rise, ratio) {
        (Some(v), None) => Some(OverheatTarget::Rise(rd.positive(
            v,
            &format!("{p}.overheat_rise"),
            Dimension::TemperatureDifference,
        )?)),
        (None, Some(v)) => {
            let x = rd.quantity(v, &format!("{p}.overheat_ratio"), Dimension::Fraction)?;
            if !(x > 0.0 && x < 20.0) {
                return Err(rd.err(
                    Some(v.span()),
                    &format!("{p}.overheat_ratio"),
                    format!("expected a ratio above 0 and below 20, found {x}"),
                ));
            }
            Some(OverheatTarget::Ratio(x))
        }
        (Some(_), Some(v)) => {
            return Err(rd.err(
                Some(v.span()),
                &format!("{p}.overheat_ratio"),
                "give either overheat_rise or overheat_ratio, not both".into(),
            ))
        }
        (None, None) => None,
    })
}

/// Read a drive table (the design's `[drive]` or a candidate's own), with
/// field names under `p`.
pub(crate) fn build_drive(
    rd: &mut Reader<'_>,
    d: &raw::RawDrive,
    p: &str,
    has_reg: bool,
    e_series: ESeries,
) -> R<DriveChoice> {
    let kind = rd.word(
        &d.kind,
        &format!("{p}.kind"),
        &["series-resistor", "constant-current"],
    )?;
    let drive = if kind == "series-resistor" {
        let rail = match &d.rail {
            Some(w) => rd.rail(w, &format!("{p}.rail"), has_reg)?,
            None => {
                let r = if has_reg {
                    Rail::Regulated
                } else {
                    Rail::Input
                };
                rd.assumptions.push(format!(
                    "{p}.rail not given: the element is fed from the {} rail",
                    r.name()
                ));
                r
            }
        };
        let series = rd.required(
            &d.series,
            &format!("{p}.series"),
            Some(d.kind.span()),
            "the series resistor, e.g. series = \"47 ohm\" or series = \"auto\"",
        )?;
        if let Some(c) = &d.current {
            return Err(rd.err(
                Some(c.span()),
                &format!("{p}.current"),
                "a series-resistor drive takes `series`, not `current`".into(),
            ));
        }
        DriveSpec::SeriesResistor {
            rail,
            series_ohm: rd.sizable(series, &format!("{p}.series"), Dimension::Resistance)?,
        }
    } else {
        let current = rd.required(
            &d.current,
            &format!("{p}.current"),
            Some(d.kind.span()),
            "the drive current, e.g. current = \"50 mA\" or current = \"auto\"",
        )?;
        if let Some(c) = &d.series {
            return Err(rd.err(
                Some(c.span()),
                &format!("{p}.series"),
                "a constant-current drive takes `current`, not `series`".into(),
            ));
        }
        if let Some(c) = &d.rail {
            return Err(rd.err(
                Some(c.span()),
                &format!("{p}.rail"),
                "a constant-current drive takes no rail".into(),
            ));
        }
        DriveSpec::ConstantCurrent {
            current_a: rd.sizable(current, &format!("{p}.current"), Dimension::Current)?,
        }
    };
    let sized = matches!(
        drive,
        DriveSpec::SeriesResistor {
            series_ohm: Sizable::Auto,
            ..
        } | DriveSpec::ConstantCurrent {
            current_a: Sizable::Auto
        }
    );
    let overheat = read_overheat(rd, &d.overheat_rise, &d.overheat_ratio, p)?;
    if sized && overheat.is_none() {
        return Err(rd.err(
            Some(d.kind.span()),
            "drive",
            "the drive is \"auto\", so it needs a wanted still-air overheat: overheat_rise = \"80 K\" or overheat_ratio = 0.3".into(),
        ));
    }
    if !sized {
        if let Some(v) = d.overheat_rise.as_ref().or(d.overheat_ratio.as_ref()) {
            return Err(rd.err(
                Some(v.span()),
                p,
                "an overheat target is only used when the drive is \"auto\"".into(),
            ));
        }
    }
    let default_tol = match drive {
        DriveSpec::SeriesResistor { .. } => e_series.tolerance(),
        DriveSpec::ConstantCurrent { .. } => 0.0,
    };
    let drive_tolerance = rd.or_default(
        &d.tolerance,
        default_tol,
        &format!(
            "{p}.tolerance not given: ±{} % assumed",
            default_tol * 100.0
        ),
        |r, v| r.fraction_in(v, &format!("{p}.tolerance"), 0.0, 0.5),
    )?;
    Ok(DriveChoice {
        drive,
        overheat,
        tolerance: drive_tolerance,
    })
}

/// Background airflow of a closed room when the file gives none, m/s:
/// ISO 7730 treats mean air speeds at or below 0.05 m/s as causing no
/// draught (its draught-rate formula uses 0.05 m/s for anything lower).
pub const DEFAULT_BACKGROUND_AIRFLOW_M_PER_S: f64 = 0.05;

/// Half-width of the default trip band as a share of the target (draftwire's
/// own default, no source).
pub const DEFAULT_BAND_SHARE: f64 = 0.3;

/// Trimmer track tolerance when the file gives none: ±20 % (typical of
/// cermet trimmers of the single-turn class; common practice, no source).
pub const DEFAULT_TRIMMER_TOLERANCE: f64 = 0.2;

/// The airflow at which the output must stay idle: (normal, background).
/// A rising trip uses the background airflow (room air) for both; a
/// falling trip its normal running airflow.
fn quiet_airflows(
    rd: &mut Reader<'_>,
    t: &raw::RawDetector,
    trip_on: TripDirection,
    trip_airflow_m_per_s: f64,
) -> R<(f64, f64)> {
    match trip_on {
        TripDirection::Rising => {
            if let Some(v) = &t.normal_airflow {
                return Err(rd.err(
                    Some(v.span()),
                    "detector.normal_airflow",
                    "a detector that trips on rising airflow is idle in room air: give detector.background_airflow (the airflow always present) instead of normal_airflow".into(),
                ));
            }
            let u = match &t.background_airflow {
                Some(v) => {
                    rd.non_negative(v, "detector.background_airflow", Dimension::Velocity)?
                }
                None => {
                    rd.assumptions.push(format!(
                        "detector.background_airflow not given: {DEFAULT_BACKGROUND_AIRFLOW_M_PER_S} m/s of room air is always present (ISO 7730 counts mean air speeds up to 0.05 m/s as no draught)"
                    ));
                    DEFAULT_BACKGROUND_AIRFLOW_M_PER_S
                }
            };
            Ok((u, u))
        }
        TripDirection::Falling => {
            if let Some(v) = &t.background_airflow {
                return Err(rd.err(
                    Some(v.span()),
                    "detector.background_airflow",
                    "a detector that trips on falling airflow is idle at its running airflow: give detector.normal_airflow instead of background_airflow".into(),
                ));
            }
            let u = match &t.normal_airflow {
                Some(v) => {
                    let u = rd.non_negative(v, "detector.normal_airflow", Dimension::Velocity)?;
                    if u <= trip_airflow_m_per_s {
                        return Err(rd.err(
                            Some(v.span()),
                            "detector.normal_airflow",
                            format!("a detector that trips on falling airflow needs its normal airflow above the trip airflow ({trip_airflow_m_per_s} m/s), found {u} m/s"),
                        ));
                    }
                    u
                }
                None => {
                    rd.assumptions.push(format!(
                        "detector.normal_airflow not given: twice the trip airflow ({} m/s) taken as the normal running airflow",
                        2.0 * trip_airflow_m_per_s
                    ));
                    2.0 * trip_airflow_m_per_s
                }
            };
            Ok((u, 0.0))
        }
    }
}

/// The trip band, `["low", "high"]`, around the target.
fn trip_band(rd: &mut Reader<'_>, t: &raw::RawDetector, target: f64) -> R<(f64, f64)> {
    let Some(band) = &t.trip_band else {
        let (lo, hi) = (
            (1.0 - DEFAULT_BAND_SHARE) * target,
            (1.0 + DEFAULT_BAND_SHARE) * target,
        );
        rd.assumptions.push(format!(
            "detector.trip_band not given: ±30 % around the target, {} – {} m/s (draftwire's default)",
            crate::quantity::format_sig(lo, 3),
            crate::quantity::format_sig(hi, 3)
        ));
        return Ok((lo, hi));
    };
    let items = band.get_ref();
    if items.len() != 2 {
        return Err(rd.err(
            Some(band.span()),
            "detector.trip_band",
            format!("expected two airflows, low and high, such as [\"0.2 m/s\", \"0.45 m/s\"]; found {} item(s)", items.len()),
        ));
    }
    let lo = rd.non_negative(&items[0], "detector.trip_band", Dimension::Velocity)?;
    let hi = rd.positive(&items[1], "detector.trip_band", Dimension::Velocity)?;
    if !(lo < target && target < hi) {
        return Err(rd.err(
            Some(band.span()),
            "detector.trip_band",
            format!("expected a band with low < trip_airflow ({target} m/s) < high, found {lo} – {hi} m/s"),
        ));
    }
    Ok((lo, hi))
}

/// The airflow where the output must stay idle lies outside the band, on
/// the idle side.
fn check_quiet_outside_band(
    rd: &Reader<'_>,
    t: &raw::RawDetector,
    trip_on: TripDirection,
    band: (f64, f64),
    quiet: f64,
) -> R<()> {
    let (bad, key, value) = match trip_on {
        TripDirection::Rising => (
            quiet >= band.0,
            "detector.background_airflow",
            &t.background_airflow,
        ),
        TripDirection::Falling => (
            quiet <= band.1,
            "detector.normal_airflow",
            &t.normal_airflow,
        ),
    };
    if bad {
        let span = value
            .as_ref()
            .map(|v| v.span())
            .or(t.trip_band.as_ref().map(|b| b.span()));
        return Err(rd.err(
            span,
            key,
            format!(
                "expected the airflow where the output stays idle ({quiet} m/s) {} the trip band ({} – {} m/s)",
                if trip_on == TripDirection::Rising { "below" } else { "above" },
                band.0,
                band.1
            ),
        ));
    }
    Ok(())
}

/// Tolerances of the divider parts: from the E-series for the fixed
/// resistors (IEC 60063 pairs each series with a tolerance), ±20 % for the
/// trimmer track; each may be given.
fn divider_tolerances(
    rd: &mut Reader<'_>,
    t: &raw::RawDetector,
    e_series: ESeries,
) -> R<DividerTolerances> {
    let es = e_series.tolerance();
    let read = |rd: &mut Reader<'_>, v: &Option<Value>, key: &str, default: f64, note: String| {
        rd.or_default(v, default, &note, |r, v| r.fraction_in(v, key, 0.0, 0.5))
    };
    let top = read(
        rd,
        &t.top_tolerance,
        "detector.top_tolerance",
        es,
        String::new(),
    )?;
    let bottom = read(
        rd,
        &t.bottom_tolerance,
        "detector.bottom_tolerance",
        es,
        String::new(),
    )?;
    let trimmer = read(
        rd,
        &t.trimmer_tolerance,
        "detector.trimmer_tolerance",
        DEFAULT_TRIMMER_TOLERANCE,
        String::new(),
    )?;
    if t.top_tolerance.is_none() || t.bottom_tolerance.is_none() || t.trimmer_tolerance.is_none() {
        rd.assumptions.push(format!(
            "divider tolerances not all given: fixed resistors ±{} % (the {} series), trimmer track ±{} % (common practice) unless stated",
            crate::quantity::format_sig(100.0 * es, 3),
            e_series.name(),
            crate::quantity::format_sig(100.0 * DEFAULT_TRIMMER_TOLERANCE, 3)
        ));
    }
    Ok(DividerTolerances {
        top,
        trimmer,
        bottom,
    })
}

/// Full-temperature-range limits of the open-collector comparator class
/// next to its 25 °C limits (class data sheets, electrical characteristics
/// at V+ = 5 V, 25 °C and full-range rows): offset 5 → 9 mV, bias 250 →
/// 400 nA, output low at 4 mA 0.4 → 0.7 V, common mode to V+ − 1.5 V →
/// V+ − 2 V.
pub const CLASS_25C: ComparatorLimits = ComparatorLimits {
    offset_v: 5e-3,
    bias_a: 250e-9,
    common_mode_headroom_v: 1.5,
    output_low_v: 0.4,
};

/// See [`CLASS_25C`].
pub const CLASS_FULL_RANGE: ComparatorLimits = ComparatorLimits {
    offset_v: 9e-3,
    bias_a: 400e-9,
    common_mode_headroom_v: 2.0,
    output_low_v: 0.7,
};

/// The full-range limits: as given, or the given 25 °C figure widened as the
/// class widens it (offset ×1.8, bias ×1.6, output low ×1.75, headroom
/// +0.5 V), recorded as an assumption.
fn comparator_full_range(
    rd: &mut Reader<'_>,
    c: &raw::RawComparator,
    at_25c: &ComparatorLimits,
) -> R<ComparatorLimits> {
    let (f, t) = (CLASS_FULL_RANGE, CLASS_25C);
    let mut widened = Vec::new();
    // (key, the file's value, dimension, unit, the class-widened default)
    let mut one =
        |v: &Option<Value>, key: &str, dim: Dimension, unit: &str, default: f64| -> R<f64> {
            match v {
                Some(v) => rd.non_negative(v, &format!("comparator.{key}"), dim),
                None => {
                    widened.push(format!(
                        "{key} {}",
                        crate::quantity::format_engineering(default, unit, 3)
                    ));
                    Ok(default)
                }
            }
        };
    let offset_v = one(
        &c.offset_full_range,
        "offset_full_range",
        Dimension::Voltage,
        "V",
        at_25c.offset_v * f.offset_v / t.offset_v,
    )?;
    let bias_a = one(
        &c.bias_current_full_range,
        "bias_current_full_range",
        Dimension::Current,
        "A",
        at_25c.bias_a * f.bias_a / t.bias_a,
    )?;
    let output_low_v = one(
        &c.output_low_full_range,
        "output_low_full_range",
        Dimension::Voltage,
        "V",
        at_25c.output_low_v * f.output_low_v / t.output_low_v,
    )?;
    let common_mode_headroom_v = one(
        &c.common_mode_headroom_full_range,
        "common_mode_headroom_full_range",
        Dimension::Voltage,
        "V",
        at_25c.common_mode_headroom_v + f.common_mode_headroom_v - t.common_mode_headroom_v,
    )?;
    if !widened.is_empty() {
        rd.assumptions.push(format!(
            "comparator full-temperature-range limits not given, widened from the 25 °C figures as the open-collector class widens them: {}",
            widened.join(", ")
        ));
    }
    Ok(ComparatorLimits {
        offset_v,
        bias_a,
        common_mode_headroom_v,
        output_low_v,
    })
}

/// Maximum junction temperature of a small-signal silicon transistor when
/// the file gives none: 150 °C (class data sheets: "operating and storage
/// junction temperature −55 to +150 °C"; memory).
pub const DEFAULT_TRANSISTOR_MAX_JUNCTION_K: f64 = 423.15;

fn build_comparator(
    rd: &mut Reader<'_>,
    c: Option<&raw::RawComparator>,
    default_rail: Rail,
    has_reg: bool,
    ambient: &Ambient,
) -> R<ComparatorSpec> {
    // Typical figures of the open-collector comparator class (no specific
    // part): offset 5 mV, bias 250 nA, common mode 0 … V+ − 1.5 V, sink
    // 4 mA at 0.4 V (the class specifies its 0.4 V low level at 4 mA), supply 2–36 V, 1 mA supply current.
    let empty = raw::RawComparator {
        rail: None,
        offset: None,
        bias_current: None,
        common_mode_low: None,
        common_mode_headroom: None,
        sink_max: None,
        output_low: None,
        supply_min: None,
        supply_max: None,
        supply_current: None,
        pullup: None,
        offset_full_range: None,
        bias_current_full_range: None,
        common_mode_headroom_full_range: None,
        output_low_full_range: None,
    };
    let typical = crate::circuit::comparator::ComparatorParams::typical_open_collector();
    let section_given = c.is_some();
    if !section_given {
        rd.assumptions.push("no [comparator] section: typical open-collector comparator figures used (offset 5 mV, bias 250 nA, common mode 0 V to V+ − 1.5 V, sink 4 mA at 0.4 V, supply 2–36 V, 1 mA)".into());
    }
    let c = c.unwrap_or(&empty);
    let rail = match &c.rail {
        Some(w) => rd.rail(w, "comparator.rail", has_reg)?,
        None => {
            rd.assumptions.push(format!(
                "comparator.rail not given: the comparator is fed from the {} rail, like the reference",
                default_rail.name()
            ));
            default_rail
        }
    };
    let field = |rd: &mut Reader<'_>,
                 v: &Option<Value>,
                 name: &str,
                 dim: Dimension,
                 typical: f64,
                 shown: &str|
     -> R<f64> {
        let full = format!("comparator.{name}");
        match v {
            Some(v) => rd.non_negative(v, &full, dim),
            None => {
                if section_given {
                    rd.assumptions.push(format!("{full} not given: {shown} assumed (typical of the open-collector comparator class)"));
                }
                Ok(typical)
            }
        }
    };
    let offset_v = field(rd, &c.offset, "offset", Dimension::Voltage, 5e-3, "5 mV")?;
    let bias_a = field(
        rd,
        &c.bias_current,
        "bias_current",
        Dimension::Current,
        250e-9,
        "250 nA",
    )?;
    let common_mode_low_v = field(
        rd,
        &c.common_mode_low,
        "common_mode_low",
        Dimension::Voltage,
        0.0,
        "0 V",
    )?;
    let common_mode_headroom_v = field(
        rd,
        &c.common_mode_headroom,
        "common_mode_headroom",
        Dimension::Voltage,
        1.5,
        "1.5 V",
    )?;
    let sink_max_a = field(
        rd,
        &c.sink_max,
        "sink_max",
        Dimension::Current,
        typical.output_sink_max_a,
        "4 mA",
    )?;
    let output_low_v = field(
        rd,
        &c.output_low,
        "output_low",
        Dimension::Voltage,
        0.4,
        "0.4 V",
    )?;
    let supply_min_v = field(
        rd,
        &c.supply_min,
        "supply_min",
        Dimension::Voltage,
        2.0,
        "2 V",
    )?;
    let supply_max_v = field(
        rd,
        &c.supply_max,
        "supply_max",
        Dimension::Voltage,
        36.0,
        "36 V",
    )?;
    let supply_current_a = field(
        rd,
        &c.supply_current,
        "supply_current",
        Dimension::Current,
        1e-3,
        "1 mA",
    )?;
    let pullup_ohm = match &c.pullup {
        Some(v) => rd.sizable(v, "comparator.pullup", Dimension::Resistance)?,
        None => Sizable::Auto,
    };
    let at_25c = ComparatorLimits {
        offset_v,
        bias_a,
        common_mode_headroom_v,
        output_low_v,
    };
    let full_range = comparator_full_range(rd, c, &at_25c)?;
    // The 25 °C limits hold near room temperature; outside 20–30 °C the
    // data sheet's full-range limits apply (draftwire's window).
    let basis = if ambient.min_k >= 293.15 && ambient.max_k <= 303.15 {
        LimitsBasis::At25C
    } else {
        LimitsBasis::FullRange
    };
    let used = match basis {
        LimitsBasis::At25C => at_25c,
        LimitsBasis::FullRange => full_range,
    };
    Ok(ComparatorSpec {
        rail,
        offset_v: used.offset_v,
        bias_a: used.bias_a,
        common_mode_low_v,
        common_mode_headroom_v: used.common_mode_headroom_v,
        sink_max_a,
        output_low_v: used.output_low_v,
        supply_min_v,
        supply_max_v,
        supply_current_a,
        pullup_ohm,
        at_25c,
        full_range,
        basis,
    })
}

fn build_output(
    rd: &mut Reader<'_>,
    o: &raw::RawOutput,
    has_reg: bool,
    comparator: &ComparatorSpec,
    supply: &Supply,
) -> R<OutputSpec> {
    // `None` stands for "auto", resolved below once the load is known.
    let stage = match &o.stage {
        None => None,
        Some(w) => match rd.word(
            w,
            "output.stage",
            &["auto", "direct", "npn-low-side", "pnp-high-side"],
        )? {
            "auto" => None,
            "direct" => Some(StageKind::Direct),
            "npn-low-side" => Some(StageKind::NpnLowSide),
            _ => Some(StageKind::PnpHighSide),
        },
    };
    let near = Some(o.load.span());
    let load = match rd.word(&o.load, "output.load", &["led", "buzzer", "relay"])? {
        "led" => Load::Led {
            // An indicator LED: 0.5–10 V forward (infrared to a few LEDs in
            // series), 1 µA–1 A (draftwire's ranges, no source).
            forward_v: rd.positive_within(
                rd.required(
                    &o.led_forward,
                    "output.led_forward",
                    near.clone(),
                    "the LED forward voltage, e.g. led_forward = \"2.0 V\"",
                )?,
                "output.led_forward",
                Dimension::Voltage,
                0.5,
                10.0,
            )?,
            current_a: rd.positive_within(
                rd.required(
                    &o.led_current,
                    "output.led_current",
                    near,
                    "the wanted LED current, e.g. led_current = \"5 mA\"",
                )?,
                "output.led_current",
                Dimension::Current,
                1e-6,
                1.0,
            )?,
        },
        "buzzer" => Load::Buzzer {
            current_a: rd.positive(
                rd.required(
                    &o.buzzer_current,
                    "output.buzzer_current",
                    near,
                    "the buzzer current at its rated voltage, e.g. buzzer_current = \"25 mA\"",
                )?,
                "output.buzzer_current",
                Dimension::Current,
            )?,
        },
        _ => Load::Relay {
            coil_v: rd.positive(
                rd.required(
                    &o.coil_voltage,
                    "output.coil_voltage",
                    near.clone(),
                    "the relay coil's rated voltage, e.g. coil_voltage = \"12 V\"",
                )?,
                "output.coil_voltage",
                Dimension::Voltage,
            )?,
            coil_ohm: rd.positive(
                rd.required(
                    &o.coil_resistance,
                    "output.coil_resistance",
                    near,
                    "the relay coil resistance, e.g. coil_resistance = \"400 ohm\"",
                )?,
                "output.coil_resistance",
                Dimension::Resistance,
            )?,
            contact_rating: o.contact_rating.as_ref().map(|w| w.get_ref().clone()),
            switches_mains: o.switches_mains.as_ref().is_some_and(|b| *b.get_ref()),
        },
    };
    let rail = match &o.rail {
        Some(w) => rd.rail(w, "output.rail", has_reg)?,
        None => {
            rd.assumptions
                .push("output.rail not given: the load is fed from the input rail".into());
            Rail::Input
        }
    };
    // Keys that belong to another load are an error, not silently ignored.
    let load_name = match load {
        Load::Led { .. } => "led",
        Load::Buzzer { .. } => "buzzer",
        Load::Relay { .. } => "relay",
    };
    let foreign: [(&str, &str, Option<std::ops::Range<usize>>); 7] = [
        (
            "led_forward",
            "led",
            o.led_forward.as_ref().map(|v| v.span()),
        ),
        (
            "led_current",
            "led",
            o.led_current.as_ref().map(|v| v.span()),
        ),
        (
            "buzzer_current",
            "buzzer",
            o.buzzer_current.as_ref().map(|v| v.span()),
        ),
        (
            "coil_resistance",
            "relay",
            o.coil_resistance.as_ref().map(|v| v.span()),
        ),
        (
            "coil_voltage",
            "relay",
            o.coil_voltage.as_ref().map(|v| v.span()),
        ),
        (
            "contact_rating",
            "relay",
            o.contact_rating.as_ref().map(|v| v.span()),
        ),
        (
            "switches_mains",
            "relay",
            o.switches_mains.as_ref().map(|v| v.span()),
        ),
    ];
    for (key, owner, span) in foreign {
        if let Some(span) = span {
            if owner != load_name {
                return Err(rd.err(
                    Some(span),
                    &format!("output.{key}"),
                    format!(
                        "`{key}` belongs to a {owner} load, but this output drives a {load_name}"
                    ),
                ));
            }
        }
    }
    if load_name != "relay" && o.diode.is_some() {
        return Err(rd.err(
            Some(o.load.span()),
            "output.diode",
            format!("a flyback diode is only fitted across a relay coil, but this output drives a {load_name}"),
        ));
    }
    // `auto` picks the simplest stage within ratings: the comparator output
    // directly when an LED or buzzer current is within its sink limit,
    // otherwise an NPN low-side switch (a relay coil always gets a switch).
    let stage = if let Some(stage) = stage {
        stage
    } else {
        let rail_v = supply.rail_v(rail);
        let (load_a, what) = match load {
            Load::Led { current_a, .. } => (current_a, "LED"),
            Load::Buzzer { current_a } => (current_a, "buzzer"),
            Load::Relay { coil_ohm, .. } => (rail_v / coil_ohm, "relay coil"),
        };
        let direct = load_a <= comparator.sink_max_a && load_name != "relay";
        rd.assumptions.push(format!(
            "output.stage \"auto\": {} ({what} current {:.1} mA against the comparator's {:.1} mA sink limit)",
            if direct { "the comparator output drives the load directly" } else { "an NPN low-side switch" },
            load_a * 1e3,
            comparator.sink_max_a * 1e3
        ));
        if direct {
            StageKind::Direct
        } else {
            StageKind::NpnLowSide
        }
    };
    if stage == StageKind::Direct {
        if let Some(v) = &o.forced_gain {
            return Err(rd.err(Some(v.span()), "output.forced_gain", "a forced gain applies to a transistor stage, but the comparator drives this load directly".into()));
        }
        if o.transistor.is_some() {
            return Err(rd.err(Some(o.load.span()), "output.transistor", "transistor figures apply to a transistor stage, but the comparator drives this load directly".into()));
        }
    }
    let gain_note = if stage == StageKind::Direct {
        ""
    } else {
        "output.forced_gain not given: 10 (common practice for a saturated switch)"
    };
    let forced_gain = rd.or_default(&o.forced_gain, 10.0, gain_note, |r, v| {
        let x = r.quantity(v, "output.forced_gain", Dimension::Fraction)?;
        if (2.0..=50.0).contains(&x) {
            Ok(x)
        } else {
            Err(r.err(
                Some(v.span()),
                "output.forced_gain",
                format!("expected a forced gain between 2 and 50, found {x}"),
            ))
        }
    })?;
    // Typical small-signal transistor class figures (no specific part).
    let transistor = match &o.transistor {
        None => {
            if stage != StageKind::Direct {
                rd.assumptions.push("no [output.transistor]: typical small-signal transistor figures used (Vce 40 V, Ic 200 mA, 500 mW, hFE ≥ 100, Vce(sat) 0.3 V, Vbe 0.7 V)".into());
            }
            {
                let t = crate::circuit::switch::TransistorRatings::typical_small_signal();
                TransistorSpec {
                    vce_max_v: t.vce_max_v,
                    ic_max_a: t.ic_max_a,
                    power_max_w: t.p_max_w,
                    hfe_min: t.hfe_min,
                    vce_sat_v: t.vce_sat_v,
                    vbe_on_v: t.vbe_on_v,
                    max_junction_k: DEFAULT_TRANSISTOR_MAX_JUNCTION_K,
                }
            }
        }
        Some(t) => {
            let g = |rd: &Reader, v: &Option<Value>, name: &str, dim: Dimension| -> R<f64> {
                let full = format!("output.transistor.{name}");
                rd.positive(
                    rd.required(
                        v,
                        &full,
                        None,
                        "every transistor figure when the section is given",
                    )?,
                    &full,
                    dim,
                )
            };
            TransistorSpec {
                vce_max_v: g(rd, &t.vce_max, "vce_max", Dimension::Voltage)?,
                ic_max_a: g(rd, &t.ic_max, "ic_max", Dimension::Current)?,
                power_max_w: g(rd, &t.power_max, "power_max", Dimension::Power)?,
                hfe_min: g(rd, &t.hfe_min, "hfe_min", Dimension::Fraction)?,
                vce_sat_v: g(rd, &t.vce_sat, "vce_sat", Dimension::Voltage)?,
                vbe_on_v: g(rd, &t.vbe_on, "vbe_on", Dimension::Voltage)?,
                max_junction_k: rd.or_default(
                    &t.max_junction,
                    DEFAULT_TRANSISTOR_MAX_JUNCTION_K,
                    "output.transistor.max_junction not given: 150 °C (typical of small-signal silicon transistors); the power rating derates linearly to zero there from 25 °C",
                    |r, v| {
                        let t = r.quantity(v, "output.transistor.max_junction", Dimension::Temperature)?;
                        if t > 298.15 + 1.0 {
                            Ok(t)
                        } else {
                            Err(r.err(Some(v.span()), "output.transistor.max_junction", format!("expected a junction limit above 26 °C, found {:.1} °C", t - 273.15)))
                        }
                    },
                )?,
            }
        }
    };
    let diode = match &o.diode {
        None => {
            if matches!(load, Load::Relay { .. }) {
                rd.assumptions.push("no [output.diode]: typical general-purpose rectifier figures used (400 V, 1 A)".into());
            }
            DiodeSpec {
                reverse_max_v: 400.0,
                forward_max_a: 1.0,
            }
        }
        Some(d) => DiodeSpec {
            reverse_max_v: rd.positive(
                rd.required(
                    &d.reverse_max,
                    "output.diode.reverse_max",
                    None,
                    "the diode's reverse voltage rating",
                )?,
                "output.diode.reverse_max",
                Dimension::Voltage,
            )?,
            forward_max_a: rd.positive(
                rd.required(
                    &d.forward_max,
                    "output.diode.forward_max",
                    None,
                    "the diode's forward current rating",
                )?,
                "output.diode.forward_max",
                Dimension::Current,
            )?,
        },
    };
    Ok(OutputSpec {
        stage,
        load,
        rail,
        forced_gain,
        transistor,
        diode,
    })
}
