//! NTC thermistor resistance laws: the beta model and the Steinhart–Hart
//! equation.

use std::f64::consts::PI;

/// Operating range assumed for a beta-model NTC, −55…+150 °C in K: the usual
/// rated range of leaded NTC discs (common practice, no source). The beta
/// model itself is only a fit; its error grows away from T0.
pub const BETA_RANGE_K: (f64, f64) = (218.15, 423.15);

/// Why a thermistor law was rejected or could not be evaluated.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum ThermistorError {
    /// R0 must be positive and finite.
    #[error("R0 must be positive and finite, got {r0_ohm} ohm")]
    InvalidR0 {
        /// The offending R0, ohm.
        r0_ohm: f64,
    },
    /// T0 must be positive and finite.
    #[error("T0 must be positive and finite, got {t0_k} K")]
    InvalidT0 {
        /// The offending T0, K.
        t0_k: f64,
    },
    /// The B constant must be positive and finite (an NTC).
    #[error("beta must be positive and finite, got {beta_k} K")]
    InvalidBeta {
        /// The offending B constant, K.
        beta_k: f64,
    },
    /// A Steinhart–Hart coefficient is NaN or infinite.
    #[error("Steinhart–Hart coefficient {name} must be finite, got {value}")]
    NotFinite {
        /// Which coefficient: "a", "b" or "c".
        name: &'static str,
        /// The offending value, 1/K.
        value: f64,
    },
    /// Steinhart–Hart b must be positive (every NTC coefficient set has b > 0).
    #[error("Steinhart–Hart coefficient b must be positive, got {b}")]
    NonPositiveB {
        /// The offending coefficient b, 1/K.
        b: f64,
    },
    /// The temperature range must satisfy 0 < min < max, finite.
    #[error("temperature range must satisfy 0 < min < max, got [{t_min_k}, {t_max_k}] K")]
    InvalidRange {
        /// The stated lower temperature, K.
        t_min_k: f64,
        /// The stated upper temperature, K.
        t_max_k: f64,
    },
    /// R(T) does not decrease over the whole stated range (possible with c < 0).
    #[error("R(T) must decrease over the stated range, but it does not at {t_k} K (c < 0 turns the curve back)")]
    NotDecreasing {
        /// The range end where R(T) fails to decrease, K.
        t_k: f64,
    },
    /// R(T) overflows at an end of the range.
    #[error(
        "R(T) is not finite at {t_k} K: the coefficients do not describe a usable thermistor there"
    )]
    ResistanceOverflow {
        /// The temperature where R(T) is not finite, K.
        t_k: f64,
    },
    /// A resistance must be positive and finite.
    #[error("resistance must be positive and finite, got {r_ohm} ohm")]
    InvalidResistance {
        /// The offending resistance, ohm.
        r_ohm: f64,
    },
    /// The law gives no positive temperature for this resistance.
    #[error("no positive temperature for {r_ohm} ohm: 1/T = {inverse_t_per_k} 1/K")]
    NoTemperature {
        /// The resistance given, ohm.
        r_ohm: f64,
        /// The non-positive 1/T the law gives for it, 1/K.
        inverse_t_per_k: f64,
    },
}

/// Why a three-point Steinhart–Hart fit failed.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum FitError {
    /// A point has a non-positive or non-finite temperature or resistance.
    #[error("point {index} must have positive, finite T and R, got T = {t_k} K, R = {r_ohm} ohm")]
    InvalidPoint {
        /// Zero-based index of the point.
        index: usize,
        /// The point's temperature, K.
        t_k: f64,
        /// The point's resistance, ohm.
        r_ohm: f64,
    },
    /// Two points share a temperature.
    #[error("two points share the temperature {t_k} K; the three must be distinct")]
    RepeatedTemperature {
        /// The shared temperature, K.
        t_k: f64,
    },
    /// Two points share a resistance.
    #[error("two points share the resistance {r_ohm} ohm; the three must be distinct")]
    RepeatedResistance {
        /// The shared resistance, ohm.
        r_ohm: f64,
    },
    /// Resistance must fall as temperature rises.
    #[error("an NTC's resistance must fall as T rises, but R = {r_low_ohm} ohm at {t_low_k} K and {r_high_ohm} ohm at {t_high_k} K")]
    NotDecreasing {
        /// The lower temperature of the offending pair, K.
        t_low_k: f64,
        /// The resistance at the lower temperature, ohm.
        r_low_ohm: f64,
        /// The higher temperature of the offending pair, K.
        t_high_k: f64,
        /// The resistance at the higher temperature, ohm.
        r_high_ohm: f64,
    },
    /// ln R1 + ln R2 + ln R3 = 0 makes the 3×3 system singular.
    #[error("the points are singular for the fit: ln R1 + ln R2 + ln R3 = {sum_ln_r} (product of resistances ≈ 1 ohm³)")]
    Singular {
        /// ln R1 + ln R2 + ln R3, with R in ohm.
        sum_ln_r: f64,
    },
    /// The fitted coefficients fail the law's own checks.
    #[error("fitted law is invalid: {0}")]
    Law(#[from] ThermistorError),
}

