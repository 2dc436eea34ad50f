//! Rendering a `fit` report: aligned text, JSON and the residuals as CSV;
//! pure functions of the report.

use crate::fit::FitReport;
use std::fmt::Write as _;

/// JSON, pretty-printed, units in the key names.
pub fn render_json(r: &FitReport) -> String {
    serde_json::to_string_pretty(r).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}")) + "\n"
}

/// The residuals as CSV (RFC 4180), units in the column names.
pub fn render_csv(r: &FitReport) -> String {
    let rows = r
        .king
        .as_ref()
        .map(|k| &k.residuals)
        .or(r.still_air.as_ref().map(|s| &s.residuals));
    let unit = if r.king.is_some() { "w_per_k" } else { "ohm" };
    let mut o = format!("airflow_m_per_s,measured_{unit},fitted_{unit},residual_{unit}\r\n");
    for x in rows.into_iter().flatten() {
        let _ = write!(
            o,
            "{},{},{},{}\r\n",
            x.airflow_m_per_s, x.measured, x.fitted, x.residual
        );
    }
    o
}

/// Aligned text for people.
pub fn render_text(r: &FitReport) -> String {
    let eng = |x: f64, u: &str| crate::quantity::format_engineering(x, u, 4);
    let mut o = String::new();
    let _ = writeln!(o, "draftwire fit · {} readings ({})", r.readings, r.kind);
    let _ = writeln!(o, "readings      {}", r.readings_file);
    let _ = writeln!(o, "design file   {} (its resistance law)", r.design_file);
    let _ = writeln!(
        o,
        "\nFitted constants (± one standard error; 95 % interval = ± t·SE)\n{}",
        "─".repeat(64)
    );
    if let Some(k) = &r.king {
        let _ = writeln!(
            o,
            "  A   {:>14}  ± {}",
            eng(k.a_w_per_k, "W/K"),
            eng(k.a_stderr_w_per_k, "W/K")
        );
        let _ = writeln!(
            o,
            "  B   {:>14}  ± {}",
            eng(k.b_w_per_k, "W/K"),
            eng(k.b_stderr_w_per_k, "W/K")
        );
        let _ = writeln!(o, "  n   {:>14.4}  ± {:.4}", k.n, k.n_stderr);
        let _ = writeln!(
            o,
            "  t = {:.3} ({} degrees of freedom); readings cover {} – {} m/s",
            k.t95, k.degrees_of_freedom, k.airflow_range_m_per_s[0], k.airflow_range_m_per_s[1]
        );
        let _ = writeln!(o, "\nCovariance of (A, B, n), SI\n{}", "─".repeat(27));
        for row in &k.covariance {
            let _ = writeln!(o, "  {:>12.4e} {:>12.4e} {:>12.4e}", row[0], row[1], row[2]);
        }
        let _ = writeln!(
            o,
            "\nResiduals (conductance G = P/(T − T_a))\n{}",
            "─".repeat(39)
        );
        let _ = writeln!(
            o,
            "  {:>10}  {:>12}  {:>12}  {:>12}",
            "airflow", "measured", "fitted", "residual"
        );
        for x in &k.residuals {
            let _ = writeln!(
                o,
                "  {:>6.3} m/s  {:>12}  {:>12}  {:>12}",
                x.airflow_m_per_s,
                eng(x.measured, "W/K"),
                eng(x.fitted, "W/K"),
                eng(x.residual, "W/K")
            );
        }
    }
    if let Some(s) = &r.still_air {
        let _ = writeln!(
            o,
            "  R0  {:>14}  ± {}",
            eng(s.r0_ohm, "Ω"),
            eng(s.r0_stderr_ohm, "Ω")
        );
        let _ = writeln!(
            o,
            "  A   {:>14}  ± {}",
            eng(s.a_w_per_k, "W/K"),
            eng(s.a_stderr_w_per_k, "W/K")
        );
        let _ = writeln!(
            o,
            "  t = {:.3} ({} degrees of freedom)",
            s.t95, s.degrees_of_freedom
        );
        let _ = writeln!(o, "\nResiduals (resistance)\n{}", "─".repeat(22));
        for x in &s.residuals {
            let _ = writeln!(
                o,
                "  measured {:>12}  fitted {:>12}  residual {:>12}",
                eng(x.measured, "Ω"),
                eng(x.fitted, "Ω"),
                eng(x.residual, "Ω")
            );
        }
    }
    let _ = writeln!(
        o,
        "\nPaste into the design file\n{}\n{}",
        "─".repeat(26),
        r.section
    );
    o
}
