//! Output stage: a saturated bipolar transistor switch and its loads (LED,
//! relay coil with flyback diode, buzzer), with every rating checked.
//!
//! Saturated-switch design follows the usual textbook method (e.g.
//! P. Horowitz & W. Hill, *The Art of Electronics*, 3rd ed., Cambridge
//! 2015, §2.2.1 "transistor switch"): choose a forced gain β_F = I_C/I_B
//! well below the minimum h_FE so that the transistor stays saturated for
//! every part, then size the base resistor from the drive voltage less
//! V_BE(on).

use thiserror::Error;

use super::value::{finite, non_negative, positive, ValueError};

/// Forced gain used when none is given, 10 (common practice, no source:
/// 10–20 is usual for a hard-saturated small-signal switch).
pub const DEFAULT_FORCED_GAIN: f64 = 10.0;

/// Ratio of the base–emitter hold-off resistor to the base resistor, 10
/// (common practice, no source).
pub const DEFAULT_HOLD_OFF_RATIO: f64 = 10.0;

/// Least ratio of a flyback diode's repetitive reverse voltage to the
/// supply it blocks, 2 (common practice, no source).
pub const DEFAULT_FLYBACK_VOLTAGE_MARGIN: f64 = 2.0;

/// Why a switch or load cannot be designed or checked.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
pub enum SwitchError {
    /// A parameter is not finite, not positive or negative where it must
    /// not be.
    #[error(transparent)]
    Value(#[from] ValueError),
    /// Not enough voltage to drive the load or the base.
    #[error("available voltage {available_v} V must exceed {needed_v} V")]
    NoHeadroom {
        /// Voltage available, V.
        available_v: f64,
        /// Voltage needed, V.
        needed_v: f64,
    },
}

/// Where the switch sits.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SwitchPolarity {
    /// NPN, emitter to ground, load between the supply and the collector;
    /// turned on by a high drive level.
    NpnLowSide,
    /// PNP, emitter to the supply, load between the collector and ground;
    /// turned on by a low drive level (the comparator output sinking).
    PnpHighSide,
}

impl SwitchPolarity {
    /// Voltage across the base resistor and the base–emitter junction in
    /// series when the switch is on, V: NPN low-side, the drive level
    /// itself (emitter at 0 V); PNP high-side, `supply_v − drive_on_v`.
    /// For an NPN fed through the comparator's pull-up, the pull-up is in
    /// series with the base resistor and comes off the base resistor value.
    pub fn drive_span_v(self, supply_v: f64, drive_on_v: f64) -> f64 {
        match self {
            SwitchPolarity::NpnLowSide => drive_on_v,
            SwitchPolarity::PnpHighSide => supply_v - drive_on_v,
        }
    }
}

/// Data-sheet figures of a bipolar transistor used as a switch.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TransistorRatings {
    /// Collector–emitter breakdown |V_CEO|, V.
    pub vce_max_v: f64,
    /// Largest continuous collector current, A.
    pub ic_max_a: f64,
    /// Largest total dissipation (at the data sheet's ambient), W.
    pub p_max_w: f64,
    /// Minimum DC current gain h_FE at the operating current.
    pub hfe_min: f64,
    /// Collector–emitter saturation voltage |V_CE(sat)|, V.
    pub vce_sat_v: f64,
    /// Base–emitter on voltage |V_BE(on)|, V.
    pub vbe_on_v: f64,
}

impl TransistorRatings {
    /// Validate and build a rating set (all values > 0).
    pub fn new(
        vce_max_v: f64,
        ic_max_a: f64,
        p_max_w: f64,
        hfe_min: f64,
        vce_sat_v: f64,
        vbe_on_v: f64,
    ) -> Result<Self, SwitchError> {
        positive("vce_max_v", vce_max_v)?;
        positive("ic_max_a", ic_max_a)?;
        positive("p_max_w", p_max_w)?;
        positive("hfe_min", hfe_min)?;
        positive("vce_sat_v", vce_sat_v)?;
        positive("vbe_on_v", vbe_on_v)?;
        Ok(Self {
            vce_max_v,
            ic_max_a,
            p_max_w,
            hfe_min,
            vce_sat_v,
            vbe_on_v,
        })
    }

