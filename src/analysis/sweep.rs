//! `sweep`: one design-file key (or two, for a grid) stepped over a range,
//! each point read, sized and checked as if the file said so.
//!
//! Point i of N is `from + (to − from)·i/(N − 1)` (or geometric with
//! `--log`), computed from its index, with the last point exactly `to`.
//! Keys tied to a swept one follow it by a stated rule: sweeping
//! `supply.input` scales `supply.input_min` and `supply.input_max` by the
//! same factor; sweeping `ambient.nominal` shifts `ambient.min` and
//! `ambient.max` by the same amount. With `hold_values` the design is sized
//! once at its own values, and every point analyses that built circuit
//! (the sized parts and the trimmer setting held).

use crate::design::overrides::Override;
use crate::design::{parse_design_with, Design};
use crate::quantity::{parse_quantity, Dimension};
use serde::Serialize;

/// Most points one axis may have.
pub const MAX_POINTS: usize = 10_000;

/// Most points a whole sweep (grid) may have.
pub const MAX_TOTAL_POINTS: usize = 100_000;

/// The dimensions a swept value may have, tried in this order.
const DIMENSIONS: [Dimension; 17] = [
    Dimension::Velocity,
    Dimension::Voltage,
    Dimension::Current,
    Dimension::Resistance,
    Dimension::Power,
    Dimension::Temperature,
    Dimension::TemperatureDifference,
    Dimension::ThermalConductance,
    Dimension::ThermalResistance,
    Dimension::HeatCapacity,
    Dimension::TemperatureCoefficient,
    Dimension::Capacitance,
    Dimension::Length,
    Dimension::Time,
    Dimension::Pressure,
    Dimension::Resistivity,
    Dimension::Fraction,
];

/// One swept key.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Axis {
    /// Dotted key as in the file.
    pub key: String,
    /// Column name: the key with its SI unit appended.
    pub column: String,
    /// First value, SI.
    pub from: f64,
    /// Last value, SI.
    pub to: f64,
    #[serde(skip)]
    dim: Dimension,
}

/// Why a sweep cannot run.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SweepError {
    /// A range end has no recognisable quantity.
    #[error("{key}: cannot read \"{text}\" as a quantity with its unit, such as \"0.5 m/s\" or \"12 V\"")]
    Quantity {
        /// The key.
        key: String,
        /// The text.
        text: String,
    },
    /// The two ends have different dimensions.
    #[error("{key}: \"{from}\" and \"{to}\" are not the same kind of quantity")]
    Mismatch {
        /// The key.
        key: String,
        /// First end.
        from: String,
        /// Last end.
        to: String,
    },
    /// The range is empty or too large.
    #[error("{0}")]
    Range(String),
    /// The key is not a dotted key.
    #[error("expected a dotted key as in the file, such as detector.trip_airflow; found \"{0}\"")]
    Key(String),
}

fn suffix(dim: Dimension) -> &'static str {
    match dim {
        Dimension::Resistance => "_ohm",
        Dimension::Voltage => "_v",
        Dimension::Current => "_a",
        Dimension::Power => "_w",
        Dimension::Velocity => "_m_per_s",
        Dimension::Temperature | Dimension::TemperatureDifference => "_k",
        Dimension::ThermalConductance => "_w_per_k",
        Dimension::ThermalResistance => "_k_per_w",
        Dimension::HeatCapacity => "_j_per_k",
        Dimension::Fraction => "",
        Dimension::TemperatureCoefficient => "_per_k",
        Dimension::Capacitance => "_f",
        Dimension::Length => "_m",
        Dimension::Time => "_s",
        Dimension::Pressure => "_pa",
        Dimension::Resistivity => "_ohm_m",
    }
}

/// The unit spelled as the design file reads it.
fn unit_text(dim: Dimension) -> &'static str {
    match dim {
        Dimension::Resistance => "ohm",
        Dimension::Resistivity => "ohm m",
        Dimension::Fraction => "",
        d => d.si_unit(),
    }
}

