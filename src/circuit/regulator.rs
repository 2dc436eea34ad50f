//! Linear voltage regulator: output range, headroom, dissipation and
//! junction temperature.
//!
//! Formulas as printed in linear-regulator data sheets, "Power Dissipation"
//! and "Estimating Junction Temperature" sections (e.g. Texas Instruments,
//! 500-mA automotive LDO regulator data sheet SGLS380J, 2025, §8.1.4–8.1.5):
//! P_D = (V_IN − V_OUT)·I_OUT + V_IN·I_Q and T_J = T_A + P_D·θ_JA, with θ_JA
//! the junction-to-ambient thermal resistance as defined in JEDEC JESD51-1
//! (θ_JA = (T_J − T_A)/P_D).

use thiserror::Error;

use super::value::{finite, non_negative, positive, ValueError};

/// Why regulator figures or operating values are rejected.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
pub enum RegulatorError {
    /// A parameter is not finite, not positive or negative where it must
    /// not be.
    #[error(transparent)]
    Value(#[from] ValueError),
    /// The tolerance is not a fraction below 1.
    #[error("output_tolerance must be a fraction in [0, 1), got {0}")]
    Tolerance(f64),
    /// The input is below the output, so the formulas do not apply.
    #[error("input {vin_v} V must be at least the output {vout_v} V")]
    InputBelowOutput {
        /// Input voltage, V.
        vin_v: f64,
        /// Nominal output voltage, V.
        vout_v: f64,
    },
    /// The input range is inverted.
    #[error("vin_min ({min} V) must not exceed vin_max ({max} V)")]
    InputRange {
        /// Lowest input, V.
        min: f64,
        /// Highest input, V.
        max: f64,
    },
}

/// A fixed-output linear regulator described by its data-sheet figures.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LinearRegulator {
    /// Nominal output voltage, V.
    pub output_v: f64,
    /// Output tolerance as a fraction (0.04 = ±4 %).
    pub output_tolerance: f64,
    /// Dropout voltage (least V_IN − V_OUT for regulation), V.
    pub dropout_v: f64,
    /// Quiescent (ground-pin) current, A.
    pub quiescent_a: f64,
    /// Junction-to-ambient thermal resistance θ_JA, K/W.
    pub theta_ja_k_per_w: f64,
    /// Highest allowed junction temperature, K.
    pub max_junction_k: f64,
}

/// Result of [`LinearRegulator::check`]; every margin is negative when the
/// corresponding limit is broken.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RegulatorCheck {
    /// Lowest and highest output voltage from the tolerance, V.
    pub output_range_v: (f64, f64),
    /// Headroom at the lowest input, `vin_min − vout − dropout`, V.
    pub headroom_v: f64,
    /// Dissipation at the highest input and the given load, W.
    pub dissipation_w: f64,
    /// Junction temperature at the highest ambient, K.
    pub junction_k: f64,
    /// `max_junction_k − junction_k`, K.
    pub junction_margin_k: f64,
    /// Largest load current that keeps the junction at its limit at the
    /// highest input and ambient, A (0 if even no load is too hot).
    pub max_load_a: f64,
    /// True when both the headroom and the junction margin are ≥ 0.
    pub ok: bool,
}

impl LinearRegulator {
    /// Validate and build a regulator.
    pub fn new(
        output_v: f64,
        output_tolerance: f64,
        dropout_v: f64,
        quiescent_a: f64,
        theta_ja_k_per_w: f64,
        max_junction_k: f64,
    ) -> Result<Self, RegulatorError> {
        positive("output_v", output_v)?;
        finite("output_tolerance", output_tolerance)?;
        if !(0.0..1.0).contains(&output_tolerance) {
            return Err(RegulatorError::Tolerance(output_tolerance));
        }
        non_negative("dropout_v", dropout_v)?;
        non_negative("quiescent_a", quiescent_a)?;
        positive("theta_ja_k_per_w", theta_ja_k_per_w)?;
        positive("max_junction_k", max_junction_k)?;
        Ok(Self {
            output_v,
            output_tolerance,
            dropout_v,
            quiescent_a,
            theta_ja_k_per_w,
            max_junction_k,
        })
    }