    /// Typical of the small-signal transistor class (TO-92, NPN or PNP),
    /// no specific part: 40 V, 0.2 A, 0.5 W, h_FE ≥ 100, V_CE(sat) 0.3 V,
    /// V_BE(on) 0.7 V (typical class figures, memory).
    pub fn typical_small_signal() -> Self {
        Self {
            vce_max_v: 40.0,
            ic_max_a: 0.2,
            p_max_w: 0.5,
            hfe_min: 100.0,
            vce_sat_v: 0.3,
            vbe_on_v: 0.7,
        }
    }
}

/// A base drive sized for a forced gain.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BaseDrive {
    /// Ideal base resistor, Ω (snap it to an E-series value at or below, so
    /// that the forced gain stays at or below the target).
    pub base_ohm: f64,
    /// Base–emitter hold-off resistor, Ω.
    pub hold_off_ohm: f64,
    /// Base current I_C/β_F, A.
    pub base_current_a: f64,
    /// Current through the base resistor (base current plus hold-off
    /// current), which the driver sinks (PNP) or sources (NPN), A.
    pub drive_current_a: f64,
}

/// Size the base resistor and the base–emitter hold-off resistor of a
/// saturated switch.
///
/// `drive_span_v`: see [`SwitchPolarity::drive_span_v`]. `leakage_a`: the
/// largest current into the base node with the driver off (driver off-state
/// leakage plus the transistor's I_CBO).
///
/// Hold-off resistor (common practice, no source): R_BE = 10·R_B, but no
/// more than (V_BE(on)/2)/I_leak so that leakage alone keeps V_BE below half
/// its on value. With the switch on, R_B carries I_B + V_BE/R_BE:
///
/// ```text
/// R_BE = k·R_B:      R_B = (V_span − V_BE − V_BE/k) / I_B
/// R_BE = R_leak:     R_B = (V_span − V_BE) / (I_B + V_BE/R_leak)
/// ```
///
/// (Kirchhoff's current law at the base), with I_B = I_C/β_F.
pub fn design_base_drive(
    load_a: f64,
    forced_gain: f64,
    drive_span_v: f64,
    transistor: &TransistorRatings,
    leakage_a: f64,
) -> Result<BaseDrive, SwitchError> {
    let ic = positive("load_a", load_a)?;
    let beta = positive("forced_gain", forced_gain)?;
    let span = finite("drive_span_v", drive_span_v)?;
    let leak = non_negative("leakage_a", leakage_a)?;
    let vbe = transistor.vbe_on_v;
    let k = DEFAULT_HOLD_OFF_RATIO;
    let needed_v = vbe * (1.0 + 1.0 / k);
    if span <= needed_v {
        return Err(SwitchError::NoHeadroom {
            available_v: span,
            needed_v,
        });
    }
    let ib = ic / beta;
    let mut base_ohm = (span - needed_v) / ib;
    let mut hold_off_ohm = k * base_ohm;
    if leak > 0.0 {
        let r_leak = 0.5 * vbe / leak;
        if hold_off_ohm > r_leak {
            hold_off_ohm = r_leak;
            base_ohm = (span - vbe) / (ib + vbe / r_leak);
        }
    }
    Ok(BaseDrive {
        base_ohm,
        hold_off_ohm,
        base_current_a: ib,
        drive_current_a: (span - vbe) / base_ohm,
    })
}

/// Base current and forced gain obtained with given (e.g. E-series)
/// resistors: I_B = (V_span − V_BE)/R_B − V_BE/R_BE, β_F = I_C/I_B. Returns
/// `(base_current_a, forced_gain)`; `hold_off_ohm = f64::INFINITY` means
/// none fitted.
pub fn forced_gain_with(
    load_a: f64,
    drive_span_v: f64,
    base_ohm: f64,
    hold_off_ohm: f64,
    vbe_on_v: f64,
) -> Result<(f64, f64), SwitchError> {
    let ic = positive("load_a", load_a)?;
    let rb = positive("base_ohm", base_ohm)?;
    if hold_off_ohm.is_nan() || hold_off_ohm <= 0.0 {
        return Err(SwitchError::Value(ValueError::NotPositive {
            name: "hold_off_ohm",
            value: hold_off_ohm,
        }));
    }
    let vbe = positive("vbe_on_v", vbe_on_v)?;
    let span = finite("drive_span_v", drive_span_v)?;
    let ib = (span - vbe) / rb - vbe / hold_off_ohm;
    if ib <= 0.0 {
        return Err(SwitchError::NoHeadroom {
            available_v: span,
            needed_v: vbe * (1.0 + rb / hold_off_ohm),
        });
    }
    Ok((ib, ic / ib))
}

