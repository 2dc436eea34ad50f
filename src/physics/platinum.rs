//! Platinum resistance thermometer law: the Callendar–Van Dusen equation with
//! the coefficients of IEC 60751 (Industrial platinum resistance thermometers
//! and platinum temperature sensors, 2008), §5.1.
//!
//! With t in °C (t = T − 273.15):
//! R(t) = R0·(1 + A·t + B·t²) for 0 °C ≤ t ≤ 850 °C and
//! R(t) = R0·(1 + A·t + B·t² + C·(t − 100 °C)·t³) for −200 °C ≤ t < 0 °C.

/// Lowest temperature of the IEC 60751 equation, −200 °C, in K.
pub const T_MIN_K: f64 = 73.15;
/// Highest temperature of the IEC 60751 equation, 850 °C, in K.
pub const T_MAX_K: f64 = 1123.15;
/// IEC 60751 coefficient A, 1/°C.
pub const IEC60751_A: f64 = 3.9083e-3;
/// IEC 60751 coefficient B, 1/°C².
pub const IEC60751_B: f64 = -5.775e-7;
/// IEC 60751 coefficient C, 1/°C⁴ (applies below 0 °C only).
pub const IEC60751_C: f64 = -4.183e-12;

const CELSIUS_OFFSET_K: f64 = 273.15;

/// Why a Callendar–Van Dusen law was rejected.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum PlatinumError {
    /// R0 must be a positive, finite resistance.
    #[error("R0 must be positive and finite, got {r0_ohm} ohm")]
    InvalidR0 {
        /// The offending R0, ohm.
        r0_ohm: f64,
    },
    /// A coefficient is NaN or infinite.
    #[error("coefficient {name} must be finite, got {value}")]
    NotFinite {
        /// Which coefficient: "A", "B" or "C".
        name: &'static str,
        /// The offending value (A in 1/°C, B in 1/°C², C in 1/°C⁴).
        value: f64,
    },
    /// R(T) must rise over the whole −200…850 °C range.
    #[error(
        "R(T) must increase over 73.15–1123.15 K, but dR/dT = {slope_ohm_per_k} ohm/K at {t_k} K"
    )]
    NotIncreasing {
        /// Temperature where the slope fails, K.
        t_k: f64,
        /// The slope dR/dT there, ohm/K.
        slope_ohm_per_k: f64,
    },
    /// R(T) must stay positive over the range.
    #[error("R(T) must be positive over 73.15–1123.15 K, but R = {r_ohm} ohm at {t_k} K")]
    NonPositive {
        /// Temperature where R(T) fails, K.
        t_k: f64,
        /// The resistance there, ohm.
        r_ohm: f64,
    },
}

/// A platinum element described by the Callendar–Van Dusen equation.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CallendarVanDusen {
    r0_ohm: f64,
    a: f64,
    b: f64,
    c: f64,
}

impl CallendarVanDusen {
    /// An element with R0 at 0 °C and the IEC 60751 coefficients
    /// A = 3.9083e-3, B = −5.775e-7, C = −4.183e-12.
    pub fn iec60751(r0_ohm: f64) -> Result<Self, PlatinumError> {
        Self::new(r0_ohm, IEC60751_A, IEC60751_B, IEC60751_C)
    }

    /// An element with its own coefficients (t in °C). Rejects R0 ≤ 0,
    /// non-finite coefficients, and any set for which R(T) is not positive
    /// and strictly increasing over −200…850 °C.
    pub fn new(r0_ohm: f64, a: f64, b: f64, c: f64) -> Result<Self, PlatinumError> {
        if !(r0_ohm > 0.0 && r0_ohm.is_finite()) {
            return Err(PlatinumError::InvalidR0 { r0_ohm });
        }
        for (name, value) in [("A", a), ("B", b), ("C", c)] {
            if !value.is_finite() {
                return Err(PlatinumError::NotFinite { name, value });
            }
        }
        let law = Self { r0_ohm, a, b, c };
        // dR/dt is linear above 0 °C and a cubic below, so its minimum over
        // each part lies at an end or where d²R/dt² = 0:
        // 2B + 12C·t² − 600C·t = 0 for t < 0.
        let mut candidates_c = [-200.0, 0.0, 850.0, 0.0, 0.0];
        let mut count = 3;
        if c != 0.0 {
            let (qa, qb, qc) = (12.0 * c, -600.0 * c, 2.0 * b);
            let disc = qb * qb - 4.0 * qa * qc;
            if disc >= 0.0 {
                for root in [
                    (-qb + disc.sqrt()) / (2.0 * qa),
                    (-qb - disc.sqrt()) / (2.0 * qa),
                ] {
                    if root > -200.0 && root < 0.0 {
                        candidates_c[count] = root;
                        count += 1;
                    }
                }
            }
        }
        for &t_c in &candidates_c[..count] {
            let t_k = t_c + CELSIUS_OFFSET_K;
            let slope_ohm_per_k = law.derivative_ohm_per_k(t_k);
            if slope_ohm_per_k.is_nan() || slope_ohm_per_k <= 0.0 {
                return Err(PlatinumError::NotIncreasing {
                    t_k,
                    slope_ohm_per_k,
                });
            }
        }
        let r_min = law.resistance_ohm(T_MIN_K);
        if r_min.is_nan() || r_min <= 0.0 {
            return Err(PlatinumError::NonPositive {
                t_k: T_MIN_K,
                r_ohm: r_min,
            });
        }
        Ok(law)
    }

