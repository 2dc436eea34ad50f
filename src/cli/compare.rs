//! `draftwire compare DESIGN.toml [--candidates FILE.toml ...]`: candidate
//! elements side by side in the design's drive and detector.
//!
//! The design's own element is the first candidate. Each candidates file is
//! either a whole design file (its `[element]` is one candidate, labelled by
//! its `name` or the design's title) or a file of `[[candidate]]` tables,
//! each with the keys of `[element]` (and its `resistance`, `cooling` or
//! `lamp` sub-tables as `[candidate.resistance]` …) plus a `label`.

use super::{emit, Format, EXIT_DESIGN_FAIL, EXIT_INPUT, EXIT_PASS};
use draftwire::analysis::compare::compare;
use draftwire::design::element::{parse_candidates, Candidate};
use draftwire::render;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Run `compare`; exit 0 when every candidate was solved, 1 when some
/// candidate failed to size or solve, 2 on bad input.
pub fn run(design_path: &Path, candidate_files: &[PathBuf], format: Format) -> ExitCode {
    let file = super::shown_name(design_path);
    let design = match super::load_design(design_path, &file, format) {
        Ok(d) => d,
        Err(code) => return code,
    };
    // The design's own element is the first candidate, as already read.
    let own_label = design
        .element_name
        .clone()
        .unwrap_or_else(|| design.title.clone());
    let mut list = vec![Candidate {
        label: own_label,
        element: design.element.clone(),
        tolerance: design.element_tolerance,
        drive: None,
        assumptions: Vec::new(),
    }];
    for path in candidate_files {
        let text = match super::read_data(path, "candidates") {
            Ok(s) => s,
            Err(e) => return super::input_error(format, &format!("error: {e}"), None),
        };
        match parse_candidates(&super::shown_name(path), &text, &design) {
            Ok(cs) => list.extend(cs),
            Err(d) => return super::input_error(format, &format!("error: {d}"), Some(&d)),
        }
    }
    let cmp = match compare(&design, &list) {
        Ok(c) => c,
        Err(e) => {
            eprintln!("error: {e}");
            return ExitCode::from(EXIT_INPUT);
        }
    };
    let text =
        match format {
            Format::Text => render::compare::render_text_with_width(&cmp, super::terminal_width()),
            Format::Json => render::compare::render_json(&cmp),
            Format::Csv => render::compare::render_csv(&cmp),
            Format::Svg => return super::input_error(
                Format::Text,
                "error: compare: --format svg is not drawn for a comparison; use text, json or csv",
                None,
            ),
        };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    let failed = cmp.rows.iter().any(|r| r.error.is_some() || !r.passed);
    ExitCode::from(if failed { EXIT_DESIGN_FAIL } else { EXIT_PASS })
}