/// Transistor check, margins negative when a limit is broken.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SwitchCheck {
    /// `vce_max − off-state V_CE`, V.
    pub vce_margin_v: f64,
    /// `ic_max − I_C`, A.
    pub ic_margin_a: f64,
    /// On-state dissipation V_CE(sat)·I_C + V_BE·I_B, W.
    pub power_w: f64,
    /// `p_max − power_w`, W.
    pub power_margin_w: f64,
    /// h_FE(min)/β_F; ≥ 1 keeps every part saturated.
    pub gain_ratio: f64,
    /// True when every margin is ≥ 0 and `gain_ratio ≥ 1`.
    pub ok: bool,
}

/// Check a transistor switch: off-state voltage `off_vce_v` (the supply for
/// a resistive load, [`flyback_peak_vce_v`] for a coil), collector current,
/// actual base current. Dissipation P = V_CE(sat)·I_C + V_BE·I_B
/// (saturated switch, Horowitz & Hill as in the module text).
pub fn check_switch(
    transistor: &TransistorRatings,
    off_vce_v: f64,
    load_a: f64,
    base_current_a: f64,
) -> Result<SwitchCheck, SwitchError> {
    let v = non_negative("off_vce_v", off_vce_v)?;
    let ic = positive("load_a", load_a)?;
    let ib = positive("base_current_a", base_current_a)?;
    let t = transistor;
    let power_w = t.vce_sat_v * ic + t.vbe_on_v * ib;
    let vce_margin_v = t.vce_max_v - v;
    let ic_margin_a = t.ic_max_a - ic;
    let power_margin_w = t.p_max_w - power_w;
    let gain_ratio = t.hfe_min / (ic / ib);
    Ok(SwitchCheck {
        vce_margin_v,
        ic_margin_a,
        power_w,
        power_margin_w,
        gain_ratio,
        ok: vce_margin_v >= 0.0 && ic_margin_a >= 0.0 && power_margin_w >= 0.0 && gain_ratio >= 1.0,
    })
}

/// An indicator LED.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LedLoad {
    /// Forward voltage at the operating current, V.
    pub forward_v: f64,
    /// Wanted current, A.
    pub current_a: f64,
}

impl LedLoad {
    /// Validate and build an LED load.
    pub fn new(forward_v: f64, current_a: f64) -> Result<Self, SwitchError> {
        positive("forward_v", forward_v)?;
        positive("current_a", current_a)?;
        Ok(Self {
            forward_v,
            current_a,
        })
    }

    /// Series resistor R = (V_supply − V_F − V_sw)/I (Ohm's law), Ω, where
    /// `switch_drop_v` is the transistor's V_CE(sat) or the comparator's
    /// V_OL when it drives the LED directly.
    pub fn series_resistor_ohm(
        &self,
        supply_v: f64,
        switch_drop_v: f64,
    ) -> Result<f64, SwitchError> {
        Ok(self.resistor_voltage_v(supply_v, switch_drop_v)? / self.current_a)
    }

    /// Current with a chosen resistor, (V_supply − V_F − V_sw)/R, A.
    pub fn current_with(
        &self,
        resistor_ohm: f64,
        supply_v: f64,
        switch_drop_v: f64,
    ) -> Result<f64, SwitchError> {
        Ok(self.resistor_voltage_v(supply_v, switch_drop_v)?
            / positive("resistor_ohm", resistor_ohm)?)
    }

    /// Resistor dissipation I²·R, W.
    pub fn resistor_dissipation_w(&self, resistor_ohm: f64, current_a: f64) -> f64 {
        current_a * current_a * resistor_ohm
    }

    /// LED dissipation V_F·I, W.
    pub fn led_dissipation_w(&self, current_a: f64) -> f64 {
        self.forward_v * current_a
    }

    fn resistor_voltage_v(&self, supply_v: f64, switch_drop_v: f64) -> Result<f64, SwitchError> {
        let vs = finite("supply_v", supply_v)?;
        let drop = non_negative("switch_drop_v", switch_drop_v)?;
        let v = vs - self.forward_v - drop;
        if v > 0.0 {
            Ok(v)
        } else {
            Err(SwitchError::NoHeadroom {
                available_v: vs,
                needed_v: self.forward_v + drop,
            })
        }
    }
}

