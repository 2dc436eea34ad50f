//! `draftwire compare DESIGN.toml [--candidates FILE.toml ...]`: candidate
//! elements side by side in the design's drive and detector.
//!
//! The design's own element is the first candidate. Each candidates file is
//! either a whole design file (its `[element]` is one candidate, labelled by
//! its `name` or the design's title) or a file of `[[candidate]]` tables,
//! each with the keys of `[element]` (and its `resistance`, `cooling` or
//! `lamp` sub-tables as `[candidate.resistance]` …) plus a `label`.

use super::{emit, read, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::analysis::compare::{compare, CompareRow, Comparison};
use draftwire::design::element::parse_candidates;
use draftwire::design::parse_design;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Run `compare`; exit 0 when every candidate was solved, 1 when some
/// candidate failed to size or solve, 2 on bad input.
pub fn run(design_path: &Path, candidate_files: &[PathBuf], format: Format) -> ExitCode {
    let file = design_path.display().to_string();
    let source = match read(design_path) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("{e}");
            return ExitCode::from(EXIT_INPUT);
        }
    };
    let design = match parse_design(&file, &source) {
        Ok(d) => d,
        Err(d) => {
            eprintln!("error: {d}");
            return ExitCode::from(EXIT_INPUT);
        }
    };
    // The design's own element is the first candidate, as already read.
    let own_label = design
        .element_name
        .clone()
        .unwrap_or_else(|| design.title.clone());
    let mut list = vec![(own_label, design.element.clone(), design.element_tolerance)];
    for path in candidate_files {
        let text = match read(path) {
            Ok(s) => s,
            Err(e) => {
                eprintln!("{e}");
                return ExitCode::from(EXIT_INPUT);
            }
        };
        match parse_candidates(&path.display().to_string(), &text) {
            Ok(cs) => list.extend(cs.into_iter().map(|c| (c.label, c.element, c.tolerance))),
            Err(d) => {
                eprintln!("error: {d}");
                return ExitCode::from(EXIT_INPUT);
            }
        }
    }
    let cmp = match compare(&design, &list) {
        Ok(c) => c,
        Err(e) => {
            eprintln!("error: {e}");
            return ExitCode::from(EXIT_INPUT);
        }
    };
    let text = match format {
        Format::Text => render_text(&cmp),
        Format::Json => serde_json::to_string_pretty(&cmp).unwrap_or_default() + "\n",
        Format::Csv => render_csv(&cmp),
    };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    let failed = cmp.rows.iter().any(|r| r.error.is_some());
    ExitCode::from(if failed { EXIT_DESIGN_FAIL } else { EXIT_PASS })
}

fn num(x: Option<f64>, digits: usize) -> String {
    x.map_or_else(|| "—".to_string(), |v| format!("{v:.digits$}"))
}

/// (heading, cell) for each figure of a row, in display order.
fn cells(r: &CompareRow) -> Vec<(&'static str, String)> {
    vec![
        ("element", r.element.clone()),
        ("tolerance %", format!("{:.1}", r.tolerance_percent)),
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
    ]
}

/// Aligned text: one column per candidate, one line per figure; warnings
/// and errors listed below.
pub fn render_text(c: &Comparison) -> String {
    let mut out = format!(
        "draftwire compare · {}\ntarget trip airflow {:.3} m/s, ambient {:.1} °C\n\n",
        c.title, c.target_trip_airflow_m_per_s, c.ambient_c
    );
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
    for r in &c.rows {
        if let Some(e) = &r.error {
            out.push_str(&format!("\n{}: FAILED: {e}\n", r.label));
        }
        for w in &r.warnings {
            out.push_str(&format!("\n{}: warning: {w}\n", r.label));
        }
    }
    out
}

fn csv_field(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

/// CSV: one row per candidate, SI units in the column names.
pub fn render_csv(c: &Comparison) -> String {
    let mut out = String::from(
        "label,element,tolerance_percent,drive,still_air_temperature_c,still_air_rise_k,still_air_overheat_ratio,\
         still_air_power_w,sense_change_v,trip_airflow_m_per_s,sensitivity_v_per_m_per_s,trip_drift_m_per_s_per_k,\
         time_constant_s,hottest_temperature_c,max_temperature_c,safe_in_air,warnings,error\n",
    );
    let f = |x: Option<f64>| x.map_or(String::new(), |v| format!("{v}"));
    for r in &c.rows {
        let fields = [
            csv_field(&r.label),
            csv_field(&r.element),
            format!("{}", r.tolerance_percent),
            csv_field(&r.drive),
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
            csv_field(&r.warnings.join("; ")),
            csv_field(r.error.as_deref().unwrap_or("")),
        ];
        out.push_str(&fields.join(","));
        out.push('\n');
    }
    out
}
