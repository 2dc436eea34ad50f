//! Standard component ratings and the derating applied to them.

use thiserror::Error;

use super::value::{finite, non_negative, ValueError};

/// Common power ratings of fixed resistors, W, ascending (common practice,
/// no source).
pub const STANDARD_RESISTOR_POWER_W: &[f64] =
    &[0.063, 0.1, 0.125, 0.25, 0.5, 0.6, 1.0, 2.0, 3.0, 5.0];

/// A power rating as builders buy it: the through-hole fractions (1/16 W,
/// 1/10 W, 1/8 W, 1/4 W, 1/2 W) and whole watts; other values in W with
/// three significant figures.
pub fn bench_power_text(w: f64) -> String {
    const FRACTIONS: [(f64, &str); 5] = [
        (0.0625, "1/16 W"),
        (0.1, "1/10 W"),
        (0.125, "1/8 W"),
        (0.25, "1/4 W"),
        (0.5, "1/2 W"),
    ];
    // The standard list writes 1/16 W as 0.063 W.
    for (v, text) in FRACTIONS {
        if (w - v).abs() <= 0.01 * v {
            return text.into();
        }
    }
    if w >= 1.0 && (w - w.round()).abs() < 1e-9 {
        return format!("{} W", w.round());
    }
    format!("{} W", crate::quantity::format_sig(w, 3))
}

/// Share of the (temperature-derated) rating a resistor is run at, at most:
/// 50 % (common practice, no source; 50–60 % is the usual figure).
pub const DEFAULT_RESISTOR_DERATING: f64 = 0.5;

/// Ambient temperature up to which a film resistor carries its full rating,
/// 70 °C = 343.15 K (MIL-PRF-39017 film resistors: "capable of full-load
/// operation at an ambient temperature of 70 °C", scope of the
/// specification).
pub const FILM_FULL_POWER_TO_K: f64 = 343.15;

/// Ambient temperature at which the film-resistor rating has fallen
/// linearly to zero, 155 °C = 428.15 K: the upper category temperature of
/// common metal-film resistors (common practice, no source; the
/// MIL-PRF-39017 curve itself ends near 150 °C, memory).
pub const FILM_ZERO_POWER_AT_K: f64 = 428.15;

/// Trimmer values, 1-2-5 sequence from 100 Ω to 1 MΩ (common practice, no
/// source).
pub const STANDARD_TRIMMER_OHM: &[f64] = &[
    100.0, 200.0, 500.0, 1e3, 2e3, 5e3, 10e3, 20e3, 50e3, 100e3, 200e3, 500e3, 1e6,
];

/// Power rating assumed for a small trimmer when none is entered, W: the
/// low end of the usual 0.1–0.5 W (common practice, no source).
pub const TYPICAL_TRIMMER_POWER_W: f64 = 0.1;

/// Common capacitor voltage ratings, V, ascending (common practice, no
/// source).
pub const STANDARD_CAPACITOR_V: &[f64] = &[6.3, 10.0, 16.0, 25.0, 35.0, 50.0, 63.0, 100.0];

/// Least ratio of capacitor voltage rating to the rail, 1.5 (common
/// practice, no source: 1.5–2× the rail).
pub const DEFAULT_CAPACITOR_VOLTAGE_MARGIN: f64 = 1.5;

