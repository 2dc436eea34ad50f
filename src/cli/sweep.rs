//! `draftwire sweep`: step one key (or two, for a grid) over a range,
//! sizing and checking every point.

use super::{emit, input_error, read, shown_name, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::analysis::sweep::{sweep, Axis, SweepSpec};
use draftwire::render;
use std::path::Path;
use std::process::ExitCode;

/// Run `sweep`. `spec_args` are `KEY FROM TO` once or twice.
pub fn run(
    path: &Path,
    spec_args: &[String],
    points: usize,
    log: bool,
    hold_values: bool,
    format: Format,
) -> ExitCode {
    if spec_args.len() != 3 && spec_args.len() != 6 {
        return input_error(
            format,
            &format!(
                "error: sweep: expected KEY FROM TO (and optionally a second KEY FROM TO for a grid), found {} argument(s)",
                spec_args.len()
            ),
            None,
        );
    }
    let mut axes = Vec::new();
    for c in spec_args.chunks(3) {
        match Axis::new(&c[0], &c[1], &c[2]) {
            Ok(a) => axes.push(a),
            Err(e) => return input_error(format, &format!("error: sweep: {e}"), None),
        }
    }
    let spec = SweepSpec {
        axes,
        points,
        log,
        hold_values,
    };
    if let Err(e) = spec.validate() {
        return input_error(format, &format!("error: sweep: {e}"), None);
    }
    let source = match read(path) {
        Ok(s) => s,
        Err(e) => return input_error(format, &e, None),
    };
    let file = shown_name(path);
    let total = points.pow(spec.axes.len() as u32) as u64;
    let bar = indicatif::ProgressBar::new(total);
    let progress = |done: usize| bar.set_position(done as u64);
    let report = match sweep(
        &file,
        &source,
        super::OVERRIDES.get().map_or(&[], |v| v),
        &spec,
        &progress,
    ) {
        Ok(r) => r,
        Err(d) => return input_error(format, &format!("error: {d}"), Some(&d)),
    };
    bar.finish_and_clear();
    let text = match format {
        Format::Text => render::sweep::render_text(&report),
        Format::Json => render::sweep::render_json(&report),
        Format::Csv => render::sweep::render_csv(&report),
        Format::Svg => render::svg::sweep(&report),
    };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    let all_pass = report.rows.iter().all(|r| r.passed == Some(true));
    ExitCode::from(if all_pass {
        EXIT_PASS
    } else {
        EXIT_DESIGN_FAIL
    })
}
