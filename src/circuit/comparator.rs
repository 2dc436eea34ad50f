//! Open-collector comparator: data-sheet parameters and the checks made
//! against them. Each check returns `(ok, margin)`; the margin is in the
//! unit of the quantity checked and is negative when the check fails.

use thiserror::Error;

use super::value::{finite, non_negative, ValueError};

/// Why a set of comparator parameters is rejected.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
pub enum ComparatorError {
    /// A parameter is not finite, not positive or negative where it must
    /// not be.
    #[error(transparent)]
    Value(#[from] ValueError),
    /// The output sink limit is not positive.
    #[error("output_sink_max_a must be > 0, got {0}")]
    SinkNotPositive(f64),
    /// The supply range is empty or not positive.
    #[error("supply range must satisfy 0 < supply_min_v ({min}) < supply_max_v ({max})")]
    SupplyRange {
        /// Lower supply limit, V.
        min: f64,
        /// Upper supply limit, V.
        max: f64,
    },
}

/// Data-sheet figures of an open-collector comparator (SI units).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ComparatorParams {
    /// Input offset voltage magnitude, V.
    pub input_offset_v: f64,
    /// Input bias current magnitude, A.
    pub input_bias_a: f64,
    /// Lowest input common-mode voltage, relative to the negative rail, V
    /// (0 = includes ground).
    pub common_mode_low_v: f64,
    /// Headroom the common-mode range stops below the positive supply, V.
    pub common_mode_high_below_supply_v: f64,
    /// Largest output sink current at which `output_low_v` holds, A.
    pub output_sink_max_a: f64,
    /// Saturated output-low voltage at `output_sink_max_a`, V.
    pub output_low_v: f64,
    /// Lowest operating supply, V.
    pub supply_min_v: f64,
    /// Highest operating supply, V.
    pub supply_max_v: f64,
}

impl ComparatorParams {
    /// Validate and build a parameter set.
    #[allow(clippy::too_many_arguments)]
    pub fn new(
        input_offset_v: f64,
        input_bias_a: f64,
        common_mode_low_v: f64,
        common_mode_high_below_supply_v: f64,
        output_sink_max_a: f64,
        output_low_v: f64,
        supply_min_v: f64,
        supply_max_v: f64,
    ) -> Result<Self, ComparatorError> {
        non_negative("input_offset_v", input_offset_v)?;
        non_negative("input_bias_a", input_bias_a)?;
        finite("common_mode_low_v", common_mode_low_v)?;
        non_negative(
            "common_mode_high_below_supply_v",
            common_mode_high_below_supply_v,
        )?;
        non_negative("output_sink_max_a", output_sink_max_a)?;
        if output_sink_max_a <= 0.0 {
            return Err(ComparatorError::SinkNotPositive(output_sink_max_a));
        }
        non_negative("output_low_v", output_low_v)?;
        non_negative("supply_min_v", supply_min_v)?;
        non_negative("supply_max_v", supply_max_v)?;
        if !(supply_min_v > 0.0 && supply_max_v > supply_min_v) {
            return Err(ComparatorError::SupplyRange {
                min: supply_min_v,
                max: supply_max_v,
            });
        }
        Ok(Self {
            input_offset_v,
            input_bias_a,
            common_mode_low_v,
            common_mode_high_below_supply_v,
            output_sink_max_a,
            output_low_v,
            supply_min_v,
            supply_max_v,
        })
    }

    /// Typical of the open-collector comparator class (bipolar, PNP input,
    /// single supply), no specific part. Figures from the class's data
    /// sheets (memory unless stated): offset 5 mV (maximum at 25 °C; 2–3 mV
    /// typical); bias 250 nA (maximum; 25 nA typical, seen in a class data
    /// sheet's feature list); common-mode range from 0 V to V_CC − 1.5 V
    /// (seen: "V_CC is at least 1.5 V more positive than the input
    /// common-mode voltage"); supply 2–36 V. Output: V_OL 0.4 V is the
    /// class's maximum at 4 mA sink, so the sink limit paired with it is
    /// 4 mA; the class sinks about 16 mA typical (6 mA guaranteed) only with
    /// the output near 1.5 V — enter those figures for an LED driven
    /// directly.
    pub fn typical_open_collector() -> Self {
        Self {
            input_offset_v: 5e-3,
            input_bias_a: 250e-9,
            common_mode_low_v: 0.0,
            common_mode_high_below_supply_v: 1.5,
            output_sink_max_a: 4e-3,
            output_low_v: 0.4,
            supply_min_v: 2.0,
            supply_max_v: 36.0,
        }
    }

    /// Is `v_in` inside the common-mode range at supply `vcc`? Margin (V) is
    /// the distance to the nearer edge of
    /// `[common_mode_low_v, vcc − common_mode_high_below_supply_v]`.
    pub fn common_mode_ok(&self, v_in: f64, vcc: f64) -> (bool, f64) {
        let low = v_in - self.common_mode_low_v;
        let high = (vcc - self.common_mode_high_below_supply_v) - v_in;
        let margin = low.min(high);
        (margin >= 0.0, margin)
    }

