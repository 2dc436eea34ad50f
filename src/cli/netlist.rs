//! `draftwire netlist`: size a design and write its circuit as a SPICE
//! netlist or an SVG schematic.

use super::{emit, load_design, shown_name, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::quantity::{parse_quantity, Dimension};
use draftwire::render;
use std::path::Path;
use std::process::ExitCode;

/// What was asked for on the command line.
pub struct Ask {
    /// Write the SVG schematic instead of the netlist.
    pub svg: bool,
    /// `--airflow`, as typed.
    pub airflow: Option<String>,
    /// `--analyses`.
    pub analyses: bool,
}

/// Run the command.
pub fn run(path: &Path, ask: &Ask) -> ExitCode {
    let file = shown_name(path);
    let design = match load_design(path, &file, Format::Text) {
        Ok(d) => d,
        Err(code) => return code,
    };
    let airflow = match &ask.airflow {
        None => None,
        Some(t) => match parse_quantity(t, Dimension::Velocity) {
            Ok(u) if u.is_finite() && (0.0..=100.0).contains(&u) => Some(u),
            Ok(u) => {
                eprintln!("error: --airflow: expected an airflow of 0 to 100 m/s, found {u} m/s");
                return ExitCode::from(EXIT_INPUT);
            }
            Err(e) => {
                eprintln!("error: --airflow: {e}");
                return ExitCode::from(EXIT_INPUT);
            }
        },
    };
    let sized = match draftwire::analysis::size_full(&design) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("design failed: {file}: {e}: nothing to write");
            return ExitCode::from(EXIT_DESIGN_FAIL);
        }
    };
    let text = if ask.svg {
        render::schematic::svg(&sized.report)
    } else {
        let figures = draftwire::analysis::netlist_model::expected(
            &sized,
            airflow.unwrap_or(sized.design.detector.trip_airflow_m_per_s),
        );
        render::spice::netlist(
            &sized,
            &render::spice::NetlistOptions {
                airflow_m_per_s: airflow,
                analyses: ask.analyses,
            },
            figures.as_ref(),
        )
    };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    if sized.report.passed() {
        ExitCode::from(EXIT_PASS)
    } else {
        eprintln!(
            "note: {file} fails some of its design checks (see `draftwire size`); the circuit is written as sized"
        );
        ExitCode::from(EXIT_DESIGN_FAIL)
    }
}
