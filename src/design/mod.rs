//! The design file: raw TOML mirror, validation into a model, diagnostics.

pub mod build;
pub mod diagnostic;
pub mod element;
pub mod model;
pub mod raw;
pub mod reader;

pub use build::parse_design;
pub use diagnostic::Diagnostic;
pub use model::Design;