fn positive_finite(x: f64) -> bool {
    x > 0.0 && x.is_finite()
}

/// NTC beta model: R(T) = R0·exp(B·(1/T − 1/T0)), with the B constant
/// defined from two points as B = ln(R1/R2)/(1/T1 − 1/T2) (IEC 60539-1,
/// Directly heated negative temperature coefficient thermistors – Generic
/// specification, definition of the B-value; memory). The special case c = 0
/// of Steinhart–Hart.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BetaThermistor {
    r0_ohm: f64,
    t0_k: f64,
    beta_k: f64,
}

impl BetaThermistor {
    /// A thermistor of resistance `r0_ohm` at `t0_k` with B constant `beta_k`;
    /// each must be positive and finite.
    pub fn new(r0_ohm: f64, t0_k: f64, beta_k: f64) -> Result<Self, ThermistorError> {
        if !positive_finite(r0_ohm) {
            return Err(ThermistorError::InvalidR0 { r0_ohm });
        }
        if !positive_finite(t0_k) {
            return Err(ThermistorError::InvalidT0 { t0_k });
        }
        if !positive_finite(beta_k) {
            return Err(ThermistorError::InvalidBeta { beta_k });
        }
        Ok(Self {
            r0_ohm,
            t0_k,
            beta_k,
        })
    }

    /// R0, ohm.
    pub fn r0_ohm(&self) -> f64 {
        self.r0_ohm
    }

    /// T0, K.
    pub fn t0_k(&self) -> f64 {
        self.t0_k
    }

    /// B, K.
    pub fn beta_k(&self) -> f64 {
        self.beta_k
    }

    /// The range the model is used on, [`BETA_RANGE_K`].
    pub fn temperature_range_k(&self) -> (f64, f64) {
        BETA_RANGE_K
    }

    /// R(T) = R0·exp(B·(1/T − 1/T0)).
    pub fn resistance_ohm(&self, t_k: f64) -> f64 {
        self.r0_ohm * (self.beta_k * (1.0 / t_k - 1.0 / self.t0_k)).exp()
    }

    /// dR/dT = −R(T)·B/T².
    pub fn derivative_ohm_per_k(&self, t_k: f64) -> f64 {
        -self.resistance_ohm(t_k) * self.beta_k / (t_k * t_k)
    }

    /// T(R) = 1/(1/T0 + ln(R/R0)/B).
    pub fn temperature_k(&self, r_ohm: f64) -> Result<f64, ThermistorError> {
        if !positive_finite(r_ohm) {
            return Err(ThermistorError::InvalidResistance { r_ohm });
        }
        let inverse_t_per_k = 1.0 / self.t0_k + (r_ohm / self.r0_ohm).ln() / self.beta_k;
        if inverse_t_per_k > 0.0 {
            Ok(1.0 / inverse_t_per_k)
        } else {
            Err(ThermistorError::NoTemperature {
                r_ohm,
                inverse_t_per_k,
            })
        }
    }
}

/// Steinhart–Hart equation 1/T = a + b·ln R + c·(ln R)³ (J. S. Steinhart &
/// S. R. Hart, "Calibration curves for thermistors", Deep-Sea Research 15
/// (1968) 497–503), on a stated temperature range over which R(T) is checked
/// to decrease.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SteinhartHart {
    a: f64,
    b: f64,
    c: f64,
    range_k: (f64, f64),
}

