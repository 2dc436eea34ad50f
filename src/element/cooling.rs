//! Heat-loss laws of the sensing element.
//!
//! Every law gives the heat the element loses, `P_loss(T, U)`, to air at
//! the ambient temperature, with its partial derivatives in T and U.

use super::Environment;

/// Why a cooling law could not be built.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum CoolingLawError {
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

/// King's law in conductance form, `G(U) = A + B·Uⁿ` (W/K), with
/// `P_loss = G(U)·(T − T_amb)`.
///
/// L. V. King, "On the convection of heat from small cylinders in a stream
/// of fluid", Phil. Trans. R. Soc. A 214 (1914) 373–432. King's theory gives
/// n = 0.5; calibrations commonly find n ≈ 0.45. `B` is the conductance
/// added at U = 1 m/s, so U is taken in m/s.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct KingsLaw {
    a_w_per_k: f64,
    b_w_per_k: f64,
    n: f64,
}

impl KingsLaw {
    /// Build King's law: A ≥ 0, B > 0, 0 < n ≤ 1, and A + B > 0.
    pub fn new(a_w_per_k: f64, b_w_per_k: f64, n: f64) -> Result<Self, CoolingLawError> {
        let bad = |parameter, condition, value| {
            Err(CoolingLawError::Invalid {
                parameter,
                condition,
                value,
            })
        };
        if !(a_w_per_k.is_finite() && a_w_per_k >= 0.0) {
            return bad("A", "a finite conductance of at least 0 W/K", a_w_per_k);
        }
        if !(b_w_per_k.is_finite() && b_w_per_k > 0.0) {
            return bad("B", "a finite conductance above 0 W/K", b_w_per_k);
        }
        if !(n.is_finite() && n > 0.0 && n <= 1.0) {
            return bad("n", "a number in (0, 1]", n);
        }
        Ok(Self {
            a_w_per_k,
            b_w_per_k,
            n,
        })
    }
    /// A, the still-air conductance (W/K).
    pub fn a_w_per_k(&self) -> f64 {
        self.a_w_per_k
    }
    /// B, the conductance added at 1 m/s (W/K).
    pub fn b_w_per_k(&self) -> f64 {
        self.b_w_per_k
    }
    /// n, the airflow exponent.
    pub fn n(&self) -> f64 {
        self.n
    }
    /// G(U) = A + B·Uⁿ, U in m/s (negative U taken as |U|).
    pub fn conductance_w_per_k(&self, airflow_m_per_s: f64) -> f64 {
        self.a_w_per_k + self.b_w_per_k * airflow_m_per_s.abs().powf(self.n)
    }
}

/// The element's heat-loss law. Later laws are added as variants.
#[derive(Debug, Clone, PartialEq)]
pub enum CoolingLaw {
    /// King's law with constant coefficients.
    King(KingsLaw),
}

impl CoolingLaw {
    /// Heat lost (W) at element temperature `t_k` and airflow `u` (m/s).
    pub fn heat_loss_w(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        match self {
            CoolingLaw::King(k) => k.conductance_w_per_k(airflow_m_per_s) * (t_k - env.ambient_k),
        }
    }

    /// ∂P_loss/∂T (W/K).
    pub fn d_heat_loss_dt(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        match self {
            CoolingLaw::King(k) => {
                let _ = t_k;
                let _ = env;
                k.conductance_w_per_k(airflow_m_per_s)
            }
        }
    }

    /// ∂P_loss/∂U (W per m/s); for U = 0 and n < 1 the one-sided limit is
    /// infinite, so callers evaluate it at U > 0.
    pub fn d_heat_loss_du(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        match self {
            CoolingLaw::King(k) => {
                let u = airflow_m_per_s.abs().max(f64::MIN_POSITIVE);
                k.b_w_per_k * k.n * u.powf(k.n - 1.0) * (t_k - env.ambient_k)
            }
        }
    }

    /// Short name for reports.
    pub fn name(&self) -> &'static str {
        match self {
            CoolingLaw::King(_) => "King's law",
        }
    }
}
