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
        "result        {}",
        if r.passed {
            format!(
                "PASS: {} trimmable (≥ {} wanted), {} false trips (≤ {} allowed)",
                pct(r.trimmable_share),
                pct(r.min_trimmable),
                pct(r.false_trip_share),
                pct(r.max_false_trip)
            )
        } else {
            format!(
                "FAIL: {} trimmable (≥ {} wanted), {} false trips (≤ {} allowed)",
                pct(r.trimmable_share),
                pct(r.min_trimmable),
                pct(r.false_trip_share),
                pct(r.max_false_trip)
            )
        }
    );
    let _ = writeln!(o, "\nTolerances drawn\n────────────────");
    for t in &r.tolerances {
        if t.plus_minus > 0.0 {
            let _ = writeln!(o, "  {:<22} ± {:.4} {}", t.parameter, t.plus_minus, t.unit);
        }
    }
    let _ = writeln!(
        o,
        "\nTrip airflow with the trimmer at its printed {:.1} % (target {:.3} m/s, band {:.3}–{:.3} m/s)\n──────────────────────────────────────────────",
        r.trimmer_position_percent, r.target_airflow_m_per_s, r.band_m_per_s[0], r.band_m_per_s[1]
    );
    for (label, v) in ["1 %", "5 %", "50 %", "95 %", "99 %"]
        .iter()
        .zip(&r.trip_airflow_quantiles_text)
    {
        let _ = writeln!(o, "  {label:>5}  {v}");
    }
    let _ = writeln!(
        o,
        "  (histogram resolution {:.2} %; {} of trials never switch at this setting)",
        100.0 * r.quantile_resolution,
        pct(r.never_switches_share)
    );
    let w = &r.worst_case;
    let _ = writeln!(
        o,
        "\nWorst case over the tolerance box ({} conditions)\n────────────────────────────",
        w.conditions
    );
    let _ = writeln!(
        o,
        "  trips between     {} and {}",
        w.trip_airflow_min_m_per_s
            .map_or("— (some vertex never switches)".into(), |u| format!(
                "{u:.3} m/s"
            )),
        w.trip_airflow_max_m_per_s
            .map_or("— (some vertex never switches)".into(), |u| format!(
                "{u:.3} m/s"
            ))
    );
    let _ = writeln!(
        o,
        "  releases between  {} and {}",
        w.release_airflow_min_m_per_s
            .map_or("— (some vertex never switches)".into(), |u| format!(
                "{u:.3} m/s"
            )),
        w.release_airflow_max_m_per_s
            .map_or("— (some vertex never switches)".into(), |u| format!(
                "{u:.3} m/s"
            ))
    );
    let _ = writeln!(
        o,
        "  every vertex re-trimmable to target: {}",
        if w.retrimmable { "yes" } else { "NO" }
    );
    let _ = writeln!(
        o,
        "\nBatch of builds, each trimmed at the bench\n──────────────────────────"
    );
    let _ = writeln!(
        o,
        "  trimmable to target             {}",
        pct(r.trimmable_share)
    );
    let _ = writeln!(
        o,
        "  false trip at some ambient/supply end  {}",
        pct(r.false_trip_share)
    );
    let _ = writeln!(
        o,
        "  outside the band at some end    {}",
        pct(r.out_of_band_share)
    );
    if !r.contributions.is_empty() {
        let _ = writeln!(
            o,
            "\nShare of the trip airflow's variance (first order)\n──────────────────────────"
        );
        for c in &r.contributions {
            let _ = writeln!(o, "  {:<22} {:>6.1} %", c.parameter, 100.0 * c.share);
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
