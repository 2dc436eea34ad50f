//! `draftwire transient`: read a design, size it, run a scenario in time,
//! render, and map the outcome to an exit status.

use super::{emit, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::analysis::transient::{report, Scenario};
use draftwire::quantity::{parse_quantity, Dimension};
use draftwire::render;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// What was asked for on the command line.
pub struct Ask<'a> {
    /// `power-on`, `step` or `puff` (absent with an airflow file).
    pub scenario: Option<&'a str>,
    /// `--to`.
    pub to: Option<&'a str>,
    /// `--peak`.
    pub peak: Option<&'a str>,
    /// `--duration`.
    pub duration: Option<&'a str>,
    /// `--shape`.
    pub half_sine: bool,
    /// `--airflow-file`.
    pub airflow_file: Option<&'a PathBuf>,
    /// `--samples`.
    pub samples: Option<&'a PathBuf>,
}

fn usage(msg: &str) -> ExitCode {
    eprintln!("error: {msg}");
    ExitCode::from(EXIT_INPUT)
}

fn quantity(flag: &str, text: Option<&str>, dim: Dimension, hi: f64) -> Result<f64, String> {
    let t = text.ok_or(format!("{flag} is required for this scenario"))?;
    let x = parse_quantity(t, dim).map_err(|e| format!("{flag}: {e}"))?;
    if x.is_finite() && (0.0..=hi).contains(&x) {
        Ok(x)
    } else {
        Err(format!(
            "{flag}: expected 0 to {hi} {}, found {t}",
            dim.si_unit()
        ))
    }
}

/// Read `time_s, airflow_m_per_s` rows: a header, then numbers, times
/// increasing.
pub fn read_history(path: &Path) -> Result<Vec<(f64, f64)>, String> {
    let name = path.display().to_string();
    let text = super::read_data(path, "airflow history")?;
    let mut lines = text.lines().enumerate();
    let header = lines
        .next()
        .map(|(_, l)| l.trim().trim_start_matches('\u{feff}').to_string())
        .unwrap_or_default();
    let cols: Vec<&str> = header.split(',').map(str::trim).collect();
    if cols != ["time_s", "airflow_m_per_s"] {
        return Err(format!(
            "{name}:1: expected the header `time_s,airflow_m_per_s`, found `{header}`"
        ));
    }
    let mut rows: Vec<(f64, f64)> = Vec::new();
    for (i, l) in lines {
        if l.trim().is_empty() {
            continue;
        }
        let cells: Vec<&str> = l.split(',').map(str::trim).collect();
        let num = |j: usize, what: &str| -> Result<f64, String> {
            let c = cells.get(j).copied().unwrap_or("");
            c.parse::<f64>()
                .ok()
                .filter(|x| x.is_finite())
                .ok_or(format!(
                    "{name}:{}: expected {what} as a finite number, found `{c}`",
                    i + 1
                ))
        };
        if cells.len() != 2 {
            return Err(format!(
                "{name}:{}: expected 2 columns, found {}",
                i + 1,
                cells.len()
            ));
        }
        let (t, u) = (num(0, "time_s")?, num(1, "airflow_m_per_s")?);
        if !(0.0..=100.0).contains(&u) {
            return Err(format!(
                "{name}:{}: expected an airflow of 0–100 m/s, found {u}",
                i + 1
            ));
        }
        if let Some(&(t0, _)) = rows.last() {
            if t <= t0 {
                return Err(format!(
                    "{name}:{}: times must increase, found {t} after {t0}",
                    i + 1
                ));
            }
        }
        rows.push((t, u));
    }
    if rows.len() < 2 {
        return Err(format!(
            "{name}: expected at least 2 rows of readings, found {}",
            rows.len()
        ));
    }
    if rows[rows.len() - 1].0 - rows[0].0 > 86_400.0 {
        return Err(format!(
            "{name}: the history spans more than a day; split it"
        ));
    }
    Ok(rows)
}

/// Run `transient`.
pub fn run(path: &Path, ask: Ask<'_>, format: Format) -> ExitCode {
    let file = super::shown_name(path);
    let design = match super::load_design(path, &file, format) {
        Ok(d) => d,
        Err(code) => return code,
    };
    // Options that the chosen run would ignore are mistakes.
    let is = |n: &str| ask.scenario == Some(n);
    if ask.to.is_some() && !is("step") {
        return usage("--to is only for --scenario step");
    }
    if (ask.peak.is_some() || ask.duration.is_some()) && !is("puff") {
        return usage("--peak and --duration are only for --scenario puff");
    }
    let scenario = match (ask.scenario, ask.airflow_file) {
        (Some(_), Some(_)) => return usage("give --scenario or --airflow-file, not both"),
        (None, Some(f)) => match read_history(f) {
            Ok(rows) => Scenario::History(rows),
            Err(e) => return usage(&e),
        },
        (Some("power-on") | None, None) => Scenario::PowerOn,
        (Some("step"), None) => match quantity("--to", ask.to, Dimension::Velocity, 100.0) {
            Ok(u) => Scenario::Step(u),
            Err(e) => return usage(&e),
        },
        (Some("puff"), None) => {
            let peak = quantity("--peak", ask.peak, Dimension::Velocity, 100.0);
            let dur = quantity("--duration", ask.duration, Dimension::Time, 3600.0);
            match (peak, dur) {
                (Ok(peak), Ok(d)) if d >= 1e-4 => Scenario::Puff {
                    peak,
                    duration_s: d,
                    half_sine: ask.half_sine,
                },
                (Ok(_), Ok(d)) => {
                    return usage(&format!("--duration: expected 0.1 ms to 1 h, found {d} s"))
                }
                (Err(e), _) | (_, Err(e)) => return usage(&e),
            }
        }
        (Some(other), None) => {
            return usage(&format!(
                "--scenario: expected one of power-on, step, puff, found {other}"
            ))
        }
    };
    let (choice, core) = match draftwire::analysis::choice::size_resolved(&design) {
        Ok(x) => x,
        Err(e) => {
            eprintln!("design failed: {file}: {e} (run `draftwire size` for the full report)");
            return ExitCode::from(EXIT_DESIGN_FAIL);
        }
    };
    let (r, runs) = report(&choice.design, &core, &scenario);
    if let Some(p) = ask.samples {
        let text = runs
            .first()
            .map(render::transient::samples_csv)
            .unwrap_or_default();
        if let Err(e) = std::fs::write(p, text) {
            eprintln!("error: --samples: cannot write {}: {e}", p.display());
            return ExitCode::from(EXIT_INPUT);
        }
    }
    let text = match format {
        Format::Text => render::transient::render_text(&r),
        Format::Json => render::transient::render_json(&r),
        Format::Csv => render::transient::render_csv(&r),
        Format::Svg => return usage("--format svg is not available for transient"),
    };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    ExitCode::from(if r.passed {
        EXIT_PASS
    } else {
        EXIT_DESIGN_FAIL
    })
}
