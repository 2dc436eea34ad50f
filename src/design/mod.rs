//! The design file: raw TOML mirror, validation into a model, diagnostics.

pub mod build;
pub mod compensation;
pub mod diagnostic;
pub mod element;
pub mod model;
pub mod overrides;
pub mod ranges;
pub mod raw;
pub mod reader;

pub use build::parse_design;
pub use diagnostic::Diagnostic;
pub use model::Design;

/// Read a design with `--set` overrides applied: every check of the reader
/// applies to them, an error on an overridden key points at the override,
/// and each override is listed among the assumptions.
pub fn parse_design_with(
    file: &str,
    source: &str,
    overrides: &[overrides::Override],
) -> Result<Design, Box<Diagnostic>> {
    if overrides.is_empty() {
        return parse_design(file, source);
    }
    let patched = overrides::apply(source, overrides);
    let mut d = parse_design(file, &patched.text).map_err(|e| patched.remap(e))?;
    d.assumptions.extend(patched.notes());
    Ok(d)
}
