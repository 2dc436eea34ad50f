//! Rendering a sweep: aligned text, CSV and JSON, each a pure function of
//! the sweep with a fixed column order (the swept keys, then the results,
//! then every sized part in the order first met).

use super::csv::field;
use crate::analysis::sweep::SweepReport;
use crate::quantity::format_sig;

/// JSON, pretty-printed, units in the key names.
pub fn render_json(r: &SweepReport) -> String {
    serde_json::to_string_pretty(r).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}")) + "\n"
}

/// Every designator met, in first-seen order.
fn designators(r: &SweepReport) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for row in &r.rows {
        for p in &row.parts {
            if !out.contains(&p.designator) {
                out.push(p.designator.clone());
            }
        }
    }
    out
}

fn header(r: &SweepReport) -> Vec<String> {
    let mut h: Vec<String> = r.axes.iter().map(|a| a.column.clone()).collect();
    for c in [
        "passed",
        "trip_airflow_m_per_s",
        "release_airflow_m_per_s",
        "reference_voltage_v",
        "trimmer_position_percent",
        "failing_checks",
        "failing_check_ids",
    ] {
        h.push(c.into());
    }
    for d in designators(r) {
        h.push(format!("{d}_value_si"));
    }
    h.push("error".into());
    h
}

fn cells(r: &SweepReport, digits: Option<usize>) -> Vec<Vec<String>> {
    let ds = designators(r);
    let num = |x: f64| match digits {
        Some(n) => format_sig(x, n),
        None => format!("{x}"),
    };
    let opt = |x: Option<f64>| x.map_or(String::new(), num);
    r.rows
        .iter()
        .map(|row| {
            let mut c: Vec<String> = row.values.iter().map(|v| num(*v)).collect();
            c.push(row.passed.map_or(String::new(), |p| p.to_string()));
            c.push(opt(row.trip_airflow_m_per_s));
            c.push(opt(row.release_airflow_m_per_s));
            c.push(opt(row.reference_voltage_v));
            c.push(opt(row.trimmer_position_percent));
            c.push(if row.error.is_some() {
                String::new()
            } else {
                row.failing_checks.len().to_string()
            });
            c.push(row.failing_checks.join(" "));
            for d in &ds {
                c.push(
                    row.parts
                        .iter()
                        .find(|p| &p.designator == d)
                        .map_or(String::new(), |p| num(p.value)),
                );
            }
            c.push(row.error.clone().unwrap_or_default());
            c
        })
        .collect()
}

/// CSV (RFC 4180, CRLF), SI values at full precision.
pub fn render_csv(r: &SweepReport) -> String {
    let mut out = format!("# schema_version {}\r\n", r.schema_version);
    out.push_str(
        &header(r)
            .iter()
            .map(|h| field(h))
            .collect::<Vec<_>>()
            .join(","),
    );
    out.push_str("\r\n");
    for row in cells(r, None) {
        out.push_str(&row.iter().map(|c| field(c)).collect::<Vec<_>>().join(","));
        out.push_str("\r\n");
    }
    out
}

/// Aligned text: one line per point, four significant figures.
pub fn render_text(r: &SweepReport) -> String {
    let mut out = format!(
        "draftwire sweep · {} · {} point(s){}{}\n",
        r.design_file,
        r.rows.len(),
        if r.log { ", geometric steps" } else { "" },
        if r.hold_values {
            ", parts held at the design's own sizing"
        } else {
            ", each point sized afresh"
        }
    );
    for t in &r.tied {
        out.push_str(&format!("  {t}\n"));
    }
    let head = header(r);
    let body = cells(r, Some(4));
    let widths: Vec<usize> = (0..head.len())
        .map(|i| {
            body.iter()
                .map(|row| row[i].chars().count())
                .chain(std::iter::once(head[i].chars().count()))
                .max()
                .unwrap_or(0)
        })
        .collect();
    let line = |cells: &[String]| {
        let mut s = String::from(" ");
        for (c, w) in cells.iter().zip(&widths) {
            s.push_str(&format!(" {c:>w$}"));
        }
        s.trim_end().to_string() + "\n"
    };
    out.push_str(&line(&head));
    for row in &body {
        out.push_str(&line(row));
    }
    out
}
