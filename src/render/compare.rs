//! Rendering an element comparison: aligned text, JSON and CSV, each a
//! pure function of the comparison with a fixed field order.

use super::csv::field;
use crate::analysis::compare::{CompareRow, Comparison};

/// JSON, pretty-printed, units in the key names.
pub fn render_json(c: &Comparison) -> String {
    // Serialising plain structs of numbers and strings cannot fail.
    serde_json::to_string_pretty(c).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}")) + "\n"
}

fn num(x: Option<f64>, digits: usize) -> String {
    x.map_or_else(|| "—".to_string(), |v| format!("{v:.digits$}"))
}

/// (heading, cell) for each figure of a row, in display order.
fn cells(r: &CompareRow) -> Vec<(&'static str, String)> {
    vec![
        ("element", r.element.clone()),
        (
            "tolerance %",
            crate::quantity::format_sig(r.tolerance_percent, 3),
        ),
        (
            "drive",
            if r.drive.is_empty() {
                "—".into()
            } else {
                r.drive.clone()
            },
        ),
        (
            "still-air temperature °C",
            num(r.still_air_temperature_c, 1),
        ),
        ("still-air rise K", num(r.still_air_rise_k, 1)),
        (
            "still-air overheat ratio",
            num(r.still_air_overheat_ratio, 3),
        ),
        (
            "still-air power mW",
            num(r.still_air_power_w.map(|w| w * 1e3), 1),
        ),
        (
            "sense change still→trip mV",
            num(r.sense_change_v.map(|v| v * 1e3), 2),
        ),
        ("trip airflow m/s", num(r.trip_airflow_m_per_s, 3)),
        (
            "sensitivity mV per m/s",
            num(r.sensitivity_v_per_m_per_s.map(|v| v * 1e3), 2),
        ),
        ("trip drift m/s per K", num(r.trip_drift_m_per_s_per_k, 4)),
        ("time constant s", num(r.time_constant_s, 4)),
        ("hottest still-air °C", num(r.hottest_temperature_c, 1)),
        ("max temperature °C", num(r.max_temperature_c, 0)),
        (
            "safe in air",
            match r.safe_in_air {
                Some(true) => "yes".into(),
                Some(false) => "NO".into(),
                None => "unknown".into(),
            },
        ),
        (
            "design checks passed",
            format!(
                "{} of {}{}",
                r.checks_passed,
                r.checks_total,
                if r.passed { "" } else { " FAIL" }
            ),
        ),
    ]
}

/// Aligned text: one column per candidate, one line per figure; warnings
/// and errors listed below.
pub fn render_text(c: &Comparison) -> String {
    render_text_with_width(c, super::text::DEFAULT_WIDTH)
}

/// [`render_text`] for a terminal `width` columns wide: when the
/// side-by-side table would be wider, each candidate becomes a block of
/// lines instead.
pub fn render_text_with_width(c: &Comparison, width: usize) -> String {
    let table = columns(c);
    if table.lines().map(|l| l.chars().count()).max().unwrap_or(0) <= width {
        return table + &notes(c);
    }
    let mut out = header(c);
    for r in &c.rows {
        out.push_str(&format!("{}\n", r.label));
        let cells = cells(r);
        let w = cells
            .iter()
            .map(|(h, _)| h.chars().count())
            .max()
            .unwrap_or(0);
        for (h, v) in cells {
            out.push_str(&format!("  {h:<w$}  {v}\n"));
        }
        out.push('\n');
    }
    out + &notes(c)
}

fn header(c: &Comparison) -> String {
    format!(
        "draftwire compare · {}\ntarget trip airflow {:.3} m/s, ambient {:.1} °C\n\n",
        c.title, c.target_trip_airflow_m_per_s, c.ambient_c
    )
}

/// The side-by-side table (no notes).
fn columns(c: &Comparison) -> String {
    let mut out = header(c);
    let table: Vec<Vec<(&str, String)>> = c.rows.iter().map(cells).collect();
    let head_w = table.first().map_or(0, |t| {
        t.iter().map(|(h, _)| h.chars().count()).max().unwrap_or(0)
    });
    let widths: Vec<usize> = c
        .rows
        .iter()
        .zip(&table)
        .map(|(r, t)| {
            t.iter()
                .map(|(_, v)| v.chars().count())
                .chain(std::iter::once(r.label.chars().count()))
                .max()
                .unwrap_or(0)
        })
        .collect();
    let pad = |s: &str, w: usize| format!("{}{s}", " ".repeat(w.saturating_sub(s.chars().count())));
    out.push_str(&" ".repeat(head_w));
    for (r, w) in c.rows.iter().zip(&widths) {
        out.push_str("  ");
        out.push_str(&pad(&r.label, *w));
    }
    out.push('\n');
    for i in 0..table.first().map_or(0, Vec::len) {
        let head = table[0][i].0;
        out.push_str(&format!(
            "{head}{}",
            " ".repeat(head_w - head.chars().count())
        ));
        for (t, w) in table.iter().zip(&widths) {
            out.push_str("  ");
            out.push_str(&pad(&t[i].1, *w));
        }
        out.push('\n');
    }
    out
}

/// Failing checks, errors and warnings under the table.
fn notes(c: &Comparison) -> String {
    let mut out = String::new();
    for r in &c.rows {
        if !r.failed_checks.is_empty() {
            out.push_str(&format!(
                "\n{}: failing design checks: {}\n",
                r.label,
                r.failed_checks.join(", ")
            ));
        }
        if let Some(e) = &r.error {
            out.push_str(&format!("\n{}: FAILED: {e}\n", r.label));
        }
        for w in &r.warnings {
            out.push_str(&format!("\n{}: warning: {w}\n", r.label));
        }
    }
    out
}

/// CSV: one row per candidate, SI units in the column names.
pub fn render_csv(c: &Comparison) -> String {
    let mut out = String::from(
        "label,element,tolerance_percent,drive,still_air_temperature_c,still_air_rise_k,still_air_overheat_ratio,\
         still_air_power_w,sense_change_v,trip_airflow_m_per_s,sensitivity_v_per_m_per_s,trip_drift_m_per_s_per_k,\
         time_constant_s,hottest_temperature_c,max_temperature_c,safe_in_air,checks_passed,checks_total,failed_checks,passed,warnings,error\r\n",
    );
    let f = |x: Option<f64>| x.map_or(String::new(), |v| format!("{v}"));
    for r in &c.rows {
        let fields = [
            field(&r.label),
            field(&r.element),
            format!("{}", r.tolerance_percent),
            field(&r.drive),
            f(r.still_air_temperature_c),
            f(r.still_air_rise_k),
            f(r.still_air_overheat_ratio),
            f(r.still_air_power_w),
            f(r.sense_change_v),
            f(r.trip_airflow_m_per_s),
            f(r.sensitivity_v_per_m_per_s),
            f(r.trip_drift_m_per_s_per_k),
            f(r.time_constant_s),
            f(r.hottest_temperature_c),
            f(r.max_temperature_c),
            r.safe_in_air.map_or(String::new(), |b| b.to_string()),
            r.checks_passed.to_string(),
            r.checks_total.to_string(),
            field(&r.failed_checks.join("; ")),
            r.passed.to_string(),
            field(&r.warnings.join("; ")),
            field(r.error.as_deref().unwrap_or("")),
        ];
        out.push_str(&fields.join(","));
        out.push_str("\r\n");
    }
    out
}
