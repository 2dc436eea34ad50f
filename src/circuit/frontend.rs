//! The comparator front end: which signal goes to which input, where the
//! hysteresis feedback goes, and the sense voltages at which the output
//! switches.
//!
//! An open-collector comparator sinks current (output low) when its
//! non-inverting input is below its inverting input. Positive feedback `Rf`
//! from the output to the non-inverting input moves that input's level with
//! the output state, which gives two switching points (hysteresis). The
//! level of a node fed by two Thevenin sources follows Millman's theorem:
//! `V = (V1/R1 + V2/R2)/(1/R1 + 1/R2)` (J. Millman, "A useful network
//! theorem", Proc. IRE 28 (1940) 413–417).

use super::divider::Divider;

/// Which signal the non-inverting input sees.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Arrangement {
    /// Reference divider wiper on the non-inverting input, sense node on the
    /// inverting input; feedback goes into the reference node.
    ReferenceOnNonInverting,
    /// Sense node on the non-inverting input through a series input
    /// resistor (the sense node itself is too stiff to move), reference on
    /// the inverting input; feedback goes to the non-inverting input.
    SenseOnNonInverting,
}

/// The comparator's output state.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum OutputState {
    /// Output transistor off: the output node is pulled up.
    High,
    /// Output transistor on: the output sits at its low voltage.
    Low,
}

impl OutputState {
    /// The other state.
    pub fn other(self) -> Self {
        match self {
            OutputState::High => OutputState::Low,
            OutputState::Low => OutputState::High,
        }
    }
}

/// Millman's theorem for two Thevenin sources into one node.
pub fn millman(v1: f64, r1: f64, v2: f64, r2: f64) -> f64 {
    (v1 / r1 + v2 / r2) / (1.0 / r1 + 1.0 / r2)
}

/// The front end with its values (SI).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FrontEnd {
    /// Input arrangement.
    pub arrangement: Arrangement,
    /// The reference divider.
    pub divider: Divider,
    /// Voltage of the rail the divider hangs from, V.
    pub reference_rail_v: f64,
    /// Feedback resistor, ohm (`None`: no hysteresis).
    pub feedback_ohm: Option<f64>,
    /// Series input resistor on the sense path, ohm (0 when absent).
    pub input_ohm: f64,
    /// Output-high Thevenin source seen by the feedback resistor: (V, ohm).
    pub output_high: (f64, f64),
    /// Output low voltage, V.
    pub output_low_v: f64,
}

impl FrontEnd {
    /// The output as a Thevenin source seen through the feedback resistor
    /// `rf` in `state`: (V, ohm).
    pub fn output_source(&self, state: OutputState, rf: f64) -> (f64, f64) {
        match state {
            OutputState::High => (self.output_high.0, self.output_high.1 + rf),
            OutputState::Low => (self.output_low_v, rf),
        }
    }

    /// The sense-node voltage at which the comparator switches out of
    /// `state`, with the trimmer at `x` and the sense node's own source
    /// resistance `sense_source_ohm`.
    pub fn switching_sense_v(&self, x: f64, state: OutputState, sense_source_ohm: f64) -> f64 {
        let (v_th, r_th) = self.divider.thevenin(self.reference_rail_v, x);
        match (self.arrangement, self.feedback_ohm) {
            (_, None) => v_th,
            (Arrangement::ReferenceOnNonInverting, Some(rf)) => {
                let (vo, ro) = self.output_source(state, rf);
                millman(v_th, r_th, vo, ro)
            }
            (Arrangement::SenseOnNonInverting, Some(rf)) => {
                // V+ = Millman(Vs, R1; Vo, Ro) = V−  ⇒  Vs = (V−·(1/R1 + 1/Ro) − Vo/Ro)·R1.
                let (vo, ro) = self.output_source(state, rf);
                let r1 = sense_source_ohm + self.input_ohm;
                (v_th * (1.0 / r1 + 1.0 / ro) - vo / ro) * r1
            }
        }
    }

