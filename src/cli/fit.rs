//! `draftwire fit`: read bench readings and a design, fit the element's
//! cooling, render.

use super::{emit, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::fit::{
    conductances, fit_king, fit_still_air, king_section, still_air_section, AirflowReading,
    FitReport, StillAirReading,
};
use draftwire::render;
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
    let design = match super::load_design(design_path, &dname, format) {
        Ok(d) => d,
        Err(code) => return code,
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
        Format::Json => render::fit::render_json(&report),
        Format::Csv => render::fit::render_csv(&report),
        Format::Text => render::fit::render_text(&report),
        Format::Svg => return fail("--format svg is not available for fit"),
    };
    if !emit(&out) {
        return ExitCode::from(EXIT_INPUT);
    }
    ExitCode::from(EXIT_PASS)
}