impl SteinhartHart {
    /// A law from its coefficients (1/K, T in K, R in ohm) and the range
    /// `(t_min_k, t_max_k)` it is used on. Needs finite a, b, c with b > 0;
    /// for c < 0 the cubic turns back at |ln R| = √(−b/3c), so every 1/T of
    /// the range must lie inside a ± (2/3)·b·√(−b/3c), the values on the
    /// rising branch.
    pub fn new(a: f64, b: f64, c: f64, range_k: (f64, f64)) -> Result<Self, ThermistorError> {
        for (name, value) in [("a", a), ("b", b), ("c", c)] {
            if !value.is_finite() {
                return Err(ThermistorError::NotFinite { name, value });
            }
        }
        if b <= 0.0 {
            return Err(ThermistorError::NonPositiveB { b });
        }
        let (t_min_k, t_max_k) = range_k;
        if !(positive_finite(t_min_k) && t_max_k.is_finite() && t_min_k < t_max_k) {
            return Err(ThermistorError::InvalidRange { t_min_k, t_max_k });
        }
        if c < 0.0 {
            let turn = (-b / (3.0 * c)).sqrt();
            let half_width = 2.0 / 3.0 * b * turn;
            if 1.0 / t_max_k <= a - half_width {
                return Err(ThermistorError::NotDecreasing { t_k: t_max_k });
            }
            if 1.0 / t_min_k >= a + half_width {
                return Err(ThermistorError::NotDecreasing { t_k: t_min_k });
            }
        }
        let law = Self { a, b, c, range_k };
        for t_k in [t_min_k, t_max_k] {
            let r = law.resistance_ohm(t_k);
            if !positive_finite(r) {
                return Err(ThermistorError::ResistanceOverflow { t_k });
            }
        }
        Ok(law)
    }

    /// The coefficients (a, b, c).
    pub fn coefficients(&self) -> (f64, f64, f64) {
        (self.a, self.b, self.c)
    }

    /// The stated range, K.
    pub fn temperature_range_k(&self) -> (f64, f64) {
        self.range_k
    }

    /// ln R at temperature T: the real root of the depressed cubic
    /// L³ + p·L + q = 0, p = b/c, q = (a − 1/T)/c, by Cardano's formula in
    /// its hyperbolic form (c > 0, one real root)
    /// L = −2√(p/3)·sinh(⅓·asinh((3q/2p)·√(3/p))),
    /// or, for c < 0, the trigonometric form's middle root (the rising branch)
    /// L = 2√(−p/3)·cos(⅓·acos((3q/2p)·√(−3/p)) − 2π/3)
    /// (both forms: e.g. W. H. Press et al., Numerical Recipes, 3rd ed.
    /// (2007) §5.6; memory). These forms avoid the cancellation and the
    /// p³ overflow of the radical form. Two Newton steps on
    /// a + b·L + c·L³ − 1/T then polish the last bits.
    fn ln_resistance(&self, t_k: f64) -> f64 {
        let y = 1.0 / t_k;
        let (a, b, c) = (self.a, self.b, self.c);
        let p = b / c;
        let q = (a - y) / c;
        let mut l = if c == 0.0 || !p.is_finite() || !q.is_finite() {
            (y - a) / b
        } else if c > 0.0 {
            -2.0 * (p / 3.0).sqrt() * ((1.5 * q / p * (3.0 / p).sqrt()).asinh() / 3.0).sinh()
        } else {
            let arg = (1.5 * q / p * (-3.0 / p).sqrt()).clamp(-1.0, 1.0);
            2.0 * (-p / 3.0).sqrt() * (arg.acos() / 3.0 - 2.0 * PI / 3.0).cos()
        };
        for _ in 0..2 {
            let f = a + b * l + c * l * l * l - y;
            let df = b + 3.0 * c * l * l;
            l -= f / df;
        }
        l
    }

    /// R(T) = exp(L), L solving 1/T = a + b·L + c·L³ (see the private
    /// `ln_resistance` for the closed-form root).
    pub fn resistance_ohm(&self, t_k: f64) -> f64 {
        self.ln_resistance(t_k).exp()
    }

