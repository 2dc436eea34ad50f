//! How the element is powered: the drive circuit.
//!
//! The sense voltage is the voltage across the element, measured from its
//! grounded end.

/// The drive topology with its values (SI).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Drive {
    /// A regulated rail feeding the element through a series resistor
    /// (a Thevenin source): `I = V/(Rs + R)`.
    SeriesResistor {
        /// Rail voltage, V.
        rail_v: f64,
        /// Series resistance, ohm.
        series_ohm: f64,
    },
    /// A constant current, A.
    ConstantCurrent {
        /// Drive current, A.
        current_a: f64,
    },
}

impl Drive {
    /// Current through the element when its resistance is `r_ohm` (Ohm's law).
    pub fn current_a(&self, r_ohm: f64) -> f64 {
        match *self {
            Drive::SeriesResistor { rail_v, series_ohm } => rail_v / (series_ohm + r_ohm),
            Drive::ConstantCurrent { current_a } => current_a,
        }
    }

    /// Electrical power in the element, `P = I²·R` (Joule's law).
    pub fn power_w(&self, r_ohm: f64) -> f64 {
        let i = self.current_a(r_ohm);
        i * i * r_ohm
    }

    /// dP/dR at `r_ohm`: `V²(Rs − R)/(Rs + R)³` for the series drive, `I²`
    /// for constant current (differentiating the expressions above).
    pub fn dpower_dr(&self, r_ohm: f64) -> f64 {
        match *self {
            Drive::SeriesResistor { rail_v, series_ohm } => {
                let s = series_ohm + r_ohm;
                rail_v * rail_v * (series_ohm - r_ohm) / (s * s * s)
            }
            Drive::ConstantCurrent { current_a } => current_a * current_a,
        }
    }

    /// Voltage across the element (the sense voltage), `V·R/(Rs + R)` or `I·R`.
    pub fn sense_v(&self, r_ohm: f64) -> f64 {
        self.current_a(r_ohm) * r_ohm
    }

    /// The element resistance that gives sense voltage `sense_v` (the drive
    /// inverted): `R = V_s·Rs/(V − V_s)` for the series drive (`V_s` below
    /// the rail), `R = V_s/I` for a current; `None` where no positive
    /// resistance gives it.
    pub fn resistance_for_sense(&self, sense_v: f64) -> Option<f64> {
        let r = match *self {
            Drive::SeriesResistor { rail_v, series_ohm } => {
                if !(sense_v > 0.0 && sense_v < rail_v) {
                    return None;
                }
                sense_v * series_ohm / (rail_v - sense_v)
            }
            Drive::ConstantCurrent { current_a } => sense_v / current_a,
        };
        (r.is_finite() && r > 0.0).then_some(r)
    }

    /// d(sense)/dR: `V·Rs/(Rs + R)²`, or `I`.
    pub fn dsense_dr(&self, r_ohm: f64) -> f64 {
        match *self {
            Drive::SeriesResistor { rail_v, series_ohm } => {
                let s = series_ohm + r_ohm;
                rail_v * series_ohm / (s * s)
            }
            Drive::ConstantCurrent { current_a } => current_a,
        }
    }

    /// Static source resistance seen at the sense node, ohm: `Rs ∥ R` for
    /// the series drive, `R` for an ideal current source.
    pub fn sense_source_ohm(&self, r_ohm: f64) -> f64 {
        match *self {
            Drive::SeriesResistor { series_ohm, .. } => series_ohm * r_ohm / (series_ohm + r_ohm),
            Drive::ConstantCurrent { .. } => r_ohm,
        }
    }

    /// Short name for reports.
    pub fn name(&self) -> &'static str {
        match self {
            Drive::SeriesResistor { .. } => "rail through a series resistor",
            Drive::ConstantCurrent { .. } => "constant current",
        }
    }
}