/// Why a rating cannot be chosen or checked.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
pub enum RatingError {
    /// A parameter is not finite, not positive or negative where it must
    /// not be.
    #[error(transparent)]
    Value(#[from] ValueError),
    /// A derating or engaged fraction is outside (0, 1].
    #[error("{name} must be in (0, 1], got {value}")]
    Fraction {
        /// Parameter name.
        name: &'static str,
        /// Offending value.
        value: f64,
    },
    /// A margin factor below 1.
    #[error("margin_factor must be >= 1, got {0}")]
    MarginFactor(f64),
    /// The ambient is at or above the zero-power temperature.
    #[error("ambient {ambient_k} K is at or above the zero-power temperature {zero_k} K")]
    TooHot {
        /// Ambient temperature, K.
        ambient_k: f64,
        /// Zero-power temperature, K.
        zero_k: f64,
    },
    /// No standard value is large enough.
    #[error("needed {needed} exceeds the largest standard value {largest}")]
    NoStandardValue {
        /// Value needed (W, V or Ω).
        needed: f64,
        /// Largest value in the series.
        largest: f64,
    },
}

fn fraction(name: &'static str, value: f64) -> Result<f64, RatingError> {
    if value.is_finite() && value > 0.0 && value <= 1.0 {
        Ok(value)
    } else {
        Err(RatingError::Fraction { name, value })
    }
}

/// Smallest entry of an ascending series at or above `needed`.
fn at_or_above(series: &[f64], needed: f64) -> Result<f64, RatingError> {
    series
        .iter()
        .copied()
        .find(|&v| v >= needed)
        .ok_or(RatingError::NoStandardValue {
            needed,
            largest: series.last().copied().unwrap_or(0.0),
        })
}

/// Fraction of its rated power a film resistor may carry at `ambient_k`:
/// 1 up to [`FILM_FULL_POWER_TO_K`], falling linearly to 0 at
/// [`FILM_ZERO_POWER_AT_K`], 0 above (MIL-PRF-39017-style curve, see the
/// constants).
pub fn film_temperature_derating(ambient_k: f64) -> Result<f64, RatingError> {
    finite("ambient_k", ambient_k)?;
    Ok(
        ((FILM_ZERO_POWER_AT_K - ambient_k) / (FILM_ZERO_POWER_AT_K - FILM_FULL_POWER_TO_K))
            .clamp(0.0, 1.0),
    )
}

/// Smallest standard resistor power rating P_r with
/// `dissipation_w ≤ derating · f(T_a) · P_r`, f the film temperature
/// derating. `derating` is the share of the derated rating allowed, e.g.
/// [`DEFAULT_RESISTOR_DERATING`].
pub fn resistor_rating_for(
    dissipation_w: f64,
    ambient_k: f64,
    derating: f64,
) -> Result<f64, RatingError> {
    let p = non_negative("dissipation_w", dissipation_w)?;
    let d = fraction("derating", derating)?;
    let f = film_temperature_derating(ambient_k)?;
    if f <= 0.0 {
        return Err(RatingError::TooHot {
            ambient_k,
            zero_k: FILM_ZERO_POWER_AT_K,
        });
    }
    at_or_above(STANDARD_RESISTOR_POWER_W, p / (d * f))
}

/// A resistor's power check.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ResistorMargin {
    /// Power allowed, `derating · f(T_a) · rating`, W.
    pub allowed_w: f64,
    /// `allowed_w − dissipation_w`, W (negative: overloaded).
    pub margin_w: f64,
    /// Dissipation as a share of the temperature-derated rating,
    /// `P / (f(T_a)·rating)` (infinite when the derated rating is 0).
    pub load_fraction: f64,
    /// True when `margin_w ≥ 0`.
    pub ok: bool,
}

/// Check a resistor of rating `rating_w` dissipating `dissipation_w` at
/// `ambient_k` against `derating` × its temperature-derated rating.
pub fn resistor_margin(
    dissipation_w: f64,
    rating_w: f64,
    ambient_k: f64,
    derating: f64,
) -> Result<ResistorMargin, RatingError> {
    let p = non_negative("dissipation_w", dissipation_w)?;
    let r = non_negative("rating_w", rating_w)?;
    let d = fraction("derating", derating)?;
    let derated = film_temperature_derating(ambient_k)? * r;
    let allowed_w = d * derated;
    let margin_w = allowed_w - p;
    Ok(ResistorMargin {
        allowed_w,
        margin_w,
        load_fraction: if derated > 0.0 {
            p / derated
        } else {
            f64::INFINITY
        },
        ok: margin_w >= 0.0,
    })
}

/// Cermet single-turn trimmers carry their rated power up to 70 °C (class
/// data sheets: "0.5 W at +70 °C derated linearly to 0 W at 125 °C").
pub const TRIMMER_FULL_POWER_TO_K: f64 = 343.15;

/// See [`TRIMMER_FULL_POWER_TO_K`]: zero power at 125 °C.
pub const TRIMMER_ZERO_POWER_AT_K: f64 = 398.15;

