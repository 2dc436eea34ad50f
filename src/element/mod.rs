//! The self-heated sensing element: its resistance law, its cooling law and
//! its heat capacity, plus the air it sits in.

pub mod cooling;
pub mod resistance;

pub use cooling::{CoolingLaw, CoolingLawError, DissipationLaw, GeometryCooling, KingsLaw, Shape};
pub use resistance::{
    LinearTcr, ResistanceLaw, ResistanceLawError, ResistanceTable, ScaledSteinhartHart,
};

/// The air around the element.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Environment {
    /// Ambient (free-stream) air temperature, K.
    pub ambient_k: f64,
    /// Absolute air pressure, Pa.
    pub pressure_pa: f64,
}

/// Standard atmospheric pressure (re-exported from the air model).
pub use crate::physics::air::STANDARD_PRESSURE_PA;

impl Environment {
    /// Air at `ambient_k` and standard pressure.
    pub fn at(ambient_k: f64) -> Self {
        Self {
            ambient_k,
            pressure_pa: STANDARD_PRESSURE_PA,
        }
    }
}

/// Why an element could not be built.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ElementError {
    /// The heat capacity was not a finite positive number.
    #[error("heat capacity must be a finite value above 0 J/K, found {0}")]
    HeatCapacity(f64),
    /// The maximum temperature was not inside the resistance law's range.
    #[error("maximum element temperature {found_k} K is outside the resistance law's valid range {lo_k}–{hi_k} K")]
    MaxTemperature {
        /// The value given.
        found_k: f64,
        /// Low end of the law's range.
        lo_k: f64,
        /// High end of the law's range.
        hi_k: f64,
    },
}

/// A validated sensing element.
#[derive(Debug, Clone, PartialEq)]
pub struct Element {
    resistance: ResistanceLaw,
    cooling: CoolingLaw,
    heat_capacity_j_per_k: f64,
    max_temperature_k: Option<f64>,
    notes: Vec<String>,
    plausibility: Vec<String>,
    calibrated_range: Option<(f64, f64)>,
}

impl Element {
    /// Build an element from its laws, heat capacity (J/K, > 0) and an
    /// optional maximum safe temperature (K).
    pub fn new(
        resistance: ResistanceLaw,
        cooling: CoolingLaw,
        heat_capacity_j_per_k: f64,
        max_temperature_k: Option<f64>,
    ) -> Result<Self, ElementError> {
        if !(heat_capacity_j_per_k.is_finite() && heat_capacity_j_per_k > 0.0) {
            return Err(ElementError::HeatCapacity(heat_capacity_j_per_k));
        }
        if let Some(t) = max_temperature_k {
            let (lo, hi) = resistance.valid_range_k();
            if !(t.is_finite() && t > lo && t <= hi) {
                return Err(ElementError::MaxTemperature {
                    found_k: t,
                    lo_k: lo,
                    hi_k: hi,
                });
            }
        }
        Ok(Self {
            resistance,
            cooling,
            heat_capacity_j_per_k,
            max_temperature_k,
            notes: Vec::new(),
            plausibility: Vec::new(),
            calibrated_range: None,
        })
    }
    /// The resistance law.
    pub fn resistance_law(&self) -> &ResistanceLaw {
        &self.resistance
    }
    /// The cooling law.
    pub fn cooling_law(&self) -> &CoolingLaw {
        &self.cooling
    }
    /// Lumped heat capacity, J/K.
    pub fn heat_capacity_j_per_k(&self) -> f64 {
        self.heat_capacity_j_per_k
    }
    /// Maximum safe element temperature, K, when one is known.
    pub fn max_temperature_k(&self) -> Option<f64> {
        self.max_temperature_k
    }
    /// The same wire `factor` times as long: resistance, cooling and heat
    /// capacity all scale with the length (a twin cut from the same reel).
    /// Where the cooling law cannot be scaled, only the resistance is.
    pub fn scaled_in_length(&self, factor: f64) -> Self {
        let mut e = self.with_resistance_law(self.resistance.scaled(factor));
        if let Some(c) = self.cooling.scaled_in_length(factor) {
            e.cooling = c;
            e.heat_capacity_j_per_k *= factor;
        }
        e
    }

    /// A copy of this element with another cooling law (a model tolerance
    /// on the cooling).
    pub fn with_cooling_law(&self, cooling: CoolingLaw) -> Self {
        Self {
            cooling,
            ..self.clone()
        }
    }
    /// A copy of this element with another resistance law (used by
    /// tolerance corners that scale R0).
    pub fn with_resistance_law(&self, resistance: ResistanceLaw) -> Self {
        Self {
            resistance,
            ..self.clone()
        }
    }
    /// Notes about how the element was derived (e.g. a lamp filament
    /// inferred from its rating: how far the measured cold resistance
    /// agrees with typical lamps, and what coiling changes), for the report.
    pub fn notes(&self) -> &[String] {
        &self.notes
    }
    /// Where the element's own data disagree with what they imply (e.g. a
    /// lamp's measured cold resistance against its rating), with what that
    /// means for the trip point: warnings for the report.
    pub fn plausibility_warnings(&self) -> &[String] {
        &self.plausibility
    }
    /// This element with plausibility warnings appended.
    pub fn with_plausibility_warnings(mut self, w: impl IntoIterator<Item = String>) -> Self {
        self.plausibility.extend(w);
        self
    }
    /// This element with notes appended.
    pub fn with_notes(mut self, notes: impl IntoIterator<Item = String>) -> Self {
        self.notes.extend(notes);
        self
    }
    /// Where the cooling model is used outside its published range at
    /// element temperature `t_k` and airflow `airflow_m_per_s`
    /// ([`CoolingLaw::range_warnings`]); empty when all is in range.
    pub fn range_warnings(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> Vec<String> {
        let mut w = self.cooling.range_warnings(t_k, airflow_m_per_s, env);
        w.extend(self.calibration_warning(airflow_m_per_s));
        w
    }

    /// A warning when `airflow_m_per_s` lies outside the airflow range the
    /// cooling law was calibrated over, saying how far it extrapolates
    /// (issue 11: King's law near still air has an infinite slope at
    /// U → 0, so an extrapolation below the calibration is least safe).
    pub fn calibration_warning(&self, airflow_m_per_s: f64) -> Option<String> {
        let (lo, hi) = self.calibrated_range?;
        let u = airflow_m_per_s;
        let how_far = if u < lo * (1.0 - 1e-9) {
            format!(
                "{} m/s below its lowest calibrated airflow ({} % of that airflow)",
                crate::quantity::format_sig(lo - u, 3),
                crate::quantity::format_sig(100.0 * (lo - u) / lo, 3)
            )
        } else if u > hi * (1.0 + 1e-9) {
            format!(
                "{} m/s above its highest calibrated airflow",
                crate::quantity::format_sig(u - hi, 3)
            )
        } else {
            return None;
        };
        Some(format!(
            "{u:.3} m/s lies outside the airflow range the cooling law was calibrated over ({lo} – {hi} m/s): the law is extrapolated {how_far}"
        ))
    }

    /// The airflow range the cooling law was calibrated over, m/s.
    pub fn calibrated_range(&self) -> Option<(f64, f64)> {
        self.calibrated_range
    }

    /// This element with the airflow range its cooling was calibrated over.
    pub fn with_calibrated_range(mut self, lo: f64, hi: f64) -> Self {
        self.calibrated_range = Some((lo, hi));
        self
    }
}
