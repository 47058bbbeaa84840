//! Physics: the viewing geometry, optics, turbulence, the four limits, the target criteria, and
//! light (the sun, daylight, exposure and signal).
//! Imports nothing else of the core.

pub mod chain;
pub mod earth;
pub mod engine;
pub mod geometry;
pub mod light;
pub mod optics;
pub mod roots;
pub mod target;
pub mod turbulence;
