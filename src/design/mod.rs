//! The design file: raw TOML mirror, validation into a model, diagnostics.

pub mod diagnostic;
pub mod element;
pub mod model;
pub mod raw;

pub use diagnostic::Diagnostic;
pub use model::{parse_design, Design};
