//! Presets: invented demo scenarios, generic sensor formats and bands.

pub mod demo;
