//! Shared checks on scalar circuit parameters: finite, strictly positive,
//! non-negative. Each returns the value on success so it can be bound
//! directly, and a [`ValueError`] naming the parameter otherwise.

use thiserror::Error;

/// Why a scalar parameter is rejected.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
pub enum ValueError {
    /// A parameter is NaN or infinite.
    #[error("{name} must be finite, got {value}")]
    NotFinite {
        /// Parameter name.
        name: &'static str,
        /// Offending value.
        value: f64,
    },
    /// A parameter that must be > 0 is not.
    #[error("{name} must be > 0, got {value}")]
    NotPositive {
        /// Parameter name.
        name: &'static str,
        /// Offending value.
        value: f64,
    },
    /// A parameter that must be ≥ 0 is negative.
    #[error("{name} must be >= 0, got {value}")]
    Negative {
        /// Parameter name.
        name: &'static str,
        /// Offending value.
        value: f64,
    },
}

/// `value` if it is finite, else [`ValueError::NotFinite`].
pub fn finite(name: &'static str, value: f64) -> Result<f64, ValueError> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(ValueError::NotFinite { name, value })
    }
}

/// `value` if it is finite and > 0; [`ValueError::NotFinite`] for NaN or
/// ±∞, else [`ValueError::NotPositive`].
pub fn positive(name: &'static str, value: f64) -> Result<f64, ValueError> {
    if finite(name, value)? > 0.0 {
        Ok(value)
    } else {
        Err(ValueError::NotPositive { name, value })
    }
}

/// `value` if it is finite and ≥ 0; [`ValueError::NotFinite`] for NaN or
/// ±∞, else [`ValueError::Negative`].
pub fn non_negative(name: &'static str, value: f64) -> Result<f64, ValueError> {
    if finite(name, value)? >= 0.0 {
        Ok(value)
    } else {
        Err(ValueError::Negative { name, value })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finite_passes_finite_values_and_rejects_nan_and_inf() {
        assert_eq!(finite("x", -3.5), Ok(-3.5));
        assert_eq!(
            finite("x", f64::INFINITY),
            Err(ValueError::NotFinite {
                name: "x",
                value: f64::INFINITY
            })
        );
        assert!(matches!(
            finite("x", f64::NAN),
            Err(ValueError::NotFinite { name: "x", .. })
        ));
    }

    #[test]
    fn positive_rejects_zero_negative_and_non_finite() {
        assert_eq!(positive("r", 1e-12), Ok(1e-12));
        assert_eq!(
            positive("r", 0.0),
            Err(ValueError::NotPositive {
                name: "r",
                value: 0.0
            })
        );
        assert!(matches!(
            positive("r", -1.0),
            Err(ValueError::NotPositive { .. })
        ));
        // Non-finite input is reported as such, even when negative.
        assert!(matches!(
            positive("r", f64::NEG_INFINITY),
            Err(ValueError::NotFinite { .. })
        ));
    }

    #[test]
    fn non_negative_accepts_zero_and_rejects_negative() {
        assert_eq!(non_negative("i", 0.0), Ok(0.0));
        assert_eq!(
            non_negative("i", -0.5),
            Err(ValueError::Negative {
                name: "i",
                value: -0.5
            })
        );
        assert!(matches!(
            non_negative("i", f64::NAN),
            Err(ValueError::NotFinite { .. })
        ));
    }

    #[test]
    fn messages_name_parameter_condition_and_value() {
        let e = finite("supply_v", f64::NAN).unwrap_err();
        assert_eq!(e.to_string(), "supply_v must be finite, got NaN");
        let e = positive("base_ohm", 0.0).unwrap_err();
        assert_eq!(e.to_string(), "base_ohm must be > 0, got 0");
        let e = non_negative("load_a", -2.0).unwrap_err();
        assert_eq!(e.to_string(), "load_a must be >= 0, got -2");
    }
}
