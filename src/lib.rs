//! draftwire core library: the physics of a self-heated resistive element in
//! moving air, its drive circuit, the solvers and the sizing analyses.
//!
//! No I/O and no printing happen here: the binary parses files and renders
//! reports; this crate computes.
#![forbid(unsafe_code)]

pub mod analysis;
pub mod circuit;
pub mod design;
pub mod drive;
pub mod element;
pub mod eseries;
pub mod physics;
pub mod precision;
pub mod quantity;
pub mod render;
pub mod report;
pub mod roots;
pub mod solve;
