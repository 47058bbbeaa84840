//! Physics: the viewing geometry, optics, turbulence, the four limits and the target criteria.
//! Imports nothing else of the core.

pub mod chain;
pub mod engine;
pub mod geometry;
pub mod optics;
pub mod roots;
pub mod target;
pub mod turbulence;
