//! Hysteresis from positive feedback around an open-collector comparator.
//!
//! The network: one comparator input node is fed by a Thevenin source
//! (`source_v`, `source_ohm`) and, through the feedback resistor Rf, by the
//! comparator output. With the output transistor off ("output high") the
//! output node is pulled to `supply_v` through `pullup_ohm`, so the feedback
//! path from the supply to the node is Rf + Rpu in series; with the output
//! transistor saturated ("output low") the output is a voltage source at
//! `output_low_v` and the path is Rf alone. Nodal analysis of the single node
//! gives (Kirchhoff's current law, any circuit-analysis text):
//!
//! ```text
//! V_node,high = Vs + (Vcc − Vs)·Rs / (Rs + Rf + Rpu)
//! V_node,low  = Vs + (Vol − Vs)·Rs / (Rs + Rf)
//! ```
//!
//! Anything else on the output node while the output is high (an LED to the
//! supply, a transistor base path) must be folded by the caller into one
//! Thevenin equivalent (`supply_v`, `pullup_ohm`); a load much larger than
//! Rpu may be ignored, as the data sheets below assume (R_LOAD ≫ R_PULLUP).
//! `pullup_ohm = 0` models a push-pull output swinging to `supply_v`.
//!
//! Where the network goes. The sense node of a self-heated element is often
//! stiff (tens of ohms), and feedback into a stiff node needs a very small
//! Rf: the output-high level then sags and the comparator sinks a large
//! current. Two placements are provided:
//!
//! * **Feedback into the sense side** (sense on the non-inverting input):
//!   [`FeedbackNetwork::source_thresholds`] and
//!   [`feedback_for_source_hysteresis`]. If the sense node is too stiff, a
//!   series input resistor Rin raises the source resistance first
//!   ([`series_input_for_feedback`]); Rs is then Rin + R_sense.
//! * **Feedback into the reference node** (sense on the inverting input,
//!   trip direction reversed): the reference divider with its trimmer is a
//!   Thevenin source of kilohms, so Rf goes there and the sense voltage
//!   trips at [`FeedbackNetwork::node_voltage_output_high`] (rising) and
//!   [`FeedbackNetwork::node_voltage_output_low`] (falling); sized by
//!   [`feedback_for_reference_hysteresis`].
//!
//! For a self-heated element the Thevenin resistance to use is the
//! incremental (small-signal) resistance of the sense node at the trip
//! point, not V/I. The width returned is in volts at the sense node; the
//! caller turns it into airflow by dividing by dV/dU.
//!
//! Published forms of the same equations: Analog Devices, data sheet of a
//! single open-drain / push-pull comparator with reference, Rev. D, p. 10
//! ("Noninverting … Comparator Configuration with Hysteresis", open-drain
//! version: V_IN_HI = V_REF(R1+R2)/R2, V_IN_LO = [V_REF(R1+R2+R_PULLUP) −
//! V_CC·R1]/(R2+R_PULLUP)); ABLIC Inc., semiconductor support FAQ, "examples
//! of how to set the hysteresis voltage of a comparator" (V_THR =
//! V_REF·R1(1/R1+1/R2+1/R3), V_HB = R1·V_CC/R3).

use thiserror::Error;

use super::value::{finite, non_negative, positive, ValueError};

/// Least ratio Rf / Rpu accepted when sizing: "R_PU should be at least 10x
/// less than R2" (the feedback resistor). Texas Instruments, data sheet of a
/// low-voltage quad open-collector comparator family, SNOSDA4D (2023),
/// §"Non-Inverting Comparator With Hysteresis". Below it the output-high
/// level is pulled well under the supply by the feedback path.
pub const MIN_FEEDBACK_TO_PULLUP_RATIO: f64 = 10.0;

/// Series input resistance aimed for in front of a stiff sense node,
/// 10 kΩ (common practice, no source); lowered when the input bias current
/// would make too large an error.
pub const DEFAULT_SERIES_INPUT_OHM: f64 = 10e3;