    /// A fixed 5 V three-terminal regulator in a TO-220 package with no heat
    /// sink; typical class figures, no specific part: ±4 % output, 2 V
    /// dropout, 5 mA quiescent, 125 °C maximum junction (memory, classic
    /// fixed-regulator data sheets); θ_JA 65 K/W (regulator data sheets,
    /// TO-220 free air, typical 60–65 K/W).
    pub fn typical_fixed_5v() -> Self {
        Self {
            output_v: 5.0,
            output_tolerance: 0.04,
            dropout_v: 2.0,
            quiescent_a: 5e-3,
            theta_ja_k_per_w: 65.0,
            max_junction_k: 398.15,
        }
    }

    /// Lowest and highest output voltage, `vout·(1 ∓ tolerance)`, V.
    pub fn output_range_v(&self) -> (f64, f64) {
        (
            self.output_v * (1.0 - self.output_tolerance),
            self.output_v * (1.0 + self.output_tolerance),
        )
    }

    /// Dissipation P_D = (V_IN − V_OUT)·I_OUT + V_IN·I_Q, W (data-sheet
    /// formula, module text).
    pub fn dissipation_w(&self, vin_v: f64, iout_a: f64) -> Result<f64, RegulatorError> {
        finite("vin_v", vin_v)?;
        non_negative("iout_a", iout_a)?;
        if vin_v < self.output_v {
            return Err(RegulatorError::InputBelowOutput {
                vin_v,
                vout_v: self.output_v,
            });
        }
        Ok((vin_v - self.output_v) * iout_a + vin_v * self.quiescent_a)
    }

    /// Junction temperature T_J = T_A + P_D·θ_JA, K (data-sheet formula,
    /// JESD51-1 definition of θ_JA).
    pub fn junction_k(&self, ambient_k: f64, dissipation_w: f64) -> f64 {
        ambient_k + dissipation_w * self.theta_ja_k_per_w
    }

    /// Headroom above dropout at the lowest input,
    /// `vin_min − vout − dropout`, V (negative: the regulator drops out).
    pub fn headroom_v(&self, vin_min_v: f64) -> f64 {
        vin_min_v - self.output_v - self.dropout_v
    }

    /// Largest load current for which T_J stays at `max_junction_k`:
    /// I = [(T_Jmax − T_A)/θ_JA − V_IN·I_Q]/(V_IN − V_OUT), from the two
    /// data-sheet formulas; clamped at 0; infinite when V_IN = V_OUT.
    pub fn max_load_a(&self, vin_v: f64, ambient_k: f64) -> f64 {
        let p_allowed = (self.max_junction_k - ambient_k) / self.theta_ja_k_per_w;
        let p_load = p_allowed - vin_v * self.quiescent_a;
        if p_load <= 0.0 {
            0.0
        } else if vin_v > self.output_v {
            p_load / (vin_v - self.output_v)
        } else {
            f64::INFINITY
        }
    }

