//! `draftwire fit`: read bench readings and a design, fit the element's
//! cooling, render.

use super::{emit, read, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::fit::{
    conductances, fit_king, fit_still_air, king_section, still_air_section, AirflowReading,
    FitReport, StillAirReading,
};
use std::fmt::Write as _;
use std::path::Path;
use std::process::ExitCode;

fn fail(msg: &str) -> ExitCode {
    eprintln!("error: {msg}");
    ExitCode::from(EXIT_INPUT)
}

/// The readings as columns by name: every row's values, and the ambient
/// default for rows without one.
struct Table {
    names: Vec<String>,
    rows: Vec<(usize, Vec<f64>)>,
}

fn parse_table(name: &str, text: &str) -> Result<Table, String> {
    let mut lines = text
        .lines()
        .enumerate()
        .filter(|(_, l)| !l.trim().is_empty());
    let (_, header) = lines.next().ok_or(format!(
        "{name}: empty file: expected a header line and readings"
    ))?;
    let header = header.trim_start_matches('\u{feff}');
    let names: Vec<String> = header.split(',').map(|s| s.trim().to_string()).collect();
    for (i, n) in names.iter().enumerate() {
        if names[..i].contains(n) {
            return Err(format!("{name}:1: the column `{n}` appears twice"));
        }
    }
    let known = [
        "airflow_m_per_s",
        "element_voltage_v",
        "element_current_a",
        "ambient_c",
    ];
    for n in &names {
        if !known.contains(&n.as_str()) {
            return Err(format!(
                "{name}:1: unknown column `{n}`: expected columns among {} (units in the names)",
                known.join(", ")
            ));
        }
    }
    let mut rows = Vec::new();
    for (i, l) in lines {
        let cells: Vec<&str> = l.split(',').map(str::trim).collect();
        if cells.len() != names.len() {
            return Err(format!(
                "{name}:{}: expected {} columns, found {}",
                i + 1,
                names.len(),
                cells.len()
            ));
        }
        let mut vals = Vec::new();
        for (c, n) in cells.iter().zip(&names) {
            let x: f64 = c
                .parse()
                .ok()
                .filter(|x: &f64| x.is_finite())
                .ok_or(format!(
                    "{name}:{}: `{n}`: expected a finite number, found `{c}`",
                    i + 1
                ))?;
            vals.push(x);
        }
        rows.push((i + 1, vals));
    }
    if rows.len() > 100_000 {
        return Err(format!("{name}: more than 100 000 readings; thin them out"));
    }
    Ok(Table { names, rows })
}

impl Table {
    fn col(&self, n: &str) -> Option<usize> {
        self.names.iter().position(|x| x == n)
    }
}

/// Run `fit`.
pub fn run(readings: &Path, design_path: &Path, format: Format) -> ExitCode {
    let rname = super::shown_name(readings);
    let dname = super::shown_name(design_path);
    let text = match super::read_data(readings, "readings") {
        Ok(s) => s,
        Err(e) => return fail(&e),
    };
    let source = match read(design_path) {
        Ok(s) => s,
        Err(e) => return super::input_error(format, &e, None),
    };
    let design = match super::parse_with_overrides(&dname, &source) {
        Ok(d) => d,
        Err(d) => return super::input_error(format, &format!("error: {d}"), Some(&d)),
    };
    let table = match parse_table(&rname, &text) {
        Ok(t) => t,
        Err(e) => return fail(&e),
    };
    let (Some(v), Some(i)) = (
        table.col("element_voltage_v"),
        table.col("element_current_a"),
    ) else {
        return fail(&format!(
            "{rname}:1: the readings need `element_voltage_v` and `element_current_a` columns"
        ));
    };
    let amb = table.col("ambient_c");
    let ambient = |row: &[f64]| amb.map_or(design.ambient.nominal_k, |c| row[c] + 273.15);
    for (line, row) in &table.rows {
        if let Some(c) = amb {
            if !(-60.0..=200.0).contains(&row[c]) {
                return fail(&format!(
                    "{rname}:{line}: `ambient_c`: expected −60 to 200 °C, found {}",
                    row[c]
                ));
            }
        }
    }
    let law = design.element.resistance_law();
    let report = match table.col("airflow_m_per_s") {
        Some(u) => {
            let readings: Vec<AirflowReading> = table
                .rows
                .iter()
                .map(|(_, r)| AirflowReading {
                    airflow_m_per_s: r[u],
                    voltage_v: r[v],
                    current_a: r[i],
                    ambient_k: ambient(r),
                })
                .collect();
            if let Some((line, _)) = table
                .rows
                .iter()
                .find(|(_, r)| !(0.0..=100.0).contains(&r[u]))
            {
                return fail(&format!(
                    "{rname}:{line}: `airflow_m_per_s`: expected 0–100 m/s"
                ));
            }
            let fitted = conductances(law, &readings).and_then(|g| fit_king(&g));
            match fitted {
                Ok(k) => FitReport {
                    schema_version: draftwire::report::SCHEMA_VERSION,
                    tool_version: env!("CARGO_PKG_VERSION").to_string(),
                    readings_file: rname.clone(),
                    design_file: dname.clone(),
                    kind: "airflow".into(),
                    readings: readings.len(),
                    section: king_section(&k, design.detector.trip_airflow_m_per_s),
                    king: Some(k),
                    still_air: None,
                },
                Err(e) => {
                    eprintln!("fit failed: {rname}: {e}");
                    return ExitCode::from(EXIT_DESIGN_FAIL);
                }
            }
        }
        None => {
            let readings: Vec<StillAirReading> = table
                .rows
                .iter()
                .map(|(_, r)| StillAirReading {
                    current_a: r[i],
                    voltage_v: r[v],
                    ambient_k: ambient(r),
                })
                .collect();
            match fit_still_air(law, &readings) {
                Ok(f) => FitReport {
                    schema_version: draftwire::report::SCHEMA_VERSION,
                    tool_version: env!("CARGO_PKG_VERSION").to_string(),
                    readings_file: rname.clone(),
                    design_file: dname.clone(),
                    kind: "still-air".into(),
                    readings: readings.len(),
                    section: still_air_section(&f, law),
                    king: None,
                    still_air: Some(f),
                },
                Err(e) => {
                    eprintln!("fit failed: {rname}: {e}");
                    return ExitCode::from(EXIT_DESIGN_FAIL);
                }
            }
        }
    };
    let out = match format {
        Format::Json => {
            serde_json::to_string_pretty(&report)
                .unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
                + "\n"
        }
        Format::Csv => residuals_csv(&report),
        Format::Text => render_text(&report),
        Format::Svg => return fail("--format svg is not available for fit"),
    };
    if !emit(&out) {
        return ExitCode::from(EXIT_INPUT);
    }
    ExitCode::from(EXIT_PASS)
}

fn residuals_csv(r: &FitReport) -> String {
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

fn render_text(r: &FitReport) -> String {
    let eng = |x: f64, u: &str| draftwire::quantity::format_engineering(x, u, 4);
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
