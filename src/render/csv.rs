//! CSV rendering (RFC 4180 quoting): one table of the report per call.

use crate::report::Report;

/// Which table of the report to write.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Table {
    /// The bill of values.
    Values,
    /// The operating points.
    OperatingPoints,
    /// The checks.
    Checks,
    /// The drift rows.
    Drift,
    /// The connection list: every pin of every part and its node.
    Connections,
}

/// Quote a field when it holds a comma, quote or line break (RFC 4180 §2).
pub fn field(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

fn num(x: f64) -> String {
    format!("{x}")
}

fn opt(x: Option<f64>) -> String {
    x.map(num).unwrap_or_default()
}

fn line(out: &mut String, cells: &[String]) {
    let cells: Vec<String> = cells.iter().map(|c| field(c)).collect();
    out.push_str(&cells.join(","));
    out.push_str("\r\n");
}

/// Render one table.
pub fn render(report: &Report, table: Table) -> String {
    let mut out = String::new();
    match table {
        Table::Values => {
            line(
                &mut out,
                &[
                    "designator",
                    "function",
                    "part",
                    "value_ohm",
                    "value_a",
                    "value_f",
                    "value_v",
                    "exact",
                    "e_series",
                    "text",
                    "rating_w",
                    "dissipation_w",
                    "rating",
                    "reason",
                ]
                .map(String::from),
            );
            for v in &report.values {
                line(
                    &mut out,
                    &[
                        v.designator.clone(),
                        v.function.clone(),
                        v.part.clone(),
                        opt(v.value_ohm),
                        opt(v.value_a),
                        opt(v.value_f),
                        opt(v.value_v),
                        opt(v.exact),
                        v.e_series.clone(),
                        v.text.clone(),
                        opt(v.rating_w),
                        opt(v.dissipation_w),
                        v.rating.clone(),
                        v.reason.clone(),
                    ],
                );
            }
        }
        Table::OperatingPoints => {
            line(
                &mut out,
                &[
                    "label",
                    "airflow_m_per_s",
                    "ambient_c",
                    "element_temperature_c",
                    "element_resistance_ohm",
                    "element_current_a",
                    "element_power_w",
                    "sense_voltage_v",
                    "overheat_ratio",
                    "time_constant_s",
                ]
                .map(String::from),
            );
            for p in &report.operating_points {
                line(
                    &mut out,
                    &[
                        p.label.clone(),
                        num(p.airflow_m_per_s),
                        num(p.ambient_c),
                        num(p.element_temperature_c),
                        num(p.element_resistance_ohm),
                        num(p.element_current_a),
                        num(p.element_power_w),
                        num(p.sense_voltage_v),
                        num(p.overheat_ratio),
                        num(p.time_constant_s),
                    ],
                );
            }
        }
        Table::Checks => {
            line(
                &mut out,
                &[
                    "id",
                    "name",
                    "passed",
                    "value",
                    "limit",
                    "margin",
                    "unit",
                    "condition",
                    "detail",
                ]
                .map(String::from),
            );
            for c in &report.checks {
                line(
                    &mut out,
                    &[
                        c.id.clone(),
                        c.name.clone(),
                        c.passed.to_string(),
                        opt(c.value),
                        opt(c.limit),
                        opt(c.margin),
                        c.unit.clone(),
                        c.condition.clone(),
                        c.detail.clone(),
                    ],
                );
            }
        }
        Table::Connections => {
            line(&mut out, &["designator", "pin", "node"].map(String::from));
            for c in &report.connections {
                line(
                    &mut out,
                    &[c.designator.clone(), c.pin.clone(), c.node.clone()],
                );
            }
        }
        Table::Drift => {
            line(
                &mut out,
                &[
                    "condition",
                    "ambient_c",
                    "element_rail_v",
                    "reference_rail_v",
                    "corner",
                    "offset_v",
                    "trip_airflow_m_per_s",
                    "release_airflow_m_per_s",
                    "shift_m_per_s",
                    "tripped_in_still_air",
                    "uncompensated_trip_airflow_m_per_s",
                    "note",
                ]
                .map(String::from),
            );
            for d in &report.drift {
                line(
                    &mut out,
                    &[
                        d.condition.clone(),
                        num(d.ambient_c),
                        num(d.element_rail_v),
                        num(d.reference_rail_v),
                        d.corner.clone(),
                        num(d.offset_v),
                        opt(d.trip_airflow_m_per_s),
                        opt(d.release_airflow_m_per_s),
                        opt(d.shift_m_per_s),
                        d.tripped_in_still_air.to_string(),
                        opt(d.uncompensated_trip_airflow_m_per_s),
                        d.note.clone(),
                    ],
                );
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn quotes_only_when_needed() {
        // RFC 4180 §2 rules 6 and 7.
        assert_eq!(field("plain"), "plain");
        assert_eq!(field("a,b"), "\"a,b\"");
        assert_eq!(field("say \"hi\""), "\"say \"\"hi\"\"\"");
    }
}
