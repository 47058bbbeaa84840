//! The pure core: physics, planning and formatting in plain Rust.
//!
//! Architecture invariant: nothing under `core` imports yew, web-sys, gloo or wasm-bindgen, does
//! IO, or panics on any input. The browser shell (`crate::ui`) is a thin layer over it, and the
//! native tests and the `report` example exercise it directly.

pub mod cautions;
pub mod chart;
pub mod demo;
pub mod engine;
pub mod format;
pub mod geojson;
pub mod geometry;
pub mod library;
pub mod optics;
pub mod qr;
pub mod report;
pub mod scenario;
pub mod solve;
pub mod survey;
pub mod target;
pub mod turbulence;