    /// R0, the resistance at 0 °C, ohm.
    pub fn r0_ohm(&self) -> f64 {
        self.r0_ohm
    }

    /// The coefficients (A, B, C), t in °C.
    pub fn coefficients(&self) -> (f64, f64, f64) {
        (self.a, self.b, self.c)
    }

    /// The equation's valid range (−200…850 °C) in K.
    pub fn temperature_range_k(&self) -> (f64, f64) {
        (T_MIN_K, T_MAX_K)
    }

    /// R(T) by Callendar–Van Dusen (IEC 60751 §5.1):
    /// R0·(1 + A·t + B·t² + C·(t − 100)·t³), C term only for t < 0 °C.
    /// Outside the range the polynomial is simply continued.
    pub fn resistance_ohm(&self, t_k: f64) -> f64 {
        let t = t_k - CELSIUS_OFFSET_K;
        let low = if t < 0.0 {
            self.c * (t - 100.0) * t * t * t
        } else {
            0.0
        };
        self.r0_ohm * (1.0 + self.a * t + self.b * t * t + low)
    }

    /// dR/dT = R0·(A + 2B·t + C·(4t³ − 300t²)), C term only for t < 0 °C
    /// (the derivative of the equation above; continuous at 0 °C because the
    /// C term and its slope vanish there).
    pub fn derivative_ohm_per_k(&self, t_k: f64) -> f64 {
        let t = t_k - CELSIUS_OFFSET_K;
        let low = if t < 0.0 {
            self.c * (4.0 * t * t * t - 300.0 * t * t)
        } else {
            0.0
        };
        self.r0_ohm * (self.a + 2.0 * self.b * t + low)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn pt100_table_values() {
        // IEC 60751 Pt100 reference table: −200 °C 18.52 Ω, −100 °C 60.26 Ω,
        // 50 °C 119.40 Ω, 100 °C 138.51 Ω, 200 °C 175.86 Ω, 400 °C 247.09 Ω
        // (−200 °C exercises the C term; 0 °C is R0 itself, not a check).
        let pt100 = CallendarVanDusen::iec60751(100.0).unwrap();
        for (t_c, r_table) in [
            (-200.0, 18.52),
            (-100.0, 60.26),
            (50.0, 119.40),
            (100.0, 138.51),
            (200.0, 175.86),
            (400.0, 247.09),
        ] {
            assert_abs_diff_eq!(pt100.resistance_ohm(t_c + 273.15), r_table, epsilon = 0.01);
        }
    }

    #[test]
    fn derivative_continuous_at_zero_celsius() {
        // Invariant: both branches meet in slope at 0 °C.
        let pt100 = CallendarVanDusen::iec60751(100.0).unwrap();
        let below = pt100.derivative_ohm_per_k(273.15 - 1e-9);
        let above = pt100.derivative_ohm_per_k(273.15);
        assert_abs_diff_eq!(below, above, epsilon = 1e-9);
        // Against IEC 60751's printed rows at ±10 °C (96.09 and 103.90 Ω):
        // a central difference of 0.3905 Ω/K, good to two roundings of
        // 0.005 Ω over 20 K (5e-4 Ω/K); found 0.39083.
        assert_abs_diff_eq!(above, (103.90 - 96.09) / 20.0, epsilon = 6e-4);
    }

    #[test]
    fn derivative_matches_finite_difference() {
        let pt1000 = CallendarVanDusen::iec60751(1000.0).unwrap();
        for i in 0..=100 {
            let t_k = 80.0 + i as f64 * 10.4;
            let h = crate::precision::FD_REL_STEP * t_k;
            let fd = (pt1000.resistance_ohm(t_k + h) - pt1000.resistance_ohm(t_k - h)) / (2.0 * h);
            approx::assert_relative_eq!(pt1000.derivative_ohm_per_k(t_k), fd, max_relative = 1e-7);
        }
    }

    #[test]
    fn rejects_invalid_laws() {
        assert!(matches!(
            CallendarVanDusen::iec60751(0.0),
            Err(PlatinumError::InvalidR0 { .. })
        ));
        assert!(matches!(
            CallendarVanDusen::new(100.0, 3.9e-3, f64::NAN, 0.0),
            Err(PlatinumError::NotFinite { name: "B", .. })
        ));
        // B = −5e-6 makes dR/dt = A + 2B·t negative above t = A/(−2B) = 390 °C.
        assert!(matches!(
            CallendarVanDusen::new(100.0, 3.9e-3, -5e-6, 0.0),
            Err(PlatinumError::NotIncreasing { .. })
        ));
    }
}