/// The first dimension `text` reads as (a bare number is a fraction).
fn read(text: &str) -> Option<(f64, Dimension)> {
    DIMENSIONS
        .iter()
        .find_map(|&d| parse_quantity(text, d).ok().map(|v| (v, d)))
}

impl Axis {
    /// A swept key from its two ends as the file would write them.
    pub fn new(key: &str, from: &str, to: &str) -> Result<Self, SweepError> {
        if key.split('.').count() < 2 || key.split('.').any(str::is_empty) {
            return Err(SweepError::Key(key.into()));
        }
        let q = |t: &str| {
            read(t).ok_or_else(|| SweepError::Quantity {
                key: key.into(),
                text: t.into(),
            })
        };
        let (a, da) = q(from)?;
        let (b, db) = q(to)?;
        if da != db {
            return Err(SweepError::Mismatch {
                key: key.into(),
                from: from.into(),
                to: to.into(),
            });
        }
        Ok(Self {
            key: key.into(),
            column: format!("{key}{}", suffix(da)),
            from: a,
            to: b,
            dim: da,
        })
    }

    /// The value of point `i` of `n`: linear or geometric, the last one
    /// exactly `to`.
    fn value(&self, i: usize, n: usize, log: bool) -> f64 {
        if n <= 1 || i == 0 {
            return self.from;
        }
        if i == n - 1 {
            return self.to;
        }
        let f = i as f64 / (n - 1) as f64;
        if log {
            self.from * (self.to / self.from).powf(f)
        } else {
            self.from + (self.to - self.from) * f
        }
    }

    /// The override text for a value, checked to read back.
    fn text(&self, v: f64) -> String {
        let unit = unit_text(self.dim);
        if unit.is_empty() {
            format!("{v}")
        } else {
            format!("{v} {unit}")
        }
    }
}

/// What to sweep.
#[derive(Debug, Clone, PartialEq)]
pub struct SweepSpec {
    /// One or two axes.
    pub axes: Vec<Axis>,
    /// Points per axis.
    pub points: usize,
    /// Geometric steps.
    pub log: bool,
    /// Size once and hold the parts.
    pub hold_values: bool,
}

impl SweepSpec {
    /// Check the range before anything runs.
    pub fn validate(&self) -> Result<(), SweepError> {
        if !(2..=MAX_POINTS).contains(&self.points) {
            return Err(SweepError::Range(format!(
                "--points: expected 2 to {MAX_POINTS}, found {}",
                self.points
            )));
        }
        let total = self.points.pow(self.axes.len() as u32);
        if total > MAX_TOTAL_POINTS {
            return Err(SweepError::Range(format!(
                "the grid would have {total} points; at most {MAX_TOTAL_POINTS}"
            )));
        }
        for a in &self.axes {
            if a.from == a.to {
                return Err(SweepError::Range(format!(
                    "{}: the range is empty (both ends are {})",
                    a.key,
                    a.text(a.from)
                )));
            }
            if self.log && !(a.from > 0.0 && a.to > 0.0) {
                return Err(SweepError::Range(format!(
                    "{}: --log needs both ends above zero",
                    a.key
                )));
            }
        }
        Ok(())
    }
}

/// A sized part as a sweep row shows it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PartValue {
    /// Designator.
    pub designator: String,
    /// Value in SI (ohm, A, F or V).
    pub value: f64,
}

/// One point.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SweepRow {
    /// The swept values, SI, in axis order.
    pub values: Vec<f64>,
    /// Whether every design check passed (null when the point failed).
    pub passed: Option<bool>,
    /// Trip airflow, m/s.
    pub trip_airflow_m_per_s: Option<f64>,
    /// Release airflow, m/s.
    pub release_airflow_m_per_s: Option<f64>,
    /// Reference voltage at the trip, V.
    pub reference_voltage_v: Option<f64>,
    /// Trimmer setting, % of travel.
    pub trimmer_position_percent: Option<f64>,
    /// The sized parts.
    pub parts: Vec<PartValue>,
    /// Ids of the failing checks.
    pub failing_checks: Vec<String>,
    /// Why the point could not be read or sized.
    pub error: Option<String>,
}

