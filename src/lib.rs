//! draftwire core library: the physics of a self-heated resistive element in
//! moving air, its drive circuit, the solvers and the sizing analyses.
//!
//! No I/O and no printing happen here: the binary parses files and renders
//! reports; this crate computes.
//!
//! ```
//! use draftwire::drive::Drive;
//! use draftwire::element::{CoolingLaw, Element, Environment, KingsLaw, LinearTcr, ResistanceLaw};
//! use draftwire::solve::operating_point;
//!
//! // An example element (invented values): 8 Ω at 20 °C, α = 0.006 /K,
//! // King's law G(U) = 1.2 mW/K + 2.4 mW/K·U^0.45, heat capacity 30 mJ/K.
//! let element = Element::new(
//!     ResistanceLaw::Linear(LinearTcr::new(8.0, 293.15, 0.006)?),
//!     CoolingLaw::King(KingsLaw::new(1.2e-3, 2.4e-3, 0.45)?),
//!     0.03,
//!     None,
//! )?;
//! let drive = Drive::SeriesResistor { rail_v: 5.0, series_ohm: 51.0 };
//! let still_air = operating_point(&element, &drive, &Environment::at(295.15), 0.0)?;
//! // The energy balance closes and the element runs above ambient.
//! assert!(still_air.balance_residual() < 1e-9);
//! assert!(still_air.rise_k() > 0.0);
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```
#![forbid(unsafe_code)]
#![warn(missing_docs)]

pub mod analysis;
pub mod circuit;
pub mod design;
pub mod drive;
pub mod element;
pub mod eseries;
pub mod fit;
pub mod physics;
pub mod precision;
pub mod quantity;
pub mod render;
pub mod report;
pub mod roots;
pub mod solve;
pub mod starter;
pub mod transient;