/// Fraction of its rated power a cermet trimmer may carry at `ambient_k`:
/// 1 up to 70 °C, linearly to 0 at 125 °C (see the constants).
pub fn trimmer_temperature_derating(ambient_k: f64) -> Result<f64, RatingError> {
    finite("ambient_k", ambient_k)?;
    Ok(((TRIMMER_ZERO_POWER_AT_K - ambient_k)
        / (TRIMMER_ZERO_POWER_AT_K - TRIMMER_FULL_POWER_TO_K))
        .clamp(0.0, 1.0))
}

/// [`resistor_margin`] for a trimmer, on the trimmer's own derating curve
/// ([`trimmer_temperature_derating`]).
pub fn trimmer_margin(
    dissipation_w: f64,
    rating_w: f64,
    ambient_k: f64,
    derating: f64,
) -> Result<ResistorMargin, RatingError> {
    let dissipation_w = non_negative("dissipation_w", dissipation_w)?;
    let rating_w = non_negative("rating_w", rating_w)?;
    let derating = fraction("derating", derating)?;
    let derated = trimmer_temperature_derating(ambient_k)? * rating_w;
    let allowed_w = derating * derated;
    let margin_w = allowed_w - dissipation_w;
    Ok(ResistorMargin {
        allowed_w,
        margin_w,
        load_fraction: if derated > 0.0 {
            dissipation_w / derated
        } else {
            f64::INFINITY
        },
        ok: margin_w >= 0.0,
    })
}

/// Power a trimmer may dissipate when only a share of its track carries
/// current: "when only a portion of the resistance element is engaged in
/// the circuit, the power rating is reduced in approximately the same
/// proportion as the resistance" (MIL-PRF-27208F, §3.5). P = rating ×
/// engaged fraction, W.
pub fn trimmer_allowed_power_w(rating_w: f64, engaged_fraction: f64) -> Result<f64, RatingError> {
    Ok(non_negative("rating_w", rating_w)? * fraction("engaged_fraction", engaged_fraction)?)
}

/// Smallest standard trimmer value at or above `ohm`.
pub fn trimmer_at_or_above(ohm: f64) -> Result<f64, RatingError> {
    at_or_above(STANDARD_TRIMMER_OHM, non_negative("ohm", ohm)?)
}

