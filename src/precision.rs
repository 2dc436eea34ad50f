//! The one precision policy of draftwire.
//!
//! Every iterative solver in the crate takes its tolerances and iteration
//! limits from here, so that a change of policy happens in one place.

/// Relative tolerance on a root's abscissa (temperature in K, airflow in m/s).
pub const ROOT_REL_TOL: f64 = 1e-12;

/// Absolute tolerance on a root's abscissa, in the abscissa's SI unit.
pub const ROOT_ABS_TOL: f64 = 1e-12;

/// Most function evaluations one Brent solve may take.
pub const BRENT_MAX_EVALUATIONS: usize = 200;

/// Number of sub-intervals the bracketing scan splits a range into when it
/// looks for every sign change of the energy-balance residual.
pub const SCAN_INTERVALS: usize = 256;

/// Relative tolerance to which a solved energy balance must close.
pub const ENERGY_BALANCE_REL_TOL: f64 = 1e-9;

/// Relative step used for central finite differences of smooth physics
/// functions (derivatives of losses and electrical power with temperature).
pub const FD_REL_STEP: f64 = 1e-6;

/// Iterations of the golden-section search used by the King's-law
/// equivalent fit (each shrinks the interval by 0.618; 80 reach the
/// resolution of f64 on [0.05, 1]).
pub const GOLDEN_SECTION_ITERATIONS: usize = 80;