/// A relay coil (DC).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RelayCoil {
    /// Rated coil voltage, V.
    pub coil_v: f64,
    /// Coil resistance, Ω.
    pub coil_ohm: f64,
}

impl RelayCoil {
    /// Validate and build a coil.
    pub fn new(coil_v: f64, coil_ohm: f64) -> Result<Self, SwitchError> {
        positive("coil_v", coil_v)?;
        positive("coil_ohm", coil_ohm)?;
        Ok(Self { coil_v, coil_ohm })
    }

    /// Coil current at rated voltage, V/R, A.
    pub fn rated_current_a(&self) -> f64 {
        self.coil_v / self.coil_ohm
    }

    /// Coil current with `applied_v` across it (supply less V_CE(sat)), A.
    pub fn current_at(&self, applied_v: f64) -> f64 {
        applied_v / self.coil_ohm
    }

    /// Applied voltage as a share of the rated coil voltage; compare it
    /// with the relay's must-operate share (often about 0.7–0.8, relay data
    /// sheets, common practice) and its maximum (often 1.1–1.3).
    pub fn applied_fraction(&self, applied_v: f64) -> f64 {
        applied_v / self.coil_v
    }
}

/// A DC buzzer with built-in driver.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BuzzerLoad {
    /// Rated voltage, V.
    pub rated_v: f64,
    /// Current at rated voltage, A.
    pub current_a: f64,
}

impl BuzzerLoad {
    /// Validate and build a buzzer load.
    pub fn new(rated_v: f64, current_a: f64) -> Result<Self, SwitchError> {
        positive("rated_v", rated_v)?;
        positive("current_a", current_a)?;
        Ok(Self { rated_v, current_a })
    }

    /// Is `applied_v` within the rating? Margin `rated_v − applied_v`, V.
    pub fn voltage_ok(&self, applied_v: f64) -> (bool, f64) {
        let margin = self.rated_v - applied_v;
        (margin >= 0.0, margin)
    }
}

/// Data-sheet figures of a rectifier diode.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DiodeRatings {
    /// Repetitive peak reverse voltage V_RRM, V.
    pub vrrm_v: f64,
    /// Average forward current I_F(AV), A.
    pub if_avg_a: f64,
    /// Forward voltage at its rated current, V.
    pub forward_v: f64,
}

impl DiodeRatings {
    /// Validate and build a diode rating set.
    pub fn new(vrrm_v: f64, if_avg_a: f64, forward_v: f64) -> Result<Self, SwitchError> {
        positive("vrrm_v", vrrm_v)?;
        positive("if_avg_a", if_avg_a)?;
        positive("forward_v", forward_v)?;
        Ok(Self {
            vrrm_v,
            if_avg_a,
            forward_v,
        })
    }

    /// Typical of the general-purpose silicon rectifier class, no specific
    /// part: 400 V, 1 A, 1.0 V forward (typical class figures, memory).
    pub fn typical_rectifier() -> Self {
        Self {
            vrrm_v: 400.0,
            if_avg_a: 1.0,
            forward_v: 1.0,
        }
    }
}

/// Flyback diode check, margins negative when a limit is broken.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FlybackCheck {
    /// `vrrm − margin·supply`, V.
    pub reverse_margin_v: f64,
    /// `if_avg − coil current`, A.
    pub current_margin_a: f64,
    /// True when both margins are ≥ 0.
    pub ok: bool,
}

/// Check a flyback diode across a coil. With the switch on the diode
/// blocks the supply; at switch-off it takes the whole coil current, which
/// then decays with the coil's L/R. Requirements (common practice, no
/// source): V_RRM ≥ `voltage_margin` × supply, and I_F(AV) ≥ the coil
/// current (conservative: the pulse is short, but the rating then covers
/// any switching rate).
///
/// Release time: a plain diode makes the relay release slowest, because the
/// current circulates in the coil; a Zener in series with the diode speeds
/// release at the cost of a higher off-state V_CE (supply + V_Z) (common
/// practice, no source).
pub fn check_flyback_diode(
    diode: &DiodeRatings,
    supply_v: f64,
    coil_current_a: f64,
    voltage_margin: f64,
) -> Result<FlybackCheck, SwitchError> {
    let vs = non_negative("supply_v", supply_v)?;
    let i = non_negative("coil_current_a", coil_current_a)?;
    let m = positive("voltage_margin", voltage_margin)?;
    let reverse_margin_v = diode.vrrm_v - m * vs;
    let current_margin_a = diode.if_avg_a - i;
    Ok(FlybackCheck {
        reverse_margin_v,
        current_margin_a,
        ok: reverse_margin_v >= 0.0 && current_margin_a >= 0.0,
    })
}

