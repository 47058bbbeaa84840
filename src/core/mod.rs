//! The pure core: physics, planning, words, formats, the contract and presets, in plain Rust.
//!
//! Architecture invariant: nothing under `core` imports yew, web-sys, gloo or wasm-bindgen, does
//! IO, or panics on any input. The browser shell (`crate::ui`) is a thin layer over it, and the
//! native tests and the `report` example exercise it directly.
//!
//! The folders are layers, each importing only those listed before it (DEVELOPERS.md, "Layers";
//! `tests/layers.rs` checks it): `physics` ← `planning` ← `words` ← `formats` ← `contract` ←
//! `presets`.

pub mod contract;
pub mod formats;
pub mod physics;
pub mod planning;
pub mod presets;
pub mod words;