    /// dR/dT = −R/(T²·(b + 3c·(ln R)²)), from differentiating
    /// 1/T = a + b·L + c·L³ with dR = R·dL.
    pub fn derivative_ohm_per_k(&self, t_k: f64) -> f64 {
        let l = self.ln_resistance(t_k);
        -l.exp() / (t_k * t_k * (self.b + 3.0 * self.c * l * l))
    }

    /// T(R) = 1/(a + b·ln R + c·(ln R)³).
    pub fn temperature_k(&self, r_ohm: f64) -> Result<f64, ThermistorError> {
        if !positive_finite(r_ohm) {
            return Err(ThermistorError::InvalidResistance { r_ohm });
        }
        let l = r_ohm.ln();
        let inverse_t_per_k = self.a + self.b * l + self.c * l * l * l;
        if inverse_t_per_k > 0.0 {
            Ok(1.0 / inverse_t_per_k)
        } else {
            Err(ThermistorError::NoTemperature {
                r_ohm,
                inverse_t_per_k,
            })
        }
    }

    /// Fit a, b, c through three (T, R) points exactly; the law's range is
    /// the points' span. With Lᵢ = ln Rᵢ, Yᵢ = 1/Tᵢ:
    /// γ₂ = (Y₂ − Y₁)/(L₂ − L₁), γ₃ = (Y₃ − Y₁)/(L₃ − L₁),
    /// c = (γ₃ − γ₂)/((L₃ − L₂)·(L₁ + L₂ + L₃)),
    /// b = γ₂ − c·(L₁² + L₁L₂ + L₂²), a = Y₁ − (b + c·L₁²)·L₁
    /// (elimination on the 3×3 system of Steinhart & Hart 1968; its
    /// determinant is (L₂ − L₁)(L₃ − L₁)(L₃ − L₂)(L₁ + L₂ + L₃)).
    pub fn fit_three_points(points: [(f64, f64); 3]) -> Result<Self, FitError> {
        for (index, &(t_k, r_ohm)) in points.iter().enumerate() {
            if !(positive_finite(t_k) && positive_finite(r_ohm)) {
                return Err(FitError::InvalidPoint { index, t_k, r_ohm });
            }
        }
        let mut sorted = points;
        sorted.sort_by(|p, q| p.0.total_cmp(&q.0));
        for pair in sorted.windows(2) {
            let ((t_low_k, r_low_ohm), (t_high_k, r_high_ohm)) = (pair[0], pair[1]);
            if t_low_k == t_high_k {
                return Err(FitError::RepeatedTemperature { t_k: t_low_k });
            }
            if r_low_ohm == r_high_ohm {
                return Err(FitError::RepeatedResistance { r_ohm: r_low_ohm });
            }
            if r_high_ohm > r_low_ohm {
                return Err(FitError::NotDecreasing {
                    t_low_k,
                    r_low_ohm,
                    t_high_k,
                    r_high_ohm,
                });
            }
        }
        let [(t1, r1), (t2, r2), (t3, r3)] = sorted;
        let (l1, l2, l3) = (r1.ln(), r2.ln(), r3.ln());
        let (y1, y2, y3) = (1.0 / t1, 1.0 / t2, 1.0 / t3);
        let sum_ln_r = l1 + l2 + l3;
        if sum_ln_r.abs() <= 1e-9 * (l1.abs() + l2.abs() + l3.abs()) {
            return Err(FitError::Singular { sum_ln_r });
        }
        let gamma2 = (y2 - y1) / (l2 - l1);
        let gamma3 = (y3 - y1) / (l3 - l1);
        let c = (gamma3 - gamma2) / ((l3 - l2) * sum_ln_r);
        let b = gamma2 - c * (l1 * l1 + l1 * l2 + l2 * l2);
        let a = y1 - (b + c * l1 * l1) * l1;
        Ok(Self::new(a, b, c, (t1, t3))?)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::{assert_abs_diff_eq, assert_relative_eq};
    use proptest::prelude::*;

    /// A coefficient set widely quoted for a 10 kΩ (25 °C) NTC bead
    /// (memory); checked below only against hand calculations.
    fn ten_k() -> SteinhartHart {
        SteinhartHart::new(1.129148e-3, 2.34125e-4, 8.76741e-8, (233.15, 423.15)).unwrap()
    }

    #[test]
    fn steinhart_hart_hand_calculation() {
        // Hand calculation, R = 10 000 Ω:
        //   L = ln 10000 = 9.210340, L³ = 781.3166,
        //   b·L = 2.34125e-4 · 9.210340 = 2.156371e-3,
        //   c·L³ = 8.76741e-8 · 781.3166 = 6.850123e-5,
        //   1/T = 1.129148e-3 + 2.156371e-3 + 6.850123e-5 = 3.354020e-3 /K,
        //   T = 298.1497 K (24.9997 °C).
        // R = 3000 Ω: L = 8.006368, L³ = 513.2235, b·L = 1.874491e-3,
        //   c·L³ = 4.499641e-5, 1/T = 3.048635e-3 /K, T = 328.0156 K.
        let law = ten_k();
        for (r_ohm, t_hand_k) in [(10_000.0, 298.1497), (3000.0, 328.0156)] {
            assert_abs_diff_eq!(law.temperature_k(r_ohm).unwrap(), t_hand_k, epsilon = 1e-4);
            // Closed-form inverse: dR/R = −B_eff·dT/T², so 1e-4 K of rounding
            // is < 1e-5 relative in R.
            assert_relative_eq!(law.resistance_ohm(t_hand_k), r_ohm, max_relative = 1e-5);
        }
    }

    #[test]
    fn closed_form_inverse_is_exact() {
        let law = ten_k();
        for i in 0..=190 {
            let t_k = 233.15 + i as f64;
            let r = law.resistance_ohm(t_k);
            assert_relative_eq!(law.temperature_k(r).unwrap(), t_k, max_relative = 1e-14);
        }
        // A c < 0 law on its rising branch (invented coefficients).
        let negative_c = SteinhartHart::new(1.2e-3, 2.4e-4, -2e-8, (250.0, 400.0)).unwrap();
        for i in 0..=150 {
            let t_k = 250.0 + i as f64;
            let r = negative_c.resistance_ohm(t_k);
            assert_relative_eq!(
                negative_c.temperature_k(r).unwrap(),
                t_k,
                max_relative = 1e-14
            );
        }
    }

    #[test]
    fn derivatives_match_finite_difference() {
        let law = ten_k();
        let beta = BetaThermistor::new(10_000.0, 298.15, 3950.0).unwrap();
        for i in 0..=19 {
            let t_k = 240.0 + i as f64 * 9.7;
            let h = crate::precision::FD_REL_STEP * t_k;
            let fd = (law.resistance_ohm(t_k + h) - law.resistance_ohm(t_k - h)) / (2.0 * h);
            assert_relative_eq!(law.derivative_ohm_per_k(t_k), fd, max_relative = 1e-6);
            let fd = (beta.resistance_ohm(t_k + h) - beta.resistance_ohm(t_k - h)) / (2.0 * h);
            assert_relative_eq!(beta.derivative_ohm_per_k(t_k), fd, max_relative = 1e-6);
        }
    }

    #[test]
    fn beta_model_hand_calculation() {
        // Hand calculation: R0 = 10 kΩ at 298.15 K, B = 3950 K, T = 323.15 K:
        // 1/T − 1/T0 = 3.094538e-3 − 3.354016e-3 = −2.594783e-4 /K,
        // B·(…) = −1.024939, exp(−1.024939) = 0.358818, R = 3588.18 Ω.
        let beta = BetaThermistor::new(10_000.0, 298.15, 3950.0).unwrap();
        assert_relative_eq!(beta.resistance_ohm(323.15), 3588.18, max_relative = 2e-6);
        assert_relative_eq!(
            beta.temperature_k(3588.18).unwrap(),
            323.15,
            max_relative = 1e-6
        );
        assert!(matches!(
            BetaThermistor::new(10_000.0, 298.15, -1.0),
            Err(ThermistorError::InvalidBeta { .. })
        ));
        assert!(matches!(
            BetaThermistor::new(0.0, 298.15, 3950.0),
            Err(ThermistorError::InvalidR0 { .. })
        ));
    }

    #[test]
    fn fit_round_trip_on_beta_curve() {
        // A beta curve is Steinhart–Hart with c = 0, so the three-point fit
        // reproduces it everywhere between the points, not only at them; we
        // ask 1e-9 relative at the points and 1e-8 between them.
        let beta = BetaThermistor::new(10_000.0, 298.15, 3950.0).unwrap();
        let pts = [273.15, 298.15, 348.15].map(|t| (t, beta.resistance_ohm(t)));
        let fit = SteinhartHart::fit_three_points(pts).unwrap();
        for (t_k, r_ohm) in pts {
            assert_relative_eq!(fit.resistance_ohm(t_k), r_ohm, max_relative = 1e-9);
        }
        for i in 0..=75 {
            let t_k = 273.15 + i as f64;
            assert_relative_eq!(
                fit.resistance_ohm(t_k),
                beta.resistance_ohm(t_k),
                max_relative = 1e-8
            );
        }
        assert_eq!(fit.temperature_range_k(), (273.15, 348.15));
    }

    #[test]
    fn fit_recovers_steinhart_hart_coefficients() {
        let law = ten_k();
        let pts = [273.15, 323.15, 373.15].map(|t| (t, law.resistance_ohm(t)));
        // Order of the points does not matter.
        let fit = SteinhartHart::fit_three_points([pts[2], pts[0], pts[1]]).unwrap();
        let (a, b, c) = fit.coefficients();
        assert_relative_eq!(a, 1.129148e-3, max_relative = 1e-8);
        assert_relative_eq!(b, 2.34125e-4, max_relative = 1e-8);
        assert_relative_eq!(c, 8.76741e-8, max_relative = 1e-6);
    }

    #[test]
    fn fit_rejects_bad_points() {
        assert!(matches!(
            SteinhartHart::fit_three_points([(300.0, 1e4), (300.0, 9e3), (320.0, 5e3)]),
            Err(FitError::RepeatedTemperature { .. })
        ));
        assert!(matches!(
            SteinhartHart::fit_three_points([(300.0, 1e4), (310.0, 1e4), (320.0, 5e3)]),
            Err(FitError::RepeatedResistance { .. })
        ));
        assert!(matches!(
            SteinhartHart::fit_three_points([(300.0, 1e4), (310.0, 2e4), (320.0, 5e3)]),
            Err(FitError::NotDecreasing { .. })
        ));
        assert!(matches!(
            SteinhartHart::fit_three_points([(300.0, 1e4), (310.0, -1.0), (320.0, 5e3)]),
            Err(FitError::InvalidPoint { index: 1, .. })
        ));
        assert!(matches!(
            SteinhartHart::new(1e-3, -1e-4, 1e-7, (250.0, 400.0)),
            Err(ThermistorError::NonPositiveB { .. })
        ));
        // c = −1e-6: turn at L = √(2.4e-4/3e-6) = 8.94, 1/T allowed within
        // a ± 1.43e-3 = (−2.3e-4, 2.63e-3): 250 K (4e-3 /K) is outside.
        assert!(matches!(
            SteinhartHart::new(1.2e-3, 2.4e-4, -1e-6, (250.0, 400.0)),
            Err(ThermistorError::NotDecreasing { t_k: 250.0 })
        ));
    }

    proptest! {
        #[test]
        fn steinhart_hart_resistance_decreases(
            a in 0.5e-3f64..1.5e-3,
            b in 1.5e-4f64..3.0e-4,
            c in 0.0f64..2.0e-7,
            t in 233.15f64..422.0,
            dt in 0.01f64..1.0,
        ) {
            let law = SteinhartHart::new(a, b, c, (233.15, 423.15)).unwrap();
            let (r1, r2) = (law.resistance_ohm(t), law.resistance_ohm(t + dt));
            prop_assert!(r1.is_finite() && r2.is_finite());
            prop_assert!(r2 < r1);
            prop_assert!(law.derivative_ohm_per_k(t) < 0.0);
        }

        #[test]
        fn beta_resistance_decreases(
            r0 in 100.0f64..1e6,
            beta in 2000.0f64..5000.0,
            t in 218.15f64..422.0,
            dt in 0.01f64..1.0,
        ) {
            let law = BetaThermistor::new(r0, 298.15, beta).unwrap();
            prop_assert!(law.resistance_ohm(t + dt) < law.resistance_ohm(t));
        }
    }
}