/// Why a hysteresis network cannot be analysed or sized.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
pub enum HysteresisError {
    /// A parameter is not finite, not positive or negative where it must
    /// not be.
    #[error(transparent)]
    Value(#[from] ValueError),
    /// The supply is not above the output-low level.
    #[error("supply_v ({supply_v} V) must be above output_low_v ({output_low_v} V)")]
    SupplyNotAboveOutputLow {
        /// Supply voltage, V.
        supply_v: f64,
        /// Output-low voltage, V.
        output_low_v: f64,
    },
    /// The operating level lies outside the output swing, so the feedback
    /// cannot move the node both ways.
    #[error(
        "operating level {level_v} V must lie strictly between output_low_v ({output_low_v} V) \
         and supply_v ({supply_v} V)"
    )]
    LevelOutsideSwing {
        /// The operating level (threshold or reference voltage), V.
        level_v: f64,
        /// Output-low voltage, V.
        output_low_v: f64,
        /// Supply voltage, V.
        supply_v: f64,
    },
    /// The wanted width is larger than the network can give with
    /// Rf ≥ `MIN_FEEDBACK_TO_PULLUP_RATIO`·Rpu (or, at the reference node,
    /// than the output swing allows).
    #[error(
        "wanted hysteresis {wanted_v} V must be below {max_v} V, the most this network \
         gives (raise the source resistance, e.g. with a series input resistor)"
    )]
    WidthTooLarge {
        /// Wanted width, V.
        wanted_v: f64,
        /// Largest width available, V.
        max_v: f64,
    },
}

fn check_swing(supply_v: f64, output_low_v: f64) -> Result<(), HysteresisError> {
    finite("supply_v", supply_v)?;
    finite("output_low_v", output_low_v)?;
    if supply_v > output_low_v {
        Ok(())
    } else {
        Err(HysteresisError::SupplyNotAboveOutputLow {
            supply_v,
            output_low_v,
        })
    }
}

fn check_level(level_v: f64, supply_v: f64, output_low_v: f64) -> Result<(), HysteresisError> {
    finite("operating level", level_v)?;
    if level_v > output_low_v && level_v < supply_v {
        Ok(())
    } else {
        Err(HysteresisError::LevelOutsideSwing {
            level_v,
            output_low_v,
            supply_v,
        })
    }
}

/// A comparator input node fed by a Thevenin source and by positive
/// feedback from an open-collector output with a pull-up (see the module
/// text for the model). Build it with [`FeedbackNetwork::new`]; the methods
/// assume a validated network.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FeedbackNetwork {
    /// Open-circuit voltage of the source feeding the node, V.
    pub source_v: f64,
    /// Thevenin resistance of that source, Ω (≥ 0).
    pub source_ohm: f64,
    /// Feedback resistor Rf from the output to the node, Ω (> 0;
    /// `f64::INFINITY` means no feedback).
    pub feedback_ohm: f64,
    /// Pull-up resistor from the output to the supply, Ω (≥ 0; 0 = push-pull).
    pub pullup_ohm: f64,
    /// Supply the pull-up returns to, V.
    pub supply_v: f64,
    /// Saturated output-low voltage, V.
    pub output_low_v: f64,
}

impl FeedbackNetwork {
    /// Validate and build a network.
    pub fn new(
        source_v: f64,
        source_ohm: f64,
        feedback_ohm: f64,
        pullup_ohm: f64,
        supply_v: f64,
        output_low_v: f64,
    ) -> Result<Self, HysteresisError> {
        finite("source_v", source_v)?;
        non_negative("source_ohm", source_ohm)?;
        if feedback_ohm.is_nan() {
            return Err(HysteresisError::Value(ValueError::NotFinite {
                name: "feedback_ohm",
                value: feedback_ohm,
            }));
        }
        if feedback_ohm <= 0.0 {
            return Err(HysteresisError::Value(ValueError::NotPositive {
                name: "feedback_ohm",
                value: feedback_ohm,
            }));
        }
        non_negative("pullup_ohm", pullup_ohm)?;
        check_swing(supply_v, output_low_v)?;
        Ok(Self {
            source_v,
            source_ohm,
            feedback_ohm,
            pullup_ohm,
            supply_v,
            output_low_v,
        })
    }

