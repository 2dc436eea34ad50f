//! A tungsten lamp filament inferred from what a hobbyist knows: the lamp's
//! rating (volts, watts) and its measured cold resistance.
//!
//! Model and its assumptions:
//! 1. At rated voltage the filament's resistance is R_hot = V²/P.
//! 2. Resistance follows tungsten's resistivity (Forsythe & Worthing 1925),
//!    so ρ(T_op)/ρ(T_cold) = R_hot/R_cold fixes the operating temperature.
//! 3. At rated power the filament loses essentially all its power by
//!    radiation to surroundings at the cold temperature (a vacuum lamp):
//!    P = ε(T)·σ·π·d·L·(T⁴ − T_cold⁴) (Stefan–Boltzmann; Incropera et al.,
//!    6th ed., eq. 1.7), with ε from Forsythe & Watson (1934). Gas-filled
//!    lamps also lose some power to the gas, so for them this overstates the
//!    radiating area π·d·L (d and L come out too large).
//! 4. A straight cylinder: R_hot = ρ(T)·4L/(π·d²). Solving 3 and 4 for d and
//!    L is closed form: d·L = P/(ε·σ·π·(T⁴ − T_cold⁴)) and
//!    L/d² = π·R_hot/(4ρ), so d = ∛((d·L)/(L/d²)) and L = (L/d²)·d².
//!
//! See [`coil_note`] for what a coiled filament changes.

use crate::physics::radiation::STEFAN_BOLTZMANN_W_PER_M2_K4;
use crate::physics::tungsten::{self, TungstenError, TungstenWire};

/// Usual operating temperature of small incandescent lamps, K: about
/// 2200–3000 K (common practice, no source).
pub const TYPICAL_OPERATING_RANGE_K: (f64, f64) = (2200.0, 3000.0);

/// Why a lamp rating was rejected or could not be turned into a filament.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum LampError {
    /// Rated voltage must be positive and finite.
    #[error("rated voltage must be positive and finite, got {volts} V")]
    InvalidVoltage {
        /// The offending rated voltage, V.
        volts: f64,
    },
    /// Rated power must be positive and finite.
    #[error("rated power must be positive and finite, got {watts} W")]
    InvalidPower {
        /// The offending rated power, W.
        watts: f64,
    },
    /// Cold resistance must be positive and finite.
    #[error("cold resistance must be positive and finite, got {r_ohm} ohm")]
    InvalidColdResistance {
        /// The offending cold resistance, ohm.
        r_ohm: f64,
    },
    /// Cold temperature must lie where tungsten's resistivity is known.
    #[error("cold temperature {t_k} K is outside [{min_k}, {max_k}] K")]
    ColdTemperatureOutOfRange {
        /// The offending cold temperature, K.
        t_k: f64,
        /// Lowest temperature of the tungsten resistivity table, K.
        min_k: f64,
        /// Highest temperature of the tungsten resistivity table, K.
        max_k: f64,
    },
    /// A filament's resistance must rise when lit: R_hot/R_cold must exceed 1.
    #[error("hot/cold resistance ratio {ratio} must exceed 1 (R_hot = V²/P = {hot_resistance_ohm} ohm); check the rating and the measured cold resistance")]
    ImpossibleRatio {
        /// The hot/cold resistance ratio R_hot/R_cold (dimensionless).
        ratio: f64,
        /// The hot resistance V²/P from the rating, ohm.
        hot_resistance_ohm: f64,
    },
    /// The ratio implies a temperature beyond the resistivity table.
    #[error("hot/cold resistance ratio {ratio} exceeds {max_ratio}, the most tungsten reaches up to 3500 K from this cold temperature")]
    BeyondTable {
        /// The hot/cold resistance ratio R_hot/R_cold (dimensionless).
        ratio: f64,
        /// The largest ratio the table allows from this cold temperature,
        /// ρ(3500 K)/ρ(T_cold) (dimensionless).
        max_ratio: f64,
    },
    /// Tungsten property failure.
    #[error(transparent)]
    Tungsten(#[from] TungstenError),
}

/// A lamp as rated and measured.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LampRating {
    rated_voltage_v: f64,
    rated_power_w: f64,
    cold_resistance_ohm: f64,
    cold_temperature_k: f64,
}