/// The whole sweep.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SweepReport {
    /// Layout version.
    pub schema_version: u32,
    /// draftwire's version.
    pub tool_version: String,
    /// The design file.
    pub design_file: String,
    /// The swept keys.
    pub axes: Vec<Axis>,
    /// Points per axis.
    pub points: usize,
    /// Geometric steps.
    pub log: bool,
    /// Whether the parts were held.
    pub hold_values: bool,
    /// How tied keys followed the swept one, in words.
    pub tied: Vec<String>,
    /// One row per point, first axis fastest.
    pub rows: Vec<SweepRow>,
}

/// Overrides that keep the keys tied to a swept one in step.
fn tied_overrides(design: &Design, axis: &Axis, v: f64) -> (Vec<Override>, Option<String>) {
    let o = |k: &str, val: String| Override {
        key: k.into(),
        value: val,
        remove: false,
    };
    match axis.key.as_str() {
        "supply.input" => {
            let s = &design.supply;
            let r = v / s.input_v;
            (
                vec![
                    o("supply.input_min", format!("{} V", s.input_min_v * r)),
                    o("supply.input_max", format!("{} V", s.input_max_v * r)),
                ],
                Some("supply.input_min and supply.input_max scale with supply.input (same ratio as in the file)".into()),
            )
        }
        "ambient.nominal" => {
            let a = &design.ambient;
            let d = v - a.nominal_k;
            (
                vec![
                    o("ambient.min", format!("{} K", a.min_k + d)),
                    o("ambient.max", format!("{} K", a.max_k + d)),
                ],
                Some("ambient.min and ambient.max move with ambient.nominal (same offsets as in the file)".into()),
            )
        }
        _ => (Vec::new(), None),
    }
}

/// Overrides that hold the sized parts of a report.
fn hold_overrides(report: &crate::report::Report) -> Vec<Override> {
    let mut out = Vec::new();
    let o = |k: &str, val: String| Override {
        key: k.into(),
        value: val,
        remove: false,
    };
    // Parts are found by their role (the bill's function column): their
    // designators depend on which parts the design has.
    use super::wiring::Role;
    let part = |r: Role| report.values.iter().find(|v| v.function == r.function());
    let ohm = |r: Role| part(r).and_then(|v| v.value_ohm);
    for (r, key) in [
        (Role::SeriesResistor, "drive.series"),
        (Role::DividerTop, "detector.top"),
        (Role::Trimmer, "detector.trimmer"),
        (Role::DividerBottom, "detector.bottom"),
        (Role::Feedback, "detector.feedback"),
        (Role::InputResistor, "detector.input_resistor"),
        (Role::PullUp, "comparator.pullup"),
        (Role::Twin, "compensation.twin_resistance"),
        (Role::Thermistor, "compensation.thermistor_r25"),
        (Role::Linearising, "compensation.linearising"),
    ] {
        if let Some(v) = ohm(r) {
            out.push(o(key, format!("{v} ohm")));
        }
    }
    // The compensation `auto` chose is held too.
    if report.compensation.kind != "none" {
        out.push(o("compensation.kind", report.compensation.kind.clone()));
    }
    if let Some(a) = part(Role::CurrentSource).and_then(|v| v.value_a) {
        out.push(o("drive.current", format!("{a} A")));
    }
    if ohm(Role::SeriesResistor).is_some() || out.iter().any(|x| x.key == "drive.current") {
        for k in ["drive.overheat_rise", "drive.overheat_ratio"] {
            out.push(Override {
                key: k.into(),
                value: String::new(),
                remove: true,
            });
        }
    }
    out.push(o(
        "detector.trimmer_position",
        format!("{} %", report.trip.trimmer_position_percent),
    ));
    out
}

