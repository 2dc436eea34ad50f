//! Renderers: pure functions from a report to text. Each format keeps a
//! fixed field order.

pub mod compare;
pub mod csv;
pub mod fit;
pub mod guard;
pub mod json;
pub mod schematic;
pub mod spice;
pub mod spread;
pub mod svg;
pub mod sweep;
pub mod text;
pub mod transient;
