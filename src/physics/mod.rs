//! Physical properties and correlations: air, convection, radiation,
//! resistance of materials, monotone tables, lamp filaments.

pub mod air;
pub mod convection;
pub mod cube_root;
pub mod interp;
pub mod lamp;
pub mod materials;
pub mod platinum;
pub mod radiation;
pub mod thermistor;
pub mod tungsten;