    /// The trimmer position at which the comparator switches out of `state`
    /// at sense level `v_t`, in closed form; `None` when no position in
    /// −1 … 2 gives it (the caller then searches).
    ///
    /// With L = Rb + x·Rp the divider's lower part, T its total and
    /// U = T − L, the wiper's Thevenin source is (V·L/T, L·U/T)
    /// (Thevenin's theorem). Millman's theorem at the input then gives:
    /// - no feedback: V·L/T = v_t, linear in L;
    /// - sense on the non-inverting input: the inverting input must sit at
    ///   c = (v_t/R1 + Vo/Ro)/(1/R1 + 1/Ro), again linear (V·L/T = c);
    /// - reference on the non-inverting input:
    ///   (V·L·Ro + Vo·L·U)/(Ro·T + L·U) = v_t, which multiplies out to the
    ///   quadratic −(Vo − v_t)·L² + ((Vo − v_t)·T + V·Ro)·L − v_t·Ro·T = 0.
    pub fn position_for_switching_sense(
        &self,
        v_t: f64,
        state: OutputState,
        sense_source_ohm: f64,
    ) -> Option<f64> {
        let d = &self.divider;
        let total = d.total_ohm();
        let rail = self.reference_rail_v;
        let x_of = |lower: f64| (lower - d.bottom_ohm) / d.trimmer_ohm;
        let in_reach = |x: &f64| x.is_finite() && (-1.0..=2.0).contains(x);
        let linear = |wiper_v: f64| Some(x_of(wiper_v / rail * total)).filter(in_reach);
        match (self.arrangement, self.feedback_ohm) {
            (_, None) => linear(v_t),
            (Arrangement::SenseOnNonInverting, Some(rf)) => {
                let (vo, ro) = self.output_source(state, rf);
                let r1 = sense_source_ohm + self.input_ohm;
                linear(millman(v_t, r1, vo, ro))
            }
            (Arrangement::ReferenceOnNonInverting, Some(rf)) => {
                let (vo, ro) = self.output_source(state, rf);
                let a = -(vo - v_t);
                let b = (vo - v_t) * total + rail * ro;
                let c = -v_t * ro * total;
                let roots = crate::roots::quadratic_roots(a, b, c)?;
                // The physical root: the lower part within the divider.
                let fits = |l: &f64| (0.0..=total).contains(l);
                let lower = match roots {
                    (r0, r1) if fits(&r0) && !fits(&r1) => r0,
                    (r0, r1) if fits(&r1) && !fits(&r0) => r1,
                    _ => return None,
                };
                Some(x_of(lower)).filter(in_reach)
            }
        }
    }

    /// Voltages at the two comparator inputs (non-inverting, inverting) for
    /// a sense voltage `sense_v`, trimmer `x` and output `state`.
    pub fn input_voltages(
        &self,
        sense_v: f64,
        x: f64,
        state: OutputState,
        sense_source_ohm: f64,
    ) -> (f64, f64) {
        let (v_th, r_th) = self.divider.thevenin(self.reference_rail_v, x);
        match self.arrangement {
            Arrangement::ReferenceOnNonInverting => {
                let vp = match self.feedback_ohm {
                    Some(rf) => {
                        let (vo, ro) = self.output_source(state, rf);
                        millman(v_th, r_th, vo, ro)
                    }
                    None => v_th,
                };
                (vp, sense_v)
            }
            Arrangement::SenseOnNonInverting => {
                let vp = match self.feedback_ohm {
                    Some(rf) => {
                        let (vo, ro) = self.output_source(state, rf);
                        millman(sense_v, sense_source_ohm + self.input_ohm, vo, ro)
                    }
                    None => sense_v,
                };
                (vp, v_th)
            }
        }
    }