/// How the measured cold resistance compares with typical lamps.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Plausibility {
    /// [`TYPICAL_OPERATING_RANGE_K`].
    pub typical_operating_range_k: (f64, f64),
    /// Cold resistance a filament of the same rating would have if it ran at
    /// the hot, then the cool, end of the typical range:
    /// R_hot·ρ(T_cold)/ρ(T_edge), ohm (low, high).
    pub expected_cold_resistance_range_ohm: (f64, f64),
    /// Whether the measured cold resistance lies in that range (the same as
    /// the inferred operating temperature lying in the typical range).
    pub cold_resistance_in_range: bool,
    /// Relative distance of the measured cold resistance outside the range:
    /// measured/nearest edge − 1 (negative below, positive above, 0 inside).
    pub cold_resistance_deviation: f64,
}

/// The filament inferred from a [`LampRating`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct InferredFilament {
    /// R_hot = V²/P, ohm.
    pub hot_resistance_ohm: f64,
    /// Temperature at rated voltage, K.
    pub operating_temperature_k: f64,
    /// Total emissivity used at the operating temperature.
    pub emissivity: f64,
    /// Equivalent straight-wire diameter, m.
    pub diameter_m: f64,
    /// Equivalent straight-wire length, m.
    pub length_m: f64,
    /// R_hot/R_cold.
    pub hot_to_cold_ratio: f64,
    /// How the measurement compares with typical lamps.
    pub plausibility: Plausibility,
    /// The filament's resistance law, referred to the measured cold point.
    pub wire: TungstenWire,
}

fn positive_finite(x: f64) -> bool {
    x > 0.0 && x.is_finite()
}

impl LampRating {
    /// A rating: positive, finite voltage, power and cold resistance, and a
    /// cold temperature inside tungsten's resistivity range (273.15–3500 K).
    pub fn new(
        rated_voltage_v: f64,
        rated_power_w: f64,
        cold_resistance_ohm: f64,
        cold_temperature_k: f64,
    ) -> Result<Self, LampError> {
        if !positive_finite(rated_voltage_v) {
            return Err(LampError::InvalidVoltage {
                volts: rated_voltage_v,
            });
        }
        if !positive_finite(rated_power_w) {
            return Err(LampError::InvalidPower {
                watts: rated_power_w,
            });
        }
        if !positive_finite(cold_resistance_ohm) {
            return Err(LampError::InvalidColdResistance {
                r_ohm: cold_resistance_ohm,
            });
        }
        let (min_k, max_k) = tungsten::RANGE_K;
        if !(cold_temperature_k >= min_k && cold_temperature_k <= max_k) {
            return Err(LampError::ColdTemperatureOutOfRange {
                t_k: cold_temperature_k,
                min_k,
                max_k,
            });
        }
        Ok(Self {
            rated_voltage_v,
            rated_power_w,
            cold_resistance_ohm,
            cold_temperature_k,
        })
    }

    /// Rated voltage, V.
    pub fn rated_voltage_v(&self) -> f64 {
        self.rated_voltage_v
    }

    /// Rated power, W.
    pub fn rated_power_w(&self) -> f64 {
        self.rated_power_w
    }

    /// Measured cold resistance, ohm.
    pub fn cold_resistance_ohm(&self) -> f64 {
        self.cold_resistance_ohm
    }

    /// Temperature of the cold measurement, K.
    pub fn cold_temperature_k(&self) -> f64 {
        self.cold_temperature_k
    }

