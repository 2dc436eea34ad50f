//! The output stage, the supply and the ratings of every part: the circuit
//! a builder solders around the sized core.

use super::size::{SizedCore, DEFAULT_PULLUP_OHM};
use crate::design::model::{Design, Sizable, StageKind};
use crate::report::{Check, SupplyBudget, ValueRow};

/// What the comparator's output node looks like to the feedback network.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OutputNode {
    /// Pull-up resistor from the comparator rail to the output, ohm.
    pub pullup_ohm: f64,
    /// The exact pull-up value before snapping, when it was sized.
    pub pullup_exact: Option<f64>,
    /// Thevenin source of the output node when the output is high (V, ohm),
    /// including whatever the output stage loads it with.
    pub high_source: (f64, f64),
}

/// The output node for a resolved stage; called by `size_core` before the
/// hysteresis network is sized.
pub fn output_node(design: &Design, stage: StageKind) -> OutputNode {
    let _ = stage;
    let vcc = design.supply.rail_v(design.comparator.rail);
    let (pullup_ohm, pullup_exact) = match design.comparator.pullup_ohm {
        Sizable::Fixed(r) => (r, None),
        Sizable::Auto => (DEFAULT_PULLUP_OHM, None),
    };
    OutputNode {
        pullup_ohm,
        pullup_exact,
        high_source: (vcc, pullup_ohm),
    }
}

/// The circuit section of the report.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct CircuitSection {
    /// Values to append to the bill.
    pub values: Vec<ValueRow>,
    /// Checks to append.
    pub checks: Vec<Check>,
    /// The supply budget.
    pub supply: SupplyBudget,
    /// Cautions to append.
    pub cautions: Vec<String>,
}

/// Size the output stage and supply, rate every part (annotating the core
/// values in `values` with their ratings), and check the comparator limits.
pub fn circuit_section(
    design: &Design,
    core: &SizedCore,
    values: &mut [ValueRow],
) -> CircuitSection {
    let _ = (design, core, values);
    CircuitSection::default()
}
