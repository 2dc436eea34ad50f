//! Where the comparator output switches as the airflow changes: the
//! airflow at which the sense voltage crosses a switching level, or, when
//! it never does, which side of the level every airflow lies on.

use crate::drive::Drive;
use crate::element::{Element, Environment};
use crate::solve::{airflow_for_sense, SolveError};

/// Where the output switches for a given switching level.
#[derive(Debug, Clone, PartialEq)]
pub enum Switching {
    /// At this airflow, m/s.
    At(f64),
    /// The level lies beyond every airflow on the tripped side: the output
    /// is tripped at every airflow.
    AlwaysTripped,
    /// The level lies beyond every airflow on the idle side: the output
    /// never trips.
    NeverTrips,
    /// No steady state could be solved.
    Unsolved(String),
}

impl Switching {
    /// The airflow, when it switches at one.
    pub fn airflow(&self) -> Option<f64> {
        match self {
            Switching::At(u) => Some(*u),
            _ => None,
        }
    }
    /// In words.
    pub fn describe(&self) -> String {
        match self {
            Switching::At(u) => format!("{u:.3} m/s"),
            Switching::AlwaysTripped => "always tripped".into(),
            Switching::NeverTrips => "never trips".into(),
            Switching::Unsolved(e) => format!("no steady state ({e})"),
        }
    }
}

/// Where the sense voltage crosses `level`, or which side every airflow
/// lies on.
pub fn switching_at(
    element: &Element,
    drive: &Drive,
    env: &Environment,
    level: f64,
    hint: f64,
    sigma: f64,
) -> Switching {
    match airflow_for_sense(element, drive, env, level, hint) {
        Ok(u) => Switching::At(u),
        Err(SolveError::LevelNotReached { at_zero_v, .. }) => {
            if sigma * (at_zero_v - level) > 0.0 {
                Switching::AlwaysTripped
            } else {
                Switching::NeverTrips
            }
        }
        Err(e) => Switching::Unsolved(e.to_string()),
    }
}