    /// Infer the filament (module docs give the model): R_hot = V²/P;
    /// T_op from ρ(T_op) = (R_hot/R_cold)·ρ(T_cold); then d and L from the
    /// radiation balance and the hot resistance in closed form.
    pub fn infer(&self) -> Result<InferredFilament, LampError> {
        let hot_resistance_ohm = self.rated_voltage_v * self.rated_voltage_v / self.rated_power_w;
        let ratio = hot_resistance_ohm / self.cold_resistance_ohm;
        if ratio.is_nan() || ratio <= 1.0 {
            return Err(LampError::ImpossibleRatio {
                ratio,
                hot_resistance_ohm,
            });
        }
        let t_cold = self.cold_temperature_k;
        let rho_cold = tungsten::resistivity_ohm_m(t_cold)?;
        let rho_max = tungsten::resistivity_ohm_m(tungsten::RANGE_K.1)?;
        let max_ratio = rho_max / rho_cold;
        if ratio > max_ratio {
            return Err(LampError::BeyondTable { ratio, max_ratio });
        }
        let rho_hot = (ratio * rho_cold).min(rho_max);
        let t_op = tungsten::temperature_from_resistivity_k(rho_hot)?;
        let emissivity = tungsten::emissivity(t_op);

        // d·L from P = ε·σ·π·d·L·(T⁴ − T_cold⁴); L/d² from R = ρ·4L/(π·d²).
        let d_times_l = self.rated_power_w
            / (emissivity
                * STEFAN_BOLTZMANN_W_PER_M2_K4
                * std::f64::consts::PI
                * (t_op.powi(4) - t_cold.powi(4)));
        let l_over_d2 = std::f64::consts::PI * hot_resistance_ohm / (4.0 * rho_hot);
        let diameter_m = (d_times_l / l_over_d2).cbrt();
        let length_m = l_over_d2 * diameter_m * diameter_m;

        let (t_low, t_high) = TYPICAL_OPERATING_RANGE_K;
        let expected_low = hot_resistance_ohm * rho_cold / tungsten::resistivity_ohm_m(t_high)?;
        let expected_high = hot_resistance_ohm * rho_cold / tungsten::resistivity_ohm_m(t_low)?;
        let measured = self.cold_resistance_ohm;
        let cold_resistance_deviation = if measured < expected_low {
            measured / expected_low - 1.0
        } else if measured > expected_high {
            measured / expected_high - 1.0
        } else {
            0.0
        };
        Ok(InferredFilament {
            hot_resistance_ohm,
            operating_temperature_k: t_op,
            emissivity,
            diameter_m,
            length_m,
            hot_to_cold_ratio: ratio,
            plausibility: Plausibility {
                typical_operating_range_k: TYPICAL_OPERATING_RANGE_K,
                expected_cold_resistance_range_ohm: (expected_low, expected_high),
                cold_resistance_in_range: cold_resistance_deviation == 0.0,
                cold_resistance_deviation,
            },
            wire: TungstenWire::new(measured, t_cold)?,
        })
    }
}

