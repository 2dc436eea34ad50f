//! The circuit around the element: reference divider, comparator front end,
//! hysteresis, output stage, supply and ratings.

pub mod comparator;
pub mod divider;
pub mod frontend;
pub mod hysteresis;
pub mod ratings;
pub mod regulator;
pub mod switch;
pub mod value;
