//! Presets: invented demo scenarios, generic sensor formats and bands.

pub mod cameras;
pub mod demo;