fn row_of(values: Vec<f64>, r: Result<crate::report::Report, String>) -> SweepRow {
    match r {
        Ok(rep) => SweepRow {
            values,
            passed: Some(rep.passed),
            trip_airflow_m_per_s: rep.trip.airflow_m_per_s,
            release_airflow_m_per_s: rep.trip.release_airflow_m_per_s,
            reference_voltage_v: Some(rep.trip.reference_voltage_v),
            trimmer_position_percent: Some(rep.trip.trimmer_position_percent),
            parts: rep
                .values
                .iter()
                .filter_map(|v| {
                    v.value_ohm.or(v.value_a).or(v.value_f).map(|x| PartValue {
                        designator: v.designator.clone(),
                        value: x,
                    })
                })
                .collect(),
            failing_checks: rep
                .checks
                .iter()
                .filter(|c| !c.passed)
                .map(|c| c.id.clone())
                .collect(),
            error: None,
        },
        Err(e) => SweepRow {
            values,
            passed: None,
            trip_airflow_m_per_s: None,
            release_airflow_m_per_s: None,
            reference_voltage_v: None,
            trimmer_position_percent: None,
            parts: Vec::new(),
            failing_checks: Vec::new(),
            error: Some(e),
        },
    }
}

/// Run the sweep. `base` are the command line's own `--set` overrides;
/// `progress` is called with the points done. The base design must read;
/// a point that cannot be read or sized becomes a row with its reason.
pub fn sweep(
    file: &str,
    source: &str,
    base: &[Override],
    spec: &SweepSpec,
    progress: &dyn Fn(usize),
) -> Result<SweepReport, Box<crate::design::Diagnostic>> {
    let design = parse_design_with(file, source, base)?;
    let mut fixed: Vec<Override> = base.to_vec();
    if spec.hold_values {
        if let Ok(report) = super::size(&design) {
            fixed.extend(hold_overrides(&report));
        }
    }
    let n = spec.points;
    let total = n.pow(spec.axes.len() as u32);
    let mut rows = Vec::with_capacity(total);
    let mut tied = Vec::new();
    for k in 0..total {
        let mut overrides = fixed.clone();
        let mut values = Vec::new();
        let mut rest = k;
        for axis in &spec.axes {
            let i = rest % n;
            rest /= n;
            let v = axis.value(i, n, spec.log);
            values.push(v);
            let (extra, why) = tied_overrides(&design, axis, v);
            if let Some(w) = why {
                if !tied.contains(&w) {
                    tied.push(w);
                }
            }
            overrides.extend(extra);
            overrides.push(Override {
                key: axis.key.clone(),
                value: axis.text(v),
                remove: false,
            });
        }
        let result = parse_design_with(file, source, &overrides)
            .map_err(|d| d.to_string())
            .and_then(|d| super::size(&d).map_err(|e| e.to_string()));
        rows.push(row_of(values, result));
        progress(k + 1);
    }
    Ok(SweepReport {
        schema_version: crate::report::SCHEMA_VERSION,
        tool_version: env!("CARGO_PKG_VERSION").to_string(),
        design_file: file.to_string(),
        axes: spec.axes.clone(),
        points: n,
        log: spec.log,
        hold_values: spec.hold_values,
        tied,
        rows,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn points_hit_both_ends_exactly() {
        let a = Axis::new("detector.trip_airflow", "0.2 m/s", "0.6 m/s").unwrap();
        assert_eq!(a.column, "detector.trip_airflow_m_per_s");
        assert_eq!(a.value(0, 20, false), 0.2);
        assert_eq!(a.value(19, 20, false), 0.6);
        assert_eq!(a.value(19, 20, true), 0.6);
        // Linear interior point from its index: 0.2 + 0.4·10/19 (arithmetic).
        assert!((a.value(10, 20, false) - (0.2 + 0.4 * 10.0 / 19.0)).abs() < 1e-15);
        assert!(Axis::new("detector.trip_airflow", "0.2 m/s", "12 V").is_err());
        let spec = SweepSpec {
            axes: vec![a.clone()],
            points: 1,
            log: false,
            hold_values: false,
        };
        assert!(spec.validate().is_err());
    }
}