    /// Source resistance seen by each input (non-inverting, inverting), ohm,
    /// for the bias-current error.
    pub fn input_source_ohm(&self, x: f64, sense_source_ohm: f64) -> (f64, f64) {
        let (_, r_th) = self.divider.thevenin(self.reference_rail_v, x);
        let with_fb = |r: f64| match self.feedback_ohm {
            Some(rf) => r * rf / (r + rf),
            None => r,
        };
        match self.arrangement {
            Arrangement::ReferenceOnNonInverting => (with_fb(r_th), sense_source_ohm),
            Arrangement::SenseOnNonInverting => (with_fb(sense_source_ohm + self.input_ohm), r_th),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn millman_of_equal_sources_is_the_mean() {
        // Hand calculation: two 1 kΩ sources at 0 V and 10 V meet at 5 V.
        assert!((millman(0.0, 1e3, 10.0, 1e3) - 5.0).abs() < 1e-12);
        // Hand calculation: 12 V through 1 kΩ against 0 V through 3 kΩ → 9 V.
        assert!((millman(12.0, 1e3, 0.0, 3e3) - 9.0).abs() < 1e-12);
    }

    #[test]
    fn sense_side_threshold_reproduces_equal_inputs() {
        // Invariant: at the returned sense voltage both inputs are equal.
        let fe = FrontEnd {
            arrangement: Arrangement::SenseOnNonInverting,
            divider: Divider {
                top_ohm: 10e3,
                trimmer_ohm: 5e3,
                bottom_ohm: 10e3,
            },
            reference_rail_v: 5.0,
            feedback_ohm: Some(1e6),
            input_ohm: 10e3,
            output_high: (5.0, 10e3),
            output_low_v: 0.2,
        };
        for state in [OutputState::High, OutputState::Low] {
            let vs = fe.switching_sense_v(0.4, state, 30.0);
            let (vp, vn) = fe.input_voltages(vs, 0.4, state, 30.0);
            assert!((vp - vn).abs() < 1e-12);
        }
    }

    #[test]
    fn agrees_with_the_published_feedback_equations() {
        // Reference: the open-drain hysteresis equations as implemented and
        // checked against the Analog Devices comparator data sheet (Rev. D,
        // p. 10) and the ABLIC worked example in circuit::hysteresis. Both
        // placements of the feedback must give the same switching levels.
        use crate::circuit::hysteresis::FeedbackNetwork;
        let divider = Divider {
            top_ohm: 47e3,
            trimmer_ohm: 5e3,
            bottom_ohm: 6.2e3,
        };
        let (x, rail, rf, rpu, vol, src) = (0.525, 5.0, 12e6, 10e3, 0.4, 7.7);
        let base = FrontEnd {
            arrangement: Arrangement::SenseOnNonInverting,
            divider,
            reference_rail_v: rail,
            feedback_ohm: Some(rf),
            input_ohm: 10e3,
            output_high: (rail, rpu),
            output_low_v: vol,
        };
        let (v_th, r_th) = divider.thevenin(rail, x);
        // Sense side: thresholds of the source against the reference.
        let net = FeedbackNetwork::new(0.0, src + 10e3, rf, rpu, rail, vol).unwrap();
        let (vs_high, vs_low) = net.source_thresholds(v_th);
        assert!((base.switching_sense_v(x, OutputState::High, src) - vs_high).abs() < 1e-12);
        assert!((base.switching_sense_v(x, OutputState::Low, src) - vs_low).abs() < 1e-12);
        // Reference side: the sense trips at the reference node's two levels.
        let fe = FrontEnd {
            arrangement: Arrangement::ReferenceOnNonInverting,
            input_ohm: 0.0,
            ..base
        };
        let net = FeedbackNetwork::new(v_th, r_th, rf, rpu, rail, vol).unwrap();
        assert!(
            (fe.switching_sense_v(x, OutputState::High, src) - net.node_voltage_output_high())
                .abs()
                < 1e-12
        );
        assert!(
            (fe.switching_sense_v(x, OutputState::Low, src) - net.node_voltage_output_low()).abs()
                < 1e-12
        );
    }

    use proptest::prelude::*;

    proptest! {
        /// Invariant: the closed-form trimmer position reproduces the level
        /// it was asked for, in both arrangements, both states, with and
        /// without feedback (the forward map is Thevenin + Millman).
        #[test]
        fn closed_form_position_reproduces_its_level(
            top in 1e3f64..1e6, trimmer in 1e2f64..1e5, bottom in 1e3f64..1e6,
            rail in 2.0f64..24.0, x in 0.0f64..1.0, rf_ln in 9.0f64..18.4,
            with_fb in any::<bool>(), sense_side in any::<bool>(), high in any::<bool>(),
            src in 1.0f64..1e4, vol in 0.0f64..0.5, rpu in 1e2f64..1e5,
        ) {
            let fe = FrontEnd {
                arrangement: if sense_side {
                    Arrangement::SenseOnNonInverting
                } else {
                    Arrangement::ReferenceOnNonInverting
                },
                divider: Divider { top_ohm: top, trimmer_ohm: trimmer, bottom_ohm: bottom },
                reference_rail_v: rail,
                feedback_ohm: with_fb.then(|| rf_ln.exp()),
                input_ohm: 1e3,
                output_high: (rail, rpu),
                output_low_v: vol,
            };
            let state = if high { OutputState::High } else { OutputState::Low };
            let v_t = fe.switching_sense_v(x, state, src);
            let found = fe.position_for_switching_sense(v_t, state, src);
            prop_assert!(found.is_some(), "no closed-form position for x = {x}");
            let back = fe.switching_sense_v(found.unwrap(), state, src);
            prop_assert!((back - v_t).abs() <= 1e-9 * v_t.abs().max(1e-3),
                "x = {x}: level {v_t} V, closed form gives {back} V");
        }
    }
}
