//! Resistance-versus-temperature laws of the sensing element.
//!
//! Each law is one variant of [`ResistanceLaw`]; every variant evaluates
//! `R(T)` and `dR/dT` without heap allocation and states the temperature
//! range over which it is valid.

use serde::Serialize;

/// Why a resistance law could not be built.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ResistanceLawError {
    /// A parameter violated its stated condition.
    #[error("{parameter} must be {condition}, found {value}")]
    Invalid {
        /// Which parameter.
        parameter: &'static str,
        /// The condition it must satisfy.
        condition: &'static str,
        /// The offending value (SI).
        value: f64,
    },
}

fn require(
    ok: bool,
    parameter: &'static str,
    condition: &'static str,
    value: f64,
) -> Result<(), ResistanceLawError> {
    if ok && value.is_finite() {
        Ok(())
    } else {
        Err(ResistanceLawError::Invalid {
            parameter,
            condition,
            value,
        })
    }
}

/// Linear temperature coefficient law, `R(T) = R0·(1 + α·(T − T0))`.
///
/// The usual first-order model of a metal's resistance (e.g. IEC 60751
/// defines α for platinum as (R100 − R0)/(100·R0); CRC Handbook wire tables
/// quote α near 20 °C for common metals).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct LinearTcr {
    r0_ohm: f64,
    t0_k: f64,
    alpha_per_k: f64,
}

/// Lowest temperature any law is evaluated at (liquid-nitrogen region);
/// below this a linear law means nothing for the elements draftwire models.
pub const LOWEST_MODEL_TEMPERATURE_K: f64 = 70.0;

/// Highest temperature any law is evaluated at: above tungsten's melting
/// point (3695 K, CRC Handbook) no solid element exists.
pub const HIGHEST_MODEL_TEMPERATURE_K: f64 = 3695.0;

impl LinearTcr {
    /// Build a linear-TCR law: `r0_ohm` > 0 at `t0_k` > 0, any finite α.
    pub fn new(r0_ohm: f64, t0_k: f64, alpha_per_k: f64) -> Result<Self, ResistanceLawError> {
        require(
            r0_ohm > 0.0,
            "R0",
            "a finite resistance above 0 ohm",
            r0_ohm,
        )?;
        require(
            t0_k > 0.0,
            "T0",
            "a finite absolute temperature above 0 K",
            t0_k,
        )?;
        require(
            alpha_per_k.abs() < 1.0,
            "alpha",
            "a finite coefficient with |alpha| < 1 /K",
            alpha_per_k,
        )?;
        Ok(Self {
            r0_ohm,
            t0_k,
            alpha_per_k,
        })
    }
    /// R0, the resistance at T0.
    pub fn r0_ohm(&self) -> f64 {
        self.r0_ohm
    }
    /// T0, the reference temperature.
    pub fn t0_k(&self) -> f64 {
        self.t0_k
    }
    /// α, the temperature coefficient referred to T0.
    pub fn alpha_per_k(&self) -> f64 {
        self.alpha_per_k
    }
}

/// The element's resistance law. Later laws are added as variants.
#[derive(Debug, Clone, PartialEq)]
pub enum ResistanceLaw {
    /// `R = R0·(1 + α·(T − T0))`.
    Linear(LinearTcr),
}

impl ResistanceLaw {
    /// Resistance at absolute temperature `t_k`, in ohm.
    pub fn resistance_ohm(&self, t_k: f64) -> f64 {
        match self {
            ResistanceLaw::Linear(l) => l.r0_ohm * (1.0 + l.alpha_per_k * (t_k - l.t0_k)),
        }
    }

    /// dR/dT at `t_k`, in ohm/K.
    pub fn derivative_ohm_per_k(&self, t_k: f64) -> f64 {
        match self {
            ResistanceLaw::Linear(l) => {
                let _ = t_k;
                l.r0_ohm * l.alpha_per_k
            }
        }
    }

    /// Temperature range (K) over which the law is valid and gives a
    /// positive resistance.
    pub fn valid_range_k(&self) -> (f64, f64) {
        match self {
            ResistanceLaw::Linear(l) => {
                let (mut lo, mut hi) = (LOWEST_MODEL_TEMPERATURE_K, HIGHEST_MODEL_TEMPERATURE_K);
                // Keep R ≥ 1 % of R0 so the law never reaches zero resistance.
                if l.alpha_per_k > 0.0 {
                    lo = lo.max(l.t0_k - 0.99 / l.alpha_per_k);
                } else if l.alpha_per_k < 0.0 {
                    hi = hi.min(l.t0_k - 0.99 / l.alpha_per_k);
                }
                (lo, hi)
            }
        }
    }

    /// The temperature (K) at which the law gives `r_ohm`, if it lies in
    /// the valid range (Brent's method on the monotone law).
    pub fn temperature_for_resistance(&self, r_ohm: f64) -> Option<f64> {
        let (lo, hi) = self.valid_range_k();
        crate::roots::brent(|t| self.resistance_ohm(t) - r_ohm, lo, hi)
            .ok()
            .map(|r| r.x)
    }

    /// The same law with every resistance scaled by `factor` (a part at a
    /// tolerance corner).
    pub fn scaled(&self, factor: f64) -> Self {
        match self {
            ResistanceLaw::Linear(l) => ResistanceLaw::Linear(LinearTcr {
                r0_ohm: l.r0_ohm * factor,
                ..*l
            }),
        }
    }

    /// Short name of the law for reports.
    pub fn name(&self) -> &'static str {
        match self {
            ResistanceLaw::Linear(_) => "linear TCR",
        }
    }

    /// Whether the resistance rises with temperature (metals, PTC).
    pub fn is_increasing(&self) -> bool {
        let (lo, hi) = self.valid_range_k();
        let mid = 0.5 * (lo + hi).min(lo + 600.0);
        self.derivative_ohm_per_k(mid) > 0.0
    }
}