    /// Node voltage with the output high (transistor off):
    /// `Vs + (Vcc − Vs)·Rs/(Rs + Rf + Rpu)` (nodal analysis, module text).
    pub fn node_voltage_output_high(&self) -> f64 {
        let series = self.source_ohm + self.feedback_ohm + self.pullup_ohm;
        self.source_v + (self.supply_v - self.source_v) * (self.source_ohm / series)
    }

    /// Node voltage with the output low (saturated at Vol):
    /// `Vs + (Vol − Vs)·Rs/(Rs + Rf)` (nodal analysis, module text).
    pub fn node_voltage_output_low(&self) -> f64 {
        let series = self.source_ohm + self.feedback_ohm;
        self.source_v + (self.output_low_v - self.source_v) * (self.source_ohm / series)
    }

    /// The two source voltages at which the node equals the voltage on the
    /// other comparator input, `v_other_input` (Vt), as `(with output high,
    /// with output low)`. From the node equations set to Vt:
    ///
    /// ```text
    /// Vs,high = Vt − (Vcc − Vt)·Rs/(Rf + Rpu)
    /// Vs,low  = Vt + (Vt − Vol)·Rs/Rf
    /// ```
    ///
    /// With the sense on the non-inverting input the output goes high when
    /// the source rises through `Vs,low` and low again when it falls through
    /// `Vs,high`. Same result as the open-drain equations in the Analog
    /// Devices data sheet cited in the module text (R1 = Rs, R2 = Rf).
    pub fn source_thresholds(&self, v_other_input: f64) -> (f64, f64) {
        let vt = v_other_input;
        let high =
            vt - (self.supply_v - vt) * (self.source_ohm / (self.feedback_ohm + self.pullup_ohm));
        let low = vt + (vt - self.output_low_v) * (self.source_ohm / self.feedback_ohm);
        (high, low)
    }

    /// Hysteresis width at the source, `Vs,low − Vs,high` =
    /// `Rs·[(Vt − Vol)/Rf + (Vcc − Vt)/(Rf + Rpu)]`.
    pub fn source_hysteresis_v(&self, v_other_input: f64) -> f64 {
        let (high, low) = self.source_thresholds(v_other_input);
        low - high
    }

    /// Voltage at the output pin with the output high and the node at
    /// `v_node`: the pull-up and Rf divide `Vcc − v_node`,
    /// `Vcc − (Vcc − v_node)·Rpu/(Rpu + Rf)`.
    pub fn output_high_v(&self, v_node: f64) -> f64 {
        self.supply_v
            - (self.supply_v - v_node) * (self.pullup_ohm / (self.pullup_ohm + self.feedback_ohm))
    }

    /// Current the output transistor sinks when low with the node at
    /// `v_node`: `(Vcc − Vol)/Rpu + (v_node − Vol)/Rf` (Ohm's law on both
    /// branches; with `pullup_ohm` = 0, a push-pull output, only the
    /// feedback branch counts).
    pub fn output_sink_current_a(&self, v_node: f64) -> f64 {
        let pull = if self.pullup_ohm > 0.0 {
            (self.supply_v - self.output_low_v) / self.pullup_ohm
        } else {
            0.0
        };
        pull + (v_node - self.output_low_v) / self.feedback_ohm
    }
}

/// Positive root x of `k·x·(x + Rpu) = a·(x + Rpu) + b·x`, i.e. of
/// `k·x² + (k·Rpu − a − b)·x − a·Rpu = 0` with a, b, k > 0, Rpu ≥ 0. The
/// product of the roots is −a·Rpu/k ≤ 0, so exactly one root is positive;
/// it is taken in the form free of cancellation.
fn positive_root(a: f64, b: f64, k: f64, rpu: f64) -> f64 {
    let beta = k * rpu - a - b;
    let disc = (beta * beta + 4.0 * k * a * rpu).sqrt();
    if beta >= 0.0 {
        2.0 * a * rpu / (beta + disc)
    } else {
        (disc - beta) / (2.0 * k)
    }
}

/// Width `Rs·[a/x + b/(x + Rpu)]` of the two hysteresis forms (see the
/// sizing functions).
fn width(rs: f64, a: f64, b: f64, x: f64, rpu: f64) -> f64 {
    rs * (a / x + b / (x + rpu))
}

