//! Rendering a spread report: aligned text, JSON and CSV, each a pure
//! function of the report with a fixed field order.

use super::csv::field;
use crate::analysis::spread::{SpreadReport, TrialRow, PARAMETERS};
use std::fmt::Write as _;

/// JSON, pretty-printed, units in the key names.
pub fn render_json(r: &SpreadReport) -> String {
    serde_json::to_string_pretty(r).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}")) + "\n"
}

fn pct(x: f64) -> String {
    format!("{:.2} %", 100.0 * x)
}

/// A section heading underlined to its own width.
fn heading(o: &mut String, title: &str) {
    let _ = writeln!(o, "\n{title}\n{}", "─".repeat(title.chars().count()));
}

/// One aligned line: label, then value.
fn line(o: &mut String, label: &str, value: &str) {
    let _ = writeln!(o, "  {label:<44} {value}");
}

/// Aligned text for people.
pub fn render_text(r: &SpreadReport) -> String {
    let mut o = String::new();
    let _ = writeln!(o, "draftwire spread · {}", r.title);
    let _ = writeln!(o, "design file   {}", r.design_file);
    let _ = writeln!(
        o,
        "trials        {} ({} draws, seed {})",
        r.trials, r.distribution, r.seed
    );
    let _ = writeln!(
        o,
        "result        {}: {} trimmable (≥ {} wanted), {} false trips (≤ {} allowed)",
        if r.passed { "PASS" } else { "FAIL" },
        pct(r.trimmable_share),
        pct(r.min_trimmable),
        pct(r.false_trip_share),
        pct(r.max_false_trip)
    );
    heading(&mut o, "Tolerances drawn");
    for t in &r.tolerances {
        if t.plus_minus <= 0.0 {
            continue;
        }
        let value = match t.parameter.as_str() {
            "ambient" => format!(
                "{:.1}–{:.1} °C (uniform)",
                r.ambient_range_c[0], r.ambient_range_c[1]
            ),
            "input voltage" => format!(
                "{:.2}–{:.2} V (uniform)",
                r.input_range_v[0], r.input_range_v[1]
            ),
            "comparator offset" => format!("± {:.1} mV", 1e3 * t.plus_minus),
            _ => format!(
                "± {} {}",
                crate::quantity::format_sig(t.plus_minus, 4),
                t.unit
            ),
        };
        line(&mut o, &t.parameter, &value);
    }
    heading(
        &mut o,
        &format!(
            "Trip airflow, trimmer at its printed {:.1} % (target {:.3} m/s, band {:.3}–{:.3} m/s)",
            r.trimmer_position_percent,
            r.target_airflow_m_per_s,
            r.band_m_per_s[0],
            r.band_m_per_s[1]
        ),
    );
    for (label, v) in ["1 %", "5 %", "50 %", "95 %", "99 %"]
        .iter()
        .zip(&r.trip_airflow_quantiles_text)
    {
        line(&mut o, &format!("{label} quantile"), v);
    }
    let _ = writeln!(
        o,
        "  (histogram resolution {:.2} %; {} of trials never switch at this setting)",
        100.0 * r.quantile_resolution,
        pct(r.never_switches_share)
    );
    let w = &r.worst_case;
    heading(
        &mut o,
        &format!(
            "Worst case over the tolerance box ({} conditions)",
            w.conditions
        ),
    );
    // A vertex that never switches puts the extreme beyond every airflow.
    let low = |x: Option<f64>| x.map_or("below every airflow".into(), |u| format!("{u:.3} m/s"));
    let high = |x: Option<f64>| x.map_or("above every airflow".into(), |u| format!("{u:.3} m/s"));
    line(
        &mut o,
        "trips between",
        &format!(
            "{} and {}",
            low(w.trip_airflow_min_m_per_s),
            high(w.trip_airflow_max_m_per_s)
        ),
    );
    line(
        &mut o,
        "releases between",
        &format!(
            "{} and {}",
            low(w.release_airflow_min_m_per_s),
            high(w.release_airflow_max_m_per_s)
        ),
    );
    line(
        &mut o,
        "every vertex re-trimmable to target",
        if w.retrimmable { "yes" } else { "NO" },
    );
    heading(&mut o, "Batch of builds, each trimmed at the bench");
    line(&mut o, "trimmable to target", &pct(r.trimmable_share));
    line(
        &mut o,
        "false trip at some ambient/supply end",
        &pct(r.false_trip_share),
    );
    line(
        &mut o,
        "outside the band at some ambient/supply end",
        &pct(r.out_of_band_share),
    );
    if !r.contributions.is_empty() {
        heading(&mut o, "Share of the trip airflow's variance (first order)");
        for c in &r.contributions {
            line(&mut o, &c.parameter, &format!("{:>5.1} %", 100.0 * c.share));
        }
    }
    o
}

/// CSV: one summary row, units in the column names.
pub fn render_csv(r: &SpreadReport) -> String {
    let q = &r.trip_airflow_quantiles_m_per_s;
    let w = &r.worst_case;
    let f = |x: Option<f64>| x.map_or(String::new(), |v| format!("{v}"));
    let mut out = String::from(
        "schema_version,trials,seed,distribution,p01_m_per_s,p05_m_per_s,p50_m_per_s,p95_m_per_s,p99_m_per_s,\
         worst_trip_min_m_per_s,worst_trip_max_m_per_s,worst_release_min_m_per_s,worst_release_max_m_per_s,retrimmable,\
         trimmable_share,false_trip_share,out_of_band_share,passed\r\n",
    );
    let cells = [
        r.schema_version.to_string(),
        r.trials.to_string(),
        r.seed.to_string(),
        field(&r.distribution),
        f(q.p01),
        f(q.p05),
        f(q.p50),
        f(q.p95),
        f(q.p99),
        f(w.trip_airflow_min_m_per_s),
        f(w.trip_airflow_max_m_per_s),
        f(w.release_airflow_min_m_per_s),
        f(w.release_airflow_max_m_per_s),
        w.retrimmable.to_string(),
        r.trimmable_share.to_string(),
        r.false_trip_share.to_string(),
        r.out_of_band_share.to_string(),
        r.passed.to_string(),
    ];
    out.push_str(&cells.join(","));
    out.push_str("\r\n");
    out
}

/// The header of the per-trial CSV.
pub fn trials_csv_header() -> String {
    let mut h = String::from("trial");
    for p in PARAMETERS {
        h.push(',');
        h.push_str(&field(&format!("draw_{}", p.replace(' ', "_"))));
    }
    h.push_str(
        ",ambient_c,trip_airflow_m_per_s,tripped_throughout,trimmable,false_trip,out_of_band\r\n",
    );
    h
}

/// One per-trial CSV line.
pub fn trials_csv_line(row: &TrialRow) -> String {
    let mut l = row.trial.to_string();
    for d in row.draws {
        let _ = write!(l, ",{d}");
    }
    let _ = write!(
        l,
        ",{},{},{},{},{},{}\r\n",
        row.ambient_c,
        row.trip_airflow_m_per_s
            .map_or(String::new(), |u| u.to_string()),
        row.tripped_throughout,
        row.trimmable,
        row.false_trip,
        row.out_of_band
    );
    l
}