    /// Shift of an input node caused by the bias current flowing through the
    /// source resistance that feeds it: ΔV = I_b·R_source, V (Ohm's law).
    /// For the PNP-input class the current flows out of the inputs, so the
    /// node rises by this amount; the sign depends on the part.
    pub fn bias_error_v(&self, source_ohm: f64) -> f64 {
        self.input_bias_a * source_ohm
    }

    /// Worst-case input-referred error for unequal source resistances on the
    /// two inputs: |V_os| + I_b·|R_+ − R_−| (bias currents equal; offset
    /// current neglected). The classic reason for matching the resistances.
    pub fn input_error_v(&self, source_ohm_plus: f64, source_ohm_minus: f64) -> f64 {
        self.input_offset_v + self.input_bias_a * (source_ohm_plus - source_ohm_minus).abs()
    }

    /// Can the output sink `sink_a` and still hold `output_low_v`?
    /// Margin = `output_sink_max_a − sink_a`, A.
    pub fn sink_ok(&self, sink_a: f64) -> (bool, f64) {
        let margin = self.output_sink_max_a - sink_a;
        (margin >= 0.0, margin)
    }

    /// Is `vcc` inside the operating supply range? Margin (V) to the nearer
    /// limit.
    pub fn supply_ok(&self, vcc: f64) -> (bool, f64) {
        let margin = (vcc - self.supply_min_v).min(self.supply_max_v - vcc);
        (margin >= 0.0, margin)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn preset_is_valid() {
        let p = ComparatorParams::typical_open_collector();
        let q = ComparatorParams::new(
            p.input_offset_v,
            p.input_bias_a,
            p.common_mode_low_v,
            p.common_mode_high_below_supply_v,
            p.output_sink_max_a,
            p.output_low_v,
            p.supply_min_v,
            p.supply_max_v,
        )
        .unwrap();
        assert_eq!(p, q);
    }

    /// Hand: at V_CC = 5 V the range is 0 … 3.5 V. 3.2 V → margin
    /// min(3.2, 0.3) = 0.3 V; 4 V → −0.5 V; −0.1 V → −0.1 V.
    #[test]
    fn common_mode() {
        let p = ComparatorParams::typical_open_collector();
        let (ok, m) = p.common_mode_ok(3.2, 5.0);
        assert!(ok);
        assert_relative_eq!(m, 0.3, max_relative = 1e-12);
        assert_eq!(p.common_mode_ok(4.0, 5.0), (false, -0.5));
        assert_eq!(p.common_mode_ok(-0.1, 5.0), (false, -0.1));
    }

    /// Hand: 250 nA through 10 kΩ = 2.5 mV; with 10 kΩ against 2 kΩ the
    /// worst-case error is 5 mV + 250 nA·8 kΩ = 7 mV.
    #[test]
    fn bias_and_input_error() {
        let p = ComparatorParams::typical_open_collector();
        assert_relative_eq!(p.bias_error_v(10e3), 2.5e-3, max_relative = 1e-12);
        assert_relative_eq!(p.input_error_v(10e3, 2e3), 7e-3, max_relative = 1e-12);
    }

    /// Hand: 4 mA limit; 3 mA → +1 mA, 10 mA → −6 mA. Supply 2–36 V: 5 V →
    /// margin 3 V; 40 V → −4 V.
    #[test]
    fn sink_and_supply() {
        let p = ComparatorParams::typical_open_collector();
        let (ok, m) = p.sink_ok(3e-3);
        assert!(ok);
        assert_relative_eq!(m, 1e-3, max_relative = 1e-9);
        let (ok, m) = p.sink_ok(10e-3);
        assert!(!ok);
        assert_relative_eq!(m, -6e-3, max_relative = 1e-9);
        assert_eq!(p.supply_ok(5.0), (true, 3.0));
        assert_eq!(p.supply_ok(40.0), (false, -4.0));
    }

    #[test]
    fn rejects_bad_parameters() {
        assert!(matches!(
            ComparatorParams::new(5e-3, 250e-9, 0.0, 1.5, 0.0, 0.4, 2.0, 36.0),
            Err(ComparatorError::SinkNotPositive(_))
        ));
        assert!(matches!(
            ComparatorParams::new(5e-3, -1e-9, 0.0, 1.5, 4e-3, 0.4, 2.0, 36.0),
            Err(ComparatorError::Value(ValueError::Negative { .. }))
        ));
        assert!(matches!(
            ComparatorParams::new(5e-3, 250e-9, 0.0, 1.5, 4e-3, 0.4, 36.0, 2.0),
            Err(ComparatorError::SupplyRange { .. })
        ));
        assert!(matches!(
            ComparatorParams::new(f64::NAN, 250e-9, 0.0, 1.5, 4e-3, 0.4, 2.0, 36.0),
            Err(ComparatorError::Value(ValueError::NotFinite { .. }))
        ));
    }
}