/// Feedback resistor Rf giving a wanted hysteresis width at the source,
/// sense on the non-inverting input, around the operating level
/// `v_other_input` (the voltage on the other input, Vt).
///
/// Derivation (from [`FeedbackNetwork::source_thresholds`]): with
/// a = Vt − Vol, b = Vcc − Vt and k = ΔV/Rs,
///
/// ```text
/// ΔV = Rs·[a/Rf + b/(Rf + Rpu)]
/// ⇒ k·Rf² + (k·Rpu − a − b)·Rf − a·Rpu = 0
/// ⇒ Rf = [(a + b − k·Rpu) + √((k·Rpu − a − b)² + 4·k·a·Rpu)] / (2k)
/// ```
///
/// the positive root (the other is negative). For a push-pull output
/// (Rpu = 0) this is Rf = Rs·(Vcc − Vol)/ΔV, the form of the ABLIC example
/// (V_HB = R1·V_CC/R3). Because Rpu ≠ 0 makes the width depend on Vt, the
/// operating level is an argument.
///
/// Errors: width ≤ 0; source_ohm ≤ 0 (an ideal source cannot be moved);
/// Vt outside (Vol, Vcc); a width that would need Rf below
/// `MIN_FEEDBACK_TO_PULLUP_RATIO`·Rpu.
pub fn feedback_for_source_hysteresis(
    source_ohm: f64,
    pullup_ohm: f64,
    supply_v: f64,
    output_low_v: f64,
    v_other_input: f64,
    wanted_delta_v_at_source: f64,
) -> Result<f64, HysteresisError> {
    let rs = positive("source_ohm", source_ohm)?;
    let rpu = non_negative("pullup_ohm", pullup_ohm)?;
    check_swing(supply_v, output_low_v)?;
    check_level(v_other_input, supply_v, output_low_v)?;
    let delta = positive("wanted_delta_v_at_source", wanted_delta_v_at_source)?;
    let a = v_other_input - output_low_v;
    let b = supply_v - v_other_input;
    if rpu > 0.0 {
        let rf_min = MIN_FEEDBACK_TO_PULLUP_RATIO * rpu;
        let max_v = width(rs, a, b, rf_min, rpu);
        if delta >= max_v {
            return Err(HysteresisError::WidthTooLarge {
                wanted_v: delta,
                max_v,
            });
        }
    }
    Ok(positive_root(a, b, delta / rs, rpu))
}

/// Feedback resistor Rf for a wanted width at the sense node when the
/// feedback goes into the reference node (sense on the inverting input).
///
/// The reference divider is the Thevenin source (`reference_v`,
/// `reference_ohm`); the sense voltage trips where it crosses the node
/// voltage, so the width is `V_node,high − V_node,low`. From the node
/// equations with x = Rs + Rf, a = Vr − Vol, b = Vcc − Vr:
///
/// ```text
/// ΔV = Rs·[a/x + b/(x + Rpu)]
/// ```
///
/// the same quadratic as [`feedback_for_source_hysteresis`] in x; then
/// Rf = x − Rs. The width can never reach Vcc − Vol (Rf → 0 with a
/// push-pull output); with a pull-up, Rf is held at or above
/// `MIN_FEEDBACK_TO_PULLUP_RATIO`·Rpu. Checked against the Analog Devices
/// data sheet's inverting example in the tests.
pub fn feedback_for_reference_hysteresis(
    reference_v: f64,
    reference_ohm: f64,
    pullup_ohm: f64,
    supply_v: f64,
    output_low_v: f64,
    wanted_delta_v_at_sense: f64,
) -> Result<f64, HysteresisError> {
    let rs = positive("reference_ohm", reference_ohm)?;
    let rpu = non_negative("pullup_ohm", pullup_ohm)?;
    check_swing(supply_v, output_low_v)?;
    check_level(reference_v, supply_v, output_low_v)?;
    let delta = positive("wanted_delta_v_at_sense", wanted_delta_v_at_sense)?;
    let a = reference_v - output_low_v;
    let b = supply_v - reference_v;
    let rf_min = MIN_FEEDBACK_TO_PULLUP_RATIO * rpu;
    let max_v = width(rs, a, b, rs + rf_min, rpu);
    if delta >= max_v {
        return Err(HysteresisError::WidthTooLarge {
            wanted_v: delta,
            max_v,
        });
    }
    let x = positive_root(a, b, delta / rs, rpu);
    Ok((x - rs).max(rf_min))
}