/// What a coiled filament changes, and what the model assumes.
pub fn coil_note() -> &'static str {
    "Most lamp filaments are coiled (often coiled-coil). Neighbouring turns face \
     each other, so a coil radiates and convects less than a straight wire of the \
     same length: part of each turn's surface sees the rest of the coil instead of \
     the surroundings. The diameter and length inferred here are those of an \
     equivalent straight wire that radiates the rated power; the real wire is \
     somewhat longer and thinner. Its electrical behaviour (hot/cold ratio, \
     resistance against temperature) is unaffected, but a coil run at low \
     temperature in air loses heat more like a short cylinder the size of the \
     coil's envelope than like its uncoiled wire, so cooling computed from the \
     straight-wire dimensions overstates the coil's heat loss."
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn example_lamp_hand_calculation() {
        // Invented example values: a 12 V, 5 W lamp whose cold resistance,
        // measured at 300 K, is 28.8·5.65/73.91 = 2.201597 Ω (chosen so that
        // the operating point falls on a table row).
        // Hand calculation:
        //   R_hot = 12²/5 = 28.8 Ω; ratio = 28.8/2.201597 = 13.0814;
        //   ρ_op = 13.0814 · 5.65 = 73.91 µΩ·cm → T_op = 2500 K
        //   (Forsythe & Worthing 1925); ε(2500 K) = 0.301 (Forsythe & Watson).
        //   d·L = 5/(0.301 · 5.670374e-8 · π · (2500⁴ − 300⁴))
        //       = 5/(1.706783e-8 · π · 3.905440e13) = 5/2.094103e6
        //       = 2.387657e-6 m²;
        //   L/d² = π · 28.8/(4 · 73.91e-8) = 3.060407e7 /m;
        //   d = ∛(2.387657e-6/3.060407e7) = ∛(7.801763e-14) = 4.272981e-5 m;
        //   L = 3.060407e7 · (4.272981e-5)² = 0.05587802 m.
        //   Typical range low edge: 28.8 · 5.65/92.04 = 1.767927 Ω (3000 K).
        let r_cold = 28.8 * 5.65 / 73.91;
        let lamp = LampRating::new(12.0, 5.0, r_cold, 300.0).unwrap();
        let f = lamp.infer().unwrap();
        assert_relative_eq!(f.hot_resistance_ohm, 28.8, max_relative = 1e-15);
        assert_relative_eq!(f.operating_temperature_k, 2500.0, max_relative = 1e-10);
        assert_relative_eq!(f.emissivity, 0.301, max_relative = 1e-9);
        assert_relative_eq!(f.diameter_m, 4.272981e-5, max_relative = 1e-6);
        assert_relative_eq!(f.length_m, 0.05587802, max_relative = 1e-6);
        let (low, high) = f.plausibility.expected_cold_resistance_range_ohm;
        assert_relative_eq!(low, 1.767927, max_relative = 1e-6);
        assert!(high > r_cold && low < r_cold);
        assert!(f.plausibility.cold_resistance_in_range);
        assert_eq!(f.plausibility.cold_resistance_deviation, 0.0);
        assert!(f.hot_to_cold_ratio > 10.0 && f.hot_to_cold_ratio < 15.0);
    }

    #[test]
    fn round_trip_from_known_filament() {
        // Forward: a straight filament d = 30 µm, L = 40 mm at 2700 K, cold
        // at 295 K; compute its rating and cold resistance, then infer back.
        let (d, l, t_op, t_cold): (f64, f64, f64, f64) = (30e-6, 0.04, 2700.0, 295.0);
        let rho_op = tungsten::resistivity_ohm_m(t_op).unwrap();
        let r_hot = rho_op * 4.0 * l / (std::f64::consts::PI * d * d);
        let power = tungsten::emissivity(t_op)
            * STEFAN_BOLTZMANN_W_PER_M2_K4
            * std::f64::consts::PI
            * d
            * l
            * (t_op.powi(4) - t_cold.powi(4));
        let volts = (power * r_hot).sqrt();
        let r_cold = r_hot * tungsten::resistivity_ohm_m(t_cold).unwrap() / rho_op;
        let f = LampRating::new(volts, power, r_cold, t_cold)
            .unwrap()
            .infer()
            .unwrap();
        assert_relative_eq!(f.operating_temperature_k, t_op, max_relative = 1e-6);
        assert_relative_eq!(f.diameter_m, d, max_relative = 1e-6);
        assert_relative_eq!(f.length_m, l, max_relative = 1e-6);
        assert_relative_eq!(f.wire.resistance_ohm(t_op), r_hot, max_relative = 1e-9);
    }

    #[test]
    fn cold_resistance_outside_typical_range_is_reported() {
        // Invented example: 6 V, 3 W (R_hot = 12 Ω) with 2 Ω cold at 300 K:
        // ratio 6 → ρ = 33.9 µΩ·cm, about 1290 K, far below 2200 K, so the
        // measured 2 Ω lies above the expected range: deviation > 0.
        let f = LampRating::new(6.0, 3.0, 2.0, 300.0)
            .unwrap()
            .infer()
            .unwrap();
        assert!(f.operating_temperature_k < 2200.0);
        assert!(!f.plausibility.cold_resistance_in_range);
        let (_, high) = f.plausibility.expected_cold_resistance_range_ohm;
        assert_relative_eq!(
            f.plausibility.cold_resistance_deviation,
            2.0 / high - 1.0,
            max_relative = 1e-12
        );
        assert!(f.plausibility.cold_resistance_deviation > 0.0);
    }

    #[test]
    fn impossible_ratios_are_errors() {
        // R_hot = 12 Ω, R_cold = 15 Ω: ratio 0.8.
        assert!(matches!(
            LampRating::new(6.0, 3.0, 15.0, 300.0).unwrap().infer(),
            Err(LampError::ImpossibleRatio { .. })
        ));
        // Ratio 24 > 111.1/5.65 = 19.66, beyond the 3500 K row.
        assert!(matches!(
            LampRating::new(6.0, 3.0, 0.5, 300.0).unwrap().infer(),
            Err(LampError::BeyondTable { .. })
        ));
        assert!(matches!(
            LampRating::new(0.0, 3.0, 1.0, 300.0),
            Err(LampError::InvalidVoltage { .. })
        ));
        assert!(matches!(
            LampRating::new(6.0, 3.0, 1.0, 200.0),
            Err(LampError::ColdTemperatureOutOfRange { .. })
        ));
    }

    #[test]
    fn coil_note_states_assumption() {
        let note = coil_note();
        assert!(note.contains("coil") && note.contains("straight wire"));
    }
}