/// Peak collector–emitter voltage at switch-off of a coil clamped by a
/// diode across it: supply + diode forward voltage, V (the collector is
/// held one diode drop beyond the supply).
pub fn flyback_peak_vce_v(supply_v: f64, diode_forward_v: f64) -> f64 {
    supply_v + diode_forward_v
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Hand: 12 V supply, LED 2.0 V at 10 mA, switch 0.3 V:
    /// R = (12 − 2 − 0.3)/0.01 = 970 Ω; with 1 kΩ, I = 9.7 mA;
    /// P_R = 0.0097²·1000 = 94.09 mW; P_LED = 2·0.0097 = 19.4 mW.
    #[test]
    fn led_resistor() {
        let led = LedLoad::new(2.0, 10e-3).unwrap();
        assert_relative_eq!(
            led.series_resistor_ohm(12.0, 0.3).unwrap(),
            970.0,
            max_relative = 1e-12
        );
        let i = led.current_with(1e3, 12.0, 0.3).unwrap();
        assert_relative_eq!(i, 9.7e-3, max_relative = 1e-12);
        assert_relative_eq!(
            led.resistor_dissipation_w(1e3, i),
            94.09e-3,
            max_relative = 1e-12
        );
        assert_relative_eq!(led.led_dissipation_w(i), 19.4e-3, max_relative = 1e-12);
        assert!(matches!(
            led.series_resistor_ohm(2.2, 0.3),
            Err(SwitchError::NoHeadroom { .. })
        ));
    }

    /// Hand, PNP high-side from a comparator output low at 0.4 V on a 12 V
    /// supply, relay coil 12 V / 400 Ω: I_C = (12 − 0.3)/400 = 29.25 mA;
    /// β_F = 10 → I_B = 2.925 mA; span = 12 − 0.4 = 11.6 V;
    /// R_B = (11.6 − 0.7 − 0.07)/2.925e-3 = 3702.56 Ω; R_BE = 37 025.6 Ω;
    /// driver current = 10.9/3702.56 = 2.9439 mA (I_B + 0.7/R_BE).
    #[test]
    fn base_drive_ratio_rule() {
        let t = TransistorRatings::typical_small_signal();
        let coil = RelayCoil::new(12.0, 400.0).unwrap();
        let ic = coil.current_at(12.0 - t.vce_sat_v);
        assert_relative_eq!(ic, 29.25e-3, max_relative = 1e-12);
        let span = SwitchPolarity::PnpHighSide.drive_span_v(12.0, 0.4);
        let d = design_base_drive(ic, DEFAULT_FORCED_GAIN, span, &t, 0.0).unwrap();
        assert_relative_eq!(d.base_current_a, 2.925e-3, max_relative = 1e-12);
        assert_relative_eq!(d.base_ohm, 10.83 / 2.925e-3, max_relative = 1e-12);
        assert_relative_eq!(
            d.hold_off_ohm,
            10.0 * 10.83 / 2.925e-3,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            d.drive_current_a,
            2.925e-3 + 0.7 / d.hold_off_ohm,
            max_relative = 1e-12
        );
        // The resistors give back the forced gain exactly.
        let (ib, beta) = forced_gain_with(ic, span, d.base_ohm, d.hold_off_ohm, 0.7).unwrap();
        assert_relative_eq!(ib, 2.925e-3, max_relative = 1e-12);
        assert_relative_eq!(beta, 10.0, max_relative = 1e-12);
        // Snapping R_B down to 3.3 kΩ raises I_B, lowers β_F below 10.
        let (_, beta) = forced_gain_with(ic, span, 3.3e3, 39e3, 0.7).unwrap();
        assert!(beta < 10.0);
    }

    /// Hand, leakage rule: 10 µA leakage caps R_BE at 0.35/1e-5 = 35 kΩ,
    /// below 10·R_B; then R_B = 10.9/(2.925e-3 + 0.7/35e3) = 10.9/2.945e-3
    /// = 3701.19 Ω.
    #[test]
    fn base_drive_leakage_rule() {
        let t = TransistorRatings::typical_small_signal();
        let d = design_base_drive(29.25e-3, 10.0, 11.6, &t, 10e-6).unwrap();
        assert_relative_eq!(d.hold_off_ohm, 35e3, max_relative = 1e-12);
        assert_relative_eq!(d.base_ohm, 10.9 / 2.945e-3, max_relative = 1e-12);
        assert!(matches!(
            design_base_drive(29.25e-3, 10.0, 0.75, &t, 0.0),
            Err(SwitchError::NoHeadroom { .. })
        ));
    }

    /// Hand: I_C = 29.25 mA, I_B = 2.925 mA, off V_CE = 12 + 1 = 13 V:
    /// P = 0.3·0.02925 + 0.7·0.002925 = 8.775 + 2.0475 = 10.8225 mW;
    /// margins 27 V, 0.17075 A, 0.4891775 W; h_FE/β_F = 100/10 = 10.
    #[test]
    fn transistor_check() {
        let t = TransistorRatings::typical_small_signal();
        let d = DiodeRatings::typical_rectifier();
        let c = check_switch(
            &t,
            flyback_peak_vce_v(12.0, d.forward_v),
            29.25e-3,
            2.925e-3,
        )
        .unwrap();
        assert_relative_eq!(c.power_w, 10.8225e-3, max_relative = 1e-12);
        assert_relative_eq!(c.vce_margin_v, 27.0, max_relative = 1e-12);
        assert_relative_eq!(c.ic_margin_a, 0.17075, max_relative = 1e-12);
        assert_relative_eq!(c.power_margin_w, 0.5 - 10.8225e-3, max_relative = 1e-12);
        assert_relative_eq!(c.gain_ratio, 10.0, max_relative = 1e-12);
        assert!(c.ok);
        // 48 V off-state breaks the 40 V rating.
        let c = check_switch(&t, 48.0, 29.25e-3, 2.925e-3).unwrap();
        assert!(!c.ok && c.vce_margin_v == -8.0);
    }

    /// Hand: 400 V / 1 A diode on 12 V with 2× margin: reverse margin
    /// 400 − 24 = 376 V, current margin 1 − 0.03 = 0.97 A. A 20 V / 0.02 A
    /// diode fails both.
    #[test]
    fn flyback() {
        let c = check_flyback_diode(&DiodeRatings::typical_rectifier(), 12.0, 0.03, 2.0).unwrap();
        assert_relative_eq!(c.reverse_margin_v, 376.0, max_relative = 1e-12);
        assert_relative_eq!(c.current_margin_a, 0.97, max_relative = 1e-12);
        assert!(c.ok);
        let weak = DiodeRatings::new(20.0, 0.02, 0.7).unwrap();
        let c = check_flyback_diode(&weak, 12.0, 0.03, DEFAULT_FLYBACK_VOLTAGE_MARGIN).unwrap();
        assert!(!c.ok && c.reverse_margin_v < 0.0 && c.current_margin_a < 0.0);
    }

    /// Hand: 12 V / 400 Ω coil → 30 mA rated; 11.7 V applied → 0.975 of
    /// rated. Buzzer rated 12 V on 13 V → −1 V margin.
    #[test]
    fn loads() {
        let coil = RelayCoil::new(12.0, 400.0).unwrap();
        assert_relative_eq!(coil.rated_current_a(), 0.03, max_relative = 1e-12);
        assert_relative_eq!(coil.applied_fraction(11.7), 0.975, max_relative = 1e-12);
        let b = BuzzerLoad::new(12.0, 25e-3).unwrap();
        assert_eq!(b.voltage_ok(13.0), (false, -1.0));
        assert_eq!(b.voltage_ok(5.0), (true, 7.0));
        assert!(RelayCoil::new(12.0, 0.0).is_err());
        assert!(TransistorRatings::new(40.0, 0.2, 0.5, f64::NAN, 0.3, 0.7).is_err());
    }

    #[test]
    fn polarity_span() {
        assert_eq!(SwitchPolarity::NpnLowSide.drive_span_v(12.0, 5.0), 5.0);
        assert_eq!(SwitchPolarity::PnpHighSide.drive_span_v(12.0, 0.4), 11.6);
    }
}