/// A series input resistor and the feedback resistor sized with it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SeriesInputNetwork {
    /// Series input resistor Rin between the sense node and the input, Ω
    /// (0 when the sense node is already soft enough).
    pub input_ohm: f64,
    /// Feedback resistor Rf, Ω.
    pub feedback_ohm: f64,
    /// Source resistance seen by the input, R_sense + Rin, Ω.
    pub total_source_ohm: f64,
    /// Offset of the input node caused by the bias current,
    /// I_b·(Rs ∥ (Rf + Rpu)), V (the larger of the two output states).
    pub bias_error_v: f64,
}

/// Size a series input resistor and then Rf for a stiff sense node (sense
/// on the non-inverting input).
///
/// Rule: aim for a total source resistance of
/// min([`DEFAULT_SERIES_INPUT_OHM`], `max_bias_error_v`/`input_bias_a`) —
/// 10 kΩ is common practice (no source), capped so that I_b·Rs stays within
/// the error budget; Rin = that aim − R_sense, or 0 if the sense node is
/// already at least that soft. Rf then comes from
/// [`feedback_for_source_hysteresis`] with Rs = R_sense + Rin. A larger
/// Rs lets Rf be larger (Rf ∝ Rs for a push-pull output), which unloads the
/// output and the sense node. `input_bias_a` = 0 means "ignore bias".
#[allow(clippy::too_many_arguments)]
pub fn series_input_for_feedback(
    sense_ohm: f64,
    pullup_ohm: f64,
    supply_v: f64,
    output_low_v: f64,
    v_other_input: f64,
    wanted_delta_v_at_sense: f64,
    input_bias_a: f64,
    max_bias_error_v: f64,
) -> Result<SeriesInputNetwork, HysteresisError> {
    let r_sense = non_negative("sense_ohm", sense_ohm)?;
    let ib = non_negative("input_bias_a", input_bias_a)?;
    let budget = positive("max_bias_error_v", max_bias_error_v)?;
    let aim = if ib > 0.0 {
        DEFAULT_SERIES_INPUT_OHM.min(budget / ib)
    } else {
        DEFAULT_SERIES_INPUT_OHM
    };
    let input_ohm = (aim - r_sense).max(0.0);
    let total = r_sense + input_ohm;
    let rf = feedback_for_source_hysteresis(
        total,
        pullup_ohm,
        supply_v,
        output_low_v,
        v_other_input,
        wanted_delta_v_at_sense,
    )?;
    let r_high = rf + pullup_ohm;
    Ok(SeriesInputNetwork {
        input_ohm,
        feedback_ohm: rf,
        total_source_ohm: total,
        bias_error_v: ib * total * r_high / (total + r_high),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;
    use proptest::prelude::*;

    /// ABLIC Inc., semiconductor support FAQ, worked example "how to set the
    /// hysteresis voltage of a comparator": V_DD = 3.3 V, V_REF = 1.4 V,
    /// R1 = 2.55 kΩ (input), R2 = 14.4 kΩ (input node to ground),
    /// R3 = 1.4 MΩ (feedback), push-pull output; published results
    /// V_THR = 1.650 V, V_HB = 6 mV. The input is turned into its Thevenin
    /// equivalent Vs = Vin·R2/(R1+R2), Rs = R1∥R2, and the thresholds back
    /// into Vin by dividing by R2/(R1+R2).
    #[test]
    fn published_noninverting_example_push_pull() {
        let (r1, r2, r3) = (2.55e3, 14.4e3, 1.4e6);
        let ratio = r2 / (r1 + r2);
        let rs = r1 * r2 / (r1 + r2);
        let net = FeedbackNetwork::new(0.0, rs, r3, 0.0, 3.3, 0.0).unwrap();
        let (falling, rising) = net.source_thresholds(1.4);
        let (vin_fall, vin_rise) = (falling / ratio, rising / ratio);
        // V_THR = 1.650 V as published (rounded to 1 mV).
        assert!((vin_rise - 1.650).abs() <= 0.0005, "{vin_rise}");
        // V_HB = 6 mV as published (rounded to 1 mV).
        assert!(((vin_rise - vin_fall) - 6e-3).abs() <= 0.5e-3);
        // Sizing back: the note picks R3 = 1.4 MΩ first and rounds
        // R1 = R3·V_HB/V_DD = 2.545 kΩ up to 2.55 kΩ, so with R1 = 2.55 kΩ
        // the exact Rf for 6 mV is 1.4025 MΩ: within the note's rounding
        // (0.2 %) of its 1.4 MΩ.
        let rf = feedback_for_source_hysteresis(rs, 0.0, 3.3, 0.0, 1.4, 6e-3 * ratio).unwrap();
        assert_relative_eq!(rf, 1.4e6, max_relative = 2.5e-3);
    }

    /// Analog Devices, single comparator-with-reference data sheet, Rev. D,
    /// p. 10, Figure 20 (inverting configuration, push-pull output):
    /// V_CC = 5 V, R1 = R2 = R3 = 1 MΩ; published thresholds 1.67 V and
    /// 3.33 V. Here the feedback goes into the divider node (the
    /// "reference-node" placement): Thevenin 2.5 V, 500 kΩ.
    #[test]
    fn published_inverting_example_feedback_into_reference() {
        let net = FeedbackNetwork::new(2.5, 0.5e6, 1e6, 0.0, 5.0, 0.0).unwrap();
        assert!((net.node_voltage_output_high() - 3.33).abs() <= 0.005);
        assert!((net.node_voltage_output_low() - 1.67).abs() <= 0.005);
        // Sizing back from the published width 3.33 − 1.67 (exactly 5/3 V
        // in the network) gives R3 = 1 MΩ.
        let rf = feedback_for_reference_hysteresis(2.5, 0.5e6, 0.0, 5.0, 0.0, 5.0 / 3.0).unwrap();
        assert_relative_eq!(rf, 1e6, max_relative = 1e-12);
    }

    /// S. R. Ball, *Analog Interfacing to Embedded Microprocessors*, 2nd ed.
    /// (Newnes 2004), comparator hysteresis example (book identity from
    /// memory; figures seen in the online copy): V_r = 2.5 V through
    /// R1 = 1 kΩ, R2 = 100 kΩ from a 5 V / 0 V output; published V+ =
    /// 2.5247 V and 2.475 V, hysteresis 0.049 V (truncated).
    #[test]
    fn published_textbook_thresholds() {
        let net = FeedbackNetwork::new(2.5, 1e3, 100e3, 0.0, 5.0, 0.0).unwrap();
        // 2.5247524… printed to four decimals.
        assert!((net.node_voltage_output_high() - 2.5247).abs() <= 1e-4);
        assert!((net.node_voltage_output_low() - 2.475).abs() <= 0.0005);
        let width = net.node_voltage_output_high() - net.node_voltage_output_low();
        assert!((width - 0.049).abs() <= 0.001);
    }

    /// Open-drain equations printed in the Analog Devices data sheet (Rev. D
    /// p. 10, non-inverting, R1 input, R2 feedback):
    /// V_IN_HI = V_REF(R1+R2)/R2, V_IN_LO = [V_REF(R1+R2+R_PU) − V_CC·R1]/(R2+R_PU).
    /// Hand values for R1 = 10 kΩ, R2 = 1 MΩ, R_PU = 10 kΩ, V_REF = 2.5 V,
    /// V_CC = 5 V, V_OL = 0:
    /// V_IN_HI = 2.5·1.01e6/1e6 = 2.525 V;
    /// V_IN_LO = (2.5·1.02e6 − 5·1e4)/1.01e6 = 2.5e6/1.01e6 = 2.475247… V.
    #[test]
    fn published_open_drain_equations() {
        let net = FeedbackNetwork::new(0.0, 10e3, 1e6, 10e3, 5.0, 0.0).unwrap();
        let (lo, hi) = net.source_thresholds(2.5);
        assert_relative_eq!(hi, 2.525, max_relative = 1e-12);
        assert_relative_eq!(lo, 2.5e6 / 1.01e6, max_relative = 1e-12);
    }

    /// Round trip: size Rf for a width, rebuild the network, width
    /// reproduced to 1e-9 V; also the reference-node form.
    #[test]
    fn sizing_round_trip() {
        let (rs, rpu, vcc, vol, vt) = (10e3, 4.7e3, 5.0, 0.2, 2.1);
        for &delta in &[1e-3, 20e-3, 0.3] {
            let rf = feedback_for_source_hysteresis(rs, rpu, vcc, vol, vt, delta).unwrap();
            let net = FeedbackNetwork::new(0.0, rs, rf, rpu, vcc, vol).unwrap();
            assert!((net.source_hysteresis_v(vt) - delta).abs() < 1e-9);
            let rf = feedback_for_reference_hysteresis(vt, rs, rpu, vcc, vol, delta).unwrap();
            let net = FeedbackNetwork::new(vt, rs, rf, rpu, vcc, vol).unwrap();
            let w = net.node_voltage_output_high() - net.node_voltage_output_low();
            assert!((w - delta).abs() < 1e-9);
        }
    }

    proptest! {
        #[test]
        fn round_trip_any_network(
            rs in 10.0f64..1e5, rpu in 0.0f64..2e4, vol in 0.0f64..0.5,
            vcc in 3.0f64..30.0, frac in 0.1f64..0.9, rel in 1e-4f64..0.05,
        ) {
            let vt = vol + frac * (vcc - vol);
            let delta = rel * (vcc - vol) * (rs / (rs + 20.0 * rpu + 1e3)).min(1.0);
            match feedback_for_source_hysteresis(rs, rpu, vcc, vol, vt, delta) {
                Ok(rf) => {
                    prop_assert!(rf.is_finite() && rf > 0.0);
                    let net = FeedbackNetwork::new(0.0, rs, rf, rpu, vcc, vol).unwrap();
                    prop_assert!((net.source_hysteresis_v(vt) - delta).abs() < 1e-9);
                }
                Err(HysteresisError::WidthTooLarge { max_v, .. }) => prop_assert!(delta >= max_v),
                Err(e) => prop_assert!(false, "{e}"),
            }
        }
    }

    /// Rf → ∞: both thresholds collapse onto Vt and the width goes to zero
    /// (as 1/Rf for large Rf).
    #[test]
    fn no_feedback_no_hysteresis() {
        let net = FeedbackNetwork::new(1.0, 50.0, f64::INFINITY, 10e3, 5.0, 0.2).unwrap();
        assert_eq!(net.source_thresholds(2.0), (2.0, 2.0));
        assert_eq!(net.node_voltage_output_high(), 1.0);
        assert_eq!(net.node_voltage_output_low(), 1.0);
        let w = |rf: f64| {
            FeedbackNetwork::new(1.0, 50.0, rf, 10e3, 5.0, 0.2)
                .unwrap()
                .source_hysteresis_v(2.0)
        };
        // Hand: Rs·[(Vt−Vol)/Rf + (Vcc−Vt)/(Rf+Rpu)] → 50·(1.8 + 3)/Rf.
        assert_relative_eq!(w(1e12) * 1e12, 50.0 * 4.8, max_relative = 1e-6);
        assert!(w(1e9) < w(1e6));
    }

    /// A stiff 50 Ω sense node cannot give 50 mV against a 10 kΩ pull-up
    /// without Rf < 10·Rpu; a 10 kΩ series input resistor fixes it.
    #[test]
    fn stiff_source_needs_series_input() {
        let err = feedback_for_source_hysteresis(50.0, 10e3, 5.0, 0.2, 2.5, 50e-3).unwrap_err();
        // Hand: max = 50·(2.3/1e5 + 2.5/1.1e5) = 2.2864 mV.
        match err {
            HysteresisError::WidthTooLarge { max_v, .. } => {
                assert_relative_eq!(
                    max_v,
                    50.0 * (2.3 / 1e5 + 2.5 / 1.1e5),
                    max_relative = 1e-12
                )
            }
            e => panic!("{e}"),
        }
        let s = series_input_for_feedback(50.0, 10e3, 5.0, 0.2, 2.5, 50e-3, 250e-9, 5e-3).unwrap();
        assert_relative_eq!(s.input_ohm, 9950.0, max_relative = 1e-12);
        assert_relative_eq!(s.total_source_ohm, 10e3, max_relative = 1e-12);
        assert!(s.feedback_ohm >= MIN_FEEDBACK_TO_PULLUP_RATIO * 10e3);
        assert!(s.bias_error_v <= 250e-9 * 10e3);
        // Bias budget 1 mV with 250 nA caps the total at 4 kΩ.
        let s = series_input_for_feedback(50.0, 1e3, 5.0, 0.2, 2.5, 20e-3, 250e-9, 1e-3).unwrap();
        assert_relative_eq!(s.total_source_ohm, 4e3, max_relative = 1e-12);
        // A sense node already softer than the aim gets no series resistor.
        let s = series_input_for_feedback(20e3, 1e3, 5.0, 0.2, 2.5, 20e-3, 0.0, 1e-3).unwrap();
        assert_eq!(s.input_ohm, 0.0);
    }

    #[test]
    fn errors() {
        assert!(matches!(
            feedback_for_source_hysteresis(1e3, 1e3, 5.0, 0.2, 2.5, 0.0),
            Err(HysteresisError::Value(ValueError::NotPositive { .. }))
        ));
        assert!(matches!(
            feedback_for_source_hysteresis(1e3, 1e3, 5.0, 0.2, 5.5, 1e-3),
            Err(HysteresisError::LevelOutsideSwing { .. })
        ));
        assert!(matches!(
            feedback_for_source_hysteresis(0.0, 1e3, 5.0, 0.2, 2.5, 1e-3),
            Err(HysteresisError::Value(ValueError::NotPositive { .. }))
        ));
        // Reference node with push-pull output: width must stay below the
        // full swing Vcc − Vol = 4.8 V.
        assert!(matches!(
            feedback_for_reference_hysteresis(2.5, 1e3, 0.0, 5.0, 0.2, 4.9),
            Err(HysteresisError::WidthTooLarge { .. })
        ));
        assert!(matches!(
            FeedbackNetwork::new(1.0, 1e3, 1e5, 1e3, 0.1, 0.2),
            Err(HysteresisError::SupplyNotAboveOutputLow { .. })
        ));
        assert!(matches!(
            FeedbackNetwork::new(f64::NAN, 1e3, 1e5, 1e3, 5.0, 0.2),
            Err(HysteresisError::Value(ValueError::NotFinite { .. }))
        ));
        assert!(matches!(
            FeedbackNetwork::new(1.0, -1.0, 1e5, 1e3, 5.0, 0.2),
            Err(HysteresisError::Value(ValueError::Negative { .. }))
        ));
    }

    /// Output loading, hand values: Vcc = 5, Vol = 0.2, Rpu = 10 kΩ,
    /// Rf = 1 MΩ, node 2.5 V. Sink = 4.8/1e4 + 2.3/1e6 = 482.3 µA;
    /// output high = 5 − 2.5·1e4/1.01e6 = 4.975247… V.
    #[test]
    fn output_loading() {
        let net = FeedbackNetwork::new(2.5, 1e3, 1e6, 10e3, 5.0, 0.2).unwrap();
        assert_relative_eq!(
            net.output_sink_current_a(2.5),
            482.3e-6,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            net.output_high_v(2.5),
            5.0 - 2.5e4 / 1.01e6,
            max_relative = 1e-12
        );
        // Push-pull: only the feedback branch, 2.3 V / 1 MΩ = 2.3 µA.
        let pp = FeedbackNetwork::new(2.5, 1e3, 1e6, 0.0, 5.0, 0.2).unwrap();
        assert_relative_eq!(pp.output_sink_current_a(2.5), 2.3e-6, max_relative = 1e-12);
    }
}
