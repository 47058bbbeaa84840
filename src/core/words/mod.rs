//! Words: units, numbers for people, and the chart's geometry and text.

pub mod chart;
pub mod format;
pub mod light;
pub mod notes;
pub mod units;
