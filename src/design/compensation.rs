//! `[compensation]`: which ambient compensation the reference gets, and the
//! compensating parts' figures, each read with its unit and checked against
//! a plausible range (docs/design-file.md lists them).

use super::model::{CompensationKind, CompensationSpec, Sizable, ThermistorSpec, TwinSpec};
use super::raw::{RawCompensation, Value};
use super::reader::{Reader, R};
use crate::quantity::Dimension;

/// Largest twin self-heating rise when the file gives none: 2 % of the
/// sensing element's overheat (the limit the compensation issue states;
/// draftwire's choice, no source).
pub const DEFAULT_TWIN_MAX_RISE: f64 = 0.02;

/// Beta constant when the file gives none: 3950 K, a common value of
/// generic 10 kΩ NTC discs and chips (generic NTC data sheets list
/// 3380–4100 K; common practice, no source for the choice).
pub const DEFAULT_THERMISTOR_BETA_K: f64 = 3950.0;

/// R25 and beta tolerance when the file gives none: ±1 %, the tightest
/// common class of generic NTC data sheets (R25 in ±1/2/3/5 % classes,
/// B25/85 ±1 %).
pub const DEFAULT_THERMISTOR_TOLERANCE: f64 = 0.01;

/// Dissipation constant when the file gives none: 1 mW/K, the low end of
/// generic small NTCs in still air (0402 chips about 1 mW/K, leaded discs
/// 1–4 mW/K; MIL-PRF-23648 defines the figure). The low end over-states the
/// self-heating, which is the safe side.
pub const DEFAULT_THERMISTOR_DISSIPATION_W_PER_K: f64 = 1e-3;

/// The settings when the file has no `[compensation]`: none.
pub fn defaults(element_tolerance: f64) -> CompensationSpec {
    CompensationSpec {
        kind: CompensationKind::None,
        twin: TwinSpec {
            resistance_ohm: Sizable::Auto,
            tolerance: element_tolerance,
            max_rise_share: DEFAULT_TWIN_MAX_RISE,
        },
        thermistor: ThermistorSpec {
            r25_ohm: Sizable::Auto,
            beta_k: DEFAULT_THERMISTOR_BETA_K,
            r25_tolerance: DEFAULT_THERMISTOR_TOLERANCE,
            beta_tolerance: DEFAULT_THERMISTOR_TOLERANCE,
            dissipation_w_per_k: DEFAULT_THERMISTOR_DISSIPATION_W_PER_K,
            linearising_ohm: Sizable::Auto,
        },
    }
}

/// A value within `[lo, hi]` (SI) or an error at it.
fn within(rd: &Reader<'_>, v: &Value, field: &str, dim: Dimension, lo: f64, hi: f64) -> R<f64> {
    let x = rd.positive(v, field, dim)?;
    if (lo..=hi).contains(&x) {
        Ok(x)
    } else {
        Err(rd.err(
            Some(v.span()),
            field,
            format!(
                "expected {} between {} and {}, found {}",
                dim.name(),
                crate::quantity::format_engineering(lo, dim.si_unit(), 3),
                crate::quantity::format_engineering(hi, dim.si_unit(), 3),
                crate::quantity::format_engineering(x, dim.si_unit(), 4)
            ),
        ))
    }
}

/// A sizable resistance within 10 mΩ … 10 MΩ.
fn sizable_ohm(rd: &Reader<'_>, v: &Value, field: &str) -> R<Sizable> {
    match rd.sizable(v, field, Dimension::Resistance)? {
        Sizable::Auto => Ok(Sizable::Auto),
        Sizable::Fixed(_) => {
            within(rd, v, field, Dimension::Resistance, 0.01, 10e6).map(Sizable::Fixed)
        }
    }
}

/// Read `[compensation]`.
pub(crate) fn build_compensation(
    rd: &mut Reader<'_>,
    c: Option<&RawCompensation>,
    element_tolerance: f64,
) -> R<CompensationSpec> {
    let mut spec = defaults(element_tolerance);
    let Some(c) = c else {
        return Ok(spec);
    };
    spec.kind = match &c.kind {
        None => {
            rd.assumptions
                .push("compensation.kind not given: no compensation".into());
            CompensationKind::None
        }
        Some(w) => match rd.word(
            w,
            "compensation.kind",
            &["none", "twin", "thermistor", "auto"],
        )? {
            "twin" => CompensationKind::Twin,
            "thermistor" => CompensationKind::Thermistor,
            "auto" => CompensationKind::Auto,
            _ => CompensationKind::None,
        },
    };
    let t = &mut spec.twin;
    if let Some(v) = &c.twin_resistance {
        t.resistance_ohm = sizable_ohm(rd, v, "compensation.twin_resistance")?;
    }
    if let Some(v) = &c.twin_tolerance {
        t.tolerance = rd.fraction_in(v, "compensation.twin_tolerance", 0.0, 0.2)?;
    }
    if let Some(v) = &c.twin_max_rise {
        t.max_rise_share = rd.fraction_in(v, "compensation.twin_max_rise", 0.001, 0.2)?;
    }
    let n = &mut spec.thermistor;
    if let Some(v) = &c.thermistor_r25 {
        n.r25_ohm = sizable_ohm(rd, v, "compensation.thermistor_r25")?;
    }
    if let Some(v) = &c.thermistor_beta {
        n.beta_k = within(
            rd,
            v,
            "compensation.thermistor_beta",
            Dimension::TemperatureDifference,
            1000.0,
            10000.0,
        )?;
    }
    if let Some(v) = &c.thermistor_tolerance {
        n.r25_tolerance = rd.fraction_in(v, "compensation.thermistor_tolerance", 0.0, 0.2)?;
    }
    if let Some(v) = &c.thermistor_beta_tolerance {
        n.beta_tolerance = rd.fraction_in(v, "compensation.thermistor_beta_tolerance", 0.0, 0.1)?;
    }
    if let Some(v) = &c.thermistor_dissipation {
        n.dissipation_w_per_k = within(
            rd,
            v,
            "compensation.thermistor_dissipation",
            Dimension::ThermalConductance,
            1e-4,
            0.1,
        )?;
    }
    if let Some(v) = &c.linearising {
        n.linearising_ohm = sizable_ohm(rd, v, "compensation.linearising")?;
    }
    Ok(spec)
}