/// Smallest standard capacitor voltage rating at or above
/// `margin_factor · rail_v` (margin ≥ 1; 1.5–2× is common practice).
pub fn capacitor_rating_for(rail_v: f64, margin_factor: f64) -> Result<f64, RatingError> {
    let v = non_negative("rail_v", rail_v.abs())?;
    if !margin_factor.is_finite() || margin_factor < 1.0 {
        return Err(RatingError::MarginFactor(margin_factor));
    }
    at_or_above(STANDARD_CAPACITOR_V, v * margin_factor)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn series_are_ascending() {
        for s in [
            STANDARD_RESISTOR_POWER_W,
            STANDARD_TRIMMER_OHM,
            STANDARD_CAPACITOR_V,
        ] {
            assert!(s.windows(2).all(|w| w[0] < w[1]));
        }
    }

    /// Curve points by hand: 25 °C → 1; 70 °C → 1; 112.5 °C (half-way
    /// between 70 and 155) → 0.5; 155 °C → 0; 200 °C → 0.
    #[test]
    fn film_curve() {
        assert_eq!(film_temperature_derating(298.15).unwrap(), 1.0);
        assert_eq!(film_temperature_derating(343.15).unwrap(), 1.0);
        assert_relative_eq!(
            film_temperature_derating(385.65).unwrap(),
            0.5,
            max_relative = 1e-12
        );
        assert_eq!(film_temperature_derating(428.15).unwrap(), 0.0);
        assert_eq!(film_temperature_derating(473.15).unwrap(), 0.0);
    }

    /// Hand: 0.1 W at 25 °C with 50 % derating needs ≥ 0.2 W → 0.25 W.
    /// 0.1 W at 112.5 °C (f = 0.5) needs ≥ 0.4 W → 0.5 W. 0.26 W at 25 °C
    /// needs 0.52 W → 0.6 W. 3 W needs 6 W → none.
    #[test]
    fn rating_selection() {
        assert_eq!(resistor_rating_for(0.1, 298.15, 0.5).unwrap(), 0.25);
        assert_eq!(resistor_rating_for(0.1, 385.65, 0.5).unwrap(), 0.5);
        assert_eq!(resistor_rating_for(0.26, 298.15, 0.5).unwrap(), 0.6);
        assert!(matches!(
            resistor_rating_for(3.0, 298.15, 0.5),
            Err(RatingError::NoStandardValue { .. })
        ));
        assert!(matches!(
            resistor_rating_for(0.01, 430.0, 0.5),
            Err(RatingError::TooHot { .. })
        ));
        assert!(matches!(
            resistor_rating_for(0.01, 300.0, 0.0),
            Err(RatingError::Fraction { .. })
        ));
        assert!(matches!(
            resistor_rating_for(-0.01, 300.0, 0.5),
            Err(RatingError::Value(ValueError::Negative { .. }))
        ));
    }

    /// Hand: a 0.25 W resistor dissipating 0.1 W at 25 °C, 50 % derating:
    /// allowed 0.125 W, margin 0.025 W, load 40 %. At 112.5 °C: allowed
    /// 0.0625 W, margin −0.0375 W, load 80 %.
    #[test]
    fn margins() {
        let m = resistor_margin(0.1, 0.25, 298.15, 0.5).unwrap();
        assert_relative_eq!(m.allowed_w, 0.125, max_relative = 1e-12);
        assert_relative_eq!(m.margin_w, 0.025, max_relative = 1e-12);
        assert_relative_eq!(m.load_fraction, 0.4, max_relative = 1e-12);
        assert!(m.ok);
        let m = resistor_margin(0.1, 0.25, 385.65, 0.5).unwrap();
        assert_relative_eq!(m.margin_w, -0.0375, max_relative = 1e-12);
        assert_relative_eq!(m.load_fraction, 0.8, max_relative = 1e-12);
        assert!(!m.ok);
        let m = resistor_margin(0.01, 0.25, 430.0, 0.5).unwrap();
        assert!(!m.ok && m.load_fraction.is_infinite());
    }

    /// Hand: 0.5 W trimmer with 30 % of its track engaged may take 0.15 W
    /// (MIL-PRF-27208F §3.5 proportional rule). 4.7 kΩ wanted → 5 kΩ;
    /// 1 MΩ → 1 MΩ; 2 MΩ → none.
    #[test]
    fn trimmers() {
        assert_relative_eq!(
            trimmer_allowed_power_w(0.5, 0.3).unwrap(),
            0.15,
            max_relative = 1e-12
        );
        assert_eq!(trimmer_at_or_above(4.7e3).unwrap(), 5e3);
        assert_eq!(trimmer_at_or_above(1e6).unwrap(), 1e6);
        assert!(trimmer_at_or_above(2e6).is_err());
        assert!(trimmer_allowed_power_w(0.5, 1.5).is_err());
    }

    /// Hand: 5 V × 1.5 = 7.5 → 10 V; 12 V × 1.5 = 18 → 25 V; 12 V × 2 = 24
    /// → 25 V; 24 V × 2 = 48 → 50 V; 60 V × 2 = 120 → none.
    #[test]
    fn capacitors() {
        assert_eq!(
            capacitor_rating_for(5.0, DEFAULT_CAPACITOR_VOLTAGE_MARGIN).unwrap(),
            10.0
        );
        assert_eq!(capacitor_rating_for(12.0, 1.5).unwrap(), 25.0);
        assert_eq!(capacitor_rating_for(12.0, 2.0).unwrap(), 25.0);
        assert_eq!(capacitor_rating_for(24.0, 2.0).unwrap(), 50.0);
        assert!(capacitor_rating_for(60.0, 2.0).is_err());
        assert!(matches!(
            capacitor_rating_for(5.0, 0.9),
            Err(RatingError::MarginFactor(_))
        ));
    }

    #[test]
    fn bench_power_names() {
        // The through-hole ratings as sold (common practice, no source).
        assert_eq!(bench_power_text(0.063), "1/16 W");
        assert_eq!(bench_power_text(0.125), "1/8 W");
        assert_eq!(bench_power_text(0.25), "1/4 W");
        assert_eq!(bench_power_text(0.5), "1/2 W");
        assert_eq!(bench_power_text(1.0), "1 W");
        assert_eq!(bench_power_text(0.6), "0.6 W");
    }
}
