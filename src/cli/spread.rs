//! `draftwire spread`: read a design, size it, run the worst case and the
//! Monte Carlo, render, and map the outcome to an exit status.

use super::{emit, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::analysis::size::size_core;
use draftwire::analysis::spread::{spread, SpreadOptions, TrialRow};
use draftwire::render;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Run `spread`.
pub fn run(
    path: &Path,
    opts: SpreadOptions,
    format: Format,
    trials_csv: Option<&PathBuf>,
) -> ExitCode {
    let file = super::shown_name(path);
    let design = match super::load_design(path, &file, format) {
        Ok(d) => d,
        Err(code) => return code,
    };
    if opts.trials == 0 {
        eprintln!("error: --trials: expected at least 1 trial, found 0");
        return ExitCode::from(EXIT_INPUT);
    }
    let design = draftwire::analysis::choice::resolve(&design).design;
    let core = match size_core(&design) {
        Ok(c) => c,
        Err(e) => {
            eprintln!("design failed: {file}: {e} (run `draftwire size` for the full report)");
            return ExitCode::from(EXIT_DESIGN_FAIL);
        }
    };
    // A progress bar on a terminal only (indicatif draws nothing when
    // stderr is not one).
    let bar = indicatif::ProgressBar::new(opts.trials);
    bar.set_style(
        indicatif::ProgressStyle::with_template("{bar:40} {pos}/{len} trials {eta}")
            .unwrap_or_else(|_| indicatif::ProgressStyle::default_bar()),
    );
    let progress = |done: u64| bar.set_position(done);
    let mut csv_file = match trials_csv {
        None => None,
        Some(p) => match std::fs::File::create(p) {
            Ok(f) => Some((p, std::io::BufWriter::new(f))),
            Err(e) => {
                eprintln!("error: --trials-csv: cannot write {}: {e}", p.display());
                return ExitCode::from(EXIT_INPUT);
            }
        },
    };
    let mut write_error = None;
    if let Some((_, w)) = csv_file.as_mut() {
        if let Err(e) = w.write_all(render::spread::trials_csv_header().as_bytes()) {
            write_error = Some(e);
        }
    }
    let mut sink = |row: &TrialRow| {
        if let Some((_, w)) = csv_file.as_mut() {
            if write_error.is_none() {
                if let Err(e) = w.write_all(render::spread::trials_csv_line(row).as_bytes()) {
                    write_error = Some(e);
                }
            }
        }
    };
    let keep = trials_csv.is_some();
    let report = spread(
        &design,
        &core,
        opts,
        &progress,
        if keep { Some(&mut sink) } else { None },
    );
    bar.finish_and_clear();
    if let Some((p, mut w)) = csv_file {
        if let Some(e) = write_error.or_else(|| w.flush().err()) {
            eprintln!("error: --trials-csv: cannot write {}: {e}", p.display());
            return ExitCode::from(EXIT_INPUT);
        }
    }
    let text = match format {
        Format::Text => render::spread::render_text(&report),
        Format::Json => render::spread::render_json(&report),
        Format::Csv => render::spread::render_csv(&report),
        Format::Svg => render::svg::spread(&report),
    };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    ExitCode::from(if report.passed {
        EXIT_PASS
    } else {
        EXIT_DESIGN_FAIL
    })
}