    /// Check the regulator over an input range at a load and the highest
    /// ambient temperature.
    pub fn check(
        &self,
        vin_min_v: f64,
        vin_max_v: f64,
        iout_a: f64,
        ambient_max_k: f64,
    ) -> Result<RegulatorCheck, RegulatorError> {
        finite("vin_min_v", vin_min_v)?;
        finite("vin_max_v", vin_max_v)?;
        positive("ambient_max_k", ambient_max_k)?;
        if vin_min_v > vin_max_v {
            return Err(RegulatorError::InputRange {
                min: vin_min_v,
                max: vin_max_v,
            });
        }
        let dissipation_w = self.dissipation_w(vin_max_v, iout_a)?;
        let junction_k = self.junction_k(ambient_max_k, dissipation_w);
        let headroom_v = self.headroom_v(vin_min_v);
        let junction_margin_k = self.max_junction_k - junction_k;
        Ok(RegulatorCheck {
            output_range_v: self.output_range_v(),
            headroom_v,
            dissipation_w,
            junction_k,
            junction_margin_k,
            max_load_a: self.max_load_a(vin_max_v, ambient_max_k),
            ok: headroom_v >= 0.0 && junction_margin_k >= 0.0,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Hand calculation with the data-sheet formulas, preset regulator,
    /// V_IN = 12 V, I_OUT = 100 mA, T_A = 40 °C (313.15 K):
    /// P = (12 − 5)·0.1 + 12·0.005 = 0.7 + 0.06 = 0.76 W;
    /// T_J = 313.15 + 0.76·65 = 313.15 + 49.4 = 362.55 K (89.4 °C);
    /// margin = 398.15 − 362.55 = 35.6 K.
    #[test]
    fn dissipation_and_junction_hand_calc() {
        let r = LinearRegulator::typical_fixed_5v();
        let p = r.dissipation_w(12.0, 0.1).unwrap();
        assert_relative_eq!(p, 0.76, max_relative = 1e-12);
        assert_relative_eq!(r.junction_k(313.15, p), 362.55, max_relative = 1e-12);
        let c = r.check(9.0, 12.0, 0.1, 313.15).unwrap();
        assert_relative_eq!(c.junction_margin_k, 35.6, max_relative = 1e-9);
        // Headroom at 9 V: 9 − 5 − 2 = 2 V.
        assert_relative_eq!(c.headroom_v, 2.0, max_relative = 1e-12);
        assert!(c.ok);
        // Output range: 5·(1 ∓ 0.04) = 4.8 … 5.2 V.
        assert_relative_eq!(c.output_range_v.0, 4.8, max_relative = 1e-12);
        assert_relative_eq!(c.output_range_v.1, 5.2, max_relative = 1e-12);
        // Max load: (85 K / 65 K/W − 0.06 W)/7 V = (1.307692 − 0.06)/7
        // = 0.178242 A.
        assert_relative_eq!(
            c.max_load_a,
            (85.0 / 65.0 - 0.06) / 7.0,
            max_relative = 1e-12
        );
        // At that load the junction sits exactly at its limit.
        let p_max = r.dissipation_w(12.0, c.max_load_a).unwrap();
        assert_relative_eq!(r.junction_k(313.15, p_max), 398.15, max_relative = 1e-12);
    }

    /// Hand: 7 V minimum input gives 7 − 5 − 2 = 0 V headroom (edge); 6.5 V
    /// gives −0.5 V and fails. 24 V at 0.3 A, 50 °C: P = 19·0.3 + 24·0.005
    /// = 5.82 W, T_J = 323.15 + 378.3 = 701.45 K → fails.
    #[test]
    fn failing_cases() {
        let r = LinearRegulator::typical_fixed_5v();
        assert_eq!(r.headroom_v(7.0), 0.0);
        let c = r.check(6.5, 12.0, 0.05, 298.15).unwrap();
        assert!(!c.ok);
        assert_relative_eq!(c.headroom_v, -0.5, max_relative = 1e-12);
        let c = r.check(12.0, 24.0, 0.3, 323.15).unwrap();
        assert_relative_eq!(c.dissipation_w, 5.82, max_relative = 1e-12);
        assert_relative_eq!(c.junction_k, 323.15 + 5.82 * 65.0, max_relative = 1e-12);
        assert!(!c.ok);
    }

    #[test]
    fn errors() {
        let r = LinearRegulator::typical_fixed_5v();
        assert!(matches!(
            r.dissipation_w(4.0, 0.1),
            Err(RegulatorError::InputBelowOutput { .. })
        ));
        assert!(matches!(
            r.dissipation_w(9.0, -0.1),
            Err(RegulatorError::Value(ValueError::Negative { .. }))
        ));
        assert!(matches!(
            r.check(12.0, 9.0, 0.1, 300.0),
            Err(RegulatorError::InputRange { .. })
        ));
        assert!(matches!(
            LinearRegulator::new(5.0, 1.2, 2.0, 5e-3, 65.0, 398.15),
            Err(RegulatorError::Tolerance(_))
        ));
        assert!(matches!(
            LinearRegulator::new(5.0, 0.04, 2.0, 5e-3, 0.0, 398.15),
            Err(RegulatorError::Value(ValueError::NotPositive { .. }))
        ));
        assert!(LinearRegulator::new(5.0, 0.04, 2.0, 5e-3, 65.0, 398.15).is_ok());
    }
}
